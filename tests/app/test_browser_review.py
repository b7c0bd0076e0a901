import csv
import io
import re
import uuid

import pytest
from playwright.sync_api import Page, expect

pytestmark = pytest.mark.browser

PICKED = ["GaAs", "InP", "ZnSe"]


def test_review_flow_filter_shortlist_note_compare_export(page: Page, live_server: str) -> None:
    errors: list[str] = []
    page.on("pageerror", lambda exc: errors.append(str(exc)))
    name = f"Review {uuid.uuid4().hex[:6]}"

    # Filter the table: no cadmium, nothing RoHS-restricted.
    page.goto(live_server + "compounds")
    page.fill("#filter-exclude", "Cd")
    page.check("#filter-no-rohs")  # applied on change
    expect(page).to_have_url(re.compile(r"no_rohs=true"))
    assert "exclude=Cd" in page.url
    formulas = page.locator("#compound-table tbody tr[data-formula]").evaluate_all(
        "rows => rows.map(r => r.dataset.formula)")
    assert formulas and not [f for f in formulas if re.search(r"Cd|Hg|Pb", f)]

    # Tick three candidates and add them to a new shortlist.
    for formula in PICKED:
        page.check(f"#compound-table tr[data-formula='{formula}'] input[type=checkbox]")
    page.fill("#add-to-shortlist-new", name)
    page.click("#add-to-shortlist button[type=submit]")
    expect(page.locator("#shortlist-name")).to_have_text(name)
    rows = page.locator("#candidates tbody tr[data-formula]")
    expect(rows).to_have_count(3)

    # Write a note on one candidate; it is saved at once and shown after the reload.
    note = "=keep: lattice-matched to InP"
    row = page.locator("#candidates tr[data-formula='InP']")
    row.locator("textarea").fill(note)
    with page.expect_navigation():  # the form posts and redirects
        row.locator("button", has_text="Save").click()
    expect(page.locator("#candidates tr[data-formula='InP'] textarea")).to_have_value(note)

    # Save the conditions they are chosen under: on GaAs.
    page.select_option("#cond-substrate", "GaAs")
    page.click("#edit-shortlist button[type=submit]")
    expect(page.locator("#shortlist-conditions")).to_contain_text("substrate GaAs")

    # Open the comparison: the three side by side, with the chart and the substrate line.
    page.click("#compare-button")
    expect(page).to_have_url(re.compile(r"/compare"))
    heads = page.locator("#compare-table thead th[data-formula]").evaluate_all(
        "cells => cells.map(c => c.dataset.formula)")
    assert heads == PICKED
    expect(page.locator("#compare-table tr[data-key='band_gap_eV'] th")).to_contain_text("eV")
    page.wait_for_selector("#chart-compare.js-plotly-plot .main-svg")
    # The candidates' labels are placed after the draw, apart from each other (issue 10).
    expect(page.locator("#chart-compare .annotation-text")).to_have_count(1 + len(PICKED))
    texts = page.locator("#chart-compare .annotation-text").evaluate_all(
        "nodes => nodes.map(n => n.textContent)")
    assert sorted(t for t in texts if " " not in t) == sorted(PICKED)
    expect(page.locator("#chart-compare .shapelayer path")).to_have_count(1)
    notes = [t for t in texts if " " in t]
    assert len(notes) == 1 and notes[0].startswith("GaAs 5.653")  # a = 5.65325 Å
    best = page.locator("#compare-table tr[data-key='mismatch'] td.best")
    expect(best).to_have_count(1)
    expect(best).to_have_text(re.compile(r"^\s*0\.000\b"))  # GaAs on GaAs: zero has no sign
    expect(page.locator("#hazard-box")).to_contain_text("safety data sheets")

    # Export the CSV and read it back.
    page.go_back()
    with page.expect_download() as info:
        page.click("#export-csv")
    text = info.value.path().read_text(encoding="utf-8-sig")
    table = list(csv.reader(io.StringIO(text)))  # the header row first
    exported = [dict(zip(table[0], r, strict=True)) for r in table[1:]]
    assert {r["substrate"] for r in exported} == {"GaAs"}
    assert [r["formula"] for r in exported] == PICKED
    assert exported[1]["note"] == "'" + note  # neutralised for spreadsheets
    assert float(exported[0]["band_gap_eV"]) == pytest.approx(1.424)  # GaAs, 300 K (seed data)
    assert errors == []
