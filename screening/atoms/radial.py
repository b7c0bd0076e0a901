"""Logarithmic radial grid, radial Schrodinger eigenproblem and radial Poisson equation.

Units are hartree atomic units throughout (energies in hartree, lengths in bohr).

On the grid r = exp(x), with x uniformly spaced by h, the radial function u(r) = r R(r) is
written u = sqrt(r) v(x). The radial equation -u''/2 + [l(l+1)/(2 r^2) + V] u = E u becomes
-v''/(2 r^2) + [(l + 1/2)^2 / (2 r^2) + V] v = E v, and after the substitution w = r v and a
three-point second difference in x it is the symmetric tridiagonal eigenproblem

    diagonal       (1/h^2 + (l + 1/2)^2 / 2) / r_i^2 + V_i
    off-diagonal   -1 / (2 h^2 r_i r_{i+1}).

The eigenvector w is normalised by sum(w^2) h = 1, which is the normalisation of u because
u^2 dr = w^2 dx. The discretisation error of every eigenvalue is a series in h^2, which the
SCF driver removes to O(h^4) by Richardson extrapolation.

Boundary conditions: at the outer end w = 0 one step beyond r_max (a hard wall far outside the
atom); at the inner end the grid is continued with the regular solution of the discrete
equation, v ~ exp((l + 1/2) x), rather than a hard wall. A hard wall at r_min would act like
an impenetrable nucleus of radius r_min and raise an s level of a Coulomb potential by about
2 Z^3 r_min / n^3 hartree; the regular continuation leaves an error of order (Z r_min)^2.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import cached_property

import numpy as np
from numpy.typing import NDArray
from scipy.linalg import eigh_tridiagonal

from screening.errors import ConvergenceError

EIGENVALUE_TOLERANCE: float = 1e-12
"""Absolute tolerance (hartree) of the bisection for each eigenvalue."""


@dataclass(frozen=True)
class LogGrid:
    """Uniform grid in x = ln(r / bohr) from r_min to (about) r_max.

    Attributes:
        x_min: ln(r_min / bohr) of the first point.
        h: Grid step in x (dimensionless).
        size: Number of grid points.
    """

    x_min: float
    h: float
    size: int

    @classmethod
    def spanning(cls, r_min: float, r_max: float, h: float) -> LogGrid:
        """Return the grid with step ``h`` from ``r_min`` whose last point is at or past ``r_max``.

        Args:
            r_min: First radius in bohr (> 0).
            r_max: Radius in bohr the grid must reach.
            h: Step in x = ln r.
        """
        x_min = float(np.log(r_min))
        size = int(np.ceil((np.log(r_max) - x_min) / h - 1e-9)) + 1
        return cls(x_min=x_min, h=float(h), size=size)

    def refined(self) -> LogGrid:
        """Return the grid with half the step, whose even points are this grid's points."""
        return LogGrid(x_min=self.x_min, h=self.h / 2.0, size=2 * self.size - 1)

    @cached_property
    def x(self) -> NDArray[np.float64]:
        """Grid points in x = ln(r / bohr)."""
        return self.x_min + self.h * np.arange(self.size)

    @cached_property
    def r(self) -> NDArray[np.float64]:
        """Grid radii in bohr."""
        return np.exp(self.x)


def radial_eigenstates(
    grid: LogGrid,
    potential: NDArray[np.float64],
    l: int,  # noqa: E741 - the quantum number's conventional name
    count: int,
) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
    """Lowest ``count`` eigenstates of angular momentum ``l`` in a spherical potential.

    Args:
        grid: The logarithmic grid.
        potential: Potential energy V(r_i) in hartree on the grid.
        l: Angular momentum quantum number.
        count: Number of states wanted, n = l + 1, ..., l + count.

    Returns:
        (energies, w): eigenvalues in hartree, ascending, shape (count,), and the functions
        w = sqrt(r) u(r) on the grid, shape (count, size), normalised so that
        sum(w**2) * h = 1 (hence w**2 is the electron probability per unit x).

    Raises:
        ConvergenceError: LAPACK's inverse iteration failed for an eigenvector.
    """
    r, h = grid.r, grid.h
    centrifugal = (l + 0.5) ** 2
    diagonal = (1.0 / h**2 + 0.5 * centrifugal) / r**2 + potential
    # Regular continuation below r_min: v_{-1} = exp(-kappa h) v_0 with the discrete growth
    # rate kappa of v'' = (l + 1/2)^2 v, cosh(kappa h) = 1 + h^2 (l + 1/2)^2 / 2.
    kappa_h = np.arccosh(1.0 + 0.5 * h * h * centrifugal)
    diagonal[0] -= np.exp(-kappa_h) / (2.0 * h * h * r[0] ** 2)
    off_diagonal = -1.0 / (2.0 * h * h * r[:-1] * r[1:])
    try:
        energies, vectors = eigh_tridiagonal(
            diagonal,
            off_diagonal,
            select="i",
            select_range=(0, count - 1),
            lapack_driver="stebz",
            tol=EIGENVALUE_TOLERANCE,
        )
    except np.linalg.LinAlgError as exc:  # stein: an eigenvector did not converge
        raise ConvergenceError(f"radial eigenvectors for l = {l} failed: {exc}") from exc
    return energies, vectors.T / np.sqrt(h)


def _cumulative_integral(f: NDArray[np.float64], h: float) -> NDArray[np.float64]:
    """Integral of ``f`` from the first grid point to each grid point, fourth-order accurate.

    The trapezoid rule with the Euler-Maclaurin end correction -h^2/12 (f'(x_i) - f'(x_0)).

    Args:
        f: Samples of a smooth function on a uniform grid.
        h: Grid step.
    """
    trapezoid = np.concatenate(([0.0], np.cumsum(0.5 * h * (f[1:] + f[:-1]))))
    slope = np.gradient(f, h)
    return trapezoid - h * h / 12.0 * (slope - slope[0])


def hartree_potential(grid: LogGrid, charge: NDArray[np.float64]) -> NDArray[np.float64]:
    """Electrostatic potential energy of an electron in a spherical electron cloud.

    V_H(r) = Q(r) / r + integral from r to infinity of 4 pi r' n(r') dr', with Q(r) the
    electron charge inside r.

    Args:
        grid: The logarithmic grid.
        charge: Radial charge per unit x, q = 4 pi r^3 n(r) (electrons), on the grid; it must
            vanish smoothly at both ends of the grid.

    Returns:
        V_H in hartree on the grid.
    """
    r, h = grid.r, grid.h
    # Charge inside r_min: q grows at least like r^3 (s electrons) below the grid.
    inner = _cumulative_integral(charge, h) + charge[0] / 3.0
    outer_integrand = charge / r
    outer = _cumulative_integral(outer_integrand[::-1], h)[::-1]
    return inner / r + outer


def integrate(grid: LogGrid, f: NDArray[np.float64]) -> float:
    """Integral of ``f`` dx over the grid for an integrand vanishing at both ends.

    Args:
        grid: The logarithmic grid.
        f: Samples of the integrand per unit x (e.g. charge q times a potential).
    """
    return float(np.sum(f) * grid.h)
