"""End-point band gaps of alloys: the one place where the alloy engine asks for binary gaps.

Measured 300 K gaps from the seed data (``screening.reference``), moved to the temperature
asked for by each compound's temperature law (``screening.temperature``: Varshni or
Bose-Einstein per valley, a flagged default shape where no law is held). A measured gap carries
no model uncertainty (0 eV). Binaries without a measured gap, and semimetals (gap <= 0, whose
gap the temperature laws do not describe), give NaN.
"""

from __future__ import annotations

from collections.abc import Sequence

import numpy as np
from numpy.typing import NDArray

from screening.reference import measured_compounds
from screening.temperature import gaps_at_temperature


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
    measured = measured_compounds()
    gap_300K = np.array(
        [float(measured.get(f, {})["band_gap"].value) if "band_gap" in measured.get(f, {})
         else np.nan for f in formulas]
    )
    if not len(formulas):
        return np.zeros(0), np.zeros(0)
    gaps = gaps_at_temperature(list(formulas), gap_300K, float(temperature_K)).gap_eV[:, 0]
    uncertainty = np.where(np.isfinite(gaps), 0.0, np.nan)
    return gaps, uncertainty
