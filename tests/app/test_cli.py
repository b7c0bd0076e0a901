import csv
import io
import json
import subprocess
import sys
from pathlib import Path

import pytest

from app.cli import main
from app.config import DB_ENV_VAR

BAD_FORMULAS = ["Xx", "GaAs2", "NaCl3", "", "A" * 500]


def run(capsys, *argv: str) -> tuple[int, str, str]:
    code = main(list(argv))
    out, err = capsys.readouterr()
    return code, out, err


def test_show_json_is_the_api_object(client, db_path: Path, capsys) -> None:
    code, out, _ = run(capsys, "show", "AsGa", "--json", "--db", str(db_path))
    assert code == 0
    assert json.loads(out) == client.get("/api/compounds/GaAs").json()


def test_show_text_has_units_routes_and_caution(db_path: Path, capsys) -> None:
    code, out, _ = run(capsys, "show", "CdTe", "--db", str(db_path))
    assert code == 0
    assert out.startswith("CdTe  (II-VI")
    assert "Band gap" in out and " eV " in out and "[measured" in out
    assert "Caution: contains Cd, Te: toxic" in out


def test_list_json_and_csv_match_the_api(client, db_path: Path, capsys) -> None:
    args = ["--family", "II-VI", "--sort", "ionicity_spectroscopic", "--desc"]
    code, out, _ = run(capsys, "list", *args, "--json", "--db", str(db_path))
    assert code == 0
    params = {"family": "II-VI", "sort": "ionicity_spectroscopic", "desc": "true"}
    assert json.loads(out) == client.get("/api/compounds", params=params).json()
    code, out, _ = run(capsys, "list", *args, "--csv", "--db", str(db_path))
    assert code == 0
    assert out == client.get("/api/compounds.csv", params=params).text
    assert len(list(csv.DictReader(io.StringIO(out)))) == len(json.loads(
        client.get("/api/compounds", params=params).text)["rows"])


def test_list_text_filters(db_path: Path, capsys) -> None:
    code, out, _ = run(capsys, "list", "--gap-min", "2", "--measured-only", "--db", str(db_path))
    assert code == 0
    lines = out.splitlines()
    assert lines[0].startswith("Compound")
    count = int(lines[-2].split()[0]) if lines[-1].startswith("Caution") else int(
        lines[-1].split()[0])
    assert count > 0


@pytest.mark.parametrize("formula", BAD_FORMULAS)
def test_show_bad_formula_exits_2_with_one_line(db_path: Path, capsys, formula: str) -> None:
    code, out, err = run(capsys, "show", formula, "--db", str(db_path))
    assert code == 2 and out == ""
    assert err.startswith("bondgap: error: ") and err.count("\n") == 1


@pytest.mark.parametrize(
    "args",
    [
        ["--sort", "nope"],
        ["--family", "V-V"],
        ["--structure", "cubic"],
        ["--gap-min", "abc"],
        ["--gap-min", "3", "--gap-max", "1"],
    ],
)
def test_list_bad_input_exits_2_with_one_line(db_path: Path, capsys, args) -> None:
    code, out, err = run(capsys, "list", *args, "--db", str(db_path))
    assert code == 2 and out == ""
    assert err.startswith("bondgap: error: ") and err.count("\n") == 1


def test_unusable_database_exits_2(tmp_path: Path, capsys) -> None:
    junk = tmp_path / "junk.db"
    junk.write_bytes(b"not sqlite" * 100)
    code, _, err = run(capsys, "list", "--db", str(junk))
    assert code == 2 and "not a database" in err and err.count("\n") == 1


def test_db_option_beats_environment(db_path: Path, tmp_path: Path, capsys, monkeypatch) -> None:
    monkeypatch.setenv(DB_ENV_VAR, str(tmp_path / "junk.db"))
    (tmp_path / "junk.db").write_bytes(b"not sqlite" * 100)
    assert run(capsys, "list", "--db", str(db_path))[0] == 0
    assert run(capsys, "list")[0] == 2  # the environment variable is used without --db
    monkeypatch.setenv(DB_ENV_VAR, str(db_path))
    assert run(capsys, "list")[0] == 0


def test_serve_on_a_busy_port_exits_2(db_path: Path, capsys) -> None:
    import socket

    with socket.socket() as busy:
        busy.bind(("127.0.0.1", 0))
        busy.listen()
        port = busy.getsockname()[1]
        code, _, err = run(capsys, "serve", "--port", str(port), "--db", str(db_path))
    assert code == 2 and f"cannot listen on 127.0.0.1:{port}" in err


def test_serve_rejects_a_bad_port(capsys) -> None:
    with pytest.raises(SystemExit) as exc:
        main(["serve", "--port", "70000"])
    assert exc.value.code == 2
    assert "not a port number" in capsys.readouterr().err


def test_entry_point_runs_without_traceback(db_path: Path) -> None:
    done = subprocess.run(
        [sys.executable, "-m", "app", "show", "GaAs2", "--db", str(db_path)],
        capture_output=True, text=True, check=False,
    )
    assert done.returncode == 2 and "Traceback" not in done.stderr
    assert done.stderr.startswith("bondgap: error: ")


def test_show_gives_the_estimated_lattice_constant_with_its_uncertainty(db_path: Path,
                                                                        capsys) -> None:
    # BSb has no measured lattice constant (seed data): its estimate carries its ± (the
    # leave-one-out RMS of the bond length times da/dd), rounded to it (app.numbers rule).
    code, out, _ = run(capsys, "show", "BSb", "--db", str(db_path))
    line = next(x for x in out.splitlines() if "Lattice constant a (estimated)" in x)
    value, _, rest = line.split(")", 1)[1].strip().partition(" ± ")
    uncertainty = rest.split()[0]
    assert code == 0 and float(uncertainty) > 0
    assert len(value.partition(".")[2]) == len(uncertainty.partition(".")[2])
