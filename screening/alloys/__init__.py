"""Alloys of octet binaries: formulas, systems, interpolated properties and the finder.

Ternaries A(x)B(1-x)C and AC(y)D(1-y) and quaternaries A(x)B(1-x)C(y)D(1-y), A(x)B(y)C(1-x-y)D
and AB(x)C(y)D(1-x-y) of binaries that share a sublattice family and a crystal structure.
Lattice constants by Vegard's law, band gaps from the end points with published bowing
parameters (Glisson/VMR interpolation for quaternaries), ionicity and polarity in the virtual
crystal approximation, and a vectorised search for compositions that meet a target on a
substrate. Everything works on numpy arrays over compositions.
"""

from screening.alloys.endpoints import endpoint_gaps
from screening.alloys.finder import find_compositions, select_systems
from screening.alloys.formula import Alloy, format_alloy, parse_alloy, parse_material
from screening.alloys.interpolation import COMPOSITION_LAWS, default_bowing
from screening.alloys.paging import ORDER_KEYS, Page
from screening.alloys.properties import (
    AlloyProperties,
    EpitaxyResult,
    alloy_properties,
    formula_properties,
    on_substrate,
)
from screening.alloys.query import ALL_SYSTEMS, FinderQuery, GapWindow
from screening.alloys.results import JSON_KEYS, MATCH_KINDS, AlloyMatch, FinderResult
from screening.alloys.systems import AlloySystem, design_space_systems, parse_system
from screening.alloys.vca import VcaResult, vca_bonds

__all__ = [
    "ALL_SYSTEMS",
    "COMPOSITION_LAWS",
    "JSON_KEYS",
    "MATCH_KINDS",
    "ORDER_KEYS",
    "Alloy",
    "AlloyMatch",
    "AlloyProperties",
    "AlloySystem",
    "EpitaxyResult",
    "FinderQuery",
    "FinderResult",
    "GapWindow",
    "Page",
    "VcaResult",
    "alloy_properties",
    "default_bowing",
    "design_space_systems",
    "endpoint_gaps",
    "find_compositions",
    "format_alloy",
    "formula_properties",
    "on_substrate",
    "parse_alloy",
    "parse_material",
    "parse_system",
    "select_systems",
    "vca_bonds",
]
