"""Properties of one alloy system at many compositions: lattice constant, gap, epitaxy.

The entry points for a known system or formula; the composition finder evaluates many
systems at once through the same functions of ``screening.alloys.model``.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from screening import epitaxy
from screening.alloys.bandgap import band_gap, gap_tables, gap_uncertainty
from screening.alloys.formula import check_fractions, parse_alloy
from screening.alloys.model import ZERO_COLUMN, pack_systems, vegard
from screening.alloys.systems import AlloySystem, require_measured_data
from screening.alloys.valleys import CHANNELS
from screening.errors import OutOfRangeError, StructureMismatchError

VALLEY_NAMES: NDArray[np.str_] = np.array([*CHANNELS, ""])
"""Valley label per channel index; index -1 (unknown gap) maps to ""."""


def check_temperature(temperature_K: float) -> float:
    """Return the temperature as a float, or raise for a negative or non-finite one.

    Raises:
        OutOfRangeError: T < 0 K or not finite.
    """
    t = float(temperature_K)
    if not math.isfinite(t) or t < 0.0:
        raise OutOfRangeError(f"temperature {temperature_K!r} K: give a finite value >= 0 K")
    return t


@dataclass(frozen=True, eq=False)
class AlloyProperties:
    """One system at many compositions (arrays over compositions).

    Attributes:
        system: The system.
        temperature_K: Temperature of the gaps (K); lattice constants are 300 K values.
        fractions: (ncomposition, nelement) site fractions in system element order.
        lattice_constant_angstrom: Vegard a: cubic a, or the hexagonal in-plane a (A).
        lattice_c_angstrom: Vegard c of a hexagonal alloy (A); NaN for cubic ones.
        band_gap_eV: Gap at temperature_K (eV); NaN where an end point's gap is unknown.
        band_gap_uncertainty_eV: Its uncertainty (eV).
        valley: "Gamma", "X", "L", "fundamental" (valley data missing) or "" (unknown).
        default_bowing: True where an untabulated (default) bowing entered the gap.
        poisson_ratio: (001) Poisson ratio from Vegard-averaged C11, C12.
        poisson_assumed: True where the default Poisson ratio was used.
        gap_sources: Where each bowing parameter or gap law of the system comes from (the
            valleys its gap is the lowest of), one entry per edge and valley.
    """

    system: AlloySystem
    temperature_K: float
    fractions: NDArray[np.float64]
    lattice_constant_angstrom: NDArray[np.float64]
    lattice_c_angstrom: NDArray[np.float64]
    band_gap_eV: NDArray[np.float64]
    band_gap_uncertainty_eV: NDArray[np.float64]
    valley: NDArray[np.str_]
    default_bowing: NDArray[np.bool_]
    poisson_ratio: NDArray[np.float64]
    poisson_assumed: NDArray[np.bool_]
    gap_sources: tuple[str, ...]


def padded_fractions(fractions: ArrayLike) -> NDArray[np.float64]:
    """Site fractions padded with zero columns to the packed width (five columns)."""
    f = np.atleast_2d(np.asarray(fractions, dtype=float))
    out = np.zeros((f.shape[0], ZERO_COLUMN + 1))
    out[:, : f.shape[1]] = f
    return out


def alloy_properties(system: AlloySystem, fractions: ArrayLike, temperature_K: float = 300.0
                     ) -> AlloyProperties:
    """Evaluate one system at many compositions.

    Args:
        system: The system (e.g. from ``parse_system("InGaAsP")``).
        fractions: (ncomposition, nelement) site fractions in :attr:`AlloySystem.elements`
            order, each site summing to one.
        temperature_K: Temperature of the band gaps (K).

    Returns:
        The properties.

    Raises:
        CompositionError: Fractions outside [0, 1] or not summing to one per site.
        MissingDataError: End points without measured lattice constant or gap.
        OutOfRangeError: A negative temperature.
    """
    t = check_temperature(temperature_K)
    require_measured_data(system)
    f = np.atleast_2d(np.asarray(fractions, dtype=float))
    check_fractions(system, f)
    packed = pack_systems((system,))
    tables = gap_tables(packed, t)
    padded = padded_fractions(f)
    index = np.zeros(len(f), dtype=np.intp)
    gap, channel = band_gap(packed, tables, index, padded)
    uncertainty, default = gap_uncertainty(packed, tables, index, padded, channel)
    c11 = vegard(packed, index, padded, packed.c11_GPa)
    c12 = vegard(packed, index, padded, packed.c12_GPa)
    nu, assumed = epitaxy.poisson_ratio_001(c11, c12)
    hexagonal = system.lattice == "hexagonal"
    return AlloyProperties(
        system=system,
        temperature_K=t,
        fractions=f,
        lattice_constant_angstrom=vegard(packed, index, padded, packed.lattice_a_angstrom),
        lattice_c_angstrom=(vegard(packed, index, padded, packed.lattice_c_angstrom)
                            if hexagonal else np.full(len(f), np.nan)),
        band_gap_eV=gap,
        band_gap_uncertainty_eV=uncertainty,
        valley=VALLEY_NAMES[channel],
        default_bowing=default,
        poisson_ratio=nu,
        poisson_assumed=assumed,
        gap_sources=tuple(
            f"{system.binaries[edge.slot_first]}-{system.binaries[edge.slot_second]} "
            f"{CHANNELS[c]}: {tables.sources[0][e][c]}"
            for e, edge in enumerate(system.edges) for c in np.flatnonzero(tables.channel_used[0])
        ),
    )


def formula_properties(text: str, temperature_K: float = 300.0) -> AlloyProperties:
    """Evaluate one alloy formula such as "In0.53Ga0.47As" (arrays of length one)."""
    alloy = parse_alloy(text)
    return alloy_properties(alloy.system, [alloy.fractions], temperature_K)


@dataclass(frozen=True, eq=False)
class EpitaxyResult:
    """A layer on a substrate (arrays over compositions).

    Attributes:
        mismatch: f = (a_layer - a_sub)/a_sub (see ``epitaxy.MISMATCH_CONVENTION``).
        in_plane_strain: (a_sub - a_layer)/a_layer.
        critical_thickness_nm: Matthews-Blakeslee h_c (nm); inf when matched, 0 when no
            thickness above b is stable, NaN for layers where the (001) 60 degree geometry
            does not apply (hexagonal and rocksalt).
        geometry: The geometry factor used.
    """

    mismatch: NDArray[np.float64]
    in_plane_strain: NDArray[np.float64]
    critical_thickness_nm: NDArray[np.float64]
    geometry: epitaxy.MisfitGeometry


def on_substrate(properties: AlloyProperties, substrate: epitaxy.SubstrateSpec,
                 geometry: str = "single-uncapped") -> EpitaxyResult:
    """Mismatch, strain and critical thickness of the alloys on a substrate.

    Raises:
        StructureMismatchError: A cubic layer on a hexagonal substrate or the reverse.
        UnknownChoiceError: An unknown geometry.
    """
    check_lattice(properties.system, substrate)
    a = properties.lattice_constant_angstrom
    h_c = epitaxy.critical_thickness_nm(a, substrate.lattice_a_angstrom,
                                        properties.poisson_ratio, geometry)
    if properties.system.structure != "zincblende":
        h_c = np.full_like(a, np.nan)
    return EpitaxyResult(
        mismatch=epitaxy.lattice_mismatch(a, substrate.lattice_a_angstrom),
        in_plane_strain=epitaxy.in_plane_strain(a, substrate.lattice_a_angstrom),
        critical_thickness_nm=h_c,
        geometry=epitaxy.misfit_geometry(geometry),
    )


def check_lattice(system: AlloySystem, substrate: epitaxy.SubstrateSpec) -> None:
    """Raise unless the layer and the substrate have the same lattice kind.

    Raises:
        StructureMismatchError: A cubic layer on a hexagonal substrate or the reverse.
    """
    if system.lattice != substrate.lattice:
        raise StructureMismatchError(
            f"{system.name} is {system.structure or 'of unknown structure'} ({system.lattice} "
            f"lattice) but substrate {substrate.name} is {substrate.lattice}; cubic layers are "
            "compared with cubic substrates and hexagonal layers with hexagonal ones"
        )
