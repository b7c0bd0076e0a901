"""Ground-state electron configurations of the neutral atoms H to Rn (Z = 1 to 86).

These are the configurations of NIST Standard Reference Database 141 (Kotochigova, Levine,
Shirley, Stiles and Clark, Phys. Rev. A 55, 191 (1997)): the experimental ground-state
configurations, e.g. Cr [Ar] 3d5 4s1, Cu [Ar] 3d10 4s1, Pd [Kr] 4d10, La [Xe] 5d1 6s2,
Ce [Xe] 4f1 5d1 6s2, Gd [Xe] 4f7 5d1 6s2. Open shells are occupied spherically and without
spin polarisation (each orbital ``nl`` carries its occupation spread evenly over its 2(2l+1)
spin orbitals).

The valence shell of an element is the principal quantum number of its period (row of the
periodic table): its ``ns`` and ``np`` orbitals are the valence s and p levels, occupied or
not. H and He have no 1p, so their valence p level is 2p.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from screening.errors import UnknownElementError

ORBITAL_LETTERS: str = "spdf"
"""Letters of the angular momenta l = 0, 1, 2, 3."""

_NOBLE_CORES: dict[str, str] = {
    "[He]": "1s2",
    "[Ne]": "1s2 2s2 2p6",
    "[Ar]": "1s2 2s2 2p6 3s2 3p6",
    "[Kr]": "1s2 2s2 2p6 3s2 3p6 3d10 4s2 4p6",
    "[Xe]": "1s2 2s2 2p6 3s2 3p6 3d10 4s2 4p6 4d10 5s2 5p6",
}

CONFIGURATIONS: tuple[tuple[str, str], ...] = (
    ("H", "1s1"),  # 1
    ("He", "1s2"),  # 2
    ("Li", "[He] 2s1"),  # 3
    ("Be", "[He] 2s2"),  # 4
    ("B", "[He] 2s2 2p1"),  # 5
    ("C", "[He] 2s2 2p2"),  # 6
    ("N", "[He] 2s2 2p3"),  # 7
    ("O", "[He] 2s2 2p4"),  # 8
    ("F", "[He] 2s2 2p5"),  # 9
    ("Ne", "[He] 2s2 2p6"),  # 10
    ("Na", "[Ne] 3s1"),  # 11
    ("Mg", "[Ne] 3s2"),  # 12
    ("Al", "[Ne] 3s2 3p1"),  # 13
    ("Si", "[Ne] 3s2 3p2"),  # 14
    ("P", "[Ne] 3s2 3p3"),  # 15
    ("S", "[Ne] 3s2 3p4"),  # 16
    ("Cl", "[Ne] 3s2 3p5"),  # 17
    ("Ar", "[Ne] 3s2 3p6"),  # 18
    ("K", "[Ar] 4s1"),  # 19
    ("Ca", "[Ar] 4s2"),  # 20
    ("Sc", "[Ar] 3d1 4s2"),  # 21
    ("Ti", "[Ar] 3d2 4s2"),  # 22
    ("V", "[Ar] 3d3 4s2"),  # 23
    ("Cr", "[Ar] 3d5 4s1"),  # 24
    ("Mn", "[Ar] 3d5 4s2"),  # 25
    ("Fe", "[Ar] 3d6 4s2"),  # 26
    ("Co", "[Ar] 3d7 4s2"),  # 27
    ("Ni", "[Ar] 3d8 4s2"),  # 28
    ("Cu", "[Ar] 3d10 4s1"),  # 29
    ("Zn", "[Ar] 3d10 4s2"),  # 30
    ("Ga", "[Ar] 3d10 4s2 4p1"),  # 31
    ("Ge", "[Ar] 3d10 4s2 4p2"),  # 32
    ("As", "[Ar] 3d10 4s2 4p3"),  # 33
    ("Se", "[Ar] 3d10 4s2 4p4"),  # 34
    ("Br", "[Ar] 3d10 4s2 4p5"),  # 35
    ("Kr", "[Ar] 3d10 4s2 4p6"),  # 36
    ("Rb", "[Kr] 5s1"),  # 37
    ("Sr", "[Kr] 5s2"),  # 38
    ("Y", "[Kr] 4d1 5s2"),  # 39
    ("Zr", "[Kr] 4d2 5s2"),  # 40
    ("Nb", "[Kr] 4d4 5s1"),  # 41
    ("Mo", "[Kr] 4d5 5s1"),  # 42
    ("Tc", "[Kr] 4d5 5s2"),  # 43
    ("Ru", "[Kr] 4d7 5s1"),  # 44
    ("Rh", "[Kr] 4d8 5s1"),  # 45
    ("Pd", "[Kr] 4d10"),  # 46
    ("Ag", "[Kr] 4d10 5s1"),  # 47
    ("Cd", "[Kr] 4d10 5s2"),  # 48
    ("In", "[Kr] 4d10 5s2 5p1"),  # 49
    ("Sn", "[Kr] 4d10 5s2 5p2"),  # 50
    ("Sb", "[Kr] 4d10 5s2 5p3"),  # 51
    ("Te", "[Kr] 4d10 5s2 5p4"),  # 52
    ("I", "[Kr] 4d10 5s2 5p5"),  # 53
    ("Xe", "[Kr] 4d10 5s2 5p6"),  # 54
    ("Cs", "[Xe] 6s1"),  # 55
    ("Ba", "[Xe] 6s2"),  # 56
    ("La", "[Xe] 5d1 6s2"),  # 57
    ("Ce", "[Xe] 4f1 5d1 6s2"),  # 58
    ("Pr", "[Xe] 4f3 6s2"),  # 59
    ("Nd", "[Xe] 4f4 6s2"),  # 60
    ("Pm", "[Xe] 4f5 6s2"),  # 61
    ("Sm", "[Xe] 4f6 6s2"),  # 62
    ("Eu", "[Xe] 4f7 6s2"),  # 63
    ("Gd", "[Xe] 4f7 5d1 6s2"),  # 64
    ("Tb", "[Xe] 4f9 6s2"),  # 65
    ("Dy", "[Xe] 4f10 6s2"),  # 66
    ("Ho", "[Xe] 4f11 6s2"),  # 67
    ("Er", "[Xe] 4f12 6s2"),  # 68
    ("Tm", "[Xe] 4f13 6s2"),  # 69
    ("Yb", "[Xe] 4f14 6s2"),  # 70
    ("Lu", "[Xe] 4f14 5d1 6s2"),  # 71
    ("Hf", "[Xe] 4f14 5d2 6s2"),  # 72
    ("Ta", "[Xe] 4f14 5d3 6s2"),  # 73
    ("W", "[Xe] 4f14 5d4 6s2"),  # 74
    ("Re", "[Xe] 4f14 5d5 6s2"),  # 75
    ("Os", "[Xe] 4f14 5d6 6s2"),  # 76
    ("Ir", "[Xe] 4f14 5d7 6s2"),  # 77
    ("Pt", "[Xe] 4f14 5d9 6s1"),  # 78
    ("Au", "[Xe] 4f14 5d10 6s1"),  # 79
    ("Hg", "[Xe] 4f14 5d10 6s2"),  # 80
    ("Tl", "[Xe] 4f14 5d10 6s2 6p1"),  # 81
    ("Pb", "[Xe] 4f14 5d10 6s2 6p2"),  # 82
    ("Bi", "[Xe] 4f14 5d10 6s2 6p3"),  # 83
    ("Po", "[Xe] 4f14 5d10 6s2 6p4"),  # 84
    ("At", "[Xe] 4f14 5d10 6s2 6p5"),  # 85
    ("Rn", "[Xe] 4f14 5d10 6s2 6p6"),  # 86
)
"""(symbol, ground-state configuration) for Z = 1, 2, ..., 86, in order of Z."""

MAX_Z: int = len(CONFIGURATIONS)
"""Heaviest element covered (Rn, Z = 86)."""

_Z_BY_SYMBOL: dict[str, int] = {sym: z for z, (sym, _) in enumerate(CONFIGURATIONS, start=1)}
_SHELL = re.compile(r"^([1-7])([spdf])(\d+(?:\.\d+)?)$")


@dataclass(frozen=True)
class Subshell:
    """One orbital ``nl`` of a configuration.

    Attributes:
        n: Principal quantum number.
        l: Angular momentum quantum number (0 = s, 1 = p, 2 = d, 3 = f).
        occupation: Number of electrons in the subshell (0 for an unoccupied level).
    """

    n: int
    l: int  # noqa: E741 - the quantum number's conventional name
    occupation: float

    @property
    def label(self) -> str:
        """Spectroscopic label such as ``"4p"``."""
        return f"{self.n}{ORBITAL_LETTERS[self.l]}"


def atomic_number(symbol_or_z: str | int) -> int:
    """Return Z for an element symbol (case-insensitive) or check an atomic number.

    Args:
        symbol_or_z: Element symbol such as ``"Zn"`` or ``"zn"``, or an atomic number.

    Returns:
        The atomic number, 1 to 86.

    Raises:
        UnknownElementError: Not an element symbol of H to Rn, or Z outside 1 to 86.
    """
    if isinstance(symbol_or_z, bool):
        raise UnknownElementError(
            f"unknown element {symbol_or_z!r}: give a symbol or atomic number of Z = 1..{MAX_Z}"
        )
    if isinstance(symbol_or_z, int):
        if 1 <= symbol_or_z <= MAX_Z:
            return symbol_or_z
        raise UnknownElementError(
            f"atomic number {symbol_or_z} out of range: Z = 1..{MAX_Z} (H to Rn) are accepted"
        )
    text = str(symbol_or_z).strip()
    z = _Z_BY_SYMBOL.get(text[:1].upper() + text[1:].lower())
    if z is None:
        raise UnknownElementError(
            f"unknown element {symbol_or_z!r}: symbols of Z = 1..{MAX_Z} (H to Rn) are accepted"
        )
    return z


def element_symbol(z: int) -> str:
    """Return the element symbol for atomic number ``z`` (1 to 86)."""
    return CONFIGURATIONS[atomic_number(z) - 1][0]


def configuration(z: int) -> str:
    """Return the ground-state configuration string of element ``z``, e.g. ``"[Ar] 3d10 4s2"``."""
    return CONFIGURATIONS[atomic_number(z) - 1][1]


def parse_configuration(text: str) -> tuple[Subshell, ...]:
    """Expand a configuration string with an optional noble-gas core into its subshells.

    Args:
        text: Configuration such as ``"[Ar] 3d10 4s2"`` or ``"1s2 2s1"``.

    Returns:
        The occupied subshells sorted by (n, l).

    Raises:
        ValueError: A token that is neither a known core nor ``<n><l><occupation>``, or a
            subshell listed twice or over-filled.
    """
    tokens: list[str] = []
    for token in text.split():
        tokens.extend(_NOBLE_CORES[token].split() if token in _NOBLE_CORES else [token])
    shells: dict[tuple[int, int], float] = {}
    for token in tokens:
        match = _SHELL.match(token)
        if match is None:
            raise ValueError(f"cannot read subshell {token!r} in configuration {text!r}")
        n, l = int(match.group(1)), ORBITAL_LETTERS.index(match.group(2))  # noqa: E741
        occupation = float(match.group(3))
        if l >= n or (n, l) in shells or not 0 < occupation <= 2 * (2 * l + 1):
            raise ValueError(f"impossible subshell {token!r} in configuration {text!r}")
        shells[(n, l)] = occupation
    return tuple(Subshell(n, ang, f) for (n, ang), f in sorted(shells.items()))


def period(z: int) -> int:
    """Return the period (row of the periodic table) of element ``z``, 1 to 6."""
    z = atomic_number(z)
    for row, last_z in enumerate((2, 10, 18, 36, 54, 86), start=1):
        if z <= last_z:
            return row
    raise AssertionError("unreachable: atomic_number() bounds Z to 1..86")


def valence_s_p(z: int) -> tuple[Subshell, Subshell]:
    """Return the valence s and p subshells of element ``z`` with their occupations.

    The valence s is ``ns`` and the valence p is ``np`` with n the period, except that H and He
    take 2p. Either may be unoccupied (occupation 0): the p of groups 1, 2, 3 to 12 and of the
    f-block, and the 5s and 5p of Pd ([Kr] 4d10).

    Args:
        z: Atomic number, 1 to 86.

    Returns:
        (valence s, valence p) subshells.
    """
    n = period(z)
    occupied = {(s.n, s.l): s.occupation for s in parse_configuration(configuration(z))}
    n_p = max(n, 2)
    return (
        Subshell(n, 0, occupied.get((n, 0), 0.0)),
        Subshell(n_p, 1, occupied.get((n_p, 1), 0.0)),
    )


def lowest_d_shell(z: int) -> Subshell:
    """Return the d subshell that is the element's lowest d level, with its occupation.

    The (n-1)d shell of an element of period n >= 4 (3d for periods 1 to 3, which have no
    lower d): the outermost occupied d where that shell is occupied (Sc to Zn 3d, Ga to Kr 3d,
    Pd 4d, Au 5d, ...), otherwise the lowest empty d (K and Ca 3d, Rb and Sr 4d, Cs, Ba and the
    lanthanides without a 5d electron 5d, H to Ar 3d). Every d shell below it is full, so no
    lower d level is empty.

    Args:
        z: Atomic number, 1 to 86.

    Returns:
        The d subshell (l = 2) with its ground-state occupation (0 if empty).
    """
    n_d = max(period(z) - 1, 3)
    occupied = {(s.n, s.l): s.occupation for s in parse_configuration(configuration(z))}
    return Subshell(n_d, 2, occupied.get((n_d, 2), 0.0))


def subshells_to_solve(z: int) -> tuple[Subshell, ...]:
    """Return every occupied subshell of ``z`` plus its unoccupied valence s and p, by (n, l)."""
    shells = {(s.n, s.l): s for s in parse_configuration(configuration(z))}
    for shell in valence_s_p(z):
        shells.setdefault((shell.n, shell.l), shell)
    return tuple(shells[key] for key in sorted(shells))
