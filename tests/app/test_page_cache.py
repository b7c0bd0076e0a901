"""The response cache never serves stale data: any committed change retires its entries."""

from pathlib import Path

from fastapi.testclient import TestClient

from app.page_cache import PageCache


def test_cache_serves_repeats_and_forgets_after_a_write(client: TestClient, db_path: Path) -> None:
    first = client.get("/api/substrates")
    assert first.status_code == 200
    assert client.get("/api/substrates").json() == first.json()
    created = client.post("/api/substrates", json={
        "name": "CacheTest", "structure": "zincblende", "a_angstrom": 5.5})
    assert created.status_code in (200, 201), created.text
    names = [s["name"] for s in client.get("/api/substrates").json()["substrates"]]
    assert "CacheTest" in names


def test_cache_keeps_only_plain_answers(tmp_path: Path) -> None:
    cache = PageCache(app=None, db_path=tmp_path / "none.db")  # type: ignore[arg-type]
    scope = {"type": "http", "method": "GET", "path": "/x", "query_string": b"a=1",
             "headers": [(b"host", b"127.0.0.1")]}
    assert cache._key(scope) == cache._key(scope)
    other = dict(scope, query_string=b"a=2")
    assert cache._key(scope) != cache._key(other)
