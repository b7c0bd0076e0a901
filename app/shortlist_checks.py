"""Checking what the user typed for a shortlist: its name, a note, a candidate's formula.

Each check returns the clean value or raises a `BondgapInputError` with one line saying what
was wrong and what is accepted.
"""

from __future__ import annotations

from typing import Any

from app.params import QueryError

NAME_LENGTH = 80
NOTE_LENGTH = 4000


def check_name(name: Any) -> str:
    """A list name: 1 to 80 characters on one line, outer spaces removed."""
    text = str(name or "").strip()
    if not text or len(text) > NAME_LENGTH or any(ord(ch) < 32 or ch == "\x7f" for ch in text):
        raise QueryError(f"a shortlist name is 1 to {NAME_LENGTH} characters on one line, "
                         f"not {text[:40]!r}")
    return text


def check_note(note: Any) -> str:
    """A note: up to 4000 characters; line breaks kept, other control characters refused."""
    text = str(note or "").replace("\r\n", "\n").replace("\r", "\n").strip()
    if len(text) > NOTE_LENGTH:
        raise QueryError(f"a note is at most {NOTE_LENGTH} characters, not {len(text)}")
    if any((ord(ch) < 32 and ch not in "\n\t") or ch == "\x7f" for ch in text):
        raise QueryError("a note may hold line breaks and tabs but no other control characters")
    return text


def check_formula(text: Any) -> str:
    """Normalise a binary or alloy formula and check that the engine can report on it.

    Raises:
        BondgapInputError: The engine's message (unknown element, not an octet compound,
            fractions off, end points without data, ...).
    """
    from screening.alloy_report import material_report, normalise_material

    formula = normalise_material(str(text or "").strip())
    material_report(formula)
    return formula


def split_formulas(text: str) -> list[str]:
    """Formulas typed into one field, separated by spaces, commas, semicolons or lines."""
    return [p for p in text.replace(",", " ").replace(";", " ").split() if p]
