"""Take the README's screenshots of the pages in headless chromium (Debian's /usr/bin/chromium).

Starts `bondgap serve` on a fresh database in a temporary folder, makes a shortlist of eight
candidates (an invented name and note: demo data, not a real design), and saves PNGs of the
compound table, a compound page, the composition finder, the shortlist and its comparison.

    PYTHONPATH=. .venv/bin/python scripts/screenshots.py            # into docs/
    PYTHONPATH=. .venv/bin/python scripts/screenshots.py --out /tmp/shots --width 1920 --full

Nothing here writes to your own database: the server runs on a throw-away copy.
"""

from __future__ import annotations

import argparse
import tempfile
from pathlib import Path

import httpx
from playwright.sync_api import Page, sync_playwright

from tests.conftest import CHROMIUM, CHROMIUM_ARGS, REPO_ROOT, build_database, csrf_headers, serving

DEMO_NAME = "Demo (invented): 1.3 µm emitter"
DEMO_NOTE = "Invented demo list for the screenshots; not a real design."
DEMO_FORMULAS = ["GaAs", "AlAs", "InP", "In0.53Ga0.47As", "GaP", "ZnSe", "CdTe", "GaN"]
DEMO_YOURS = (
    "formula,property,value,unit,source\n"
    "GaAs,band_gap,1.43,eV,invented demo value (not a measurement)\n"
)
SHOTS = {
    # file name: (path, "{id}" standing for the demo list's id; selector to wait for; height)
    "table.png": ("compounds", "#compound-table", 1000),
    "compound.png": ("compounds/GaAs", "#chart-ehc .annotation", 2100),
    "compound-CdTe.png": ("compounds/CdTe", "#chart-ehc .annotation", 2100),
    "finder.png": (
        "alloys?system=InGaAsP&on=InP&wavelength=1300",
        "#chart-plane .annotation",
        1300,
    ),
    "finder-AlGaAs.png": ("alloys?system=AlGaAs&on=GaAs", "#chart-plane .annotation", 1300),
    "shortlist.png": ("shortlists/{id}", "#candidates", 1000),
    "compare.png": ("shortlists/{id}/compare", "#chart-compare .annotation", 1700),
}
README_SHOTS = ("table.png", "compound.png", "finder.png", "shortlist.png", "compare.png")


def make_demo_list(base: str) -> int:
    """Create the invented demo shortlist (and one invented "yours" value); return its id."""
    with httpx.Client(base_url=base, timeout=30) as client:
        client.headers.update(csrf_headers(client))
        made = client.post(
            "/api/shortlists",
            json={"name": DEMO_NAME, "note": DEMO_NOTE, "substrate": "InP", "target_gap_eV": 0.95},
        )
        made.raise_for_status()
        list_id = made.json()["id"]
        client.post(
            f"/api/shortlists/{list_id}/items", json={"formulas": DEMO_FORMULAS}
        ).raise_for_status()
        client.patch(
            f"/api/shortlists/{list_id}/items/InP",
            json={"note": "substrate itself (invented note)"},
        ).raise_for_status()
        client.post(
            "/api/measurements", content=DEMO_YOURS.encode(), headers={"content-type": "text/csv"}
        ).raise_for_status()
        return list_id


def shoot(page: Page, url: str, selector: str, target: Path, full: bool) -> None:
    """Open `url`, wait for `selector` and the charts to settle, and save a PNG."""
    page.goto(url)
    page.wait_for_selector(selector)
    page.wait_for_timeout(600)  # labels are placed after the first draw
    page.screenshot(path=str(target), full_page=full)


def main() -> None:
    """Parse the options and take the screenshots."""
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--out", type=Path, default=REPO_ROOT / "docs")
    parser.add_argument("--width", type=int, default=1400)
    parser.add_argument("--height", type=int, help="screen height (default: per page)")
    parser.add_argument("--full", action="store_true", help="whole pages, not the first screen")
    parser.add_argument(
        "--all",
        action="store_true",
        help="also the extra pages (CdTe, AlGaAs), not only the README's",
    )
    args = parser.parse_args()
    args.out.mkdir(parents=True, exist_ok=True)
    names = list(SHOTS) if args.all else list(README_SHOTS)
    with tempfile.TemporaryDirectory() as folder:
        db = build_database(Path(folder) / "bondgap.db")
        with serving(db, Path(folder) / "server.log") as server:
            list_id = make_demo_list(server.url)
            with sync_playwright() as play:
                browser = play.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS)
                page = browser.new_page()
                for name in names:
                    path, selector, height = SHOTS[name]
                    page.set_viewport_size({"width": args.width, "height": args.height or height})
                    url = f"{server.url}/{path.format(id=list_id)}"
                    shoot(page, url, selector, args.out / name, args.full)
                    print(args.out / name)
                browser.close()


if __name__ == "__main__":
    main()
