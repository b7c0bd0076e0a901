"""The composition finder as the app asks it: one checked query, one run, one payload.

`MatchQuery.parse` checks what a user typed (form, URL or CLI); `run_match` resolves the
substrate (built-in or the user's) and asks the engine's `find_compositions` for one page of
matches in the asked order (`offset`, `limit`; the web app caps an answer at `MAX_PAGE_ROWS`,
a finder page at `MAX_TABLE_ROWS`);
`match_payload` is the object of `GET /api/match` and `bondgap match --json`, and the finder
page renders the same rows.
"""

from __future__ import annotations

from concurrent.futures import ThreadPoolExecutor
from dataclasses import asdict, dataclass, replace
from typing import Any

from sqlalchemy.orm import Session

from app.memory import release_freed_memory
from app.number_input import NumberRule
from app.params import MAX_GAP_EV, MAX_WAVELENGTH_NM, QueryError, number, parse_temperature
from app.substrates import resolve_substrate
from screening.alloys import (
    ALL_SYSTEMS,
    ORDER_KEYS,
    FinderQuery,
    FinderResult,
    GapWindow,
    Page,
    find_compositions,
    parse_system,
)
from screening.alloys.query import DEFAULT_FAMILIES
from screening.constants import HC_EV_NM
from screening.elements import atomic_number
from screening.epitaxy import GEOMETRIES, SubstrateSpec
from screening.errors import echo
from screening.hazards import ROHS_RESTRICTED

DEFAULT_TOLERANCE_EV = 0.01
DEFAULT_LIMIT = 500
MAX_LIMIT = 100_000
"""Largest `limit` accepted (the command line prints up to this many matches)."""
MAX_PAGE_ROWS = 1000
"""Most matches in one answer of the API; the rest come by `offset`."""
MAX_TABLE_ROWS = 500
"""Most matches in one finder page (HTML): the table's rendering costs more per row than JSON."""
MAX_OFFSET = 10_000_000
"""Largest `offset` accepted: more compositions than the whole design space holds."""
SORT_KEYS: tuple[str, ...] = ORDER_KEYS
"""Columns the matches can be ordered by ("rank": the finder's score, best first)."""
FINDER = ThreadPoolExecutor(max_workers=1, thread_name_prefix="finder")
"""The one thread that runs finder searches, one at a time: a search over the whole design
space holds up to about 200 MB for a moment; two at once would not finish sooner on a shared
CPU, and searches spread over many threads would each leave the allocator's memory of their
own thread held (resident memory grew to 2 GB after a burst)."""


def _system(text: str | None) -> str:
    """"all", or the normalised name of an alloy system (ternary or quaternary)."""
    clean = (text or "").strip()
    if not clean or clean.lower() == ALL_SYSTEMS:
        return ALL_SYSTEMS
    system = parse_system(clean)
    if system.form == "binary":
        raise QueryError(f"{system.name} is a binary compound, not an alloy system; name a "
                         "ternary or quaternary such as InGaAs or InGaAsP, or all")
    return system.name


def _elements(value: str | list[str] | tuple[str, ...] | None) -> tuple[str, ...]:
    """Element symbols from "Cd, Hg" or ["Cd", "Hg"], each checked."""
    items = [value] if isinstance(value, str) else list(value or ())
    symbols = [s.strip() for item in items for s in item.replace(";", ",").replace(" ", ",")
               .split(",") if s.strip()]
    if len(symbols) > 20:
        raise QueryError("exclude at most 20 elements")
    cleaned = tuple(dict.fromkeys(s[:1].upper() + s[1:].lower() for s in symbols))
    for symbol in cleaned:
        atomic_number(symbol)
    return cleaned


@dataclass(frozen=True)
class MatchQuery:
    """A checked finder query as typed (before the substrate is looked up)."""

    system: str = ALL_SYSTEMS
    on: str = ""
    gap: float | None = None
    wavelength: float | None = None
    tolerance: float | None = None
    temperature: float | None = None
    max_mismatch: float | None = None
    thickness: float | None = None
    geometry: str = "single-uncapped"
    exclude: tuple[str, ...] = ()
    no_rohs: bool = False
    sort: str = "rank"
    desc: bool = False
    limit: int = DEFAULT_LIMIT
    offset: int = 0

    @classmethod
    def parse(cls, *, system: str | None = None, on: str | None = None, gap: Any = None,
              wavelength: Any = None, tolerance: Any = None, temperature: Any = None,
              max_mismatch: Any = None, thickness: Any = None, geometry: str | None = None,
              exclude: Any = None, no_rohs: bool = False, sort: str | None = None,
              desc: bool = False, limit: Any = None, offset: Any = None) -> MatchQuery:
        """Check raw values and return the query.

        Raises:
            QueryError (or another BondgapInputError): what is wrong and what is accepted.
        """
        if not (on or "").strip():
            raise QueryError("give a substrate (on=NAME, --on NAME), e.g. InP or GaAs")
        gap_eV = number(gap, NumberRule("the target gap", "eV", 0.0, MAX_GAP_EV, low_open=True))
        wl = number(wavelength, NumberRule("the target wavelength", "nm",
                                           HC_EV_NM / MAX_GAP_EV, MAX_WAVELENGTH_NM))
        if gap_eV is not None and wl is not None:
            raise QueryError("give the target as a gap or as a wavelength, not both")
        tol = number(tolerance, NumberRule("the gap tolerance", "eV", 0.0, MAX_GAP_EV))
        if tol is not None and gap_eV is None and wl is None:
            raise QueryError("a gap tolerance needs a target gap or wavelength")
        mismatch = number(max_mismatch, NumberRule("the mismatch limit (a fraction, 0.001 = "
                                                   "0.1 %)", "", 0.0, 1.0))
        h = number(thickness, NumberRule("the layer thickness", "nm", 0.0, 1e6, low_open=True))
        shape = (geometry or "").strip() or "single-uncapped"
        if shape not in GEOMETRIES:
            raise QueryError(f"unknown critical-thickness geometry {echo(shape)}; choose one "
                             f"of {', '.join(GEOMETRIES)}")
        key = (sort or "").strip() or "rank"
        if key not in SORT_KEYS:
            raise QueryError(f"cannot sort matches by {echo(key)}; sortable: "
                             f"{', '.join(SORT_KEYS)}")
        count = number(limit, NumberRule("limit", "", 1, MAX_LIMIT, whole=True))
        skip = number(offset, NumberRule("offset", "", 0, MAX_OFFSET, whole=True))
        return cls(system=_system(system), on=(on or "").strip(), gap=gap_eV, wavelength=wl,
                   tolerance=tol, temperature=parse_temperature(temperature),
                   max_mismatch=mismatch, thickness=h, geometry=shape,
                   exclude=_elements(exclude), no_rohs=bool(no_rohs), sort=key,
                   desc=bool(desc),
                   limit=DEFAULT_LIMIT if count is None else int(count),
                   offset=0 if skip is None else int(skip))

    def capped(self, most: int = MAX_PAGE_ROWS) -> MatchQuery:
        """The query with at most `most` matches per answer (the web app's API and pages)."""
        return replace(self, limit=min(self.limit, most))

    @property
    def temperature_K(self) -> float:
        """Temperature of the gaps (300 K unless asked otherwise)."""
        return 300.0 if self.temperature is None else self.temperature

    def window(self) -> GapWindow | None:
        """The accepted gaps: target +/- tolerance (eV), the target given as gap or wavelength."""
        if self.gap is None and self.wavelength is None:
            return None
        tol = DEFAULT_TOLERANCE_EV if self.tolerance is None else self.tolerance
        if self.gap is not None:
            return GapWindow.from_gap(self.gap, tol)
        target = HC_EV_NM / self.wavelength
        window = GapWindow.from_gap(target, tol)
        return replace(window, description=f"wavelength {self.wavelength:g} nm "
                                           f"({target:.4f} eV) +/- {tol:g} eV")

    def as_params(self) -> dict[str, Any]:
        """The query as URL parameters (only those set), for links and the API echo."""
        params = {k: v for k, v in asdict(self).items()
                  if v is not None and v is not False and v != () and (k, v) != ("offset", 0)}
        if self.exclude:
            params["exclude"] = ",".join(self.exclude)
        return params


@dataclass(frozen=True)
class MatchRun:
    """A query, its substrate, and the page of matches it asked for (in the asked order)."""

    query: MatchQuery
    substrate: SubstrateSpec
    window: GapWindow | None
    result: FinderResult

    @property
    def next_offset(self) -> int | None:
        """Offset of the next page, or None on the last page."""
        after = self.result.offset + len(self.result)
        return after if after < self.result.match_count else None


def _search(query: FinderQuery, page: Page) -> FinderResult:
    """One search, then the memory its arrays held given back (in the finder's thread)."""
    try:
        return find_compositions(query, page)
    finally:
        release_freed_memory()


def run_match(session: Session | None, query: MatchQuery) -> MatchRun:
    """Resolve the substrate, run the finder for the query's page of matches.

    Raises:
        BondgapInputError: Unknown substrate, a system of the other lattice kind than the
            substrate, a system without data (the engine's message).
    """
    substrate = resolve_substrate(session, query.on)
    window = query.window()
    result = FINDER.submit(_search, FinderQuery(
        substrate=substrate, system=query.system, gap=window,
        temperature_K=query.temperature_K, max_mismatch=query.max_mismatch,
        layer_thickness_nm=query.thickness,
        exclude_elements=query.exclude + (tuple(ROHS_RESTRICTED) if query.no_rohs else ()),
        geometry=query.geometry, families=DEFAULT_FAMILIES),
        Page(order=query.sort, descending=query.desc, offset=query.offset,
             limit=query.limit)).result()
    return MatchRun(query, substrate, window, result)
