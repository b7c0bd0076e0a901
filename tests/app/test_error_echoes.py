"""Error messages echo at most 40 characters of what was typed, and every float has a range.

Issue 10, defect 6: a 100 kB `exclude=` value came back in full in the message, and
`wavelength=1e308` was taken as 0.0000 eV while `1e999` was refused.
"""

from __future__ import annotations

import pytest

from screening.errors import ECHO_LENGTH

LONG = "Q" * 20_000
GETS = [
    ("/api/compounds", ["family", "structure", "gap_min", "gap_max", "sort", "temperature",
                        "wl_min", "wl_max", "kind", "exclude"]),
    ("/api/match?on=InP", ["system", "gap", "wavelength", "tolerance", "temperature",
                           "max_mismatch", "thickness", "geometry", "exclude", "sort", "limit",
                           "offset"]),
    ("/api/compounds/GaAs", ["temperature", "on"]),
    ("/api/compounds/GaAs?on=InP", ["geometry"]),
    ("/api/compounds/GaAs/bands", ["points"]),
]


def _longest_run(message: str, letter: str = "Q") -> int:
    """The longest run of `letter` in the message (the echo of the typed value)."""
    return max((len(chunk) for chunk in "".join(c if c == letter else " " for c in message)
                .split()), default=0)


@pytest.mark.parametrize(("path", "params"), GETS)
def test_long_values_are_echoed_cut(client, path: str, params: list[str]) -> None:
    for name in params:
        response = client.get(f"{path}{'&' if '?' in path else '?'}{name}={LONG}")
        assert 400 <= response.status_code < 500, (name, response.status_code, response.text[:200])
        detail = response.json()["detail"]
        assert _longest_run(detail) <= ECHO_LENGTH, (name, len(detail), detail[:200])
        assert len(detail) < 1000, (name, len(detail))


def test_long_formula_in_the_path_is_echoed_cut(client) -> None:
    detail = client.get("/api/compounds/" + "Ga" + "Q" * 5000).json()["detail"]
    assert _longest_run(detail) <= ECHO_LENGTH, detail[:200]


@pytest.mark.parametrize(("params", "words"), [
    ({"wavelength": "1e308"}, "wavelength"),
    ({"wavelength": "1e7"}, "wavelength"),
    ({"tolerance": "1e308", "gap": "1"}, "tolerance"),
    ({"max_mismatch": "1e-320"}, None),
])
def test_every_finder_float_has_a_stated_range(client, params: dict, words: str | None) -> None:
    response = client.get("/api/match", params={"on": "InP", "system": "InGaAs", **params})
    if words is None:
        assert response.status_code == 200, response.text[:200]
        return
    assert response.status_code == 400, response.text[:200]
    detail = response.json()["detail"]
    assert words in detail and " to " in detail, detail


@pytest.mark.parametrize(("params", "words"), [
    ({"gap_min": "1e308"}, "gap-min"),
    ({"gap_max": "-1e308"}, "gap-max"),
    ({"wl_min": "1e308"}, "wl-min"),
    ({"wl_max": "1e-300"}, "wl-max"),
])
def test_table_windows_have_a_stated_range(client, params: dict, words: str) -> None:
    response = client.get("/api/compounds", params=params)
    assert response.status_code == 400, response.text[:200]
    detail = response.json()["detail"]
    assert words in detail and " to " in detail, detail


@pytest.mark.parametrize(("path", "body"), [
    ("/api/shortlists", {"name": "Numbers", "temperature_K": True}),
    ("/api/shortlists", {"name": "Numbers", "target_gap_eV": True}),
    ("/api/substrates", {"name": "Mine", "structure": "zincblende", "a_angstrom": True}),
    ("/api/substrates", {"name": "Mine", "structure": "zincblende", "a_angstrom": "5.6"}),
])
def test_json_numbers_are_numbers(client, path: str, body: dict) -> None:
    # Issue 10, defect 5: JSON `true` was taken as the number 1.
    response = client.post(path, json=body)
    assert response.status_code == 422, response.text[:200]


@pytest.mark.parametrize("value", ["1_000", "\uff13\uff10\uff10", "300\u200b", "0x12c"])
def test_query_numbers_are_plain_decimals(client, value: str) -> None:
    # Issue 10, defect 5: `temperature=1_000` and full-width digits were accepted.
    response = client.get("/api/compounds", params={"temperature": value})
    assert response.status_code == 400
    assert response.json()["detail"].startswith("temperature must be a number of K from 0 to")
