"""Substrates: the page `/substrates` (list, add, delete) and `/api/substrates`."""

from __future__ import annotations

from typing import Annotated, Any
from urllib.parse import urlencode

from fastapi import APIRouter, Form, HTTPException, Request
from fastapi.responses import RedirectResponse, Response
from pydantic import BaseModel, Field

from app.deps import SessionDep
from app.substrates import (
    A_RANGE,
    C_RANGE,
    NAME_RULE,
    STRUCTURE_CHOICES,
    SubstrateConflict,
    SubstrateNotFound,
    add_substrate,
    delete_substrate,
    substrate_rows,
)
from app.text_rules import JsonNumber, JsonText
from screening.epitaxy import MISMATCH_CONVENTION
from screening.errors import BondgapInputError

router = APIRouter()
ERRORS: dict[int | str, dict[str, Any]] = {
    400: {"description": 'Bad input, as {"detail": "what was wrong and what is accepted"}'},
    404: {"description": "No substrate of yours by that name"},
    409: {"description": "The name is built in or already one of yours"},
}


class SubstrateIn(BaseModel):
    """A substrate of the user's own, as sent to `POST /api/substrates`."""

    name: JsonText = Field(description=NAME_RULE)
    structure: JsonText = Field(description=f"One of {', '.join(STRUCTURE_CHOICES)}")
    a_angstrom: JsonNumber = Field(description=f"Cubic a or hexagonal in-plane a, {A_RANGE[0]:g} "
                                               f"to "
                                          f"{A_RANGE[1]:g} Å")
    c_angstrom: JsonNumber | None = Field(None, description="Hexagonal c, Å (hexagonal only)")
    note: JsonText = Field("", description="One line, at most 200 characters")


def _status(exc: BondgapInputError) -> int:
    if isinstance(exc, SubstrateConflict):
        return 409
    return 404 if isinstance(exc, SubstrateNotFound) else 400


@router.get("/api/substrates", tags=["substrates"], summary="Substrates")
def list_substrates(session: SessionDep) -> dict[str, Any]:
    """The built-in substrates (with sources) and yours.

    matched_a_angstrom is the lattice constant layers are compared with (a / sqrt(3) for
    corundum: c-plane layers grow rotated by 30 degrees).
    """
    return {"substrates": substrate_rows(session), "mismatch_convention": MISMATCH_CONVENTION}


@router.post("/api/substrates", tags=["substrates"], summary="Add a substrate",
             status_code=201, responses=ERRORS)
def create_substrate(session: SessionDep, body: SubstrateIn) -> dict[str, Any]:
    """Store a substrate of your own; built-in names and names you already use are refused."""
    try:
        return add_substrate(session, **body.model_dump())
    except BondgapInputError as exc:
        raise HTTPException(_status(exc), str(exc)) from exc


@router.delete("/api/substrates/{name}", tags=["substrates"], summary="Delete a substrate",
               responses=ERRORS)
def remove_substrate(session: SessionDep, name: str) -> dict[str, Any]:
    """Delete one of your substrates (built-in ones cannot be deleted)."""
    try:
        return {"deleted": delete_substrate(session, name)}
    except BondgapInputError as exc:
        raise HTTPException(_status(exc), str(exc)) from exc


def _page(request: Request, session: SessionDep, *, status: int = 200, error: str | None = None,
          form: dict[str, Any] | None = None) -> Response:
    return request.app.state.templates.TemplateResponse(request, "substrates.html", {
        "rows": substrate_rows(session), "structures": STRUCTURE_CHOICES, "error": error,
        "form": form or {}, "name_rule": NAME_RULE, "a_range": A_RANGE, "c_range": C_RANGE,
        "convention": MISMATCH_CONVENTION, "done": request.query_params.get("done"),
    }, status_code=status)


@router.get("/substrates", include_in_schema=False)
def substrates_page(request: Request, session: SessionDep) -> Response:
    """The built-in substrates with sources, yours, and a form to add one."""
    return _page(request, session)


@router.post("/substrates", include_in_schema=False)
def add_from_form(request: Request, session: SessionDep, name: Annotated[str, Form()] = "",
                  structure: Annotated[str, Form()] = "", a_angstrom: Annotated[str, Form()] = "",
                  c_angstrom: Annotated[str, Form()] = "", note: Annotated[str, Form()] = ""
                  ) -> Response:
    """Add a substrate from the page's form; on bad input show the form again with why."""
    form = {"name": name, "structure": structure, "a_angstrom": a_angstrom,
            "c_angstrom": c_angstrom, "note": note}
    try:
        row = add_substrate(session, **form)
    except BondgapInputError as exc:
        return _page(request, session, status=_status(exc), error=str(exc), form=form)
    return RedirectResponse("/substrates?" + urlencode({"done": f"added {row['name']}"}),
                            status_code=303)


@router.post("/substrates/{name}/delete", include_in_schema=False)
def delete_from_form(request: Request, session: SessionDep, name: str) -> Response:
    """Delete one of the user's substrates from the page."""
    try:
        deleted = delete_substrate(session, name)
    except BondgapInputError as exc:
        return _page(request, session, status=_status(exc), error=str(exc))
    return RedirectResponse("/substrates?" + urlencode({"done": f"deleted {deleted}"}),
                            status_code=303)
