"""Alembic environment: runs on the connection `upgrade_to_head` hands over.

From the command line (`alembic -c app/alembic.ini ...`) it opens the database that
`app.config.resolve_db_path` picks (`BONDGAP_DB`, ...).
"""

from alembic import context

from app.models import Base
from app.store import make_engine

config = context.config
target_metadata = Base.metadata


def _run(connection: object) -> None:
    context.configure(
        connection=connection,
        target_metadata=target_metadata,
        render_as_batch=True,  # SQLite cannot ALTER most things: copy-and-move tables instead
        transactional_ddl=True,
    )
    with context.begin_transaction():
        context.run_migrations()


def run_migrations_online() -> None:
    """Run the migrations on the given connection, or on the configured database file."""
    connection = config.attributes.get("connection")
    if connection is not None:
        _run(connection)
        return
    from app.config import resolve_db_path

    engine = make_engine(resolve_db_path())
    with engine.connect() as conn, conn.begin():
        _run(conn)


if context.is_offline_mode():
    raise SystemExit("bondgap migrations run online only (SQLite file)")
run_migrations_online()
