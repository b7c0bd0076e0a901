"""One page of the finder's matches in an asked order, without ordering every detail.

The order of the matches is a list of sort keys, primary first (the asked column, then the
rounded ranking score), and a last tie-break (the gap uncertainty) that costs more to compute.
:func:`page_rows` finds the rows of the page by partition on the primary key, sorts only those
(with the rows that tie with its first and last) on every key, and computes the tie-break for
the page and the groups of equal keys at its edges: the page is the same as that of a full
sort.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from screening.errors import OutOfRangeError, UnknownChoiceError, echo

ORDER_KEYS: tuple[str, ...] = (
    "rank", "formula", "lattice_constant_angstrom", "mismatch", "abs_mismatch", "band_gap_eV",
    "band_gap_uncertainty_eV", "wavelength_nm", "critical_thickness_nm",
)
"""Orders the matches can be read in ("rank": the finder's score, best first)."""


@dataclass(frozen=True)
class Page:
    """Which matches to return: an order, and a slice of the matches in that order.

    Attributes:
        order: One of :data:`ORDER_KEYS`.
        descending: Reverse the order of the key (empty values stay last).
        offset: Matches skipped, >= 0.
        limit: Most matches returned (None: every match from ``offset`` on).
    """

    order: str = "rank"
    descending: bool = False
    offset: int = 0
    limit: int | None = None

    def validate(self) -> None:
        """Check the page.

        Raises:
            UnknownChoiceError: An unknown order.
            OutOfRangeError: A negative offset or a limit below 1.
        """
        if self.order not in ORDER_KEYS:
            raise UnknownChoiceError(f"cannot order matches by {echo(self.order)}; choose one "
                                     f"of {', '.join(ORDER_KEYS)}")
        if self.offset < 0:
            raise OutOfRangeError(f"page offset {self.offset}: give a whole number >= 0")
        if self.limit is not None and self.limit < 1:
            raise OutOfRangeError(f"page limit {self.limit}: give a whole number >= 1")

    def stop(self, count: int) -> int:
        """End of the page among `count` matches."""
        return count if self.limit is None else min(count, self.offset + self.limit)


def value_keys(values: NDArray[np.float64], descending: bool) -> list[NDArray]:
    """Sort keys of a numeric column: empty (NaN) values last in either direction."""
    missing = np.isnan(values)
    signed = -values if descending else values
    return [np.where(missing, np.inf, signed), missing]


SortKey = NDArray | Callable[[NDArray[np.intp]], NDArray]
"""A sort key: its values over every row, or a function giving them for some rows."""


def page_rows(keys: list[SortKey], tie_break: Callable[[NDArray[np.intp]], NDArray],
              start: int, stop: int) -> NDArray[np.intp]:
    """Rows [start, stop) of the order given by `keys` (primary first), then `tie_break`.

    Only the rows whose primary key lies between those at `start` and at `stop - 1` (found by
    partition) are sorted on every key; `tie_break` is computed only for the rows of the page
    and those that tie with its first or last row on every key.

    Args:
        keys: Arrays over the rows, compared in turn (all of one length; the primary key
            without NaN); a key after the primary may be a function of row indices, asked
            only for the rows near the page.
        tie_break: Values of the last key for some rows (called once).
        start: First position wanted.
        stop: One past the last position wanted.

    Returns:
        Row indices, in order.
    """
    count = len(keys[0]) if keys else 0
    stop = min(stop, count)
    if start >= stop:
        return np.zeros(0, dtype=np.intp)
    primary = keys[0]
    low, high = np.partition(primary, (start, stop - 1))[[start, stop - 1]]
    window = np.flatnonzero((primary >= low) & (primary <= high))
    start -= int(np.count_nonzero(primary < low))
    stop -= len(primary) - len(window) - int(np.count_nonzero(primary > high))
    values = [key(window) if callable(key) else key[window] for key in keys]
    ordered = np.lexsort(values[::-1])
    window = window[ordered]
    new_group = np.zeros(len(window), dtype=bool)
    new_group[0] = True
    for value in values:
        value = value[ordered]
        new_group[1:] |= value[1:] != value[:-1]
    starts = np.flatnonzero(new_group)
    first = int(starts[np.searchsorted(starts, start, side="right") - 1])
    after = np.searchsorted(starts, stop, side="left")
    last = int(starts[after]) if after < len(starts) else len(window)
    near = window[first:last]
    near = near[np.lexsort((tie_break(near), np.cumsum(new_group[first:last])))]
    return near[start - first: stop - first]
