"""The elements that build octet binary compounds: groups, valence and period.

Valence counts are the number of s and p valence electrons (Cu, Ag count 1; Zn, Cd, Hg count
2), as in the octet rule for AB compounds (the two valences sum to eight).
"""

from __future__ import annotations

from typing import Final

from screening.errors import UnknownElementError, echo

OCTET_GROUPS: Final[dict[int, tuple[str, ...]]] = {
    1: ("Li", "Na", "K", "Rb", "Cu", "Ag"),
    2: ("Be", "Mg", "Ca", "Sr", "Ba", "Zn", "Cd", "Hg"),
    3: ("B", "Al", "Ga", "In", "Tl"),
    4: ("C", "Si", "Ge", "Sn"),
    5: ("N", "P", "As", "Sb", "Bi"),
    6: ("O", "S", "Se", "Te"),
    7: ("F", "Cl", "Br", "I"),
}
"""Catalogue elements by number of valence (s + p) electrons."""

VALENCE: Final[dict[str, int]] = {
    symbol: valence for valence, symbols in OCTET_GROUPS.items() for symbol in symbols
}

FAMILIES: Final[dict[int, str]] = {4: "IV-IV", 3: "III-V", 2: "II-VI", 1: "I-VII"}
"""Family name by the cation's valence."""

_SYMBOLS: Final[tuple[str, ...]] = (
    "H He Li Be B C N O F Ne Na Mg Al Si P S Cl Ar K Ca Sc Ti V Cr Mn Fe Co Ni Cu Zn Ga Ge As "
    "Se Br Kr Rb Sr Y Zr Nb Mo Tc Ru Rh Pd Ag Cd In Sn Sb Te I Xe Cs Ba La Ce Pr Nd Pm Sm Eu "
    "Gd Tb Dy Ho Er Tm Yb Lu Hf Ta W Re Os Ir Pt Au Hg Tl Pb Bi Po At Rn"
).split()
ATOMIC_NUMBER: Final[dict[str, int]] = {s: z for z, s in enumerate(_SYMBOLS, start=1)}
"""Atomic number Z for H..Rn (Z = 1..86)."""

_PERIOD_STARTS: Final[tuple[int, ...]] = (1, 3, 11, 19, 37, 55, 87)


def atomic_number(symbol: str) -> int:
    """Atomic number of a symbol from H to Rn.

    Raises:
        UnknownElementError: if the symbol is not an element from H (Z = 1) to Rn (Z = 86).
    """
    try:
        return ATOMIC_NUMBER[symbol]
    except KeyError:
        raise UnknownElementError(
            f"{echo(symbol)} is not a chemical element symbol from H to Rn (Z = 1..86); "
            "symbols are case-sensitive, e.g. Ga, As, Zn"
        ) from None


def period(symbol: str) -> int:
    """Period (row) of the periodic table, 1..6."""
    z = atomic_number(symbol)
    return sum(1 for start in _PERIOD_STARTS if z >= start)


def has_filled_inner_d(symbol: str) -> bool:
    """True where a filled d shell lies just below (or in) the valence shell.

    That is rows 4-6 from group 11 on (Cu..Br, Ag..I, Au..Rn): the shallow d electrons that
    raise the dielectric response. s-block atoms (K, Ca, Rb, Sr, Ba) and rows 1-3 have none.
    """
    z = atomic_number(symbol)
    return (29 <= z <= 36) or (47 <= z <= 54) or (79 <= z <= 86)
