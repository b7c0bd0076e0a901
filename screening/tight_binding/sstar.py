"""The sp3s* model: one excited s* orbital added on each atom (10 x 10 H(k)).

The s* orbital (P. Vogl, H. P. Hjalmarson and J. D. Dow, J. Phys. Chem. Solids 44, 365 (1983),
"VHD") stands in for the higher atomic states (excited s, d) that push the conduction band at
X down. It couples only to the p orbitals of the nearest neighbours, through a V_s*p_sigma that
enters H exactly like V_sp_sigma; there is no s*-s or s*-s* coupling. At Gamma it couples to
nothing (gx = gy = gz = 0), so the Gamma levels are those of the sp3 part.

Basis order: s_a, px_a, py_a, pz_a, s_c, px_c, py_c, pz_c, s*_a, s*_c. The extra elements are
H[s*_a, p_c(x, y, z)] = V_s*p g(x, y, z) and H[p_a(x, y, z), s*_c] = -V_s*p g(x, y, z), with
V_s*p = V_s*p_sigma / sqrt(3) (the s-p pattern of the package docstring).

The universal rule (ours, with constants read off one published crystal)
-------------------------------------------------------------------------
VHD fit their matrix elements per compound. To estimate any pair of elements we need a rule, so
every coupling and the s* level scale as hbar^2/(m d^2), Harrison's universal scaling:

* V_ll'm = eta_ll'm hbar^2/(m d^2) for ss_sigma, sp_sigma, pp_sigma, pp_pi and s*p_sigma;
* eps_s*(atom) = eps_p(atom) + kappa_s* hbar^2/(m d^2): the s* level sits above the atom's own p
  term value by an energy that scales like a free-electron energy at the zone scale;
* eps_s and eps_p are the caller's atomic term values (the engine's LDA levels).

The six constants (:data:`SSTAR_SI_VHD`) are VHD's published silicon matrix elements (from
memory: E_s = -4.2000, E_p = 1.7150, E_s* = 6.6850, V(s,s) = -8.3000, V(x,x) = 1.7150,
V(x,y) = 4.5750, V(sa,pc) = 5.7292, V(s*a,pc) = 5.3749 eV, in their normalisation
V(s,s) = 4 V_ss_sigma, V(x,x) = (4/3)(V_pp_sigma + 2 V_pp_pi), V(x,y) = (4/3)(V_pp_sigma -
V_pp_pi), V(s,p) = (4/sqrt 3) V_sp_sigma), divided by hbar^2/(m d^2) at the silicon bond
d = 2.3517 angstrom, and kappa_s* = (E_s* - E_p) / (hbar^2/(m d^2)). So the constants are fitted
to ONE crystal, silicon, and by VHD, not by us; Si's own valley order is therefore not an
independent check. Nothing was tuned to any other compound. VHD also give chemical-trend rules
for the diagonal energies (differences of atomic term values scaled by beta_s and beta_p, from
memory); we do not use them: the term values enter unscaled, as in the sp3 model.

A variant (``neighbour_reference=True``, :data:`SSTAR_SI_VHD_NEIGHBOUR`) places each s* above the
p level of the bond partner it couples to, so that the s*-p energy denominator across each bond
is the universal quantity (the two rules coincide for elements). It was tried after the
default rule was seen to put the X valley of the polar compounds too low; VHD's own GaAs
diagonal energies (from memory: E(s*,a) - E(p,c) = 4.92 eV, E(s*,c) - E(p,a) = 5.70 eV, against
4.97 eV in Si) are closer to it. It raises the III-V X valleys by 0.4-0.7 eV but changes no
valley order of the five checked crystals; it is offered, not the default.

Known limits: the Gamma conduction level is the sp3 model's s-antibonding state, which the
s* does not touch; with unscaled LDA term values it lies too high for Ge and the Ga, In
compounds (GaAs and Ge get L below Gamma wrong way round; see the tests).
"""

from __future__ import annotations

from dataclasses import dataclass, replace
from typing import Final

import numpy as np
from numpy.typing import ArrayLike, NDArray

from screening.constants import HBAR2_OVER_M_EV_ANGSTROM2
from screening.harrison import UniversalEta
from screening.tight_binding.hamiltonian import (
    BLOCK_ENTRIES,
    DEFAULT_CHUNK,
    TightBindingParameters,
    build_matrices,
    couplings,
    eigenvalues_in_batches,
    phase_sums,
)

N_BANDS_SSTAR: int = 10
"""Bands per k-point of the sp3s* model: s, three p and s* on each of two atoms."""

_SI_BOND_ANGSTROM: Final[float] = 5.431 * np.sqrt(3.0) / 4.0
"""Si nearest-neighbour distance from a = 5.431 angstrom (Madelung 2004, from memory)."""

_SI_SCALE_EV: Final[float] = HBAR2_OVER_M_EV_ANGSTROM2 / _SI_BOND_ANGSTROM**2


@dataclass(frozen=True)
class SStarModel:
    """Universal constants of the sp3s* model (all dimensionless, energies in hbar^2/(m d^2)).

    Attributes:
        eta: sp3 couplings eta_ss_sigma, eta_sp_sigma, eta_pp_sigma, eta_pp_pi.
        eta_sstar_p_sigma: eta of V_s*p_sigma.
        kappa_sstar: s* level above the reference p term value, in units of hbar^2/(m d^2).
        source: Where the constants come from.
        neighbour_reference: False (default): each atom's s* sits above its own p level.
            True: above the p level of the other atom of the bond, the p level it couples to
            (a variant; see the module docstring).
    """

    eta: UniversalEta
    eta_sstar_p_sigma: float
    kappa_sstar: float
    source: str
    neighbour_reference: bool = False


def _from_vhd_si(v_ss: float, v_xx: float, v_xy: float, v_sp: float, v_sstar_p: float,
                 e_p: float, e_sstar: float) -> SStarModel:
    """Turn VHD's silicon matrix elements (their normalisation, eV) into universal constants."""
    pp_pi = (3.0 / 4.0) * (v_xx - v_xy) / 3.0
    pp_sigma = (3.0 / 4.0) * v_xy + pp_pi
    eta = UniversalEta(
        ss_sigma=v_ss / 4.0 / _SI_SCALE_EV,
        sp_sigma=v_sp * np.sqrt(3.0) / 4.0 / _SI_SCALE_EV,
        pp_sigma=pp_sigma / _SI_SCALE_EV,
        pp_pi=pp_pi / _SI_SCALE_EV,
    )
    return SStarModel(
        eta=eta,
        eta_sstar_p_sigma=v_sstar_p * np.sqrt(3.0) / 4.0 / _SI_SCALE_EV,
        kappa_sstar=(e_sstar - e_p) / _SI_SCALE_EV,
        source=(
            "P. Vogl, H. P. Hjalmarson and J. D. Dow, J. Phys. Chem. Solids 44, 365 (1983), "
            "silicon matrix elements (from memory), scaled as d^-2 (W. A. Harrison)"
        ),
    )


SSTAR_SI_VHD: Final[SStarModel] = _from_vhd_si(
    v_ss=-8.3000, v_xx=1.7150, v_xy=4.5750, v_sp=5.7292, v_sstar_p=5.3749,
    e_p=1.7150, e_sstar=6.6850,
)
"""The default constants: eta_ss = -1.506, eta_sp = 1.801, eta_pp_sigma = 1.971,
eta_pp_pi = -0.519, eta_s*p = 1.689, kappa_s* = 3.607 (VHD silicon, see the module docstring)."""


SSTAR_SI_VHD_NEIGHBOUR: Final[SStarModel] = replace(SSTAR_SI_VHD, neighbour_reference=True)
"""The same constants, each s* above the bond partner's p level."""


def sstar_levels_eV(
    params: TightBindingParameters, model: SStarModel = SSTAR_SI_VHD
) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
    """Return the s* on-site energies (anion, cation) per compound, eV."""
    offset = model.kappa_sstar * HBAR2_OVER_M_EV_ANGSTROM2 / params.bond_length_angstrom**2
    if model.neighbour_reference:
        return params.eps_p_cation_eV + offset, params.eps_p_anion_eV + offset
    return params.eps_p_anion_eV + offset, params.eps_p_cation_eV + offset


# s*_a (8) - p_c (5, 6, 7) and p_a (1, 2, 3) - s*_c (9); coupling column 4 = V_s*p
SSTAR_ENTRIES: tuple[tuple[int, int, int, int, float], ...] = BLOCK_ENTRIES + (
    (8, 5, 4, 1, 1.0),
    (8, 6, 4, 2, 1.0),
    (8, 7, 4, 3, 1.0),
    (1, 9, 4, 1, -1.0),
    (2, 9, 4, 2, -1.0),
    (3, 9, 4, 3, -1.0),
)
"""Non-zero anion-cation elements of the 10 x 10 H: the sp3 block plus the s*-p couplings."""


def _onsite_and_table(
    params: TightBindingParameters, model: SStarModel
) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
    c = couplings(params, model.eta)
    v_sstar = (
        model.eta_sstar_p_sigma * HBAR2_OVER_M_EV_ANGSTROM2 / params.bond_length_angstrom**2
        / np.sqrt(3.0)
    )
    table = np.stack([c.v_ss_eV, c.v_s_eV, c.v_xx_eV, c.v_xy_eV, v_sstar], axis=-1)
    ea_s, ea_p = params.eps_s_anion_eV, params.eps_p_anion_eV
    ec_s, ec_p = params.eps_s_cation_eV, params.eps_p_cation_eV
    sstar_a, sstar_c = sstar_levels_eV(params, model)
    onsite = np.stack([ea_s, ea_p, ea_p, ea_p, ec_s, ec_p, ec_p, ec_p, sstar_a, sstar_c], axis=-1)
    return onsite, table


def hamiltonian_sstar(
    k: ArrayLike, params: TightBindingParameters, model: SStarModel = SSTAR_SI_VHD
) -> NDArray[np.complex128]:
    """Build the full Hermitian 10 x 10 Hamiltonians for every compound at every k-point.

    Not chunked (1.6 kB per compound and k-point); use :func:`band_energies_sstar` for large
    samples.

    Args:
        k: Wave vectors (nk, 3) in units of 2 pi / a.
        params: Term values and bond lengths of ncompound compounds.
        model: Universal constants (default: :data:`SSTAR_SI_VHD`).

    Returns:
        Complex array (ncompound, nk, 10, 10), eV, basis order s_a, p_a (x, y, z), s_c,
        p_c (x, y, z), s*_a, s*_c.
    """
    onsite, table = _onsite_and_table(params, model)
    return build_matrices(phase_sums(k), onsite, table, SSTAR_ENTRIES, upper=True)


def band_energies_sstar(
    k: ArrayLike,
    params: TightBindingParameters,
    model: SStarModel = SSTAR_SI_VHD,
    *,
    chunk: int = DEFAULT_CHUNK,
) -> NDArray[np.float64]:
    """Return the ten sp3s* band energies, sorted ascending, per compound and k-point.

    Built and diagonalised in batches of at most ``chunk`` matrices, so memory stays bounded.

    Args:
        k: Wave vectors (nk, 3) in units of 2 pi / a.
        params: Term values and bond lengths of ncompound compounds.
        model: Universal constants (default: :data:`SSTAR_SI_VHD`).
        chunk: Largest number of matrices per batch (>= 1).

    Returns:
        Float array (ncompound, nk, 10), eV; bands 0-3 are filled.

    Raises:
        BondgapInputError: If ``chunk`` < 1 or the k-points are malformed.
    """
    onsite, table = _onsite_and_table(params, model)
    return eigenvalues_in_batches(k, onsite, table, SSTAR_ENTRIES, chunk)
