"""`bondgap show ALLOY` and `GET /api/compounds/ALLOY`: the compound keys, identity, errors."""

import json
from pathlib import Path

import pytest

from app.cli import main


def run(capsys, *argv: str) -> tuple[int, str, str]:
    code = main(list(argv))
    out, err = capsys.readouterr()
    return code, out, err


def test_show_alloy_json_has_the_compound_keys(client, db_path: Path, capsys) -> None:
    code, out, _ = run(capsys, "show", "In0.53Ga0.47As", "--json", "--db", str(db_path))
    assert code == 0
    alloy = json.loads(out)
    compound = client.get("/api/compounds/GaAs").json()
    assert set(compound) <= set(alloy)
    assert {"alloy", "fractions", "end_points", "flags", "lattice_constant_angstrom"} <= set(alloy)
    assert alloy["lattice_constant_angstrom"] == pytest.approx(5.8679265)
    assert set(compound["phillips"]) <= set(alloy["phillips"])
    assert set(compound["hazards"]) <= set(alloy["hazards"])
    assert alloy == client.get("/api/compounds/In0.53Ga0.47As").json()


def test_show_alloy_any_order_temperature_and_substrate(client, db_path: Path, capsys) -> None:
    code, out, _ = run(capsys, "show", "GaAs0.51Sb0.49", "--json", "--temperature", "77",
                       "--on", "InP", "--geometry", "capped-well", "--db", str(db_path))
    assert code == 0
    report = json.loads(out)
    params = {"temperature": "77", "on": "InP", "geometry": "capped-well"}
    assert report == client.get("/api/compounds/GaAs0.51Sb0.49", params=params).json()
    assert report["band_gap"]["temperature_K"] == 77.0
    assert report["epitaxy"]["geometry"]["name"] == "capped-well"
    assert abs(report["epitaxy"]["mismatch"]) < 2e-3  # GaAs0.51Sb0.49 is nearly matched to InP


def test_show_alloy_text(db_path: Path, capsys) -> None:
    code, out, _ = run(capsys, "show", "In0.73Ga0.27As0.58P0.42", "--on", "InP", "--db",
                       str(db_path))
    assert code == 0
    assert out.startswith("In0.73Ga0.27As0.58P0.42  (III-V; cation In0.73Ga0.27")
    assert "Mismatch f" in out and "Critical thickness h_c" in out
    assert "in the virtual crystal" in out and "Caution: contains As" in out


def test_show_binary_on_a_substrate(client) -> None:
    report = client.get("/api/compounds/GaAs", params={"on": "InP"}).json()
    assert report["epitaxy"]["mismatch"] == pytest.approx((5.65325 - 5.8687) / 5.8687)
    assert "alloy" not in report


@pytest.mark.parametrize(
    ("formula", "words"),
    [("In0.6Ga0.6As", "sum to 1.2"), ("In1.5Ga0As", "lie in [0, 1]"),
     ("In0.5Zn0.5As", "mixes sublattices"), ("GaAs0.5N0.5", "mixes crystal structures")],
)
def test_show_bad_alloy_exits_2(db_path: Path, capsys, formula: str, words: str) -> None:
    code, out, err = run(capsys, "show", formula, "--db", str(db_path))
    assert code == 2 and out == ""
    assert err.startswith("bondgap: error: ") and err.count("\n") == 1 and words in err


def test_show_on_unknown_substrate_exits_2(db_path: Path, capsys) -> None:
    code, _, err = run(capsys, "show", "In0.53Ga0.47As", "--on", "Unobtainium", "--db",
                       str(db_path))
    assert code == 2 and "unknown substrate 'Unobtainium'" in err
