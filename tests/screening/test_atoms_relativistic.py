"""Scalar-relativistic (scaled ZORA) atoms: the Dirac limit, spin-orbit splittings, the SR table."""

from __future__ import annotations

import numpy as np
import pytest

from screening.atoms import (
    CONFIGURATIONS,
    MAX_Z,
    atom_levels,
    solve_atom,
    spin_orbit_splitting_eV,
    term_values,
    valence_s_p,
)
from screening.atoms.radial import LogGrid, radial_eigenstates
from screening.atoms.zora import SPEED_OF_LIGHT_AU, dirac_coulomb_energy, zora_eigenstates
from screening.constants import HARTREE_EV
from screening.errors import UnknownElementError

SYMBOLS = [symbol for symbol, _ in CONFIGURATIONS]
CM_PER_EV = 8065.543937  # CODATA 2018: 1 eV = 8065.543937 cm^-1

# --- the exact limit: one-electron ions ---------------------------------------------------------


def _richardson(z: float, l: int, count: int, kappa: int | None, r_max: float):  # noqa: E741
    coarse = LogGrid.spanning(1e-6 / z, r_max, 0.02)
    fine = coarse.refined()
    a = zora_eigenstates(coarse, -z / coarse.r, l, count, kappa)
    b = zora_eigenstates(fine, -z / fine.r, l, count, kappa)
    return (4 * b.scaled - a.scaled) / 3, (4 * b.energies - a.energies) / 3


@pytest.mark.parametrize("z", [1, 30, 50, 80])
@pytest.mark.parametrize(
    ("l", "kappa"),
    [(0, -1), (1, 1), (1, -2), (2, 2), (2, -3)],
    ids=["s", "p12", "p32", "d32", "d52"],
)
def test_scaled_zora_reproduces_the_dirac_energies_of_one_electron_ions(
    z: int, l: int, kappa: int  # noqa: E741
) -> None:
    # Closed-form Dirac energies of a point nucleus (Darwin 1928; Gordon 1928) for the three
    # lowest n of each kappa (1s..3s, 2p..4p, 3d..5d). Scaled ZORA (van Lenthe et al., J. Chem.
    # Phys. 101, 9783 (1994)) is exact for this potential: measured relative error <= 2.2e-8 after
    # Richardson extrapolation (numerical error of the grid), so the tolerance is 1e-7.
    r_max = 400.0 if z == 1 else 60.0  # hydrogen's n = 5 states need room
    scaled, _ = _richardson(z, l, 3, kappa, r_max)
    exact = np.array([dirac_coulomb_energy(n, kappa, z) for n in range(l + 1, l + 4)])
    np.testing.assert_allclose(scaled, exact, rtol=1e-7)


def test_plain_zora_errors_are_the_known_overbinding_of_deep_levels() -> None:
    # Plain ZORA over-binds deep levels (van Lenthe et al. 1994); measured against the Dirac
    # energies: 1s of Z = 80 10.4 % too deep, 2p1/2 2.5 %, 1s of Z = 30 1.2 %.
    for z, l, kappa, n, measured in ((80, 0, -1, 1, 0.1038), (80, 1, 1, 2, 0.0247),  # noqa: E741
                                     (30, 0, -1, 1, 0.0123)):
        _, plain = _richardson(z, l, 1, kappa, 60.0)
        error = plain[0] / dirac_coulomb_energy(n, kappa, z) - 1.0
        assert error == pytest.approx(measured, abs=5e-4)


def test_dirac_energy_formula_limits() -> None:
    # Non-relativistic limit -Z^2/(2 n^2); the 1s Dirac energy c^2 (sqrt(1 - (Z alpha)^2) - 1).
    assert dirac_coulomb_energy(2, 1, 1, c=1e6) == pytest.approx(-0.125, rel=1e-9)
    za = 80 / SPEED_OF_LIGHT_AU
    assert dirac_coulomb_energy(1, -1, 80) == pytest.approx(
        SPEED_OF_LIGHT_AU**2 * (np.sqrt(1 - za**2) - 1), rel=1e-12
    )


def test_zora_without_relativity_is_the_schrodinger_operator() -> None:
    # c -> infinity: K = 1 and the ZORA matrix is the non-relativistic one of radial.py.
    grid = LogGrid.spanning(1e-6 / 26, 60.0, 0.02)
    potential = -26.0 / grid.r * np.exp(-grid.r)
    for l in (0, 1, 2):  # noqa: E741
        nr, _ = radial_eigenstates(grid, potential, l, 3)
        states = zora_eigenstates(grid, potential, l, 3, c=1e9)
        np.testing.assert_allclose(states.energies, nr, rtol=1e-9)
        np.testing.assert_allclose(states.scaled, nr, rtol=1e-9)


def test_kappa_must_belong_to_l() -> None:
    grid = LogGrid.spanning(1e-6, 60.0, 0.02)
    for l, kappa in ((1, -1), (1, 2), (0, 1), (2, 0)):  # noqa: E741
        with pytest.raises(ValueError, match="kappa"):
            zora_eigenstates(grid, -1.0 / grid.r, l, 1, kappa)


# --- atomic spin-orbit splittings against experiment --------------------------------------------

# Ground-term fine-structure splittings of free atoms, cm^-1, NIST Atomic Spectra Database
# (from memory): 2P1/2 - 2P3/2 of the group-13 atoms (one p electron) and the inverted
# 2P3/2 - 2P1/2 of the halogens (one p hole); for either, the splitting is Delta_p = (3/2) zeta_p.
GROUND_TERM_SPLITTING_CM = {
    "B": 15.29, "Al": 112.06, "Ga": 826.19, "In": 2212.60, "Tl": 7792.7,
    "F": 404.14, "Cl": 882.35, "Br": 3685.24, "I": 7603.15,
}
# Resonance doublets np 2P3/2 - 2P1/2 of the alkali atoms (D2 - D1), cm^-1, NIST ASD (from
# memory): the empty valence p of the ground-state atom.
ALKALI_DOUBLET_CM = {"Na": 17.196, "K": 57.710, "Rb": 237.60, "Cs": 554.04}

# Measured (computed / measured - 1), in docs/atoms.md: B +75.1 %, F +27.7 %, Al +22.4 %,
# Ga +19.0 %, Cl +15.9 %, In +15.8 %, Tl +12.2 %, Br +11.6 %, I +9.6 %; Na +15.6 %, K +17.3 %,
# Rb +15.7 %, Cs +16.4 %. The one-electron splitting in the LDA potential is too large by
# 10-25 % for Z >= 13 and more for the first row, where the two-electron spin-other-orbit
# interaction, absent from a one-electron potential, removes the largest share (Blume and
# Watson, Proc. R. Soc. A 270, 127 (1962), from memory). Tolerances are set from these
# measurements, not tuned: 0 to +25 % for Z >= 11, 0 to +100 % for B and F.
OVERESTIMATE_LIMIT = {"B": 1.0, "F": 1.0}
DEFAULT_LIMIT = 0.25


@pytest.mark.parametrize("symbol", sorted({**GROUND_TERM_SPLITTING_CM, **ALKALI_DOUBLET_CM}))
def test_p_spin_orbit_splitting_against_measured_fine_structure(symbol: str) -> None:
    measured = {**GROUND_TERM_SPLITTING_CM, **ALKALI_DOUBLET_CM}[symbol] / CM_PER_EV
    computed = spin_orbit_splitting_eV([symbol])[0]
    assert 0.0 < computed / measured - 1.0 < OVERESTIMATE_LIMIT.get(symbol, DEFAULT_LIMIT)


def test_spin_orbit_errors_quoted_in_the_docs() -> None:
    # The per-element relative errors listed above and in docs/atoms.md, and the mean absolute
    # error over the nine ground terms: 40.1 meV (mean |relative error| 23.3 %, 15.2 % without
    # B and F).
    quoted = {"B": 75.1, "F": 27.7, "Al": 22.4, "Ga": 19.0, "Cl": 15.9, "In": 15.8, "Tl": 12.2,
              "Br": 11.6, "I": 9.6, "Na": 15.6, "K": 17.3, "Rb": 15.7, "Cs": 16.4}
    measured = {**GROUND_TERM_SPLITTING_CM, **ALKALI_DOUBLET_CM}
    symbols = list(quoted)
    computed = spin_orbit_splitting_eV(symbols) * CM_PER_EV
    for symbol, value in zip(symbols, computed, strict=True):
        assert 100 * (value / measured[symbol] - 1) == pytest.approx(quoted[symbol], abs=0.05)
    terms = list(GROUND_TERM_SPLITTING_CM)
    errors = spin_orbit_splitting_eV(terms) * CM_PER_EV - np.array(
        [GROUND_TERM_SPLITTING_CM[s] for s in terms])
    assert np.mean(np.abs(errors)) / CM_PER_EV * 1e3 == pytest.approx(40.1, abs=0.05)


def test_spin_orbit_splitting_of_every_element() -> None:
    delta = spin_orbit_splitting_eV(SYMBOLS)
    assert delta.shape == (MAX_Z,)
    # H and He: the 2p is not bound; 0 by definition. Every other valence p splits, j = 3/2 up.
    assert delta[0] == delta[1] == 0.0
    assert np.all(delta[2:] > 0.0)
    # Down each p-block group the splitting grows (B < Al < Ga < In < Tl, ..., F < ... < At).
    for first in range(5, 11):  # the B..Ne columns
        zs = np.array([first, first + 8, first + 26, first + 44, first + 76])
        assert np.all(np.diff(delta[zs - 1]) > 0), zs


def test_spin_orbit_pair_is_stored_in_the_relativistic_levels() -> None:
    ga = atom_levels("Ga", relativistic=True)
    j_half, j_three_halves = ga.valence_p_j_eV
    assert ga.relativistic and j_half < ga.level("4p").energy_eV < j_three_halves < 0
    # The scalar level is the (2j+1)-weighted mean of the pair to first order in spin-orbit
    # coupling; measured: 1.7 meV above it, 1.4 % of Delta_p (second order).
    mean = (2 * j_half + 4 * j_three_halves) / 6
    assert ga.level("4p").energy_eV == pytest.approx(mean, abs=0.03 * (j_three_halves - j_half))
    assert ga.spin_orbit_splitting_eV == spin_orbit_splitting_eV("Ga")[0]
    assert atom_levels("Ga").spin_orbit_splitting_eV is None


# --- relativistic term values ----------------------------------------------------------------

RELATIVISTIC_SHIFT_SYMBOLS = ("Zn", "Ga", "Cd", "In", "Te", "I", "Au", "Hg", "Tl", "Pb", "Bi")


def test_heavy_6s_levels_are_bound_more_deeply() -> None:
    # Relativistic stabilisation of the 6s of Au and Hg, roughly 1-2 eV (the figure,
    # common practice, no source); measured here with the Dirac-limit-validated solver: Au 1.66,
    # Hg 1.54, Tl 2.06, Pb 2.59, Bi 3.15 eV deeper than non-relativistic.
    nr_s, _ = term_values(["Au", "Hg", "Tl", "Pb", "Bi"])
    sr_s, _ = term_values(["Au", "Hg", "Tl", "Pb", "Bi"], relativistic=True)
    shift = sr_s - nr_s
    np.testing.assert_allclose(shift, [-1.656, -1.537, -2.064, -2.590, -3.149], atol=0.002)
    assert np.all((shift[:2] < -1.0) & (shift[:2] > -2.0))


def test_gold_maximum_of_the_relative_6s_stabilisation() -> None:
    # The ratio eps_6s(relativistic) / eps_6s(non-relativistic) is largest at Au among Cs..Rn,
    # the "gold maximum" of relativistic effects in the sixth row (P. Pyykko and J. P. Desclaux,
    # Acc. Chem. Res. 12, 276 (1979), from memory).
    row = SYMBOLS[54:86]
    ratio = term_values(row, relativistic=True)[0] / term_values(row)[0]
    assert row[int(np.argmax(ratio))] == "Au"


def test_relativity_vanishes_for_light_atoms() -> None:
    # H 1s moves by about (Z alpha)^2 / 4 of its value (0.2 meV); first-row valence levels by
    # less than 0.15 eV; every s level moves down.
    nr_s, nr_p = term_values(SYMBOLS)
    sr_s, sr_p = term_values(SYMBOLS, relativistic=True)
    assert -1e-3 < sr_s[0] - nr_s[0] < 0.0
    assert np.all(np.abs(sr_s[:10] - nr_s[:10]) < 0.15)
    assert np.all(np.abs(sr_p[:10] - nr_p[:10]) < 0.02)
    assert np.all(sr_s <= nr_s)


def test_relativistic_term_values_of_every_element_are_finite_and_s_below_p() -> None:
    e_s, e_p = term_values(SYMBOLS, relativistic=True)
    assert np.all(np.isfinite(e_s)) and np.all(np.isfinite(e_p)) and np.all(e_s < e_p)
    for symbol in SYMBOLS:
        atom = atom_levels(symbol, relativistic=True)
        assert atom.configuration == atom_levels(symbol).configuration
        s_shell, p_shell = valence_s_p(atom.Z)
        orbitals = [lv.orbital for lv in atom_levels(symbol).levels]
        assert [lv.orbital for lv in atom.levels] == orbitals
        assert atom.level(s_shell.label).energy_eV < atom.level(p_shell.label).energy_eV


def test_default_term_values_stay_non_relativistic() -> None:
    assert term_values(["Hg"])[0][0] == atom_levels("Hg").level("6s").energy_eV
    assert term_values(["Hg"], relativistic=True)[0][0] == atom_levels(
        "Hg", relativistic=True).level("6s").energy_eV


def test_spin_orbit_lookup_rejects_unknown_symbols_and_accepts_one() -> None:
    with pytest.raises(UnknownElementError, match="Z = 1..86"):
        spin_orbit_splitting_eV(["Ga", "Xx"])
    assert spin_orbit_splitting_eV("Tl").shape == (1,)
    assert spin_orbit_splitting_eV([]).shape == (0,)


def test_shifts_quoted_in_the_docs() -> None:
    # docs/atoms.md lists SR - NR of the valence s and p for these elements (eV).
    quoted = {  # (s shift, p shift), eV
        "Zn": (-0.157, 0.046), "Ga": (-0.243, 0.034), "Cd": (-0.394, 0.108),
        "In": (-0.574, 0.073), "Te": (-1.176, 0.057), "I": (-1.419, 0.053),
        "Au": (-1.656, 0.064), "Hg": (-1.537, 0.299), "Tl": (-2.064, 0.189),
        "Pb": (-2.590, 0.157), "Bi": (-3.149, 0.138),
    }
    symbols = list(RELATIVISTIC_SHIFT_SYMBOLS)
    nr_s, nr_p = term_values(symbols)
    sr_s, sr_p = term_values(symbols, relativistic=True)
    for i, symbol in enumerate(symbols):
        assert (sr_s[i] - nr_s[i], sr_p[i] - nr_p[i]) == pytest.approx(quoted[symbol], abs=0.0015)


# --- the solver reproduces the relativistic table ------------------------------------------------

QUICK_SOLVES = ("C", "Ga", "Hg")


@pytest.mark.parametrize("symbol", [
    s if s in QUICK_SOLVES else pytest.param(s, marks=pytest.mark.slow) for s in SYMBOLS
])
def test_relativistic_solver_reproduces_the_committed_table(symbol: str) -> None:
    solved = solve_atom(symbol, relativistic=True)
    stored = atom_levels(symbol, relativistic=True)
    assert [lv.orbital for lv in solved.levels] == [lv.orbital for lv in stored.levels]
    for new, old in zip(solved.levels, stored.levels, strict=True):
        assert new.energy_eV == pytest.approx(old.energy_eV, abs=1e-6)
    assert solved.total_energy_eV == pytest.approx(stored.total_energy_eV, abs=1e-6)
    np.testing.assert_allclose(solved.valence_p_j_eV, stored.valence_p_j_eV, atol=1e-6)
    assert solved.lowest_d is not None and stored.lowest_d is not None
    assert solved.lowest_d.orbital == stored.lowest_d.orbital
    np.testing.assert_allclose(solved.lowest_d.energy_eV, stored.lowest_d.energy_eV, atol=1e-6)


def test_relativistic_1s_of_mercury_against_the_dirac_scale() -> None:
    # The Hg 1s moves down by thousands of eV (the Dirac 1s of a bare Z = 80 nucleus lies
    # 10.3 % below the non-relativistic -Z^2/2 hartree); the screened atom's shift is 0.88 of
    # the bare ion's (measured).
    nr = atom_levels("Hg").level("1s").energy_eV
    sr = atom_levels("Hg", relativistic=True).level("1s").energy_eV
    bare = (dirac_coulomb_energy(1, -1, 80) + 80**2 / 2) * HARTREE_EV
    assert 0.8 < (sr - nr) / bare < 1.2
