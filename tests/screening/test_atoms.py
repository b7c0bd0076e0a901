"""The all-electron LDA atom solver and its committed table, checked against NIST SRD 141."""

from __future__ import annotations

import numpy as np
import pytest
from pymatgen.core import Element

from screening.atoms import (
    CONFIGURATIONS,
    MAX_Z,
    atom_levels,
    solve_atom,
    term_values,
    valence_s_p,
)
from screening.atoms.configurations import parse_configuration
from screening.atoms.radial import LogGrid, hartree_potential, radial_eigenstates
from screening.atoms.xc import lda_xc
from screening.constants import HARTREE_EV
from screening.errors import ConvergenceError, UnknownElementError

NIST_SOURCE = (
    "NIST SRD 141, Kotochigova et al., Phys. Rev. A 55, 191 (1997), "
    "via pymatgen Element.atomic_orbitals"
)
TOLERANCE_EV = 1e-3  # the target: 1 meV for every element and orbital, core included
SYMBOLS = [symbol for symbol, _ in CONFIGURATIONS]


def nist_levels_ev(symbol: str) -> dict[str, float]:
    """LDA orbital energies of the neutral atom in eV (source: NIST_SOURCE; hartree there)."""
    return {orb: e * HARTREE_EV for orb, e in Element(symbol).atomic_orbitals.items()}


# --- configurations -------------------------------------------------------------------------


@pytest.mark.parametrize("symbol", SYMBOLS)
def test_configuration_matches_the_nist_ground_state(symbol: str) -> None:
    # The occupied orbitals are exactly those NIST lists (source: NIST_SOURCE), and the
    # occupations are pymatgen's ground-state ones.
    element = Element(symbol)
    ours = {(s.label, s.occupation) for s in parse_configuration(atom_levels(symbol).configuration)}
    theirs = {(f"{n}{ang}", float(occ)) for n, ang, occ in element.full_electronic_structure}
    assert ours == theirs
    assert {label for label, _ in ours} == set(element.atomic_orbitals)
    assert sum(occ for _, occ in ours) == element.Z


def test_parse_configuration_rejects_nonsense() -> None:
    with pytest.raises(ValueError, match="2x1"):
        parse_configuration("1s2 2x1")
    with pytest.raises(ValueError, match="1p1"):
        parse_configuration("1p1")
    with pytest.raises(ValueError, match="2p7"):
        parse_configuration("[He] 2p7")


# --- the committed table against NIST -------------------------------------------------------


@pytest.mark.parametrize("symbol", SYMBOLS)
def test_table_matches_nist_within_1_meV(symbol: str) -> None:
    # Every occupied level NIST lists -- valence s and p, d and f, and all core levels down to
    # 1s -- agrees within 1 meV (source: NIST_SOURCE, LDA column, non-relativistic).
    atom = atom_levels(symbol)
    ours = {lv.orbital: lv.energy_eV for lv in atom.levels if lv.occupation > 0}
    nist = nist_levels_ev(symbol)
    assert set(ours) == set(nist)
    errors = {orb: abs(ours[orb] - nist[orb]) for orb in nist}
    assert max(errors.values()) <= TOLERANCE_EV, f"{symbol} vs {NIST_SOURCE}: {errors}"


@pytest.mark.parametrize("symbol", SYMBOLS)
def test_valence_and_deepest_core_levels_named_against_nist(symbol: str) -> None:
    # The explicit checks: occupied valence s and p, and 1s as the core spot check
    # (source: NIST_SOURCE).
    atom = atom_levels(symbol)
    nist = nist_levels_ev(symbol)
    checked = [shell.label for shell in valence_s_p(atom.Z) if shell.occupation > 0] + ["1s"]
    for orbital in checked:
        assert atom.level(orbital).energy_eV == pytest.approx(nist[orbital], abs=TOLERANCE_EV)


def test_overall_agreement_with_nist_is_far_inside_the_target() -> None:
    # Measured over all 86 atoms and every occupied orbital (source: NIST_SOURCE, which rounds
    # to 1e-6 hartree = 0.027 meV); docs/atoms.md quotes: all orbitals 0.039 meV (Au 3s), 1s
    # 0.027 meV (Hf), occupied valence s 0.014 meV (V 4s), occupied valence p 0.014 meV (Se 4p).
    def worst(pick) -> tuple[float, str, str]:
        return max((abs(atom_levels(sym).level(orb).energy_eV - e) * 1e3, sym, orb)
                   for sym in SYMBOLS for orb, e in nist_levels_ev(sym).items() if pick(sym, orb))

    def valence(kind: str):
        return lambda sym, orb: any(
            shell.label == orb and shell.occupation > 0 and orb.endswith(kind)
            for shell in valence_s_p(atom_levels(sym).Z))

    for (value, sym, orb), quoted, where in (
        (worst(lambda sym, orb: True), 0.039, ("Au", "3s")),
        (worst(lambda sym, orb: orb == "1s"), 0.027, ("Hf", "1s")),
        (worst(valence("s")), 0.014, ("V", "4s")),
        (worst(valence("p")), 0.014, ("Se", "4p")),
    ):
        assert value == pytest.approx(quoted, abs=0.001) and (sym, orb) == where


# NIST SRD 141 LDA total energies in hartree, quoted from memory.
NIST_TOTAL_ENERGY_HARTREE = {
    "H": -0.445671,
    "He": -2.834836,
    "Li": -7.335195,
    "Be": -14.447209,
    "C": -37.425749,
    "N": -54.025016,
    "O": -74.473077,
    "Ne": -128.233481,
    "Ar": -525.946195,
}


@pytest.mark.parametrize("symbol", sorted(NIST_TOTAL_ENERGY_HARTREE))
def test_total_energy_matches_nist_lda_from_memory(symbol: str) -> None:
    expected_ev = NIST_TOTAL_ENERGY_HARTREE[symbol] * HARTREE_EV  # NIST SRD 141, from memory
    assert atom_levels(symbol).total_energy_eV == pytest.approx(expected_ev, abs=TOLERANCE_EV)


# --- unoccupied valence levels --------------------------------------------------------------


@pytest.mark.parametrize(
    "symbol", ["Be", "Mg", "Ca", "Zn", "Cd", "Hg", "Cu", "Ag", "Li", "Na", "K"]
)
def test_unoccupied_p_is_bound_and_above_the_valence_s(symbol: str) -> None:
    atom = atom_levels(symbol)
    s_shell, p_shell = valence_s_p(atom.Z)
    e_s, e_p = atom.level(s_shell.label).energy_eV, atom.level(p_shell.label).energy_eV
    assert p_shell.occupation == 0.0 and s_shell.occupation > 0
    assert e_s < e_p < 0.0


def test_every_unoccupied_level_beyond_helium_is_bound() -> None:
    for symbol in SYMBOLS[2:]:
        for level in atom_levels(symbol).levels:
            if level.occupation == 0:
                assert level.energy_eV < 0.0, (symbol, level)


def test_hydrogen_and_helium_2p_are_not_bound_and_sit_at_the_vacuum_level() -> None:
    # The LDA potential of neutral H and He binds no p state: the lowest p is the continuum
    # edge, reported as 0 eV.
    for symbol in ("H", "He"):
        assert atom_levels(symbol).level("2p").energy_eV == 0.0


def test_palladium_valence_s_and_p_are_the_empty_5s_and_5p() -> None:
    pd = atom_levels("Pd")
    assert pd.configuration == "[Kr] 4d10"
    assert [(lv.orbital, lv.occupation) for lv in pd.levels[-2:]] == [("5s", 0.0), ("5p", 0.0)]
    assert pd.level("4d").energy_eV < pd.level("5s").energy_eV < pd.level("5p").energy_eV < 0


# --- the solver reproduces the table --------------------------------------------------------


QUICK_SOLVES = ("H", "C", "Zn", "Ag", "Hg")
"""Atoms re-solved in a quick run (`-m "not slow"`); the full suite re-solves all 86."""


@pytest.mark.parametrize("symbol", [
    s if s in QUICK_SOLVES else pytest.param(s, marks=pytest.mark.slow) for s in SYMBOLS
])
def test_solver_reproduces_the_committed_table(symbol: str) -> None:
    # Every one of the 86 atoms is solved again and must give the committed table (about 20 s
    # in all; part of every full run and of CI).
    solved = solve_atom(symbol)
    stored = atom_levels(symbol)
    assert (solved.element, solved.Z, solved.configuration) == (
        stored.element,
        stored.Z,
        stored.configuration,
    )
    assert [(lv.orbital, lv.n, lv.l, lv.occupation) for lv in solved.levels] == [
        (lv.orbital, lv.n, lv.l, lv.occupation) for lv in stored.levels
    ]
    # The table stores eV rounded to 1e-6: equal at that precision.
    for new, old in zip(solved.levels, stored.levels, strict=True):
        assert new.energy_eV == pytest.approx(old.energy_eV, abs=1e-6)
    assert solved.total_energy_eV == pytest.approx(stored.total_energy_eV, abs=1e-6)
    assert solved.lowest_d is not None and stored.lowest_d is not None
    assert solved.lowest_d.orbital == stored.lowest_d.orbital
    np.testing.assert_allclose(solved.lowest_d.energy_eV, stored.lowest_d.energy_eV, atol=1e-6)


def test_unoccupied_level_is_converged_in_the_grid_radius() -> None:
    # Pd 5p (-0.27 eV) is the most weakly bound level in the table; a grid reaching 90 bohr
    # instead of 60 moves it by far less than 1 meV.
    default = solve_atom("Pd").level("5p").energy_eV
    wider = solve_atom("Pd", r_max=90.0).level("5p").energy_eV
    assert abs(wider - default) < 1e-5


def test_scf_that_does_not_converge_raises_with_element_and_iterations() -> None:
    with pytest.raises(ConvergenceError, match=r"Fe \(Z = 26\).*1 iteration"):
        solve_atom("Fe", max_iterations=1)


def test_solve_atom_accepts_atomic_numbers_and_rejects_unknown_elements() -> None:
    assert solve_atom(1).element == "H"
    with pytest.raises(UnknownElementError, match=r"Z = 1\.\.86"):
        solve_atom(87)
    with pytest.raises(UnknownElementError, match=r"Z = 1\.\.86"):
        solve_atom("Fr")


# --- public lookups ------------------------------------------------------------------------


def test_term_values_are_vectorised_in_the_order_given() -> None:
    symbols = ["Ga", "As", "Zn", "Se", "H", "zn"]
    e_s, e_p = term_values(symbols)
    assert e_s.shape == e_p.shape == (6,)
    for symbol, s_value, p_value in zip(symbols, e_s, e_p, strict=True):
        atom = atom_levels(symbol)
        s_shell, p_shell = valence_s_p(atom.Z)
        assert s_value == atom.level(s_shell.label).energy_eV
        assert p_value == atom.level(p_shell.label).energy_eV
    assert e_s[2] == e_s[5]
    # Ga 4s and 4p against NIST (source: NIST_SOURCE)
    assert e_s[0] == pytest.approx(nist_levels_ev("Ga")["4s"], abs=TOLERANCE_EV)
    assert e_p[0] == pytest.approx(nist_levels_ev("Ga")["4p"], abs=TOLERANCE_EV)


def test_term_values_of_every_element_are_finite_and_s_below_p() -> None:
    e_s, e_p = term_values(SYMBOLS)
    assert len(e_s) == MAX_Z and np.all(np.isfinite(e_s)) and np.all(np.isfinite(e_p))
    assert np.all(e_s < e_p)


def test_term_values_of_a_single_symbol_and_of_nothing() -> None:
    e_s, e_p = term_values("Si")
    assert e_s.shape == (1,) and e_p.shape == (1,)
    empty_s, empty_p = term_values([])
    assert empty_s.shape == empty_p.shape == (0,)


def test_term_values_and_atom_levels_reject_unknown_symbols() -> None:
    with pytest.raises(UnknownElementError, match=r"'Xx'.*Z = 1\.\.86"):
        term_values(["Ga", "Xx"])
    with pytest.raises(UnknownElementError, match=r"Z = 1\.\.86"):
        atom_levels("U")


# --- numerical building blocks -------------------------------------------------------------


def test_exchange_correlation_potential_is_the_density_derivative() -> None:
    n = np.logspace(-6, 4, 41)
    eps, v = lda_xc(n)
    step = 1e-6 * n
    upper, _ = lda_xc(n + step)
    lower, _ = lda_xc(n - step)
    numeric = ((n + step) * upper - (n - step) * lower) / (2 * step)
    np.testing.assert_allclose(v, numeric, rtol=1e-7)
    assert np.all(eps < 0)
    assert lda_xc(np.array([0.0]))[1][0] == 0.0


def test_vwn5_correlation_energy_of_the_uniform_gas() -> None:
    # Ceperley-Alder value fitted by VWN5 at r_s = 1: -0.0600 hartree per electron.
    n = 3.0 / (4.0 * np.pi)
    eps, _ = lda_xc(np.array([n]))
    exchange = -0.75 * np.cbrt(3.0 * n / np.pi)
    assert eps[0] - exchange == pytest.approx(-0.0600, abs=2e-4)


def test_hydrogenic_levels_after_richardson_extrapolation() -> None:
    z = 30
    coarse = LogGrid.spanning(1e-6 / z, 60.0, 0.02)
    fine = coarse.refined()
    for l in (0, 1, 2):  # noqa: E741
        e_h, _ = radial_eigenstates(coarse, -z / coarse.r, l, 2)
        e_h2, _ = radial_eigenstates(fine, -z / fine.r, l, 2)
        exact = -(z**2) / (2.0 * np.arange(l + 1, l + 3) ** 2)
        np.testing.assert_allclose((4 * e_h2 - e_h) / 3, exact, rtol=2e-8)


def test_hartree_potential_of_the_hydrogen_1s_cloud() -> None:
    grid = LogGrid.spanning(1e-6, 60.0, 0.02)
    r = grid.r
    charge = 4.0 * r**3 * np.exp(-2.0 * r)  # 4 pi r^3 n with n = exp(-2r) / pi
    exact = 1.0 / r - (1.0 + 1.0 / r) * np.exp(-2.0 * r)
    np.testing.assert_allclose(hartree_potential(grid, charge), exact, atol=1e-7)


def test_committed_table_was_made_with_the_default_settings() -> None:
    import json
    from dataclasses import asdict

    from screening.atoms import DEFAULT_SETTINGS
    from screening.atoms.table import table_path

    header = json.loads(table_path().read_text(encoding="utf-8"))
    assert header["settings"] == asdict(DEFAULT_SETTINGS)
    assert [a["element"] for a in header["atoms"]] == SYMBOLS
