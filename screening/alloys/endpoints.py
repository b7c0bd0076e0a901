"""End-point band gaps of alloys: the one place where the alloy engine asks for binary gaps.

The gaps come from `screening.gaps` at the temperature asked for: a measured gap (moved from
300 K by the compound's temperature law) carries no model uncertainty (0 eV); a binary without
a measured gap gets the calibrated estimate with its cross-validated uncertainty. Semimetals
(measured gap <= 0, which the temperature laws do not describe) and formulas outside the
catalogue give NaN.
"""

from __future__ import annotations

from collections.abc import Sequence

import numpy as np
from numpy.typing import NDArray

from screening.evaluate import catalogue_table
from screening.gaps import gaps_at


def endpoint_gaps(
    formulas: Sequence[str], temperature_K: float
) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
    """Return the fundamental gaps of binaries at one temperature, with their uncertainties.

    Args:
        formulas: Normalised binary formulas ("GaAs", "InP").
        temperature_K: Temperature in K (>= 0).

    Returns:
        (gap_eV, uncertainty_eV), arrays in the order of ``formulas``; NaN where unknown.
    """
    if not len(formulas):
        return np.zeros(0), np.zeros(0)
    at = gaps_at(float(temperature_K))
    position = {c.formula: i for i, c in enumerate(catalogue_table().compounds)}
    index = np.array([position.get(f, -1) for f in formulas])
    inside = index >= 0
    safe = np.where(inside, index, 0)
    measured = at.value_is_measured[safe]
    gap = np.where(measured, at.measured_eV[safe], at.estimate_eV[safe])
    gap = np.where(inside & ~(measured & (at.measured_eV[safe] <= 0)), gap, np.nan)
    uncertainty = np.where(measured, 0.0, at.uncertainty_eV[safe])
    return gap, np.where(np.isfinite(gap), uncertainty, np.nan)
