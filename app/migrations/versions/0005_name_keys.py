"""Folded name keys: shortlist and substrate names unique by one Unicode rule (`app.names`).

Adds `name_key` (NOT NULL, default "") to `shortlists` and `user_substrates`, fills it from
each name with `app.names.name_key`, and puts a unique index on it. The column is added in
place (`ALTER TABLE ... ADD COLUMN`): the tables are not rebuilt, so no ON DELETE CASCADE fires
and every candidate keeps its list.

An older bondgap compared names with SQLite's ASCII-only `lower()`, so a file may hold two
names that are now one name (e.g. "ÄPFEL" and "äpfel"). Nothing is dropped: the row made first
(lowest id) keeps its name, each later one is renamed by appending " (2)", " (3)", ... (the
first number whose name is free under the rule, cut to the column's length), with its
candidates and notes kept. A renamed substrate is renamed in the conditions of the shortlists
that name it too. Downgrading drops the keys and keeps the new names.

Revision ID: 0005
Revises: 0004
Create Date: 2026-12-08
"""

import itertools
from collections.abc import Iterable, Sequence

import sqlalchemy as sa
from alembic import op

from app.names import KEY_GROWTH, name_key

revision: str = "0005"
down_revision: str | None = "0004"
branch_labels: str | Sequence[str] | None = None
depends_on: str | Sequence[str] | None = None

_TABLES: tuple[tuple[str, int], ...] = (("user_substrates", 40), ("shortlists", 80))
"""Tables with a user-given name, and the name column's length."""
_SHORTLISTS = sa.table("shortlists", sa.column("substrate"))


def _free_name(name: str, length: int, used: set[str]) -> tuple[str, str]:
    """The name with the first suffix " (2)", " (3)", ... whose key is not used, and its key."""
    for number in itertools.count(2):
        suffix = f" ({number})"
        candidate = name[: length - len(suffix)].rstrip() + suffix
        key = name_key(candidate)
        if key not in used:
            return candidate, key
    raise AssertionError("unreachable: the used keys are finitely many")


def distinct_names(rows: Iterable[tuple[int, str]], length: int) -> dict[int, tuple[str, str]]:
    """Give every row a name of its own key: id -> (name, key), later duplicates renamed.

    The lowest id of each key keeps its name; a new name never takes another row's key.

    Args:
        rows: (id, name) pairs.
        length: Longest name allowed.
    """
    ordered = sorted(rows)
    first: dict[str, int] = {}
    for row_id, name in ordered:
        first.setdefault(name_key(name), row_id)
    used = set(first)
    result: dict[int, tuple[str, str]] = {}
    for row_id, name in ordered:
        key = name_key(name)
        if first[key] != row_id:
            name, key = _free_name(name, length, used)
            used.add(key)
        result[row_id] = (name, key)
    return result


def upgrade() -> None:
    """Add, fill and index the key columns, renaming names that the rule now makes one."""
    conn = op.get_bind()
    for table, length in _TABLES:
        op.add_column(
            table,
            sa.Column(
                "name_key", sa.String(length=length * KEY_GROWTH), nullable=False, server_default=""
            ),
        )
        named = sa.table(table, sa.column("id"), sa.column("name"), sa.column("name_key"))
        rows = [(row.id, row.name) for row in conn.execute(sa.select(named.c.id, named.c.name))]
        names = dict(rows)
        for row_id, (name, key) in distinct_names(rows, length).items():
            conn.execute(
                sa.update(named).where(named.c.id == row_id).values(name=name, name_key=key)
            )
            if table == "user_substrates" and name != names[row_id]:
                conn.execute(
                    sa.update(_SHORTLISTS)
                    .where(_SHORTLISTS.c.substrate == names[row_id])
                    .values(substrate=name)
                )
        op.create_index(f"uq_{table}_name_key", table, ["name_key"], unique=True)


def downgrade() -> None:
    """Drop the keys (SQLite >= 3.35 drops columns in place); renamed names stay renamed."""
    for table, _ in reversed(_TABLES):
        op.drop_index(f"uq_{table}_name_key", table_name=table)
        op.drop_column(table, "name_key")
