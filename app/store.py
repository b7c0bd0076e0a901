"""The store: a SQLite file holding the engine's results, kept in step with the engine.

Data flows one way: `seed_data/` -> `screening` (the engine) -> this store -> pages, API, CLI.

Tables (models in `app.models`; the schema is owned by the Alembic revisions in
`app/migrations/versions/`):

    store_meta          key/value pairs; `model_version` is the engine version of the results,
                        `csrf_secret` the secret of the web app's token (`app.csrf`)
    compound_results    one row per catalogue compound: indexed scalars for sorting and
                        filtering, plus the engine's full report as JSON text

`open_store` migrates the file to the newest schema, then recomputes `compound_results` in one
transaction when the stored model version differs from `screening.MODEL_VERSION`. Tables other
than `compound_results` and `store_meta` (the user's own, added by later revisions) are never
written here.

Every connection runs with WAL journaling, foreign keys on, synchronous=FULL and a busy timeout.
"""

from __future__ import annotations

import sqlite3
from collections.abc import Callable, Iterable
from datetime import UTC, datetime
from pathlib import Path
from typing import Any

from sqlalchemy import URL, Connection, Engine, Table, create_engine, delete, event, select
from sqlalchemy.dialects.sqlite import Insert
from sqlalchemy.dialects.sqlite import insert as sqlite_insert
from sqlalchemy.exc import DBAPIError
from sqlalchemy.orm import sessionmaker

import screening
from app.models import Base, CompoundResult, StoreMeta, row_values

__all__ = [
    "CONNECTION_PRAGMAS", "WRITE_LOCK", "Base", "CompoundResult", "StoreError", "StoreMeta",
    "make_engine", "open_store", "refresh_results", "row_values", "stored_model_version",
]

WRITE_LOCK = "bondgap_write_lock"
"""Execution option: start the transaction with `BEGIN IMMEDIATE` (take the write lock first)."""


CONNECTION_PRAGMAS: tuple[str, ...] = (
    "PRAGMA journal_mode=WAL",
    "PRAGMA foreign_keys=ON",
    "PRAGMA synchronous=FULL",
    "PRAGMA busy_timeout=10000",
)
"""Run on every new connection. WAL: readers do not block the writer, and a crash mid-write
leaves the last committed state. synchronous=FULL: the WAL is synced at every commit, so an
acknowledged change survives a power cut too (NORMAL could lose the last commits then)."""


class StoreError(RuntimeError):
    """The database file cannot be opened or migrated (not the user's input, but their file)."""


def make_engine(db_path: Path) -> Engine:
    """Create the SQLAlchemy engine for one database file (the file is created on first use).

    Connections get `CONNECTION_PRAGMAS` (WAL journaling, foreign keys, synchronous=FULL, a
    10 s busy timeout), and transactions that SQLAlchemy begins itself (so DDL is
    transactional and `WRITE_LOCK` can ask for `BEGIN IMMEDIATE`).
    """
    db_path.parent.mkdir(parents=True, exist_ok=True)
    engine = create_engine(
        URL.create("sqlite", database=str(db_path)),
        connect_args={"check_same_thread": False, "timeout": 10},
    )

    @event.listens_for(engine, "connect")
    def _on_connect(dbapi_connection: sqlite3.Connection, _record: object) -> None:
        dbapi_connection.isolation_level = None  # SQLAlchemy emits BEGIN below
        for statement in CONNECTION_PRAGMAS:
            dbapi_connection.execute(statement)

    @event.listens_for(engine, "begin")
    def _on_begin(conn: Connection) -> None:
        immediate = conn.get_execution_options().get(WRITE_LOCK, False)
        conn.exec_driver_sql("BEGIN IMMEDIATE" if immediate else "BEGIN")

    return engine


def _version_in(conn: Connection) -> str | None:
    """The stored model version, read on an open connection (inside its transaction)."""
    return conn.scalar(select(StoreMeta.value).where(StoreMeta.key == "model_version"))


def stored_model_version(engine: Engine) -> str | None:
    """Return the engine version the stored results were computed with (None if never)."""
    with engine.connect() as conn:
        return _version_in(conn)


def _upsert(table: Table, key: str) -> Insert:
    """INSERT ... ON CONFLICT(key) DO UPDATE every other column (rows keep their identity)."""
    stmt = sqlite_insert(table)
    others = {c.name: stmt.excluded[c.name] for c in table.c if c.name != key}
    return stmt.on_conflict_do_update(index_elements=[key], set_=others)


def refresh_results(
    engine: Engine,
    *,
    model_version: str | None = None,
    reports: Callable[[], Iterable[dict[str, Any]]] | None = None,
) -> bool:
    """Recompute `compound_results` if they were made by another engine version.

    The reports are computed before the write lock is taken; the rows are then replaced in one
    `BEGIN IMMEDIATE` transaction (upsert by formula, then delete formulas no longer in the
    catalogue), so a failure leaves the previous results intact and a second process that
    starts at the same time waits and then finds nothing to do.

    Args:
        engine: From `make_engine`, already migrated.
        model_version: Version to store (defaults to `screening.MODEL_VERSION`).
        reports: Callable returning every catalogue report (defaults to
            `screening.report.catalogue_reports`).

    Returns:
        True if the rows were recomputed, False if they were already current.
    """
    version = model_version or screening.MODEL_VERSION
    if stored_model_version(engine) == version:
        return False
    if reports is None:
        from screening.report import catalogue_reports as reports
    rows = [row_values(report) for report in reports()]
    table = CompoundResult.__table__
    with engine.connect() as conn:
        conn.execution_options(**{WRITE_LOCK: True})
        with conn.begin():
            if _version_in(conn) == version:
                return False
            if rows:
                conn.execute(_upsert(table, "formula"), rows)
            formulas = [row["formula"] for row in rows]
            conn.execute(delete(table).where(table.c.formula.not_in(formulas)))
            now = datetime.now(UTC).isoformat(timespec="seconds")
            conn.execute(
                _upsert(StoreMeta.__table__, "key"),
                [{"key": "model_version", "value": version}, {"key": "computed_at", "value": now}],
            )
    return True


def open_store(db_path: Path, **refresh_options: Any) -> sessionmaker:
    """Open (creating if needed), migrate and refresh the database; return a session factory.

    Args:
        db_path: The SQLite file.
        **refresh_options: Passed to `refresh_results` (tests inject small catalogues).

    Returns:
        A `sessionmaker` bound to the file's engine.

    Raises:
        StoreError: The file is a folder, unreadable, not SQLite, damaged, read-only, another
            program's database or a newer bondgap's (it is left as it was, checked read-only
            first: `app.db_file`).
    """
    from app.db_file import check_database_file
    from app.migrations import upgrade_to_head

    check_database_file(db_path)
    engine = None
    try:
        engine = make_engine(db_path)
        upgrade_to_head(engine)
        refresh_results(engine, **refresh_options)
    except BaseException as exc:
        if engine is not None:
            engine.dispose()  # close every connection: SQLite removes its -wal and -shm
        if isinstance(exc, (DBAPIError, OSError)):
            reason = getattr(exc, "orig", None) or exc
            raise StoreError(f"cannot use database {db_path}: {reason}") from exc
        raise
    return sessionmaker(engine, expire_on_commit=False)
