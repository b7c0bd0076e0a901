"""Schema migrations (Alembic): every change to the database layout is a revision in `versions/`.

`upgrade_to_head` runs on every start, inside one `BEGIN IMMEDIATE` transaction, so a database
made by an older bondgap is brought up to date without losing what the user stored, and two
processes starting together do not race. For a new revision (with the models changed first)::

    BONDGAP_DB=/tmp/dev.db alembic -c app/alembic.ini revision --autogenerate -m "what changed"
"""

from __future__ import annotations

from pathlib import Path

from alembic.config import Config
from alembic.script import ScriptDirectory
from alembic.util.exc import CommandError
from sqlalchemy import Connection, Engine

MIGRATIONS_DIR = Path(__file__).resolve().parent


def alembic_config(connection: Connection | None = None) -> Config:
    """Build an Alembic config pointing at this folder, optionally bound to a connection."""
    config = Config()
    config.set_main_option("script_location", str(MIGRATIONS_DIR))
    if connection is not None:
        config.attributes["connection"] = connection
    return config


def head_revision() -> str:
    """Return the newest revision id in `versions/`."""
    head = ScriptDirectory.from_config(alembic_config()).get_current_head()
    assert head is not None, "no migration revisions found"
    return head


def known_revisions() -> frozenset[str]:
    """Every revision id in `versions/` (a database at any of them can be migrated)."""
    script = ScriptDirectory.from_config(alembic_config())
    return frozenset(s.revision for s in script.walk_revisions())


def upgrade_to_head(engine: Engine) -> None:
    """Migrate the database to the newest schema, in one transaction holding the write lock.

    `app.db_file.check_database_file` has refused a file of an unknown revision before this
    runs (read-only, so the file is not changed); the check here only catches a file changed
    in between.

    Raises:
        StoreError: The database carries a revision this bondgap does not know (it was
            written by a newer version).
    """
    from alembic import command

    from app.store import WRITE_LOCK, StoreError

    with engine.connect() as conn:
        conn.execution_options(**{WRITE_LOCK: True})
        with conn.begin():
            try:
                command.upgrade(alembic_config(conn), "head")
            except CommandError as exc:
                raise StoreError(
                    f"cannot use database {engine.url.database}: its schema revision is "
                    "unknown to this bondgap (it was probably written by a newer version); "
                    "upgrade bondgap or choose another file with --db or BONDGAP_DB"
                ) from exc
