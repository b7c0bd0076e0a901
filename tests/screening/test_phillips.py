"""Phillips-Van Vechten routes against Phillips' published table (tests/data/phillips_1970.csv)."""

import csv
from pathlib import Path

import numpy as np
import pytest

from screening import phillips
from screening.evaluate import catalogue_table
from screening.report import compound_report

TABLE = Path(__file__).parent.parent / "data" / "phillips_1970.csv"


def _rows() -> list[dict[str, str]]:
    with TABLE.open() as handle:
        return list(csv.DictReader(line for line in handle if not line.startswith("#")))


ROWS = _rows()


def _ionicities(route: str) -> tuple[list[str], np.ndarray, np.ndarray]:
    table = catalogue_table()
    result = getattr(table, route)
    names, ours, theirs = [], [], []
    for row in ROWS:
        value = result.ionicity[table.index(row["formula"])]
        if np.isfinite(value):
            names.append(row["formula"])
            ours.append(value)
            theirs.append(float(row["ionicity"]))
    return names, np.array(ours), np.array(theirs)


GROUP_IV = ("C", "Si", "Ge")
"""Homopolar by construction in both routes (C = 0): Eh is drawn through diamond and Si, and
Ge's D is fitted to make it so; the figures are quoted with and without them."""


def _mae(route: str, *, without_group_iv: bool = False) -> tuple[int, float, dict]:
    names, ours, theirs = _ionicities(route)
    keep = [n not in GROUP_IV or not without_group_iv for n in names]
    errors = np.abs(ours - theirs)[keep]
    kept = [n for n, k in zip(names, keep, strict=True) if k]
    return len(kept), float(errors.mean()), dict(zip(kept, errors.round(3), strict=True))


def test_spectroscopic_ionicity_mae_against_phillips_1970() -> None:
    # Phillips, Rev. Mod. Phys. 42, 317 (1970); values from memory (see the data file).
    # Measured here: MAE 0.019 over 16 compounds; 0.024 without C, Si, Ge (13). With Van
    # Vechten's published Eh law instead of the one through our diamond and Si it was 0.022 and
    # 0.025 (Si alone then came out at 0.026).
    count, mae, errors = _mae("spectroscopic")
    assert count == 16 and mae == pytest.approx(0.019, abs=0.0015), errors
    count, mae, errors = _mae("spectroscopic", without_group_iv=True)
    assert count == 13 and mae == pytest.approx(0.024, abs=0.0015), errors


def test_predictive_ionicity_mae_against_phillips_1970() -> None:
    # Same source and values; the predictive route reads dielectric data only through Eh (the
    # law through diamond and Si). Measured here: MAE 0.033 over 17 compounds; 0.040 without
    # C, Si, Ge (14) (0.034 and 0.041 with Van Vechten's published Eh law).
    count, mae, errors = _mae("predictive")
    assert count == len(ROWS) == 17 and mae == pytest.approx(0.033, abs=0.0015), errors
    count, mae, errors = _mae("predictive", without_group_iv=True)
    assert count == 14 and mae == pytest.approx(0.040, abs=0.0015), errors


@pytest.mark.parametrize("row", [r for r in ROWS if r["homopolar_gap_eV"]],
                         ids=lambda r: r["formula"])
def test_homopolar_gap_within_two_percent_of_phillips(row: dict[str, str]) -> None:
    # Eh of Phillips (1970), from memory; ours from the measured bond length, by Van Vechten's
    # published law and by the law through our own diamond and Si.
    table = catalogue_table()
    d = table.bond_length_used_angstrom[table.index(row["formula"])]
    assert phillips.homopolar_gap(d) == pytest.approx(float(row["homopolar_gap_eV"]), rel=0.02)
    assert table.homopolar_law.gap(d) == pytest.approx(float(row["homopolar_gap_eV"]), rel=0.02)


def test_homopolar_law_through_diamond_and_si_is_near_van_vechtens() -> None:
    # Eh = 39.74 d^-2.48 eV (Van Vechten, Phys. Rev. 182, 891 (1969); from memory) was drawn
    # through diamond and Si with the eps_inf of 1969; ours through eps_inf(C) = 5.70 and
    # eps_inf(Si) = 11.7 of the seed data lands within about 1 % of both numbers.
    law = catalogue_table().homopolar_law
    assert law.prefactor_eV == pytest.approx(phillips.VAN_VECHTEN_1969.prefactor_eV, rel=0.015)
    assert law.exponent == pytest.approx(phillips.VAN_VECHTEN_1969.exponent, rel=0.015)


def test_electron_gas_of_gaas() -> None:
    # GaAs: hbar omega_p = 15.6 eV, E_F = 11.5 eV, k_s = 2.04 1/A (Van Vechten, Phys. Rev. 182,
    # 891 (1969), Table I; from memory).
    plasma, fermi, _, k_s = phillips.electron_gas(5.65325**3 / 4)
    assert plasma == pytest.approx(15.6, abs=0.1)
    assert fermi == pytest.approx(11.5, abs=0.1)
    assert k_s == pytest.approx(2.04, abs=0.02)


@pytest.mark.parametrize("formula", ["C", "Si", "Ge", "Sn"])
def test_elements_have_zero_ionicity_by_both_routes(formula: str) -> None:
    # C = 0 for an element by definition (Phillips, Rev. Mod. Phys. 42, 317 (1970)): exactly,
    # in the table and in the compound report the API and pages show.
    table = catalogue_table()
    i = table.index(formula)
    for route in (table.spectroscopic, table.predictive):
        assert route.heteropolar_gap_eV[i] == 0.0
        assert route.ionicity[i] == 0.0
        assert route.average_gap_eV[i] == route.homopolar_gap_eV[i]
    report = compound_report(formula)["phillips"]
    assert report["spectroscopic"]["ionicity"] == 0.0
    assert report["predictive"]["ionicity"] == 0.0


def test_spectroscopic_c_is_zero_below_rounding_and_nan_without_eps() -> None:
    # An element's Eg and Eh agree to rounding; a real C of 1 meV is kept; no eps_inf, no C.
    law = phillips.HomopolarLaw(prefactor_eV=40.0, exponent=2.5)
    d = np.array([2.35, 2.35, 2.35])
    volume = (d * 4 / np.sqrt(3)) ** 3 / 4
    eh = float(law.gap(2.35))
    eps = 12.0
    d_exact = phillips.d_factor_of_element(eps, 2.35, law)
    plasma, fermi, _, _ = phillips.electron_gas(volume[0])
    eg_1mev = np.hypot(eh, 1e-3)
    d_1mev = (eps - 1) * eg_1mev**2 / (plasma**2 * phillips.penn_factor(eg_1mev, fermi))
    result = phillips.spectroscopic(d, volume, [eps, eps, np.nan], [d_exact, d_1mev, 1.0], law)
    assert result.heteropolar_gap_eV[0] == 0.0
    assert result.heteropolar_gap_eV[1] == pytest.approx(1e-3, rel=1e-3)
    assert np.isnan(result.heteropolar_gap_eV[2]) and np.isnan(result.ionicity[2])


def test_critical_ionicity_line_on_the_eh_c_plane() -> None:
    # fc = 0.785 is the line C/Eh = sqrt(0.785/0.215) = 1.91 (Phillips 1970; from memory).
    assert np.sqrt(phillips.CRITICAL_IONICITY / (1 - phillips.CRITICAL_IONICITY)) == \
        pytest.approx(1.91, abs=0.005)


AL_V_PHILLIPS = {"AlP": 0.307, "AlAs": 0.274, "AlSb": 0.250, "GaAs": 0.310}
"""Phillips, Rev. Mod. Phys. 42, 317 (1970), from memory. AlSb is uncertain: 0.426 is also
recalled (the physics reference, Table A), and the data file leaves AlP and AlSb out."""


def test_al_v_predictive_ionicity_falls_down_the_anion_column_below_gaas() -> None:
    # Phillips' order (AL_V_PHILLIPS): AlP > AlAs > AlSb, and AlAs (0.274) < GaAs (0.310).
    table = catalogue_table()
    fi = {f: table.predictive.ionicity[table.index(f)] for f in AL_V_PHILLIPS}
    assert fi["AlP"] > fi["AlAs"] > fi["AlSb"]
    assert fi["AlAs"] < fi["GaAs"]


def test_al_v_spectroscopic_order_is_set_by_the_measured_eps_inf_not_by_d() -> None:
    # A known limit, listed so that any change to it is seen. The spectroscopic route gives
    # AlP 0.38, AlAs 0.44, AlSb 0.43 against Phillips' 0.307, 0.274, 0.250 (AL_V_PHILLIPS).
    # Van Vechten's d factor only adds oscillator strength (D >= 1, Phys. Rev. 182, 891
    # (1969)); even D = 1 for AlAs (no d contribution at all) leaves it above GaAs, because
    # its measured eps_inf (8.16, seed data) is far below GaAs' (10.89).
    table = catalogue_table()
    law = table.homopolar_law
    i, j = table.index("AlAs"), table.index("GaAs")
    d, volume = table.bond_length_used_angstrom, table.volume_per_pair_angstrom3
    alas_d1 = phillips.spectroscopic(d[i], volume[i], table.eps_inf[i], 1.0, law).ionicity
    assert alas_d1 > table.spectroscopic.ionicity[j]
    # AlP has D = 1 in every definition (no d shell on either atom): Phillips' 0.307 needs
    # eps_inf = 8.35 here, against the measured 7.54 (seed data).
    k = table.index("AlP")
    eh = float(law.gap(d[k]))
    eg = eh / np.sqrt(1.0 - AL_V_PHILLIPS["AlP"])
    plasma, fermi, _, _ = phillips.electron_gas(volume[k])
    needed = 1.0 + (plasma / eg) ** 2 * phillips.penn_factor(eg, fermi)
    assert needed == pytest.approx(8.35, abs=0.01)
    assert table.eps_inf[k] == pytest.approx(7.54, abs=0.005)
