"""`bondgap serve` stays on this machine unless told otherwise, and then says what that means."""

from pathlib import Path

import httpx
import pytest
import uvicorn

from app.cli import main
from tests.conftest import serving


@pytest.fixture
def no_serving(monkeypatch) -> None:
    """Run `serve` up to the point where uvicorn would serve, then return."""
    def run(self, sockets=None) -> None:
        for sock in sockets or ():
            sock.close()

    monkeypatch.setattr(uvicorn.Server, "run", run)


@pytest.mark.parametrize("host", ["0.0.0.0", "::", "192.0.2.1"])
def test_a_non_loopback_address_needs_allow_remote(host: str, tmp_path: Path, capsys) -> None:
    db = tmp_path / "bondgap.db"
    assert main(["serve", "--host", host, "--port", "0", "--db", str(db)]) == 2
    err = capsys.readouterr().err
    assert err.startswith(f"bondgap: error: refusing to listen on {host}")
    assert "--allow-remote" in err and err.count("\n") == 1
    assert not db.exists()  # refused before the database is opened


@pytest.mark.parametrize("host", ["127.0.0.1", "localhost", "127.0.0.2"])
def test_loopback_addresses_serve_without_a_warning(host: str, db_path: Path, capsys,
                                                    no_serving) -> None:
    assert main(["serve", "--host", host, "--port", "0", "--db", str(db_path)]) == 0
    out, err = capsys.readouterr()
    assert "serving http://" in out and err == ""


def test_allow_remote_serves_with_a_warning_on_stderr(db_path: Path, capsys,
                                                      no_serving) -> None:
    argv = ["serve", "--host", "0.0.0.0", "--allow-remote", "--allow-host", "lab-pc.example",
            "--port", "0", "--db", str(db_path)]
    assert main(argv) == 0
    out, err = capsys.readouterr()
    assert "serving http://0.0.0.0:" in out and "WARNING" not in out
    assert err.startswith("bondgap: WARNING: listening on 0.0.0.0: anyone who can reach")
    assert "no login" in err and "lab-pc.example" in err and err.count("\n") == 1


def test_a_remote_server_answers_only_to_the_names_it_was_given(db_path: Path,
                                                                 tmp_path: Path) -> None:
    log = tmp_path / "server.log"
    with serving(db_path, log, "--host", "0.0.0.0", "--allow-remote",
                 "--allow-host", "lab-pc.example") as server:
        port = server.url.rsplit(":", 1)[1]
        named = httpx.get(server.url + "/api/status", headers={"Host": f"lab-pc.example:{port}"})
        assert named.status_code == 200
        other = httpx.get(server.url + "/api/status", headers={"Host": f"evil.example:{port}"})
        assert other.status_code == 400
    assert "WARNING" in log.read_text()
