"""User substrates: add, list, delete, persist; refused names and values; use with the finder."""

import json
import sqlite3
from pathlib import Path

import pytest
from bs4 import BeautifulSoup
from fastapi.testclient import TestClient

from app.cli import main
from app.main import create_app

MINE = {"name": "InP-strained", "structure": "cubic", "a_angstrom": 5.80,
        "note": "relaxed buffer on InP"}


def run(capsys, *argv: str) -> tuple[int, str, str]:
    code = main(list(argv))
    out, err = capsys.readouterr()
    return code, out, err


def names(client) -> list[str]:
    return [s["name"] for s in client.get("/api/substrates").json()["substrates"]]


def test_builtin_substrates_are_listed_with_sources(client) -> None:
    rows = {s["name"]: s for s in client.get("/api/substrates").json()["substrates"]}
    assert rows["InP"]["a_angstrom"] == 5.8687 and rows["InP"]["built_in"]
    assert "Ioffe" in rows["InP"]["source"]
    assert rows["sapphire"]["matched_a_angstrom"] == pytest.approx(4.758 / 3**0.5)


def test_add_list_use_delete_and_persist(client, settings) -> None:
    response = client.post("/api/substrates", json=MINE)
    assert response.status_code == 201
    assert response.json()["lattice"] == "cubic" and not response.json()["built_in"]
    with TestClient(create_app(settings)) as fresh:  # a new app on the same file
        assert "InP-strained" in names(fresh)
        match = fresh.get("/api/match", params={"system": "InGaAs", "on": "InP-strained",
                                                "max_mismatch": "0"}).json()
        assert match["substrate"]["lattice_a_angstrom"] == 5.80
        assert match["matches"][0]["lattice_constant_angstrom"] == pytest.approx(5.80)
        report = fresh.get("/api/compounds/In0.5Ga0.5As", params={"on": "inp-STRAINED"}).json()
        assert report["epitaxy"]["substrate"] == "InP-strained"
    assert client.delete("/api/substrates/InP-strained").json() == {"deleted": "InP-strained"}
    assert "InP-strained" not in names(client)
    assert client.delete("/api/substrates/InP-strained").status_code == 404


@pytest.mark.parametrize(
    ("body", "status", "words"),
    [({**MINE, "name": "InP"}, 409, "built-in substrate"),
     ({**MINE, "name": "gaas"}, 409, "built-in substrate"),
     ({**MINE, "name": "bad/name"}, 400, "is not accepted"),
     ({**MINE, "name": ""}, 400, "is not accepted"),
     ({**MINE, "name": "x" * 41}, 400, "is not accepted"),
     ({**MINE, "structure": "amorphous"}, 400, "unknown substrate structure"),
     ({**MINE, "a_angstrom": 1.5}, 400, "above 2 to 10"),
     ({**MINE, "a_angstrom": 12}, 400, "above 2 to 10"),
     ({**MINE, "c_angstrom": 5.2}, 400, "has no c lattice constant"),
     ({**MINE, "structure": "hexagonal"}, 400, "needs its c lattice constant"),
     ({**MINE, "note": "x" * 201}, 400, "at most 200 characters")],
)
def test_refused_substrates(client, body, status: int, words: str) -> None:
    response = client.post("/api/substrates", json=body)
    assert response.status_code == status
    assert words in response.json()["detail"]


def test_duplicate_and_builtin_deletion_are_refused(client) -> None:
    assert client.post("/api/substrates", json=MINE).status_code == 201
    again = client.post("/api/substrates", json={**MINE, "name": "inp-strained"})
    assert again.status_code == 409 and "already have" in again.json()["detail"]
    gone = client.delete("/api/substrates/InP")
    assert gone.status_code == 400 and "cannot be deleted" in gone.json()["detail"]
    hexagonal = {"name": "my AlN template", "structure": "wurtzite", "a_angstrom": 3.112,
                 "c_angstrom": 4.982}
    assert client.post("/api/substrates", json=hexagonal).json()["lattice"] == "hexagonal"


def test_page_lists_adds_and_deletes(client) -> None:
    page = BeautifulSoup(client.get("/substrates").text, "html.parser")
    rows = page.select("#substrate-table tbody tr")
    assert {r["data-name"] for r in rows} >= {"InP", "GaAs", "sapphire"}
    assert all(r["data-built-in"] == "true" for r in rows)
    form = {"name": "GaAs-on-Si", "structure": "zincblende", "a_angstrom": "5.62",
            "c_angstrom": "", "note": "virtual substrate"}
    added = client.post("/substrates", data=form, follow_redirects=False)
    assert added.status_code == 303
    page = BeautifulSoup(client.get(added.headers["location"]).text, "html.parser")
    assert "added GaAs-on-Si" in page.select_one("#substrate-done").text
    row = page.select_one("#substrate-table tr[data-name='GaAs-on-Si']")
    assert row["data-built-in"] == "false" and row.select_one("form button")
    refused = client.post("/substrates", data={**form, "name": "Si"})
    assert refused.status_code == 409
    page = BeautifulSoup(refused.text, "html.parser")
    assert "built-in substrate" in page.select_one("#substrate-error").text
    assert page.select_one("#s-name")["value"] == "Si"  # the form keeps what was typed
    deleted = client.post("/substrates/GaAs-on-Si/delete", follow_redirects=False)
    assert deleted.status_code == 303
    assert "GaAs-on-Si" not in names(client)


def test_cross_site_form_post_is_refused(client) -> None:
    response = client.post("/substrates", data={"name": "x", "structure": "cubic",
                                                "a_angstrom": "5"},
                           headers={"Origin": "http://elsewhere.example"})
    assert response.status_code == 403


def test_cli_add_list_delete(db_path: Path, capsys) -> None:
    code, out, _ = run(capsys, "substrates", "add", "Buffer 1", "--structure", "cubic",
                       "--a", "5.75", "--db", str(db_path))
    assert code == 0 and "added substrate Buffer 1" in out
    code, out, _ = run(capsys, "substrates", "list", "--json", "--db", str(db_path))
    rows = {s["name"]: s for s in json.loads(out)["substrates"]}
    assert rows["Buffer 1"]["a_angstrom"] == 5.75 and rows["InP"]["built_in"]
    code, out, _ = run(capsys, "match", "InGaAs", "--on", "Buffer 1", "--max-mismatch", "0",
                       "--json", "--db", str(db_path))
    assert code == 0 and json.loads(out)["substrate"]["name"] == "Buffer 1"
    code, _, err = run(capsys, "substrates", "add", "InP", "--structure", "cubic", "--a", "5.8",
                       "--db", str(db_path))
    assert code == 2 and "built-in substrate" in err
    code, _, err = run(capsys, "substrates", "add", "Buffer 1", "--structure", "cubic", "--a",
                       "5.8", "--db", str(db_path))
    assert code == 2 and "already have" in err
    assert run(capsys, "substrates", "delete", "Buffer 1", "--db", str(db_path))[0] == 0
    code, _, err = run(capsys, "substrates", "delete", "Buffer 1", "--db", str(db_path))
    assert code == 2 and "no substrate named" in err
    code, out, _ = run(capsys, "substrates", "list", "--db", str(db_path))
    assert out.startswith("name") and "Buffer 1" not in out


def test_migration_0002_to_0003_keeps_data(tmp_path: Path) -> None:
    from tests.app.test_migrations import migrate, query

    db = tmp_path / "old.db"
    migrate(db, "0002")
    with sqlite3.connect(db) as conn:
        conn.execute("INSERT INTO store_meta VALUES ('model_version', 'old')")
        conn.execute("CREATE TABLE user_notes (formula TEXT, note TEXT)")
        conn.execute("INSERT INTO user_notes VALUES ('InP', 'our wafers')")
    migrate(db, "0003")
    assert query(db, "SELECT * FROM user_notes") == [("InP", "our wafers")]
    assert query(db, "SELECT value FROM store_meta") == [("old",)]
    with sqlite3.connect(db) as conn:
        conn.execute("INSERT INTO user_substrates (name, structure, a_angstrom, note, created_at)"
                     " VALUES ('mine', 'cubic', 5.7, '', '2026-12-03 10:00:00')")
    migrate(db, "0002", down=True)
    assert "user_substrates" not in {t for (t,) in query(
        db, "SELECT name FROM sqlite_master WHERE type = 'table'")}
    assert query(db, "SELECT * FROM user_notes") == [("InP", "our wafers")]
