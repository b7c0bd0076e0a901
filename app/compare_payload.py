"""The comparison as JSON: its rows, and the chart of gap against lattice constant."""

from __future__ import annotations

import math
from typing import Any

from app.candidates import Candidate
from app.compare import Row
from app.views import dig


def chart_data(candidates: list[Candidate], background: list[dict[str, Any]],
               substrate: Any) -> dict[str, Any]:
    """Data of the chart: gap against lattice constant.

    The candidates, the user's values, the catalogue at the list's temperature, and the
    substrate's lattice constant (a vertical line).
    """
    points = [{"formula": c.formula, "a": c.report.get("lattice_constant_angstrom"),
               "gap": dig(c.report, "band_gap.value_eV"),
               "source": dig(c.report, "band_gap.value_source"),
               "yours_gap": dig(c.yours, "band_gap.value"),
               "yours_a": dig(c.yours, "lattice_a.value")} for c in candidates]
    return {
        "candidates": points,
        "background": [{"formula": r["formula"], "a": r["lattice_constant_angstrom"],
                        "gap": r["band_gap_eV"]} for r in background
                       if r["lattice_constant_angstrom"] and r["band_gap_eV"] is not None],
        "substrate": None if substrate is None else {
            "name": substrate.name, "a": substrate.lattice_a_angstrom,
            "lattice": substrate.lattice},
    }


def _json_value(value: Any) -> Any:
    return None if isinstance(value, float) and math.isinf(value) else value


def rows_payload(rows: list[Row]) -> list[dict[str, Any]]:
    """The rows as JSON (the compare API)."""
    return [{"key": r.key, "label": r.label, "unit": r.unit, "rule": r.rule,
             "best": list(r.best),
             "cells": [{"value": _json_value(c.value), "text": c.text, "route": c.route,
                        "source": c.source, "yours": c.yours} for c in r.cells]}
            for r in rows]
