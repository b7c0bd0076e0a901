"""Build the web app: `create_app(settings)` opens the store and wires pages, API and errors.

Bad input is answered with a 4xx status and a one-line message: `{"detail": "..."}` under
`/api/`, a short error page elsewhere. No traceback ever reaches the client. Every request
passes the request guard first (`app.guard`: host allow-list, cross-site refusal, body limit,
the install's token for changes; `app.csrf`).
"""

from __future__ import annotations

from fastapi import FastAPI, Request
from fastapi.exceptions import RequestValidationError
from fastapi.responses import FileResponse, JSONResponse, Response
from fastapi.staticfiles import StaticFiles
from fastapi.templating import Jinja2Templates
from sqlalchemy.exc import OperationalError
from starlette.exceptions import HTTPException as StarletteHTTPException

import screening
from app.config import Settings
from app.csrf import install_token
from app.guard import RequestGuard
from app.numbers import JINJA_FILTERS
from app.page_cache import PageCache
from app.routes import alloys, api, measurements, pages, shortlist_api, shortlist_pages, substrates
from app.store import open_store
from app.validation import plain_messages
from screening.errors import BondgapInputError, one_line


def make_templates(settings: Settings) -> Jinja2Templates:
    """The Jinja2 environment of the pages (autoescaping on)."""
    templates = Jinja2Templates(directory=settings.templates_dir)
    templates.env.globals["model_version"] = screening.MODEL_VERSION
    templates.env.filters.update(JINJA_FILTERS)
    return templates


def _error(request: Request, status: int, message: str) -> Response:
    """Answer an error as JSON under /api/, as a page elsewhere (the message on one line)."""
    message = one_line(message)
    if request.url.path.startswith("/api/") or request.url.path == "/api":
        return JSONResponse({"detail": message}, status_code=status)
    templates: Jinja2Templates = request.app.state.templates
    # No token on error pages: a refused request (a foreign Host) must not be able to read it.
    return templates.TemplateResponse(
        request, "error.html", {"status": status, "message": message, "csrf_token": ""},
        status_code=status,
    )


async def _input_error(request: Request, exc: Exception) -> Response:
    # A subclass may name its own 4xx status (404 not found, 409 conflict, 413 too large).
    return _error(request, getattr(exc, "status_code", 400), str(exc))


async def _validation_error(request: Request, exc: Exception) -> Response:
    assert isinstance(exc, RequestValidationError)
    return _error(request, 422, plain_messages(exc.errors()))


async def _busy_error(request: Request, exc: Exception) -> Response:
    # The write lock stayed taken past the busy timeout (another program holds the file).
    assert isinstance(exc, OperationalError)
    reason = str(exc.orig)
    if "locked" in reason or "busy" in reason:
        response = _error(request, 503, "the database is busy (another program is writing "
                                        "to it); nothing was changed: try again")
        response.headers["Retry-After"] = "1"
        return response
    for words, why in _UNWRITABLE:
        if words in reason:
            return _error(request, 503, f"the database file cannot be written now ({why}); "
                                        "nothing was changed: fix the file, then restart")
    raise exc


_UNWRITABLE: tuple[tuple[str, str], ...] = (
    ("readonly", "it became read-only while the server runs"),
    ("disk is full", "the disk is full"),
    ("disk I/O error", "the disk reported an error"),
)
"""SQLite's reasons a write can fail after start, and how we say them."""


async def _http_error(request: Request, exc: Exception) -> Response:
    assert isinstance(exc, StarletteHTTPException)
    if exc.status_code == 404 and exc.detail == "Not Found":
        return _error(request, 404, f"nothing at {request.url.path[:100]}")
    return _error(request, exc.status_code, str(exc.detail))


def _describe_errors_as_answered(app: FastAPI) -> None:
    """Make the OpenAPI document describe 422 answers as they are sent: {"detail": "..."}."""
    stock = app.openapi

    def openapi() -> dict:
        if app.openapi_schema is None:
            schema = stock()
            components = schema.get("components", {}).get("schemas", {})
            if "HTTPValidationError" in components:
                components["HTTPValidationError"] = {
                    "title": "HTTPValidationError",
                    "type": "object",
                    "properties": {"detail": {"type": "string", "title": "Detail"}},
                    "required": ["detail"],
                }
                components.pop("ValidationError", None)
            app.openapi_schema = schema
        return app.openapi_schema

    app.openapi = openapi  # type: ignore[method-assign]


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
    app.state.csrf_token = install_token(app.state.sessions.kw["bind"])
    app.state.templates = make_templates(settings)
    app.state.templates.env.globals["csrf_token"] = app.state.csrf_token
    # The cache sits inside the guard: a cached answer still passes the host and site checks.
    app.add_middleware(PageCache, db_path=settings.db_path)
    app.add_middleware(RequestGuard, hosts=settings.host_names(), token=app.state.csrf_token,
                       refuse=_error)
    app.add_exception_handler(BondgapInputError, _input_error)
    app.add_exception_handler(OperationalError, _busy_error)
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
    _describe_errors_as_answered(app)

    @app.get("/vendor/plotly.min.js", include_in_schema=False)
    def plotly_js() -> FileResponse:
        """plotly.js from the installed plotly package (the one file, not its folder)."""
        return FileResponse(
            settings.plotly_js,
            media_type="text/javascript",
            headers={"Cache-Control": "public, max-age=86400"},
        )

    return app
