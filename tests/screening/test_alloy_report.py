"""The alloy report, the compound/alloy dispatcher, a layer on a substrate, system outlines."""

import json
import subprocess
import sys

import numpy as np
import pytest

from screening.alloy_report import alloy_report, material_report, normalise_material
from screening.alloys.outline import binary_points, outline_fractions, system_outline
from screening.alloys.systems import parse_system
from screening.epitaxy import substrate_spec
from screening.errors import (
    CompositionError,
    MissingDataError,
    StructureMismatchError,
    UnknownChoiceError,
)
from screening.layer import layer_block
from screening.report import compound_report


def test_alloy_report_has_the_compound_keys_and_its_own() -> None:
    compound = compound_report("GaAs")
    alloy = alloy_report("In0.53Ga0.47As")
    assert set(compound) - {"tight_binding"} <= set(alloy)
    assert set(compound["band_gap"]) - {"model"} <= set(alloy["band_gap"])
    assert alloy["alloy"] is True and alloy["system"] == "InGaAs"
    assert alloy["fractions"] == pytest.approx({"In": 0.53, "Ga": 0.47, "As": 1.0})
    assert alloy["cation"] == "In0.53Ga0.47" and alloy["anion"] == "As"
    assert [p["formula"] for p in alloy["end_points"]] == ["InAs", "GaAs"]
    assert alloy["band_gap"]["measured_eV"] is None
    assert alloy["band_gap"]["cross_validated_eV"] is None
    assert alloy["hazards"]["elements"] == ["As"]
    json.dumps(alloy, allow_nan=False)  # JSON-ready: no NaN, no numpy scalars


def test_ingaas_values() -> None:
    # Vegard: 0.53 * 6.0583 + 0.47 * 5.65325 A (seed data); gap about 0.74 eV at 300 K
    # (Vurgaftman, Meyer & Ram-Mohan, J. Appl. Phys. 89, 5815 (2001); from memory).
    report = alloy_report("In0.53Ga0.47As")
    assert report["lattice_constant_angstrom"] == pytest.approx(0.53 * 6.0583 + 0.47 * 5.65325)
    assert report["band_gap"]["value_eV"] == pytest.approx(0.74, abs=0.02)
    assert report["band_gap"]["kind"] == "direct"
    assert report["band_gap"]["wavelength_nm"] == pytest.approx(1240 / 0.738, rel=0.03)
    assert report["coordination"]["predicted"] == "fourfold"
    colder = alloy_report("In0.53Ga0.47As", 77.0)["band_gap"]
    assert colder["temperature_K"] == 77.0 and colder["value_eV"] > report["band_gap"]["value_eV"]


def test_vca_lies_between_the_end_points() -> None:
    alloy = alloy_report("In0.5Ga0.5As")
    ends = [compound_report(f)["harrison"]["polarity"] for f in ("InAs", "GaAs")]
    assert min(ends) <= alloy["harrison"]["polarity"] <= max(ends)


@pytest.mark.parametrize(
    ("text", "normalised"),
    [("Ga0.47In0.53As", "In0.53Ga0.47As"), ("In0Ga1As", "GaAs"), ("AsGa", "GaAs"),
     ("In0.5Ga0.5As1P0", "In0.5Ga0.5As"), ("In0.73Ga0.27As0.58P0.42", "In0.73Ga0.27As0.58P0.42")],
)
def test_normalise_material(text: str, normalised: str) -> None:
    assert normalise_material(text) == normalised


def test_material_report_dispatches() -> None:
    assert material_report("AsGa") == compound_report("GaAs")
    assert material_report("GaAs0.51Sb0.49")["alloy"] is True


@pytest.mark.parametrize(
    ("text", "error", "words"),
    [("In0.6Ga0.6As", CompositionError, "sum to 1.2"),
     ("In1.5Ga0As", CompositionError, "lie in [0, 1]"),
     ("In0.5Zn0.5As", CompositionError, "mixes sublattices"),
     ("GaAs0.5N0.5", StructureMismatchError, "mixes crystal structures")],
)
def test_bad_alloys_are_refused(text: str, error: type, words: str) -> None:
    with pytest.raises(error, match=words.replace("[", r"\[").replace("]", r"\]")):
        alloy_report(text)


def test_layer_on_a_substrate() -> None:
    block = layer_block("In0.53Ga0.47As", substrate_spec("InP"))
    a = 0.53 * 6.0583 + 0.47 * 5.65325
    assert block["mismatch"] == pytest.approx((a - 5.8687) / 5.8687)
    assert block["in_plane_strain"] == pytest.approx((5.8687 - a) / a)
    assert block["strain_kind"] == "tensile" and block["geometry"]["name"] == "single-uncapped"
    assert block["critical_thickness_nm"] > 1000  # |f| ~ 1e-4: microns
    capped = layer_block("In0.53Ga0.47As", substrate_spec("InP"), "capped-well")
    assert capped["critical_thickness_nm"] > block["critical_thickness_nm"]  # two segments
    binary = layer_block("GaAs", substrate_spec("InP"))
    assert binary["mismatch"] < 0 and 0 < binary["critical_thickness_nm"] < 10
    hexagonal = layer_block("GaN", substrate_spec("sapphire"))
    assert hexagonal["critical_thickness_nm"] is None
    assert "zincblende" in hexagonal["critical_thickness_note"]


@pytest.mark.parametrize(
    ("text", "substrate", "geometry", "error"),
    [("GaN", "InP", "single-uncapped", StructureMismatchError),
     ("GaAs", "InP", "nope", UnknownChoiceError),
     ("TlAs", "InP", "single-uncapped", MissingDataError)],
)
def test_layer_errors(text: str, substrate: str, geometry: str, error: type) -> None:
    with pytest.raises(error):
        layer_block(text, substrate_spec(substrate), geometry)


def test_outline_paths() -> None:
    ternary = outline_fractions(2, 1, 5)
    assert ternary[0].tolist() == [1, 0, 1] and ternary[-1].tolist() == [0, 1, 1]
    square = outline_fractions(2, 2, 5)
    assert np.allclose(square[0], square[-1]) and len(square) == 4 * 4 + 1
    triangle = outline_fractions(1, 3, 5)
    assert np.allclose(triangle[:, 1:].sum(axis=1), 1.0) and len(triangle) == 3 * 4 + 1
    outline = system_outline(parse_system("InGaAsP"), 300.0, 11)
    assert outline.lattice_constant_angstrom.min() == pytest.approx(5.4505)  # GaP corner
    assert outline.lattice_constant_angstrom.max() == pytest.approx(6.0583)  # InAs corner


def test_binary_points() -> None:
    cubic = binary_points("cubic", 300.0, ("III-V",))
    assert "GaAs" in cubic.formulas and "GaN" not in cubic.formulas
    assert cubic.band_gap_eV[cubic.formulas.index("GaAs")] == pytest.approx(1.424)
    assert "GaN" in binary_points("hexagonal", 300.0).formulas


def test_alloy_report_imports_no_web_or_database_module() -> None:
    code = (
        "import sys, json; from screening.alloy_report import material_report;"
        "from screening.layer import layer_block; from screening.epitaxy import substrate_spec;"
        "material_report('In0.53Ga0.47As'); layer_block('GaAs', substrate_spec('InP'));"
        "print(json.dumps(sorted(m for m in sys.modules if m.split('.')[0] in "
        "('app', 'fastapi', 'sqlalchemy', 'starlette', 'uvicorn', 'alembic', 'jinja2'))))"
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True)
    assert json.loads(out.stdout) == []


def test_alloy_eps_inf_and_sources_come_from_the_end_points() -> None:
    report = alloy_report("In0.53Ga0.47As")
    ends = {p["formula"]: p for p in report["end_points"]}
    # Virtual-crystal eps_inf: the weighted mean of the end points' measured values (a named
    # formula: weights p_i q_j = 0.53 and 0.47), computed here from the report's own inputs.
    expected = 0.53 * ends["InAs"]["eps_inf"] + 0.47 * ends["GaAs"]["eps_inf"]
    assert report["eps_inf_vca"]["value"] == pytest.approx(expected, rel=1e-12)
    assert report["eps_inf_vca"]["not_available"] is None
    assert all(p["lattice_constant_source"] and p["eps_inf_source"] for p in ends.values())
    # HgTe has no measured eps_inf in the seed data: no value, and the report says why.
    hgcdte = alloy_report("Hg0.7Cd0.3Te")["eps_inf_vca"]
    assert hgcdte["value"] is None and "HgTe" in hgcdte["not_available"]


@pytest.mark.parametrize(("formula", "glisson"), [("In0.53Ga0.47As", False),
                                                  ("GaAs0.5Sb0.5", False),
                                                  ("In0.73Ga0.27As0.58P0.42", True)])
def test_a_ternary_does_not_cite_the_quaternary_scheme(formula, glisson) -> None:
    route = alloy_report(formula)["band_gap"]["route"]
    assert ("Glisson" in route) == glisson
    assert "Vurgaftman, Meyer & Ram-Mohan" in route
