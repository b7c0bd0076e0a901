"""Shortlist pages: the lists, one list with its candidates and notes, the comparison.

Every change is a POST form (in `templates/_forms.html`) answered with a redirect to the page
that shows the result; deleting asks first on its own page (the form sends confirm=yes).
"""

from __future__ import annotations

from typing import Annotated, Any

from fastapi import APIRouter, Form, Query, Request
from fastapi.responses import RedirectResponse, Response

from app import shortlists as store
from app import views
from app.candidates import ShortlistView, caution_elements, load_shortlist, rohs_elements
from app.compare import MAX_COMPARED, MIN_COMPARED
from app.compare_notes import compare_notes
from app.conditions import Conditions
from app.deps import SessionDep, ShortlistId
from app.params import QueryError
from app.routes.shortlist_api import compare_payload
from app.shortlist_checks import check_formula, split_formulas
from app.substrates import substrate_rows
from app.text_rules import parse_id
from screening.hazards import ROHS_RESTRICTED, ROHS_SOURCE

router = APIRouter(include_in_schema=False)
Text = Annotated[str, Form()]


def _render(request: Request, name: str, context: dict[str, Any]) -> Response:
    return request.app.state.templates.TemplateResponse(request, name, context)


def _back(shortlist_id: int, anchor: str = "") -> RedirectResponse:
    return RedirectResponse(f"/shortlists/{shortlist_id}{anchor}", status_code=303)


def _conditions(session: Any, substrate: str, temperature: str, target_gap: str,
                target_wavelength: str) -> Conditions:
    return Conditions.parse(substrate=substrate, temperature=temperature, target_gap=target_gap,
                            target_wavelength=target_wavelength, session=session)


def hazard_context(view: ShortlistView) -> dict[str, Any]:
    """The caution (toxic elements) and RoHS note of a page showing candidates."""
    rohs = rohs_elements(view.candidates)
    return {"caution": views.caution_line(caution_elements(view.candidates)),
            "rohs": [(e, ROHS_RESTRICTED[e]) for e in rohs], "rohs_source": ROHS_SOURCE}


@router.get("/shortlists")
def index(request: Request, session: SessionDep) -> Response:
    """Every shortlist, and the form for a new one."""
    return _render(request, "shortlists.html", {
        "lists": store.all_shortlists(session),
        "substrates": [s["name"] for s in substrate_rows(session)],
    })


@router.post("/shortlists")
def create(session: SessionDep, name: Text, note: Text = "", substrate: Text = "",
           temperature: Text = "", target_gap: Text = "", target_wavelength: Text = ""
           ) -> Response:
    """Create a list and show it."""
    conditions = _conditions(session, substrate, temperature, target_gap, target_wavelength)
    made = store.create_shortlist(session, name=name, note=note, conditions=conditions)
    return _back(made.id)


@router.post("/shortlists/add")
def add_from_anywhere(session: SessionDep, formula: Annotated[list[str] | None, Form()] = None,
                      shortlist: Text = "", new_name: Text = "", note: Text = "") -> Response:
    """Add candidates chosen on a table or page to a list, or to a new list named here.

    The formulas are checked before a new list is made, so a bad one leaves nothing behind.
    """
    formulas = [f for text in formula or () for f in split_formulas(text)]
    if not formulas:
        raise QueryError("choose at least one candidate to add")
    for text in formulas:
        check_formula(text)
    if new_name.strip():
        target_id = store.create_shortlist(session, name=new_name).id
    elif shortlist.strip():
        target_id = parse_id(shortlist, "the shortlist")
    else:
        raise QueryError("choose a shortlist, or give a name for a new one")
    store.add_items(session, shortlist_id=target_id, formulas=formulas, note=note)
    return _back(target_id)


@router.get("/shortlists/{shortlist_id}")
def shortlist_page(request: Request, session: SessionDep, shortlist_id: ShortlistId) -> Response:
    """One list: its candidates with notes and key numbers, conditions, exports."""
    view = load_shortlist(session, shortlist_id=shortlist_id)
    return _render(request, "shortlist.html", {
        "view": view, "shortlist": view.data, "conditions": view.conditions,
        "substrates": [s["name"] for s in substrate_rows(session)],
        "min_compared": MIN_COMPARED, "max_compared": MAX_COMPARED,
        **hazard_context(view),
    })


@router.post("/shortlists/{shortlist_id}")
def edit(session: SessionDep, shortlist_id: ShortlistId, name: Text, note: Text = "",
         substrate: Text = "", temperature: Text = "", target_gap: Text = "",
         target_wavelength: Text = "") -> Response:
    """Rename a list, change its note and conditions."""
    conditions = _conditions(session, substrate, temperature, target_gap, target_wavelength)
    store.update_shortlist(session, shortlist_id=shortlist_id, name=name, note=note,
                           conditions=conditions)
    return _back(shortlist_id)


@router.post("/shortlists/{shortlist_id}/items")
def add(session: SessionDep, shortlist_id: ShortlistId, formulas: Text,
        note: Text = "") -> Response:
    """Add candidates typed into the list's page (several at once, separated by spaces)."""
    store.add_items(session, shortlist_id=shortlist_id,
                    formulas=split_formulas(formulas), note=note)
    return _back(shortlist_id)


@router.post("/shortlists/{shortlist_id}/items/note")
def note(session: SessionDep, shortlist_id: ShortlistId, formula: Text,
         note: Text = "") -> Response:
    """Save a candidate's note."""
    store.set_item_note(session, shortlist_id=shortlist_id, formula=formula, note=note)
    return _back(shortlist_id, f"#item-{formula}")


@router.post("/shortlists/{shortlist_id}/items/remove")
def remove(session: SessionDep, shortlist_id: ShortlistId, formula: Text) -> Response:
    """Take a candidate off the list."""
    store.remove_item(session, shortlist_id=shortlist_id, formula=formula)
    return _back(shortlist_id)


@router.get("/shortlists/{shortlist_id}/delete")
def confirm_delete(request: Request, session: SessionDep, shortlist_id: ShortlistId) -> Response:
    """Ask before deleting a list."""
    shortlist = store.get_shortlist(session, shortlist_id=shortlist_id)
    count = len(store.items_of(session, shortlist.id))
    return _render(request, "confirm.html", {
        "title": "Delete a shortlist",
        "message": f"Delete the shortlist “{shortlist.name}” with its {count} candidate(s) "
                   "and their notes? This cannot be undone.",
        "action": f"/shortlists/{shortlist.id}/delete", "cancel": f"/shortlists/{shortlist.id}",
    })


@router.post("/shortlists/{shortlist_id}/delete")
def delete(session: SessionDep, shortlist_id: ShortlistId, confirm: Text = "") -> Response:
    """Delete a list once confirmed."""
    if confirm != "yes":
        raise QueryError("deleting a shortlist needs confirm=yes (use the confirmation page)")
    store.delete_shortlist(session, shortlist_id=shortlist_id)
    return RedirectResponse("/shortlists", status_code=303)


@router.get("/shortlists/{shortlist_id}/compare")
def compare_page(request: Request, session: SessionDep, shortlist_id: ShortlistId,
                 formula: Annotated[list[str] | None, Query()] = None) -> Response:
    """Two to eight candidates side by side, with the gap against lattice constant chart."""
    view = load_shortlist(session, shortlist_id=shortlist_id, formulas=formula)
    payload = compare_payload(session, view)
    return _render(request, "compare.html", {
        "view": view, "shortlist": view.data, "conditions": view.conditions,
        "rows": payload["rows"], "notes": compare_notes(payload["rows"]),
        "chart": payload["chart"], **hazard_context(view),
    })
