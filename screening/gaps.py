"""Band-gap estimates with a measured error bar, for every catalogue compound, at any T.

The physics carries the estimate and a small statistical layer learns what it misses:

* the physical features of every compound (`screening.gap_features`): the tight-binding band
  structure's valleys, the bond polarity, the atomic levels, the p-d repulsion of a filled
  cation d shell, the predicted coordination;
* a Gaussian process with a linear mean over those features (`screening.gp`), chosen among a
  few candidate models by marginal likelihood and calibrated on its own leave-one-out errors
  (`screening.gap_validation`), fitted on every catalogue compound with a measured gap;
* a logistic classifier for direct against indirect (`screening.gap_kind`).

Every figure of merit is measured by nested leave-one-out (each measured compound predicted by
a model that chose everything without it): MAE, largest error, and the share of errors within
one and two of the stated uncertainties. A compound's uncertainty is the calibrated predictive
standard deviation of the process: wider where a compound is far from every measured one.

An estimate never replaces a measurement: both are reported side by side, and the value shown
is the measured one where it exists. A semimetal (negative gap E0 = E(Gamma6) - E(Gamma8)) has
no emission wavelength; an estimate whose range reaches zero or below may be a semimetal, and
its wavelength is given as a range only.

Temperature: a gap at T is the 300 K value moved by the compound's Varshni law
(`screening.temperature`; flagged ``assumed`` where no published law is held).
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache
from typing import Final

import numpy as np
from numpy.typing import NDArray

from screening.atoms import atom_levels, lowest_d_level_eV, term_values
from screening.evaluate import CatalogueTable, catalogue_table
from screening.gap_features import D_REPULSION_WINDOW_EV, GapFeatures, standardise
from screening.gap_kind import fit_kind, kind_inputs
from screening.gap_validation import Validation, fit_gap, load_or_run
from screening.temperature import gaps_at_temperature, wavelength_nm
from screening.tight_binding import BandGaps, gaps, parameters_from_elements
from screening.tight_binding.valleys import valleys

D10_CATIONS: Final[frozenset[str]] = frozenset({"Cu", "Ag", "Zn", "Cd", "Hg", "Ga", "In", "Tl"})
"""Cations with a filled d shell close below the valence band (p-d repulsion)."""


def _filled_d_level_eV(symbol: str) -> float:
    """Energy of the outermost filled d shell of an atom (eV), NaN if it has none."""
    shells = [lv for lv in atom_levels(symbol).levels if lv.l == 2 and lv.occupation >= 9.5]
    return shells[-1].energy_eV if shells else float("nan")


def _empty_d(cations: list[str], eps_s_eV: NDArray[np.float64], relativistic: bool
             ) -> NDArray[np.float64]:
    """1 / (empty d level - valence s level) of each cation, 1/eV; 0 where d is filled/unbound."""
    level, occupied = lowest_d_level_eV(cations, relativistic=relativistic)
    above = level - eps_s_eV
    usable = np.isfinite(level) & ~occupied & (above > 0)
    return np.where(usable, 1.0 / np.where(usable, above, 1.0), 0.0)


def _spin_orbit_eV(table: CatalogueTable, tb_params) -> NDArray[np.float64]:  # noqa: ANN001
    """Model valence-band spin-orbit splitting Delta0 per compound (0 where not available)."""
    try:
        from screening.atoms import spin_orbit_splitting_eV  # type: ignore[attr-defined]
        from screening.tight_binding import valence_spin_orbit_eV  # type: ignore[attr-defined]
    except ImportError:
        return np.zeros(len(table.compounds))
    cations = [c.cation for c in table.compounds]
    anions = [c.anion for c in table.compounds]
    return np.asarray(valence_spin_orbit_eV(
        tb_params, spin_orbit_splitting_eV(anions), spin_orbit_splitting_eV(cations)), float)


RELATIVISTIC: Final[bool] = True
"""Band-structure features from scalar-relativistic (scaled ZORA) term values."""


def physical_features(table: CatalogueTable, *, relativistic: bool = RELATIVISTIC
                      ) -> tuple[GapFeatures, BandGaps]:
    """The estimator's features of every catalogue compound, and the band structure's gaps.

    Args:
        table: the catalogue.
        relativistic: scalar-relativistic term values (the default) or non-relativistic ones
            (kept to measure what relativity brings).
    """
    cations = [c.cation for c in table.compounds]
    anions = [c.anion for c in table.compounds]
    params = parameters_from_elements(cations, anions, table.bond_length_used_angstrom,
                                      relativistic=relativistic)
    eps_s_c, eps_p_c = term_values(cations, relativistic=relativistic)
    _, eps_p_a = term_values(anions, relativistic=relativistic)
    tb = gaps(params)
    sstar = valleys(params)
    delta0 = _spin_orbit_eV(table, params)
    d_level = np.array([_filled_d_level_eV(c) for c in cations])
    depth = eps_p_a - d_level
    in_window = np.isfinite(depth) & (depth > 0) & (depth < D_REPULSION_WINDOW_EV)
    d_repulsion = np.where(in_window, 1.0 / np.where(in_window, depth, 1.0), 0.0)
    raise_top = delta0 / 3.0  # the Gamma8 valence top rises by Delta0 / 3
    features = GapFeatures(
        physical_gap_eV=tb.min_gap_eV - raise_top,
        gamma_eV=tb.gamma_gap_eV - raise_top,
        x_eV=tb.x_valley_eV - raise_top,
        l_eV=tb.l_valley_eV - raise_top,
        sstar_gap_eV=sstar.min_eV - raise_top,
        sstar_gamma_eV=sstar.gamma_eV - raise_top,
        sstar_x_eV=sstar.x_eV - raise_top,
        sstar_l_eV=sstar.l_eV - raise_top,
        spin_orbit_eV=delta0,
        polarity=np.asarray(table.bonds.polarity, float),
        cation_s_eV=np.asarray(eps_s_c, float),
        anion_p_eV=np.asarray(eps_p_a, float),
        inverse_d2=1.0 / np.asarray(table.bond_length_used_angstrom, float) ** 2,
        sixfold=np.array([p == "sixfold" for p in table.coordination_predicted], float),
        d_repulsion=d_repulsion,
        d10=np.array([c in D10_CATIONS for c in cations], float),
        empty_d=_empty_d(cations, eps_s_c, relativistic),
        cation_sp_eV=np.asarray(eps_p_c - eps_s_c, float),
        sixfold_known=np.array([(o or p) == "sixfold" for o, p in
                                zip(table.coordination_observed, table.coordination_predicted,
                                    strict=True)], float),
    )
    return features, tb


def _measured_gaps(table: CatalogueTable) -> NDArray[np.float64]:
    return np.array([float(m["band_gap"].value) if "band_gap" in m else np.nan
                     for m in table.measured])


def _measured_kinds(table: CatalogueTable) -> tuple[str | None, ...]:
    return tuple(str(m["gap_kind"].value) if "gap_kind" in m else None for m in table.measured)


def validation_inputs() -> tuple[tuple[str, ...], GapFeatures, NDArray[np.float64],
                                 tuple[str | None, ...]]:
    """(formulas, features, measured 300 K gaps, measured kinds) of the catalogue."""
    table = catalogue_table()
    features, _ = physical_features(table)
    return (tuple(c.formula for c in table.compounds), features, _measured_gaps(table),
            _measured_kinds(table))


@dataclass(frozen=True)
class GapModel:
    """The calibrated gap estimator for the whole catalogue (arrays in catalogue order, eV).

    Attributes:
        tight_binding: the band structure's gaps per compound.
        features: the estimator's inputs.
        validation: nested leave-one-out results and the final hyperparameters.
        validation_stored: True if the validation was read from the stored file.
        feature_set: the candidate model chosen on every measured gap.
        measured_300K_eV: measured gap, NaN where none (negative for a semimetal).
        measured_kind: measured kind ("direct", "indirect", "semimetal") or None.
        estimate_300K_eV: the estimator's value (never replaces the measurement).
        uncertainty_eV: calibrated predictive standard deviation of the estimate.
        cross_validated_300K_eV: leave-one-out estimate, NaN where no measurement.
        cross_validated_uncertainty_eV: its standard deviation.
        indirect_probability: P(indirect) from the classifier fitted on every measured kind.
        kind_estimate: "semimetal" where the estimate is negative, else the classifier's kind.
        family_rms_eV: RMS leave-one-out error per family.
    """

    tight_binding: BandGaps
    features: GapFeatures
    validation: Validation
    validation_stored: bool
    feature_set: str
    measured_300K_eV: NDArray[np.float64]
    measured_kind: tuple[str | None, ...]
    estimate_300K_eV: NDArray[np.float64]
    uncertainty_eV: NDArray[np.float64]
    cross_validated_300K_eV: NDArray[np.float64]
    cross_validated_uncertainty_eV: NDArray[np.float64]
    indirect_probability: NDArray[np.float64]
    kind_estimate: tuple[str, ...]
    family_rms_eV: dict[str, float]

    @property
    def loo_errors_eV(self) -> NDArray[np.float64]:
        """Leave-one-out estimate minus measurement, over the measured compounds."""
        known = np.isfinite(self.measured_300K_eV)
        return self.cross_validated_300K_eV[known] - self.measured_300K_eV[known]

    @property
    def n_measured(self) -> int:
        """Number of measured gaps the estimator is fitted and validated on."""
        return int(np.isfinite(self.measured_300K_eV).sum())

    @property
    def loo_mae_eV(self) -> float:
        """Mean absolute leave-one-out error over the measured compounds, eV."""
        return float(np.mean(np.abs(self.loo_errors_eV)))

    @property
    def loo_max_eV(self) -> float:
        """Largest absolute leave-one-out error, eV."""
        return float(np.max(np.abs(self.loo_errors_eV)))

    def coverage(self, k: float) -> float:
        """Share of leave-one-out errors within k of their own stated uncertainties."""
        known = np.isfinite(self.measured_300K_eV)
        sd = self.cross_validated_uncertainty_eV[known]
        return float(np.mean(np.abs(self.loo_errors_eV) <= k * sd))

    def kind_accuracy(self) -> tuple[int, int]:
        """(correct, total) of the leave-one-out kind over measured direct/indirect gaps."""
        p = self.validation.loo_indirect_probability
        labelled = np.isfinite(p)
        truth = np.array([k == "indirect" for k in self.measured_kind])
        return int(np.sum((p[labelled] >= 0.5) == truth[labelled])), int(labelled.sum())


@lru_cache(maxsize=1)
def gap_model() -> GapModel:
    """Fit the estimator on the catalogue and attach its validation (cached per process)."""
    table = catalogue_table()
    features, tb = physical_features(table)
    formulas = tuple(c.formula for c in table.compounds)
    measured = _measured_gaps(table)
    kinds = _measured_kinds(table)
    validation, stored = load_or_run(formulas, features, measured, kinds)
    known = np.isfinite(measured)
    final = fit_gap(features, measured, known, fixed=(
        validation.final_set, validation.final_hyper, validation.final_scale))
    estimate, uncertainty = final.predict()
    labelled = np.array([k in ("direct", "indirect") for k in kinds])
    z = standardise(kind_inputs(features), labelled)
    classifier = fit_kind(z[labelled], np.array([k == "indirect" for k in kinds])[labelled])
    p_indirect = classifier.probability_indirect(z)
    kind_estimate = tuple(
        "semimetal" if e <= 0 else ("indirect" if p >= 0.5 else "direct")
        for e, p in zip(estimate, p_indirect, strict=True))
    families = np.array([c.family for c in table.compounds])
    errors = validation.loo_mean_eV - measured
    family_rms = {f: float(np.sqrt(np.mean(errors[known & (families == f)] ** 2)))
                  for f in sorted(set(families[known]))}
    return GapModel(
        tight_binding=tb, features=features, validation=validation, validation_stored=stored,
        feature_set=validation.final_set, measured_300K_eV=measured, measured_kind=kinds,
        estimate_300K_eV=estimate, uncertainty_eV=uncertainty,
        cross_validated_300K_eV=validation.loo_mean_eV,
        cross_validated_uncertainty_eV=validation.loo_sd_eV,
        indirect_probability=p_indirect, kind_estimate=kind_estimate,
        family_rms_eV=family_rms,
    )


@dataclass(frozen=True)
class GapsAt:
    """Gaps of every catalogue compound at one temperature (eV; NaN where not defined).

    ``value_eV`` is what to show: the measured gap moved to T where one is measured, else
    the estimate moved to T; ``value_is_measured`` says which. ``semimetal`` is True for a
    measured semimetal and for a negative estimate; ``may_be_semimetal`` for an estimate whose
    range (value +/- uncertainty) reaches zero. ``wavelength_nm`` is NaN for both; the
    wavelength range of every estimate (measured compounds included) is
    ``wavelength_short_nm`` to ``wavelength_long_nm`` (NaN long end where the range reaches
    zero, both NaN for a negative estimate).
    """

    temperature_K: float
    measured_eV: NDArray[np.float64]
    estimate_eV: NDArray[np.float64]
    cross_validated_eV: NDArray[np.float64]
    uncertainty_eV: NDArray[np.float64]
    value_eV: NDArray[np.float64]
    value_is_measured: NDArray[np.bool_]
    semimetal: NDArray[np.bool_]
    may_be_semimetal: NDArray[np.bool_]
    wavelength_nm: NDArray[np.float64]
    wavelength_short_nm: NDArray[np.float64]
    wavelength_long_nm: NDArray[np.float64]
    temperature_law_assumed: NDArray[np.bool_]
    temperature_law_source: tuple[str, ...]


def gaps_at(temperature_K: float = 300.0) -> GapsAt:
    """Measured and estimated gaps of the whole catalogue at one temperature (K).

    Cached per temperature; the arrays of the result are read-only.
    """
    return _gaps_at(float(temperature_K))


@lru_cache(maxsize=64)
def _gaps_at(temperature_K: float) -> GapsAt:
    model = gap_model()
    formulas = [c.formula for c in catalogue_table().compounds]
    shift = gaps_at_temperature(formulas, np.ones(len(formulas)), [temperature_K])
    delta = shift.gap_eV[:, 0] - 1.0  # the law's shift from 300 K, per compound

    def moved(values: NDArray[np.float64]) -> NDArray[np.float64]:
        return values + delta

    measured = np.where(model.measured_300K_eV > 0, moved(model.measured_300K_eV),
                        model.measured_300K_eV)
    estimate = moved(model.estimate_300K_eV)
    has_measured = np.isfinite(model.measured_300K_eV)
    value = np.where(has_measured, measured, estimate)
    measured_semimetal = np.array([k == "semimetal" for k in model.measured_kind])
    semimetal = measured_semimetal | np.where(has_measured, measured <= 0, estimate <= 0)
    low = estimate - model.uncertainty_eV
    high = estimate + model.uncertainty_eV
    may_be = ~has_measured & ~semimetal & (low <= 0)
    single = np.where(semimetal | may_be, np.nan, value)
    estimate_semimetal = estimate <= 0
    with np.errstate(invalid="ignore"):
        short = np.where(estimate_semimetal, np.nan, wavelength_nm(np.maximum(high, 1e-9)))
        long = np.where(estimate_semimetal | (low <= 0), np.nan,
                        wavelength_nm(np.maximum(low, 1e-9)))
    result = GapsAt(
        temperature_K=float(temperature_K),
        measured_eV=measured,
        estimate_eV=estimate,
        cross_validated_eV=moved(model.cross_validated_300K_eV),
        uncertainty_eV=model.uncertainty_eV,
        value_eV=value,
        value_is_measured=has_measured,
        semimetal=semimetal,
        may_be_semimetal=may_be,
        wavelength_nm=wavelength_nm(single),
        wavelength_short_nm=short,
        wavelength_long_nm=long,
        temperature_law_assumed=shift.assumed,
        temperature_law_source=shift.sources,
    )
    for array in vars(result).values():
        if isinstance(array, np.ndarray):
            array.setflags(write=False)
    return result
