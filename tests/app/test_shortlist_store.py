import sqlite3
from pathlib import Path

import pytest

from app import shortlists as store
from app.conditions import Conditions
from app.params import QueryError
from app.shortlists import ShortlistConflict, ShortlistNotFound
from app.store import open_store
from screening.errors import BondgapInputError, UnknownSubstrateError


@pytest.fixture
def session(db_path: Path):
    sessions = open_store(db_path)
    with sessions() as s:
        yield s
    sessions.kw["bind"].dispose()


def rows(db: Path, sql: str) -> list[tuple]:
    with sqlite3.connect(db) as conn:
        return conn.execute(sql).fetchall()


def test_create_add_note_and_read_back(session, db_path: Path) -> None:
    conditions = Conditions.parse(substrate="InP", temperature="77", target_gap="0.8",
                                  session=session)
    made = store.create_shortlist(session, name=" Laser 1.55 ", note="why\nthese",
                                  conditions=conditions)
    done = store.add_items(session, shortlist_id=made.id,
                           formulas=["AsGa", "In0.530Ga0.470As", "GaAs"], note="first")
    assert done == {"added": ["GaAs", "In0.53Ga0.47As"], "present": []}
    assert store.add_items(session, shortlist_id=made.id, formulas=["GaAs"]) == {
        "added": [], "present": ["GaAs"]}
    store.set_item_note(session, shortlist_id=made.id, formula="AsGa", note="substrate-matched?")
    data = store.shortlist_dict(session, store.get_shortlist(session, name="laser 1.55"))
    assert data["name"] == "Laser 1.55" and data["note"] == "why\nthese"
    assert data["conditions"] == {"substrate": "InP", "temperature_K": 77.0,
                                  "target": {"gap_eV": 0.8, "wavelength_nm": None}}
    assert [(i["formula"], i["note"], i["position"]) for i in data["items"]] == [
        ("GaAs", "substrate-matched?", 1), ("In0.53Ga0.47As", "first", 2)]
    assert rows(db_path, "SELECT name, substrate, temperature_K, target FROM shortlists") == [
        ("Laser 1.55", "InP", 77.0, '{"gap_eV": 0.8}')]


def test_rename_conflict_and_delete_cascades(session, db_path: Path) -> None:
    a = store.create_shortlist(session, name="A")
    store.create_shortlist(session, name="B")
    store.add_items(session, shortlist_id=a.id, formulas=["GaAs", "InP"])
    with pytest.raises(ShortlistConflict, match="already exists"):
        store.create_shortlist(session, name="a")
    with pytest.raises(ShortlistConflict):
        store.update_shortlist(session, shortlist_id=a.id, name="b")
    store.update_shortlist(session, shortlist_id=a.id, name="A renamed", note="kept")
    assert store.get_shortlist(session, name="A renamed").note == "kept"
    assert store.delete_shortlist(session, shortlist_id=a.id) == "A renamed"
    assert rows(db_path, "SELECT count(*) FROM shortlist_items") == [(0,)]
    assert rows(db_path, "SELECT name FROM shortlists") == [("B",)]
    with pytest.raises(ShortlistNotFound):
        store.delete_shortlist(session, shortlist_id=a.id)


def test_a_bad_formula_adds_nothing(session, db_path: Path) -> None:
    made = store.create_shortlist(session, name="L")
    with pytest.raises(BondgapInputError):
        store.add_items(session, shortlist_id=made.id, formulas=["GaAs", "Xx", "InP"])
    with pytest.raises(BondgapInputError):
        store.add_items(session, shortlist_id=made.id, formulas=["In0.6Ga0.6As"])
    assert rows(db_path, "SELECT count(*) FROM shortlist_items") == [(0,)]


@pytest.mark.parametrize("name", ["", "   ", "x" * 81, "two\nlines", "tab\there"])
def test_bad_names_are_refused(session, name: str) -> None:
    with pytest.raises(QueryError, match="1 to 80 characters"):
        store.create_shortlist(session, name=name)


def test_notes_keep_lines_but_refuse_control_characters_and_length(session) -> None:
    made = store.create_shortlist(session, name="N")
    store.add_items(session, shortlist_id=made.id, formulas=["GaAs"])
    with pytest.raises(QueryError, match="control"):
        store.set_item_note(session, shortlist_id=made.id, formula="GaAs", note="a\x00b")
    with pytest.raises(QueryError, match="4000"):
        store.set_item_note(session, shortlist_id=made.id, formula="GaAs", note="x" * 4001)
    store.set_item_note(session, shortlist_id=made.id, formula="GaAs", note="a\r\nb\tc")
    assert store.items_of(session, made.id)[0].note == "a\nb\tc"
    with pytest.raises(ShortlistNotFound, match="InP is not on this shortlist"):
        store.set_item_note(session, shortlist_id=made.id, formula="PIn", note="x")


def test_conditions_are_checked(session) -> None:
    with pytest.raises(UnknownSubstrateError, match="unknown substrate"):
        Conditions.parse(substrate="Unobtainium", session=session)
    with pytest.raises(QueryError, match="not both"):
        Conditions.parse(target_gap="1", target_wavelength="1000")
    with pytest.raises(QueryError, match="temperature"):
        Conditions.parse(temperature="-3")
    with pytest.raises(QueryError, match="target band gap"):
        Conditions.parse(target_gap="abc")
    assert Conditions.parse(substrate="inp").substrate == "InP"
    assert Conditions.parse(target_wavelength="1240").gap_goal_eV == pytest.approx(1.0, rel=1e-3)


def test_sql_text_in_names_and_notes_is_stored_as_text(session, db_path: Path) -> None:
    name = "x'); DROP TABLE shortlists; --"
    made = store.create_shortlist(session, name=name, note="' OR 1=1 --")
    assert store.get_shortlist(session, shortlist_id=made.id).name == name
    assert rows(db_path, "SELECT count(*) FROM shortlists") == [(1,)]
