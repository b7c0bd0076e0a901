"""Band-gap estimates with a measured error bar, for every catalogue compound, at any T.

The estimator maps the sp3 tight-binding minimum gap E_TB (`screening.tight_binding`) to the
measured 300 K gap by a scale factor that depends linearly on the bond polarity alpha_p
(`screening.harrison`) and on whether the cation carries a shallow filled d shell (Cu, Ag, Zn,
Cd, Hg, Ga, In, Tl: p-d repulsion raises the valence-band top, which the sp3 model lacks):

    E_g ~ b0 + E_TB (b1 + b2 alpha_p + b3 n_d),   n_d = 1 for a d10 cation, else 0.

The four coefficients are fitted by least squares on every catalogue compound with a measured
gap (a calibration of ours, recomputed from the seed data at start). Its error is measured by
leave-one-out cross-validation (closed form for linear least squares: e_i = r_i / (1 - h_ii)),
reported as MAE and maximum, and as a per-family RMS that serves as each estimate's
uncertainty. An estimate never replaces a measurement: both are reported side by side.

Temperature: a gap at T is the 300 K value moved by the compound's Varshni law
(`screening.temperature`; flagged ``assumed`` where no published law is held).
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache
from typing import Final

import numpy as np
from numpy.typing import ArrayLike, NDArray

from screening.evaluate import CatalogueTable, catalogue_table
from screening.temperature import gaps_at_temperature, wavelength_nm
from screening.tight_binding import BandGaps, gaps, parameters_from_elements

D10_CATIONS: Final[frozenset[str]] = frozenset({"Cu", "Ag", "Zn", "Cd", "Hg", "Ga", "In", "Tl"})
"""Cations with a filled d shell close below the valence band (p-d repulsion)."""

FEATURE_NAMES: Final[tuple[str, ...]] = ("1", "E_TB", "E_TB*alpha_p", "E_TB*n_d")


@dataclass(frozen=True)
class LinearFit:
    """A least-squares fit with its closed-form leave-one-out predictions."""

    coefficients: NDArray[np.float64]
    targets: NDArray[np.float64]
    fitted: NDArray[np.float64]
    loo_predicted: NDArray[np.float64]

    @property
    def loo_errors(self) -> NDArray[np.float64]:
        """Leave-one-out prediction minus target, per sample."""
        return self.loo_predicted - self.targets


def linear_fit_loo(features: ArrayLike, targets: ArrayLike) -> LinearFit:
    """Ordinary least squares and its exact leave-one-out predictions.

    Args:
        features: design matrix (n, k), a column of ones included by the caller if wanted.
        targets: (n,) values to fit.

    Returns:
        The fit; ``loo_predicted[i]`` is what the fit made without sample i predicts for it,
        y_i - r_i / (1 - h_ii) with h the hat matrix.
    """
    x = np.asarray(features, dtype=float)
    y = np.asarray(targets, dtype=float)
    coefficients, *_ = np.linalg.lstsq(x, y, rcond=None)
    fitted = x @ coefficients
    leverage = np.einsum("ij,ji->i", x, np.linalg.pinv(x))
    loo = y - (y - fitted) / (1.0 - leverage)
    return LinearFit(coefficients, y, fitted, loo)


@dataclass(frozen=True)
class GapModel:
    """The calibrated gap estimator for the whole catalogue (arrays in catalogue order, eV).

    Attributes:
        tight_binding: the sp3 model's gaps per compound.
        fit: the fit on the compounds with a measured gap.
        measured_300K_eV: measured gap, NaN where none.
        estimate_300K_eV: the estimator's value (never replaces the measurement).
        cross_validated_300K_eV: leave-one-out estimate, NaN where no measurement.
        uncertainty_eV: RMS leave-one-out error of the compound's family.
    """

    tight_binding: BandGaps
    fit: LinearFit
    measured_300K_eV: NDArray[np.float64]
    estimate_300K_eV: NDArray[np.float64]
    cross_validated_300K_eV: NDArray[np.float64]
    uncertainty_eV: NDArray[np.float64]
    family_rms_eV: dict[str, float]

    @property
    def loo_mae_eV(self) -> float:
        """Mean absolute leave-one-out error over the measured compounds, eV."""
        return float(np.mean(np.abs(self.fit.loo_errors)))

    @property
    def loo_max_eV(self) -> float:
        """Largest absolute leave-one-out error, eV."""
        return float(np.max(np.abs(self.fit.loo_errors)))


def gap_features(table: CatalogueTable, tight_binding: BandGaps) -> NDArray[np.float64]:
    """Design matrix of the estimator: 1, E_TB, E_TB alpha_p, E_TB n_d per compound."""
    e_tb = tight_binding.min_gap_eV
    n_d = np.array([c.cation in D10_CATIONS for c in table.compounds], dtype=float)
    return np.column_stack([np.ones_like(e_tb), e_tb, e_tb * table.bonds.polarity, e_tb * n_d])


def _measured_gaps(table: CatalogueTable) -> NDArray[np.float64]:
    return np.array([float(m["band_gap"].value) if "band_gap" in m else np.nan
                     for m in table.measured])


@lru_cache(maxsize=1)
def gap_model() -> GapModel:
    """Fit and cross-validate the estimator on the catalogue (cached per process)."""
    table = catalogue_table()
    tb = gaps(parameters_from_elements(
        [c.cation for c in table.compounds], [c.anion for c in table.compounds],
        table.bond_length_used_angstrom,
    ))
    features = gap_features(table, tb)
    measured = _measured_gaps(table)
    known = np.isfinite(measured)
    fit = linear_fit_loo(features[known], measured[known])
    families = np.array([c.family for c in table.compounds])
    family_rms = {
        f: float(np.sqrt(np.mean(fit.loo_errors[families[known] == f] ** 2)))
        for f in sorted(set(families[known]))
    }
    overall_rms = float(np.sqrt(np.mean(fit.loo_errors**2)))
    cross_validated = np.full(len(measured), np.nan)
    cross_validated[known] = fit.loo_predicted
    return GapModel(
        tight_binding=tb,
        fit=fit,
        measured_300K_eV=measured,
        estimate_300K_eV=features @ fit.coefficients,
        cross_validated_300K_eV=cross_validated,
        uncertainty_eV=np.array([family_rms.get(f, overall_rms) for f in families]),
        family_rms_eV=family_rms,
    )


@dataclass(frozen=True)
class GapsAt:
    """Gaps of every catalogue compound at one temperature (eV; NaN where not defined).

    ``value_eV`` is what to show: the measured gap moved to T where one is measured, else
    the estimate moved to T; ``value_is_measured`` says which.
    """

    temperature_K: float
    measured_eV: NDArray[np.float64]
    estimate_eV: NDArray[np.float64]
    cross_validated_eV: NDArray[np.float64]
    uncertainty_eV: NDArray[np.float64]
    value_eV: NDArray[np.float64]
    value_is_measured: NDArray[np.bool_]
    wavelength_nm: NDArray[np.float64]
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
    result = GapsAt(
        temperature_K=float(temperature_K),
        measured_eV=measured,
        estimate_eV=estimate,
        cross_validated_eV=moved(model.cross_validated_300K_eV),
        uncertainty_eV=model.uncertainty_eV,
        value_eV=value,
        value_is_measured=has_measured,
        wavelength_nm=wavelength_nm(value),
        temperature_law_assumed=shift.assumed,
        temperature_law_source=shift.sources,
    )
    for array in vars(result).values():
        if isinstance(array, np.ndarray):
            array.setflags(write=False)
    return result
