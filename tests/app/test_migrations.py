import sqlite3
from pathlib import Path

from alembic import command

import screening
from app.migrations import alembic_config, head_revision
from app.store import WRITE_LOCK, make_engine, open_store
from screening.catalogue import catalogue_formulas

GAP_COLUMNS = {"gap_value_ev", "gap_value_source", "gap_estimate_ev", "gap_uncertainty_ev",
               "gap_wavelength_nm", "gap_kind_shown", "gap_kind_source", "tb_direct"}


def query(db: Path, sql: str) -> list[tuple]:
    with sqlite3.connect(db) as conn:
        return conn.execute(sql).fetchall()


def columns(db: Path) -> set[str]:
    return {row[1] for row in query(db, "PRAGMA table_info(compound_results)")}


def migrate(db: Path, revision: str, *, down: bool = False) -> None:
    engine = make_engine(db)
    with engine.connect() as conn:
        conn.execution_options(**{WRITE_LOCK: True})
        with conn.begin():
            (command.downgrade if down else command.upgrade)(alembic_config(conn), revision)
    engine.dispose()


def database_of_the_previous_version(db: Path) -> None:
    """Schema 0001 with a result row as version 0.1.0 wrote it, and a table of the user's own."""
    migrate(db, "0001")
    with sqlite3.connect(db) as conn:
        conn.execute(
            "INSERT INTO compound_results (formula, family, cation, anion, gap_measured_ev, "
            "hazard_elements, model_version, report_json) "
            "VALUES ('GaAs', 'III-V', 'Ga', 'As', 1.424, 'As', '0.1.0', '{}')"
        )
        conn.execute("INSERT INTO store_meta VALUES ('model_version', '0.1.0')")
        conn.execute("CREATE TABLE shortlist (formula TEXT NOT NULL "
                     "REFERENCES compound_results(formula), note TEXT)")
        conn.execute("INSERT INTO shortlist VALUES ('GaAs', 'our substrate')")


def test_database_at_0001_upgrades_and_keeps_user_rows(tmp_path: Path) -> None:
    db = tmp_path / "old.db"
    database_of_the_previous_version(db)
    assert query(db, "SELECT version_num FROM alembic_version") == [("0001",)]
    assert not GAP_COLUMNS & columns(db)

    open_store(db).kw["bind"].dispose()

    assert query(db, "SELECT version_num FROM alembic_version") == [(head_revision(),)]
    assert GAP_COLUMNS <= columns(db)
    assert query(db, "SELECT * FROM shortlist") == [("GaAs", "our substrate")]
    assert query(db, "PRAGMA foreign_key_check") == []
    assert query(db, "SELECT value FROM store_meta WHERE key = 'model_version'") == [
        (screening.MODEL_VERSION,)
    ]
    assert query(db, "SELECT gap_value_ev, gap_value_source, gap_kind_shown, tb_direct "
                     "FROM compound_results WHERE formula = 'GaAs'") == [
        (1.424, "measured", "direct", 1)
    ]
    assert query(db, "SELECT count(*) FROM compound_results WHERE gap_estimate_ev IS NULL "
                     "OR gap_uncertainty_ev IS NULL") == [(0,)]
    formulas = {f for (f,) in query(db, "SELECT formula FROM compound_results")}
    assert formulas == set(catalogue_formulas())


def test_upgrade_asks_for_recomputation_even_if_the_version_matched(tmp_path: Path) -> None:
    db = tmp_path / "old.db"
    database_of_the_previous_version(db)
    with sqlite3.connect(db) as conn:
        conn.execute("UPDATE store_meta SET value = ?", (screening.MODEL_VERSION,))
    open_store(db).kw["bind"].dispose()
    assert query(db, "SELECT gap_value_ev FROM compound_results WHERE formula = 'GaAs'") == [
        (1.424,)
    ]


def test_downgrade_to_0001_and_back_keeps_user_rows(db_path: Path) -> None:
    with sqlite3.connect(db_path) as conn:
        conn.execute("CREATE TABLE user_notes (formula TEXT, note TEXT)")
        conn.execute("INSERT INTO user_notes VALUES ('ZnSe', 'blue-green')")
    migrate(db_path, "0001", down=True)
    assert not GAP_COLUMNS & columns(db_path)
    assert query(db_path, "SELECT count(*) FROM store_meta WHERE key = 'model_version'") == [
        (0,)
    ]
    open_store(db_path).kw["bind"].dispose()
    assert GAP_COLUMNS <= columns(db_path)
    assert query(db_path, "SELECT * FROM user_notes") == [("ZnSe", "blue-green")]
    assert query(db_path, "SELECT count(*) FROM compound_results WHERE gap_value_source "
                          "IS NULL") == [(0,)]
