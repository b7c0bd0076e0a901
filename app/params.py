"""Checking what a user typed: table filters, temperature, band-path points.

Every check raises `QueryError` (a `BondgapInputError`) with one line saying what was wrong and
what is accepted; the web layer answers it with 400, the CLI with exit code 2. Values reach the
database only as bound parameters, and sort keys only through `app.columns.COLUMNS_BY_KEY`.
"""

from __future__ import annotations

import math
from dataclasses import asdict, dataclass
from typing import Any

from app.columns import COLUMNS_BY_KEY
from screening.bands import MAX_PATH_POINTS
from screening.elements import FAMILIES
from screening.errors import BondgapInputError
from screening.hazards import parse_excluded
from screening.report import MAX_TEMPERATURE_K
from screening.structure import STRUCTURES


class QueryError(BondgapInputError):
    """Input the app cannot answer: unknown sort key or filter value, a bad number or window."""


FAMILY_CHOICES: tuple[str, ...] = tuple(FAMILIES[v] for v in sorted(FAMILIES, reverse=True))
STRUCTURE_CHOICES: tuple[str, ...] = STRUCTURES
KIND_CHOICES: tuple[str, ...] = ("direct", "indirect")
STORED_TEMPERATURE_K = 300.0
"""Temperature of the band gaps held in the store (others are computed on request)."""
DEFAULT_POINTS = 400
"""Default number of k-points along the band path."""
MIN_POINTS = 6


def _choice(value: str | None, accepted: tuple[str, ...], what: str) -> str | None:
    """Match `value` case-insensitively against `accepted`; None for an empty value."""
    if value is None or not value.strip():
        return None
    for option in accepted:
        if option.lower() == value.strip().lower():
            return option
    raise QueryError(f"unknown {what} {value.strip()[:40]!r}; accepted: {', '.join(accepted)}")


def _number(value: float | str | None, name: str, unit: str) -> float | None:
    """Read a finite number; None for an empty value."""
    if value is None or (isinstance(value, str) and not value.strip()):
        return None
    try:
        number = float(value)
    except ValueError:
        number = math.nan
    if not math.isfinite(number):
        raise QueryError(f"{name} must be a finite number of {unit}, not {str(value)[:40]!r}")
    return number


def _window(
    low: float | str | None, high: float | str | None, name: str, unit: str, *, positive: bool
) -> tuple[float | None, float | None]:
    """Read a (min, max) window; both ends optional, min <= max, > 0 if `positive`."""
    lo, hi = _number(low, f"{name}-min", unit), _number(high, f"{name}-max", unit)
    for end, value in (("min", lo), ("max", hi)):
        if positive and value is not None and value <= 0:
            raise QueryError(f"{name}-{end} must be a positive number of {unit}, not {value:g}")
    if lo is not None and hi is not None and lo > hi:
        raise QueryError(
            f"empty {name} window: {name}-min {lo:g} {unit} > {name}-max {hi:g} {unit}"
        )
    return lo, hi


def parse_temperature(value: float | str | None) -> float | None:
    """Read a temperature in K (0 to 2000); None for an empty value (meaning 300 K)."""
    number = _number(value, "temperature", "kelvin (0 to 2000)")
    if number is not None and not 0.0 <= number <= MAX_TEMPERATURE_K:
        raise QueryError(
            f"temperature {number:g} K is outside the accepted range 0 to "
            f"{MAX_TEMPERATURE_K:g} K"
        )
    return number


def parse_points(value: int | str | None) -> int:
    """Read the number of k-points of a band path (6 to 2000; default 400)."""
    if value is None or (isinstance(value, str) and not value.strip()):
        return DEFAULT_POINTS
    try:
        points = int(str(value).strip())
    except ValueError:
        points = -1
    if not MIN_POINTS <= points <= MAX_PATH_POINTS:
        raise QueryError(
            f"points must be a whole number from {MIN_POINTS} to {MAX_PATH_POINTS}, "
            f"not {str(value)[:40]!r}"
        )
    return points


@dataclass(frozen=True)
class TableQuery:
    """A checked table query: filters, sort key and direction, temperature of the gaps.

    The gap window (eV) and the wavelength window (nm) apply to the band gap shown at the
    temperature: the measured gap where one is known, else the estimate.
    """

    family: str | None = None
    structure: str | None = None
    gap_min: float | None = None
    gap_max: float | None = None
    measured_only: bool = False
    sort: str = "formula"
    desc: bool = False
    temperature: float | None = None
    wl_min: float | None = None
    wl_max: float | None = None
    kind: str | None = None
    exclude: tuple[str, ...] = ()
    no_rohs: bool = False

    @property
    def temperature_K(self) -> float:
        """Temperature of the gaps, K (300 K unless asked otherwise)."""
        return STORED_TEMPERATURE_K if self.temperature is None else self.temperature

    @classmethod
    def parse(
        cls,
        *,
        family: str | None = None,
        structure: str | None = None,
        gap_min: float | str | None = None,
        gap_max: float | str | None = None,
        measured_only: bool = False,
        sort: str | None = None,
        desc: bool = False,
        temperature: float | str | None = None,
        wl_min: float | str | None = None,
        wl_max: float | str | None = None,
        kind: str | None = None,
        exclude: str | list[str] | tuple[str, ...] | None = None,
        no_rohs: bool = False,
    ) -> TableQuery:
        """Check raw filter values (as typed in a form, a URL or the CLI) and return the query.

        Raises:
            QueryError: Unknown family, structure, kind or sort key; a bound that is not a
                finite number; an empty window; a wavelength <= 0; a temperature outside
                0 to 2000 K.
            UnknownElementError: A symbol in `exclude` that is not an element.
        """
        gap_min, gap_max = _window(gap_min, gap_max, "gap", "eV", positive=False)
        wl_min, wl_max = _window(wl_min, wl_max, "wl", "nm", positive=True)
        sort_key = (sort or "formula").strip()
        if sort_key not in COLUMNS_BY_KEY:
            raise QueryError(
                f"cannot sort by {sort_key[:40]!r}; sortable columns: {', '.join(COLUMNS_BY_KEY)}"
            )
        return cls(
            family=_choice(family, FAMILY_CHOICES, "family"),
            structure=_choice(structure, STRUCTURE_CHOICES, "structure"),
            gap_min=gap_min,
            gap_max=gap_max,
            measured_only=measured_only,
            sort=sort_key,
            desc=desc,
            temperature=parse_temperature(temperature),
            wl_min=wl_min,
            wl_max=wl_max,
            kind=_choice(kind, KIND_CHOICES, "gap kind"),
            exclude=parse_excluded(exclude),
            no_rohs=no_rohs,
        )

    def as_params(self) -> dict[str, Any]:
        """Return the query as URL parameters (only those set), for links and the API echo.

        Excluded elements are joined with commas (`exclude=As,Cd`).
        """
        params = {k: v for k, v in asdict(self).items()
                  if v is not None and v is not False and v != ()}
        if self.exclude:
            params["exclude"] = ",".join(self.exclude)
        return params
