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
from typing import Any

import httpx
import pytest

CHROMIUM = "/usr/bin/chromium"
CHROMIUM_ARGS = [
    "--headless",
    "--no-sandbox",
    "--disable-gpu",
    "--disable-quic",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
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


@pytest.fixture
def settings(db_path: Path) -> Any:
    """App settings pointing at this test's database."""
    from app.config import Settings

    return Settings(db_path=db_path)


@pytest.fixture
def client(settings: Any) -> Iterator[Any]:
    """A TestClient on an app built from this test's database."""
    from fastapi.testclient import TestClient

    from app.main import create_app

    with TestClient(create_app(settings)) as test_client:
        yield test_client


def free_port() -> int:
    """A TCP port on 127.0.0.1 that was free a moment ago."""
    with socket.socket() as sock:
        sock.bind(("127.0.0.1", 0))
        return sock.getsockname()[1]


@pytest.fixture(scope="session")
def live_server(
    seeded_db_template: Path, tmp_path_factory: pytest.TempPathFactory
) -> Iterator[str]:
    """Run `bondgap serve` (uvicorn) in a subprocess on 127.0.0.1 and a free port.

    Yields the base URL once the server answers; stops the process by its pid afterwards.
    """
    folder = tmp_path_factory.mktemp("live")
    db = folder / "bondgap.db"
    shutil.copyfile(seeded_db_template, db)
    port = free_port()
    log = (folder / "server.log").open("w")
    env = {**os.environ, "PYTHONUNBUFFERED": "1"}
    proc = subprocess.Popen(
        [sys.executable, "-m", "app", "serve", "--port", str(port), "--db", str(db)],
        cwd=REPO_ROOT, stdout=log, stderr=subprocess.STDOUT, env=env,
    )
    url = f"http://127.0.0.1:{port}/"
    try:
        deadline = time.monotonic() + 60
        while True:
            if proc.poll() is not None:
                raise RuntimeError(f"server exited: {(folder / 'server.log').read_text()}")
            with contextlib.suppress(httpx.TransportError):
                if httpx.get(url + "api/status", timeout=2).status_code == 200:
                    break
            if time.monotonic() > deadline:
                raise RuntimeError("server did not answer within 60 s")
            time.sleep(0.2)
        yield url
    finally:
        if proc.poll() is None:
            os.kill(proc.pid, signal.SIGTERM)
            try:
                proc.wait(timeout=10)
            except subprocess.TimeoutExpired:
                os.kill(proc.pid, signal.SIGKILL)
                proc.wait()
        log.close()
