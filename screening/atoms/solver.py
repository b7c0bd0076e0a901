"""The atom solver: SCF on two nested grids and Richardson extrapolation to the continuum limit.

The second-order finite differences of `screening.atoms.radial` leave an error c h^2 + O(h^4)
in every eigenvalue and in the total energy. Solving at steps h and h/2 and taking
(4 E(h/2) - E(h)) / 3 removes the h^2 term; at the default h = 0.02 the remaining error is
about 3e-5 eV for the deepest levels of the heaviest atoms and far less for valence levels.

With ``relativistic=True`` the same two-grid SCF runs with scalar-relativistic ZORA orbitals
(`screening.atoms.zora`), the reported levels are scaled-ZORA energies, and the valence p level
is also solved for j = 1/2 and j = 3/2 (the two kappa equations) in the final potential of each
grid; all of these are extrapolated in the same way.
"""

from __future__ import annotations

from dataclasses import replace

import numpy as np
from numpy.typing import NDArray

from screening.atoms.configurations import (
    atomic_number,
    configuration,
    element_symbol,
    lowest_d_shell,
    subshells_to_solve,
    valence_s_p,
)
from screening.atoms.levels import AtomLevels, Level
from screening.atoms.radial import LogGrid, radial_eigenstates
from screening.atoms.scf import GridSolution, ScfSettings, run_scf
from screening.atoms.zora import zora_eigenstates
from screening.constants import HARTREE_EV

DEFAULT_SETTINGS: ScfSettings = ScfSettings()
"""Settings of the committed table (see `ScfSettings` for their meaning)."""


def _refine_charge(charge: NDArray[np.float64], fine: LogGrid) -> NDArray[np.float64]:
    """Carry a radial charge to the refined grid ``fine``: copy even points, cubic midpoints."""
    refined = np.empty(fine.size)
    refined[::2] = charge
    # Four-point (cubic) interpolation at the midpoints, linear next to the ends.
    mid = 0.5 * (charge[:-1] + charge[1:])
    mid[1:-1] = (9.0 * (charge[1:-2] + charge[2:-1]) - (charge[:-3] + charge[3:])) / 16.0
    refined[1::2] = np.maximum(mid, 0.0)
    return refined


def _extrapolate(e_coarse: float, e_fine: float) -> float:
    """Richardson extrapolation of a quantity with an h^2 error from steps h and h/2."""
    return (4.0 * e_fine - e_coarse) / 3.0


def _p_spin_orbit_pair(
    n_p: int, coarse: GridSolution, fine: GridSolution
) -> tuple[float, float]:
    """Scaled-ZORA (p1/2, p3/2) energies in hartree of the level n_p p, extrapolated."""
    pair = []
    for kappa in (1, -2):
        values = [
            zora_eigenstates(s.grid, s.potential, 1, n_p - 1, kappa=kappa).scaled[-1]
            for s in (coarse, fine)
        ]
        pair.append(_extrapolate(float(values[0]), float(values[1])))
    return pair[0], pair[1]


def _empty_d_level(
    n_d: int, coarse: GridSolution, fine: GridSolution, relativistic: bool
) -> float:
    """Energy in hartree of the empty level n_d d in the final potentials, extrapolated.

    The (n_d - 2)-th d state of each grid's self-consistent potential (scaled ZORA if
    ``relativistic``), the same eigenvalue the SCF would give a zero-occupation d shell; NaN
    if the fine grid's state is not bound (a box state at or above the vacuum level).
    """
    values = []
    for solution in (coarse, fine):
        if relativistic:
            states = zora_eigenstates(solution.grid, solution.potential, 2, n_d - 2)
            values.append(float(states.scaled[-1]))
        else:
            energies, _ = radial_eigenstates(solution.grid, solution.potential, 2, n_d - 2)
            values.append(float(energies[-1]))
    if values[1] >= 0.0:
        return float("nan")
    return _extrapolate(values[0], values[1])


def solve_atom(
    symbol_or_z: str | int,
    settings: ScfSettings | None = None,
    *,
    relativistic: bool = False,
    **overrides: float | int,
) -> AtomLevels:
    """Solve the LDA Kohn-Sham equations of a neutral atom now (a fraction of a second).

    Spherical, spin-unpolarised; Slater exchange plus VWN5 correlation; the ground-state
    configuration of `screening.atoms.configurations`. Non-relativistic by default.

    Args:
        symbol_or_z: Element symbol (``"Zn"``) or atomic number, Z = 1 to 86.
        settings: Numerical settings; `DEFAULT_SETTINGS` when omitted.
        relativistic: Scalar-relativistic (scaled ZORA) levels and the spin-orbit pair of the
            valence p level instead of the non-relativistic levels.
        **overrides: Fields of `ScfSettings` to change, e.g. ``max_iterations=1``.

    Returns:
        Every occupied level and the unoccupied valence s and p levels in eV, and the total
        energy in eV. An unoccupied level that the atom's potential does not bind (the 2p of H
        and He) is reported at the vacuum level, 0 eV, the bottom of its continuum (its
        spin-orbit pair too). ``lowest_d`` is the lowest d level
        (`screening.atoms.configurations.lowest_d_shell`): the outermost occupied d, or the
        lowest empty d of the final potential, extrapolated like the other levels; its energy
        is NaN where that empty d is not bound.

    Raises:
        UnknownElementError: Not an element of Z = 1 to 86.
        ConvergenceError: The SCF cycle did not converge on one of the two grids.
    """
    z = atomic_number(symbol_or_z)
    symbol = element_symbol(z)
    chosen = replace(settings or DEFAULT_SETTINGS, **overrides)
    shells = subshells_to_solve(z)
    label = f"{symbol} (Z = {z})"

    coarse_grid = LogGrid.spanning(chosen.z_r_min / z, chosen.r_max, chosen.h)
    coarse = run_scf(z, shells, coarse_grid, chosen, label=label, relativistic=relativistic)
    fine_grid = coarse_grid.refined()
    start = _refine_charge(coarse.charge, fine_grid)
    fine = run_scf(
        z, shells, fine_grid, chosen, initial_charge=start, label=label, relativistic=relativistic
    )

    levels = []
    unbound: set[tuple[int, int]] = set()
    for shell in shells:
        key = (shell.n, shell.l)
        energy = _extrapolate(coarse.energies[key], fine.energies[key])
        if shell.occupation == 0.0 and fine.energies[key] >= 0.0:
            energy = 0.0  # not bound: only continuum states (box states here) above 0
            unbound.add(key)
        levels.append(Level(shell.label, shell.n, shell.l, shell.occupation, energy * HARTREE_EV))
    total = _extrapolate(coarse.total_energy, fine.total_energy) * HARTREE_EV
    pair = None
    if relativistic:
        n_p = valence_s_p(z)[1].n
        j_half, j_three_halves = (0.0, 0.0)
        if (n_p, 1) not in unbound:
            j_half, j_three_halves = _p_spin_orbit_pair(n_p, coarse, fine)
        pair = (j_half * HARTREE_EV, j_three_halves * HARTREE_EV)
    d_shell = lowest_d_shell(z)
    if d_shell.occupation > 0.0:
        lowest_d = next(lv for lv in levels if lv.orbital == d_shell.label)
    else:
        d_energy = _empty_d_level(d_shell.n, coarse, fine, relativistic) * HARTREE_EV
        lowest_d = Level(d_shell.label, d_shell.n, 2, 0.0, d_energy)
    return AtomLevels(
        symbol, z, configuration(z), tuple(levels), total, relativistic, pair, lowest_d
    )
