"""A layer of one binary or alloy composition on a substrate: mismatch, strain, h_c.

Lattice constant by Vegard's law over the end points' measured lattice constants (a binary's
own), Poisson ratio from Vegard-averaged C11 and C12 (the flagged default where an end point
has none), then ``screening.epitaxy``: mismatch f = (a_layer - a_sub)/a_sub, in-plane strain
(a_sub - a_layer)/a_layer, (001) perpendicular strain -2 (C12/C11) eps_par = -2 nu/(1 - nu)
eps_par, and the Matthews-Blakeslee critical thickness in the chosen geometry (zincblende
layers only: the 60 degree (001) geometry does not describe wurtzite or rocksalt layers).
"""

from __future__ import annotations

import math
from typing import Any

import numpy as np

from screening import epitaxy
from screening.alloy_report import normalise_material
from screening.alloys.formula import parse_alloy
from screening.alloys.model import pack_systems, vegard
from screening.alloys.properties import check_lattice, padded_fractions
from screening.alloys.systems import require_measured_data


def layer_block(text: str, substrate: epitaxy.SubstrateSpec,
                geometry: str = "single-uncapped") -> dict[str, Any]:
    """A layer of a binary or alloy on a substrate, as a JSON-ready dict.

    Args:
        text: Formula of the layer, e.g. "In0.53Ga0.47As" or "GaAs".
        substrate: The substrate (built-in or the user's own).
        geometry: A key of ``epitaxy.GEOMETRIES``.

    Returns:
        Substrate, layer a, mismatch (with its sign convention), in-plane and perpendicular
        strain, Poisson ratio (and whether assumed), critical thickness (nm; None when
        lattice-matched or not applicable, with a note saying which) and the geometry named.

    Raises:
        BondgapInputError: Unreadable formula, end points without measured data, a layer of
            the other lattice kind than the substrate, an unknown geometry.
    """
    shape = epitaxy.misfit_geometry(geometry)
    alloy = parse_alloy(normalise_material(text))
    system = alloy.system
    require_measured_data(system)
    check_lattice(system, substrate)
    packed = pack_systems((system,))
    index = np.zeros(1, dtype=np.intp)
    padded = padded_fractions([alloy.fractions])
    a_layer = vegard(packed, index, padded, packed.lattice_a_angstrom)
    c11 = vegard(packed, index, padded, packed.c11_GPa)
    c12 = vegard(packed, index, padded, packed.c12_GPa)
    nu_array, assumed = epitaxy.poisson_ratio_001(c11, c12)
    a_sub = substrate.lattice_a_angstrom
    strain = float(epitaxy.in_plane_strain(a_layer, a_sub)[0])
    nu = float(nu_array[0])
    if system.structure == "zincblende":
        h_c = float(epitaxy.critical_thickness_nm(a_layer, a_sub, nu, geometry)[0])
        note = ("lattice-matched: no critical thickness" if math.isinf(h_c)
                else "no thickness above one Burgers vector is stable" if h_c == 0.0
                else "Matthews-Blakeslee force balance, 60 degree dislocations on (001)")
    else:
        h_c = math.nan
        note = (f"not given for {system.structure} layers: the (001) 60 degree geometry "
                "applies to zincblende layers")
    return {
        "formula": alloy.formula,
        "substrate": substrate.name,
        "substrate_lattice": substrate.lattice,
        "substrate_a_angstrom": float(a_sub),
        "substrate_note": substrate.note,
        "layer_a_angstrom": float(a_layer[0]),
        "mismatch": float(epitaxy.lattice_mismatch(a_layer, a_sub)[0]),
        "mismatch_convention": epitaxy.MISMATCH_CONVENTION,
        "in_plane_strain": strain,
        "perpendicular_strain_001": (-2.0 * nu / (1.0 - nu) * strain
                                     if system.lattice == "cubic" else None),
        "strain_kind": "none" if strain == 0.0 else ("compressive" if strain < 0 else "tensile"),
        "poisson_ratio_001": nu,
        "poisson_assumed": bool(assumed[0]),
        "critical_thickness_nm": h_c if math.isfinite(h_c) else None,
        "critical_thickness_note": note,
        "geometry": {"name": shape.name, "factor": shape.factor,
                     "description": shape.description, "reference": shape.reference},
    }
