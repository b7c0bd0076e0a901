"""Look at a database file before opening it for writing: refuse anything that is not healthy.

`check_database_file` runs before the store opens its first read-write connection (which would
switch the file to WAL journaling, migrate it and write results). It only reads: a folder, an
unreadable file, a file that is not SQLite, or a SQLite file that fails `PRAGMA quick_check`
is refused with one line, and its bytes stay as they were. A missing or empty file is fine (a
new database is created).
"""

from __future__ import annotations

import sqlite3
from pathlib import Path

from app.store import StoreError

SQLITE_MAGIC = b"SQLite format 3\x00"
"""The first 16 bytes of every SQLite database file."""

LEFT_ALONE = "it was left untouched; choose another file with --db or BONDGAP_DB"


def _quick_check(path: Path) -> str:
    """SQLite's own quick integrity check on a read-only connection: "ok" or the first fault.

    Without a `-wal` file beside it, no program has the database open in WAL mode and the file
    holds all of it: it is read as immutable, so no `-wal` or `-shm` file is made beside a file
    that may be refused. With one (a running server, or a crash), the WAL is read with it.
    """
    wal = path.with_name(path.name + "-wal")
    options = "mode=ro" if wal.exists() else "mode=ro&immutable=1"
    try:
        conn = sqlite3.connect(f"{path.as_uri()}?{options}", uri=True)
    except sqlite3.Error as exc:
        return str(exc)
    try:
        rows = conn.execute("PRAGMA quick_check").fetchall()
    except sqlite3.Error as exc:
        return str(exc)
    finally:
        conn.close()
    if rows and rows[0][0] == "ok":
        return "ok"
    more = f" (and {len(rows) - 1} more)" if len(rows) > 1 else ""
    return (str(rows[0][0]) if rows else "no answer") + more


def check_database_file(path: Path) -> None:
    """Refuse a database file that bondgap must not open for writing.

    Args:
        path: The database file (absolute; it may not exist yet).

    Raises:
        StoreError: A folder, an unreadable file, not a SQLite file, or a damaged one.
    """
    if path.is_dir():
        raise StoreError(f"cannot use database {path}: it is a folder, not a file; choose "
                         "a file with --db or BONDGAP_DB")
    if not path.exists():
        return
    try:
        with path.open("rb") as handle:
            header = handle.read(len(SQLITE_MAGIC))
    except OSError as exc:
        raise StoreError(f"cannot read database {path}: {exc.strerror or exc}; "
                         f"{LEFT_ALONE}") from exc
    if not header:
        return  # an empty file: SQLite makes it a new database
    if header != SQLITE_MAGIC:
        raise StoreError(f"cannot use database {path}: it is not a database (no SQLite header); "
                         f"{LEFT_ALONE}")
    verdict = _quick_check(path)
    if verdict != "ok":
        raise StoreError(f"cannot use database {path}: it is damaged (SQLite quick_check: "
                         f"{verdict[:120]}); {LEFT_ALONE}, or restore it from a backup")
