import csv
import io
import json
import zipfile

import pytest
from pymatgen.core import Structure

from app.exports import CSV_COLUMNS, neutralise

pytestmark = pytest.mark.filterwarnings(  # pymatgen rounds 0.33333333 to 1/3 when reading
    "ignore:Issues encountered while parsing CIF.*rounded to ideal values:UserWarning"
)
FORMULAS = ["GaAs", "In0.53Ga0.47As", "CdTe", "InP", "GaN"]


@pytest.fixture
def shortlist(client) -> str:
    made = client.post("/api/shortlists", json={
        "name": "=cmd|' /C calc'!A0", "note": "+review, \"quoted\"\nsecond line",
        "substrate": "InP", "temperature_K": 300, "target_gap_eV": 0.8}).json()
    url = f"/api/shortlists/{made['id']}"
    client.post(url + "/items", json={"formulas": FORMULAS})
    for formula, note in [("GaAs", "=1+1"), ("InP", "+33 call"), ("CdTe", "-bad"),
                          ("GaN", "@SUM(A1)"), ("In0.53Ga0.47As", "-0.5 eV off?")]:
        client.patch(f"{url}/items/{formula}", json={"note": note})
    return url


def read_csv(text: str) -> tuple[dict[str, str], list[dict[str, str]]]:
    lines = list(csv.reader(io.StringIO(text)))
    header = {row[0][2:]: row[1] for row in lines if row[0].startswith("# ") and len(row) == 2}
    table = [row for row in lines if not row[0].startswith("#")]
    return header, [dict(zip(table[0], row, strict=True)) for row in table[1:]]


def test_csv_parses_back_to_the_same_numbers_and_units(client, shortlist: str) -> None:
    response = client.get(shortlist + "/export.csv")
    assert response.headers["content-type"].startswith("text/csv")
    assert 'filename="cmd-C-calc-A0.csv"' in response.headers["content-disposition"]
    raw = response.content
    assert raw.startswith(b"\xef\xbb\xbf# bondgap shortlist export\r\n")  # BOM, CRLF
    header, rows = read_csv(raw.decode("utf-8-sig"))
    exported = json.loads(client.get(shortlist + "/export.json").text)
    assert header["model_version"] == exported["model_version"]
    assert header["temperature_K"] == "300.0" and header["substrate"] == "InP"
    assert header["target"] == "band gap 0.8 eV"
    assert "_eV are in eV" in header["units"] and "fractions (not percent)" in header["units"]
    assert "2011/65/EU" in header["rohs"] and "safety data sheets" in header["caution"]
    assert [r["formula"] for r in rows] == FORMULAS
    assert list(rows[0]) == [name for name, _ in CSV_COLUMNS]
    by_formula = {c["formula"]: c for c in exported["candidates"]}
    for row in rows:
        report = by_formula[row["formula"]]["report"]
        layer = by_formula[row["formula"]]["layer"]
        assert float(row["band_gap_eV"]) == report["band_gap"]["value_eV"]
        assert float(row["lattice_constant_angstrom"]) == report["lattice_constant_angstrom"]
        assert float(row["bond_length_angstrom"]) == report["bond_length_used_angstrom"]
        assert float(row["wavelength_nm"]) == report["band_gap"]["wavelength_nm"]
        if layer:
            assert float(row["mismatch_fraction"]) == layer["mismatch"]
    gaas = rows[0]
    assert gaas["band_gap_route"] == "measured" and "Ioffe" in gaas["band_gap_source"]
    assert gaas["lattice_constant_source"] and gaas["eps_inf_source"]
    assert gaas["mismatch_fraction"].startswith("-")  # a negative number stays a number
    assert float(gaas["mismatch_fraction"]) < 0
    assert rows[2]["rohs_restricted"] == "Cd" and rows[2]["toxic_elements"] == "Cd Te"
    assert rows[1]["kind"] == "alloy" and rows[4]["layer_not_computed"].startswith("GaN is")


def test_csv_neutralises_formula_text(client, shortlist: str) -> None:
    header, rows = read_csv(client.get(shortlist + "/export.csv").content.decode("utf-8-sig"))
    notes = {r["formula"]: r["note"] for r in rows}
    assert notes == {"GaAs": "'=1+1", "InP": "'+33 call", "CdTe": "'-bad", "GaN": "'@SUM(A1)",
                     "In0.53Ga0.47As": "'-0.5 eV off?"}
    assert header["shortlist"] == "'=cmd|' /C calc'!A0"
    assert header["note"] == "'+review, \"quoted\"\nsecond line"


@pytest.mark.parametrize(
    ("value", "written"),
    [("=A1", "'=A1"), ("+1", "'+1"), ("-1", "'-1"), ("@x", "'@x"), ("\tx", "'\tx"),
     ("\rx", "'\rx"), ("plain", "plain"), (-0.5, -0.5), (2, 2), (None, ""),
     (float("inf"), ""), (True, "true")],
)
def test_neutralise(value, written) -> None:
    assert neutralise(value) == written


def test_json_has_conditions_and_full_reports(client, shortlist: str) -> None:
    body = json.loads(client.get(shortlist + "/export.json").text)
    assert body["conditions"]["substrate"] == "InP"
    assert body["shortlist"]["note"].startswith("+review")
    gaas = body["candidates"][0]
    assert gaas["report"] == client.get("/api/compounds/GaAs").json()
    assert gaas["hazards"]["toxic_elements"] == ["As"] and gaas["note"] == "=1+1"
    assert "2015/863" in body["rohs_source"]


def test_cells_zip_parses_back_with_the_engine_lattice_and_bond(client, shortlist: str) -> None:
    reports = {c["formula"]: c["report"] for c in
               json.loads(client.get(shortlist + "/export.json").text)["candidates"]}
    archive = zipfile.ZipFile(io.BytesIO(client.get(shortlist + "/cells.zip").content))
    names = set(archive.namelist())
    assert "In0.53Ga0.47As.cif" in names and "In0.53Ga0.47As.POSCAR" not in names
    assert {"GaAs.cif", "GaAs.POSCAR", "GaN.POSCAR", "README.txt"} <= names
    for formula, report in reports.items():
        text = archive.read(f"{formula}.cif").decode()
        structure = Structure.from_str(text, fmt="cif")
        assert structure.lattice.a == pytest.approx(report["lattice_constant_angstrom"], abs=1e-6)
        bond = min(n.nn_distance for n in structure.get_neighbors(structure[0], 4.0))
        if report.get("alloy"):
            assert "VIRTUAL-CRYSTAL" in text.splitlines()[0]
        else:
            assert bond == pytest.approx(report["bond_length_used_angstrom"], abs=1e-4)
            poscar = Structure.from_str(archive.read(f"{formula}.POSCAR").decode(), fmt="poscar")
            assert poscar.lattice.a == pytest.approx(structure.lattice.a, abs=1e-6)
    assert "virtual-crystal" in archive.read("README.txt").decode()
