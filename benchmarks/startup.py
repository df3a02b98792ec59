"""Start-up cost of `loadcheck check` against the bare import of its dependencies.

Run on demand:  python benchmarks/startup.py [--runs 15] [--old 42b09d9]

Both are timed in the same run, as fresh interpreters, alternating, and the medians of
wall and CPU time (every thread, so a spinning BLAS pool shows) are compared. Target:
each ratio (the check's start-up over the bare import) at or below 1.3. "Bare import"
means importing numpy, shapely, pydantic (with BaseModel, which is what using pydantic
loads), typer and rich; a plain check --json must import neither matplotlib nor rich.
"""

from __future__ import annotations

import argparse
import compileall
import os
import resource
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

from older import ROOT, extract, samples_for_old

SAMPLE = ROOT / "sample_aircraft" / "trainer4" / "within.toml"

BARE = "import numpy, shapely, typer, rich; from pydantic import BaseModel"
# pydantic loads its model machinery lazily, on the first model class; any program that
# uses pydantic pays for it, so the second baseline includes one trivial model.
BARE_WITH_MODEL = BARE + "\nclass M(BaseModel):\n    x: int\nM(x=1)"
# typer and rich load their command and console machinery lazily too: the smallest program
# that uses all five (one pydantic model, one typer command printing through rich)
MINIMAL_APP = BARE_WITH_MODEL + (
    "\nfrom rich.console import Console\napp = typer.Typer()\n@app.command()\ndef go(x: int = 1) -> None:\n"
    "    Console().print(M(x=x).x)\ntry:\n    app(['--x', '2'])\nexcept SystemExit:\n    pass"
)
NEW_ONLY = "matplotlib", "rich"  # what a plain check --json of this checkout must not import


def _check(sample: Path, unloaded: tuple[str, ...] = ()) -> str:
    """A fresh interpreter's ``loadcheck check SAMPLE --json``: it must end in a verdict (exit 0 or 1,
    never an input error timed as a check) without importing ``unloaded``."""
    return (
        f"import sys; sys.argv = ['loadcheck', 'check', {str(sample)!r}, '--json']\n"
        "import loadcheck.cli as c\n"
        "try:\n    c.main()\nexcept SystemExit as stop:\n    assert stop.code in (0, 1, None), stop.code\n"
        f"assert not [m for m in {unloaded!r} if m in sys.modules]"
    )


CHECK = _check(SAMPLE, NEW_ONLY)


_EMPTY = [str(ROOT)]  # the working folder of the timed interpreters: an empty one (set in _measure)


def _time(code: str, path: Path = ROOT) -> tuple[float, float]:
    """Wall time and CPU time (user + system, every thread) of a fresh interpreter running ``code`` [s],
    with the package of ``path`` first on the path (this checkout's, not an installed one)."""
    env = {**os.environ, "PYTHONPATH": os.pathsep.join([str(path), os.environ.get("PYTHONPATH", "")])}
    before = resource.getrusage(resource.RUSAGE_CHILDREN)
    start = time.perf_counter()
    # run from outside any checkout: "python -c" puts the working folder first on the path
    subprocess.run([sys.executable, "-c", code], check=True, stdout=subprocess.DEVNULL, env=env, cwd=_EMPTY[0])
    wall = time.perf_counter() - start
    after = resource.getrusage(resource.RUSAGE_CHILDREN)
    return wall, (after.ru_utime - before.ru_utime) + (after.ru_stime - before.ru_stime)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--runs", type=int, default=15)
    parser.add_argument("--old", default=None, help="also time check --json of this commit (e.g. 42b09d9)")
    args = parser.parse_args()
    with tempfile.TemporaryDirectory() as folder:
        _measure(args, Path(folder))


def _measure(args: argparse.Namespace, folder: Path) -> None:
    # An installed package has its bytecode compiled at install time, as the
    # dependencies' has; compile ours too, since PYTHONDONTWRITEBYTECODE may be set.
    compileall.compile_dir(str(ROOT / "loadcheck"), quiet=1)
    (folder / "empty").mkdir()
    _EMPTY[0] = str(folder / "empty")
    codes = {
        "bare": (BARE, ROOT),
        "model": (BARE_WITH_MODEL, ROOT),
        "minimal": (MINIMAL_APP, ROOT),
        "check": (CHECK, ROOT),
    }
    if args.old:
        package = extract(args.old, folder)
        compileall.compile_dir(str(package), quiet=1)
        # the older code reads the sample with the keys renamed since under their old names
        old_sample = samples_for_old(folder, package) / SAMPLE.relative_to(ROOT / "sample_aircraft")
        codes["old"] = (_check(old_sample), folder)
    for code, path in codes.values():
        _time(code, path)  # warm the file cache
    runs: dict[str, list[tuple[float, float]]] = {name: [] for name in codes}
    for _ in range(args.runs):
        for name, (code, path) in codes.items():
            runs[name].append(_time(code, path))
    wall = {k: statistics.median(w for w, _ in v) for k, v in runs.items()}
    cpu = {k: statistics.median(c for _, c in v) for k, v in runs.items()}
    print(f"medians over {args.runs} runs, alternating          wall      CPU")
    print(f"bare import of dependencies:             {wall['bare'] * 1000:6.0f} ms {cpu['bare'] * 1000:6.0f} ms")
    print(f"  the same plus one pydantic model:      {wall['model'] * 1000:6.0f} ms {cpu['model'] * 1000:6.0f} ms")
    print(f"  smallest typer+rich+pydantic program:  {wall['minimal'] * 1000:6.0f} ms {cpu['minimal'] * 1000:6.0f} ms")
    print(f"loadcheck check --json (trainer):        {wall['check'] * 1000:6.0f} ms {cpu['check'] * 1000:6.0f} ms")
    print(
        f"ratio to the bare import:                {wall['check'] / wall['bare']:6.2f}    "
        f"{cpu['check'] / cpu['bare']:6.2f}"
        "   (target <= 1.30 each)"
    )
    print(
        f"ratio to the import plus one model:      {wall['check'] / wall['model']:6.2f}    "
        f"{cpu['check'] / cpu['model']:6.2f}"
    )
    print(
        f"ratio to the smallest program:           {wall['check'] / wall['minimal']:6.2f}    "
        f"{cpu['check'] / cpu['minimal']:6.2f}"
    )
    if "old" in wall:
        print(f"check --json of {args.old}:               {wall['old'] * 1000:6.0f} ms {cpu['old'] * 1000:6.0f} ms")
        print(
            f"  its ratio to the bare import:          {wall['old'] / wall['bare']:6.2f}    "
            f"{cpu['old'] / cpu['bare']:6.2f}"
        )


if __name__ == "__main__":
    main()
