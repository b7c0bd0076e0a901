"""Errors raised by the engine for input it cannot accept.

Family tree::

    BondgapInputError (ValueError)       bad input: the web layer answers 4xx, the CLI exits 2
    ├── UnknownElementError              a symbol that is not a chemical element (or beyond Z = 86)
    ├── FormulaSyntaxError               text that cannot be read as a formula
    ├── NotOctetCompoundError            a formula that is not an octet binary AB
    ├── CompositionError                 alloy fractions out of [0, 1] or not summing per site
    ├── StructureMismatchError           alloy end points (or layer and substrate) of different
    │                                    crystal structures
    ├── MissingDataError                 an alloy whose end-point binaries lack the measured
    │                                    data the calculation needs
    ├── OutOfRangeError                  a number outside its meaningful range (temperature < 0,
    │                                    tolerance < 0, wavelength <= 0, grid step)
    ├── UnknownChoiceError               a named option not in its registry (lists the names)
    └── UnknownSubstrateError            a substrate name not in the table
    ConvergenceError (RuntimeError)      a numerical solve that did not converge (not bad input)

Every message says what was wrong and what is accepted.
"""


import re

ECHO_LENGTH = 40
"""Most characters of a user's input repeated in a message."""

_LONG_WORD = re.compile(rf"\S{{{ECHO_LENGTH + 4},}}")
"""A run without spaces longer than any word of ours: what a message echoed from the input."""


def echo(value: object) -> str:
    """What the user typed, quoted for a message: at most `ECHO_LENGTH` characters of it.

    Messages that repeat input quote it through here, so a 100 kB value never comes back.
    """
    text = str(value)
    if len(text) <= ECHO_LENGTH:
        return repr(text)
    return repr(text[:ECHO_LENGTH])[:-1] + "...'"


def one_line(text: object) -> str:
    """The text on one line: control characters (line breaks, tabs, ...) shown escaped."""
    return "".join(ch if ch.isprintable() else repr(ch)[1:-1] for ch in str(text))


def cut_echoes(text: str) -> str:
    """The message with every run of more than `ECHO_LENGTH` + 3 non-space characters cut.

    The net under `echo`: a message built from input that was not quoted through it still
    repeats at most `ECHO_LENGTH` characters of each word of that input.
    """
    return _LONG_WORD.sub(lambda m: m.group()[:ECHO_LENGTH] + "...", text)


class BondgapInputError(ValueError):
    """Base class for every kind of input the engine rejects.

    The message is always one line: control characters that came in with the user's text
    (line breaks, tabs, ...) are shown escaped, as Python writes them; and it repeats at most
    `ECHO_LENGTH` characters of any word of that text (`cut_echoes`).
    """

    def __init__(self, message: object = "", *args: object) -> None:
        super().__init__(cut_echoes(one_line(message)), *args)


class UnknownElementError(BondgapInputError):
    """A symbol that is not a chemical element the engine covers."""


class FormulaSyntaxError(BondgapInputError):
    """Text that cannot be read as a chemical formula."""


class NotOctetCompoundError(BondgapInputError):
    """A formula that is not an octet binary compound (IV-IV, III-V, II-VI, I-VII)."""


class CompositionError(BondgapInputError):
    """Alloy fractions outside [0, 1], not summing to one per site, or mixing sublattices."""


class StructureMismatchError(BondgapInputError):
    """Alloy end points of different crystal structures, or a layer and substrate that differ."""


class MissingDataError(BondgapInputError):
    """An alloy whose end-point binaries lack the measured data that the calculation needs."""


class OutOfRangeError(BondgapInputError):
    """A number outside its meaningful range (a target no alloy meets is not an error)."""


class UnknownChoiceError(BondgapInputError):
    """A named option (model, geometry, ...) that is not in its registry."""


class UnknownSubstrateError(BondgapInputError):
    """A substrate name that is not in the substrate table."""


class ConvergenceError(RuntimeError):
    """A numerical solve (for example an atomic SCF cycle) that did not converge."""

