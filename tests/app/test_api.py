import csv
import io
import sqlite3

import pytest
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

from app.columns import COLUMNS_BY_KEY
from screening.catalogue import catalogue_formulas
from screening.report import compound_report

BAD_FORMULAS = ["Xx", "GaAs2", "NaCl3", "", "A" * 500, "Ga As", "<script>", "GaAs'; --"]


def test_list_returns_every_compound_with_columns(client) -> None:
    body = client.get("/api/compounds").json()
    assert body["count"] == len(catalogue_formulas()) == len(body["rows"])
    assert [c["key"] for c in body["columns"]] == list(COLUMNS_BY_KEY)
    assert set(body["rows"][0]) == {*COLUMNS_BY_KEY, "hazard_elements", "rohs_restricted"}
    assert body["model_version"]


def test_list_filters_and_sorts(client) -> None:
    params = {"family": "ii-vi", "sort": "ionicity_predictive", "desc": "true"}
    body = client.get("/api/compounds", params=params).json()
    assert body["query"] == {"family": "II-VI", "sort": "ionicity_predictive", "desc": True}
    assert body["rows"] and {r["family"] for r in body["rows"]} == {"II-VI"}
    values = [r["ionicity_predictive"] for r in body["rows"]]
    values = [v for v in values if v is not None]
    assert values == sorted(values, reverse=True)


def test_gap_window_and_measured_only(client) -> None:
    rows = client.get("/api/compounds", params={"gap_min": "1", "gap_max": "2.5"}).json()["rows"]
    assert rows and all(1 <= r["band_gap_eV"] <= 2.5 for r in rows)
    assert {r["band_gap_source"] for r in rows} == {"measured", "estimate"}
    measured = client.get("/api/compounds", params={"measured_only": "true"}).json()["rows"]
    assert measured and all(r["band_gap_measured_eV"] is not None for r in measured)
    assert {r["band_gap_source"] for r in measured} == {"measured"}
    both = {"measured_only": "true", "gap_min": "1", "gap_max": "2.5"}
    rows = client.get("/api/compounds", params=both).json()["rows"]
    assert rows and all(1 <= r["band_gap_measured_eV"] <= 2.5 for r in rows)


def test_csv_has_the_same_rows_as_json(client) -> None:
    params = {"family": "III-V", "sort": "lattice_constant_angstrom"}
    rows = client.get("/api/compounds", params=params).json()["rows"]
    response = client.get("/api/compounds.csv", params=params)
    assert response.headers["content-type"].startswith("text/csv")
    parsed = list(csv.DictReader(io.StringIO(response.text)))
    assert [r["formula"] for r in parsed] == [r["formula"] for r in rows]
    for got, want in zip(parsed, rows, strict=True):
        for key, value in want.items():
            if key in ("hazard_elements", "rohs_restricted"):
                assert got[key].split() == value
            elif value is None:
                assert got[key] == ""
            elif isinstance(value, float):
                assert float(got[key]) == value
            else:
                assert got[key] == str(value)


def test_compound_is_the_engine_report(client) -> None:
    body = client.get("/api/compounds/GaAs").json()
    assert body == compound_report("GaAs")
    assert client.get("/api/compounds/AsGa").json() == body


@pytest.mark.parametrize("formula", BAD_FORMULAS)
def test_bad_formula_gets_400_with_a_message(client, formula: str) -> None:
    response = client.get(f"/api/compounds/{formula}")
    assert response.status_code == 400
    detail = response.json()["detail"]
    assert isinstance(detail, str) and 10 < len(detail) < 300
    assert "Traceback" not in detail


@pytest.mark.parametrize(
    ("params", "status", "fragment"),
    [
        ({"sort": "bogus"}, 400, "cannot sort by 'bogus'"),
        ({"sort": "report_json"}, 400, "cannot sort by"),
        ({"family": "V-V"}, 400, "unknown family"),
        ({"structure": "cubic"}, 400, "unknown structure"),
        ({"gap_min": "abc"}, 400, "gap-min"),
        ({"gap_min": "3", "gap_max": "1"}, 400, "empty gap window"),
        ({"desc": "maybe"}, 422, "desc"),
        ({"measured_only": "perhaps"}, 422, "measured_only"),
    ],
)
def test_bad_table_parameters_get_4xx_with_one_line(client, params, status, fragment) -> None:
    response = client.get("/api/compounds", params=params)
    assert response.status_code == status
    detail = response.json()["detail"]
    assert isinstance(detail, str) and fragment in detail and "\n" not in detail


def test_injection_attempts_leave_the_store_intact(client, db_path) -> None:
    for value in ["II-VI'; DROP TABLE compound_results; --", "1 OR 1=1"]:
        assert client.get("/api/compounds", params={"family": value}).status_code == 400
        assert client.get("/api/compounds", params={"sort": value}).status_code == 400
        assert client.get(f"/api/compounds/{value}").status_code == 400
    with sqlite3.connect(db_path) as conn:
        count = conn.execute("SELECT count(*) FROM compound_results").fetchone()[0]
    assert count == len(catalogue_formulas())


def test_unknown_api_path_is_404_json(client) -> None:
    response = client.get("/api/nothing-here")
    assert response.status_code == 404
    assert "nothing at /api/nothing-here" in response.json()["detail"]


def test_status_reports_versions(client) -> None:
    body = client.get("/api/status").json()
    assert body["model_version"] == body["stored_model_version"]
    assert body["compounds"] == len(catalogue_formulas())


def test_openapi_document_and_offline_docs_page(client) -> None:
    spec = client.get("/api/openapi.json").json()
    assert {"/api/compounds", "/api/compounds/{formula}", "/api/compounds.csv"} <= set(
        spec["paths"]
    )
    page = client.get("/api/docs")
    assert page.status_code == 200 and "/api/compounds" in page.text
    assert client.get("/docs").status_code == 404  # the CDN-based stock page is off


def test_plotly_is_served_from_the_installed_package_only(client, settings) -> None:
    response = client.get("/vendor/plotly.min.js")
    assert response.status_code == 200
    assert len(response.content) == settings.plotly_js.stat().st_size
    others = ["/vendor/plotly.js", "/vendor/package_data/plotly.min.js", "/static/../app/store.py"]
    for path in others:
        assert client.get(path).status_code == 404


@settings(
    max_examples=60,
    deadline=None,
    database=None,
    suppress_health_check=[HealthCheck.function_scoped_fixture],
)
@given(text=st.text(st.characters(exclude_categories=("Cs", "Cc")), max_size=40))
def test_any_formula_text_gets_200_or_400(client, text: str) -> None:
    formula = text.replace("/", "").replace("?", "").replace("#", "")
    # "." and ".." are dot segments of the URL path (RFC 3986 section 5.2.4), not formula text:
    # the client resolves them before sending, to /api/compounds itself.
    assume(formula not in (".", ".."))
    response = client.get("/api/compounds/" + formula)
    assert response.status_code in (200, 400, 404)
    assert isinstance(response.json()["detail" if response.status_code != 200 else "formula"], str)
