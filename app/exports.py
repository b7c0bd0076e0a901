"""A shortlist for the review: CSV, JSON, and each candidate's crystal cell as CIF and POSCAR.

CSV: UTF-8 with a byte-order mark (spreadsheet programs then read Å and ε correctly; read it
back with the `utf-8-sig` codec), CRLF line ends. First a header block of two-cell rows whose
first cell starts with `#` (tool, model version, export time, list name and note, conditions,
units, where the values come from, the RoHS source, the caution), then one header row and one
row per candidate. Units are in the column names (`band_gap_eV`, `critical_thickness_nm`);
each measured value has a `*_source` column; the user's own values are in `yours_*` columns.
Numbers are written as numbers (full precision, so they parse back exactly; a negative number
stays a number); text cells that a spreadsheet would run as a formula (starting with `=`, `+`,
`-`, `@`, tab or carriage return) get a leading `'`.
"""

from __future__ import annotations

import csv
import io
import json
import math
import zipfile
from collections.abc import Callable
from datetime import UTC, datetime
from pathlib import Path
from typing import Any

import screening
from app.candidates import Candidate
from app.conditions import Conditions
from app.views import dig
from screening.epitaxy import MISMATCH_CONVENTION
from screening.hazards import CAUTION, ROHS_SOURCE

FORMULA_TRIGGERS = ("=", "+", "-", "@", "\t", "\r")
"""First characters that make a spreadsheet read a text cell as a formula."""

UNITS_LEGEND = (
    "columns ending _eV are in eV, _angstrom in angstrom, _nm in nm, _K in kelvin; "
    "mismatch_fraction and in_plane_strain are fractions (not percent); eps_inf, ionicity "
    "and polarity have no unit"
)
SOURCES_LEGEND = (
    "each *_source column names where the value before it comes from (publication of a "
    "measured value; 'from memory' where not yet checked against it); *_route says measured, "
    "estimate (calibrated model, with its uncertainty) or interpolated (alloys); yours_* "
    "columns hold your own imported values and their sources"
)


def neutralise(value: Any) -> Any:
    """A cell as written: numbers as numbers, text safe from formula evaluation."""
    if value is None:
        return ""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, int | float):
        return value if math.isfinite(value) else ""
    text = str(value)
    return "'" + text if text.startswith(FORMULA_TRIGGERS) else text


def _source(c: Candidate, key: str) -> str | None:
    item = dig(c.report, f"measured.{key}")
    if not item:
        return None
    return str(item.get("source") or "") + (" (from memory)" if item.get("from_memory") else "")


def _at(path: str) -> Callable[[Candidate], Any]:
    return lambda c: dig(c.report, path)


def _layer(key: str) -> Callable[[Candidate], Any]:
    return lambda c: (c.layer or {}).get(key)


def _yours(prop: str, key: str) -> Callable[[Candidate], Any]:
    return lambda c: (c.yours.get(prop) or {}).get(key)


CSV_COLUMNS: tuple[tuple[str, Callable[[Candidate], Any]], ...] = (
    ("position", lambda c: c.position),
    ("formula", lambda c: c.formula),
    ("kind", lambda c: c.kind),
    ("note", lambda c: c.note),
    ("structure", _at("structure.observed")),
    ("structure_source", _at("structure.source")),
    ("temperature_K", _at("band_gap.temperature_K")),
    ("band_gap_eV", _at("band_gap.value_eV")),
    ("band_gap_route", _at("band_gap.value_source")),
    ("band_gap_uncertainty_eV", lambda c: None if dig(c.report, "band_gap.value_source")
     == "measured" else dig(c.report, "band_gap.uncertainty_eV")),
    ("band_gap_source", lambda c: _source(c, "band_gap_eV") or dig(c.report, "band_gap.route")
     or "calibrated sp3 estimate; uncertainty = leave-one-out RMS error of the family"),
    ("band_gap_estimate_eV", _at("band_gap.estimate_eV")),
    ("wavelength_nm", _at("band_gap.wavelength_nm")),
    ("gap_kind", _at("band_gap.kind")),
    ("gap_kind_route", _at("band_gap.kind_source")),
    ("gap_kind_source", lambda c: _source(c, "gap_kind")),
    ("lattice_constant_angstrom", _at("lattice_constant_angstrom")),
    ("lattice_c_angstrom", _at("lattice_c_angstrom")),
    ("lattice_constant_route", lambda c: c.report.get("lattice_route") or (
        "measured" if c.report.get("lattice_constant_angstrom") is not None else None)),
    ("lattice_constant_source", lambda c: _source(c, "lattice_a")),
    ("bond_length_angstrom", _at("bond_length_used_angstrom")),
    ("eps_inf", _at("measured.eps_inf.value")),
    ("eps_inf_source", lambda c: _source(c, "eps_inf")),
    ("ionicity_spectroscopic", _at("phillips.spectroscopic.ionicity")),
    ("ionicity_predictive", _at("phillips.predictive.ionicity")),
    ("polarity", _at("harrison.polarity")),
    ("coordination_predicted", _at("coordination.predicted")),
    ("coordination_observed", _at("coordination.observed")),
    ("substrate", _layer("substrate")),
    ("substrate_a_angstrom", _layer("substrate_a_angstrom")),
    ("mismatch_fraction", _layer("mismatch")),
    ("in_plane_strain", _layer("in_plane_strain")),
    ("critical_thickness_nm", _layer("critical_thickness_nm")),
    ("critical_thickness_note", _layer("critical_thickness_note")),
    ("layer_not_computed", lambda c: c.layer_error),
    ("toxic_elements", lambda c: " ".join(c.toxic)),
    ("rohs_restricted", lambda c: " ".join(c.rohs)),
    ("yours_lattice_a_angstrom", _yours("lattice_a", "value")),
    ("yours_lattice_a_source", _yours("lattice_a", "source")),
    ("yours_band_gap_eV", _yours("band_gap", "value")),
    ("yours_band_gap_source", _yours("band_gap", "source")),
    ("yours_eps_inf", _yours("eps_inf", "value")),
    ("yours_eps_inf_source", _yours("eps_inf", "source")),
)
"""Header and value of every CSV column, in order."""


def _stamp(now: datetime | None) -> str:
    return (now or datetime.now(UTC)).astimezone(UTC).isoformat(timespec="seconds")


def shortlist_csv(shortlist: dict[str, Any], candidates: list[Candidate],
                  conditions: Conditions, *, now: datetime | None = None) -> str:
    """The CSV text of a list (the byte-order mark included).

    Args:
        shortlist: `app.shortlists.shortlist_dict` of the list.
        candidates: Its candidates under its conditions.
        conditions: Its conditions.
        now: Export time (default: now, UTC).
    """
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\r\n")
    substrate = conditions.substrate or "none"
    header = (
        ("tool", f"bondgap (engine model {screening.MODEL_VERSION})"),
        ("model_version", screening.MODEL_VERSION),
        ("exported_at", _stamp(now)),
        ("shortlist", shortlist["name"]),
        ("note", shortlist["note"]),
        ("substrate", substrate),
        ("temperature_K", conditions.temperature_K),
        ("target", conditions.target_text()),
        ("units", UNITS_LEGEND),
        ("mismatch_convention", MISMATCH_CONVENTION),
        ("sources", SOURCES_LEGEND),
        ("rohs", f"rohs_restricted lists elements restricted by {ROHS_SOURCE}"),
        ("caution", CAUTION),
    )
    writer.writerow(["# bondgap shortlist export"])
    for key, value in header:
        writer.writerow([f"# {key}", neutralise(value)])
    writer.writerow([name for name, _ in CSV_COLUMNS])
    for c in candidates:
        writer.writerow([neutralise(get(c)) for _, get in CSV_COLUMNS])
    return "\ufeff" + out.getvalue()


def shortlist_json(shortlist: dict[str, Any], candidates: list[Candidate],
                   conditions: Conditions, *, now: datetime | None = None) -> str:
    """The JSON export: the list, its conditions and each candidate's full report."""
    payload = {
        "tool": "bondgap",
        "model_version": screening.MODEL_VERSION,
        "exported_at": _stamp(now),
        "shortlist": {k: v for k, v in shortlist.items() if k != "items"},
        "conditions": conditions.as_dict(),
        "units": UNITS_LEGEND,
        "mismatch_convention": MISMATCH_CONVENTION,
        "rohs_source": ROHS_SOURCE,
        "caution": CAUTION,
        "candidates": [c.as_dict() for c in candidates],
    }
    return json.dumps(payload, indent=2, ensure_ascii=False) + "\n"


def cell_files(candidates: list[Candidate]) -> list[tuple[str, str]]:
    """(file name, text) of every candidate's cell: `F.cif`, and `F.POSCAR` for ordered cells.

    Alloys get their virtual-crystal average cell as CIF only (labelled in its first line).
    """
    from screening.cells import is_virtual_crystal, material_cell
    from screening.crystal import to_cif, to_poscar

    files = []
    lines = ["Crystal cells exported by bondgap (engine model " + screening.MODEL_VERSION + ")",
             "Alloys: virtual-crystal average cells (fractional occupancies), CIF only.", ""]
    for c in candidates:
        spec = material_cell(c.formula)
        files.append((f"{c.formula}.cif", to_cif(spec)))
        names = f"{c.formula}.cif"
        if not is_virtual_crystal(spec):
            files.append((f"{c.formula}.POSCAR", to_poscar(spec)))
            names += f", {c.formula}.POSCAR"
        lines.append(f"{names}: {spec.label}")
    files.append(("README.txt", "\n".join(lines) + "\n"))
    return files


def cells_zip(candidates: list[Candidate]) -> bytes:
    """The cell files of a list as one zip archive."""
    buffer = io.BytesIO()
    with zipfile.ZipFile(buffer, "w", zipfile.ZIP_DEFLATED) as archive:
        for name, text in cell_files(candidates):
            archive.writestr(name, text)
    return buffer.getvalue()


def write_cells(candidates: list[Candidate], folder: Path) -> list[Path]:
    """Write the cell files of a list into a folder (created if needed); return the paths."""
    folder.mkdir(parents=True, exist_ok=True)
    paths = []
    for name, text in cell_files(candidates):
        path = folder / name
        path.write_text(text, encoding="utf-8")
        paths.append(path)
    return paths
