"""Band structure of one catalogue compound along L-Gamma-X-W-K-Gamma (sp3 tight binding).

Energies in eV on the free-atom scale of the term values; the valence-band top is reported so
that a chart can shift it to zero. Model limits (stated wherever bands are shown): the sp3
nearest-neighbour model with universal parameters gives fair valence bands and a fair gap at
Gamma, but poor conduction bands away from Gamma (no s* or d states), and it has no spin-orbit
splitting. Sixfold (rocksalt) compounds are treated as if tetrahedral at their bond length.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from screening.errors import BondgapInputError
from screening.evaluate import catalogue_table
from screening.formula import parse_compound
from screening.tight_binding import (
    N_VALENCE_BANDS,
    band_energies,
    high_symmetry_path,
    parameters_from_elements,
)

MODEL_LIMITS = (
    "sp3 nearest-neighbour tight binding with universal parameters and scalar-relativistic "
    "term values: conduction bands away from Gamma are poor (no s* state in this chart), no "
    "spin-orbit splitting in the bands (Delta0 is reported apart), no d states; sixfold "
    "compounds are treated as tetrahedral at their bond length."
)


@dataclass(frozen=True)
class BandStructure:
    """Bands along the standard path: energies (npoints, 8) in eV, distances in 2 pi / a."""

    formula: str
    k_2pi_over_a: NDArray[np.float64]
    distance: NDArray[np.float64]
    labels: tuple[tuple[str, float], ...]
    energies_eV: NDArray[np.float64]
    valence_top_eV: float
    conduction_bottom_eV: float
    bond_length_angstrom: float

    @property
    def gap_eV(self) -> float:
        """Smallest gap along the path, eV (negative where the bands overlap)."""
        return self.conduction_bottom_eV - self.valence_top_eV


MAX_PATH_POINTS = 2000
"""Largest number of path points accepted."""


def band_structure(formula: str, n_points: int = 400) -> BandStructure:
    """Bands of a catalogue compound along L-Gamma-X-W-K-Gamma.

    Args:
        formula: any accepted spelling of an octet binary.
        n_points: number of k-points on the path (6 to 2000).
    """
    if not 6 <= int(n_points) <= MAX_PATH_POINTS:
        raise BondgapInputError(
            f"n_points must be between 6 and {MAX_PATH_POINTS}, got {n_points}"
        )
    compound = parse_compound(formula)
    table = catalogue_table()
    d = float(table.bond_length_used_angstrom[table.index(compound.formula)])
    params = parameters_from_elements([compound.cation], [compound.anion], [d])
    k, distance, labels = high_symmetry_path(int(n_points))
    energies = band_energies(k, params)[0]
    return BandStructure(
        formula=compound.formula,
        k_2pi_over_a=k,
        distance=distance,
        labels=labels,
        energies_eV=energies,
        valence_top_eV=float(energies[:, N_VALENCE_BANDS - 1].max()),
        conduction_bottom_eV=float(energies[:, N_VALENCE_BANDS].min()),
        bond_length_angstrom=d,
    )
