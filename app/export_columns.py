"""The columns of the shortlist CSV: name, value (rounded by `app.numbers`) and meaning.

Each column is declared once here; the CSV's header row, its cells and the column list of the
sidecar README come from these declarations. Numbers are rounded to their meaningful
precision (the rules of `app.numbers`): an estimate or interpolated gap to its uncertainty, a
measured value as published, a Vegard or virtual-crystal average to the decimals of its end
points, other model numbers to the decimals the pages show. The JSON export keeps every number
at full precision.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass
from typing import Any

from app.candidates import Candidate
from app.numbers import (
    THICKNESS_ABOVE,
    THICKNESS_BOUND_NM,
    as_written,
    round_estimate,
    rounded,
    stated_decimals,
    thickness_number,
    thickness_text,
)
from app.views import dig

ESTIMATE_SOURCE = "calibrated sp3 estimate; uncertainty = leave-one-out RMS error of the family"
VEGARD_SOURCE = "Vegard's law over the end points' measured lattice constants"
EPS_NOT_AVAILABLE = "not available"


@dataclass(frozen=True)
class CsvColumn:
    """One CSV column.

    Attributes:
        name: Header (the unit is in the name: `_eV`, `_angstrom`, `_nm`, `_K`).
        get: The cell of a candidate (None for an empty cell).
        about: What it holds, for the sidecar README.
    """

    name: str
    get: Callable[[Candidate], Any]
    about: str


def _places(value: Any, decimals: int) -> float | None:
    return None if value is None else as_written(value, decimals)


def _at(path: str, decimals: int | None = None) -> Callable[[Candidate], Any]:
    """The report value at `path`, rounded to `decimals` (None: as stored, a stated value)."""
    if decimals is None:
        return lambda c: dig(c.report, path)
    return lambda c: _places(dig(c.report, path), decimals)


def _layer(key: str, decimals: int | None = None) -> Callable[[Candidate], Any]:
    if decimals is None:
        return lambda c: (c.layer or {}).get(key)
    return lambda c: _places((c.layer or {}).get(key), decimals)


def _yours(prop: str, key: str) -> Callable[[Candidate], Any]:
    return lambda c: (c.yours.get(prop) or {}).get(key)


def _cited(c: Candidate, key: str) -> str | None:
    item = dig(c.report, f"measured.{key}")
    if not item:
        return None
    return str(item.get("source") or "") + (" (from memory)" if item.get("from_memory") else "")


def _measured(c: Candidate) -> bool:
    return dig(c.report, "band_gap.value_source") == "measured"


def _uncertainty(c: Candidate) -> float | None:
    return dig(c.report, "band_gap.uncertainty_eV")


def gap_value(c: Candidate) -> float | None:
    """The gap shown: a measured one to its published decimals, an estimate to its ±."""
    gap = c.report.get("band_gap") or {}
    value = gap.get("value_eV")
    if value is None:
        return None
    if _measured(c):
        published = gap.get("measured_300K_eV") or dig(c.report, "measured.band_gap_eV.value")
        return value if published is None else rounded(value, stated_decimals(published))
    return _to_error_bar(value, _uncertainty(c))


def _to_error_bar(value: float, uncertainty: float | None) -> float:
    _, _, places = round_estimate(value, uncertainty)
    return as_written(value, places)


def gap_uncertainty(c: Candidate) -> float | None:
    """The uncertainty of a gap that is not measured, to one or two significant digits."""
    value, u = dig(c.report, "band_gap.value_eV"), _uncertainty(c)
    if _measured(c) or value is None or u is None:
        return None
    _, _, places = round_estimate(value, u)
    return as_written(u, places)


def _estimate(c: Candidate) -> float | None:
    value = dig(c.report, "band_gap.estimate_eV")
    return None if value is None else _to_error_bar(value, _uncertainty(c))


def wavelength(c: Candidate) -> float | None:
    """hc/Eg of the gap shown: to the ± it inherits from an estimate, else to 1 nm."""
    value, gap = dig(c.report, "band_gap.wavelength_nm"), dig(c.report, "band_gap.value_eV")
    u = _uncertainty(c)
    if value is None or _measured(c) or u is None or not gap:
        return _places(value, 0)
    _, _, places = round_estimate(value, value * u / gap, 0)
    return as_written(value, places)


def _end_point_decimals(c: Candidate, key: str) -> int | None:
    values = [p.get(key) for p in c.report.get("end_points") or ()]
    if not values or any(v is None for v in values):
        return None
    return max(stated_decimals(v) for v in values)


def _averaged(path: str, end_point_key: str) -> Callable[[Candidate], Any]:
    """A binary's stated value; an alloy's average to the decimals of its end points."""

    def get(c: Candidate) -> Any:
        value = dig(c.report, path)
        places = _end_point_decimals(c, end_point_key) if c.report.get("alloy") else None
        return value if value is None or places is None else rounded(value, places)

    return get


def _end_point_sources(c: Candidate, key: str) -> str:
    return "; ".join(f"{p['formula']}: {p.get(key) or 'no source'}"
                     for p in c.report.get("end_points") or ())


def lattice_source(c: Candidate) -> str | None:
    """A binary's measured source; an alloy's Vegard route over its end points' sources."""
    if c.report.get("alloy"):
        return f"{VEGARD_SOURCE} ({_end_point_sources(c, 'lattice_constant_source')})"
    return _cited(c, "lattice_a")


def eps_inf(c: Candidate) -> Any:
    """A binary's measured eps_inf; an alloy's virtual-crystal one, or "not available"."""
    if not c.report.get("alloy"):
        return dig(c.report, "measured.eps_inf.value")
    value = dig(c.report, "eps_inf_vca.value")
    if value is None:
        return EPS_NOT_AVAILABLE
    places = _end_point_decimals(c, "eps_inf")
    return value if places is None else rounded(value, places)


def eps_inf_source(c: Candidate) -> str | None:
    """Where eps_inf comes from (an alloy: the virtual-crystal route, or why there is none)."""
    if not c.report.get("alloy"):
        return _cited(c, "eps_inf")
    block = c.report.get("eps_inf_vca") or {}
    if block.get("value") is None:
        return f"{EPS_NOT_AVAILABLE}: {block.get('not_available') or 'no virtual-crystal value'}"
    return f"{block.get('route')} ({_end_point_sources(c, 'eps_inf_source')})"


def gap_source(c: Candidate) -> str | None:
    """Where the gap shown comes from: the publication, or the route (and bowing sources)."""
    cited = _cited(c, "band_gap_eV")
    if cited:
        return cited
    route = dig(c.report, "band_gap.route")
    if not route:
        return ESTIMATE_SOURCE
    sources = dig(c.report, "band_gap.sources") or ()
    return route + (f"; bowing: {'; '.join(sources)}" if sources else "")


def _matched(c: Candidate) -> bool:
    return "lattice-matched" in str((c.layer or {}).get("critical_thickness_note") or "")


def thickness_shown(c: Candidate) -> str | None:
    """The critical thickness as the pages show it: "∞", "> 10 µm", "250 nm" (None: none)."""
    if c.layer is None:
        return None
    h_c = c.layer.get("critical_thickness_nm")
    if h_c is None and not _matched(c):
        return None
    return thickness_text(math.inf if _matched(c) else h_c, unit=True).replace("\u00a0", " ")


def _thickness(c: Candidate) -> float | None:
    return thickness_number((c.layer or {}).get("critical_thickness_nm"))


CSV_COLUMNS: tuple[CsvColumn, ...] = (
    CsvColumn("position", lambda c: c.position, "place on the list"),
    CsvColumn("formula", lambda c: c.formula, "formula, cation first"),
    CsvColumn("kind", lambda c: c.kind, "compound or alloy"),
    CsvColumn("note", lambda c: c.note, "your note on the candidate"),
    CsvColumn("structure", _at("structure.observed"), "observed crystal structure"),
    CsvColumn("structure_source", _at("structure.source"), "where the structure comes from"),
    CsvColumn("temperature_K", _at("band_gap.temperature_K"), "temperature of the gaps, K"),
    CsvColumn("band_gap_eV", gap_value, "band gap at the temperature, eV: measured as "
              "published, an estimate or interpolated gap to its uncertainty"),
    CsvColumn("band_gap_route", _at("band_gap.value_source"),
              "measured, estimate or interpolated"),
    CsvColumn("band_gap_uncertainty_eV", gap_uncertainty,
              "uncertainty of a gap that is not measured, eV (1 or 2 significant digits)"),
    CsvColumn("band_gap_source", gap_source, "publication of a measured gap, or the route "
              "and bowing sources of an estimate or interpolated gap"),
    CsvColumn("band_gap_estimate_eV", _estimate,
              "the model estimate beside a measured gap, eV, to its uncertainty"),
    CsvColumn("wavelength_nm", wavelength, "photon wavelength hc/Eg of the gap shown, nm, to "
              "the uncertainty it inherits from the gap (1 nm for a measured gap)"),
    CsvColumn("gap_kind", _at("band_gap.kind"), "direct or indirect"),
    CsvColumn("gap_kind_route", _at("band_gap.kind_source"), "where the kind comes from"),
    CsvColumn("gap_kind_source", lambda c: _cited(c, "gap_kind"), "publication of the kind"),
    CsvColumn("lattice_constant_angstrom", _averaged("lattice_constant_angstrom",
                                                     "lattice_constant_angstrom"),
              "lattice constant a, angstrom (alloys: Vegard, to the end points' decimals)"),
    CsvColumn("lattice_c_angstrom", _averaged("lattice_c_angstrom", "lattice_constant_angstrom"),
              "lattice constant c of hexagonal cells, angstrom"),
    CsvColumn("lattice_constant_route", lambda c: c.report.get("lattice_route") or (
        "measured" if c.report.get("lattice_constant_angstrom") is not None else None),
        "measured, or Vegard's law for an alloy"),
    CsvColumn("lattice_constant_source", lattice_source,
              "publication of a, or (alloys) Vegard's law and each end point's source"),
    CsvColumn("bond_length_angstrom", _at("bond_length_used_angstrom", 4),
              "bond length the models used, angstrom"),
    CsvColumn("eps_inf", eps_inf, "high-frequency dielectric constant (no unit): measured, "
              "or the virtual-crystal average for an alloy, or 'not available'"),
    CsvColumn("eps_inf_source", eps_inf_source,
              "publication, or the virtual-crystal route and the end points' sources"),
    CsvColumn("ionicity_spectroscopic", _at("phillips.spectroscopic.ionicity", 3),
              "Phillips ionicity, spectroscopic route (no unit)"),
    CsvColumn("ionicity_predictive", _at("phillips.predictive.ionicity", 3),
              "Phillips ionicity, predictive route (no unit)"),
    CsvColumn("polarity", _at("harrison.polarity", 3), "Harrison polarity (no unit)"),
    CsvColumn("coordination_predicted", _at("coordination.predicted"),
              "coordination predicted from the ionicity"),
    CsvColumn("coordination_observed", _at("coordination.observed"),
              "coordination of the observed structure"),
    CsvColumn("substrate", _layer("substrate"), "substrate of the list"),
    CsvColumn("substrate_a_angstrom", _layer("substrate_a_angstrom"),
              "substrate lattice constant the layer is matched to, angstrom"),
    CsvColumn("mismatch_fraction", _layer("mismatch", 5),
              "lattice mismatch as a fraction (not percent), 5 decimals"),
    CsvColumn("in_plane_strain", _layer("in_plane_strain", 5),
              "in-plane strain of a pseudomorphic layer (fraction), 5 decimals"),
    CsvColumn("critical_thickness", thickness_shown,
              f"critical thickness as the pages show it: '∞' for a lattice-matched layer, "
              f"'{THICKNESS_ABOVE}' above {THICKNESS_BOUND_NM:g} nm, else the value in nm"),
    CsvColumn("critical_thickness_nm", _thickness, "Matthews-Blakeslee critical thickness, nm, "
              f"3 significant digits; empty when lattice-matched or above "
              f"{THICKNESS_BOUND_NM:g} nm (see critical_thickness)"),
    CsvColumn("critical_thickness_note", _layer("critical_thickness_note"),
              "how the critical thickness was found, or why there is none"),
    CsvColumn("layer_not_computed", lambda c: c.layer_error,
              "why there is no layer on the substrate"),
    CsvColumn("toxic_elements", lambda c: " ".join(c.toxic), "toxic elements present"),
    CsvColumn("rohs_restricted", lambda c: " ".join(c.rohs), "elements restricted by RoHS"),
    CsvColumn("yours_lattice_a_angstrom", _yours("lattice_a", "value"),
              "your imported lattice constant, angstrom"),
    CsvColumn("yours_lattice_a_source", _yours("lattice_a", "source"), "its source"),
    CsvColumn("yours_band_gap_eV", _yours("band_gap", "value"), "your imported gap, eV"),
    CsvColumn("yours_band_gap_source", _yours("band_gap", "source"), "its source"),
    CsvColumn("yours_eps_inf", _yours("eps_inf", "value"), "your imported eps_inf"),
    CsvColumn("yours_eps_inf_source", _yours("eps_inf", "source"), "its source"),
)
"""Every CSV column, in order."""
