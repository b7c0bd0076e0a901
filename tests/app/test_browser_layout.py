"""The pages as a reviewer sees them at 1400 px: values on screen, chart labels apart.

Bounding boxes come from the real page in headless chromium (issue 10: the compare page showed
no values at 1400 px; chart labels, legend, axis titles and the plot toolbar overlapped).
"""

import uuid
from collections.abc import Iterator
from itertools import combinations
from typing import Any

import httpx
import pytest
from playwright.sync_api import Page, expect

from tests.conftest import csrf_headers

pytestmark = pytest.mark.browser

WIDTH = 1400
EIGHT = ["GaAs", "AlAs", "InP", "In0.53Ga0.47As", "GaP", "ZnSe", "CdTe", "GaN"]
# Invented values for the test (not measurements): two "yours" tags on the pages.
YOURS = (
    "formula,property,value,unit,source\n"
    "GaAs,band_gap,1.43,eV,invented test value (photoluminescence run 7 of a made-up lab)\n"
    "InP,lattice_a,5.8690,angstrom,invented test value (x-ray, made-up wafer 12)\n"
)
PARTS = {  # what a chart draws that a reader must be able to read, by kind
    "label": ".annotation-text-g",
    "point label": ".textpoint",
    "x title": ".g-xtitle",
    "y title": ".g-ytitle",
    "legend": ".legend .bg",
    "toolbar": ".modebar",
}


@pytest.fixture
def eight(live_server: str) -> Iterator[str]:
    """A shortlist of eight candidates on InP with two of "yours"; yields its page's URL."""
    token = csrf_headers(httpx, live_server)
    made = httpx.post(
        live_server + "api/shortlists",
        headers=token,
        json={
            "name": f"Layout {uuid.uuid4().hex[:6]}",
            "substrate": "InP",
            "target_gap_eV": 0.95,
            "note": "invented list for a layout test",
        },
    ).json()
    url = f"{live_server}api/shortlists/{made['id']}"
    httpx.post(url + "/items", headers=token, json={"formulas": EIGHT}).raise_for_status()
    batch = httpx.post(
        live_server + "api/measurements",
        content=YOURS.encode(),
        headers={**token, "content-type": "text/csv"},
    ).json()["batch"]
    try:
        yield f"{live_server}shortlists/{made['id']}"
    finally:
        httpx.delete(
            f"{live_server}api/measurements/batches/{batch}",
            params={"confirm": "yes"},
            headers=token,
        )
        httpx.delete(url, params={"confirm": "yes"}, headers=token)


def boxes(page: Page, selector: str) -> list[dict[str, Any]]:
    """Bounding boxes (viewport px) of every element matching `selector` with a size."""
    return page.locator(selector).evaluate_all("""nodes => nodes.map(n => {
        const b = n.getBoundingClientRect();
        return {text: n.textContent, x0: b.left, x1: b.right, y0: b.top, y1: b.bottom};
    }).filter(b => b.x1 > b.x0 && b.y1 > b.y0)""")


def chart_parts(page: Page, chart: str) -> list[dict[str, Any]]:
    """Every label, title, legend and the toolbar of one plotly chart, with its kind."""
    page.hover(chart + " .nsewdrag")  # the toolbar shows while the pointer is on the chart
    return [
        {**b, "kind": kind} for kind, sel in PARTS.items() for b in boxes(page, f"{chart} {sel}")
    ]


def overlapping(parts: list[dict[str, Any]], slack: float = 0.5) -> list[tuple[str, str]]:
    """Pairs of parts whose boxes overlap by more than `slack` px both ways."""

    def cross(a: dict[str, Any], b: dict[str, Any]) -> bool:
        return (
            min(a["x1"], b["x1"]) - max(a["x0"], b["x0"]) > slack
            and min(a["y1"], b["y1"]) - max(a["y0"], b["y0"]) > slack
        )

    return [
        (f"{a['kind']} {a['text']!r}", f"{b['kind']} {b['text']!r}")
        for a, b in combinations(parts, 2)
        if cross(a, b)
    ]


def wait_for_labels(page: Page, chart: str, count: int) -> None:
    """Wait until the chart's labels are placed (they are added after the first draw)."""
    page.wait_for_selector(chart + ".js-plotly-plot .main-svg")
    expect(page.locator(chart + " .annotation-text-g")).to_have_count(count)


def test_compare_shows_every_value_and_keeps_labels_apart(page: Page, eight: str) -> None:
    errors: list[str] = []
    page.on("pageerror", lambda exc: errors.append(str(exc)))
    page.set_viewport_size({"width": WIDTH, "height": 1000})
    page.goto(eight + "/compare")
    cells = boxes(page, "#compare-table tbody td .value")
    assert len(cells) >= 8 * 15
    outside = [c["text"] for c in cells if c["x0"] < 0 or c["x1"] > WIDTH]
    assert outside == []
    assert page.evaluate("document.documentElement.scrollWidth") <= WIDTH  # no sideways scroll
    # Sources are numbered notes under the table; every number points at one.
    targets = set(
        page.locator("#compare-table sup.fn a").evaluate_all(
            "links => links.map(a => a.getAttribute('href'))"
        )
    )
    assert targets and all(page.locator(t).count() == 1 for t in targets)
    expect(page.locator("#compare-table .yours-tag")).to_have_count(2)

    wait_for_labels(page, "#chart-compare", 1 + 8)  # the substrate's line and 8 candidates
    parts = chart_parts(page, "#chart-compare")
    labels = sorted(p["text"] for p in parts if p["kind"] == "label")
    assert labels == sorted([*EIGHT, "InP 5.8687 Å"])  # a = 5.86875 Å, seed data
    assert overlapping(parts) == []
    assert errors == []


@pytest.mark.parametrize("width", [WIDTH, WIDTH - 16])  # headless; a window with a scrollbar
def test_shortlist_buttons_stay_on_screen(page: Page, eight: str, width: int) -> None:
    page.set_viewport_size({"width": width, "height": 1000})
    page.goto(eight)
    expect(page.locator("#candidates tbody tr[data-formula]")).to_have_count(8)
    buttons = boxes(page, "main button, main a")
    assert len(buttons) > 20
    assert [b["text"] for b in buttons if b["x1"] > width or b["x0"] < 0] == []
    # Nor hidden by the table's own sideways scrolling: the table fits its frame.
    wrap = page.locator("#candidates").locator("xpath=..")
    assert wrap.evaluate("w => w.scrollWidth <= w.clientWidth")
    frame = wrap.bounding_box()
    inside = boxes(page, "#candidates button")
    assert len(inside) == 16 and all(b["x1"] <= frame["x"] + frame["width"] for b in inside)


@pytest.mark.parametrize("formula", ["GaAs", "CdTe"])
def test_compound_charts_keep_labels_apart(page: Page, live_server: str, formula: str) -> None:
    errors: list[str] = []
    page.on("pageerror", lambda exc: errors.append(str(exc)))
    page.set_viewport_size({"width": WIDTH, "height": 1000})
    page.goto(f"{live_server}compounds/{formula}")
    wait_for_labels(page, "#chart-levels", 4)  # two hybrids, bonding, antibonding
    wait_for_labels(page, "#chart-ehc", 1)  # the compound itself
    page.wait_for_selector("#chart-bands.js-plotly-plot .main-svg")
    for chart in ("#chart-levels", "#chart-ehc", "#chart-bands"):
        parts = chart_parts(page, chart)
        assert any(p["kind"] == "toolbar" for p in parts)
        assert overlapping(parts) == [], chart
    label = chart_parts(page, "#chart-ehc")[0]
    points = boxes(page, "#chart-ehc .scatterlayer .point")
    assert len(points) > 40
    assert not [p for p in points if overlapping([{**label, "kind": "l"}, {**p, "kind": "p"}])]
    assert errors == []


@pytest.mark.parametrize(
    ("system", "on", "ends"),
    [("AlGaAs", "GaAs", {"GaAs", "AlAs"}), ("InGaAsP", "InP", {"InP", "InAs", "GaAs", "GaP"})],
)
def test_finder_chart_frames_its_points(
    page: Page, live_server: str, system: str, on: str, ends: set[str]
) -> None:
    page.set_viewport_size({"width": WIDTH, "height": 1000})
    page.goto(f"{live_server}alloys?system={system}&on={on}")
    page.wait_for_selector("#chart-plane.js-plotly-plot .main-svg")
    page.wait_for_function(  # the substrate's label first, the end points' after the draw
        "document.querySelectorAll('#chart-plane .annotation-text-g').length > 1"
    )
    chart = page.evaluate("""() => {
        const el = document.getElementById('chart-plane');
        const data = JSON.parse(document.getElementById('plane-data').textContent);
        const xs = data.systems.flatMap(s => s.a).concat(data.matches.a, [data.substrate.a])
            .filter(x => x !== null);
        return {range: el._fullLayout.xaxis.range, lo: Math.min(...xs), hi: Math.max(...xs),
                marked: data.matches.formula.length, shown: data.matches_in_table};
    }""")
    (start, end), lo, hi = chart["range"], chart["lo"], chart["hi"]
    width = end - start
    assert start + 0.05 * width <= lo and hi <= end - 0.05 * width  # every point, padded
    assert hi - lo >= 0.6 * width  # and the data fill the chart (AlGaAs spans 0.008 Å)
    assert chart["marked"] <= 60 < chart["shown"]  # thinned: the curve stays visible
    kinds = page.locator("#chart-plane .scatterlayer .trace").evaluate_all(
        "nodes => nodes.map(n => n.querySelector('.js-line') ? 'line' : 'markers')"
    )
    assert kinds[0] == "markers" and "line" in kinds  # matches first, the curve on top
    plot = boxes(page, "#chart-plane .nsewdrag")[0]
    labels = [b for b in boxes(page, "#chart-plane .annotation-text-g") if " " not in b["text"]]
    assert ends <= {b["text"] for b in labels}  # the end points are labelled, not clipped
    assert [
        b["text"]
        for b in labels
        if not (
            plot["x0"] <= b["x0"]
            and b["x1"] <= plot["x1"]
            and plot["y0"] <= b["y0"]
            and b["y1"] <= plot["y1"]
        )
    ] == []
    assert overlapping(chart_parts(page, "#chart-plane")) == []


def test_compound_table_keeps_its_first_column_in_view(page: Page, live_server: str) -> None:
    page.set_viewport_size({"width": WIDTH, "height": 900})
    page.goto(live_server + "compounds")
    wrap = page.locator(".table-wrap").first
    assert wrap.evaluate("w => w.scrollWidth > w.clientWidth")  # the right-hand columns scroll
    name = page.locator("#compound-table tbody tr[data-formula='GaAs'] th")
    before = name.bounding_box()
    wrap.evaluate("w => { w.scrollLeft = w.scrollWidth; }")
    after = name.bounding_box()
    assert after["x"] == pytest.approx(before["x"], abs=1)
    tick = page.locator("#compound-table tbody tr[data-formula='GaAs'] td.pin").bounding_box()
    assert tick["x"] + tick["width"] <= after["x"] + 1  # the select box beside it, not under
