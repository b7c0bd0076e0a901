"""The columns of the compound table: one registry for the page, the API, the CSV and the CLI.

Labels, units and descriptions of computed quantities come from `screening.registry`.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any, Literal

from app.numbers import estimate_text, fixed
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
        source_key: Key of the row value saying where this value came from ("measured",
            "estimate", ...), shown as a mark beside it.
        uncertainty_key: Key of the row value holding the uncertainty shown with this value
            wherever it is not measured.
    """

    key: str
    attr: str
    label: str
    unit: str
    description: str
    kind: Literal["text", "number"] = "number"
    digits: int = 3
    shown: bool = True
    source_key: str | None = None
    uncertainty_key: str | None = None

    def format(self, value: Any) -> str:
        """The value as the page and the text table show it (an em dash for no value)."""
        if value is None:
            return "—"
        return fixed(value, self.digits) if self.kind == "number" else str(value)

    def cell(self, row: dict[str, Any]) -> tuple[str, str | None]:
        """The value of `row` as shown, with its uncertainty where estimated, and its mark.

        Returns:
            (text, mark): e.g. ("2.3 ± 1.0", "est.") (rounded by `app.numbers`), ("1.424",
            "m"), ("indirect", "model"); the mark is None where the column has no source.
        """
        value = row.get(self.key)
        source = row.get(self.source_key) if self.source_key else None
        uncertainty = row.get(self.uncertainty_key) if self.uncertainty_key else None
        text = (estimate_text(value, uncertainty, self.digits)
                if value is not None and source != "measured" and uncertainty is not None
                else self.format(value))
        return text, (SOURCE_MARKS.get(source, source) if value is not None and source else None)


SOURCE_MARKS: dict[str, str] = {"measured": "m", "estimate": "est.", "tight-binding model": "model"}
"""Short marks of where a value came from, as the table and the text output show them."""


def _registry_column(key: str, attr: str, quantity: str, digits: int = 3) -> Column:
    """A numeric column whose label, unit and description come from `screening.registry`."""
    q = BY_KEY[quantity]
    kind: Literal["text", "number"] = "text" if quantity.startswith("coordination") else "number"
    return Column(key, attr, q.label, q.unit, f"{q.route} ({q.reference})", kind, digits)


LATTICE = BY_KEY["lattice_constant_angstrom"]
LATTICE_ESTIMATE = BY_KEY["lattice_constant_estimated_angstrom"]

COLUMNS: tuple[Column, ...] = (
    Column("formula", "formula", "Compound", "", "Formula, cation first", "text"),
    Column("family", "family", "Family", "", "IV-IV, III-V, II-VI or I-VII", "text"),
    Column("cation", "cation", "Cation", "", "Cation element", "text", shown=False),
    Column("anion", "anion", "Anion", "", "Anion element", "text", shown=False),
    Column("structure_observed", "structure_observed", "Structure", "",
           "Observed crystal structure", "text"),
    Column("band_gap_eV", "gap_value_ev", "Band gap", "eV",
           "Band gap at the temperature: measured where known (m), else the estimate (est.) "
           "with its uncertainty", digits=3, source_key="band_gap_source",
           uncertainty_key="band_gap_uncertainty_eV"),
    Column("band_gap_source", "gap_value_source", "Gap from", "",
           "Where the band gap comes from: measured or estimate", "text", shown=False),
    Column("band_gap_estimate_eV", "gap_estimate_ev", "Estimate", "eV",
           "Band-gap estimate at the temperature (sp3 tight binding calibrated on the measured "
           "gaps), shown beside the measured gap with its uncertainty, rounded to it",
           digits=3, uncertainty_key="band_gap_uncertainty_eV"),
    Column("band_gap_uncertainty_eV", "gap_uncertainty_ev", "± estimate", "eV",
           "Uncertainty of the estimate: leave-one-out RMS error of the compound's family",
           digits=2, shown=False),
    Column("wavelength_nm", "gap_wavelength_nm", "Wavelength", "nm",
           "Photon wavelength of the band gap shown, hc/Eg", digits=0),
    Column("band_gap_kind", "gap_kind_shown", "Gap kind", "",
           "Direct or indirect: measured where known, else from the sp3 model (model)", "text",
           source_key="band_gap_kind_source"),
    Column("band_gap_kind_source", "gap_kind_source", "Kind from", "",
           "Where the gap kind comes from: measured or tight-binding model", "text",
           shown=False),
    Column("band_gap_measured_eV", "gap_measured_ev", "Measured gap (300 K)", "eV",
           "Measured band gap at 300 K, as in the seed data", digits=3, shown=False),
    Column("gap_kind", "gap_kind", "Measured gap kind", "", "Direct or indirect (measured)",
           "text", shown=False),
    Column("eps_inf", "eps_inf", "ε∞", "", "Measured high-frequency dielectric constant",
           digits=2),
    Column("lattice_constant_angstrom", "lattice_constant_shown", LATTICE.label, LATTICE.unit,
           "Lattice constant a: measured where known (m), else estimated (est.) with its "
           f"uncertainty: {LATTICE_ESTIMATE.route}", digits=4,
           source_key="lattice_constant_source",
           uncertainty_key="lattice_constant_uncertainty_angstrom"),
    Column("lattice_constant_source", "lattice_constant_source", "Lattice constant from", "",
           "Where the lattice constant comes from: measured or estimate", "text", shown=False),
    Column("lattice_constant_uncertainty_angstrom", "lattice_constant_uncertainty",
           "± lattice constant", "Å",
           "Uncertainty of an estimated lattice constant: leave-one-out RMS error of the bond "
           "length times da/dd", digits=2, shown=False),
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
    Column("tight_binding_direct", "tb_direct", "Direct (sp3 model)", "",
           "Whether the sp3 tight-binding model puts the smallest gap at Gamma", "text",
           shown=False),
)
COLUMNS_BY_KEY: dict[str, Column] = {c.key: c for c in COLUMNS}
