"""Crystal-structure helpers: bond length and volume per atom pair from lattice constants.

All lengths in angstrom, volumes in cubic angstrom. Structures: ``diamond`` and
``zincblende`` (cubic a), ``wurtzite`` (hexagonal a, c), ``rocksalt`` (cubic a).

A wurtzite crystal (a, c) is given the internal parameter that makes its four bonds equal,
u = 1/4 + a^2 / (3 c^2), so its bond length is d = u c (exactly sqrt(3/8) a for the ideal
c/a = sqrt(8/3)); its volume per pair is sqrt(3) a^2 c / 4, and the zincblende crystal of the
same volume has a_eq = (sqrt(3) a^2 c)^(1/3).
"""

from __future__ import annotations

import numpy as np
from numpy.typing import ArrayLike, NDArray

TETRAHEDRAL = ("diamond", "zincblende", "wurtzite")
"""Structures with fourfold coordination."""

OCTAHEDRAL = ("rocksalt",)
"""Structures with sixfold coordination."""

STRUCTURES = (*TETRAHEDRAL, *OCTAHEDRAL, "other")


def zincblende_equivalent_a(a_angstrom: ArrayLike, c_angstrom: ArrayLike) -> NDArray[np.float64]:
    """Cubic lattice constant with the same volume per pair as a wurtzite cell (a, c), in A."""
    a = np.asarray(a_angstrom, dtype=float)
    c = np.asarray(c_angstrom, dtype=float)
    return np.cbrt(np.sqrt(3.0) * a * a * c)


def cubic_lattice_constant(
    structure: ArrayLike, a_angstrom: ArrayLike, c_angstrom: ArrayLike
) -> NDArray[np.float64]:
    """The cubic lattice constant a (zincblende-equivalent for wurtzite), in angstrom.

    NaN where the structure is ``other`` or a needed constant is missing (NaN).
    """
    s = np.asarray(structure)
    a = np.asarray(a_angstrom, dtype=float)
    c = np.asarray(c_angstrom, dtype=float)
    cubic = np.isin(s, ("diamond", "zincblende", "rocksalt"))
    with np.errstate(invalid="ignore"):
        hexagonal = zincblende_equivalent_a(a, c)
    return np.where(cubic, a, np.where(s == "wurtzite", hexagonal, np.nan))


def wurtzite_u(a_angstrom: ArrayLike, c_angstrom: ArrayLike) -> NDArray[np.float64]:
    """Internal parameter u = 1/4 + a^2/(3 c^2) that makes the four wurtzite bonds equal."""
    a = np.asarray(a_angstrom, dtype=float)
    c = np.asarray(c_angstrom, dtype=float)
    return 0.25 + a * a / (3.0 * c * c)


def bond_length(structure: ArrayLike, a_angstrom: ArrayLike, c_angstrom: ArrayLike
                ) -> NDArray[np.float64]:
    """Nearest-neighbour distance d in angstrom.

    sqrt(3) a / 4 for diamond and zincblende, a / 2 for rocksalt, u c for wurtzite (four equal
    bonds); NaN for ``other``.
    """
    s = np.asarray(structure)
    a_cubic = cubic_lattice_constant(s, a_angstrom, c_angstrom)
    with np.errstate(invalid="ignore"):
        hexagonal = wurtzite_u(a_angstrom, c_angstrom) * np.asarray(c_angstrom, dtype=float)
    return np.select(
        [np.isin(s, OCTAHEDRAL), s == "wurtzite"],
        [a_cubic / 2.0, hexagonal],
        np.sqrt(3.0) * a_cubic / 4.0,
    )


def volume_per_pair(structure: ArrayLike, a_angstrom: ArrayLike, c_angstrom: ArrayLike
                    ) -> NDArray[np.float64]:
    """Volume per atom pair in cubic angstrom: a^3/4 for every cubic structure used here."""
    return cubic_lattice_constant(structure, a_angstrom, c_angstrom) ** 3 / 4.0


def lattice_from_bond_length(
    structure: ArrayLike, d_angstrom: ArrayLike
) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
    """Lattice constants (a, c) in angstrom of a crystal of bond length d (`bond_length` inverted).

    a = 4 d / sqrt(3) for diamond and zincblende, 2 d for rocksalt; wurtzite with the ideal
    c/a = sqrt(8/3) (u = 3/8): a = sqrt(8/3) d, c = sqrt(8/3) a. c is NaN for cubic
    structures; a and c are NaN for ``other``.
    """
    s = np.asarray(structure)
    d = np.asarray(d_angstrom, dtype=float)
    ideal = np.sqrt(8.0 / 3.0)
    a = np.select(
        [np.isin(s, ("diamond", "zincblende")), np.isin(s, OCTAHEDRAL), s == "wurtzite"],
        [4.0 * d / np.sqrt(3.0), 2.0 * d, ideal * d],
        np.nan,
    )
    c = np.where(s == "wurtzite", ideal * a, np.nan)
    return a, c


def tetrahedral_volume_per_pair(d_angstrom: ArrayLike) -> NDArray[np.float64]:
    """Volume per pair of a zincblende crystal of bond length d: (16 / 3 sqrt 3) d^3."""
    d = np.asarray(d_angstrom, dtype=float)
    return 16.0 / (3.0 * np.sqrt(3.0)) * d**3
