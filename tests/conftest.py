"""Shared fixtures: Debian's chromium for pytest-playwright, fresh databases, a live server.

App modules are imported inside the fixtures, so engine-only test runs stay light.
"""

from __future__ import annotations

import contextlib
import os
import shutil
import signal
import socket
import subprocess
import sys
import time
from collections.abc import Iterator
from pathlib import Path
from typing import Any, NamedTuple

import httpx
import pytest

CHROMIUM = "/usr/bin/chromium"
REBIND_HOST = "rebind.test"
"""A name chromium resolves to 127.0.0.1 in the browser tests, as a rebinding attack would."""
CHROMIUM_ARGS = [
    "--headless",
    "--no-sandbox",
    "--disable-gpu",
    "--disable-quic",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
    f"--host-resolver-rules=MAP {REBIND_HOST} 127.0.0.1",  # a DNS-rebinding attacker's name
]
REPO_ROOT = Path(__file__).resolve().parent.parent


@pytest.fixture(scope="session")
def browser_type_launch_args(browser_type_launch_args: dict[str, Any]) -> dict[str, Any]:
    """Drive Debian's chromium (Playwright cannot download browsers here), quiet and offline."""
    args = [*browser_type_launch_args.get("args", []), *CHROMIUM_ARGS]
    return {**browser_type_launch_args, "executable_path": CHROMIUM, "args": args}


def build_database(path: Path) -> Path:
    """Create, migrate and seed a database at `path` with the app's own start-up code."""
    from app.store import open_store

    sessions = open_store(path)
    sessions.kw["bind"].dispose()  # closes the last connection: SQLite folds the WAL back in
    return path


@pytest.fixture(scope="session")
def seeded_db_template(tmp_path_factory: pytest.TempPathFactory) -> Path:
    """One seeded database per test session, copied by `db_path` (seeding runs the engine)."""
    return build_database(tmp_path_factory.mktemp("template") / "bondgap.db")


@pytest.fixture
def db_path(seeded_db_template: Path, tmp_path: Path) -> Path:
    """A fresh, seeded SQLite database file of this test's own, in tmp_path."""
    target = tmp_path / "bondgap.db"
    shutil.copyfile(seeded_db_template, target)
    return target


TEST_HOST = "testserver"
"""The Host header Starlette's TestClient sends: allowed in the tests' settings only."""


@pytest.fixture
def settings(db_path: Path) -> Any:
    """App settings pointing at this test's database (TestClient's host name allowed)."""
    from app.config import Settings

    return Settings(db_path=db_path, allowed_hosts=(TEST_HOST,))


def csrf_headers(client: Any, base_url: str = "") -> dict[str, str]:
    """The header every state-changing request needs, fetched as a client does: GET /api/token.

    Args:
        client: Anything with httpx's `get`: a TestClient, an `httpx.Client`, the `httpx` module.
        base_url: Put before the path (a live server's address, e.g. "http://127.0.0.1:8123").

    Returns:
        {"X-Bondgap-Token": token}, to pass as `headers=` (or to add to a client's headers).
    """
    answer = client.get(base_url.rstrip("/") + "/api/token")
    assert answer.status_code == 200, answer.text
    return {answer.json()["header"]: answer.json()["token"]}


@pytest.fixture
def client(settings: Any) -> Iterator[Any]:
    """A TestClient on an app built from this test's database, sending the token with every request.

    The token comes from `csrf_headers`; build a TestClient of your own for requests without it.
    """
    from fastapi.testclient import TestClient

    from app.main import create_app

    with TestClient(create_app(settings)) as test_client:
        test_client.headers.update(csrf_headers(test_client))
        yield test_client


def free_port() -> int:
    """A TCP port on 127.0.0.1 that was free a moment ago."""
    with socket.socket() as sock:
        sock.bind(("127.0.0.1", 0))
        return sock.getsockname()[1]


class Server(NamedTuple):
    """A running `bondgap serve`: its base URL (no trailing slash) and its process."""

    url: str
    process: subprocess.Popen


@contextlib.contextmanager
def serving(db: Path, log: Path, *options: str) -> Iterator[Server]:
    """Run `bondgap serve` (uvicorn) in a subprocess on 127.0.0.1 and a free port.

    Yields once the server answers; stops it by its pid afterwards (SIGTERM, then SIGKILL) if
    it still runs. Its output goes to `log` (appended).
    """
    port = free_port()
    with log.open("a") as out:
        proc = subprocess.Popen(
            [sys.executable, "-m", "app", "serve", "--port", str(port), "--db", str(db),
             *options],
            cwd=REPO_ROOT, stdout=out, stderr=subprocess.STDOUT,
            env={**os.environ, "PYTHONUNBUFFERED": "1"})
    url = f"http://127.0.0.1:{port}"
    try:
        deadline = time.monotonic() + 60
        while True:
            if proc.poll() is not None:
                raise RuntimeError(f"server exited: {log.read_text()}")
            with contextlib.suppress(httpx.TransportError):
                if httpx.get(url + "/api/status", timeout=2).status_code == 200:
                    break
            if time.monotonic() > deadline:
                raise RuntimeError("server did not answer within 60 s")
            time.sleep(0.2)
        yield Server(url, proc)
    finally:
        if proc.poll() is None:
            os.kill(proc.pid, signal.SIGTERM)
            try:
                proc.wait(timeout=10)
            except subprocess.TimeoutExpired:
                os.kill(proc.pid, signal.SIGKILL)
                proc.wait()


@pytest.fixture(scope="session")
def live_server(
    seeded_db_template: Path, tmp_path_factory: pytest.TempPathFactory
) -> Iterator[str]:
    """`serving` on a copy of the seeded database, for the whole session.

    Yields the base URL with a trailing slash.
    """
    folder = tmp_path_factory.mktemp("live")
    db = folder / "bondgap.db"
    shutil.copyfile(seeded_db_template, db)
    with serving(db, folder / "server.log") as server:
        yield server.url + "/"
