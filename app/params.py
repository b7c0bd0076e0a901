"""Checking what a user typed: table filters, temperature, band-path points.

Every check raises `QueryError` (a `BondgapInputError`) with one line saying what was wrong and
what is accepted; the web layer answers it with 400, the CLI with exit code 2. Values reach the
database only as bound parameters, and sort keys only through `app.columns.COLUMNS_BY_KEY`.
"""

from __future__ import annotations

from dataclasses import asdict, dataclass
from typing import Any

from app.columns import COLUMNS_BY_KEY
from app.number_input import NumberError, NumberRule, read_number
from screening.bands import MAX_PATH_POINTS
from screening.constants import HC_EV_NM
from screening.elements import FAMILIES
from screening.errors import BondgapInputError, echo
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
MAX_GAP_EV = 20.0
"""Largest band gap a query may name: beyond any solid (LiF, about 14 eV, has the widest)."""
MAX_WAVELENGTH_NM = 1e6
"""Longest photon wavelength a query may name: 1 mm, a gap of about 1.2 meV."""


def _choice(value: str | None, accepted: tuple[str, ...], what: str) -> str | None:
    """Match `value` case-insensitively against `accepted`; None for an empty value."""
    if value is None or not value.strip():
        return None
    for option in accepted:
        if option.lower() == value.strip().lower():
            return option
    raise QueryError(f"unknown {what} {echo(value.strip())}; accepted: {', '.join(accepted)}")


def number(value: Any, rule: NumberRule) -> float | None:
    """Read a typed number within its rule (`app.number_input`); None for an empty value.

    Raises:
        QueryError: Not a plain decimal number in the rule's range (one message for all).
    """
    try:
        return read_number(value, rule)
    except NumberError as exc:
        raise QueryError(str(exc)) from None


def _window(
    low: float | str | None, high: float | str | None, name: str, unit: str,
    bounds: tuple[float, float],
) -> tuple[float | None, float | None]:
    """Read a (min, max) window inside `bounds`; both ends optional, min <= max."""
    lo = number(low, NumberRule(f"{name}-min", unit, *bounds))
    hi = number(high, NumberRule(f"{name}-max", unit, *bounds))
    if lo is not None and hi is not None and lo > hi:
        raise QueryError(
            f"empty {name} window: {name}-min {lo:g} {unit} > {name}-max {hi:g} {unit}"
        )
    return lo, hi


TEMPERATURE = NumberRule("temperature", "K", 0.0, MAX_TEMPERATURE_K)
GAP_WINDOW_EV = (0.0, MAX_GAP_EV)
"""Range of the table's gap window, eV."""
WAVELENGTH_WINDOW_NM = (HC_EV_NM / MAX_GAP_EV, MAX_WAVELENGTH_NM)
"""Range of the table's wavelength window, nm (gaps from 20 eV down to about 1 meV)."""


def parse_temperature(value: float | str | None) -> float | None:
    """Read a temperature in K (0 to 2000); None for an empty value (meaning 300 K)."""
    return number(value, TEMPERATURE)


def parse_points(value: int | str | None) -> int:
    """Read the number of k-points of a band path (6 to 2000; default 400)."""
    points = number(value, NumberRule("points", "", MIN_POINTS, MAX_PATH_POINTS, whole=True))
    return DEFAULT_POINTS if points is None else int(points)


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
        gap_min, gap_max = _window(gap_min, gap_max, "gap", "eV", GAP_WINDOW_EV)
        wl_min, wl_max = _window(wl_min, wl_max, "wl", "nm", WAVELENGTH_WINDOW_NM)
        sort_key = (sort or "formula").strip()
        if sort_key not in COLUMNS_BY_KEY:
            raise QueryError(
                f"cannot sort by {echo(sort_key)}; sortable columns: {', '.join(COLUMNS_BY_KEY)}"
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
