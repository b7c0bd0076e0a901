import numpy as np
import pytest

from screening import structure


def test_diamond_bond_length_of_silicon() -> None:
    # Si: a = 5.4310 A (Madelung, Semiconductors: Data Handbook, 2004; from memory);
    # Si-Si bond 2.3517 A (same source, sqrt(3) a / 4; from memory).
    assert structure.bond_length("diamond", 5.4310, np.nan) == pytest.approx(2.3517, abs=2e-4)


def test_rocksalt_bond_is_half_the_cube() -> None:
    # NaCl: a = 5.640 A, Na-Cl 2.820 A (CRC Handbook of Chemistry and Physics; from memory).
    assert structure.bond_length("rocksalt", 5.640, np.nan) == pytest.approx(2.820, abs=1e-3)


def test_wurtzite_gan_matches_its_zincblende_polytype() -> None:
    # wz-GaN a = 3.189, c = 5.185 A; zb-GaN a = 4.50 A (VMR, J. Appl. Phys. 94, 3675 (2003);
    # from memory). Equal volume per pair puts them within 0.5 % (common practice, no source).
    a_eq = structure.zincblende_equivalent_a(3.189, 5.185)
    assert a_eq == pytest.approx(4.50, rel=5e-3)


def test_volume_per_pair_matches_bond_length() -> None:
    d = structure.bond_length("zincblende", 5.65325, np.nan)
    omega = structure.volume_per_pair("zincblende", 5.65325, np.nan)
    assert structure.tetrahedral_volume_per_pair(d) == pytest.approx(omega, rel=1e-12)


def test_unknown_structure_gives_nan() -> None:
    assert np.isnan(structure.bond_length("other", 5.0, np.nan))


def test_wurtzite_bond_is_the_ideal_one_for_ideal_c_over_a() -> None:
    # Ideal wurtzite (c/a = sqrt(8/3), u = 3/8): every bond is sqrt(3/8) a (geometry; common
    # practice, no source).
    a = 3.2
    c = a * np.sqrt(8.0 / 3.0)
    assert structure.wurtzite_u(a, c) == pytest.approx(0.375)
    assert structure.bond_length("wurtzite", a, c) == pytest.approx(np.sqrt(3.0 / 8.0) * a)


def test_gan_bond_length() -> None:
    # GaN: a = 3.189, c = 5.185 A, u = 0.377 and Ga-N bonds of 1.95 A (Madelung, Semiconductors:
    # Data Handbook, 2004; from memory).
    assert structure.wurtzite_u(3.189, 5.185) == pytest.approx(0.377, abs=0.002)
    assert structure.bond_length("wurtzite", 3.189, 5.185) == pytest.approx(1.95, abs=0.01)
