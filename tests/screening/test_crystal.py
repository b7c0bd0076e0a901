import numpy as np
import pytest
from pymatgen.core import Structure

from screening.crystal import CellSpec, build_structure, to_cif, to_poscar


def _nearest(structure: Structure) -> list[float]:
    return sorted(n.nn_distance for n in structure.get_neighbors(structure[0], 3.5))


@pytest.mark.parametrize(
    ("spec", "bond"),
    [
        # GaAs a = 5.65325 A (VMR 2001; from memory): d = sqrt(3) a / 4.
        (CellSpec("zincblende", "Ga", "As", 5.65325, None, "GaAs"), np.sqrt(3) * 5.65325 / 4),
        # NaCl a = 5.640 A (CRC Handbook; from memory): d = a / 2.
        (CellSpec("rocksalt", "Na", "Cl", 5.640, None, "NaCl"), 5.640 / 2),
        # Si a = 5.431 A (Madelung 2004; from memory).
        (CellSpec("diamond", "Si", "Si", 5.431, None, "Si"), np.sqrt(3) * 5.431 / 4),
    ],
)
def test_cif_parses_back_with_lattice_and_bond(spec: CellSpec, bond: float) -> None:
    parsed = Structure.from_str(to_cif(spec), fmt="cif")
    assert parsed.lattice.abc == pytest.approx((spec.a_angstrom,) * 3, abs=1e-6)
    assert _nearest(parsed)[0] == pytest.approx(bond, abs=1e-4)


def test_wurtzite_cell_has_four_equal_bonds() -> None:
    # GaN a = 3.189, c = 5.185 A (VMR, J. Appl. Phys. 94, 3675 (2003); from memory).
    parsed = Structure.from_str(to_poscar(CellSpec("wurtzite", "Ga", "N", 3.189, 5.185, "GaN")),
                                fmt="poscar")
    bonds = _nearest(parsed)[:4]
    assert max(bonds) - min(bonds) < 1e-6


def test_virtual_crystal_cell_is_cif_only() -> None:
    spec = CellSpec("zincblende", {"In": 0.53, "Ga": 0.47}, "As", 5.8687, None, "VCA")
    parsed = Structure.from_str(to_cif(spec), fmt="cif")
    assert parsed.composition["In"] == pytest.approx(4 * 0.53)
    with pytest.raises(ValueError, match="fractional"):
        to_poscar(spec)


def test_unknown_structure_is_refused() -> None:
    with pytest.raises(ValueError, match="accepted"):
        build_structure(CellSpec("cinnabar", "Hg", "S", 4.1, None, "HgS"))
