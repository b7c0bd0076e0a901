"""Phillips-Van Vechten dielectric theory of the octet bond: Eh, C, Eg and ionicity fi.

The average (Penn) gap Eg of the valence-conduction manifold splits into a homopolar part Eh
(set by the bond length) and a heteropolar part C (set by the charge transfer):
Eg^2 = Eh^2 + C^2, ionicity fi = C^2 / Eg^2.

Two routes give C:

* spectroscopic: Eg from the measured high-frequency dielectric constant,
  eps_inf - 1 = (hbar omega_p / Eg)^2 D A, then C = sqrt(Eg^2 - Eh^2);
* predictive: the screened Coulomb difference of the two atomic cores,
  C = b e^2 |Z_A/r_A - Z_B/r_B| exp(-k_s d/2), from atomic data and the bond length only.

References: J. C. Phillips, Phys. Rev. Lett. 20, 550 (1968); J. A. Van Vechten, Phys. Rev.
182, 891 (1969) and 187, 1007 (1969); J. C. Phillips, Rev. Mod. Phys. 42, 317 (1970);
D. R. Penn, Phys. Rev. 128, 2093 (1962). Energies in eV, lengths in angstrom.

The homopolar gap Eh(d) is, by Phillips' definition, the average gap of the homopolar crystal
of bond length d: a power law through the spectroscopic Eg of diamond and Si (D = 1, no d
shell), where C = 0 for an element. `homopolar_law_of_elements` draws it through the same
eps_inf data the spectroscopic route then reads, so C, Si, Ge and alpha-Sn come out with C = 0
(Van Vechten's 39.74 d^-2.48, drawn through the eps_inf of 1969, is kept as
`VAN_VECHTEN_1969` for comparison: its Eh(Si) = 4.77 eV is the Eg of eps_inf(Si) = 12.0 here, so
with the measured 11.7 it left Si a spurious C = 0.78 eV, fi = 0.026).

The spectroscopic fi of AlP, AlAs, AlSb (0.38, 0.44, 0.43) exceeds Phillips' (0.307, 0.274,
0.250, from memory) through the measured eps_inf (7.54, 8.16, 10.24), not through D: even D = 1
(no d contribution, the least Van Vechten's definition allows) leaves AlAs above GaAs, and
Phillips' AlP (D = 1 in any definition) needs eps_inf = 8.35.

Calibrations of ours (constants in `PhillipsCalibration`):
* the d-electron factor D: D of a row fixed by that row's group-IV element (Ge, alpha-Sn)
  so that its eps_inf is reproduced with Eg = Eh; D = 1 for atoms without a shallow filled d
  shell; for a compound D = D_av - (D_av - 1) z (Z_B - Z_A)^2;
* the radii of the predictive route: the covalent radius of the atom's period (half the bond
  length of the period's group-IV crystal: C, Si, Ge, alpha-Sn; Pauling's tetrahedral Pb
  radius for period 6), with Phillips' prefactor b = 1.5.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from screening.constants import BOHR_ANGSTROM, E2_EV_ANGSTROM

HBAR2_OVER_M_EXACT: float = 7.619964
"""hbar^2/m_e in eV A^2 (CODATA 2018), for the plasma and Fermi energies."""

ROUNDING_RELATIVE: float = 1e-12
"""Eg^2 - Eh^2 below this fraction of Eh^2 (C < 1e-6 Eh, fi < 1e-12) is rounding, so C = 0."""

CRITICAL_IONICITY: float = 0.785
"""Phillips' critical ionicity: fourfold below, sixfold above (Rev. Mod. Phys. 42, 317)."""


@dataclass(frozen=True)
class PhillipsCalibration:
    """The calibration constants of the two routes, in one place (ours unless noted)."""

    d_reduction_z: float = 1.0 / 45.0
    """z in D = D_av - (D_av - 1) z dZ^2 (a reconstruction of Van Vechten's reduction)."""
    d_row6_extrapolated: bool = True
    """Row-6 D by linear extrapolation from rows 4 and 5 (no group-IV element to fix it)."""
    screening_prefactor_b: float = 1.5
    """b of the predictive C (Phillips 1970)."""
    period_radius_pb_angstrom: float = 1.46
    """Period-6 radius: Pauling's tetrahedral radius of Pb (1960; from memory)."""


@dataclass(frozen=True)
class PhillipsResult:
    """Eh, C, Eg (eV) and fi, arrays over compounds. NaN where the route does not apply."""

    homopolar_gap_eV: NDArray[np.float64]
    heteropolar_gap_eV: NDArray[np.float64]
    average_gap_eV: NDArray[np.float64]
    ionicity: NDArray[np.float64]


@dataclass(frozen=True)
class HomopolarLaw:
    """Eh = prefactor d^-exponent: the homopolar gap in eV for bond length d in angstrom."""

    prefactor_eV: float
    exponent: float

    def gap(self, d_angstrom: ArrayLike) -> NDArray[np.float64]:
        """Homopolar gap Eh in eV for bond length d in angstrom."""
        return self.prefactor_eV * np.asarray(d_angstrom, dtype=float) ** -self.exponent


VAN_VECHTEN_1969 = HomopolarLaw(prefactor_eV=39.74, exponent=2.48)
"""Eh = 39.74 d^-2.48 eV (Van Vechten, Phys. Rev. 182, 891 (1969); Phillips 1970; from memory)."""


def homopolar_gap(d_angstrom: ArrayLike, law: HomopolarLaw = VAN_VECHTEN_1969
                  ) -> NDArray[np.float64]:
    """Homopolar gap Eh in eV for bond length d in angstrom (published law unless given)."""
    return law.gap(d_angstrom)


def electron_gas(volume_per_pair_angstrom3: ArrayLike) -> tuple[NDArray[np.float64], ...]:
    """Valence electron gas of eight electrons per pair.

    Returns:
        (plasma energy hbar omega_p in eV, Fermi energy in eV, Fermi wave number k_F in 1/A,
        Thomas-Fermi screening wave number k_s in 1/A).
    """
    n = 8.0 / np.asarray(volume_per_pair_angstrom3, dtype=float)
    plasma = np.sqrt(4.0 * np.pi * n * E2_EV_ANGSTROM * HBAR2_OVER_M_EXACT)
    k_f = np.cbrt(3.0 * np.pi**2 * n)
    fermi = HBAR2_OVER_M_EXACT * k_f**2 / 2.0
    k_s = np.sqrt(4.0 * k_f / (np.pi * BOHR_ANGSTROM))
    return plasma, fermi, k_f, k_s


def penn_factor(gap_eV: ArrayLike, fermi_eV: ArrayLike) -> NDArray[np.float64]:
    """Penn's correction A = 1 - B + B^2/3 with B = Eg / (4 E_F)."""
    b = np.asarray(gap_eV, dtype=float) / (4.0 * np.asarray(fermi_eV, dtype=float))
    return 1.0 - b + b * b / 3.0


def spectroscopic_average_gap(
    eps_inf: ArrayLike, plasma_eV: ArrayLike, fermi_eV: ArrayLike, d_factor: ArrayLike,
    iterations: int = 60,
) -> NDArray[np.float64]:
    """Average gap Eg in eV from eps_inf - 1 = (hbar omega_p / Eg)^2 D A(Eg) (fixed point).

    NaN where eps_inf is NaN or not above 1.
    """
    eps = np.asarray(eps_inf, dtype=float)
    plasma = np.asarray(plasma_eV, dtype=float)
    with np.errstate(invalid="ignore", divide="ignore"):
        scale = np.where(eps > 1.0, plasma * np.sqrt(np.asarray(d_factor) / (eps - 1.0)), np.nan)
        gap = scale.copy()
        for _ in range(iterations):  # contraction: |dA/dEg| * Eg / 2 A << 1
            gap = scale * np.sqrt(penn_factor(gap, fermi_eV))
    return gap


def row_d_factor(
    row: ArrayLike, d_row4: float, d_row5: float, extrapolate_row6: bool = True
) -> NDArray[np.float64]:
    """D of an atom in a row with a shallow filled d shell: 1 for rows <= 3."""
    r = np.asarray(row)
    d_row6 = 2.0 * d_row5 - d_row4 if extrapolate_row6 else d_row5
    return np.select([r <= 3, r == 4, r == 5], [1.0, d_row4, d_row5], d_row6)


def compound_d_factor(
    d_cation: ArrayLike, d_anion: ArrayLike, valence_difference: ArrayLike, z: float
) -> NDArray[np.float64]:
    """D = D_av - (D_av - 1) z dZ^2 for a compound (calibration of ours, see module doc)."""
    d_av = (np.asarray(d_cation, dtype=float) + np.asarray(d_anion, dtype=float)) / 2.0
    dz2 = np.asarray(valence_difference, dtype=float) ** 2
    return d_av - (d_av - 1.0) * z * dz2


def homopolar_law_of_elements(
    d_angstrom: ArrayLike, volume_per_pair_angstrom3: ArrayLike, eps_inf: ArrayLike
) -> HomopolarLaw:
    """Eh(d) through the average gaps of two homopolar crystals without a d shell (D = 1).

    Phillips' definition of Eh (Rev. Mod. Phys. 42, 317 (1970)): the average gap of the
    homopolar crystal, C = 0, drawn as a power law through diamond and Si.

    Args:
        d_angstrom: Bond lengths of the two crystals (diamond, Si), angstrom.
        volume_per_pair_angstrom3: Their volumes per atom pair, cubic angstrom.
        eps_inf: Their measured high-frequency dielectric constants.
    """
    d = np.asarray(d_angstrom, dtype=float)
    plasma, fermi, _, _ = electron_gas(volume_per_pair_angstrom3)
    eg = spectroscopic_average_gap(eps_inf, plasma, fermi, 1.0)
    exponent = float(np.log(eg[0] / eg[1]) / np.log(d[1] / d[0]))
    return HomopolarLaw(prefactor_eV=float(eg[1] * d[1] ** exponent), exponent=exponent)


def d_factor_of_element(eps_inf: float, d_angstrom: float, law: HomopolarLaw) -> float:
    """D that reproduces a group-IV element's eps_inf with Eg = Eh (C = 0)."""
    eh = float(law.gap(d_angstrom))
    a = d_angstrom * 4.0 / np.sqrt(3.0)
    plasma, fermi, _, _ = electron_gas(a**3 / 4.0)
    return float((eps_inf - 1.0) * eh**2 / (plasma**2 * penn_factor(eh, fermi)))


def spectroscopic(
    d_angstrom: ArrayLike, volume_per_pair_angstrom3: ArrayLike, eps_inf: ArrayLike,
    d_factor: ArrayLike, law: HomopolarLaw,
) -> PhillipsResult:
    """The spectroscopic route: Eg from eps_inf, C = sqrt(Eg^2 - Eh^2) (0 if Eg <= Eh).

    C = 0 also where Eg^2 - Eh^2 is rounding (`ROUNDING_RELATIVE`): an element's Eg and Eh
    come from the same eps_inf through different arithmetic.
    """
    eh = law.gap(d_angstrom)
    plasma, fermi, _, _ = electron_gas(volume_per_pair_angstrom3)
    eg = spectroscopic_average_gap(eps_inf, plasma, fermi, d_factor)
    excess = eg**2 - eh**2
    heteropolar = np.sqrt(np.where(excess > ROUNDING_RELATIVE * eh**2, excess, 0.0))
    c = np.where(np.isnan(excess), np.nan, heteropolar)
    eg = np.sqrt(eh**2 + c**2)
    eh = np.where(np.isnan(c), np.nan, eh)
    return PhillipsResult(eh, c, eg, c**2 / eg**2)


def predictive(
    d_angstrom: ArrayLike, volume_per_pair_angstrom3: ArrayLike,
    valence_cation: ArrayLike, valence_anion: ArrayLike,
    radius_cation_angstrom: ArrayLike, radius_anion_angstrom: ArrayLike,
    prefactor_b: float, law: HomopolarLaw,
) -> PhillipsResult:
    """The predictive route: C = b e^2 |Z_A/r_A - Z_B/r_B| exp(-k_s d/2)."""
    d = np.asarray(d_angstrom, dtype=float)
    eh = law.gap(d)
    _, _, _, k_s = electron_gas(volume_per_pair_angstrom3)
    za, zb = np.asarray(valence_cation, float), np.asarray(valence_anion, float)
    ra, rb = np.asarray(radius_cation_angstrom, float), np.asarray(radius_anion_angstrom, float)
    c = prefactor_b * E2_EV_ANGSTROM * np.abs(zb / rb - za / ra) * np.exp(-k_s * d / 2.0)
    eg = np.sqrt(eh**2 + c**2)
    return PhillipsResult(eh, c, eg, c**2 / eg**2)
