"""What the pages say (issue 10): one mismatch convention per screen, the RoHS list from its one
declaration, the navigation, a bad substrate named on a compound's page, the sp3 valleys."""

import pytest
from bs4 import BeautifulSoup

from app.cli import main
from screening.hazards import ROHS_RESTRICTED

ROHS = ", ".join(sorted(ROHS_RESTRICTED))


def soup_of(response) -> BeautifulSoup:
    assert response.headers["content-type"].startswith("text/html")
    return BeautifulSoup(response.text, "lxml")


def test_every_page_links_the_measurements_import(client) -> None:
    for url in ("/compounds", "/alloys", "/shortlists", "/measurements"):
        nav = soup_of(client.get(url)).select_one("nav[aria-label='Main']")
        assert "/measurements" in [a["href"] for a in nav.select("a")]


def test_rohs_list_is_one_declaration_on_pages_api_and_cli(client, capsys) -> None:
    # RoHS Annex II as amended by (EU) 2015/863: Cd, Hg, Pb and hexavalent Cr (from memory).
    assert ROHS == "Cd, Cr, Hg, Pb"
    label = soup_of(client.get("/alloys")).select_one("#f-no-rohs").parent.get_text()
    assert f"({ROHS})" in label
    docs = client.get("/api/openapi.json").json()["paths"]
    for path in ("/api/match", "/api/compounds"):
        rohs = next(p for p in docs[path]["get"]["parameters"] if p["name"] == "no_rohs")
        assert ROHS in rohs["description"], path
    for command in ("list", "match"):
        with pytest.raises(SystemExit):
            main([command, "--help"])
        assert ROHS in " ".join(capsys.readouterr().out.split()), command


def test_finder_speaks_percent_once(client) -> None:
    page = soup_of(
        client.get(
            "/alloys", params={"system": "InGaAs", "on": "InP", "max_mismatch_percent": "0.1"}
        )
    )
    assert "%" in page.select_one("#f-max-mismatch").parent.get_text()
    assert page.select_one("#f-max-mismatch")["value"] == "0.1"
    assert "fraction" not in page.select_one("main").get_text()
    assert page.get_text().count("shown in percent") == 1
    mismatches = [float(td["data-value"]) for td in page.select("td[data-key='mismatch']")]
    assert mismatches and max(abs(m) for m in mismatches) <= 0.001  # 0.1 % as a fraction
    # The API's link keeps its fraction; an old fraction link fills the percent field.
    assert "max_mismatch=0.001" in page.select_one("#match-count a")["href"]
    old = soup_of(
        client.get("/alloys", params={"system": "InGaAs", "on": "InP", "max_mismatch": "0.002"})
    )
    assert old.select_one("#f-max-mismatch")["value"] == "0.2"


@pytest.mark.parametrize(
    ("value", "problem"),
    [(v, "percent from 0 to 100") for v in ("150", "abc", "1_0", "\uff11", "nan", "-1")],
)
def test_finder_refuses_a_bad_percent(client, value, problem) -> None:
    answer = client.get(
        "/alloys", params={"system": "InGaAs", "on": "InP", "max_mismatch_percent": value}
    )
    assert answer.status_code == 400
    assert problem in soup_of(answer).select_one("#finder-error").get_text()


def test_compound_page_names_an_unknown_substrate(client) -> None:
    answer = client.get("/compounds/GaAs", params={"on": "NOPE"})
    assert answer.status_code == 400  # as GET /api/compounds/GaAs?on=NOPE answers
    assert client.get("/api/compounds/GaAs", params={"on": "NOPE"}).status_code == 400
    message = soup_of(answer).select_one("#epitaxy-error").get_text()
    assert "unknown substrate 'NOPE'" in message and "InP" in message and "GaAs" in message
    assert soup_of(answer).select_one("h1#compound-formula").get_text() == "GaAs"


def test_compound_page_shows_a_known_substrate(client) -> None:
    page = soup_of(client.get("/compounds/InAs", params={"on": "InP"}))
    titles = [h.get_text() for h in page.select("section.numbers h2")]
    assert "On InP (geometry single-uncapped)" in titles
    assert page.select_one("a[href^='/api/compounds/InAs']")["href"].endswith("?on=InP")


def test_sp3_valleys_are_above_the_valence_band_maximum(client) -> None:
    page = soup_of(client.get("/compounds/CdTe"))
    rows = {tr["data-key"]: tr for tr in page.select("tr[data-key]")}

    def value(key: str) -> float:
        return float(rows[key].select_one("td.number")["data-value"])

    report = client.get("/api/compounds/CdTe").json()["tight_binding"]
    valleys = [value(k) for k in ("gamma_valley_eV", "x_valley_eV", "l_valley_eV")]
    # The smallest gap along the path is the lowest valley (here L), not a direct gap: the
    # labels say which is which (issue 10: 3.222 was "the smallest of" 3.287/5.497/3.962).
    assert value("min_gap_eV") == pytest.approx(min(valleys), abs=2e-3)
    assert value("x_gap_eV") == pytest.approx(report["x_gap_eV"], abs=1e-3)
    assert "Smallest gap along the path" in rows["min_gap_eV"].th.get_text()
    assert rows["x_gap_eV"].th.get_text().startswith("Direct gap at X")
    assert "above the valence-band maximum" in rows["x_valley_eV"].th.get_text()
    assert not [t for t in page.select("th") if "Smallest of the three" in t.get_text()]
