"""Shortlists in the store: create, rename, annotate, delete; add, annotate and remove candidates.

Every change is one write transaction (`app.writes.writing`): checked in full first, then
written whole or not at all. Candidates are normalised formulas of catalogue binaries or alloy
compositions (`screening.alloy_report.normalise_material`), checked to have a report before
they are stored. Names are unique, and found, by one folding rule (`app.names`: Unicode case
folding and canonical equivalence), compared on the stored `name_key`. The functions take
keyword arguments only and raise `QueryError` subclasses with one line for anything the user
can fix.
"""

from __future__ import annotations

from typing import Any

from sqlalchemy import func, select
from sqlalchemy.exc import IntegrityError
from sqlalchemy.orm import Session

from app.conditions import Conditions
from app.models import Shortlist, ShortlistItem
from app.names import name_key
from app.params import QueryError
from app.shortlist_checks import NAME_LENGTH, check_formula, check_name, check_note
from app.writes import utc_now, writing

MAX_ITEMS = 200
"""Most candidates on one list."""


class ShortlistNotFound(QueryError):
    """No shortlist (or no candidate on it) by that name or id (HTTP 404)."""

    status_code = 404


class ShortlistConflict(QueryError):
    """A name already taken by another shortlist (HTTP 409)."""

    status_code = 409


def get_shortlist(session: Session, *, shortlist_id: int | None = None,
                  name: str | None = None) -> Shortlist:
    """One shortlist by id or by name (folded by `app.names.name_key`).

    Raises:
        ShortlistNotFound: Naming what was asked for.
    """
    if shortlist_id is not None:
        found = session.get(Shortlist, shortlist_id)
        what = f"id {shortlist_id}"
    else:
        wanted = str(name or "").strip()
        found = session.scalar(select(Shortlist).where(Shortlist.name_key == name_key(wanted)))
        what = f"name {wanted[:NAME_LENGTH]!r}"
    if found is None:
        raise ShortlistNotFound(f"no shortlist with {what}")
    return found


def items_of(session: Session, shortlist_id: int) -> list[ShortlistItem]:
    """The candidates of a list, in the order they were added."""
    stmt = (select(ShortlistItem).where(ShortlistItem.shortlist_id == shortlist_id)
            .order_by(ShortlistItem.position, ShortlistItem.id))
    return list(session.scalars(stmt))


def conditions_of(shortlist: Shortlist) -> Conditions:
    """The conditions saved with a list."""
    return Conditions.from_row(shortlist.substrate, shortlist.temperature_K, shortlist.target)


def shortlist_dict(session: Session, shortlist: Shortlist) -> dict[str, Any]:
    """A list as the API and `bondgap shortlist list --json` give it (items included)."""
    return {
        "id": shortlist.id, "name": shortlist.name, "note": shortlist.note,
        "conditions": conditions_of(shortlist).as_dict(),
        "created_at": shortlist.created_at.isoformat() + "Z",
        "updated_at": shortlist.updated_at.isoformat() + "Z",
        "items": [{"formula": i.formula, "note": i.note, "position": i.position,
                   "added_at": i.added_at.isoformat() + "Z"}
                  for i in items_of(session, shortlist.id)],
    }


def shortlist_count(session: Session) -> int:
    """How many lists there are."""
    return session.scalar(select(func.count()).select_from(Shortlist)) or 0


def all_shortlists(session: Session, offset: int = 0,
                   limit: int | None = None) -> list[dict[str, Any]]:
    """The lists, newest change first, with their numbers of candidates (not the items).

    Every list, or `limit` of them from `offset` on (the listing API's page).
    """
    lists = session.scalars(select(Shortlist).order_by(Shortlist.updated_at.desc(),
                                                       Shortlist.id.desc())
                            .offset(offset).limit(limit)).all()
    counts = dict(session.execute(
        select(ShortlistItem.shortlist_id, func.count())
        .where(ShortlistItem.shortlist_id.in_([s.id for s in lists]))
        .group_by(ShortlistItem.shortlist_id)
    ).all())
    return [{"id": s.id, "name": s.name, "note": s.note,
             "conditions": conditions_of(s).as_dict(), "count": counts.get(s.id, 0),
             "updated_at": s.updated_at.isoformat() + "Z"} for s in lists]


def _name_free(session: Session, name: str, own_id: int | None = None) -> None:
    taken = session.scalar(select(Shortlist).where(Shortlist.name_key == name_key(name)))
    if taken is not None and taken.id != own_id:
        raise ShortlistConflict(f"a shortlist named {taken.name!r} already exists; choose "
                                "another name")


def _flush_unique(session: Session, name: str) -> None:
    """Flush, turning a unique-name race with another writer into a conflict."""
    try:
        session.flush()
    except IntegrityError as exc:
        raise ShortlistConflict(f"a shortlist named {name!r} already exists") from exc


def create_shortlist(session: Session, *, name: Any, note: Any = "",
                     conditions: Conditions | None = None) -> Shortlist:
    """Create an empty list with its note and conditions.

    Raises:
        QueryError: A bad name or note. ShortlistConflict: the name is taken.
    """
    clean, text = check_name(name), check_note(note)
    chosen = conditions or Conditions()
    with writing(session):
        _name_free(session, clean)
        now = utc_now()
        shortlist = Shortlist(name=clean, note=text, substrate=chosen.substrate,
                              temperature_K=chosen.temperature_K, target=chosen.target_json(),
                              created_at=now, updated_at=now)
        session.add(shortlist)
        _flush_unique(session, clean)
    return shortlist


def update_shortlist(session: Session, *, shortlist_id: int, name: Any = None,
                     note: Any = None, conditions: Conditions | None = None) -> Shortlist:
    """Rename a list, change its note or its conditions (None leaves a field as it is).

    Raises:
        ShortlistNotFound, ShortlistConflict, QueryError.
    """
    clean = None if name is None else check_name(name)
    text = None if note is None else check_note(note)
    with writing(session):
        shortlist = get_shortlist(session, shortlist_id=shortlist_id)
        if clean is not None:
            _name_free(session, clean, shortlist.id)
            shortlist.name = clean
        if text is not None:
            shortlist.note = text
        if conditions is not None:
            shortlist.substrate = conditions.substrate
            shortlist.temperature_K = conditions.temperature_K
            shortlist.target = conditions.target_json()
        shortlist.updated_at = utc_now()
        _flush_unique(session, shortlist.name)
    return shortlist


def delete_shortlist(session: Session, *, shortlist_id: int) -> str:
    """Delete a list and its candidates; return its name. Raises ShortlistNotFound."""
    with writing(session):
        shortlist = get_shortlist(session, shortlist_id=shortlist_id)
        name = shortlist.name
        session.delete(shortlist)
    return name


def add_items(session: Session, *, shortlist_id: int, formulas: list[str],
              note: Any = "") -> dict[str, list[str]]:
    """Add candidates to a list (all checked first; those already on it are left as they are).

    Returns:
        {"added": [...], "present": [...]}: normalised formulas.

    Raises:
        BondgapInputError: A formula the engine cannot report on (nothing is added).
        ShortlistNotFound. QueryError: no formula, or more than MAX_ITEMS on the list.
    """
    text = check_note(note)
    wanted: list[str] = []
    for raw in formulas:
        formula = check_formula(raw)
        if formula not in wanted:
            wanted.append(formula)
    if not wanted:
        raise QueryError("give at least one formula, e.g. GaAs or In0.53Ga0.47As")
    with writing(session):
        shortlist = get_shortlist(session, shortlist_id=shortlist_id)
        items = items_of(session, shortlist.id)
        have = {i.formula for i in items}
        added = [f for f in wanted if f not in have]
        if len(items) + len(added) > MAX_ITEMS:
            raise QueryError(f"a shortlist holds at most {MAX_ITEMS} candidates")
        start = max((i.position for i in items), default=0) + 1
        now = utc_now()
        for offset, formula in enumerate(added):
            session.add(ShortlistItem(shortlist_id=shortlist.id, formula=formula, note=text,
                                      position=start + offset, added_at=now))
        shortlist.updated_at = now
    return {"added": added, "present": [f for f in wanted if f in have]}


def _item(session: Session, shortlist_id: int, formula: str) -> ShortlistItem:
    from screening.alloy_report import normalise_material

    normalised = normalise_material(str(formula or "").strip())
    item = session.scalar(select(ShortlistItem).where(
        ShortlistItem.shortlist_id == shortlist_id, ShortlistItem.formula == normalised))
    if item is None:
        raise ShortlistNotFound(f"{normalised} is not on this shortlist")
    return item


def set_item_note(session: Session, *, shortlist_id: int, formula: str, note: Any) -> None:
    """Replace the note of one candidate. Raises ShortlistNotFound, QueryError."""
    text = check_note(note)
    with writing(session):
        shortlist = get_shortlist(session, shortlist_id=shortlist_id)
        _item(session, shortlist.id, formula).note = text
        shortlist.updated_at = utc_now()


def remove_item(session: Session, *, shortlist_id: int, formula: str) -> None:
    """Take one candidate off a list. Raises ShortlistNotFound."""
    with writing(session):
        shortlist = get_shortlist(session, shortlist_id=shortlist_id)
        session.delete(_item(session, shortlist.id, formula))
        shortlist.updated_at = utc_now()
