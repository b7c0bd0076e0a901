import csv
import io
import json
from pathlib import Path

import pytest

from app.cli import main

LABELS = ["L", "Γ", "X", "W", "K", "Γ"]


def run(capsys, *argv: str) -> tuple[int, str, str]:
    code = main(list(argv))
    out, err = capsys.readouterr()
    return code, out, err


def test_show_json_at_a_temperature_is_the_api_object(client, db_path: Path, capsys) -> None:
    code, out, _ = run(capsys, "show", "GaAs", "--json", "--temperature", "77",
                       "--db", str(db_path))
    assert code == 0
    shown = json.loads(out)
    assert shown == client.get("/api/compounds/GaAs", params={"temperature": "77"}).json()
    gap = shown["band_gap"]
    assert gap["temperature_K"] == 77.0 and gap["measured_eV"] > 1.424
    for key in ("estimate_eV", "uncertainty_eV", "cross_validated_eV", "kind", "wavelength_nm"):
        assert gap[key] is not None
    assert isinstance(shown["tight_binding"]["direct"], bool)


def test_show_text_has_the_band_gap_block(db_path: Path, capsys) -> None:
    code, out, _ = run(capsys, "show", "GaBi", "--temperature", "500", "--db", str(db_path))
    assert code == 0
    assert "Band gap at 500 K" in out and "±" in out and " nm)" in out
    assert "Band edges of the sp3 model" in out and "spin-orbit" in out


def test_list_at_a_temperature_matches_the_api(client, db_path: Path, capsys) -> None:
    args = ["--temperature", "350", "--gap-min", "1.8", "--gap-max", "2.3", "--kind", "direct",
            "--wl-max", "700"]
    code, out, _ = run(capsys, "list", *args, "--json", "--db", str(db_path))
    assert code == 0
    params = {"temperature": "350", "gap_min": "1.8", "gap_max": "2.3", "kind": "direct",
              "wl_max": "700"}
    assert json.loads(out) == client.get("/api/compounds", params=params).json()
    code, out, _ = run(capsys, "list", *args, "--csv", "--db", str(db_path))
    assert out == client.get("/api/compounds.csv", params=params).text
    code, out, _ = run(capsys, "list", "--temperature", "77", "--db", str(db_path))
    assert code == 0 and "Band gap (eV)" in out.splitlines()[0] and " est." in out


@pytest.mark.parametrize(
    "args",
    [
        ["show", "GaAs", "--temperature", "-1"],
        ["show", "GaAs", "--temperature", "warm"],
        ["list", "--temperature", "2001"],
        ["list", "--wl-min", "-400"],
        ["list", "--wl-min", "800", "--wl-max", "400"],
        ["list", "--kind", "sideways"],
        ["bands", "GaAs", "--points", "2"],
        ["bands", "GaAs", "--points", "many"],
        ["bands", "GaAs2"],
    ],
)
def test_bad_gap_input_exits_2_with_one_line(db_path: Path, capsys, args) -> None:
    code, out, err = run(capsys, *args, *(["--db", str(db_path)] if args[0] != "bands" else []))
    assert code == 2 and out == ""
    assert err.startswith("bondgap: error: ") and err.count("\n") == 1


def parse_bands_csv(text: str) -> tuple[list[str], list[dict[str, str]]]:
    lines = text.splitlines()
    header = [line for line in lines if line.startswith("#")]
    body = [line for line in lines if not line.startswith("#")]
    assert lines[: len(header)] == header  # comment lines come first
    return header, list(csv.DictReader(io.StringIO("\n".join(body))))


def test_bands_csv_parses_back(capsys) -> None:
    code, out, _ = run(capsys, "bands", "AsGa", "--csv", "--points", "60")
    assert code == 0
    header, rows = parse_bands_csv(out)
    assert any("eV relative to the valence-band top" in line for line in header)
    assert any("2π/a" in line for line in header)
    assert any("spin-orbit" in line for line in header)
    assert len(rows) == 60
    assert list(rows[0]) == ["distance", "kx", "ky", "kz", "label",
                             *(f"band{i}" for i in range(1, 9))]
    assert [r["label"] for r in rows if r["label"]] == LABELS
    energies = [[float(r[f"band{i}"]) for i in range(1, 9)] for r in rows]
    assert max(e[3] for e in energies) == 0.0
    assert min(e[4] for e in energies) > 0  # GaAs has a gap in the model
    distances = [float(r["distance"]) for r in rows]
    assert distances == sorted(distances) and distances[0] == 0.0


def test_bands_json_is_the_api_object_and_text_has_units(client, capsys) -> None:
    code, out, _ = run(capsys, "bands", "Si", "--json", "--points", "20")
    assert code == 0
    assert json.loads(out) == client.get("/api/compounds/Si/bands?points=20").json()
    code, out, _ = run(capsys, "bands", "Si", "--points", "20")
    lines = out.splitlines()
    assert lines[0].startswith("# Si: bands of the sp3")
    table = [line for line in lines if not line.startswith("#")]
    assert table[0].split() == ["distance", "kx", "ky", "kz", "label",
                                *(f"band{i}" for i in range(1, 9))]
    assert len(table) == 21 and "indirect" in out
