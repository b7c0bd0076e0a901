"""Harrison's bond-orbital model of the tetrahedral bond.

Each atom forms four sp3 hybrids, eps_h = (eps_s + 3 eps_p)/4. Two hybrids pointing at each
other along a bond form a two-level problem with off-diagonal -V2 (covalent energy) and
on-site energies eps_h^cation, eps_h^anion, whose half difference is the polar energy V3
(taken positive).
Its solutions are the bonding and antibonding levels
eps_b,a = (eps_h^c + eps_h^a)/2 -/+ sqrt(V2^2 + V3^2); the polarity
alpha_p = V3 / sqrt(V2^2 + V3^2) and the covalency alpha_c = V2 / sqrt(V2^2 + V3^2) follow.
The metallic energy V1 = (eps_p - eps_s)/4 couples hybrids on the same atom.

V2 = -(V_ss_sigma - 2 sqrt(3) V_sp_sigma - 3 V_pp_sigma)/4 with the universal two-centre
matrix elements V = eta hbar^2/(m d^2). Universal constants: the 1981 set,
eta_ss_sigma = -1.32, eta_sp_sigma = 1.42, eta_pp_sigma = 2.22, eta_pp_pi = -0.63
(W. A. Harrison, Phys. Rev. B 24, 5835 (1981); also in Electronic Structure and the
Properties of Solids, Dover 1989), which give V2 = 3.22 hbar^2/(m d^2).

Energies in eV, lengths in angstrom. Term values eps_s, eps_p come from the atom solver
(`screening.atoms`), not from Harrison's tables: absolute V3 and levels therefore differ from
his printed values, while polarity trends are the model's.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import ArrayLike, NDArray

from screening.constants import HBAR2_OVER_M_EV_ANGSTROM2


@dataclass(frozen=True)
class UniversalEta:
    """Dimensionless two-centre constants eta (V = eta hbar^2 / m d^2)."""

    ss_sigma: float
    sp_sigma: float
    pp_sigma: float
    pp_pi: float

    @property
    def hybrid_covalent(self) -> float:
        """Eta of V2 between two sp3 hybrids pointing at each other."""
        return -(self.ss_sigma - 2.0 * np.sqrt(3.0) * self.sp_sigma - 3.0 * self.pp_sigma) / 4.0


ETA_1981: Final[UniversalEta] = UniversalEta(-1.32, 1.42, 2.22, -0.63)
"""Harrison, Phys. Rev. B 24, 5835 (1981)."""


@dataclass(frozen=True)
class BondOrbitals:
    """Bond-orbital quantities, arrays over compounds, in eV (polarity, covalency unitless)."""

    hybrid_energy_cation_eV: NDArray[np.float64]
    hybrid_energy_anion_eV: NDArray[np.float64]
    covalent_energy_eV: NDArray[np.float64]
    polar_energy_eV: NDArray[np.float64]
    metallic_energy_cation_eV: NDArray[np.float64]
    metallic_energy_anion_eV: NDArray[np.float64]
    polarity: NDArray[np.float64]
    covalency: NDArray[np.float64]
    bonding_eV: NDArray[np.float64]
    antibonding_eV: NDArray[np.float64]

    @property
    def metallic_energy_eV(self) -> NDArray[np.float64]:
        """Mean of the two atoms' metallic energies V1, eV."""
        return (self.metallic_energy_cation_eV + self.metallic_energy_anion_eV) / 2.0


def hybrid_energy(eps_s_eV: ArrayLike, eps_p_eV: ArrayLike) -> NDArray[np.float64]:
    """sp3 hybrid energy (eps_s + 3 eps_p)/4 in eV."""
    return (np.asarray(eps_s_eV, dtype=float) + 3.0 * np.asarray(eps_p_eV, dtype=float)) / 4.0


def covalent_energy(d_angstrom: ArrayLike, eta: UniversalEta = ETA_1981) -> NDArray[np.float64]:
    """V2 = eta_h hbar^2/(m d^2) in eV for bond length d in angstrom."""
    d = np.asarray(d_angstrom, dtype=float)
    return eta.hybrid_covalent * HBAR2_OVER_M_EV_ANGSTROM2 / d**2


def bond_orbitals(
    eps_s_cation_eV: ArrayLike, eps_p_cation_eV: ArrayLike,
    eps_s_anion_eV: ArrayLike, eps_p_anion_eV: ArrayLike,
    d_angstrom: ArrayLike, eta: UniversalEta = ETA_1981,
) -> BondOrbitals:
    """Solve the bond's two-level problem for every compound at once.

    Args:
        eps_s_cation_eV: valence s term value of the cation, eV.
        eps_p_cation_eV: valence p term value of the cation, eV.
        eps_s_anion_eV: valence s term value of the anion, eV.
        eps_p_anion_eV: valence p term value of the anion, eV.
        d_angstrom: bond length, angstrom.
        eta: the universal constants.
    """
    sc, pc = np.asarray(eps_s_cation_eV, float), np.asarray(eps_p_cation_eV, float)
    sa, pa = np.asarray(eps_s_anion_eV, float), np.asarray(eps_p_anion_eV, float)
    hc, ha = hybrid_energy(sc, pc), hybrid_energy(sa, pa)
    v2 = covalent_energy(d_angstrom, eta)
    v3 = np.abs(hc - ha) / 2.0
    half_splitting = np.hypot(v2, v3)
    middle = (hc + ha) / 2.0
    return BondOrbitals(
        hybrid_energy_cation_eV=hc,
        hybrid_energy_anion_eV=ha,
        covalent_energy_eV=v2,
        polar_energy_eV=v3,
        metallic_energy_cation_eV=(pc - sc) / 4.0,
        metallic_energy_anion_eV=(pa - sa) / 4.0,
        polarity=v3 / half_splitting,
        covalency=v2 / half_splitting,
        bonding_eV=middle - half_splitting,
        antibonding_eV=middle + half_splitting,
    )
