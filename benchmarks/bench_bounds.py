"""Bounded cost of the heaviest GET requests: the slowest answer, and the server's memory.

Starts the real server (`bondgap serve`, one uvicorn process, fresh database, as
`bench_load.py` does) and sends the heaviest GETs the validators allow: the finder over the
whole design space with the largest `limit`, at a deep `offset`, in every costly order; the
finder page; the compound table and page; a band structure with the most k-points; the CSV
table. Each request carries its own temperature, so no answer comes from the response cache.

1. Alone, one after the other (after one warm-up each): the slowest answer and the largest
   body. Target: every request under 1 s.
2. A burst: BURST concurrent clients, each sending every heavy request (the finder ones with
   distinct temperatures). Then the server's resident memory (VmRSS, and its peak VmHWM).
   Target: under 300 MB after the burst.

The load generator shares the machine's CPUs with the server (2 cores on the project's
machines, which other sessions may share): read the times with that in mind. Figures, not
asserts: the exit code is 0 either way.

Run: python benchmarks/bench_bounds.py [--burst 8]
"""

from __future__ import annotations

import argparse
import os
import sys
import tempfile
import threading
import time
from pathlib import Path

import httpx

sys.path.insert(0, str(Path(__file__).resolve().parent))

from bench_load import REQUEST_TIMEOUT_S, served, varied  # noqa: E402

SLOWEST_TARGET_S = 1.0
RSS_TARGET_MB = 300.0
BIG = "limit=100000"
HEAVY: tuple[str, ...] = (
    f"/api/match?system=all&on=GaAs&{BIG}",
    f"/api/match?system=all&on=GaAs&{BIG}&offset=600000",
    f"/api/match?system=all&on=GaAs&{BIG}&sort=critical_thickness_nm",
    f"/api/match?system=all&on=GaAs&{BIG}&sort=band_gap_uncertainty_eV&desc=true",
    f"/api/match?system=all&on=InP&gap=1&tolerance=20&{BIG}&sort=formula",
    f"/api/match?system=all&on=GaAs&{BIG}&exclude=Cd",
    f"/alloys?system=all&on=GaAs&{BIG}",
    "/api/compounds?sort=band_gap_eV&desc=true",
    "/api/compounds.csv",
    "/compounds",
    "/compounds/GaAs",
    "/api/compounds/GaAs/bands?points=2000",
)


def memory_mb(pid: int) -> tuple[float, float]:
    """Resident memory of a process now and at its peak (VmRSS, VmHWM), MB."""
    fields = dict(line.split(":", 1) for line in Path(f"/proc/{pid}/status").read_text()
                  .splitlines() if ":" in line)
    return (int(fields["VmRSS"].split()[0]) / 1024, int(fields["VmHWM"].split()[0]) / 1024)


def alone(client: httpx.Client) -> float:
    """Each heavy request once, alone; print time and size; return the slowest time."""
    slowest = 0.0
    for turn, path in enumerate(HEAVY):
        client.get(varied(path, turn + 500))  # warm-up: grids and gap tables built
        start = time.perf_counter()
        response = client.get(varied(path, turn))
        elapsed = time.perf_counter() - start
        slowest = max(slowest, elapsed)
        print(f"  {elapsed * 1e3:7.0f} ms {len(response.content) / 1e6:7.2f} MB "
              f"{response.status_code}  {path}")
    return slowest


def burst(url: str, clients: int) -> tuple[float, int]:
    """`clients` threads, each sending every heavy request once; wall time, non-200 count."""
    failures: list[str] = []

    def one(first: int) -> None:
        with httpx.Client(base_url=url, timeout=REQUEST_TIMEOUT_S * 4) as client:
            for i in range(len(HEAVY)):
                path = HEAVY[(first + i) % len(HEAVY)]
                try:
                    status = client.get(varied(path, 1000 + first * 97 + i)).status_code
                except httpx.HTTPError as exc:
                    failures.append(type(exc).__name__)
                    continue
                if status != 200:
                    failures.append(str(status))

    start = time.monotonic()
    threads = [threading.Thread(target=one, args=(c,)) for c in range(clients)]
    for thread in threads:
        thread.start()
    for thread in threads:
        thread.join()
    return time.monotonic() - start, len(failures)


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--burst", type=int, default=8, help="concurrent clients (8)")
    args = parser.parse_args()
    with tempfile.TemporaryDirectory() as tmp, served(Path(tmp)) as (url, pid):
        load = os.getloadavg()
        print(f"bondgap serve on {url}, pid {pid}; load average before {load[0]:.2f}; "
              f"memory at start {memory_mb(pid)[0]:.0f} MB")
        with httpx.Client(base_url=url, timeout=REQUEST_TIMEOUT_S * 4) as client:
            print("\nalone (after one warm-up each):")
            slowest = alone(client)
        verdict = "PASS" if slowest < SLOWEST_TARGET_S else "MISS"
        print(f"  slowest: {slowest * 1e3:.0f} ms (target < {SLOWEST_TARGET_S * 1e3:.0f} ms): "
              f"{verdict}")
        wall, failed = burst(url, args.burst)
        rss, peak = memory_mb(pid)
        verdict = "PASS" if rss < RSS_TARGET_MB and not failed else "MISS"
        print(f"\nburst: {args.burst} clients x {len(HEAVY)} heavy requests in {wall:.1f} s, "
              f"{failed} not 200")
        print(f"  server memory after the burst: {rss:.0f} MB (peak {peak:.0f} MB; target "
              f"< {RSS_TARGET_MB:.0f} MB after): {verdict}")


if __name__ == "__main__":
    main()
