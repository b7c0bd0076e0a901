import shutil
from pathlib import Path

import pytest

import screening
from screening.fingerprint import engine_fingerprint

SEED = Path(screening.__file__).resolve().parent.parent / "seed_data"


def test_model_version_carries_the_fingerprint() -> None:
    assert screening.MODEL_VERSION == f"{screening.ENGINE_RELEASE}+{engine_fingerprint()}"


def test_a_changed_reference_value_changes_the_fingerprint(
    tmp_path: Path, monkeypatch: pytest.MonkeyPatch
) -> None:
    copy = tmp_path / "seed"
    shutil.copytree(SEED, copy)
    monkeypatch.setenv("BONDGAP_SEED_DATA", str(copy))
    before = engine_fingerprint()
    compounds = copy / "compounds.csv"
    compounds.write_text(compounds.read_text().replace("5.65325", "5.65330", 1))
    assert engine_fingerprint() != before
