"""Substrates: the built-in table (with sources) and the user's own (table `user_substrates`).

One place for the page, the API and the CLI: `substrate_rows` lists both kinds,
`resolve_substrate` turns a name into the engine's `SubstrateSpec` (the finder's and the
composition page's `on=`), `add_substrate` checks and stores one of the user's, and
`delete_substrate` removes one. Built-in names can be neither added nor deleted. Names are
unique, and found, by one folding rule (`app.names`), on the stored `name_key` of the user's.
"""

from __future__ import annotations

import re
from typing import Any

from sqlalchemy import select
from sqlalchemy.exc import IntegrityError
from sqlalchemy.orm import Session

from app.models import UserSubstrate
from app.names import name_key
from app.number_input import NumberRule
from app.params import QueryError, number
from app.text_rules import plain_text
from app.writes import utc_now, writing
from screening.epitaxy import SubstrateSpec, substrate_from, substrate_spec
from screening.errors import UnknownSubstrateError, echo
from screening.reference import substrates

STRUCTURE_CHOICES: tuple[str, ...] = (
    "cubic", "hexagonal", "zincblende", "diamond", "wurtzite", "corundum",
)
"""Structures a user substrate may have: the lattice kinds, or the engine's structure names."""

HEXAGONAL_STRUCTURES = frozenset({"hexagonal", "wurtzite", "corundum"})
ENGINE_STRUCTURE = {"cubic": "zincblende"}
"""Structure names the engine knows under another name (lattice kind only)."""

NAME_PATTERN = re.compile(r"[A-Za-z0-9][A-Za-z0-9 ._()+\-]{0,39}")
NAME_RULE = ("1 to 40 characters: letters, digits, space and . _ ( ) + -, starting with a "
             "letter or digit")
A_RANGE = (2.0, 10.0)
C_RANGE = (2.0, 40.0)
NOTE_LENGTH = 200


class SubstrateConflict(QueryError):
    """A substrate name that is built in or already one of the user's (HTTP 409)."""


class SubstrateNotFound(QueryError):
    """No substrate of the user's by that name (HTTP 404)."""


def _number(value: Any, name: str, low: float, high: float) -> float:
    value = number(value, NumberRule(name, "angstrom", low, high, low_open=True))
    if value is None:
        raise QueryError(f"{name} must be a number of angstrom above {low:g} to {high:g}")
    return value


def _built_in_name(name: str) -> str | None:
    """The built-in substrate of that name (folded by `app.names.name_key`), or None."""
    key = name_key(name)
    return next((b for b in substrates() if name_key(b) == key), None)


def check_substrate(*, name: str, structure: str, a_angstrom: Any,
                    c_angstrom: Any = None, note: str = "") -> dict[str, Any]:
    """Check a user substrate as typed and return its clean values.

    Raises:
        QueryError: A bad name, structure, lattice constant or note (one line saying which).
        SubstrateConflict: A built-in name.
    """
    clean = (name or "").strip()
    if not NAME_PATTERN.fullmatch(clean):
        raise QueryError(f"substrate name {echo(clean)} is not accepted: {NAME_RULE}")
    built_in = _built_in_name(clean)
    if built_in:
        raise SubstrateConflict(f"{built_in!r} is a built-in substrate; choose another name")
    kind = (structure or "").strip().lower()
    if kind not in STRUCTURE_CHOICES:
        raise QueryError(f"unknown substrate structure {structure!r}; choose one of "
                         f"{', '.join(STRUCTURE_CHOICES)}")
    a = _number(a_angstrom, "lattice constant a", *A_RANGE)
    blank_c = c_angstrom is None or (isinstance(c_angstrom, str) and not c_angstrom.strip())
    if kind in HEXAGONAL_STRUCTURES and blank_c:
        raise QueryError(f"a {kind} substrate needs its c lattice constant too")
    if kind not in HEXAGONAL_STRUCTURES and not blank_c:
        raise QueryError(f"a {kind} substrate has no c lattice constant; leave c empty")
    c = None if blank_c else _number(c_angstrom, "lattice constant c", *C_RANGE)
    text = plain_text(note, what="the note", max_length=NOTE_LENGTH)
    return {"name": clean, "structure": kind, "a_angstrom": a, "c_angstrom": c, "note": text}


def _user_spec(row: UserSubstrate) -> SubstrateSpec:
    return substrate_from(row.name, ENGINE_STRUCTURE.get(row.structure, row.structure),
                          row.a_angstrom)


def _user_row(session: Session, name: str) -> UserSubstrate | None:
    return session.scalar(select(UserSubstrate).where(UserSubstrate.name_key == name_key(name)))


def resolve_substrate(session: Session | None, name: str) -> SubstrateSpec:
    """The engine's substrate for a built-in name or one of the user's (`app.names` folding).

    Raises:
        UnknownSubstrateError: Naming the built-in substrates and the user's.
    """
    clean = (name or "").strip()
    built_in = _built_in_name(clean)
    if built_in:
        return substrate_spec(built_in)
    row = _user_row(session, clean) if session is not None and clean else None
    if row is not None:
        return _user_spec(row)
    users = [] if session is None else list(session.scalars(select(UserSubstrate.name)))
    yours = f"; yours: {', '.join(users)}" if users else ""
    raise UnknownSubstrateError(
        f"unknown substrate {echo(clean)}; built-in: {', '.join(substrates())}{yours} "
        "(add your own on the substrates page or with `bondgap substrates add`)"
    )


def _row_dict(row: UserSubstrate) -> dict[str, Any]:
    spec = _user_spec(row)
    return {"name": row.name, "built_in": False, "structure": row.structure,
            "lattice": spec.lattice, "a_angstrom": row.a_angstrom, "c_angstrom": row.c_angstrom,
            "matched_a_angstrom": spec.lattice_a_angstrom, "source": "your own",
            "from_memory": False, "note": row.note,
            "created_at": row.created_at.isoformat(timespec="seconds")}


def substrate_rows(session: Session) -> list[dict[str, Any]]:
    """Every substrate: the built-in ones (table order), then the user's (by name)."""
    rows = []
    for name, item in substrates().items():
        spec = substrate_spec(name)
        rows.append({"name": name, "built_in": True, "structure": item.structure,
                     "lattice": spec.lattice, "a_angstrom": item.lattice_a_angstrom,
                     "c_angstrom": item.lattice_c_angstrom,
                     "matched_a_angstrom": float(spec.lattice_a_angstrom),
                     "source": item.source, "from_memory": item.from_memory,
                     "note": "; ".join(t for t in (item.note, spec.note) if t),
                     "created_at": None})
    users = session.scalars(select(UserSubstrate).order_by(UserSubstrate.name))
    return rows + [_row_dict(r) for r in users]


def add_substrate(session: Session, **values: Any) -> dict[str, Any]:
    """Check and store a substrate of the user's; return it as listed.

    Raises:
        QueryError: Bad values. SubstrateConflict: a built-in name or one already stored.
    """
    clean = check_substrate(**values)
    with writing(session):
        same = _user_row(session, clean["name"])
        if same is not None:
            raise SubstrateConflict(f"you already have a substrate named {same.name!r}; "
                                    "delete it first or choose another name")
        row = UserSubstrate(**clean, created_at=utc_now())
        session.add(row)
        try:
            session.flush()
        except IntegrityError as exc:  # the unique index has the last word
            raise SubstrateConflict(f"a substrate named {clean['name']!r} already "
                                    "exists") from exc
    return _row_dict(row)


def delete_substrate(session: Session, name: str) -> str:
    """Delete one of the user's substrates (named by `app.names` folding); return its name.

    Raises:
        QueryError: A built-in name. SubstrateNotFound: no such substrate of the user's.
    """
    clean = name.strip()
    built_in = _built_in_name(clean)
    if built_in:
        raise QueryError(f"{built_in!r} is a built-in substrate and cannot be deleted")
    with writing(session):
        row = _user_row(session, clean)
        if row is None:
            raise SubstrateNotFound(f"you have no substrate named {echo(clean)}")
        session.delete(row)
        return row.name
