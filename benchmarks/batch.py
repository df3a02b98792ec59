"""Throughput of the engine (loadcheck.engine.evaluate) against its floor and the single check.

Run on demand:  python benchmarks/batch.py [--n 1000000] [--loop 10000] [--busy]

Printed side by side in one run:
- loadings per second of ``engine.evaluate`` (four conditions, every limit, burn path) at N,
  and its CPU time (above the wall time where a BLAS thread pool spins);
- the tight floor: the same numpy arithmetic for the four conditions, chunked as the
  engine is, the burn order honoured, no BLAS, plus one ``shapely.intersects_xy`` call per
  condition on the same arrays, and the ratio to it (target: within 2x; at least
  1,000,000 loadings per second, also with ``--busy``: one other core kept busy);
- the speed-up over calling ``check_loading`` in a Python loop (target: at least 50x at 10^4);
- peak memory of the process at N (target: under 1 GiB).
"""

from __future__ import annotations

import argparse
import resource
import sys
import time
from pathlib import Path

import numpy as np
import shapely

from loadcheck import check_loading, load_aircraft
from loadcheck.engine import CHUNK, evaluate
from loadcheck.loading import Loading

ROOT = Path(__file__).resolve().parent.parent
sys.path.append(str(ROOT))  # append: engine_cpu.py's older-commit runs keep their own loadcheck

from tests.helpers import random_loadings  # noqa: E402

CASES = [("trainer4", None), ("twin6", ("aux", "mains"))]


def floor(aircraft, stations, fuel, taxi, trip, order=None) -> float:
    """The tight floor: chunked like the engine, the burn order honoured, no BLAS.

    Plain numpy weight and moment of the four conditions (tank quantities after taxi and
    trip in the burn order) plus one ``shapely.intersects_xy`` per condition, in chunks of
    ``engine.CHUNK`` loadings, every product written without BLAS (``numpy.einsum``).
    """
    start = time.perf_counter()
    arms = np.array([s.arm for s in aircraft.station])
    tank_arms = np.array([t.arm_at(t.usable) for t in aircraft.tank])
    rho = np.array([aircraft.density(t) for t in aircraft.tank])
    ids = [t.id for t in aircraft.tank]
    sequence = None if order is None else [ids.index(x) for x in order]
    shape = aircraft.envelopes_for(aircraft.categories[0])[0].shape
    for i in range(0, len(taxi), CHUNK):
        st, fu, tx, tr = stations[i : i + CHUNK], fuel[i : i + CHUNK], taxi[i : i + CHUNK], trip[i : i + CHUNK]
        pay_w = aircraft.empty.weight + st.sum(1)
        pay_m = aircraft.empty.moment + np.einsum("ij,j->i", st, arms)
        total = fu.sum(1)
        for burned in (np.zeros_like(tx), tx, tx + tr, total):
            if sequence is None:
                left = fu * np.clip(1 - burned / np.where(total > 0, total, 1), 0, 1)[:, None]
            else:
                left, remaining = fu.copy(), burned.copy()
                for tank in sequence:
                    used = np.minimum(left[:, tank], remaining)
                    left[:, tank] -= used
                    remaining -= used
            mass = left * rho
            w = pay_w + mass.sum(1)
            m = pay_m + np.einsum("ij,j->i", mass, tank_arms)
            x, y = shape.coords(w, m, np.zeros_like(w))
            shapely.intersects_xy(
                shape.covering, (x - shape.origin[0]) / shape.span[0], (y - shape.origin[1]) / shape.span[1]
            )
    return time.perf_counter() - start


def loop(aircraft, stations, fuel, taxi, trip, order) -> float:
    start = time.perf_counter()
    for i in range(len(taxi)):
        check_loading(
            aircraft,
            Loading(
                load={s.id: stations[i, j] for j, s in enumerate(aircraft.station)},
                fuel={t.id: fuel[i, j] for j, t in enumerate(aircraft.tank)},
                burn={"taxi": taxi[i], "trip": trip[i], "order": list(order) if order else "together"},
            ),
        )
    return time.perf_counter() - start


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--n", type=int, default=1_000_000)
    parser.add_argument("--loop", type=int, default=10_000)
    parser.add_argument("--repeat", type=int, default=3)
    parser.add_argument("--busy", action="store_true", help="keep one other core busy (a spinning process) throughout")
    args = parser.parse_args()
    spinner = None
    if args.busy:
        import subprocess
        import sys

        spinner = subprocess.Popen([sys.executable, "-c", "while True: pass"])
    try:
        _measure(args)
    finally:
        if spinner is not None:
            spinner.kill()
            spinner.wait()


def _measure(args: argparse.Namespace) -> None:
    for name, order in CASES:
        aircraft = load_aircraft(ROOT / "sample_aircraft" / name / "aircraft.toml")
        data = random_loadings(aircraft, args.n, order)
        evaluate(aircraft, *(a[:1000] for a in data), order=order)  # warm up
        engine, base, cpu = float("inf"), float("inf"), float("inf")
        for _ in range(args.repeat):  # best of several: this machine is shared and noisy
            start, start_cpu = time.perf_counter(), time.process_time()
            result = evaluate(aircraft, *data, order=order)
            engine = min(engine, time.perf_counter() - start)
            cpu = min(cpu, time.process_time() - start_cpu)
            base = min(base, floor(aircraft, *data, order))
        small = tuple(a[: args.loop] for a in data)
        start = time.perf_counter()
        evaluate(aircraft, *small, order=order)
        engine_small = time.perf_counter() - start
        single = loop(aircraft, *small, order)
        print(f"{name} (burn order {'together' if order is None else ', '.join(order)}), N = {args.n:,}:")
        print(
            f"  batch engine:     {engine:6.2f} s  {args.n / engine:12,.0f} loadings/s  (within limits: "
            f"{result.ok.mean():.1%}; "
            f"CPU {cpu:.2f} s)"
        )
        print(
            f"  floor:            {base:6.2f} s  {args.n / base:12,.0f} loadings/s  ratio engine/floor "
            f"{engine / base:.2f}"
        )
        print(
            f"  single-check loop at N = {args.loop:,}: {single:.2f} s; batch {engine_small * 1000:.0f} ms; "
            f"speed-up {single / engine_small:,.0f}x"
        )
        # the same engine on a day where every loading is within limits (every burn path is tested in full)
        good = tuple(a[result.ok] for a in data)
        reps = -(-args.n // max(1, len(good[0])))
        good = tuple(np.concatenate([a] * reps)[: args.n] for a in good)
        within, base_within = float("inf"), float("inf")
        for _ in range(args.repeat):
            start = time.perf_counter()
            evaluate(aircraft, *good, order=order)
            within = min(within, time.perf_counter() - start)
            base_within = min(base_within, floor(aircraft, *good, order))
        print(
            f"  only loadings within limits: {within:6.2f} s  {args.n / within:12,.0f} loadings/s  "
            f"ratio engine/floor {within / base_within:.2f}"
        )
    peak = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024
    print(f"peak memory of this process: {peak:,.0f} MiB")


if __name__ == "__main__":
    main()
