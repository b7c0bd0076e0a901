"""The composition finder: every alloy composition that meets a query, ranked.

For the chosen system (or every system of the design space whose lattice kind matches the
substrate's and that contains no excluded element), the search screens

* every grid composition (ternaries in steps of 0.001, quaternaries 0.005 by default), and
* exact roots: the lattice-matched composition of each ternary, the lattice-matched line of
  each quaternary (solved exactly at every grid value of its driver fraction), and, for a gap
  target, the compositions whose gap equals the target exactly (along each ternary, and along
  each quaternary's lattice-matched line),

with array operations over all of them at once, in a cascade: Vegard lattice constant and
mismatch first, then the band gap of the survivors, then the critical thickness and the
uncertainty of what remains. A layer-thickness limit is applied exactly without solving for
h_c (``epitaxy.critical_strain``); the critical thickness itself (Lambert W) is computed for the
matches when they are read.

Ranking: score = sqrt(g^2 + m^2), with g the gap's distance from the target in units of the
window's half-width on that side (0 without a gap target) and m = |f| / (mismatch limit, or
1 % without one); ties go to the smaller gap uncertainty. Exact roots that meet both targets
score 0 and come first.
"""

from __future__ import annotations

from collections.abc import Callable

import numpy as np
from numpy.typing import NDArray

from screening import epitaxy
from screening.alloys.bandgap import band_gap, gap_tables, gap_uncertainty
from screening.alloys.design import (
    DesignSpace,
    composition_keys,
    design_space,
    grid_count,
    poisson_ratio,
)
from screening.alloys.model import vegard
from screening.alloys.paging import Page, SortKey, page_rows, value_keys
from screening.alloys.properties import VALLEY_NAMES, check_lattice
from screening.alloys.query import ALL_SYSTEMS, FinderQuery, GapWindow
from screening.alloys.results import MATCH_KINDS, FinderResult
from screening.alloys.roots import gap_roots_on_grid, gap_roots_on_paths, lattice_matched
from screening.alloys.systems import (
    AlloySystem,
    design_space_systems,
    parse_system,
    require_measured_data,
)
from screening.constants import HC_EV_NM
from screening.errors import CompositionError

_SLACK = 1e-12
"""Tolerance of the limit comparisons, so that exact roots meet zero-width limits."""

_SCORE_DECIMALS = 9
"""Scores are compared to this many decimals, so that round-off does not outrank a tie-break."""

_CHUNK = 65_536
"""Compositions screened at once (bounds the temporary arrays of one search)."""

_MANY = 4 * _CHUNK
"""From this many rows on, a column is evaluated over the whole grid and read back by row."""

_CORE = ("system_index", "fractions", "kind", "lattice_constant_angstrom", "mismatch")

_LATTICE_MATCHED, _TARGET_GAP, _BOTH = (MATCH_KINDS.index(k) for k in MATCH_KINDS[1:])


def select_systems(query: FinderQuery) -> tuple[tuple[AlloySystem, ...], tuple[tuple[str, str],
                                                                              ...]]:
    """The systems a query screens, and the design-space systems it leaves out (with why).

    Raises:
        FormulaSyntaxError, CompositionError, ...: A system name that cannot be read.
        MissingDataError: A named system whose end points lack measured data.
        StructureMismatchError: A named system whose lattice differs from the substrate's.
    """
    excluded = set(query.exclude_elements)
    if query.system.strip().lower() == ALL_SYSTEMS:
        candidates = design_space_systems(tuple(sorted(set(query.families))))
    else:
        system = parse_system(query.system)
        if system.form == "binary":
            raise CompositionError(
                f"'{query.system}' is a binary compound, not an alloy system; name a system "
                "with three or four elements (e.g. InGaAs, InGaAsP) or 'all'"
            )
        require_measured_data(system)
        check_lattice(system, query.substrate)
        candidates = (system,)
    chosen, skipped = [], []
    for system in candidates:
        hit = sorted(excluded & set(system.elements))
        if hit:
            skipped.append((system.name, f"contains excluded element(s) {', '.join(hit)}"))
        elif system.lattice != query.substrate.lattice:
            skipped.append((system.name, f"{system.lattice} lattice; substrate "
                                         f"{query.substrate.name} is {query.substrate.lattice}"))
        else:
            chosen.append(system)
    return tuple(chosen), tuple(skipped)


def _gap_window_distance(gap: NDArray[np.float64], window: GapWindow) -> NDArray[np.float64]:
    below = window.target_eV - window.low_eV
    above = window.high_eV - window.target_eV
    scale_above = above if np.isfinite(above) else below
    scale = np.where(gap < window.target_eV, below, scale_above)
    deviation = np.abs(gap - window.target_eV)
    return np.divide(deviation, scale, out=np.where(deviation > 0.0, np.inf, 0.0),
                     where=scale > 0.0)


def _chunks(rows: NDArray[np.intp]) -> list[NDArray[np.intp]]:
    """`rows` in slices of at most ``_CHUNK`` (one empty slice for no rows)."""
    return [rows[a:a + _CHUNK] for a in range(0, max(len(rows), 1), _CHUNK)]


class _Search:
    """One query's evaluation over a design space (vectorised over compositions)."""

    def __init__(self, query: FinderQuery, space: DesignSpace) -> None:
        self.query = query
        self.space = space
        self.packed = space.packed
        self.tables = gap_tables(space.packed, float(query.temperature_K))
        self.a_sub = float(query.substrate.lattice_a_angstrom)
        self.zincblende = np.array([s.structure == "zincblende" for s in self.packed.systems])
        self.grid_channel: NDArray[np.intp] | None = None
        """Channel of every grid composition, once the gaps were computed over the grid."""

    def gap(self, system_index: NDArray[np.intp], fractions: NDArray[np.float64]
            ) -> tuple[NDArray[np.float64], NDArray[np.intp]]:
        """Gap (eV) and channel of each composition."""
        return band_gap(self.packed, self.tables, system_index, fractions)

    def gap_only(self, system_index: NDArray[np.intp], fractions: NDArray[np.float64]
                 ) -> NDArray[np.float64]:
        """Gap (eV) only; the signature the root finders use."""
        return self.gap(system_index, fractions)[0]

    def roots(self) -> tuple[NDArray[np.intp], NDArray[np.float64], NDArray[np.intp]]:
        """Exact compositions: lattice-matched, target gap, and both (none if not asked for)."""
        if not self.query.exact_roots:
            none = np.zeros(0, dtype=np.intp)
            return none, np.zeros((0, self.space.fractions.shape[1])), none
        systems = np.arange(len(self.packed.systems))
        count = grid_count(self.space.quaternary_step, "quaternary")
        matched = lattice_matched(self.packed, systems, self.a_sub, count)
        parts = [(matched.system_index, matched.fractions,
                  np.full(len(matched.t), _LATTICE_MATCHED))]
        window = self.query.gap
        if window is not None:
            ternary = np.flatnonzero(self.packed.n_edges[self.space.system_index] == 1)
            t_sys, t_frac = self.space.system_index[ternary], self.space.fractions[ternary]
            g_sys, g_frac = gap_roots_on_grid(self.gap_only, t_sys, t_frac,
                                              self.gap_only(t_sys, t_frac), window.target_eV,
                                              self._brackets_within_limit(ternary))
            parts.append((g_sys, g_frac, np.full(len(g_sys), _TARGET_GAP)))
            b_sys, b_frac = gap_roots_on_paths(self.gap_only, self.packed, matched, self.a_sub,
                                               window.target_eV)
            parts.append((b_sys, b_frac, np.full(len(b_sys), _BOTH)))
        system_index, fractions, kind = zip(*parts, strict=True)
        return np.concatenate(system_index), np.concatenate(fractions), np.concatenate(kind)

    def _brackets_within_limit(self, rows: NDArray[np.intp]) -> NDArray[np.bool_] | None:
        """For neighbouring grid rows: can a composition between them meet the mismatch limit?

        Vegard's law is linear along a ternary, so the mismatch between two neighbours lies
        between theirs.
        """
        if self.query.max_mismatch is None:
            return None
        f = self.space.lattice_constant_angstrom[rows] / self.a_sub - 1.0
        low, high = np.minimum(f[:-1], f[1:]), np.maximum(f[:-1], f[1:])
        limit = self.query.max_mismatch + _SLACK
        return (low <= limit) & (high >= -limit)

    def poisson(self, system_index: NDArray[np.intp], fractions: NDArray[np.float64]
                ) -> tuple[NDArray[np.float64], NDArray[np.bool_]]:
        """(001) Poisson ratio of each composition, and whether the default was assumed."""
        return poisson_ratio(self.packed, system_index, fractions)

    def screen(self, sources: list[tuple[NDArray[np.intp], NDArray[np.float64], NDArray[np.intp],
                                         NDArray[np.float64], NDArray[np.intp]]]
               ) -> dict[str, NDArray]:
        """Apply every limit to sets of compositions; the survivors' core columns.

        Each source is (system index, fractions, kind, lattice constant, origin: the row of
        the design space, -1 for an exact root). The compositions are
        screened in slices of ``_CHUNK``, and the survivors' columns joined one at a time, so
        that the temporary arrays stay small whatever the size of the design space.
        """
        parts = [self._screen(*(column[a:a + _CHUNK] for column in source))
                 for source in sources for a in range(0, max(len(source[0]), 1), _CHUNK)]
        return {name: np.concatenate([part.pop(name) for part in parts])
                for name in list(parts[0])}

    def _screen(self, system_index: NDArray[np.intp], fractions: NDArray[np.float64],
                kind: NDArray[np.intp], lattice: NDArray[np.float64], origin: NDArray[np.intp]
                ) -> dict[str, NDArray]:
        query = self.query
        mismatch = lattice / self.a_sub - 1.0
        rows = np.arange(len(system_index))
        if query.max_mismatch is not None:
            rows = np.flatnonzero(np.abs(mismatch) <= query.max_mismatch + _SLACK)
        gaps = {}  # without a gap window, the gaps wait until a reader needs them (gap_of)
        if query.gap is not None:
            if len(rows) == len(system_index):
                gap, channel = self.gap(system_index, fractions)
            else:
                gap, channel = self.gap(system_index[rows], fractions[rows])
            inside = ((gap >= query.gap.low_eV - _SLACK) & (gap <= query.gap.high_eV + _SLACK))
            rows = rows[inside]
            gaps = {"band_gap_eV": gap[inside], "channel": channel[inside]}
        if query.layer_thickness_nm is not None:  # h < h_c exactly when |eps| < eps_c(h)
            a_rows = lattice[rows]
            poisson, _ = self.poisson(system_index[rows], fractions[rows])
            limit = epitaxy.critical_strain(
                query.layer_thickness_nm * epitaxy.ANGSTROM_PER_NM,
                epitaxy.burgers_vector_60(a_rows), poisson, query.geometry)
            below = (self.zincblende[system_index[rows]]
                     & (np.abs(epitaxy.in_plane_strain(a_rows, self.a_sub)) < limit))
            rows = rows[below]
            gaps = {name: value[below] for name, value in gaps.items()}
        if len(rows) == len(system_index):  # every one passed: no copy (joined later)
            return {"system_index": system_index, "fractions": fractions, "kind": kind,
                    "lattice_constant_angstrom": lattice, "mismatch": mismatch,
                    "origin": origin, **gaps}
        return {"system_index": system_index[rows], "fractions": fractions[rows],
                "kind": kind[rows], "lattice_constant_angstrom": lattice[rows],
                "mismatch": mismatch[rows], "origin": origin[rows], **gaps}

    def gap_of(self, columns: dict[str, NDArray], rows: NDArray[np.intp]
               ) -> tuple[NDArray[np.float64], NDArray[np.intp]]:
        """Gap (eV) and channel of some survivors (computed here if the screen did not)."""
        if "channel" not in columns and len(rows) >= _MANY:
            self._fill_gaps(columns)
        if "channel" in columns:
            return columns["band_gap_eV"][rows], columns["channel"][rows]
        parts = [self.gap(columns["system_index"][chunk], columns["fractions"][chunk])
                 for chunk in _chunks(rows)]
        return np.concatenate([p[0] for p in parts]), np.concatenate([p[1] for p in parts])

    def _fill_gaps(self, columns: dict[str, NDArray]) -> None:
        """Add the gap and channel columns of every survivor (the grid's read off the grid)."""
        space, origin = self.space, columns["origin"]
        parts = [self.gap(space.system_index[a:a + _CHUNK], space.fractions[a:a + _CHUNK])
                 for a in range(0, space.size, _CHUNK)]
        self.grid_channel = np.concatenate([p[1] for p in parts])
        gap = np.concatenate([p[0] for p in parts])[origin]
        channel = self.grid_channel[origin]
        roots = np.flatnonzero(origin < 0)
        gap[roots], channel[roots] = self.gap(columns["system_index"][roots],
                                              columns["fractions"][roots])
        columns["band_gap_eV"], columns["channel"] = gap, channel

    def uncertainty(self, columns: dict[str, NDArray], rows: NDArray[np.intp]
                    ) -> tuple[NDArray[np.float64], NDArray[np.bool_]]:
        """Gap uncertainty (eV) of some survivors, and whether a default bowing entered it."""
        def evaluate(system_index: NDArray[np.intp], fractions: NDArray[np.float64],
                     lattice: NDArray[np.float64], channel: NDArray[np.intp],
                     poisson: NDArray[np.float64] | None) -> tuple[NDArray, ...]:
            return gap_uncertainty(self.packed, self.tables, system_index, fractions, channel)

        if len(rows) < _MANY:
            channel = self.gap_of(columns, rows)[1]
            parts = [gap_uncertainty(self.packed, self.tables, columns["system_index"][chunk],
                                     columns["fractions"][chunk], channel[a:a + _CHUNK])
                     for a, chunk in zip(range(0, max(len(rows), 1), _CHUNK), _chunks(rows),
                                         strict=True)]
            return np.concatenate([p[0] for p in parts]), np.concatenate([p[1] for p in parts])
        self.gap_of(columns, rows)
        uncertainty, default = self._evaluated(columns, rows, evaluate)
        return uncertainty, default

    def _evaluated(self, columns: dict[str, NDArray], rows: NDArray[np.intp],
                   evaluate: Callable[..., tuple[NDArray, ...]]) -> tuple[NDArray, ...]:
        """Per-composition columns of some survivors, by ``evaluate``.

        ``evaluate(system_index, fractions, lattice, channel, poisson)`` gives a tuple of
        columns, each row's values depending on that row alone (``poisson``: the grid's Poisson
        ratios, or None where not at hand).

        Few rows are gathered and evaluated in slices of ``_CHUNK``. Many rows are evaluated
        on the design space's own arrays, in contiguous slices grouped by system (no gathering,
        no regrouping), and read back by each row's place in the grid; the exact roots among
        them are evaluated apart.
        """
        origin = columns["origin"][rows]
        grid = origin >= 0
        if len(rows) < _MANY:
            return self._gathered(columns, rows, evaluate)
        space = self.space
        channel = self.grid_channel
        if channel is None:
            channel = np.full(space.size, -1, dtype=np.intp)
        if self.grid_channel is None and "channel" in columns:
            survivors = np.flatnonzero(columns["origin"] >= 0)
            channel[columns["origin"][survivors]] = columns["channel"][survivors]
        parts = [evaluate(space.system_index[a:a + _CHUNK], space.fractions[a:a + _CHUNK],
                          space.lattice_constant_angstrom[a:a + _CHUNK], channel[a:a + _CHUNK],
                          space.poisson_ratio[a:a + _CHUNK])
                 for a in range(0, space.size, _CHUNK)]
        values = []
        for i in range(len(parts[0])):
            on_grid = np.concatenate([part[i] for part in parts])
            value = np.empty(len(rows), dtype=on_grid.dtype)
            value[grid] = on_grid[origin[grid]]
            values.append(value)
        if not grid.all():
            for value, root in zip(values, self._gathered(columns, rows[~grid], evaluate),
                                   strict=True):
                value[~grid] = root
        return tuple(values)

    def _gathered(self, columns: dict[str, NDArray], rows: NDArray[np.intp],
                  evaluate: Callable[..., tuple[NDArray, ...]]) -> tuple[NDArray, ...]:
        """``evaluate`` on the survivors' columns, gathered in slices of ``_CHUNK``."""
        channel = columns.get("channel")
        parts = [evaluate(columns["system_index"][chunk], columns["fractions"][chunk],
                          columns["lattice_constant_angstrom"][chunk],
                          None if channel is None else channel[chunk], None)
                 for chunk in _chunks(rows)]
        return tuple(np.concatenate([part[i] for part in parts]) for i in range(len(parts[0])))

    def details(self, columns: dict[str, NDArray], rows: NDArray[np.intp]
                ) -> dict[str, NDArray]:
        """Every column of a page of survivors (the costly ones computed for those rows only)."""
        page = {name: columns[name][rows] for name in _CORE}
        page["band_gap_eV"], channel = self.gap_of(columns, rows)
        uncertainty, default = self.uncertainty(columns, rows)
        poisson, assumed = self.poisson(page["system_index"], page["fractions"])
        return {**page, "band_gap_uncertainty_eV": uncertainty,
                "valley": VALLEY_NAMES[channel], "default_bowing": default,
                "poisson_ratio": poisson, "poisson_assumed": assumed,
                "critical_thickness_applies": self.zincblende[page["system_index"]],
                "score": columns["score"][rows]}

    def critical_thickness(self, columns: dict[str, NDArray], rows: NDArray[np.intp]
                           ) -> NDArray[np.float64]:
        """Matthews-Blakeslee h_c (nm) of some survivors (NaN where it does not apply)."""
        def evaluate(system_index: NDArray[np.intp], fractions: NDArray[np.float64],
                     lattice: NDArray[np.float64], channel: NDArray[np.intp],
                     poisson: NDArray[np.float64] | None) -> tuple[NDArray, ...]:
            if poisson is None:
                poisson = self.poisson(system_index, fractions)[0]
            h_c = epitaxy.critical_thickness_nm(lattice, self.a_sub, poisson,
                                                self.query.geometry)
            return (np.where(self.zincblende[system_index], h_c, np.nan),)

        return self._evaluated(columns, rows, evaluate)[0]


def _deduplicated(columns: dict[str, NDArray], space: DesignSpace) -> NDArray[np.intp]:
    """Rows to keep, one per composition: the smallest system's, exact roots before grid.

    Returned in the order of the composition keys. The grid rows come ordered by key (and by
    preference among equal keys) with the design space; only the keys that an exact root
    shares are decided here, among the few rows that carry them.
    """
    origin = columns["origin"]
    n_roots = int(np.count_nonzero(origin < 0))  # the roots come first
    column_of = np.full(space.size, -1, dtype=np.intp)
    column_of[origin[n_roots:]] = np.arange(n_roots, len(origin))
    grid = column_of[space.key_order]
    grid = grid[grid >= 0]  # surviving grid rows, by key, preferred first among equal keys
    keys = space.composition_key[origin[grid]]
    first = np.ones(len(grid), dtype=bool)
    first[1:] = keys[1:] != keys[:-1]
    kept, kept_keys = grid[first], keys[first]
    if not n_roots:
        return kept
    systems = space.packed.systems
    root_keys = np.unique(composition_keys(systems, columns["system_index"][:n_roots],
                                           columns["fractions"][:n_roots], space.key_systems))
    low = np.searchsorted(keys, root_keys, side="left")
    high = np.searchsorted(keys, root_keys, side="right")
    counts = high - low  # the grid rows that share each root's key: low .. high - 1
    shared = np.arange(counts.sum()) + np.repeat(low - (np.cumsum(counts) - counts), counts)
    rows = np.concatenate([np.arange(n_roots), np.sort(grid[shared])])
    n_elements = np.array([len(s.elements) for s in systems])[columns["system_index"][rows]]
    order = np.lexsort((-columns["kind"][rows], n_elements))
    row_keys = composition_keys(systems, columns["system_index"][rows],
                                columns["fractions"][rows], space.key_systems)
    unique_keys, best = np.unique(row_keys[order], return_index=True)
    if len(kept):  # kept_keys is sorted and unique: drop those of the roots' keys
        at = np.minimum(np.searchsorted(kept_keys, root_keys), len(kept) - 1)
        shared = at[kept_keys[at] == root_keys]
        kept, kept_keys = np.delete(kept, shared), np.delete(kept_keys, shared)
    return np.insert(kept, np.searchsorted(kept_keys, unique_keys), rows[order[best]])


def _order_keys(columns: dict[str, NDArray], keep: NDArray[np.intp], score: NDArray[np.float64],
                search: _Search, page: Page) -> list[SortKey]:
    """Sort keys of the kept rows in the asked order, primary first, ending with the score."""
    key = page.order
    if key == "rank":
        return [score]
    if key == "formula":  # by system name, then by the fractions in element order
        systems = search.packed.systems
        names = np.argsort(np.argsort([s.name for s in systems]))[columns["system_index"][keep]]
        sign = -1.0 if page.descending else 1.0

        def fraction(column: int) -> Callable[[NDArray[np.intp]], NDArray]:
            return lambda rows: sign * columns["fractions"][keep[rows], column]

        width = columns["fractions"].shape[1]
        return [-names if page.descending else names, *map(fraction, range(width)), score]
    if key == "band_gap_uncertainty_eV":
        values = search.uncertainty(columns, keep)[0]
    elif key == "critical_thickness_nm":
        values = search.critical_thickness(columns, keep)
    elif key == "abs_mismatch":
        values = np.abs(columns["mismatch"][keep])
    elif key == "wavelength_nm":
        gap = search.gap_of(columns, keep)[0]
        values = np.where(gap > 0, HC_EV_NM / np.where(gap > 0, gap, 1.0), np.nan)
    elif key == "band_gap_eV":
        values = search.gap_of(columns, keep)[0]
    else:
        values = columns[key][keep]
    return [*value_keys(values, page.descending), score]


def _systems_by_best_match(system_index: NDArray[np.intp], score: NDArray[np.float64],
                           tie_break: Callable[[NDArray[np.intp]], NDArray]) -> tuple[int, ...]:
    """Indices of the systems with matches, ordered by their best-ranked match."""
    best = np.full(int(system_index.max(initial=-1)) + 1, np.inf)
    np.minimum.at(best, system_index, score)
    tied = np.flatnonzero(score == best[system_index])
    order = tied[np.lexsort((tie_break(tied), score[tied]))]
    _, first = np.unique(system_index[order], return_index=True)
    return tuple(int(s) for s in system_index[order][np.sort(first)])


def find_compositions(query: FinderQuery, page: Page | None = None) -> FinderResult:
    """The matches of a query: every one ranked best first, or one page in an asked order.

    Every composition of the design space is screened either way (the count of matches needs
    it); the costly columns (gap uncertainty, Poisson ratio, critical thickness) are computed
    for the page's rows only, unless the order asks for one of them.

    Args:
        query: The search (system, substrate, gap window, limits, exclusions, grid steps).
        page: Order and slice of the matches returned (default: all, ranked best first).

    Returns:
        The matches asked for; an empty result when nothing meets the query.

    Raises:
        BondgapInputError: A subclass naming what is wrong with the query (out-of-range number,
            unknown element, geometry or order, unreadable system, a named system without data
            or of the other lattice kind than the substrate).
    """
    query.validate()
    page = page or Page()
    page.validate()
    systems, skipped = select_systems(query)
    grid_count(query.ternary_step, "ternary")
    grid_count(query.quaternary_step, "quaternary")
    geometry = epitaxy.misfit_geometry(query.geometry)
    if not systems:
        return FinderResult.empty(query, skipped, geometry)
    space = design_space(systems, query.ternary_step, query.quaternary_step)
    search = _Search(query, space)
    root_sys, root_frac, root_kind = search.roots()
    root_lattice = vegard(space.packed, root_sys, root_frac, space.packed.lattice_a_angstrom)
    columns = search.screen([
        (root_sys, root_frac, root_kind, root_lattice, np.full(len(root_sys), -1)),
        (space.system_index, space.fractions, np.zeros(space.size, dtype=np.intp),
         space.lattice_constant_angstrom, np.arange(space.size))])
    keep = _deduplicated(columns, space)
    gap_term = (np.zeros(len(keep)) if query.gap is None
                else _gap_window_distance(columns["band_gap_eV"][keep], query.gap))
    columns["score"] = np.zeros(len(columns["mismatch"]))
    columns["score"][keep] = np.hypot(gap_term, np.abs(columns["mismatch"][keep])
                                      / query.mismatch_scale)
    score = np.round(columns["score"][keep], _SCORE_DECIMALS)

    def tie_break(rows: NDArray[np.intp]) -> NDArray[np.float64]:
        return search.uncertainty(columns, keep[rows])[0]

    rows = keep[page_rows(_order_keys(columns, keep, score, search, page), tie_break,
                          page.offset, page.stop(len(keep)))]
    return FinderResult(query=query, systems=systems, skipped=skipped,
                        points_screened=space.size + len(root_sys), geometry=geometry,
                        total=len(keep), offset=page.offset,
                        systems_by_rank=_systems_by_best_match(columns["system_index"][keep],
                                                               score, tie_break),
                        **search.details(columns, rows))
