import sqlite3
from pathlib import Path

import pytest
from bs4 import BeautifulSoup

HEADER = "formula,property,value,unit,source\n"
GOOD = HEADER + (
    "GaAs,band_gap,1.43,eV,our PL at 300 K\n"
    "AsGa,lattice_a,0.565,nm,XRD run 7\n"
    "In0.53Ga0.47As,band_gap,745,meV,PL wafer 12\n"
    "# a comment line\n"
    "GaAs,eps_inf,10.9,,ellipsometry\n"
)


def post(client, text: str | bytes, name: str = "m.csv"):
    data = text.encode() if isinstance(text, str) else text
    return client.post("/api/measurements", files={"file": (name, data, "text/csv")})


def stored(db: Path) -> list[tuple]:
    with sqlite3.connect(db) as conn:
        return conn.execute(
            "SELECT formula, property, value, unit, source FROM user_measurements "
            "ORDER BY formula, property").fetchall()


def test_good_file_is_stored_in_canonical_units(client, db_path: Path) -> None:
    response = post(client, GOOD)
    assert response.status_code == 201 and response.json()["imported"] == 4
    assert stored(db_path) == [
        ("GaAs", "band_gap", 1.43, "eV", "our PL at 300 K"),
        ("GaAs", "eps_inf", 10.9, "", "ellipsometry"),
        ("GaAs", "lattice_a", pytest.approx(5.65), "angstrom", "XRD run 7"),
        ("In0.53Ga0.47As", "band_gap", pytest.approx(0.745), "eV", "PL wafer 12"),
    ]
    again = client.post("/api/measurements", content=HEADER + "GaAs,band_gap,1.44,eV,PL 2\n",
                        headers={"content-type": "text/csv"})
    assert again.json() == {**again.json(), "imported": 1, "replaced": 1}
    assert ("GaAs", "band_gap", 1.44, "eV", "PL 2") in stored(db_path)


@pytest.mark.parametrize(
    ("text", "status", "words"),
    [
        ("formula,value,unit\nGaAs,1.4,eV\n", 400, "line 1 (header): missing column(s) "
         "property, source"),
        (HEADER + "GaAs,band_gap,1.4,eV,a\nInP,band_gap,abc,eV,b\n", 400,
         "line 3, column value: a band_gap value must be a number of eV from -1 to 15, not 'abc'"),
        (HEADER + "GaAs,band_gap,1.4,eV,a\nUnobtainium,band_gap,1.4,eV,b\n", 400,
         "line 3, column formula: 'Unobtainium'"),
        (HEADER + "GaAs,band_gap,1.4,eV,a\nNaAs,band_gap,1.4,eV,b\n", 400,
         "line 3, column formula: 'NaAs'"),
        (HEADER + "GaAs,band_gap,1.4,eV,a\nGaAs,band_gap,1.5,eV,b\n", 400,
         "line 3, column property: GaAs band_gap is given twice (first on line 2)"),
        (HEADER + "GaAs,density,5.3,g/cm3,a\n", 400, "line 2, column property: unknown"),
        (HEADER + "GaAs,band_gap,1.4,K,a\n", 400, "line 2, column unit: unit 'K'"),
        (HEADER + "GaAs,lattice_a,565,angstrom,a\n", 400,
         "a lattice_a value must be a number of angstrom from 1 to 20, not '565'"),
        (HEADER + "GaAs,band_gap,nan,eV,a\n", 400,
         "must be a number of eV from -1 to 15, not 'nan'"),
        (HEADER + "GaAs,band_gap,1.4,eV,\n", 400, "line 2, column source"),
        (HEADER + "GaAs,band_gap,1.4\n", 400, "line 2, column unit"),
        (HEADER, 400, "no value rows"),
        ("", 400, "empty"),
        (HEADER.encode() + b"GaAs,band_gap,1.4,eV,caf\xe9\n", 400, "not UTF-8"),
        (HEADER + "GaAs,band_gap,1.4,eV,a\n" * 5001, 400,
         "5001 value rows, more than 5000 (line 5002 is the first too many)"),
    ],
)
def test_malformed_files_name_the_row_and_store_nothing(client, db_path, text, status,
                                                        words) -> None:
    post(client, HEADER + "InP,band_gap,1.34,eV,before\n")
    before = stored(db_path)
    response = post(client, text)
    assert response.status_code == status
    detail = response.json()["detail"]
    assert words in detail
    assert "nothing was imported" in detail or "empty" in detail
    assert "\n" not in detail
    assert stored(db_path) == before


def test_ten_megabyte_file_is_refused_before_reading(client, db_path) -> None:
    big = (HEADER + "GaAs,band_gap,1.4,eV,a\n" * 500_000).encode()
    assert len(big) > 10_000_000
    response = post(client, big)
    assert response.status_code == 413
    assert "1 MB" in response.json()["detail"]  # refused by the request guard's size limit
    raw = client.post("/api/measurements", content=big, headers={"content-type": "text/csv"})
    assert raw.status_code == 413
    assert stored(db_path) == []


def test_page_import_shows_errors_and_values_appear_as_yours(client, db_path) -> None:
    page = client.post("/measurements", files={"file": ("x.csv", b"formula\nGaAs\n", "text/csv")})
    assert page.status_code == 400
    soup = BeautifulSoup(page.text, "lxml")
    assert "missing column(s)" in soup.select_one("#import-error").get_text()
    done = client.post("/measurements", files={"file": ("m.csv", GOOD.encode(), "text/csv")},
                       follow_redirects=False)
    assert done.status_code == 303 and "imported=4" in done.headers["location"]
    listing = BeautifulSoup(client.get("/measurements").text, "lxml")
    assert len(listing.select("#measurements-table tbody tr[data-formula]")) == 4
    compound = BeautifulSoup(client.get("/compounds/GaAs").text, "lxml")
    yours = compound.select_one("#yours tr[data-key='yours.band_gap']")
    assert "yours" in yours.get_text() and "our PL at 300 K" in yours.get_text()
    assert yours.select_one("td[data-value]")["data-value"] == "1.43"
    made = client.post("/api/shortlists", json={"name": "Y"}).json()
    client.post(f"/api/shortlists/{made['id']}/items", json={"formulas": ["GaAs", "InP"]})
    rows = {r["key"]: r for r in client.get(f"/api/shortlists/{made['id']}/compare").json()[
        "rows"]}
    assert rows["band_gap_eV"]["cells"][0]["yours"]["value"] == 1.43
    assert rows["band_gap_eV"]["cells"][0]["value"] == 1.424  # the handbook value stays
    assert rows["band_gap_eV"]["cells"][1]["yours"] is None


def test_template_and_batch_delete(client, db_path) -> None:
    template = client.get("/api/measurements/template.csv")
    assert template.text.splitlines()[0] == HEADER.strip()
    batch = post(client, GOOD).json()["batch"]
    assert client.delete(f"/api/measurements/batches/{batch}").status_code == 400
    done = client.delete(f"/api/measurements/batches/{batch}", params={"confirm": "yes"})
    assert done.json() == {"deleted": 4} and stored(db_path) == []
    assert client.delete(f"/api/measurements/batches/{batch}",
                         params={"confirm": "yes"}).status_code == 404


@pytest.mark.parametrize("source", ["PL \u202e2024", "PL\u20282024", "PL\u00852024",
                                    "PL\u007f2024", "PL\u200b2024"])
def test_sources_follow_the_text_rules_of_the_forms(client, db_path, source: str) -> None:
    # Issue 10, defect 5: these were stored as typed.
    response = post(client, HEADER + f"GaAs,band_gap,1.42,eV,{source}\n")
    assert response.status_code == 400, response.text
    assert "column source" in response.json()["detail"]
    assert stored(db_path) == []


def test_sources_are_stored_nfc(client, db_path) -> None:
    decomposed = "Mu\u0308ller lab"  # u + combining diaeresis
    assert post(client, HEADER + f"GaAs,band_gap,1.42,eV,{decomposed}\n").status_code == 201
    assert [row[-1] for row in stored(db_path)] == ["M\u00fcller lab"]


@pytest.mark.parametrize("value", ["1_4", "\uff11.4", "1.4\u200b", "0x1", "inf", "true"])
def test_values_are_plain_decimal_numbers_only(client, db_path, value: str) -> None:
    # Issue 10, defect 5: `1_4` was stored as 14.0.
    response = post(client, HEADER + f"GaAs,band_gap,{value},eV,PL\n")
    assert response.status_code == 400, response.text
    assert "must be a number of eV from -1 to 15" in response.json()["detail"]
    assert stored(db_path) == []


def test_the_listing_is_paged(client, db_path) -> None:
    # Bounded cost: one answer holds at most LIST_PAGE_ROWS values; the rest by offset.
    assert post(client, GOOD).status_code == 201  # four values
    first = client.get("/api/measurements", params={"limit": 2}).json()
    assert len(first["measurements"]) == 2
    assert (first["total"], first["offset"], first["next_offset"]) == (4, 0, 2)
    rest = client.get("/api/measurements", params={"offset": first["next_offset"]}).json()
    assert [(m["formula"], m["property"]) for m in rest["measurements"]] == [
        ("GaAs", "lattice_a"), ("In0.53Ga0.47As", "band_gap")]
    assert rest["next_offset"] is None
    for bad in ({"limit": 0}, {"limit": 1001}, {"offset": -1}, {"offset": "1_0"}):
        answer = client.get("/api/measurements", params=bad)
        assert answer.status_code == 422 and "\n" not in answer.json()["detail"]
