"""The finder's answer as data: rows for the page, the object of `/api/match` and `match --json`.

Each match carries the public keys of the issue (`formula`, `fractions`,
`lattice_constant_angstrom`, `mismatch`, `band_gap_eV`, `band_gap_uncertainty_eV`,
`critical_thickness_nm`) and, beside them, `wavelength_nm`, `system`, `kind`, `valley`,
`default_bowing`, `poisson_assumed` and `lattice_matched` (critical thickness infinite). An
empty result is an answer: `matches` is empty and `message` says that no composition
satisfies the query. `count` is the number of matches over all pages, `shown` the number in
this answer, `offset` the position of its first match, and `next_offset` the `offset` of the
next page (null on the last page).
"""

from __future__ import annotations

import math
from typing import Any

import screening
from app.finder import MatchRun
from screening.constants import HC_EV_NM
from screening.epitaxy import MISMATCH_CONVENTION


def match_rows(run: MatchRun) -> list[dict[str, Any]]:
    """The page of matches in the asked order, as JSON-ready dicts."""
    rows = []
    for match in run.result.matches():
        gap = match.band_gap_eV
        rows.append({
            **match.as_dict(),
            "wavelength_nm": HC_EV_NM / gap if gap > 0 else None,
            "system": match.system,
            "kind": match.kind,
            "valley": match.valley or None,
            "default_bowing": match.default_bowing,
            "poisson_assumed": match.poisson_assumed,
            "lattice_matched": math.isinf(match.critical_thickness_nm),
        })
    return rows


def conditions(run: MatchRun) -> str:
    """The query in words: "InGaAsP on InP, gap ..., |f| <= 0.001, ..."."""
    query = run.query
    parts = [f"{'any system' if query.system == 'all' else query.system} on "
             f"{run.substrate.name}"]
    if run.window is not None:
        parts.append(run.window.description)
    parts.append(f"at {query.temperature_K:g} K")
    if query.max_mismatch is not None:
        parts.append(f"|mismatch| <= {query.max_mismatch:g}")
    if query.thickness is not None:
        parts.append(f"{query.thickness:g} nm below the critical thickness ({query.geometry})")
    if query.exclude:
        parts.append(f"without {', '.join(query.exclude)}")
    return ", ".join(parts)


def empty_message(run: MatchRun) -> str | None:
    """The friendly line for an empty result (None when there are matches)."""
    if run.result.match_count:
        return None
    if not run.result.systems:
        return (f"no composition satisfies {conditions(run)}: no alloy system is left to "
                "screen (see the systems left out)")
    hints = []
    if run.window is not None:
        hints.append("a wider gap tolerance")
    if run.query.max_mismatch is not None:
        hints.append("a larger mismatch limit")
    if run.query.thickness is not None:
        hints.append("a thinner layer")
    tail = f"; try {' or '.join(hints)}" if hints else ""
    return f"no composition satisfies {conditions(run)}{tail}"


def match_payload(run: MatchRun) -> dict[str, Any]:
    """The object of `GET /api/match` and `bondgap match --json`."""
    rows = match_rows(run)
    substrate = run.substrate
    geometry = run.result.geometry
    window = run.window
    return {
        "matches": rows,
        "count": run.result.match_count,
        "shown": len(rows),
        "offset": run.result.offset,
        "next_offset": run.next_offset,
        "query": run.query.as_params(),
        "conditions": conditions(run),
        "message": empty_message(run),
        "substrate": {"name": substrate.name, "lattice": substrate.lattice,
                      "lattice_a_angstrom": float(substrate.lattice_a_angstrom),
                      "note": substrate.note},
        "target": None if window is None else {
            "description": window.description, "target_eV": window.target_eV,
            "low_eV": window.low_eV,
            "high_eV": window.high_eV if window.high_eV != float("inf") else None,
        },
        "temperature_K": run.query.temperature_K,
        "mismatch_convention": MISMATCH_CONVENTION,
        "geometry": {"name": geometry.name, "factor": geometry.factor,
                     "description": geometry.description, "reference": geometry.reference},
        "systems_screened": [s.name for s in run.result.systems],
        "skipped": [{"system": name, "reason": why} for name, why in run.result.skipped],
        "points_screened": run.result.points_screened,
        "model_version": screening.MODEL_VERSION,
    }
