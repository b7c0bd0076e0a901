import pytest


def make(client, name="Review", **body) -> dict:
    response = client.post("/api/shortlists", json={"name": name, **body})
    assert response.status_code == 201, response.text
    return response.json()


def test_create_add_note_patch_and_read(client) -> None:
    made = make(client, note="for the 1.55 um laser", substrate="InP", target_wavelength_nm=1550)
    assert made["conditions"] == {"substrate": "InP", "temperature_K": 300.0,
                                  "target": {"gap_eV": None, "wavelength_nm": 1550.0}}
    url = f"/api/shortlists/{made['id']}"
    added = client.post(url + "/items", json={"formulas": ["InP", "In0.53Ga0.47As", "PIn"],
                                              "note": "matched"})
    assert added.status_code == 201
    assert added.json()["added"] == ["InP", "In0.53Ga0.47As"]
    assert client.patch(url + "/items/In0.53Ga0.47As", json={"note": "best gap"}).status_code == 200
    patched = client.patch(url, json={"temperature_K": 77, "note": "changed"}).json()
    assert patched["conditions"]["temperature_K"] == 77.0
    assert patched["conditions"]["substrate"] == "InP"  # fields not given stay
    assert patched["conditions"]["target"]["wavelength_nm"] == 1550.0
    assert patched["note"] == "changed"
    assert [(i["formula"], i["note"]) for i in patched["items"]] == [
        ("InP", "matched"), ("In0.53Ga0.47As", "best gap")]
    listed = client.get("/api/shortlists").json()["shortlists"]
    assert [(s["name"], s["count"]) for s in listed] == [("Review", 2)]
    assert client.delete(url + "/items/InP").json()["items"][0]["formula"] == "In0.53Ga0.47As"


def test_delete_needs_confirm(client) -> None:
    url = f"/api/shortlists/{make(client)['id']}"
    refused = client.delete(url)
    assert refused.status_code == 400 and "confirm=yes" in refused.json()["detail"]
    assert client.get(url).status_code == 200
    assert client.delete(url, params={"confirm": "yes"}).status_code == 204
    assert client.get(url).status_code == 404


@pytest.mark.parametrize(
    ("method", "path", "body", "status", "words"),
    [
        ("get", "/api/shortlists/999", None, 404, "no shortlist"),
        ("post", "/api/shortlists", {"name": "Review"}, 409, "already exists"),
        ("post", "/api/shortlists", {"name": ""}, 400, "1 to 80"),
        ("post", "/api/shortlists", {"name": "x", "substrate": "Nope"}, 400, "unknown substrate"),
        ("post", "/api/shortlists", {"name": "x", "temperature_K": "hot"}, 422, "temperature_K"),
        ("post", "/api/shortlists", {"name": "x", "target_gap_eV": 1, "target_wavelength_nm": 900},
         400, "not both"),
        ("post", "/api/shortlists/{id}/items", {"formulas": ["GaAs", "Xx"]}, 400, "'Xx'"),
        ("post", "/api/shortlists/{id}/items", {"formulas": []}, 400, "at least one"),
        ("post", "/api/shortlists/{id}/items", {"formulas": "GaAs"}, 422, "formulas"),
        ("patch", "/api/shortlists/{id}/items/InP", {"note": "x"}, 404, "not on this"),
        ("get", "/api/shortlists/{id}/compare", None, 400, "compare 2 to 8"),
        ("get", "/api/shortlists/{id}/compare?formula=GaAs&formula=InP", None, 404, "InP"),
    ],
)
def test_bad_requests_get_one_line_answers(client, method, path, body, status, words) -> None:
    made = make(client)
    client.post(f"/api/shortlists/{made['id']}/items", json={"formulas": ["GaAs"]})
    response = getattr(client, method)(path.replace("{id}", str(made["id"])),
                                       **({"json": body} if body is not None else {}))
    assert response.status_code == status
    detail = response.json()["detail"]
    assert words in detail and "\n" not in detail and "Traceback" not in detail
    assert [i["formula"] for i in client.get(f"/api/shortlists/{made['id']}").json()["items"]] \
        == ["GaAs"]


def test_compare_marks_the_best_values_by_the_list_conditions(client) -> None:
    made = make(client, substrate="InP", target_gap_eV=0.75)
    url = f"/api/shortlists/{made['id']}"
    client.post(url + "/items", json={"formulas": ["GaAs", "In0.53Ga0.47As", "CdTe", "InP"]})
    body = client.get(url + "/compare").json()
    assert body["formulas"] == ["GaAs", "In0.53Ga0.47As", "CdTe", "InP"]
    rows = {r["key"]: r for r in body["rows"]}
    keys = [r["key"] for r in body["rows"]]
    assert keys[:9] == ["band_gap_eV", "wavelength_nm", "gap_kind", "lattice_constant_angstrom",
                        "mismatch", "critical_thickness_nm", "ionicity", "polarity", "stability"]
    assert rows["band_gap_eV"]["best"] == [1]  # InGaAs: 0.74 eV, closest to 0.75
    assert rows["mismatch"]["best"] == [3]  # InP on InP
    assert rows["critical_thickness_nm"]["cells"][3]["text"] == "∞"  # lattice-matched: one rule
    assert rows["rohs_restricted"]["cells"][2]["text"] == "Cd"
    assert "2011/65/EU" in rows["rohs_restricted"]["cells"][2]["source"]
    for row in body["rows"]:
        assert set(row) == {"key", "label", "unit", "rule", "best", "cells"}
        assert all({"value", "text", "route", "source", "yours"} <= set(c) for c in row["cells"])
    assert body["chart"]["substrate"]["a"] == pytest.approx(5.8687)
    assert len(body["chart"]["candidates"]) == 4 and len(body["chart"]["background"]) > 50
    chosen = client.get(url + "/compare", params={"formula": ["CdTe", "GaAs"]}).json()
    assert chosen["formulas"] == ["CdTe", "GaAs"]


def test_the_listing_of_shortlists_is_paged(client) -> None:
    # Bounded cost: one answer holds at most LIST_PAGE_ROWS lists; the rest by offset.
    for name in ("first", "second", "third"):
        assert client.post("/api/shortlists", json={"name": name}).status_code == 201
    page = client.get("/api/shortlists", params={"limit": 2}).json()
    assert [s["name"] for s in page["shortlists"]] == ["third", "second"]  # newest first
    assert (page["total"], page["next_offset"]) == (3, 2)
    rest = client.get("/api/shortlists", params={"offset": 2}).json()
    assert [s["name"] for s in rest["shortlists"]] == ["first"] and rest["next_offset"] is None
    assert client.get("/api/shortlists", params={"limit": 5000}).status_code == 422


@pytest.mark.parametrize("typed", ["1_0", "\uff11", "+1", "0x1", " 1e1"])
def test_ids_and_offsets_are_plain_digits(client, typed) -> None:
    # Issue 10, item 5: plain decimal numbers only ("1_0" used to reach shortlist 10).
    for url, params in ((f"/api/shortlists/{typed}", {}), ("/api/shortlists", {"offset": typed})):
        answer = client.get(url, params=params)
        assert answer.status_code == 422, url
        detail = answer.json()["detail"]
        assert "must be a whole number" in detail and "digits 0-9 only" in detail
        assert "\n" not in detail
