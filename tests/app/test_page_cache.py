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


def test_cache_is_bounded_in_bytes(tmp_path: Path, monkeypatch) -> None:
    # Issue 10 defect 4: 256 distinct cached answers of 2 MB held 0.6 GB. Many large distinct
    # answers must stay within the byte bound, the most recent ones kept.
    import asyncio
    from concurrent.futures import ThreadPoolExecutor

    from app import page_cache

    body = b"x" * page_cache.MAX_BODY_BYTES

    async def app(scope, receive, send) -> None:
        await send({"type": "http.response.start", "status": 200,
                    "headers": [(b"content-type", b"application/json")]})
        await send({"type": "http.response.body", "body": body})

    cache = PageCache(app=app, db_path=tmp_path / "none.db")

    async def noop(message) -> None:
        return None

    async def burst() -> None:
        for i in range(page_cache.MAX_ENTRIES):
            scope = {"type": "http", "method": "GET", "path": "/api/match",
                     "query_string": f"offset={i}".encode(), "headers": []}
            await cache(scope, None, noop)

    # On a thread of its own: the browser tests leave an event loop running on this one.
    with ThreadPoolExecutor(1) as pool:
        pool.submit(asyncio.run, burst()).result()
    assert cache.bytes_kept <= page_cache.MAX_TOTAL_BYTES
    assert sum(len(e[2]) for e in cache.entries.values()) <= page_cache.MAX_TOTAL_BYTES
    entry_bytes = page_cache._size(next(iter(cache.entries.values())))
    assert len(cache.entries) == page_cache.MAX_TOTAL_BYTES // entry_bytes
    newest = (b"offset=%d" % (page_cache.MAX_ENTRIES - 1))
    assert any(key[1] == newest for key in cache.entries)
