"""The user's own substrates, beside the built-in table of `seed_data/substrates.csv`.

One row per substrate: a unique name (never one of the built-in names; the app checks), the
engine's structure name (diamond, zincblende, wurtzite, hexagonal, corundum), the lattice
constant a (cubic a, or the hexagonal in-plane a) and, for hexagonal ones, c, with a free note
and the time the row was added (UTC).

Revision ID: 0003
Revises: 0002
Create Date: 2026-12-03
"""

from collections.abc import Sequence

import sqlalchemy as sa
from alembic import op

revision: str = "0003"
down_revision: str | None = "0002"
branch_labels: str | Sequence[str] | None = None
depends_on: str | Sequence[str] | None = None


def upgrade() -> None:
    """Create the `user_substrates` table."""
    op.create_table(
        "user_substrates",
        sa.Column("id", sa.Integer(), nullable=False),
        sa.Column("name", sa.String(length=40), nullable=False),
        sa.Column("structure", sa.String(length=16), nullable=False),
        sa.Column("a_angstrom", sa.Float(), nullable=False),
        sa.Column("c_angstrom", sa.Float(), nullable=True),
        sa.Column("note", sa.String(length=200), nullable=False, server_default=""),
        sa.Column("created_at", sa.DateTime(), nullable=False),
        sa.PrimaryKeyConstraint("id"),
        sa.UniqueConstraint("name", name="uq_user_substrates_name"),
    )


def downgrade() -> None:
    """Drop the `user_substrates` table."""
    op.drop_table("user_substrates")
