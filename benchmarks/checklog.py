"""`loadcheck log list` of many records: wall and CPU time of the listing, against an older commit's side by side.

Run on demand:  python benchmarks/checklog.py [--n 100000] [--old 5bdf416] [--repeat 3]

A fresh check log of N records is written (each carries the full result of a real
check of a sample loading, as a fleet check records it). Then, alternating, each as a
fresh interpreter (start-up included): ``log list`` as it is now, and, where ``--old``
is given, the listing of that commit's code (extracted with ``git archive`` under another
name; its command group is ``log``, or ``OLD_GROUP`` in a commit before it had that name), for
5bdf416 one that read every stored inputs and result and laid out a rich table. Best wall and CPU time of
``--repeat`` runs; target: under 1 s at 100,000 records.
"""

from __future__ import annotations

import argparse
import compileall
import os
import resource
import subprocess
import sys
import tempfile
import time
from pathlib import Path

from older import ROOT, extract

OLD_GROUP = "records"  # rename.py: keep (the command group's name before it was log)
LIST = (
    "import sys; sys.argv = ['loadcheck', '{group}', 'list', '--db', sys.argv[1]]\n"
    "from {package}.cli import main\n"
    "try:\n    main()\nexcept SystemExit as stop:\n    assert not stop.code, stop.code\n"
)


def _database(path: Path, count: int) -> None:
    sys.path.insert(0, str(ROOT))
    from loadcheck import check_loading, load_check_inputs
    from loadcheck.checklog import CheckLog

    inputs = load_check_inputs(ROOT / "sample_aircraft" / "twin6" / "within.toml")
    result = check_loading(inputs.aircraft, inputs.loading, samples=False).to_dict()
    aircraft = inputs.aircraft
    with CheckLog(path) as log:
        for start in range(0, count, 10_000):
            log.add_many(
                [
                    {
                        "aircraft_data": lambda: aircraft.model_dump(mode="json"),
                        "fingerprint": aircraft.fingerprint,
                        "inputs": {"load": {"row1": 380}},
                        "result": result,
                        "registration": aircraft.registration,
                        "reference": f"R{i:07d}",
                        "pilot": "C. Moreau",
                        "source": "day.csv",
                    }
                    for i in range(start, min(count, start + 10_000))
                ]
            )


def _wall(code: str, db: Path, env: dict[str, str]) -> tuple[float, float]:
    """Wall time and CPU time (user + system) of a fresh interpreter running ``code`` [s]."""
    before = resource.getrusage(resource.RUSAGE_CHILDREN)
    start = time.perf_counter()
    subprocess.run([sys.executable, "-c", code, str(db)], check=True, stdout=subprocess.DEVNULL, env=env)
    wall = time.perf_counter() - start
    after = resource.getrusage(resource.RUSAGE_CHILDREN)
    return wall, (after.ru_utime - before.ru_utime) + (after.ru_stime - before.ru_stime)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--n", type=int, default=100_000)
    parser.add_argument("--old", default=None, help="also time the listing of this commit (e.g. 5bdf416)")
    parser.add_argument("--repeat", type=int, default=3)
    args = parser.parse_args()
    with tempfile.TemporaryDirectory() as folder:
        db = Path(folder) / "records.sqlite3"
        _database(db, args.n)
        env = {**os.environ, "PYTHONPATH": os.pathsep.join([str(ROOT), folder, os.environ.get("PYTHONPATH", "")])}
        # an installed package has its bytecode compiled at install time: compile both versions here too,
        # since PYTHONDONTWRITEBYTECODE may be set (else every run would compile the changed modules again)
        compileall.compile_dir(str(ROOT / "loadcheck"), quiet=1)
        cases = {"log list (now)": LIST.format(package="loadcheck", group="log")}
        if args.old:
            package = extract(args.old, Path(folder), "loadcheck_old")  # it lists the log; it reads no sample
            group = (
                "log" if 'name="log")' in (package / "cli" / "dispatcher.py").read_text(encoding="utf-8") else OLD_GROUP
            )
            compileall.compile_dir(str(package), quiet=1)
            cases[f"log list ({args.old})"] = LIST.format(package="loadcheck_old", group=group)
        best = dict.fromkeys(cases, (float("inf"), float("inf")))
        for _ in range(args.repeat):
            for name, code in cases.items():
                wall, cpu = _wall(code, db, env)
                best[name] = (min(best[name][0], wall), min(best[name][1], cpu))
        print(
            f"{args.n:,} records, best of {args.repeat} (CPU: user + system; on a busy machine it is the "
            "steadier figure):"
        )
        for name, (wall, cpu) in best.items():
            print(f"  {name:28} {wall:7.2f} s wall {cpu:7.2f} s CPU")


if __name__ == "__main__":
    main()
