"""A bounded load test of the desk on loopback: CLIENTS pilots at once, each recording CHECKS checks
through ``POST /api/check`` (the default: 20 x 50). Every check must be recorded exactly once, none lost.

Run on demand:  python benchmarks/web_load.py [--clients 20] [--checks 50] [--write-docs]

The desk runs as ``loadcheck serve`` in a child process on a free 127.0.0.1 port, over a copy of
the sample fleet, a fresh check log and one account per client. Each check carries a front-seat
weight unique to its client and number, so the log can be matched request by request. With
--write-docs the figures replace this benchmark's own section of docs/performance.md.
"""

from __future__ import annotations

import argparse
import datetime as dt
import os
import platform
import shutil
import socket
import statistics
import subprocess
import sys
import tempfile
import threading
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
SECTION = "## Web desk under load (`python benchmarks/web_load.py`)"
PASSWORD = "load test pass phrase"


def _free_port() -> int:
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return int(s.getsockname()[1])


def _front(client: int, number: int) -> float:
    return 250.0 + client * 0.5 + number * 0.01  # unique per request, within the trainer's front-seat limit


def _client(
    url: str, name: str, checks: int, client: int, latencies: list[float], ids: list[int], errors: list[str]
) -> None:
    import httpx

    with httpx.Client(base_url=url, timeout=60) as http:
        page = http.get("/signin").text
        token = page.split('name="csrf" value="', 1)[1].split('"', 1)[0]
        signed = http.post("/signin", data={"name": name, "password": PASSWORD, "csrf": token})
        if signed.status_code != 303:
            errors.append(f"{name}: sign-in answered {signed.status_code}")
            return
        for number in range(checks):
            body = {
                "registration": "DEMO-4T",
                "load": {"front": _front(client, number), "rear": 160, "hold": "15 kg"},
                "fuel": {"mains": "school", "centre": 0},
                "burn": {"taxi": 1.2, "trip": 18},
                "record": True,
            }
            start = time.perf_counter()
            answer = http.post("/api/check", json=body)
            latencies.append(time.perf_counter() - start)
            if answer.status_code != 200:
                errors.append(f"{name} #{number}: {answer.status_code} {answer.text[:200]}")
                continue
            ids.append(int(answer.json()["record_id"]))


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--clients", type=int, default=20)
    parser.add_argument("--checks", type=int, default=50)
    parser.add_argument("--write-docs", action="store_true")
    args = parser.parse_args()
    sys.path.insert(0, str(ROOT))
    from argon2 import PasswordHasher

    from loadcheck.checklog import CheckLog
    from loadcheck.web.users import UserStore

    with tempfile.TemporaryDirectory() as folder:
        work = Path(folder)
        shutil.copytree(ROOT / "sample_aircraft", work / "fleet")
        store = UserStore(work / "users.json", hasher=PasswordHasher(time_cost=1, memory_cost=1024, parallelism=1))
        names = [f"pilot{c:02d}" for c in range(args.clients)]
        for name in names:
            store.add(name, PASSWORD, ["pilot"])
        port = _free_port()
        env = {**os.environ, "PYTHONPATH": str(ROOT) + os.pathsep + os.environ.get("PYTHONPATH", "")}
        server = subprocess.Popen(
            [
                sys.executable,
                "-m",
                "loadcheck",
                "serve",
                str(work / "fleet"),
                "--port",
                str(port),
                "--db",
                str(work / "records.sqlite3"),
                "--users",
                str(work / "users.json"),
            ],
            env=env,
            stderr=subprocess.PIPE,
            text=True,
        )
        try:
            deadline = time.monotonic() + 30
            while time.monotonic() < deadline:
                try:
                    socket.create_connection(("127.0.0.1", port), timeout=0.2).close()
                    break
                except OSError:
                    time.sleep(0.1)
            url = f"http://127.0.0.1:{port}"
            latencies: list[float] = []
            ids: list[int] = []
            errors: list[str] = []
            threads = [
                threading.Thread(target=_client, args=(url, name, args.checks, c, latencies, ids, errors))
                for c, name in enumerate(names)
            ]
            start = time.perf_counter()
            for thread in threads:
                thread.start()
            for thread in threads:
                thread.join()
            wall = time.perf_counter() - start
        finally:
            server.terminate()
            server.wait(10)
        with CheckLog(work / "records.sqlite3") as log:
            records = list(log.find())
    expected = {(names[c], round(_front(c, n), 6)) for c in range(args.clients) for n in range(args.checks)}
    found = [(r.pilot, round(float(r.inputs["load"]["front"]), 6)) for r in records]
    total = args.clients * args.checks
    exactly_once = len(found) == total and set(found) == expected and len(set(ids)) == total == len(ids)
    p50 = statistics.median(latencies) * 1000
    p99 = statistics.quantiles(latencies, n=100, method="inclusive")[98] * 1000
    lines = [
        f"{args.clients} clients x {args.checks} recorded checks = {total} requests in {wall:.1f} s "
        f"({total / wall:.0f} checks/s); latency p50 {p50:.0f} ms, p99 {p99:.0f} ms, max "
        f"{max(latencies) * 1000:.0f} ms",
        f"records in the log: {len(records)}; every check recorded exactly once: "
        f"{'yes' if exactly_once else 'NO'}; errors: {len(errors)}",
    ]
    for line in lines + errors[:5]:
        print(line)
    if args.write_docs:
        _write_docs(lines, args)
    if not exactly_once or errors:
        raise SystemExit(1)


def _write_docs(lines: list[str], args: argparse.Namespace) -> None:
    """Replace this benchmark's own section of docs/performance.md (appended the first time)."""
    path = ROOT / "docs" / "performance.md"
    text = path.read_text(encoding="utf-8")
    machine = (
        f"{platform.python_implementation()} {platform.python_version()}, {os.cpu_count()} cores, "
        f"{dt.date.today().isoformat()}"
    )
    section = "\n".join(
        [
            SECTION,
            "",
            f"The desk (`loadcheck serve`, one uvicorn process) on loopback; {args.clients} pilots signed in "
            "at once, each "
            f"recording {args.checks} checks of the sample trainer through `POST /api/check` with `record: true`, one "
            "request after the other. Each check's front-seat weight is unique, so the check log is matched request "
            f"by request afterwards. Measured on {machine}:",
            "",
            *[f"- {line}" for line in lines],
            "",
            "Each request looks at the fleet folder's files (read again when one changed, so a mechanic's new record "
            "shows at the next check), checks, and appends one record in its own SQLite transaction; the writes are "
            "serialised by SQLite's lock. The latencies are measured by the 20 client threads, which share one "
            "Python process (and its lock) with each other, on the same two cores as the desk.",
            "",
        ]
    )
    start = text.find(SECTION)
    if start == -1:
        text = text.rstrip("\n") + "\n\n" + section
    else:
        following = text.find("\n## ", start + len(SECTION))
        text = text[:start] + section + (text[following + 1 :] if following != -1 else "")
    path.write_text(text, encoding="utf-8")


if __name__ == "__main__":
    main()
