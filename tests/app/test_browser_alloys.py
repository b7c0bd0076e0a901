import re

import pytest
from playwright.sync_api import Page, expect

pytestmark = pytest.mark.browser


def texts(page: Page, selector: str) -> list[str]:
    return page.locator(selector).evaluate_all("nodes => nodes.map(n => n.textContent)")


def test_ingaasp_on_inp_for_1550_nm(page: Page, live_server: str) -> None:
    errors: list[str] = []
    page.on("pageerror", lambda exc: errors.append(str(exc)))
    page.goto(live_server + "compounds")
    page.locator("nav a", has_text="Alloys").click()
    page.fill("#f-system", "InGaAsP")
    page.select_option("#f-on", "InP")
    page.fill("#f-wavelength", "1550")
    page.fill("#f-max-mismatch", "0.1")  # percent (issue 10: one convention on the page)
    page.click("#f-submit")
    expect(page).to_have_url(re.compile(r"/alloys\?.*system=InGaAsP.*wavelength=1550"))
    assert "gap=" not in page.url  # empty fields are left out of the URL

    rows = page.locator("#match-table tbody tr")
    expect(rows.first).to_be_visible()
    formulas = rows.evaluate_all("rows => rows.map(r => r.dataset.formula)")
    assert len(formulas) > 5 and all(re.fullmatch(r"In0\.5\d*Ga0\.4\d*As0\.9\d*P0\.0\d*", f)
                                     for f in formulas[:5])
    wavelengths = [float(v) for v in page.locator(
        "#match-table td[data-key='wavelength_nm']").evaluate_all(
        "cells => cells.map(c => c.dataset.value)")]
    assert all(1520 < w < 1580 for w in wavelengths)
    mismatches = [float(v) for v in page.locator(
        "#match-table td[data-key='mismatch']").evaluate_all(
        "cells => cells.map(c => c.dataset.value)")]
    assert all(abs(f) <= 0.001 + 1e-12 for f in mismatches)

    page.wait_for_selector("#chart-plane.js-plotly-plot .main-svg")
    legend = texts(page, "#chart-plane .legendtext")
    marked = min(len(formulas), 60)  # more would hide the curve (issue 10)
    assert "InGaAsP" in legend and any(t.startswith(f"matches ({marked}") for t in legend)
    points = page.locator("#chart-plane .scatterlayer .trace").first.locator(".point").count()
    assert points == marked  # the table's compositions, drawn under the curve
    assert "target (wavelength 1550 nm" in page.locator("#chart-plane").locator(
        "xpath=..").locator("figcaption").inner_text()
    expect(page.locator("#chart-plane .annotation-text", has_text="InAs")).to_have_count(1)
    notes = " ".join(texts(page, "#chart-plane .annotation-text"))
    assert "InP 5.8687 Å" in notes

    page.locator("a[data-sort-key='band_gap_eV']").click()
    expect(page).to_have_url(re.compile(r"sort=band_gap_eV"))
    gaps = [float(v) for v in page.locator(
        "#match-table td[data-key='band_gap_eV']").evaluate_all(
        "cells => cells.map(c => c.dataset.value)")]
    assert gaps == sorted(gaps)

    first = page.locator("#match-table tbody th a").first
    formula = first.inner_text()
    first.click()
    expect(page.locator("h1#compound-formula")).to_have_text(formula)
    expect(page.locator("#epitaxy-summary")).to_contain_text("On InP")
    page.wait_for_selector("#chart-plane.js-plotly-plot .main-svg")
    page.wait_for_selector("#chart-levels.js-plotly-plot .main-svg")
    page.wait_for_selector("#chart-ehc.js-plotly-plot .main-svg")
    assert errors == []
