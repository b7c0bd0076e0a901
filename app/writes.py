"""Writing the user's own tables: one transaction per change, holding the write lock throughout.

Shortlists and imported measurements are the user's data, so every change is one transaction
that starts with `BEGIN IMMEDIATE` (another process writing waits up to the busy timeout rather
than failing half-way) and either commits whole or leaves the file as it was.
"""

from __future__ import annotations

from collections.abc import Iterator
from contextlib import contextmanager
from datetime import UTC, datetime

from sqlalchemy.orm import Session

from app.store import WRITE_LOCK


@contextmanager
def writing(session: Session) -> Iterator[Session]:
    """Run the block as one write transaction: commit at the end, roll back on any error.

    A read-only transaction the session began earlier (for a lookup before the change) is
    ended first, so the write transaction starts with the write lock.

    Args:
        session: A session of `app.store.open_store`'s factory.

    Yields:
        The same session, inside the write transaction.
    """
    if session.in_transaction():
        session.rollback()
    session.connection(execution_options={WRITE_LOCK: True})
    try:
        yield session
        session.commit()
    except BaseException:
        session.rollback()
        raise


def utc_now() -> datetime:
    """The current time in UTC, without tzinfo (as the DateTime columns store it)."""
    return datetime.now(UTC).replace(tzinfo=None, microsecond=0)
