"""The band-gap estimator: measurements win, error bars are measured, semimetals stay semimetals."""

import numpy as np
import pytest

from screening import gap_validation
from screening.evaluate import catalogue_table
from screening.gaps import gap_model, gaps_at, validation_inputs
from screening.report import compound_report


def test_estimates_never_replace_measurements() -> None:
    for temperature in (0.0, 300.0, 600.0):
        at = gaps_at(temperature)
        known = at.value_is_measured
        assert np.array_equal(at.value_eV[known], at.measured_eV[known])
        assert np.array_equal(at.value_eV[~known], at.estimate_eV[~known])
    model = gap_model()
    assert np.array_equal(np.isfinite(model.measured_300K_eV), gaps_at(300.0).value_is_measured)


def test_every_estimate_carries_an_uncertainty() -> None:
    at = gaps_at(300.0)
    assert np.all(np.isfinite(at.estimate_eV))
    assert np.all(at.uncertainty_eV > 0)


def test_a_semimetal_never_gets_a_positive_gap_or_one_wavelength() -> None:
    at = gaps_at(300.0)
    model = gap_model()
    for i, kind in enumerate(model.measured_kind):
        if kind == "semimetal":
            assert at.semimetal[i]
            assert at.value_eV[i] <= 0
            assert np.isnan(at.wavelength_nm[i])
    assert np.all(np.isnan(at.wavelength_nm[at.semimetal | at.may_be_semimetal]))
    for formula in ("HgTe", "Sn"):
        gap = compound_report(formula)["band_gap"]
        assert gap["semimetal"] is True and gap["kind"] == "semimetal"
        assert gap["wavelength_nm"] is None and gap["value_eV"] <= 0


def test_an_estimate_reaching_zero_shows_a_wavelength_range_only() -> None:
    at = gaps_at(300.0)
    rows = np.flatnonzero(at.may_be_semimetal)
    for i in rows:
        assert np.isnan(at.wavelength_nm[i]) and np.isnan(at.wavelength_long_nm[i])
        assert np.isfinite(at.wavelength_short_nm[i])
    estimated = ~at.value_is_measured & ~at.semimetal & ~at.may_be_semimetal
    assert np.all(at.wavelength_short_nm[estimated] < at.wavelength_long_nm[estimated])


def test_the_stored_validation_matches_its_inputs() -> None:
    # The nested leave-one-out is stored with a fingerprint of every input; a stale file
    # would silently show old figures (`python -m screening.gap_validation --write`).
    assert gap_validation.main(["--check"]) == 0
    assert gap_model().validation_stored


def test_a_stale_validation_file_is_not_used(monkeypatch: pytest.MonkeyPatch, tmp_path) -> None:
    formulas, features, targets, kinds = validation_inputs()
    stale = tmp_path / "gap_validation.json"
    text = gap_validation.stored_path().read_text(encoding="utf-8")
    stale.write_text(text.replace('"fingerprint": "', '"fingerprint": "0'), encoding="utf-8")
    monkeypatch.setattr(gap_validation, "stored_path", lambda: stale)
    monkeypatch.setattr(gap_validation, "run_validation", lambda *a: "recomputed")
    assert gap_validation.load_or_run(formulas, features, targets, kinds) == ("recomputed", False)


@pytest.mark.slow
def test_nested_leave_one_out_reproduces_the_stored_figures() -> None:
    # Re-runs the whole nested leave-one-out (every model choice inside each fold) and checks
    # it against the stored result the pages show.
    formulas, features, targets, kinds = validation_inputs()
    fresh = gap_validation.run_validation(formulas, features, targets, kinds)
    stored = gap_model().validation
    known = np.isfinite(targets)
    assert np.allclose(fresh.loo_mean_eV[known], stored.loo_mean_eV[known], atol=1e-6)
    assert np.allclose(fresh.loo_sd_eV[known], stored.loo_sd_eV[known], atol=1e-6)
    assert fresh.final_set == stored.final_set


def test_error_bars_hold_on_held_out_compounds() -> None:
    # Issue target (ours): 60-80 % of leave-one-out errors within one stated uncertainty,
    # at least 90 % within two (a Gaussian would give 68 % and 95 %).
    model = gap_model()
    assert 0.60 <= model.coverage(1.0) <= 0.80
    assert model.coverage(2.0) >= 0.90


def test_measured_figures_of_the_estimator() -> None:
    # Our own measured figures (README "Band gaps"), guarding against silent regressions.
    model = gap_model()
    table = catalogue_table()
    assert model.n_measured == int(sum("band_gap" in m for m in table.measured))
    errors = model.loo_errors_eV
    assert model.loo_mae_eV == pytest.approx(np.mean(np.abs(errors)))
    assert model.loo_max_eV == pytest.approx(np.max(np.abs(errors)))


def test_gaas_gap_follows_vmr_at_low_temperature() -> None:
    # GaAs: 1.519 eV at 0 K, 1.422 eV at 300 K (Vurgaftman, Meyer and Ram-Mohan, J. Appl.
    # Phys. 89, 5815 (2001)); the engine keeps the measured 300 K gap (1.424 eV) and moves it
    # by VMR's Varshni law, so it must sit within 3 meV of VMR at 0 K.
    block = compound_report("GaAs", temperature_K=0.0)["band_gap"]
    assert block["measured_eV"] == pytest.approx(1.519, abs=0.003)
    assert block["temperature_law_assumed"] is False


def test_wavelength_of_the_gaas_gap() -> None:
    # lambda = hc / E = 1239.84 nm eV / 1.424 eV = 870.7 nm (CODATA hc; common practice).
    block = compound_report("GaAs")["band_gap"]
    assert block["wavelength_nm"] == pytest.approx(1239.84 / 1.424, rel=1e-4)
    assert block["route"] == "measured"


def test_report_keys_for_an_unmeasured_compound() -> None:
    report = compound_report("TlP")
    gap = report["band_gap"]
    assert gap["measured_eV"] is None and gap["cross_validated_eV"] is None
    assert gap["value_source"] == "estimate" and gap["uncertainty_eV"] > 0
    assert gap["route"].startswith("estimate")
    assert gap["kind"] in ("direct", "indirect", "semimetal")
    assert set(report["tight_binding"]) >= {"gamma_gap_eV", "min_gap_eV", "direct"}
    assert set(report["spin_orbit"]) >= {"splitting_eV", "source"}


def test_cross_validated_value_reported_for_measured_compounds() -> None:
    table = catalogue_table()
    at = gaps_at(300.0)
    i = table.index("InP")
    assert np.isfinite(at.cross_validated_eV[i])


@pytest.mark.xfail(strict=True, reason=(
    "issue-11 targets not all reached yet: nested leave-one-out MAE 0.50 eV (target 0.30), "
    "fourfold III-V/II-VI 0.39 eV (0.25), largest error 3.4 eV for BaO (1.0); the kind "
    "target (85 %) is met: 54 of 61"))
def test_issue_targets_for_the_gap_estimator() -> None:
    model = gap_model()
    table = catalogue_table()
    four = np.array([c.family in ("III-V", "II-VI") and p == "fourfold"
                     for c, p in zip(table.compounds, table.coordination_predicted, strict=True)])
    known = np.isfinite(model.measured_300K_eV)
    errors = np.abs(model.cross_validated_300K_eV - model.measured_300K_eV)
    correct, total = model.kind_accuracy()
    assert model.loo_mae_eV <= 0.30
    assert np.mean(errors[known & four]) <= 0.25
    assert model.loo_max_eV <= 1.0
    assert correct >= 0.85 * total


def test_direct_or_indirect_is_right_for_most_measured_compounds() -> None:
    # Issue target (ours): the kind right for at least 85 % of the measured compounds, in
    # nested leave-one-out (measured kinds: seed_data, Madelung 2004 and others, from memory).
    correct, total = gap_model().kind_accuracy()
    assert total >= 55
    assert correct >= 0.85 * total


def test_every_positive_estimate_has_its_wavelength_range() -> None:
    # lambda = hc / E (common practice): the range of E +/- u maps to [hc/(E+u), hc/(E-u)].
    gap = compound_report("GaAs")["band_gap"]
    short, long = gap["wavelength_range_nm"]
    estimate, u = gap["estimate_eV"], gap["uncertainty_eV"]
    assert short == pytest.approx(1239.84 / (estimate + u), rel=1e-4)
    assert long == pytest.approx(1239.84 / (estimate - u), rel=1e-4)
    assert compound_report("HgTe")["band_gap"]["wavelength_range_nm"] is None  # E < 0
