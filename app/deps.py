"""Dependencies shared by the routes: the settings, a database session, the table query."""

from __future__ import annotations

from collections.abc import Iterator
from typing import Annotated

from fastapi import Depends, Query, Request
from sqlalchemy.orm import Session

from app.columns import COLUMNS_BY_KEY
from app.config import Settings
from app.queries import FAMILY_CHOICES, STRUCTURE_CHOICES, TableQuery


def get_settings(request: Request) -> Settings:
    """The settings the app was created with."""
    return request.app.state.settings


def get_session(request: Request) -> Iterator[Session]:
    """One session per request, closed afterwards (reads only, so nothing to commit)."""
    with request.app.state.sessions() as session:
        yield session


def table_query(
    family: Annotated[
        str | None, Query(description=f"Family: {', '.join(FAMILY_CHOICES)}")
    ] = None,
    structure: Annotated[
        str | None,
        Query(description=f"Observed structure: {', '.join(STRUCTURE_CHOICES)}"),
    ] = None,
    gap_min: Annotated[
        str | None, Query(description="Lowest measured band gap, eV")
    ] = None,
    gap_max: Annotated[
        str | None, Query(description="Highest measured band gap, eV")
    ] = None,
    measured_only: Annotated[
        bool, Query(description="Only compounds with a measured band gap")
    ] = False,
    sort: Annotated[
        str | None,
        Query(description=f"Column to sort by: {', '.join(COLUMNS_BY_KEY)}"),
    ] = None,
    desc: Annotated[bool, Query(description="Sort in descending order")] = False,
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
    )


SettingsDep = Annotated[Settings, Depends(get_settings)]
SessionDep = Annotated[Session, Depends(get_session)]
TableQueryDep = Annotated[TableQuery, Depends(table_query)]
