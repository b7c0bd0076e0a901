"""The JSON API under /api/: the same functions that build the pages, as JSON (and CSV)."""

from __future__ import annotations

from typing import Annotated, Any

from fastapi import APIRouter, Path, Query, Request
from fastapi.responses import JSONResponse, PlainTextResponse

import screening
from app import queries
from app.accuracy import accuracy_payload
from app.band_data import bands_payload
from app.csrf import FORM_FIELD, TOKEN_HEADER
from app.deps import PointsDep, SessionDep, TableQueryDep, TemperatureDep

router = APIRouter(prefix="/api", tags=["compounds"])

ERRORS: dict[int | str, dict[str, Any]] = {
    400: {"description": 'Bad input, as {"detail": "what was wrong and what is accepted"}'},
    422: {"description": 'A parameter of the wrong type, as {"detail": "desc: ..."}'},
}
FormulaPath = Annotated[
    str, Path(description="Formula of an octet binary compound, e.g. GaAs, ZnSe, Si")
]
MaterialPath = Annotated[
    str, Path(description="Formula of an octet binary compound or alloy, e.g. GaAs, "
                          "In0.53Ga0.47As, In0.73Ga0.27As0.58P0.42")
]


@router.get("/compounds", responses=ERRORS, summary="Compound table")
def list_compounds(session: SessionDep, query: TableQueryDep) -> dict[str, Any]:
    """The compound table: filtered, sorted rows (as bondgap list --json).

    Empty values sort last in either direction. Band gaps are those at the temperature
    (default 300 K); the gap window (eV) and the wavelength window (nm) apply to the gap shown:
    the measured gap where one is known, else the estimate (see band_gap_source).
    """
    return queries.table_payload(session, query=query)


@router.get(
    "/compounds.csv",
    responses=ERRORS,
    response_class=PlainTextResponse,
    summary="Compound table as CSV",
)
def list_compounds_csv(session: SessionDep, query: TableQueryDep) -> PlainTextResponse:
    """The same rows as CSV (as bondgap list --csv)."""
    text = queries.rows_csv(queries.table_rows(session, query=query))
    return PlainTextResponse(
        text,
        media_type="text/csv; charset=utf-8",
        headers={"Content-Disposition": 'attachment; filename="bondgap-compounds.csv"'},
    )


@router.get("/compounds/{formula}/bands", responses=ERRORS, summary="Band structure")
def get_bands(formula: FormulaPath, points: PointsDep) -> dict[str, Any]:
    """Bands of the sp3 tight-binding model along L-Γ-X-W-K-Γ (as bondgap bands --json).

    Energies (bands_eV, 8 per k-point) in eV relative to the valence-band top; k and path
    distance in units of 2π/a. The model's limits are in model_limits.
    """
    return bands_payload(formula, points=points)


@router.get("/compounds/{formula:path}", responses=ERRORS, summary="One compound or alloy")
def get_compound(
    session: SessionDep, formula: MaterialPath, temperature: TemperatureDep,
    on: Annotated[str | None, Query(
        description="A substrate (built-in or yours): adds the epitaxy block")] = None,
    geometry: Annotated[str | None, Query(
        description="Matthews-Blakeslee geometry of the epitaxy block")] = None,
) -> dict[str, Any]:
    """Everything known about one compound or alloy (as bondgap show FORMULA --json).

    The object follows docs/report-schema.md; any spelling of the formula is accepted
    (AsGa gives GaAs, Ga0.47In0.53As gives In0.53Ga0.47As). Alloys get the same keys plus
    alloy, fractions, end_points and flags. The band_gap block is at the temperature
    (default 300 K); with on=SUBSTRATE an epitaxy block (mismatch, strain, critical
    thickness in the named geometry) is added.
    """
    return queries.compound_report(session, formula=formula, temperature_K=temperature,
                                   on=on, geometry=geometry)


@router.get("/accuracy", summary="Band-gap model accuracy", tags=["model"])
def get_accuracy() -> dict[str, Any]:
    """Measured against leave-one-out estimated band gap for every measured compound (300 K).

    With the mean and largest absolute error, the RMS per family, the estimator's formula and
    coefficients, and the known limits.
    """
    return accuracy_payload()


@router.get("/status", summary="Versions and counts")
def status(session: SessionDep) -> dict[str, Any]:
    """Engine version, version of the stored results, and how many compounds are stored."""
    return {
        "model_version": screening.MODEL_VERSION,
        "stored_model_version": queries.model_version(session),
        "compounds": queries.compound_count(session),
    }


@router.get("/token", summary="Token for changes", tags=["security"], responses={
    403: {"description": "Asked for by another site's page"}})
def token(request: Request) -> JSONResponse:
    """The token every change (POST, PATCH, PUT, DELETE) must send in the X-Bondgap-Token header.

    Readable only by the app's own pages and programs on this machine: another site's page
    cannot read this answer, and is refused when its Origin shows. The app's forms carry the
    same token in the field csrf_token.
    """
    return JSONResponse({"token": request.app.state.csrf_token, "header": TOKEN_HEADER,
                         "form_field": FORM_FIELD}, headers={"Cache-Control": "no-store"})
