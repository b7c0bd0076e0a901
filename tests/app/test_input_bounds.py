"""Every input is checked at the boundary: out-of-bounds values get a one-line 4xx, never a 500."""

from pathlib import Path

import pytest
from bs4 import BeautifulSoup

from app.cli import main

SURROGATE = b"\\ud800"  # a JSON escape that decodes to an unpaired surrogate
TWENTY_ONE = ",".join(["As", "Sb", "P", "N", "Cd", "Hg", "Tl", "Be", "Se", "Te", "S", "O",
                       "Zn", "Mg", "Ca", "Sr", "Ba", "Pb", "Sn", "Ge", "Si"])
CSV = b"formula,property,value,unit,source\nGaAs,band_gap,1.43,eV,PL\n"


def raw_json(text: bytes) -> dict:
    return {"content": text, "headers": {"content-type": "application/json"}}


BAD = [
    # ids that SQLite cannot hold, or that cannot be ids
    ("get", "/api/shortlists/99999999999999999999", {}, 422, "shortlist_id"),
    ("get", "/api/shortlists/0", {}, 422, "must be at least 1"),
    ("delete", "/api/shortlists/-3?confirm=yes", {}, 422, "shortlist_id"),
    ("get", "/shortlists/99999999999999999999", {}, 422, "shortlist_id"),
    ("post", "/shortlists/add", {"data": {"formula": "GaAs", "shortlist": "²"}}, 400,
     "whole number"),
    ("post", "/shortlists/add", {"data": {"formula": "GaAs", "shortlist": "9" * 30}}, 400,
     "whole number"),
    ("delete", "/api/measurements/batches/NOT-HEX?confirm=yes", {}, 422, "batch"),
    ("get", "/measurements/batches/x%3Fy/delete", {}, 422, "batch"),
    ("get", "/measurements?imported=-1", {}, 422, "imported"),
    # names and notes
    ("post", "/api/shortlists", {"json": {"name": "<b>list</b>"}}, 400, "not '<'"),
    ("post", "/api/shortlists", {"json": {"name": "x" * 81}}, 400, "not 81 characters"),
    ("post", "/api/shortlists", {"json": {"name": "\u202egnp.exe"}}, 400, "bidirectional"),
    ("post", "/api/shortlists", {"json": {"name": "a\u00a0b"}}, 400, "U+00A0"),
    ("post", "/api/shortlists", {"json": {"name": "ok", "note": "x" * 4001}}, 400,
     "at most 4000"),
    ("post", "/api/shortlists", {"json": {"name": "ok", "note": "a\x1bb"}}, 400,
     "control character"),
    ("post", "/shortlists", {"data": {"name": "<script>x</script>"}}, 400, "not '<'"),
    ("patch", "/api/shortlists/{id}/items/GaAs", {"json": {"note": "\u2066x"}}, 400,
     "bidirectional"),
    ("post", "/api/substrates", {"json": {"name": "Mine", "structure": "cubic",
                                          "a_angstrom": 5, "note": "two\nlines"}}, 400,
     "control character"),
    # unpaired surrogates in JSON bodies: refused before they reach the database
    ("post", "/api/shortlists", raw_json(b'{"name": "' + SURROGATE + b'"}'), 422,
     "surrogate"),
    ("post", "/api/shortlists", raw_json(b'{"name": "x", "note": "' + SURROGATE + b'"}'), 422,
     "surrogate"),
    ("post", "/api/shortlists", raw_json(b'{"name": "x", "substrate": "' + SURROGATE + b'"}'),
     422, "surrogate"),
    ("post", "/api/shortlists/{id}/items", raw_json(b'{"formulas": ["' + SURROGATE + b'"]}'),
     422, "surrogate"),
    ("patch", "/api/shortlists/{id}/items/GaAs", raw_json(b'{"note": "' + SURROGATE + b'"}'),
     422, "surrogate"),
    ("post", "/api/substrates", raw_json(b'{"name": "M", "structure": "cubic", "a_angstrom": 5,'
                                         b' "note": "' + SURROGATE + b'"}'), 422, "surrogate"),
    # formulas, list sizes, conditions
    ("post", "/api/shortlists/{id}/items", {"json": {"formulas": ["GaAs"] * 201}}, 422,
     "formulas"),
    ("post", "/api/shortlists/{id}/items", {"json": {"formulas": ["Ga" * 40 + "As"]}}, 400,
     "at most 64"),
    ("patch", "/api/shortlists/{id}", {"json": {"temperature_K": 2001}}, 400, "0 to 2000"),
    ("patch", "/api/shortlists/{id}", raw_json(b'{"temperature_K": Infinity}'), 400,
     "temperature"),
    ("patch", "/api/shortlists/{id}", {"json": {"target_wavelength_nm": 10}}, 400,
     "above 50 to 100000"),
    ("patch", "/api/shortlists/{id}", {"json": {"target_gap_eV": -1}}, 400, "above 0 to 15"),
    # table, bands, finder
    ("get", "/api/compounds?sort=formula;DROP TABLE shortlists", {}, 400, "cannot sort"),
    ("get", "/api/compounds?temperature=2000.5", {}, 400, "0 to 2000"),
    ("get", "/api/compounds?temperature=nan", {}, 400, "a number of K from 0 to 2000"),
    ("get", "/api/compounds?wl_min=-5", {}, 400, "wl-min must be a number of nm from"),
    ("get", "/compounds/GaAs?temperature=-1", {}, 400, "0 to 2000"),
    ("get", "/api/compounds/GaAs/bands?points=2001", {}, 400, "6 to 2000"),
    ("get", "/api/match?on=InP&limit=0", {}, 400, "limit"),
    ("get", "/api/match?on=InP&limit=100001", {}, 400, "limit"),
    ("get", "/api/match?on=InP&gap=1&tolerance=-0.1", {}, 400, "tolerance"),
    ("get", "/api/match?on=InP&sort=rank desc", {}, 400, "cannot sort"),
    ("get", "/api/match?on=InP&thickness=0", {}, 400, "thickness"),
    ("get", "/api/match?on=InP&max_mismatch=2", {}, 400, "mismatch"),
    ("get", f"/api/match?on=InP&exclude={TWENTY_ONE}", {}, 400, "at most 20"),
    ("get", "/api/match?on=InP&temperature=5000", {}, 400, "0 to 2000"),
    # uploads: size and type
    ("post", "/api/measurements", {"content": CSV, "headers": {"content-type":
                                                               "application/json"}}, 415,
     "text/csv"),
    ("post", "/api/measurements", {"files": {"file": ("x.png", b"\x89PNG\r\n", "image/png")}},
     415, "image/png"),
    ("post", "/api/measurements", {"content": CSV + b"GaAs\x00,band_gap,1,eV,x\n",
                                   "headers": {"content-type": "text/csv"}}, 400, "NUL"),
    ("post", "/api/measurements", {"content": b"x" * 1_000_001,
                                   "headers": {"content-type": "text/csv"}}, 413, "1 MB"),
]


def detail_of(response) -> str:
    if response.headers["content-type"].startswith("application/json"):
        return response.json()["detail"]
    return BeautifulSoup(response.text, "lxml").select_one(".error-message").get_text()


@pytest.mark.parametrize(("method", "path", "kwargs", "status", "words"), BAD,
                         ids=[f"{m} {p[:50]} {s}" for m, p, _, s, _ in BAD])
def test_out_of_bounds_input_gets_a_one_line_4xx(client, method, path, kwargs, status,
                                                 words) -> None:
    made = client.post("/api/shortlists", json={"name": "Keep", "note": "mine"}).json()
    client.post(f"/api/shortlists/{made['id']}/items", json={"formulas": ["GaAs"]})
    before = client.get(f"/api/shortlists/{made['id']}").json()
    response = client.request(method.upper(), path.replace("{id}", str(made["id"])),
                              **kwargs)
    assert response.status_code == status, response.text[:300]
    detail = detail_of(response)
    assert words in detail and "\n" not in detail.strip() and "Traceback" not in detail
    assert client.get(f"/api/shortlists/{made['id']}").json() == before
    assert [s["name"] for s in client.get("/api/shortlists").json()["shortlists"]] == ["Keep"]


def test_values_at_the_bounds_are_accepted(client) -> None:
    name = "Ä" * 79 + "½"
    made = client.post("/api/shortlists", json={"name": name, "note": "n" * 4000,
                                                "temperature_K": 2000})
    assert made.status_code == 201 and made.json()["name"] == name
    url = f"/api/shortlists/{made.json()['id']}"
    assert client.patch(url, json={"temperature_K": 0}).json()["conditions"]["temperature_K"] == 0
    assert client.get("/api/compounds/GaAs/bands", params={"points": 2000}).status_code == 200
    assert client.get("/api/compounds", params={"temperature": 2000}).status_code == 200
    symbols = client.post("/api/shortlists", json={"name": "=cmd|' /C calc'!A0 ± 5 % µm 🔬"})
    assert symbols.status_code == 201
    decomposed = client.post("/api/shortlists", json={"name": "Cafe\u0301 review"}).json()
    assert decomposed["name"] == "Caf\u00e9 review"  # stored NFC


@pytest.mark.parametrize(("argv", "words"), [
    (["shortlist", "create", "a<b"], "not '<'"),
    (["shortlist", "create", "ok", "--note", "x" * 4001], "at most 4000"),
    (["shortlist", "create", "ok", "--temperature", "2001"], "0 to 2000"),
    (["shortlist", "list", "\udcff"], "not valid UTF-8"),
    (["shortlist", "create", "\udcffx"], "surrogate"),
    (["substrates", "delete", "\udcff"], "not valid UTF-8"),
    (["bands", "GaAs", "--points", "5"], "6 to 2000"),
    (["list", "--sort", "formula; DROP TABLE shortlists"], "cannot sort"),
    (["match", "InGaAs", "--on", "InP", "--limit", "0"], "limit"),
])
def test_cli_refuses_out_of_bounds_input(db_path: Path, capsys, argv, words) -> None:
    code = main([*argv, "--db", str(db_path)] if argv[0] != "bands" else argv)
    err = capsys.readouterr().err
    assert code == 2 and words in err and err.count("\n") == 1, err
