"""The columns of the shortlist CSV: name, value (rounded by `app.numbers`) and meaning.

Each column is declared once here; the CSV's header row, its cells and the column list of the
sidecar README come from these declarations. The getters (`app.export_values`) round numbers
to their meaningful precision: an estimate or interpolated gap to its uncertainty, a measured
value as published, a Vegard or virtual-crystal average to the decimals of its end points,
other model numbers to the decimals the pages show. The JSON export keeps full precision.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from typing import Any

from app.candidates import Candidate
from app.export_values import (
    at,
    averaged,
    cited,
    eps_inf,
    eps_inf_source,
    estimate,
    gap_source,
    gap_uncertainty,
    gap_value,
    lattice_a,
    lattice_route,
    lattice_source,
    lattice_uncertainty,
    layer,
    thickness,
    thickness_shown,
    wavelength,
    yours,
)
from app.numbers import THICKNESS_ABOVE, THICKNESS_BOUND_NM, THICKNESS_MATCHED, THICKNESS_NONE


@dataclass(frozen=True)
class CsvColumn:
    """One CSV column.

    Attributes:
        name: Header (the unit is in the name: `_eV`, `_angstrom`, `_nm`, `_K`).
        get: The cell of a candidate (None for an empty cell).
        about: What it holds, for the sidecar README.
    """

    name: str
    get: Callable[[Candidate], Any]
    about: str


CSV_COLUMNS: tuple[CsvColumn, ...] = (
    CsvColumn("position", lambda c: c.position, "place on the list"),
    CsvColumn("formula", lambda c: c.formula, "formula, cation first"),
    CsvColumn("kind", lambda c: c.kind, "compound or alloy"),
    CsvColumn("note", lambda c: c.note, "your note on the candidate"),
    CsvColumn("structure", at("structure.observed"), "observed crystal structure"),
    CsvColumn("structure_source", at("structure.source"), "where the structure comes from"),
    CsvColumn("temperature_K", at("band_gap.temperature_K"), "temperature of the gaps, K"),
    CsvColumn(
        "band_gap_eV",
        gap_value,
        "band gap at the temperature, eV: measured as "
        "published, an estimate or interpolated gap to its uncertainty",
    ),
    CsvColumn("band_gap_route", at("band_gap.value_source"), "measured, estimate or interpolated"),
    CsvColumn(
        "band_gap_uncertainty_eV",
        gap_uncertainty,
        "uncertainty of a gap that is not measured, eV (1 or 2 significant digits)",
    ),
    CsvColumn(
        "band_gap_source",
        gap_source,
        "publication of a measured gap, or the route "
        "and bowing sources of an estimate or interpolated gap",
    ),
    CsvColumn(
        "band_gap_estimate_eV",
        estimate,
        "the model estimate beside a measured gap, eV, to its uncertainty",
    ),
    CsvColumn(
        "wavelength_nm",
        wavelength,
        "photon wavelength hc/Eg of the gap shown, nm, to "
        "the uncertainty it inherits from the gap (1 nm for a measured gap)",
    ),
    CsvColumn("gap_kind", at("band_gap.kind"), "direct or indirect"),
    CsvColumn("gap_kind_route", at("band_gap.kind_source"), "where the kind comes from"),
    CsvColumn("gap_kind_source", lambda c: cited(c, "gap_kind"), "publication of the kind"),
    CsvColumn(
        "lattice_constant_angstrom",
        lattice_a,
        "lattice constant a, angstrom: measured as published; alloys: Vegard, to the end "
        "points' decimals; a compound never measured: the estimate from its bond length, to "
        "its uncertainty",
    ),
    CsvColumn(
        "lattice_constant_uncertainty_angstrom",
        lattice_uncertainty,
        "uncertainty of an estimated lattice constant, angstrom (empty when measured)",
    ),
    CsvColumn(
        "lattice_c_angstrom",
        averaged("lattice_c_angstrom", "lattice_constant_angstrom"),
        "lattice constant c of hexagonal cells, angstrom",
    ),
    CsvColumn(
        "lattice_constant_route",
        lattice_route,
        "measured; Vegard's law for an alloy; or estimate (from the estimated bond length)",
    ),
    CsvColumn(
        "lattice_constant_source",
        lattice_source,
        "publication of a; (alloys) Vegard's law and each end point's source; or the route "
        "of the estimate",
    ),
    CsvColumn(
        "bond_length_angstrom",
        at("bond_length_used_angstrom", 4),
        "bond length the models used, angstrom",
    ),
    CsvColumn(
        "eps_inf",
        eps_inf,
        "high-frequency dielectric constant (no unit): measured, "
        "or the virtual-crystal average for an alloy, or 'not available'",
    ),
    CsvColumn(
        "eps_inf_source",
        eps_inf_source,
        "publication, or the virtual-crystal route and the end points' sources",
    ),
    CsvColumn(
        "ionicity_spectroscopic",
        at("phillips.spectroscopic.ionicity", 3),
        "Phillips ionicity, spectroscopic route (no unit)",
    ),
    CsvColumn(
        "ionicity_predictive",
        at("phillips.predictive.ionicity", 3),
        "Phillips ionicity, predictive route (no unit)",
    ),
    CsvColumn("polarity", at("harrison.polarity", 3), "Harrison polarity (no unit)"),
    CsvColumn(
        "coordination_predicted",
        at("coordination.predicted"),
        "coordination predicted from the ionicity",
    ),
    CsvColumn(
        "coordination_observed",
        at("coordination.observed"),
        "coordination of the observed structure",
    ),
    CsvColumn("substrate", layer("substrate"), "substrate of the list"),
    CsvColumn(
        "substrate_a_angstrom",
        layer("substrate_a_angstrom"),
        "substrate lattice constant the layer is matched to, angstrom",
    ),
    CsvColumn(
        "mismatch_fraction",
        layer("mismatch", 5),
        "lattice mismatch as a fraction (not percent), 5 decimals",
    ),
    CsvColumn(
        "in_plane_strain",
        layer("in_plane_strain", 5),
        "in-plane strain of a pseudomorphic layer (fraction), 5 decimals",
    ),
    CsvColumn(
        "critical_thickness",
        thickness_shown,
        f"critical thickness as the pages show it: '{THICKNESS_MATCHED}' for a lattice-matched "
        f"layer, '{THICKNESS_ABOVE}' above {THICKNESS_BOUND_NM:g} nm, '{THICKNESS_NONE}' when "
        "no coherent layer is thicker than one Burgers vector, else the value in nm",
    ),
    CsvColumn(
        "critical_thickness_nm",
        thickness,
        "Matthews-Blakeslee critical thickness, nm, "
        f"3 significant digits; empty when lattice-matched or above "
        f"{THICKNESS_BOUND_NM:g} nm (see critical_thickness)",
    ),
    CsvColumn(
        "critical_thickness_note",
        layer("critical_thickness_note"),
        "how the critical thickness was found, or why there is none",
    ),
    CsvColumn(
        "layer_not_computed", lambda c: c.layer_error, "why there is no layer on the substrate"
    ),
    CsvColumn("toxic_elements", lambda c: " ".join(c.toxic), "toxic elements present"),
    CsvColumn("rohs_restricted", lambda c: " ".join(c.rohs), "elements restricted by RoHS"),
    CsvColumn(
        "yours_lattice_a_angstrom",
        yours("lattice_a", "value"),
        "your imported lattice constant, angstrom",
    ),
    CsvColumn("yours_lattice_a_source", yours("lattice_a", "source"), "its source"),
    CsvColumn("yours_band_gap_eV", yours("band_gap", "value"), "your imported gap, eV"),
    CsvColumn("yours_band_gap_source", yours("band_gap", "source"), "its source"),
    CsvColumn("yours_eps_inf", yours("eps_inf", "value"), "your imported eps_inf"),
    CsvColumn("yours_eps_inf_source", yours("eps_inf", "source"), "its source"),
)
"""Every CSV column, in order."""
