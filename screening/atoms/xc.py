"""Local-density exchange-correlation of the spin-unpolarised electron gas, in hartree.

Exchange is Slater's (Dirac's) exchange of the uniform gas; correlation is the Vosko, Wilk and
Nusair fit "VWN5" to the Ceperley-Alder energies (S. H. Vosko, L. Wilk and M. Nusair,
Can. J. Phys. 58, 1200 (1980), formula (4.4) with the paramagnetic parameters). This is the
functional of the NIST atomic reference data (NIST SRD 141).
"""

from __future__ import annotations

import numpy as np
from numpy.typing import NDArray

_VWN5_A: float = 0.0310907
"""VWN5 paramagnetic A = 0.0621814 / 2 hartree; x0, b, c below are dimensionless."""
_VWN5_X0: float = -0.10498
_VWN5_B: float = 3.72744
_VWN5_C: float = 12.9352

DENSITY_FLOOR: float = 1e-30
"""Densities below this (electrons per bohr^3) are treated as vacuum: no exchange-correlation."""


def lda_xc(density: NDArray[np.float64]) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
    """Slater exchange plus VWN5 correlation for a spin-unpolarised density.

    Args:
        density: Electron density n in electrons per bohr^3 (any shape, n >= 0).

    Returns:
        (eps_xc, v_xc): the exchange-correlation energy per electron and the potential
        d(n eps_xc)/dn, both in hartree, same shape as ``density``; zero where
        ``density <= DENSITY_FLOOR``.
    """
    n = np.asarray(density, dtype=np.float64)
    present = n > DENSITY_FLOOR
    n_safe = np.where(present, n, 1.0)

    # Exchange: eps_x = -(3/4) (3 n / pi)^(1/3), v_x = (4/3) eps_x.
    kf_term = np.cbrt(3.0 * n_safe / np.pi)
    eps_x = -0.75 * kf_term
    v_x = -kf_term

    # VWN5 correlation in x = sqrt(r_s), r_s = (3 / (4 pi n))^(1/3).
    a, x0, b, c = _VWN5_A, _VWN5_X0, _VWN5_B, _VWN5_C
    x = np.sqrt(np.cbrt(3.0 / (4.0 * np.pi * n_safe)))
    big_x = x * x + b * x + c
    big_x0 = x0 * x0 + b * x0 + c
    q = np.sqrt(4.0 * c - b * b)
    two_x_b = 2.0 * x + b
    atan_term = np.arctan(q / two_x_b)
    eps_c = a * (
        np.log(x * x / big_x)
        + 2.0 * b / q * atan_term
        - b * x0 / big_x0 * (np.log((x - x0) ** 2 / big_x) + 2.0 * (b + 2.0 * x0) / q * atan_term)
    )
    denom = two_x_b * two_x_b + q * q
    deps_dx = a * (
        2.0 / x
        - two_x_b / big_x
        - 4.0 * b / denom
        - b * x0 / big_x0 * (2.0 / (x - x0) - two_x_b / big_x - 4.0 * (b + 2.0 * x0) / denom)
    )
    # v_c = eps_c - (r_s / 3) d eps_c / d r_s = eps_c - (x / 6) d eps_c / dx.
    v_c = eps_c - x / 6.0 * deps_dx

    eps_xc = np.where(present, eps_x + eps_c, 0.0)
    v_xc = np.where(present, v_x + v_c, 0.0)
    return eps_xc, v_xc
