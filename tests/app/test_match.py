"""The composition finder through the API and the CLI: keys, identity, bad input, empty results."""

import json
from pathlib import Path

import pytest

from app.cli import main

MATCH_KEYS = {"formula", "fractions", "lattice_constant_angstrom", "mismatch", "band_gap_eV",
              "band_gap_uncertainty_eV", "critical_thickness_nm"}
INGAASP = {"system": "InGaAsP", "on": "InP", "wavelength": "1550", "max_mismatch": "0.001"}


def run(capsys, *argv: str) -> tuple[int, str, str]:
    code = main(list(argv))
    out, err = capsys.readouterr()
    return code, out, err


def test_api_match_keys_and_best_composition(client) -> None:
    response = client.get("/api/match", params=INGAASP)
    assert response.status_code == 200
    payload = response.json()
    assert payload["count"] == len(payload["matches"]) > 0
    assert all(MATCH_KEYS <= set(m) for m in payload["matches"])
    best = payload["matches"][0]
    # In(1-x)Ga(x)As(y)P(1-y) lattice-matched to InP with Eg = hc/1550 nm = 0.80 eV:
    # about In0.57Ga0.43As0.93P0.07 (Nahory et al., Appl. Phys. Lett. 33, 659 (1978); from memory)
    assert best["fractions"]["In"] == pytest.approx(0.565, abs=0.01)
    assert best["fractions"]["As"] == pytest.approx(0.93, abs=0.01)
    assert sum(v for k, v in best["fractions"].items() if k in ("In", "Ga")) == pytest.approx(1)
    assert best["mismatch"] == pytest.approx(0.0, abs=1e-9)
    assert best["band_gap_eV"] == pytest.approx(1239.84 / 1550, abs=1e-3)
    assert best["critical_thickness_nm"] is None and best["lattice_matched"] is True
    assert all(abs(m["mismatch"]) <= 0.001 + 1e-12 for m in payload["matches"])
    assert payload["mismatch_convention"].startswith("f = (a_layer - a_substrate) / a_substrate")
    assert payload["query"]["system"] == "InGaAsP" and payload["message"] is None


def test_cli_match_json_is_the_api_object(client, db_path: Path, capsys) -> None:
    code, out, _ = run(capsys, "match", "InGaAsP", "--on", "InP", "--wavelength", "1550",
                       "--max-mismatch", "0.001", "--json", "--db", str(db_path))
    assert code == 0
    printed = json.loads(out)
    assert set(printed["matches"][0]) >= MATCH_KEYS
    assert printed == client.get("/api/match", params=INGAASP).json()


def test_cli_match_text(db_path: Path, capsys) -> None:
    code, out, _ = run(capsys, "match", "InGaAs", "--on", "InP", "--gap", "0.75",
                       "--tolerance", "0.02", "--thickness", "100", "--limit", "3",
                       "--db", str(db_path))
    assert code == 0
    assert out.startswith("# InGaAs on InP, gap 0.75 +/- 0.02 eV")
    assert "# mismatch: f = (a_layer - a_substrate) / a_substrate" in out
    assert "formula" in out and "h_c (nm)" in out and "In0.5" in out
    assert "26 more not shown" in out


def test_sort_limit_and_exclude(client) -> None:
    params = {"system": "all", "on": "InP", "gap": "0.8", "tolerance": "0.05",
              "max_mismatch": "0.002", "sort": "abs_mismatch", "desc": "true", "limit": "20",
              "exclude": ["Sb", "Al"]}
    payload = client.get("/api/match", params=params).json()
    assert payload["count"] > payload["shown"] == 20
    values = [abs(m["mismatch"]) for m in payload["matches"]]
    assert values == sorted(values, reverse=True)
    assert not {"Sb", "Al"} & {e for m in payload["matches"] for e in m["fractions"]}
    assert payload["query"]["exclude"] == "Sb,Al"


def test_empty_result_is_an_answer(client, db_path: Path, capsys) -> None:
    params = {"system": "InGaAs", "on": "GaAs", "gap": "0.4", "max_mismatch": "0"}
    response = client.get("/api/match", params=params)
    assert response.status_code == 200
    payload = response.json()
    assert payload["matches"] == [] and payload["count"] == 0
    assert payload["message"].startswith("no composition satisfies InGaAs on GaAs")
    code, out, _ = run(capsys, "match", "InGaAs", "--on", "GaAs", "--gap", "0.4",
                       "--max-mismatch", "0", "--db", str(db_path))
    assert code == 0 and "no composition satisfies" in out


BAD = [
    ({"system": "InGaAs", "on": "Unobtainium"}, ["--on", "Unobtainium"], "unknown substrate"),
    ({"system": "In0.5Ga0.5As", "on": "InP"}, ["--on", "InP"], "without numbers"),
    ({"system": "GaAs", "on": "InP"}, ["--on", "InP"], "binary compound, not an alloy system"),
    ({"system": "InZnAs", "on": "InP"}, ["--on", "InP"], "mixes sublattices"),
    ({"system": "GaAsN", "on": "InP"}, ["--on", "InP"], "mixes crystal structures"),
    ({"system": "InGaAs", "on": "GaN"}, ["--on", "GaN"], "cubic layers are compared"),
    ({"system": "InGaAs", "on": "InP", "gap": "-1"}, ["--on", "InP", "--gap", "-1"],
     "target gap must be a number of eV above 0 to 20"),
    ({"system": "InGaAs", "on": "InP", "wavelength": "0"}, ["--on", "InP", "--wavelength", "0"],
     "target wavelength must be a number of nm from"),
    ({"system": "InGaAs", "on": "InP", "gap": "50"}, ["--on", "InP", "--gap", "50"],
     "target gap must be a number of eV above 0 to 20"),
    ({"system": "InGaAs", "on": "InP", "wavelength": "20"}, ["--on", "InP", "--wavelength", "20"],
     "to 1e+06"),
    ({"system": "InGaAs", "on": "InP", "gap": "nan"}, ["--on", "InP", "--gap", "nan"],
     "target gap must be"),
    ({"system": "InGaAs", "on": "InP", "gap": "1", "tolerance": "-0.1"},
     ["--on", "InP", "--gap", "1", "--tolerance", "-0.1"], "tolerance must be"),
    ({"system": "InGaAs", "on": "InP", "tolerance": "0.1"}, ["--on", "InP", "--tolerance", "0.1"],
     "needs a target gap or wavelength"),
    ({"system": "InGaAs", "on": "InP", "max_mismatch": "2"},
     ["--on", "InP", "--max-mismatch", "2"], "a number from 0 to 1"),
    ({"system": "InGaAs", "on": "InP", "thickness": "0"}, ["--on", "InP", "--thickness", "0"],
     "layer thickness must be"),
    ({"system": "InGaAs", "on": "InP", "temperature": "-5"},
     ["--on", "InP", "--temperature", "-5"], "a number of K from 0 to 2000"),
    ({"system": "InGaAs", "on": "InP", "geometry": "flat"}, ["--on", "InP", "--geometry", "flat"],
     "unknown critical-thickness geometry"),
    ({"system": "InGaAs", "on": "InP", "exclude": "Qq"}, ["--on", "InP", "--exclude", "Qq"],
     "Qq"),
    ({"system": "InGaAs", "on": "InP", "sort": "colour"}, ["--on", "InP", "--sort", "colour"],
     "cannot sort matches by 'colour'"),
    ({"system": "InGaAs", "on": "InP", "limit": "0"}, ["--on", "InP", "--limit", "0"],
     "limit must be a whole number"),
]


@pytest.mark.parametrize(("params", "argv", "words"), BAD)
def test_bad_input_is_400_and_exit_2(client, db_path: Path, capsys, params, argv, words) -> None:
    response = client.get("/api/match", params=params)
    assert response.status_code == 400
    assert words in response.json()["detail"]
    code, out, err = run(capsys, "match", params["system"], *argv, "--db", str(db_path))
    assert code == 2 and out == ""
    assert err.startswith("bondgap: error: ") and err.count("\n") == 1 and words in err


def test_gap_and_wavelength_together_are_refused(client) -> None:
    response = client.get("/api/match", params={"on": "InP", "gap": "1", "wavelength": "1300"})
    assert response.status_code == 400
    assert "not both" in response.json()["detail"]
    assert client.get("/api/match").json()["detail"].startswith("give a substrate")


def test_finder_excludes_rohs_restricted_elements(tmp_path) -> None:
    # RoHS Annex II (Directive 2011/65/EU as amended by (EU) 2015/863) restricts Cd, Hg, Pb
    # and hexavalent Cr: with --no-rohs no CdZnTe-type composition may come back.
    import json
    import subprocess
    import sys

    db = str(tmp_path / "rohs.db")
    base = [sys.executable, "-m", "app", "match", "all", "--on", "CdTe", "--json", "--db", db,
            "--limit", "2000"]
    plain = json.loads(subprocess.run(base, capture_output=True, text=True, check=True).stdout)
    strict = json.loads(subprocess.run(base + ["--no-rohs"], capture_output=True, text=True,
                                       check=True).stdout)
    assert any("Cd" in m["fractions"] or "Hg" in m["fractions"] for m in plain["matches"])
    assert all(not ({"Cd", "Hg", "Pb", "Cr"} & set(m["fractions"])) for m in strict["matches"])


def test_a_huge_limit_gets_one_capped_page_and_the_next_offset(client) -> None:
    # Issue 10, defect 4: limit=100000 over the whole design space returned 44 MB.
    from app.finder import MAX_PAGE_ROWS

    first = client.get("/api/match", params={"system": "all", "on": "GaAs",
                                             "limit": "100000"})
    assert first.status_code == 200
    payload = first.json()
    assert payload["shown"] == len(payload["matches"]) == MAX_PAGE_ROWS < payload["count"]
    assert payload["offset"] == 0 and payload["next_offset"] == MAX_PAGE_ROWS
    assert len(first.content) < 1_000_000
    second = client.get("/api/match", params={"system": "all", "on": "GaAs", "limit": "100000",
                                              "offset": str(payload["next_offset"])}).json()
    assert second["offset"] == MAX_PAGE_ROWS and len(second["matches"]) == MAX_PAGE_ROWS
    seen = {m["formula"] for m in payload["matches"]}
    assert not seen & {m["formula"] for m in second["matches"]}
    last = client.get("/api/match", params={"system": "all", "on": "GaAs", "limit": "100000",
                                            "offset": str(payload["count"] - 3)}).json()
    assert len(last["matches"]) == 3 and last["next_offset"] is None
