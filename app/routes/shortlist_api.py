"""The shortlist API under /api/shortlists: lists, candidates, comparison and exports (JSON)."""

from __future__ import annotations

import re
from typing import Annotated, Any

from fastapi import APIRouter, Query
from fastapi.responses import Response
from pydantic import BaseModel, Field

from app import shortlists as store
from app.candidates import ShortlistView, load_shortlist
from app.compare import compare_rows
from app.compare_payload import chart_data, rows_payload
from app.conditions import Conditions
from app.deps import ListPageDep, SessionDep, ShortlistId, paged
from app.exports import cells_zip, csv_zip, shortlist_csv, shortlist_json
from app.params import QueryError, TableQuery
from app.queries import table_rows
from app.shortlist_checks import NAME_LENGTH, NOTE_LENGTH
from app.text_rules import NAME_RULE, JsonNumber, JsonText
from screening.errors import BondgapInputError

router = APIRouter(prefix="/api/shortlists", tags=["shortlists"])

ERRORS: dict[int | str, dict[str, Any]] = {
    400: {"description": 'Bad input, as {"detail": "what was wrong and what is accepted"}'},
    404: {"description": "No shortlist with that id, or the formula is not on it"},
    409: {"description": "The name is taken by another shortlist"},
    422: {"description": "A field of the wrong type"},
}


class ConditionsIn(BaseModel):
    """Conditions as JSON; each field optional."""

    substrate: JsonText | None = Field(None, description="Substrate name (built-in or yours)")
    temperature_K: JsonNumber | None = Field(None,
                                             description="Temperature of the gaps, 0 to 2000 K")
    target_gap_eV: JsonNumber | None = Field(None, description="Target band gap, eV (0 to 15)")
    target_wavelength_nm: JsonNumber | None = Field(None, description="Target wavelength, nm "
                                                                 "(50 to 100000)")


class ShortlistIn(ConditionsIn):
    """A new shortlist."""

    name: JsonText = Field(description=f"Unique name, 1 to {NAME_LENGTH} characters: "
                                       f"{NAME_RULE}")
    note: JsonText = Field("", description=f"Why this list (up to {NOTE_LENGTH} characters)")


class ShortlistPatch(ConditionsIn):
    """Changes to a shortlist: only the fields given change."""

    name: JsonText | None = Field(None, description=f"New name, 1 to {NAME_LENGTH} characters")
    note: JsonText | None = Field(None, description=f"New note, up to {NOTE_LENGTH} characters")


class ItemsIn(BaseModel):
    """Candidates to add: binaries or alloy compositions."""

    formulas: list[JsonText] = Field(max_length=store.MAX_ITEMS,
                                     description="1 to 200 formulas, e.g. "
                                                 "[\"GaAs\", \"In0.53Ga0.47As\"]")
    note: JsonText = Field("", description=f"Note on each added candidate (up to {NOTE_LENGTH} "
                                           "characters)")


class NoteIn(BaseModel):
    """A candidate's note."""

    note: JsonText = Field(description=f"Up to {NOTE_LENGTH} characters")


CONDITION_FIELDS = ("substrate", "temperature_K", "target_gap_eV", "target_wavelength_nm")


def _conditions(session: Any, body: ConditionsIn, base: Conditions | None = None
                ) -> Conditions | None:
    """Conditions from the body's fields, the others kept from `base` (None: none given)."""
    given = body.model_fields_set & set(CONDITION_FIELDS)
    if base is not None and not given:
        return None
    old = base or Conditions()
    values = {"substrate": old.substrate, "temperature_K": old.temperature_K,
              "target_gap_eV": old.target_gap_eV,
              "target_wavelength_nm": old.target_wavelength_nm}
    if {"target_gap_eV", "target_wavelength_nm"} & given:
        values["target_gap_eV"] = values["target_wavelength_nm"] = None
    values.update({k: getattr(body, k) for k in given})
    return Conditions.parse(substrate=values["substrate"], temperature=values["temperature_K"],
                            target_gap=values["target_gap_eV"],
                            target_wavelength=values["target_wavelength_nm"], session=session)


def _one(session: Any, shortlist_id: int) -> dict[str, Any]:
    return store.shortlist_dict(session, store.get_shortlist(session, shortlist_id=shortlist_id))


@router.get("", summary="All shortlists")
def list_shortlists(session: SessionDep, page: ListPageDep) -> dict[str, Any]:
    """Your shortlists with their notes, conditions and numbers of candidates, newest first.

    One page of at most 1000 lists (`offset`, `limit`); `total` counts them all and
    `next_offset` gives the next page (null on the last).
    """
    offset, limit = page
    return {"shortlists": store.all_shortlists(session, offset, limit),
            **paged(store.shortlist_count(session), offset, limit)}


@router.post("", status_code=201, responses=ERRORS, summary="Create a shortlist")
def create(session: SessionDep, body: ShortlistIn) -> dict[str, Any]:
    """Create an empty shortlist with its note and the conditions it is chosen under."""
    conditions = _conditions(session, body)
    made = store.create_shortlist(session, name=body.name, note=body.note,
                                  conditions=conditions)
    return _one(session, made.id)


@router.get("/{shortlist_id}", responses=ERRORS, summary="One shortlist")
def get_one(session: SessionDep, shortlist_id: ShortlistId) -> dict[str, Any]:
    """A shortlist with its candidates and their notes."""
    return _one(session, shortlist_id)


@router.patch("/{shortlist_id}", responses=ERRORS, summary="Rename or change a shortlist")
def patch(session: SessionDep, shortlist_id: ShortlistId, body: ShortlistPatch) -> dict[str, Any]:
    """Change the name, the note or any of the conditions (fields not given stay)."""
    shortlist = store.get_shortlist(session, shortlist_id=shortlist_id)
    conditions = _conditions(session, body, store.conditions_of(shortlist))
    store.update_shortlist(session, shortlist_id=shortlist_id, name=body.name,
                           note=body.note, conditions=conditions)
    return _one(session, shortlist_id)


@router.delete("/{shortlist_id}", status_code=204, responses=ERRORS,
               summary="Delete a shortlist")
def delete(session: SessionDep, shortlist_id: ShortlistId,
           confirm: Annotated[str, Query(description="Must be yes")] = "") -> Response:
    """Delete a shortlist and its candidates; asks for confirm=yes."""
    if confirm != "yes":
        raise QueryError("deleting a shortlist needs confirm=yes")
    store.delete_shortlist(session, shortlist_id=shortlist_id)
    return Response(status_code=204)


@router.post("/{shortlist_id}/items", status_code=201, responses=ERRORS,
             summary="Add candidates")
def add_items(session: SessionDep, shortlist_id: ShortlistId, body: ItemsIn) -> dict[str, Any]:
    """Add binaries or alloy compositions (normalised; those on the list already stay)."""
    done = store.add_items(session, shortlist_id=shortlist_id, formulas=body.formulas,
                           note=body.note)
    return {**done, "shortlist": _one(session, shortlist_id)}


@router.patch("/{shortlist_id}/items/{formula}", responses=ERRORS,
              summary="Change a candidate's note")
def note_item(session: SessionDep, shortlist_id: ShortlistId, formula: str, body: NoteIn
              ) -> dict[str, Any]:
    """Replace the note of one candidate."""
    store.set_item_note(session, shortlist_id=shortlist_id, formula=formula, note=body.note)
    return _one(session, shortlist_id)


@router.delete("/{shortlist_id}/items/{formula}", responses=ERRORS,
               summary="Remove a candidate")
def remove_item(session: SessionDep, shortlist_id: ShortlistId, formula: str) -> dict[str, Any]:
    """Take one candidate off the list."""
    store.remove_item(session, shortlist_id=shortlist_id, formula=formula)
    return _one(session, shortlist_id)


def compare_payload(session: Any, view: ShortlistView) -> dict[str, Any]:
    """The comparison as JSON: rows with the best cells, and the chart's data."""
    rows = compare_rows(view.candidates, view.conditions)
    background = table_rows(session, query=TableQuery(temperature=view.conditions.temperature_K))
    try:
        spec = view.conditions.substrate_spec(session)
    except BondgapInputError:  # deleted since the list was saved: the chart goes without
        spec = None
    return {"shortlist": {k: v for k, v in view.data.items() if k != "items"},
            "formulas": view.formulas, "rows": rows_payload(rows),
            "chart": chart_data(view.candidates, background, spec)}


@router.get("/{shortlist_id}/compare", responses=ERRORS, summary="Compare candidates")
def compare(session: SessionDep, shortlist_id: ShortlistId,
            formula: Annotated[list[str] | None, Query(
                description="Candidates to compare (2 to 8; default: the whole list)")] = None,
            ) -> dict[str, Any]:
    """Every property side by side with unit, route and source; best per row marked."""
    view = load_shortlist(session, shortlist_id=shortlist_id, formulas=formula)
    return compare_payload(session, view)


def download_name(name: str, suffix: str) -> str:
    """An ASCII file name for a list's export."""
    slug = re.sub(r"[^A-Za-z0-9._-]+", "-", name).strip("-.")[:60] or "shortlist"
    return f"{slug}{suffix}"


def _download(body: str | bytes, media_type: str, filename: str) -> Response:
    return Response(body, media_type=media_type,
                    headers={"Content-Disposition": f'attachment; filename="{filename}"'})


@router.get("/{shortlist_id}/export.zip", responses=ERRORS,
            summary="Export as CSV with its README (zip)")
def export_zip(session: SessionDep, shortlist_id: ShortlistId) -> Response:
    """The CSV (header row first) and its README (conditions, units, sources, columns)."""
    view = load_shortlist(session, shortlist_id=shortlist_id)
    body = csv_zip(view.data, view.candidates, view.conditions,
                   download_name(view.data["name"], ".csv"))
    return _download(body, "application/zip", download_name(view.data["name"], "-csv.zip"))


@router.get("/{shortlist_id}/export.csv", responses=ERRORS, summary="Export as CSV")
def export_csv(session: SessionDep, shortlist_id: ShortlistId) -> Response:
    """One row per candidate after the header row; conditions and units: `export.zip`."""
    view = load_shortlist(session, shortlist_id=shortlist_id)
    text = shortlist_csv(view.candidates)
    return _download(text.encode("utf-8"), "text/csv; charset=utf-8",
                     download_name(view.data["name"], ".csv"))


@router.get("/{shortlist_id}/export.json", responses=ERRORS, summary="Export as JSON")
def export_json(session: SessionDep, shortlist_id: ShortlistId) -> Response:
    """The list, its conditions and each candidate's full report."""
    view = load_shortlist(session, shortlist_id=shortlist_id)
    text = shortlist_json(view.data, view.candidates, view.conditions)
    return _download(text, "application/json", download_name(view.data["name"], ".json"))


@router.get("/{shortlist_id}/cells.zip", responses=ERRORS, summary="Crystal cells (zip)")
def export_cells(session: SessionDep, shortlist_id: ShortlistId) -> Response:
    """Each candidate's cell as CIF (and POSCAR for binaries); alloys as virtual crystals."""
    view = load_shortlist(session, shortlist_id=shortlist_id)
    return _download(cells_zip(view.candidates), "application/zip",
                     download_name(view.data["name"], "-cells.zip"))
