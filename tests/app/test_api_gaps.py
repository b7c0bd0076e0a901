import math

import pytest

from app.gap_columns import GAP_KEYS, gap_values_at
from screening.catalogue import catalogue_formulas
from screening.gaps import gap_model
from screening.report import compound_report

BAND_GAP_KEYS = {"estimate_eV", "uncertainty_eV", "cross_validated_eV", "measured_eV", "kind",
                 "temperature_K", "wavelength_nm"}
UNMEASURED = "GaBi"  # no measured gap in the seed data


def rows(client, **params) -> list[dict]:
    response = client.get("/api/compounds", params=params)
    assert response.status_code == 200, response.text
    return response.json()["rows"]


def test_report_keys_of_the_issue(client) -> None:
    body = client.get("/api/compounds/GaAs", params={"temperature": "77"}).json()
    assert BAND_GAP_KEYS <= set(body["band_gap"])
    assert {"gamma_gap_eV", "min_gap_eV", "direct"} <= set(body["tight_binding"])
    assert isinstance(body["tight_binding"]["direct"], bool)
    assert body["band_gap"]["temperature_K"] == 77.0
    assert body["band_gap"]["measured_eV"] > 1.424  # gaps widen on cooling
    assert body["band_gap"]["wavelength_nm"] == pytest.approx(1239.84198 / body["band_gap"][
        "measured_eV"], rel=1e-6)
    unmeasured = client.get(f"/api/compounds/{UNMEASURED}").json()["band_gap"]
    assert unmeasured["measured_eV"] is None and unmeasured["cross_validated_eV"] is None
    assert unmeasured["estimate_eV"] is not None and unmeasured["uncertainty_eV"] > 0


def test_compound_at_a_temperature_is_the_engine_report(client) -> None:
    body = client.get("/api/compounds/AsGa", params={"temperature": "77"}).json()
    assert body == compound_report("GaAs", temperature_K=77.0)
    assert client.get("/api/compounds/GaAs", params={"temperature": "300"}).json() == (
        client.get("/api/compounds/GaAs").json())


def test_stored_gap_columns_match_the_engine_at_300_K(client) -> None:
    engine = gap_values_at(300.0)
    for row in rows(client):
        assert {k: row[k] for k in GAP_KEYS} == engine[row["formula"]]


def test_table_gaps_follow_the_temperature_and_match_the_report(client) -> None:
    cold = {r["formula"]: r for r in rows(client, temperature="77")}
    warm = {r["formula"]: r for r in rows(client)}
    assert set(cold) == set(catalogue_formulas())
    assert cold["GaAs"]["band_gap_eV"] > warm["GaAs"]["band_gap_eV"]
    assert cold["GaAs"]["band_gap_measured_eV"] == warm["GaAs"]["band_gap_measured_eV"] == 1.424
    for formula in ("GaAs", "ZnSe", UNMEASURED):
        gap = compound_report(formula, temperature_K=77.0)["band_gap"]
        row = cold[formula]
        assert row["band_gap_eV"] == gap["value_eV"]
        assert row["band_gap_source"] == gap["value_source"]
        assert row["band_gap_estimate_eV"] == gap["estimate_eV"]
        assert row["wavelength_nm"] == gap["wavelength_nm"]
    assert client.get("/api/compounds", params={"temperature": "77"}).json()["temperature_K"] == 77


def test_estimates_never_replace_measurements(client) -> None:
    for row in rows(client, temperature="500"):
        measured = row["band_gap_measured_eV"] is not None
        assert row["band_gap_source"] == ("measured" if measured else "estimate")
        assert row["band_gap_estimate_eV"] is not None and row["band_gap_uncertainty_eV"] > 0


def test_gap_and_wavelength_windows_and_kind(client) -> None:
    params = {"temperature": "350", "gap_min": "1.8", "gap_max": "2.3", "kind": "Direct"}
    found = rows(client, **params)
    assert found and all(1.8 <= r["band_gap_eV"] <= 2.3 for r in found)
    assert {r["band_gap_kind"] for r in found} == {"direct"}
    window = rows(client, wl_min="400", wl_max="700", sort="wavelength_nm")
    lengths = [r["wavelength_nm"] for r in window]
    assert lengths and all(400 <= w <= 700 for w in lengths) and lengths == sorted(lengths)
    for r in window:
        assert r["wavelength_nm"] == pytest.approx(1239.84198 / r["band_gap_eV"], rel=1e-6)
    indirect = rows(client, kind="indirect", measured_only="true")
    assert indirect and all(r["band_gap_kind"] == "indirect" for r in indirect)
    assert "Si" in {r["formula"] for r in indirect}


@pytest.mark.parametrize("desc", ["false", "true"])
def test_sort_by_gap_at_a_temperature_keeps_missing_last(client, desc: str) -> None:
    found = rows(client, sort="wavelength_nm", desc=desc, temperature="10")
    values = [r["wavelength_nm"] for r in found]
    present = [v for v in values if v is not None]
    assert len(present) < len(values)  # semimetals have no photon wavelength
    assert values[: len(present)] == present == sorted(present, reverse=desc == "true")


def test_links_keep_the_new_filters(client) -> None:
    body = client.get("/api/compounds", params={"temperature": "0", "gap_min": "0"}).json()
    assert body["query"] == {"gap_min": 0.0, "sort": "formula", "temperature": 0.0}


@pytest.mark.parametrize(
    ("params", "fragment"),
    [
        # One message for every number (app.number_input): what is accepted, then the value.
        ({"temperature": "hot"}, "temperature must be a number of K from 0 to 2000, not 'hot'"),
        ({"temperature": "nan"}, "temperature must be a number of K from 0 to 2000"),
        ({"temperature": "-5"}, "temperature must be a number of K from 0 to 2000"),
        ({"temperature": "2000.5"}, "temperature must be a number of K from 0 to 2000"),
        ({"wl_min": "blue"}, "wl-min must be a number of nm from"),
        ({"wl_min": "0"}, "wl-min must be a number of nm from"),
        ({"wl_max": "-400"}, "wl-max must be a number of nm from"),
        ({"wl_min": "900", "wl_max": "400"}, "empty wl window"),
        ({"kind": "sideways"}, "unknown gap kind 'sideways'; accepted: direct, indirect"),
    ],
)
def test_bad_gap_parameters_get_400_with_one_line(client, params, fragment) -> None:
    response = client.get("/api/compounds", params=params)
    assert response.status_code == 400
    detail = response.json()["detail"]
    assert fragment in detail and "\n" not in detail


@pytest.mark.parametrize("value", ["warm", "-1", "1e9", "inf"])
def test_bad_temperature_on_one_compound_gets_400(client, value: str) -> None:
    response = client.get("/api/compounds/GaAs", params={"temperature": value})
    assert response.status_code == 400 and "temperature" in response.json()["detail"]


def test_bands_endpoint(client) -> None:
    body = client.get("/api/compounds/AsGa/bands", params={"points": "50"}).json()
    assert body["formula"] == "GaAs" and body["points"] == 50
    assert len(body["bands_eV"]) == len(body["k"]) == len(body["distance"]) == 50
    assert all(len(e) == 8 for e in body["bands_eV"])
    assert [x["label"] for x in body["labels"]] == ["L", "Γ", "X", "W", "K", "Γ"]
    assert [lb for lb in body["label"] if lb] == ["L", "Γ", "X", "W", "K", "Γ"]
    assert max(e[3] for e in body["bands_eV"]) == 0.0
    assert body["gap_eV"] == pytest.approx(min(e[4] for e in body["bands_eV"]), abs=1e-5)
    assert body["direct"] is True and "spin-orbit" in body["model_limits"]
    assert body["units"]["energy"] == "eV relative to the valence-band top"
    default = client.get("/api/compounds/GaAs/bands").json()
    assert default["points"] == 400


@pytest.mark.parametrize(("points", "status"), [("3", 400), ("5000", 400), ("ten", 400)])
def test_bad_band_points_get_400(client, points: str, status: int) -> None:
    response = client.get("/api/compounds/GaAs/bands", params={"points": points})
    assert response.status_code == status and "points must be" in response.json()["detail"]
    assert client.get("/api/compounds/Xx/bands").status_code == 400


def test_accuracy_endpoint(client) -> None:
    body = client.get("/api/accuracy").json()
    model = gap_model()
    assert body["n"] == len(body["rows"]) == model.n_measured
    assert body["mae_eV"] == pytest.approx(model.loo_mae_eV, abs=1e-6)
    assert body["max_eV"] == pytest.approx(max(abs(r["error_eV"]) for r in body["rows"]),
                                           abs=1e-5)
    for r in body["rows"]:
        assert r["error_eV"] == pytest.approx(r["loo_eV"] - r["measured_eV"], abs=1e-5)
        assert r["uncertainty_eV"] > 0
    assert set(body["families"]) == {"IV-IV", "III-V", "II-VI", "I-VII"}
    assert sum(f["n"] for f in body["families"].values()) == body["n"]
    assert body["within_one_uncertainty"] == pytest.approx(model.coverage(1.0), abs=1e-4)
    assert body["within_two_uncertainties"] == pytest.approx(model.coverage(2.0), abs=1e-4)
    assert body["kind_total"] > 0 and 0 <= body["kind_correct"] <= body["kind_total"]
    assert not any(math.isnan(v) for v in body["model"]["length_scales"])


def test_openapi_documents_the_new_routes_and_parameters(client) -> None:
    spec = client.get("/api/openapi.json").json()
    paths = spec["paths"]
    assert {"/api/compounds/{formula}/bands", "/api/accuracy"} <= set(paths)
    names = {p["name"] for p in paths["/api/compounds"]["get"]["parameters"]}
    assert {"temperature", "wl_min", "wl_max", "kind"} <= names
    names = {p["name"] for p in paths["/api/compounds/{formula}"]["get"]["parameters"]}
    assert "temperature" in names
