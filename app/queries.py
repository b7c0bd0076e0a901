"""Read side of the store: the compound table (one function for page, API and CSV) and reports.

`TableQuery.parse` checks filters and the sort key against `app.columns.COLUMNS` (an unknown
key raises `QueryError`, which the web layer answers with 400 and the CLI with exit code 2);
`table_rows` runs the query with bound parameters only.
"""

from __future__ import annotations

import csv
import io
import json
import math
from dataclasses import asdict, dataclass
from typing import Any

from sqlalchemy import ColumnElement, and_, func, select
from sqlalchemy.orm import Session

from app.columns import COLUMNS, COLUMNS_BY_KEY
from app.store import CompoundResult, StoreMeta
from screening.elements import FAMILIES
from screening.errors import BondgapInputError
from screening.structure import STRUCTURES


class QueryError(BondgapInputError):
    """A table query the store cannot answer: unknown sort key, filter value or gap window."""


FAMILY_CHOICES: tuple[str, ...] = tuple(FAMILIES[v] for v in sorted(FAMILIES, reverse=True))
STRUCTURE_CHOICES: tuple[str, ...] = STRUCTURES


def _choice(value: str | None, accepted: tuple[str, ...], what: str) -> str | None:
    """Match `value` case-insensitively against `accepted`; None for an empty value."""
    if value is None or not value.strip():
        return None
    for option in accepted:
        if option.lower() == value.strip().lower():
            return option
    raise QueryError(f"unknown {what} {value.strip()[:40]!r}; accepted: {', '.join(accepted)}")


def _bound(value: float | str | None, name: str) -> float | None:
    """Read one end of the gap window in eV; None for an empty value."""
    if value is None or (isinstance(value, str) and not value.strip()):
        return None
    try:
        number = float(value)
    except ValueError:
        number = math.nan
    if not math.isfinite(number):
        raise QueryError(f"{name} must be a finite number of eV, not {str(value)[:40]!r}")
    return number


@dataclass(frozen=True)
class TableQuery:
    """A checked table query: filters, sort key and direction."""

    family: str | None = None
    structure: str | None = None
    gap_min: float | None = None
    gap_max: float | None = None
    measured_only: bool = False
    sort: str = "formula"
    desc: bool = False

    @classmethod
    def parse(
        cls,
        *,
        family: str | None = None,
        structure: str | None = None,
        gap_min: float | str | None = None,
        gap_max: float | str | None = None,
        measured_only: bool = False,
        sort: str | None = None,
        desc: bool = False,
    ) -> TableQuery:
        """Check raw filter values (as typed in a form, a URL or the CLI) and return the query.

        Raises:
            QueryError: Unknown family, structure or sort key; a gap bound that is not a
                finite number; a gap window with min > max.
        """
        gap_min, gap_max = _bound(gap_min, "gap-min"), _bound(gap_max, "gap-max")
        if gap_min is not None and gap_max is not None and gap_min > gap_max:
            raise QueryError(f"empty gap window: gap-min {gap_min:g} eV > gap-max {gap_max:g} eV")
        sort_key = (sort or "formula").strip()
        if sort_key not in COLUMNS_BY_KEY:
            raise QueryError(
                f"cannot sort by {sort_key[:40]!r}; sortable columns: {', '.join(COLUMNS_BY_KEY)}"
            )
        return cls(
            family=_choice(family, FAMILY_CHOICES, "family"),
            structure=_choice(structure, STRUCTURE_CHOICES, "structure"),
            gap_min=gap_min,
            gap_max=gap_max,
            measured_only=measured_only,
            sort=sort_key,
            desc=desc,
        )

    def as_params(self) -> dict[str, Any]:
        """Return the query as URL parameters (only those set), for links and the API echo."""
        return {k: v for k, v in asdict(self).items() if v not in (None, False, "")}


def _conditions(query: TableQuery) -> list[ColumnElement[bool]]:
    """SQL conditions for the query's filters (values go in as bound parameters)."""
    table = CompoundResult
    conditions: list[ColumnElement[bool]] = []
    if query.family:
        conditions.append(table.family == query.family)
    if query.structure:
        conditions.append(table.structure_observed == query.structure)
    if query.gap_min is not None:
        conditions.append(table.gap_measured_ev >= query.gap_min)
    if query.gap_max is not None:
        conditions.append(table.gap_measured_ev <= query.gap_max)
    if query.measured_only:
        conditions.append(table.gap_measured_ev.is_not(None))
    return conditions


def row_dict(result: CompoundResult) -> dict[str, Any]:
    """One table row as the API, CSV and page see it (keys from `COLUMNS`, plus hazards)."""
    row = {c.key: getattr(result, c.attr) for c in COLUMNS}
    row["hazard_elements"] = [e for e in result.hazard_elements.split(",") if e]
    return row


def table_rows(session: Session, *, query: TableQuery) -> list[dict[str, Any]]:
    """Return the compound table rows for `query`: filtered, sorted, empty values last.

    The one source of rows for the table page, `GET /api/compounds` and `bondgap list`.
    """
    column = getattr(CompoundResult, COLUMNS_BY_KEY[query.sort].attr)
    order = column.desc() if query.desc else column.asc()
    stmt = (
        select(CompoundResult)
        .where(and_(True, *_conditions(query)))
        .order_by(column.is_(None), order, CompoundResult.formula)
    )
    return [row_dict(r) for r in session.scalars(stmt)]


def model_version(session: Session) -> str | None:
    """The engine version of the stored results."""
    return session.scalar(select(StoreMeta.value).where(StoreMeta.key == "model_version"))


def table_payload(session: Session, *, query: TableQuery) -> dict[str, Any]:
    """The JSON object of `GET /api/compounds` and `bondgap list --json`."""
    rows = table_rows(session, query=query)
    return {
        "model_version": model_version(session),
        "query": query.as_params(),
        "columns": [
            {"key": c.key, "label": c.label, "unit": c.unit, "description": c.description}
            for c in COLUMNS
        ],
        "count": len(rows),
        "rows": rows,
    }


def rows_csv(rows: list[dict[str, Any]]) -> str:
    """Render table rows as CSV text: a header of column keys, hazards joined with spaces."""
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow([*COLUMNS_BY_KEY, "hazard_elements"])
    for row in rows:
        values = ["" if row[k] is None else row[k] for k in COLUMNS_BY_KEY]
        writer.writerow([*values, " ".join(row["hazard_elements"])])
    return out.getvalue()


def compound_report(session: Session, *, formula: str) -> dict[str, Any]:
    """Return the engine's report on one compound: stored if catalogued, else computed.

    Raises:
        BondgapInputError: The text is not an octet binary formula (the engine's message).
    """
    from screening.report import compound_report as compute
    from screening.report import normalise_formula

    normalised = normalise_formula(formula)
    stored = session.get(CompoundResult, normalised)
    return json.loads(stored.report_json) if stored else compute(normalised)


def all_reports(session: Session) -> list[dict[str, Any]]:
    """Every stored report, in formula order (for charts that place one among all others)."""
    stmt = select(CompoundResult.report_json).order_by(CompoundResult.formula)
    return [json.loads(text) for text in session.scalars(stmt)]


def compound_count(session: Session) -> int:
    """How many compounds are stored."""
    return session.scalar(select(func.count()).select_from(CompoundResult)) or 0
