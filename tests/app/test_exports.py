import csv
import io
import json
import re
import zipfile

import pandas
import pytest
from pymatgen.core import Structure

from app.candidates import Candidate
from app.export_columns import CSV_COLUMNS
from app.exports import neutralise
from screening.alloy_report import alloy_report

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


def read_csv(raw: bytes) -> list[dict[str, str]]:
    """The rows of an exported CSV read by csv.reader with no options (header row first)."""
    lines = list(csv.reader(io.StringIO(raw.decode("utf-8-sig"))))
    return [dict(zip(lines[0], row, strict=True)) for row in lines[1:]]


def half_unit(text: str) -> float:
    """Half a unit in the last written decimal of a number as the CSV writes it."""
    decimals = len(text.split(".")[1]) if "." in text else 0
    return 0.5 * 10.0**-decimals + 1e-12


def test_csv_header_row_first_for_pandas_and_the_csv_module(client, shortlist: str) -> None:
    response = client.get(shortlist + "/export.csv")
    assert response.headers["content-type"].startswith("text/csv")
    assert 'filename="cmd-C-calc-A0.csv"' in response.headers["content-disposition"]
    raw = response.content
    names = [column.name for column in CSV_COLUMNS]
    assert raw.startswith(b"\xef\xbb\xbfposition,formula,")  # BOM, then the header row
    assert raw.split(b"\r\n")[0].decode("utf-8-sig") == ",".join(names)  # CRLF line ends
    first = next(csv.reader(io.StringIO(raw.decode("utf-8-sig"))))
    assert first == names
    frame = pandas.read_csv(io.BytesIO(raw))  # no options: the BOM is skipped, header row 0
    assert list(frame.columns) == names and list(frame["formula"]) == FORMULAS
    for name in ("band_gap_eV", "wavelength_nm", "lattice_constant_angstrom",
                 "mismatch_fraction", "critical_thickness_nm"):
        assert frame[name].dtype.kind in "if", name  # numbers stay numbers
    assert not any(line.startswith(b"#") for line in raw.split(b"\r\n"))


def test_csv_numbers_equal_the_json_export_to_their_stated_precision(client,
                                                                     shortlist: str) -> None:
    rows = read_csv(client.get(shortlist + "/export.csv").content)
    exported = json.loads(client.get(shortlist + "/export.json").text)
    by_formula = {c["formula"]: c for c in exported["candidates"]}
    for row in rows:
        report = by_formula[row["formula"]]["report"]
        layer = by_formula[row["formula"]]["layer"]
        gap = report["band_gap"]
        if gap["value_source"] == "measured":  # as published: to its written decimals
            assert row["band_gap_uncertainty_eV"] == ""
            assert abs(float(row["band_gap_eV"]) - gap["value_eV"]) <= half_unit(
                row["band_gap_eV"])
            assert abs(float(row["wavelength_nm"]) - gap["wavelength_nm"]) <= 0.5
        else:  # to its error bar: within half the rounded uncertainty
            u = float(row["band_gap_uncertainty_eV"])
            assert abs(u - gap["uncertainty_eV"]) <= half_unit(row["band_gap_uncertainty_eV"])
            assert abs(float(row["band_gap_eV"]) - gap["value_eV"]) <= u / 2
        for name, value, unit in [
            ("lattice_constant_angstrom", report["lattice_constant_angstrom"], None),
            ("bond_length_angstrom", report["bond_length_used_angstrom"], 1e-4),
            ("polarity", report["harrison"]["polarity"], 1e-3),
            ("mismatch_fraction", (layer or {}).get("mismatch"), 1e-5),
            ("in_plane_strain", (layer or {}).get("in_plane_strain"), 1e-5),
        ]:
            if value is None:
                assert row[name] == ""
                continue
            tolerance = half_unit(row[name]) if unit is None else unit / 2 + 1e-12
            assert abs(float(row[name]) - value) <= tolerance, name
    gaas, alloy = rows[0], rows[1]
    assert gaas["band_gap_eV"] == "1.424"  # GaAs at 300 K, as published (Ioffe; seed data)
    assert gaas["lattice_constant_angstrom"] == "5.65325"  # as published (seed data)
    assert gaas["band_gap_route"] == "measured" and "Ioffe" in gaas["band_gap_source"]
    assert gaas["lattice_constant_source"] and gaas["eps_inf_source"]
    assert gaas["mismatch_fraction"].startswith("-") and float(gaas["mismatch_fraction"]) < 0
    assert rows[2]["rohs_restricted"] == "Cd" and rows[2]["toxic_elements"] == "Cd Te"
    assert alloy["kind"] == "alloy" and rows[4]["layer_not_computed"].startswith("GaN is")


def test_no_csv_number_is_written_beyond_its_precision(client, shortlist: str) -> None:
    rows = read_csv(client.get(shortlist + "/export.csv").content)
    for row in rows:
        for name in ("ionicity_spectroscopic", "ionicity_predictive", "polarity"):
            assert len(row[name].partition(".")[2]) <= 3, (row["formula"], name)
        assert len(row["mismatch_fraction"].partition(".")[2]) <= 5
        assert not [v for v in row.values() if re.fullmatch(r"-0(\.0*)?", v)]  # no -0.0


def test_alloys_name_their_lattice_and_eps_sources(client, shortlist: str) -> None:
    alloy = read_csv(client.get(shortlist + "/export.csv").content)[1]
    assert alloy["formula"] == "In0.53Ga0.47As"
    assert alloy["lattice_constant_route"].startswith("Vegard")
    assert "Vegard" in alloy["lattice_constant_source"]
    assert "InAs:" in alloy["lattice_constant_source"]
    assert "GaAs:" in alloy["lattice_constant_source"]
    # Virtual-crystal eps_inf: 0.53 * 12.25 (InAs) + 0.47 * 10.89 (GaAs) = 11.6108, to the end
    # points' two decimals (VMR 2001 values of the seed data, from memory).
    assert alloy["eps_inf"] == "11.61"
    assert "virtual-crystal" in alloy["eps_inf_source"] and "InAs:" in alloy["eps_inf_source"]
    # A ternary cites the ternary bowing it uses, not the quaternary (Glisson) scheme.
    assert "Glisson" not in alloy["band_gap_source"]
    assert "Vurgaftman" in alloy["band_gap_source"]


def test_an_alloy_without_a_virtual_crystal_eps_inf_says_so() -> None:
    report = alloy_report("Hg0.7Cd0.3Te")  # HgTe has no measured eps_inf (seed data)
    hgcdte = Candidate("Hg0.7Cd0.3Te", "alloy", "", 1, "", report)
    cells = {column.name: column.get(hgcdte) for column in CSV_COLUMNS}
    assert cells["eps_inf"] == "not available"
    assert cells["eps_inf_source"].startswith("not available: ") and "HgTe" in cells[
        "eps_inf_source"]
    assert "Vegard" in cells["lattice_constant_source"] and "CdTe:" in cells[
        "lattice_constant_source"]


def test_csv_critical_thickness_follows_the_page_rule(client, shortlist: str) -> None:
    client.post(shortlist + "/items", json={"formulas": ["In0.532Ga0.468As"]})
    rows = {r["formula"]: r for r in read_csv(client.get(shortlist + "/export.csv").content)}
    exported = json.loads(client.get(shortlist + "/export.json").text)
    layers = {c["formula"]: c["layer"] for c in exported["candidates"]}
    assert rows["InP"]["critical_thickness"] == "∞"  # InP on InP: exactly matched
    assert rows["InP"]["critical_thickness_nm"] == ""
    assert layers["InP"]["critical_thickness_nm"] is None  # JSON: null, note says matched
    assert "lattice-matched" in layers["InP"]["critical_thickness_note"]
    # In0.532Ga0.468As on InP: |f| ~ 6e-6, h_c tens of um in the JSON, "> 10 µm" in the CSV.
    assert layers["In0.532Ga0.468As"]["critical_thickness_nm"] > 1e4
    assert rows["In0.532Ga0.468As"]["critical_thickness"] == "> 10 µm"
    assert rows["In0.532Ga0.468As"]["critical_thickness_nm"] == ""
    for formula in ("GaAs", "In0.53Ga0.47As"):  # 3.7 % and 0.013 % off InP: a value in nm
        row, h_c = rows[formula], layers[formula]["critical_thickness_nm"]
        assert h_c < 1e4
        assert row["critical_thickness"] == f"{float(row['critical_thickness_nm']):g} nm"
        assert float(row["critical_thickness_nm"]) == pytest.approx(h_c, rel=5e-3)  # 3 digits
    assert rows["GaN"]["critical_thickness"] == rows["GaN"]["critical_thickness_nm"] == ""


def test_zip_holds_the_csv_and_its_readme(client, shortlist: str) -> None:
    response = client.get(shortlist + "/export.zip")
    assert response.headers["content-type"] == "application/zip"
    assert 'filename="cmd-C-calc-A0-csv.zip"' in response.headers["content-disposition"]
    archive = zipfile.ZipFile(io.BytesIO(response.content))
    assert sorted(archive.namelist()) == ["cmd-C-calc-A0-README.txt", "cmd-C-calc-A0.csv"]
    raw = archive.read("cmd-C-calc-A0.csv")
    assert [r["formula"] for r in read_csv(raw)] == FORMULAS
    readme = archive.read("cmd-C-calc-A0-README.txt").decode("utf-8")
    exported = json.loads(client.get(shortlist + "/export.json").text)
    fields = dict(line.split(": ", 1) for line in readme.splitlines()
                  if ": " in line and not line.startswith(" "))
    assert fields["model_version"] == exported["model_version"]
    assert fields["shortlist"] == "=cmd|' /C calc'!A0"  # a text file: shown as typed
    assert fields["substrate"] == "InP" and fields["temperature_K"] == "300"
    assert fields["target"] == "band gap 0.8 eV"
    assert "_eV are in eV" in fields["units"] and "fractions (not percent)" in fields["units"]
    assert fields["mismatch_convention"] == exported["mismatch_convention"]
    assert "*_source" in fields["sources"] and "JCGM 100:2008" in fields["precision"]
    assert "2011/65/EU" in fields["rohs"] and "safety data sheets" in fields["caution"]
    assert "+review" in fields["note"] and "    second line" in readme
    listed = [line.split(":")[0].strip() for line in readme.split("Columns")[1].splitlines()[1:]]
    assert listed == [column.name for column in CSV_COLUMNS]


def test_csv_neutralises_formula_text(client, shortlist: str) -> None:
    rows = read_csv(client.get(shortlist + "/export.csv").content)
    notes = {r["formula"]: r["note"] for r in rows}
    assert notes == {"GaAs": "'=1+1", "InP": "'+33 call", "CdTe": "'-bad", "GaN": "'@SUM(A1)",
                     "In0.53Ga0.47As": "'-0.5 eV off?"}


@pytest.mark.parametrize(
    ("value", "written"),
    [("=A1", "'=A1"), ("+1", "'+1"), ("-1", "'-1"), ("@x", "'@x"), ("\tx", "'\tx"),
     ("\rx", "'\rx"), ("\nx", "'\nx"), ("plain", "plain"), ("a=b", "a=b"), ("", ""),
     # Forms a spreadsheet also takes for a formula (the findings): fullwidth signs,
     # and invisible characters before one.
     ("\uff1dA1", "'\uff1dA1"), ("\uff0b1", "'\uff0b1"), ("\uff0d1", "'\uff0d1"),
     ("\uff20x", "'\uff20x"), ("\ufe66A1", "'\ufe66A1"), ("\u2212 1", "'\u2212 1"),
     ("\u200b=A1", "'\u200b=A1"), ("\u200b\u200b\uff1dA1", "'\u200b\u200b\uff1dA1"),
     ("\ufeff=A1", "'\ufeff=A1"), ("\u2060=A1", "'\u2060=A1"), ("\u202e=A1", "'\u202e=A1"),
     ("\u00a0+1", "'\u00a0+1"), ("  =A1", "'  =A1"), ("\u200bplain", "\u200bplain"),
     ("\uff21", "\uff21"),  # a fullwidth letter is text
     (-0.5, -0.5), (2, 2), (None, ""), (float("inf"), ""), (True, "true")],
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


def test_a_compound_never_measured_exports_its_estimated_lattice_constant(client) -> None:
    made = client.post("/api/shortlists", json={"name": "never measured"}).json()
    url = f"/api/shortlists/{made['id']}"
    client.post(url + "/items", json={"formulas": ["BSb", "GaAs"]})
    rows = {r["formula"]: r for r in read_csv(client.get(url + "/export.csv").content)}
    report = client.get("/api/compounds/BSb").json()
    assert report["lattice_constant_source"] == "estimate"
    bsb = rows["BSb"]
    assert bsb["lattice_constant_route"] == "estimate"
    assert bsb["lattice_constant_source"] == report["lattice_estimate"]["route"]
    u = float(bsb["lattice_constant_uncertainty_angstrom"])
    # Zincblende geometry: a = 4 d / sqrt(3) for bond length d (a derived identity).
    d = report["bond_length_used_angstrom"]
    assert abs(float(bsb["lattice_constant_angstrom"]) - 4 * d / 3**0.5) <= u / 2
    assert rows["GaAs"]["lattice_constant_route"] == "measured"
    assert rows["GaAs"]["lattice_constant_uncertainty_angstrom"] == ""
