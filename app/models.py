"""The tables of the store (SQLAlchemy models) and how one engine report fills a row.

The schema itself is owned by the Alembic revisions in `app/migrations/versions/`;
`tests/app/test_store.py` checks that these models and the revisions agree.
"""

from __future__ import annotations

import json
from typing import Any

from sqlalchemy import Boolean, Float, String, Text
from sqlalchemy.orm import DeclarativeBase, Mapped, mapped_column

import screening


class Base(DeclarativeBase):
    """Declarative base of every table; `Base.metadata` is what the migrations must match."""


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
        "hazard_elements": ",".join(_dig(report, "hazards", "elements") or ()),
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
