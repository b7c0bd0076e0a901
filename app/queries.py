"""Read side of the store: the compound table (one function for page, API and CSV) and reports.

`TableQuery.parse` (`app.params`) checks filters and the sort key against `app.columns.COLUMNS`
(an unknown key raises `QueryError`, which the web layer answers with 400 and the CLI with exit
code 2). `table_rows` selects with bound parameters only, puts in the band gaps at the asked
temperature (from the engine when it is not the stored 300 K), then applies the gap and
wavelength windows and the sort to those values.
"""

from __future__ import annotations

import csv
import io
import json
from typing import Any

from sqlalchemy import ColumnElement, and_, func, select
from sqlalchemy.orm import Session

from app.columns import COLUMNS, COLUMNS_BY_KEY
from app.gap_columns import gap_values_at
from app.models import CompoundResult, StoreMeta
from app.params import (
    FAMILY_CHOICES,
    KIND_CHOICES,
    STORED_TEMPERATURE_K,
    STRUCTURE_CHOICES,
    QueryError,
    TableQuery,
)
from screening.hazards import excluded, rohs_restricted

__all__ = [
    "FAMILY_CHOICES", "KIND_CHOICES", "STRUCTURE_CHOICES", "QueryError", "TableQuery",
    "all_reports", "compound_count", "compound_report", "model_version", "rows_csv",
    "table_payload", "table_rows",
]


def _conditions(query: TableQuery) -> list[ColumnElement[bool]]:
    """SQL conditions for the filters that do not depend on temperature (bound parameters)."""
    table = CompoundResult
    conditions: list[ColumnElement[bool]] = []
    if query.family:
        conditions.append(table.family == query.family)
    if query.structure:
        conditions.append(table.structure_observed == query.structure)
    if query.measured_only:
        conditions.append(table.gap_measured_ev.is_not(None))
    if query.kind:
        conditions.append(table.gap_kind_shown == query.kind)
    return conditions


def _within(value: float | None, low: float | None, high: float | None) -> bool:
    """Whether `value` lies in [low, high]; a missing value lies in no window that is set."""
    if low is None and high is None:
        return True
    return value is not None and (low is None or value >= low) and (high is None or value <= high)


def _sorted(rows: list[dict[str, Any]], key: str, desc: bool) -> list[dict[str, Any]]:
    """Rows sorted by `key` (ties by formula), rows without a value last in either direction."""
    present = sorted((r for r in rows if r[key] is not None), key=lambda r: r["formula"])
    present.sort(key=lambda r: r[key], reverse=desc)  # stable: ties stay in formula order
    return present + [r for r in rows if r[key] is None]


def row_dict(result: CompoundResult) -> dict[str, Any]:
    """One table row as the API, CSV and page see it (keys from `COLUMNS`, plus hazards)."""
    row = {c.key: getattr(result, c.attr) for c in COLUMNS}
    row["hazard_elements"] = [e for e in result.hazard_elements.split(",") if e]
    row["rohs_restricted"] = rohs_restricted(dict.fromkeys((result.cation, result.anion)))
    return row


def table_rows(session: Session, *, query: TableQuery) -> list[dict[str, Any]]:
    """Return the compound table rows for `query`: filtered, sorted, empty values last.

    The one source of rows for the table page, `GET /api/compounds` and `bondgap list`. Band
    gaps are those at `query.temperature_K`: stored at 300 K, else computed by the engine for
    the whole catalogue at once (a few ms).
    """
    stmt = select(CompoundResult).where(and_(True, *_conditions(query)))
    stmt = stmt.order_by(CompoundResult.formula)
    rows = [row_dict(r) for r in session.scalars(stmt)]
    if query.temperature_K != STORED_TEMPERATURE_K:
        at = gap_values_at(query.temperature_K)
        for row in rows:
            row.update(at[row["formula"]])
    rows = [
        r for r in rows
        if _within(r["band_gap_eV"], query.gap_min, query.gap_max)
        and _within(r["wavelength_nm"], query.wl_min, query.wl_max)
        and not excluded((r["cation"], r["anion"]), query.exclude, query.no_rohs)
    ]
    return _sorted(rows, query.sort, query.desc)


def model_version(session: Session) -> str | None:
    """The engine version of the stored results."""
    return session.scalar(select(StoreMeta.value).where(StoreMeta.key == "model_version"))


def table_payload(session: Session, *, query: TableQuery) -> dict[str, Any]:
    """The JSON object of `GET /api/compounds` and `bondgap list --json`."""
    rows = table_rows(session, query=query)
    return {
        "model_version": model_version(session),
        "query": query.as_params(),
        "temperature_K": query.temperature_K,
        "columns": [
            {"key": c.key, "label": c.label, "unit": c.unit, "description": c.description}
            for c in COLUMNS
        ],
        "count": len(rows),
        "rows": rows,
    }


def rows_csv(rows: list[dict[str, Any]]) -> str:
    """Render table rows as CSV text: a header of column keys, element lists joined with spaces."""
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow([*COLUMNS_BY_KEY, "hazard_elements", "rohs_restricted"])
    for row in rows:
        values = ["" if row[k] is None else row[k] for k in COLUMNS_BY_KEY]
        writer.writerow([*values, " ".join(row["hazard_elements"]),
                         " ".join(row["rohs_restricted"])])
    return out.getvalue()


def compound_report(
    session: Session, *, formula: str, temperature_K: float | None = None,
    on: str | None = None, geometry: str | None = None,
) -> dict[str, Any]:
    """Return the engine's report on one compound or alloy, its band gap at `temperature_K`.

    The stored report where the compound is catalogued and the temperature is the stored
    300 K; otherwise the engine computes it (a few ms once warm): the compound report of a
    binary, the alloy report of an alloy (`screening.alloy_report.material_report`). With `on`
    (a substrate, built-in or the user's) the report gains an `epitaxy` block.

    Raises:
        BondgapInputError: The text is not an octet binary or alloy formula, the temperature
            is outside 0 to 2000 K, or the layer cannot be put on the substrate (the message
            says why).
    """
    from screening.alloy_report import material_report, normalise_material

    normalised = normalise_material(formula)
    temperature = STORED_TEMPERATURE_K if temperature_K is None else temperature_K
    stored = session.get(CompoundResult, normalised)
    if stored and temperature == STORED_TEMPERATURE_K:
        report = json.loads(stored.report_json)
    else:
        report = material_report(normalised, temperature_K=temperature)
    if on is not None and on.strip():
        from app.substrates import resolve_substrate
        from screening.layer import layer_block

        substrate = resolve_substrate(session, on)
        report["epitaxy"] = layer_block(normalised, substrate, geometry or "single-uncapped")
    return report


def all_reports(session: Session) -> list[dict[str, Any]]:
    """Every stored report, in formula order (for charts that place one among all others)."""
    stmt = select(CompoundResult.report_json).order_by(CompoundResult.formula)
    return [json.loads(text) for text in session.scalars(stmt)]


def compound_count(session: Session) -> int:
    """How many compounds are stored."""
    return session.scalar(select(func.count()).select_from(CompoundResult)) or 0
