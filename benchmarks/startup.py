"""Start-up cost of `loadcheck check` against the bare import of its dependencies.

Run on demand:  python benchmarks/startup.py [--runs 15]

Both are timed in the same run, as fresh interpreters, alternating, and the medians are
compared. Target (issue 2 / issue 8): the ratio stays at or below 1.3. "Bare import"
means importing numpy, shapely, pydantic (with BaseModel, which is what using pydantic
loads), typer and rich; a plain check must not import matplotlib.
"""

from __future__ import annotations

import argparse
import compileall
import statistics
import subprocess
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
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
CHECK = (
    "import sys; sys.argv = ['loadcheck', 'check', %r, '--json'];"
    "import loadcheck.cli as c\n"
    "try:\n    c.main()\nexcept SystemExit:\n    pass\n"
    "assert 'matplotlib' not in sys.modules" % str(SAMPLE)
)


def _time(code: str) -> float:
    start = time.perf_counter()
    subprocess.run([sys.executable, "-c", code], check=True, stdout=subprocess.DEVNULL)
    return time.perf_counter() - start


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--runs", type=int, default=15)
    args = parser.parse_args()
    # An installed package has its bytecode compiled at install time, as the
    # dependencies' has; compile ours too, since PYTHONDONTWRITEBYTECODE may be set.
    compileall.compile_dir(str(ROOT / "loadcheck"), quiet=1)
    _time(BARE), _time(BARE_WITH_MODEL), _time(MINIMAL_APP), _time(CHECK)  # warm the file cache
    bare, model, minimal, check = [], [], [], []
    for _ in range(args.runs):
        bare.append(_time(BARE))
        model.append(_time(BARE_WITH_MODEL))
        minimal.append(_time(MINIMAL_APP))
        check.append(_time(CHECK))
    b, m, a, c = (statistics.median(x) for x in (bare, model, minimal, check))
    print(f"bare import of dependencies:             median {b * 1000:.0f} ms over {args.runs} runs")
    print(f"  the same plus one pydantic model:      median {m * 1000:.0f} ms")
    print(f"  smallest typer+rich+pydantic program:  median {a * 1000:.0f} ms")
    print(f"loadcheck check --json (trainer):        median {c * 1000:.0f} ms")
    print(f"ratio to the bare import:                {c / b:.2f} (target <= 1.30)")
    print(f"ratio to the import plus one model:      {c / m:.2f}")
    print(f"ratio to the smallest program:           {c / a:.2f}")


if __name__ == "__main__":
    main()
