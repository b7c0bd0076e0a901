import re

import pytest
from playwright.sync_api import Page, expect

pytestmark = pytest.mark.browser


def column_values(page: Page, key: str) -> list[str]:
    return page.locator(f"#compound-table td[data-key='{key}']").evaluate_all(
        "cells => cells.map(c => c.dataset.value)"
    )


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
