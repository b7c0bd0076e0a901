"""The values of the shortlist CSV's columns, rounded to their meaningful precision.

The rules are those of `app.numbers`: an estimate or interpolated gap to its uncertainty, a
measured value as published, a Vegard or virtual-crystal average to the decimals of its end
points, other model numbers to the decimals the pages show; alloys name their end points'
sources. `app.export_columns` declares the columns with these getters.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from typing import Any

from app.candidates import Candidate
from app.numbers import (
    as_written,
    round_estimate,
    rounded,
    stated_decimals,
    terminal,
    thickness_number,
    thickness_text,
)
from app.views import dig

ESTIMATE_SOURCE = "calibrated sp3 estimate; uncertainty = leave-one-out RMS error of the family"
VEGARD_SOURCE = "Vegard's law over the end points' measured lattice constants"
EPS_NOT_AVAILABLE = "not available"


def _places(value: Any, decimals: int) -> float | None:
    return None if value is None else as_written(value, decimals)


def at(path: str, decimals: int | None = None) -> Callable[[Candidate], Any]:
    """The report value at `path`, rounded to `decimals` (None: as stored, a stated value)."""
    if decimals is None:
        return lambda c: dig(c.report, path)
    return lambda c: _places(dig(c.report, path), decimals)


def layer(key: str, decimals: int | None = None) -> Callable[[Candidate], Any]:
    """The layer-block value `key`, rounded to `decimals` (None: as stored)."""
    if decimals is None:
        return lambda c: (c.layer or {}).get(key)
    return lambda c: _places((c.layer or {}).get(key), decimals)


def yours(prop: str, key: str) -> Callable[[Candidate], Any]:
    """`key` (value or source) of the user's own value of `prop`."""
    return lambda c: (c.yours.get(prop) or {}).get(key)


def cited(c: Candidate, key: str) -> str | None:
    """The source of a binary's measured `key`, "(from memory)" added where recalled."""
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


def estimate(c: Candidate) -> float | None:
    """The model estimate (beside a measured gap too), to its uncertainty."""
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


def averaged(path: str, end_point_key: str) -> Callable[[Candidate], Any]:
    """A binary's stated value; an alloy's average to the decimals of its end points."""

    def get(c: Candidate) -> Any:
        value = dig(c.report, path)
        places = _end_point_decimals(c, end_point_key) if c.report.get("alloy") else None
        return value if value is None or places is None else rounded(value, places)

    return get


def _end_point_sources(c: Candidate, key: str) -> str:
    return "; ".join(
        f"{p['formula']}: {p.get(key) or 'no source'}" for p in c.report.get("end_points") or ()
    )


def _lattice_estimate(c: Candidate) -> dict[str, Any] | None:
    """A binary's estimated cell, where no lattice constant is measured (else None)."""
    if c.report.get("alloy") or c.report.get("lattice_constant_angstrom") is not None:
        return None
    estimate = c.report.get("lattice_estimate") or {}
    return estimate if estimate.get("a_angstrom") is not None else None


def lattice_a(c: Candidate) -> float | None:
    """Measured a as published; an alloy's Vegard a; else the estimate to its uncertainty."""
    estimate = _lattice_estimate(c)
    if estimate is None:
        return averaged("lattice_constant_angstrom", "lattice_constant_angstrom")(c)
    value, _, places = round_estimate(estimate["a_angstrom"], estimate["uncertainty_angstrom"])
    return as_written(value, places)


def lattice_uncertainty(c: Candidate) -> float | None:
    """The uncertainty of an estimated a (empty for a measured or Vegard one)."""
    estimate = _lattice_estimate(c)
    if estimate is None:
        return None
    _, u, places = round_estimate(estimate["a_angstrom"], estimate["uncertainty_angstrom"])
    return None if u is None else as_written(u, places)


def lattice_route(c: Candidate) -> str | None:
    """measured, Vegard's law (alloys) or estimate."""
    if c.report.get("alloy"):
        return c.report.get("lattice_route")
    if c.report.get("lattice_constant_angstrom") is not None:
        return "measured"
    return "estimate" if _lattice_estimate(c) else None


def lattice_source(c: Candidate) -> str | None:
    """Measured source; an alloy's Vegard route over its end points; an estimate's route."""
    if c.report.get("alloy"):
        return f"{VEGARD_SOURCE} ({_end_point_sources(c, 'lattice_constant_source')})"
    estimate = _lattice_estimate(c)
    return estimate["route"] if estimate else cited(c, "lattice_a")


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
        return cited(c, "eps_inf")
    block = c.report.get("eps_inf_vca") or {}
    if block.get("value") is None:
        return f"{EPS_NOT_AVAILABLE}: {block.get('not_available') or 'no virtual-crystal value'}"
    return f"{block.get('route')} ({_end_point_sources(c, 'eps_inf_source')})"


def gap_source(c: Candidate) -> str | None:
    """Where the gap shown comes from: the publication, or the route (and bowing sources)."""
    published = cited(c, "band_gap_eV")
    if published:
        return published
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
    return terminal(thickness_text(math.inf if _matched(c) else h_c, unit=True))


def thickness(c: Candidate) -> float | None:
    """The critical thickness as a number within the bound (3 significant digits)."""
    return thickness_number((c.layer or {}).get("critical_thickness_nm"))
