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


GHS_SOURCE: Final[str] = (
    "GHS hazard statements (UN Globally Harmonized System of Classification and Labelling of "
    "Chemicals) as in Regulation (EC) No 1272/2008 (CLP), Annex VI, where a harmonised entry "
    "exists, else as in the suppliers' safety data sheets; from memory"
)
"""Where the precursors' hazard statements come from."""

GHS_STATEMENTS: Final[dict[str, str]] = {
    "H330": "fatal if inhaled",
    "H331": "toxic if inhaled",
    "H300": "fatal if swallowed",
    "H250": "catches fire spontaneously in air",
}
"""The GHS hazard statements that make a growth precursor hazardous enough for a caution,
most severe first: acute toxicity by inhalation or swallowing (categories 1-3) and
pyrophoricity."""


@dataclass(frozen=True)
class Precursor:
    """A common growth precursor of an element (MOCVD or MBE source), with its GHS statements.

    Attributes:
        element: The element it brings.
        name: Its name and formula, e.g. "phosphine (PH3)".
        ghs: GHS hazard statement codes (GHS_SOURCE; from memory).
    """

    element: str
    name: str
    ghs: tuple[str, ...]

    @property
    def hazards(self) -> tuple[str, ...]:
        """Words of its statements listed in :data:`GHS_STATEMENTS`, most severe first."""
        return tuple(words for code, words in GHS_STATEMENTS.items() if code in self.ghs)


PRECURSORS: Final[dict[str, tuple[Precursor, ...]]] = {
    p.element: (p,)
    for p in (
        Precursor("As", "arsine (AsH3)", ("H220", "H280", "H330", "H373", "H410")),
        Precursor("P", "phosphine (PH3)", ("H220", "H280", "H314", "H330", "H400")),
        Precursor("Sb", "stibine (SbH3)", ("H220", "H280", "H330")),
        Precursor("Se", "hydrogen selenide (H2Se)", ("H220", "H280", "H330", "H373", "H410")),
        Precursor("Te", "hydrogen telluride (H2Te)", ("H220", "H280", "H330")),
        Precursor("S", "hydrogen sulfide (H2S)", ("H220", "H280", "H330", "H335", "H400")),
        Precursor("N", "ammonia (NH3)", ("H221", "H280", "H314", "H331", "H400")),
        Precursor("B", "diborane (B2H6)", ("H220", "H280", "H330")),
        Precursor("Si", "silane (SiH4)", ("H220", "H250", "H280")),
        Precursor("Ge", "germane (GeH4)", ("H220", "H280", "H330")),
        Precursor("Ga", "trimethylgallium (TMGa)", ("H250", "H260", "H314")),
        Precursor("Al", "trimethylaluminium (TMAl)", ("H250", "H260", "H314")),
        Precursor("In", "trimethylindium (TMIn)", ("H250", "H260", "H314")),
        Precursor("Zn", "diethylzinc (DEZn)", ("H250", "H260", "H410")),
        Precursor("Cd", "dimethylcadmium (DMCd)", ("H250", "H330", "H350")),
        Precursor("Hg", "mercury vapour (Hg)", ("H330", "H360D", "H372", "H410")),
        Precursor("Pb", "tetraethyllead (TEPb)", ("H300", "H310", "H330", "H360", "H373")),
        Precursor("Tl", "thallium metal-organics", ("H300", "H330", "H373")),
    )
}
"""The common growth precursor of each element (hydrides for the anions, metal-organics for
the metals; common practice, no single source) with its GHS hazard statements (GHS_SOURCE)."""


def hazardous_precursors(elements: Iterable[str]) -> list[Precursor]:
    """The common growth precursors of the given elements that carry a caution statement."""
    return [p for e in dict.fromkeys(elements) for p in PRECURSORS.get(e, ()) if p.hazards]


def caution_elements(elements: Iterable[str]) -> list[str]:
    """The given elements that call for a caution: toxic, or grown from a hazardous precursor.

    Args:
        elements: A candidate's elements (an alloy's every element present).

    Returns:
        Those elements, in the order given, each once.
    """
    present = list(dict.fromkeys(elements))
    flagged = set(toxic_elements(present)) | {p.element for p in hazardous_precursors(present)}
    return [e for e in present if e in flagged]


CAUTION_TAIL: Final[str] = "follow the safety data sheets, local codes and your site's safety rules"


def caution_line(elements: Iterable[str]) -> str | None:
    """The one-line caution for candidates made of `elements` (None where none is due).

    The toxic elements first, then the hazardous growth precursors grouped by their most
    severe hazard, e.g. "contains As: toxic; growth precursors fatal if inhaled: arsine (AsH3);
    catches fire spontaneously in air: trimethylgallium (TMGa); follow the safety data sheets,
    local codes and your site's safety rules".
    """
    present = sorted(set(elements))
    by_hazard: dict[str, list[str]] = {words: [] for words in GHS_STATEMENTS.values()}
    for precursor in hazardous_precursors(present):
        by_hazard[precursor.hazards[0]].append(precursor.name)
    parts = [f"contains {', '.join(toxic)}: toxic"] if (toxic := toxic_elements(present)) else []
    grouped = [f"{words}: {', '.join(names)}" for words, names in by_hazard.items() if names]
    if grouped:
        parts.append("growth precursors " + "; ".join(grouped))
    return "; ".join([*parts, CAUTION_TAIL]) if parts else None


def hazards_block(elements: Iterable[str]) -> dict[str, object]:
    """The `hazards` block of a compound or alloy report (docs/report-schema.md).

    Keys: `elements` (toxic elements), `notes` (per element), `caution_elements` (toxic or
    grown from a hazardous precursor), `precursors` (the hazardous ones, with their GHS
    statements and `GHS_SOURCE`), `caution_line` (the one line every page shows) and `caution`
    (the standing reminder to follow the safety data sheets).
    """
    present = list(dict.fromkeys(elements))
    notes = hazard_notes(present)
    return {
        "elements": [n.element for n in notes if n.toxic],
        "notes": [{"element": n.element, "toxic": n.toxic, "note": n.note,
                   "precursors": n.precursors} for n in notes],
        "caution_elements": caution_elements(present),
        "precursors": [{"element": p.element, "name": p.name, "ghs": list(p.ghs),
                        "hazards": list(p.hazards), "source": GHS_SOURCE}
                       for p in hazardous_precursors(present)],
        "caution_line": caution_line(present),
        "caution": CAUTION if notes else None,
    }


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
