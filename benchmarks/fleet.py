"""`loadcheck fleet check` against its floor, the CSV -> batch engine -> JSON Lines pipeline, side by side.

Run on demand:  python benchmarks/fleet.py [--n 10000 100000] [--repeat 3] [--workers 1] [--old COMMIT]

The loadings are the rows of sample_aircraft/fleet_day.csv repeated to N rows, written to a
temporary CSV (the sample day's malformed rows included, so every run exits 2). Each
figure is the best of ``--repeat`` runs, the command and its floor alternating in the same
run, each as a fresh interpreter (start-up included), so that the ratios hold on this
shared machine whatever the other engineers run at the same time:

- the floor: read the CSV with the csv module, look each row's cells up as numbers (a
  tank level by its name), evaluate each aircraft's rows with the batch engine in chunks,
  write one JSON line per row (verdict, first finding, takeoff and landing weight and CG);
- ``fleet check --json --no-log``, the same with recording (``--db``), and with the table;
  target: at most 2x the floor (3x with recording);
- peak memory (largest resident set of the process and its workers); target: under
  300 MiB at 100,000 rows and flat from 100,000 to 1,000,000;
- with ``--old COMMIT``: ``fleet check --json --no-log`` of the package as it was at that
  commit, in the same run.

Each figure is given as wall time and as CPU time (user and system, of the process and its
workers), each with its ratio to the floor's: on a busy machine the CPU ratio is the steadier.
The floor writes its lines with orjson, the encoder fleet check uses. The package (and the older
one) is compiled before the runs, as an installed package is: with PYTHONDONTWRITEBYTECODE set,
every run would otherwise compile it again (about 0.1 s of CPU for `check --json`, measured 2026-12-04; the figures of
earlier days include that).
"""

from __future__ import annotations

import argparse
import compileall
import csv
import os
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent

FLOOR = r"""
import csv, sys
import numpy as np
import orjson
from loadcheck.engine import evaluate
from loadcheck.fleet import load_fleet
fleet = load_fleet(sys.argv[1])
planes = {e.registration: e.aircraft for e in fleet.entries if e.aircraft is not None}
out = sys.stdout.buffer
line_of = lambda row: orjson.dumps(row, option=orjson.OPT_APPEND_NEWLINE)
with open(sys.argv[2], newline="") as handle:
    reader = csv.reader(handle)
    header = [h.split(" [")[0] for h in next(reader)]
    col = {h: i for i, h in enumerate(header)}
    def flush(reg, rows):
        a = planes[reg]
        st = np.array([[r[0][s] for s in range(len(a.station))] for r in rows]).reshape(len(rows), -1)
        fu = np.array([[r[1][t] for t in range(len(a.tank))] for r in rows]).reshape(len(rows), -1)
        tx = np.array([r[2] for r in rows]); tr = np.array([r[3] for r in rows])
        found = evaluate(a, st, fu, tx, tr)
        ok, first = found.ok.tolist(), found.first_finding.tolist()
        tw, ta = found.weight["takeoff"].tolist(), found.arm["takeoff"].tolist()
        lw, la = found.weight["landing"].tolist(), found.arm["landing"].tolist()
        for k, r in enumerate(rows):
            row = {"line": r[4], "registration": reg, "ok": ok[k], "first": first[k],
                   "takeoff": [tw[k], ta[k]], "landing": [lw[k], la[k]]}
            out.write(line_of(row))
    def number(text, levels=None):
        if not text:
            return 0.0
        try:
            return float(text)
        except ValueError:
            return levels.get(text, 0.0) if levels else 0.0
    pending = {}
    for line, cells in enumerate(reader, start=2):
        reg = cells[col["registration"]]
        a = planes.get(reg)
        if a is None:
            out.write(line_of({"line": line, "input_error": ["unknown"]}))
            continue
        st = [number(cells[col[s.id]]) if s.id in col else 0.0 for s in a.station]
        fu = [min(number(cells[col[t.id]], {**t.levels, "full": t.usable}), t.usable) if t.id in col else 0.0
              for t in a.tank]
        taxi = number(cells[col["taxi"]]) if "taxi" in col else 0.0
        trip = number(cells[col["trip"]]) if "trip" in col else 0.0
        pending.setdefault(reg, []).append((st, fu, taxi, trip, line))
        if len(pending[reg]) >= 4096:
            flush(reg, pending.pop(reg))
    for reg, rows in pending.items():
        flush(reg, rows)
"""

MEASURED = (
    "import resource, subprocess, sys; run = subprocess.run(sys.argv[1:], stdout=subprocess.DEVNULL, "
    "stderr=subprocess.DEVNULL); use = resource.getrusage(resource.RUSAGE_CHILDREN); "
    "print(use.ru_maxrss, run.returncode, use.ru_utime + use.ru_stime)"
)


def _run(command: list[str], env: dict[str, str] | None = None) -> tuple[float, float, float]:
    """Wall time [s], CPU time (user and system) [s] and peak resident memory of the process tree
    [MiB] of one command."""
    start = time.perf_counter()
    done = subprocess.run(  # run from outside the worktree, so that -m loadcheck is the one on PYTHONPATH
        [sys.executable, "-c", MEASURED, *command], capture_output=True, text=True, check=True, env=env, cwd="/"
    )
    wall = time.perf_counter() - start
    peak, _, cpu = done.stdout.split()
    return wall, float(cpu), int(peak) / 1024


def _old_package(commit: str, folder: Path) -> Path:
    """The package as it was at ``commit``, extracted into ``folder`` (for --old)."""
    import tarfile
    from io import BytesIO

    archive = subprocess.run(
        ["git", "-C", str(ROOT), "archive", commit, "loadcheck"], capture_output=True, check=True
    ).stdout
    with tarfile.open(fileobj=BytesIO(archive)) as tar:
        tar.extractall(folder, filter="data")
    return folder


def _day(path: Path, count: int) -> Path:
    with open(ROOT / "sample_aircraft" / "fleet_day.csv", newline="") as source:
        reader = csv.DictReader(source)
        fields = reader.fieldnames or []
        rows = list(reader)
    with open(path, "w", newline="") as out:
        writer = csv.DictWriter(out, fieldnames=fields)
        writer.writeheader()
        for i in range(count):
            writer.writerow({**rows[i % len(rows)], "reference": f"R{i:07d}"})
    return path


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--n", type=int, nargs="+", default=[10_000, 100_000])
    parser.add_argument("--repeat", type=int, default=3)
    parser.add_argument("--workers", type=int, default=None, help="passed to fleet check (default: its own)")
    parser.add_argument("--table", action="store_true", help="also time the table output")
    parser.add_argument("--old", metavar="COMMIT", help="also time fleet check --json --no-log as at this commit")
    args = parser.parse_args()
    env_path = os.environ.get("PYTHONPATH", "")
    os.environ["PYTHONPATH"] = str(ROOT) + (os.pathsep + env_path if env_path else "")
    fleet = str(ROOT / "sample_aircraft")
    # every command starts from compiled modules, as an installed package does (the dependencies' are);
    # PYTHONDONTWRITEBYTECODE may be set, and then each run would compile the package again
    compileall.compile_dir(str(ROOT / "loadcheck"), quiet=1)
    with tempfile.TemporaryDirectory() as folder:
        old = _old_package(args.old, Path(folder) / "old") if args.old else None
        if old is not None:
            compileall.compile_dir(str(old), quiet=1)
        for n in args.n:
            day = str(_day(Path(folder) / f"day{n}.csv", n))
            base = [sys.executable, "-m", "loadcheck", "fleet", "check", fleet, day]
            if args.workers:
                base += ["--workers", str(args.workers)]
            cases = {
                "floor (CSV -> engine -> JSON Lines)": [sys.executable, "-c", FLOOR, fleet, day],
                "fleet check --json --no-log": [*base, "--json", "--no-log"],
                "fleet check --json, recording": [*base, "--json", "--db", str(Path(folder) / f"r{n}.sqlite3")],
            }
            if args.table:
                cases["fleet check (table) --no-log"] = [*base, "--no-log"]
            envs: dict[str, dict[str, str]] = {}
            if old is not None:
                name = f"fleet check --json --no-log at {args.old}"
                cases[name] = [*base, "--json", "--no-log"]
                envs[name] = {**os.environ, "PYTHONPATH": str(old) + (os.pathsep + env_path if env_path else "")}
            best = {name: (float("inf"), float("inf"), 0.0) for name in cases}
            for _ in range(args.repeat):
                for name, command in cases.items():
                    wall, cpu, peak = _run(command, envs.get(name))
                    best[name] = (min(best[name][0], wall), min(best[name][1], cpu), max(best[name][2], peak))
            floor, floor_cpu, _ = best["floor (CSV -> engine -> JSON Lines)"]
            print(f"N = {n:,} rows (best of {args.repeat}; ratios to the floor's wall and CPU time):")
            for name, (wall, cpu, peak) in best.items():
                print(
                    f"  {name:44} {wall:7.2f} s {wall / floor:5.2f}x   CPU {cpu:7.2f} s {cpu / floor_cpu:5.2f}x"
                    f"   peak {peak:6.0f} MiB"
                )


if __name__ == "__main__":
    main()
