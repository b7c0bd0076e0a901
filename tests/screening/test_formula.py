import pytest

from screening.errors import (
    BondgapInputError,
    FormulaSyntaxError,
    NotOctetCompoundError,
    UnknownElementError,
)
from screening.formula import parse_compound


@pytest.mark.parametrize(
    ("text", "formula", "family"),
    [
        ("GaAs", "GaAs", "III-V"),
        ("AsGa", "GaAs", "III-V"),
        ("Ga2As2", "GaAs", "III-V"),
        ("ZnSe", "ZnSe", "II-VI"),
        ("SeZn", "ZnSe", "II-VI"),
        ("NaCl", "NaCl", "I-VII"),
        ("AgI", "AgI", "I-VII"),
        ("Si", "Si", "IV-IV"),
        ("CSi", "SiC", "IV-IV"),
        ("SnGe", "GeSn", "IV-IV"),
        ("GeSi", "SiGe", "IV-IV"),
        (" InP ", "InP", "III-V"),
    ],
)
def test_accepted_formulas_are_normalised(text: str, formula: str, family: str) -> None:
    compound = parse_compound(text)
    assert (compound.formula, compound.family) == (formula, family)


@pytest.mark.parametrize(
    ("text", "error", "words"),
    [
        ("Xx", UnknownElementError, "not a chemical element"),
        ("GaAs2", NotOctetCompoundError, "1:1"),
        ("NaCl3", NotOctetCompoundError, "1:1"),
        ("", FormulaSyntaxError, "empty"),
        ("   ", FormulaSyntaxError, "empty"),
        ("Ga" * 250, FormulaSyntaxError, "500 characters"),
        ("gaas", FormulaSyntaxError, "cannot read"),
        ("GaAs;DROP TABLE", FormulaSyntaxError, "not allowed"),
        ("GaN3", NotOctetCompoundError, "1:1"),
        ("GaSe", NotOctetCompoundError, "8 per pair"),
        ("Fe", NotOctetCompoundError, "single element"),
        ("FeS", NotOctetCompoundError, "octet families"),
        ("GaAsP", NotOctetCompoundError, "3 elements"),
        ("<script>", FormulaSyntaxError, "not allowed"),
    ],
)
def test_rejected_formulas_say_why(text: str, error: type[Exception], words: str) -> None:
    with pytest.raises(error) as caught:
        parse_compound(text)
    assert isinstance(caught.value, BondgapInputError)
    assert words in str(caught.value)


def test_error_messages_stay_on_one_line() -> None:
    # A line break typed into a formula is shown escaped: every message is one line.
    with pytest.raises(FormulaSyntaxError) as caught:
        parse_compound("Ga\nAs")
    assert "\n" not in str(caught.value) and "\\n" in str(caught.value)
