"""Numbered notes of the compare page: each cell's route and source, said once under the table.

Citations are long; in the cells they would push the candidates' values off the screen. Each
distinct "route; source" text gets a number in reading order (row by row); a cell shows only
its number, and a row whose cells all share one text shows the number once, by its label.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any


def _text(*parts: Any) -> str:
    return "; ".join(str(p) for p in parts if p)


@dataclass(frozen=True)
class RowNotes:
    """Note numbers of one row: by its label (all cells alike), per cell, per "yours" tag."""

    head: int | None
    cells: tuple[int | None, ...]
    yours: tuple[int | None, ...]


@dataclass
class CompareNotes:
    """The numbered notes (`texts[n - 1]` is note n) and each row's numbers."""

    texts: list[str] = field(default_factory=list)
    rows: list[RowNotes] = field(default_factory=list)

    def number(self, text: str) -> int | None:
        """The number of `text` (a new one if not seen yet); None for no text."""
        if not text:
            return None
        if text not in self.texts:
            self.texts.append(text)
        return self.texts.index(text) + 1


def compare_notes(rows: list[dict[str, Any]]) -> CompareNotes:
    """Number the routes and sources of the comparison's rows (as `rows_payload` gives them)."""
    notes = CompareNotes()
    for row in rows:
        texts = [_text(c["route"], c["source"]) for c in row["cells"]]
        alike = len(set(texts)) == 1
        head = notes.number(texts[0]) if alike else None
        cells = tuple(None if alike else notes.number(t) for t in texts)
        yours = tuple(
            notes.number(_text("your value", (c["yours"] or {}).get("source")))
            if c["yours"]
            else None
            for c in row["cells"]
        )
        notes.rows.append(RowNotes(head, cells, yours))
    return notes
