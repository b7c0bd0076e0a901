"""Exact compositions: lattice-matched ones, and those with exactly the target gap.

* Ternary lattice match: Vegard's law is linear in x, so a(x) = a_sub has the single root
  x = (a_sub - a_0) / (a_1 - a_0) where it lies in [0, 1].
* Quaternary lattice match: Vegard's law is linear in the two free fractions of one site when
  the rest is held, so for every grid value of a *driver* fraction the lattice-matched value of
  the other is solved exactly. Paths: A(x)B(1-x)C(y)D(1-y) driven by x (solving y) and by y
  (solving x); A(x)B(y)C(1-x-y)D driven by each of the three fractions in turn.
* Target gap: along a ternary's grid, and along each lattice-matched path, a sign change of
  gap - target between neighbouring points brackets a root, refined by regula falsi (Illinois
  variant) to :data:`ROOT_TOLERANCE` in the fraction. The gap is the lowest valley, which is
  continuous, so a bracketed method also holds across a valley crossover.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from screening.alloys.design import simplex_grid
from screening.alloys.model import ZERO_COLUMN, PackedSystems, vegard

ROOT_STEPS = 60
"""Most refinement steps of a bracket."""

ROOT_TOLERANCE = 1e-13
"""Width (in the bracket's own variable, a fraction) below which a root counts as found."""

RESIDUAL_TOLERANCE_EV = 1e-12
"""|gap - target| (eV) below which a root counts as found."""

VERIFY_TOLERANCE_EV = 1e-9
"""A refined root is kept only if its gap is within this of the target (eV)."""

_EDGE = 1e-12


def _onehot(position: NDArray[np.intp]) -> NDArray[np.float64]:
    return (np.arange(ZERO_COLUMN + 1) == position[:, None]).astype(float)


@dataclass(frozen=True, eq=False)
class Paths:
    """Straight lines through compositions, one per row, on which Vegard's law is linear.

    A point of path p at driver value t and free value s has the fractions
    base_p + t onehot(d1_p) + (t0_p - t) onehot(d2_p) + s onehot(e1_p) + (r0_p - r1_p t - s)
    onehot(e2_p), where d1 and d2 may be the zero column (no driver, or no partner; whatever
    lands there is cleared) and r1 is 0 or 1.
    """

    system_index: NDArray[np.intp]
    base: NDArray[np.float64]
    d1: NDArray[np.intp]
    d2: NDArray[np.intp]
    t0: NDArray[np.float64]
    e1: NDArray[np.intp]
    e2: NDArray[np.intp]
    r0: NDArray[np.float64]
    r1: NDArray[np.float64]

    def remainder(self, t: NDArray[np.float64]) -> NDArray[np.float64]:
        """Share of the free pair at driver value t."""
        return self.r0 - self.r1 * t

    def point(self, t: NDArray[np.float64], s: NDArray[np.float64]) -> NDArray[np.float64]:
        """Fractions (npath, 5) at driver t and free value s."""
        fractions = (self.base + t[:, None] * _onehot(self.d1)
                     + (self.t0 - t)[:, None] * _onehot(self.d2)
                     + s[:, None] * _onehot(self.e1)
                     + (self.remainder(t) - s)[:, None] * _onehot(self.e2))
        fractions[:, ZERO_COLUMN] = 0.0
        return fractions

    def matched(self, packed: PackedSystems, t: NDArray[np.float64], a_sub: float
                ) -> NDArray[np.float64]:
        """Free value s that makes the Vegard lattice constant equal a_sub (NaN: none)."""
        r = self.remainder(t)
        a0 = vegard(packed, self.system_index, self.point(t, np.zeros_like(t)),
                    packed.lattice_a_angstrom)
        a1 = vegard(packed, self.system_index, self.point(t, r), packed.lattice_a_angstrom)
        with np.errstate(divide="ignore", invalid="ignore"):
            s = r * (a_sub - a0) / (a1 - a0)
        inside = (s >= -_EDGE) & (s <= r + _EDGE) & (r >= -_EDGE)
        return np.where(inside, np.clip(s, 0.0, np.maximum(r, 0.0)), np.nan)


def _paths(packed: PackedSystems, system_ids: NDArray[np.intp]) -> Paths:
    """Every lattice-matching path family of the given systems (loop over systems)."""
    rows: list[tuple[int, NDArray[np.float64], int, int, float, int, int, float, float]] = []
    for s in system_ids:
        system = packed.systems[s]
        n_cat = len(system.cations)
        sites = [list(range(n_cat)), list(range(n_cat, len(system.elements)))]
        base = np.zeros(ZERO_COLUMN + 1)
        for site in sites:
            if len(site) == 1:
                base[site[0]] = 1.0
        mixed = [site for site in sites if len(site) > 1]
        if len(mixed) == 1 and len(mixed[0]) == 2:  # ternary: s is the fraction itself
            rows.append((s, base, ZERO_COLUMN, ZERO_COLUMN, 0.0, *mixed[0], 1.0, 0.0))
        elif len(mixed) == 2:  # one site drives, the other is solved
            for drive, free in ((mixed[0], mixed[1]), (mixed[1], mixed[0])):
                rows.append((s, base, drive[0], drive[1], 1.0, free[0], free[1], 1.0, 0.0))
        else:  # three elements on one site: one drives, the other two share the rest
            site = mixed[0]
            for k in range(3):
                d, e1, e2 = site[k], site[(k + 1) % 3], site[(k + 2) % 3]
                rows.append((s, base, d, ZERO_COLUMN, 0.0, e1, e2, 1.0, 1.0))
    columns = list(zip(*rows, strict=True)) if rows else [()] * 9
    return Paths(
        system_index=np.array(columns[0], dtype=np.intp),
        base=np.array(columns[1]).reshape(-1, ZERO_COLUMN + 1),
        d1=np.array(columns[2], dtype=np.intp), d2=np.array(columns[3], dtype=np.intp),
        t0=np.array(columns[4], dtype=float),
        e1=np.array(columns[5], dtype=np.intp), e2=np.array(columns[6], dtype=np.intp),
        r0=np.array(columns[7], dtype=float), r1=np.array(columns[8], dtype=float),
    )


@dataclass(frozen=True, eq=False)
class MatchedPoints:
    """Lattice-matched compositions along paths (rows ordered by path, then driver value).

    Attributes:
        paths: The paths, repeated once per driver value.
        path_id: (npoint,) which original path each row lies on.
        t: (npoint,) driver value.
        s: (npoint,) solved free value.
    """

    paths: Paths
    path_id: NDArray[np.intp]
    t: NDArray[np.float64]
    s: NDArray[np.float64]

    @property
    def fractions(self) -> NDArray[np.float64]:
        """(npoint, 5) site fractions."""
        return self.paths.point(self.t, self.s)

    @property
    def system_index(self) -> NDArray[np.intp]:
        """(npoint,) system of each point."""
        return self.paths.system_index


def _take(paths: Paths, rows: NDArray[np.intp]) -> Paths:
    return Paths(**{name: getattr(paths, name)[rows] for name in Paths.__dataclass_fields__})


def lattice_matched(packed: PackedSystems, system_ids: NDArray[np.intp], a_sub: float,
                    count: int) -> MatchedPoints:
    """Exactly lattice-matched compositions of the given systems.

    Args:
        packed: The packed systems.
        system_ids: Systems to solve (indices into ``packed.systems``).
        a_sub: Substrate lattice constant (A), in the systems' lattice kind.
        count: Grid intervals of the driver values of quaternaries (1/step).

    Returns:
        One point per ternary with a root, and for quaternaries one per driver grid value with a
        root, ordered along each path.
    """
    base = _paths(packed, np.asarray(system_ids, dtype=np.intp))
    ternary = (base.d1 == ZERO_COLUMN)
    drivers = simplex_grid(2, count)[:, 0]
    per_path = np.where(ternary, 1, len(drivers))
    path_id = np.repeat(np.arange(len(ternary)), per_path)
    position = np.arange(len(path_id)) - np.repeat(np.cumsum(per_path) - per_path, per_path)
    t = np.where(ternary[path_id], 0.0, drivers[np.minimum(position, len(drivers) - 1)])
    paths = _take(base, path_id)
    s = paths.matched(packed, t, a_sub)
    keep = np.isfinite(s)
    return MatchedPoints(_take(paths, np.flatnonzero(keep)), path_id[keep], t[keep], s[keep])


GapFunction = Callable[[NDArray[np.intp], NDArray[np.float64]], NDArray[np.float64]]
"""(system index, fractions (n, 5)) -> gap (eV)."""


Residual = Callable[[NDArray[np.float64], NDArray[np.intp]], NDArray[np.float64]]
"""(values, rows) -> gap - target (eV) at those values of the brackets ``rows``."""


def _bracketed_root(values_at: Residual, low: NDArray[np.float64], high: NDArray[np.float64]
                    ) -> NDArray[np.float64]:
    """Roots inside sign-changing brackets by the Illinois variant of regula falsi.

    Superlinear and always bracketed: a crossover of valleys (a kink) inside the bracket only
    slows it. A bracket is done when its residual is below :data:`RESIDUAL_TOLERANCE_EV` or
    it is narrower than :data:`ROOT_TOLERANCE`; at most :data:`ROOT_STEPS` steps. Only the
    brackets not yet done are evaluated at each step.
    """
    low, high = low.copy(), high.copy()
    everything = np.arange(len(low))
    f_low, f_high = values_at(low, everything), values_at(high, everything)
    best = np.where(np.abs(f_low) <= np.abs(f_high), low, high)
    f_best = np.minimum(np.abs(f_low), np.abs(f_high))
    retained = np.zeros(len(low), dtype=np.int8)  # +1: low kept last step, -1: high kept
    for _ in range(ROOT_STEPS):
        rows = np.flatnonzero((f_best >= RESIDUAL_TOLERANCE_EV) & (high - low >= ROOT_TOLERANCE))
        if not len(rows):
            break
        lo, hi, f_lo, f_hi = low[rows], high[rows], f_low[rows], f_high[rows]
        span = f_hi - f_lo
        guess = np.divide(lo * f_hi - hi * f_lo, span, out=0.5 * (lo + hi), where=span != 0.0)
        guess = np.where((guess > lo) & (guess < hi), guess, 0.5 * (lo + hi))
        f_guess = values_at(guess, rows)
        improved = np.abs(f_guess) < f_best[rows]
        best[rows] = np.where(improved, guess, best[rows])
        f_best[rows] = np.where(improved, np.abs(f_guess), f_best[rows])
        keep_low = np.signbit(f_guess) == np.signbit(f_lo)  # the root lies in [guess, hi]
        f_hi = np.where(keep_low & (retained[rows] == -1), 0.5 * f_hi, f_hi)
        f_lo = np.where(~keep_low & (retained[rows] == 1), 0.5 * f_lo, f_lo)
        low[rows], f_low[rows] = np.where(keep_low, guess, lo), np.where(keep_low, f_guess, f_lo)
        high[rows] = np.where(keep_low, hi, guess)
        f_high[rows] = np.where(keep_low, f_hi, f_guess)
        retained[rows] = np.where(keep_low, -1, 1)
    return best


def _brackets(key: NDArray[np.intp], residual: NDArray[np.float64]) -> NDArray[np.intp]:
    """Rows i where residual changes sign (or hits zero) between rows i and i + 1 of one key."""
    same = key[1:] == key[:-1]
    finite = np.isfinite(residual[1:]) & np.isfinite(residual[:-1])
    crossing = np.signbit(residual[1:]) != np.signbit(residual[:-1])
    return np.flatnonzero(same & finite & (crossing | (residual[:-1] == 0.0)))


def gap_roots_on_grid(gap_of: GapFunction, system_index: NDArray[np.intp],
                      fractions: NDArray[np.float64], gap: NDArray[np.float64],
                      target_eV: float, allowed: NDArray[np.bool_] | None = None
                      ) -> tuple[NDArray[np.intp], NDArray[np.float64]]:
    """Ternary compositions with exactly the target gap, bracketed by neighbouring grid rows.

    Args:
        gap_of: Gap function.
        system_index: (n,) systems of a ternary grid, rows ordered along x within a system.
        fractions: (n, 5) the grid's fractions.
        gap: (n,) gaps at the grid points.
        target_eV: Target gap.
        allowed: (n - 1,) optional: False for brackets (row i, row i + 1) not worth refining
            (e.g. wholly outside a mismatch limit).

    Returns:
        (system index, fractions) of the roots.
    """
    rows = _brackets(system_index, gap - target_eV)
    if allowed is not None:
        rows = rows[allowed[rows]]
    lo, hi = fractions[rows], fractions[rows + 1]
    systems = system_index[rows]

    def residual(w: NDArray[np.float64], rows: NDArray[np.intp]) -> NDArray[np.float64]:
        start, step = lo[rows], hi[rows] - lo[rows]
        return gap_of(systems[rows], start + w[:, None] * step) - target_eV

    w = _bracketed_root(residual, np.zeros(len(rows)), np.ones(len(rows)))
    roots = lo + w[:, None] * (hi - lo)
    return _verified(gap_of, systems, roots, target_eV)


def gap_roots_on_paths(gap_of: GapFunction, packed: PackedSystems, matched: MatchedPoints,
                       a_sub: float, target_eV: float
                       ) -> tuple[NDArray[np.intp], NDArray[np.float64]]:
    """Lattice-matched quaternary compositions with exactly the target gap.

    Args:
        gap_of: Gap function.
        packed: The packed systems.
        matched: Lattice-matched points ordered along their paths.
        a_sub: Substrate lattice constant (A).
        target_eV: Target gap.

    Returns:
        (system index, fractions) of the roots (still lattice-matched).
    """
    quaternary = matched.paths.d1 != ZERO_COLUMN
    gap = np.where(quaternary, gap_of(matched.system_index, matched.fractions), np.nan)
    rows = _brackets(matched.path_id, gap - target_eV)
    paths = _take(matched.paths, rows)

    def residual(t: NDArray[np.float64], rows: NDArray[np.intp]) -> NDArray[np.float64]:
        some = _take(paths, rows)
        return gap_of(some.system_index, some.point(t, some.matched(packed, t, a_sub))) \
            - target_eV

    t = _bracketed_root(residual, matched.t[rows], matched.t[rows + 1])
    s = paths.matched(packed, t, a_sub)
    keep = np.isfinite(s)
    return _verified(gap_of, paths.system_index[keep], paths.point(t[keep], s[keep]), target_eV)


def _verified(gap_of: GapFunction, system_index: NDArray[np.intp],
              fractions: NDArray[np.float64], target_eV: float
              ) -> tuple[NDArray[np.intp], NDArray[np.float64]]:
    """Keep the roots whose gap is the target to :data:`VERIFY_TOLERANCE_EV`.

    A bracket that spans a stretch without a lattice-matched solution, or a gap that jumps
    (an end point without data), can leave a refined point that is not a root.
    """
    ok = np.abs(gap_of(system_index, fractions) - target_eV) <= VERIFY_TOLERANCE_EV
    return system_index[ok], fractions[ok]
