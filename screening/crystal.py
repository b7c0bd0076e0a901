"""Crystal structures of candidates for follow-up ab-initio work, built with pymatgen.

Cells are built from the lattice constants the engine used: zincblende and diamond (F-43m /
Fd-3m conventional cube, 8 atoms), rocksalt (Fm-3m, 8 atoms) and wurtzite (P6_3mc, 4 atoms,
u = 1/4 + a^2/3c^2 so the four bonds are equal, as in `screening.structure`). A compound whose
structure is unknown or ``other`` is built as zincblende from its estimated bond length, and
labelled so. An alloy is the virtual-crystal average cell: one fcc (or hexagonal) cell with the
Vegard lattice constant and fractionally occupied sites, labelled as such; POSCAR cannot carry
fractional occupancies, so alloys are written as CIF only.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass
from typing import TYPE_CHECKING

import numpy as np

if TYPE_CHECKING:
    from pymatgen.core import Structure

FCC = np.array([[0.0, 0.0, 0.0], [0.0, 0.5, 0.5], [0.5, 0.0, 0.5], [0.5, 0.5, 0.0]])

Species = str | Mapping[str, float]
"""An element symbol, or element -> fraction for a virtual-crystal (alloy) site."""


@dataclass(frozen=True)
class CellSpec:
    """What a cell is built from (lengths in angstrom)."""

    structure: str
    cation: Species
    anion: Species
    a_angstrom: float
    c_angstrom: float | None
    label: str


def build_structure(spec: CellSpec) -> Structure:
    """The pymatgen Structure of a cell spec.

    Raises:
        ValueError: an unknown structure name or a non-positive lattice constant.
    """
    from pymatgen.core import Lattice, Structure

    if not spec.a_angstrom > 0:
        raise ValueError(f"lattice constant must be positive, got {spec.a_angstrom}")
    cation = dict(spec.cation) if isinstance(spec.cation, Mapping) else spec.cation
    anion = dict(spec.anion) if isinstance(spec.anion, Mapping) else spec.anion
    if spec.structure in ("zincblende", "diamond"):
        coords = np.vstack([FCC, FCC + 0.25])
        return Structure(Lattice.cubic(spec.a_angstrom), [cation] * 4 + [anion] * 4, coords)
    if spec.structure == "rocksalt":
        coords = np.vstack([FCC, (FCC + [0.5, 0.0, 0.0]) % 1.0])
        return Structure(Lattice.cubic(spec.a_angstrom), [cation] * 4 + [anion] * 4, coords)
    if spec.structure == "wurtzite":
        if spec.c_angstrom is None or not spec.c_angstrom > 0:
            raise ValueError("a wurtzite cell needs a positive c lattice constant")
        a, c = spec.a_angstrom, spec.c_angstrom
        u = 0.25 + a * a / (3.0 * c * c)
        third, two_thirds = 1.0 / 3.0, 2.0 / 3.0
        coords = [[third, two_thirds, 0.0], [two_thirds, third, 0.5],
                  [third, two_thirds, u], [two_thirds, third, 0.5 + u]]
        return Structure(Lattice.hexagonal(a, c), [cation, cation, anion, anion], coords)
    raise ValueError(
        f"cannot build a '{spec.structure}' cell; accepted: zincblende, diamond, rocksalt, wurtzite"
    )


def to_cif(spec: CellSpec) -> str:
    """CIF text of the cell, with the label as the data block comment."""
    from pymatgen.io.cif import CifWriter

    text = str(CifWriter(build_structure(spec)))
    return f"# {spec.label}\n{text}"


def to_poscar(spec: CellSpec) -> str:
    """POSCAR text of an ordered cell (VASP format); alloys (fractional sites) are refused.

    Raises:
        ValueError: for a virtual-crystal cell, which POSCAR cannot represent.
    """
    from pymatgen.io.vasp import Poscar

    structure = build_structure(spec)
    if not structure.is_ordered:
        raise ValueError("POSCAR cannot hold fractional site occupancies; use the CIF")
    return Poscar(structure, comment=spec.label).get_str()
