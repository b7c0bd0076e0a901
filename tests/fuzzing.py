"""Shared by the fuzzers of the engine and of the web app: hypothesis strategies, bounded calls.

Strategies: random text of every kind (printable, any unicode, long), text that looks like a
formula (element symbols, some real and some not, with numbers of every shape), alloy formulas
with random fractions on real alloy systems, and numbers including nan, inf, negative and huge.

`bounded` runs one call with a time limit, so that a hang fails a test instead of blocking it.
"""

from __future__ import annotations

import threading
from collections.abc import Callable
from typing import Any, TypeVar

from hypothesis import strategies as st

from screening.alloys import design_space_systems
from screening.elements import ATOMIC_NUMBER, VALENCE
from screening.epitaxy import GEOMETRIES
from screening.reference import substrates

T = TypeVar("T")

OCTET_SYMBOLS: tuple[str, ...] = tuple(VALENCE)
"""Elements of the octet families (they build the catalogue's compounds and alloys)."""

OTHER_SYMBOLS: tuple[str, ...] = ("H", "He", "Fe", "U", "Pb", "At", "Rn", "Xx", "Q", "ga", "AS")
"""Symbols outside the octet families, beyond Rn, not elements, or in the wrong case."""

SYSTEM_NAMES: tuple[str, ...] = tuple(s.name for s in design_space_systems())
"""Every alloy system of the design space (ternaries and quaternaries)."""

SUBSTRATE_NAMES: tuple[str, ...] = tuple(substrates())
"""The built-in substrate table."""

GEOMETRY_NAMES: tuple[str, ...] = tuple(GEOMETRIES)

NUMBER_TEXTS: tuple[str, ...] = (
    "", "0", "1", "2", "0.5", ".5", "1.", "0.53", "1e3", "1e-9", "-0.2", "-1", "nan", "NaN",
    "inf", "-inf", "1e308", "1e999", "0x10", "1_000", "٣", "½", "+1", "00", " 1", "1 ",
)
"""Amounts as a user might type them, sensible or not."""


def mostly(valid: st.SearchStrategy[T], junk: st.SearchStrategy[T]) -> st.SearchStrategy[T]:
    """Draw from `valid` about three times in four, else from `junk`."""
    return st.sampled_from((valid, valid, valid, junk)).flatmap(lambda chosen: chosen)


def symbols() -> st.SearchStrategy[str]:
    """An element symbol: mostly octet elements, sometimes others or junk."""
    return st.one_of(st.sampled_from(OCTET_SYMBOLS), st.sampled_from(OTHER_SYMBOLS),
                     st.sampled_from(tuple(ATOMIC_NUMBER)))


def amounts() -> st.SearchStrategy[str]:
    """The number after a symbol, as text."""
    return st.one_of(
        st.sampled_from(NUMBER_TEXTS),
        st.floats(allow_nan=True, allow_infinity=True).map(repr),
        st.tuples(st.floats(0, 1), st.integers(0, 5)).map(lambda p: f"{p[0]:.{p[1]}f}"),
        st.integers(-5, 10**6).map(str),
    )


@st.composite
def near_formulas(draw: st.DrawFn) -> str:
    """Symbols with optional amounts, sometimes in brackets or with stray characters."""
    parts = draw(st.lists(st.tuples(symbols(), amounts()), min_size=1, max_size=6))
    text = "".join(symbol + amount for symbol, amount in parts)
    if draw(st.booleans()):
        return text
    return draw(st.sampled_from((
        "(" + text + ")", text + "2", " " + text + " ", text + "\t", text.lower(),
        text.upper(), text.replace(".", ","), text + "(", text + "\n" + text,
    )))


@st.composite
def alloy_formulas(draw: st.DrawFn) -> str:
    """A real alloy system written with random fractions (that may not sum to one per site)."""
    system = draw(st.sampled_from(design_space_systems()))
    parts = []
    for site in (system.cations, system.anions):
        split = draw(st.lists(st.floats(0, 1), min_size=len(site), max_size=len(site)))
        if draw(st.booleans()):  # half the time, fractions that sum to one on the site
            total = sum(split) or 1.0
            split = [x / total for x in split]
        decimals = draw(st.integers(0, 5))
        order = draw(st.permutations(range(len(site))))
        for i in order:
            shown = f"{split[i]:.{decimals}f}"
            parts.append(site[i] + ("" if len(site) == 1 and draw(st.booleans()) else shown))
    return "".join(parts)


def formula_texts() -> st.SearchStrategy[str]:
    """Anything a user might type where a formula is expected."""
    return st.one_of(
        near_formulas(),
        alloy_formulas(),
        st.text(alphabet=st.characters(codec="ascii", exclude_categories=("Cc",)), max_size=80),
        st.text(max_size=40),
        st.text(min_size=60, max_size=400),
        st.sampled_from(("GaAs", "AsGa", "Ga2As2", "Si", "In0.53Ga0.47As", "GaAs0.51Sb0.49",
                         "In0.73Ga0.27As0.58P0.42", "Al0.3Ga0.2In0.5P", "InGaAs", "all")),
    )


TINY_TEMPERATURES_K = (5e-324, 1e-320, 1e-310, 2.2250738585072014e-308, 1e-300)
"""Positive temperatures next to 0 K, subnormal ones included (theta / T once overflowed)."""


def accepted_temperatures() -> st.SearchStrategy[float]:
    """Temperatures the engine accepts: 0 to 2000 K, the tiny positive ones included."""
    return st.one_of(st.floats(0, 2000), st.floats(0, 1e-300), st.sampled_from(
        TINY_TEMPERATURES_K))


def temperatures() -> st.SearchStrategy[float]:
    """Temperatures in K: the accepted 0 to 2000 K, and nan, inf, negative, huge, tiny."""
    return st.one_of(
        accepted_temperatures(),
        st.floats(allow_nan=True, allow_infinity=True),
        st.sampled_from((0.0, 2000.0, 2000.0000001, -0.0, -1e-300, 1e250, 1e308)),
    )


def has_line_break(text: str) -> bool:
    """True if the text holds any character `str.splitlines` breaks at (\\n, \\r, \\x1c, ...)."""
    return "".join(text.splitlines()) != text


def number_texts() -> st.SearchStrategy[str]:
    """A number as typed in a URL or form: sensible, out of range, or not a number at all."""
    return st.one_of(
        st.sampled_from(NUMBER_TEXTS),
        st.floats(allow_nan=True, allow_infinity=True).map(str),
        st.integers(-(10**30), 10**30).map(str),
        st.text(max_size=20),
    )


def bounded(seconds: float, call: Callable[..., T], *args: Any, **kwargs: Any) -> T:
    """Return `call(*args, **kwargs)`, or raise TimeoutError if it runs past `seconds`.

    The call runs in a daemon thread; one still running at the deadline is left behind (it
    cannot be stopped from outside) and the caller gets the TimeoutError. Exceptions of the
    call are raised in the caller's thread.
    """
    box: dict[str, Any] = {}

    def run() -> None:
        try:
            box["result"] = call(*args, **kwargs)
        except BaseException as exc:  # handed to the caller's thread below
            box["error"] = exc

    thread = threading.Thread(target=run, daemon=True)
    thread.start()
    thread.join(seconds)
    if thread.is_alive():
        raise TimeoutError(f"{getattr(call, '__name__', call)}{args!r}: no result within "
                           f"{seconds:g} s")
    if "error" in box:
        raise box["error"]
    return box["result"]
