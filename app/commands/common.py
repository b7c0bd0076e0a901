"""Helpers shared by the commands that read the store (`serve`, `show`, `list`)."""

from __future__ import annotations

from sqlalchemy.orm import Session, sessionmaker

from app.cli import UsageError
from app.config import Settings
from app.store import StoreError, open_store


def open_sessions(settings: Settings) -> sessionmaker[Session]:
    """Open, migrate and (on first use or a new engine version) fill the database.

    Raises:
        UsageError: The database file cannot be used (one line, exit code 2).
    """
    try:
        return open_store(settings.db_path)
    except StoreError as exc:
        raise UsageError(str(exc)) from exc

