from screening.hazards import (
    CAUTION,
    ROHS_RESTRICTED,
    hazard_notes,
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
