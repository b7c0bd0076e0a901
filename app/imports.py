"""Importing the user's own measured values from CSV, all or nothing.

The file (UTF-8, a byte-order mark allowed, at most 1 MB and 5000 rows) has the header
`formula,property,value,unit,source` (any order; further columns are ignored; lines whose first
cell starts with `#` are comments). Properties and their accepted units:

    lattice_a   angstrom (also Å, A), nm, pm      stored in angstrom
    band_gap    eV, meV                           stored in eV
    eps_inf     empty, 1, -, dimensionless        stored without unit

Every row is checked before anything is written: a missing column, text in the value cell, an
unknown property or unit, a value outside its plausible range, a formula that is not a binary
or alloy the engine knows, an empty source, a (formula, property) given twice: each error names
its line and column, and nothing is stored. A good file is stored in one transaction; a value
for a (formula, property) the user imported before replaces the earlier one.
"""

from __future__ import annotations

import csv
import io
import uuid
from collections.abc import Iterator
from typing import Any

from sqlalchemy import delete, func, select, tuple_
from sqlalchemy.orm import Session

from app.models import UserMeasurement
from app.number_input import NumberError, NumberRule, read_number
from app.params import QueryError
from app.text_rules import plain_text
from app.writes import utc_now, writing
from screening.errors import echo

MAX_BYTES = 1_000_000
MAX_ROWS = 5000
MAX_SOURCE = 300
MAX_ERRORS = 5
COLUMNS: tuple[str, ...] = ("formula", "property", "value", "unit", "source")

UNITS: dict[str, tuple[str, dict[str, float], tuple[float, float]]] = {
    "lattice_a": ("angstrom", {"angstrom": 1.0, "Å": 1.0, "A": 1.0, "nm": 10.0, "pm": 0.01},
                  (1.0, 20.0)),
    "band_gap": ("eV", {"eV": 1.0, "meV": 0.001}, (-1.0, 15.0)),
    "eps_inf": ("", {"": 1.0, "1": 1.0, "-": 1.0, "dimensionless": 1.0}, (1.0, 100.0)),
}
"""Property -> (canonical unit, accepted unit -> factor to it, plausible range); units are
matched ignoring case."""

TEMPLATE = (
    "formula,property,value,unit,source\n"
    "# One measured value per row. property: lattice_a (angstrom, nm or pm), band_gap (eV or\n"
    "# meV), eps_inf (no unit). source: where the value comes from (your lab book, a paper).\n"
    "# Lines starting with # are skipped. Example rows (remove the # to use them):\n"
    "# GaAs,band_gap,1.422,eV,our PL at 300 K (lab book 12 p. 40)\n"
    "# In0.53Ga0.47As,lattice_a,5.8687,angstrom,XRD run 2024-03\n"
)
"""The template the measurements page offers for download."""


class ImportRefused(QueryError):
    """A file that cannot be imported; the message names the line and column (nothing stored)."""


class BatchNotFound(QueryError):
    """No imported values under that batch id (HTTP 404)."""

    status_code = 404


class ImportTooLarge(ImportRefused):
    """A file over the size limit (HTTP 413)."""

    status_code = 413


class ImportUnsupported(ImportRefused):
    """A file sent as a media type that is not CSV text (HTTP 415)."""

    status_code = 415


CSV_TYPES = frozenset({"text/csv", "text/plain", "application/csv", "text/comma-separated-values",
                       "application/vnd.ms-excel", "application/octet-stream"})
"""Media types a CSV file is sent as (browsers on Windows label .csv files
application/vnd.ms-excel; a file of unknown kind comes as application/octet-stream). What
the file holds is checked as well: UTF-8 text without NUL bytes."""


def check_type(content_type: str | None) -> None:
    """Refuse a file or body sent as anything but CSV text (an empty type passes)."""
    media = (content_type or "").split(";")[0].strip().lower()
    if media and media not in CSV_TYPES:
        raise ImportUnsupported(f"cannot import a file sent as {media[:60]}; send CSV text "
                                "(Content-Type: text/csv), UTF-8: nothing was imported")


def check_size(size: int) -> None:
    """Refuse a file over `MAX_BYTES` before reading it."""
    if size > MAX_BYTES:
        raise ImportTooLarge(f"the file is {size / 1e6:.1f} MB; the limit is "
                             f"{MAX_BYTES / 1e6:g} MB ({MAX_ROWS} rows): nothing was imported")


def _decode(data: bytes) -> str:
    check_size(len(data))
    if not data.strip():
        raise ImportRefused("the file is empty; expected the header "
                            f"{','.join(COLUMNS)} and one row per value")
    if b"\x00" in data:
        raise ImportRefused("the file holds NUL bytes, so it is not CSV text (a spreadsheet "
                            "workbook?); save it as CSV UTF-8: nothing was imported")
    try:
        return data.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        raise ImportRefused(f"the file is not UTF-8 text (byte {exc.start}); save it as "
                            "UTF-8 CSV: nothing was imported") from exc


def _rows(text: str) -> Iterator[tuple[int, list[str]]]:
    reader = csv.reader(io.StringIO(text, newline=""))
    try:
        for cells in reader:
            if not cells or not "".join(cells).strip() or cells[0].lstrip().startswith("#"):
                continue
            yield reader.line_num, cells
    except csv.Error as exc:
        raise ImportRefused(f"line {reader.line_num}: not readable as CSV ({exc}): nothing "
                            "was imported") from exc


def _value(raw: str, prop: str, unit_text: str) -> tuple[float, str]:
    """The value in its canonical unit; ValueError(column, message) for a bad cell."""
    canonical, factors, (low, high) = UNITS[prop]
    unit = unit_text.strip().lower()
    lowered = {u.lower(): f for u, f in factors.items()}
    if unit not in lowered:
        shown = ", ".join(u or "(empty)" for u in factors)
        raise ValueError("unit", f"unit {unit_text.strip()[:20]!r} is not accepted for {prop}; "
                         f"accepted: {shown}")
    factor = lowered[unit]
    rule = NumberRule(f"a {prop} value", unit_text.strip(), low / factor, high / factor)
    try:
        number = read_number(raw, rule)
    except NumberError as exc:
        raise ValueError("value", str(exc)) from None
    if number is None:
        raise ValueError("value", f"{rule.name} must be {rule.accepted()}, not empty")
    return number * factor, canonical


def _source(raw: str) -> str:
    """The source cell by the text rules of the forms (`app.text_rules`), 1 to MAX_SOURCE."""
    try:
        source = plain_text(raw, what="the source", max_length=MAX_SOURCE)
    except QueryError as exc:
        raise ValueError("source", str(exc)) from None
    if not source:
        raise ValueError("source", f"give a source of 1 to {MAX_SOURCE} characters on one "
                         "line (where the value comes from)")
    return source


def _formula(raw: str) -> str:
    from screening.alloy_report import normalise_material

    try:
        return normalise_material(raw.strip())
    except ValueError as exc:  # BondgapInputError and its kind
        raise ValueError("formula", f"{echo(raw.strip())} is not a compound or alloy the "
                         f"engine knows: {exc}") from exc


def parse_measurements(data: bytes) -> list[dict[str, Any]]:
    """Check a whole file; return its rows ready to store.

    Raises:
        ImportRefused: Naming up to five bad cells by line and column.
        ImportTooLarge: Over `MAX_BYTES`.
    """
    rows = _rows(_decode(data))
    first = next(rows, None)
    if first is None:
        raise ImportRefused(f"no header row; expected {','.join(COLUMNS)}")
    header_line, header = first
    names = [h.strip().lower() for h in header]
    missing = [c for c in COLUMNS if c not in names]
    if missing:
        raise ImportRefused(f"line {header_line} (header): missing column(s) "
                            f"{', '.join(missing)}; expected {','.join(COLUMNS)}: nothing was "
                            "imported")
    where = {c: names.index(c) for c in COLUMNS}
    records = list(rows)
    if len(records) > MAX_ROWS:
        raise ImportRefused(f"the file has {len(records)} value rows, more than {MAX_ROWS} "
                            f"(line {records[MAX_ROWS][0]} is the first too many): split it; "
                            "nothing was imported")
    errors: list[str] = []
    found: list[dict[str, Any]] = []
    seen: dict[tuple[str, str], int] = {}
    for line, cells in records:
        cell = {c: cells[i] if i < len(cells) else "" for c, i in where.items()}
        try:
            prop = cell["property"].strip()
            if prop not in UNITS:
                raise ValueError("property", f"unknown property {prop[:30]!r}; accepted: "
                                 f"{', '.join(UNITS)}")
            value, unit = _value(cell["value"], prop, cell["unit"])
            formula = _formula(cell["formula"])
            source = _source(cell["source"])
            if (formula, prop) in seen:
                raise ValueError("property", f"{formula} {prop} is given twice (first on line "
                                 f"{seen[formula, prop]})")
        except ValueError as exc:
            column, message = exc.args
            errors.append(f"line {line}, column {column}: {message}")
            if len(errors) >= MAX_ERRORS:
                break
            continue
        seen[formula, prop] = line
        found.append({"formula": formula, "property": prop, "value": value, "unit": unit,
                      "source": source})
    if errors:
        raise ImportRefused("; ".join(errors) + ": nothing was imported")
    if not found:
        raise ImportRefused("the file has a header but no value rows: nothing was imported")
    return found


def import_measurements(session: Session, data: bytes) -> dict[str, Any]:
    """Check and store a file of measured values in one transaction.

    Returns:
        {"batch": id, "imported": n, "replaced": m}.

    Raises:
        ImportRefused, ImportTooLarge: Nothing is stored.
    """
    rows = parse_measurements(data)
    batch = uuid.uuid4().hex[:12]
    keys = [(r["formula"], r["property"]) for r in rows]
    key = tuple_(UserMeasurement.formula, UserMeasurement.property)
    with writing(session):
        replaced = 0
        for start in range(0, len(keys), 400):  # bound parameters per statement
            done = session.execute(delete(UserMeasurement).where(key.in_(keys[start:start + 400])))
            replaced += done.rowcount or 0
        now = utc_now()
        session.add_all(UserMeasurement(**r, batch=batch, imported_at=now) for r in rows)
    return {"batch": batch, "imported": len(rows), "replaced": replaced}


def measurement_count(session: Session) -> int:
    """How many values you imported."""
    return session.scalar(select(func.count()).select_from(UserMeasurement)) or 0


def measurement_rows(session: Session, offset: int = 0,
                     limit: int | None = None) -> list[dict[str, Any]]:
    """Imported values by formula and property: every one, or `limit` from `offset` on."""
    stmt = (select(UserMeasurement)
            .order_by(UserMeasurement.formula, UserMeasurement.property)
            .offset(offset).limit(limit))
    return [{"formula": m.formula, "property": m.property, "value": m.value, "unit": m.unit,
             "source": m.source, "batch": m.batch,
             "imported_at": m.imported_at.isoformat() + "Z"} for m in session.scalars(stmt)]


def delete_batch(session: Session, batch: str) -> int:
    """Delete the values of one import; return how many. Raises BatchNotFound if none."""
    with writing(session):
        done = session.execute(delete(UserMeasurement).where(UserMeasurement.batch == batch))
        count = done.rowcount or 0
        if not count:
            raise BatchNotFound(f"no imported values in batch {echo(batch)}")
    return count
