"""Alloy systems: the end-point binaries of a ternary or quaternary and how they combine.

A system is a set of cation-site and anion-site elements, e.g. InGaAs (In, Ga | As) or InGaAsP
(In, Ga | As, P). Its end points are the binaries of every cation with every anion (InAs, GaAs;
InAs, InP, GaAs, GaP), which must share one ambient crystal structure: an alloy across
structures (zincblende GaAs with wurtzite GaN, zincblende ZnSe with wurtzite CdSe) is refused.

Each system also lists its *edges*: the ternary sub-alloys through which a quaternary's band
gap is interpolated (Glisson et al., J. Electron. Mater. 7, 1 (1978), in the form used by
Vurgaftman, Meyer & Ram-Mohan, J. Appl. Phys. 89, 5815 (2001)). An edge mixes two elements of
one site while an element of the other site is held: InGaAsP has the edges InGaAs, InGaP
(cation pairs) and InAsP, GaAsP (anion pairs).
"""

from __future__ import annotations

import re
from dataclasses import dataclass
from functools import lru_cache
from itertools import combinations

from screening.alloys.sites import family_of, split_sites, system_name
from screening.catalogue import catalogue
from screening.elements import atomic_number
from screening.errors import FormulaSyntaxError, MissingDataError, StructureMismatchError
from screening.reference import measured_compounds

ALLOY_STRUCTURES: tuple[str, ...] = ("zincblende", "wurtzite", "rocksalt")
"""Ambient structures whose binaries can form alloys here."""

LATTICE_OF_STRUCTURE: dict[str, str] = {
    "diamond": "cubic",
    "zincblende": "cubic",
    "rocksalt": "cubic",
    "wurtzite": "hexagonal",
    "hexagonal": "hexagonal",
    "corundum": "hexagonal",
}
"""Lattice kind compared in epitaxy: cubic a, or the hexagonal in-plane a."""

ALLOY_FAMILIES: tuple[str, ...] = ("III-V", "II-VI", "I-VII")
"""Families whose binaries form alloys on two sublattices."""

_SYSTEM_TEXT = re.compile(r"(?:[A-Z][a-z]?)+")


@dataclass(frozen=True)
class Edge:
    """A ternary sub-alloy of a system: two elements of one site mixed, one other held.

    Positions index :attr:`AlloySystem.elements`; slots index :attr:`AlloySystem.binaries`.

    Attributes:
        first: Position of the element whose fraction is 1 - u along the edge.
        second: Position of the element whose fraction is u along the edge.
        other: Position of the element held on the other site.
        slot_first: Binary of ``first`` with ``other``.
        slot_second: Binary of ``second`` with ``other``.
    """

    first: int
    second: int
    other: int
    slot_first: int
    slot_second: int


@dataclass(frozen=True)
class AlloySystem:
    """An alloy system: the elements of each site and their end-point binaries.

    Attributes:
        name: Elements in display order without numbers ("InGaAsP").
        cations: Cation-site elements in display order.
        anions: Anion-site elements in display order.
        family: "III-V", "II-VI" or "I-VII".
        structure: Ambient structure shared by every end point, or None where one of them has
            no measured structure.
        binaries: End-point binaries, cation-major: slot i * len(anions) + j holds
            cations[i] + anions[j].
    """

    name: str
    cations: tuple[str, ...]
    anions: tuple[str, ...]
    family: str
    structure: str | None
    binaries: tuple[str, ...]

    @property
    def elements(self) -> tuple[str, ...]:
        """Cation-site then anion-site elements; the column order of composition arrays."""
        return self.cations + self.anions

    @property
    def form(self) -> str:
        """"binary", "ternary" or "quaternary"."""
        return ("binary", "ternary", "quaternary")[len(self.elements) - 2]

    @property
    def lattice(self) -> str | None:
        """"cubic" or "hexagonal" (the lattice constant compared with a substrate), or None."""
        return None if self.structure is None else LATTICE_OF_STRUCTURE[self.structure]

    def slot(self, cation: int, anion: int) -> int:
        """Slot of the binary of cation position ``cation`` and anion index ``anion``."""
        return cation * len(self.anions) + anion

    @property
    def slot_elements(self) -> tuple[tuple[int, int], ...]:
        """(cation position, anion position) in :attr:`elements` for every binary slot."""
        n_cat = len(self.cations)
        return tuple(
            (i, n_cat + j) for i in range(n_cat) for j in range(len(self.anions))
        )

    @property
    def edges(self) -> tuple[Edge, ...]:
        """The ternary sub-alloys that interpolate the gap (one for a ternary)."""
        n_cat = len(self.cations)
        edges = [
            Edge(i, k, n_cat + j, self.slot(i, j), self.slot(k, j))
            for i, k in combinations(range(n_cat), 2)
            for j in range(len(self.anions))
        ]
        edges += [
            Edge(n_cat + j, n_cat + m, i, self.slot(i, j), self.slot(i, m))
            for j, m in combinations(range(len(self.anions)), 2)
            for i in range(n_cat)
        ]
        return tuple(edges)


def _structure(binary: str) -> str | None:
    data = measured_compounds().get(binary, {})
    item = data.get("structure")
    return None if item is None or item.value not in ALLOY_STRUCTURES else str(item.value)


def alloy_system(cations: tuple[str, ...], anions: tuple[str, ...], shown: str) -> AlloySystem:
    """Build the system of the given site elements and check that its end points agree.

    Args:
        cations: Cation-site elements in display order (from :func:`split_sites`).
        anions: Anion-site elements in display order.
        shown: The text the user gave, for messages.

    Returns:
        The system.

    Raises:
        StructureMismatchError: End points of different ambient structures.
    """
    binaries = tuple(c + a for c in cations for a in anions)
    structures = {b: _structure(b) for b in binaries}
    known = {s for s in structures.values() if s is not None}
    if len(known) > 1:
        listed = ", ".join(f"{b} {s or 'unknown'}" for b, s in structures.items())
        raise StructureMismatchError(
            f"'{shown}' mixes crystal structures ({listed}); an alloy's end points must share "
            "one ambient structure (zincblende, wurtzite or rocksalt)"
        )
    structure = known.pop() if known and None not in structures.values() else None
    return AlloySystem(
        name=system_name(cations, anions),
        cations=cations,
        anions=anions,
        family=family_of(cations[0]),
        structure=structure,
        binaries=binaries,
    )


def parse_system(text: str) -> AlloySystem:
    """Read an alloy system written as a formula without numbers, in any element order.

    Args:
        text: e.g. "InGaAs", "GaInAs", "InGaAsP", "AlGaInP".

    Returns:
        The system.

    Raises:
        FormulaSyntaxError: Text that is not element symbols without numbers, or a repeat.
        UnknownElementError: A token that is not an element.
        NotOctetCompoundError, CompositionError: Elements that do not form an octet alloy.
        StructureMismatchError: End points of different structures.
    """
    shown = text.strip()
    if not _SYSTEM_TEXT.fullmatch(shown):
        raise FormulaSyntaxError(
            f"cannot read '{shown}' as an alloy system: write its element symbols without "
            "numbers, e.g. InGaAs or InGaAsP (or 'all')"
        )
    symbols = re.findall(r"[A-Z][a-z]?", shown)
    for symbol in symbols:
        atomic_number(symbol)
    if len(set(symbols)) != len(symbols):
        raise FormulaSyntaxError(f"'{shown}' names an element twice; give each element once")
    cations, anions = split_sites(symbols, shown)
    return alloy_system(cations, anions, shown)


def has_measured_data(binary: str) -> bool:
    """True where a binary has a measured lattice constant, band gap and alloy structure."""
    data = measured_compounds().get(binary, {})
    return "lattice_a" in data and "band_gap" in data and _structure(binary) is not None


def require_measured_data(system: AlloySystem) -> None:
    """Raise unless every end point of ``system`` has the data the engine needs.

    Raises:
        MissingDataError: Naming the binaries and what they lack.
    """
    missing = [b for b in system.binaries if not has_measured_data(b)]
    if missing:
        raise MissingDataError(
            f"{system.name} cannot be evaluated: {', '.join(missing)} "
            f"{'has' if len(missing) == 1 else 'have'} no measured lattice constant, band gap "
            "or alloy-forming structure (zincblende, wurtzite, rocksalt) in the seed data"
        )


@lru_cache(maxsize=8)
def design_space_systems(families: tuple[str, ...] = ALLOY_FAMILIES) -> tuple[AlloySystem, ...]:
    """Every ternary and quaternary of the catalogue binaries with measured data.

    Binaries of one family and one ambient structure are combined in every accepted form:
    A(x)B(1-x)C, AC(y)D(1-y), A(x)B(1-x)C(y)D(1-y), A(x)B(y)C(1-x-y)D, AB(x)C(y)D(1-x-y),
    wherever every end point has a measured lattice constant and band gap.

    Args:
        families: Families to include ("III-V", "II-VI", "I-VII").

    Returns:
        The systems, ternaries first, then quaternaries, each sorted by name.
    """
    measured = [c for c in catalogue() if c.family in families and has_measured_data(c.formula)]
    present = {(c.cation, c.anion) for c in measured}
    found: dict[str, AlloySystem] = {}
    groups: dict[tuple[str, str | None], list[tuple[str, str]]] = {}
    for compound in measured:
        key = (compound.family, _structure(compound.formula))
        groups.setdefault(key, []).append((compound.cation, compound.anion))
    for pairs in groups.values():
        cations = sorted({c for c, _ in pairs})
        anions = sorted({a for _, a in pairs})
        shapes = [(cs, ans) for n_c, n_a in ((2, 1), (1, 2), (2, 2), (3, 1), (1, 3))
                  for cs in combinations(cations, n_c) for ans in combinations(anions, n_a)]
        for cs, ans in shapes:
            if all((c, a) in present and (c, a) in pairs for c in cs for a in ans):
                ordered_c, ordered_a = split_sites([*cs, *ans], "".join(cs + ans))
                system = alloy_system(ordered_c, ordered_a, "".join(cs + ans))
                found[system.name] = system
    return tuple(sorted(found.values(), key=lambda s: (len(s.elements), s.name)))
