"""Where alloy systems lie on the band-gap vs lattice-constant plane: outlines and end points.

A ternary is a curve from one end point to the other. A quaternary covers a region; its
outline is the closed path through its ternary edges: A(x)B(1-x)C(y)D(1-y) around the square
x, y in {0, 1}, A(x)B(y)C(1-x-y)D and AB(x)C(y)D(1-x-y) around the triangle of the
three-element site. With bowing the region's interior can reach slightly beyond its outline;
the outline is what a chart draws. Every point is evaluated by ``alloy_properties`` in one
vectorised call per system.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from screening.alloys.endpoints import endpoint_gaps
from screening.alloys.properties import AlloyProperties, alloy_properties
from screening.alloys.systems import LATTICE_OF_STRUCTURE, AlloySystem, has_measured_data
from screening.catalogue import catalogue
from screening.reference import measured_compounds


def _segment(start: NDArray[np.float64], stop: NDArray[np.float64], points: int
             ) -> NDArray[np.float64]:
    t = np.linspace(0.0, 1.0, points)[:, None]
    return (1.0 - t) * start + t * stop


def outline_fractions(n_cations: int, n_anions: int, points: int = 101) -> NDArray[np.float64]:
    """Site fractions along a system's outline, (npoint, nelement) in element order.

    Args:
        n_cations: Elements on the cation site (1 to 3).
        n_anions: Elements on the anion site (1 to 3).
        points: Points per edge (>= 2).

    Returns:
        The ternary's path from one end point to the other, or the quaternary's closed path
        through its edges (first point repeated at the end).
    """
    corners: list[NDArray[np.float64]]
    if n_cations == 2 and n_anions == 2:
        corners = [np.array(c, dtype=float) for c in
                   ((1, 0, 1, 0), (0, 1, 1, 0), (0, 1, 0, 1), (1, 0, 0, 1), (1, 0, 1, 0))]
    else:
        size = max(n_cations, n_anions)
        unit = np.eye(size)
        path = [unit[i] for i in range(size)] + ([unit[0]] if size == 3 else [])
        corners = [np.concatenate([c, [1.0]]) if n_cations == size
                   else np.concatenate([[1.0], c]) for c in path]
    parts = [_segment(a, b, points)[:-1] for a, b in zip(corners[:-1], corners[1:], strict=True)]
    return np.vstack([*parts, corners[-1][None, :]])


@dataclass(frozen=True, eq=False)
class BinaryPoints:
    """Binaries placed on the plane (arrays over binaries).

    Attributes:
        formulas: Normalised formulas.
        lattice_constant_angstrom: Measured a (cubic a, or hexagonal in-plane a).
        band_gap_eV: Gap at the temperature (measured where known, moved by its law).
        band_gap_uncertainty_eV: 0 for measured gaps, else the estimate's uncertainty.
    """

    formulas: tuple[str, ...]
    lattice_constant_angstrom: NDArray[np.float64]
    band_gap_eV: NDArray[np.float64]
    band_gap_uncertainty_eV: NDArray[np.float64]


def binary_points(lattice: str, temperature_K: float,
                  families: tuple[str, ...] | None = None) -> BinaryPoints:
    """Every catalogue binary with measured data whose lattice kind is ``lattice``.

    Args:
        lattice: "cubic" or "hexagonal".
        temperature_K: Temperature of the gaps (K).
        families: Families to include (all by default).
    """
    data = measured_compounds()
    formulas = tuple(
        c.formula for c in catalogue()
        if (families is None or c.family in families) and has_measured_data(c.formula)
        and LATTICE_OF_STRUCTURE[str(data[c.formula]["structure"].value)] == lattice
    )
    lattice_a = np.array([float(data[f]["lattice_a"].value) for f in formulas])
    gap, uncertainty = endpoint_gaps(formulas, temperature_K)
    return BinaryPoints(formulas, lattice_a, gap, uncertainty)


def system_outline(system: AlloySystem, temperature_K: float, points: int = 101
                   ) -> AlloyProperties:
    """Evaluate a system along its outline (see :func:`outline_fractions`).

    Args:
        system: An ``AlloySystem`` with measured end-point data.
        temperature_K: Temperature of the gaps (K).
        points: Points per edge.

    Raises:
        MissingDataError: End points without measured data.
    """
    fractions = outline_fractions(len(system.cations), len(system.anions), points)
    return alloy_properties(system, fractions, temperature_K)
