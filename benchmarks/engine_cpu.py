"""Wall and CPU time of the engine on 10^6 loadings, this code against an older commit, side by side.

Run on demand:  python benchmarks/engine_cpu.py [--old 8ebbf10] [--n 1000000] [--rounds 2]

The older package is extracted (``git archive``) to a temporary folder; each round runs
one fresh interpreter per version, alternating, each timing ``engine.evaluate`` on the
same random loadings of both samples (best of 3). A BLAS thread pool that spins on the
engine's small products shows as CPU time above what the same work takes on one thread.
"""

from __future__ import annotations

import argparse
import os
import subprocess
import sys
import tarfile
import tempfile
from io import BytesIO
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent

RUN = r"""
import sys, time
sys.path.insert(0, sys.argv[1])
sys.path.insert(1, sys.argv[2])
from loadcheck import load_aircraft
from loadcheck.engine import evaluate
from batch import random_loadings
for name, order in (("trainer4", None), ("twin6", ("aux", "mains"))):
    a = load_aircraft(sys.argv[3] + f"/sample_aircraft/{name}/aircraft.toml")
    data = random_loadings(a, int(sys.argv[4]), order)
    evaluate(a, *(x[:1000] for x in data), order=order)
    wall = cpu = float("inf")
    for _ in range(3):
        t, c = time.perf_counter(), time.process_time()
        evaluate(a, *data, order=order)
        wall, cpu = min(wall, time.perf_counter() - t), min(cpu, time.process_time() - c)
    print(f"  {sys.argv[5]:10} {name:9} wall {wall:6.2f} s  CPU {cpu:6.2f} s")
"""


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--old", default="8ebbf10")
    parser.add_argument("--n", type=int, default=1_000_000)
    parser.add_argument("--rounds", type=int, default=2)
    args = parser.parse_args()
    with tempfile.TemporaryDirectory() as folder:
        archive = subprocess.run(
            ["git", "-C", str(ROOT), "archive", args.old, "loadcheck"], capture_output=True, check=True
        ).stdout
        with tarfile.open(fileobj=BytesIO(archive)) as tar:
            tar.extractall(folder, filter="data")
        env = {k: v for k, v in os.environ.items() if k != "PYTHONPATH"}
        for round_ in range(args.rounds):
            print(f"round {round_ + 1}:")
            for label, path in ((args.old, folder), ("now", str(ROOT))):
                subprocess.run(
                    [sys.executable, "-c", RUN, path, str(ROOT / "benchmarks"), str(ROOT), str(args.n), label],
                    check=True,
                    env=env,
                )


if __name__ == "__main__":
    main()
