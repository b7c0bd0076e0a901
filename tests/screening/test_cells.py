import numpy as np
import pytest
from pymatgen.core import Structure

from screening.alloy_report import alloy_report
from screening.catalogue import catalogue_formulas
from screening.cells import is_virtual_crystal, material_cell
from screening.crystal import to_cif, to_poscar
from screening.errors import BondgapInputError
from screening.report import compound_report

# pymatgen notes that it rounds the hexagonal coordinates 0.33333333 and 0.66666667 written in
# a CIF to exactly 1/3 and 2/3 when it reads them back: expected, and harmless here.
pytestmark = pytest.mark.filterwarnings(
    "ignore:Issues encountered while parsing CIF.*rounded to ideal values:UserWarning"
)


def nearest(structure: Structure) -> float:
    return min(n.nn_distance for n in structure.get_neighbors(structure[0], 4.0))


@pytest.mark.parametrize("formula", catalogue_formulas())
def test_binary_cif_gives_the_lattice_constant_and_bond_length_the_engine_used(
    formula: str,
) -> None:
    report = compound_report(formula)
    spec = material_cell(formula)
    parsed = Structure.from_str(to_cif(spec), fmt="cif")
    assert nearest(parsed) == pytest.approx(report["bond_length_used_angstrom"], abs=1e-4)
    a = report["lattice_constant_angstrom"]
    if a is not None:
        assert parsed.lattice.a == pytest.approx(a, abs=1e-6)
    if report["structure"]["observed"] == "wurtzite":
        assert parsed.lattice.c == pytest.approx(report["lattice_c_angstrom"], abs=1e-6)
    else:
        assert parsed.lattice.abc == pytest.approx((parsed.lattice.a,) * 3)
    assert set(parsed.composition.as_dict()) == {report["cation"], report["anion"]}
    assert formula in spec.label and not is_virtual_crystal(spec)


@pytest.mark.parametrize("formula", ["GaAs", "GaN", "NaCl", "Si", "BSb"])
def test_poscar_parses_back_to_the_same_cell(formula: str) -> None:
    spec = material_cell(formula)
    from_cif = Structure.from_str(to_cif(spec), fmt="cif")
    from_poscar = Structure.from_str(to_poscar(spec), fmt="poscar")
    assert from_poscar.lattice.abc == pytest.approx(from_cif.lattice.abc, abs=1e-6)
    assert nearest(from_poscar) == pytest.approx(nearest(from_cif), abs=1e-6)


def test_unknown_structure_is_labelled_as_estimated() -> None:
    spec = material_cell("BSb")  # no measured lattice constant in the seed data
    assert spec.structure == "zincblende" and "estimated bond length" in spec.label


@pytest.mark.parametrize("formula", ["In0.53Ga0.47As", "Al0.3Ga0.7N", "In0.73Ga0.27As0.58P0.42"])
def test_alloy_is_a_labelled_virtual_crystal_in_cif_only(formula: str) -> None:
    report = alloy_report(formula)
    spec = material_cell(formula)
    assert is_virtual_crystal(spec) and "VIRTUAL-CRYSTAL" in spec.label
    text = to_cif(spec)
    assert text.splitlines()[0].startswith(f"# {formula} VIRTUAL-CRYSTAL AVERAGE CELL")
    parsed = Structure.from_str(text, fmt="cif")
    assert parsed.lattice.a == pytest.approx(report["lattice_constant_angstrom"], abs=1e-6)
    per_cell = 4 if spec.structure == "zincblende" else 2
    for element, fraction in report["fractions"].items():
        assert parsed.composition[element] == pytest.approx(per_cell * fraction, abs=1e-6)
    if spec.structure == "zincblende":  # Vegard a gives the VCA bond length exactly
        d = np.sqrt(3.0) * parsed.lattice.a / 4.0
        assert d == pytest.approx(report["bond_length_used_angstrom"], abs=1e-6)
    with pytest.raises(ValueError, match="fractional"):
        to_poscar(spec)


@pytest.mark.parametrize("text", ["Xx", "GaAs2", "In0.6Ga0.6As"])
def test_bad_formulas_are_refused(text: str) -> None:
    with pytest.raises(BondgapInputError):
        material_cell(text)
