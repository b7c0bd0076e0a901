"""One typed registry of the quantities bondgap reports: key, label, unit, route, reference.

The engine, the API documentation and the UI's column headers all read this table.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass
from typing import Any, Final


@dataclass(frozen=True)
class Quantity:
    """A reported quantity: where it sits in the report, how it is shown, where it comes from."""

    key: str
    label: str
    unit: str
    route: str
    reference: str
    detail_key: str | None = None
    """Dotted report path of a per-compound word on the route (which bond length, which
    structure), shown after the route; None where the route is the same for every compound."""
    uncertainty_key: str | None = None
    """Dotted report path of the estimate's uncertainty (same unit), shown as "± u"; None for
    a quantity reported without one."""

    def route_in(self, report: Mapping[str, Any]) -> str:
        """The route for one report: the declared route, plus its per-compound detail."""
        detail = report_value(report, self.detail_key) if self.detail_key else None
        return f"{self.route} ({detail})" if detail else self.route


def report_value(report: Any, dotted: str) -> Any:
    """Value at a dotted path of a report (`phillips.predictive.ionicity`); None if absent."""
    for part in dotted.split("."):
        if not isinstance(report, Mapping):
            return None
        report = report.get(part)
    return report


PVV = (
    "J. C. Phillips, Rev. Mod. Phys. 42, 317 (1970); "
    "J. A. Van Vechten, Phys. Rev. 182, 891 (1969)"
)
BOND_ORBITAL = "W. A. Harrison, Phys. Rev. B 24, 5835 (1981)"
RADII = "tetrahedral radii: calibration of ours; Pauling (1960) radii as prior"
EH_ROUTE = ("Eh = A d^-s (d in Å) through the average gaps of diamond and Si from their "
            "measured eps_inf (Van Vechten 1969 had 39.74 d^-2.48), at the bond length the "
            "models used")

QUANTITIES: Final[tuple[Quantity, ...]] = (
    Quantity("lattice_constant_angstrom", "Lattice constant a", "Å", "measured",
             "seed data (source per value)"),
    Quantity("lattice_constant_estimated_angstrom", "Lattice constant a (estimated)", "Å",
             "cell geometry of the structure from the estimated bond length",
             f"{RADII}; I. D. Brown and D. Altermatt, Acta Cryst. B 41, "
             "244 (1985) for sixfold bonds", detail_key="lattice_estimate.route",
             uncertainty_key="lattice_estimate.uncertainty_angstrom"),
    Quantity("bond_length_angstrom", "Bond length (measured)", "Å",
             "from the measured lattice constant and structure", "seed data"),
    Quantity("bond_length_estimated_angstrom", "Bond length (estimated)", "Å",
             "sum of fitted tetrahedral radii", RADII),
    Quantity("phillips.spectroscopic.homopolar_gap_eV", "Eh (spectroscopic)", "eV", EH_ROUTE, PVV,
             detail_key="bond_length_source"),
    Quantity("phillips.spectroscopic.heteropolar_gap_eV", "C (spectroscopic)", "eV",
             "from eps_inf with the plasma energy, D and A corrections", PVV),
    Quantity("phillips.spectroscopic.average_gap_eV", "Eg (spectroscopic)", "eV",
             "Eg^2 = Eh^2 + C^2", PVV),
    Quantity("phillips.spectroscopic.ionicity", "fi (spectroscopic)", "",
             "fi = C^2 / Eg^2", PVV),
    Quantity("phillips.predictive.homopolar_gap_eV", "Eh (predictive)", "eV", EH_ROUTE, PVV,
             detail_key="bond_length_source"),
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
             "fi against the critical ionicity 0.785", PVV, detail_key="coordination.route"),
)

BY_KEY: Final[dict[str, Quantity]] = {q.key: q for q in QUANTITIES}
