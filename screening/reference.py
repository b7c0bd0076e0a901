"""Measured reference data from ``seed_data/``: compounds, substrates, bowing, elastic constants.

Besides the model inputs, two validation tables are read here and kept apart from them: the
measured valence-band spin-orbit splittings Delta0 (``spin_orbit.csv``) and the measured
conduction-valley energies at Gamma, X and L (``valleys.csv``). The engine never fits to them;
tests compare its predictions with them.

Every value carries its source (handbook or paper, with year) and a ``from_memory`` flag: true
where the value was recalled rather than checked against the printed source. The CSV files and
their conventions are described in ``seed_data/README.md``. Values are at room temperature
(300 K) unless a row or column says otherwise (semimetal gaps and valley energies name their
temperature); lengths are in angstrom, energies in eV, elastic constants in GPa.

The loader validates each file as it reads it and raises :class:`SeedDataError` (a
``ValueError``) naming the file and line of the first problem: a wrong header, an unknown
property, a unit that does not match the property, a number that does not parse, a duplicate
row, an empty source or a ``from_memory`` other than ``true``/``false``.

The data directory is ``seed_data/`` next to the package, or the directory named by the
environment variable ``BONDGAP_SEED_DATA``; every loader also takes an explicit ``data_dir``.
Parsed files are cached per resolved path; :func:`clear_cache` forgets them.
"""

from __future__ import annotations

import csv
import math
import os
import re
from collections.abc import Iterator
from dataclasses import dataclass
from functools import lru_cache
from pathlib import Path

import numpy as np
from numpy.typing import ArrayLike, NDArray

from screening.structure import STRUCTURES

SEED_DATA_ENV = "BONDGAP_SEED_DATA"
"""Environment variable that overrides the seed-data directory."""

COMPOUNDS_FILE = "compounds.csv"
SUBSTRATES_FILE = "substrates.csv"
BOWING_FILE = "bowing.csv"
ELASTIC_FILE = "elastic.csv"
SPIN_ORBIT_FILE = "spin_orbit.csv"
VALLEYS_FILE = "valleys.csv"

COMPOUND_COLUMNS = ("formula", "property", "value", "unit", "source", "from_memory", "note")
SUBSTRATE_COLUMNS = ("name", "structure", "lattice_a", "lattice_c", "source", "from_memory", "note")
BOWING_COLUMNS = (
    "system",
    "alloy_formula_pattern",
    "compound_x0",
    "compound_x1",
    "varying_element",
    "valley",
    "bowing_eV",
    "bowing_linear_x_eV",
    "source",
    "from_memory",
    "note",
)
ELASTIC_COLUMNS = ("formula", "c11_GPa", "c12_GPa", "c44_GPa", "source", "from_memory", "note")
SPIN_ORBIT_COLUMNS = ("formula", "delta0_eV", "source", "from_memory", "note")
VALLEY_COLUMNS = (
    "formula",
    "valley",
    "energy_eV",
    "temperature_K",
    "source",
    "from_memory",
    "note",
)


COORDINATIONS = ("fourfold", "sixfold")
GAP_KINDS = ("direct", "indirect", "semimetal")
SUBSTRATE_STRUCTURES = ("diamond", "zincblende", "wurtzite", "hexagonal", "corundum")
"""Substrate structures: ``hexagonal`` is a hexagonal SiC polytype, ``corundum`` is sapphire."""

VALLEYS = ("Gamma", "X", "L")

PROPERTY_UNITS: dict[str, str] = {
    "structure": "",
    "coordination": "",
    "lattice_a": "angstrom",
    "lattice_c": "angstrom",
    "zincblende_lattice_a": "angstrom",
    "band_gap": "eV",
    "gap_kind": "",
    "direct_gap_gamma": "eV",
    "eps_inf": "",
}
"""Each compound property and its unit ("" for categorical or dimensionless values)."""

CATEGORICAL_PROPERTIES: dict[str, tuple[str, ...]] = {
    "structure": STRUCTURES,
    "coordination": COORDINATIONS,
    "gap_kind": GAP_KINDS,
}
"""Compound properties whose value is a word from a fixed list."""

_POSITIVE_PROPERTIES = ("lattice_a", "lattice_c", "zincblende_lattice_a", "eps_inf")
_FORMULA_RE = re.compile(r"^(?:[A-Z][a-z]?){1,2}$")


class SeedDataError(ValueError):
    """A seed-data file that cannot be read: the message names the file and the line."""


@dataclass(frozen=True)
class Measured:
    """One measured value of one compound, with its provenance.

    Attributes:
        value: The number (float) or, for categorical properties, the word (str).
        unit: ``"angstrom"``, ``"eV"`` or ``""`` (categorical or dimensionless).
        source: Handbook or paper, with year.
        from_memory: True where the value was recalled rather than checked against the source.
        note: Free text: temperature, competing values, doubts.
    """

    value: float | str
    unit: str
    source: str
    from_memory: bool
    note: str


@dataclass(frozen=True)
class Substrate:
    """A substrate for epitaxy and its room-temperature lattice constants.

    Attributes:
        name: Substrate name as used in the tables ("GaAs", "6H-SiC", "sapphire").
        structure: One of :data:`SUBSTRATE_STRUCTURES`.
        lattice_a_angstrom: Cubic lattice constant, or the in-plane a of a hexagonal substrate.
        lattice_c_angstrom: The c axis of a hexagonal substrate; None for cubic ones.
        source: Handbook or paper, with year.
        from_memory: True where the value was recalled rather than checked against the source.
        note: Free text.
    """

    name: str
    structure: str
    lattice_a_angstrom: float
    lattice_c_angstrom: float | None
    source: str
    from_memory: bool
    note: str


@dataclass(frozen=True)
class BowingParameter:
    """Band-gap bowing of one ternary alloy at one valley.

    Convention (Vurgaftman, Meyer & Ram-Mohan, J. Appl. Phys. 89, 5815 (2001)): for the alloy
    with a fraction x of ``compound_x1`` and 1 - x of ``compound_x0``,
    E(x) = (1 - x) E_x0 + x E_x1 - x (1 - x) C(x), with C(x) = C0 + C1 x. A positive C bows
    the gap downwards.

    Attributes:
        system: Short alloy name ("AlGaAs").
        alloy_formula_pattern: The alloy with its composition variable ("Al_xGa_{1-x}As").
        compound_x0: The end compound at x = 0 ("GaAs").
        compound_x1: The end compound at x = 1 ("AlAs").
        varying_element: The element whose fraction is x ("Al").
        valley: Conduction-band valley of the gap: "Gamma", "X" or "L".
        bowing_eV: C0 in eV.
        bowing_linear_x_eV: C1 in eV (0 for a constant bowing parameter).
        source: Paper, with year.
        from_memory: True where the value was recalled rather than checked against the source.
        note: Free text.
    """

    system: str
    alloy_formula_pattern: str
    compound_x0: str
    compound_x1: str
    varying_element: str
    valley: str
    bowing_eV: float
    bowing_linear_x_eV: float
    source: str
    from_memory: bool
    note: str

    def bowing_at(self, x: ArrayLike) -> NDArray[np.float64]:
        """Return the bowing parameter C(x) = C0 + C1 x in eV.

        Args:
            x: Fraction of ``compound_x1`` (scalar or array, 0 <= x <= 1).

        Returns:
            C(x) in eV, with the shape of ``x``.
        """
        x_arr = np.asarray(x, dtype=float)
        return self.bowing_eV + self.bowing_linear_x_eV * x_arr

    def gap_eV(self, x: ArrayLike, gap_x0_eV: float, gap_x1_eV: float) -> NDArray[np.float64]:
        """Return the bowed gap E(x) = (1 - x) E_x0 + x E_x1 - x (1 - x) C(x) in eV.

        Args:
            x: Fraction of ``compound_x1`` (scalar or array, 0 <= x <= 1).
            gap_x0_eV: Gap of ``compound_x0`` at this valley, in eV.
            gap_x1_eV: Gap of ``compound_x1`` at this valley, in eV.

        Returns:
            The alloy gap in eV, with the shape of ``x``.
        """
        x_arr = np.asarray(x, dtype=float)
        linear = (1.0 - x_arr) * gap_x0_eV + x_arr * gap_x1_eV
        return linear - x_arr * (1.0 - x_arr) * self.bowing_at(x_arr)


@dataclass(frozen=True)
class ElasticConstants:
    """Cubic elastic stiffness constants at room temperature.

    Attributes:
        formula: Normalised compound formula.
        c11_GPa: C11 in GPa.
        c12_GPa: C12 in GPa.
        c44_GPa: C44 in GPa.
        source: Handbook or paper, with year.
        from_memory: True where the value was recalled rather than checked against the source.
        note: Free text.
    """

    formula: str
    c11_GPa: float
    c12_GPa: float
    c44_GPa: float
    source: str
    from_memory: bool
    note: str

    @property
    def poisson_ratio_001(self) -> float:
        """Poisson ratio for biaxial strain in the (001) plane, nu = C12 / (C11 + C12)."""
        return self.c12_GPa / (self.c11_GPa + self.c12_GPa)


@dataclass(frozen=True)
class SpinOrbitSplitting:
    """Measured valence-band spin-orbit splitting Delta0 of one compound (validation data).

    Delta0 = E(Gamma8) - E(Gamma7) at the valence-band top (Gamma25' split in the diamond
    structure); negative where Gamma7 lies above Gamma8 (CuCl). For a wurtzite compound it is
    the spin-orbit parameter of the quasi-cubic model.

    Attributes:
        formula: Normalised compound formula.
        delta0_eV: Delta0 in eV.
        source: Handbook or paper, with year.
        from_memory: True where the value was recalled rather than checked against the source.
        note: Free text.
    """

    formula: str
    delta0_eV: float
    source: str
    from_memory: bool
    note: str


@dataclass(frozen=True)
class ValleyEnergy:
    """Measured energy of one conduction-band valley above the valence-band top (validation data).

    Attributes:
        formula: Normalised compound formula.
        valley: "Gamma", "X" or "L" (X stands for the Delta-line minimum near X in C and Si).
        energy_eV: Energy of the valley minimum above the valence-band maximum, in eV.
        temperature_K: Temperature of the value in K (0 for extrapolated band-edge values).
        source: Handbook or paper, with year.
        from_memory: True where the value was recalled rather than checked against the source.
        note: Free text.
    """

    formula: str
    valley: str
    energy_eV: float
    temperature_K: float
    source: str
    from_memory: bool
    note: str


def seed_data_dir() -> Path:
    """Return the seed-data directory.

    Returns:
        The directory named by ``BONDGAP_SEED_DATA`` if that is set and not empty, else the
        repository's ``seed_data/`` next to the ``screening`` package.
    """
    override = os.environ.get(SEED_DATA_ENV, "").strip()
    if override:
        return Path(override).expanduser().resolve()
    return Path(__file__).resolve().parent.parent / "seed_data"


def measured_compounds(data_dir: Path | str | None = None) -> dict[str, dict[str, Measured]]:
    """Return the measured compound data, formula -> property -> :class:`Measured`.

    Args:
        data_dir: Directory holding ``compounds.csv``; default :func:`seed_data_dir`.

    Returns:
        A new dict (safe to modify) keyed by normalised formula, e.g. ``"GaAs"``.

    Raises:
        SeedDataError: If the file is missing or malformed (the message names file and line).
    """
    cached = _load_compounds(_file(data_dir, COMPOUNDS_FILE))
    return {formula: dict(props) for formula, props in cached.items()}


def substrates(data_dir: Path | str | None = None) -> dict[str, Substrate]:
    """Return the substrate table, name -> :class:`Substrate`.

    Args:
        data_dir: Directory holding ``substrates.csv``; default :func:`seed_data_dir`.

    Returns:
        A new dict keyed by substrate name, e.g. ``"InP"`` or ``"6H-SiC"``.

    Raises:
        SeedDataError: If the file is missing or malformed.
    """
    return dict(_load_substrates(_file(data_dir, SUBSTRATES_FILE)))


def bowing_parameters(
    data_dir: Path | str | None = None,
) -> dict[tuple[str, str], BowingParameter]:
    """Return the band-gap bowing table, (system, valley) -> :class:`BowingParameter`.

    Args:
        data_dir: Directory holding ``bowing.csv``; default :func:`seed_data_dir`.

    Returns:
        A new dict keyed by e.g. ``("AlGaAs", "Gamma")``.

    Raises:
        SeedDataError: If the file is missing or malformed.
    """
    return dict(_load_bowing(_file(data_dir, BOWING_FILE)))


def bowing_for(
    compound_a: str, compound_b: str, valley: str = "Gamma", data_dir: Path | str | None = None
) -> BowingParameter | None:
    """Return the bowing parameter of the alloy between two binaries, in either order.

    Check ``compound_x0`` of the result: a composition-dependent C(x) refers to the fraction
    of ``compound_x1``.

    Args:
        compound_a: One end compound (normalised formula).
        compound_b: The other end compound.
        valley: "Gamma", "X" or "L".
        data_dir: Directory holding ``bowing.csv``; default :func:`seed_data_dir`.

    Returns:
        The matching parameter, or None if the table has no such alloy and valley.
    """
    ends = {compound_a, compound_b}
    for param in _load_bowing(_file(data_dir, BOWING_FILE)).values():
        if param.valley == valley and {param.compound_x0, param.compound_x1} == ends:
            return param
    return None


def elastic_constants(data_dir: Path | str | None = None) -> dict[str, ElasticConstants]:
    """Return the cubic elastic constants, formula -> :class:`ElasticConstants`.

    Args:
        data_dir: Directory holding ``elastic.csv``; default :func:`seed_data_dir`.

    Returns:
        A new dict keyed by normalised formula.

    Raises:
        SeedDataError: If the file is missing or malformed.
    """
    return dict(_load_elastic(_file(data_dir, ELASTIC_FILE)))


def spin_orbit_splittings(data_dir: Path | str | None = None) -> dict[str, SpinOrbitSplitting]:
    """Return the measured valence-band spin-orbit splittings, formula -> Delta0.

    Validation data: kept apart from the model inputs, for checking a computed Delta0.

    Args:
        data_dir: Directory holding ``spin_orbit.csv``; default :func:`seed_data_dir`.

    Returns:
        A new dict keyed by normalised formula.

    Raises:
        SeedDataError: If the file is missing or malformed.
    """
    return dict(_load_spin_orbit(_file(data_dir, SPIN_ORBIT_FILE)))


def valley_energies(data_dir: Path | str | None = None) -> dict[str, dict[str, ValleyEnergy]]:
    """Return the measured conduction-valley energies, formula -> valley -> :class:`ValleyEnergy`.

    Validation data: kept apart from the model inputs. All valleys of one compound are given at
    one temperature, so their order is meaningful.

    Args:
        data_dir: Directory holding ``valleys.csv``; default :func:`seed_data_dir`.

    Returns:
        A new dict keyed by normalised formula, then by "Gamma", "X" or "L".

    Raises:
        SeedDataError: If the file is missing or malformed.
    """
    cached = _load_valleys(_file(data_dir, VALLEYS_FILE))
    return {formula: dict(valleys) for formula, valleys in cached.items()}


def valley_order(formula: str, data_dir: Path | str | None = None) -> tuple[str, ...]:
    """Return the measured valleys of a compound from the lowest to the highest energy.

    Args:
        formula: Normalised compound formula, e.g. ``"GaP"``.
        data_dir: Directory holding ``valleys.csv``; default :func:`seed_data_dir`.

    Returns:
        Valley names ordered by energy (e.g. ``("X", "L", "Gamma")`` for GaP); empty if the
        table has no row for the compound.
    """
    valleys = _load_valleys(_file(data_dir, VALLEYS_FILE)).get(formula, {})
    return tuple(sorted(valleys, key=lambda name: valleys[name].energy_eV))


def clear_cache() -> None:
    """Forget every parsed file, so the next call reads the files again."""
    for loader in (
        _load_compounds,
        _load_substrates,
        _load_bowing,
        _load_elastic,
        _load_spin_orbit,
        _load_valleys,
    ):
        loader.cache_clear()


# ------------------------------------------------------------------------------------------
# Parsing helpers


def _file(data_dir: Path | str | None, name: str) -> Path:
    base = seed_data_dir() if data_dir is None else Path(data_dir).expanduser().resolve()
    return base / name


def _rows(path: Path, columns: tuple[str, ...]) -> Iterator[tuple[int, dict[str, str]]]:
    """Yield (line number, row) for each data row of a CSV file with exactly ``columns``."""
    if not path.is_file():
        raise SeedDataError(f"{path}: seed-data file not found")
    with path.open(newline="", encoding="utf-8") as handle:
        reader = csv.reader(handle)
        header = next(reader, None)
        if header is None or tuple(h.strip() for h in header) != columns:
            raise SeedDataError(
                f"{path}:1: header must be exactly {','.join(columns)}; "
                f"found {','.join(header or [])!r}"
            )
        for record in reader:
            line = reader.line_num
            if not record or all(not cell.strip() for cell in record):
                continue
            if len(record) != len(columns):
                raise SeedDataError(
                    f"{path}:{line}: expected {len(columns)} fields, found {len(record)}"
                )
            yield line, {col: cell.strip() for col, cell in zip(columns, record, strict=True)}


def _where(path: Path, line: int) -> str:
    return f"{path}:{line}"


def _provenance(path: Path, line: int, row: dict[str, str]) -> tuple[str, bool]:
    """Return (source, from_memory) of a row, checking both."""
    source = row["source"]
    if not source:
        raise SeedDataError(f"{_where(path, line)}: missing source (every value needs one)")
    flag = row["from_memory"].lower()
    if flag not in ("true", "false"):
        raise SeedDataError(
            f"{_where(path, line)}: from_memory must be 'true' or 'false', "
            f"found {row['from_memory']!r}"
        )
    return source, flag == "true"


def _number(path: Path, line: int, column: str, text: str) -> float:
    """Parse a finite float, or raise naming the file, line and column."""
    try:
        value = float(text)
    except ValueError:
        raise SeedDataError(f"{_where(path, line)}: {column} {text!r} is not a number") from None
    if not math.isfinite(value):
        raise SeedDataError(f"{_where(path, line)}: {column} {text!r} is not a finite number")
    return value


def _optional_number(path: Path, line: int, column: str, text: str) -> float | None:
    return None if text == "" else _number(path, line, column, text)


def _check_formula(path: Path, line: int, formula: str) -> None:
    if not _FORMULA_RE.match(formula):
        raise SeedDataError(
            f"{_where(path, line)}: formula {formula!r} is not an element or a binary "
            "compound written as element symbols (e.g. 'Si', 'GaAs')"
        )


def _choice(path: Path, line: int, what: str, value: str, allowed: tuple[str, ...]) -> str:
    if value not in allowed:
        raise SeedDataError(
            f"{_where(path, line)}: {what} {value!r} is not one of {', '.join(allowed)}"
        )
    return value


# ------------------------------------------------------------------------------------------
# The loaders (cached per resolved file path)


@lru_cache(maxsize=16)
def _load_compounds(path: Path) -> dict[str, dict[str, Measured]]:
    data: dict[str, dict[str, Measured]] = {}
    first_line: dict[tuple[str, str], int] = {}
    for line, row in _rows(path, COMPOUND_COLUMNS):
        formula, prop, unit = row["formula"], row["property"], row["unit"]
        _check_formula(path, line, formula)
        if prop not in PROPERTY_UNITS:
            raise SeedDataError(
                f"{_where(path, line)}: unknown property {prop!r}; accepted: "
                f"{', '.join(PROPERTY_UNITS)}"
            )
        expected_unit = PROPERTY_UNITS[prop]
        if unit != expected_unit:
            raise SeedDataError(
                f"{_where(path, line)}: unit {unit!r} does not match property {prop!r} "
                f"(expected {expected_unit!r})"
            )
        key = (formula, prop)
        if key in first_line:
            raise SeedDataError(
                f"{_where(path, line)}: duplicate {prop!r} for {formula} "
                f"(first given on line {first_line[key]})"
            )
        first_line[key] = line
        source, from_memory = _provenance(path, line, row)
        value: float | str
        if prop in CATEGORICAL_PROPERTIES:
            value = _choice(path, line, prop, row["value"], CATEGORICAL_PROPERTIES[prop])
        else:
            value = _number(path, line, prop, row["value"])
            if prop in _POSITIVE_PROPERTIES and value <= 0:
                raise SeedDataError(f"{_where(path, line)}: {prop} must be positive")
        data.setdefault(formula, {})[prop] = Measured(
            value=value, unit=unit, source=source, from_memory=from_memory, note=row["note"]
        )
    for formula, props in data.items():
        structure = props.get("structure")
        if "lattice_c" in props and (structure is None or structure.value != "wurtzite"):
            raise SeedDataError(
                f"{path}:{first_line[(formula, 'lattice_c')]}: lattice_c given for {formula}, "
                "whose structure is not wurtzite"
            )
    return data


@lru_cache(maxsize=16)
def _load_substrates(path: Path) -> dict[str, Substrate]:
    data: dict[str, Substrate] = {}
    for line, row in _rows(path, SUBSTRATE_COLUMNS):
        name = row["name"]
        if not name:
            raise SeedDataError(f"{_where(path, line)}: empty substrate name")
        if name in data:
            raise SeedDataError(f"{_where(path, line)}: duplicate substrate {name!r}")
        structure = _choice(path, line, "structure", row["structure"], SUBSTRATE_STRUCTURES)
        a = _number(path, line, "lattice_a", row["lattice_a"])
        c = _optional_number(path, line, "lattice_c", row["lattice_c"])
        if a <= 0 or (c is not None and c <= 0):
            raise SeedDataError(f"{_where(path, line)}: lattice constants must be positive")
        hexagonal = structure in ("wurtzite", "hexagonal", "corundum")
        if hexagonal != (c is not None):
            raise SeedDataError(
                f"{_where(path, line)}: lattice_c is required for hexagonal substrates and "
                f"must be empty for cubic ones ({name}: {structure})"
            )
        source, from_memory = _provenance(path, line, row)
        data[name] = Substrate(
            name=name,
            structure=structure,
            lattice_a_angstrom=a,
            lattice_c_angstrom=c,
            source=source,
            from_memory=from_memory,
            note=row["note"],
        )
    return data


@lru_cache(maxsize=16)
def _load_bowing(path: Path) -> dict[tuple[str, str], BowingParameter]:
    data: dict[tuple[str, str], BowingParameter] = {}
    for line, row in _rows(path, BOWING_COLUMNS):
        system = row["system"]
        valley = _choice(path, line, "valley", row["valley"], VALLEYS)
        for column in ("compound_x0", "compound_x1"):
            _check_formula(path, line, row[column])
        x0, x1, element = row["compound_x0"], row["compound_x1"], row["varying_element"]
        if not system or not row["alloy_formula_pattern"]:
            raise SeedDataError(f"{_where(path, line)}: empty system or alloy_formula_pattern")
        if x0 == x1:
            raise SeedDataError(f"{_where(path, line)}: compound_x0 and compound_x1 are equal")
        if element not in _elements(x1) or element in _elements(x0):
            raise SeedDataError(
                f"{_where(path, line)}: varying_element {element!r} must occur in "
                f"compound_x1 ({x1}) and not in compound_x0 ({x0})"
            )
        if (system, valley) in data:
            raise SeedDataError(f"{_where(path, line)}: duplicate bowing row {system} {valley}")
        source, from_memory = _provenance(path, line, row)
        data[(system, valley)] = BowingParameter(
            system=system,
            alloy_formula_pattern=row["alloy_formula_pattern"],
            compound_x0=x0,
            compound_x1=x1,
            varying_element=element,
            valley=valley,
            bowing_eV=_number(path, line, "bowing_eV", row["bowing_eV"]),
            bowing_linear_x_eV=_number(path, line, "bowing_linear_x_eV", row["bowing_linear_x_eV"]),
            source=source,
            from_memory=from_memory,
            note=row["note"],
        )
    return data


@lru_cache(maxsize=16)
def _load_elastic(path: Path) -> dict[str, ElasticConstants]:
    data: dict[str, ElasticConstants] = {}
    for line, row in _rows(path, ELASTIC_COLUMNS):
        formula = row["formula"]
        _check_formula(path, line, formula)
        if formula in data:
            raise SeedDataError(f"{_where(path, line)}: duplicate elastic constants for {formula}")
        c11, c12, c44 = (
            _number(path, line, column, row[column]) for column in ("c11_GPa", "c12_GPa", "c44_GPa")
        )
        if min(c11, c12, c44) <= 0:
            raise SeedDataError(f"{_where(path, line)}: elastic constants must be positive")
        source, from_memory = _provenance(path, line, row)
        data[formula] = ElasticConstants(
            formula=formula,
            c11_GPa=c11,
            c12_GPa=c12,
            c44_GPa=c44,
            source=source,
            from_memory=from_memory,
            note=row["note"],
        )
    return data


@lru_cache(maxsize=16)
def _load_spin_orbit(path: Path) -> dict[str, SpinOrbitSplitting]:
    data: dict[str, SpinOrbitSplitting] = {}
    for line, row in _rows(path, SPIN_ORBIT_COLUMNS):
        formula = row["formula"]
        _check_formula(path, line, formula)
        if formula in data:
            raise SeedDataError(f"{_where(path, line)}: duplicate spin-orbit row for {formula}")
        source, from_memory = _provenance(path, line, row)
        data[formula] = SpinOrbitSplitting(
            formula=formula,
            delta0_eV=_number(path, line, "delta0_eV", row["delta0_eV"]),
            source=source,
            from_memory=from_memory,
            note=row["note"],
        )
    return data


@lru_cache(maxsize=16)
def _load_valleys(path: Path) -> dict[str, dict[str, ValleyEnergy]]:
    data: dict[str, dict[str, ValleyEnergy]] = {}
    for line, row in _rows(path, VALLEY_COLUMNS):
        formula = row["formula"]
        _check_formula(path, line, formula)
        valley = _choice(path, line, "valley", row["valley"], VALLEYS)
        if valley in data.get(formula, {}):
            raise SeedDataError(f"{_where(path, line)}: duplicate {valley} valley for {formula}")
        temperature = _number(path, line, "temperature_K", row["temperature_K"])
        if temperature < 0:
            raise SeedDataError(f"{_where(path, line)}: temperature_K must not be negative")
        others = data.get(formula, {})
        if others and next(iter(others.values())).temperature_K != temperature:
            raise SeedDataError(
                f"{_where(path, line)}: every valley of {formula} must be given at one "
                "temperature, so that their order means something"
            )
        source, from_memory = _provenance(path, line, row)
        data.setdefault(formula, {})[valley] = ValleyEnergy(
            formula=formula,
            valley=valley,
            energy_eV=_number(path, line, "energy_eV", row["energy_eV"]),
            temperature_K=temperature,
            source=source,
            from_memory=from_memory,
            note=row["note"],
        )
    return data


def _elements(formula: str) -> list[str]:
    return re.findall(r"[A-Z][a-z]?", formula)
