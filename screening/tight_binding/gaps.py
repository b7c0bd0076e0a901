"""Gaps of the sp3 model: closed forms at Gamma, and gaps over a k sample per compound."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from screening.errors import BondgapInputError
from screening.tight_binding.brillouin import SPECIAL_POINTS_2PI_OVER_A, check_k, high_symmetry_path
from screening.tight_binding.hamiltonian import (
    DEFAULT_CHUNK,
    ETA_HARRISON_1981,
    N_VALENCE_BANDS,
    HarrisonEta,
    TightBindingParameters,
    band_energies,
    couplings,
)


@dataclass(frozen=True, eq=False)
class GammaLevels:
    """Closed-form levels at Gamma, one entry per compound (eV).

    At Gamma (g0 = 4, gx = gy = gz = 0) the s orbitals and each p component pair off:
    Gamma_1: (eps_s_a + eps_s_c)/2 -/+ sqrt(((eps_s_c - eps_s_a)/2)^2 + (4 Vss)^2);
    Gamma_15 (three-fold): (eps_p_a + eps_p_c)/2 -/+ sqrt(((eps_p_c - eps_p_a)/2)^2 + (4 Vxx)^2).

    Attributes:
        s_bonding_eV: Lower Gamma_1 level.
        s_antibonding_eV: Upper Gamma_1 level.
        p_bonding_eV: Lower Gamma_15 level (three-fold).
        p_antibonding_eV: Upper Gamma_15 level (three-fold).
        valence_top_eV: Fourth-lowest of the eight levels (the top filled level at Gamma).
        conduction_bottom_eV: Fifth-lowest level.
        gap_eV: conduction_bottom_eV - valence_top_eV (0 if the levels cross).
    """

    s_bonding_eV: NDArray[np.float64]
    s_antibonding_eV: NDArray[np.float64]
    p_bonding_eV: NDArray[np.float64]
    p_antibonding_eV: NDArray[np.float64]
    valence_top_eV: NDArray[np.float64]
    conduction_bottom_eV: NDArray[np.float64]
    gap_eV: NDArray[np.float64]


def gamma_closed_form(
    params: TightBindingParameters, eta: HarrisonEta = ETA_HARRISON_1981
) -> GammaLevels:
    """Return the two-level closed-form eigenvalues at Gamma for every compound.

    Args:
        params: Term values and bond lengths.
        eta: Universal coefficients (default: Harrison 1981).

    Returns:
        The Gamma_1 and Gamma_15 levels and the Gamma gap, each of shape (ncompound,).
    """
    c = couplings(params, eta)
    s_mid = 0.5 * (params.eps_s_anion_eV + params.eps_s_cation_eV)
    s_half = np.hypot(0.5 * (params.eps_s_cation_eV - params.eps_s_anion_eV), 4.0 * c.v_ss_eV)
    p_mid = 0.5 * (params.eps_p_anion_eV + params.eps_p_cation_eV)
    p_half = np.hypot(0.5 * (params.eps_p_cation_eV - params.eps_p_anion_eV), 4.0 * c.v_xx_eV)
    sb, sa, pb, pa = s_mid - s_half, s_mid + s_half, p_mid - p_half, p_mid + p_half
    levels = np.sort(np.stack([sb, sa, pb, pb, pb, pa, pa, pa], axis=-1), axis=-1)
    top = levels[:, N_VALENCE_BANDS - 1]
    bottom = levels[:, N_VALENCE_BANDS]
    return GammaLevels(
        s_bonding_eV=sb,
        s_antibonding_eV=sa,
        p_bonding_eV=pb,
        p_antibonding_eV=pa,
        valence_top_eV=top,
        conduction_bottom_eV=bottom,
        gap_eV=bottom - top,
    )


@dataclass(frozen=True, eq=False)
class BandGaps:
    """Gaps of the sp3 model, one entry per compound (energies in eV).

    Attributes:
        gamma_gap_eV: Direct gap at Gamma: lowest conduction minus highest valence level there.
        x_gap_eV: Direct gap at X.
        l_gap_eV: Direct gap at L.
        x_valley_eV: Lowest conduction level at X minus the valence top at Gamma (the
            convention of tabulated X-valley gaps, e.g. Vurgaftman et al. 2001).
        l_valley_eV: Lowest conduction level at L minus the valence top at Gamma.
        valence_top_eV: Highest valence level over the k sample (the VBM).
        conduction_bottom_eV: Lowest conduction level over the k sample (the CBM).
        min_gap_eV: conduction_bottom_eV - valence_top_eV; negative if the bands overlap
            (a semimetal in this model).
        direct: True where both the CBM and the VBM are at Gamma (within 1e-9 eV).
        cbm_k_2pi_over_a: k-point of the CBM in the sample, shape (ncompound, 3), 2 pi / a.
        n_k_sampled: Number of k-points in the sample.
    """

    gamma_gap_eV: NDArray[np.float64]
    x_gap_eV: NDArray[np.float64]
    l_gap_eV: NDArray[np.float64]
    x_valley_eV: NDArray[np.float64]
    l_valley_eV: NDArray[np.float64]
    valence_top_eV: NDArray[np.float64]
    conduction_bottom_eV: NDArray[np.float64]
    min_gap_eV: NDArray[np.float64]
    direct: NDArray[np.bool_]
    cbm_k_2pi_over_a: NDArray[np.float64]
    n_k_sampled: int


DIRECT_TOLERANCE_EV: float = 1e-9
"""Energy tolerance for placing the CBM or VBM at Gamma."""


def gaps(
    params: TightBindingParameters,
    eta: HarrisonEta = ETA_HARRISON_1981,
    *,
    n_path: int = 400,
    extra_k: ArrayLike | None = None,
    chunk: int = DEFAULT_CHUNK,
) -> BandGaps:
    """Return the Gamma, X and L gaps and the minimum gap over a k sample, per compound.

    The sample is Gamma, X and L, the ``n_path`` points of :func:`high_symmetry_path`, and
    ``extra_k`` if given. The minimum gap is only as good as the sample: a CBM off the path
    and off ``extra_k`` is missed. Compounds are handled in blocks, so memory stays bounded;
    the cost is about 5 us per compound per k-point (0.2 s for 100 compounds with the
    default path). For large alloy grids use :func:`gamma_closed_form`, which costs nothing.

    Args:
        params: Term values and bond lengths of ncompound compounds.
        eta: Universal coefficients (default: Harrison 1981).
        n_path: Points along L-Gamma-X-W-K-Gamma (>= 6).
        extra_k: Further k-points (nk, 3) in units of 2 pi / a.
        chunk: Largest number of matrices per diagonalisation batch.

    Returns:
        A :class:`BandGaps` with arrays of shape (ncompound,).
    """
    special = np.array([SPECIAL_POINTS_2PI_OVER_A[name] for name in ("Γ", "X", "L")])
    path_k, _, _ = high_symmetry_path(n_path)
    parts = [special, path_k]
    if extra_k is not None:
        parts.append(check_k(extra_k))
    k = np.concatenate(parts)
    nc, nk = params.n_compounds, k.shape[0]
    valence = np.empty((nc, nk))
    conduction = np.empty((nc, nk))
    block = max(1, (4 * chunk) // nk)
    for c0 in range(0, nc, block):
        part = slice(c0, c0 + block)
        e = band_energies(k, params.subset(part), eta, chunk=chunk)
        valence[part] = e[:, :, N_VALENCE_BANDS - 1]
        conduction[part] = e[:, :, N_VALENCE_BANDS]
    vbm = valence.max(axis=1)
    cbm_index = conduction.argmin(axis=1)
    cbm = conduction[np.arange(nc), cbm_index]
    cbm_at_gamma = conduction[:, 0] - cbm <= DIRECT_TOLERANCE_EV
    vbm_at_gamma = vbm - valence[:, 0] <= DIRECT_TOLERANCE_EV
    cbm_k = np.where(cbm_at_gamma[:, None], special[0], k[cbm_index])
    return BandGaps(
        gamma_gap_eV=conduction[:, 0] - valence[:, 0],
        x_gap_eV=conduction[:, 1] - valence[:, 1],
        l_gap_eV=conduction[:, 2] - valence[:, 2],
        x_valley_eV=conduction[:, 1] - valence[:, 0],
        l_valley_eV=conduction[:, 2] - valence[:, 0],
        valence_top_eV=vbm,
        conduction_bottom_eV=cbm,
        min_gap_eV=cbm - vbm,
        direct=cbm_at_gamma & vbm_at_gamma,
        cbm_k_2pi_over_a=cbm_k,
        n_k_sampled=int(k.shape[0]),
    )


def parameters_from_elements(
    cations: list[str] | tuple[str, ...],
    anions: list[str] | tuple[str, ...],
    bond_length_angstrom: ArrayLike,
    *,
    relativistic: bool = True,
) -> TightBindingParameters:
    """Build parameters from element symbols with the engine's atomic term values.

    The term values are scalar-relativistic (scaled ZORA, `screening.atoms`) by default, the
    levels the band-gap estimator uses; ``relativistic=False`` gives the non-relativistic ones.

    Args:
        cations: Cation symbols, one per compound (for an element, the element itself).
        anions: Anion symbols, same length.
        bond_length_angstrom: Nearest-neighbour distances (angstrom), scalar or per compound.
        relativistic: Scalar-relativistic term values (default) or non-relativistic ones.

    Returns:
        The parameters, with term values from ``screening.atoms.term_values``.

    Raises:
        BondgapInputError: If the two symbol lists differ in length.
    """
    if len(cations) != len(anions):
        raise BondgapInputError(
            f"need one anion per cation, got {len(cations)} cations and {len(anions)} anions"
        )
    from screening.atoms import term_values  # lazy: the atom solver is heavier

    eps_s_c, eps_p_c = term_values(list(cations), relativistic=relativistic)
    eps_s_a, eps_p_a = term_values(list(anions), relativistic=relativistic)
    return TightBindingParameters(
        eps_s_anion_eV=eps_s_a,
        eps_p_anion_eV=eps_p_a,
        eps_s_cation_eV=eps_s_c,
        eps_p_cation_eV=eps_p_c,
        bond_length_angstrom=bond_length_angstrom,
    )
