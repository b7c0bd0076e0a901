"""Files bondgap must not write are refused at start, one line, and stay byte for byte as they were.

A newer bondgap's file and another program's SQLite file (in rollback-journal and in WAL mode)
are looked at read-only and refused; a file (or folder) that cannot be written is refused
before anything is made beside it. Tests run as root, who may write any file with mode 0444:
read-only-ness comes from the immutable attribute (`chattr +i`, which binds root too) and from a
child process that gave up root's power to override file modes.
"""

import os
import shutil
import sqlite3
import subprocess
import sys
from collections.abc import Iterator
from contextlib import contextmanager
from pathlib import Path

import pytest

from app.cli import main
from app.store import StoreError, open_store
from tests.app.test_old_database import sha256, without_read_override
from tests.conftest import REPO_ROOT

COMMANDS = (
    ["list"],
    ["serve", "--port", "0"],
    ["shortlist", "create", "x"],
    ["substrates", "list"],
    ["show", "GaAs"],
)
"""Every command that opens the database, one of each kind."""


def execute(db: Path, *statements: str) -> None:
    """Run statements and commit, then close the connection (so no lock stays)."""
    conn = sqlite3.connect(db)
    try:
        for statement in statements:
            conn.execute(statement)
        conn.commit()
    finally:
        conn.close()


def set_journal(db: Path, journal: str) -> None:
    conn = sqlite3.connect(db)
    try:
        assert conn.execute(f"PRAGMA journal_mode={journal}").fetchone()[0] == journal.lower()
    finally:
        conn.close()


def newer_schema(folder: Path, template: Path, journal: str) -> Path:
    """A bondgap file whose schema revision this bondgap does not know."""
    db = folder / "newer.db"
    shutil.copyfile(template, db)
    execute(
        db,
        "UPDATE alembic_version SET version_num = 'f00dfeed'",
        "CREATE TABLE from_the_future (x)",
    )
    set_journal(db, journal)
    return db


def foreign_file(folder: Path, journal: str) -> Path:
    """Another program's SQLite database: its own tables, no bondgap schema."""
    db = folder / "notes.db"
    execute(
        db,
        "CREATE TABLE notes (id INTEGER PRIMARY KEY, body TEXT)",
        "INSERT INTO notes (body) VALUES ('lab book, page 1')",
    )
    set_journal(db, journal)
    return db


def refuse_everywhere(path: Path, capsys, *words: str) -> None:
    """Every command exits 2 with one line naming the file; the file and its folder unchanged."""
    before, files = sha256(path), sorted(os.listdir(path.parent))
    for argv in COMMANDS:
        assert main([*argv, "--db", str(path)]) == 2, argv
        err = capsys.readouterr().err
        assert err.startswith(f"bondgap: error: cannot use database {path}: "), err
        assert err.count("\n") == 1 and "--db" in err
        for word in words:
            assert word in err, (word, err)
    with pytest.raises(StoreError):
        open_store(path)
    assert sha256(path) == before
    assert sorted(os.listdir(path.parent)) == files  # no -wal, -shm or -journal left


@pytest.mark.parametrize("journal", ["DELETE", "WAL"])
def test_a_newer_schema_is_refused_and_not_changed(
    journal: str, tmp_path: Path, seeded_db_template: Path, capsys
) -> None:
    db = newer_schema(tmp_path, seeded_db_template, journal)
    refuse_everywhere(db, capsys, "newer", "f00dfeed", "upgrade bondgap")


@pytest.mark.parametrize("journal", ["DELETE", "WAL"])
def test_another_programs_database_is_refused_not_adopted(
    journal: str, tmp_path: Path, capsys
) -> None:
    db = foreign_file(tmp_path, journal)
    refuse_everywhere(db, capsys, "not a bondgap database", "notes")


def test_an_empty_sqlite_file_is_adopted(tmp_path: Path) -> None:
    db = tmp_path / "empty.db"
    execute(db, "CREATE TABLE scratch (x)", "DROP TABLE scratch")
    assert db.stat().st_size > 0
    open_store(db).kw["bind"].dispose()
    with sqlite3.connect(db) as conn:
        assert conn.execute("SELECT count(*) FROM compound_results").fetchone()[0] > 0


@contextmanager
def immutable(path: Path) -> Iterator[None]:
    """Set the immutable attribute (no write, no new file in a folder, even for root)."""
    if shutil.which("chattr") is None:
        pytest.skip("chattr is not installed")
    done = subprocess.run(["chattr", "+i", str(path)], capture_output=True, check=False)
    if done.returncode:
        pytest.skip(f"this file system does not take chattr +i: {done.stderr.decode()[:80]}")
    try:
        yield
    finally:
        subprocess.run(["chattr", "-i", str(path)], check=True)


def test_a_file_that_cannot_be_written_is_refused_at_start(db_path: Path, capsys) -> None:
    with immutable(db_path):
        refuse_everywhere(db_path, capsys, "cannot be written", "read-only")


def test_a_folder_that_cannot_be_written_is_refused_at_start(db_path: Path, capsys) -> None:
    with immutable(db_path.parent):
        refuse_everywhere(db_path, capsys, "its folder", "cannot be written")


def test_a_new_file_in_a_folder_that_cannot_be_written_is_refused(tmp_path: Path, capsys) -> None:
    folder = tmp_path / "locked"
    folder.mkdir()
    with immutable(folder):
        assert main(["list", "--db", str(folder / "new.db")]) == 2
        err = capsys.readouterr().err
        assert "its folder" in err and err.count("\n") == 1
        assert list(folder.iterdir()) == []


def test_a_read_only_file_is_refused_by_the_server_without_a_traceback(db_path: Path) -> None:
    db_path.chmod(0o444)  # the usual way: the user's own file, made read-only
    before, files = sha256(db_path), sorted(os.listdir(db_path.parent))
    try:
        done = subprocess.run(
            [sys.executable, "-m", "app", "serve", "--port", "0", "--db", str(db_path)],
            capture_output=True,
            text=True,
            timeout=60,
            check=False,
            cwd=REPO_ROOT,
            preexec_fn=without_read_override,
        )
    except OSError as exc:  # pragma: no cover - a container that forbids dropping capabilities
        pytest.skip(f"root writes any file and this machine does not let it give that up: {exc}")
    assert done.returncode == 2, done.stderr
    assert done.stderr.startswith(f"bondgap: error: cannot use database {db_path}: ")
    assert "read-only" in done.stderr and done.stderr.count("\n") == 1
    assert sha256(db_path) == before and sorted(os.listdir(db_path.parent)) == files
