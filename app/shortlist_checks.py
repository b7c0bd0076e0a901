"""Checking what the user typed for a shortlist: its name, a note, a candidate's formula.

Each check returns the clean value or raises a `BondgapInputError` with one line saying what
was wrong and what is accepted.
"""

from __future__ import annotations

from typing import Any

from app.text_rules import name_text, plain_text

NAME_LENGTH = 80
NOTE_LENGTH = 4000


def check_name(name: Any) -> str:
    """A list name: 1 to 80 characters on one line (`app.text_rules.NAME_RULE`), trimmed."""
    return name_text(name, what="a shortlist name", max_length=NAME_LENGTH)


def check_note(note: Any) -> str:
    """A note: up to 4000 characters; line breaks and tabs kept (`app.text_rules.plain_text`)."""
    return plain_text(note, what="a note", max_length=NOTE_LENGTH, lines=True)


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
