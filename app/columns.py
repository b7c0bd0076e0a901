"""The columns of the compound table: one registry for the page, the API, the CSV and the CLI.

Labels, units and descriptions of computed quantities come from `screening.registry`.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Literal

from screening.registry import BY_KEY


@dataclass(frozen=True)
class Column:
    """One column of the compound table, as the page, the API and the CSV name it.

    Attributes:
        key: Name in API rows, CSV headers and `?sort=`.
        attr: Attribute of `CompoundResult` holding it.
        label: Column header.
        unit: Unit ("" for dimensionless or text).
        description: One line for tooltips and the API columns list.
        kind: "text" or "number".
        digits: Decimals shown on the page and in `bondgap list`.
        shown: Whether the page shows it as a column.
    """

    key: str
    attr: str
    label: str
    unit: str
    description: str
    kind: Literal["text", "number"] = "number"
    digits: int = 3
    shown: bool = True

    def format(self, value: Any) -> str:
        """The value as the page and the text table show it (an em dash for no value)."""
        if value is None:
            return "—"
        return f"{value:.{self.digits}f}" if self.kind == "number" else str(value)


def _registry_column(key: str, attr: str, quantity: str, digits: int = 3) -> Column:
    """A numeric column whose label, unit and description come from `screening.registry`."""
    q = BY_KEY[quantity]
    kind: Literal["text", "number"] = "text" if quantity.startswith("coordination") else "number"
    return Column(key, attr, q.label, q.unit, f"{q.route} ({q.reference})", kind, digits)


COLUMNS: tuple[Column, ...] = (
    Column("formula", "formula", "Compound", "", "Formula, cation first", "text"),
    Column("family", "family", "Family", "", "IV-IV, III-V, II-VI or I-VII", "text"),
    Column("cation", "cation", "Cation", "", "Cation element", "text", shown=False),
    Column("anion", "anion", "Anion", "", "Anion element", "text", shown=False),
    Column("structure_observed", "structure_observed", "Structure", "",
           "Observed crystal structure", "text"),
    Column("band_gap_measured_eV", "gap_measured_ev", "Band gap", "eV", "Measured band gap",
           digits=2),
    Column("gap_kind", "gap_kind", "Gap kind", "", "Direct or indirect (measured)", "text"),
    Column("eps_inf", "eps_inf", "ε∞", "", "Measured high-frequency dielectric constant",
           digits=2),
    _registry_column("lattice_constant_angstrom", "lattice_constant_angstrom",
                     "lattice_constant_angstrom", digits=4),
    Column("bond_length_angstrom", "bond_length_angstrom", "Bond length", "Å",
           "Bond length the models used: measured where known, else estimated"),
    _registry_column("ionicity_spectroscopic", "ionicity_spectroscopic",
                     "phillips.spectroscopic.ionicity"),
    _registry_column("ionicity_predictive", "ionicity_predictive", "phillips.predictive.ionicity"),
    _registry_column("polarity", "polarity", "harrison.polarity"),
    _registry_column("covalent_energy_eV", "covalent_energy_ev", "harrison.covalent_energy_eV",
                     digits=2),
    _registry_column("polar_energy_eV", "polar_energy_ev", "harrison.polar_energy_eV", digits=2),
    _registry_column("coordination_predicted", "coordination_predicted", "coordination.predicted"),
    Column("coordination_observed", "coordination_observed", "Coordination (observed)", "",
           "Coordination of the observed structure", "text"),
)
COLUMNS_BY_KEY: dict[str, Column] = {c.key: c for c in COLUMNS}
