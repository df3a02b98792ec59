"""The single check (`check_loading`) against the code before the engine rebuild, side by side.

Run on demand:  python benchmarks/single.py [--old 5bdf416] [--runs 300] [--repeat 7] [--cpu]

The package as it was at commit ``--old`` is extracted (``git archive``) to a temporary
folder under another name, so both versions are imported into this one process; each
sample loading is checked by the old and the new code in turn, ``--repeat`` times, and the
best time per check of each is printed with their ratio (target: about 0.5 ms a check,
no slower than the old code). The machine is shared: only the ratios measured side by
side mean much; ``--cpu`` times CPU (``time.process_time``) instead of the wall clock,
which the other processes disturb less.
"""

from __future__ import annotations

import argparse
import importlib
import sys
import tempfile
import time
from pathlib import Path

from older import ROOT, extract, samples_for_old

SAMPLES = [
    "trainer4/within.toml",
    "twin6/within.toml",
    "twin6/two_stretches.toml",
    "tandem2/aft_heavy.toml",
    "heli2/solo_heavy_right.toml",
]


def _best(check, aircraft, loading, runs: int, samples: bool, clock=time.perf_counter) -> float:
    start = clock()
    for _ in range(runs):
        check(aircraft, loading, samples=samples)
    return (clock() - start) / runs


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--old", default="5bdf416")
    parser.add_argument("--runs", type=int, default=300)
    parser.add_argument("--repeat", type=int, default=7)
    parser.add_argument("--cpu", action="store_true", help="time CPU (process_time) rather than the wall clock")
    args = parser.parse_args()
    sys.path.insert(0, str(ROOT))
    import loadcheck as new

    with tempfile.TemporaryDirectory() as folder:
        package = extract(args.old, Path(folder), "loadcheck_old")
        sys.path.insert(0, folder)
        old: object = importlib.import_module("loadcheck_old")
        old_samples = samples_for_old(Path(folder), package)
        clock = time.process_time if args.cpu else time.perf_counter
        print(
            f"check_loading ({'CPU' if args.cpu else 'wall'} time), best of {args.repeat} x {args.runs} "
            f"checks, ms per check (old = {args.old}):"
        )
        print(f"  {'sample':30} {'samples':>8} {'old':>7} {'new':>7} {'new/old':>8}")
        for name in SAMPLES:
            versions = []
            for package, where in ((old, old_samples), (new, ROOT / "sample_aircraft")):
                inputs = package.load_check_inputs(where / name)  # type: ignore[attr-defined]
                versions.append((package.check_loading, inputs.aircraft, inputs.loading))  # type: ignore[attr-defined]
            for samples in (False, True):
                for check, aircraft, loading in versions:
                    check(aircraft, loading, samples=samples)  # warm up
                best = [float("inf"), float("inf")]
                for _ in range(args.repeat):
                    for k, (check, aircraft, loading) in enumerate(versions):
                        best[k] = min(best[k], _best(check, aircraft, loading, args.runs, samples, clock))
                print(
                    f"  {name:30} {samples!s:>8} {best[0] * 1000:7.3f} {best[1] * 1000:7.3f} {best[1] / best[0]:8.2f}"
                )


if __name__ == "__main__":
    main()
