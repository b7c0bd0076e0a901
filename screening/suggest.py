"""Suggestions for a formula that could not be read: "did you mean GaAs?".

Candidates come from two places, best first:

* the text read as element symbols whatever its case ("gaas", "GAAS", "GaAS" -> Ga As), each
  reading kept if it is a formula the engine accepts (catalogue compounds before others), or
  an alloy system, shown with an example composition;
* the catalogue's formulas compared without regard to case.

Only the failing path computes suggestions, and its cost is bounded: at most
:data:`MAX_READINGS` readings of a text of at most ``MAX_FORMULA_LENGTH`` characters.
"""

from __future__ import annotations

import re
from collections.abc import Callable, Iterator
from typing import Final, TypeVar

from screening.elements import ATOMIC_NUMBER
from screening.errors import BondgapInputError

MAX_READINGS: Final[int] = 64
"""Most readings of a text as element symbols that are tried."""

MAX_SUGGESTIONS: Final[int] = 3
"""Most suggestions named in one message."""

_SYMBOL_OF_LOWER: Final[dict[str, str]] = {s.lower(): s for s in ATOMIC_NUMBER}
_RUNS = re.compile(r"[A-Za-z]+|[^A-Za-z]+")

Error = TypeVar("Error", bound=BondgapInputError)


def _symbol_splits(letters: str) -> Iterator[list[str]]:
    """Every way to read a run of letters as element symbols (any case), one- or two-letter.

    Only positions from which the rest can still be read are entered, so each reading costs
    O(len) and a run that cannot be read costs O(len) in all (no backtracking blow-up).
    """
    n = len(letters)
    symbols = [{size: _SYMBOL_OF_LOWER.get(letters[i:i + size].lower())
                for size in (2, 1) if i + size <= n} for i in range(n)]
    viable = [False] * n + [True]
    for i in range(n - 1, -1, -1):
        viable[i] = any(sym is not None and viable[i + size] for size, sym in symbols[i].items())

    def walk(i: int) -> Iterator[list[str]]:
        if i == n:
            yield []
            return
        for size, symbol in symbols[i].items():
            if symbol is not None and viable[i + size]:
                for rest in walk(i + size):
                    yield [symbol, *rest]

    if viable[0]:
        yield from walk(0)


def recased_readings(text: str) -> list[str]:
    """The text with its letters re-cased as element symbols, every reading (bounded).

    "gaas" -> ["GaAs", ...]; digits, dots and brackets stay where they are.
    """
    readings = [""]
    for run in _RUNS.findall(text.strip()):
        if not run[0].isalpha():
            readings = [r + run for r in readings]
            continue
        splits = []
        for split in _symbol_splits(run):
            splits.append("".join(split))
            if len(splits) >= MAX_READINGS:
                break
        readings = [r + s for r in readings for s in splits][:MAX_READINGS]
    return [r for r in readings if r]


def _catalogue_formulas() -> tuple[str, ...]:
    from screening.catalogue import catalogue_formulas

    return tuple(catalogue_formulas())


def suggestions(text: str, read: Callable[[str], str]) -> list[str]:
    """Likely meant formulas for a text that could not be read.

    Args:
        text: What the user wrote.
        read: Reads one candidate and returns what to suggest for it (the normalised
            formula, or an alloy system with an example), raising `BondgapInputError` when it
            cannot be read either.

    Returns:
        At most :data:`MAX_SUGGESTIONS` suggestions, catalogue compounds first; none equal to
        the text itself.
    """
    shown = text.strip()
    catalogue = _catalogue_formulas()
    found: list[str] = []
    candidates = [*recased_readings(shown), *(f for f in catalogue if f.lower() == shown.lower())]
    for candidate in candidates:
        if candidate == shown:
            continue
        try:
            suggestion = read(candidate)
        except BondgapInputError:
            continue
        if suggestion != shown and suggestion not in found:
            found.append(suggestion)
    found.sort(key=lambda s: s not in catalogue)  # stable: catalogue compounds first
    return found[:MAX_SUGGESTIONS]


def with_suggestions(error: Error, text: str, read: Callable[[str], str]) -> Error:
    """The error with "did you mean ...?" added when a likely formula is found, else as is."""
    found = suggestions(text, read)
    if not found:
        return error
    names = found[0] if len(found) == 1 else ", ".join(found[:-1]) + " or " + found[-1]
    return type(error)(f"{error}; did you mean {names}?")
