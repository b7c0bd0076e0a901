"""The page of one alloy composition (`/compounds/In0.53Ga0.47As`, dispatched from `pages`)."""

from __future__ import annotations

from typing import Any
from urllib.parse import quote, urlencode

from fastapi import Request
from fastapi.responses import Response
from sqlalchemy.orm import Session

from app.alloy_views import alloy_context
from app.page_extras import report_extras
from app.substrates import substrate_rows
from screening.epitaxy import GEOMETRIES


def alloy_page(request: Request, session: Session, report: dict[str, Any], *,
               on: str | None, geometry: str | None) -> Response:
    """Render `alloy.html`: the compound page's sections for an alloy, plus the substrate."""
    context = alloy_context(session, report, on=on, geometry=geometry)
    params = {k: v for k, v in (("temperature", request.query_params.get("temperature")),
                                ("on", on), ("geometry", geometry if on else None)) if v}
    json_url = "/api/compounds/" + quote(report["formula"])
    context.update(report=report, substrates=substrate_rows(session), geometries=GEOMETRIES,
                   json_url=json_url + ("?" + urlencode(params) if params else ""),
                   **report_extras(session, report))
    status = 400 if context["epitaxy_error"] else 200  # as the API answers the same query
    return request.app.state.templates.TemplateResponse(request, "alloy.html", context,
                                                        status_code=status)
