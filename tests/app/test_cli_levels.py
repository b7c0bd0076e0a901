"""`bondgap levels`: text and JSON output, and one-line errors for unknown symbols."""

from __future__ import annotations

import json
import subprocess
import sys

import pytest

from app.cli import main
from screening.atoms import atom_levels


def test_json_lists_configuration_and_valence_levels(capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["levels", "Zn", "Ga", "--json"]) == 0
    payload = json.loads(capsys.readouterr().out)
    assert [item["element"] for item in payload] == ["Zn", "Ga"]
    zn = payload[0]
    assert zn["configuration"] == "[Ar] 3d10 4s2"
    assert [(lv["orbital"], lv["occupation"]) for lv in zn["levels"]] == [("4s", 2.0), ("4p", 0.0)]
    assert zn["levels"][0]["energy_eV"] == atom_levels("Zn").level("4s").energy_eV
    assert zn["levels"][0]["energy_eV"] < zn["levels"][1]["energy_eV"] < 0
    assert set(zn) == {"element", "configuration", "levels", "spin_orbit_splitting_eV",
                       "lowest_d"}
    assert zn["lowest_d"]["orbital"] == "3d" and zn["lowest_d"]["occupation"] == 10
    assert set(zn["levels"][0]) == {
        "orbital", "occupation", "energy_eV", "scalar_relativistic_energy_eV"
    }
    # The scalar-relativistic level and the valence p spin-orbit splitting come from the
    # relativistic table.
    zn_sr = atom_levels("Zn", relativistic=True)
    assert zn["levels"][0]["scalar_relativistic_energy_eV"] == zn_sr.level("4s").energy_eV
    assert zn["spin_orbit_splitting_eV"] == zn_sr.spin_orbit_splitting_eV
    assert [lv["orbital"] for lv in payload[1]["levels"]] == ["4s", "4p"]


def test_json_all_includes_core_levels(capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["levels", "--all", "--json", "Ga"]) == 0
    levels = json.loads(capsys.readouterr().out)[0]["levels"]
    assert [lv["orbital"] for lv in levels] == ["1s", "2s", "2p", "3s", "3p", "3d", "4s", "4p"]


def test_text_output(capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["levels", "cd", "H"]) == 0
    out = capsys.readouterr().out.splitlines()
    assert out[0] == "Cd (Z = 48)  [Kr] 4d10 5s2"
    assert out[1].split()[:3] == ["5s", "occupation", "2"]
    assert out[2].split()[:3] == ["5p", "occupation", "0"] and "(unoccupied)" in out[2]
    assert f"{atom_levels('Cd').level('5s').energy_eV:.4f} eV" in out[1]
    cd_sr = atom_levels("Cd", relativistic=True)
    assert f"SR {cd_sr.level('5s').energy_eV:.4f} eV" in " ".join(out[1].split())
    assert f"spin-orbit {cd_sr.spin_orbit_splitting_eV:.4f} eV" in out[2]
    assert out[3] == "H (Z = 1)  1s1"
    assert "not bound" in out[5] and "spin-orbit" not in out[5]


def test_unknown_symbol_exits_2_with_one_line(capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["levels", "Zn", "Xx"]) == 2
    captured = capsys.readouterr()
    assert captured.out == ""  # nothing printed for the valid symbol either
    lines = captured.err.strip().splitlines()
    assert len(lines) == 1 and "Xx" in lines[0] and "Z = 1..86" in lines[0]


def test_subprocess_unknown_symbol_has_no_traceback() -> None:
    result = subprocess.run(
        [sys.executable, "-m", "app", "levels", "Uuo"], capture_output=True, text=True
    )
    assert result.returncode == 2
    assert result.stdout == ""
    assert result.stderr.count("\n") == 1 and "Traceback" not in result.stderr
    assert result.stderr.startswith("bondgap: error: unknown element 'Uuo'")


def test_subprocess_json() -> None:
    result = subprocess.run(
        [sys.executable, "-m", "app", "levels", "Hg", "--json"],
        capture_output=True,
        text=True,
        check=True,
    )
    payload = json.loads(result.stdout)
    assert payload[0]["element"] == "Hg"
    assert [lv["orbital"] for lv in payload[0]["levels"]] == ["6s", "6p"]


def test_levels_show_the_lowest_empty_d_of_an_alkaline_earth(capsys) -> None:
    # Ba: 6s2 ground state; its empty 5d lies between 6s and the vacuum (the 6s5d excited
    # configurations lie about 1.1 eV up, NIST ASD, from memory).
    assert main(["levels", "Ba", "--json"]) == 0
    ba = json.loads(capsys.readouterr().out)[0]
    d = ba["lowest_d"]
    assert d["orbital"] == "5d" and d["occupation"] == 0
    assert ba["levels"][0]["energy_eV"] < d["energy_eV"] < 0
    assert main(["levels", "K"]) == 0  # K's 3d is not bound in LDA: no d line
    assert "3d" not in capsys.readouterr().out
