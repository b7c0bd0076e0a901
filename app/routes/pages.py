"""HTML pages: the compound table, one page per compound, model accuracy, the API reference."""

from __future__ import annotations

from typing import Any
from urllib.parse import quote, urlencode

from fastapi import APIRouter, Request
from fastapi.responses import RedirectResponse, Response

from app import gap_views, queries, views
from app.accuracy import accuracy_payload
from app.alloy_views import epitaxy_for, epitaxy_section
from app.band_data import bands_payload
from app.candidates import elements_of
from app.columns import COLUMNS
from app.deps import SessionDep, TableQueryDep, TemperatureDep
from app.page_extras import report_extras, table_extras
from app.routes.alloy_page import alloy_page
from screening.bands import MODEL_LIMITS

router = APIRouter(include_in_schema=False)


def _render(request: Request, name: str, context: dict[str, Any]) -> Response:
    return request.app.state.templates.TemplateResponse(request, name, context)


def _url_params(query: queries.TableQuery) -> dict[str, Any]:
    """The query's parameters for a link (booleans spelled as in a form: "true")."""
    return {k: "true" if v is True else v for k, v in query.as_params().items()}


def _sort_headers(query: queries.TableQuery) -> list[dict[str, Any]]:
    """Header cells of the table: each column with the link that sorts by it."""
    headers = []
    for column in COLUMNS:
        if not column.shown:
            continue
        active = query.sort == column.key
        params = {**_url_params(query), "sort": column.key}
        params.pop("desc", None)
        if active and not query.desc:
            params["desc"] = "true"
        aria = ("descending" if query.desc else "ascending") if active else "none"
        headers.append({"column": column, "url": "/compounds?" + urlencode(params),
                        "aria_sort": aria})
    return headers


@router.get("/")
def home() -> RedirectResponse:
    """The table is the home page."""
    return RedirectResponse("/compounds", status_code=307)


@router.get("/compounds")
def compounds_page(request: Request, session: SessionDep, query: TableQueryDep) -> Response:
    """The compound table, filtered and sorted by the URL's parameters."""
    rows = queries.table_rows(session, query=query)
    hazards = {e for row in rows for e in row["hazard_elements"]}
    params = _url_params(query)
    return _render(request, "compounds.html", {
        "rows": rows,
        "headers": _sort_headers(query),
        "query": query,
        "total": queries.compound_count(session),
        "families": queries.FAMILY_CHOICES,
        "structures": queries.STRUCTURE_CHOICES,
        "kinds": queries.KIND_CHOICES,
        "model_limits": MODEL_LIMITS,
        "csv_url": "/api/compounds.csv" + ("?" + urlencode(params) if params else ""),
        "json_url": "/api/compounds" + ("?" + urlencode(params) if params else ""),
        "caution": views.caution_line(hazards),
        "stored_model_version": queries.model_version(session),
        **table_extras(session, rows),
    })


def _api_query(temperature: float | None, on: str | None, geometry: str | None) -> str:
    """The page's temperature, substrate and geometry as the JSON link's query ("" if none)."""
    params = {"temperature": None if temperature is None else f"{temperature:.10g}",
              "on": on, "geometry": geometry if on else None}
    given = {k: v for k, v in params.items() if v}
    return "?" + urlencode(given) if given else ""


@router.get("/compounds/{formula:path}")
def compound_page(
    request: Request, session: SessionDep, formula: str, temperature: TemperatureDep,
    on: str | None = None, geometry: str | None = None,
) -> Response:
    """Everything about one compound or alloy: band gap at a temperature, numbers, charts."""
    report = queries.compound_report(session, formula=formula, temperature_K=temperature)
    at = "" if temperature is None else "?" + urlencode({"temperature": f"{temperature:.10g}"})
    if report["formula"] != formula:
        if request.query_params:  # keep substrate and geometry
            at = "?" + urlencode(request.query_params.multi_items())
        return RedirectResponse("/compounds/" + quote(report["formula"]) + at, status_code=307)
    if report.get("alloy"):
        return alloy_page(request, session, report, on=on, geometry=geometry)
    bands = bands_payload(report["formula"], points=gap_views.CHART_POINTS)
    charts = {
        "ehc": views.eh_c_chart(queries.all_reports(session), formula=report["formula"]),
        "levels": views.bond_levels_chart(report),
        "bands": gap_views.band_chart(report, bands),
    }
    block, _, problem = epitaxy_for(session, report["formula"], on, geometry or "single-uncapped")
    sections = [*views.report_sections(report), gap_views.tight_binding_section(report, bands)]
    if block:
        sections.insert(0, epitaxy_section(block))
    page = _render(request, "compound.html", {
        "report": report,
        "epitaxy_error": problem,
        "gap": gap_views.gap_summary(report),
        "gap_section": gap_views.band_gap_section(report),
        "sections": sections,
        "charts": charts,
        "model_limits": MODEL_LIMITS,
        "hazard_caution": views.caution_line(elements_of(report)),
        "hazard_notes": report.get("hazards", {}).get("notes") or [],
        "json_url": "/api/compounds/" + quote(report["formula"])
        + _api_query(temperature, on, geometry),
        "bands_url": "/api/compounds/" + quote(report["formula"]) + "/bands",
        **report_extras(session, report),
    })
    page.status_code = 400 if problem else 200  # an unknown substrate: as the API answers
    return page


@router.get("/accuracy")
def accuracy_page(request: Request) -> Response:
    """Measured against leave-one-out estimated band gap for every measured compound."""
    data = accuracy_payload()
    return _render(request, "accuracy.html", {"data": data, "model_limits": MODEL_LIMITS})


@router.get("/api/docs")
def api_docs(request: Request) -> Response:
    """The API reference, rendered from the app's own OpenAPI document (works offline)."""
    spec = request.app.openapi()
    return _render(request, "api_docs.html", {"spec": spec})
