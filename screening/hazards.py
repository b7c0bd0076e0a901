"""Hazard notes for the elements of the catalogue and the precursors used to grow them.

These notes are reminders, not safety data: they name the usual hazards of an element and of
its common growth precursors (hydrides and metal-organics) and always defer to the safety data
sheets, local codes and the site's safety rules.
"""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass
from typing import Final

from screening.elements import atomic_number
from screening.errors import OutOfRangeError

CAUTION: Final[str] = (
    "Follow the safety data sheets, local codes and your site's safety rules for every "
    "element, compound and precursor; these notes are reminders, not safety data."
)


@dataclass(frozen=True)
class HazardNote:
    """The usual hazards of an element and of its growth precursors."""

    element: str
    toxic: bool
    note: str
    precursors: str


HAZARDS: Final[dict[str, HazardNote]] = {
    n.element: n
    for n in (
        HazardNote("As", True, "toxic and carcinogenic", "arsine (AsH3): extremely toxic gas"),
        HazardNote("P", False, "white phosphorus is pyrophoric and toxic",
                   "phosphine (PH3): highly toxic, pyrophoric gas"),
        HazardNote("Sb", True, "toxic", "stibine (SbH3): toxic gas; TMSb is pyrophoric"),
        HazardNote("Cd", True, "toxic and carcinogenic (cadmium compounds)",
                   "dimethylcadmium: toxic, pyrophoric"),
        HazardNote("Hg", True, "toxic (vapour and compounds)", "mercury vapour sources"),
        HazardNote("Pb", True, "toxic", "tetraethyllead: toxic"),
        HazardNote("Tl", True, "highly toxic", "thallium metal-organics: highly toxic"),
        HazardNote("Be", True, "toxic and carcinogenic dust (beryllium and BeO)",
                   "beryllium sources: dust control required"),
        HazardNote("Se", True, "toxic", "hydrogen selenide (H2Se): extremely toxic gas"),
        HazardNote("Te", True, "toxic", "hydrogen telluride, DETe/DIPTe: toxic"),
        HazardNote("S", False, "", "hydrogen sulfide (H2S): toxic gas"),
        HazardNote("N", False, "", "ammonia (NH3): toxic, corrosive gas"),
        HazardNote("B", False, "", "diborane (B2H6): toxic, pyrophoric gas"),
        HazardNote("Si", False, "", "silane (SiH4): pyrophoric gas"),
        HazardNote("Ge", False, "", "germane (GeH4): toxic, flammable gas"),
        HazardNote("Ga", False, "", "trimethylgallium (TMGa): pyrophoric"),
        HazardNote("Al", False, "", "trimethylaluminium (TMAl): pyrophoric"),
        HazardNote("In", False, "", "trimethylindium (TMIn): pyrophoric"),
        HazardNote("Zn", False, "", "diethylzinc (DEZn): pyrophoric"),
        HazardNote("Ba", True, "soluble barium compounds are toxic", ""),
        HazardNote("F", True, "fluorides can release hydrogen fluoride (HF): toxic, corrosive",
                   ""),
    )
}
"""Hazard notes by element (common practice, no single source; defer to safety data sheets)."""


def hazard_notes(elements: Iterable[str]) -> list[HazardNote]:
    """Hazard notes for the given elements, in the order given (elements without one skipped)."""
    return [HAZARDS[e] for e in elements if e in HAZARDS]


def toxic_elements(elements: Iterable[str]) -> list[str]:
    """The given elements that are toxic in themselves."""
    return [n.element for n in hazard_notes(elements) if n.toxic]


ROHS_SOURCE: Final[str] = (
    "Directive 2011/65/EU (RoHS 2), Annex II, as amended by Commission Delegated Directive "
    "(EU) 2015/863"
)

ROHS_RESTRICTED: Final[dict[str, str]] = {
    "Pb": "lead: 0.1 % by weight in homogeneous materials",
    "Hg": "mercury: 0.1 % by weight in homogeneous materials",
    "Cd": "cadmium: 0.01 % by weight in homogeneous materials",
    "Cr": "hexavalent chromium: 0.1 % by weight in homogeneous materials",
}
"""Elements restricted by RoHS Annex II (the other Annex II entries are organic compounds:
PBB, PBDE and four phthalates). Exemptions exist per application; check the current Annex III
and IV and your product's category."""


ROHS_ELEMENTS: Final[str] = ", ".join(sorted(ROHS_RESTRICTED))
"""The restricted elements as one list for help texts and labels ("Cd, Cr, Hg, Pb")."""
ROHS_ANNEX_II: Final[str] = f"Directive 2011/65/EU Annex II: {ROHS_ELEMENTS}"
"""Short form of the restriction for help texts (the full citation is `ROHS_SOURCE`)."""


def rohs_restricted(elements: Iterable[str]) -> list[str]:
    """The given elements that RoHS Annex II restricts."""
    return [e for e in elements if e in ROHS_RESTRICTED]


MAX_EXCLUDED: Final[int] = 40
"""Most element symbols an exclusion list may name."""


def parse_excluded(text: str | Iterable[str] | None) -> tuple[str, ...]:
    """Read an "exclude elements" list: "As,Cd", "As Cd", or symbols one by one.

    Args:
        text: Comma- or space-separated symbols, an iterable of them, or None.

    Returns:
        The distinct symbols in the order given (empty for None or an empty text).

    Raises:
        UnknownElementError: A symbol that is not an element (symbols are case-sensitive).
        OutOfRangeError: More than :data:`MAX_EXCLUDED` symbols.
    """
    if text is None:
        return ()
    parts = [text] if isinstance(text, str) else list(text)
    symbols: list[str] = []
    for part in parts:
        for symbol in str(part).replace(",", " ").split():
            atomic_number(symbol)  # raises for anything that is not an element
            if symbol not in symbols:
                symbols.append(symbol)
    if len(symbols) > MAX_EXCLUDED:
        raise OutOfRangeError(
            f"exclude at most {MAX_EXCLUDED} elements, not {len(symbols)}"
        )
    return tuple(symbols)


def excluded(elements: Iterable[str], exclude: Iterable[str] = (), no_rohs: bool = False) -> bool:
    """Whether a candidate made of `elements` is filtered out.

    Shared by the compound table, the composition finder and the command line, so every
    "exclude elements" and "exclude RoHS-restricted" filter means the same thing.

    Args:
        elements: The candidate's elements (both sites; for an alloy every element present).
        exclude: Element symbols the user excluded.
        no_rohs: Also exclude every candidate containing an element of :data:`ROHS_RESTRICTED`.

    Returns:
        True if any element is excluded (or RoHS-restricted when `no_rohs`).
    """
    present = set(elements)
    if present & set(exclude):
        return True
    return bool(no_rohs and present & ROHS_RESTRICTED.keys())
