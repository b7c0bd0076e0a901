"""Band-gap columns of the compound table, for sorting and filtering.

The gap at 300 K (measured where known, else the estimate), the estimate, its uncertainty, the
photon wavelength, the gap kind and where it comes from, and the sp3 model's direct flag.

Columns are added in place (SQLite `ALTER TABLE ... ADD COLUMN`), so the table is not rebuilt
and rows of the user's own tables that refer to `compound_results` keep their references.
The stored model version is cleared, so the next start fills the new columns.

Revision ID: 0002
Revises: 0001
Create Date: 2026-12-02
"""

from collections.abc import Sequence

import sqlalchemy as sa
from alembic import op

revision: str = "0002"
down_revision: str | None = "0001"
branch_labels: str | Sequence[str] | None = None
depends_on: str | Sequence[str] | None = None

_COLUMNS: tuple[tuple[str, sa.types.TypeEngine], ...] = (
    ("gap_value_ev", sa.Float()),
    ("gap_value_source", sa.String(length=16)),
    ("gap_estimate_ev", sa.Float()),
    ("gap_uncertainty_ev", sa.Float()),
    ("gap_wavelength_nm", sa.Float()),
    ("gap_kind_shown", sa.String(length=16)),
    ("gap_kind_source", sa.String(length=32)),
    ("tb_direct", sa.Boolean()),
)
_INDEXED = ("gap_value_ev", "gap_wavelength_nm", "gap_kind_shown")


def upgrade() -> None:
    """Add the band-gap columns and their indexes; ask for the results to be recomputed."""
    for name, type_ in _COLUMNS:
        op.add_column("compound_results", sa.Column(name, type_, nullable=True))
    for name in _INDEXED:
        op.create_index(f"ix_compound_results_{name}", "compound_results", [name])
    op.execute(sa.text("DELETE FROM store_meta WHERE key = 'model_version'"))


def downgrade() -> None:
    """Drop the band-gap columns again (SQLite >= 3.35 drops columns in place)."""
    for name in _INDEXED:
        op.drop_index(f"ix_compound_results_{name}", table_name="compound_results")
    for name, _ in reversed(_COLUMNS):
        op.drop_column("compound_results", name)
    op.execute(sa.text("DELETE FROM store_meta WHERE key = 'model_version'"))
