from pathlib import Path

import httpx

from tests.conftest import csrf_headers, serving


def test_shortlist_and_notes_survive_a_server_restart(db_path: Path, tmp_path: Path) -> None:
    log = tmp_path / "server.log"
    with serving(db_path, log) as server:
        url = server.url
        token = csrf_headers(httpx, url)
        made = httpx.post(url + "/api/shortlists", headers=token, json={
            "name": "Review ½", "note": "keep for the 1.3 µm review", "substrate": "InP",
            "temperature_K": 77, "target_wavelength_nm": 1300}).json()
        items = f"{url}/api/shortlists/{made['id']}/items"
        added = httpx.post(items, headers=token, json={"formulas": ["InP", "In0.53Ga0.47As"]})
        assert added.status_code == 201
        noted = httpx.patch(items + "/InP", headers=token, json={"note": "substrate itself"})
        assert noted.status_code == 200
        before = httpx.get(f"{url}/api/shortlists/{made['id']}").json()
    with serving(db_path, log) as server:
        url = server.url
        after = httpx.get(f"{url}/api/shortlists/{made['id']}").json()
        page = httpx.get(f"{url}/shortlists/{made['id']}").text
    assert after == before
    assert after["name"] == "Review ½" and after["note"] == "keep for the 1.3 µm review"
    assert after["conditions"]["temperature_K"] == 77.0
    assert [(i["formula"], i["note"]) for i in after["items"]] == [
        ("InP", "substrate itself"), ("In0.53Ga0.47As", "")]
    assert "substrate itself" in page
