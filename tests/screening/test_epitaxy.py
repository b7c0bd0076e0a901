"""Mismatch, strain, Poisson ratio and critical thickness (screening.epitaxy)."""

import numpy as np
import pytest

from screening import epitaxy
from screening.alloys import alloy_properties, on_substrate, parse_system
from screening.errors import (
    OutOfRangeError,
    StructureMismatchError,
    UnknownChoiceError,
    UnknownSubstrateError,
)
from screening.reference import elastic_constants, substrates


def test_mismatch_sign_convention_and_strain() -> None:
    # A larger layer (InAs-rich) on GaAs: f > 0, compressed in-plane (eps_par < 0).
    f = epitaxy.lattice_mismatch(5.7343, 5.65325)
    eps = epitaxy.in_plane_strain(5.7343, 5.65325)
    assert f > 0 and eps < 0
    assert f == pytest.approx((5.7343 - 5.65325) / 5.65325, rel=1e-15)
    assert eps == pytest.approx((5.65325 - 5.7343) / 5.7343, rel=1e-15)
    assert "compressed" in epitaxy.MISMATCH_CONVENTION


def test_poisson_ratio_and_perpendicular_strain_of_gaas() -> None:
    # GaAs C11 = 122.1, C12 = 56.6 GPa (VMR 2001, from memory): nu = 0.317.
    gaas = elastic_constants()["GaAs"]
    nu, assumed = epitaxy.poisson_ratio_001(gaas.c11_GPa, gaas.c12_GPa)
    assert nu == pytest.approx(56.6 / (122.1 + 56.6), rel=1e-12)
    assert nu == pytest.approx(gaas.poisson_ratio_001, rel=1e-12)
    assert not assumed
    assert epitaxy.perpendicular_strain_001(-0.01, 122.1, 56.6) == pytest.approx(
        2 * 56.6 / 122.1 * 0.01)
    default, flagged = epitaxy.poisson_ratio_001(np.nan, 50.0)
    assert flagged and default == epitaxy.DEFAULT_POISSON_RATIO


@pytest.mark.parametrize("geometry", list(epitaxy.GEOMETRIES))
def test_matthews_blakeslee_force_balance_holds_at_the_solved_thickness(geometry: str) -> None:
    strain = np.geomspace(1e-4, 3e-2, 40)
    b, nu = 4.0, 0.31
    h = epitaxy.matthews_blakeslee_thickness(strain, b, nu, geometry)
    assert np.all(h > b)
    residual = epitaxy.matthews_blakeslee_residual(h, strain, b, nu, geometry)
    scale = 2 * (1 + nu) * (h / b) * strain * 0.5  # the misfit-force term
    assert np.max(np.abs(residual) / scale) < 1e-10


def test_critical_thickness_falls_as_mismatch_grows() -> None:
    strain = np.linspace(1e-3, 4e-2, 200)
    h = epitaxy.matthews_blakeslee_thickness(strain, 4.0, 0.31)
    assert np.all(np.diff(h) < 0)


def test_closed_form_equals_fixed_point_iteration() -> None:
    strain, b, nu = 0.01, 4.0, 0.3
    k = (1 - nu / 4) / (8 * np.pi * strain * (1 + nu) * 0.5)
    t = 10.0
    for _ in range(200):  # t = K (ln t + 1) converges from above on the large root
        t = k * (np.log(t) + 1)
    assert epitaxy.matthews_blakeslee_thickness(strain, b, nu) == pytest.approx(t * b, rel=1e-10)


def test_limits_zero_strain_and_no_stable_thickness() -> None:
    h = epitaxy.matthews_blakeslee_thickness([0.0, 0.2, np.nan], 4.0, 0.3)
    assert h[0] == np.inf
    assert h[1] == 0.0  # K < 1: no thickness above one Burgers vector
    assert np.isnan(h[2])


def test_capped_well_is_thicker_than_single_layer() -> None:
    single = epitaxy.matthews_blakeslee_thickness(0.01, 4.0, 0.3, "single-uncapped")
    capped = epitaxy.matthews_blakeslee_thickness(0.01, 4.0, 0.3, "capped-well")
    assert capped > 2 * single  # twice the line tension, and ln(h/b) grows too


def test_critical_strain_inverts_the_critical_thickness() -> None:
    thickness = np.geomspace(5.0, 1e5, 30)  # angstrom, above b
    b, nu = 4.0, 0.33
    for geometry in epitaxy.GEOMETRIES:
        eps = epitaxy.critical_strain(thickness, b, nu, geometry)
        assert epitaxy.matthews_blakeslee_thickness(eps, b, nu, geometry) == pytest.approx(
            thickness, rel=1e-9)


def test_people_bean_satisfies_its_balance_and_exceeds_matthews_blakeslee_for_sige() -> None:
    # People & Bean, Appl. Phys. Lett. 47, 322 (1985): b = 4 A for SiGe; their energy balance
    # lies well above Matthews-Blakeslee at low Ge content (from memory).
    f, b, a, nu = 0.0083, 4.0, 5.431, 0.28  # about Si0.8Ge0.2 on Si
    h = epitaxy.people_bean_thickness(f, b, a, nu)
    rhs = (1 - nu) / (1 + nu) / (16 * np.pi * np.sqrt(2)) * b**2 / a / f**2 * np.log(h / b)
    assert h == pytest.approx(rhs, rel=1e-10)
    assert h > 5 * epitaxy.matthews_blakeslee_thickness(f, b, nu)


def test_unknown_geometry_lists_the_choices() -> None:
    with pytest.raises(UnknownChoiceError, match="single-uncapped"):
        epitaxy.matthews_blakeslee_thickness(0.01, 4.0, 0.3, "triple")


def test_substrates_from_the_table() -> None:
    inp = epitaxy.substrate_spec("InP")
    assert inp.lattice == "cubic"
    assert inp.lattice_a_angstrom == substrates()["InP"].lattice_a_angstrom
    sapphire = epitaxy.substrate_spec("sapphire")
    assert sapphire.lattice == "hexagonal"
    # GaN on c-sapphire: compare with a/sqrt(3) (30-degree rotated epitaxy); about 16 %
    # mismatch (e.g. S. Nakamura et al., The Blue Laser Diode, Springer 2000; from memory).
    assert sapphire.lattice_a_angstrom == pytest.approx(4.758 / np.sqrt(3), rel=1e-3)
    assert epitaxy.lattice_mismatch(3.189, sapphire.lattice_a_angstrom) == pytest.approx(
        0.16, abs=0.01)
    with pytest.raises(UnknownSubstrateError, match="InP"):
        epitaxy.substrate_spec("unobtainium")


def test_algaas_mismatch_to_gaas_is_below_0p15_percent_for_all_x() -> None:
    # a(AlAs) = 5.6611, a(GaAs) = 5.65325 A (VMR 2001, from memory): at most
    # (5.6611 - 5.65325) / 5.65325 = 0.139 %.
    x = np.linspace(0.0, 1.0, 1001)
    props = alloy_properties(parse_system("AlGaAs"), np.column_stack([x, 1 - x, np.ones_like(x)]))
    result = on_substrate(props, epitaxy.substrate_spec("GaAs"))
    assert np.max(np.abs(result.mismatch)) < 0.0015
    assert np.all(result.mismatch >= 0.0)
    assert np.all(np.diff(result.critical_thickness_nm[1:]) < 0)  # grows with Al, falls


def test_layer_and_substrate_lattices_must_agree() -> None:
    props = alloy_properties(parse_system("InGaN"), [[0.1, 0.9, 1.0]])
    with pytest.raises(StructureMismatchError, match="hexagonal"):
        on_substrate(props, epitaxy.substrate_spec("GaAs"))
    result = on_substrate(props, epitaxy.substrate_spec("GaN"))
    assert result.mismatch[0] > 0
    assert np.isnan(result.critical_thickness_nm[0])  # (001) 60 degree geometry: cubic only


def test_substrates_of_the_users_own() -> None:
    own = epitaxy.substrate_from("my InP", "zincblende", 5.87)
    assert (own.lattice, own.lattice_a_angstrom) == ("cubic", 5.87)
    assert epitaxy.substrate_from("c-sapphire", "corundum", 4.758).lattice_a_angstrom == (
        pytest.approx(4.758 / np.sqrt(3)))
    with pytest.raises(UnknownChoiceError, match="zincblende"):
        epitaxy.substrate_from("x", "perovskite", 3.9)
    with pytest.raises(OutOfRangeError):
        epitaxy.substrate_from("x", "zincblende", -1.0)
