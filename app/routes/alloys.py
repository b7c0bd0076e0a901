"""The composition finder: the page `/alloys` and `GET /api/match`, both from `app.finder`."""

from __future__ import annotations

from typing import Annotated, Any
from urllib.parse import quote, urlencode

from fastapi import APIRouter, Depends, Query, Request
from fastapi.responses import RedirectResponse, Response

from app.deps import SessionDep
from app.finder import (
    DEFAULT_LIMIT,
    DEFAULT_TOLERANCE_EV,
    MAX_LIMIT,
    MAX_OFFSET,
    MAX_PAGE_ROWS,
    MAX_TABLE_ROWS,
    SORT_KEYS,
    MatchQuery,
    run_match,
)
from app.finder_chart import finder_chart
from app.finder_payload import match_payload
from app.number_input import NumberRule
from app.params import QueryError, number
from app.shortlists import all_shortlists
from app.substrates import substrate_rows
from app.views import caution_line
from screening.alloy_report import normalise_material
from screening.alloys import design_space_systems
from screening.alloys.query import DEFAULT_FAMILIES
from screening.epitaxy import GEOMETRIES, MISMATCH_PERCENT_CONVENTION
from screening.errors import BondgapInputError
from screening.hazards import ROHS_ELEMENTS

router = APIRouter()

EXCLUDE_CHOICES: tuple[str, ...] = ("As", "Sb", "P", "Cd", "Hg", "Tl", "Be", "Se", "Te")
"""Elements offered as checkboxes (the toxic ones and P); others go in the text field."""

COLUMNS: tuple[tuple[str, str, str], ...] = (
    ("rank", "#", ""), ("formula", "Composition", ""),
    ("lattice_constant_angstrom", "a", "Å"), ("mismatch", "Mismatch f", "%"),
    ("band_gap_eV", "Band gap", "eV"), ("wavelength_nm", "Wavelength", "nm"),
    ("critical_thickness_nm", "Critical thickness", "nm"),
)
"""Sortable columns of the results table: key, header, unit."""

PARAMS = ("system", "on", "gap", "wavelength", "tolerance", "temperature", "max_mismatch",
          "thickness", "geometry", "sort", "desc", "limit", "offset")

PERCENT_FIELD = "max_mismatch_percent"
"""The page's form asks the mismatch limit in percent; the API's `max_mismatch` is a fraction."""


MISMATCH_PERCENT = NumberRule("the mismatch limit", "percent", 0.0, 100.0)
"""The finder form's mismatch limit, in percent."""
MAX_MISMATCH_FRACTION = NumberRule("max_mismatch", "", 0.0, 1.0)
"""The API's mismatch limit, a fraction (read here only to fill the form's percent field)."""


def _mismatch_fraction(params: Any) -> str | None:
    """The page's mismatch limit as the API's fraction: from the form's percent, or as given.

    Raises:
        QueryError: Not a number of percent from 0 to 100, or given both ways.
    """
    text = (params.get(PERCENT_FIELD) or "").strip()
    if not text:
        return params.get("max_mismatch")
    if (params.get("max_mismatch") or "").strip():
        raise QueryError("give the mismatch limit once: in percent (max_mismatch_percent) or "
                         "as a fraction (max_mismatch)")
    return repr(number(text, MISMATCH_PERCENT) / 100)


def match_query(
    system: Annotated[str | None, Query(
        description="Alloy system without numbers (InGaAs, InGaAsP) or all (default)")] = None,
    on: Annotated[str | None, Query(
        description="Substrate: a built-in name (InP, GaAs, ...) or one of yours")] = None,
    gap: Annotated[str | None, Query(description="Target band gap, eV")] = None,
    wavelength: Annotated[str | None, Query(
        description="Target photon wavelength, nm (instead of gap)")] = None,
    tolerance: Annotated[str | None, Query(
        description=f"Gap tolerance, eV (default {DEFAULT_TOLERANCE_EV})")] = None,
    temperature: Annotated[str | None, Query(
        description="Temperature of the gaps, K (0 to 2000; default 300)")] = None,
    max_mismatch: Annotated[str | None, Query(
        description="Largest |mismatch| as a fraction (0.001 = 0.1 %)")] = None,
    thickness: Annotated[str | None, Query(
        description="Layer thickness that must stay below the critical thickness, nm")] = None,
    geometry: Annotated[str | None, Query(
        description=f"Matthews-Blakeslee geometry: {', '.join(GEOMETRIES)}")] = None,
    exclude: Annotated[list[str] | None, Query(
        description="Elements no match may contain (repeat, or a comma list)")] = None,
    no_rohs: Annotated[bool, Query(
        description=f"Exclude compositions with a RoHS-restricted element ({ROHS_ELEMENTS})")
    ] = False,
    sort: Annotated[str | None, Query(
        description=f"Order of the matches: {', '.join(SORT_KEYS)} (default rank)")] = None,
    desc: Annotated[bool, Query(description="Descending order")] = False,
    limit: Annotated[str | None, Query(
        description=f"Most matches returned, 1 to {MAX_LIMIT} (default {DEFAULT_LIMIT}); an "
                    f"answer holds at most {MAX_PAGE_ROWS}: ask for the rest with offset")
    ] = None,
    offset: Annotated[str | None, Query(
        description=f"Matches skipped before the first one returned, 0 to {MAX_OFFSET} "
                    "(default 0); the answer's next_offset is that of the next page")] = None,
) -> MatchQuery:
    """Read the finder query from the URL (shared by the page and the API)."""
    return MatchQuery.parse(system=system, on=on, gap=gap, wavelength=wavelength,
                            tolerance=tolerance, temperature=temperature,
                            max_mismatch=max_mismatch, thickness=thickness, geometry=geometry,
                            exclude=exclude, no_rohs=no_rohs, sort=sort, desc=desc,
                            limit=limit, offset=offset)


MatchQueryDep = Annotated[MatchQuery, Depends(match_query)]


MATCH_DESCRIPTION = f"""Alloy compositions that meet a target on a substrate (as bondgap match
--json).

matches: one page of the matches in the asked order, from `offset` on, at most `limit` and
never more than {MAX_PAGE_ROWS}; each with formula, fractions (element -> fraction on its site),
lattice_constant_angstrom, mismatch (fraction, sign convention in mismatch_convention),
band_gap_eV, band_gap_uncertainty_eV and critical_thickness_nm (null when lattice-matched or
not applicable). count: every match over all pages; shown: the matches in this answer; offset:
the position of the first; next_offset: the offset of the next page (null on the last). An
empty list is an answer, with a message saying so.

Bounded cost: a search screens the whole design space (about 700 000 compositions for
system=all) in slices of fixed size, one search at a time per server; only the rows of the
page are fully computed, so an answer holds at most {MAX_PAGE_ROWS} matches (about 0.5 MB).
"""


@router.get("/api/match", tags=["alloys"], summary="Composition finder",
            description=MATCH_DESCRIPTION, responses={
                400: {"description": 'Bad input, as {"detail": "what was wrong and what is '
                                     'accepted"}'},
                422: {"description": 'A parameter of the wrong type, as {"detail": "desc: '
                                     '..."}'}})
def api_match(session: SessionDep, query: MatchQueryDep) -> dict[str, Any]:
    """Alloy compositions that meet a target on a substrate (see `MATCH_DESCRIPTION`)."""
    return match_payload(run_match(session, query.capped()))


def _query_of(request: Request) -> MatchQuery:
    params = request.query_params
    values = {k: params.get(k) for k in PARAMS if k != "desc"}
    return match_query(**{**values, "max_mismatch": _mismatch_fraction(params)},
                       desc=params.get("desc", "").lower() in ("true", "1", "on", "yes"),
                       exclude=params.getlist("exclude") or None,  # as the API reads it
                       no_rohs=params.get("no_rohs", "").lower() in ("true", "1", "on", "yes"))


def _headers(query: MatchQuery) -> list[dict[str, Any]]:
    params = query.as_params()
    headers = []
    for key, label, unit in COLUMNS:
        active = query.sort == key
        link = {**params, "sort": key}
        link.pop("desc", None)
        link.pop("offset", None)  # a new order starts at its first page
        if active and not query.desc and key != "rank":
            link["desc"] = "true"
        aria = ("descending" if query.desc else "ascending") if active else "none"
        headers.append({"key": key, "label": label, "unit": unit, "aria_sort": aria,
                        "url": "/alloys?" + urlencode(link, doseq=True)})
    return headers


def _page_url(query: MatchQuery, offset: int | None) -> str | None:
    """The finder page of the same query from another offset (None for no offset)."""
    if offset is None:
        return None
    params = {k: v for k, v in query.as_params().items() if k != "offset"}
    return "/alloys?" + urlencode({**params, **({"offset": offset} if offset else {})},
                                  doseq=True)


def _as_percent(fraction: str | None) -> str:
    """An old link's `max_mismatch` fraction as the form's percent ("" if it is not one)."""
    try:
        value = number(fraction, MAX_MISMATCH_FRACTION)
    except QueryError:
        return ""
    return "" if value is None else f"{100 * value:g}"


def _form(request: Request) -> dict[str, Any]:
    params = request.query_params
    form = {k: params.get(k, "") for k in PARAMS}
    form[PERCENT_FIELD] = params.get(PERCENT_FIELD) or _as_percent(params.get("max_mismatch"))
    form["no_rohs"] = params.get("no_rohs", "").lower() in ("true", "1", "on", "yes")
    form["exclude"] = [e.strip() for v in params.getlist("exclude") for e in v.split(",")
                       if e.strip()]
    return form


@router.get("/alloys/open", include_in_schema=False)
def open_composition(formula: str = "", on: str = "") -> RedirectResponse:
    """Go to the page of a composition typed in the finder's look-up box (any spelling)."""
    target = "/compounds/" + quote(normalise_material(formula))
    return RedirectResponse(target + ("?" + urlencode({"on": on}) if on.strip() else ""),
                            status_code=303)


@router.get("/alloys", include_in_schema=False)
def finder_page(request: Request, session: SessionDep) -> Response:
    """The finder: a GET form, then the matches as a sortable table and a chart."""
    context: dict[str, Any] = {
        "form": _form(request), "substrates": substrate_rows(session),
        "systems": [s.name for s in design_space_systems(DEFAULT_FAMILIES)],
        "geometries": GEOMETRIES, "exclude_choices": EXCLUDE_CHOICES,
        "default_tolerance": DEFAULT_TOLERANCE_EV, "convention": MISMATCH_PERCENT_CONVENTION,
        "rohs_elements": ROHS_ELEMENTS,
        "payload": None, "error": None, "shortlists": all_shortlists(session),
    }
    status = 200
    if request.query_params:
        try:
            query = _query_of(request).capped(MAX_TABLE_ROWS)
            run = run_match(session, query)
        except BondgapInputError as exc:
            context["error"], status = str(exc), 400
        else:
            payload = match_payload(run)
            on = {"on": run.substrate.name, "geometry": query.geometry}
            if query.temperature is not None:
                on["temperature"] = f"{query.temperature:g}"
            context.update(
                payload=payload, query=query, headers=_headers(query),
                chart=finder_chart(run, payload["matches"]),
                detail_query="?" + urlencode(on),
                json_url="/api/match?" + urlencode(query.as_params(), doseq=True),
                next_url=_page_url(query, run.next_offset),
                first_url=_page_url(query, 0),
                caution=caution_line(
                    {e for m in payload["matches"] for e, f in m["fractions"].items() if f}))
    return request.app.state.templates.TemplateResponse(
        request, "finder.html", context, status_code=status)

