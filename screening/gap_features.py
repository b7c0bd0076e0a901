"""Physical features of every catalogue compound, the inputs of the band-gap estimator.

Every feature is a quantity of the engine's own physics, computed the same way for a measured
compound and for one nobody has made (no measured gap enters a feature):

* ``physical_gap_eV``: the smallest gap of the tight-binding band structure
  (`screening.tight_binding`), lowered at Gamma by a third of the spin-orbit splitting where
  the model gives one.
* ``gamma_eV``, ``x_eV``, ``l_eV``: the sp3 model's conduction valleys above the valence top.
* ``sstar_gap_eV``, ``sstar_gamma_eV``, ``sstar_x_eV``, ``sstar_l_eV``: the same from the sp3s*
  model (`screening.tight_binding.sstar`), whose X valley the excited s* state pulls down.
* ``polarity``: Harrison's bond polarity alpha_p (`screening.harrison`).
* ``cation_s_eV``, ``anion_p_eV``: the atomic term values that set the conduction-band bottom
  and the valence-band top in the two-level picture.
* ``inverse_d2``: 1 / d^2 (angstrom^-2), the scale of every coupling (V ~ hbar^2 / m d^2).
* ``sixfold``: 1 where the coordination predicted by the engine (not the observed one) is
  sixfold, so a hypothetical compound is treated like a measured one.
* ``d_repulsion``: 1 / (anion p - cation d) in 1/eV for a cation with a filled d shell within
  25 eV below the anion p level, else 0: the strength of the p-d repulsion that pushes the
  valence-band top up (second order in the p-d coupling).
* ``empty_d``: 1 / (cation's empty d level - its valence s level) in 1/eV for a cation whose
  lowest d shell is empty and bound (Ca, Sr, Ba, Rb, Cs), else 0: a low empty d level pulls
  the conduction band down away from Gamma (the alkaline-earth oxides and chalcogenides).
* ``d10``: 1 for a cation with a filled d shell close below the valence band, else 0.
* ``cation_sp_eV``: the cation's p - s level splitting: the deeper its s level, the lower the
  s-like conduction state at Gamma against the X and L states.
* ``sixfold_known``: like ``sixfold``, but the observed coordination where the structure is
  known (a measurement independent of the gap).

`FEATURE_SETS` are the candidate models: each names the basis functions of the linear mean and
the inputs of the Gaussian-process correction. The estimator chooses among them inside every
leave-one-out fold by the marginal likelihood of the fold's training data.
"""

from __future__ import annotations

from dataclasses import dataclass, fields
from typing import Final

import numpy as np
from numpy.typing import NDArray

D_REPULSION_WINDOW_EV: Final[float] = 25.0
"""A cation d shell deeper than this below the anion p level is treated as core (no p-d term)."""


@dataclass(frozen=True)
class GapFeatures:
    """Feature arrays over the catalogue (catalogue order)."""

    physical_gap_eV: NDArray[np.float64]
    gamma_eV: NDArray[np.float64]
    x_eV: NDArray[np.float64]
    l_eV: NDArray[np.float64]
    sstar_gap_eV: NDArray[np.float64]
    sstar_gamma_eV: NDArray[np.float64]
    sstar_x_eV: NDArray[np.float64]
    sstar_l_eV: NDArray[np.float64]
    spin_orbit_eV: NDArray[np.float64]
    polarity: NDArray[np.float64]
    cation_s_eV: NDArray[np.float64]
    anion_p_eV: NDArray[np.float64]
    inverse_d2: NDArray[np.float64]
    sixfold: NDArray[np.float64]
    d_repulsion: NDArray[np.float64]
    d10: NDArray[np.float64]
    empty_d: NDArray[np.float64]
    cation_sp_eV: NDArray[np.float64]
    sixfold_known: NDArray[np.float64]

    def column(self, name: str) -> NDArray[np.float64]:
        """One feature, or a product "a*b" of two."""
        if "*" in name:
            left, right = name.split("*")
            return self.column(left) * self.column(right)
        return np.asarray(getattr(self, name), dtype=float)

    def matrix(self, names: tuple[str, ...]) -> NDArray[np.float64]:
        """Columns in the given order, shape (n, len(names))."""
        return np.column_stack([self.column(n) for n in names]) if names else np.zeros(
            (self.physical_gap_eV.size, 0))

    @classmethod
    def names(cls) -> tuple[str, ...]:
        """The plain feature names."""
        return tuple(f.name for f in fields(cls))


@dataclass(frozen=True)
class FeatureSet:
    """One candidate model: linear-mean basis (a constant is always added) and GP inputs."""

    name: str
    basis: tuple[str, ...]
    inputs: tuple[str, ...]


FEATURE_SETS: Final[tuple[FeatureSet, ...]] = (
    FeatureSet("trend", ("physical_gap_eV",), ("polarity", "d_repulsion", "empty_d")),
    FeatureSet(
        "scaled",
        ("physical_gap_eV", "physical_gap_eV*polarity", "physical_gap_eV*d10"),
        ("polarity", "d_repulsion", "empty_d"),
    ),
    FeatureSet("trend, s*", ("sstar_gap_eV",), ("polarity", "d_repulsion", "empty_d")),
    FeatureSet(
        "scaled, s*",
        ("sstar_gap_eV", "sstar_gap_eV*polarity", "sstar_gap_eV*d10"),
        ("polarity", "d_repulsion", "empty_d"),
    ),
    FeatureSet(
        "levels",
        ("physical_gap_eV", "cation_s_eV", "anion_p_eV", "inverse_d2", "sixfold",
         "physical_gap_eV*d10", "physical_gap_eV*polarity"),
        ("polarity", "d_repulsion", "empty_d"),
    ),
)
"""The candidate models, from the plainest to the richest."""


def standardise(
    columns: NDArray[np.float64], train: NDArray[np.bool_], *, keep_first: bool = False
) -> NDArray[np.float64]:
    """Centre and scale columns by the mean and spread of the training rows only.

    Args:
        columns: (n, k) values.
        train: rows whose statistics are used.
        keep_first: leave column 0 untouched (the constant of a basis).
    """
    out = np.array(columns, dtype=float)
    start = 1 if keep_first else 0
    mean = out[train, start:].mean(axis=0)
    spread = out[train, start:].std(axis=0)
    spread[spread == 0] = 1.0
    out[:, start:] = (out[:, start:] - mean) / spread
    return out
