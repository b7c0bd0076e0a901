"""A shortlist for the review: CSV with its README, JSON, and each candidate's crystal cell.

CSV: the header row first, then one row per candidate, so spreadsheets, `pandas.read_csv` and
`csv.reader` read it as it is. UTF-8 with a byte-order mark (spreadsheet programs then read Å
and ε correctly; pandas skips it, and the `utf-8-sig` codec does too), CRLF line ends. Units
are in the column names (`band_gap_eV`, `critical_thickness_nm`); each measured value has a
`*_source` column; the user's own values are in `yours_*` columns. Numbers are written as
numbers, rounded to their meaningful precision by `app.numbers` (full precision is in the JSON
export); text cells that a spreadsheet would run as a formula get a leading `'`.

Sidecar README (text): tool and model version, export time, the list's name and note, its
conditions, the mismatch convention, the rounding rules, the RoHS source, the caution and what
every column holds (from `app.export_columns`). The web export's zip holds both files;
`bondgap shortlist export NAME --csv FILE` writes FILE and the README beside it.
"""

from __future__ import annotations

import csv
import io
import json
import math
import unicodedata
import zipfile
from datetime import UTC, datetime
from pathlib import Path
from typing import Any

import screening
from app.candidates import Candidate
from app.conditions import Conditions
from app.export_columns import CSV_COLUMNS
from app.numbers import THICKNESS_ABOVE, THICKNESS_MATCHED, THICKNESS_NONE
from screening.epitaxy import MISMATCH_CONVENTION
from screening.hazards import CAUTION, ROHS_SOURCE

FORMULA_TRIGGERS = ("=", "+", "-", "@", "\t", "\r", "\n", "\u2212")
"""First characters that make a spreadsheet read a text cell as a formula (after NFKC, so the
fullwidth and small forms count too; U+2212 is the minus sign)."""
INVISIBLE = frozenset({"Cc", "Cf", "Zs", "Zl", "Zp"})
"""Unicode categories skipped before the first visible character: controls, format
characters (zero-width space, bidi marks), spaces and separators."""
SIDECAR_SUFFIX = "-README.txt"
"""The README beside an exported CSV: `review.csv` gets `review-README.txt`."""

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
PRECISION_LEGEND = (
    "an estimate or interpolated value is rounded to its uncertainty (uncertainty to 1 or 2 "
    "significant digits: 2 when its leading digits are 100-354, else 1; the value to the same "
    "decimal place; Particle Data Group rule, after JCGM 100:2008 section 7.2.6); measured "
    "values as published; Vegard and virtual-crystal averages to their end points' decimals; "
    "ionicity and polarity to 3 decimals, bond length to 4, mismatch and strain to 5; "
    f"critical thickness to 3 significant digits, '{THICKNESS_MATCHED}' when lattice-matched"
    f", '{THICKNESS_ABOVE}' above 10 µm and '{THICKNESS_NONE}' when no coherent layer is "
    "thicker than one Burgers vector; the JSON export has every number at full precision"
)


def _visible_start(text: str) -> str:
    """The text from its first visible character, NFKC-normalised (for the formula check)."""
    for i, char in enumerate(text):
        if unicodedata.category(char) not in INVISIBLE or char in "\t\r\n":
            return unicodedata.normalize("NFKC", text[i:i + 4])
    return ""


def neutralise(value: Any) -> Any:
    """A cell as written: numbers as numbers, text safe from formula evaluation.

    Text whose first visible character (after leading spaces, zero-width and other invisible
    format characters, NFKC-normalised so `＝`, `＋`, `－`, `＠` count) starts a formula, or
    that starts with a tab, carriage return or line feed, gets a leading `'`.
    """
    if value is None:
        return ""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, int | float):
        return value if math.isfinite(value) else ""
    text = str(value)
    return "'" + text if _visible_start(text).startswith(FORMULA_TRIGGERS) else text


def _stamp(now: datetime | None) -> str:
    return (now or datetime.now(UTC)).astimezone(UTC).isoformat(timespec="seconds")


def shortlist_csv(candidates: list[Candidate]) -> str:
    """The CSV text of a list's candidates (under its conditions): header row first.

    The byte-order mark is included; the list's name, note and conditions are in the README.
    """
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\r\n")
    writer.writerow([column.name for column in CSV_COLUMNS])
    for c in candidates:
        writer.writerow([neutralise(column.get(c)) for column in CSV_COLUMNS])
    return "\ufeff" + out.getvalue()


def _indented(text: str) -> str:
    return "\n    ".join(text.splitlines()) or "(none)"


def shortlist_readme(shortlist: dict[str, Any], conditions: Conditions, csv_name: str, *,
                     now: datetime | None = None) -> str:
    """The sidecar README of a CSV export: conditions, units, sources and every column.

    Args:
        shortlist: `app.shortlists.shortlist_dict` of the list.
        conditions: Its conditions.
        csv_name: File name of the CSV it describes.
        now: Export time (default: now, UTC).
    """
    lines = [
        f"About {csv_name}: a bondgap shortlist export",
        "",
        f"tool: bondgap (engine model {screening.MODEL_VERSION})",
        f"model_version: {screening.MODEL_VERSION}",
        f"exported_at: {_stamp(now)}",
        f"shortlist: {shortlist['name']}",
        f"note: {_indented(shortlist['note'])}",
        f"substrate: {conditions.substrate or 'none'}",
        f"temperature_K: {conditions.temperature_K:g}",
        f"target: {conditions.target_text()}",
        f"units: {UNITS_LEGEND}",
        f"mismatch_convention: {MISMATCH_CONVENTION}",
        f"sources: {SOURCES_LEGEND}",
        f"precision: {PRECISION_LEGEND}",
        f"rohs: rohs_restricted lists elements restricted by {ROHS_SOURCE}",
        f"caution: {CAUTION}",
        "",
        "Columns (the CSV's header row, in order):",
        *(f"  {column.name}: {column.about}" for column in CSV_COLUMNS),
    ]
    return "\n".join(lines) + "\n"


def readme_path(csv_path: Path) -> Path:
    """Where the README of a CSV written to `csv_path` goes (beside it)."""
    return csv_path.with_name(csv_path.stem + SIDECAR_SUFFIX)


def csv_zip(shortlist: dict[str, Any], candidates: list[Candidate], conditions: Conditions,
            csv_name: str, *, now: datetime | None = None) -> bytes:
    """The CSV and its README as one zip archive (the README named after the CSV)."""
    buffer = io.BytesIO()
    with zipfile.ZipFile(buffer, "w", zipfile.ZIP_DEFLATED) as archive:
        archive.writestr(csv_name, shortlist_csv(candidates))
        archive.writestr(readme_path(Path(csv_name)).name,
                         shortlist_readme(shortlist, conditions, csv_name, now=now))
    return buffer.getvalue()


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
