"""Initial schema: store_meta and compound_results.

Revision ID: 0001
Revises:
Create Date: 2026-12-02
"""

from collections.abc import Sequence

import sqlalchemy as sa
from alembic import op

revision: str = "0001"
down_revision: str | None = None
branch_labels: str | Sequence[str] | None = None
depends_on: str | Sequence[str] | None = None

_INDEXED = (
    "family",
    "structure_observed",
    "gap_measured_ev",
    "lattice_constant_angstrom",
    "ionicity_spectroscopic",
    "ionicity_predictive",
)


def upgrade() -> None:
    """Create the results table (one row per compound) and the key/value meta table."""
    op.create_table(
        "compound_results",
        sa.Column("formula", sa.String(length=32), nullable=False),
        sa.Column("family", sa.String(length=8), nullable=False),
        sa.Column("cation", sa.String(length=3), nullable=False),
        sa.Column("anion", sa.String(length=3), nullable=False),
        sa.Column("structure_observed", sa.String(length=32), nullable=True),
        sa.Column("gap_measured_ev", sa.Float(), nullable=True),
        sa.Column("gap_kind", sa.String(length=16), nullable=True),
        sa.Column("eps_inf", sa.Float(), nullable=True),
        sa.Column("lattice_constant_angstrom", sa.Float(), nullable=True),
        sa.Column("bond_length_angstrom", sa.Float(), nullable=True),
        sa.Column("ionicity_spectroscopic", sa.Float(), nullable=True),
        sa.Column("ionicity_predictive", sa.Float(), nullable=True),
        sa.Column("polarity", sa.Float(), nullable=True),
        sa.Column("covalent_energy_ev", sa.Float(), nullable=True),
        sa.Column("polar_energy_ev", sa.Float(), nullable=True),
        sa.Column("coordination_predicted", sa.String(length=16), nullable=True),
        sa.Column("coordination_observed", sa.String(length=16), nullable=True),
        sa.Column("hazard_elements", sa.String(length=64), nullable=False),
        sa.Column("model_version", sa.String(length=32), nullable=False),
        sa.Column("report_json", sa.Text(), nullable=False),
        sa.PrimaryKeyConstraint("formula"),
    )
    for column in _INDEXED:
        op.create_index(f"ix_compound_results_{column}", "compound_results", [column])
    op.create_table(
        "store_meta",
        sa.Column("key", sa.String(length=64), nullable=False),
        sa.Column("value", sa.Text(), nullable=False),
        sa.PrimaryKeyConstraint("key"),
    )


def downgrade() -> None:
    """Drop both tables."""
    op.drop_table("store_meta")
    for column in _INDEXED:
        op.drop_index(f"ix_compound_results_{column}", table_name="compound_results")
    op.drop_table("compound_results")
