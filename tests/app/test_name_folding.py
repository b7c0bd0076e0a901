"""Names of shortlists and substrates: one Unicode folding rule for uniqueness and look-ups.

Expected foldings are those of Unicode's CaseFolding.txt and canonical decomposition
(The Unicode Standard, ch. 3, D145 "canonical caseless match"; Unicode 15 data).
"""

import json
import sqlite3
import unicodedata
from pathlib import Path

import pytest

from app.cli import main


def run(capsys, db: Path, *argv: str) -> tuple[int, str, str]:
    code = main([*argv, "--db", str(db)])
    out, err = capsys.readouterr()
    return code, out, err


def rows(db: Path, sql: str) -> list[tuple]:
    with sqlite3.connect(db) as conn:
        return conn.execute(sql).fetchall()


def items_by_list(db: Path) -> list[tuple[str, str]]:
    return rows(
        db,
        "SELECT s.name, i.formula FROM shortlist_items i "
        "JOIN shortlists s ON s.id = i.shortlist_id ORDER BY s.id, i.position",
    )


def test_a_second_list_differing_only_in_non_ascii_case_is_refused(db_path: Path, capsys) -> None:
    assert run(capsys, db_path, "shortlist", "create", "ÄPFEL")[0] == 0
    code, _, err = run(capsys, db_path, "shortlist", "create", "äpfel")
    assert code == 2 and "already exists" in err and err.count("\n") == 1
    assert run(capsys, db_path, "shortlist", "add", "ÄPFEL", "GaAs")[0] == 0
    assert run(capsys, db_path, "shortlist", "add", "äpfel", "InP")[0] == 0
    assert items_by_list(db_path) == [("ÄPFEL", "GaAs"), ("ÄPFEL", "InP")]


@pytest.mark.parametrize("typed", ["Éclair", "éclair", "ÉCLAIR", "E\u0301clair"])
def test_every_command_finds_a_list_with_a_non_ascii_name(
    db_path: Path, tmp_path: Path, capsys, typed: str
) -> None:
    assert run(capsys, db_path, "shortlist", "create", "Éclair")[0] == 0
    steps = [
        ("add", typed, "GaAs", "InP", "AlAs"),
        ("note", typed, "GaAs", "first"),
        ("remove", typed, "AlAs"),
        ("set", typed, "--on", "GaAs"),
        ("list", typed),
        ("compare", typed),
        ("export", typed, "--json", str(tmp_path / "e.json")),
        ("rename", typed, "Éclair 2"),
        ("delete", "ÉCLAIR 2", "--yes"),
    ]
    for step in steps:
        code, _, err = run(capsys, db_path, "shortlist", *step)
        assert code == 0, (step, err)
        if step[0] == "rename":
            assert items_by_list(db_path) == [("Éclair 2", "GaAs"), ("Éclair 2", "InP")]
            assert rows(db_path, "SELECT substrate FROM shortlists") == [("GaAs",)]
    assert rows(db_path, "SELECT count(*) FROM shortlists") == [(0,)]


@pytest.mark.parametrize(
    ("first", "others"),
    [
        ("Maß", ["MASS", "MAẞ", "mass"]),  # CaseFolding.txt: U+00DF and U+1E9E fold to "ss"
        ("E\u0301tude", ["Étude", "ÉTUDE", "E\u0301TUDE"]),  # U+00C9 = U+0045 U+0301
        ("Ωmega", ["ωMEGA", "\u2126mega"]),
    ],  # U+2126 OHM SIGN is canonically U+03A9
)
def test_names_that_fold_alike_are_one_list(
    db_path: Path, capsys, first: str, others: list[str]
) -> None:
    assert run(capsys, db_path, "shortlist", "create", first)[0] == 0
    stored = unicodedata.normalize("NFC", first)
    for other in others:
        code, _, err = run(capsys, db_path, "shortlist", "create", other)
        assert code == 2 and "already exists" in err, other
        assert run(capsys, db_path, "shortlist", "add", other, "GaAs")[0] == 0
        code, out, _ = run(capsys, db_path, "shortlist", "list", other, "--json")
        assert json.loads(out)["name"] == stored
    assert items_by_list(db_path) == [(stored, "GaAs")]
    assert rows(db_path, "SELECT name FROM shortlists") == [(stored,)]


def test_api_finds_and_refuses_by_the_same_rule(client) -> None:
    from tests.conftest import csrf_headers

    token = csrf_headers(client)
    made = client.post("/api/shortlists", headers=token, json={"name": "ÄPFEL"})
    assert made.status_code == 201
    again = client.post("/api/shortlists", headers=token, json={"name": "äpfel"})
    assert again.status_code == 409 and "already exists" in again.json()["detail"]
    other = client.post("/api/shortlists", headers=token, json={"name": "Birne"}).json()
    clash = client.patch(f"/api/shortlists/{other['id']}", headers=token, json={"name": "äPFEL"})
    assert clash.status_code == 409
    own = client.patch(
        f"/api/shortlists/{made.json()['id']}", headers=token, json={"name": "Äpfel"}
    )  # a list may change the case of its own name
    assert own.status_code == 200 and own.json()["name"] == "Äpfel"


def test_substrate_names_are_unique_and_found_ignoring_case(client, db_path: Path, capsys) -> None:
    mine = {"name": "Mine", "structure": "cubic", "a_angstrom": 5.7}
    assert client.post("/api/substrates", json=mine).status_code == 201
    again = client.post("/api/substrates", json={**mine, "name": "MINE"})
    assert again.status_code == 409 and "already have" in again.json()["detail"]
    assert client.get("/api/compounds/GaAs", params={"on": "mINE"}).status_code == 200
    gone = client.delete("/api/substrates/mine")
    assert gone.status_code == 200 and gone.json() == {"deleted": "Mine"}
    assert rows(db_path, "SELECT count(*) FROM user_substrates") == [(0,)]
    assert client.post("/api/substrates", json={**mine, "name": "Yours"}).status_code == 201
    code, out, _ = run(capsys, db_path, "substrates", "delete", "YOURS")
    assert code == 0 and out.strip() == "deleted substrate Yours"


def test_migration_keeps_both_of_two_names_that_now_fold_alike(tmp_path: Path, capsys) -> None:
    from app.store import open_store
    from tests.app.test_migrations import migrate

    db = tmp_path / "old.db"
    migrate(db, "0004")  # an older bondgap compared names with SQLite's ASCII-only lower()
    lists = ["ÄPFEL", "äpfel", "äpfel (2)", "Maß", "MASS", "Ä" * 80, "ä" * 80]
    conn = sqlite3.connect(db)
    conn.execute("INSERT INTO store_meta VALUES ('model_version', 'old')")
    conn.executemany(
        "INSERT INTO user_substrates (id, name, structure, a_angstrom, created_at) "
        "VALUES (?, ?, 'cubic', 5.7, '2026-12-01')",
        [(1, "Mine"), (2, "MINE")],
    )
    conn.executemany(
        "INSERT INTO shortlists (id, name, substrate, created_at, updated_at) "
        "VALUES (?, ?, ?, '2026-12-01', '2026-12-01')",
        [(i, name, "MINE" if i == 2 else None) for i, name in enumerate(lists, 1)],
    )
    conn.executemany(
        "INSERT INTO shortlist_items (shortlist_id, formula, position, added_at) "
        "VALUES (?, ?, 1, '2026-12-01')",
        [(1, "GaAs"), (2, "InP"), (5, "AlAs")],
    )
    conn.commit()
    conn.close()

    open_store(db).kw["bind"].dispose()

    assert rows(db, "SELECT id, name, substrate FROM shortlists ORDER BY id") == [
        (1, "ÄPFEL", None),
        (2, "äpfel (3)", "MINE (2)"),
        (3, "äpfel (2)", None),
        (4, "Maß", None),
        (5, "MASS (2)", None),
        (6, "Ä" * 80, None),
        (7, "ä" * 76 + " (2)", None),
    ]
    assert rows(db, "SELECT name FROM user_substrates ORDER BY id") == [("Mine",), ("MINE (2)",)]
    assert items_by_list(db) == [("ÄPFEL", "GaAs"), ("äpfel (3)", "InP"), ("MASS (2)", "AlAs")]
    code, out, _ = run(capsys, db, "shortlist", "list", "ÄPFEL (3)", "--json")
    assert code == 0 and json.loads(out)["conditions"]["substrate"] == "MINE (2)"
    assert run(capsys, db, "shortlist", "create", "mass (2)")[0] == 2

    migrate(db, "0004", down=True)  # and back: the keys go, the names stay
    assert "name_key" not in {c for (_, c, *_) in rows(db, "PRAGMA table_info(shortlists)")}
    open_store(db).kw["bind"].dispose()
    assert rows(db, "SELECT count(*) FROM shortlists WHERE name_key = ''") == [(0,)]
