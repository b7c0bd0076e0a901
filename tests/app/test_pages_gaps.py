import json

import pytest
from bs4 import BeautifulSoup

from screening.gaps import gap_model

UNMEASURED = "GaBi"


def soup_of(response) -> BeautifulSoup:
    assert response.status_code == 200, response.text[:300]
    return BeautifulSoup(response.text, "lxml")


def gap_rows(soup: BeautifulSoup) -> dict[str, BeautifulSoup]:
    return {tr["data-key"]: tr for tr in soup.select("#gap-table tbody tr[data-key]")}


def test_compound_page_band_gap_block_moves_with_temperature(client) -> None:
    warm = soup_of(client.get("/compounds/GaAs"))
    cold = soup_of(client.get("/compounds/GaAs?temperature=77"))
    assert cold.select_one("#temperature")["value"] == "77"
    assert cold.select_one("#temperature-form")["action"] == "/compounds/GaAs"
    assert float(cold.select_one("#gap-value")["data-value"]) > float(
        warm.select_one("#gap-value")["data-value"])
    assert cold.select_one("#gap-value")["data-source"] == "measured"
    assert "nm" in cold.select_one("#gap-wavelength").text
    rows = gap_rows(cold)
    assert {"measured", "estimate", "cross_validated", "kind", "temperature_law"} <= set(rows)
    measured = rows["measured"].find_all("td")
    assert "moved to 77 K" in measured[2].text and measured[3].text.strip()
    assert "nm" in measured[0].select_one(".wl").text
    assert "±" in rows["estimate"].find("td").text  # never an estimate without its error bar
    assert "±" in rows["cross_validated"].find("td").text
    assert "published" in rows["temperature_law"].find("td").text


def test_unmeasured_compound_shows_the_estimate_with_its_error_bar(client) -> None:
    soup = soup_of(client.get(f"/compounds/{UNMEASURED}?temperature=500"))
    value = soup.select_one("#gap-value")
    assert value["data-source"] == "estimate" and "±" in value.text
    rows = gap_rows(soup)
    assert rows["measured"].find("td").text.strip() == "—"
    assert rows["cross_validated"].find("td").text.strip() == "—"


def test_compound_page_band_chart_data_and_limits(client) -> None:
    soup = soup_of(client.get("/compounds/ZnSe?temperature=10"))
    bands = json.loads(soup.select_one("script#chart-data").string)["bands"]
    assert [x["label"] for x in bands["labels"]] == ["L", "Γ", "X", "W", "K", "Γ"]
    assert len(bands["bands"]) == 8 and len(bands["bands"][0]) == len(bands["distance"])
    assert max(bands["bands"][3]) == 0.0 and bands["model_gap_eV"] > 0
    assert bands["shown_gap"]["temperature_K"] == 10.0
    assert soup.select_one("#chart-bands")
    limits = soup.select_one("#model-limits").text
    assert "spin-orbit" in limits and "d states" in limits and "Gamma" in limits
    assert "/static/gaps.js" in [s["src"] for s in soup.select("script[src]")]


def test_redirect_keeps_the_temperature(client) -> None:
    response = client.get("/compounds/SeZn?temperature=77", follow_redirects=False)
    assert response.status_code == 307
    assert response.headers["location"] == "/compounds/ZnSe?temperature=77"


@pytest.mark.parametrize("value", ["hot", "-3", "5000"])
def test_bad_temperature_page_is_a_friendly_400(client, value: str) -> None:
    response = client.get(f"/compounds/GaAs?temperature={value}")
    assert response.status_code == 400
    message = BeautifulSoup(response.text, "lxml").select_one(".error-message").text
    assert "temperature" in message and "0 to 2000" in message


def test_table_has_gap_columns_marks_and_filters(client) -> None:
    soup = soup_of(client.get("/compounds?temperature=77&kind=direct&wl_min=300"))
    keys = [a["data-sort-key"] for a in soup.select("thead th a[data-sort-key]")]
    for key in ("band_gap_eV", "band_gap_estimate_eV", "wavelength_nm", "band_gap_kind"):
        assert key in keys
    # The estimate carries its ± in its own cell (one line), rounded to it: no second column.
    assert "band_gap_uncertainty_eV" not in keys
    assert keys.index("band_gap_estimate_eV") == keys.index("band_gap_eV") + 1
    assert soup.select_one("#filter-temperature")["value"] == "77"
    assert soup.select_one("#filter-kind option[selected]")["value"] == "direct"
    assert soup.select_one("#filter-wl-min")["value"] == "300.0"
    assert soup.select_one("#table-temperature").text == "77 K"
    for td in soup.select("td[data-key='band_gap_eV']"):
        mark = td.select_one("abbr.src")
        assert mark["title"] in {"measured", "estimate"}
        assert ("±" in td.text) == (mark["title"] == "estimate")
    for td in soup.select("td[data-key='wavelength_nm']"):
        assert float(td["data-value"]) >= 300
    href = soup.select_one("a[data-sort-key='polarity']")["href"]
    assert "temperature=77" in href and "kind=direct" in href and "wl_min=300" in href
    assert "spin-orbit" in soup.select_one("#gap-note").text


def test_accuracy_page_lists_every_measured_compound(client) -> None:
    soup = soup_of(client.get("/accuracy"))
    listed = [tr["data-formula"] for tr in soup.select("#accuracy-table tbody tr")]
    body = client.get("/api/accuracy").json()
    assert sorted(listed) == sorted(r["formula"] for r in body["rows"])
    assert len(listed) == gap_model().n_measured
    assert soup.select_one("#acc-n").text == str(len(listed))
    assert soup.select_one("#acc-mae").text == f"{body['mae_eV']:.2f} eV"
    families = [tr["data-family"] for tr in soup.select("#family-rms tbody tr")]
    assert families == ["IV-IV", "III-V", "II-VI", "I-VII"]
    limits = soup.select_one("#accuracy-limits").text
    for phrase in ("p-d repulsion", "Hg and Tl", "Few measured neighbours", "from memory"):
        assert phrase in limits
    assert "nested leave-one-out" in soup.select_one("#estimator").text
    data = json.loads(soup.select_one("script#accuracy-data").string)
    assert data == body
    assert soup.select_one("#chart-accuracy")
    for tr in soup.select("#accuracy-table tbody tr"):
        assert "±" in tr.select_one("td[data-key='loo_eV']").text


def test_nav_links_the_accuracy_page(client) -> None:
    soup = soup_of(client.get("/compounds"))
    assert "/accuracy" in [a["href"] for a in soup.select("nav a")]


def test_every_estimate_in_the_table_is_rounded_to_its_uncertainty(client) -> None:
    # Rule of app.numbers (uncertainty to 1-2 significant digits, value to the same place;
    # Particle Data Group rounding, common practice): "5.2 ± 0.7", never "5.174 ± 0.69".
    soup = soup_of(client.get("/compounds"))
    cells = soup.select("td[data-key='band_gap_estimate_eV']")
    assert len(cells) > 50
    for cell in cells:
        text = cell.get_text(" ", strip=True)
        if text == "—":
            continue
        value, _, uncertainty = text.partition("±")
        assert uncertainty, text
        decimals = [len(part.strip().partition(".")[2]) for part in (value, uncertainty)]
        assert decimals[0] == decimals[1] and decimals[0] <= 2, text
