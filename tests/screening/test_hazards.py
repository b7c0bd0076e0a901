import pytest

from screening.elements import ATOMIC_NUMBER
from screening.errors import OutOfRangeError, UnknownElementError
from screening.hazards import (
    CAUTION,
    ROHS_RESTRICTED,
    ROHS_SOURCE,
    excluded,
    hazard_notes,
    parse_excluded,
    rohs_restricted,
    toxic_elements,
)


def test_rohs_annex_ii_elements() -> None:
    # Directive 2011/65/EU Annex II (as amended by (EU) 2015/863): lead 0.1 %, mercury 0.1 %,
    # cadmium 0.01 %, hexavalent chromium 0.1 % (from memory); the rest are organic compounds.
    assert set(ROHS_RESTRICTED) == {"Pb", "Hg", "Cd", "Cr"}
    assert "0.01 %" in ROHS_RESTRICTED["Cd"]
    assert rohs_restricted(["Cd", "Te"]) == ["Cd"]
    assert rohs_restricted(["Ga", "As"]) == []


def test_usual_toxic_elements_are_flagged() -> None:
    # Common practice, no single source: As, Cd, Hg, Tl, Be, Pb, Se, Te, Sb are toxic.
    for element in ("As", "Cd", "Hg", "Tl", "Be", "Pb", "Se", "Te", "Sb"):
        assert toxic_elements([element]) == [element]


def test_notes_defer_to_safety_data_sheets() -> None:
    assert "safety data sheets" in CAUTION
    assert any("arsine" in n.precursors for n in hazard_notes(["As"]))


def test_rohs_source_names_the_directive_and_its_amendment() -> None:
    # Directive 2011/65/EU Annex II, as amended by (EU) 2015/863 (from memory).
    assert "2011/65/EU" in ROHS_SOURCE and "Annex II" in ROHS_SOURCE
    assert "(EU) 2015/863" in ROHS_SOURCE


@pytest.mark.parametrize(
    ("elements", "exclude", "no_rohs", "out"),
    [
        (["Ga", "As"], (), False, False),
        (["Ga", "As"], ("As",), False, True),
        (["Cd", "Te"], (), True, True),
        (["Hg", "Cd", "Te"], (), True, True),
        (["Pb", "S"], (), True, True),
        (["Zn", "Se"], ("Cd",), True, False),
        (["In", "Ga", "As"], ("Ga", "P"), False, True),
    ],
)
def test_excluded(elements: list[str], exclude: tuple[str, ...], no_rohs: bool,
                  out: bool) -> None:
    assert excluded(elements, exclude, no_rohs) is out


def test_parse_excluded_reads_lists_and_refuses_non_elements() -> None:
    assert parse_excluded("As, Cd  Hg,As") == ("As", "Cd", "Hg")
    assert parse_excluded(["As,Cd", "Pb"]) == ("As", "Cd", "Pb")
    assert parse_excluded(None) == parse_excluded("") == ()
    with pytest.raises(UnknownElementError, match="'as'"):
        parse_excluded("as")
    with pytest.raises(OutOfRangeError, match="at most"):
        parse_excluded(list(ATOMIC_NUMBER)[:41])
