"""The crystal cell of a candidate (binary or alloy) from the lattice constants the engine uses.

:func:`material_cell` gives the :class:`~screening.crystal.CellSpec` that
:func:`~screening.crystal.to_cif` and :func:`~screening.crystal.to_poscar` write:

* a catalogue binary of known structure and measured lattice constant(s): zincblende or diamond
  (a), rocksalt (a) or wurtzite (a, c; equal-bond u), so that the nearest-neighbour distance of
  the cell is the bond length of the report (``bond_length_used_angstrom``);
* a binary without a measured lattice constant, or of structure ``other`` or unknown: the cell
  of its observed structure where that is cubic, else zincblende, built from the estimated bond
  length the models used (a = 4 d / sqrt 3, or 2 d for rocksalt), labelled "estimated";
* an alloy: the virtual-crystal average cell of its system's structure, each site occupied by
  its elements in their fractions, with the Vegard lattice constant(s), labelled as a virtual
  crystal. Such a cell is CIF only (POSCAR cannot hold fractional occupancies).

Every cell carries a one-line label saying what it is and where its lattice constant comes from.
"""

from __future__ import annotations

import math

from screening import MODEL_VERSION
from screening.crystal import CellSpec
from screening.structure import lattice_from_bond_length

_CUBIC = ("zincblende", "diamond", "rocksalt")
"""Cubic structures, built from one lattice constant."""


def _binary_cell(formula: str) -> CellSpec:
    """The cell of a catalogue binary (normalised formula)."""
    from screening.evaluate import catalogue_table

    table = catalogue_table()
    i = table.index(formula)
    compound = table.compounds[i]
    structure = table.structure[i]
    a = float(table.lattice_constant_angstrom[i])
    c = float(table.lattice_c_angstrom[i])
    bond = float(table.bond_length_used_angstrom[i])
    tail = f"bondgap engine model {MODEL_VERSION}"
    if structure == "wurtzite" and math.isfinite(a) and math.isfinite(c):
        label = (f"{formula} wurtzite (P6_3mc), measured a = {a:g} A, c = {c:g} A, "
                 f"u for four equal bonds (d = {bond:.5f} A); {tail}")
        return CellSpec("wurtzite", compound.cation, compound.anion, a, c, label)
    if structure in _CUBIC and math.isfinite(a):
        label = f"{formula} {structure}, measured a = {a:g} A (d = {bond:.5f} A); {tail}"
        return CellSpec(structure, compound.cation, compound.anion, a, None, label)
    shape = structure if structure in _CUBIC else "zincblende"
    known = f"observed {structure}" if structure else "structure not known"
    a = float(lattice_from_bond_length(shape, bond)[0])
    label = (f"{formula} {shape} cell ({known}; no measured lattice constant): a = {a:.5f} A "
             f"from the estimated bond length d = {bond:.5f} A; {tail}")
    return CellSpec(shape, compound.cation, compound.anion, a, None, label)


def _alloy_cell(formula: str) -> CellSpec:
    """The virtual-crystal average cell of an alloy composition."""
    from screening.alloys import alloy_properties, parse_alloy

    alloy = parse_alloy(formula)
    system = alloy.system
    props = alloy_properties(system, [alloy.fractions])
    n_cat = len(system.cations)
    cation = {e: f for e, f in zip(system.cations, alloy.fractions[:n_cat], strict=True) if f}
    anion = {e: f for e, f in zip(system.anions, alloy.fractions[n_cat:], strict=True) if f}
    a = float(props.lattice_constant_angstrom[0])
    c = float(props.lattice_c_angstrom[0])
    hexagonal = system.structure == "wurtzite"
    lengths = f"a = {a:.5f} A, c = {c:.5f} A" if hexagonal else f"a = {a:.5f} A"
    label = (f"{alloy.formula} VIRTUAL-CRYSTAL AVERAGE CELL ({system.structure}; fractional "
             f"site occupancies, not an ordered structure): {lengths} by Vegard's law over the "
             f"end points' measured lattice constants; bondgap engine model {MODEL_VERSION}")
    return CellSpec(system.structure, cation, anion, a, c if hexagonal else None, label)


def material_cell(text: str) -> CellSpec:
    """The cell of a binary compound or an alloy composition.

    Args:
        text: A formula: "GaAs", "AsGa", "In0.53Ga0.47As".

    Returns:
        The cell spec; ``is_virtual_crystal(spec)`` tells an alloy's average cell.

    Raises:
        BondgapInputError: A subclass naming what is wrong with the formula (alloys whose end
            points lack measured lattice constants included).
    """
    from screening.alloys import parse_material
    from screening.alloys.formula import Alloy

    material = parse_material(text)
    if isinstance(material, Alloy):
        return _alloy_cell(material.formula)
    return _binary_cell(material.formula)


def is_virtual_crystal(spec: CellSpec) -> bool:
    """Whether a cell has fractionally occupied sites (an alloy's average cell: CIF only)."""
    return not isinstance(spec.cation, str) or not isinstance(spec.anion, str)
