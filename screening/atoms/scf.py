"""Self-consistent LDA solution of the spherical neutral atom on one logarithmic grid.

Hartree atomic units. The Kohn-Sham potential is V = -Z/r + V_H[n] + v_xc[n]; the density is
spherical and spin-unpolarised, n(r) = sum over subshells of f_nl u_nl(r)^2 / (4 pi r^2).
Self-consistency is reached by Pulay (Anderson) mixing of the radial charge q = 4 pi r^3 n.

The orbitals are non-relativistic (`screening.atoms.radial`) or, with ``relativistic=True``,
scalar-relativistic ZORA orbitals (`screening.atoms.zora`); the density is built from the
normalised orbitals in both cases and the same LDA is used.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from screening.atoms.configurations import Subshell
from screening.atoms.radial import LogGrid, hartree_potential, integrate, radial_eigenstates
from screening.atoms.xc import lda_xc
from screening.atoms.zora import zora_eigenstates
from screening.errors import ConvergenceError

ZORA_EIGENVALUE_NOISE: float = 1e-12
"""Relative rounding noise of a ZORA eigenvalue (dimensionless), added to the energy tolerance.

Near the nucleus the ZORA matrix elements K / (h^2 r^2) reach 1e14 hartree and depend on V
through K, so their rounding moves the deepest eigenvalues of the heaviest atoms by about
1e-9 hartree (2.5e-13 of the Tl 1s energy) from one iteration to the next even when the
density is converged to 1e-11 electrons. A relativistic SCF therefore accepts an eigenvalue
change of energy_tolerance + ZORA_EIGENVALUE_NOISE |E| (4e-9 hartree for Tl 1s, 1e-10 for
valence levels); the non-relativistic criterion is unchanged.
"""


@dataclass(frozen=True)
class ScfSettings:
    """Numerical settings of the atom solver.

    Attributes:
        h: Coarse grid step in x = ln r; the solver also runs at h / 2 and extrapolates.
        z_r_min: Z times the first grid radius, in bohr.
        r_max: Outer radius of the grid in bohr (hard wall just beyond).
        mixing: Fraction of the output-input charge residual taken in each Pulay step.
        history: Number of previous iterations Pulay mixing combines.
        density_tolerance: Converged when the integral of |q_out - q_in| over the grid falls
            below this many electrons ...
        energy_tolerance: ... and no eigenvalue moved by more than this (hartree) in the last
            iteration.
        max_iterations: Iterations allowed per grid before ConvergenceError.
    """

    h: float = 0.02
    z_r_min: float = 1e-6
    r_max: float = 60.0
    mixing: float = 0.5
    history: int = 8
    density_tolerance: float = 1e-9
    energy_tolerance: float = 1e-10
    max_iterations: int = 200


@dataclass(frozen=True)
class GridSolution:
    """Converged SCF result on one grid.

    Attributes:
        grid: The grid.
        energies: Eigenvalue in hartree of every solved subshell, keyed by (n, l); for a
            relativistic solution the scaled-ZORA energy.
        total_energy: LDA total energy in hartree (with the plain ZORA kinetic energy for a
            relativistic solution).
        charge: Self-consistent radial charge q = 4 pi r^3 n per unit x on the grid.
        iterations: SCF iterations used.
        potential: Kohn-Sham potential in hartree the final orbitals were computed in.
    """

    grid: LogGrid
    energies: dict[tuple[int, int], float]
    total_energy: float
    charge: NDArray[np.float64]
    iterations: int
    potential: NDArray[np.float64]


def thomas_fermi_potential(z: int, r: NDArray[np.float64]) -> NDArray[np.float64]:
    """Starting potential: Tietz's fit to the Thomas-Fermi screened nucleus, in hartree.

    V(r) = -Z / (r (1 + 0.53625 r / b)^2) with b = 0.8853 Z^(-1/3) bohr (T. Tietz,
    J. Chem. Phys. 22, 2094 (1954)).

    Args:
        z: Nuclear charge.
        r: Radii in bohr.
    """
    b = 0.8853 * z ** (-1.0 / 3.0)
    return -z / (r * (1.0 + 0.53625 * r / b) ** 2)


class _Pulay:
    """Pulay (Anderson) mixing of input charges from their residuals.

    Uses the difference form: the new input is q + beta R - (dQ + beta dR) gamma, with dQ, dR
    the changes of input and residual over the stored iterations and gamma the least-squares
    solution of dR gamma = R, which is independent of the scale of the residuals.
    """

    def __init__(self, mixing: float, history: int) -> None:
        self.mixing = mixing
        self.history = history
        self.inputs: list[NDArray[np.float64]] = []
        self.residuals: list[NDArray[np.float64]] = []

    def next_input(
        self, q_in: NDArray[np.float64], residual: NDArray[np.float64]
    ) -> NDArray[np.float64]:
        """Return the next input charge given this input and its residual q_out - q_in."""
        self.inputs = [*self.inputs, q_in][-(self.history + 1) :]
        self.residuals = [*self.residuals, residual][-(self.history + 1) :]
        step = q_in + self.mixing * residual
        if len(self.inputs) > 1:
            d_in = np.diff(np.array(self.inputs), axis=0)
            d_res = np.diff(np.array(self.residuals), axis=0)
            gamma = np.linalg.lstsq(d_res.T, residual, rcond=1e-12)[0]
            step = step - (d_in + self.mixing * d_res).T @ gamma
        return np.maximum(step, 0.0)


def _kohn_sham_potential(
    z: int, grid: LogGrid, charge: NDArray[np.float64]
) -> tuple[NDArray[np.float64], NDArray[np.float64], NDArray[np.float64]]:
    """Return (V_total, V_H, v_xc) in hartree for the radial charge ``charge``."""
    r = grid.r
    v_h = hartree_potential(grid, charge)
    _, v_xc = lda_xc(charge / (4.0 * np.pi * r**3))
    return -z / r + v_h + v_xc, v_h, v_xc


def _occupations(shells: tuple[Subshell, ...]) -> dict[int, NDArray[np.float64]]:
    """Occupation of the states n = l+1, l+2, ... for each l present in ``shells``."""
    occupations: dict[int, NDArray[np.float64]] = {}
    for l in sorted({s.l for s in shells}):  # noqa: E741
        count = max(s.n for s in shells if s.l == l) - l
        occ = np.zeros(count)
        for s in shells:
            if s.l == l:
                occ[s.n - l - 1] = s.occupation
        occupations[l] = occ
    return occupations


def _states(
    grid: LogGrid,
    potential: NDArray[np.float64],
    l: int,  # noqa: E741
    count: int,
    relativistic: bool,
) -> tuple[NDArray[np.float64], NDArray[np.float64], NDArray[np.float64]]:
    """(eigenvalues, reported energies, w) of the ``count`` lowest states of ``l``, hartree.

    Non-relativistic: both energies are the eigenvalues. Scalar-relativistic: the plain ZORA
    eigenvalues (those of the Hamiltonian whose kinetic energy enters the total energy) and the
    scaled-ZORA energies that are reported.
    """
    if relativistic:
        states = zora_eigenstates(grid, potential, l, count)
        return states.energies, states.scaled, states.w
    energies, w = radial_eigenstates(grid, potential, l, count)
    return energies, energies, w


def run_scf(
    z: int,
    shells: tuple[Subshell, ...],
    grid: LogGrid,
    settings: ScfSettings,
    initial_charge: NDArray[np.float64] | None = None,
    label: str = "",
    relativistic: bool = False,
) -> GridSolution:
    """Solve the Kohn-Sham equations of a spherical atom self-consistently on one grid.

    Args:
        z: Nuclear charge.
        shells: Subshells to solve with their occupations (unoccupied ones are solved for their
            eigenvalue only). Occupations must sum to ``z`` for a neutral atom.
        grid: The logarithmic grid.
        settings: Mixing, tolerances and iteration limit.
        initial_charge: Starting radial charge q on ``grid``; the Thomas-Fermi potential's
            orbitals when omitted.
        label: Name of the atom for error messages.
        relativistic: Solve the scalar-relativistic (ZORA) instead of the Schrodinger orbitals.

    Returns:
        The converged eigenvalues, total energy and charge.

    Raises:
        ConvergenceError: Not self-consistent within ``settings.max_iterations`` iterations.
    """
    occupations = _occupations(shells)
    r = grid.r
    mixer = _Pulay(settings.mixing, settings.history)
    q_in = initial_charge
    potential = (
        thomas_fermi_potential(z, r) if q_in is None else _kohn_sham_potential(z, grid, q_in)[0]
    )
    previous: NDArray[np.float64] | None = None
    residual_norm = np.inf
    for iteration in range(1, settings.max_iterations + 1):
        q_out = np.zeros(grid.size)
        eigenvalues: dict[int, NDArray[np.float64]] = {}
        reported: dict[int, NDArray[np.float64]] = {}
        for l, occ in occupations.items():  # noqa: E741
            eigenvalues[l], reported[l], w = _states(grid, potential, l, occ.size, relativistic)
            q_out += occ @ (w * w)
        current = np.concatenate(list(eigenvalues.values()))
        if q_in is not None and previous is not None:
            residual = q_out - q_in
            residual_norm = integrate(grid, np.abs(residual))
            noise = ZORA_EIGENVALUE_NOISE * np.abs(current) if relativistic else 0.0
            shift = float(np.max(np.abs(current - previous) - noise))
            if residual_norm < settings.density_tolerance and shift < settings.energy_tolerance:
                energies_by_shell = {
                    (l + i + 1, l): float(e)
                    for l, values in reported.items()  # noqa: E741
                    for i, e in enumerate(values)
                }
                total = _total_energy(z, grid, occupations, eigenvalues, potential, q_out)
                return GridSolution(grid, energies_by_shell, total, q_out, iteration, potential)
            q_in = mixer.next_input(q_in, residual)
        else:
            q_in = q_out
        previous = current
        potential = _kohn_sham_potential(z, grid, q_in)[0]
    measured = "not yet measured" if np.isinf(residual_norm) else f"{residual_norm:.2e} electrons"
    raise ConvergenceError(
        f"SCF for {label or f'Z = {z}'} did not converge in {settings.max_iterations} "
        f"iteration(s) on the grid with step h = {grid.h:g}: charge residual {measured}, "
        f"tolerance {settings.density_tolerance:.0e} electrons; raise max_iterations or "
        f"change mixing"
    )


def _total_energy(
    z: int,
    grid: LogGrid,
    occupations: dict[int, NDArray[np.float64]],
    eigenvalues: dict[int, NDArray[np.float64]],
    potential: NDArray[np.float64],
    charge: NDArray[np.float64],
) -> float:
    """LDA total energy in hartree of the output charge of the last iteration.

    E = T + E_nuc + E_H + E_xc with the kinetic energy T = sum f eps - integral of q V over x,
    V being the potential the orbitals were computed in.
    """
    r = grid.r
    band = sum(float(occ @ eigenvalues[l]) for l, occ in occupations.items())  # noqa: E741
    kinetic = band - integrate(grid, charge * potential)
    nuclear = integrate(grid, -z * charge / r)
    hartree = 0.5 * integrate(grid, charge * hartree_potential(grid, charge))
    eps_xc, _ = lda_xc(charge / (4.0 * np.pi * r**3))
    return kinetic + nuclear + hartree + integrate(grid, charge * eps_xc)
