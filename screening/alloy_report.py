"""The alloy report: one JSON-ready dict per alloy composition, shaped like the compound report.

:func:`alloy_report` gives an alloy the top-level keys of :func:`screening.report.compound_report`
(formula, family, cation/anion, structure, lattice constant, bond lengths, Phillips and
Harrison blocks in the virtual-crystal approximation, band gap, coordination, hazards) plus
``alloy: true``, the site fractions, the end points with their weights, the bowing sources and
flags (docs/report-schema.md). :func:`material_report` dispatches on the formula: the compound
report for a binary, the alloy report for an alloy (``screening.layer`` puts either on a
substrate). Reports are computed on request (a few ms); nothing is stored.
"""

from __future__ import annotations

import math
from typing import Any

import numpy as np

from screening import MODEL_VERSION, epitaxy
from screening.alloys import AlloyProperties, alloy_properties, parse_material
from screening.alloys.endpoints import endpoint_gaps
from screening.alloys.formula import Alloy, parse_alloy
from screening.alloys.vca import site_weights, vca_bonds
from screening.constants import HC_EV_NM
from screening.coordination import BORDERLINE_HALF_WIDTH, predicted_coordination
from screening.evaluate import catalogue_table
from screening.gaps import gaps_at
from screening.hazards import hazards_block
from screening.phillips import PhillipsResult
from screening.reference import Measured, measured_compounds
from screening.report import check_temperature, compound_report
from screening.spin_orbit import spin_orbit_table

GAP_ROUTES = {
    "ternary": "lowest valley of the end-point gaps interpolated along the ternary with "
    "published bowing parameters, E = (1 - x) E_A + x E_B - x (1 - x) C (convention of "
    "Vurgaftman, Meyer & Ram-Mohan, J. Appl. Phys. 89, 5815 (2001))",
    "quaternary": "lowest valley of the end-point gaps interpolated with published bowing "
    "parameters: weighted mean of the ternary edges (Glisson et al., J. Electron. Mater. 7, 1 "
    "(1978), in the form of Vurgaftman, Meyer & Ram-Mohan, J. Appl. Phys. 89, 5815 (2001))",
}
"""The band-gap route of an alloy, by its form: a ternary is its one bowed edge."""
VCA_ROUTE = "virtual-crystal approximation: end-point inputs averaged with weights p_i q_j"
EPS_ROUTE = "virtual-crystal average of the end points' measured eps_inf, weights p_i q_j"
KIND_OF_VALLEY = {"Gamma": "direct", "X": "indirect", "L": "indirect"}
COORDINATION_OF_STRUCTURE = {"zincblende": "fourfold", "wurtzite": "fourfold",
                             "rocksalt": "sixfold"}


def _float(value: Any) -> float | None:
    number = float(value)
    return number if math.isfinite(number) else None


def _phillips(result: PhillipsResult) -> dict[str, float | None] | None:
    if not math.isfinite(float(result.ionicity[0])):
        return None
    return {"homopolar_gap_eV": _float(result.homopolar_gap_eV[0]),
            "heteropolar_gap_eV": _float(result.heteropolar_gap_eV[0]),
            "average_gap_eV": _float(result.average_gap_eV[0]),
            "ionicity": _float(result.ionicity[0])}


def _site_text(elements: tuple[str, ...], fractions: tuple[float, ...]) -> str:
    """A site as written in the formula: "In0.53Ga0.47", or "As" for one element."""
    present = [(e, f) for e, f in zip(elements, fractions, strict=True) if f > 0.0]
    if len(present) == 1:
        return present[0][0]
    return "".join(e + f"{f:.4f}".rstrip("0").rstrip(".") for e, f in present)


def _reaches_zero(gap: float | None, props: AlloyProperties) -> bool:
    """True where a positive gap's range (value - uncertainty) reaches zero."""
    uncertainty = _float(props.band_gap_uncertainty_eV[0]) or 0.0
    return gap is not None and gap > 0 and gap - uncertainty <= 0


def _wavelength_range(gap: float | None, props: AlloyProperties) -> list[float | None] | None:
    """[short, long] photon wavelengths of gap +/- uncertainty (long None where it reaches 0)."""
    uncertainty = _float(props.band_gap_uncertainty_eV[0])
    if gap is None or gap <= 0 or uncertainty is None:
        return None
    low = gap - uncertainty
    return [HC_EV_NM / (gap + uncertainty), HC_EV_NM / low if low > 0 else None]


def _band_gap(alloy: Alloy, props: AlloyProperties) -> dict[str, Any]:
    gap = _float(props.band_gap_eV[0])
    valley = str(props.valley[0])
    at = gaps_at(props.temperature_K)
    position = {c.formula: i for i, c in enumerate(catalogue_table().compounds)}
    assumed = [b for b in alloy.system.binaries if at.temperature_law_assumed[position[b]]]
    return {
        "value_eV": gap,
        "value_source": "interpolated",
        "estimate_eV": gap,
        "uncertainty_eV": _float(props.band_gap_uncertainty_eV[0]),
        "cross_validated_eV": None,
        "cross_validated_uncertainty_eV": None,
        "measured_eV": None,
        "measured_300K_eV": None,
        "semimetal": gap is not None and gap <= 0,
        "may_be_semimetal": _reaches_zero(gap, props),
        "kind": "semimetal" if gap is not None and gap <= 0 else KIND_OF_VALLEY.get(valley),
        "kind_estimate": KIND_OF_VALLEY.get(valley),
        "indirect_probability": None,
        "kind_source": f"valley of the interpolated gap ({valley or 'unknown'})",
        "valley": valley or None,
        "temperature_K": props.temperature_K,
        "temperature_law": "end points' gaps at the temperature; bowing parameters as published",
        "temperature_law_assumed": bool(assumed),
        "wavelength_nm": (_float(HC_EV_NM / gap) if gap and gap > 0
                          and not _reaches_zero(gap, props) else None),
        "wavelength_range_nm": _wavelength_range(gap, props),
        "default_bowing": bool(props.default_bowing[0]),
        "route": GAP_ROUTES[alloy.system.form],
        "sources": list(props.gap_sources),
    }


def _cited(item: Measured | None) -> str | None:
    """Where a measured value comes from, "(from memory)" added where it was recalled."""
    if item is None:
        return None
    return item.source + (" (from memory)" if item.from_memory else "")


def _spin_orbit(alloy: Alloy) -> dict[str, Any]:
    """Composition-weighted mean of the end points' Delta0 (no spin-orbit bowing)."""
    weights = site_weights(alloy.system, [alloy.fractions])[0]
    table = spin_orbit_table()
    position = {c.formula: i for i, c in enumerate(catalogue_table().compounds)}
    values = [float(table.value_eV[position[b]]) for b in alloy.system.binaries]
    routes = sorted({table.route[position[b]] for b in alloy.system.binaries})
    return {
        "splitting_eV": _float(float(np.dot(weights, values))),
        "route": "weighted mean of the end points (" + " and ".join(routes) + "), no bowing",
        "source": "end points: " + "; ".join(
            f"{b} {table.route[position[b]]}" for b in alloy.system.binaries),
    }


def _end_points(alloy: Alloy, temperature_K: float) -> list[dict[str, Any]]:
    weights = site_weights(alloy.system, [alloy.fractions])[0]
    gaps, uncertainties = endpoint_gaps(alloy.system.binaries, temperature_K)
    data = measured_compounds()
    rows = []
    for b, binary in enumerate(alloy.system.binaries):
        lattice, eps = data[binary].get("lattice_a"), data[binary].get("eps_inf")
        rows.append({"formula": binary, "weight": float(weights[b]),
                     "lattice_constant_angstrom": float(lattice.value) if lattice else None,
                     "lattice_constant_source": _cited(lattice),
                     "eps_inf": float(eps.value) if eps else None,
                     "eps_inf_source": _cited(eps),
                     "band_gap_eV": _float(gaps[b]),
                     "band_gap_uncertainty_eV": _float(uncertainties[b])})
    return rows


def _eps_inf(value: float, end_points: list[dict[str, Any]]) -> dict[str, Any]:
    """The virtual-crystal eps_inf block: the value, or null and which end points lack one."""
    missing = [p["formula"] for p in end_points if p["eps_inf"] is None]
    return {"value": _float(value), "route": EPS_ROUTE,
            "not_available": (f"no measured eps_inf for {', '.join(missing)}"
                              if missing else None)}


def _coordination(spectroscopic: PhillipsResult, predictive: PhillipsResult,
                  structure: str | None) -> dict[str, Any]:
    route = "spectroscopic" if math.isfinite(float(spectroscopic.ionicity[0])) else "predictive"
    result = spectroscopic if route == "spectroscopic" else predictive
    predicted = predicted_coordination(result.ionicity, BORDERLINE_HALF_WIDTH[route])[0]
    return {"predicted": predicted, "route": route,
            "observed": COORDINATION_OF_STRUCTURE.get(structure or "")}


def alloy_report(text: str, temperature_K: float = 300.0) -> dict[str, Any]:
    """The report of one alloy composition (docs/report-schema.md, "Alloys").

    Args:
        text: An alloy in the usual notation, e.g. "In0.53Ga0.47As".
        temperature_K: Temperature of the band-gap block, 0 to 2000 K.

    Raises:
        BondgapInputError: A subclass naming what is wrong with the formula or temperature
            (fractions off their site sum or outside [0, 1], mixed sublattices or structures,
            end points without measured data).
    """
    temperature = check_temperature(temperature_K)
    alloy = parse_alloy(text)
    system = alloy.system
    props = alloy_properties(system, [alloy.fractions], temperature)
    vca = vca_bonds(system, [alloy.fractions])
    bonds = vca.bonds
    n_cat = len(system.cations)
    present = [e for e, f in zip(system.elements, alloy.fractions, strict=True) if f > 0.0]
    end_points = _end_points(alloy, temperature)
    flags = []
    if props.default_bowing[0]:
        flags.append("a default bowing (no published value for an edge) entered the band gap")
    if props.poisson_assumed[0]:
        flags.append(f"Poisson ratio assumed ({epitaxy.DEFAULT_POISSON_RATIO:.3f}): elastic "
                     "constants missing for an end point")
    if _phillips(vca.spectroscopic) is None:
        flags.append("no spectroscopic ionicity: an end point has no measured eps_inf")
    return {
        "formula": alloy.formula,
        "alloy": True,
        "system": system.name,
        "form": system.form,
        "family": system.family,
        "cation": _site_text(system.cations, alloy.fractions[:n_cat]),
        "anion": _site_text(system.anions, alloy.fractions[n_cat:]),
        "fractions": {e: f for e, f in zip(system.elements, alloy.fractions, strict=True)},
        "sites": {"cation": dict(zip(system.cations, alloy.fractions[:n_cat], strict=True)),
                  "anion": dict(zip(system.anions, alloy.fractions[n_cat:], strict=True))},
        "model_version": MODEL_VERSION,
        "structure": {"observed": system.structure,
                      "source": "ambient structure shared by the end points (seed data)"},
        "lattice_constant_angstrom": _float(props.lattice_constant_angstrom[0]),
        "lattice_c_angstrom": _float(props.lattice_c_angstrom[0]),
        "lattice_route": "Vegard's law over the end points' measured lattice constants",
        "lattice_constant_source": "interpolated",
        "lattice_constant_estimated_angstrom": None,
        "lattice_estimate": None,
        "bond_length_angstrom": _float(vca.bond_length_angstrom[0]),
        "bond_length_estimated_angstrom": None,
        "bond_length_used_angstrom": _float(vca.bond_length_angstrom[0]),
        "bond_length_source": "interpolated",
        "measured": {key: None for key in
                     ("band_gap_eV", "gap_kind", "eps_inf", "lattice_a", "lattice_c")},
        "end_points": end_points,
        "eps_inf_vca": _eps_inf(float(vca.eps_inf[0]), end_points),
        "phillips": {"spectroscopic": _phillips(vca.spectroscopic),
                     "predictive": _phillips(vca.predictive), "route": VCA_ROUTE},
        "harrison": {
            "covalent_energy_eV": _float(bonds.covalent_energy_eV[0]),
            "polar_energy_eV": _float(bonds.polar_energy_eV[0]),
            "metallic_energy_eV": _float(bonds.metallic_energy_eV[0]),
            "metallic_energy_cation_eV": _float(bonds.metallic_energy_cation_eV[0]),
            "metallic_energy_anion_eV": _float(bonds.metallic_energy_anion_eV[0]),
            "polarity": _float(bonds.polarity[0]),
            "covalency": _float(bonds.covalency[0]),
            "hybrid_energy_cation_eV": _float(bonds.hybrid_energy_cation_eV[0]),
            "hybrid_energy_anion_eV": _float(bonds.hybrid_energy_anion_eV[0]),
            "bonding_eV": _float(bonds.bonding_eV[0]),
            "antibonding_eV": _float(bonds.antibonding_eV[0]),
            "route": VCA_ROUTE,
        },
        "band_gap": _band_gap(alloy, props),
        "spin_orbit": _spin_orbit(alloy),
        "tight_binding": None,
        "elastic": {"poisson_ratio_001": _float(props.poisson_ratio[0]),
                    "poisson_assumed": bool(props.poisson_assumed[0]),
                    "route": "nu = C12 / (C11 + C12) of Vegard-averaged C11, C12"},
        "coordination": _coordination(vca.spectroscopic, vca.predictive, system.structure),
        "hazards": hazards_block(present),
        "flags": flags,
    }


def normalise_material(text: str) -> str:
    """The normalised formula of a binary or alloy; elements at fraction 0 are dropped.

    "Ga0.47In0.53As" gives "In0.53Ga0.47As", "In0Ga1As" gives "GaAs", "AsGa" gives "GaAs".

    Raises:
        BondgapInputError: A subclass naming what is wrong with the formula.
    """
    material = parse_material(text)
    if isinstance(material, Alloy):
        material = parse_material(material.formula)
    return material.formula


def material_report(text: str, temperature_K: float = 300.0) -> dict[str, Any]:
    """The compound report of a binary, or the alloy report of an alloy, from its formula.

    Raises:
        BondgapInputError: A subclass naming what is wrong with the formula or temperature.
    """
    formula = normalise_material(text)
    if isinstance(parse_material(formula), Alloy):
        return alloy_report(formula, temperature_K)
    return compound_report(formula, temperature_K)

