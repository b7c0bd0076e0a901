"""Valence-band spin-orbit splitting Delta0: the model against measured values, and the report."""

import numpy as np
import pytest

from screening.evaluate import catalogue_table
from screening.reference import spin_orbit_splittings
from screening.report import compound_report
from screening.spin_orbit import spin_orbit_table

CUPROUS_HALIDES = ("CuCl", "CuBr", "CuI")
"""Cu 3d states mix into the valence-band top and shrink (CuCl: reverse) Delta0; the
sp-only weighting cannot follow (M. Cardona, Phys. Rev. 129, 69 (1963), from memory)."""


def _model_and_measured() -> tuple[list[str], np.ndarray, np.ndarray]:
    table = catalogue_table()
    so = spin_orbit_table()
    rows = spin_orbit_splittings()
    formulas = [f for f in rows if f not in CUPROUS_HALIDES]
    model = np.array([so.model_eV[table.index(f)] for f in formulas])
    measured = np.array([rows[f].delta0_eV for f in formulas])
    return formulas, model, measured


@pytest.mark.parametrize(("formula", "measured_eV"), [
    ("GaAs", 0.341),  # VMR 2001 (from memory)
    ("Si", 0.044),  # Madelung 2004 (from memory)
    ("InSb", 0.81),  # VMR 2001 (from memory)
    ("CdTe", 0.91),  # Madelung 2004 (from memory)
    ("GaP", 0.08),  # VMR 2001 (from memory)
])
def test_model_delta0_within_a_third_of_the_measured_value(formula: str,
                                                           measured_eV: float) -> None:
    # The bond-orbital weighting of free-atom splittings is a first model; measured on our
    # table it runs 10-35 % low for these compounds (README "Spin-orbit").
    model = spin_orbit_table().model_eV[catalogue_table().index(formula)]
    assert model == pytest.approx(measured_eV, rel=0.35)


def test_model_delta0_mean_error_over_every_measured_compound() -> None:
    # seed_data/spin_orbit.csv (VMR 2001, VM 2003, Madelung 2004; from memory), cuprous
    # halides excepted. Our measured figure: MAE 0.086 eV over 24 compounds (README).
    formulas, model, measured = _model_and_measured()
    assert len(formulas) >= 20
    assert np.mean(np.abs(model - measured)) <= 0.10
    # The trend down each column is right: Delta0 rises with the anion's row.
    order = np.argsort(measured)
    assert np.corrcoef(model[order], measured[order])[0, 1] > 0.9


def test_measured_delta0_wins_and_the_route_says_so() -> None:
    block = compound_report("GaAs")["spin_orbit"]
    assert block["splitting_eV"] == pytest.approx(0.341)  # VMR 2001 (from memory)
    assert block["route"] == "measured" and "Vurgaftman" in block["source"]
    estimated = compound_report("TlP")["spin_orbit"]
    assert estimated["route"] == "model" and estimated["splitting_eV"] > 0
    assert estimated["measured_eV"] is None


def test_elements_have_their_atomic_weighting() -> None:
    # For an element both atoms are alike: Delta0 equals the atom's own p splitting.
    from screening.atoms import spin_orbit_splitting_eV

    table = catalogue_table()
    for element in ("C", "Si", "Ge", "Sn"):
        model = spin_orbit_table().model_eV[table.index(element)]
        assert model == pytest.approx(float(spin_orbit_splitting_eV([element])[0]), rel=1e-9)
