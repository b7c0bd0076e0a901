"""Another site's page must not be able to change anything: every change needs the token."""

import importlib
import pkgutil
import sqlite3
from pathlib import Path

import pytest
from bs4 import BeautifulSoup
from fastapi.routing import APIRoute
from fastapi.testclient import TestClient

import app.routes
from app.config import Settings
from app.main import create_app
from tests.conftest import TEST_HOST, csrf_headers

USER_TABLES = ("shortlists", "shortlist_items", "user_substrates", "user_measurements")
CHANGES = {"POST", "PUT", "PATCH", "DELETE"}
CSV = b"formula,property,value,unit,source\nGaAs,band_gap,1.43,eV,PL\n"


def user_rows(db: Path) -> dict[str, list[tuple]]:
    with sqlite3.connect(db) as conn:
        return {t: conn.execute(f"SELECT * FROM {t} ORDER BY id").fetchall()
                for t in USER_TABLES}


@pytest.fixture
def stocked(client) -> dict[str, str]:
    """A list with a candidate, a substrate and an import of the user's: things to change."""
    made = client.post("/api/shortlists", json={"name": "Keep", "note": "mine"}).json()
    client.post(f"/api/shortlists/{made['id']}/items", json={"formulas": ["GaAs"]})
    client.post("/api/substrates", json={"name": "Mine", "structure": "cubic",
                                         "a_angstrom": 5.5})
    batch = client.post("/api/measurements", content=CSV,
                        headers={"content-type": "text/csv"}).json()["batch"]
    return {"shortlist_id": str(made["id"]), "formula": "GaAs", "name": "Mine",
            "batch": batch}


def changing_requests(values: dict[str, str]) -> list[tuple[str, str]]:
    """(method, URL) of every route that changes data, its path filled with real values.

    Routes are read from the router of every module in `app.routes` (as `create_app` includes
    them), so a route added later is checked too.
    """
    found = []
    for info in pkgutil.iter_modules(app.routes.__path__):
        router = getattr(importlib.import_module(f"app.routes.{info.name}"), "router", None)
        for route in getattr(router, "routes", ()):
            if isinstance(route, APIRoute):
                found += [(m, route.path_format.format(**values))
                          for m in sorted(route.methods & CHANGES)]
    return found


def send(bare: TestClient, method: str, url: str, **headers: str):
    body = ({"json": {"name": "X", "formulas": ["InP"], "note": "n", "structure": "cubic",
                      "a_angstrom": 5.0}} if url.startswith("/api/") else
            {"data": {"name": "X", "formulas": "InP", "formula": "GaAs", "note": "n",
                      "confirm": "yes", "structure": "cubic", "a_angstrom": "5"}})
    return bare.request(method, url, params={"confirm": "yes"}, headers=headers, **body)


def test_every_change_without_the_right_token_is_refused(client, stocked, db_path) -> None:
    before = user_rows(db_path)
    requests = changing_requests(stocked)
    assert len(requests) >= 16 and ("DELETE", f"/api/shortlists/{stocked['shortlist_id']}"
                                    ) in requests
    bare = TestClient(client.app)  # no token
    for method, url in requests:
        for headers in ({}, {"X-Bondgap-Token": "0" * 64}):
            response = send(bare, method, url, **headers)
            assert response.status_code == 403, (method, url, response.text[:200])
            words = "wrong bondgap token" if headers else "no bondgap token"
            assert words in response.text, (method, url)
    assert user_rows(db_path) == before


def test_changes_from_another_sites_page_are_refused_even_with_the_token(client, stocked,
                                                                         db_path) -> None:
    before = user_rows(db_path)
    requests = changing_requests(stocked)
    assert len(requests) >= 16
    foreign = [{"Origin": "http://evil.example"}, {"Origin": "null"},
               {"Origin": "http://127.0.0.1:9"}, {"Sec-Fetch-Site": "cross-site"},
               {"Sec-Fetch-Site": "same-site"}]
    for method, url in requests:
        for headers in foreign:
            response = send(client, method, url, **headers)
            assert response.status_code == 403, (method, url, headers)
            assert "another site" in response.text
    assert user_rows(db_path) == before
    same = {"Origin": f"http://{TEST_HOST}", "Sec-Fetch-Site": "same-origin"}
    made = client.post("/api/shortlists", json={"name": "Mine too"}, headers=same)
    assert made.status_code == 201


def test_the_token_is_served_to_this_site_only(client) -> None:
    answer = client.get("/api/token")
    assert answer.status_code == 200 and answer.headers["cache-control"] == "no-store"
    assert answer.json()["header"] == "X-Bondgap-Token"
    assert len(answer.json()["token"]) == 64
    for headers in ({"Origin": "http://evil.example"}, {"Sec-Fetch-Site": "cross-site"}):
        refused = client.get("/api/token", headers=headers)
        assert refused.status_code == 403 and "token" not in refused.json()
    same = client.get("/api/token", headers={"Origin": f"http://{TEST_HOST}"})
    assert same.json()["token"] == answer.json()["token"]


def test_every_page_form_carries_the_token(client, stocked) -> None:
    token = csrf_headers(client)["X-Bondgap-Token"]
    list_url = f"/shortlists/{stocked['shortlist_id']}"
    pages = ["/compounds", "/compounds/GaAs", "/compounds/In0.53Ga0.47As", "/shortlists",
             list_url, list_url + "/delete", "/substrates", "/measurements",
             f"/measurements/batches/{stocked['batch']}/delete",
             "/alloys?system=InGaAs&on=InP&gap=0.75"]
    post_forms = 0
    for url in pages:
        soup = BeautifulSoup(client.get(url).text, "lxml")
        assert soup.select_one("meta[name='bondgap-token']")["content"] == token, url
        for form in soup.select("form"):
            if form.get("method", "get").lower() == "post":
                post_forms += 1
                fields = form.select("input[name='csrf_token']")
                assert [f["value"] for f in fields] == [token], (url, form.get("action"))
                assert fields[0]["type"] == "hidden"
    assert post_forms >= 12


def test_a_form_with_the_token_field_works_without_the_header(client) -> None:
    token = csrf_headers(client)["X-Bondgap-Token"]
    bare = TestClient(client.app)
    done = bare.post("/shortlists", data={"name": "From the form", "csrf_token": token},
                     follow_redirects=False)
    assert done.status_code == 303
    upload = bare.post("/measurements", data={"csrf_token": token},
                       files={"file": ("m.csv", CSV, "text/csv")}, follow_redirects=False)
    assert upload.status_code == 303
    # The JSON API takes the header only, so a plain HTML form cannot reach it.
    api = bare.post("/api/shortlists", data={"name": "Nope", "csrf_token": token})
    assert api.status_code == 403


def test_the_token_is_per_install_and_survives_a_restart(settings, tmp_path: Path) -> None:
    def token_of(db: Path) -> str:
        with TestClient(create_app(Settings(db_path=db, allowed_hosts=(TEST_HOST,)))) as fresh:
            return csrf_headers(fresh)["X-Bondgap-Token"]

    first = token_of(settings.db_path)
    assert token_of(settings.db_path) == first
    assert token_of(tmp_path / "other.db") != first
    with sqlite3.connect(settings.db_path) as conn:
        secret = conn.execute("SELECT value FROM store_meta WHERE key = 'csrf_secret'").fetchone()
    assert secret and len(secret[0]) == 64 and secret[0] != first  # the secret stays inside


def test_error_pages_do_not_carry_the_token(client) -> None:
    token = csrf_headers(client)["X-Bondgap-Token"]
    for response in (client.get("/shortlists/999"), client.get("/compounds/Xx"),
                     client.get("/compounds", headers={"Host": "evil.example"})):
        assert response.status_code in (400, 404)
        assert token not in response.text
