import csv
import io
import json
from pathlib import Path

import pytest
from pymatgen.core import Structure

from app.cli import main


def run(capsys, db: Path, *argv: str) -> tuple[int, str, str]:
    code = main([*argv, "--db", str(db)])
    out, err = capsys.readouterr()
    return code, out, err


def test_create_add_note_list_export_without_the_browser(db_path: Path, tmp_path: Path,
                                                         capsys) -> None:
    assert run(capsys, db_path, "shortlist", "create", "Laser", "--note", "1.55 um",
               "--on", "InP", "--target-wavelength", "1550")[0] == 0
    code, out, _ = run(capsys, db_path, "shortlist", "add", "laser", "InP", "In0.53Ga0.47As",
                       "PIn", "--note", "matched")
    assert code == 0 and out.strip() == "added InP, In0.53Ga0.47As"
    assert run(capsys, db_path, "shortlist", "note", "Laser", "InP", "=1+2")[0] == 0
    code, out, _ = run(capsys, db_path, "shortlist", "list", "Laser", "--json")
    data = json.loads(out)
    assert data["conditions"]["substrate"] == "InP"
    assert [(i["formula"], i["note"]) for i in data["items"]] == [
        ("InP", "=1+2"), ("In0.53Ga0.47As", "matched")]
    code, out, _ = run(capsys, db_path, "shortlist", "list")
    assert out.strip() == "Laser  (2 candidates)"
    target = tmp_path / "laser.csv"
    code, out, _ = run(capsys, db_path, "shortlist", "export", "Laser", "--csv", str(target))
    readme = tmp_path / "laser-README.txt"  # the sidecar, beside the CSV and named in the output
    assert code == 0 and f"wrote {target}" in out and f"wrote {readme}" in out
    rows = list(csv.reader(io.StringIO(target.read_text(encoding="utf-8-sig"))))
    assert rows[0][:2] == ["position", "formula"]  # the header row first
    table = [dict(zip(rows[0], r, strict=True)) for r in rows[1:]]
    assert [(r["formula"], r["note"]) for r in table] == [("InP", "'=1+2"),
                                                          ("In0.53Ga0.47As", "matched")]
    about = readme.read_text(encoding="utf-8")
    assert "shortlist: Laser" in about and "substrate: InP" in about
    assert "target: wavelength 1550 nm" in about and "  band_gap_eV: " in about
    code, out, _ = run(capsys, db_path, "shortlist", "export", "Laser", "--csv")
    assert code == 0 and out.startswith("\ufeffposition,formula,")  # stdout: the CSV alone
    code, out, _ = run(capsys, db_path, "shortlist", "export", "Laser", "--json")
    assert json.loads(out)["candidates"][0]["report"]["formula"] == "InP"
    folder = tmp_path / "cells"
    code, out, _ = run(capsys, db_path, "shortlist", "export", "Laser", "--cif", str(folder))
    assert code == 0
    assert sorted(p.name for p in folder.iterdir()) == [
        "In0.53Ga0.47As.cif", "InP.POSCAR", "InP.cif", "README.txt"]
    inp = Structure.from_file(folder / "InP.cif")
    assert inp.lattice.a == pytest.approx(5.8687, abs=1e-6)  # InP a (Ioffe; seed data)
    code, out, _ = run(capsys, db_path, "shortlist", "compare", "Laser")
    assert code == 0 and "Mismatch on the substrate (%)" in out and "*" in out


def test_rename_set_remove_and_delete(db_path: Path, capsys) -> None:
    run(capsys, db_path, "shortlist", "create", "A")
    run(capsys, db_path, "shortlist", "add", "A", "GaAs", "InP")
    assert run(capsys, db_path, "shortlist", "rename", "A", "B")[0] == 0
    assert run(capsys, db_path, "shortlist", "set", "B", "--temperature", "77",
               "--note", "cold")[0] == 0
    assert run(capsys, db_path, "shortlist", "remove", "B", "AsGa")[0] == 0
    data = json.loads(run(capsys, db_path, "shortlist", "list", "B", "--json")[1])
    assert data["note"] == "cold" and data["conditions"]["temperature_K"] == 77.0
    assert [i["formula"] for i in data["items"]] == ["InP"]
    code, _, err = run(capsys, db_path, "shortlist", "delete", "B")
    assert code == 2 and err.strip() == "bondgap: error: deleting 'B' needs --yes"
    assert run(capsys, db_path, "shortlist", "delete", "B", "--yes")[0] == 0
    assert run(capsys, db_path, "shortlist", "list")[1].startswith("no shortlists yet")


@pytest.mark.parametrize(
    ("argv", "words"),
    [
        (["shortlist", "add", "Nope", "GaAs"], "no shortlist with name 'Nope'"),
        (["shortlist", "create", "X", "--on", "Mars"], "unknown substrate 'Mars'"),
        (["shortlist", "create", "X", "--temperature", "-5"], "temperature"),
        (["shortlist", "export", "Nope", "--csv"], "no shortlist"),
        (["shortlist", "import-measurements", "/no/such/file.csv"], "cannot read"),
    ],
)
def test_bad_input_exits_2_with_one_line(db_path: Path, capsys, argv, words) -> None:
    code, out, err = run(capsys, db_path, *argv)
    assert code == 2 and words in err and len(err.strip().splitlines()) == 1


def test_import_measurements_all_or_nothing(db_path: Path, tmp_path: Path, capsys) -> None:
    bad = tmp_path / "bad.csv"
    bad.write_text("formula,property,value,unit,source\nGaAs,band_gap,1.4,eV,a\n"
                   "GaAs,lattice_a,five,angstrom,b\n")
    code, _, err = run(capsys, db_path, "shortlist", "import-measurements", str(bad))
    assert code == 2 and "line 3, column value:" in err
    assert "must be a number" in err and "'five'" in err
    big = tmp_path / "big.csv"
    big.write_bytes(b"x" * 10_000_000)
    code, _, err = run(capsys, db_path, "shortlist", "import-measurements", str(big))
    assert code == 2 and "limit is 1 MB" in err
    good = tmp_path / "good.csv"
    good.write_text("formula,property,value,unit,source\nGaAs,band_gap,1.43,eV,PL\n")
    code, out, _ = run(capsys, db_path, "shortlist", "import-measurements", str(good))
    assert code == 0 and out.startswith("imported 1 value(s)")
