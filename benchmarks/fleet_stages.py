"""Where a fleet check's time goes, stage by stage, per row (CPU), against an older commit side by side.

Run on demand:  python benchmarks/fleet_stages.py [--n 10000] [--per-call 85 256] [--repeat 3] [--old COMMIT]

The rows of sample_aircraft/fleet_day.csv repeated to N rows (as benchmarks/fleet.py writes
them) go through the stages of ``fleet check`` one at a time, in one process: reading the rows
(``read_loadings``: the cells and ``parse_loading``), ``resolve_loading``, ``check_many`` on
``--per-call`` rows of one aircraft at a time (and, where the package has them, what the fleet
check does instead: ``check_columns``, and ``result_texts`` writing each result's JSON from the
columns) (a chunk of 1,024 flights gives each of the four
sample aircraft about 256, a chunk of 256 about 64 to 85), the result's JSON form
(``to_dict``) and the JSON line (orjson). Each figure is the best of ``--repeat`` runs of the
stage, in microseconds of CPU (``time.process_time``) a row, with the cycle collector held off
while the stage runs (``gc.disable``): its passes over the earlier stages' 10,000 rows and
results, which a fleet check never holds at once (it goes by chunks, with what exists before it
frozen), doubled some figures from run to run; a whole fleet check of 10,000 rows takes the same
CPU with the collector on or off (docs/performance.md). ``--collected`` times it as before
2026-12-03). With ``--old COMMIT`` the package
as it was at that commit is timed the same way in its own interpreter, one after the other, so
that the two can be read side by side; only the ratios mean much on a shared machine.
"""

from __future__ import annotations

import argparse
import os
import subprocess
import sys
import tempfile
from pathlib import Path

from older import ROOT, extract

STAGES = r"""
import gc, sys, time
import orjson
from loadcheck.check import check_many
from loadcheck.fleet import load_fleet, read_loadings
from loadcheck.loading import resolve_loading

day, repeat, QUIET, per_calls = sys.argv[1], int(sys.argv[2]), sys.argv[3] == "1", [int(n) for n in sys.argv[4:]]
fleet = load_fleet(FLEET)


def best(stage, count):
    fastest = float("inf")
    for _ in range(repeat):
        if QUIET:  # no cycle collection while the stage runs (what it makes is freed by reference counting)
            gc.disable()
        start = time.process_time()
        stage()
        fastest = min(fastest, (time.process_time() - start) / count * 1e6)
        gc.enable()
    return fastest


rows = list(read_loadings(day, fleet)[0])
print(f"read_loadings                {best(lambda: list(read_loadings(day, fleet)[0]), len(rows)):7.1f}")
usable = [(r.loading, fleet.aircraft(r.registration)) for r in rows if r.loading is not None and not r.problems
          and not r.loading.leg]


def resolve():
    out = []
    for loading, aircraft in usable:
        try:
            out.append((aircraft, resolve_loading(loading, aircraft)))
        except Exception:
            pass
    return out


resolved = resolve()
print(f"resolve_loading              {best(resolve, len(usable)):7.1f}")
by_aircraft = {}
for aircraft, one in resolved:
    by_aircraft.setdefault(id(aircraft), (aircraft, []))[1].append(one)
results = []
try:  # the results written from the engine's columns (2026-12-04 on); before, objects for each row
    from loadcheck.check import check_columns
    from loadcheck.result_json import result_texts
except ImportError:
    check_columns = None
for per_call in per_calls:
    def check():
        out = []
        for aircraft, loadings in by_aircraft.values():
            for at in range(0, len(loadings), per_call):
                out += check_many(aircraft, loadings[at : at + per_call])
        results[:] = out
    print(f"check_many, {per_call:4d} rows a call  {best(check, len(resolved)):7.1f}")
    if check_columns is not None:
        chunks = []
        def columns():
            chunks.clear()
            for aircraft, loadings in by_aircraft.values():
                for at in range(0, len(loadings), per_call):
                    placed = check_columns(aircraft, loadings[at : at + per_call])
                    chunks.extend({id(c): c for c, _ in placed}.values())
        print(f"check_columns, {per_call:4d} a call   {best(columns, len(resolved)):7.1f}")
        written = best(lambda: [result_texts(c) for c in chunks], len(resolved))
        print(f"result_texts, {per_call:4d} a call    {written:7.1f}")
print(f"to_dict                      {best(lambda: [r.to_dict() for r in results], len(results)):7.1f}")
lines = [r.to_dict() for r in results]
print(f"orjson line                  {best(lambda: [orjson.dumps(d) for d in lines], len(lines)):7.1f}")
"""


def _day(path: Path, count: int) -> Path:
    sys.path.insert(0, str(Path(__file__).resolve().parent))
    from fleet import _day as write_day

    return write_day(path, count)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--n", type=int, default=10_000)
    parser.add_argument("--per-call", type=int, nargs="+", default=[85, 256])
    parser.add_argument("--repeat", type=int, default=3)
    parser.add_argument("--old", metavar="COMMIT", help="also time the package as it was at this commit")
    parser.add_argument(
        "--collected",
        action="store_true",
        help="leave the cycle collector on during each stage (the figures before 2026-12-03)",
    )
    args = parser.parse_args()
    code = STAGES.replace("FLEET", repr(str(ROOT / "sample_aircraft")))
    with tempfile.TemporaryDirectory() as folder:
        day = _day(Path(folder) / "day.csv", args.n)
        packages = {"now": ROOT}
        if args.old:
            packages[args.old] = extract(args.old, Path(folder) / "old").parent
        for name, path in packages.items():
            print(f"{name}: us of CPU a row, best of {args.repeat}, {args.n:,} rows", flush=True)
            env = {**os.environ, "PYTHONPATH": str(path)}
            command = [sys.executable, "-c", code, str(day), str(args.repeat), str(int(not args.collected))]
            command += [str(n) for n in args.per_call]
            subprocess.run(command, check=True, env=env, cwd="/")


if __name__ == "__main__":
    main()
