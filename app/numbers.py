"""How numbers are written on the pages, in the CLI's text output and in the CSV: one rule each.

Estimates with an error bar ("Rounding to the error bar"): the uncertainty is rounded to one or
two significant digits and the value to the same decimal place, following the rule of the
Particle Data Group (Review of Particle Physics, Introduction, section "Rounding"; e.g.
R. L. Workman et al., Prog. Theor. Exp. Phys. 2022, 083C01), which makes the GUM's advice
concrete (JCGM 100:2008, section 7.2.6: "at most two significant digits" for the uncertainty,
the value rounded to the uncertainty's last digit). Take the three leading digits of the
uncertainty: 100 to 354, keep two significant digits; 355 to 949, keep one; 950 to 999, round
up to 1000 and keep two. So 5.174 ± 0.69 is written 5.2 ± 0.7, 2.31 ± 0.96 is 2.3 ± 1.0 and
0.7384 ± 0.0123 is 0.738 ± 0.012. Halves round away from zero, on the decimal digits as
printed (0.125 gives 0.13). An estimate whose uncertainty is zero (or not known) keeps the
decimals of its column. Value and uncertainty are joined by no-break spaces, so a page never
breaks the line between them.

Measured values keep their stated precision (the decimals of the published value); a measured
value moved to another temperature keeps the decimals of the published one.

No negative zero: a number that rounds to zero is written "0.000", never "-0.000" (nor with a
"+" sign).

Critical thickness: "∞" for a lattice-matched layer (mismatch exactly zero, so h_c is
infinite); "> 10 µm" above :data:`THICKNESS_BOUND_NM` (layers that thick are past what a
(001) Matthews-Blakeslee estimate is used for, and the number's digits would only suggest a
precision it does not have); "none" for a zero h_c (no coherent layer above one Burgers
vector); otherwise the value in nm to three significant digits (common practice, no source).
JSON keeps every number at full precision (an infinite h_c is null there, with
`lattice_matched` or the note saying why).
"""

from __future__ import annotations

import math
from decimal import ROUND_HALF_UP, Decimal

NBSP = "\u00a0"
"""No-break space: joins a value, its ± and its uncertainty."""
PLUS_MINUS = f"{NBSP}±{NBSP}"
"""The separator of a value and its uncertainty."""
THICKNESS_BOUND_NM = 10_000.0
"""Critical thicknesses above this (10 µm) are written "> 10 µm"."""
THICKNESS_ABOVE = "> 10 µm"
"""How a critical thickness above the bound is written."""
THICKNESS_MATCHED = "∞"
"""How the critical thickness of a lattice-matched layer is written."""
THICKNESS_NONE = "none"
"""How a zero critical thickness is written: no coherent layer thicker than one Burgers vector."""
THICKNESS_DIGITS = 3
"""Significant digits of a critical thickness below the bound."""
NO_VALUE = "—"
"""How a missing value is written."""


def _finite(value: object) -> bool:
    return isinstance(value, int | float) and not isinstance(value, bool) and math.isfinite(value)


def uncertainty_decimals(uncertainty: float) -> int | None:
    """Decimal place the rounding rule keeps for this uncertainty (negative: tens, hundreds).

    Returns:
        The number of decimals (e.g. 1 for 0.69, 2 for 0.12, -2 for 514), or None for an
        uncertainty that is zero, negative or not finite.
    """
    if not _finite(uncertainty) or uncertainty <= 0:
        return None
    exponent = math.floor(math.log10(uncertainty))
    leading = int(_quantize(Decimal(repr(uncertainty)).scaleb(2 - exponent), 0))
    if leading >= 1000:  # 999.6 rounds to 1000: one more digit in front
        exponent, leading = exponent + 1, 100
    # 100-354: two digits; 355-949: one; 950-999: 1000 to two digits, the same place as one.
    return 1 - exponent if leading <= 354 else -exponent


def _quantize(value: Decimal, decimals: int) -> Decimal:
    rounded = value.quantize(Decimal(1).scaleb(-decimals), rounding=ROUND_HALF_UP)
    return rounded.copy_abs() if rounded == 0 else rounded


def rounded(value: float, decimals: int) -> float:
    """The value rounded half away from zero to `decimals` (never -0.0)."""
    return float(_quantize(Decimal(repr(float(value))), decimals)) + 0.0


def as_written(value: float, decimals: int) -> int | float:
    """The value rounded to `decimals` as a CSV number: an int when no decimal is kept."""
    number = rounded(value, decimals)
    return int(number) if decimals <= 0 else number


def fixed(value: float | None, decimals: int, *, signed: bool = False) -> str:
    """The value with `decimals` decimals ("—" for none); a rounded zero has no sign.

    Args:
        value: The number.
        decimals: Decimals to keep (negative: round to tens, hundreds, ... and show none).
        signed: Show "+" before a positive number (mismatch, strain).
    """
    if value is None or not _finite(value):
        return NO_VALUE
    number = _quantize(Decimal(repr(float(value))), decimals)
    text = f"{number:.{max(decimals, 0)}f}"
    return "+" + text if signed and number > 0 else text


def round_estimate(
    value: float, uncertainty: float | None, decimals: int = 3
) -> tuple[float, float | None, int]:
    """An estimate and its uncertainty rounded by the rule of this module.

    Args:
        value: The estimate.
        uncertainty: Its uncertainty (None or 0: the value keeps `decimals`).
        decimals: Decimals used when the uncertainty gives none.

    Returns:
        (value, uncertainty, decimals kept).
    """
    places = uncertainty_decimals(uncertainty) if uncertainty is not None else None
    places = decimals if places is None else places
    u = None if uncertainty is None or not _finite(uncertainty) else rounded(uncertainty, places)
    return rounded(value, places), u, places


def estimate_text(
    value: float | None,
    uncertainty: float | None,
    decimals: int = 3,
    *,
    separator: str = PLUS_MINUS,
) -> str:
    """An estimate as written: "5.2 ± 0.7" (no-break spaces), or the value alone without one.

    Args:
        value: The estimate ("—" for None).
        uncertainty: Its uncertainty (None: the value alone, with `decimals`).
        decimals: Decimals where the uncertainty gives none (None or zero).
        separator: Between value and uncertainty (the CLI's tables pass " ± ").
    """
    if value is None or not _finite(value):
        return NO_VALUE
    if uncertainty is None or not _finite(uncertainty):
        return fixed(value, decimals)
    _, _, places = round_estimate(value, uncertainty, decimals)
    return f"{fixed(value, places)}{separator}{fixed(uncertainty, places)}"


def uncertainty_text(uncertainty: float | None, decimals: int = 2) -> str:
    """An uncertainty alone, rounded by the rule (`decimals` where it gives none, e.g. zero)."""
    places = None if uncertainty is None else uncertainty_decimals(uncertainty)
    return fixed(uncertainty, decimals if places is None else places)


def stated_decimals(value: float) -> int:
    """Decimals of a published value as stored (5.65325 gives 5; 300.0 gives 0)."""
    exponent = Decimal(repr(float(value))).normalize().as_tuple().exponent
    return max(0, -int(exponent))


def _significant_text(value: float, digits: int) -> str:
    places = digits - 1 - math.floor(math.log10(abs(value))) if value else 0
    return fixed(value, places)


def thickness_text(value_nm: float | None, *, matched: bool = False, unit: bool = False) -> str:
    """A critical thickness as written: "∞", "> 10 µm", "250" (" nm" if `unit`), "none" or "—".

    "none" is a zero h_c: the mismatch is so large that no layer above one Burgers vector is
    coherent.

    Args:
        value_nm: h_c in nm (inf or None for a lattice-matched layer, None where not given).
        matched: The layer is lattice-matched (mismatch exactly zero).
        unit: Add " nm" to a number.
    """
    if matched or (value_nm is not None and math.isinf(value_nm)):
        return THICKNESS_MATCHED
    if value_nm is None or not _finite(value_nm):
        return NO_VALUE
    if value_nm > THICKNESS_BOUND_NM:
        return THICKNESS_ABOVE
    if value_nm <= 0:
        return THICKNESS_NONE
    return _significant_text(value_nm, THICKNESS_DIGITS) + (f"{NBSP}nm" if unit else "")


def thickness_number(value_nm: float | None) -> float | None:
    """A critical thickness as a CSV number: within the bound, to three significant digits.

    None for a lattice-matched layer, one above the bound or none given (the text column
    beside it says which).
    """
    if value_nm is None or not _finite(value_nm) or value_nm > THICKNESS_BOUND_NM:
        return None
    if value_nm == 0:
        return 0
    return as_written(value_nm, THICKNESS_DIGITS - 1 - math.floor(math.log10(abs(value_nm))))


def terminal(text: str) -> str:
    """Text for a terminal or a text table: no-break spaces as plain spaces."""
    return text.replace(NBSP, " ")


JINJA_FILTERS = {"estimate": estimate_text, "fixed": fixed, "thickness": thickness_text}
"""The page templates' filters: `x|estimate(u)`, `x|fixed(3, signed=true)`, `h|thickness`."""
