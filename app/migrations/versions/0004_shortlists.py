"""Shortlists with their items and conditions, and the user's own measured values.

`shortlists`: a unique name, a note, the conditions the candidates were chosen under (substrate
name, temperature in K, target as JSON text) and UTC times. `shortlist_items`: one normalised
formula (binary or alloy composition) per list and position, with a note; deleting a list
deletes its items (ON DELETE CASCADE; connections run with foreign keys on).
`user_measurements`: one value per (formula, property) in {lattice_a, band_gap, eps_inf}, in
its canonical unit, with the source the user gave and the import batch.

Revision ID: 0004
Revises: 0003
Create Date: 2026-12-03
"""

from collections.abc import Sequence

import sqlalchemy as sa
from alembic import op

revision: str = "0004"
down_revision: str | None = "0003"
branch_labels: str | Sequence[str] | None = None
depends_on: str | Sequence[str] | None = None


def upgrade() -> None:
    """Create the three tables and their indexes."""
    op.create_table(
        "shortlists",
        sa.Column("id", sa.Integer(), nullable=False),
        sa.Column("name", sa.String(length=80), nullable=False),
        sa.Column("note", sa.Text(), nullable=False, server_default=""),
        sa.Column("substrate", sa.String(length=40), nullable=True),
        sa.Column("temperature_K", sa.Float(), nullable=False, server_default="300.0"),
        sa.Column("target", sa.Text(), nullable=True),
        sa.Column("created_at", sa.DateTime(), nullable=False),
        sa.Column("updated_at", sa.DateTime(), nullable=False),
        sa.PrimaryKeyConstraint("id"),
        sa.UniqueConstraint("name", name="uq_shortlists_name"),
    )
    op.create_table(
        "shortlist_items",
        sa.Column("id", sa.Integer(), nullable=False),
        sa.Column("shortlist_id", sa.Integer(), nullable=False),
        sa.Column("formula", sa.String(length=64), nullable=False),
        sa.Column("note", sa.Text(), nullable=False, server_default=""),
        sa.Column("position", sa.Integer(), nullable=False),
        sa.Column("added_at", sa.DateTime(), nullable=False),
        sa.ForeignKeyConstraint(["shortlist_id"], ["shortlists.id"], ondelete="CASCADE"),
        sa.PrimaryKeyConstraint("id"),
        sa.UniqueConstraint("shortlist_id", "formula", name="uq_shortlist_items_formula"),
    )
    op.create_index("ix_shortlist_items_shortlist_id", "shortlist_items", ["shortlist_id"])
    op.create_table(
        "user_measurements",
        sa.Column("id", sa.Integer(), nullable=False),
        sa.Column("formula", sa.String(length=64), nullable=False),
        sa.Column("property", sa.String(length=16), nullable=False),
        sa.Column("value", sa.Float(), nullable=False),
        sa.Column("unit", sa.String(length=16), nullable=False),
        sa.Column("source", sa.Text(), nullable=False),
        sa.Column("batch", sa.String(length=32), nullable=False),
        sa.Column("imported_at", sa.DateTime(), nullable=False),
        sa.PrimaryKeyConstraint("id"),
        sa.UniqueConstraint("formula", "property", name="uq_user_measurements_formula_property"),
        sa.CheckConstraint("property IN ('lattice_a', 'band_gap', 'eps_inf')",
                           name="ck_user_measurements_property"),
    )
    op.create_index("ix_user_measurements_formula", "user_measurements", ["formula"])
    op.create_index("ix_user_measurements_batch", "user_measurements", ["batch"])


def downgrade() -> None:
    """Drop the three tables (the user's shortlists and measurements with them)."""
    op.drop_index("ix_user_measurements_batch", table_name="user_measurements")
    op.drop_index("ix_user_measurements_formula", table_name="user_measurements")
    op.drop_table("user_measurements")
    op.drop_index("ix_shortlist_items_shortlist_id", table_name="shortlist_items")
    op.drop_table("shortlist_items")
    op.drop_table("shortlists")
