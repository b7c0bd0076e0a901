"""Alloy formulas, systems, interpolation and the virtual crystal (screening.alloys).

Check values name their source beside them; "from memory" where recalled, not checked in print.
"""

import numpy as np
import pytest

from screening.alloys import (
    Alloy,
    alloy_properties,
    default_bowing,
    design_space_systems,
    endpoint_gaps,
    formula_properties,
    parse_alloy,
    parse_material,
    parse_system,
    vca_bonds,
)
from screening.constants import HC_EV_NM
from screening.errors import (
    CompositionError,
    FormulaSyntaxError,
    MissingDataError,
    NotOctetCompoundError,
    OutOfRangeError,
    StructureMismatchError,
    UnknownElementError,
)
from screening.evaluate import catalogue_table
from screening.formula import Compound
from screening.reference import measured_compounds

# Vurgaftman, Meyer & Ram-Mohan, J. Appl. Phys. 89, 5815 (2001) ("VMR"), from memory.
VMR_INGAAS_BOWING_EV = 0.477


def _lattice(formula: str) -> float:
    return float(measured_compounds()[formula]["lattice_a"].value)


def _gap(formula: str) -> float:
    return float(measured_compounds()[formula]["band_gap"].value)


# ------------------------------------------------------------------------------------------
# Formulas


@pytest.mark.parametrize(
    ("text", "system", "fractions"),
    [
        ("In0.53Ga0.47As", "InGaAs", {"In": 0.53, "Ga": 0.47, "As": 1.0}),
        ("GaAs0.51Sb0.49", "GaAsSb", {"Ga": 1.0, "As": 0.51, "Sb": 0.49}),
        ("In0.73Ga0.27As0.58P0.42", "InGaAsP", {"In": 0.73, "Ga": 0.27, "As": 0.58, "P": 0.42}),
        ("Al0.3Ga0.2In0.5P", "AlInGaP", {"Al": 0.3, "Ga": 0.2, "In": 0.5, "P": 1.0}),
        ("InAs0.6Sb0.3P0.1", "InAsPSb", {"In": 1.0, "As": 0.6, "Sb": 0.3, "P": 0.1}),
        ("Hg0.8Cd0.2Te", "HgCdTe", {"Hg": 0.8, "Cd": 0.2, "Te": 1.0}),
    ],
)
def test_usual_notation_is_read_per_site(text: str, system: str, fractions: dict) -> None:
    alloy = parse_alloy(text)
    assert alloy.system.name == system
    assert alloy.site_fractions == pytest.approx(fractions)


def test_element_order_does_not_matter_and_formulas_round_trip() -> None:
    a, b = parse_alloy("Ga0.47In0.53As"), parse_alloy("In0.53Ga0.47As")
    assert a == b
    assert a.formula == "In0.53Ga0.47As"
    assert parse_alloy(a.formula) == a


def test_parse_material_sends_binaries_to_the_binary_parser() -> None:
    assert isinstance(parse_material("Ga2As2"), Compound)
    assert isinstance(parse_material("GaAs"), Compound)
    assert isinstance(parse_material("In0.53Ga0.47As"), Alloy)


@pytest.mark.parametrize(
    ("text", "error", "fragment"),
    [
        ("In0.5Ga0.4As", CompositionError, "sum to 0.9"),
        ("In0.53Ga0.47As0.9", CompositionError, "anion-site"),
        ("In1.2Ga0.2As0.5P0.5", CompositionError, "lie in [0, 1]"),
        ("Ga0.5Zn0.5As", CompositionError, "mixes sublattices"),
        ("Si0.5Ge0.5", CompositionError, "group-IV"),
        ("GaAs0.5Si0.5", CompositionError, "group-IV"),
        ("In0.2Ga0.8As0.3P0.3Sb0.4", CompositionError, "2 cation(s) and 3 anion(s)"),
        ("InGaAs", CompositionError, "names an alloy system"),
        ("GaAs0.9N0.1", StructureMismatchError, "GaN wurtzite"),
        ("Zn0.5Cd0.5Se", StructureMismatchError, "CdSe wurtzite"),
        ("Fe0.5Ga0.5As", NotOctetCompoundError, "Fe"),
        ("In0.5Ga0.5Xx", UnknownElementError, "Xx"),
        ("In0.5-Ga0.5As", FormulaSyntaxError, "'-'"),
    ],
)
def test_bad_alloy_formulas_raise_specific_errors(text: str, error: type, fragment: str) -> None:
    with pytest.raises(error, match=None) as caught:
        parse_alloy(text)
    assert fragment in str(caught.value)


# ------------------------------------------------------------------------------------------
# Systems


def test_system_names_in_any_order_and_their_edges() -> None:
    assert parse_system("GaInAs") == parse_system("InGaAs")
    quaternary = parse_system("GaInAsP")
    assert quaternary.name == "InGaAsP"
    assert quaternary.binaries == ("InAs", "InP", "GaAs", "GaP")
    assert len(quaternary.edges) == 4  # InGaAs, InGaP, InAsP, GaAsP
    assert len(parse_system("AlGaInP").edges) == 3


@pytest.mark.parametrize(
    ("text", "error"),
    [("In0.5GaAs", FormulaSyntaxError), ("InInAs", FormulaSyntaxError),
     ("InGaAsPSb", CompositionError), ("GaAsN", StructureMismatchError),
     ("InQq", UnknownElementError)],
)
def test_bad_system_names(text: str, error: type) -> None:
    with pytest.raises(error):
        parse_system(text)


def test_design_space_systems_share_a_structure_and_have_data() -> None:
    systems = design_space_systems(("III-V", "II-VI"))
    names = {s.name for s in systems}
    assert {"InGaAs", "InGaAsP", "AlInGaP", "AlGaAs", "InGaN", "HgCdTe", "ZnSSe"} <= names
    measured = measured_compounds()
    for system in systems:
        structures = {measured[b]["structure"].value for b in system.binaries}
        assert structures == {system.structure}
        assert all("band_gap" in measured[b] for b in system.binaries)
        assert system.family in ("III-V", "II-VI")
        assert system.form in ("ternary", "quaternary")


# ------------------------------------------------------------------------------------------
# Vegard and band gaps


def test_vegard_ternary_and_bilinear_quaternary() -> None:
    # Vegard, Z. Phys. 5, 17 (1921); the bilinear form as used by VMR 2001 (from memory).
    props = formula_properties("In0.53Ga0.47As")
    expected = 0.53 * _lattice("InAs") + 0.47 * _lattice("GaAs")
    assert props.lattice_constant_angstrom[0] == pytest.approx(expected, rel=1e-12)
    system = parse_system("InGaAsP")
    corners = alloy_properties(system, [[1, 0, 1, 0], [1, 0, 0, 1], [0, 1, 1, 0], [0, 1, 0, 1]])
    assert corners.lattice_constant_angstrom == pytest.approx(
        [_lattice(b) for b in system.binaries], rel=1e-12)
    assert corners.band_gap_eV == pytest.approx([_gap(b) for b in system.binaries], abs=1e-12)
    centre = alloy_properties(system, [[0.5, 0.5, 0.5, 0.5]])
    assert centre.lattice_constant_angstrom[0] == pytest.approx(
        np.mean([_lattice(b) for b in system.binaries]), rel=1e-12)


def test_ingaas_gap_with_vmr_bowing() -> None:
    # E(x) = x E_InAs + (1 - x) E_GaAs - x (1 - x) C, C = 0.477 eV (VMR 2001, from memory).
    x = 0.53
    props = formula_properties("In0.53Ga0.47As", temperature_K=300.0)
    expected = x * _gap("InAs") + (1 - x) * _gap("GaAs") - x * (1 - x) * VMR_INGAAS_BOWING_EV
    assert props.band_gap_eV[0] == pytest.approx(expected, abs=1e-12)
    assert props.valley[0] == "Gamma"
    assert not props.default_bowing[0]
    # Measured end points and a tabulated bowing: only the bowing's stated uncertainty,
    # max(0.05, 0.2 C) = 0.0954 eV (ours, common practice), times x (1 - x).
    assert props.band_gap_uncertainty_eV[0] == pytest.approx(x * (1 - x) * 0.2 * 0.477, rel=1e-9)
    # Measured: about 0.75 eV at room temperature for In0.53Ga0.47As on InP (Pearsall's
    # review, GaInAsP Alloy Semiconductors, Wiley 1982; from memory).
    assert props.band_gap_eV[0] == pytest.approx(0.75, abs=0.02)


def test_quaternary_reduces_to_its_ternary_edges() -> None:
    quaternary = alloy_properties(parse_system("InGaAsP"), [[0.53, 0.47, 1.0, 0.0]])
    ternary = formula_properties("In0.53Ga0.47As")
    assert quaternary.band_gap_eV[0] == pytest.approx(ternary.band_gap_eV[0], abs=1e-12)
    three = alloy_properties(parse_system("AlGaInP"), [[0.0, 0.49, 0.51, 1.0]])
    assert three.band_gap_eV[0] == pytest.approx(
        formula_properties("Ga0.51In0.49P").band_gap_eV[0], abs=1e-12)


def test_gap_follows_temperature_from_the_end_points() -> None:
    cold = formula_properties("In0.53Ga0.47As", temperature_K=77.0)
    warm = formula_properties("In0.53Ga0.47As", temperature_K=300.0)
    assert cold.band_gap_eV[0] > warm.band_gap_eV[0]
    ends = alloy_properties(parse_system("InGaAs"), [[1, 0, 1], [0, 1, 1]], temperature_K=77.0)
    assert ends.band_gap_eV == pytest.approx(endpoint_gaps(["InAs", "GaAs"], 77.0)[0], abs=1e-12)


def test_indirect_end_points_take_the_lowest_valley() -> None:
    x = np.linspace(0.0, 1.0, 1001)
    algaas = alloy_properties(parse_system("AlGaAs"), np.column_stack([x, 1 - x, np.ones_like(x)]))
    first_indirect = x[np.argmax(algaas.valley != "Gamma")]
    # Direct-indirect crossover of Al(x)Ga(1-x)As near x = 0.4-0.45 (Casey & Panish,
    # Heterostructure Lasers, 1978: about 0.45; VMR 2001 parameters give about 0.4; from memory).
    assert 0.38 <= first_indirect <= 0.46
    assert algaas.band_gap_eV[-1] == pytest.approx(_gap("AlAs"), abs=1e-12)
    assert algaas.valley[-1] == "X"
    # GaAs(1-x)P(x) turns indirect near x = 0.45-0.49 (VMR 2001 and references; from memory).
    gaasp = alloy_properties(parse_system("GaAsP"), np.column_stack(
        [np.ones_like(x), 1 - x, x]))
    assert 0.42 <= x[np.argmax(gaasp.valley != "Gamma")] <= 0.5


def test_default_bowing_is_flagged_with_its_uncertainty() -> None:
    default = default_bowing("Gamma")
    assert default.uncertainty_eV > 0.0
    zns_se = alloy_properties(parse_system("ZnSSe"), [[1, 0.5, 0.5], [1, 1.0, 0.0]])
    assert zns_se.default_bowing.tolist() == [True, False]
    assert zns_se.band_gap_uncertainty_eV[0] == pytest.approx(0.25 * default.uncertainty_eV)
    assert zns_se.band_gap_uncertainty_eV[1] == 0.0


def test_hgcdte_follows_hansen_law() -> None:
    # Hansen, Schmit & Casselman, J. Appl. Phys. 53, 7099 (1982), from memory.
    x, t = 0.2, 77.0
    props = formula_properties("Hg0.8Cd0.2Te", temperature_K=t)
    hansen = -0.302 + 1.93 * x - 0.81 * x**2 + 0.832 * x**3 + 5.35e-4 * t * (1 - 2 * x)
    assert props.band_gap_eV[0] == pytest.approx(hansen, abs=1e-12)
    # x = 0.2 at 77 K is the long-wave infrared detector alloy, cut-off near 12-15 um
    # (from memory).
    assert 11_000 <= HC_EV_NM / props.band_gap_eV[0] <= 16_000


def test_alloy_properties_reject_bad_input() -> None:
    with pytest.raises(CompositionError, match="lie in"):
        alloy_properties(parse_system("InGaAs"), [[1.2, -0.2, 1.0]])
    with pytest.raises(CompositionError, match="sum to"):
        alloy_properties(parse_system("InGaAs"), [[0.5, 0.6, 1.0]])
    # AgF has a measured lattice constant but no measured gap in the seed data.
    with pytest.raises(MissingDataError, match="AgF"):
        formula_properties("Ag0.1Na0.9F")
    with pytest.raises(OutOfRangeError):
        formula_properties("In0.53Ga0.47As", temperature_K=-1.0)


def test_endpoint_gaps_are_measured_values_at_300K() -> None:
    gaps, uncertainty = endpoint_gaps(["GaAs", "InP", "AgF"], 300.0)
    assert gaps[:2] == pytest.approx([_gap("GaAs"), _gap("InP")], abs=1e-12)
    assert uncertainty[:2].tolist() == [0.0, 0.0]
    # AgF has no measured gap: the calibrated estimate comes with its uncertainty.
    assert np.isfinite(gaps[2]) and uncertainty[2] > 0


# ------------------------------------------------------------------------------------------
# Virtual crystal


def test_vca_end_points_reproduce_the_binaries() -> None:
    table = catalogue_table()
    result = vca_bonds(parse_system("InGaAs"), [[1, 0, 1], [0, 1, 1]])
    for row, formula in enumerate(("InAs", "GaAs")):
        i = table.index(formula)
        assert result.spectroscopic.ionicity[row] == pytest.approx(
            table.spectroscopic.ionicity[i], rel=1e-12)
        assert result.predictive.ionicity[row] == pytest.approx(
            table.predictive.ionicity[i], rel=1e-12)
        assert result.bonds.polarity[row] == pytest.approx(table.bonds.polarity[i], rel=1e-12)


def test_hypothetical_alloy_vca_ionicity_lies_between_its_end_points() -> None:
    # B(x)In(1-x)P: a 29 % size difference between BP and InP, not grown: hypothetical.
    x = np.linspace(0.0, 1.0, 11)
    result = vca_bonds(parse_system("BInP"), np.column_stack([x, 1 - x, np.ones_like(x)]))
    for values in (result.spectroscopic.ionicity, result.predictive.ionicity,
                   result.bonds.polarity):
        low, high = sorted((values[0], values[-1]))
        assert high - low > 0.01
        assert np.all((values >= low - 1e-12) & (values <= high + 1e-12))


def test_vca_is_between_end_points_for_every_ternary_whose_ends_differ() -> None:
    # The VCA averages inputs, not results; where two end points' values are within 0.01 the
    # non-linearity can put the middle just outside them (ZnSSe, ZnSTe), so those are skipped.
    # So are end points whose lattice constants differ by more than 20 % (BAsN: 3.6 against
    # 4.8 angstrom), where the d^-2 couplings of the averaged bond bend the polarity past its
    # ends; such alloys are far outside any miscibility (common practice, no source).
    measured = measured_compounds()
    for system in design_space_systems(("III-V", "II-VI")):
        if system.form != "ternary":
            continue
        ends = [float(measured[b]["lattice_a"].value) for b in system.binaries]
        if max(ends) / min(ends) > 1.2:
            continue
        rows = [[1.0, 0.0, 1.0], [0.5, 0.5, 1.0], [0.0, 1.0, 1.0]]
        if len(system.cations) == 1:
            rows = [[1.0, 1.0, 0.0], [1.0, 0.5, 0.5], [1.0, 0.0, 1.0]]
        result = vca_bonds(system, rows)
        for values in (result.spectroscopic.ionicity, result.predictive.ionicity,
                       result.bonds.polarity):
            if np.all(np.isfinite(values)) and abs(values[0] - values[2]) > 0.01:
                assert min(values[0], values[2]) <= values[1] <= max(values[0], values[2]), (
                    system.name)
