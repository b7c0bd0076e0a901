"""The design space of the composition finder: every system's compositions on a fine grid.

Each site's fractions run over a simplex grid of the given step (a site with one element is
1; two elements: x = 0, step, ..., 1; three: every (i, j, k) step with i + j + k = 1), and a
system's grid is the product of its two sites' grids. All systems' grids are concatenated into
one array of compositions with the system index of each row, grouped by system (the order the
gap evaluation works in).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from functools import lru_cache

import numpy as np
from numpy.typing import NDArray

from screening.alloys.model import (
    ZERO_COLUMN,
    PackedSystems,
    binary_weights,
    pack_systems,
    vegard,
)
from screening.alloys.systems import AlloySystem, design_space_systems
from screening.epitaxy import poisson_ratio_001
from screening.errors import OutOfRangeError

MIN_STEP = {"ternary": 1e-4, "quaternary": 1e-3}
"""Finest grid steps accepted (they bound the number of points to about 10^6 per system)."""


def grid_count(step: float, form: str) -> int:
    """Number of intervals 1/step, checked to be a whole number within the accepted range.

    Raises:
        OutOfRangeError: A step that does not divide 1, or is too fine or coarse.
    """
    if not math.isfinite(step) or not MIN_STEP[form] <= step <= 0.5:
        raise OutOfRangeError(
            f"{form} grid step {step!r}: give a value from {MIN_STEP[form]} to 0.5"
        )
    count = round(1.0 / step)
    if abs(count * step - 1.0) > 1e-9:
        raise OutOfRangeError(f"{form} grid step {step!r} does not divide 1 into whole steps")
    return count


def simplex_grid(size: int, count: int) -> NDArray[np.float64]:
    """Every composition of ``size`` elements on one site in steps of 1/count, (n, size)."""
    if size == 1:
        return np.ones((1, 1))
    if size == 2:
        x = np.arange(count + 1) / count
        return np.column_stack([x, 1.0 - x])
    i, j = np.triu_indices(count + 1)  # i <= j: fractions i, j - i, count - j
    return np.column_stack([i, j - i, count - j]) / count


def system_grid(system: AlloySystem, count: int) -> NDArray[np.float64]:
    """A system's grid in :attr:`AlloySystem.elements` order, (n, nelement)."""
    cations = simplex_grid(len(system.cations), count)
    anions = simplex_grid(len(system.anions), count)
    return np.hstack([np.repeat(cations, len(anions), axis=0), np.tile(anions, (len(cations), 1))])


@dataclass(frozen=True, eq=False)
class DesignSpace:
    """Every grid composition of a set of systems, packed for vectorised evaluation.

    Attributes:
        packed: The packed systems.
        system_index: (npoint,) system of each composition.
        fractions: (npoint, 5) site fractions (column 4 zero).
        lattice_constant_angstrom: (npoint,) Vegard lattice constant (300 K).
        ternary_step: Grid step of the ternaries.
        quaternary_step: Grid step of the quaternaries.
        composition_key: (npoint,) :func:`composition_keys` of each composition (over the
            elements of ``key_systems``).
        key_order: (npoint,) the rows sorted by composition key, then by the number of
            elements of their system, then by position (the preference among duplicates).
        key_systems: The systems whose elements the keys are over (the built grid's).
        poisson_ratio: (npoint,) (001) Poisson ratio of each composition (Vegard C11, C12).
        poisson_assumed: (npoint,) True where the default Poisson ratio was assumed.
    """

    packed: PackedSystems
    system_index: NDArray[np.intp]
    fractions: NDArray[np.float64]
    lattice_constant_angstrom: NDArray[np.float64]
    ternary_step: float
    quaternary_step: float
    composition_key: NDArray[np.uint64]
    key_order: NDArray[np.intp]
    key_systems: tuple[AlloySystem, ...]
    poisson_ratio: NDArray[np.float64]
    poisson_assumed: NDArray[np.bool_]

    @property
    def size(self) -> int:
        """Number of grid compositions."""
        return len(self.system_index)


def design_space(systems: tuple[AlloySystem, ...], ternary_step: float = 0.001,
                 quaternary_step: float = 0.005) -> DesignSpace:
    """The grid of every system: rows of the cached grid of their families' design space.

    One grid per family set and steps is kept (at most ``_SPACES_KEPT``, about 60 MB each for
    the III-V and II-VI design space); a subset of its systems (as a query that excludes
    elements asks for) is selected from it, not built and kept again. Systems outside the
    design space get a grid of their own.

    Args:
        systems: The systems.
        ternary_step: Grid step of ternaries.
        quaternary_step: Grid step of quaternaries.

    Raises:
        OutOfRangeError: A step that does not divide 1 or is out of range.
    """
    families = tuple(sorted({s.family for s in systems}))
    full = design_space_systems(families)
    if not set(systems) <= set(full) or set(systems) == set(full):
        return _built_space(systems, ternary_step, quaternary_step)
    whole = _built_space(full, ternary_step, quaternary_step)
    position = np.full(len(full), -1, dtype=np.intp)
    position[[full.index(s) for s in systems]] = np.arange(len(systems))
    index = position[whole.system_index]
    rows = np.flatnonzero(index >= 0)
    rows = rows[np.argsort(index[rows], kind="stable")]
    keys = whole.composition_key[rows]
    if np.all(rows[1:] > rows[:-1]):  # same relative order: the whole's key order carries over
        subset_row = np.full(whole.size, -1, dtype=np.intp)
        subset_row[rows] = np.arange(len(rows))
        order = subset_row[whole.key_order]
        order = order[order >= 0]
    else:
        order = _key_order(pack_systems(systems), index[rows], keys)
    return DesignSpace(pack_systems(systems), index[rows], whole.fractions[rows],
                       whole.lattice_constant_angstrom[rows], ternary_step, quaternary_step,
                       keys, order, whole.key_systems, whole.poisson_ratio[rows],
                       whole.poisson_assumed[rows])


def composition_keys(systems: tuple[AlloySystem, ...], system_index: NDArray[np.intp],
                     fractions: NDArray[np.float64],
                     over: tuple[AlloySystem, ...] | None = None) -> NDArray[np.uint64]:
    """A hash of each composition that ignores which system it was reached through.

    Each element of the systems `over` (default: `systems`) gets a fixed pseudo-random 64-bit
    multiplier; the key is the sum over the elements of multiplier * round(fraction * 2^30)
    (wrapping), so In0.5Ga0.5As from InGaAs and from AlInGaAs (Al = 0) get the same key.
    """
    elements = sorted({e for s in (over or systems) for e in s.elements})
    multipliers = np.random.default_rng(0).integers(
        1, 2**63, size=len(elements) + 1, dtype=np.uint64)
    position = {e: i for i, e in enumerate(elements)}
    width = fractions.shape[1]
    table = np.full((len(systems), width), len(elements), dtype=np.intp)
    for s, system in enumerate(systems):  # loop over systems
        table[s, : len(system.elements)] = [position[e] for e in system.elements]
    steps = np.rint(fractions * 2.0**30).astype(np.uint64)
    with np.errstate(over="ignore"):
        return (multipliers[table[system_index]] * steps).sum(axis=1, dtype=np.uint64)


def _key_order(packed: PackedSystems, system_index: NDArray[np.intp],
               keys: NDArray[np.uint64]) -> NDArray[np.intp]:
    """Rows by composition key, then by their system's number of elements, then position."""
    n_elements = np.array([len(s.elements) for s in packed.systems])[system_index]
    return np.lexsort((n_elements, keys))


_SPACES_KEPT = 2
"""Design-space grids kept in memory."""


@lru_cache(maxsize=_SPACES_KEPT)
def _built_space(systems: tuple[AlloySystem, ...], ternary_step: float,
                 quaternary_step: float) -> DesignSpace:
    """Build (and cache) the grid of every system.

    Args:
        systems: The systems.
        ternary_step: Grid step of ternaries.
        quaternary_step: Grid step of quaternaries.

    Raises:
        OutOfRangeError: A step that does not divide 1 or is out of range.
    """
    counts = {"ternary": grid_count(ternary_step, "ternary"),
              "quaternary": grid_count(quaternary_step, "quaternary")}
    packed = pack_systems(systems)
    grids = [system_grid(s, counts[s.form]) for s in systems]  # one array per system
    sizes = [len(g) for g in grids]
    fractions = np.zeros((sum(sizes), ZERO_COLUMN + 1))
    start = 0
    for grid in grids:
        fractions[start:start + len(grid), : grid.shape[1]] = grid
        start += len(grid)
    index = np.repeat(np.arange(len(systems), dtype=np.intp), sizes)
    lattice = vegard(packed, index, fractions, packed.lattice_a_angstrom)
    keys = composition_keys(systems, index, fractions)
    order = _key_order(packed, index, keys)
    poisson, assumed = poisson_ratio(packed, index, fractions)
    for array in (index, fractions, lattice, keys, order, poisson, assumed):
        array.flags.writeable = False
    return DesignSpace(packed, index, fractions, lattice, ternary_step, quaternary_step, keys,
                       order, systems, poisson, assumed)


def poisson_ratio(packed: PackedSystems, system_index: NDArray[np.intp],
                  fractions: NDArray[np.float64]
                  ) -> tuple[NDArray[np.float64], NDArray[np.bool_]]:
    """(001) Poisson ratio of each composition (Vegard C11, C12); True where assumed."""
    weights = binary_weights(packed, system_index, fractions)  # Vegard, weighed once
    slots = packed.slot_binary[system_index]
    c11 = np.einsum("ij,ij->i", weights, packed.c11_GPa[slots])
    c12 = np.einsum("ij,ij->i", weights, packed.c12_GPa[slots])
    return poisson_ratio_001(c11, c12)
