"""Scalar-relativistic and spin-orbit radial equations in the zeroth-order regular approximation.

Hartree atomic units throughout (energies in hartree, lengths in bohr, c = 1/alpha).

ZORA (E. van Lenthe, E. J. Baerends and J. G. Snijders, J. Chem. Phys. 99, 4597 (1993)) replaces
the Dirac equation of an electron in a potential V by the two-component equation

    H = sigma.p (K / 2) sigma.p + V,    K(r) = 2 c^2 / (2 c^2 - V(r)).

Derivation of the radial equation. With f = K/2 and p = -i grad, sigma.p f sigma.p
= p.(f p) + sigma.(grad f x p), and for a spherical f, grad f x p = (f'/r) L, so
H = p.(f p) + (K' / (2 r)) sigma.L + V. On psi = (u(r)/r) times a spin-angular function of
(l, j), -div(f grad psi) gives -(f u')' + [f l(l+1)/r^2 + f'/r] u (the f'/r term is the radial
derivative of f acting on the 1/r of psi), and sigma.L = -(1 + kappa) with kappa = -(l + 1)
for j = l + 1/2 and kappa = l for j = l - 1/2. Hence

    -(1/2) (K u')' + [K l(l+1) / (2 r^2) - kappa K' / (2 r) + V] u = E u.            (1)

The scalar (spin-orbit-free) equation drops sigma.L, i.e. replaces -kappa by +1: the average
of -kappa over the 2(2l+1) states, ((l+1)(2l+2) - l (2l)) / (4l+2) = 1; for s states (kappa = -1)
the two coincide. Near a point nucleus K = (2 c^2 / Z) r + O(r^2) and u ~ r^gamma with
gamma^2 = l(l+1) - kappa - (Z/c)^2 = kappa^2 - (Z alpha)^2, the exponent of the Dirac large
component; the ZORA equation is regular where the Pauli expansion is not.

Log-grid form. With r = exp(x) and u = sqrt(r) v, the quadratic form of (1) times r dr becomes

    -(1/2) (K v_x)_x + [K (l + 1/2)^2 / 2 + (s/2 - 1/4) K_x + r^2 V] v = E r^2 v,

s = -kappa (or 1 for the scalar equation); for K = 1 this is the non-relativistic equation of
`screening.atoms.radial`. The flux-conservative three-point difference, with K at the half
points x_i +- h/2 and K_x = (K_{i+1/2} - K_{i-1/2}) / h, and w = r v, gives the symmetric
tridiagonal eigenproblem

    diagonal       (K_{i+1/2} + K_{i-1/2}) / (2 h^2 r_i^2)
                   + [K_i (l+1/2)^2 / 2 + (s/2 - 1/4) K_x,i] / r_i^2 + V_i
    off-diagonal   -K_{i+1/2} / (2 h^2 r_i r_{i+1})

with the normalisation sum(w^2) h = 1 of `radial_eigenstates`; its error is a series in h^2.
Inside the first point the grid is continued with the regular discrete solution v ~ exp(mu x)
of the equation with K = (2 c^2 / Z) r and V = -Z/r (see `_inner_growth`).

Scaled ZORA (E. van Lenthe, E. J. Baerends and J. G. Snijders, J. Chem. Phys. 101, 9783
(1994)): E_scaled = E / (1 + <phi| sigma.p (c^2 / (2 c^2 - V)^2) sigma.p |phi>). The operator in
the brackets is (1) without V and with K replaced by K^2 / (2 c^2), so its expectation value is
evaluated with the same tridiagonal form. For a bare Coulomb potential it reproduces the Dirac
energies (tests/screening/test_atoms_relativistic.py measures this).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray
from scipy.linalg import eigh_tridiagonal

from screening.atoms.radial import EIGENVALUE_TOLERANCE, LogGrid
from screening.errors import ConvergenceError

SPEED_OF_LIGHT_AU: float = 137.035999084
"""Speed of light in hartree atomic units, 1/alpha (CODATA 2018)."""

SCALAR: None = None
"""Pass as ``kappa`` to solve the scalar-relativistic (spin-orbit-free) equation."""


@dataclass(frozen=True)
class ZoraStates:
    """Eigenstates of one radial ZORA equation on one grid.

    Attributes:
        energies: Plain ZORA eigenvalues in hartree, ascending.
        scaled: Scaled-ZORA energies E / (1 + <S>) in hartree.
        w: Functions w = sqrt(r) u(r), shape (count, size), sum(w**2) * h = 1.
    """

    energies: NDArray[np.float64]
    scaled: NDArray[np.float64]
    w: NDArray[np.float64]


def _half_point_values(grid: LogGrid, y: NDArray[np.float64]) -> NDArray[np.float64]:
    """Values of the smooth function ``y`` at x_i + h/2 for i = -1 .. size-1 (size + 1 values).

    Four-point (cubic) interpolation inside, quadratic extrapolation half a step beyond the ends.
    """
    half = np.empty(grid.size + 1)
    inner = 0.5 * (y[:-1] + y[1:])
    inner[1:-1] = (9.0 * (y[1:-2] + y[2:-1]) - (y[:-3] + y[3:])) / 16.0
    half[1:-1] = inner
    half[0] = (15.0 * y[0] - 10.0 * y[1] + 3.0 * y[2]) / 8.0
    half[-1] = (15.0 * y[-1] - 10.0 * y[-2] + 3.0 * y[-3]) / 8.0
    return half


def _inner_growth(h: float, l: int, s: float, z_alpha_sq: float) -> float:  # noqa: E741
    """Discrete growth rate mu h of the regular solution v ~ exp(mu x) next to the nucleus.

    With K = K_0 exp(x) and r^2 V = -(Z^2 / (2 c^2)) K the difference equation has the exact
    solution exp(mu x) with cosh((mu + 1/2) h) = cosh(h/2) + h^2 [(l + 1/2)^2 / 2
    + (s/2 - 1/4) 2 sinh(h/2) / h - (Z alpha)^2 / 2]; as h -> 0, mu + 1/2 = gamma.
    """
    rhs = np.cosh(0.5 * h) + h * h * (
        0.5 * (l + 0.5) ** 2 + (0.5 * s - 0.25) * 2.0 * np.sinh(0.5 * h) / h - 0.5 * z_alpha_sq
    )
    return float(np.arccosh(rhs) - 0.5 * h)


def _operator(
    grid: LogGrid,
    k_half: NDArray[np.float64],
    k_grid: NDArray[np.float64],
    l: int,  # noqa: E741
    s: float,
    growth: float,
) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
    """Diagonal and off-diagonal of the kinetic part sigma.p (K/2) sigma.p (no potential)."""
    r, h = grid.r, grid.h
    k_x = (k_half[1:] - k_half[:-1]) / h
    diagonal = (
        (k_half[1:] + k_half[:-1]) / (2.0 * h * h) + 0.5 * (l + 0.5) ** 2 * k_grid
        + (0.5 * s - 0.25) * k_x
    ) / r**2
    diagonal[0] -= k_half[0] * np.exp(-growth) / (2.0 * h * h * r[0] ** 2)
    off_diagonal = -k_half[1:-1] / (2.0 * h * h * r[:-1] * r[1:])
    return diagonal, off_diagonal


def zora_eigenstates(
    grid: LogGrid,
    potential: NDArray[np.float64],
    l: int,  # noqa: E741 - the quantum number's conventional name
    count: int,
    kappa: int | None = SCALAR,
    c: float = SPEED_OF_LIGHT_AU,
) -> ZoraStates:
    """Lowest ``count`` ZORA eigenstates of angular momentum ``l`` in a spherical potential.

    Args:
        grid: The logarithmic grid.
        potential: Potential energy V(r_i) in hartree on the grid (attractive nucleus: V < 0
            near r = 0, with r V -> -Z).
        l: Orbital angular momentum quantum number.
        count: Number of states wanted, n = l + 1, ..., l + count.
        kappa: Dirac quantum number, -(l + 1) for j = l + 1/2 and l for j = l - 1/2; `SCALAR`
            (None) for the spin-orbit-free scalar-relativistic equation.
        c: Speed of light in atomic units (a large value gives the non-relativistic limit).

    Returns:
        Plain and scaled ZORA energies (hartree) and the normalised functions w.

    Raises:
        ValueError: ``kappa`` does not belong to ``l``.
        ConvergenceError: LAPACK's inverse iteration failed for an eigenvector.
    """
    if kappa is not None and kappa not in (-(l + 1), l) or kappa == 0:
        raise ValueError(f"kappa = {kappa} is not a Dirac quantum number of l = {l}")
    s = 1.0 if kappa is None else float(-kappa)
    r = grid.r
    two_c2 = 2.0 * c * c
    r_half = np.exp(grid.x_min + grid.h * (np.arange(grid.size + 1) - 0.5))
    rv_half = _half_point_values(grid, r * potential)
    k_half = two_c2 * r_half / (two_c2 * r_half - rv_half)
    k_grid = two_c2 * r / (two_c2 * r - r * potential)
    z_alpha_sq = (r[0] * potential[0] / c) ** 2
    growth = _inner_growth(grid.h, l, s, z_alpha_sq)
    diagonal, off_diagonal = _operator(grid, k_half, k_grid, l, s, growth)
    try:
        energies, vectors = eigh_tridiagonal(
            diagonal + potential,
            off_diagonal,
            select="i",
            select_range=(0, count - 1),
            lapack_driver="stebz",
            tol=EIGENVALUE_TOLERANCE,
        )
    except np.linalg.LinAlgError as exc:  # stein: an eigenvector did not converge
        raise ConvergenceError(f"ZORA radial eigenvectors for l = {l} failed: {exc}") from exc
    w = vectors.T / np.sqrt(grid.h)
    s_diag, s_off = _operator(grid, k_half**2 / two_c2, k_grid**2 / two_c2, l, s, growth)
    weight = grid.h * (
        np.sum(s_diag * w * w, axis=1) + 2.0 * np.sum(s_off * w[:, :-1] * w[:, 1:], axis=1)
    )
    return ZoraStates(energies, energies / (1.0 + weight), w)


def dirac_coulomb_energy(n: int, kappa: int, z: float, c: float = SPEED_OF_LIGHT_AU) -> float:
    """Exact Dirac energy (hartree, rest energy removed) of a one-electron ion, point nucleus.

    E = c^2 [1 + (Z alpha / (n - |kappa| + sqrt(kappa^2 - (Z alpha)^2)))^2]^(-1/2) - c^2
    (C. G. Darwin, Proc. R. Soc. A 118, 654 (1928); W. Gordon, Z. Phys. 48, 11 (1928)).

    Args:
        n: Principal quantum number.
        kappa: Dirac quantum number, 1 <= |kappa| <= n, kappa != n.
        z: Nuclear charge.
        c: Speed of light in atomic units.
    """
    za = z / c
    denominator = n - abs(kappa) + np.sqrt(kappa * kappa - za * za)
    return float(c * c / np.sqrt(1.0 + (za / denominator) ** 2) - c * c)
