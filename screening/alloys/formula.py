"""Reading and writing alloy formulas in the usual notation.

``In0.53Ga0.47As``, ``GaAs0.51Sb0.49``, ``In0.73Ga0.27As0.58P0.42``, ``Al0.3Ga0.2In0.5P``:
element symbols with their fraction on their sublattice (cations on one, anions on the
other); an element alone on its site needs no number. Each site's fractions must sum to one
(within :data:`SITE_SUM_TOLERANCE`, then renormalised) and lie in [0, 1]. Binaries written
this way ("GaAs") are accepted too; :func:`parse_material` sends two-element formulas such as
"Ga2As2" to the binary parser instead.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import ArrayLike

from screening.alloys.sites import split_sites
from screening.alloys.systems import AlloySystem, alloy_system, parse_system
from screening.errors import BondgapInputError, CompositionError
from screening.formula import Compound, parse_compound, split_formula
from screening.suggest import with_suggestions

SITE_SUM_TOLERANCE: Final[float] = 2e-3
"""Largest accepted |sum of a site's fractions - 1| (formulas rounded to three decimals)."""

FORMULA_DECIMALS: Final[int] = 4
"""Decimals of the fractions written into formulas."""


@dataclass(frozen=True)
class Alloy:
    """One alloy composition.

    Attributes:
        system: Its system (elements, end points, structure).
        fractions: Fraction of each element on its site, in :attr:`AlloySystem.elements` order.
    """

    system: AlloySystem
    fractions: tuple[float, ...]

    @property
    def formula(self) -> str:
        """The formula in the usual notation, e.g. "In0.53Ga0.47As"."""
        return format_alloy(self.system, self.fractions)

    @property
    def site_fractions(self) -> dict[str, float]:
        """Element -> fraction on its site."""
        return dict(zip(self.system.elements, self.fractions, strict=True))


def _number(value: float) -> str:
    text = f"{value:.{FORMULA_DECIMALS}f}".rstrip("0").rstrip(".")
    return "" if text == "1" else text


def format_alloy(system: AlloySystem, fractions: Sequence[float]) -> str:
    """Write a composition of a system in the usual notation.

    Elements whose fraction rounds to zero are left out; an element alone on its site is
    written without a number.

    Args:
        system: The system.
        fractions: Site fractions in :attr:`AlloySystem.elements` order.
    """
    parts = []
    n_cat = len(system.cations)
    for site in (range(n_cat), range(n_cat, len(system.elements))):
        present = [(system.elements[i], float(fractions[i])) for i in site
                   if round(float(fractions[i]), FORMULA_DECIMALS) > 0.0]
        if len(present) == 1:
            parts.append(present[0][0])
        else:
            parts += [symbol + _number(value) for symbol, value in present]
    return "".join(parts)


def check_fractions(system: AlloySystem, fractions: ArrayLike, shown: str = "") -> None:
    """Raise unless every row of site fractions lies in [0, 1] and sums to one per site.

    Args:
        system: The system.
        fractions: (ncomposition, nelement) or (nelement,) in :attr:`AlloySystem.elements` order.
        shown: Text for messages (default: the system name).

    Raises:
        CompositionError: Naming the first offending composition.
    """
    f = np.atleast_2d(np.asarray(fractions, dtype=float))
    label = shown or system.name
    if f.shape[1] != len(system.elements):
        raise CompositionError(
            f"{label}: expected {len(system.elements)} fractions per composition "
            f"({', '.join(system.elements)}), got {f.shape[1]}"
        )
    bad = ~np.isfinite(f) | (f < 0.0) | (f > 1.0)
    if bad.any():
        row, col = np.argwhere(bad)[0]
        raise CompositionError(
            f"{label}: the fraction of {system.elements[col]} is {f[row, col]:g}; fractions "
            "lie in [0, 1]"
        )
    n_cat = len(system.cations)
    for site, columns in (("cation", slice(0, n_cat)), ("anion", slice(n_cat, None))):
        sums = f[:, columns].sum(axis=1)
        off = np.abs(sums - 1.0) > SITE_SUM_TOLERANCE
        if off.any():
            row = int(np.argmax(off))
            names = " + ".join(system.elements[columns])
            raise CompositionError(
                f"{label}: the {site}-site fractions {names} sum to {sums[row]:.4g}; each "
                f"site's fractions must sum to 1 (within {SITE_SUM_TOLERANCE})"
            )


def parse_alloy(text: str) -> Alloy:
    """Read an alloy (or a binary) in the usual notation.

    Args:
        text: e.g. "In0.53Ga0.47As", "GaAs0.51Sb0.49", "In0.73Ga0.27As0.58P0.42".

    Returns:
        The alloy, its fractions renormalised to sum exactly to one per site.

    Raises:
        FormulaSyntaxError, UnknownElementError: Text that is not a formula.
        NotOctetCompoundError: An element outside the octet families.
        CompositionError: Fractions outside [0, 1], not summing to one per site, elements of
            different families on one site, group-IV elements, or more than four elements.
        StructureMismatchError: End points of different crystal structures.
    """
    shown = text.strip()
    pairs = split_formula(shown)
    amounts: dict[str, float] = {}
    for symbol, amount in pairs:
        amounts[symbol] = amounts.get(symbol, 0.0) + amount
    cations, anions = split_sites(amounts, shown)
    if len(amounts) > 2 and all(value == 1.0 for value in amounts.values()):
        raise CompositionError(
            f"'{shown}' names an alloy system, not a composition; give each element's fraction "
            "on its site, e.g. In0.53Ga0.47As"
        )
    system = alloy_system(cations, anions, shown)
    fractions = np.array([amounts[e] for e in system.elements])
    check_fractions(system, fractions, f"'{shown}'")
    n_cat = len(cations)
    fractions[:n_cat] /= fractions[:n_cat].sum()
    fractions[n_cat:] /= fractions[n_cat:].sum()
    return Alloy(system, tuple(float(v) for v in fractions))


def parse_material(text: str) -> Compound | Alloy:
    """Read a binary compound or an alloy, whichever the formula is.

    Two-element formulas with equal amounts ("GaAs", "Ga2As2", "AsGa") and the group-IV
    elements go to :func:`screening.formula.parse_compound`; everything else to
    :func:`parse_alloy`.

    Raises:
        BondgapInputError: A subclass naming what is wrong (see the two parsers), with
            "did you mean ...?" where the text re-cased as element symbols is a formula or an
            alloy system ("gaas" -> GaAs; `screening.suggest`).
    """
    try:
        return _read_material(text)
    except BondgapInputError as exc:
        raise with_suggestions(exc, text, _suggestion) from None


def _suggestion(candidate: str) -> str:
    """What to suggest for a re-cased text: its formula, or an alloy system with an example."""
    try:
        return _read_material(candidate).formula
    except CompositionError:
        system = parse_system(candidate)
        n_cat = len(system.cations)
        even = [1.0 / n_cat] * n_cat + [1.0 / (len(system.elements) - n_cat)] * (
            len(system.elements) - n_cat)
        return f"{system.name} with fractions (e.g. {format_alloy(system, even)})"


def _read_material(text: str) -> Compound | Alloy:
    pairs = split_formula(text)
    symbols = {symbol for symbol, _ in pairs}
    amounts = [amount for _, amount in pairs]
    if len(symbols) <= 1 or (len(symbols) == 2 and abs(amounts[0] - amounts[-1]) < 1e-9):
        return parse_compound(text)
    return parse_alloy(text)
