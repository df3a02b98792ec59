"""The docs stay true (issue 15, item 9): the file-format reference is written from the models
and every field the models accept is in it; the docs link only to pages that exist."""

from __future__ import annotations

import re
import runpy
from pathlib import Path

import pytest

from loadcheck.aircraft import Aircraft
from loadcheck.loading import Loading

ROOT = Path(__file__).resolve().parent.parent
GENERATOR = runpy.run_path(str(ROOT / "docs" / "file_format_reference.py"))
PAGE = ROOT / "docs" / "file-format.md"


def test_file_format_reference_is_current():
    page = PAGE.read_text(encoding="utf-8")
    assert GENERATOR["updated"](page) == page, "run: python docs/file_format_reference.py"


def _paths(model, prefix=""):
    for name, info in model.model_fields.items():
        key = info.alias or name
        yield f"{prefix}{key}"
        inner, _ = GENERATOR["_model"](info.annotation)
        if inner is not None and inner is not model:
            yield from _paths(inner, f"{prefix}{key}.")


@pytest.mark.parametrize("model", [Aircraft, Loading], ids=["aircraft", "loading"])
def test_every_accepted_field_is_documented(model):
    # regression: seats, controls, [[equipment]], rotorcraft, the group id and the loading's
    # registration, reference and pilot were accepted but not documented
    page = PAGE.read_text(encoding="utf-8")
    rows = set(re.findall(r"^\| (`[^|]+`(?: [a-z_]+)?) \|", page, re.M))
    for path in _paths(model):
        *tables, key = path.split(".")
        if tables:
            assert any(row.endswith(f"` {key}") and tables[-1] in row for row in rows) or any(
                row == f"`[[{path}]]`" or row == f"`[{path}]`" for row in rows
            ), path
        else:
            assert f"`{key}`" in rows or any(f"[{key}]" in row for row in rows), path
    for words in [
        "seats",
        "controls",
        "[[equipment]]",
        "rotorcraft",
        "`[[station_group]]` id",
        "`registration`",
        "`reference`",
        "`pilot`",
    ]:
        assert words in page


def test_docs_link_only_to_pages_in_the_repository():
    for page in [ROOT / "README.md", ROOT / "DEVELOPERS.md", *sorted((ROOT / "docs").glob("*.md"))]:
        text = page.read_text(encoding="utf-8")
        for target in re.findall(r"\]\(([^)#]+)(?:#[^)]*)?\)", text):
            if re.match(r"^[a-z]+:", target):
                continue
            assert (page.parent / target).exists(), f"{page.name} links to {target}, which is not in the repository"
        assert "DESIGN.md" not in text or page.name == "DEVELOPERS.md", (
            f"{page.name} cites a page outside the repository"
        )


# -- the tests mirror the package (DEVELOPERS.md, "Tests") ------------------------------------------

TESTS = ROOT / "tests"

CROSS_CUTTING = {
    "test_answers.py": "every planning answer, schedule case and extreme passes the full check",
    "test_bad_inputs.py": "the malformed-file corpus (tests/bad_inputs/)",
    "test_completion.py": "shell completion of every command",
    "test_docs.py": "the docs stay true, and this layout",
    "test_fuzz.py": "random documents, mutations and CSV shapes through the readers and the command line",
    "test_lateral.py": "two-axis balance across the models, the engine and the check",
    "test_lateral_moment.py": "lateral limits drawn as lateral moment against weight",
    "test_oracle.py": "the library against the independent oracle (tests/oracle.py)",
    "test_properties.py": "invariants of the check for any loading",
    "test_regressions.py": "one test per crash found, named after what broke",
    "test_samples.py": "every sample loading shows what its name says",
    "test_sheet_print.py": "the load sheet printed through a headless browser",
    "test_terminal_width.py": "every command's output at 60, 80 and 120 columns and piped",
    "test_web_api_boundary.py": "the desk's JSON API boundary, plan fuel and page words against the library's",
    "test_web_browser.py": "the desk in a real browser",
    "test_writes.py": "every file any command writes is written whole or not at all",
}
"""Test files named for what they check across modules, not after one module."""

NOT_MIRRORED = {
    "__init__.py": "re-exports only",
    "__main__.py": "python -m loadcheck: test_cli.py",
    "render/__init__.py": "re-exports only",
    "web/__init__.py": "re-exports only",
}
"""Modules of loadcheck/ without a test file of their own, and where their tests are."""


def _test_file(module: Path) -> str:
    """tests/test_<module>.py for loadcheck/<module>.py, test_<package>_<module>.py for
    loadcheck/<package>/<module>.py, test_<package>.py for a package's __init__.py."""
    parts = module.relative_to(ROOT / "loadcheck").with_suffix("").parts
    parts = parts[:-1] if parts[-1] == "__init__" else parts
    return "test_" + "_".join(parts) + ".py"


def _modules() -> dict[str, str]:
    return {
        m.relative_to(ROOT / "loadcheck").as_posix(): _test_file(m) for m in sorted((ROOT / "loadcheck").rglob("*.py"))
    }


def test_every_module_of_the_package_has_its_test_file():
    modules = _modules()
    missing = [f"{m} -> tests/{t}" for m, t in modules.items() if m not in NOT_MIRRORED and not (TESTS / t).is_file()]
    assert not missing, f"a module without its test file: {missing}"
    stale = [m for m in NOT_MIRRORED if m not in modules or (TESTS / modules[m]).is_file()]
    assert not stale, f"NOT_MIRRORED lists a module that is gone or has its file now: {stale}"
    for where in NOT_MIRRORED.values():
        for name in re.findall(r"test_\w+\.py", where):
            assert (TESTS / name).is_file(), name


def test_every_test_file_is_a_modules_or_a_listed_suite():
    mirrors = set(_modules().values())
    files = {p.name for p in TESTS.rglob("test_*.py")}
    orphans = sorted(files - mirrors - set(CROSS_CUTTING))
    assert not orphans, f"a test file named after no module and not a listed cross-cutting suite: {orphans}"
    assert not set(CROSS_CUTTING) - files, "CROSS_CUTTING lists a file that is gone"
    developers = (ROOT / "DEVELOPERS.md").read_text(encoding="utf-8")
    unlisted = [name for name in CROSS_CUTTING if name not in developers]
    assert not unlisted, f"DEVELOPERS.md's tests section does not name {unlisted}"


def test_every_unit_spelling_read_is_documented():
    """Each spelling units.canonical_unit folds to a unit (`kgs`, `pounds`) is listed in
    docs/file-format.md, so none is read without the user being able to know it (fail closed:
    common practice, a value is used as documented or refused)."""
    from loadcheck.units import _ALIASES, canonical_unit

    text = (ROOT / "docs" / "file-format.md").read_text(encoding="utf-8")
    head = text[: text.index("## Aircraft file")]
    for spelling, unit in _ALIASES.items():
        assert f"`{spelling}`" in head, spelling
        assert canonical_unit(spelling.upper()) == unit  # "in any letter case", as the page says


@pytest.mark.parametrize(
    "page, opening",
    [
        ("file-format.md", "A station or tank id may not be a column name of the fleet CSV ("),
        ("fleet.md", "A station or tank may not be called by a name the CSV below uses for its own columns\n("),
    ],
)
def test_regression_the_reserved_names_listed_are_the_ones_refused(page, opening):
    # trial 10, finding 14: file-format.md's list left out trip_id and leg, which docs/fleet.md
    # and loadcheck.aircraft.RESERVED_IDS have; each page's list is exactly the refused names
    from loadcheck.aircraft import RESERVED_IDS

    text = (ROOT / "docs" / page).read_text(encoding="utf-8")
    start = text.index(opening) + len(opening)
    listed = re.findall(r"`([^`]+)`", text[start : text.index("in any letter case", start)])
    assert listed == list(RESERVED_IDS)
