"""Dependencies shared by the routes: settings, a database session, the checked URL inputs."""

from __future__ import annotations

from collections.abc import Iterator
from typing import Annotated

from fastapi import Depends, Path, Query, Request
from sqlalchemy.orm import Session

from app.columns import COLUMNS_BY_KEY
from app.config import Settings
from app.number_input import PlainWhole
from app.params import (
    DEFAULT_POINTS,
    FAMILY_CHOICES,
    KIND_CHOICES,
    STRUCTURE_CHOICES,
    TableQuery,
    parse_points,
    parse_temperature,
)
from app.text_rules import MAX_ID
from screening.hazards import ROHS_ANNEX_II


def get_settings(request: Request) -> Settings:
    """The settings the app was created with."""
    return request.app.state.settings


def get_session(request: Request) -> Iterator[Session]:
    """One session per request, closed afterwards (reads only, so nothing to commit)."""
    with request.app.state.sessions() as session:
        yield session


TEMPERATURE_HELP = "Temperature of the band gaps, K (0 to 2000; default 300)"


def table_query(
    family: Annotated[
        str | None, Query(description=f"Family: {', '.join(FAMILY_CHOICES)}")
    ] = None,
    structure: Annotated[
        str | None,
        Query(description=f"Observed structure: {', '.join(STRUCTURE_CHOICES)}"),
    ] = None,
    gap_min: Annotated[
        str | None,
        Query(description="Lowest band gap at the temperature, eV (measured, else estimate)"),
    ] = None,
    gap_max: Annotated[
        str | None,
        Query(description="Highest band gap at the temperature, eV (measured, else estimate)"),
    ] = None,
    measured_only: Annotated[
        bool, Query(description="Only compounds with a measured band gap")
    ] = False,
    sort: Annotated[
        str | None,
        Query(description=f"Column to sort by: {', '.join(COLUMNS_BY_KEY)}"),
    ] = None,
    desc: Annotated[bool, Query(description="Sort in descending order")] = False,
    temperature: Annotated[str | None, Query(description=TEMPERATURE_HELP)] = None,
    wl_min: Annotated[
        str | None, Query(description="Shortest photon wavelength of the band gap, nm")
    ] = None,
    wl_max: Annotated[
        str | None, Query(description="Longest photon wavelength of the band gap, nm")
    ] = None,
    kind: Annotated[
        str | None,
        Query(description=f"Gap kind (measured, else sp3 model): {', '.join(KIND_CHOICES)}"),
    ] = None,
    exclude: Annotated[
        list[str] | None,
        Query(description="Leave out compounds containing these elements: exclude=As,Cd "
                          "(or the parameter repeated)"),
    ] = None,
    no_rohs: Annotated[
        bool,
        Query(description="Leave out compounds with an element restricted by RoHS "
                          f"({ROHS_ANNEX_II})"),
    ] = False,
) -> TableQuery:
    """Read the table filters from the URL (shared by the table page and the API)."""
    return TableQuery.parse(
        family=family,
        structure=structure,
        gap_min=gap_min,
        gap_max=gap_max,
        measured_only=measured_only,
        sort=sort,
        desc=desc,
        temperature=temperature,
        wl_min=wl_min,
        wl_max=wl_max,
        kind=kind,
        exclude=exclude,
        no_rohs=no_rohs,
    )


def temperature_query(
    temperature: Annotated[str | None, Query(description=TEMPERATURE_HELP)] = None,
) -> float | None:
    """Read `?temperature=` (K) from the URL; None where not given (300 K)."""
    return parse_temperature(temperature)


def points_query(
    points: Annotated[
        str | None,
        Query(description=f"Number of k-points along the path, 6 to 2000 (default "
                          f"{DEFAULT_POINTS})"),
    ] = None,
) -> int:
    """Read `?points=` from the URL."""
    return parse_points(points)


SettingsDep = Annotated[Settings, Depends(get_settings)]
SessionDep = Annotated[Session, Depends(get_session)]
TableQueryDep = Annotated[TableQuery, Depends(table_query)]
TemperatureDep = Annotated[float | None, Depends(temperature_query)]
PointsDep = Annotated[int, Depends(points_query)]
ShortlistId = Annotated[PlainWhole, Path(ge=1, le=MAX_ID, description="Shortlist id")]
"""A shortlist id in a URL: a whole number that SQLite can store (1 to 2**63 - 1)."""


LIST_PAGE_ROWS = 1000
"""Most rows one answer of a listing API (your measurements, your shortlists) holds."""
MAX_LIST_OFFSET = 1_000_000
"""Largest offset a listing API accepts."""


def list_page(
    offset: Annotated[PlainWhole, Query(
        ge=0, le=MAX_LIST_OFFSET,
        description=f"Rows to skip (0 to {MAX_LIST_OFFSET}); the answer's next_offset gives "
        "the next page")] = 0,
    limit: Annotated[PlainWhole, Query(
        ge=1, le=LIST_PAGE_ROWS,
        description=f"Most rows in this answer (1 to {LIST_PAGE_ROWS})")] = LIST_PAGE_ROWS,
) -> tuple[int, int]:
    """The (offset, limit) of one page of a listing API."""
    return offset, limit


ListPageDep = Annotated[tuple[int, int], Depends(list_page)]


def paged(total: int, offset: int, limit: int) -> dict[str, int | None]:
    """The paging keys of a listing answer: total, offset and next_offset (None at the end)."""
    following = offset + limit
    return {"total": total, "offset": offset,
            "next_offset": following if following < total else None}
