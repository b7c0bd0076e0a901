"""Build the web app: `create_app(settings)` opens the store and wires pages, API and errors.

Bad input is answered with a 4xx status and a one-line message: `{"detail": "..."}` under
`/api/`, a short error page elsewhere. No traceback ever reaches the client.
"""

from __future__ import annotations

from fastapi import FastAPI, Request
from fastapi.exceptions import RequestValidationError
from fastapi.responses import FileResponse, JSONResponse, Response
from fastapi.staticfiles import StaticFiles
from fastapi.templating import Jinja2Templates
from starlette.exceptions import HTTPException as StarletteHTTPException

import screening
from app.config import Settings
from app.routes import alloys, api, measurements, pages, shortlist_api, shortlist_pages, substrates
from app.store import open_store
from screening.errors import BondgapInputError


def make_templates(settings: Settings) -> Jinja2Templates:
    """The Jinja2 environment of the pages (autoescaping on)."""
    templates = Jinja2Templates(directory=settings.templates_dir)
    templates.env.globals["model_version"] = screening.MODEL_VERSION
    return templates


def _error(request: Request, status: int, message: str) -> Response:
    """Answer an error as JSON under /api/, as a page elsewhere."""
    if request.url.path.startswith("/api/") or request.url.path == "/api":
        return JSONResponse({"detail": message}, status_code=status)
    templates: Jinja2Templates = request.app.state.templates
    return templates.TemplateResponse(
        request, "error.html", {"status": status, "message": message}, status_code=status
    )


async def _input_error(request: Request, exc: Exception) -> Response:
    # A subclass may name its own 4xx status (404 not found, 409 conflict, 413 too large).
    return _error(request, getattr(exc, "status_code", 400), str(exc))


async def _validation_error(request: Request, exc: Exception) -> Response:
    assert isinstance(exc, RequestValidationError)
    parts = []
    for err in exc.errors():
        where = ".".join(str(p) for p in err.get("loc", ()) if p not in ("query", "path"))
        parts.append(f"{where}: {err.get('msg', 'invalid value')}")
    return _error(request, 422, "; ".join(parts) or "invalid request")


async def _http_error(request: Request, exc: Exception) -> Response:
    assert isinstance(exc, StarletteHTTPException)
    if exc.status_code == 404 and exc.detail == "Not Found":
        return _error(request, 404, f"nothing at {request.url.path[:100]}")
    return _error(request, exc.status_code, str(exc.detail))


def create_app(settings: Settings) -> FastAPI:
    """Create the app: migrate and refresh the database, then mount pages, API and assets.

    Args:
        settings: Where the database, templates and static files are.

    Returns:
        The FastAPI application (OpenAPI at /api/openapi.json, its docs at /api/docs).

    Raises:
        StoreError: The database file cannot be used.
    """
    app = FastAPI(
        title="bondgap",
        version=screening.MODEL_VERSION,
        summary="Octet binary compounds: band gaps, lattice constants, ionicity and polarity.",
        openapi_url="/api/openapi.json",
        docs_url=None,  # the stock docs pages load scripts from a CDN; ours work offline
        redoc_url=None,
    )
    app.state.settings = settings
    app.state.sessions = open_store(settings.db_path)
    app.state.templates = make_templates(settings)
    app.add_exception_handler(BondgapInputError, _input_error)
    app.add_exception_handler(RequestValidationError, _validation_error)
    app.add_exception_handler(StarletteHTTPException, _http_error)
    app.include_router(api.router)
    app.include_router(alloys.router)
    app.include_router(substrates.router)
    app.include_router(shortlist_api.router)
    app.include_router(shortlist_pages.router)
    app.include_router(measurements.router)
    app.include_router(pages.router)
    app.mount("/static", StaticFiles(directory=settings.static_dir), name="static")

    @app.get("/vendor/plotly.min.js", include_in_schema=False)
    def plotly_js() -> FileResponse:
        """plotly.js from the installed plotly package (the one file, not its folder)."""
        return FileResponse(
            settings.plotly_js,
            media_type="text/javascript",
            headers={"Cache-Control": "public, max-age=86400"},
        )

    return app
