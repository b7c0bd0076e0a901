"""Bond ionicity and polarity of an alloy in the virtual-crystal approximation (VCA).

The virtual crystal replaces each site by an average atom: every model input is averaged over
the end-point binaries with the weights p_i q_j of the composition (equivalently, over each
site's elements), and the binary formulas of ``screening.phillips`` and ``screening.harrison``
are evaluated once for the average. That is "the bond ionicity of a hypothetical alloy":

* Harrison bond orbitals: the site-averaged term values eps_s, eps_p (``screening.atoms``) and
  the Vegard bond length (the weighted mean of the end points' bond lengths, which is the bond
  length of the Vegard lattice constant).
* Phillips predictive route: the site-averaged Z/r (valence over the period radius used by
  ``screening.evaluate``) and the Vegard bond length.
* Phillips spectroscopic route: eps_inf and Van Vechten's d-electron factor D averaged
  linearly, where every end point has a measured eps_inf (else NaN).

The VCA averages the inputs, so it gives trends across compositions, not the alloy's own
disorder effects (gap bowing is taken from measurements instead, see ``interpolation``).
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache

import numpy as np
from numpy.typing import ArrayLike, NDArray

from screening import phillips, structure
from screening.alloys.systems import AlloySystem
from screening.atoms import term_values
from screening.elements import VALENCE, period
from screening.evaluate import CALIBRATION, catalogue_table, d_factors, period_radii
from screening.formula import Compound
from screening.harrison import BondOrbitals, bond_orbitals
from screening.phillips import PhillipsResult
from screening.reference import measured_compounds

_INPUTS = ("bond_length", "eps_inf", "d_factor", "zr_cation", "zr_anion",
           "s_cation", "p_cation", "s_anion", "p_anion")


@dataclass(frozen=True, eq=False)
class VcaResult:
    """VCA bond properties of one system at many compositions (arrays over compositions).

    Attributes:
        system: The alloy system.
        bond_length_angstrom: Vegard bond length (A).
        spectroscopic: Phillips spectroscopic route (NaN where an end point lacks eps_inf).
        predictive: Phillips predictive route.
        bonds: Harrison bond orbitals (``bonds.polarity`` is alpha_p).
        eps_inf: Virtual-crystal eps_inf, the weighted mean of the end points' measured eps_inf
            that the spectroscopic route uses (NaN where an end point has none).
    """

    system: AlloySystem
    bond_length_angstrom: NDArray[np.float64]
    spectroscopic: PhillipsResult
    predictive: PhillipsResult
    bonds: BondOrbitals
    eps_inf: NDArray[np.float64]


@lru_cache(maxsize=1)
def _binary_inputs() -> dict[str, dict[str, float]]:
    """Model inputs of every catalogue binary, keyed by formula."""
    table = catalogue_table()
    compounds: tuple[Compound, ...] = table.compounds
    d_factor = d_factors(measured_compounds(), compounds)
    radius = period_radii(measured_compounds())
    s_cat, p_cat = term_values([c.cation for c in compounds])
    s_an, p_an = term_values([c.anion for c in compounds])
    inputs = {}
    for i, compound in enumerate(compounds):  # loop over catalogue binaries
        inputs[compound.formula] = {
            "bond_length": float(table.bond_length_used_angstrom[i]),
            "eps_inf": float(table.eps_inf[i]),
            "d_factor": float(d_factor[i]),
            "zr_cation": VALENCE[compound.cation] / radius[period(compound.cation)],
            "zr_anion": VALENCE[compound.anion] / radius[period(compound.anion)],
            "s_cation": float(s_cat[i]), "p_cation": float(p_cat[i]),
            "s_anion": float(s_an[i]), "p_anion": float(p_an[i]),
        }
    return inputs


def site_weights(system: AlloySystem, fractions: ArrayLike) -> NDArray[np.float64]:
    """Weights p_i q_j of the end-point binaries, (ncomposition, nbinary) in slot order.

    Args:
        system: The system.
        fractions: (ncomposition, nelement) site fractions in :attr:`AlloySystem.elements`
            order (each site summing to one).
    """
    f = np.atleast_2d(np.asarray(fractions, dtype=float))
    return np.stack([f[:, i] * f[:, j] for i, j in system.slot_elements], axis=1)


def vca_bonds(system: AlloySystem, fractions: ArrayLike) -> VcaResult:
    """Evaluate the VCA ionicity and polarity of a system at many compositions.

    Args:
        system: The alloy system (zincblende, wurtzite or rocksalt end points).
        fractions: (ncomposition, nelement) site fractions in :attr:`AlloySystem.elements`
            order.

    Returns:
        The VCA result, arrays of length ncomposition.
    """
    inputs = _binary_inputs()
    weights = site_weights(system, fractions)
    per_binary = np.array([[inputs[b][key] for key in _INPUTS] for b in system.binaries])
    averaged = dict(zip(_INPUTS, (weights @ per_binary).T, strict=True))
    d = averaged["bond_length"]
    if system.structure == "rocksalt":
        volume = structure.volume_per_pair("rocksalt", 2.0 * d, np.nan)
    else:
        volume = structure.tetrahedral_volume_per_pair(d)
    law = catalogue_table().homopolar_law
    spectroscopic = phillips.spectroscopic(d, volume, averaged["eps_inf"], averaged["d_factor"],
                                           law)
    predictive = phillips.predictive(d, volume, averaged["zr_cation"], averaged["zr_anion"],
                                     1.0, 1.0, CALIBRATION.screening_prefactor_b, law)
    bonds = bond_orbitals(averaged["s_cation"], averaged["p_cation"], averaged["s_anion"],
                          averaged["p_anion"], d)
    return VcaResult(system, d, spectroscopic, predictive, bonds, averaged["eps_inf"])
