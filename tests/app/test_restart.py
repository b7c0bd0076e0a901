import contextlib
import os
import signal
import subprocess
import sys
import time
from collections.abc import Iterator
from pathlib import Path

import httpx

from tests.conftest import REPO_ROOT, free_port


@contextlib.contextmanager
def serving(db: Path, log: Path) -> Iterator[str]:
    """`bondgap serve` on a free port, stopped by its pid (SIGTERM) when the block ends."""
    port = free_port()
    with log.open("a") as out:
        proc = subprocess.Popen(
            [sys.executable, "-m", "app", "serve", "--port", str(port), "--db", str(db)],
            cwd=REPO_ROOT, stdout=out, stderr=subprocess.STDOUT,
            env={**os.environ, "PYTHONUNBUFFERED": "1"})
    url = f"http://127.0.0.1:{port}"
    try:
        deadline = time.monotonic() + 60
        while True:
            assert proc.poll() is None, log.read_text()
            with contextlib.suppress(httpx.TransportError):
                if httpx.get(url + "/api/status", timeout=2).status_code == 200:
                    break
            assert time.monotonic() < deadline, "server did not answer within 60 s"
            time.sleep(0.2)
        yield url
    finally:
        os.kill(proc.pid, signal.SIGTERM)
        try:
            proc.wait(timeout=10)
        except subprocess.TimeoutExpired:
            os.kill(proc.pid, signal.SIGKILL)
            proc.wait()


def test_shortlist_and_notes_survive_a_server_restart(db_path: Path, tmp_path: Path) -> None:
    log = tmp_path / "server.log"
    with serving(db_path, log) as url:
        made = httpx.post(url + "/api/shortlists", json={
            "name": "Review ½", "note": "keep for the 1.3 µm review", "substrate": "InP",
            "temperature_K": 77, "target_wavelength_nm": 1300}).json()
        items = f"{url}/api/shortlists/{made['id']}/items"
        assert httpx.post(items, json={"formulas": ["InP", "In0.53Ga0.47As"]}).status_code == 201
        assert httpx.patch(items + "/InP", json={"note": "substrate itself"}).status_code == 200
        before = httpx.get(f"{url}/api/shortlists/{made['id']}").json()
    with serving(db_path, log) as url:
        after = httpx.get(f"{url}/api/shortlists/{made['id']}").json()
        page = httpx.get(f"{url}/shortlists/{made['id']}").text
    assert after == before
    assert after["name"] == "Review ½" and after["note"] == "keep for the 1.3 µm review"
    assert after["conditions"]["temperature_K"] == 77.0
    assert [(i["formula"], i["note"]) for i in after["items"]] == [
        ("InP", "substrate itself"), ("In0.53Ga0.47As", "")]
    assert "substrate itself" in page
