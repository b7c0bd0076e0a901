"""Benchmark of the alloy pages as a user gets them: the real app on loopback, timed over HTTP.

Starts `bondgap serve` (uvicorn) in a subprocess on 127.0.0.1 and a free port with a fresh
database in a temporary folder, waits until it answers, then times whole HTTP requests
(server work, template rendering and transfer; the browser's drawing is not included):

* the finder page for InGaAsP on InP at 1550 nm, |f| <= 0.001 (the browser test's query);
* the finder page for every system on InP at 1550 nm, |f| <= 0.001 (the heavier "all");
* the same queries through `GET /api/match`;
* an alloy composition's page with its substrate block (`/compounds/In0.53Ga0.47As?on=InP`);
* the worst case: "all" on InP with neither a target nor a limit, where every composition of
  the cubic design space (about 700,000) is a match, ranked, and the best 500 are shown.

Each is requested once cold (the first request after start builds the composition grids and
gap tables), then REPEATS times warm; the median and the slowest warm time are printed, and
compared with the target of 0.5 s for an alloy page. The server is stopped by its pid.

Run: python benchmarks/bench_pages.py   (prints the figures; no assertions on timing)
"""

from __future__ import annotations

import contextlib
import os
import signal
import socket
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

import httpx

ROOT = Path(__file__).resolve().parent.parent
REPEATS = 15
TARGET_S = 0.5
REQUESTS = (
    ("finder page, InGaAsP on InP, 1550 nm", "/alloys?system=InGaAsP&on=InP&wavelength=1550"
                                            "&max_mismatch=0.001"),
    ("finder page, all systems on InP, 1550 nm", "/alloys?system=all&on=InP&wavelength=1550"
                                                "&max_mismatch=0.001"),
    ("GET /api/match, InGaAsP", "/api/match?system=InGaAsP&on=InP&wavelength=1550"
                                "&max_mismatch=0.001"),
    ("GET /api/match, all", "/api/match?system=all&on=InP&wavelength=1550&max_mismatch=0.001"),
    ("composition page on InP", "/compounds/In0.53Ga0.47As?on=InP"),
    ("worst case: finder page, all systems on InP, no target and no limit (every composition "
     "of the cubic design space matches)", "/alloys?system=all&on=InP"),
)


def free_port() -> int:
    with socket.socket() as sock:
        sock.bind(("127.0.0.1", 0))
        return sock.getsockname()[1]


@contextlib.contextmanager
def server(folder: Path):
    """Run the real app; yield its base URL; stop it by its pid."""
    port = free_port()
    log = (folder / "server.log").open("w")
    proc = subprocess.Popen(
        [sys.executable, "-m", "app", "serve", "--port", str(port), "--db",
         str(folder / "bondgap.db")], cwd=ROOT, stdout=log, stderr=subprocess.STDOUT)
    url = f"http://127.0.0.1:{port}"
    try:
        deadline = time.monotonic() + 120
        while True:
            if proc.poll() is not None:
                raise RuntimeError((folder / "server.log").read_text())
            with contextlib.suppress(httpx.TransportError):
                if httpx.get(url + "/api/status", timeout=2).status_code == 200:
                    break
            if time.monotonic() > deadline:
                raise RuntimeError("server did not answer within 120 s")
            time.sleep(0.2)
        yield url
    finally:
        if proc.poll() is None:
            os.kill(proc.pid, signal.SIGTERM)
            proc.wait(timeout=10)
        log.close()


def timed(client: httpx.Client, path: str) -> tuple[float, int, int]:
    start = time.perf_counter()
    response = client.get(path)
    elapsed = time.perf_counter() - start
    response.raise_for_status()
    return elapsed, len(response.content), response.status_code


def main() -> None:
    with tempfile.TemporaryDirectory() as tmp, server(Path(tmp)) as url, \
            httpx.Client(base_url=url, timeout=30) as client:
        print(f"bondgap serve on {url} (fresh database; {os.cpu_count()} CPUs); "
              f"{REPEATS} warm requests each, target {TARGET_S} s for an alloy page")
        for label, path in REQUESTS:
            cold, size, _ = timed(client, path)
            repeats = REPEATS if cold < 1.0 else 3
            warm = [timed(client, path)[0] for _ in range(repeats)]
            median, worst = statistics.median(warm), max(warm)
            verdict = "within" if worst < TARGET_S else "OVER"
            print(f"  {label}: cold {cold:.3f} s; warm median {median:.3f} s, slowest "
                  f"{worst:.3f} s ({verdict} {TARGET_S} s); {size / 1024:.0f} KiB")


if __name__ == "__main__":
    main()
