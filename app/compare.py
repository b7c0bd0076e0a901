"""Two to eight candidates side by side: one row per property, the best value per row marked.

Rows come in the order a design review reads them: the differences that matter first (band gap,
wavelength, direct or indirect, lattice constant, mismatch, critical thickness, ionicity,
polarity, structure stability), then the rest. Each cell carries its value, unit, route and
source, and the user's own value where one was imported ("yours"). Each row states its rule
for "best" (closest to the target, smallest |mismatch|, ...); rows without a figure of merit
are not ranked, and a row whose values all tie marks none.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass
from typing import Any

from app.candidates import Candidate
from app.conditions import Conditions
from app.numbers import estimate_text, fixed, thickness_text, uncertainty_text
from app.params import QueryError
from app.views import dig
from screening.epitaxy import MISMATCH_PERCENT_CONVENTION
from screening.hazards import ROHS_SOURCE
from screening.phillips import CRITICAL_IONICITY
from screening.registry import BOND_ORBITAL, PVV, QUANTITIES, Quantity

MIN_COMPARED, MAX_COMPARED = 2, 8


@dataclass(frozen=True)
class Cell:
    """One candidate's value of one property."""

    value: float | str | None
    text: str
    route: str
    source: str
    yours: dict[str, Any] | None = None


@dataclass(frozen=True)
class Row:
    """One property across the candidates; `best` holds the indexes of the best cells."""

    key: str
    label: str
    unit: str
    rule: str
    cells: tuple[Cell, ...]
    best: tuple[int, ...]


def _num(value: Any, digits: int) -> str:
    return fixed(value, digits)


def _measured_source(c: Candidate, key: str) -> str:
    item = dig(c.report, f"measured.{key}") or {}
    text = str(item.get("source") or "")
    return text + (" (from memory)" if text and item.get("from_memory") else "")


def _gap(c: Candidate, _: Conditions) -> Cell:
    gap = c.report.get("band_gap") or {}
    value, source = gap.get("value_eV"), gap.get("value_source") or ""
    text = estimate_text(value, None if source == "measured" else gap.get("uncertainty_eV"))
    origin = (_measured_source(c, "band_gap_eV") if source == "measured"
              else gap.get("route") or "calibrated sp3 estimate; ± leave-one-out RMS of family")
    return Cell(value, text, f"{source} at {gap.get('temperature_K', 300):g} K", origin,
                c.yours.get("band_gap"))


def _wavelength(c: Candidate, _: Conditions) -> Cell:
    value = dig(c.report, "band_gap.wavelength_nm")
    return Cell(value, _num(value, 0), "hc / Eg of the gap shown", "")


def _kind(c: Candidate, _: Conditions) -> Cell:
    gap = c.report.get("band_gap") or {}
    return Cell(gap.get("kind"), gap.get("kind") or "—", gap.get("kind_source") or "",
                _measured_source(c, "gap_kind"))


def _lattice(c: Candidate, _: Conditions) -> Cell:
    value = c.report.get("lattice_constant_angstrom")
    route = c.report.get("lattice_route") or ("measured" if value is not None else "not known")
    return Cell(value, _num(value, 4), route, _measured_source(c, "lattice_a"),
                c.yours.get("lattice_a"))


def _layer_cell(c: Candidate, key: str, text: Callable[[Any], str]) -> Cell:
    if c.layer is None:
        return Cell(None, "—", "no layer block", c.layer_error or "no substrate set")
    value = c.layer.get(key)
    note = c.layer.get("critical_thickness_note") if key == "critical_thickness_nm" else ""
    route = MISMATCH_PERCENT_CONVENTION if key == "mismatch" else note
    source = (f"{c.layer['substrate']} a = {c.layer['substrate_a_angstrom']:.5g} Å; "
              f"{c.layer['geometry']['reference']}")
    return Cell(value, text(value), route or "", source)


def _mismatch(c: Candidate, _: Conditions) -> Cell:
    return _layer_cell(c, "mismatch", lambda v: fixed(None if v is None else 100 * v, 3,
                                                      signed=True))


def _thickness(c: Candidate, _: Conditions) -> Cell:
    cell = _layer_cell(c, "critical_thickness_nm", thickness_text)
    if c.layer and cell.value is None and "lattice-matched" in cell.route:
        return Cell(math.inf, thickness_text(math.inf), cell.route, cell.source)
    return cell


def _ionicity_route(c: Candidate) -> tuple[float | None, str]:
    for route in ("spectroscopic", "predictive"):
        value = dig(c.report, f"phillips.{route}.ionicity")
        if value is not None:
            return value, route
    return None, ""


def _ionicity(c: Candidate, _: Conditions) -> Cell:
    value, route = _ionicity_route(c)
    return Cell(value, _num(value, 3), f"Phillips {route}, fi = C²/Eg²" if route else "", PVV)


def _polarity(c: Candidate, _: Conditions) -> Cell:
    value = dig(c.report, "harrison.polarity")
    return Cell(value, _num(value, 3), "Harrison bond orbitals, V3 / sqrt(V2² + V3²)",
                BOND_ORBITAL)


def _stability(c: Candidate, _: Conditions) -> Cell:
    fi, route = _ionicity_route(c)
    predicted = dig(c.report, "coordination.predicted") or "—"
    observed = dig(c.report, "coordination.observed")
    if fi is None:
        return Cell(None, predicted, "no ionicity", PVV)
    margin = abs(CRITICAL_IONICITY - fi)
    agree = "" if observed in (None, predicted) else f"; observed {observed}"
    return Cell(margin, f"{predicted}, margin {margin:.3f}{agree}",
                f"|fi - {CRITICAL_IONICITY}| ({route} fi)", PVV)


def _structure(c: Candidate, _: Conditions) -> Cell:
    value = dig(c.report, "structure.observed")
    return Cell(value, value or "not known", "observed", dig(c.report, "structure.source") or "")


def _uncertainty(c: Candidate, _: Conditions) -> Cell:
    gap = c.report.get("band_gap") or {}
    measured = gap.get("value_source") == "measured"
    value = 0.0 if measured else gap.get("uncertainty_eV")
    return Cell(value, "measured" if measured else uncertainty_text(value),
                "leave-one-out RMS of the family (binaries) or propagated (alloys)", "")


def _eps(c: Candidate, _: Conditions) -> Cell:
    value = dig(c.report, "measured.eps_inf.value")
    return Cell(value, _num(value, 2), "measured", _measured_source(c, "eps_inf"),
                c.yours.get("eps_inf"))


def _bond(c: Candidate, _: Conditions) -> Cell:
    value = c.report.get("bond_length_used_angstrom")
    return Cell(value, _num(value, 4), "used by the models (measured where known)", "")


def _toxic(c: Candidate, _: Conditions) -> Cell:
    return Cell(len(c.toxic), ", ".join(c.toxic) or "none", "hazard notes",
                "safety data sheets rule; these are reminders")


def _rohs(c: Candidate, _: Conditions) -> Cell:
    return Cell(len(c.rohs), ", ".join(c.rohs) or "none", "RoHS Annex II", ROHS_SOURCE)


def _closest(goal: Callable[[Conditions], float | None]) -> Callable[[Any, Conditions], Any]:
    def score(value: Any, conditions: Conditions) -> float | None:
        target = goal(conditions)
        return None if target is None or value is None else abs(value - target)
    return score


Scorer = Callable[[Any, Conditions], Any]
ROWS: tuple[tuple[str, str, str, Callable[[Candidate, Conditions], Cell], Scorer | None,
                  str], ...] = (
    ("band_gap_eV", "Band gap", "eV", _gap, _closest(lambda k: k.gap_goal_eV),
     "closest to the target"),
    ("wavelength_nm", "Wavelength", "nm", _wavelength,
     _closest(lambda k: k.wavelength_goal_nm), "closest to the target"),
    ("gap_kind", "Direct or indirect", "", _kind,
     lambda v, _: None if v is None else (v != "direct"), "direct"),
    ("lattice_constant_angstrom", "Lattice constant a", "Å", _lattice, None,
     "not ranked (see mismatch)"),
    ("mismatch", "Mismatch on the substrate", "%", _mismatch,
     lambda v, _: None if v is None else abs(v), "smallest |mismatch|"),
    ("critical_thickness_nm", "Critical thickness", "nm", _thickness,
     lambda v, _: None if v is None else -v, "largest"),
    ("ionicity", "Ionicity fi", "", _ionicity, None, "not ranked"),
    ("polarity", "Polarity αp", "", _polarity, None, "not ranked"),
    ("stability", "Structure stability (coordination, margin to fi = 0.785)", "", _stability,
     lambda v, _: None if v is None else -v, "largest margin"),
    ("structure", "Structure", "", _structure, None, "not ranked"),
    ("band_gap_uncertainty_eV", "Band-gap uncertainty", "eV", _uncertainty,
     lambda v, _: v, "smallest"),
    ("eps_inf", "ε∞ (measured)", "", _eps, None, "not ranked"),
    ("bond_length_angstrom", "Bond length", "Å", _bond, None, "not ranked"),
    ("toxic_elements", "Toxic elements", "", _toxic, lambda v, _: v, "fewest"),
    ("rohs_restricted", "RoHS-restricted elements", "", _rohs, lambda v, _: v, "none"),
)
"""key, label, unit, cell builder, score (lower is better; None: not ranked), rule."""


SHOWN_ABOVE = frozenset({"lattice_constant_angstrom", "harrison.polarity",
                         "coordination.predicted"})
"""Registry quantities that rows of `ROWS` show already."""


def _quantity(c: Candidate, q: Quantity) -> Cell:
    """A registry quantity of a candidate (alloys: the virtual-crystal route of its block)."""
    value = dig(c.report, q.key)
    block_route = dig(c.report, q.key.split(".")[0] + ".route") if "." in q.key else None
    text = value if isinstance(value, str) else _num(value, 3)
    route = q.route_in(c.report)
    return Cell(value, text, f"{route}; {block_route}" if block_route else route, q.reference)


def _best(scores: list[Any]) -> tuple[int, ...]:
    present = [s for s in scores if s is not None]
    if len(present) < 2 or min(present) == max(present):
        return ()
    low = min(present)
    return tuple(i for i, s in enumerate(scores) if s is not None and s == low)


def compare_rows(candidates: list[Candidate], conditions: Conditions) -> list[Row]:
    """The comparison table: one `Row` per property in review order.

    Raises:
        QueryError: Fewer than two or more than eight candidates.
    """
    if not MIN_COMPARED <= len(candidates) <= MAX_COMPARED:
        raise QueryError(f"compare {MIN_COMPARED} to {MAX_COMPARED} candidates, not "
                         f"{len(candidates)}; choose them on the shortlist page")
    rows = []
    for key, label, unit, build, score, rule in ROWS:
        cells = tuple(build(c, conditions) for c in candidates)
        scores = [None if score is None else score(cell.value, conditions) for cell in cells]
        if score is not None and all(s is None for s in scores):
            rule = "not ranked: " + ("no target set" if "target" in rule else "no values")
        rows.append(Row(key, label, unit, rule, cells, _best(scores)))
    rows += [Row(q.key, q.label, q.unit, "not ranked",
                 tuple(_quantity(c, q) for c in candidates), ())
             for q in QUANTITIES if q.key not in SHOWN_ABOVE]
    return rows
