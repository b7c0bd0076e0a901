"""The user's file: an older schema migrates and keeps its data; a bad file is never touched."""

import ctypes
import hashlib
import os
import random
import shutil
import sqlite3
import subprocess
import sys
from pathlib import Path

import pytest
from fastapi.testclient import TestClient

import screening
from app.cli import main
from app.config import Settings
from app.main import create_app
from app.migrations import head_revision
from screening.catalogue import catalogue_formulas
from tests.conftest import REPO_ROOT, TEST_HOST, csrf_headers

PR_CAPBSET_DROP = 24
FIXTURE = REPO_ROOT / "tests" / "data" / "bondgap-0003.db"  # made by make_bondgap_0003.py


def sha256(path: Path) -> str:
    return hashlib.sha256(path.read_bytes()).hexdigest()


def query(db: Path, sql: str) -> list[tuple]:
    conn = sqlite3.connect(db)
    try:
        return conn.execute(sql).fetchall()
    finally:
        conn.close()


def test_a_database_of_the_previous_schema_migrates_on_start_and_keeps_its_data(
        tmp_path: Path) -> None:
    fixture_hash = sha256(FIXTURE)
    db = tmp_path / "bondgap.db"
    shutil.copyfile(FIXTURE, db)
    assert query(db, "SELECT version_num FROM alembic_version") == [("0003",)]
    columns_0003 = "id, name, structure, a_angstrom, c_angstrom, note, created_at"
    substrates = query(db, f"SELECT {columns_0003} FROM user_substrates ORDER BY id")
    assert len(substrates) == 2

    settings = Settings(db_path=db, allowed_hosts=(TEST_HOST,))
    with TestClient(create_app(settings)) as client:
        listed = {s["name"]: s for s in client.get("/api/substrates").json()["substrates"]}
        mine = listed["InGaAs buffer"]
        assert (mine["a_angstrom"], mine["note"]) == (5.75, "relaxed buffer, wafer 12 (µm-thick)")
        assert listed["my AlN template"]["c_angstrom"] == 4.982
        token = csrf_headers(client)  # the new tables work, on the user's own substrate
        made = client.post("/api/shortlists", headers=token, json={
            "name": "After the upgrade", "substrate": "InGaAs buffer"})
        assert made.status_code == 201
        url = f"/api/shortlists/{made.json()['id']}/items"
        assert client.post(url, headers=token, json={"formulas": ["InP"]}).status_code == 201

    assert query(db, "SELECT version_num FROM alembic_version") == [(head_revision(),)]
    assert query(db, f"SELECT {columns_0003} FROM user_substrates ORDER BY id") == substrates
    assert query(db, "SELECT name_key FROM user_substrates ORDER BY id") == [
        ("ingaas buffer",), ("my aln template",)]
    assert query(db, "SELECT value FROM store_meta WHERE key = 'model_version'") == [
        (screening.MODEL_VERSION,)]
    assert {f for (f,) in query(db, "SELECT formula FROM compound_results")} == set(
        catalogue_formulas())
    assert query(db, "PRAGMA integrity_check") == [("ok",)]
    assert query(db, "PRAGMA foreign_key_check") == []
    assert sha256(FIXTURE) == fixture_hash  # the committed fixture itself is never opened


def damaged_files(folder: Path, seeded: Path) -> dict[str, Path]:
    """A file of random bytes, a truncated database, a SQLite header over garbage."""
    rng = random.Random(7)
    files = {"random": bytes(rng.getrandbits(8) for _ in range(16384)),
             "truncated": seeded.read_bytes()[: seeded.stat().st_size // 2],
             "bad pages": b"SQLite format 3\x00" + bytes(rng.getrandbits(8) for _ in range(8192))}
    paths = {}
    for name, data in files.items():
        paths[name] = folder / f"{name.replace(' ', '-')}.db"
        paths[name].write_bytes(data)
    return paths


@pytest.mark.parametrize("kind", ["random", "truncated", "bad pages"])
def test_a_damaged_file_is_refused_and_left_as_it_was(kind: str, tmp_path: Path,
                                                     seeded_db_template: Path, capsys) -> None:
    path = damaged_files(tmp_path, seeded_db_template)[kind]
    before, files_before = sha256(path), sorted(os.listdir(tmp_path))
    for argv in (["list"], ["serve", "--port", "0"], ["shortlist", "create", "x"]):
        assert main([*argv, "--db", str(path)]) == 2
        err = capsys.readouterr().err
        assert err.startswith(f"bondgap: error: cannot use database {path}")
        assert err.count("\n") == 1 and "left untouched" in err
        assert "damaged" in err or "not a database" in err
    assert sha256(path) == before
    assert sorted(os.listdir(tmp_path)) == files_before  # no -wal or -shm made beside it


def test_the_command_refuses_a_damaged_file_without_a_traceback(tmp_path: Path,
                                                                seeded_db_template: Path) -> None:
    path = damaged_files(tmp_path, seeded_db_template)["truncated"]
    before = sha256(path)
    done = subprocess.run([sys.executable, "-m", "app", "serve", "--port", "0", "--db",
                           str(path)], capture_output=True, text=True, timeout=60, check=False)
    assert done.returncode == 2 and "Traceback" not in done.stderr
    assert "it is damaged" in done.stderr and sha256(path) == before


def test_a_folder_in_place_of_the_file_is_refused(tmp_path: Path, capsys) -> None:
    folder = tmp_path / "bondgap.db"
    folder.mkdir()
    assert main(["list", "--db", str(folder)]) == 2
    assert "it is a folder" in capsys.readouterr().err
    assert list(folder.iterdir()) == []


def without_read_override() -> None:
    """In the child: give up root's power to read any file (CAP_DAC_OVERRIDE, _READ_SEARCH).

    Dropped from the capability bounding set, so the program the child runs does not get them.
    """
    if os.geteuid() != 0:
        return
    libc = ctypes.CDLL(None, use_errno=True)
    for capability in (1, 2):  # CAP_DAC_OVERRIDE, CAP_DAC_READ_SEARCH
        if libc.prctl(PR_CAPBSET_DROP, capability, 0, 0, 0) != 0:
            raise OSError(ctypes.get_errno(), "cannot drop a capability")


def test_an_unreadable_file_is_refused_and_left_as_it_was(db_path: Path) -> None:
    db_path.chmod(0o000)
    before, files_before = sha256(db_path), sorted(os.listdir(db_path.parent))
    try:
        done = subprocess.run([sys.executable, "-m", "app", "list", "--db", str(db_path)],
                              capture_output=True, text=True, timeout=60, check=False,
                              cwd=REPO_ROOT, preexec_fn=without_read_override)
    except OSError as exc:  # pragma: no cover - a container that forbids dropping capabilities
        pytest.skip(f"root reads any file and this machine does not let it give that up: {exc}")
    assert done.returncode == 2, done.stderr
    assert done.stderr.startswith(f"bondgap: error: cannot read database {db_path}")
    assert "Permission denied" in done.stderr and "Traceback" not in done.stderr
    assert sha256(db_path) == before and sorted(os.listdir(db_path.parent)) == files_before
