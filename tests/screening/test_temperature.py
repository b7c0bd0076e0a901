"""Checks of the temperature laws, the Varshni table and the photon wavelength."""

from __future__ import annotations

from pathlib import Path

import numpy as np
import pytest

from screening.errors import BondgapInputError
from screening.reference import SeedDataError
from screening.temperature import (
    DEFAULT_ALPHA_MEV_PER_K,
    DEFAULT_BETA_K,
    VALLEYS,
    VARSHNI_COLUMNS,
    ValleyLaw,
    bose_einstein_eV,
    gap_at,
    gaps_at_temperature,
    load_varshni_table,
    varshni_eV,
    varshni_shift_eV,
    wavelength_nm,
)

VMR = "Vurgaftman, Meyer & Ram-Mohan, J. Appl. Phys. 89, 5815 (2001)"


@pytest.mark.parametrize(
    ("temperature_K", "expected_eV", "source"),
    [
        (0.0, 1.519, f"{VMR}, GaAs Gamma E_g(0) (from memory)"),
        (300.0, 1.422, f"{VMR}, GaAs Gamma at 300 K (from memory)"),
    ],
)
def test_varshni_gaas_worked_values(temperature_K: float, expected_eV: float, source: str) -> None:
    # GaAs Gamma: alpha = 0.5405 meV/K, beta = 204 K (VMR 2001, from memory)
    assert varshni_eV(1.519, 0.5405, 204.0, temperature_K) == pytest.approx(expected_eV, abs=6e-4)


# Arithmetic checks: each table row evaluated at 300 K equals Varshni's law recomputed here
# with VMR's parameters (VMR 2001, Table III and text; from memory), Eg(T) = Eg(0) - alpha T^2 /
# (T + beta). They prove that the table holds those parameters, not that the law is right.
VMR_LAWS = [
    ("GaAs", "Gamma", 1.519, 0.5405, 204.0),
    ("InAs", "Gamma", 0.417, 0.276, 93.0),
    ("GaSb", "Gamma", 0.812, 0.417, 140.0),
    ("InSb", "Gamma", 0.235, 0.32, 170.0),
    ("AlAs", "X", 2.24, 0.70, 530.0),
    ("GaP", "X", 2.35, 0.5771, 372.0),
    ("AlSb", "X", 1.696, 0.39, 140.0),
    ("InP", "Gamma", 1.4236, 0.363, 162.0),
]


@pytest.mark.parametrize(("formula", "valley", "eg0", "alpha_meV", "beta"), VMR_LAWS)
def test_table_rows_recompute_vmr_laws_at_300K(
    formula: str, valley: str, eg0: float, alpha_meV: float, beta: float
) -> None:
    laws = {law.valley: law for law in load_varshni_table()[formula]}
    expected = eg0 - alpha_meV * 1e-3 * 300.0**2 / (300.0 + beta)  # arithmetic check
    assert float(laws[valley].gap_eV(300.0)) == pytest.approx(expected, abs=1e-6)


def test_gap_bose_einstein_and_inp_x_linear_forms_recomputed() -> None:
    # Arithmetic checks of the two non-Varshni forms VMR give (VMR 2001; from memory):
    # GaP Gamma 2.886 + 0.1081 [1 - coth(164 / T)] eV; InP X 2.384 - 3.7e-4 T eV.
    laws = load_varshni_table()
    gap_gamma = {law.valley: law for law in laws["GaP"]}["Gamma"]
    inp_x = {law.valley: law for law in laws["InP"]}["X"]
    assert float(gap_gamma.gap_eV(300.0)) == pytest.approx(
        2.886 + 0.1081 * (1.0 - 1.0 / np.tanh(164.0 / 300.0)), abs=1e-6)
    assert float(inp_x.gap_eV(300.0)) == pytest.approx(2.384 - 3.7e-4 * 300.0, abs=1e-6)


HANDBOOK = (
    "O. Madelung, Semiconductors: Data Handbook, 3rd ed., Springer 2004, and S. M. Sze and "
    "K. K. Ng, Physics of Semiconductor Devices, 3rd ed., Wiley 2007, Appendix; from memory"
)


@pytest.mark.parametrize(
    ("formula", "measured_300K_eV", "tolerance_eV"),
    [
        ("Si", 1.12, 0.015),
        ("Ge", 0.66, 0.015),
        ("GaAs", 1.424, 0.015),
        ("InP", 1.344, 0.015),
        ("InAs", 0.354, 0.015),
        ("GaSb", 0.726, 0.015),
        ("InSb", 0.17, 0.015),
        ("AlAs", 2.16, 0.015),
        ("GaP", 2.26, 0.015),
        ("AlSb", 1.62, 0.015),
        # known less well: AlP 2.45-2.5 eV, GaN 3.39-3.44 eV, AlN 6.1-6.2 eV at 300 K
        ("AlP", 2.45, 0.05),
        ("GaN", 3.42, 0.04),
        ("AlN", 6.2, 0.06),
    ],
)
def test_temperature_laws_meet_measured_300K_gaps(
    formula: str, measured_300K_eV: float, tolerance_eV: float
) -> None:
    # The lowest valley of the table's law at 300 K against the measured room-temperature gap
    # of the handbooks (HANDBOOK): a check of the laws against measurements they were not
    # built from. 15 meV covers the spread between the handbooks for the well-known ones.
    lowest = min(float(law.gap_eV(300.0)) for law in load_varshni_table()[formula])
    assert lowest == pytest.approx(measured_300K_eV, abs=tolerance_eV), HANDBOOK


def test_table_is_well_formed() -> None:
    table = load_varshni_table()
    vmr_iii_v = ("AlP", "AlAs", "AlSb", "GaP", "GaAs", "GaSb", "InP", "InAs", "InSb")
    for formula in vmr_iii_v:
        assert sorted(law.valley for law in table[formula]) == sorted(VALLEYS)
    for laws in table.values():
        for law in laws:
            assert law.source and law.eg0_eV > 0
            assert np.all(np.diff(law.gap_eV(np.linspace(0, 600, 13))) <= 0)


def test_varshni_broadcasts_compounds_by_temperatures() -> None:
    eg0 = np.array([[1.519], [0.417]])
    alpha = np.array([[0.5405], [0.276]])
    beta = np.array([[204.0], [93.0]])
    temps = np.array([0.0, 77.0, 300.0, 500.0])
    out = varshni_eV(eg0, alpha, beta, temps)
    assert out.shape == (2, 4)
    np.testing.assert_allclose(out[:, 0], [1.519, 0.417])


def test_varshni_with_zero_beta_is_linear_and_finite_at_zero() -> None:
    # InP X in VMR 2001 is linear, 2.384 - 3.7e-4 T eV (from memory): beta = 0 reproduces it
    temps = np.array([0.0, 100.0, 300.0])
    np.testing.assert_allclose(varshni_eV(2.384, 0.37, 0.0, temps), 2.384 - 3.7e-4 * temps)
    assert varshni_shift_eV(0.5, 0.0, 0.0) == 0.0


def test_bose_einstein_form() -> None:
    # VMR 2001 GaP Gamma: 2.886 + 0.1081[1 - coth(164/T)] (from memory)
    assert bose_einstein_eV(2.886, 0.1081, 164.0, 0.0) == 2.886
    expected = 2.886 + 0.1081 * (1 - 1 / np.tanh(164.0 / 300.0))
    assert bose_einstein_eV(2.886, 0.1081, 164.0, 300.0) == pytest.approx(expected, rel=1e-14)


def test_gap_at_keeps_the_measured_300K_value() -> None:
    result = gap_at("GaAs", 1.424, [0.0, 300.0, 400.0])
    assert result.gap_eV[1] == 1.424
    assert not result.assumed
    assert "Vurgaftman" in result.source
    # shift = V(T) - V(300) of the GaAs Gamma law (VMR 2001, from memory)
    shift0 = varshni_shift_eV(0.5405, 204.0, 0.0) - varshni_shift_eV(0.5405, 204.0, 300.0)
    assert result.gap_eV[0] == pytest.approx(1.424 + float(shift0), abs=1e-12)
    assert list(result.valley) == ["Gamma"] * 3


def test_gap_at_scalar_temperature_gives_scalar() -> None:
    result = gap_at("Si", 1.12, 77.0)
    assert result.gap_eV.shape == ()
    assert result.valley.shape == ()


def test_unknown_compound_uses_flagged_default() -> None:
    result = gap_at("ZnTe", 2.26, [0.0, 300.0])
    assert result.assumed
    assert "assumed" in result.source
    expected = 2.26 + float(
        varshni_shift_eV(DEFAULT_ALPHA_MEV_PER_K, DEFAULT_BETA_K, 0.0)
        - varshni_shift_eV(DEFAULT_ALPHA_MEV_PER_K, DEFAULT_BETA_K, 300.0)
    )
    assert result.gap_eV[0] == pytest.approx(expected, abs=1e-12)
    assert result.gap_eV[1] == 2.26


def test_valley_crossover_is_followed() -> None:
    # synthetic laws (no source): Gamma flat at 1.0 eV, X = 1.2 - 1e-3 T eV; they cross at 200 K
    laws = (
        ValleyLaw("Xy", "Gamma", 1.0, 0.0, 0.0, "synthetic", False, ""),
        ValleyLaw("Xy", "X", 1.2, 1.0, 0.0, "synthetic", False, ""),
    )
    result = gaps_at_temperature(["Xy"], 0.95, [0.0, 100.0, 300.0], table={"Xy": laws})
    assert list(result.valley[0]) == ["Gamma", "Gamma", "X"]
    # lowest valley: 1.0, 1.0, 0.9 eV; anchored so that 300 K gives 0.95 eV
    np.testing.assert_allclose(result.gap_eV[0], [1.05, 1.05, 0.95], atol=1e-12)


def test_many_compounds_at_once() -> None:
    formulas = ["GaAs", "AlAs", "ZnSe", "HgTe"]
    result = gaps_at_temperature(formulas, [1.424, 2.16, 2.7, -0.15], [0.0, 300.0])
    assert result.gap_eV.shape == (4, 2)
    np.testing.assert_array_equal(result.assumed, [False, False, True, True])
    np.testing.assert_allclose(result.gap_eV[:3, 1], [1.424, 2.16, 2.7])
    assert np.all(np.isnan(result.gap_eV[3]))  # semimetal: not described by these laws
    assert result.valley[1, 0] == "X"


@pytest.mark.parametrize("bad", [-1.0, np.nan, np.inf])
def test_bad_temperature_is_rejected(bad: float) -> None:
    with pytest.raises(BondgapInputError):
        varshni_eV(1.5, 0.5, 200.0, bad)
    with pytest.raises(BondgapInputError):
        gap_at("GaAs", 1.424, bad)


def test_mismatched_gap_count_is_rejected() -> None:
    with pytest.raises(BondgapInputError):
        gaps_at_temperature(["GaAs", "InP"], [1.424, 1.344, 0.354], 300.0)


@pytest.mark.parametrize(
    ("gap_eV", "expected_nm"),
    [
        (1.424, 1239.84198 / 1.424),  # h c = 1239.84198 eV nm (CODATA 2018)
        (1.0, 1239.84198),
    ],
)
def test_wavelength(gap_eV: float, expected_nm: float) -> None:
    assert wavelength_nm(gap_eV) == pytest.approx(expected_nm, rel=1e-12)


def test_wavelength_of_no_gap_is_nan() -> None:
    out = wavelength_nm([0.0, -0.3, np.nan, 2.0])
    assert np.all(np.isnan(out[:3]))
    assert out[3] == pytest.approx(619.92099, rel=1e-6)


def write_table(tmp_path: Path, rows: list[str], header: str | None = None) -> Path:
    text = (header or ",".join(VARSHNI_COLUMNS)) + "\n" + "\n".join(rows) + "\n"
    (tmp_path / "varshni.csv").write_text(text, encoding="utf-8")
    return tmp_path


@pytest.mark.parametrize(
    ("rows", "header"),
    [
        (["GaAs,Gamma,1.519,0.5405,204,src,true,"], "formula,valley,eg0"),
        (["GaAs,Delta,1.519,0.5405,204,src,true,"], None),
        (["GaAs,Gamma,1.519,0.5405,204,,true,"], None),
        (["GaAs,Gamma,1.519,0.5405,204,src,yes,"], None),
        (["GaAs,Gamma,1.519,-0.5,204,src,true,"], None),
        (["GaAs,Gamma,abc,0.5,204,src,true,"], None),
        (["GaAs,Gamma,1.519,,,src,true,"], None),
        (["GaAs,Gamma,1.519,0.5405,204,src,true,", "GaAs,Gamma,1.5,0.5,200,src,true,"], None),
        (["GaAs,Gamma,1.519,0.5405,204,src,true"], None),
    ],
)
def test_malformed_tables_are_rejected(tmp_path: Path, rows: list[str], header: str | None) -> None:
    with pytest.raises(SeedDataError):
        load_varshni_table(write_table(tmp_path, rows, header))


def test_missing_table_is_reported(tmp_path: Path) -> None:
    with pytest.raises(SeedDataError):
        load_varshni_table(tmp_path)


@pytest.mark.parametrize("temperature_K", [5e-324, 1e-320, 1e-310, 1e-300])
def test_tiny_positive_temperatures_give_the_0_k_gap_without_warnings(temperature_K) -> None:
    # Issue 10: theta / T overflowed for GaP near 1e-310 K. 1 - coth(theta / T) is below
    # exp(-700) there, so the gap is E(0) to double precision (the limit of the formula).
    gap = bose_einstein_eV(2.886, 0.0862, 305.0, temperature_K)
    assert float(gap) == 2.886
    assert float(varshni_eV(1.519, 0.5405, 204.0, temperature_K)) == pytest.approx(1.519)


def test_huge_temperatures_give_finite_varshni_values() -> None:
    # T^2 overflowed above 1e154 K; T * (T / (T + beta)) does not (arithmetic check).
    assert float(varshni_eV(1.0, 1.0, 100.0, 1e250)) == pytest.approx(-1e-3 * 1e250, rel=1e-12)
