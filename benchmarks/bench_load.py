"""Load test on loopback: N concurrent clients for T seconds against the real server.

Starts `bondgap serve --port 0` (uvicorn, one process) on 127.0.0.1 with a fresh database in a
temporary folder, reads the address it prints, warms every endpoint up (the first finder
request builds the composition grids), then runs N client threads (default 20), each with its
own keep-alive `httpx.Client`, for T seconds (default 20). Every client cycles through the
endpoints, starting at a different one, so they are loaded together:

* the table page `/compounds`;
* a compound page `/compounds/GaAs`;
* the JSON API `/api/compounds/GaAs`;
* the finder page for InGaAsP on InP at 1550 nm, |f| <= 0.001.

With `--each`, every endpoint is loaded alone for T seconds instead, one after the other.

Prints per endpoint: requests, requests per second, p50, p99 and slowest latency (whole HTTP
requests as the client sees them: queueing in the server included), and errors (any status but
200, a timeout or a broken connection). Targets: p99 < 0.5 s for the pages and the JSON API,
p99 < 1 s for the finder; each is printed PASS or MISS. A non-zero error count is printed
loudly, with the end of the server's log. The exit code is 0 either way: figures, not asserts.

The load generator runs on the same machine as the server and takes part of its CPU (2 cores on
the project's machines, which other sessions may share): read the figures with that in mind.

Run: python benchmarks/bench_load.py [--clients 20] [--seconds 20] [--each]
"""

from __future__ import annotations

import argparse
import contextlib
import math
import os
import re
import signal
import subprocess
import sys
import tempfile
import threading
import time
from collections import Counter
from collections.abc import Iterator
from dataclasses import dataclass, field
from pathlib import Path

import httpx

ROOT = Path(__file__).resolve().parent.parent
PAGE_TARGET_S = 0.5
FINDER_TARGET_S = 1.0
REQUEST_TIMEOUT_S = 30.0
"""Longest wait for one answer; a request still unanswered counts as an error."""
START_TIMEOUT_S = 120.0
"""Longest wait for the server to print its address (the first start seeds the database)."""
WARM_UP_REPEATS = 3


@dataclass(frozen=True)
class Endpoint:
    label: str
    path: str
    target_s: float


ENDPOINTS = (
    Endpoint("table page", "/compounds", PAGE_TARGET_S),
    Endpoint("compound page", "/compounds/GaAs", PAGE_TARGET_S),
    Endpoint("JSON API", "/api/compounds/GaAs", PAGE_TARGET_S),
    Endpoint("finder page", "/alloys?system=InGaAsP&on=InP&wavelength=1550&max_mismatch=0.001",
             FINDER_TARGET_S),
)


@dataclass
class Tally:
    """What the clients saw for one endpoint (appended to by several threads under `lock`)."""

    latencies_s: list[float] = field(default_factory=list)
    errors: Counter[str] = field(default_factory=Counter)
    lock: threading.Lock = field(default_factory=threading.Lock)


@contextlib.contextmanager
def server(folder: Path) -> Iterator[str]:
    """Run `bondgap serve --port 0` on 127.0.0.1; yield its base URL; stop it by its pid."""
    with served(folder) as (url, _pid):
        yield url


@contextlib.contextmanager
def served(folder: Path) -> Iterator[tuple[str, int]]:
    """Run `bondgap serve --port 0` on 127.0.0.1; yield its base URL and pid; stop it."""
    log_path = folder / "server.log"
    with log_path.open("w") as log:
        proc = subprocess.Popen(
            [sys.executable, "-m", "app", "serve", "--host", "127.0.0.1", "--port", "0",
             "--db", str(folder / "bondgap.db")],
            cwd=ROOT, stdout=log, stderr=subprocess.STDOUT,
            env={**os.environ, "PYTHONUNBUFFERED": "1"})
        try:
            yield _served_url(proc, log_path), proc.pid
        finally:
            if proc.poll() is None:
                os.kill(proc.pid, signal.SIGTERM)
                try:
                    proc.wait(timeout=10)
                except subprocess.TimeoutExpired:
                    os.kill(proc.pid, signal.SIGKILL)
                    proc.wait()


def _served_url(proc: subprocess.Popen[bytes], log_path: Path) -> str:
    """The address the server prints once it listens (loopback only), within the timeout."""
    deadline = time.monotonic() + START_TIMEOUT_S
    pattern = re.compile(r"serving (http://127\.0\.0\.1:\d+)/")
    while time.monotonic() < deadline:
        found = pattern.search(log_path.read_text())
        if found:
            url = found.group(1)
            with contextlib.suppress(httpx.TransportError):
                if httpx.get(url + "/api/status", timeout=5).status_code == 200:
                    return url
        if proc.poll() is not None:
            raise RuntimeError(f"the server exited:\n{log_path.read_text()}")
        time.sleep(0.2)
    raise RuntimeError(f"the server did not answer within {START_TIMEOUT_S:g} s")


def varied(path: str, turn: int) -> str:
    """The path with a temperature that differs from request to request (defeats the cache)."""
    return f"{path}{'&' if '?' in path else '?'}temperature={250 + turn % 997 * 0.5:g}"


def client_loop(url: str, endpoints: tuple[Endpoint, ...], first: int, stop_at: float,
                tallies: dict[str, Tally], uncached: bool = False) -> None:
    """One client: request the endpoints in turn until `stop_at`, timing each answer."""
    turn = first
    with httpx.Client(base_url=url, timeout=REQUEST_TIMEOUT_S) as client:
        while time.monotonic() < stop_at:
            endpoint = endpoints[turn % len(endpoints)]
            turn += 1
            error = None
            start = time.perf_counter()
            try:
                path = varied(endpoint.path, turn) if uncached else endpoint.path
                response = client.get(path)
                if response.status_code != 200:
                    error = f"status {response.status_code}"
            except httpx.HTTPError as exc:
                error = f"{type(exc).__name__}: {exc}"[:120]
            elapsed = time.perf_counter() - start
            tally = tallies[endpoint.label]
            with tally.lock:
                if error is None:
                    tally.latencies_s.append(elapsed)
                else:
                    tally.errors[error] += 1


def percentile(values: list[float], p: float) -> float:
    """Nearest-rank percentile (NaN for no values)."""
    if not values:
        return math.nan
    ordered = sorted(values)
    return ordered[max(0, math.ceil(p / 100 * len(ordered)) - 1)]


def run_load(url: str, endpoints: tuple[Endpoint, ...], clients: int, seconds: float,
             uncached: bool = False) -> tuple[dict[str, Tally], float]:
    """N client threads for `seconds`; returns the tallies and the wall time until all ended."""
    tallies = {e.label: Tally() for e in endpoints}
    start = time.monotonic()
    threads = [threading.Thread(target=client_loop, args=(url, endpoints, i, start + seconds,
                                                          tallies, uncached), daemon=True)
               for i in range(clients)]
    for thread in threads:
        thread.start()
    for thread in threads:  # each stops after its last request (at most the request timeout)
        thread.join(seconds + REQUEST_TIMEOUT_S + 5)
    return tallies, time.monotonic() - start


def report(endpoints: tuple[Endpoint, ...], tallies: dict[str, Tally], wall_s: float) -> int:
    """Print one line per endpoint and the verdicts; return the number of errors."""
    print(f"  {'endpoint':<14} {'requests':>8} {'req/s':>7} {'p50 ms':>8} {'p99 ms':>8} "
          f"{'max ms':>8} {'errors':>6}  target p99")
    errors = 0
    for endpoint in endpoints:
        tally = tallies[endpoint.label]
        done, failed = len(tally.latencies_s), sum(tally.errors.values())
        errors += failed
        p50, p99 = percentile(tally.latencies_s, 50), percentile(tally.latencies_s, 99)
        slowest = max(tally.latencies_s, default=math.nan)
        verdict = "PASS" if p99 < endpoint.target_s and not failed else "MISS"
        print(f"  {endpoint.label:<14} {done + failed:>8} {(done + failed) / wall_s:>7.1f} "
              f"{p50 * 1e3:>8.0f} {p99 * 1e3:>8.0f} {slowest * 1e3:>8.0f} {failed:>6}  "
              f"< {endpoint.target_s * 1e3:.0f} ms: {verdict}")
        for message, count in tally.errors.most_common(3):
            print(f"      {count} x {message}")
    total = sum(len(t.latencies_s) + sum(t.errors.values()) for t in tallies.values())
    print(f"  all: {total} requests in {wall_s:.1f} s = {total / wall_s:.1f} req/s")
    return errors


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--clients", type=int, default=20, help="concurrent clients (20)")
    parser.add_argument("--seconds", type=float, default=20.0, help="duration of a run (20)")
    parser.add_argument("--uncached", action="store_true",
                        help="give every request its own temperature, so no answer is a "
                        "repeat and the response cache never serves it")
    parser.add_argument("--each", action="store_true",
                        help="load each endpoint alone, one after the other")
    args = parser.parse_args()
    runs = [(e,) for e in ENDPOINTS] if args.each else [ENDPOINTS]
    with tempfile.TemporaryDirectory() as tmp, server(Path(tmp)) as url:
        load = os.getloadavg()
        print(f"bondgap serve on {url} (one uvicorn process, fresh database); {os.cpu_count()} "
              f"CPUs shared with this load generator and any other work (load average before: "
              f"{load[0]:.2f} {load[1]:.2f} {load[2]:.2f})")
        with httpx.Client(base_url=url, timeout=REQUEST_TIMEOUT_S) as client:
            for endpoint in ENDPOINTS:
                for _ in range(WARM_UP_REPEATS):
                    client.get(endpoint.path)
        errors = 0
        for endpoints in runs:
            what = "together" if len(endpoints) > 1 else "alone"
            mode = " (every request a new temperature: no cache hits)" if args.uncached else ""
            print(f"\n{args.clients} clients for {args.seconds:g} s{mode}, "
                  f"{', '.join(e.label for e in endpoints)} {what}:")
            tallies, wall_s = run_load(url, endpoints, args.clients, args.seconds,
                                       args.uncached)
            errors += report(endpoints, tallies, wall_s)
        if errors:
            print(f"\n!!! {errors} ERRORS: every request should have answered 200 !!!")
            print("end of the server's log:\n" + (Path(tmp) / "server.log").read_text()[-3000:])


if __name__ == "__main__":
    main()
