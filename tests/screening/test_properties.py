"""Property-based fuzzing of the engine's entry points (hypothesis).

Every call either returns a well-formed result or raises a `BondgapInputError` subclass whose
message is one non-empty line; any other exception fails the test. Examples and time per
example are bounded, so the file runs in seconds. Finder queries use coarse grids (the default
fine grids are timed in `benchmarks/`), so each search stays small.

Physical properties checked on whatever the fuzzers get accepted: Phillips ionicity and
Harrison polarity in [0, 1] with their defining identities, an alloy's Vegard lattice constant
between its end points, finder matches inside the limits they were asked for.
"""

from __future__ import annotations

import json
import math
from collections.abc import Callable
from typing import Any, TypeVar

import numpy as np
import pytest
from hypothesis import HealthCheck, event, given, settings
from hypothesis import strategies as st

from screening.alloy_report import material_report, normalise_material
from screening.alloys import Alloy, FinderQuery, GapWindow, find_compositions, parse_alloy
from screening.alloys.query import DEFAULT_FAMILIES
from screening.bands import band_structure
from screening.catalogue import catalogue_formulas
from screening.elements import VALENCE
from screening.epitaxy import SubstrateSpec, substrate_from, substrate_spec
from screening.errors import BondgapInputError
from screening.formula import Compound, parse_compound
from screening.report import compound_report
from tests.fuzzing import (
    GEOMETRY_NAMES,
    OCTET_SYMBOLS,
    SUBSTRATE_NAMES,
    SYSTEM_NAMES,
    accepted_temperatures,
    alloy_formulas,
    bounded,
    formula_texts,
    has_line_break,
    mostly,
    symbols,
    temperatures,
)

T = TypeVar("T")

FAST = settings(max_examples=250, deadline=1000,
                suppress_health_check=[HealthCheck.too_slow, HealthCheck.filter_too_much])
"""Parsers and reports: cheap calls, many examples."""
SLOW = settings(max_examples=60, deadline=5000, suppress_health_check=[HealthCheck.too_slow])
"""Band structures and finder searches: fewer examples, a generous deadline per example."""

CALL_TIMEOUT_S = 30.0
"""A call still running after this fails the test (a hang); the slowest here take 0.5 s."""
ANY_FLOAT = st.floats(allow_nan=True, allow_infinity=True)
UNIT = 1.0 + 1e-12
"""Slack on the bounds [0, 1] for round-off."""


@pytest.fixture(scope="module", autouse=True)
def _warm_caches() -> None:
    """Load pymatgen, the catalogue and the gap tables once, outside any example's deadline."""
    compound_report("GaAs")
    material_report("In0.53Ga0.47As")
    find_compositions(FinderQuery(substrate=substrate_spec("InP"), system="InGaAs",
                                  ternary_step=0.1, quaternary_step=0.1))


def check_message(exc: BondgapInputError, *, one_line: bool = True) -> None:
    """An input error names the problem in one non-empty line."""
    message = str(exc)
    assert message.strip(), f"{type(exc).__name__} without a message"
    if one_line:
        assert not has_line_break(message), f"message of several lines: {message!r}"


def outcome(call: Callable[..., T], *args: Any, one_line: bool = True, **kwargs: Any
            ) -> T | None:
    """The call's result, or None after a well-formed input error; anything else propagates.

    Every input error's message is one line, whatever the input held (`one_line=False` is
    kept for callers that check something else).
    """
    try:
        result = bounded(CALL_TIMEOUT_S, call, *args, **kwargs)
    except BondgapInputError as exc:
        check_message(exc, one_line=one_line)
        event(f"refused: {type(exc).__name__}")
        return None
    event("accepted")
    return result


def quoting(text: str) -> dict[str, bool]:
    """The `one_line` argument of `outcome` for a call whose message may quote `text`."""
    del text  # messages are one line even when the text holds line breaks
    return {"one_line": True}


def strict_json(report: dict[str, Any]) -> None:
    """The report is JSON without NaN or infinity (the API answers it with allow_nan=False)."""
    json.dumps(report, allow_nan=False)


@FAST
@given(text=formula_texts())
def test_parse_compound_returns_an_octet_pair_or_an_input_error(text: str) -> None:
    compound = outcome(parse_compound, text, **quoting(text))
    if compound is None:
        return
    assert isinstance(compound, Compound)
    assert compound.cation in VALENCE and compound.anion in VALENCE
    if compound.cation == compound.anion:
        assert VALENCE[compound.cation] == 4
    else:
        assert VALENCE[compound.cation] + VALENCE[compound.anion] == 8
        assert VALENCE[compound.cation] <= VALENCE[compound.anion]
    assert parse_compound(compound.formula) == compound  # the normalised name reads back


@FAST
@given(text=formula_texts())
def test_parse_alloy_returns_fractions_on_each_site_or_an_input_error(text: str) -> None:
    alloy = outcome(parse_alloy, text, **quoting(text))
    if alloy is None:
        return
    assert isinstance(alloy, Alloy)
    fractions = np.array(alloy.fractions)
    assert np.all((fractions >= 0.0) & (fractions <= 1.0))
    n_cat = len(alloy.system.cations)
    assert math.isclose(fractions[:n_cat].sum(), 1.0, abs_tol=1e-9)
    assert math.isclose(fractions[n_cat:].sum(), 1.0, abs_tol=1e-9)
    # The formula rounds to FORMULA_DECIMALS and leaves out an element whose fraction rounds
    # to zero (format_alloy): reading it back gives the same fractions to that rounding.
    again = parse_alloy(alloy.formula).site_fractions
    for element, fraction in alloy.site_fractions.items():
        assert again.get(element, 0.0) == pytest.approx(fraction, abs=2e-4)


@FAST
@given(text=formula_texts())
def test_normalised_name_is_a_fixed_point(text: str) -> None:
    # The pages redirect any spelling to the normalised one: a second pass must not move it,
    # or the redirect would loop.
    name = outcome(normalise_material, text, **quoting(text))
    if name is not None:
        assert normalise_material(name) == name


@FAST
@given(text=formula_texts(), temperature=temperatures())
def test_material_report_is_strict_json_or_an_input_error(text: str, temperature: float) -> None:
    report = outcome(material_report, text, temperature, **quoting(text))
    if report is None:
        return
    assert 0.0 <= temperature <= 2000.0
    assert report["formula"] == normalise_material(text)
    assert report["band_gap"]["temperature_K"] == pytest.approx(temperature)
    strict_json(report)


def _spellings(formula: str) -> list[str]:
    compound = parse_compound(formula)
    if compound.cation == compound.anion:
        return [formula, f"{formula}2", f" {formula} "]
    return [formula, compound.anion + compound.cation, f"{compound.cation}2{compound.anion}2"]


@FAST
@given(formula=st.sampled_from(catalogue_formulas()), which=st.integers(0, 2),
       temperature=accepted_temperatures())
def test_binary_ionicity_and_polarity_lie_in_zero_one(formula: str, which: int,
                                                      temperature: float) -> None:
    report = bounded(CALL_TIMEOUT_S, compound_report, _spellings(formula)[which], temperature)
    assert report["formula"] == formula
    strict_json(report)
    for route in ("spectroscopic", "predictive"):
        phillips = (report["phillips"] or {}).get(route)
        if phillips is None or phillips["ionicity"] is None:
            continue
        assert 0.0 <= phillips["ionicity"] <= UNIT
        eh, c, eg = (phillips[k] for k in ("homopolar_gap_eV", "heteropolar_gap_eV",
                                          "average_gap_eV"))
        assert eg**2 == pytest.approx(eh**2 + c**2, rel=1e-9)  # Eg^2 = Eh^2 + C^2
        assert phillips["ionicity"] == pytest.approx(c**2 / eg**2, rel=1e-9, abs=1e-12)
    harrison = report["harrison"]
    if harrison and harrison["polarity"] is not None:
        assert 0.0 <= harrison["polarity"] <= UNIT
        assert 0.0 <= harrison["covalency"] <= UNIT
        assert harrison["polarity"] ** 2 + harrison["covalency"] ** 2 == pytest.approx(1.0)


@FAST
@given(text=alloy_formulas(), temperature=accepted_temperatures())
def test_alloy_lattice_lies_between_its_end_points(text: str, temperature: float) -> None:
    report = outcome(material_report, text, temperature, **quoting(text))
    if report is None or not report.get("alloy"):
        return
    strict_json(report)
    ends = report["end_points"]
    assert sum(e["weight"] for e in ends) == pytest.approx(1.0)
    lattice = [e["lattice_constant_angstrom"] for e in ends if e["weight"] > 0]
    a = report["lattice_constant_angstrom"]
    assert min(lattice) * (1 - 1e-12) <= a <= max(lattice) * (1 + 1e-12)  # Vegard's law
    for route in ("spectroscopic", "predictive"):
        phillips = (report["phillips"] or {}).get(route)
        if phillips and phillips["ionicity"] is not None:
            assert 0.0 <= phillips["ionicity"] <= UNIT
    if report["harrison"] and report["harrison"]["polarity"] is not None:
        assert 0.0 <= report["harrison"]["polarity"] <= UNIT


@SLOW
@given(text=mostly(st.sampled_from(catalogue_formulas()), formula_texts()),
       points=mostly(st.integers(6, 2000), st.integers(-(10**20), 10**20)))
def test_band_structure_is_finite_or_an_input_error(text: str, points: int) -> None:
    bands = outcome(band_structure, text, points, **quoting(text))
    if bands is None:
        return
    assert 6 <= points <= 2000
    assert bands.energies_eV.shape == (points, 8)
    assert np.isfinite(bands.energies_eV).all()
    assert np.all(np.diff(bands.distance) >= 0)
    assert math.isfinite(bands.gap_eV)


@FAST
@given(name=st.one_of(st.sampled_from(SUBSTRATE_NAMES), formula_texts()))
def test_substrate_lookup(name: str) -> None:
    spec = outcome(substrate_spec, name, **quoting(name))
    if spec is not None:
        assert spec.lattice in ("cubic", "hexagonal")
        assert math.isfinite(spec.lattice_a_angstrom) and spec.lattice_a_angstrom > 0


@FAST
@given(structure=st.one_of(st.sampled_from(("zincblende", "diamond", "wurtzite", "hexagonal",
                                            "corundum")), st.text(max_size=12)),
       a=ANY_FLOAT)
def test_substrate_of_your_own(structure: str, a: float) -> None:
    spec = outcome(substrate_from, "yours", structure, a, **quoting(structure))
    if spec is not None:
        assert math.isfinite(spec.lattice_a_angstrom) and spec.lattice_a_angstrom > 0


@FAST
@given(target=ANY_FLOAT, tolerance=ANY_FLOAT, wavelength=st.booleans())
def test_gap_window_brackets_its_target(target: float, tolerance: float,
                                        wavelength: bool) -> None:
    make = GapWindow.from_wavelength if wavelength else GapWindow.from_gap
    window = outcome(make, target, tolerance)
    if window is not None:
        assert window.low_eV <= window.target_eV <= window.high_eV  # low < 0: tolerance > gap
        assert window.target_eV > 0


def _substrates(clean: bool) -> st.SearchStrategy[SubstrateSpec | str]:
    """A built-in name (looked up in the test), or a spec of one's own, sensible or not."""
    built_in = st.sampled_from(SUBSTRATE_NAMES)
    own = st.builds(
        SubstrateSpec, name=st.just("yours"),
        lattice=pick(clean, st.sampled_from(("cubic", "hexagonal")), st.sampled_from(
            ("cubicle", ""))),
        # Finite extremes (a = 5e-324 or 1e308 A) too: the engine answers them without a
        # numpy warning (the app keeps a user's a within 2 to 10 A).
        lattice_a_angstrom=pick(clean, st.floats(2.0, 10.0), st.one_of(st.sampled_from(
            (0.0, -5.65, math.nan, math.inf, -math.inf, 5e-324, 1e-300, 1e300, 1.7e308)),
            st.floats(min_value=0.0, exclude_min=True, allow_infinity=False))))
    return st.one_of(built_in, own)


def pick(clean: bool, valid: st.SearchStrategy[Any], junk: st.SearchStrategy[Any]
         ) -> st.SearchStrategy[Any]:
    """Valid values only in a clean query; mostly valid ones otherwise."""
    return valid if clean else mostly(valid, junk)


@st.composite
def finder_queries(draw: st.DrawFn) -> dict[str, Any]:
    """The raw inputs of a finder query: built inside the test, where errors are expected.

    Half the queries are clean (every value in range), so that searches run; in the others
    each value is out of range or junk one time in four.
    """
    clean = draw(st.booleans())
    target = draw(st.sampled_from(("none", "gap", "wavelength")))
    plausible = st.floats(0.1, 4.0) if target == "gap" else st.floats(200.0, 5000.0)
    return {
        "substrate": draw(_substrates(clean)),
        "system": draw(pick(clean, st.sampled_from((*SYSTEM_NAMES, "all")), formula_texts())),
        "target": target,
        "target_value": draw(pick(clean, plausible, ANY_FLOAT)),
        "tolerance": draw(pick(clean, st.floats(0, 0.5), ANY_FLOAT)),
        # Refused values, or 0 to 2000 K: the finder takes any finite T >= 0, and above about
        # 1e200 K numpy overflows (a RuntimeWarning; reported with issue 7).
        "temperature_K": draw(pick(clean, accepted_temperatures(), st.sampled_from(
            (-1.0, -1e-300, math.nan, math.inf, -math.inf)))),
        "max_mismatch": draw(st.one_of(st.none(), pick(clean, st.floats(0, 0.05), ANY_FLOAT))),
        "layer_thickness_nm": draw(st.one_of(st.none(), pick(clean, st.floats(0.1, 1e4),
                                                             ANY_FLOAT))),
        "exclude_elements": tuple(draw(st.lists(
            pick(clean, st.sampled_from(OCTET_SYMBOLS), symbols()), max_size=3))),
        "geometry": draw(pick(clean, st.sampled_from(GEOMETRY_NAMES), st.text(max_size=12))),
        "families": draw(pick(clean, st.sampled_from((DEFAULT_FAMILIES, ("III-V",), ("II-VI",),
                                                      ("I-VII",))),
                              st.lists(st.sampled_from(("IV-IV", "V-III", "III-V")), min_size=1,
                                       max_size=2).map(tuple))),
        # Coarse grids keep a search small; the fine defaults are timed in benchmarks/.
        "ternary_step": draw(pick(clean, st.sampled_from((0.5, 0.25, 0.1, 0.05, 0.02)),
                                  st.sampled_from((0.3, 0.0, -0.1, math.nan, 1.0)))),
        "quaternary_step": draw(pick(clean, st.sampled_from((0.5, 0.25, 0.1, 0.05)),
                                     st.sampled_from((0.3, 1e-6, math.inf)))),
    }


def _run_finder(raw: dict[str, Any]) -> tuple[FinderQuery, Any]:
    values = dict(raw)
    substrate = values.pop("substrate")
    if isinstance(substrate, str):
        substrate = substrate_spec(substrate)
    target, value, tolerance = (values.pop(k) for k in ("target", "target_value", "tolerance"))
    gap = {"none": lambda: None, "gap": lambda: GapWindow.from_gap(value, tolerance),
           "wavelength": lambda: GapWindow.from_wavelength(value, tolerance)}[target]()
    query = FinderQuery(substrate=substrate, gap=gap, **values)
    return query, find_compositions(query)


@SLOW
@given(raw=finder_queries())
def test_finder_matches_meet_their_query_or_an_input_error(raw: dict[str, Any]) -> None:
    ran = outcome(_run_finder, raw, **quoting(raw["system"] + raw["geometry"]))
    if ran is None:
        return
    query, result = ran
    assert 0.0 <= query.temperature_K < math.inf
    n = len(result)
    a_sub = query.substrate.lattice_a_angstrom
    assert np.all(np.isfinite(result.lattice_constant_angstrom)) and np.all(
        result.lattice_constant_angstrom > 0)
    np.testing.assert_allclose(result.mismatch, (result.lattice_constant_angstrom - a_sub) / a_sub,
                               rtol=1e-9, atol=1e-12)
    if query.max_mismatch is not None:
        assert np.all(np.abs(result.mismatch) <= query.max_mismatch + 1e-9)
    if query.gap is not None and n:
        gaps = result.band_gap_eV
        assert np.all(np.isfinite(gaps))
        assert np.all((gaps >= query.gap.low_eV - 1e-9) & (gaps <= query.gap.high_eV + 1e-9))
    rounded = np.round(result.score, 9)
    assert np.all(np.diff(rounded) >= 0), "matches not ranked best first"
    for match in result.matches(25):
        assert set(match.fractions).isdisjoint(query.exclude_elements)
        assert all(0.0 < f <= 1.0 for f in match.fractions.values())
        json.dumps(match.as_dict(), allow_nan=False)
