"""Nothing lost: WAL and full sync on every connection, concurrent writers, a killed server."""

import os
import signal
import sqlite3
import threading
import time
from concurrent.futures import ThreadPoolExecutor
from pathlib import Path

import httpx
import pytest

from app.db_file import check_database_file
from app.store import open_store
from tests.conftest import csrf_headers, serving


def alloy(n: int) -> str:
    """The n-th of many distinct compositions (In0.001Ga0.999As, ...), as the engine writes it."""
    from screening.alloy_report import normalise_material

    return normalise_material(f"In{n / 1000:.3f}Ga{1 - n / 1000:.3f}As")


def items_in(db: Path) -> list[tuple[int, str, int]]:
    with sqlite3.connect(db) as conn:
        return conn.execute("SELECT shortlist_id, formula, position FROM shortlist_items"
                            ).fetchall()


def test_every_connection_runs_with_wal_foreign_keys_and_full_sync(db_path: Path) -> None:
    engine = open_store(db_path).kw["bind"]
    barrier = threading.Barrier(4)

    def pragmas(_: int) -> tuple:
        with engine.connect() as conn:
            barrier.wait(timeout=10)  # four connections open at once: not one reused
            return tuple(conn.exec_driver_sql(f"PRAGMA {name}").scalar() for name in
                         ("journal_mode", "foreign_keys", "synchronous", "busy_timeout"))

    with ThreadPoolExecutor(4) as pool:
        seen = list(pool.map(pragmas, range(4)))
    engine.dispose()
    assert seen == [("wal", 1, 2, 10000)] * 4  # synchronous 2 = FULL


def test_concurrent_writers_lose_no_item(db_path: Path, tmp_path: Path) -> None:
    writers, each = 8, 16
    with serving(db_path, tmp_path / "server.log") as server:
        token = csrf_headers(httpx, server.url)
        lists = [httpx.post(server.url + "/api/shortlists", headers=token,
                            json={"name": f"Crowd {k}"}).json()["id"] for k in range(2)]
        barrier = threading.Barrier(writers)

        def write(k: int) -> list[tuple[int, int]]:
            answers = []
            with httpx.Client(base_url=server.url, headers=token, timeout=30) as http:
                barrier.wait(timeout=30)
                for i in range(each):
                    n = 1 + k * each + i
                    answer = http.post(f"/api/shortlists/{lists[k % 2]}/items",
                                       json={"formulas": [alloy(n)], "note": f"writer {k}"})
                    answers.append((n, answer.status_code))
            return answers

        with ThreadPoolExecutor(writers) as pool:
            answers = [a for part in pool.map(write, range(writers)) for a in part]
    assert sorted(status for _, status in answers) == [201] * writers * each
    stored = items_in(db_path)
    expected = {(lists[(n - 1) // each % 2], alloy(n)) for n in range(1, writers * each + 1)}
    assert {(s, f) for s, f, _ in stored} == expected and len(stored) == len(expected)
    for shortlist in lists:  # positions stay distinct under contention
        positions = [p for s, _, p in stored if s == shortlist]
        assert len(set(positions)) == len(positions) == writers * each // 2


def test_acknowledged_writes_survive_a_killed_server(db_path: Path, tmp_path: Path) -> None:
    log = tmp_path / "server.log"
    acknowledged: list[tuple[int, str]] = []
    with serving(db_path, log) as server:
        token = csrf_headers(httpx, server.url)
        lists = [httpx.post(server.url + "/api/shortlists", headers=token,
                            json={"name": f"Burst {k}"}).json()["id"] for k in range(4)]

        def burst(k: int) -> None:
            with httpx.Client(base_url=server.url, headers=token, timeout=10) as http:
                for i in range(1, 200):
                    try:
                        answer = http.post(f"/api/shortlists/{lists[k]}/items",
                                           json={"formulas": [alloy(k * 200 + i)]})
                    except httpx.TransportError:
                        return  # the server is gone: this write was never acknowledged
                    assert answer.status_code == 201, answer.text
                    acknowledged.append((lists[k], answer.json()["added"][0]))

        threads = [threading.Thread(target=burst, args=(k,)) for k in range(4)]
        for thread in threads:
            thread.start()
        deadline = time.monotonic() + 30
        while len(acknowledged) < 40 and time.monotonic() < deadline:
            time.sleep(0.01)
        os.kill(server.process.pid, signal.SIGKILL)  # in the middle of the burst
        server.process.wait()
        for thread in threads:
            thread.join(timeout=30)
    assert len(acknowledged) >= 40, log.read_text()
    check_database_file(db_path)  # the file, with its WAL, passes the start-up check
    with sqlite3.connect(db_path) as conn:
        assert conn.execute("PRAGMA integrity_check").fetchall() == [("ok",)]
        assert conn.execute("PRAGMA foreign_key_check").fetchall() == []
    with serving(db_path, log) as server:  # the restarted app opens it and shows every write
        shown = {(shortlist, item["formula"]) for shortlist in {s for s, _ in acknowledged}
                 for item in httpx.get(f"{server.url}/api/shortlists/{shortlist}"
                                       ).json()["items"]}
    assert set(acknowledged) <= shown
    assert set(acknowledged) <= {(s, f) for s, f, _ in items_in(db_path)}


def test_a_lock_held_past_the_busy_timeout_is_a_clear_503(client, monkeypatch) -> None:
    from sqlalchemy.exc import OperationalError

    from app import shortlists

    def locked(*args, **kwargs):
        raise OperationalError("BEGIN IMMEDIATE", {}, sqlite3.OperationalError(
            "database is locked"))

    monkeypatch.setattr(shortlists, "create_shortlist", locked)
    answer = client.post("/api/shortlists", json={"name": "Later"})
    assert answer.status_code == 503 and answer.headers["retry-after"] == "1"
    assert answer.json()["detail"].startswith("the database is busy")


@pytest.mark.parametrize(("reason", "said"), [
    ("attempt to write a readonly database", "read-only"),
    ("database or disk is full", "disk is full"),
    ("disk I/O error", "disk reported an error"),
])
def test_a_file_that_stops_taking_writes_is_a_one_line_503(client, monkeypatch, reason,
                                                           said) -> None:
    # SQLite's own reasons (sqlite3 result codes SQLITE_READONLY, SQLITE_FULL, SQLITE_IOERR);
    # the file turning read-only under a running server cannot be staged for root here.
    from sqlalchemy.exc import OperationalError

    from app import shortlists

    def refused(*args, **kwargs):
        raise OperationalError("INSERT", {}, sqlite3.OperationalError(reason))

    monkeypatch.setattr(shortlists, "create_shortlist", refused)
    answer = client.post("/api/shortlists", json={"name": "Later"})
    assert answer.status_code == 503
    detail = answer.json()["detail"]
    assert said in detail and "nothing was changed" in detail and "\n" not in detail
