"""The alloy finder page and an alloy composition's page, parsed as HTML."""

import json

import pytest
from bs4 import BeautifulSoup

FINDER = {"system": "InGaAsP", "on": "InP", "wavelength": "1550", "max_mismatch": "0.001"}


def soup(response) -> BeautifulSoup:
    return BeautifulSoup(response.text, "html.parser")


def test_finder_form_without_a_query(client) -> None:
    response = client.get("/alloys")
    assert response.status_code == 200
    page = soup(response)
    assert page.select_one("#f-on option[selected]")["value"] == "InP"
    options = {o["value"] for o in page.select("#system-list option")}
    assert {"all", "InGaAs", "InGaAsP", "AlGaAs"} <= options
    assert page.select_one("#finder-hint") and not page.select_one("#match-table")
    assert page.select_one("nav a[href='/alloys']") and page.select_one("nav a[href='/substrates']")


def test_finder_table_and_chart_are_the_api_rows(client) -> None:
    response = client.get("/alloys", params=FINDER)
    assert response.status_code == 200
    page = soup(response)
    api = client.get("/api/match", params=FINDER).json()
    rows = page.select("#match-table tbody tr")
    assert [r["data-formula"] for r in rows] == [m["formula"] for m in api["matches"]]
    assert page.select_one("#match-count strong").text == str(api["count"])
    first = rows[0]
    link = first.select_one("th a")["href"]
    assert link.startswith("/compounds/In0.5") and "on=InP" in link
    assert "∞" in first.select_one("td[data-key='critical_thickness_nm']").text
    chart = json.loads(page.select_one("#plane-data").string)
    assert chart["substrate"] == {"name": "InP", "a": 5.8687, "lattice": "cubic"}
    assert [s["name"] for s in chart["systems"]] == ["InGaAsP"]
    assert {"GaAs", "InP", "InAs", "GaP"} <= set(chart["binaries"]["formula"])
    assert chart["matches"]["formula"] == [m["formula"] for m in api["matches"]]
    assert chart["target"]["low"] < 1239.84 / 1550 < chart["target"]["high"]
    scripts = [s["src"] for s in page.select("script[src]")]
    assert "/vendor/plotly.min.js" in scripts and "/static/finder.js" in scripts


def test_finder_sort_links_and_order(client) -> None:
    page = soup(client.get("/alloys", params={**FINDER, "sort": "wavelength_nm"}))
    header = page.select_one("a[data-sort-key='wavelength_nm']")
    assert header.parent["aria-sort"] == "ascending" and "desc=true" in header["href"]
    values = [float(td["data-value"]) for td in
              page.select("#match-table td[data-key='wavelength_nm']")]
    assert len(values) > 5 and values == sorted(values)
    page = soup(client.get(header["href"]))
    values = [float(td["data-value"]) for td in
              page.select("#match-table td[data-key='wavelength_nm']")]
    assert values == sorted(values, reverse=True)


def test_finder_says_how_many_more(client) -> None:
    params = {"system": "all", "on": "InP", "gap": "1.0", "tolerance": "0.1", "limit": "50"}
    page = soup(client.get("/alloys", params=params))
    assert len(page.select("#match-table tbody tr")) == 50
    more = int(page.select_one("#more-count").text)
    assert more == int(page.select_one("#match-count strong").text) - 50 > 0
    chart = json.loads(page.select_one("#plane-data").string)
    assert 1 <= len(chart["systems"]) <= 10


def test_finder_empty_result_and_bad_input(client) -> None:
    empty = client.get("/alloys", params={"system": "InGaAs", "on": "GaAs", "gap": "0.4",
                                          "max_mismatch": "0"})
    assert empty.status_code == 200
    assert soup(empty).select_one("#no-match").text.startswith("no composition satisfies")
    bad = client.get("/alloys", params={**FINDER, "on": "Unobtainium"})
    assert bad.status_code == 400
    page = soup(bad)
    assert "unknown substrate 'Unobtainium'" in page.select_one("#finder-error").text
    assert page.select_one("#f-system")["value"] == "InGaAsP"  # the form keeps what was typed


def test_alloy_page_sections_charts_and_substrate(client) -> None:
    response = client.get("/compounds/In0.53Ga0.47As", params={"on": "InP"})
    assert response.status_code == 200
    page = soup(response)
    assert page.select_one("h1#compound-formula").text == "In0.53Ga0.47As"
    titles = [h.text for h in page.select("section.numbers h2")]
    assert titles[0] == "Composition (ternary InGaAs)"
    assert "On InP (geometry single-uncapped)" in titles
    assert any("virtual crystal" in t for t in titles)
    gap = float(page.select_one("#gap-value")["data-value"])
    assert gap == pytest.approx(0.738, abs=0.01)
    mismatch = page.select_one("tr[data-key='mismatch'] td.number").text
    assert mismatch.startswith("-1.318e-04")
    h_c = page.select_one("tr[data-key='critical_thickness'] td.route").text
    assert "single-uncapped" in h_c
    assert "As" in page.select_one("#hazard-caution").text
    charts = json.loads(page.select_one("#chart-data").string)
    assert charts["levels"]["bonding_eV"] < charts["levels"]["antibonding_eV"]
    assert "In0.53Ga0.47As" in [p["formula"] for p in charts["ehc"]["points"]]
    plane = json.loads(page.select_one("#plane-data").string)
    assert plane["substrate"]["name"] == "InP" and plane["matches"]["formula"] == [
        "In0.53Ga0.47As"]
    assert page.select_one("#json-link")["href"] == "/api/compounds/In0.53Ga0.47As?on=InP"


def test_alloy_page_geometry_and_bad_substrate(client) -> None:
    page = soup(client.get("/compounds/In0.53Ga0.47As",
                           params={"on": "InP", "geometry": "capped-well"}))
    assert "geometry capped-well" in page.select_one("tr[data-key='critical_thickness']").text
    page = soup(client.get("/compounds/In0.53Ga0.47As", params={"on": "GaN"}))
    assert "cubic layers are compared" in page.select_one("#epitaxy-error").text


def test_alloy_page_redirects_to_the_normalised_formula(client) -> None:
    response = client.get("/compounds/Ga0.47In0.53As", params={"on": "InP"},
                          follow_redirects=False)
    assert response.status_code == 307
    assert response.headers["location"] == "/compounds/In0.53Ga0.47As?on=InP"


@pytest.mark.parametrize(
    ("formula", "words"),
    [("In0.6Ga0.6As", "sum to 1.2"), ("In1.5Ga0As", "lie in [0, 1]"),
     ("In0.5Zn0.5As", "mixes sublattices"), ("GaAs0.5N0.5", "mixes crystal structures")],
)
def test_bad_alloy_formulas_are_400(client, formula: str, words: str) -> None:
    response = client.get(f"/api/compounds/{formula}")
    assert response.status_code == 400 and words in response.json()["detail"]
    page = client.get(f"/compounds/{formula}")
    assert page.status_code == 400 and words in page.text


def test_open_a_composition_from_the_finder(client) -> None:
    response = client.get("/alloys/open", params={"formula": "Ga0.47In0.53As", "on": "InP"},
                          follow_redirects=False)
    assert response.status_code == 303
    assert response.headers["location"] == "/compounds/In0.53Ga0.47As?on=InP"
    bad = client.get("/alloys/open", params={"formula": "In0.6Ga0.6As"})
    assert bad.status_code == 400 and "sum to 1.2" in bad.text


def test_the_finder_page_shows_at_most_its_table_cap_and_links_the_next_rows(client) -> None:
    # Issue 10, bounded requests: a page holds at most MAX_TABLE_ROWS matches, however large
    # the limit asked, and links the rest; the rows are those of the API's page.
    from app.finder import MAX_TABLE_ROWS

    params = {"system": "InGaAsP", "on": "InP", "limit": "100000"}
    page = soup(client.get("/alloys", params=params))
    rows = page.select("#match-table tbody tr")
    assert len(rows) == MAX_TABLE_ROWS
    api = client.get("/api/match", params={**params, "limit": str(MAX_TABLE_ROWS)}).json()
    assert [r["data-formula"] for r in rows] == [m["formula"] for m in api["matches"]]
    assert api["count"] > MAX_TABLE_ROWS
    link = page.select_one("#next-page")["href"]
    assert f"offset={MAX_TABLE_ROWS}" in link
    following = soup(client.get(link)).select("#match-table tbody tr")
    assert following and following[0]["data-formula"] not in {r["data-formula"] for r in rows}
