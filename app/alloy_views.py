"""What an alloy composition's page shows, built from the alloy report: sections and charts.

The same sections as a compound page (every number with unit, route and source), with the
routes of the alloy models: Vegard's law for the lattice, the interpolated band gap with its
bowing sources, the virtual-crystal approximation for the Phillips and Harrison quantities,
and, on a chosen substrate, mismatch, strain and critical thickness with the geometry named.
"""

from __future__ import annotations

from dataclasses import replace
from typing import Any

from sqlalchemy.orm import Session

from app import queries, views
from app.finder_chart import plane_chart
from app.numbers import fixed, thickness_number, thickness_text
from app.substrates import resolve_substrate
from app.views import Line, Section, wavelength_of
from screening.alloys import parse_system
from screening.epitaxy import SubstrateSpec
from screening.errors import BondgapInputError
from screening.layer import layer_block

VEGARD = "Vegard's law over the end points' measured lattice constants"
SEED = "seed data (end points), see the compound pages"
VCA_TITLES = {"Dielectric theory (Phillips–Van Vechten)", "Bond orbitals (Harrison)",
              "Coordination"}


def composition_section(report: dict[str, Any]) -> Section:
    """Site fractions and the end points with their weights."""
    lines = [Line(f"{element} on the {site} site", f"{fraction:.4f}", "", "as given, "
                  "renormalised per site", "", key=f"fraction.{element}")
             for site, fractions in report["sites"].items()
             for element, fraction in fractions.items()]
    lines += [Line(f"End point {p['formula']}: weight", f"{p['weight']:.4f}", "",
                   "product of its two site fractions", "", key=f"end_point.{p['formula']}")
              for p in report["end_points"]]
    return Section(f"Composition ({report['form']} {report['system']})", tuple(lines))


def gap_section(report: dict[str, Any]) -> Section:
    """The interpolated band gap at the report's temperature, its kind and its sources."""
    gap = report["band_gap"]
    t = gap["temperature_K"]
    sources = "; ".join(gap.get("sources") or ()) or "end points' gaps only"
    default = " (a default bowing entered it)" if gap.get("default_bowing") else ""
    lines = (
        Line(f"Band gap at {t:g} K", gap["value_eV"], "eV", gap["route"] + default, sources,
             uncertainty=gap.get("uncertainty_eV"), wavelength_nm=wavelength_of(gap["value_eV"]),
             key="gap"),
        Line("Gap kind", gap.get("kind") or "not known", "", gap["kind_source"],
             "valley ordering of the end points (seed data)", key="kind"),
        Line("Temperature dependence", "assumed" if gap.get("temperature_law_assumed")
             else "published", "", gap["temperature_law"], "end points' temperature laws",
             key="temperature_law"),
    )
    return Section(f"Band gap at {t:g} K", lines)


def lattice_section(report: dict[str, Any]) -> Section:
    """Vegard lattice constant(s) and the VCA bond length."""
    lines = [Line("Lattice constant a", f"{report['lattice_constant_angstrom']:.4f}", "Å",
                  VEGARD, SEED, key="lattice_a")]
    if report.get("lattice_c_angstrom") is not None:
        lines.append(Line("Lattice constant c", report["lattice_c_angstrom"], "Å", VEGARD, SEED,
                          key="lattice_c"))
    lines.append(Line("Bond length", report["bond_length_used_angstrom"], "Å",
                      "weighted mean of the end points' bond lengths (VCA)", SEED,
                      key="bond_length"))
    elastic = report["elastic"]
    lines.append(Line("Poisson ratio (001)", elastic["poisson_ratio_001"], "",
                      elastic["route"] + (" (assumed: elastic constants missing)"
                                          if elastic["poisson_assumed"] else ""),
                      "seed data (elastic constants)", key="poisson"))
    return Section("Lattice and bond length", tuple(lines))


def vca_sections(report: dict[str, Any]) -> list[Section]:
    """The compound page's Phillips, Harrison and coordination sections, routed through VCA."""
    sections = []
    for section in views.report_sections(report):
        if section.title not in VCA_TITLES:
            continue
        lines = tuple(replace(line, route=f"VCA; {line.route}")
                      if section.title != "Coordination" or "observed" not in line.label
                      else replace(line, source="ambient structure of the end points")
                      for line in section.lines)
        sections.append(Section(section.title + " in the virtual crystal", lines))
    return sections


def _small(value: float | None) -> str | None:
    """A strain or mismatch as shown: "-1.318e-04 (-0.0132 %)"."""
    return None if value is None else f"{value:+.3e} ({fixed(value * 100, 4, signed=True)} %)"


def epitaxy_section(block: dict[str, Any]) -> Section:
    """Mismatch, strain and critical thickness on the chosen substrate."""
    geometry = block["geometry"]
    h_c = block["critical_thickness_nm"]
    matched = "lattice-matched" in block["critical_thickness_note"]
    shown = (thickness_text(h_c, matched=matched) if h_c is not None or matched
             else block["critical_thickness_note"])
    lines = (
        Line("Substrate lattice constant (matched)", f"{block['substrate_a_angstrom']:.4f}", "Å",
             block["substrate_note"] or "substrate table", "built-in table or yours",
             key="substrate_a"),
        Line("Mismatch f", _small(block["mismatch"]), "", block["mismatch_convention"],
             "Vegard a", key="mismatch"),
        Line("In-plane strain", _small(block["in_plane_strain"]), "",
             f"(a_sub - a_layer) / a_layer: {block['strain_kind']}", "pseudomorphic layer",
             key="in_plane_strain"),
        Line("Perpendicular strain (001)", _small(block["perpendicular_strain_001"]), "",
             "-2 ν/(1 - ν) × in-plane strain", "elastic constants (Vegard)",
             key="perpendicular_strain"),
        Line("Critical thickness h_c", shown,
             "nm" if thickness_number(h_c) is not None else "",
             f"{block['critical_thickness_note']}; geometry {geometry['name']}: "
             f"{geometry['description']}"
             + (" (Poisson ratio assumed)" if block["poisson_assumed"] else ""),
             geometry["reference"], key="critical_thickness"),
    )
    return Section(f"On {block['substrate']} (geometry {geometry['name']})", lines)


def epitaxy_for(session: Session, formula: str, on: str | None, geometry: str
                ) -> tuple[dict[str, Any] | None, SubstrateSpec | None, str | None]:
    """The layer block of `formula` on the substrate `on`, the substrate, or what is wrong.

    Returns:
        (block, substrate, None); (None, None, message) for an unknown or unsuitable
        substrate; (None, None, None) without one.
    """
    if not on:
        return None, None, None
    try:
        substrate = resolve_substrate(session, on)
        return layer_block(formula, substrate, geometry), substrate, None
    except BondgapInputError as exc:
        return None, None, str(exc)


def alloy_context(session: Session, report: dict[str, Any], *, on: str | None,
                  geometry: str | None) -> dict[str, Any]:
    """Template context of an alloy page (`alloy.html`)."""
    shape = geometry or "single-uncapped"
    block, substrate, problem = epitaxy_for(session, report["formula"], on, shape)
    sections = [composition_section(report), lattice_section(report), *vca_sections(report)]
    if block:
        sections.insert(1, epitaxy_section(block))
    system = parse_system(report["system"])
    point = {"formula": report["formula"], "band_gap_eV": report["band_gap"]["value_eV"],
             "lattice_constant_angstrom": report["lattice_constant_angstrom"],
             "mismatch": block["mismatch"] if block else None}
    ehc = views.eh_c_chart([*queries.all_reports(session), report], formula=report["formula"])
    return {
        "gap_section": gap_section(report), "sections": sections, "epitaxy": block,
        "epitaxy_error": problem, "on": on or "", "geometry": shape,
        "charts": {"levels": views.bond_levels_chart(report), "ehc": ehc},
        "plane": plane_chart([system], lattice=system.lattice or "cubic",
                             temperature_K=report["band_gap"]["temperature_K"],
                             substrate=substrate, window=None, highlighted=[point]),
        "hazard_caution": views.caution_line(report["hazards"]["caution_elements"]),
        "hazard_notes": report["hazards"]["notes"],
    }
