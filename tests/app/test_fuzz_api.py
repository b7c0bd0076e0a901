"""Fuzzing the web app with hypothesis: random paths and query strings, real app, temp database.

Every answer must be below 500; under /api/ an error is JSON with a one-line `detail`; no body
(JSON, CSV or HTML) holds traceback text. Redirects are followed (a redirect loop fails the
test). Examples are bounded per test; the finder gets a cheap share of expensive queries
(`limit` stays small: large limits are a matter of the load benchmark, not of fuzzing).
"""

from __future__ import annotations

import shutil
from collections.abc import Iterator
from pathlib import Path
from typing import Any
from urllib.parse import parse_qsl, quote, unquote, urlencode

import pytest
from hypothesis import HealthCheck, event, given, settings
from hypothesis import strategies as st

from tests.conftest import TEST_HOST
from tests.fuzzing import (
    GEOMETRY_NAMES,
    SUBSTRATE_NAMES,
    SYSTEM_NAMES,
    bounded,
    formula_texts,
    has_line_break,
    mostly,
    number_texts,
    symbols,
)

FUZZ = settings(max_examples=60, deadline=None, database=None,
                suppress_health_check=[HealthCheck.too_slow])
"""No per-example deadline (a cold finder run takes a second or two); examples are bounded."""

REQUEST_TIMEOUT_S = 30.0
"""Longest wait for one answer (the slowest plausible request here takes about 2 s)."""
TRACEBACK_MARKS = ("Traceback", 'File "')

TABLE_PARAMS = ("family", "structure", "gap_min", "gap_max", "measured_only", "sort", "desc",
                "temperature", "wl_min", "wl_max", "kind", "exclude", "no_rohs")
FINDER_PARAMS = ("system", "on", "gap", "wavelength", "tolerance", "temperature",
                 "max_mismatch", "thickness", "geometry", "exclude", "no_rohs", "sort", "desc",
                 "limit")
PAGES_AND_API = ("/api/compounds", "/compounds", "/api/compounds.csv", "/api/match", "/alloys",
                 "/api/compounds/GaAs", "/compounds/In0.53Ga0.47As", "/api/compounds/GaAs/bands")


@pytest.fixture(scope="module")
def fuzz_client(seeded_db_template: Path, tmp_path_factory: pytest.TempPathFactory
                ) -> Iterator[Any]:
    """One app on a database of its own for the whole module (the fuzzers only read)."""
    from fastapi.testclient import TestClient

    from app.config import Settings
    from app.main import create_app

    db = tmp_path_factory.mktemp("fuzz") / "bondgap.db"
    shutil.copyfile(seeded_db_template, db)
    app = create_app(Settings(db_path=db, allowed_hosts=(TEST_HOST,)))
    with TestClient(app, follow_redirects=True) as client:
        yield client


@pytest.mark.parametrize("url", [*PAGES_AND_API[:3], "/api/match?on=InP&wavelength=1550&limit=5",
                                 "/alloys?on=InP&gap=0.8&limit=5", *PAGES_AND_API[5:]])
def test_fuzzed_endpoints_answer_a_plain_request(fuzz_client: Any, url: str) -> None:
    # The fuzzers below pass on any status under 500: make sure their client is served at all
    # (not refused by the request guard), so that they reach the routes.
    assert get(fuzz_client, url).status_code == 200


def check(response: Any, *, typed: list[str]) -> None:
    """Below 500, no traceback text, and under /api/ a one-line JSON `detail` for an error.

    Args:
        response: The answer (after redirects).
        typed: The decoded values the request carried (every message must be one line even
            when they hold line breaks).
    """
    request = f"{response.request.method} {response.request.url}"
    event(f"status {response.status_code}")
    assert response.status_code < 500, f"{request} -> {response.status_code}"
    body = response.text
    for mark in TRACEBACK_MARKS:
        assert mark not in body, f"{request}: traceback text in the body"
    if response.request.url.path.startswith("/api/") and response.status_code >= 400:
        detail = response.json()["detail"]
        assert isinstance(detail, str) and detail.strip(), f"{request}: empty detail"
        assert not has_line_break(detail), f"{request}: detail of several lines {detail!r}"


def get(client: Any, url: str) -> Any:
    """GET through the test client (which has no timeouts), failing after REQUEST_TIMEOUT_S."""
    return bounded(REQUEST_TIMEOUT_S, client.get, url)


def segment(text: str) -> str:
    """A path segment carrying `text` exactly (percent-encoded, slashes included)."""
    return quote(text, safe="")


@FUZZ
@given(text=formula_texts(), page=st.booleans(),
       extra=st.dictionaries(st.sampled_from(("temperature", "on", "geometry")),
                             st.one_of(number_texts(), st.sampled_from(SUBSTRATE_NAMES),
                                       st.sampled_from(GEOMETRY_NAMES)), max_size=3))
def test_compound_paths(fuzz_client: Any, text: str, page: bool, extra: dict[str, str]) -> None:
    prefix = "/compounds/" if page else "/api/compounds/"
    url = prefix + segment(text) + ("?" + urlencode(extra) if extra else "")
    check(get(fuzz_client, url), typed=[text, *extra.values()])


@FUZZ
@given(text=mostly(st.sampled_from(("GaAs", "AsGa", "Si", "ZnSe", "NaCl", "GaN")),
                   formula_texts()),
       points=st.one_of(st.none(), number_texts(), st.integers(-10, 2100).map(str)))
def test_band_paths(fuzz_client: Any, text: str, points: str | None) -> None:
    query = "" if points is None else "?" + urlencode({"points": points})
    check(get(fuzz_client, f"/api/compounds/{segment(text)}/bands{query}"),
          typed=[text, points or ""])


def _param_values(name: str) -> st.SearchStrategy[str]:
    """Values for one query parameter: plausible ones for its name, and junk."""
    plausible: dict[str, st.SearchStrategy[str]] = {
        "family": st.sampled_from(("III-V", "ii-vi", "I-VII", "IV-IV", "V-III")),
        "structure": st.sampled_from(("zincblende", "wurtzite", "rocksalt", "diamond", "fcc")),
        "kind": st.sampled_from(("direct", "indirect", "Direct", "both")),
        "sort": st.sampled_from(("formula", "band_gap_eV", "rank", "abs_mismatch", "a; drop",
                                 "ionicity_predictive", "mismatch")),
        "desc": st.sampled_from(("true", "false", "1", "0", "maybe", "")),
        "measured_only": st.sampled_from(("true", "false", "on", "2")),
        "no_rohs": st.sampled_from(("true", "false", "yes", "x")),
        "system": st.sampled_from((*SYSTEM_NAMES, "all", "ALL", "GaAs", "InGaAsPSb")),
        "on": st.sampled_from((*SUBSTRATE_NAMES, "inp", "")),
        "geometry": st.sampled_from((*GEOMETRY_NAMES, "single")),
        "exclude": st.lists(symbols(), max_size=4).map(",".join),
        "limit": st.integers(-5, 600).map(str),
    }
    numbers = {"gap": (0.1, 4.0), "gap_min": (0.0, 4.0), "gap_max": (0.5, 8.0),
               "wavelength": (300.0, 5000.0), "wl_min": (200.0, 2000.0), "wl_max": (500.0, 9000.0),
               "tolerance": (0.0, 0.2), "temperature": (0.0, 2000.0),
               "max_mismatch": (0.0, 0.02), "thickness": (1.0, 1000.0)}
    for key, (low, high) in numbers.items():
        plausible[key] = st.one_of(st.floats(low, high), st.floats(0.0, 1e-300).filter(
            lambda v, low=low: v >= low)).map(str)
    return mostly(plausible.get(name, number_texts()), st.one_of(number_texts(), formula_texts()))


@st.composite
def query_params(draw: st.DrawFn, names: tuple[str, ...], required: tuple[str, ...] = ()
                 ) -> list[tuple[str, str]]:
    """A query string's pairs: the required names (mostly), known names (sometimes repeated),
    now and then an unknown one."""
    keys = [key for key in required if draw(mostly(st.just(True), st.just(False)))]
    keys += draw(st.lists(mostly(st.sampled_from(names), st.text(max_size=8)), max_size=6))
    return [(key, draw(_param_values(key))) for key in keys]


@FUZZ
@given(path=st.sampled_from(("/api/compounds", "/compounds", "/api/compounds.csv")),
       params=query_params(TABLE_PARAMS))
def test_table_queries(fuzz_client: Any, path: str, params: list[tuple[str, str]]) -> None:
    check(get(fuzz_client, path + "?" + urlencode(params)), typed=[v for _, v in params])


@settings(FUZZ, max_examples=40)
@given(path=st.sampled_from(("/api/match", "/alloys")),
       params=query_params(FINDER_PARAMS, required=("on", "system")))
def test_finder_queries(fuzz_client: Any, path: str, params: list[tuple[str, str]]) -> None:
    limited = [(k, v) for k, v in params if k != "limit"]
    limited.append(("limit", next((v for k, v in params if k == "limit"), "50")))
    check(get(fuzz_client, path + "?" + urlencode(limited)), typed=[v for _, v in limited])


@FUZZ
@given(path=st.sampled_from(PAGES_AND_API),
       raw=st.text(st.characters(codec="utf-8", exclude_categories=("Cs",)), max_size=120))
def test_raw_query_strings(fuzz_client: Any, path: str, raw: str) -> None:
    # Percent signs pass through unencoded, so malformed escapes (%zz, %ff) reach the app.
    query = quote(raw, safe="=&;%+")
    if path in ("/api/match", "/alloys"):
        query += "&limit=50"  # the last value of a repeated parameter wins
    typed = [unquote(raw), *(v for _, v in parse_qsl(query, keep_blank_values=True))]
    check(get(fuzz_client, f"{path}?{query}"), typed=typed)
