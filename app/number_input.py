"""Reading a number typed by a user: one parser and one message for every way numbers come in.

URL parameters, form fields, JSON bodies, cells of an imported CSV and command-line options
all go through `read_number`. Accepted: a plain decimal number in ASCII (optional sign, digits
with an optional decimal point, an optional exponent: `-1.5`, `.5`, `2e-3`), or a JSON number
(never `true` or `false`). Refused: digit separators (`1_4`), digits of other scripts
(full-width `１`), `inf`, `nan`, hexadecimal, and anything outside the range the quantity
accepts. The message names the quantity, its unit and range, and repeats at most
`screening.errors.ECHO_LENGTH` characters of what was typed.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from typing import Annotated, Any

from pydantic import BeforeValidator

from screening.errors import echo

PLAIN_DECIMAL = re.compile(r"[+-]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][+-]?[0-9]+)?")
"""What a typed number may look like (ASCII only)."""


class NumberError(ValueError):
    """A value that is not a plain decimal number in its quantity's range (the message says)."""


@dataclass(frozen=True)
class NumberRule:
    """The range of one quantity as typed.

    Attributes:
        name: The quantity in messages ("temperature", "the target gap").
        unit: Its unit in words ("K", "eV", "" for none).
        low: Smallest value accepted.
        high: Largest value accepted.
        low_open: Whether `low` itself is refused (the range is "above low").
        whole: Whether only whole numbers are accepted.
    """

    name: str
    unit: str
    low: float
    high: float
    low_open: bool = False
    whole: bool = False

    def accepted(self) -> str:
        """The accepted values in words: "a number of eV from 0 to 20"."""
        kind = "a whole number" if self.whole else "a number"
        unit = f" of {self.unit}" if self.unit else ""
        low = f"above {self.low:g}" if self.low_open else f"from {self.low:g}"
        return f"{kind}{unit} {low} to {self.high:g}"

    def fits(self, number: float) -> bool:
        """Whether a finite number lies in the range (and is whole, if asked)."""
        above = number > self.low if self.low_open else number >= self.low
        return above and number <= self.high and (not self.whole or number == int(number))


def read_number(value: Any, rule: NumberRule) -> float | None:
    """Read a typed number within its rule; None for an empty value.

    Args:
        value: A string as typed (outer spaces ignored), an int or float from JSON, or None.
        rule: The quantity's name, unit and range.

    Raises:
        NumberError: Not a plain decimal number, or outside the range: "<name> must be <rule>,
            not '<value>'".
    """
    if value is None or (isinstance(value, str) and not value.strip()):
        return None
    number = math.nan
    if isinstance(value, (int, float)) and not isinstance(value, bool):
        number = float(value) if not isinstance(value, int) or abs(value) < 1e300 else math.inf
    elif isinstance(value, str) and PLAIN_DECIMAL.fullmatch(value.strip()):
        number = float(value.strip()) + 0.0  # -0 reads as 0
    if not (math.isfinite(number) and rule.fits(number)):
        raise NumberError(f"{rule.name} must be {rule.accepted()}, not {echo(value)}")
    return number


PLAIN_WHOLE = re.compile(r"[0-9]{1,19}")
"""What a typed whole number (an id, an offset, a count) may look like: ASCII digits only."""


def plain_whole(value: Any) -> Any:
    """Refuse a whole number typed as text unless it is ASCII digits (`1_0`, `１`, `+1`, `0x1`).

    Used before pydantic reads an int from a URL or a form, whose own reading would take `1_0`
    as 10. Numbers that arrive as JSON numbers pass unchanged (pydantic checks them).

    Raises:
        ValueError: "must be a whole number, not '…' (digits 0-9 only)".
    """
    if isinstance(value, str) and not PLAIN_WHOLE.fullmatch(value.strip()):
        raise ValueError(f"must be a whole number, not {echo(value)} (digits 0-9 only)")
    return value


PlainWhole = Annotated[int, BeforeValidator(plain_whole)]
"""An int read from a URL or form with the plain-digits rule of `plain_whole`."""
