"""Band-gap values of the table rows at any temperature, computed by the engine.

The store holds the gaps at 300 K; for another temperature `gap_values_at` computes them for the
whole catalogue at once (`screening.gaps.gaps_at`, vectorised, a few ms), with exactly the
values the compound report gives at that temperature.
"""

from __future__ import annotations

import math
from typing import Any

from screening.evaluate import catalogue_table
from screening.gaps import gaps_at

GAP_KEYS: tuple[str, ...] = (
    "band_gap_eV", "band_gap_source", "band_gap_estimate_eV", "band_gap_uncertainty_eV",
    "wavelength_nm",
)
"""Row keys (`app.columns`) that depend on the temperature."""


def _number(value: float) -> float | None:
    number = float(value)
    return number if math.isfinite(number) else None


def gap_values_at(temperature_K: float) -> dict[str, dict[str, Any]]:
    """Temperature-dependent row values (`GAP_KEYS`) per catalogue formula.

    Args:
        temperature_K: 0 to 2000 K (checked by the caller).

    Returns:
        formula -> {band_gap_eV, band_gap_source, band_gap_estimate_eV,
        band_gap_uncertainty_eV, wavelength_nm}; NaN becomes None.
    """
    at = gaps_at(temperature_K)
    values: dict[str, dict[str, Any]] = {}
    for i, compound in enumerate(catalogue_table().compounds):
        values[compound.formula] = dict(zip(GAP_KEYS, (
            _number(at.value_eV[i]),
            "measured" if at.value_is_measured[i] else "estimate",
            _number(at.estimate_eV[i]),
            _number(at.uncertainty_eV[i]),
            _number(at.wavelength_nm[i]),
        ), strict=True))
    return values
