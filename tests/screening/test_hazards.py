import pytest

from screening.alloy_report import alloy_report
from screening.catalogue import catalogue
from screening.elements import ATOMIC_NUMBER
from screening.errors import OutOfRangeError, UnknownElementError
from screening.hazards import (
    CAUTION,
    ROHS_RESTRICTED,
    ROHS_SOURCE,
    caution_elements,
    caution_line,
    excluded,
    hazard_notes,
    hazardous_precursors,
    parse_excluded,
    rohs_restricted,
    toxic_elements,
)
from screening.report import compound_report


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


# The anions whose common growth precursor is a hydride gas, with the hydride (common practice,
# no single source) and its GHS acute-toxicity statement (Regulation (EC) No 1272/2008 (CLP),
# Annex VI, or the suppliers' safety data sheets; from memory): arsine, phosphine, stibine,
# hydrogen selenide, hydrogen telluride and hydrogen sulfide H330 "fatal if inhaled"; ammonia
# H331 "toxic if inhaled".
HYDRIDE_ANIONS = {
    "As": ("arsine", "H330"), "P": ("phosphine", "H330"), "Sb": ("stibine", "H330"),
    "Se": ("hydrogen selenide", "H330"), "Te": ("hydrogen telluride", "H330"),
    "S": ("hydrogen sulfide", "H330"), "N": ("ammonia", "H331"),
}


@pytest.mark.parametrize("anion", sorted(HYDRIDE_ANIONS))
def test_every_catalogue_compound_grown_from_a_hydride_gets_the_caution(anion: str) -> None:
    name, code = HYDRIDE_ANIONS[anion]
    compounds = [c for c in catalogue() if c.anion == anion]
    assert compounds
    for compound in compounds:
        line = caution_line(compound.elements)
        assert line is not None and name in line and "safety data sheets" in line, compound
        assert anion in caution_elements(compound.elements)
        (precursor,) = [p for p in hazardous_precursors([anion])]
        assert code in precursor.ghs


@pytest.mark.parametrize("formula", ["InP", "GaP", "AlP", "GaN"])
def test_issue_compounds_without_toxic_elements_get_the_caution_in_their_report(
    formula: str,
) -> None:
    hazards = compound_report(formula)["hazards"]
    assert hazards["elements"] == []  # no toxic element of their own
    assert hazards["caution_line"] and "local codes" in hazards["caution_line"]
    assert set(hazards["caution_elements"]) >= {formula[-1]}
    assert all("CLP" in p["source"] for p in hazards["precursors"])


def test_alloy_report_carries_the_precursor_caution() -> None:
    hazards = alloy_report("In0.53Ga0.47As0.5P0.5")["hazards"]
    assert "arsine" in hazards["caution_line"] and "phosphine" in hazards["caution_line"]
    assert hazards["caution_elements"] == ["In", "Ga", "As", "P"]


def test_caution_names_toxic_elements_first_and_groups_precursors_by_hazard() -> None:
    line = caution_line(["Ga", "As"])
    assert line is not None
    assert line.startswith("contains As: toxic; growth precursors fatal if inhaled: arsine")
    assert "catches fire spontaneously in air: trimethylgallium (TMGa)" in line
    assert caution_line(["Na", "Cl"]) is None
    assert caution_elements(["Na", "Cl"]) == []
