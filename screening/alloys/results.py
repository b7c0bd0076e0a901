"""Results of the composition finder: ranked matches as arrays, and one record per match.

``AlloyMatch.as_dict()`` gives exactly the keys the app prints: ``formula``, ``fractions``
(element -> fraction on its site), ``lattice_constant_angstrom``, ``mismatch`` (fraction,
sign convention ``epitaxy.MISMATCH_CONVENTION``), ``band_gap_eV``, ``band_gap_uncertainty_eV``,
``critical_thickness_nm``. Numbers that JSON cannot hold become null: an unknown gap, and a
critical thickness that is infinite (lattice-matched) or not defined (the (001) 60 degree
geometry applies to zincblende layers only).
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from functools import cached_property
from typing import Any

import numpy as np
from numpy.typing import NDArray

from screening.alloys.formula import format_alloy
from screening.alloys.query import FinderQuery
from screening.alloys.sites import system_name
from screening.alloys.systems import AlloySystem
from screening.epitaxy import MISMATCH_CONVENTION, MisfitGeometry, critical_thickness_nm

MATCH_KINDS: tuple[str, ...] = ("grid", "lattice-matched", "target-gap",
                                "lattice-matched target-gap")
"""How a match was found: a grid point, or an exact root (of a(x) = a_sub, of E(x) = target,
or of both along the lattice-matched line)."""

JSON_KEYS: tuple[str, ...] = ("formula", "fractions", "lattice_constant_angstrom", "mismatch",
                              "band_gap_eV", "band_gap_uncertainty_eV", "critical_thickness_nm")

_FRACTION_DECIMALS = 10


def _json_number(value: float) -> float | None:
    return float(value) if math.isfinite(value) else None


@dataclass(frozen=True)
class AlloyMatch:
    """One composition that satisfies a query.

    Attributes:
        formula: Usual notation, e.g. "In0.532Ga0.468As".
        fractions: Element -> fraction on its site (the elements present).
        lattice_constant_angstrom: Vegard lattice constant (cubic a or hexagonal in-plane a).
        mismatch: f = (a_layer - a_sub)/a_sub (fraction).
        band_gap_eV: Gap at the query temperature.
        band_gap_uncertainty_eV: Its uncertainty.
        critical_thickness_nm: Matthews-Blakeslee h_c (inf matched; NaN not applicable).
        system: Name of the elements present ("InGaAs"; a binary's formula at an end point).
        kind: One of :data:`MATCH_KINDS`.
        valley: Valley of the gap ("Gamma", "X", "L", "fundamental").
        default_bowing: True where a default (untabulated) bowing entered the gap.
        poisson_assumed: True where the default Poisson ratio entered h_c.
        score: Ranking score (lower is better).
    """

    formula: str
    fractions: dict[str, float]
    lattice_constant_angstrom: float
    mismatch: float
    band_gap_eV: float
    band_gap_uncertainty_eV: float
    critical_thickness_nm: float
    system: str
    kind: str
    valley: str
    default_bowing: bool
    poisson_assumed: bool
    score: float

    def as_dict(self) -> dict[str, Any]:
        """The JSON record: exactly :data:`JSON_KEYS`; non-finite numbers become None."""
        return {
            "formula": self.formula,
            "fractions": dict(self.fractions),
            "lattice_constant_angstrom": _json_number(self.lattice_constant_angstrom),
            "mismatch": _json_number(self.mismatch),
            "band_gap_eV": _json_number(self.band_gap_eV),
            "band_gap_uncertainty_eV": _json_number(self.band_gap_uncertainty_eV),
            "critical_thickness_nm": _json_number(self.critical_thickness_nm),
        }


@dataclass(frozen=True, eq=False)
class FinderResult:
    """The matches of a query asked for: every one ranked best first, or one page of them.

    Attributes:
        query: The query.
        systems: Systems screened (indexed by ``system_index``).
        skipped: (system, reason) for systems of the design space left out.
        points_screened: Grid points plus exact roots evaluated.
        system_index: (nmatch,) index into ``systems``.
        fractions: (nmatch, 5) site fractions in each system's element order.
        kind: (nmatch,) index into :data:`MATCH_KINDS`.
        lattice_constant_angstrom, mismatch, band_gap_eV, band_gap_uncertainty_eV,
        poisson_ratio, score: (nmatch,) values.
        valley: (nmatch,) valley names.
        default_bowing, poisson_assumed: (nmatch,) flags.
        critical_thickness_applies: (nmatch,) True for zincblende layers, where the (001)
            60 degree Matthews-Blakeslee geometry holds.
        geometry: The Matthews-Blakeslee geometry used.
        total: How many compositions match (None: as many as held, no page was asked).
        offset: Position of the first match held among all matches in the asked order.
        systems_by_rank: Indices into ``systems`` of the systems with matches, ordered by
            their best-ranked match (empty when not computed).
    """

    query: FinderQuery
    systems: tuple[AlloySystem, ...]
    skipped: tuple[tuple[str, str], ...]
    points_screened: int
    system_index: NDArray[np.intp]
    fractions: NDArray[np.float64]
    kind: NDArray[np.intp]
    lattice_constant_angstrom: NDArray[np.float64]
    mismatch: NDArray[np.float64]
    band_gap_eV: NDArray[np.float64]
    band_gap_uncertainty_eV: NDArray[np.float64]
    valley: NDArray[np.str_]
    default_bowing: NDArray[np.bool_]
    poisson_ratio: NDArray[np.float64]
    poisson_assumed: NDArray[np.bool_]
    critical_thickness_applies: NDArray[np.bool_]
    score: NDArray[np.float64]
    geometry: MisfitGeometry
    mismatch_convention: str = MISMATCH_CONVENTION
    total: int | None = None
    offset: int = 0
    systems_by_rank: tuple[int, ...] = ()

    def __len__(self) -> int:
        return len(self.system_index)

    @property
    def match_count(self) -> int:
        """How many compositions match the query (held here or not)."""
        return len(self) if self.total is None else self.total

    @classmethod
    def empty(cls, query: FinderQuery, skipped: tuple[tuple[str, str], ...],
              geometry: MisfitGeometry) -> FinderResult:
        """A result without matches (no system to screen)."""
        none = np.zeros(0)
        flags = np.zeros(0, dtype=bool)
        return cls(query=query, systems=(), skipped=skipped, points_screened=0,
                   system_index=np.zeros(0, dtype=np.intp), fractions=np.zeros((0, 5)),
                   kind=np.zeros(0, dtype=np.intp), lattice_constant_angstrom=none,
                   mismatch=none, band_gap_eV=none, band_gap_uncertainty_eV=none,
                   valley=np.zeros(0, dtype=str), default_bowing=flags, poisson_ratio=none,
                   poisson_assumed=flags, critical_thickness_applies=flags, score=none,
                   geometry=geometry, total=0)

    def critical_thickness_of(self, rows: slice | NDArray[np.intp]) -> NDArray[np.float64]:
        """Matthews-Blakeslee h_c (nm) of some matches: inf matched, NaN not applicable."""
        h_c = critical_thickness_nm(self.lattice_constant_angstrom[rows],
                                    self.query.substrate.lattice_a_angstrom,
                                    self.poisson_ratio[rows], self.geometry.name)
        return np.where(self.critical_thickness_applies[rows], h_c, np.nan)

    @cached_property
    def critical_thickness_nm(self) -> NDArray[np.float64]:
        """(nmatch,) Matthews-Blakeslee h_c (nm) of every match (computed when first read)."""
        return self.critical_thickness_of(slice(None))

    def matches(self, limit: int | None = None) -> tuple[AlloyMatch, ...]:
        """The best ``limit`` matches (all by default) as records, best first."""
        count = len(self) if limit is None else min(limit, len(self))
        h_c = self.critical_thickness_of(slice(0, count))
        records = []
        for i in range(count):  # builds records for the matches asked for, not the grid
            system = self.systems[self.system_index[i]]
            values = self.fractions[i, : len(system.elements)]
            present = {e: round(float(v), _FRACTION_DECIMALS)
                       for e, v in zip(system.elements, values, strict=True) if v > 0.0}
            records.append(AlloyMatch(
                formula=format_alloy(system, values),
                fractions=present,
                lattice_constant_angstrom=float(self.lattice_constant_angstrom[i]),
                mismatch=float(self.mismatch[i]),
                band_gap_eV=float(self.band_gap_eV[i]),
                band_gap_uncertainty_eV=float(self.band_gap_uncertainty_eV[i]),
                critical_thickness_nm=float(h_c[i]),
                system=system_name([e for e in system.cations if e in present],
                                   [e for e in system.anions if e in present]),
                kind=MATCH_KINDS[self.kind[i]],
                valley=str(self.valley[i]),
                default_bowing=bool(self.default_bowing[i]),
                poisson_assumed=bool(self.poisson_assumed[i]),
                score=float(self.score[i]),
            ))
        return tuple(records)

    def as_dicts(self, limit: int | None = None) -> list[dict[str, Any]]:
        """JSON records of the best ``limit`` matches."""
        return [match.as_dict() for match in self.matches(limit)]
