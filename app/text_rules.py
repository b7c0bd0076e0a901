"""What text the user may store: names, notes, ids; checked once, at the boundary.

Text is stored NFC-normalised with its outer spaces removed. Everywhere refused: unpaired
surrogates (a JSON body can carry them; they cannot be stored or shown as UTF-8), control
characters other than line breaks and tabs in notes, and the bidirectional overrides and
isolates (U+202A..U+202E, U+2066..U+2069) that can make text display differently from what is
stored, the Unicode line and paragraph separators, and the zero-width characters (U+200B,
U+2060, U+FEFF) that make two texts that look alike differ. Names are one line of letters,
digits, spaces, punctuation and symbols, without the markup and quoting characters < > " ` and
the backslash (and no other kind of space), so a name reads the same wherever it is shown: a
page, a chart, a file name, a terminal. Each check raises `QueryError` with one line saying what
was wrong and what is accepted.
"""

from __future__ import annotations

import unicodedata
from typing import Annotated, Any

from pydantic import AfterValidator, Strict

from app.params import QueryError
from screening.errors import echo

BIDI_CONTROLS = frozenset("\u202a\u202b\u202c\u202d\u202e\u2066\u2067\u2068\u2069")
INVISIBLE = frozenset("\u200b\u2060\ufeff")
"""Zero-width characters that change what is stored but not what is shown."""
NAME_REFUSED = frozenset('<>"\\`')
NAME_RULE = "letters, digits, spaces, punctuation and symbols except < > \" \\ `"
MAX_ID = 2**63 - 1
"""Largest id SQLite stores (a signed 64-bit integer)."""


def _refused_character(text: str, *, lines: bool) -> str | None:
    """A description of the first character `text` may not hold, or None."""
    for ch in text:
        category = unicodedata.category(ch)
        if category == "Cs":
            return f"an unpaired surrogate (U+{ord(ch):04X}); send UTF-8 text"
        if ch in BIDI_CONTROLS:
            return f"a bidirectional control character (U+{ord(ch):04X})"
        if category == "Cc" and not (lines and ch in "\n\t"):
            return f"a control character (U+{ord(ch):04X})"
        if category in ("Zl", "Zp"):
            return f"a Unicode line or paragraph separator (U+{ord(ch):04X}); use a line break"
        if ch in INVISIBLE:
            return f"an invisible character (U+{ord(ch):04X})"
    return None


def plain_text(value: Any, *, what: str, max_length: int, lines: bool = False) -> str:
    """Check free text (a note): NFC, outer spaces removed, at most `max_length` characters.

    Args:
        value: As typed (None counts as empty).
        what: Its name in the message, e.g. "a note".
        max_length: Most characters accepted.
        lines: Whether line breaks and tabs are allowed (CRLF and CR become LF).

    Raises:
        QueryError: Too long, or a character that is refused.
    """
    text = str(value or "").replace("\r\n", "\n").replace("\r", "\n")
    bad = _refused_character(text, lines=lines)
    if bad:
        raise QueryError(f"{what} may not hold {bad}")
    text = unicodedata.normalize("NFC", text).strip()
    if len(text) > max_length:
        raise QueryError(f"{what} is at most {max_length} characters, not {len(text)}")
    return text


def name_text(value: Any, *, what: str, max_length: int) -> str:
    """Check a name: 1 to `max_length` characters of `NAME_RULE` on one line, NFC, trimmed.

    Raises:
        QueryError: Empty, too long, or a character outside the rule.
    """
    rule = f"{what} is 1 to {max_length} characters on one line"
    text = unicodedata.normalize("NFC", str(value or "")).strip()
    bad = _refused_character(text, lines=False)
    if bad is None:
        odd = next((ch for ch in text if ch in NAME_REFUSED or not (
            unicodedata.category(ch)[0] in "LMNPS" or ch == " ")), None)
        bad = None if odd is None else f"{odd!r} (U+{ord(odd):04X})"
    if bad:
        raise QueryError(f"{rule} ({NAME_RULE}), not {bad}")
    if not text or len(text) > max_length:
        raise QueryError(f"{rule} ({NAME_RULE}), not {len(text)} characters")
    return text


def parse_id(value: Any, what: str) -> int:
    """A row id typed into a form: a whole number from 1 to `MAX_ID` (ASCII digits only)."""
    text = str(value or "").strip()
    number = int(text) if text.isascii() and text.isdigit() and len(text) <= 19 else 0
    if not 1 <= number <= MAX_ID:
        raise QueryError(f"{what} must be a whole number from 1 to {MAX_ID}, not {echo(text)}")
    return number


def _no_surrogates(value: str) -> str:
    if any(unicodedata.category(ch) == "Cs" for ch in value):
        raise ValueError("text holds an unpaired surrogate; send UTF-8 text")
    return value


JsonText = Annotated[str, AfterValidator(_no_surrogates)]
"""A string field of a JSON body: unpaired surrogates are refused (422) before any check."""

JsonNumber = Annotated[float, Strict()]
"""A number field of a JSON body: a JSON number only (`true`, `"1.5"` are refused, 422)."""
