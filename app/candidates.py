"""A shortlist's candidates with everything shown about them: one builder for every view.

The compare page, the JSON and CSV exports and the CLI all read `Candidate`s: the engine's
report at the list's temperature (stored for binaries at 300 K, computed otherwise), the layer
on the list's substrate (mismatch, strain, critical thickness), hazard and RoHS flags, and the
values the user imported for that formula ("yours").
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

from sqlalchemy import select
from sqlalchemy.orm import Session

from app import queries
from app.conditions import Conditions
from app.models import ShortlistItem, UserMeasurement
from screening.errors import BondgapInputError
from screening.hazards import ROHS_RESTRICTED, ROHS_SOURCE, rohs_restricted
from screening.hazards import caution_elements as hazard_caution_elements

USER_PROPERTIES: dict[str, tuple[str, str]] = {
    "lattice_a": ("Lattice constant a", "Å"),
    "band_gap": ("Band gap", "eV"),
    "eps_inf": ("High-frequency dielectric constant ε∞", ""),
}
"""Properties the user can import: label and canonical unit (as `app.imports` stores them)."""


@dataclass(frozen=True)
class Candidate:
    """One candidate under a list's conditions.

    Attributes:
        formula: Normalised binary or alloy formula.
        kind: "compound" or "alloy".
        note: The user's note on it.
        position: Its place on the list.
        added_at: ISO time (UTC) it was added.
        report: The engine's report (docs/report-schema.md) at the list's temperature.
        layer: The layer on the substrate (`screening.layer.layer_block`), None without one.
        layer_error: Why there is no layer block although a substrate is set.
        toxic: Its toxic elements.
        rohs: Its elements restricted by RoHS Annex II.
        yours: property -> {value, unit, source, imported_at} of the user's own values.
    """

    formula: str
    kind: str
    note: str
    position: int
    added_at: str
    report: dict[str, Any]
    layer: dict[str, Any] | None = None
    layer_error: str | None = None
    toxic: tuple[str, ...] = ()
    rohs: tuple[str, ...] = ()
    yours: dict[str, dict[str, Any]] = field(default_factory=dict)

    @property
    def elements(self) -> tuple[str, ...]:
        """Every element present."""
        return elements_of(self.report)

    def as_dict(self) -> dict[str, Any]:
        """The candidate as the JSON export gives it."""
        return {
            "formula": self.formula, "kind": self.kind, "note": self.note,
            "position": self.position, "added_at": self.added_at, "report": self.report,
            "layer": self.layer, "layer_error": self.layer_error,
            "hazards": {"toxic_elements": list(self.toxic),
                        "rohs_restricted": list(self.rohs),
                        "rohs_limits": {e: ROHS_RESTRICTED[e] for e in self.rohs},
                        "rohs_source": ROHS_SOURCE},
            "yours": self.yours,
        }


def elements_of(report: dict[str, Any]) -> tuple[str, ...]:
    """The elements of a binary's or an alloy's report (alloys: those present)."""
    if report.get("alloy"):
        return tuple(e for e, f in (report.get("fractions") or {}).items() if f)
    return tuple(dict.fromkeys((report["cation"], report["anion"])))


def user_values(session: Session, formulas: list[str]) -> dict[str, dict[str, dict[str, Any]]]:
    """The user's imported values: formula -> property -> {value, unit, source, ...}."""
    if not formulas:
        return {}
    stmt = select(UserMeasurement).where(UserMeasurement.formula.in_(formulas))
    found: dict[str, dict[str, dict[str, Any]]] = {}
    for row in session.scalars(stmt):
        found.setdefault(row.formula, {})[row.property] = {
            "value": row.value, "unit": row.unit, "source": row.source, "batch": row.batch,
            "imported_at": row.imported_at.isoformat() + "Z", "yours": True,
        }
    return found


def _layer(formula: str, substrate: Any) -> tuple[dict[str, Any] | None, str | None]:
    from screening.layer import layer_block

    try:
        return layer_block(formula, substrate), None
    except BondgapInputError as exc:
        return None, str(exc)


def build_candidates(session: Session, items: list[ShortlistItem],
                     conditions: Conditions) -> list[Candidate]:
    """Every item of a list as a candidate under the list's conditions.

    A substrate that no longer exists (the user deleted it) leaves the layer out, with the
    reason in `layer_error`, rather than failing the page.
    """
    substrate, substrate_error = None, None
    if conditions.substrate:
        try:
            substrate = conditions.substrate_spec(session)
        except BondgapInputError as exc:
            substrate_error = str(exc)
    yours = user_values(session, [i.formula for i in items])
    candidates = []
    for item in items:
        report = queries.compound_report(session, formula=item.formula,
                                         temperature_K=conditions.temperature_K)
        layer, error = (_layer(item.formula, substrate) if substrate is not None
                        else (None, substrate_error))
        elements = elements_of(report)
        candidates.append(Candidate(
            formula=item.formula,
            kind="alloy" if report.get("alloy") else "compound",
            note=item.note,
            position=item.position,
            added_at=item.added_at.isoformat() + "Z",
            report=report,
            layer=layer,
            layer_error=error,
            toxic=tuple((report.get("hazards") or {}).get("elements") or ()),
            rohs=tuple(rohs_restricted(elements)),
            yours=yours.get(item.formula, {}),
        ))
    return candidates


def caution_elements(candidates: list[Candidate]) -> list[str]:
    """The elements of all candidates that call for a caution (for the page's caution line).

    Toxic elements and those grown from a hazardous precursor (`screening.hazards`).
    """
    return sorted({e for c in candidates for e in hazard_caution_elements(c.elements)})


def rohs_elements(candidates: list[Candidate]) -> list[str]:
    """The RoHS-restricted elements of all candidates."""
    return sorted({e for c in candidates for e in c.rohs})


@dataclass(frozen=True)
class ShortlistView:
    """A list loaded for a page or an export: its dict, its conditions, its candidates."""

    data: dict[str, Any]
    conditions: Conditions
    candidates: list[Candidate]

    @property
    def formulas(self) -> list[str]:
        """The candidates' formulas, in list order."""
        return [c.formula for c in self.candidates]


def load_shortlist(session: Session, *, shortlist_id: int | None = None,
                   name: str | None = None, formulas: list[str] | None = None
                   ) -> ShortlistView:
    """A list with its candidates (all of them, or those named, in the order named).

    Raises:
        ShortlistNotFound: No such list, or a named formula that is not on it.
    """
    from app.shortlists import (
        ShortlistNotFound,
        conditions_of,
        get_shortlist,
        items_of,
        shortlist_dict,
    )
    from screening.alloy_report import normalise_material

    shortlist = get_shortlist(session, shortlist_id=shortlist_id, name=name)
    items = items_of(session, shortlist.id)
    if formulas:
        by_formula = {i.formula: i for i in items}
        chosen = []
        for text in formulas:
            formula = normalise_material(text.strip())
            if formula not in by_formula:
                raise ShortlistNotFound(f"{formula} is not on shortlist {shortlist.name!r}")
            if by_formula[formula] not in chosen:
                chosen.append(by_formula[formula])
        items = chosen
    conditions = conditions_of(shortlist)
    return ShortlistView(shortlist_dict(session, shortlist), conditions,
                         build_candidates(session, items, conditions))
