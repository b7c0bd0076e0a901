import json

import pytest
from bs4 import BeautifulSoup

from screening.catalogue import catalogue_formulas

CAUTION_TAIL = "follow the safety data sheets, local codes and your site's safety rules"


def soup_of(response) -> BeautifulSoup:
    assert response.headers["content-type"].startswith("text/html")
    return BeautifulSoup(response.text, "lxml")


def table_formulas(soup: BeautifulSoup) -> list[str]:
    return [tr["data-formula"] for tr in soup.select("#compound-table tbody tr[data-formula]")]


def cells(soup: BeautifulSoup, key: str) -> list[str]:
    return [td["data-value"] for td in soup.select(f"#compound-table td[data-key='{key}']")]


def test_home_redirects_to_the_table(client) -> None:
    response = client.get("/", follow_redirects=False)
    assert response.status_code == 307 and response.headers["location"] == "/compounds"


def test_table_lists_every_compound_with_sort_links(client) -> None:
    soup = soup_of(client.get("/compounds"))
    assert sorted(table_formulas(soup)) == sorted(catalogue_formulas())
    links = {a["data-sort-key"]: a["href"] for a in soup.select("thead th a[data-sort-key]")}
    assert "ionicity_spectroscopic" in links and "band_gap_eV" in links
    assert links["ionicity_spectroscopic"] == "/compounds?sort=ionicity_spectroscopic"
    first = soup.select_one("#compound-table tbody th a")
    assert first["href"] == f"/compounds/{first.text}"


def test_table_sorted_by_ionicity_descending(client) -> None:
    soup = soup_of(client.get("/compounds?sort=ionicity_spectroscopic&desc=true"))
    values = [float(v) for v in cells(soup, "ionicity_spectroscopic") if v]
    assert values == sorted(values, reverse=True)
    header = soup.select_one("th[aria-sort='descending'] a")
    assert header["data-sort-key"] == "ionicity_spectroscopic"
    assert "desc" not in header["href"]  # clicking again sorts ascending


def test_table_filters_keep_each_other_in_sort_links(client) -> None:
    soup = soup_of(client.get("/compounds?family=II-VI&measured_only=true"))
    assert set(cells(soup, "family")) == {"II-VI"}
    sources = [td.select_one(".src")["title"] for td in soup.select("td[data-key='band_gap_eV']")]
    assert sources and set(sources) == {"measured"}
    assert soup.select_one("#filter-family option[selected]")["value"] == "II-VI"
    assert soup.select_one("#filter-measured").has_attr("checked")
    href = soup.select_one("a[data-sort-key='polarity']")["href"]
    assert "family=II-VI" in href and "measured_only=true" in href
    resorted = soup_of(client.get(href))
    assert set(cells(resorted, "family")) == {"II-VI"}
    values = [float(v) for v in cells(resorted, "polarity") if v]
    assert values == sorted(values)


def test_table_caution_names_the_toxic_elements_shown(client) -> None:
    soup = soup_of(client.get("/compounds?family=III-V"))
    caution = soup.select_one("footer .caution").get_text(" ", strip=True)
    assert "As" in caution and CAUTION_TAIL in caution


@pytest.mark.parametrize(("formula", "hydride"), [
    ("InP", "phosphine (PH3)"), ("GaP", "phosphine (PH3)"), ("AlP", "phosphine (PH3)"),
    ("GaN", "ammonia (NH3)"),
])
def test_compounds_grown_from_hazardous_hydrides_show_the_caution(
    client, formula: str, hydride: str,
) -> None:
    # Phosphine is GHS H330 "fatal if inhaled", ammonia H331 "toxic if inhaled" (Regulation
    # (EC) No 1272/2008, Annex VI; from memory): the page, the table flag and the table's
    # caution line name them although In, Ga, Al, P and N are not toxic elements themselves.
    box = soup_of(client.get(f"/compounds/{formula}")).select_one(".caution-box").text
    assert hydride in box and "safety data sheets" in box and "CLP" in box
    table = soup_of(client.get("/compounds"))
    row = table.select_one(f"#compound-table tr[data-formula='{formula}']")
    assert row.select_one(".hazard-mark") is not None
    assert hydride in table.select_one("footer .caution").get_text(" ", strip=True)


def test_compound_page_shows_numbers_with_unit_route_and_source(client) -> None:
    soup = soup_of(client.get("/compounds/GaAs"))
    assert soup.select_one("h1#compound-formula").text == "GaAs"
    rows = soup.select("table.quantities tbody tr")
    assert len(rows) > 15
    for row in rows:
        label, value, _unit, route, _source = (
            c.get_text(strip=True) for c in row.find_all(["th", "td"])
        )
        assert label and value and route, row
    gap = next(r for r in rows if r.th.get_text(strip=True) == "Band gap")
    assert [c.get_text(strip=True) for c in gap.find_all("td")][1:3] == ["eV", "measured"]
    assert "contains As" in soup.select_one(".caution-box").text


def test_compound_page_chart_data_and_local_scripts(client) -> None:
    soup = soup_of(client.get("/compounds/ZnSe"))
    data = json.loads(soup.select_one("script#chart-data").string)
    formulas = {p["formula"] for p in data["ehc"]["points"]}
    assert "ZnSe" in formulas and len(formulas) > 40
    assert data["ehc"]["critical_ionicity"] == pytest.approx(0.785)
    levels = data["levels"]
    assert levels["bonding_eV"] < min(levels["cation_eV"], levels["anion_eV"])
    assert levels["antibonding_eV"] > max(levels["cation_eV"], levels["anion_eV"])
    assert soup.select_one("#chart-ehc") and soup.select_one("#chart-levels")
    sources = [s["src"] for s in soup.select("script[src]")] + [
        link["href"] for link in soup.select("link[href]")
    ]
    assert "/vendor/plotly.min.js" in sources
    assert not [s for s in sources if s.startswith(("http:", "https:", "//"))]


def test_any_spelling_redirects_to_the_canonical_page(client) -> None:
    response = client.get("/compounds/SeZn", follow_redirects=False)
    assert response.status_code == 307 and response.headers["location"] == "/compounds/ZnSe"


@pytest.mark.parametrize("formula", ["Xx", "GaAs2", "NaCl3", "", "A" * 500])
def test_bad_formula_page_is_a_friendly_4xx(client, formula: str) -> None:
    response = client.get(f"/compounds/{formula}")
    assert response.status_code == 400
    soup = soup_of(response)
    message = soup.select_one(".error-message").get_text(strip=True)
    assert 10 < len(message) < 300
    assert soup.select_one(".error-box a")["href"] == "/compounds"


def test_bad_filter_page_is_a_friendly_400(client) -> None:
    response = client.get("/compounds?sort=colour")
    assert response.status_code == 400
    assert "cannot sort by 'colour'" in soup_of(response).select_one(".error-message").text


def test_unknown_page_is_a_friendly_404(client) -> None:
    response = client.get("/no/such/page")
    assert response.status_code == 404
    assert soup_of(response).select_one(".error-box")


def test_markup_in_input_is_escaped(client) -> None:
    response = client.get("/compounds?family=<b>bold</b>")
    assert response.status_code == 400
    assert "<b>" not in response.text and "&lt;b&gt;" in response.text


def quantity_rows(soup: BeautifulSoup) -> dict[str, list[str]]:
    return {
        row.th.get_text(strip=True): [c.get_text(" ", strip=True) for c in row.find_all("td")]
        for row in soup.select("table.quantities tbody tr") if row.th
    }


@pytest.mark.parametrize("formula", ["BSb", "AlBi", "TlP"])
def test_hypothetical_binary_shows_estimated_eh_and_lattice_constant(client, formula) -> None:
    rows = quantity_rows(soup_of(client.get(f"/compounds/{formula}")))
    eh = rows["Eh (predictive)"]
    assert eh[0] != "—" and eh[2].endswith("bond length the models used (estimate)")
    assert "Van Vechten" in eh[3]
    lattice = rows["Lattice constant a (estimated)"]
    assert lattice[0] != "—" and lattice[1] == "Å"
    assert "estimate: a = 4d/√3 for zincblende" in lattice[2] and "Pauling" in lattice[3]
    assert rows["Lattice constant a"][0] == "—"  # nothing measured, and it says so


def test_table_api_and_csv_show_the_estimated_lattice_constant_marked(client) -> None:
    row = soup_of(client.get("/compounds")).select_one("#compound-table tr[data-formula='BSb']")
    cell = row.select_one("td[data-key='lattice_constant_angstrom']")
    assert float(cell["data-value"]) > 5.0 and "est." in cell.get_text() and "±" in cell.get_text()
    api = {r["formula"]: r for r in client.get("/api/compounds").json()["rows"]}
    assert api["BSb"]["lattice_constant_source"] == "estimate"
    assert api["GaAs"]["lattice_constant_source"] == "measured"
    assert api["GaAs"]["lattice_constant_angstrom"] == pytest.approx(5.65325)
    assert api["GaAs"]["lattice_constant_uncertainty_angstrom"] is None
    lines = client.get("/api/compounds.csv").text.splitlines()
    header = lines[0].split(",")
    bsb = next(line.split(",") for line in lines if line.startswith("BSb,"))
    assert bsb[header.index("lattice_constant_source")] == "estimate"
    assert float(bsb[header.index("lattice_constant_angstrom")]) == pytest.approx(
        api["BSb"]["lattice_constant_angstrom"])
