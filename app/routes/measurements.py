"""The user's own measured values: import a CSV (page and API), list them, delete an import."""

from __future__ import annotations

from typing import Annotated, Any
from urllib.parse import urlencode

from fastapi import APIRouter, Form, Path, Query, Request
from fastapi.concurrency import run_in_threadpool
from fastapi.responses import PlainTextResponse, RedirectResponse, Response
from starlette.datastructures import UploadFile

from app.deps import LIST_PAGE_ROWS, ListPageDep, SessionDep, paged
from app.imports import (
    COLUMNS,
    MAX_BYTES,
    MAX_ROWS,
    TEMPLATE,
    UNITS,
    ImportRefused,
    ImportTooLarge,
    check_size,
    check_type,
    delete_batch,
    import_measurements,
    measurement_count,
    measurement_rows,
)
from app.number_input import PlainWhole
from app.params import QueryError

router = APIRouter()

FORM_OVERHEAD = 16_384
"""Bytes a multipart form may add around the file before the size check refuses it."""

Batch = Annotated[str, Path(pattern=r"^[0-9a-f]{1,32}$",
                           description="Import id (hex digits), as listed with the values")]
Count = Annotated[PlainWhole | None, Query(ge=0, le=10 * MAX_ROWS)]

ERRORS: dict[int | str, dict[str, Any]] = {
    400: {"description": 'A bad file, as {"detail": "line N, column C: what is wrong"}'},
    413: {"description": "A file over 1 MB"},
    415: {"description": "A body or file sent as another media type than CSV text"},
}


async def read_upload(request: Request) -> bytes:
    """The CSV bytes of a request: a multipart form's `file`, or the body itself (text/csv).

    Raises:
        ImportTooLarge: Over `MAX_BYTES` (refused from Content-Length before reading).
        ImportUnsupported: Sent as a media type that is not CSV text.
        ImportRefused: A form without a file.
    """
    length = request.headers.get("content-length", "")
    if length.isdigit() and int(length) > MAX_BYTES + FORM_OVERHEAD:
        check_size(int(length))
    if request.headers.get("content-type", "").startswith("multipart/form-data"):
        form = await request.form(max_files=1, max_fields=5)
        try:
            upload = form.get("file")
            if not isinstance(upload, UploadFile):
                raise ImportRefused("choose a CSV file to import (form field 'file')")
            check_type(upload.content_type)
            data = await upload.read(MAX_BYTES + 1)
        finally:
            await form.close()
    else:
        check_type(request.headers.get("content-type"))
        chunks = bytearray()
        async for chunk in request.stream():
            chunks += chunk
            if len(chunks) > MAX_BYTES:
                break
        data = bytes(chunks)
    if len(data) > MAX_BYTES:
        raise ImportTooLarge(f"the file is larger than the {MAX_BYTES / 1e6:g} MB limit "
                             f"({MAX_ROWS} rows): nothing was imported")
    return data


def _page(request: Request, session: Any, *, status: int = 200, **context: Any) -> Response:
    return request.app.state.templates.TemplateResponse(request, "measurements.html", {
        "rows": measurement_rows(session, 0, LIST_PAGE_ROWS), "columns": COLUMNS,
        "total": measurement_count(session), "units": UNITS,
        "max_bytes": MAX_BYTES, "max_rows": MAX_ROWS, **context,
    }, status_code=status)


@router.get("/measurements", include_in_schema=False)
def measurements_page(request: Request, session: SessionDep, imported: Count = None,
                      replaced: Count = 0, deleted: Count = None) -> Response:
    """The user's values, the import form and the template."""
    return _page(request, session, imported=imported, replaced=replaced, deleted=deleted)


@router.post("/measurements", include_in_schema=False)
async def import_page(request: Request, session: SessionDep) -> Response:
    """Import from the page's form; errors are shown on the page (nothing stored)."""
    try:
        data = await read_upload(request)
        done = await run_in_threadpool(import_measurements, session, data)
    except ImportRefused as exc:
        status, message = getattr(exc, "status_code", 400), str(exc)
    else:
        query = urlencode({"imported": done["imported"], "replaced": done["replaced"]})
        return RedirectResponse(f"/measurements?{query}", status_code=303)
    return await run_in_threadpool(lambda: _page(request, session, status=status,
                                                 error=message))


@router.get("/measurements/batches/{batch}/delete", include_in_schema=False)
def confirm_delete(request: Request, batch: Batch) -> Response:
    """Ask before deleting an import."""
    return request.app.state.templates.TemplateResponse(request, "confirm.html", {
        "title": "Delete an import",
        "message": f"Delete every value of import {batch}? This cannot be undone.",
        "action": f"/measurements/batches/{batch}/delete", "cancel": "/measurements"})


@router.post("/measurements/batches/{batch}/delete", include_in_schema=False)
def delete_page(session: SessionDep, batch: Batch,
                confirm: Annotated[str, Form()] = "") -> Response:
    """Delete an import once confirmed."""
    if confirm != "yes":
        raise QueryError("deleting an import needs confirm=yes")
    count = delete_batch(session, batch)
    return RedirectResponse(f"/measurements?deleted={count}", status_code=303)


@router.get("/api/measurements", tags=["measurements"], summary="Your measured values")
def list_api(session: SessionDep, page: ListPageDep) -> dict[str, Any]:
    """The values you imported (canonical units), with the accepted properties and units.

    One page of at most 1000 values by formula and property (`offset`, `limit`); `total`
    counts them all and `next_offset` gives the next page (null on the last).
    """
    offset, limit = page
    rows = measurement_rows(session, offset, limit)
    return {"columns": list(COLUMNS),
            "properties": {p: {"unit": u, "accepted_units": list(f), "range": list(r)}
                           for p, (u, f, r) in UNITS.items()},
            "measurements": rows,
            **paged(measurement_count(session), offset, limit)}


@router.post("/api/measurements", tags=["measurements"], status_code=201, responses=ERRORS,
             summary="Import measured values (CSV)")
async def import_api(request: Request, session: SessionDep) -> dict[str, Any]:
    """Import a CSV (body text/csv, or multipart field file): all rows or none.

    Columns formula,property,value,unit,source; at most 1 MB and 5000 rows. Errors name the
    line and column.
    """
    data = await read_upload(request)
    return await run_in_threadpool(import_measurements, session, data)


@router.delete("/api/measurements/batches/{batch}", tags=["measurements"],
               summary="Delete an import")
def delete_api(session: SessionDep, batch: Batch,
               confirm: Annotated[str, Query(description="Must be yes")] = "") -> dict[str, int]:
    """Delete the values of one import; asks for confirm=yes."""
    if confirm != "yes":
        raise QueryError("deleting an import needs confirm=yes")
    return {"deleted": delete_batch(session, batch)}


@router.get("/api/measurements/template.csv", tags=["measurements"],
            response_class=PlainTextResponse, summary="Import template")
def template() -> PlainTextResponse:
    """The CSV template: header and commented examples."""
    return PlainTextResponse(TEMPLATE, media_type="text/csv; charset=utf-8", headers={
        "Content-Disposition": 'attachment; filename="bondgap-measurements-template.csv"'})
