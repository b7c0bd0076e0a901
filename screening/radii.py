"""Tetrahedral covalent radii fitted to measured bond lengths, and bond-length estimates.

The estimate of a bond length is d_AB = r_A + r_B. The radii are a calibration of ours: a
least-squares fit to the measured nearest-neighbour distances of the catalogue, pulled gently
towards Pauling's tetrahedral radii (L. Pauling, The Nature of the Chemical Bond, 3rd ed.,
Cornell 1960, table of tetrahedral covalent radii; values from memory) so that every element
has a radius even when few compounds contain it. Sixfold (rocksalt) distances enter as
tetrahedral ones shortened by the bond-valence relation: d4 = d6 - b ln(6/4) with
b = 0.37 A (I. D. Brown and D. Altermatt, Acta Cryst. B 41, 244 (1985); from memory).

The error of the estimate is measured by leave-one-out cross-validation over the measured
compounds: each compound's bond length is predicted by radii fitted without it.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import ArrayLike, NDArray

PAULING_TETRAHEDRAL_RADII_ANGSTROM: Final[dict[str, float]] = {
    "Be": 1.06, "B": 0.88, "C": 0.77, "N": 0.70, "O": 0.66, "F": 0.64,
    "Mg": 1.40, "Al": 1.26, "Si": 1.17, "P": 1.10, "S": 1.04, "Cl": 0.99,
    "Cu": 1.35, "Zn": 1.31, "Ga": 1.26, "Ge": 1.22, "As": 1.18, "Se": 1.14, "Br": 1.11,
    "Ag": 1.52, "Cd": 1.48, "In": 1.44, "Sn": 1.40, "Sb": 1.36, "Te": 1.32, "I": 1.28,
    "Hg": 1.48, "Tl": 1.47, "Bi": 1.46,
}  # fmt: skip
"""Pauling's tetrahedral covalent radii in angstrom (Nature of the Chemical Bond, 1960; from
memory). The s-block metals Li, Na, K, Rb, Ca, Sr, Ba have none: their radii come from data."""

PRIOR_WEIGHT: Final[float] = 0.5
"""Weight of each prior radius relative to one measured bond (a choice of ours, not fitted)."""

BOND_VALENCE_B_ANGSTROM: Final[float] = 0.37
"""Brown-Altermatt bond-valence softness b in angstrom (Acta Cryst. B 41, 244 (1985))."""

SIXFOLD_TO_FOURFOLD_ANGSTROM: Final[float] = BOND_VALENCE_B_ANGSTROM * float(np.log(6.0 / 4.0))
"""Shortening of a bond from sixfold to fourfold coordination at fixed bond-valence sum."""


def sixfold_bond_length(d_tetrahedral_angstrom: ArrayLike) -> NDArray[np.float64]:
    """The sixfold (rocksalt) bond length of a tetrahedral one at the same bond-valence sum."""
    return np.asarray(d_tetrahedral_angstrom, dtype=float) + SIXFOLD_TO_FOURFOLD_ANGSTROM


@dataclass(frozen=True)
class RadiusFit:
    """Fitted tetrahedral radii and the leave-one-out error of the bond lengths they give."""

    radii_angstrom: dict[str, float]
    formulas: tuple[str, ...]
    measured_angstrom: NDArray[np.float64]
    loo_estimate_angstrom: NDArray[np.float64]

    @property
    def loo_mae_angstrom(self) -> float:
        """Mean absolute leave-one-out error, angstrom."""
        return float(np.mean(np.abs(self.loo_estimate_angstrom - self.measured_angstrom)))

    @property
    def loo_rms_angstrom(self) -> float:
        """Root-mean-square leave-one-out error, angstrom (the estimate's uncertainty)."""
        return float(np.sqrt(np.mean((self.loo_estimate_angstrom - self.measured_angstrom) ** 2)))

    @property
    def loo_max_angstrom(self) -> float:
        """Largest absolute leave-one-out error, angstrom."""
        return float(np.max(np.abs(self.loo_estimate_angstrom - self.measured_angstrom)))

    def estimate(self, cations: Sequence[str], anions: Sequence[str]) -> NDArray[np.float64]:
        """Estimated tetrahedral bond lengths r_A + r_B in angstrom."""
        r = self.radii_angstrom
        return np.array([r[c] + r[a] for c, a in zip(cations, anions, strict=True)])


def _solve(
    elements: list[str], cations: Sequence[str], anions: Sequence[str], d: NDArray[np.float64]
) -> NDArray[np.float64]:
    index = {e: i for i, e in enumerate(elements)}
    rows = np.zeros((len(d), len(elements)))
    for row, (c, a) in enumerate(zip(cations, anions, strict=True)):
        rows[row, index[c]] += 1.0
        rows[row, index[a]] += 1.0
    priors = [e for e in elements if e in PAULING_TETRAHEDRAL_RADII_ANGSTROM]
    prior_rows = np.zeros((len(priors), len(elements)))
    prior_rows[np.arange(len(priors)), [index[e] for e in priors]] = PRIOR_WEIGHT
    prior_rhs = PRIOR_WEIGHT * np.array([PAULING_TETRAHEDRAL_RADII_ANGSTROM[e] for e in priors])
    matrix = np.vstack([rows, prior_rows])
    rhs = np.concatenate([d, prior_rhs])
    solution, *_ = np.linalg.lstsq(matrix, rhs, rcond=None)
    return solution


def fit_radii(
    formulas: Sequence[str],
    cations: Sequence[str],
    anions: Sequence[str],
    bond_length_angstrom: ArrayLike,
    sixfold: ArrayLike,
    elements: Sequence[str],
) -> RadiusFit:
    """Fit tetrahedral radii to measured bond lengths and cross-validate them.

    Args:
        formulas: compound names, one per measured bond.
        cations: the cation of each compound.
        anions: the anion of each compound.
        bond_length_angstrom: measured nearest-neighbour distances, angstrom.
        sixfold: True where the distance was measured in a sixfold (rocksalt) crystal.
        elements: every element that needs a radius (data or prior must cover each).

    Raises:
        ValueError: an element with neither a measured compound nor a prior radius.
    """
    d = np.asarray(bond_length_angstrom, dtype=float)
    d4 = d - np.where(np.asarray(sixfold, dtype=bool), SIXFOLD_TO_FOURFOLD_ANGSTROM, 0.0)
    covered = set(cations) | set(anions) | set(PAULING_TETRAHEDRAL_RADII_ANGSTROM)
    missing = sorted(set(elements) - covered)
    if missing:
        raise ValueError(f"no measured compound and no prior radius for {', '.join(missing)}")
    all_elements = sorted(set(elements) | set(cations) | set(anions))
    radii = _solve(all_elements, cations, anions, d4)
    index = {e: i for i, e in enumerate(all_elements)}
    loo = np.empty_like(d4)
    for held_out in range(len(d4)):  # one small least-squares fit per compound
        keep = np.arange(len(d4)) != held_out
        r = _solve(
            all_elements,
            [c for c, k in zip(cations, keep, strict=True) if k],
            [a for a, k in zip(anions, keep, strict=True) if k],
            d4[keep],
        )
        loo[held_out] = r[index[cations[held_out]]] + r[index[anions[held_out]]]
    return RadiusFit(
        radii_angstrom={e: float(radii[i]) for e, i in index.items()},
        formulas=tuple(formulas),
        measured_angstrom=d4,
        loo_estimate_angstrom=loo,
    )
