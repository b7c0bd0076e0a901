"""Checks of the sp3 nearest-neighbour tight-binding bands (screening/tight_binding.py).

Inputs are explicit term values, each set with its source; the checks are properties of the
model (Hermiticity, symmetry, closed forms), so no measured band energies are needed.
"""

from __future__ import annotations

import itertools
import sys
import types

import numpy as np
import pytest

from screening.constants import HBAR2_OVER_M_EV_ANGSTROM2
from screening.errors import BondgapInputError
from screening.tight_binding import (
    ETA_HARRISON_1981,
    N_VALENCE_BANDS,
    SPECIAL_POINTS_2PI_OVER_A,
    TightBindingParameters,
    band_energies,
    couplings,
    gamma_closed_form,
    gaps,
    hamiltonian,
    high_symmetry_path,
    parameters_from_elements,
    phase_sums,
)

# (name, eps_s_anion, eps_p_anion, eps_s_cation, eps_p_cation, d in angstrom, source)
COMPOUNDS = [
    # Mann (1967) Hartree-Fock term values as tabulated in W. A. Harrison, Elementary
    # Electronic Structure (World Scientific, 1999), Table 1-1 (from memory); d from
    # a = 3.5668 / 5.431 angstrom (from memory).
    ("C", -19.38, -11.07, -19.38, -11.07, 1.5445, "Mann 1967 via Harrison 1999"),
    ("Si", -14.79, -7.59, -14.79, -7.59, 2.3517, "Mann 1967 via Harrison 1999"),
    # NIST LDA levels (Kotochigova et al., Phys. Rev. A 55, 191 (1997)) from pymatgen
    # Element.atomic_orbitals, hartree -> eV; d from a = 5.6533 / 6.4794 / 5.4635 angstrom.
    ("GaAs", -14.250, -5.374, -8.926, -2.766, 2.4480, "NIST LDA via pymatgen"),
    ("InSb", -12.126, -5.051, -7.905, -2.770, 2.8057, "NIST LDA via pymatgen"),
    ("AlP", -13.942, -5.608, -7.806, -2.790, 2.3658, "NIST LDA via pymatgen"),
    # strongly polar synthetic set (no source): exercises large on-site differences
    ("synthetic", -25.0, -12.0, -6.0, -1.0, 2.0, "synthetic, no source"),
]
IDS = [c[0] for c in COMPOUNDS]


def params_of(rows: list[tuple]) -> TightBindingParameters:
    cols = list(zip(*rows, strict=True))
    return TightBindingParameters(
        eps_s_anion_eV=cols[1],
        eps_p_anion_eV=cols[2],
        eps_s_cation_eV=cols[3],
        eps_p_cation_eV=cols[4],
        bond_length_angstrom=cols[5],
    )


ALL = params_of(COMPOUNDS)
RNG_K = np.random.default_rng(20240601).uniform(-1.0, 1.0, size=(7, 3))

GAMMA = np.array([SPECIAL_POINTS_2PI_OVER_A["Γ"]])
X = np.array([SPECIAL_POINTS_2PI_OVER_A["X"]])


def cubic_operations() -> list[np.ndarray]:
    """The 48 operations of O_h: axis permutations with sign changes."""
    ops = []
    for perm in itertools.permutations(range(3)):
        for signs in itertools.product((1.0, -1.0), repeat=3):
            m = np.zeros((3, 3))
            m[range(3), perm] = signs
            ops.append(m)
    return ops


def test_hamiltonian_is_hermitian() -> None:
    # property of any Hamiltonian (no source)
    h = hamiltonian(RNG_K, ALL)
    assert h.shape == (len(COMPOUNDS), len(RNG_K), 8, 8)
    np.testing.assert_array_equal(h, np.conj(np.swapaxes(h, -1, -2)))


def test_band_energies_match_full_matrix_diagonalisation() -> None:
    # band_energies fills only the lower triangle; the full matrix must give the same bands
    full = np.linalg.eigvalsh(hamiltonian(RNG_K, ALL))
    np.testing.assert_allclose(band_energies(RNG_K, ALL), full, rtol=0, atol=1e-12)


@pytest.mark.parametrize("chunk", [1, 5, 13, 10_000])
def test_chunking_does_not_change_results(chunk: int) -> None:
    reference = band_energies(RNG_K, ALL)
    np.testing.assert_allclose(band_energies(RNG_K, ALL, chunk=chunk), reference, atol=1e-12)


def test_trace_is_conserved() -> None:
    # the sum of the eigenvalues equals the trace of H at every k (linear algebra, no source)
    e = band_energies(RNG_K, ALL)
    trace = (
        ALL.eps_s_anion_eV + ALL.eps_s_cation_eV + 3 * ALL.eps_p_anion_eV + 3 * ALL.eps_p_cation_eV
    )
    np.testing.assert_allclose(
        e.sum(axis=-1), np.broadcast_to(trace[:, None], e.shape[:2]), rtol=0, atol=1e-11
    )


def test_phase_sums_at_gamma_and_x() -> None:
    # g0 = 4 at Gamma; at X = (1, 0, 0) 2pi/a: k.d_j = +-pi/2, so g0 = 0, gx = 4i (derived here)
    np.testing.assert_allclose(phase_sums(GAMMA)[0], [4, 0, 0, 0], atol=1e-15)
    np.testing.assert_allclose(phase_sums(X)[0], [0, 4j, 0, 0], atol=1e-14)


def test_couplings_follow_harrison_d_minus_two() -> None:
    # V = eta hbar^2/(m d^2), eta of Harrison, Phys. Rev. B 24, 5835 (1981)
    p = params_of([("x", -10, -5, -8, -3, 2.5, "synthetic")])
    c = couplings(p)
    unit = HBAR2_OVER_M_EV_ANGSTROM2 / 2.5**2
    assert c.v_ss_eV[0] == pytest.approx(-1.32 * unit, rel=1e-14)
    assert c.v_s_eV[0] == pytest.approx(1.42 * unit / np.sqrt(3), rel=1e-14)
    assert c.v_xx_eV[0] == pytest.approx((2.22 - 2 * 0.63) * unit / 3, rel=1e-14)
    assert c.v_xy_eV[0] == pytest.approx((2.22 + 0.63) * unit / 3, rel=1e-14)
    assert ETA_HARRISON_1981.sp_sigma == 1.42


@pytest.mark.parametrize("scale", [0.8, 1.3, 2.0])
def test_bands_scale_as_d_minus_two_with_zero_term_values(scale: float) -> None:
    # with all on-site energies zero every band is a sum of V ~ d^-2 terms (Harrison's scaling)
    base = params_of([("x", 0, 0, 0, 0, 2.4, "synthetic")])
    scaled = params_of([("x", 0, 0, 0, 0, 2.4 * scale, "synthetic")])
    np.testing.assert_allclose(
        band_energies(RNG_K, scaled) * scale**2, band_energies(RNG_K, base), rtol=0, atol=1e-12
    )


@pytest.mark.parametrize("row", COMPOUNDS, ids=IDS)
def test_gamma_eigenvalues_equal_closed_forms(row: tuple) -> None:
    # two-level closed forms at Gamma (D. J. Chadi and M. L. Cohen, Phys. Status Solidi B
    # 68, 405 (1975))
    p = params_of([row])
    numeric = band_energies(GAMMA, p)[0, 0]
    cf = gamma_closed_form(p)
    closed = np.sort(
        [cf.s_bonding_eV[0], cf.s_antibonding_eV[0]]
        + [cf.p_bonding_eV[0]] * 3
        + [cf.p_antibonding_eV[0]] * 3
    )
    np.testing.assert_allclose(numeric, closed, rtol=0, atol=1e-12)
    assert gaps(p, n_path=6).gamma_gap_eV[0] == pytest.approx(cf.gap_eV[0], abs=1e-12)


@pytest.mark.parametrize("row", COMPOUNDS, ids=IDS)
def test_gamma_15_is_threefold(row: tuple) -> None:
    # Gamma_15 (p bonding and p antibonding) are three-fold degenerate (group theory, T_d)
    p = params_of([row])
    e = band_energies(GAMMA, p)[0, 0]
    cf = gamma_closed_form(p)
    for level in (cf.p_bonding_eV[0], cf.p_antibonding_eV[0]):
        assert np.sum(np.abs(e - level) < 1e-12) == 3


def x_closed_form(p: TightBindingParameters, i: int = 0) -> np.ndarray:
    """X-point levels from the 2 x 2 blocks (s_a, px_c), (px_a, s_c), (py_a, pz_c) x 2.

    Derived here from the Slater-Koster block at g0 = gy = gz = 0, gx = 4i.
    """
    c = couplings(p)

    def pair(e1: float, e2: float, v: float) -> list[float]:
        half = np.hypot((e2 - e1) / 2, 4 * v)
        return [(e1 + e2) / 2 - half, (e1 + e2) / 2 + half]

    esa, epa = p.eps_s_anion_eV[i], p.eps_p_anion_eV[i]
    esc, epc = p.eps_s_cation_eV[i], p.eps_p_cation_eV[i]
    levels = pair(esa, epc, c.v_s_eV[i]) + pair(epa, esc, c.v_s_eV[i])
    levels += 2 * pair(epa, epc, c.v_xy_eV[i])
    return np.sort(levels)


@pytest.mark.parametrize("row", COMPOUNDS, ids=IDS)
def test_x_point_levels_and_x5_degeneracy(row: tuple) -> None:
    # X: the (py_a, pz_c) and (pz_a, py_c) blocks are equal, giving two doubly degenerate X5
    # levels (group theory for zincblende X; closed forms derived here)
    p = params_of([row])
    e = band_energies(X, p)[0, 0]
    np.testing.assert_allclose(e, x_closed_form(p), rtol=0, atol=1e-12)
    c = couplings(p)
    mid = (row[2] + row[4]) / 2
    half = np.hypot((row[4] - row[2]) / 2, 4 * c.v_xy_eV[0])
    for level in (mid - half, mid + half):
        assert np.sum(np.abs(e - level) < 1e-12) >= 2
    g = gaps(p, n_path=6)
    assert g.x_gap_eV[0] == pytest.approx(
        x_closed_form(p)[N_VALENCE_BANDS] - x_closed_form(p)[N_VALENCE_BANDS - 1], abs=1e-12
    )


@pytest.mark.parametrize("row", COMPOUNDS, ids=IDS)
def test_cubic_symmetry(row: tuple) -> None:
    # E(k) is the same at all 48 O_h images of k: T_d symmetry plus time reversal E(k) = E(-k)
    p = params_of([row])
    ops = cubic_operations()
    images = np.concatenate([RNG_K @ m.T for m in ops])
    e = band_energies(images, p)[0].reshape(len(ops), len(RNG_K), 8)
    np.testing.assert_allclose(e, np.broadcast_to(e[:1], e.shape), rtol=0, atol=1e-12)


def test_swapping_anion_and_cation_leaves_bands_unchanged() -> None:
    # swapping the sublattices is inversion, k -> -k; with time reversal E(-k) = E(k)
    swapped = TightBindingParameters(
        eps_s_anion_eV=ALL.eps_s_cation_eV,
        eps_p_anion_eV=ALL.eps_p_cation_eV,
        eps_s_cation_eV=ALL.eps_s_anion_eV,
        eps_p_cation_eV=ALL.eps_p_anion_eV,
        bond_length_angstrom=ALL.bond_length_angstrom,
    )
    np.testing.assert_allclose(
        band_energies(RNG_K, swapped), band_energies(RNG_K, ALL), rtol=0, atol=1e-12
    )


def homopolar(eps_s: float, eps_p: float, d: float) -> TightBindingParameters:
    return params_of([("homopolar", eps_s, eps_p, eps_s, eps_p, d, "")])


@pytest.mark.parametrize("row", COMPOUNDS[:2], ids=IDS[:2])
def test_homopolar_gamma_levels(row: tuple) -> None:
    # equal on-site energies (zero polar energy): Gamma levels are eps -/+ 4|V| (diamond limit)
    p = homopolar(row[1], row[2], row[5])
    c = couplings(p)
    cf = gamma_closed_form(p)
    assert cf.s_bonding_eV[0] == pytest.approx(row[1] - 4 * abs(c.v_ss_eV[0]), abs=1e-12)
    assert cf.s_antibonding_eV[0] == pytest.approx(row[1] + 4 * abs(c.v_ss_eV[0]), abs=1e-12)
    assert cf.p_bonding_eV[0] == pytest.approx(row[2] - 4 * abs(c.v_xx_eV[0]), abs=1e-12)


@pytest.mark.parametrize("row", COMPOUNDS[:2], ids=IDS[:2])
def test_homopolar_limit_pairs_all_bands_on_x_w(row: tuple) -> None:
    # diamond: every band is doubly degenerate on the square face X-W (non-symmorphic glide
    # plus time reversal; the diamond X point is doubly degenerate: C. Herring, Phys. Rev. 52,
    # 361 (1937), on the band sticking of non-symmorphic space groups)
    p = homopolar(row[1], row[2], row[5])
    t = np.linspace(0.0, 1.0, 9)[:, None]
    k_xw = np.array([1.0, 0.0, 0.0]) + t * np.array([0.0, 0.5, 0.0])
    e = band_energies(k_xw, p)[0]
    np.testing.assert_allclose(e[:, 0::2], e[:, 1::2], rtol=0, atol=1e-12)


def test_zincblende_x_splitting_closes_in_homopolar_limit() -> None:
    # the X levels pair up (X1 with X3) as the anion and cation term values meet: the largest
    # splitting within a pair shrinks to zero (derived here from the X blocks)
    splittings = []
    for delta in (2.0, 1.0, 0.5, 0.0):
        p = params_of(
            [
                (
                    "x",
                    -14.79 - delta,
                    -7.59 - delta,
                    -14.79 + delta,
                    -7.59 + delta,
                    2.35,
                    "Si values split by +-delta, synthetic",
                )
            ]
        )
        e = band_energies(X, p)[0, 0]
        splittings.append(np.max(e[1::2] - e[0::2]))
    assert splittings[-1] < 1e-12
    assert splittings[0] > splittings[1] > splittings[2] > splittings[3]


def test_polar_compound_bands_do_not_pair_on_x_w() -> None:
    # the counterpart of the homopolar check: in GaAs the X-W pairing is lifted
    t = np.linspace(0.1, 0.9, 5)[:, None]
    k_xw = np.array([1.0, 0.0, 0.0]) + t * np.array([0.0, 0.5, 0.0])
    e = band_energies(k_xw, params_of([COMPOUNDS[2]]))[0]
    assert np.max(e[:, 1::2] - e[:, 0::2]) > 0.1


def test_high_symmetry_path_corners_and_counts() -> None:
    k, dist, labels = high_symmetry_path(400)
    assert k.shape == (400, 3) and dist.shape == (400,)
    assert [name for name, _ in labels] == ["L", "Γ", "X", "W", "K", "Γ"]
    assert np.all(np.diff(dist) > 0)
    for name, at in labels:
        i = int(np.argmin(np.abs(dist - at)))
        np.testing.assert_array_equal(k[i], SPECIAL_POINTS_2PI_OVER_A[name])
    # total length: |L-G| + |G-X| + |X-W| + |W-K| + |K-G| in 2pi/a (geometry, no source)
    total = np.sqrt(3) / 2 + 1 + 0.5 + np.sqrt(2) / 4 + 3 * np.sqrt(2) / 4
    assert dist[-1] == pytest.approx(total, rel=1e-12)
    # spacing is nearly uniform along the whole path
    steps = np.diff(dist)
    assert steps.max() / steps.min() < 1.1


@pytest.mark.parametrize("n", [6, 7, 50])
def test_high_symmetry_path_small_counts(n: int) -> None:
    k, dist, labels = high_symmetry_path(n)
    assert len(k) == n and len(labels) == 6


def test_gaps_consistency_over_compounds() -> None:
    g = gaps(ALL, n_path=100)
    one_by_one = [gaps(params_of([row]), n_path=100) for row in COMPOUNDS]
    for i, single in enumerate(one_by_one):
        assert g.min_gap_eV[i] == pytest.approx(single.min_gap_eV[0], abs=1e-12)
        assert g.direct[i] == single.direct[0]
    np.testing.assert_allclose(g.gamma_gap_eV, gamma_closed_form(ALL).gap_eV, atol=1e-12)
    assert np.all(g.min_gap_eV <= g.gamma_gap_eV + 1e-12)
    assert np.all(g.min_gap_eV <= g.x_valley_eV + 1e-12)
    assert np.all(g.min_gap_eV <= g.l_valley_eV + 1e-12)
    at_gamma = np.all(g.cbm_k_2pi_over_a == 0.0, axis=1)
    assert np.all(g.direct <= at_gamma)


@pytest.mark.parametrize("chunk", [16, 300])
def test_gaps_do_not_depend_on_blocking(chunk: int) -> None:
    reference = gaps(ALL, n_path=60)
    blocked = gaps(ALL, n_path=60, chunk=chunk)
    np.testing.assert_allclose(blocked.min_gap_eV, reference.min_gap_eV, rtol=0, atol=1e-12)
    np.testing.assert_allclose(blocked.l_gap_eV, reference.l_gap_eV, rtol=0, atol=1e-12)
    np.testing.assert_array_equal(blocked.direct, reference.direct)


def test_si_cbm_lies_at_l_in_this_model() -> None:
    # a known failing of the sp3 model without an s* state (P. Vogl, H. P. Hjalmarson and
    # J. D. Dow, J. Phys. Chem. Solids 44, 365 (1983), who add s* to fix it): Si comes out
    # indirect with the CBM at L, not near X. This documents the model, not the crystal.
    g = gaps(params_of([COMPOUNDS[1]]))
    assert not g.direct[0]
    np.testing.assert_array_equal(g.cbm_k_2pi_over_a[0], SPECIAL_POINTS_2PI_OVER_A["L"])


def test_extra_k_points_join_the_sample() -> None:
    p = params_of([COMPOUNDS[2]])
    g = gaps(p, n_path=6, extra_k=RNG_K)
    assert g.n_k_sampled == 3 + 6 + len(RNG_K)


@pytest.mark.parametrize(
    "kwargs",
    [
        {"bond_length_angstrom": 0.0},
        {"bond_length_angstrom": -1.0},
        {"eps_s_anion_eV": np.nan},
        {"eps_s_anion_eV": [1.0, 2.0], "eps_p_anion_eV": [1.0, 2.0, 3.0]},
        {"eps_s_anion_eV": [[1.0]]},
    ],
)
def test_bad_parameters_are_rejected(kwargs: dict) -> None:
    base = {
        "eps_s_anion_eV": -14.0,
        "eps_p_anion_eV": -6.0,
        "eps_s_cation_eV": -9.0,
        "eps_p_cation_eV": -3.0,
        "bond_length_angstrom": 2.4,
    }
    with pytest.raises(BondgapInputError):
        TightBindingParameters(**{**base, **kwargs})


@pytest.mark.parametrize("k", [np.zeros((4, 2)), np.zeros((2, 3, 3)), [[np.inf, 0, 0]]])
def test_bad_k_points_are_rejected(k: object) -> None:
    with pytest.raises(BondgapInputError):
        band_energies(k, ALL)


def test_bad_chunk_and_path_are_rejected() -> None:
    with pytest.raises(BondgapInputError):
        band_energies(RNG_K, ALL, chunk=0)
    with pytest.raises(BondgapInputError):
        high_symmetry_path(5)


def test_parameters_from_elements_uses_atom_term_values(monkeypatch: pytest.MonkeyPatch) -> None:
    # stand-in for screening.atoms.term_values with explicit numbers (synthetic, no source)
    levels = {"Ga": (-8.9, -2.8), "As": (-14.3, -5.4)}

    def term_values(symbols: list[str], relativistic: bool = False) -> tuple[np.ndarray, ...]:
        return (
            np.array([levels[s][0] for s in symbols]),
            np.array([levels[s][1] for s in symbols]),
        )

    fake = types.ModuleType("screening.atoms")
    fake.term_values = term_values  # type: ignore[attr-defined]
    monkeypatch.setitem(sys.modules, "screening.atoms", fake)
    p = parameters_from_elements(["Ga"], ["As"], 2.448)
    assert p.eps_s_cation_eV[0] == -8.9 and p.eps_p_anion_eV[0] == -5.4
    with pytest.raises(BondgapInputError):
        parameters_from_elements(["Ga", "Al"], ["As"], 2.448)


def test_symmetric_reduction_gives_the_same_bands_on_a_uniform_grid() -> None:
    from screening.tight_binding import (
        FCC_RECIPROCAL_2PI_OVER_A,
        TightBindingParameters,
        band_energies,
        band_energies_symmetric,
        irreducible_k,
    )

    n = 8
    axes = (np.arange(n) + 0.5) / n - 0.5
    u = np.stack(np.meshgrid(axes, axes, axes, indexing="ij"), axis=-1).reshape(-1, 3)
    k = u @ FCC_RECIPROCAL_2PI_OVER_A
    # GaAs-like parameters (NIST LDA term values, Kotochigova et al. 1997; inputs only).
    params = TightBindingParameters(-14.250, -5.374, -8.926, -2.766, 2.448)
    full = band_energies(k, params)
    reduced = band_energies_symmetric(k, params)
    assert np.allclose(full, reduced, atol=1e-9)
    representatives, _ = irreducible_k(k)
    assert len(representatives) < len(k) / 5
