"""Data of the finder chart: band gap against lattice constant.

Every binary of the substrate's lattice kind with measured data as a labelled point, each
system as its curve (ternary) or outlined region (quaternary), the substrate as a vertical
line, the target as a horizontal band, and the matches shown in the table highlighted. The
curves are sampled by the engine (`screening.alloys.outline`), one vectorised call per system.
"""

from __future__ import annotations

import math
from collections.abc import Iterable
from typing import Any

import numpy as np

from app.finder import MatchRun
from screening.alloys import GapWindow, parse_system
from screening.alloys.outline import binary_points, system_outline
from screening.alloys.query import DEFAULT_FAMILIES
from screening.alloys.systems import AlloySystem
from screening.epitaxy import SubstrateSpec

MAX_SYSTEMS = 10
"""Most systems drawn as curves or regions (those of the best-ranked matches first)."""

POINTS_PER_EDGE = 81

MAX_MARKED = 60
"""Most matches marked on the chart: more would hide the curves they lie on."""


def marked_rows(rows: list[dict[str, Any]], most: int = MAX_MARKED) -> list[dict[str, Any]]:
    """At most `most` of the table's rows, evenly spread over it, the first (best) included."""
    if len(rows) <= most:
        return rows
    picks = np.unique(np.round(np.linspace(0, len(rows) - 1, most)).astype(int))
    return [rows[i] for i in picks]


def _numbers(values: Iterable[float], digits: int = 5) -> list[float | None]:
    """JSON numbers rounded for the page; NaN and inf become None (a gap in a plotly line)."""
    return [round(float(v), digits) if math.isfinite(v) else None for v in values]


def _chart_systems(run: MatchRun) -> tuple[list[AlloySystem], int]:
    """Systems to draw, and how many more matched than are drawn."""
    if run.query.system != "all":
        return [parse_system(run.query.system)], 0
    matched = [run.result.systems[i] for i in run.result.systems_by_rank]  # best first
    return matched[:MAX_SYSTEMS], max(0, len(matched) - MAX_SYSTEMS)


def _families(systems: list[AlloySystem]) -> tuple[str, ...]:
    return tuple(dict.fromkeys([*DEFAULT_FAMILIES, *(s.family for s in systems)]))


def plane_chart(systems: list[AlloySystem], *, lattice: str, temperature_K: float,
                substrate: SubstrateSpec | None, window: GapWindow | None,
                highlighted: list[dict[str, Any]]) -> dict[str, Any]:
    """Chart data: binaries, system outlines, substrate line, target band, highlighted points.

    Args:
        systems: Systems drawn as curves (ternaries) or outlined regions (quaternaries).
        lattice: Lattice kind of the binaries shown ("cubic" or "hexagonal").
        temperature_K: Temperature of the gaps (K).
        substrate: The substrate drawn as a vertical line, or None.
        window: The target band, or None.
        highlighted: Points to mark, each with `formula`, `lattice_constant_angstrom`,
            `band_gap_eV` and `mismatch` (None where unknown).
    """
    binaries = binary_points(lattice, temperature_K, _families(systems))
    curves = []
    for system in systems:
        outline = system_outline(system, temperature_K, POINTS_PER_EDGE)
        curves.append({"name": system.name, "form": system.form,
                       "a": _numbers(outline.lattice_constant_angstrom),
                       "gap": _numbers(outline.band_gap_eV)})
    return {
        "temperature_K": temperature_K,
        "binaries": {"formula": list(binaries.formulas),
                     "a": _numbers(binaries.lattice_constant_angstrom),
                     "gap": _numbers(binaries.band_gap_eV)},
        "systems": curves,
        "systems_not_drawn": 0,
        "substrate": None if substrate is None else {
            "name": substrate.name, "a": float(substrate.lattice_a_angstrom),
            "lattice": substrate.lattice},
        "target": None if window is None else {
            "description": window.description, "target": window.target_eV,
            "low": max(window.low_eV, 0.0),
            "high": window.high_eV if np.isfinite(window.high_eV) else None},
        "matches": {"formula": [r["formula"] for r in highlighted],
                    "a": _numbers(r["lattice_constant_angstrom"] for r in highlighted),
                    "gap": _numbers(_nan(r["band_gap_eV"]) for r in highlighted),
                    "mismatch": _numbers((_nan(r.get("mismatch")) for r in highlighted), 6)},
    }


def _nan(value: float | None) -> float:
    return math.nan if value is None else float(value)


def finder_chart(run: MatchRun, rows: list[dict[str, Any]]) -> dict[str, Any]:
    """Chart data of the finder page: up to `MAX_MARKED` of the table's matches marked."""
    systems, more = _chart_systems(run)
    chart = plane_chart(systems, lattice=run.substrate.lattice,
                        temperature_K=run.query.temperature_K, substrate=run.substrate,
                        window=run.window, highlighted=marked_rows(rows))
    return {**chart, "systems_not_drawn": more, "matches_in_table": len(rows)}
