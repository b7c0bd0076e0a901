"""Estimated lattice constants from estimated bond lengths, for compounds never measured.

The bond length d comes from the fitted tetrahedral radii (`screening.radii`). The structure
the lattice constant is given for is the observed one where known (a measured zincblende
polytype counts), else the one the predicted coordination implies: rocksalt for sixfold,
zincblende for fourfold and for borderline (said in the basis). A rocksalt bond is the
tetrahedral one lengthened by the bond-valence relation (I. D. Brown and D. Altermatt, Acta
Cryst. B 41, 244 (1985)); then a = 4 d / sqrt(3) (zincblende), 2 d (rocksalt) or the ideal
wurtzite a = sqrt(8/3) d, c = sqrt(8/3) a (`screening.structure.lattice_from_bond_length`).
The uncertainty is the leave-one-out RMS error of the bond length times da/dd.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from screening import structure
from screening.radii import sixfold_bond_length

ESTIMATED_STRUCTURES = ("diamond", "zincblende", "wurtzite", "rocksalt")
"""Structures an estimate is given for."""


@dataclass(frozen=True)
class LatticeEstimate:
    """Estimated lattice constants per compound (arrays in catalogue order, angstrom).

    Attributes:
        a_angstrom: The estimated a (cubic a, or the hexagonal in-plane a).
        c_angstrom: The estimated c of a wurtzite estimate, else NaN.
        uncertainty_angstrom: Uncertainty of a: leave-one-out RMS error of d times da/dd.
        structure: The structure the estimate is for.
        basis: Why that structure: "observed", "predicted sixfold", ... (words).
        d_angstrom: The bond length used (sixfold where the structure is rocksalt).
    """

    a_angstrom: NDArray[np.float64]
    c_angstrom: NDArray[np.float64]
    uncertainty_angstrom: NDArray[np.float64]
    structure: NDArray[np.object_]
    basis: NDArray[np.object_]
    d_angstrom: NDArray[np.float64]

    def route(self, i: int) -> str:
        """The route of compound i's estimate in words, with its structure and bond length."""
        shape = str(self.structure[i])
        formula = {"rocksalt": "a = 2d", "wurtzite": "ideal wurtzite a = √(8/3) d, c = √(8/3) a"
                   }.get(shape, "a = 4d/√3")
        lengthened = ", lengthened to sixfold" if shape == "rocksalt" else ""
        return (f"estimate: {formula} for {shape} ({self.basis[i]}) from the estimated bond "
                f"length{lengthened}, d = {self.d_angstrom[i]:.3f} Å")


def estimate_lattice(
    geometry_structure: ArrayLike, coordination: ArrayLike, d_tetrahedral_angstrom: ArrayLike,
    d_uncertainty_angstrom: float,
) -> LatticeEstimate:
    """Estimate the lattice constants of every compound from its estimated bond length.

    Args:
        geometry_structure: Structure of each compound's measured geometry ("other" or None
            where unknown; a measured zincblende polytype as "zincblende").
        coordination: Predicted coordination: "fourfold", "sixfold" or "borderline".
        d_tetrahedral_angstrom: Estimated tetrahedral bond lengths.
        d_uncertainty_angstrom: Uncertainty of a bond-length estimate (leave-one-out RMS).
    """
    observed = np.array([str(s) for s in np.asarray(geometry_structure, dtype=object)])
    predicted = np.asarray(coordination, dtype=object).astype(str)
    known = np.isin(observed, ESTIMATED_STRUCTURES)
    shape = np.where(known, observed, np.where(predicted == "sixfold", "rocksalt", "zincblende"))
    basis = np.where(known, "observed structure", np.select(
        [predicted == "sixfold", predicted == "borderline"],
        ["structure not observed; predicted sixfold",
         "structure not observed; borderline coordination, zincblende assumed"],
        "structure not observed; predicted fourfold, zincblende assumed"))
    d4 = np.asarray(d_tetrahedral_angstrom, dtype=float)
    d = np.where(shape == "rocksalt", sixfold_bond_length(d4), d4)
    a, c = structure.lattice_from_bond_length(shape, d)
    return LatticeEstimate(
        a_angstrom=a,
        c_angstrom=c,
        uncertainty_angstrom=a / d * d_uncertainty_angstrom,
        structure=shape.astype(object),
        basis=basis.astype(object),
        d_angstrom=d,
    )
