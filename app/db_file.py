"""Look at a database file before opening it for writing: refuse any file bondgap must not write.

`check_database_file` runs before the store opens its first read-write connection (which would
switch the file to WAL journaling, migrate it and write results). It only reads, through a
read-only connection, and refuses with one line; a refused file keeps its bytes, and nothing
(no `-wal`, `-shm` or `-journal`) is made beside it:

- a folder, an unreadable file, a file that is not SQLite, or a damaged one (`quick_check`);
- another program's SQLite database: it has tables, but not bondgap's (`store_meta` and
  `compound_results`, present at every revision, with a schema revision in `alembic_version`).
  It is refused, never adopted;
- a newer bondgap's database: bondgap's tables with a schema revision this bondgap does not know;
- a file, or its folder, that bondgap cannot write (a read-only or immutable file, a read-only
  file system): refused at start instead of failing at the first change.

A missing file (in a folder that can be written), an empty file, or a SQLite file without any
table is fine: a new database is made there. An older bondgap's file is migrated
(`app.migrations`).
"""

from __future__ import annotations

import os
import sqlite3
from dataclasses import dataclass
from pathlib import Path

from app.store import StoreError

SQLITE_MAGIC = b"SQLite format 3\x00"
"""The first 16 bytes of every SQLite database file."""

LEFT_ALONE = "it was left untouched; choose another file with --db or BONDGAP_DB"
VERSION_TABLE = "alembic_version"
OUR_TABLES = frozenset({"store_meta", "compound_results"})
"""Tables every bondgap database has had since its first schema revision."""


@dataclass(frozen=True)
class FileContents:
    """What a read-only look found: SQLite's quick_check verdict, the tables, the revisions."""

    verdict: str
    tables: frozenset[str] = frozenset()
    revisions: tuple[str, ...] = ()


def _read(conn: sqlite3.Connection) -> FileContents:
    rows = conn.execute("PRAGMA quick_check").fetchall()
    if not rows or rows[0][0] != "ok":
        more = f" (and {len(rows) - 1} more)" if len(rows) > 1 else ""
        return FileContents((str(rows[0][0]) if rows else "no answer") + more)
    tables = frozenset(
        str(name)
        for (name,) in conn.execute(
            "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite\\_%' "
            "ESCAPE '\\'"
        )
    )
    revisions: tuple[str, ...] = ()
    if VERSION_TABLE in tables:
        try:
            revisions = tuple(
                str(v) for (v,) in conn.execute("SELECT version_num FROM alembic_version LIMIT 3")
            )
        except sqlite3.Error:  # a table of that name with other columns: not alembic's
            revisions = ("?",)
    return FileContents("ok", tables, revisions)


def look_inside(path: Path) -> FileContents:
    """Read the file on a read-only connection: its integrity, tables and schema revisions.

    Without a `-wal` file beside it, no program has the database open in WAL mode and the file
    holds all of it: it is read as immutable, so no `-wal` or `-shm` file is made beside a file
    that may be refused. With one (a running server, or a crash), the WAL is read with it.
    """
    wal = path.with_name(path.name + "-wal")
    options = "mode=ro" if wal.exists() else "mode=ro&immutable=1"
    try:
        conn = sqlite3.connect(f"{path.as_uri()}?{options}", uri=True)
    except sqlite3.Error as exc:
        return FileContents(str(exc))
    try:
        return _read(conn)
    except sqlite3.Error as exc:
        return FileContents(str(exc))
    finally:
        conn.close()


def _table_list(tables: frozenset[str]) -> str:
    names = sorted(tables)
    shown = ", ".join(repr(name[:30]) for name in names[:3])
    return shown + (f" and {len(names) - 3} more" if len(names) > 3 else "")


def schema_problem(found: FileContents, known: frozenset[str]) -> str | None:
    """Why a readable SQLite file is not a bondgap database of a known schema (None: it is).

    Args:
        found: From `look_inside`.
        known: The revision ids this bondgap can migrate from (`app.migrations`).
    """
    if not found.tables - {VERSION_TABLE} and not found.revisions:
        return None  # no tables yet: a new database
    if OUR_TABLES <= found.tables and found.revisions:
        if len(found.revisions) == 1 and found.revisions[0] in known:
            return None
        shown = ", ".join(r[:40] for r in found.revisions)
        return (
            f"it was written by a newer version of bondgap (schema revision {shown!r} is "
            "unknown to this one); it was left untouched; upgrade bondgap or choose another "
            "file with --db or BONDGAP_DB"
        )
    return (
        f"it is not a bondgap database (it holds the tables {_table_list(found.tables)} of "
        f"another program); {LEFT_ALONE}"
    )


def write_problem(path: Path) -> str | None:
    """Why bondgap could not write the file or make its journal beside it (None: it can).

    The file is opened for reading and writing and closed again (nothing is written, its
    modification time stays), which asks the system itself: a mode, an immutable attribute
    or a read-only file system all count, for root too. SQLite keeps its `-wal` and `-shm`
    (or `-journal`) files beside the database, so the folder must be writable as well.
    """
    if path.exists():
        try:
            os.close(os.open(path, os.O_RDWR | os.O_CLOEXEC))
        except OSError as exc:
            return (
                f"the file is read-only to bondgap ({exc.strerror or exc}), so it cannot be "
                "written; it was left untouched; make it writable or choose another file "
                "with --db or BONDGAP_DB"
            )
    folder = path.parent
    while not folder.exists() and folder != folder.parent:
        folder = folder.parent
    if not os.access(folder, os.W_OK | os.X_OK):
        return (
            f"its folder {folder} cannot be written (bondgap keeps its journal files "
            "beside the database); nothing was changed: make the folder writable or choose "
            "another file with --db or BONDGAP_DB"
        )
    return None


def _refuse(path: Path, why: str) -> StoreError:
    return StoreError(f"cannot use database {path}: {why}")


def check_database_file(path: Path) -> None:
    """Refuse a database file that bondgap must not open for writing.

    Args:
        path: The database file (absolute; it may not exist yet).

    Raises:
        StoreError: A folder, an unreadable, damaged or read-only file, a file that is not
            SQLite, another program's database or a newer bondgap's, or a folder that cannot
            be written.
    """
    from app.migrations import known_revisions

    if path.is_dir():
        raise _refuse(path, "it is a folder, not a file; choose a file with --db or BONDGAP_DB")
    header = b""
    if path.exists():
        try:
            with path.open("rb") as handle:
                header = handle.read(len(SQLITE_MAGIC))
        except OSError as exc:
            raise StoreError(
                f"cannot read database {path}: {exc.strerror or exc}; {LEFT_ALONE}"
            ) from exc
    if header and header != SQLITE_MAGIC:
        raise _refuse(path, f"it is not a database (no SQLite header); {LEFT_ALONE}")
    if header:
        found = look_inside(path)
        if found.verdict != "ok":
            raise _refuse(
                path,
                write_problem(path)
                or (
                    f"it is damaged (SQLite quick_check: {found.verdict[:120]}); {LEFT_ALONE}, or "
                    "restore it from a backup"
                ),
            )
        problem = schema_problem(found, known_revisions())
        if problem:
            raise _refuse(path, problem)
    problem = write_problem(path)
    if problem:
        raise _refuse(path, problem)
