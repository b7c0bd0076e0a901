"""Every octet binary compound the engine knows: IV-IV, III-V, II-VI and I-VII."""

from __future__ import annotations

from functools import lru_cache
from itertools import combinations_with_replacement, product

from screening.elements import OCTET_GROUPS
from screening.formula import Compound, parse_compound


@lru_cache(maxsize=1)
def catalogue() -> tuple[Compound, ...]:
    """All octet binaries of the catalogue elements, in a stable order (family, cation, anion).

    IV-IV covers the elements and every pair of C, Si, Ge, Sn; the other families pair every
    cation of group N with every anion of group 8 - N.
    """
    formulas = ["".join(pair) for pair in combinations_with_replacement(OCTET_GROUPS[4], 2)]
    for cation_valence in (3, 2, 1):
        cations, anions = OCTET_GROUPS[cation_valence], OCTET_GROUPS[8 - cation_valence]
        formulas += [c + a for c, a in product(cations, anions)]
    return tuple(parse_compound(f) for f in formulas)


def catalogue_formulas() -> tuple[str, ...]:
    """Normalised formulas of the catalogue, in catalogue order."""
    return tuple(c.formula for c in catalogue())
