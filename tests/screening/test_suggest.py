"""Suggestions for formulas that could not be read (screening.suggest)."""

import pytest

from screening.alloy_report import normalise_material
from screening.errors import BondgapInputError
from screening.report import normalise_formula
from screening.suggest import MAX_READINGS, recased_readings


@pytest.mark.parametrize(("text", "suggested"), [
    ("gaas", "GaAs"), ("GaAS", "GaAs"), ("GAAS", "GaAs"), ("INP", "InP"), ("cdte", "CdTe"),
    ("asga", "GaAs"), ("gaN", "GaN"), ("in0.53ga0.47as", "In0.53Ga0.47As"),
    ("ingaas", "InGaAs with fractions (e.g. In0.5Ga0.5As)"),
])
def test_mis_cased_formulas_get_a_suggestion(text: str, suggested: str) -> None:
    with pytest.raises(BondgapInputError) as caught:
        normalise_material(text)
    message = str(caught.value)
    assert message.endswith(f"did you mean {suggested}?")
    assert "invalid formula" not in message and "Can't parse" not in message  # library words


def test_binary_only_path_suggests_too() -> None:
    with pytest.raises(BondgapInputError, match=r"did you mean InP\?"):
        normalise_formula("INP")


@pytest.mark.parametrize("text", ["Xx", "NaCl2", "GaAsP", "qqq"])
def test_no_suggestion_where_no_re_casing_reads(text: str) -> None:
    with pytest.raises(BondgapInputError) as caught:
        normalise_material(text)
    assert "did you mean" not in str(caught.value)


def test_readings_are_bounded_for_ambiguous_or_unreadable_text() -> None:
    # "co" reads as Co or C O: 2^32 readings of "coco...co"; only MAX_READINGS are tried, and
    # a run that cannot be read at all ("...cox") is found so without trying them.
    assert len(recased_readings("co" * 32)) == MAX_READINGS
    assert recased_readings("co" * 31 + "x") == []
    assert recased_readings("gaas") == ["GaAs"]
