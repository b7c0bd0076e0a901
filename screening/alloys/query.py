"""What the composition finder is asked: system, substrate, target gap, limits.

Every number is checked here; a value outside its meaningful range raises
:class:`~screening.errors.OutOfRangeError` naming it. A target no alloy reaches is not an
error: the search answers with no matches.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from screening.alloys.systems import ALLOY_FAMILIES
from screening.constants import HC_EV_NM
from screening.elements import atomic_number
from screening.epitaxy import LATTICE_RANGE_ANGSTROM, SubstrateSpec, misfit_geometry
from screening.errors import OutOfRangeError, UnknownChoiceError
from screening.report import MAX_TEMPERATURE_K

LATTICE_KINDS = ("cubic", "hexagonal")
"""Lattice kinds a substrate can have."""

ALL_SYSTEMS = "all"
"""The system name that searches every system of the design space."""

DEFAULT_FAMILIES: tuple[str, ...] = ("III-V", "II-VI")
"""Families searched by "all" unless the query names others (I-VII on request)."""

DEFAULT_MISMATCH_SCALE = 0.01
"""Mismatch that counts as one unit in the ranking score when no limit is given (1 %)."""


def _finite(name: str, value: float, minimum: float, inclusive: bool = True) -> float:
    v = float(value)
    ok = math.isfinite(v) and (v >= minimum if inclusive else v > minimum)
    if not ok:
        bound = f">= {minimum:g}" if inclusive else f"> {minimum:g}"
        raise OutOfRangeError(f"{name} {value!r}: give a finite number {bound}")
    return v


@dataclass(frozen=True)
class GapWindow:
    """The band gaps accepted, and the one aimed at (eV).

    Attributes:
        target_eV: The gap aimed at.
        low_eV: Smallest accepted gap.
        high_eV: Largest accepted gap (inf allowed).
        description: How it was asked, for reports.
    """

    target_eV: float
    low_eV: float
    high_eV: float
    description: str

    @classmethod
    def from_gap(cls, gap_eV: float, tolerance_eV: float) -> GapWindow:
        """Gap +/- tolerance.

        Raises:
            OutOfRangeError: gap <= 0 or tolerance < 0 (or not finite).
        """
        gap = _finite("target gap (eV)", gap_eV, 0.0, inclusive=False)
        tol = _finite("gap tolerance (eV)", tolerance_eV, 0.0)
        return cls(gap, gap - tol, gap + tol, f"gap {gap:g} +/- {tol:g} eV")

    @classmethod
    def from_wavelength(cls, wavelength_nm: float, tolerance_nm: float) -> GapWindow:
        """Photon wavelength +/- tolerance, as gaps hc / (lambda -/+ tolerance).

        Raises:
            OutOfRangeError: wavelength <= 0 or tolerance < 0 (or not finite).
        """
        wavelength = _finite("target wavelength (nm)", wavelength_nm, 0.0, inclusive=False)
        tol = _finite("wavelength tolerance (nm)", tolerance_nm, 0.0)
        high = HC_EV_NM / (wavelength - tol) if tol < wavelength else math.inf
        return cls(HC_EV_NM / wavelength, HC_EV_NM / (wavelength + tol), high,
                   f"wavelength {wavelength:g} +/- {tol:g} nm")


@dataclass(frozen=True)
class FinderQuery:
    """A composition search.

    Attributes:
        substrate: The substrate (from ``epitaxy.substrate_spec`` or the user's own).
        system: An alloy system without numbers ("InGaAs", "InGaAsP") or "all".
        gap: Accepted gaps, or None for any gap.
        temperature_K: Temperature of the gaps (K).
        max_mismatch: Largest accepted |f| (fraction, 0.001 = 0.1 %), or None.
        layer_thickness_nm: A layer thickness that must stay below the critical thickness, or
            None.
        exclude_elements: Element symbols no match may contain.
        geometry: Matthews-Blakeslee geometry (a key of ``epitaxy.GEOMETRIES``).
        ternary_step: Grid step of ternaries.
        quaternary_step: Grid step of quaternaries.
        families: Families searched when ``system`` is "all".
        exact_roots: Add the exact lattice-matched and target-gap compositions to the grid
            (default); False screens the grid only.
    """

    substrate: SubstrateSpec
    system: str = ALL_SYSTEMS
    gap: GapWindow | None = None
    temperature_K: float = 300.0
    max_mismatch: float | None = None
    layer_thickness_nm: float | None = None
    exclude_elements: tuple[str, ...] = ()
    geometry: str = "single-uncapped"
    ternary_step: float = 0.001
    quaternary_step: float = 0.005
    families: tuple[str, ...] = DEFAULT_FAMILIES
    exact_roots: bool = True

    def validate(self) -> None:
        """Check every number and name of the query.

        Raises:
            OutOfRangeError: A number outside its range.
            UnknownElementError: An excluded element that is not an element.
            UnknownChoiceError: An unknown geometry.
        """
        _finite("temperature (K)", self.temperature_K, 0.0)
        if self.temperature_K > MAX_TEMPERATURE_K:
            raise OutOfRangeError(f"temperature {self.temperature_K:g} K: give 0 to "
                                  f"{MAX_TEMPERATURE_K:g} K (the gap laws are fitted up to there)")
        if self.substrate.lattice not in LATTICE_KINDS:
            raise UnknownChoiceError(
                f"substrate lattice {self.substrate.lattice!r}: choose one of "
                f"{', '.join(LATTICE_KINDS)}"
            )
        _finite("substrate lattice constant (A)", self.substrate.lattice_a_angstrom, 0.0,
                inclusive=False)
        low, high = LATTICE_RANGE_ANGSTROM
        if not low <= self.substrate.lattice_a_angstrom <= high:
            raise OutOfRangeError(f"substrate lattice constant "
                                  f"{self.substrate.lattice_a_angstrom:g} A: give {low:g} to "
                                  f"{high:g} A")
        if self.max_mismatch is not None:
            _finite("mismatch limit", self.max_mismatch, 0.0)
        if self.layer_thickness_nm is not None:
            _finite("layer thickness (nm)", self.layer_thickness_nm, 0.0, inclusive=False)
        for symbol in self.exclude_elements:
            atomic_number(symbol)
        misfit_geometry(self.geometry)
        unknown = set(self.families) - set(ALLOY_FAMILIES)
        if unknown:
            raise OutOfRangeError(
                f"unknown families {sorted(unknown)}; choose from {', '.join(ALLOY_FAMILIES)}"
            )

    @property
    def mismatch_scale(self) -> float:
        """Mismatch counted as one unit in the ranking score."""
        if self.max_mismatch:
            return self.max_mismatch
        return DEFAULT_MISMATCH_SCALE
