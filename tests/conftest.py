"""Shared fixtures: the sample aircraft, the command-line runner; the long runs' option.

``pytest`` runs every test with short runs of the random ones (the README's test command,
well under a minute on two cores). ``pytest --long`` runs the long ones: the hypothesis
profile ``long`` (ten times the examples of every property and fuzz test that takes its
count from ``helpers.examples``), the oracle on 10,000 random cases, and the tests marked
``slow`` (skipped otherwise). The runs ``--long`` lengthens carry the marker ``long``, so
``pytest --long -m "long or slow"`` runs only them (what .ci/run does after the default
run). A failing hypothesis test prints its falsifying example and a reproduction blob
(``print_blob``: ``@reproduce_failure(...)``); the examples it found are kept in a database
outside the repository (``EXAMPLES_DATABASE``, in the user's cache folder), so the next run
tries them first. DEVELOPERS.md, "Set up and test".
"""

from __future__ import annotations

from collections.abc import Iterator
from pathlib import Path
from typing import TYPE_CHECKING, Any

import platformdirs
import pytest
from hypothesis import HealthCheck, is_hypothesis_test, settings
from hypothesis.database import DirectoryBasedExampleDatabase

if TYPE_CHECKING:  # the library and tests/helpers (numpy, the command tree) load in the first fixture that needs
    # them: xdist's controller, which runs no test, never imports them
    from loadcheck import Aircraft

    from .helpers import AppRunner

LONG_FACTOR = 10
"""How many times the examples of each property and fuzz test ``--long`` runs."""

ORACLE_CASES = {"short": 600, "long": 10_000}
"""Random cases of the oracle comparison (tests/test_oracle.py) in each run."""


EXAMPLES_DATABASE = Path(platformdirs.user_cache_dir("loadcheck")) / "hypothesis"
"""Where hypothesis keeps the examples it found (outside the repository)."""

_COMMON = settings(
    deadline=None,
    print_blob=True,
    database=DirectoryBasedExampleDatabase(EXAMPLES_DATABASE),
    suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large, HealthCheck.filter_too_much],
)
settings.register_profile("short", _COMMON, max_examples=100)
settings.register_profile("long", _COMMON, max_examples=100 * LONG_FACTOR)


def pytest_addoption(parser: pytest.Parser) -> None:
    parser.addoption(
        "--long",
        action="store_true",
        help="the long runs: ten times the hypothesis examples (profile 'long') and the oracle on 10,000 cases",
    )


def pytest_configure(config: pytest.Config) -> None:
    if config.getoption("--long"):
        settings.load_profile("long")
    elif not config.getoption("--hypothesis-profile", None):
        settings.load_profile("short")


@pytest.hookimpl(tryfirst=True)  # before -m selects
def pytest_collection_modifyitems(config: pytest.Config, items: list[pytest.Item]) -> None:
    """Mark the runs ``--long`` lengthens (hypothesis tests, the oracle) ``long``; skip the
    tests marked ``slow`` (only ``--long`` runs them)."""
    run_slow = config.getoption("--long")
    skip = pytest.mark.skip(reason="slow: runs with --long")
    for item in items:
        hypothesis_test = isinstance(item, pytest.Function) and is_hypothesis_test(item.obj)
        if hypothesis_test or "oracle_cases" in getattr(item, "fixturenames", ()):
            item.add_marker(pytest.mark.long)
        if item.get_closest_marker("slow") and not run_slow:
            item.add_marker(skip)


def pytest_collection_finish(session: pytest.Session) -> None:
    """Freeze what collection made (the modules, the tests, the library's tables): the cycle
    collector's full passes during the run then go over the tests' own objects only, not over
    these every time (about 3 % of the run's CPU). Nothing of it is garbage: it lives to the end."""
    import gc

    gc.freeze()


@pytest.hookimpl(trylast=True)
def pytest_unconfigure(config: pytest.Config) -> None:
    """Freeze everything once the run is over: the interpreter's collections at exit then skip the
    session's objects (about 1.5 s of CPU in each xdist worker, at the end of the run's wall time)."""
    import gc

    gc.freeze()


@pytest.fixture(scope="session")
def runner() -> AppRunner:
    """The command-line runner, its command tree built once for the session."""
    from .helpers import app_runner

    return app_runner()


def _sample_aircraft(name: str) -> Aircraft:
    from loadcheck import load_aircraft

    from .helpers import sample

    return load_aircraft(sample(f"{name}/aircraft.toml"))


@pytest.fixture(scope="session")
def trainer() -> Aircraft:
    return _sample_aircraft("trainer4")


@pytest.fixture(scope="session")
def tandem() -> Aircraft:
    return _sample_aircraft("tandem2")


@pytest.fixture(scope="session")
def twin() -> Aircraft:
    return _sample_aircraft("twin6")


@pytest.fixture(scope="session")
def oracle_cases(request: pytest.FixtureRequest) -> int:
    """Random cases for the oracle comparison: ORACLE_CASES["short"], or ["long"] with --long."""
    return ORACLE_CASES["long" if request.config.getoption("--long") else "short"]


@pytest.fixture(scope="session")
def ureg() -> Any:
    """pint's unit registry, built once (about a second each time: not at import, not per test)."""
    import pint

    return pint.UnitRegistry()


@pytest.fixture(scope="session")
def desk_files(tmp_path_factory: pytest.TempPathFactory) -> tuple[Path, Path, Path]:
    """The desk's files made once (tests/web_helpers.make_desk: the fleet, where the check log
    goes, the accounts with their hashes): each desk starts from a copy of them."""
    from .web_helpers import make_desk

    return make_desk(tmp_path_factory.mktemp("desk-files"))


def _desk_over(files: tuple[Path, Path, Path], root: Path) -> dict[str, Any]:
    from loadcheck.web import create_app

    from .web_helpers import copy_desk

    fleet, db, users = copy_desk(files, root)
    app = create_app(fleet, db=db, users=users, secret="test secret")
    return {"app": app, "fleet": fleet, "db": db, "users": users}


@pytest.fixture()
def desk(tmp_path: Path, desk_files: tuple[Path, Path, Path]) -> dict[str, Any]:
    """A desk of the test's own over a copy of the sample fleet (tests/web_helpers.make_desk): its
    app, fleet, database, accounts. For a test that records, writes a file or signs in wrongly."""
    return _desk_over(desk_files, tmp_path)


@pytest.fixture(scope="session")
def _shared_desk(tmp_path_factory: pytest.TempPathFactory, desk_files: tuple[Path, Path, Path]) -> dict[str, Any]:
    return _desk_over(desk_files, tmp_path_factory.mktemp("shared-desk"))


@pytest.fixture()
def reading_desk(_shared_desk: dict[str, Any]) -> Iterator[dict[str, Any]]:
    """The one desk of the session shared by the tests that only read (pages, checks, plans,
    refusals): the same keys as ``desk``, built once. A test on it that records a check,
    changes a file of the fleet or the accounts fails here after it: use ``desk`` for those."""
    before = _files_state(_shared_desk)
    yield _shared_desk
    assert not _shared_desk["db"].exists(), "a test on reading_desk recorded a check: give it the desk fixture"
    assert _files_state(_shared_desk) == before, "a test on reading_desk changed a file: give it the desk fixture"


def _files_state(desk: dict[str, Any]) -> list[tuple[str, int, int]]:
    paths = [*sorted(desk["fleet"].rglob("*")), desk["users"]]
    return [(str(p), (info := p.stat()).st_size, info.st_mtime_ns) for p in paths if p.is_file()]


@pytest.fixture
def db(tmp_path, monkeypatch):
    """A check log in the test's folder, made the default one ($LOADCHECK_LOG)."""
    path = tmp_path / "records.sqlite3"
    monkeypatch.setenv("LOADCHECK_LOG", str(path))
    return path
