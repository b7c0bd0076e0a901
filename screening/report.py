"""The compound report: one JSON-ready dict per compound (see docs/report-schema.md).

`compound_report` and `catalogue_reports` are what the store, the API and the CLI show; the
keys are a public contract.
"""

from __future__ import annotations

import math
from typing import Any

from screening import MODEL_VERSION
from screening.errors import BondgapInputError
from screening.evaluate import CatalogueTable, catalogue_table
from screening.formula import parse_compound
from screening.gaps import GapsAt, gap_model, gaps_at
from screening.hazards import hazards_block
from screening.lattice_estimate import LatticeEstimate
from screening.phillips import PhillipsResult
from screening.reference import Measured
from screening.spin_orbit import spin_orbit_table
from screening.suggest import with_suggestions


def _float(value: Any) -> float | None:
    number = float(value)
    return number if math.isfinite(number) else None


def _measured(item: Measured | None) -> dict[str, Any] | None:
    if item is None:
        return None
    return {"value": item.value, "unit": item.unit, "source": item.source,
            "from_memory": item.from_memory, "note": item.note}


def _phillips(result: PhillipsResult, i: int) -> dict[str, float | None] | None:
    if not math.isfinite(float(result.ionicity[i])):
        return None
    return {
        "homopolar_gap_eV": _float(result.homopolar_gap_eV[i]),
        "heteropolar_gap_eV": _float(result.heteropolar_gap_eV[i]),
        "average_gap_eV": _float(result.average_gap_eV[i]),
        "ionicity": _float(result.ionicity[i]),
    }


MAX_TEMPERATURE_K = 2000.0
"""Highest temperature accepted for a gap, K."""


def check_temperature(temperature_K: float) -> float:
    """Return the temperature if it is a number in [0, 2000] K, else raise a clear error."""
    value = float(temperature_K)
    if not 0.0 <= value <= MAX_TEMPERATURE_K:
        raise BondgapInputError(
            f"temperature {temperature_K!r} K is outside the accepted range 0 to "
            f"{MAX_TEMPERATURE_K:g} K"
        )
    return value


ESTIMATE_ROUTE = ("estimate: Gaussian process with a linear mean over the band structure's "
                  "physical features, calibrated by nested leave-one-out")
"""How an estimated gap is made (`screening.gaps`)."""

KIND_ROUTE = "estimate: logistic classifier over the band structure's valley order"
"""How an estimated gap kind is made (`screening.gap_kind`)."""


def _band_gap(table: CatalogueTable, at: GapsAt, i: int) -> dict[str, Any]:
    model = gap_model()
    measured = table.measured[i]
    kind = measured.get("gap_kind")
    semimetal = bool(at.semimetal[i])
    shown_kind = str(kind.value) if kind else model.kind_estimate[i]
    if semimetal:
        shown_kind = "semimetal"
    short, long = _float(at.wavelength_short_nm[i]), _float(at.wavelength_long_nm[i])
    return {
        "value_eV": _float(at.value_eV[i]),
        "value_source": "measured" if at.value_is_measured[i] else "estimate",
        "route": "measured" if at.value_is_measured[i] else ESTIMATE_ROUTE,
        "estimate_eV": _float(at.estimate_eV[i]),
        "uncertainty_eV": _float(at.uncertainty_eV[i]),
        "cross_validated_eV": _float(at.cross_validated_eV[i]),
        "cross_validated_uncertainty_eV": _float(model.cross_validated_uncertainty_eV[i]),
        "measured_eV": _float(at.measured_eV[i]),
        "measured_300K_eV": _float(model.measured_300K_eV[i]),
        "semimetal": semimetal,
        "may_be_semimetal": bool(at.may_be_semimetal[i]),
        "kind": shown_kind,
        "kind_source": "measured" if kind else (
            "estimate: the estimated gap is negative" if semimetal else KIND_ROUTE),
        "kind_estimate": model.kind_estimate[i],
        "indirect_probability": _float(model.indirect_probability[i]),
        "temperature_K": at.temperature_K,
        "temperature_law": at.temperature_law_source[i],
        "temperature_law_assumed": bool(at.temperature_law_assumed[i]),
        "wavelength_nm": _float(at.wavelength_nm[i]),
        "wavelength_range_nm": None if short is None else [short, long],
        "model": _model_summary(),
    }


def _model_summary() -> dict[str, Any]:
    model = gap_model()
    correct, total = model.kind_accuracy()
    return {
        "loo_mae_eV": model.loo_mae_eV,
        "loo_max_eV": model.loo_max_eV,
        "n_measured": model.n_measured,
        "within_one_uncertainty": model.coverage(1.0),
        "within_two_uncertainties": model.coverage(2.0),
        "kind_correct": correct,
        "kind_total": total,
        "validation": "nested leave-one-out over every measured gap",
    }


def _spin_orbit(i: int) -> dict[str, Any]:
    table = spin_orbit_table()
    return {
        "splitting_eV": _float(table.value_eV[i]),
        "route": table.route[i],
        "source": table.source[i],
        "model_eV": _float(table.model_eV[i]),
        "measured_eV": _float(table.measured_eV[i]),
    }


def _tight_binding(i: int) -> dict[str, Any]:
    tb = gap_model().tight_binding
    return {
        "gamma_gap_eV": _float(tb.gamma_gap_eV[i]),
        "x_gap_eV": _float(tb.x_gap_eV[i]),
        "l_gap_eV": _float(tb.l_gap_eV[i]),
        "min_gap_eV": _float(tb.min_gap_eV[i]),
        "direct": bool(tb.direct[i]),
    }


def _lattice_estimate(estimate: LatticeEstimate, i: int) -> dict[str, Any]:
    return {
        "a_angstrom": _float(estimate.a_angstrom[i]),
        "c_angstrom": _float(estimate.c_angstrom[i]),
        "uncertainty_angstrom": _float(estimate.uncertainty_angstrom[i]),
        "structure": str(estimate.structure[i]),
        "route": estimate.route(i),
    }


def _report(table: CatalogueTable, i: int, at: GapsAt) -> dict[str, Any]:
    compound = table.compounds[i]
    measured = table.measured[i]
    bonds = table.bonds
    estimate = table.lattice_estimate
    return {
        "formula": compound.formula,
        "family": compound.family,
        "cation": compound.cation,
        "anion": compound.anion,
        "model_version": MODEL_VERSION,
        "structure": {
            "observed": table.structure[i],
            "source": measured["structure"].source if "structure" in measured else None,
        },
        "lattice_constant_angstrom": _float(table.lattice_constant_angstrom[i]),
        "lattice_c_angstrom": _float(table.lattice_c_angstrom[i]),
        "lattice_constant_source": (
            "measured" if math.isfinite(table.lattice_constant_angstrom[i]) else "estimate"),
        "lattice_constant_estimated_angstrom": _float(estimate.a_angstrom[i]),
        "lattice_estimate": _lattice_estimate(estimate, i),
        "bond_length_angstrom": _float(table.bond_length_measured_angstrom[i]),
        "bond_length_estimated_angstrom": _float(table.bond_length_estimated_angstrom[i]),
        "bond_length_used_angstrom": _float(table.bond_length_used_angstrom[i]),
        "bond_length_source": (
            "measured" if math.isfinite(table.bond_length_measured_angstrom[i]) else "estimate"),
        "measured": {
            "band_gap_eV": _measured(measured.get("band_gap")),
            "gap_kind": _measured(measured.get("gap_kind")),
            "eps_inf": _measured(measured.get("eps_inf")),
            "lattice_a": _measured(measured.get("lattice_a")),
            "lattice_c": _measured(measured.get("lattice_c")),
        },
        "phillips": {
            "spectroscopic": _phillips(table.spectroscopic, i),
            "predictive": _phillips(table.predictive, i),
        },
        "harrison": {
            "covalent_energy_eV": _float(bonds.covalent_energy_eV[i]),
            "polar_energy_eV": _float(bonds.polar_energy_eV[i]),
            "metallic_energy_eV": _float(bonds.metallic_energy_eV[i]),
            "metallic_energy_cation_eV": _float(bonds.metallic_energy_cation_eV[i]),
            "metallic_energy_anion_eV": _float(bonds.metallic_energy_anion_eV[i]),
            "polarity": _float(bonds.polarity[i]),
            "covalency": _float(bonds.covalency[i]),
            "hybrid_energy_cation_eV": _float(bonds.hybrid_energy_cation_eV[i]),
            "hybrid_energy_anion_eV": _float(bonds.hybrid_energy_anion_eV[i]),
            "bonding_eV": _float(bonds.bonding_eV[i]),
            "antibonding_eV": _float(bonds.antibonding_eV[i]),
        },
        "band_gap": _band_gap(table, at, i),
        "spin_orbit": _spin_orbit(i),
        "tight_binding": _tight_binding(i),
        "coordination": {
            "predicted": table.coordination_predicted[i],
            "route": table.coordination_route[i],
            "observed": table.coordination_observed[i],
        },
        "hazards": hazards_block(compound.elements),
    }


def normalise_formula(text: str) -> str:
    """Normalised formula of an octet binary (raises `BondgapInputError` subclasses).

    The error says "did you mean ...?" where the text re-cased as element symbols is a
    compound ("INP" -> InP; `screening.suggest`).
    """
    try:
        return parse_compound(text).formula
    except BondgapInputError as exc:
        raise with_suggestions(exc, text, lambda c: parse_compound(c).formula) from None


def compound_report(formula: str, temperature_K: float = 300.0) -> dict[str, Any]:
    """The report of one compound, from any accepted spelling of its formula.

    Args:
        formula: e.g. "GaAs", "AsGa".
        temperature_K: temperature of the band gap block, 0 to 2000 K.
    """
    table = catalogue_table()
    index = table.index(normalise_formula(formula))
    return _report(table, index, gaps_at(check_temperature(temperature_K)))


def catalogue_reports(temperature_K: float = 300.0) -> list[dict[str, Any]]:
    """Reports for every catalogue compound, in catalogue order, gaps at temperature_K."""
    table = catalogue_table()
    at = gaps_at(check_temperature(temperature_K))
    return [_report(table, i, at) for i in range(len(table.compounds))]
