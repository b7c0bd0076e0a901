"""One typed registry of the quantities bondgap reports: key, label, unit, route, reference.

The engine, the API documentation and the UI's column headers all read this table.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final


@dataclass(frozen=True)
class Quantity:
    """A reported quantity: where it sits in the report, how it is shown, where it comes from."""

    key: str
    label: str
    unit: str
    route: str
    reference: str


PVV = (
    "J. C. Phillips, Rev. Mod. Phys. 42, 317 (1970); "
    "J. A. Van Vechten, Phys. Rev. 182, 891 (1969)"
)
BOND_ORBITAL = "W. A. Harrison, Phys. Rev. B 24, 5835 (1981)"

QUANTITIES: Final[tuple[Quantity, ...]] = (
    Quantity("lattice_constant_angstrom", "Lattice constant a", "Å", "measured",
             "seed data (source per value)"),
    Quantity("bond_length_angstrom", "Bond length (measured)", "Å",
             "from the measured lattice constant and structure", "seed data"),
    Quantity("bond_length_estimated_angstrom", "Bond length (estimated)", "Å",
             "sum of fitted tetrahedral radii",
             "calibration of ours; Pauling (1960) radii as prior"),
    Quantity("phillips.spectroscopic.homopolar_gap_eV", "Eh", "eV",
             "Eh = 39.74 d^-2.48", PVV),
    Quantity("phillips.spectroscopic.heteropolar_gap_eV", "C (spectroscopic)", "eV",
             "from eps_inf with the plasma energy, D and A corrections", PVV),
    Quantity("phillips.spectroscopic.average_gap_eV", "Eg (spectroscopic)", "eV",
             "Eg^2 = Eh^2 + C^2", PVV),
    Quantity("phillips.spectroscopic.ionicity", "fi (spectroscopic)", "",
             "fi = C^2 / Eg^2", PVV),
    Quantity("phillips.predictive.heteropolar_gap_eV", "C (predictive)", "eV",
             "screened Coulomb difference of the cores", PVV),
    Quantity("phillips.predictive.average_gap_eV", "Eg (predictive)", "eV",
             "Eg^2 = Eh^2 + C^2", PVV),
    Quantity("phillips.predictive.ionicity", "fi (predictive)", "", "fi = C^2 / Eg^2", PVV),
    Quantity("harrison.covalent_energy_eV", "V2", "eV", "3.22 hbar^2/(m d^2)", BOND_ORBITAL),
    Quantity("harrison.polar_energy_eV", "V3", "eV",
             "half the hybrid-energy difference, term values from the LDA atom",
             BOND_ORBITAL),
    Quantity("harrison.metallic_energy_eV", "V1", "eV",
             "(eps_p - eps_s)/4, mean of the two atoms", BOND_ORBITAL),
    Quantity("harrison.polarity", "Polarity αp", "", "V3 / sqrt(V2^2 + V3^2)", BOND_ORBITAL),
    Quantity("harrison.covalency", "Covalency αc", "", "V2 / sqrt(V2^2 + V3^2)", BOND_ORBITAL),
    Quantity("harrison.bonding_eV", "Bonding level", "eV",
             "mean hybrid energy - sqrt(V2^2 + V3^2)", BOND_ORBITAL),
    Quantity("harrison.antibonding_eV", "Antibonding level", "eV",
             "mean hybrid energy + sqrt(V2^2 + V3^2)", BOND_ORBITAL),
    Quantity("coordination.predicted", "Coordination (predicted)", "",
             "fi against the critical ionicity 0.785", PVV),
)

BY_KEY: Final[dict[str, Quantity]] = {q.key: q for q in QUANTITIES}
