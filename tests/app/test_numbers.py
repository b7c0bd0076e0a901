"""The number rules of `app.numbers`: rounding to the error bar, no negative zero, h_c text."""

import math

import pytest

from app.numbers import (
    NBSP,
    as_written,
    estimate_text,
    fixed,
    round_estimate,
    stated_decimals,
    terminal,
    thickness_number,
    thickness_text,
    uncertainty_decimals,
    uncertainty_text,
)


@pytest.mark.parametrize(
    ("value", "uncertainty", "shown"),
    [
        # The examples: an estimate to the precision its error bar allows.
        (5.174, 0.69, "5.2 ± 0.7"),
        (1.3, 0.7, "1.3 ± 0.7"),
        (2.31, 0.96, "2.3 ± 1.0"),  # 960 -> rounded up to 1000, two digits kept
        # Particle Data Group, Review of Particle Physics, Introduction, "Rounding" (the rule,
        # from memory): leading digits 100-354 keep two significant digits, 355-949 one,
        # 950-999 round up to 1000 and keep two.
        (0.7384, 0.0123, "0.738 ± 0.012"),
        (0.7384, 0.354, "0.74 ± 0.35"),
        (0.7384, 0.355, "0.7 ± 0.4"),
        (0.7384, 0.0949, "0.74 ± 0.09"),
        (0.7384, 0.0951, "0.74 ± 0.10"),
        (1.0, 0.9996, "1.0 ± 1.0"),
        (954.3, 514.0, "1000 ± 500"),  # to the hundreds: a wavelength from a rough gap
        (12.0, 3.4, "12.0 ± 3.4"),
        (-0.04, 0.69, "0.0 ± 0.7"),  # no negative zero after rounding
        # Halves away from zero on the printed decimals (common practice, no source).
        (0.125, 0.0123, "0.125 ± 0.012"),
        (0.1255, 0.0123, "0.126 ± 0.012"),
    ],
)
def test_an_estimate_is_shown_to_its_error_bar(value, uncertainty, shown) -> None:
    text = estimate_text(value, uncertainty)
    assert text == shown.replace(" ", NBSP)  # one line: no-break spaces around the ±
    assert terminal(text) == shown


@pytest.mark.parametrize(
    ("uncertainty", "decimals"),
    [
        (0.69, 1),
        (0.12, 2),
        (0.354, 2),
        (0.355, 1),
        (0.96, 1),
        (514.0, -2),
        (3.0, 1),
        (4.0, 0),
        (0.0, None),
        (-1.0, None),
        (math.nan, None),
        (math.inf, None),
    ],
)
def test_uncertainty_decimals(uncertainty, decimals) -> None:
    assert uncertainty_decimals(uncertainty) == decimals


def test_an_estimate_without_a_usable_uncertainty_keeps_its_column_decimals() -> None:
    assert estimate_text(0.73841, 0.0) == f"0.738{NBSP}±{NBSP}0.000"
    assert estimate_text(0.73841, None) == "0.738"
    assert estimate_text(0.73841, None, 2) == "0.74"
    assert estimate_text(None, 0.1) == "—"
    assert round_estimate(5.174, 0.69) == (5.2, 0.7, 1)
    assert uncertainty_text(0.96) == "1.0" and uncertainty_text(0.0) == "0.00"
    assert uncertainty_text(None) == "—"


@pytest.mark.parametrize("value", [-0.0, -1e-12, -0.0004, -0.00049999, -4e-300, 0.0, 4e-4])
@pytest.mark.parametrize("signed", [False, True])
def test_a_rounded_zero_has_no_sign(value, signed) -> None:
    assert fixed(value, 3, signed=signed) == "0.000"
    assert fixed(value * 100, 0, signed=signed) == "0"


@pytest.mark.parametrize(
    ("value", "decimals", "signed", "shown"),
    [
        (-0.0005, 3, False, "-0.001"),
        (0.0005, 3, True, "+0.001"),
        (-1.318e-2, 3, True, "-0.013"),
        (None, 3, False, "—"),
        (math.nan, 2, False, "—"),
        (954.3, -2, False, "1000"),
    ],
)
def test_fixed(value, decimals, signed, shown) -> None:
    assert fixed(value, decimals, signed=signed) == shown


def test_stated_decimals_and_csv_numbers() -> None:
    assert stated_decimals(1.424) == 3 and stated_decimals(5.65325) == 5
    assert stated_decimals(300.0) == 0 and stated_decimals(12.25) == 2
    assert as_written(954.3, -2) == 1000 and isinstance(as_written(954.3, -2), int)
    assert as_written(0.7384, 3) == 0.738 and math.copysign(1.0, as_written(-1e-9, 3)) == 1.0


@pytest.mark.parametrize(
    ("value", "matched", "shown", "number"),
    [
        (math.inf, False, "∞", None),  # lattice-matched: h_c infinite
        (None, True, "∞", None),  # the JSON's null for a matched layer
        (228389.7, False, "> 10 µm", None),  # the finder's old 228389.7 nm
        (513118.0, False, "> 10 µm", None),  # the shortlist's old 513118.0 nm
        (10000.0, False, "10000", 10000),  # the bound itself is a value
        (10000.4, False, "> 10 µm", None),
        (9876.5, False, "9880", 9880),
        (12.345, False, "12.3", 12.3),
        (0.0, False, "none", 0),  # no thickness above one Burgers vector is stable
        (None, False, "—", None),  # not given (hexagonal or rocksalt layers)
    ],
)
def test_critical_thickness_rule(value, matched, shown, number) -> None:
    assert thickness_text(value, matched=matched) == shown
    assert thickness_number(value) == number
    if number:
        assert thickness_text(value, unit=True) == f"{shown}{NBSP}nm"
