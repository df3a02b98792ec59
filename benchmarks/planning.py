"""Computation time of each planning answer on the sample aircraft (target: under 50 ms each).

Run on demand:  python benchmarks/planning.py
"""

from __future__ import annotations

import statistics
import time
from pathlib import Path

from loadcheck import load_check_inputs
from loadcheck import planning as P

ROOT = Path(__file__).resolve().parent.parent / "sample_aircraft"

QUESTIONS = [
    ("trainer4/within.toml", "most fuel", lambda a, ld: P.most_fuel(a, ld)),
    ("trainer4/within.toml", "longest trip", lambda a, ld: P.longest_trip(a, ld, rate=9.5, reserve=8)),
    ("trainer4/within.toml", "most payload hold", lambda a, ld: P.most_payload(a, ld, "hold")),
    ("trainer4/within.toml", "fuel to leave, rear 220 lb", lambda a, ld: P.fuel_to_leave(a, ld, "rear", 220.0)),
    ("twin6/two_stretches.toml", "most fuel (two stretches)", lambda a, ld: P.most_fuel(a, ld)),
    ("twin6/within.toml", "most payload nose", lambda a, ld: P.most_payload(a, ld, "nose")),
    ("tandem2/aft_heavy.toml", "least ballast", lambda a, ld: P.least_ballast(a, ld)),
    ("tandem2/aft_heavy.toml", "weight shift", lambda a, ld: P.weight_shift(a, ld, "baggage", "front")),
    ("heli2/solo_heavy_right.toml", "most payload bag_left", lambda a, ld: P.most_payload(a, ld, "bag_left")),
]


def main() -> None:
    print(f"{'sample':32} {'question':30} {'median ms':>10}")
    for name, words, ask in QUESTIONS:
        inputs = load_check_inputs(ROOT / name)
        ask(inputs.aircraft, inputs.loading)  # warm up
        times = []
        for _ in range(7):
            start = time.perf_counter()
            ask(inputs.aircraft, inputs.loading)
            times.append(time.perf_counter() - start)
        print(f"{name:32} {words:30} {statistics.median(times) * 1000:10.1f}")


if __name__ == "__main__":
    main()
