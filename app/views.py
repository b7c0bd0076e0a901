"""What the compound page shows, built from an engine report: numbered lines and chart data.

Labels, units, routes and references of computed quantities come from `screening.registry`,
so the page lists whatever the registry lists; measured values carry their own source.

`caution_line` (from `screening.hazards`) is the one caution every page and command shows.
"""

from __future__ import annotations

import math
from collections.abc import Iterable
from dataclasses import dataclass
from typing import Any

from app.numbers import estimate_text
from screening.hazards import caution_line as caution_line
from screening.phillips import CRITICAL_IONICITY
from screening.registry import BOND_ORBITAL, QUANTITIES, Quantity
from screening.registry import report_value as dig
from screening.temperature import wavelength_nm

EXTRA_QUANTITIES: tuple[Quantity, ...] = (
    Quantity("harrison.hybrid_energy_cation_eV", "Cation sp3 hybrid energy", "eV",
             "(eps_s + 3 eps_p)/4 of the cation", BOND_ORBITAL),
    Quantity("harrison.hybrid_energy_anion_eV", "Anion sp3 hybrid energy", "eV",
             "(eps_s + 3 eps_p)/4 of the anion", BOND_ORBITAL),
)
"""Report values the page shows that `screening.registry` does not list (yet)."""

MEASURED: tuple[tuple[str, str, str], ...] = (
    ("band_gap_eV", "Band gap", "eV"),
    ("gap_kind", "Gap kind", ""),
    ("eps_inf", "High-frequency dielectric constant ε∞", ""),
    ("lattice_a", "Lattice constant a (as measured)", "Å"),
    ("lattice_c", "Lattice constant c (as measured)", "Å"),
)
"""Keys of `report["measured"]` shown in the measured section: key, label, default unit."""

UNIT_SYMBOLS: dict[str, str] = {"angstrom": "Å"}
"""Unit names in the seed data shown as symbols."""

SECTION_TITLES: dict[str, str] = {
    "phillips": "Dielectric theory (Phillips–Van Vechten)",
    "harrison": "Bond orbitals (Harrison)",
    "coordination": "Coordination",
}


@dataclass(frozen=True)
class Line:
    """One number (or word) on the compound page, with everything needed to trust it.

    Attributes:
        label: What the number is.
        value: The number (or word); None where not known.
        unit: Its unit ("" for none).
        route: How it was obtained ("measured", a model's formula, ...).
        source: Where it comes from (publication, seed data).
        uncertainty: The estimate's uncertainty (same unit), shown as "± u".
        wavelength_nm: Photon wavelength of a band gap, shown beside it.
        wavelength_range_nm: (short, long) wavelengths of an estimate's range, shown instead
            of one wavelength; long None where the range reaches zero (may be a semimetal).
        key: A stable name for the line (page element ids, tests).
    """

    label: str
    value: float | str | None
    unit: str
    route: str
    source: str
    uncertainty: float | None = None
    wavelength_nm: float | None = None
    key: str = ""
    wavelength_range_nm: tuple[float, float | None] | None = None

    @property
    def text(self) -> str:
        """The value as shown: measured as given, estimates to their error bar (`app.numbers`)."""
        if self.value is None:
            return "—"
        if isinstance(self.value, bool) or not isinstance(self.value, int | float):
            return str(self.value)
        if self.route.startswith("measured"):
            return f"{self.value:.6g}"
        return estimate_text(self.value, self.uncertainty)

    @property
    def wavelength_text(self) -> str:
        """The photon wavelength (or an estimate's range) as shown ("" where there is none)."""
        if self.wavelength_range_nm is not None:
            short, long = self.wavelength_range_nm
            if long is None:
                return f"{short:.0f} nm or longer; may be a semimetal"
            return f"{short:.0f}–{long:.0f} nm"
        return f"{self.wavelength_nm:.0f} nm" if self.wavelength_nm else ""


@dataclass(frozen=True)
class Section:
    """A titled group of lines."""

    title: str
    lines: tuple[Line, ...]


def wavelength_of(gap_eV: Any) -> float | None:
    """Photon wavelength of a band gap in nm (hc/Eg); None for no gap or one <= 0."""
    if not _finite(gap_eV) or gap_eV <= 0:
        return None
    return float(wavelength_nm(gap_eV))


def _measured_lines(report: dict[str, Any]) -> tuple[Line, ...]:
    lines = [Line("Structure", dig(report, "structure.observed"), "", "observed",
                  dig(report, "structure.source") or "")]
    for key, label, unit in MEASURED:
        item = dig(report, f"measured.{key}")
        if key == "lattice_c" and item is None:
            continue
        if item is None:
            lines.append(Line(label, None, unit, "measured", "no value in the seed data"))
            continue
        source = str(item.get("source") or "")
        if item.get("from_memory"):
            source += " (from memory)"
        if item.get("note"):
            source += f"; {item['note']}"
        shown_unit = UNIT_SYMBOLS.get(item.get("unit") or "", item.get("unit") or unit)
        wavelength = wavelength_of(item.get("value")) if key == "band_gap_eV" else None
        lines.append(Line(label, item.get("value"), shown_unit, "measured", source,
                          wavelength_nm=wavelength, key=f"measured.{key}"))
    return tuple(lines)


def report_sections(report: dict[str, Any]) -> list[Section]:
    """The compound page's tables: measured values, then each model's quantities.

    Args:
        report: An engine report (docs/report-schema.md).

    Returns:
        Sections in display order; a quantity the report lacks shows as an empty value.
    """
    sections = [Section("Measured (seed data)", _measured_lines(report))]
    groups: dict[str, list[Line]] = {}
    known = {q.key for q in QUANTITIES}
    for q in (*QUANTITIES, *(e for e in EXTRA_QUANTITIES if e.key not in known)):
        group = q.key.split(".")[0] if "." in q.key else "structure"
        uncertainty = dig(report, q.uncertainty_key) if q.uncertainty_key else None
        line = Line(q.label, dig(report, q.key), q.unit, q.route_in(report), q.reference,
                    uncertainty=uncertainty)
        groups.setdefault(group, []).append(line)
    groups.setdefault("coordination", []).append(Line(
        "Coordination (observed)", dig(report, "coordination.observed"), "",
        "from the observed structure", dig(report, "structure.source") or ""))
    titles = {"structure": "Lattice and bond length", **SECTION_TITLES}
    for group, lines in groups.items():
        sections.append(Section(titles.get(group, group.capitalize()), tuple(lines)))
    return sections


def _finite(*values: Any) -> bool:
    return all(isinstance(v, int | float) and math.isfinite(v) for v in values)


def eh_c_chart(reports: Iterable[dict[str, Any]], *, formula: str) -> dict[str, Any]:
    """Data for the Eh-C plane: every compound, the critical ionicity line, `formula` marked.

    Each compound is placed by its spectroscopic Eh and C where the measured eps_inf allows,
    else by the predictive ones (the route is given per point).
    """
    points = []
    for r in reports:
        route = "spectroscopic" if dig(r, "phillips.spectroscopic.ionicity") is not None else (
            "predictive")
        eh = dig(r, f"phillips.{route}.homopolar_gap_eV")
        c = dig(r, f"phillips.{route}.heteropolar_gap_eV")
        if not _finite(eh, c):
            continue
        points.append({
            "formula": r["formula"], "family": r.get("family"), "eh": eh, "c": c,
            "ionicity": dig(r, f"phillips.{route}.ionicity"), "route": route,
            "coordination": dig(r, "coordination.observed"),
        })
    return {
        "formula": formula,
        "points": points,
        "critical_ionicity": CRITICAL_IONICITY,
        "critical_slope": math.sqrt(CRITICAL_IONICITY / (1.0 - CRITICAL_IONICITY)),
    }


def bond_levels_chart(report: dict[str, Any]) -> dict[str, Any] | None:
    """Data for the bond level diagram: two hybrid levels and the bonding/antibonding pair."""
    keys = ("hybrid_energy_cation_eV", "hybrid_energy_anion_eV", "bonding_eV", "antibonding_eV")
    values = [dig(report, f"harrison.{k}") for k in keys]
    if not _finite(*values):
        return None
    return {
        "formula": report["formula"], "cation": report["cation"], "anion": report["anion"],
        **dict(zip(("cation_eV", "anion_eV", "bonding_eV", "antibonding_eV"), values, strict=True)),
        "covalent_energy_eV": dig(report, "harrison.covalent_energy_eV"),
        "polar_energy_eV": dig(report, "harrison.polar_energy_eV"),
    }
