"""The request guard: host allow-list (DNS rebinding), body limit, headers on every answer."""

from pathlib import Path

import pytest
from bs4 import BeautifulSoup

from app.config import Settings
from app.guard import MAX_BODY_BYTES, host_name

FOREIGN_HOSTS = ["evil.example", "evil.example:8000", "127.0.0.1.evil.example",
                 "localhost.evil.example:8000", "attacker.localhost", "0.0.0.0:8000", "[::1",
                 "127.0.0.1:80x", "localhost:", "localhost:123456"]
LOOPBACK_HOSTS = ["127.0.0.1:8000", "127.0.0.1", "localhost:8000", "LocalHost", "[::1]:8000",
                  "[::1]"]


@pytest.mark.parametrize("host", FOREIGN_HOSTS)
def test_a_foreign_host_header_is_refused(client, host: str) -> None:
    page = client.get("/compounds", headers={"Host": host})
    assert page.status_code == 400
    message = BeautifulSoup(page.text, "lxml").select_one(".error-message").get_text()
    assert message.startswith("Host header not allowed") and "\n" not in message
    api = client.get("/api/shortlists", headers={"Host": host})
    assert api.status_code == 400 and api.json()["detail"].startswith("Host header not allowed")
    change = client.post("/api/shortlists", json={"name": "rebound"}, headers={"Host": host})
    assert change.status_code == 400
    assert client.get("/api/shortlists").json()["shortlists"] == []


@pytest.mark.parametrize("host", LOOPBACK_HOSTS)
def test_loopback_host_headers_are_served(client, host: str) -> None:
    assert client.get("/api/status", headers={"Host": host}).status_code == 200
    origin = "http://" + host.lower()
    made = client.post("/api/shortlists", json={"name": host},
                       headers={"Host": host, "Origin": origin})
    assert made.status_code == 201


def test_production_settings_allow_only_loopback_and_named_hosts(tmp_path: Path) -> None:
    db = tmp_path / "x.db"
    loopback = {"127.0.0.1", "localhost", "::1"}
    assert Settings(db_path=db).host_names() == loopback  # no "testserver"
    assert Settings(db_path=db, host="0.0.0.0").host_names() == loopback
    assert Settings(db_path=db, host="::").host_names() == loopback
    named = Settings(db_path=db, host="192.168.1.20", allowed_hosts=("Lab-PC.local",))
    assert named.host_names() == loopback | {"192.168.1.20", "lab-pc.local"}


def test_host_name_parsing() -> None:
    assert host_name("[::1]:8000") == "::1" and host_name("LOCALHOST") == "localhost"
    assert host_name("127.0.0.1:0") == "127.0.0.1"
    for bad in ("", None, ":8000", "[]:1", "a:b", "a:1:2", "host:٣"):
        assert host_name(bad) is None, bad


def test_every_answer_carries_the_security_headers(client) -> None:
    for response in (client.get("/compounds"), client.get("/api/status"),
                     client.get("/static/app.css"), client.get("/nowhere"),
                     client.get("/compounds", headers={"Host": "evil.example"}),
                     client.post("/api/shortlists", json={}, headers={"X-Bondgap-Token": "x"})):
        headers = response.headers
        assert headers["x-frame-options"] == "DENY"
        assert headers["x-content-type-options"] == "nosniff"
        assert headers["referrer-policy"] == "same-origin"
        policy = headers["content-security-policy"]
        assert "script-src 'self';" in policy and "frame-ancestors 'none'" in policy
        assert "unsafe-eval" not in policy


def test_a_body_over_the_limit_is_refused_before_anything_is_stored(client) -> None:
    big = b'{"name": "big", "note": "' + b"x" * MAX_BODY_BYTES + b'"}'
    sized = client.post("/api/shortlists", content=big,
                        headers={"content-type": "application/json"})
    assert sized.status_code == 413 and "2 MB" in sized.json()["detail"]

    def chunks():  # no Content-Length: the guard counts while it reads
        for _ in range(MAX_BODY_BYTES // 65536 + 2):
            yield b"x" * 65536

    streamed = client.post("/api/measurements", content=chunks(),
                           headers={"content-type": "text/csv"})
    assert streamed.status_code == 413
    page = client.post("/shortlists", content=chunks(),
                       headers={"content-type": "application/x-www-form-urlencoded"})
    assert page.status_code == 413
    assert client.get("/api/shortlists").json()["shortlists"] == []
    assert client.get("/api/measurements").json()["measurements"] == []
