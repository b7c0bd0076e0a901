"""Reading formulas of octet binary compounds.

A compound AB is accepted when its two elements' valences sum to eight (IV-IV, III-V, II-VI,
I-VII) in a 1:1 ratio, or when it is a single group-IV element (C, Si, Ge, Sn). Names are
normalised cation first ("AsGa" -> "GaAs"); in IV-IV compounds carbon is written last and
otherwise the lighter element first (SiC, GeC, SiGe, GeSn).
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from screening.elements import ATOMIC_NUMBER, FAMILIES, VALENCE, atomic_number
from screening.errors import FormulaSyntaxError, NotOctetCompoundError, UnknownElementError

MAX_FORMULA_LENGTH = 64
"""Longest formula text accepted, in characters."""

_ALLOWED = re.compile(r"[A-Za-z0-9.()]+")


@dataclass(frozen=True)
class Compound:
    """An octet binary compound AB (A = cation, B = anion; the same element for C, Si, Ge, Sn)."""

    formula: str
    cation: str
    anion: str
    family: str

    @property
    def elements(self) -> tuple[str, ...]:
        """The distinct elements, cation first."""
        return (self.cation,) if self.cation == self.anion else (self.cation, self.anion)


def split_formula(text: str) -> list[tuple[str, float]]:
    """Split a formula such as ``Ga2As2`` or ``In0.53Ga0.47As`` into (symbol, amount) pairs.

    Parsing is done by pymatgen's ``Composition``; symbols are then checked against H..Rn.

    Raises:
        FormulaSyntaxError: empty, too long, or not of the form Symbol[amount]...
        UnknownElementError: a token that is not an element symbol.
    """
    stripped = text.strip()
    if not stripped:
        raise FormulaSyntaxError("the formula is empty; give one such as GaAs, ZnSe or NaCl")
    if len(stripped) > MAX_FORMULA_LENGTH:
        raise FormulaSyntaxError(
            f"the formula is {len(stripped)} characters long; at most {MAX_FORMULA_LENGTH} "
            "are accepted"
        )
    from pymatgen.core import Composition  # heavy import, deferred

    if not _ALLOWED.fullmatch(stripped):
        bad = next(ch for ch in stripped if not _ALLOWED.fullmatch(ch))
        raise FormulaSyntaxError(
            f"cannot read '{stripped}' as a formula: '{bad}' is not allowed; write element "
            "symbols with their case and optional amounts, e.g. GaAs or In0.53Ga0.47As"
        )
    try:
        composition = Composition(stripped)
    except (ValueError, KeyError):
        raise FormulaSyntaxError(
            f"cannot read '{stripped}' as a formula: write element symbols with a capital "
            "first letter and optional amounts, e.g. GaAs or In0.53Ga0.47As"
        ) from None
    pairs: list[tuple[str, float]] = []
    for species, amount in composition.items():
        symbol = str(getattr(species, "symbol", species))
        if symbol not in ATOMIC_NUMBER:
            raise UnknownElementError(
                f"cannot read '{stripped}' as a formula: '{symbol}' is not a chemical element "
                "symbol from H to Rn; symbols are case-sensitive, e.g. Ga, As, Zn"
            )
        if not amount > 0:
            raise FormulaSyntaxError(f"the amount of {symbol} in '{stripped}' must be positive")
        pairs.append((symbol, float(amount)))
    return pairs


def _ordered_pair(first: str, second: str) -> tuple[str, str]:
    """Return (cation, anion) for two catalogue elements whose valences sum to eight."""
    v1, v2 = VALENCE[first], VALENCE[second]
    if v1 != v2:
        return (first, second) if v1 < v2 else (second, first)
    if "C" in (first, second):
        return (second, first) if first == "C" else (first, second)
    return (first, second) if atomic_number(first) < atomic_number(second) else (second, first)


def parse_compound(text: str) -> Compound:
    """Read an octet binary compound from a formula.

    Args:
        text: a formula such as ``GaAs``, ``AsGa``, ``Ga2As2``, ``ZnSe`` or ``Si``.

    Returns:
        The normalised compound.

    Raises:
        FormulaSyntaxError, UnknownElementError: text that is not a formula.
        NotOctetCompoundError: a formula that is not an octet binary AB, with the reason.
    """
    pairs = split_formula(text)
    amounts: dict[str, float] = {}
    for symbol, amount in pairs:
        amounts[symbol] = amounts.get(symbol, 0.0) + amount
    shown = text.strip()
    if len(amounts) == 1:
        (symbol,) = amounts
        if VALENCE.get(symbol) == 4:
            return Compound(symbol, symbol, symbol, FAMILIES[4])
        raise NotOctetCompoundError(
            f"'{shown}' is a single element; only the group-IV elements C, Si, Ge and Sn form "
            "octet crystals on their own"
        )
    if len(amounts) != 2:
        raise NotOctetCompoundError(
            f"'{shown}' has {len(amounts)} elements; an octet binary compound has two "
            "(alloys such as In0.53Ga0.47As are read by the alloy parser)"
        )
    (a, amount_a), (b, amount_b) = amounts.items()
    for symbol in (a, b):
        if symbol not in VALENCE:
            raise NotOctetCompoundError(
                f"{symbol} in '{shown}' is not an element of the octet families (groups I/11, "
                "II/12, III, IV, V, VI, VII as listed in the catalogue)"
            )
    if abs(amount_a - amount_b) > 1e-9 * max(amount_a, amount_b):
        raise NotOctetCompoundError(
            f"'{shown}' has {a}:{b} = {amount_a:g}:{amount_b:g}; an octet binary AB has a 1:1 "
            "ratio"
        )
    if VALENCE[a] + VALENCE[b] != 8:
        raise NotOctetCompoundError(
            f"'{shown}': {a} brings {VALENCE[a]} and {b} brings {VALENCE[b]} valence electrons, "
            f"{VALENCE[a] + VALENCE[b]} in all; an octet compound needs 8 per pair "
            "(IV-IV, III-V, II-VI or I-VII)"
        )
    cation, anion = _ordered_pair(a, b)
    return Compound(cation + anion, cation, anion, FAMILIES[VALENCE[cation]])
