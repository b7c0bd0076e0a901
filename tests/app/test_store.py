import json
import sqlite3
from pathlib import Path

import pytest
from alembic.autogenerate import compare_metadata
from alembic.migration import MigrationContext

import screening
from app.config import DB_ENV_VAR, resolve_db_path, user_data_dir
from app.migrations import head_revision, upgrade_to_head
from app.queries import QueryError, TableQuery, table_rows
from app.store import Base, StoreError, make_engine, open_store, refresh_results, row_values
from screening.catalogue import catalogue_formulas
from screening.report import catalogue_reports


def query(db: Path, sql: str) -> list[tuple]:
    with sqlite3.connect(db) as conn:
        return conn.execute(sql).fetchall()


def test_fresh_database_is_migrated_and_seeded(tmp_path: Path) -> None:
    db = tmp_path / "sub" / "fresh.db"
    sessions = open_store(db)
    sessions.kw["bind"].dispose()
    assert query(db, "SELECT version_num FROM alembic_version") == [(head_revision(),)]
    assert query(db, "SELECT value FROM store_meta WHERE key = 'model_version'") == [
        (screening.MODEL_VERSION,)
    ]
    formulas = {f for (f,) in query(db, "SELECT formula FROM compound_results")}
    assert formulas == set(catalogue_formulas())
    assert query(db, "PRAGMA journal_mode") == [("wal",)]


def test_connections_enforce_foreign_keys(db_path: Path) -> None:
    with make_engine(db_path).connect() as conn:
        assert conn.exec_driver_sql("PRAGMA foreign_keys").scalar() == 1
        assert conn.exec_driver_sql("PRAGMA journal_mode").scalar() == "wal"


def test_models_match_the_migrations(db_path: Path) -> None:
    with make_engine(db_path).connect() as conn:
        assert compare_metadata(MigrationContext.configure(conn), Base.metadata) == []


def test_upgrade_is_idempotent(db_path: Path) -> None:
    engine = make_engine(db_path)
    upgrade_to_head(engine)
    upgrade_to_head(engine)
    assert query(db_path, "SELECT count(*) FROM alembic_version") == [(1,)]


def test_new_model_version_recomputes_results_and_keeps_user_tables(db_path: Path) -> None:
    with sqlite3.connect(db_path) as conn:
        conn.execute("CREATE TABLE user_notes (formula TEXT, note TEXT)")
        conn.execute("INSERT INTO user_notes VALUES ('GaAs', 'our substrate')")
        conn.execute("UPDATE store_meta SET value = 'old' WHERE key = 'model_version'")
        conn.execute("UPDATE compound_results SET family = 'stale' WHERE formula = 'GaAs'")
    open_store(db_path).kw["bind"].dispose()
    assert query(db_path, "SELECT family FROM compound_results WHERE formula = 'GaAs'") == [
        ("III-V",)
    ]
    assert query(db_path, "SELECT * FROM user_notes") == [("GaAs", "our substrate")]
    assert query(db_path, "SELECT value FROM store_meta WHERE key = 'model_version'") == [
        (screening.MODEL_VERSION,)
    ]


def test_current_results_are_not_recomputed(db_path: Path) -> None:
    def must_not_run() -> list[dict]:
        raise AssertionError("recomputed although the model version is current")

    assert refresh_results(make_engine(db_path), reports=must_not_run) is False


def test_failed_recompute_leaves_previous_results_intact(db_path: Path) -> None:
    before = query(db_path, "SELECT formula, report_json FROM compound_results ORDER BY formula")
    good = catalogue_reports()[:3]
    broken = {**good[1], "formula": "Zz9", "family": None}  # NOT NULL violation mid-transaction
    engine = make_engine(db_path)
    with pytest.raises(Exception, match="NOT NULL"):
        refresh_results(engine, model_version="next", reports=lambda: [good[0], broken, good[2]])
    engine.dispose()
    after = query(db_path, "SELECT formula, report_json FROM compound_results ORDER BY formula")
    assert after == before
    assert query(db_path, "SELECT value FROM store_meta WHERE key = 'model_version'") == [
        (screening.MODEL_VERSION,)
    ]


def test_database_from_a_newer_version_is_refused(db_path: Path) -> None:
    with sqlite3.connect(db_path) as conn:
        conn.execute("UPDATE alembic_version SET version_num = 'f00dfeed'")
    with pytest.raises(StoreError, match="newer version"):
        open_store(db_path)


def test_file_that_is_not_a_database_is_refused_and_left_alone(tmp_path: Path) -> None:
    junk = tmp_path / "notes.db"
    junk.write_text("these are my notes, not a database\n" * 20)
    with pytest.raises(StoreError, match="not a database"):
        open_store(junk)
    assert junk.read_text().startswith("these are my notes")


def test_row_values_carry_report_and_model_version() -> None:
    report = catalogue_reports()[0]
    row = row_values(report)
    assert json.loads(row["report_json"]) == report
    assert row["model_version"] == screening.MODEL_VERSION


@pytest.mark.parametrize("sort", ["ionicity_spectroscopic", "band_gap_measured_eV", "polarity"])
@pytest.mark.parametrize("desc", [False, True])
def test_rows_sort_with_empty_values_last(client, sort: str, desc: bool) -> None:
    sessions = client.app.state.sessions
    with sessions() as session:
        rows = table_rows(session, query=TableQuery.parse(sort=sort, desc=desc))
    values = [r[sort] for r in rows]
    present = [v for v in values if v is not None]
    assert values[: len(present)] == present
    assert present == sorted(present, reverse=desc)


@pytest.mark.parametrize(
    ("kwargs", "message"),
    [
        ({"sort": "formula; DROP TABLE compound_results"}, "cannot sort by"),
        ({"family": "II-VI' OR '1'='1"}, "unknown family"),
        ({"structure": "cubic"}, "unknown structure"),
        ({"gap_min": "nan"}, "gap-min must be a number of eV from 0 to 20"),
        ({"gap_min": "two"}, "gap-min must be a number of eV from 0 to 20"),
        ({"gap_min": 3, "gap_max": 1}, "empty gap window"),
    ],
)
def test_bad_table_queries_are_refused(kwargs: dict, message: str) -> None:
    with pytest.raises(QueryError, match=message):
        TableQuery.parse(**kwargs)


def test_db_path_resolution_order(tmp_path: Path) -> None:
    env = {DB_ENV_VAR: str(tmp_path / "env.db"), "HOME": str(tmp_path)}
    assert resolve_db_path(tmp_path / "cli.db", environ=env, cwd=tmp_path) == tmp_path / "cli.db"
    assert resolve_db_path(None, environ=env, cwd=tmp_path) == tmp_path / "env.db"
    bare = {"HOME": str(tmp_path)}
    expected = user_data_dir(bare) / "bondgap.db"
    assert resolve_db_path(None, environ=bare, cwd=tmp_path) == expected
    assert str(expected).startswith(str(tmp_path / ".local" / "share"))
    (tmp_path / "bondgap.db").touch()
    assert resolve_db_path(None, environ=bare, cwd=tmp_path) == tmp_path / "bondgap.db"
