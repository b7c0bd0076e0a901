"""Spin-orbit splitting Delta0 of the valence-band top from atomic p splittings.

At Gamma the valence top Gamma_15 is, in the sp3 (and sp3s*) model, a two-level problem between
the anion and cation p orbitals of one Cartesian component: on-site energies eps_p_a, eps_p_c
and coupling 4 Vxx, Vxx = (V_pp_sigma + 2 V_pp_pi)/3 (the s* couples to nothing at Gamma). With
V3 = (eps_p_c - eps_p_a)/2 and V2 = 4 |Vxx|, the bonding (filled) state carries the weights

    w_a = (1 + alpha)/2,  w_c = (1 - alpha)/2,  alpha = V3 / sqrt(V2^2 + V3^2)

on the anion and cation p orbitals. Adding the atomic spin-orbit coupling of each p orbital as a
first-order perturbation within this state splits Gamma_15 into Gamma_8 (up by Delta0/3) and
Gamma_7 (down by 2 Delta0/3) with

    Delta0 = w_a Delta_a + w_c Delta_c,

Delta the atomic p-level splitting E(j = 3/2) - E(j = 1/2) = (3/2) zeta_p. This weighting of the
atomic splittings by the p weights of the valence-top state is the one used by D. J. Chadi,
Phys. Rev. B 16, 790 (1977) in his tight-binding treatment of spin-orbit splitting (from memory;
W. A. Harrison's Electronic Structure and the Properties of Solids (1980) weights atomic values
by the bond's anion and cation shares in the same spirit; which of the two states the formula
in exactly this form was not checked). The Gamma gap with spin-orbit is the gap without it
minus Delta0/3, since the top Gamma_8 rises by Delta0/3.
"""

from __future__ import annotations

import numpy as np
from numpy.typing import ArrayLike, NDArray

from screening.errors import BondgapInputError
from screening.harrison import UniversalEta
from screening.tight_binding.hamiltonian import (
    ETA_HARRISON_1981,
    TightBindingParameters,
    couplings,
)


def valence_top_p_weights(
    params: TightBindingParameters, eta: UniversalEta = ETA_HARRISON_1981
) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
    """Return the anion and cation p weights (w_a, w_c) of the Gamma_15 valence top.

    Args:
        params: Term values and bond lengths of ncompound compounds.
        eta: sp3 couplings (Harrison 1981 by default; pass ``SSTAR_SI_VHD.eta`` for the
            sp3s* model).

    Returns:
        (w_a, w_c), each of shape (ncompound,), w_a + w_c = 1.
    """
    v2 = 4.0 * np.abs(couplings(params, eta).v_xx_eV)
    v3 = 0.5 * (params.eps_p_cation_eV - params.eps_p_anion_eV)
    alpha = v3 / np.hypot(v2, v3)
    return 0.5 * (1.0 + alpha), 0.5 * (1.0 - alpha)


def valence_spin_orbit_eV(
    params: TightBindingParameters,
    delta_anion_eV: ArrayLike,
    delta_cation_eV: ArrayLike,
    eta: UniversalEta = ETA_HARRISON_1981,
) -> NDArray[np.float64]:
    """Return the compound's valence-band spin-orbit splitting Delta0 = w_a Delta_a + w_c Delta_c.

    Args:
        params: Term values and bond lengths of ncompound compounds.
        delta_anion_eV: Atomic p spin-orbit splitting (3/2) zeta_p of the anion, eV (>= 0),
            scalar or per compound.
        delta_cation_eV: The same for the cation.
        eta: sp3 couplings used for the p weights (see :func:`valence_top_p_weights`).

    Returns:
        Delta0 in eV, shape (ncompound,).

    Raises:
        BondgapInputError: If a splitting is negative or not finite, or the lengths differ.
    """
    delta_a = np.asarray(delta_anion_eV, dtype=np.float64)
    delta_c = np.asarray(delta_cation_eV, dtype=np.float64)
    for name, value in (("delta_anion_eV", delta_a), ("delta_cation_eV", delta_c)):
        if not np.all(np.isfinite(value)) or np.any(value < 0.0):
            raise BondgapInputError(f"{name} must be finite and >= 0 eV, got {value!r}")
    w_a, w_c = valence_top_p_weights(params, eta)
    try:
        return np.asarray(w_a * delta_a + w_c * delta_c, dtype=np.float64)
    except ValueError as exc:
        raise BondgapInputError(
            f"splittings must be scalars or one per compound ({params.n_compounds}), "
            f"got shapes {delta_a.shape} and {delta_c.shape}"
        ) from exc


def gamma_gap_with_spin_orbit_eV(
    gamma_gap_eV: ArrayLike, delta0_eV: ArrayLike
) -> NDArray[np.float64]:
    """Return the Gamma gap lowered by the rise Delta0/3 of the Gamma_8 valence top, eV."""
    gap = np.asarray(gamma_gap_eV, dtype=np.float64)
    return gap - np.asarray(delta0_eV, dtype=np.float64) / 3.0
