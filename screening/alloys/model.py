"""Alloy systems packed into arrays, and Vegard's law over compositions of many systems.

Systems are *packed* into small integer tables (their binaries, elements and ternary edges,
padded to four), so that a batch of compositions from any mix of systems is evaluated with
array operations. A composition is a row of site fractions in the order of
:attr:`AlloySystem.elements` (cations, then anions), padded with zeros to five columns; the
fifth column is always zero and is where padding entries point. The band gap is in
``screening.alloys.bandgap``.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache

import numpy as np
from numpy.typing import NDArray

from screening.alloys.systems import AlloySystem
from screening.reference import elastic_constants, measured_compounds

WIDTH = 4
"""Most elements, binaries or edges of a system (a quaternary has four)."""

ZERO_COLUMN = WIDTH
"""Column of a composition row that is always zero (padding points here)."""

@dataclass(frozen=True, eq=False)
class PackedSystems:
    """Integer tables describing systems, and per-binary data.

    Attributes:
        systems: The systems, in the order of their index.
        binaries: Every end-point binary; the last entry "" is the padding binary.
        slot_binary: (nsystem, 4) binary index of each slot.
        slot_cation: (nsystem, 4) element column of each slot's cation (padding: zero column).
        slot_anion: (nsystem, 4) element column of each slot's anion.
        edge_first: (nsystem, 4) element column of each edge's first element.
        edge_second: (nsystem, 4) same for the second element.
        edge_other: (nsystem, 4) element column held on the other site.
        edge_slot_first: (nsystem, 4) slot of the edge's first binary.
        edge_slot_second: (nsystem, 4) slot of its second binary.
        n_edges: (nsystem,) number of real edges.
        lattice_a_angstrom: (nbinary + 1,) cubic a or hexagonal in-plane a (padding 0).
        lattice_c_angstrom: (nbinary + 1,) hexagonal c, NaN for cubic binaries.
        c11_GPa: (nbinary + 1,) elastic C11, NaN where unknown.
        c12_GPa: (nbinary + 1,) elastic C12, NaN where unknown.
    """

    systems: tuple[AlloySystem, ...]
    binaries: tuple[str, ...]
    slot_binary: NDArray[np.intp]
    slot_cation: NDArray[np.intp]
    slot_anion: NDArray[np.intp]
    edge_first: NDArray[np.intp]
    edge_second: NDArray[np.intp]
    edge_other: NDArray[np.intp]
    edge_slot_first: NDArray[np.intp]
    edge_slot_second: NDArray[np.intp]
    n_edges: NDArray[np.intp]
    lattice_a_angstrom: NDArray[np.float64]
    lattice_c_angstrom: NDArray[np.float64]
    c11_GPa: NDArray[np.float64]
    c12_GPa: NDArray[np.float64]


def _measured(formula: str, key: str) -> float:
    item = measured_compounds().get(formula, {}).get(key)
    return float(item.value) if item is not None else np.nan


@lru_cache(maxsize=32)
def pack_systems(systems: tuple[AlloySystem, ...]) -> PackedSystems:
    """Pack systems into integer tables (cached per tuple of systems).

    Args:
        systems: The systems to evaluate together.

    Returns:
        The packed tables.
    """
    binaries = tuple(dict.fromkeys(b for s in systems for b in s.binaries)) + ("",)
    index = {b: i for i, b in enumerate(binaries)}
    pad = len(binaries) - 1
    n = len(systems)
    tables = {name: np.full((n, WIDTH), fill, dtype=np.intp) for name, fill in (
        ("slot_binary", pad), ("slot_cation", ZERO_COLUMN), ("slot_anion", ZERO_COLUMN),
        ("edge_first", ZERO_COLUMN), ("edge_second", ZERO_COLUMN), ("edge_other", ZERO_COLUMN),
        ("edge_slot_first", 0), ("edge_slot_second", 0))}
    n_edges = np.zeros(n, dtype=np.intp)
    for s, system in enumerate(systems):  # loop over systems, not compositions
        for k, (cation, anion) in enumerate(system.slot_elements):
            tables["slot_binary"][s, k] = index[system.binaries[k]]
            tables["slot_cation"][s, k], tables["slot_anion"][s, k] = cation, anion
        for e, edge in enumerate(system.edges):
            tables["edge_first"][s, e], tables["edge_second"][s, e] = edge.first, edge.second
            tables["edge_other"][s, e] = edge.other
            tables["edge_slot_first"][s, e] = edge.slot_first
            tables["edge_slot_second"][s, e] = edge.slot_second
        n_edges[s] = len(system.edges)
    elastic = elastic_constants()
    real = binaries[:-1]
    lattice_a = np.array([_measured(b, "lattice_a") for b in real] + [0.0])
    lattice_c = np.array([_measured(b, "lattice_c") for b in real] + [0.0])
    c11 = np.array([elastic[b].c11_GPa if b in elastic else np.nan for b in real] + [0.0])
    c12 = np.array([elastic[b].c12_GPa if b in elastic else np.nan for b in real] + [0.0])
    return PackedSystems(systems=systems, binaries=binaries, n_edges=n_edges,
                         lattice_a_angstrom=lattice_a, lattice_c_angstrom=lattice_c,
                         c11_GPa=c11, c12_GPa=c12, **tables)


def binary_weights(packed: PackedSystems, system_index: NDArray[np.intp],
                   fractions: NDArray[np.float64]) -> NDArray[np.float64]:
    """Weight p_i q_j of each binary slot: (npoint, 4).

    Args:
        packed: The packed systems.
        system_index: (npoint,) system of each composition.
        fractions: (npoint, 5) site fractions, column 4 zero.
    """
    cation = np.take_along_axis(fractions, packed.slot_cation[system_index], axis=1)
    anion = np.take_along_axis(fractions, packed.slot_anion[system_index], axis=1)
    return cation * anion


def vegard(packed: PackedSystems, system_index: NDArray[np.intp],
           fractions: NDArray[np.float64], values: NDArray[np.float64]) -> NDArray[np.float64]:
    """Vegard's law for a per-binary quantity: sum over slots of weight * value, (npoint,).

    Args:
        packed: The packed systems.
        system_index: (npoint,) system of each composition.
        fractions: (npoint, 5) site fractions.
        values: (nbinary + 1,) the quantity per binary (padding entry finite, e.g. 0).
    """
    weights = binary_weights(packed, system_index, fractions)
    return np.einsum("ij,ij->i", weights, values[packed.slot_binary[system_index]])


def edge_coordinates(packed: PackedSystems, system_index: NDArray[np.intp],
                     fractions: NDArray[np.float64]
                     ) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
    """Edge weights w_e = f_first f_second f_other and positions u_e, each (npoint, 4)."""
    first = np.take_along_axis(fractions, packed.edge_first[system_index], axis=1)
    second = np.take_along_axis(fractions, packed.edge_second[system_index], axis=1)
    other = np.take_along_axis(fractions, packed.edge_other[system_index], axis=1)
    return first * second * other, 0.5 * (1.0 - first + second)


def system_runs(system_index: NDArray[np.intp]
                ) -> tuple[NDArray[np.intp] | None, list[tuple[int, int, int]]]:
    """Group compositions by system: (order, [(system, start, stop), ...]).

    ``order`` sorts the rows by system (None when they already are, as on a design-space grid);
    each run is a contiguous slice of the sorted rows belonging to one system.
    """
    order = None
    if len(system_index) > 1 and np.any(system_index[1:] < system_index[:-1]):
        order = np.argsort(system_index, kind="stable")
    ordered = system_index if order is None else system_index[order]
    cuts = np.flatnonzero(ordered[1:] != ordered[:-1]) + 1
    starts = np.concatenate([[0], cuts]).astype(int)
    stops = np.concatenate([cuts, [len(ordered)]]).astype(int)
    return order, [(int(ordered[a]), int(a), int(b)) for a, b in zip(starts, stops, strict=True)
                   if b > a]
