"""Wall time of `loadcheck fleet check` on 10,000 loadings, recording included (target: under 5 s).

Run on demand:  python benchmarks/fleet.py [--n 10000]

The loadings are the rows of sample_aircraft/fleet_day.csv repeated to N rows, written to a
temporary CSV; the records go to a fresh temporary database.
"""

from __future__ import annotations

import argparse
import csv
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--n", type=int, default=10_000)
    args = parser.parse_args()
    with open(ROOT / "sample_aircraft" / "fleet_day.csv", newline="") as source:
        reader = csv.DictReader(source)
        fields = reader.fieldnames or []
        rows = list(reader)
    with tempfile.TemporaryDirectory() as folder:
        day = Path(folder) / "day.csv"
        with open(day, "w", newline="") as out:
            writer = csv.DictWriter(out, fieldnames=fields)
            writer.writeheader()
            for i in range(args.n):
                writer.writerow({**rows[i % len(rows)], "reference": f"R{i:06d}"})
        db = Path(folder) / "records.sqlite3"
        for record in (False, True):
            command = [sys.executable, "-m", "loadcheck", "fleet", "check", str(ROOT / "sample_aircraft"), str(day), "--json"]
            command += ["--record", str(db)] if record else ["--no-record"]
            start = time.perf_counter()
            run = subprocess.run(command, capture_output=True, text=True, check=False)
            wall = time.perf_counter() - start
            lines = run.stdout.count("\n")
            if lines != args.n:
                raise SystemExit(f"the run failed: {lines} JSON lines for {args.n} loadings\n{run.stderr[-2000:]}")
            print(f"fleet check of {args.n:,} loadings, {'with' if record else 'without'} recording: "
                  f"{wall:.2f} s wall ({lines:,} JSON lines, exit {run.returncode}); target under 5 s")
        print(f"record database: {db.stat().st_size / 1e6:.1f} MB" if db.exists() else "")


if __name__ == "__main__":
    main()
