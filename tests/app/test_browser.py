import re

import pytest
from playwright.sync_api import Page, expect

pytestmark = pytest.mark.browser


def column_values(page: Page, key: str) -> list[str]:
    return page.locator(f"#compound-table td[data-key='{key}']").evaluate_all(
        "cells => cells.map(c => c.dataset.value)"
    )


def svg_texts(page: Page, selector: str) -> list[str]:
    return page.locator(selector).evaluate_all("nodes => nodes.map(n => n.textContent)")


def test_table_sort_filter_and_compound_chart(page: Page, live_server: str) -> None:
    errors: list[str] = []
    page.on("pageerror", lambda exc: errors.append(str(exc)))
    page.goto(live_server + "compounds")
    expect(page.locator("#compound-table tbody tr").first).to_be_visible()

    page.locator("a[data-sort-key='ionicity_spectroscopic']").click()
    expect(page).to_have_url(re.compile(r"sort=ionicity_spectroscopic"))
    values = [float(v) for v in column_values(page, "ionicity_spectroscopic") if v]
    assert len(values) > 10 and values == sorted(values)

    page.select_option("#filter-family", "II-VI")  # applied on change, sort kept
    expect(page).to_have_url(re.compile(r"family=II-VI"))
    assert "sort=ionicity_spectroscopic" in page.url
    families = set(column_values(page, "family"))
    assert families == {"II-VI"}
    values = [float(v) for v in column_values(page, "ionicity_spectroscopic") if v]
    assert values == sorted(values)

    first = page.locator("#compound-table tbody th a").first
    formula = first.inner_text()
    first.click()
    expect(page.locator("h1#compound-formula")).to_have_text(formula)
    page.wait_for_selector("#chart-ehc.js-plotly-plot .main-svg")
    page.wait_for_selector("#chart-levels.js-plotly-plot .main-svg")
    assert page.locator("#chart-ehc .scatterlayer .point").count() > 40
    assert errors == []


def test_band_chart_and_temperature_move_the_gap(page: Page, live_server: str) -> None:
    errors: list[str] = []
    page.on("pageerror", lambda exc: errors.append(str(exc)))
    page.goto(live_server + "compounds/GaAs")
    page.wait_for_selector("#chart-bands.js-plotly-plot .main-svg")
    ticks = svg_texts(page, "#chart-bands .xtick text")
    assert ticks == ["L", "Γ", "X", "W", "K", "Γ"]
    assert page.locator("#chart-bands .scatterlayer .trace").count() >= 8
    notes = " ".join(svg_texts(page, "#chart-bands .annotation-text"))
    assert "sp³ model gap" in notes and "at 300 K" in notes
    expect(page.locator("#model-limits")).to_contain_text("spin-orbit")
    before = float(page.locator("#gap-value").get_attribute("data-value"))

    page.fill("#temperature", "77")
    page.press("#temperature", "Enter")
    expect(page).to_have_url(re.compile(r"temperature=77"))
    expect(page.locator("#gap-title")).to_have_text("Band gap at 77 K")
    page.wait_for_selector("#chart-bands.js-plotly-plot .main-svg")
    after = float(page.locator("#gap-value").get_attribute("data-value"))
    assert after > before + 0.05  # GaAs widens by about 0.09 eV from 300 K to 77 K
    notes = " ".join(svg_texts(page, "#chart-bands .annotation-text"))
    assert "at 77 K" in notes

    page.locator("nav a", has_text="Model accuracy").click()
    page.wait_for_selector("#chart-accuracy.js-plotly-plot .main-svg")
    rows = page.locator("#accuracy-table tbody tr").count()
    points = page.locator("#chart-accuracy .scatterlayer .point").count()
    assert rows > 40 and points == rows
    assert errors == []
