"""The tables of the store (SQLAlchemy models) and how one engine report fills a row.

The schema itself is owned by the Alembic revisions in `app/migrations/versions/`;
`tests/app/test_store.py` checks that these models and the revisions agree.
"""

from __future__ import annotations

import json
from datetime import datetime
from functools import cached_property
from typing import Any

from sqlalchemy import (
    Boolean,
    CheckConstraint,
    DateTime,
    Float,
    ForeignKey,
    Index,
    Integer,
    String,
    Text,
    UniqueConstraint,
)
from sqlalchemy.orm import DeclarativeBase, Mapped, mapped_column, validates

import screening
from app.names import KEY_GROWTH, name_key


class Base(DeclarativeBase):
    """Declarative base of every table; `Base.metadata` is what the migrations must match."""


class NamedRow:
    """A row with a user-given `name` and its `name_key` (revision 0005, `app.names`).

    Setting the name sets the key, so every write through the models stores both; the unique
    index on `name_key` refuses a second name that folds to the same key.
    """

    name: Mapped[str]
    name_key: Mapped[str]

    @validates("name")
    def _set_name_key(self, _field: str, value: str) -> str:
        self.name_key = name_key(value)
        return value


class StoreMeta(Base):
    """Key/value facts about the stored results (for example `model_version`)."""

    __tablename__ = "store_meta"

    key: Mapped[str] = mapped_column(String(64), primary_key=True)
    value: Mapped[str] = mapped_column(Text)


class CompoundResult(Base):
    """The engine's report on one compound, with the columns the table sorts and filters on.

    The formula (normalised by the engine) is the primary key, so rows keep their identity
    when results are recomputed and later tables can refer to them by formula. The `gap_*`
    columns of revision 0002 hold the band gap at 300 K; other temperatures are computed by
    the engine when asked (`app.gap_columns`).
    """

    __tablename__ = "compound_results"

    formula: Mapped[str] = mapped_column(String(32), primary_key=True)
    family: Mapped[str] = mapped_column(String(8), index=True)
    cation: Mapped[str] = mapped_column(String(3))
    anion: Mapped[str] = mapped_column(String(3))
    structure_observed: Mapped[str | None] = mapped_column(String(32), index=True)
    gap_measured_ev: Mapped[float | None] = mapped_column(Float, index=True)
    gap_kind: Mapped[str | None] = mapped_column(String(16))
    eps_inf: Mapped[float | None] = mapped_column(Float)
    lattice_constant_angstrom: Mapped[float | None] = mapped_column(Float, index=True)
    bond_length_angstrom: Mapped[float | None] = mapped_column(Float)
    ionicity_spectroscopic: Mapped[float | None] = mapped_column(Float, index=True)
    ionicity_predictive: Mapped[float | None] = mapped_column(Float, index=True)
    polarity: Mapped[float | None] = mapped_column(Float)
    covalent_energy_ev: Mapped[float | None] = mapped_column(Float)
    polar_energy_ev: Mapped[float | None] = mapped_column(Float)
    coordination_predicted: Mapped[str | None] = mapped_column(String(16))
    coordination_observed: Mapped[str | None] = mapped_column(String(16))
    hazard_elements: Mapped[str] = mapped_column(String(64), default="")
    model_version: Mapped[str] = mapped_column(String(32))
    report_json: Mapped[str] = mapped_column(Text)
    # revision 0002: the band gap at 300 K
    gap_value_ev: Mapped[float | None] = mapped_column(Float, index=True)
    gap_value_source: Mapped[str | None] = mapped_column(String(16))
    gap_estimate_ev: Mapped[float | None] = mapped_column(Float)
    gap_uncertainty_ev: Mapped[float | None] = mapped_column(Float)
    gap_wavelength_nm: Mapped[float | None] = mapped_column(Float, index=True)
    gap_kind_shown: Mapped[str | None] = mapped_column(String(16), index=True)
    gap_kind_source: Mapped[str | None] = mapped_column(String(32))
    tb_direct: Mapped[bool | None] = mapped_column(Boolean)

    @cached_property
    def report(self) -> dict[str, Any]:
        """The stored engine report, read once per row object."""
        return json.loads(self.report_json)

    @property
    def lattice_constant_shown(self) -> float | None:
        """The lattice constant a: measured where known, else the estimate (no new column)."""
        if self.lattice_constant_angstrom is not None:
            return self.lattice_constant_angstrom
        return self.report.get("lattice_constant_estimated_angstrom")

    @property
    def lattice_constant_source(self) -> str | None:
        """Where `lattice_constant_shown` comes from: "measured" or "estimate" (None: none)."""
        if self.lattice_constant_angstrom is not None:
            return "measured"
        return "estimate" if self.lattice_constant_shown is not None else None

    @property
    def lattice_constant_uncertainty(self) -> float | None:
        """Uncertainty of an estimated lattice constant, angstrom (None where measured)."""
        if self.lattice_constant_source != "estimate":
            return None
        return _dig(self.report, "lattice_estimate", "uncertainty_angstrom")


class UserSubstrate(NamedRow, Base):
    """A substrate of the user's own (revision 0003), beside the built-in table.

    `structure` is "cubic", "hexagonal" or one of the engine's substrate structures
    (`screening.epitaxy.LATTICE_OF_SUBSTRATE`); `a_angstrom` is the cubic a or the hexagonal
    in-plane a, `c_angstrom` the hexagonal c (None for cubic ones). Names never repeat a
    built-in name (checked by `app.substrates`).
    """

    __tablename__ = "user_substrates"
    __table_args__ = (UniqueConstraint("name", name="uq_user_substrates_name"),
                      Index("uq_user_substrates_name_key", "name_key", unique=True))

    id: Mapped[int] = mapped_column(Integer, primary_key=True)
    name: Mapped[str] = mapped_column(String(40))
    name_key: Mapped[str] = mapped_column(String(40 * KEY_GROWTH), server_default="")
    structure: Mapped[str] = mapped_column(String(16))
    a_angstrom: Mapped[float] = mapped_column(Float)
    c_angstrom: Mapped[float | None] = mapped_column(Float)
    note: Mapped[str] = mapped_column(String(200), server_default="")
    created_at: Mapped[datetime] = mapped_column(DateTime)

def _dig(mapping: Any, *keys: str) -> Any:
    """Follow `keys` into nested dicts; None as soon as a level is missing or null."""
    for key in keys:
        if not isinstance(mapping, dict):
            return None
        mapping = mapping.get(key)
    return mapping


def row_values(report: dict[str, Any]) -> dict[str, Any]:
    """Map one engine report (docs/report-schema.md) to the values of its `compound_results` row.

    Args:
        report: The dict from `screening.report.compound_report` (band gap at 300 K).

    Returns:
        Column name -> value, including `report_json`.
    """
    gap = report.get("band_gap") or {}
    return {
        "formula": report["formula"],
        "family": report["family"],
        "cation": report["cation"],
        "anion": report["anion"],
        "structure_observed": _dig(report, "structure", "observed"),
        "gap_measured_ev": _dig(report, "measured", "band_gap_eV", "value"),
        "gap_kind": _dig(report, "measured", "gap_kind", "value"),
        "eps_inf": _dig(report, "measured", "eps_inf", "value"),
        "lattice_constant_angstrom": report.get("lattice_constant_angstrom"),
        "bond_length_angstrom": report.get("bond_length_used_angstrom"),
        "ionicity_spectroscopic": _dig(report, "phillips", "spectroscopic", "ionicity"),
        "ionicity_predictive": _dig(report, "phillips", "predictive", "ionicity"),
        "polarity": _dig(report, "harrison", "polarity"),
        "covalent_energy_ev": _dig(report, "harrison", "covalent_energy_eV"),
        "polar_energy_ev": _dig(report, "harrison", "polar_energy_eV"),
        "coordination_predicted": _dig(report, "coordination", "predicted"),
        "coordination_observed": _dig(report, "coordination", "observed"),
        "hazard_elements": ",".join(_dig(report, "hazards", "caution_elements")
                                    or _dig(report, "hazards", "elements") or ()),
        "model_version": report.get("model_version", screening.MODEL_VERSION),
        "report_json": json.dumps(report, ensure_ascii=False, sort_keys=True),
        "gap_value_ev": gap.get("value_eV"),
        "gap_value_source": gap.get("value_source"),
        "gap_estimate_ev": gap.get("estimate_eV"),
        "gap_uncertainty_ev": gap.get("uncertainty_eV"),
        "gap_wavelength_nm": gap.get("wavelength_nm"),
        "gap_kind_shown": gap.get("kind"),
        "gap_kind_source": gap.get("kind_source"),
        "tb_direct": _dig(report, "tight_binding", "direct"),
    }


class Shortlist(NamedRow, Base):
    """A shortlist of candidates (revision 0004), with the conditions it was chosen under.

    `substrate` names a built-in or user substrate (None: none chosen), `temperature_K` is the
    temperature of the band gaps, `target` a JSON object (`app.conditions.Conditions`). Times
    are UTC.
    """

    __tablename__ = "shortlists"
    __table_args__ = (UniqueConstraint("name", name="uq_shortlists_name"),
                      Index("uq_shortlists_name_key", "name_key", unique=True))

    id: Mapped[int] = mapped_column(Integer, primary_key=True)
    name: Mapped[str] = mapped_column(String(80))
    name_key: Mapped[str] = mapped_column(String(80 * KEY_GROWTH), server_default="")
    note: Mapped[str] = mapped_column(Text, server_default="")
    substrate: Mapped[str | None] = mapped_column(String(40))
    temperature_K: Mapped[float] = mapped_column(Float, server_default="300.0")
    target: Mapped[str | None] = mapped_column(Text)
    created_at: Mapped[datetime] = mapped_column(DateTime)
    updated_at: Mapped[datetime] = mapped_column(DateTime)


class ShortlistItem(Base):
    """One candidate on a shortlist: a normalised binary or alloy formula, with a note."""

    __tablename__ = "shortlist_items"
    __table_args__ = (
        UniqueConstraint("shortlist_id", "formula", name="uq_shortlist_items_formula"),
    )

    id: Mapped[int] = mapped_column(Integer, primary_key=True)
    shortlist_id: Mapped[int] = mapped_column(
        ForeignKey("shortlists.id", ondelete="CASCADE"), index=True
    )
    formula: Mapped[str] = mapped_column(String(64))
    note: Mapped[str] = mapped_column(Text, server_default="")
    position: Mapped[int] = mapped_column(Integer)
    added_at: Mapped[datetime] = mapped_column(DateTime)


MEASUREMENT_PROPERTIES: tuple[str, ...] = ("lattice_a", "band_gap", "eps_inf")
"""Properties a user may import measured values of (`app.imports`)."""


class UserMeasurement(Base):
    """A value the user measured (revision 0004), shown beside the handbook values as theirs.

    One row per (formula, property): a later import replaces the earlier value. `value` is in
    the canonical unit `unit` (angstrom, eV, or "" for eps_inf); `batch` names the import.
    """

    __tablename__ = "user_measurements"
    __table_args__ = (
        UniqueConstraint("formula", "property", name="uq_user_measurements_formula_property"),
        CheckConstraint("property IN ('lattice_a', 'band_gap', 'eps_inf')",
                        name="ck_user_measurements_property"),
    )

    id: Mapped[int] = mapped_column(Integer, primary_key=True)
    formula: Mapped[str] = mapped_column(String(64), index=True)
    property: Mapped[str] = mapped_column(String(16))
    value: Mapped[float] = mapped_column(Float)
    unit: Mapped[str] = mapped_column(String(16))
    source: Mapped[str] = mapped_column(Text)
    batch: Mapped[str] = mapped_column(String(32), index=True)
    imported_at: Mapped[datetime] = mapped_column(DateTime)
