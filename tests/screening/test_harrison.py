import numpy as np
import pytest

from screening.constants import HBAR2_OVER_M_EV_ANGSTROM2
from screening.harrison import ETA_1981, bond_orbitals, covalent_energy

# Two sets of term values (eV) for the checks below: Hartree-Fock values of C and Si as
# tabulated by W. A. Harrison, Elementary Electronic Structure (World Scientific 1999), after
# J. B. Mann (1967): C eps_s = -19.38, eps_p = -11.07; Si -14.79, -7.59 (as quoted by
# Szczesniak et al., Nanoscale Res. Lett. 7, 616 (2012), Table 1).
C_S, C_P, SI_S, SI_P = -19.38, -11.07, -14.79, -7.59


def test_v2_coefficient_from_the_1981_constants() -> None:
    # V2 = 3.22 hbar^2/(m d^2): Harrison, Phys. Rev. B 24, 5835 (1981) (from memory).
    assert ETA_1981.hybrid_covalent == pytest.approx(3.22, abs=0.01)
    assert covalent_energy(1.0) == pytest.approx(3.225 * HBAR2_OVER_M_EV_ANGSTROM2, rel=1e-3)


def test_bond_levels_solve_the_two_level_secular_problem() -> None:
    # The polar bond is the 2x2 problem [[eps_h^c, -V2], [-V2, eps_h^a]] (common practice).
    d = 2.0
    b = bond_orbitals(SI_S, SI_P, C_S, C_P, d)
    matrix = np.array([[b.hybrid_energy_cation_eV, -b.covalent_energy_eV],
                       [-b.covalent_energy_eV, b.hybrid_energy_anion_eV]], dtype=float)
    low, high = np.linalg.eigvalsh(matrix)
    assert (b.bonding_eV, b.antibonding_eV) == pytest.approx((low, high), abs=1e-12)


def test_homopolar_bond_has_zero_polarity() -> None:
    b = bond_orbitals(SI_S, SI_P, SI_S, SI_P, 2.35)
    assert b.polarity == 0.0
    assert b.covalency == 1.0
    assert b.antibonding_eV - b.bonding_eV == pytest.approx(2 * b.covalent_energy_eV)


def test_polarity_and_covalency_are_unit_vector() -> None:
    rng = np.random.default_rng(1)
    s = -rng.uniform(5, 25, size=(4, 50))
    b = bond_orbitals(s[0], s[0] / 2, s[1], s[1] / 2, rng.uniform(1.5, 3.0, 50))
    assert np.allclose(b.polarity**2 + b.covalency**2, 1.0)


def test_metallic_energy_is_a_quarter_of_the_sp_splitting() -> None:
    b = bond_orbitals(SI_S, SI_P, C_S, C_P, 1.89)
    assert b.metallic_energy_cation_eV == pytest.approx((SI_P - SI_S) / 4)
    assert b.metallic_energy_anion_eV == pytest.approx((C_P - C_S) / 4)


def _spearman(x: np.ndarray, y: np.ndarray) -> float:
    """Spearman's rank correlation (no ties in the data used here)."""
    rank_x, rank_y = np.argsort(np.argsort(x)), np.argsort(np.argsort(y))
    return float(np.corrcoef(rank_x, rank_y)[0, 1])


def test_polarity_tracks_the_ionicity() -> None:
    # README: "polarity tracks fi", defined as Spearman's rank correlation between Harrison's
    # polarity alpha_p and Phillips' ionicity fi over the binaries (the group-IV elements, 0
    # in both by construction, left out): 0.97 against our spectroscopic fi (46 compounds) and
    # 0.99 against Phillips' published fi (Rev. Mod. Phys. 42, 317 (1970); 14 compounds,
    # from memory, tests/data/phillips_1970.csv).
    import csv
    from pathlib import Path

    from screening.evaluate import catalogue_table

    table = catalogue_table()
    fi = table.spectroscopic.ionicity
    binary = np.array([c.cation != c.anion for c in table.compounds])
    both = np.isfinite(fi) & binary
    assert both.sum() == 46
    assert _spearman(table.bonds.polarity[both], fi[both]) >= 0.97
    data = Path(__file__).parent.parent / "data" / "phillips_1970.csv"
    with data.open() as handle:
        rows = [r for r in csv.DictReader(x for x in handle if not x.startswith("#"))
                if r["formula"] not in ("C", "Si", "Ge")]
    polarity = np.array([table.bonds.polarity[table.index(r["formula"])] for r in rows])
    published = np.array([float(r["ionicity"]) for r in rows])
    assert len(rows) == 14
    assert _spearman(polarity, published) >= 0.98
