"""Messages in our own words: no pydantic or pymatgen wording reaches the user; formulas that
differ from a known one only in letter case get "did you mean ...?"."""

import pytest
from bs4 import BeautifulSoup

from app.cli import main
from app.validation import plain_message

LIBRARY_WORDING = (
    "Field required", "Input should", "valid integer", "valid number", "invalid formula",
    "Can't parse", "Value error", "body.", "pydantic", "pymatgen", "Composition", "JSON decode",
    "Extra inputs", "Traceback",
)
"""Phrases of pydantic's and pymatgen's messages (and of a traceback)."""


def detail_of(response) -> str:
    if response.headers["content-type"].startswith("application/json"):
        return response.json()["detail"]
    return BeautifulSoup(response.text, "lxml").select_one(".error-message").get_text()


def assert_ours(text: str) -> None:
    assert text and "\n" not in text.strip()
    for phrase in LIBRARY_WORDING:
        assert phrase not in text, (phrase, text)


BAD_REQUESTS = [
    ("post", "/api/shortlists", {"json": {}}, "'name' is missing"),
    ("post", "/api/shortlists", {"json": {"note": "x"}}, "'name' is missing"),
    ("post", "/api/shortlists", {"json": ["x"]}, "must be a JSON object"),
    ("post", "/api/shortlists", {"content": b"{", "headers": {"content-type":
                                                              "application/json"}},
     "not valid JSON"),
    ("post", "/api/shortlists", {"json": {"name": "x", "temperature_K": "hot"}},
     "'temperature_K' must be a number, not 'hot'"),
    ("get", "/api/shortlists/abc", {}, "'shortlist_id' must be a whole number, not 'abc'"),
    ("get", "/api/shortlists/0", {}, "'shortlist_id' must be at least 1"),
    ("get", "/shortlists/abc", {}, "'shortlist_id' must be a whole number"),
    ("get", "/api/compounds?desc=maybe", {}, "'desc' must be true or false, not 'maybe'"),
    ("post", "/api/shortlists/{id}/items", {"json": {"formulas": "GaAs"}}, "'formulas'"),
    ("post", "/api/shortlists/{id}/items", {"json": {"formulas": ["GaAs"] * 201}},
     "'formulas' must hold at most 200 items"),
    ("post", "/api/shortlists/{id}/items", {"json": {"formulas": [5]}},
     "'formulas' item 1 must be text"),
    ("get", "/api/compounds/gaas", {}, "did you mean GaAs?"),
    ("get", "/api/compounds/GaAS", {}, "did you mean GaAs?"),
    ("get", "/api/compounds/INP", {}, "did you mean InP?"),
    ("get", "/compounds/cdte", {}, "did you mean CdTe?"),
    ("get", "/api/compounds/in0.53ga0.47as", {}, "did you mean In0.53Ga0.47As?"),
    ("get", "/api/compounds/ingaasp", {}, "did you mean InGaAsP with fractions"),
    ("get", "/api/compounds/Xx", {}, "'Xx' is not a chemical element symbol"),
    ("post", "/api/shortlists/{id}/items", {"json": {"formulas": ["gan"]}},
     "did you mean GaN?"),
]


@pytest.mark.parametrize(("method", "path", "kwargs", "words"), BAD_REQUESTS,
                         ids=[f"{m} {p} {w[:20]}" for m, p, _, w in BAD_REQUESTS])
def test_bad_requests_get_our_own_words(client, method, path, kwargs, words) -> None:
    made = client.post("/api/shortlists", json={"name": "Keep"}).json()
    response = client.request(method.upper(), path.replace("{id}", str(made["id"])), **kwargs)
    assert 400 <= response.status_code < 500, response.text[:300]
    detail = detail_of(response)
    assert words in detail, detail
    assert_ours(detail)


@pytest.mark.parametrize(("text", "suggested"), [
    ("gaas", "GaAs"), ("GaAS", "GaAs"), ("GAAS", "GaAs"), ("nacl", "NaCl"), ("sic", "SiC"),
])
def test_cli_show_suggests_the_formula(db_path, capsys, text: str, suggested: str) -> None:
    assert main(["show", text, "--db", str(db_path)]) == 2
    err = capsys.readouterr().err.strip()
    assert f"did you mean {suggested}?" in err
    assert_ours(err)


@pytest.mark.parametrize(("error", "sentence"), [
    ({"type": "missing", "loc": ("body", "name")}, "'name' is missing: it is required"),
    ({"type": "missing", "loc": ("body",)}, "the request body is missing: it is required"),
    ({"type": "int_parsing", "loc": ("path", "shortlist_id"), "input": "x" * 100},
     "'shortlist_id' must be a whole number, not '" + "x" * 40 + "...'"),
    ({"type": "string_too_long", "loc": ("body", "name"), "input": "n", "ctx": {"max_length": 80}},
     "'name' must be at most 80 characters long, not 'n'"),
    ({"type": "value_error", "loc": ("body", "note"), "ctx": {"error": "text holds a surrogate"}},
     "'note': text holds a surrogate"),
    ({"type": "something_new", "loc": ("query", "x"), "input": 1}, "'x' is not accepted, not '1'"),
])
def test_each_error_type_reads_as_one_sentence(error, sentence) -> None:
    assert plain_message(error) == sentence
