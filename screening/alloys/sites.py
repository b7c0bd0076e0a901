"""The two sublattices of an octet alloy: which element sits where, and in which order.

In an octet alloy every cation (valence v < 4) shares one sublattice and every anion
(valence 8 - v) the other; each site's fractions sum to one. The display order of the
elements follows common usage in the device literature (InGaAs, AlGaAs, GaAsP, InGaAsP,
HgCdTe, ZnCdSe, MgZnO); input in any order is accepted.
"""

from __future__ import annotations

from collections.abc import Iterable
from typing import Final

from screening.elements import FAMILIES, VALENCE, atomic_number
from screening.errors import CompositionError, NotOctetCompoundError

CATION_ORDER: Final[tuple[str, ...]] = (
    "Hg", "B", "Al", "In", "Ga", "Tl", "Be", "Mg", "Ca", "Sr", "Ba", "Zn", "Cd",
    "Li", "Na", "K", "Rb", "Cu", "Ag",
)  # fmt: skip
"""Display order of cation-site elements (InGaAs, AlGaAs, AlInGaP, HgCdTe, ZnCdSe, MgZnO)."""

ANION_ORDER: Final[tuple[str, ...]] = (
    "As", "P", "Sb", "N", "Bi", "O", "S", "Se", "Te", "F", "Cl", "Br", "I",
)  # fmt: skip
"""Display order of anion-site elements (GaAsP, GaAsSb, InAsSbP, ZnSSe, ZnSeTe)."""

ACCEPTED_FORMS = (
    "ternaries A(x)B(1-x)C and AC(y)D(1-y), quaternaries A(x)B(1-x)C(y)D(1-y), "
    "A(x)B(y)C(1-x-y)D and AB(x)C(y)D(1-x-y)"
)
"""The alloy forms the engine handles, for error messages."""


def _ordered(symbols: Iterable[str], order: tuple[str, ...]) -> tuple[str, ...]:
    rank = {symbol: i for i, symbol in enumerate(order)}
    return tuple(sorted(symbols, key=lambda s: (rank.get(s, len(order)), atomic_number(s))))


def split_sites(symbols: Iterable[str], shown: str) -> tuple[tuple[str, ...], tuple[str, ...]]:
    """Sort the elements of an alloy onto the cation and anion sublattices.

    Args:
        symbols: Distinct element symbols (already checked to be elements).
        shown: The text the user gave, for messages.

    Returns:
        (cations, anions), each in display order.

    Raises:
        NotOctetCompoundError: An element outside the octet families.
        CompositionError: Group-IV elements, elements of different valence on one site, a
            site left empty, or more elements than a quaternary has.
    """
    elements = list(dict.fromkeys(symbols))
    for symbol in elements:
        if symbol not in VALENCE:
            raise NotOctetCompoundError(
                f"{symbol} in '{shown}' is not an element of the octet families (groups I/11, "
                "II/12, III, IV, V, VI, VII as listed in the catalogue)"
            )
    group_iv = [s for s in elements if VALENCE[s] == 4]
    if group_iv:
        raise CompositionError(
            f"'{shown}' contains the group-IV element(s) {', '.join(group_iv)}: the alloy engine "
            "handles III-V, II-VI and I-VII alloys on two sublattices, not group-IV alloys "
            "(SiGe, GeSn) or group-IV atoms on a compound's sites"
        )
    cations = [s for s in elements if VALENCE[s] < 4]
    anions = [s for s in elements if VALENCE[s] > 4]
    if not cations or not anions:
        site = "cation" if not cations else "anion"
        raise CompositionError(
            f"'{shown}' has no element on the {site} site; an octet alloy needs both sites "
            "filled, e.g. In0.53Ga0.47As"
        )
    valences = {VALENCE[s] for s in cations} | {8 - VALENCE[s] for s in anions}
    if len(valences) != 1:
        described = ", ".join(f"{s} ({VALENCE[s]} valence electrons)" for s in elements)
        raise CompositionError(
            f"'{shown}' mixes sublattices of different families: {described}. Every cation "
            "must have the same valence v and every anion 8 - v (III-V, II-VI or I-VII)"
        )
    if (len(cations), len(anions)) not in ((1, 1), (2, 1), (1, 2), (2, 2), (3, 1), (1, 3)):
        raise CompositionError(
            f"'{shown}' has {len(cations)} cation(s) and {len(anions)} anion(s); accepted are "
            f"binaries and {ACCEPTED_FORMS}"
        )
    return _ordered(cations, CATION_ORDER), _ordered(anions, ANION_ORDER)


def family_of(cation: str) -> str:
    """Family name ("III-V", "II-VI", "I-VII") of an alloy with this cation-site element."""
    return FAMILIES[VALENCE[cation]]


def system_name(cations: Iterable[str], anions: Iterable[str]) -> str:
    """The name of an alloy system: its elements in display order, without numbers."""
    return "".join(_ordered(cations, CATION_ORDER)) + "".join(_ordered(anions, ANION_ORDER))
