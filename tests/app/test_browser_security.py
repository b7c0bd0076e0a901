"""In the browser: user text is shown as text, and other sites' pages cannot change anything."""

import re
import threading
import uuid
from collections.abc import Iterator
from http.server import BaseHTTPRequestHandler, ThreadingHTTPServer

import httpx
import pytest
from playwright.sync_api import Page, expect

from tests.conftest import REBIND_HOST, csrf_headers

pytestmark = pytest.mark.browser

PAYLOAD = "<script>window.__pwned=1</script><b>x</b>"


class EvilSite:
    """Another web site on this machine (http://localhost:PORT/, cross-site to 127.0.0.1)."""

    def __init__(self) -> None:
        self.page = ""
        site = self

        class Handler(BaseHTTPRequestHandler):
            def do_GET(self) -> None:  # noqa: N802 - the name http.server calls
                body = site.page.encode()
                self.send_response(200)
                self.send_header("Content-Type", "text/html; charset=utf-8")
                self.send_header("Content-Length", str(len(body)))
                self.end_headers()
                self.wfile.write(body)

            def log_message(self, *args: object) -> None:
                pass

        self.server = ThreadingHTTPServer(("127.0.0.1", 0), Handler)
        self.url = f"http://localhost:{self.server.server_address[1]}/"


@pytest.fixture
def evil_site() -> Iterator[EvilSite]:
    """A real server (not an intercepted route, which chromium treats as a public site)."""
    site = EvilSite()
    thread = threading.Thread(target=site.server.serve_forever, daemon=True)
    thread.start()
    yield site
    site.server.shutdown()
    site.server.server_close()


def not_run(page: Page) -> None:
    assert page.evaluate("typeof window.__pwned") == "undefined"
    assert page.locator("main b", has_text=re.compile(r"^x$")).count() == 0


def test_notes_with_markup_are_shown_as_text(page: Page, live_server: str) -> None:
    errors: list[str] = []
    page.on("pageerror", lambda exc: errors.append(str(exc)))
    name = f"Escaping {uuid.uuid4().hex[:6]}"
    page.goto(live_server + "shortlists")
    page.fill("#new-name", name)
    page.fill("#new-note", PAYLOAD)
    page.click("#new-shortlist button[type=submit]")
    expect(page.locator("#shortlist-note")).to_have_text(PAYLOAD)
    page.fill("#add-formulas", "GaAs InP")
    page.fill("#add-note", PAYLOAD)
    page.click("#add-items button[type=submit]")
    row = page.locator("#candidates tr[data-formula='InP']")
    row.locator("textarea").fill(PAYLOAD + " (edited)")
    with page.expect_navigation():  # the form posts and redirects; reload only after that
        row.locator("button", has_text="Save").click()
    page.reload()
    expect(page.locator("#shortlist-note")).to_have_text(PAYLOAD)
    expect(page.locator("#candidates tr[data-formula='InP'] textarea")).to_have_value(
        PAYLOAD + " (edited)")
    expect(page.locator("#candidates tr[data-formula='GaAs'] textarea")).to_have_value(PAYLOAD)
    not_run(page)
    page.goto(live_server + "shortlists")
    expect(page.locator("#shortlist-index tr", has_text=name).locator(".note-text")
           ).to_have_text(PAYLOAD)
    not_run(page)

    # The same text as a substrate note and a measurement's source, on every page showing it.
    token = csrf_headers(httpx, live_server)
    substrate = f"XSS {uuid.uuid4().hex[:6]}"
    httpx.post(live_server + "api/substrates", headers=token, json={
        "name": substrate, "structure": "cubic", "a_angstrom": 6.1, "note": PAYLOAD})
    batch = httpx.post(live_server + "api/measurements", headers={
        **token, "content-type": "text/csv"}, content=(
        "formula,property,value,unit,source\nAlSb,eps_inf,10.2,," + PAYLOAD + "\n").encode()
    ).json()["batch"]
    try:
        for url, where in (("substrates", f"#substrate-table tr[data-name='{substrate}']"),
                           ("measurements", "#measurements-table tr[data-formula='AlSb']"),
                           ("compounds/AlSb", "#yours")):
            page.goto(live_server + url)
            expect(page.locator(where)).to_contain_text(PAYLOAD)
            not_run(page)
    finally:
        httpx.delete(f"{live_server}api/substrates/{substrate}", headers=token)
        httpx.delete(f"{live_server}api/measurements/batches/{batch}",
                     params={"confirm": "yes"}, headers=token)
    assert errors == []


def test_another_sites_page_cannot_change_anything(page: Page, live_server: str,
                                                   evil_site: EvilSite) -> None:
    forged = f"Forged {uuid.uuid4().hex[:6]}"
    token = csrf_headers(httpx, live_server)["X-Bondgap-Token"]  # even the right token fails
    evil_site.page = f"""<!doctype html><title>evil</title>
      <form id="f" method="post" action="{live_server}shortlists">
        <input name="name" value="{forged} form"><input name="csrf_token" value="{token}">
      </form>
      <script>
        fetch("{live_server}api/shortlists", {{method: "POST", mode: "no-cors",
          headers: {{"Content-Type": "text/plain"}}, body: '{{"name": "{forged} fetch"}}'}})
          .finally(() => document.getElementById("f").submit());
      </script>"""
    with page.expect_response(lambda r: r.url == live_server + "shortlists") as answer:
        page.goto(evil_site.url)
    assert answer.value.status == 403
    expect(page.locator(".error-message")).to_contain_text("another site")
    names = [s["name"] for s in httpx.get(live_server + "api/shortlists").json()["shortlists"]]
    assert not [n for n in names if n.startswith(forged)]


def test_our_pages_cannot_be_framed_by_another_site(page: Page, live_server: str,
                                                    evil_site: EvilSite) -> None:
    evil_site.page = f'<iframe src="{live_server}shortlists"></iframe>'
    refused: list[str] = []
    page.on("requestfailed", lambda request: refused.append(request.failure or ""))
    page.goto(evil_site.url)
    page.wait_for_load_state("load")
    framed = [f for f in page.frames if f != page.main_frame]
    for _ in range(50):  # the refused frame may show its error page a moment after "load"
        if len(framed) == 1 and framed[0].url.startswith("chrome-error://"):
            break
        page.wait_for_timeout(100)
        framed = [f for f in page.frames if f != page.main_frame]
    assert len(framed) == 1 and framed[0].url.startswith("chrome-error://")
    assert refused == ["net::ERR_BLOCKED_BY_RESPONSE"]  # our headers, not chromium's own rules


def test_a_rebound_host_name_is_refused(page: Page, live_server: str) -> None:
    # The browser resolves REBIND_HOST to 127.0.0.1, as a DNS-rebinding attacker would make it.
    port = live_server.rstrip("/").rsplit(":", 1)[1]
    answer = page.goto(f"http://{REBIND_HOST}:{port}/shortlists")
    assert answer is not None and answer.status == 400
    expect(page.locator(".error-message")).to_contain_text("Host header not allowed")
    assert page.locator("meta[name='bondgap-token']").count() == 0
    assert page.locator("form[method='post']").count() == 0
