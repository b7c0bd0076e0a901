"""Evaluate every model for every catalogue compound at once (vectorised over compounds).

Data flow: measured reference data (`screening.reference`) and atomic term values
(`screening.atoms`) in; arrays of model results out. The models use the measured
nearest-neighbour distance in the compound's ambient structure where one is known, else the
tetrahedral-radii estimate (`screening.radii`); every compound also gets a lattice constant
estimated from that estimate (`screening.lattice_estimate`).
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache

import numpy as np
from numpy.typing import NDArray

from screening import phillips, structure
from screening.atoms import term_values
from screening.catalogue import catalogue
from screening.coordination import BORDERLINE_HALF_WIDTH, predicted_coordination
from screening.elements import VALENCE, has_filled_inner_d, period
from screening.formula import Compound
from screening.harrison import BondOrbitals, bond_orbitals
from screening.lattice_estimate import LatticeEstimate, estimate_lattice
from screening.phillips import HomopolarLaw, PhillipsCalibration, PhillipsResult
from screening.radii import RadiusFit, fit_radii
from screening.reference import Measured, measured_compounds

CALIBRATION = PhillipsCalibration()
"""The one place where the Phillips-Van Vechten calibration constants are chosen."""


@dataclass(frozen=True)
class CatalogueTable:
    """Model results for every catalogue compound; arrays are in catalogue order."""

    compounds: tuple[Compound, ...]
    measured: tuple[dict[str, Measured], ...]
    structure: NDArray[np.object_]
    lattice_constant_angstrom: NDArray[np.float64]
    lattice_c_angstrom: NDArray[np.float64]
    bond_length_measured_angstrom: NDArray[np.float64]
    bond_length_estimated_angstrom: NDArray[np.float64]
    bond_length_used_angstrom: NDArray[np.float64]
    volume_per_pair_angstrom3: NDArray[np.float64]
    eps_inf: NDArray[np.float64]
    homopolar_law: HomopolarLaw
    spectroscopic: PhillipsResult
    predictive: PhillipsResult
    bonds: BondOrbitals
    coordination_predicted: NDArray[np.object_]
    coordination_route: NDArray[np.object_]
    coordination_observed: NDArray[np.object_]
    radius_fit: RadiusFit
    lattice_estimate: LatticeEstimate

    def index(self, formula: str) -> int:
        """Position of a normalised formula in the table."""
        return [c.formula for c in self.compounds].index(formula)


def _number(measured: dict[str, Measured], key: str) -> float:
    item = measured.get(key)
    return float(item.value) if item is not None else float("nan")


def _text(measured: dict[str, Measured], key: str) -> str | None:
    item = measured.get(key)
    return str(item.value) if item is not None else None


def _measured_geometry(data: dict[str, Measured]) -> tuple[str, float, float]:
    """Return (structure used for geometry, a, c) of a compound.

    Where the ambient structure is 'other', a measured zincblende polytype gives the geometry.
    """
    ambient = _text(data, "structure") or "other"
    a, c = _number(data, "lattice_a"), _number(data, "lattice_c")
    if ambient == "other" and "zincblende_lattice_a" in data:
        return "zincblende", _number(data, "zincblende_lattice_a"), float("nan")
    return ambient, a, c


def _observed_coordination(data: dict[str, Measured], ambient: str | None) -> str | None:
    stated = _text(data, "coordination")
    if stated is not None:
        return stated
    if ambient in structure.TETRAHEDRAL:
        return "fourfold"
    if ambient in structure.OCTAHEDRAL:
        return "sixfold"
    return None


def _element_crystal(data: dict[str, Measured]) -> tuple[float, float]:
    """(bond length in A, volume per atom pair in A^3) of an element's measured crystal."""
    geometry, a, c = _measured_geometry(data)
    return (float(structure.bond_length(geometry, a, c)),
            float(structure.volume_per_pair(geometry, a, c)))


def homopolar_law(measured: dict[str, dict[str, Measured]]) -> HomopolarLaw:
    """Phillips' Eh(d) through diamond and Si, from their measured eps_inf (see `phillips`)."""
    crystals = [_element_crystal(measured[symbol]) for symbol in ("C", "Si")]
    return phillips.homopolar_law_of_elements(
        [d for d, _ in crystals], [v for _, v in crystals],
        [_number(measured[symbol], "eps_inf") for symbol in ("C", "Si")])


def d_factors(measured: dict[str, dict[str, Measured]], compounds: tuple[Compound, ...]
               ) -> NDArray[np.float64]:
    """Van Vechten's d-electron factor D per compound (calibration, see `phillips`)."""
    law = homopolar_law(measured)

    def element_d(symbol: str) -> float:
        d, _ = _element_crystal(measured[symbol])
        return phillips.d_factor_of_element(_number(measured[symbol], "eps_inf"), d, law)

    d4, d5 = element_d("Ge"), element_d("Sn")
    def atom_d(symbol: str) -> float:
        if not has_filled_inner_d(symbol):
            return 1.0
        return float(phillips.row_d_factor(period(symbol), d4, d5,
                                           CALIBRATION.d_row6_extrapolated))
    d_cat = np.array([atom_d(c.cation) for c in compounds])
    d_an = np.array([atom_d(c.anion) for c in compounds])
    dz = np.array([VALENCE[c.anion] - VALENCE[c.cation] for c in compounds])
    return phillips.compound_d_factor(d_cat, d_an, dz, CALIBRATION.d_reduction_z)


def period_radii(measured: dict[str, dict[str, Measured]]) -> dict[int, float]:
    """Covalent radius of each period: half the bond length of its group-IV crystal (A)."""
    radii = {}
    for row, symbol in ((2, "C"), (3, "Si"), (4, "Ge"), (5, "Sn")):
        radii[row] = _element_crystal(measured[symbol])[0] / 2.0
    radii[6] = CALIBRATION.period_radius_pb_angstrom
    return radii


@lru_cache(maxsize=1)
def catalogue_table() -> CatalogueTable:
    """Evaluate every model for the whole catalogue (cached: computed once per process)."""
    compounds = catalogue()
    reference = measured_compounds()
    measured = tuple(reference.get(c.formula, {}) for c in compounds)
    geometry = [_measured_geometry(m) for m in measured]
    geo_structure = np.array([g[0] for g in geometry], dtype=object)
    a = np.array([g[1] for g in geometry])
    c = np.array([g[2] for g in geometry])
    with np.errstate(invalid="ignore"):
        d_measured = structure.bond_length(geo_structure.astype(str), a, c)
        volume_measured = structure.volume_per_pair(geo_structure.astype(str), a, c)
    known = np.isfinite(d_measured)
    sixfold = np.isin(geo_structure.astype(str), structure.OCTAHEDRAL)
    cations = [x.cation for x in compounds]
    anions = [x.anion for x in compounds]
    fit = fit_radii(
        [x.formula for x, k in zip(compounds, known, strict=True) if k],
        [x for x, k in zip(cations, known, strict=True) if k],
        [x for x, k in zip(anions, known, strict=True) if k],
        d_measured[known], sixfold[known], sorted(set(cations) | set(anions)),
    )
    d_estimated = fit.estimate(cations, anions)
    d_used = np.where(known, d_measured, d_estimated)
    volume = np.where(known, volume_measured, structure.tetrahedral_volume_per_pair(d_used))
    eps_inf = np.array([_number(m, "eps_inf") for m in measured])

    law = homopolar_law(reference)
    spectro = phillips.spectroscopic(d_used, volume, eps_inf, d_factors(reference, compounds),
                                     law)
    row_radius = period_radii(reference)
    predictive = phillips.predictive(
        d_used, volume,
        [VALENCE[x] for x in cations], [VALENCE[x] for x in anions],
        [row_radius[period(x)] for x in cations], [row_radius[period(x)] for x in anions],
        CALIBRATION.screening_prefactor_b, law,
    )
    s_cat, p_cat = term_values(cations)
    s_an, p_an = term_values(anions)
    bonds = bond_orbitals(s_cat, p_cat, s_an, p_an, d_used)

    use_spectro = np.isfinite(spectro.ionicity)
    coordination = np.where(
        use_spectro,
        predicted_coordination(spectro.ionicity, BORDERLINE_HALF_WIDTH["spectroscopic"]),
        predicted_coordination(predictive.ionicity, BORDERLINE_HALF_WIDTH["predictive"]),
    )
    ambient = [_text(m, "structure") for m in measured]
    return CatalogueTable(
        compounds=compounds,
        measured=measured,
        structure=np.array(ambient, dtype=object),
        lattice_constant_angstrom=np.array([_number(m, "lattice_a") for m in measured]),
        lattice_c_angstrom=np.array([_number(m, "lattice_c") for m in measured]),
        bond_length_measured_angstrom=d_measured,
        bond_length_estimated_angstrom=d_estimated,
        bond_length_used_angstrom=d_used,
        volume_per_pair_angstrom3=volume,
        eps_inf=eps_inf,
        homopolar_law=law,
        spectroscopic=spectro,
        predictive=predictive,
        bonds=bonds,
        coordination_predicted=coordination,
        coordination_route=np.where(use_spectro, "spectroscopic", "predictive").astype(object),
        coordination_observed=np.array(
            [_observed_coordination(m, s) for m, s in zip(measured, ambient, strict=True)],
            dtype=object,
        ),
        radius_fit=fit,
        lattice_estimate=estimate_lattice(geo_structure, coordination, d_estimated,
                                          fit.loo_rms_angstrom),
    )
