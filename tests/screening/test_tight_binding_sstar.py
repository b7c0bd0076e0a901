"""Checks of the sp3s* model, the valley sampler and the spin-orbit weighting.

Model properties (Hermiticity, symmetry, limits) use explicit term values; the valley orders
use the engine's own LDA term values (`screening.atoms`) and measured valley energies, each with
its source.
"""

from __future__ import annotations

import itertools

import numpy as np
import pytest

from screening.constants import HBAR2_OVER_M_EV_ANGSTROM2
from screening.errors import BondgapInputError
from screening.tight_binding import (
    N_VALENCE_BANDS,
    TightBindingParameters,
    band_energies,
    gaps,
    hamiltonian,
    parameters_from_elements,
)
from screening.tight_binding.spin_orbit import (
    gamma_gap_with_spin_orbit_eV,
    valence_spin_orbit_eV,
    valence_top_p_weights,
)
from screening.tight_binding.sstar import (
    SSTAR_SI_VHD,
    SSTAR_SI_VHD_NEIGHBOUR,
    SStarModel,
    band_energies_sstar,
    hamiltonian_sstar,
    sstar_levels_eV,
)
from screening.tight_binding.valleys import valleys, valleys_from_elements

# NIST LDA levels (Kotochigova et al., Phys. Rev. A 55, 191 (1997)) via pymatgen, as in
# test_tight_binding.py; d from a = 5.6533 / 6.4794 angstrom (VMR 2001, from memory); the last
# row is synthetic (no source), strongly polar.
PARAMS = TightBindingParameters(
    eps_s_anion_eV=[-14.250, -12.126, -25.0],
    eps_p_anion_eV=[-5.374, -5.051, -12.0],
    eps_s_cation_eV=[-8.926, -7.905, -6.0],
    eps_p_cation_eV=[-2.766, -2.770, -1.0],
    bond_length_angstrom=[2.4480, 2.8057, 2.0],
)
RNG_K = np.random.default_rng(11).uniform(-1.0, 1.0, size=(6, 3))
DECOUPLED = SStarModel(SSTAR_SI_VHD.eta, 0.0, SSTAR_SI_VHD.kappa_sstar, "test: s* decoupled")


def test_sstar_hamiltonian_is_hermitian_and_extends_the_sp3_block() -> None:
    h = hamiltonian_sstar(RNG_K, PARAMS)
    np.testing.assert_allclose(h, np.conj(np.swapaxes(h, -1, -2)), rtol=0, atol=0)
    # the upper-left 8 x 8 block is the sp3 Hamiltonian with the model's sp3 couplings
    np.testing.assert_allclose(
        h[..., :8, :8], hamiltonian(RNG_K, PARAMS, SSTAR_SI_VHD.eta), rtol=0, atol=0
    )


def test_decoupled_sstar_adds_its_two_levels_to_the_sp3_bands() -> None:
    e10 = band_energies_sstar(RNG_K, PARAMS, DECOUPLED)
    e8 = band_energies(RNG_K, PARAMS, SSTAR_SI_VHD.eta)
    sa, sc = sstar_levels_eV(PARAMS, DECOUPLED)
    levels = np.broadcast_to(np.stack([sa, sc], -1)[:, None, :], e8.shape[:2] + (2,))
    expected = np.sort(np.concatenate([e8, levels], axis=-1), axis=-1)
    np.testing.assert_allclose(e10, expected, rtol=0, atol=1e-11)


def test_gamma_levels_do_not_feel_the_sstar() -> None:
    # gx = gy = gz = 0 at Gamma: the s* couples to nothing there
    e10 = band_energies_sstar(np.zeros((1, 3)), PARAMS)[:, 0]
    e8 = band_energies(np.zeros((1, 3)), PARAMS, SSTAR_SI_VHD.eta)[:, 0]
    np.testing.assert_allclose(e10[:, :N_VALENCE_BANDS], e8[:, :N_VALENCE_BANDS], atol=1e-11)


def test_sstar_bands_have_cubic_symmetry() -> None:
    ops = []
    for perm in itertools.permutations(range(3)):
        for signs in itertools.product((1.0, -1.0), repeat=3):
            m = np.zeros((3, 3))
            m[range(3), perm] = signs
            ops.append(m)
    images = np.concatenate([RNG_K @ m.T for m in ops])
    e = band_energies_sstar(images, PARAMS).reshape(3, len(ops), len(RNG_K), 10)
    np.testing.assert_allclose(e, np.broadcast_to(e[:, :1], e.shape), rtol=0, atol=1e-11)


@pytest.mark.parametrize("chunk", [1, 5, 4096])
def test_sstar_batches_do_not_change_results(chunk: int) -> None:
    np.testing.assert_allclose(
        band_energies_sstar(RNG_K, PARAMS, chunk=chunk), band_energies_sstar(RNG_K, PARAMS),
        rtol=0, atol=1e-12,
    )
    with pytest.raises(BondgapInputError):
        band_energies_sstar(RNG_K, PARAMS, chunk=0)


def test_constants_give_back_the_silicon_matrix_elements() -> None:
    # VHD 1983 silicon, in their normalisation (from memory): V(s,s) = -8.3000,
    # V(x,x) = 1.7150, V(x,y) = 4.5750, V(sa,pc) = 5.7292, V(s*a,pc) = 5.3749,
    # E_s* - E_p = 6.6850 - 1.7150 eV; at d = 5.431 sqrt(3)/4 angstrom
    scale = HBAR2_OVER_M_EV_ANGSTROM2 / (5.431 * np.sqrt(3.0) / 4.0) ** 2
    eta = SSTAR_SI_VHD.eta
    assert 4 * eta.ss_sigma * scale == pytest.approx(-8.3000, abs=1e-9)
    assert 4 / 3 * (eta.pp_sigma + 2 * eta.pp_pi) * scale == pytest.approx(1.7150, abs=1e-9)
    assert 4 / 3 * (eta.pp_sigma - eta.pp_pi) * scale == pytest.approx(4.5750, abs=1e-9)
    assert 4 / np.sqrt(3) * eta.sp_sigma * scale == pytest.approx(5.7292, abs=1e-9)
    assert 4 / np.sqrt(3) * SSTAR_SI_VHD.eta_sstar_p_sigma * scale == pytest.approx(5.3749)
    assert SSTAR_SI_VHD.kappa_sstar * scale == pytest.approx(6.6850 - 1.7150, abs=1e-9)


def test_sp3_valleys_agree_with_the_gap_sampler() -> None:
    v = valleys(PARAMS, None)
    g = gaps(PARAMS, n_path=6)
    np.testing.assert_allclose(v.gamma_eV, g.gamma_gap_eV, atol=1e-12)
    np.testing.assert_allclose(v.x_point_eV, g.x_valley_eV, atol=1e-12)
    np.testing.assert_allclose(v.l_eV, g.l_valley_eV, atol=1e-12)
    assert not v.with_sstar


def test_delta_minimum_matches_a_dense_line() -> None:
    # the parabola through the lowest sampled point and its neighbours finds the Delta-line
    # minimum of a dense 801-point line to within 2 meV (Si, a polar compound, a synthetic one)
    params = parameters_from_elements(["Si", "Ga"], ["Si", "P"], [2.3517, 2.3601])
    v = valleys(params)
    line = np.column_stack([np.linspace(0.5, 1.0, 801), np.zeros((801, 2))])
    e = band_energies_sstar(np.concatenate([np.zeros((1, 3)), line]), params)
    dense = (e[:, 1:, N_VALENCE_BANDS] - e[:, :1, N_VALENCE_BANDS - 1]).min(axis=1)
    np.testing.assert_allclose(v.x_eV, dense, atol=2e-3)
    assert np.all(v.x_eV <= v.x_point_eV + 1e-12)


# (cation, anion, a in angstrom, measured valleys (Gamma, X, L) above the valence top in eV,
#  lowest-to-highest order, source)
VALLEY_TARGETS = [
    ("Si", "Si", 5.431, (3.4, 1.17, 2.0), "XLΓ",
     "Madelung 2004 (from memory): indirect gap 1.17 eV at 0 K with the minimum on Delta near "
     "X, L about 2.0, Gamma_15 about 3.4 eV"),
    ("Ge", "Ge", 5.658, (0.89, 1.0, 0.744), "LΓX",
     "Madelung 2004, 0 K (from memory): L 0.744, Gamma 0.898, X about 1.0 (uncertain)"),
    ("Ga", "P", 5.4505, (2.89, 2.35, 2.6), "XLΓ", "VMR 2001, 0 K (from memory)"),
    ("Al", "As", 5.6611, (3.10, 2.24, 2.46), "XLΓ", "VMR 2001, 0 K (from memory)"),
    ("Ga", "As", 5.6533, (1.519, 1.981, 1.815), "ΓLX", "VMR 2001, 0 K (from memory)"),
]
# Known failures of the pure universal rule, measured: the Gamma conduction level (the sp3
# s-antibonding state, untouched by the s*) lies too high with unscaled LDA term values, even
# with the scalar-relativistic ones (non-relativistic: Ge Gamma 1.70, GaAs Gamma 2.64 eV).
KNOWN_FAILURES = {
    "Ge": "model X 0.69 < L 0.88 < Gamma 1.33 eV: Gamma about 0.4 eV too high, X 0.3 too low",
    "GaAs": "model X 0.84 < L 1.45 < Gamma 2.30 eV: Gamma about 0.8 eV too high, X 1.1 too low",
}


def _order(gamma: float, x: float, l_valley: float) -> str:
    values = {"Γ": gamma, "X": x, "L": l_valley}
    return "".join(sorted(values, key=values.__getitem__))


def _name(target: tuple) -> str:
    return target[0] if target[0] == target[1] else target[0] + target[1]


@pytest.mark.parametrize(
    "target",
    [
        pytest.param(t, marks=pytest.mark.xfail(strict=True, reason=KNOWN_FAILURES[_name(t)]))
        if _name(t) in KNOWN_FAILURES else t
        for t in VALLEY_TARGETS
    ],
    ids=[_name(t) for t in VALLEY_TARGETS],
)
def test_valley_order_with_sstar(target: tuple) -> None:
    cation, anion, a, measured, order, _source = target
    assert _order(*measured) == order  # the table itself is consistent
    v = valleys_from_elements([cation], [anion], a * np.sqrt(3.0) / 4.0)
    assert v.with_sstar
    assert _order(v.gamma_eV[0], v.x_eV[0], v.l_eV[0]) == order


def test_neighbour_reference_variant_keeps_the_orders_and_raises_polar_x_valleys() -> None:
    # the two s* rules coincide for elements; for III-V the variant's s* lies further above
    # the p level it couples to, so the X valley rises (measured here, see the sstar docstring)
    cations, anions = ["Si", "Ga", "Al", "Ga"], ["Si", "P", "As", "As"]
    d = np.array([5.431, 5.4505, 5.6611, 5.6533]) * np.sqrt(3.0) / 4.0
    own = valleys_from_elements(cations, anions, d)
    other = valleys_from_elements(cations, anions, d, SSTAR_SI_VHD_NEIGHBOUR)
    assert other.x_eV[0] == pytest.approx(own.x_eV[0], abs=1e-12)
    assert np.all(other.x_eV[1:] > own.x_eV[1:] + 0.3)
    np.testing.assert_allclose(other.gamma_eV, own.gamma_eV, atol=1e-12)


def test_sstar_moves_the_silicon_minimum_from_l_to_delta() -> None:
    # Si's conduction minimum is on Delta at about 0.85 of Gamma-X (Madelung 2004, from memory);
    # the sp3 model puts it at L. Silicon is the crystal the constants come from (VHD's fit).
    without = valleys_from_elements(["Si"], ["Si"], 2.3517, None)
    with_s = valleys_from_elements(["Si"], ["Si"], 2.3517)
    assert without.lowest[0] == "L"
    assert with_s.lowest[0] == "X" and with_s.kind[0] == "indirect"
    assert 0.7 < with_s.delta_min_k_2pi_over_a[0] < 0.95


# Spin-orbit ------------------------------------------------------------------------------

CM_TO_EV = 1.239841984e-4
# Ground-term 3P2 - 3P0 intervals of the free group-IV atoms, which for an np^2 term in LS
# coupling equal (3/2) zeta_p; NIST Atomic Spectra Database (from memory), cm^-1.
ATOMIC_IV = {"C": 43.40, "Si": 223.157, "Ge": 1409.961}
# Measured Delta0 of the crystals: C 0.006, Si 0.044, Ge 0.296 eV (Madelung 2004, from memory).
CRYSTAL_IV = {"C": 0.006, "Si": 0.044, "Ge": 0.296}


def test_homopolar_delta0_is_the_atomic_splitting() -> None:
    d = {"C": 1.5445, "Si": 2.3517, "Ge": 2.4500}
    params = parameters_from_elements(list(d), list(d), list(d.values()))
    atomic = np.array([ATOMIC_IV[s] for s in d]) * CM_TO_EV
    delta0 = valence_spin_orbit_eV(params, atomic, atomic)
    np.testing.assert_allclose(delta0, atomic, rtol=1e-12)
    # the crystals split 1.1-1.7 times more than the free atoms: the weighting alone
    # underestimates Delta0 of Si and Ge by about 40 % (measured here, not corrected)
    ratio = np.array([CRYSTAL_IV[s] for s in d]) / delta0
    assert np.all((ratio > 1.0) & (ratio < 1.8))


def test_p_weights_are_those_of_the_gamma15_eigenvector() -> None:
    # derived from the model: diagonalise H at Gamma and project the valence top on anion p
    h = hamiltonian(np.zeros((1, 3)), PARAMS)[:, 0]
    _, vectors = np.linalg.eigh(h)
    top = vectors[:, :, N_VALENCE_BANDS - 1]
    anion_p = np.sum(np.abs(top[:, 1:4]) ** 2, axis=1)
    w_a, w_c = valence_top_p_weights(PARAMS)
    np.testing.assert_allclose(w_a, anion_p, atol=1e-12)
    np.testing.assert_allclose(w_a + w_c, 1.0, atol=1e-15)
    assert np.all(w_a > 0.5)


def test_delta0_weights_and_gap_shift() -> None:
    w_a, w_c = valence_top_p_weights(PARAMS)
    delta0 = valence_spin_orbit_eV(PARAMS, [0.3, 0.9, 0.05], 0.1)
    np.testing.assert_allclose(delta0, w_a * np.array([0.3, 0.9, 0.05]) + w_c * 0.1)
    assert gamma_gap_with_spin_orbit_eV(1.0, 0.3) == pytest.approx(0.9)


@pytest.mark.parametrize(
    ("anion", "cation"), [(-0.1, 0.1), (np.nan, 0.1), (0.1, np.inf), ([0.1, 0.2], 0.1)]
)
def test_bad_splittings_are_rejected(anion: object, cation: object) -> None:
    with pytest.raises(BondgapInputError):
        valence_spin_orbit_eV(PARAMS, anion, cation)
