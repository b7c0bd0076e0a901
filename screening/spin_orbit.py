"""The valence-band spin-orbit splitting Delta0 of every catalogue compound: measured or model.

Measured values (`seed_data/spin_orbit.csv`) win; elsewhere the model's value: the atomic
p-level splittings of the atom solver weighted by the anion and cation p shares of the
Gamma15 valence-band top (`screening.tight_binding.spin_orbit`). An alloy takes the
composition-weighted mean of its end points (no spin-orbit bowing).
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache

import numpy as np
from numpy.typing import NDArray

from screening.evaluate import catalogue_table
from screening.gaps import gap_model
from screening.reference import spin_orbit_splittings

MODEL_SOURCE = (
    "model: atomic p-level spin-orbit splittings from the atom solver, weighted by the anion "
    "and cation p shares of the valence-band top (D. J. Chadi, Phys. Rev. B 16, 790 (1977); "
    "W. A. Harrison, Electronic Structure and the Properties of Solids (1980))")
"""Where a model Delta0 comes from."""


@dataclass(frozen=True)
class SpinOrbitTable:
    """Delta0 per catalogue compound (eV): shown value, model value, route and source."""

    value_eV: NDArray[np.float64]
    model_eV: NDArray[np.float64]
    measured_eV: NDArray[np.float64]
    route: tuple[str, ...]
    source: tuple[str, ...]


@lru_cache(maxsize=1)
def spin_orbit_table() -> SpinOrbitTable:
    """Measured Delta0 where the seed data hold one, else the model's."""
    measured_rows = spin_orbit_splittings()
    model = np.asarray(gap_model().features.spin_orbit_eV, float)
    formulas = [c.formula for c in catalogue_table().compounds]
    measured = np.array([measured_rows[f].delta0_eV if f in measured_rows else np.nan
                         for f in formulas])
    has = np.isfinite(measured)
    source = tuple(
        measured_rows[f].source + (" (from memory)" if measured_rows[f].from_memory else "")
        if f in measured_rows else MODEL_SOURCE for f in formulas)
    return SpinOrbitTable(
        value_eV=np.where(has, measured, model), model_eV=model, measured_eV=measured,
        route=tuple("measured" if h else "model" for h in has), source=source)
