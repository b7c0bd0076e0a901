"""The band-gap estimator's fit and its nested leave-one-out validation.

For a training set (every measured compound, or all but one of them):

1. each candidate model of `screening.gap_features.FEATURE_SETS` is fitted (a Gaussian
   process with a linear mean, `screening.gp`) on the standardised training features, and the
   one with the highest marginal likelihood is kept;
2. its closed-form leave-one-out z-scores on the training rows set the calibration scale s of
   its standard deviations, by a rule (`CALIBRATION_RULES`) itself chosen on an inner split
   of the training rows (`choose_calibration_rule`);
3. the process predicts mean and standard deviation (times s) for any compound.

The leave-one-out validation repeats 1-3 without each measured compound in turn and predicts
it: every choice (model, hyperparameters, scale, standardisation) is made inside the fold, so
the figures are honest. The direct/indirect classifier (`screening.gap_kind`) is validated
the same way.

The validation costs about 20 s, so its result is stored in
``screening/data/gap_validation.json`` with a fingerprint of every input; the estimator uses
the stored result only while the fingerprint matches and recomputes it otherwise.
``python -m screening.gap_validation --write`` regenerates the file, ``--check`` tests it.
"""

from __future__ import annotations

import argparse
import hashlib
import json
import sys
from dataclasses import dataclass
from importlib import resources
from pathlib import Path
from typing import Any, Final

import numpy as np
from numpy.typing import NDArray

from screening import gp
from screening.gap_features import FEATURE_SETS, FeatureSet, GapFeatures, standardise
from screening.gap_kind import predict_indirect

VALIDATION_FILE: Final[str] = "gap_validation.json"
"""Name of the stored validation in the ``screening.data`` package directory."""

COVERAGE_ONE: Final[float] = 0.683
"""Share of training z-scores the calibration puts within one standard deviation."""

COVERAGE_TWO: Final[float] = 0.954
"""Share of training z-scores the calibration puts within two standard deviations."""


def design(features: GapFeatures, feature_set: FeatureSet, train: NDArray[np.bool_]
           ) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
    """GP inputs and basis (constant first) for every compound, standardised on ``train``."""
    inputs = standardise(features.matrix(feature_set.inputs), train)
    basis = np.column_stack([np.ones(features.physical_gap_eV.size),
                             features.matrix(feature_set.basis)])
    return inputs, standardise(basis, train, keep_first=True)


CALIBRATION_RULES: Final[dict[str, str]] = {
    "one": "the 68.3 % quantile of the |z|-scores (one standard deviation right)",
    "two": "half the 95.4 % quantile (two standard deviations right)",
    "both": "the larger of the two (both at least right)",
    "between": "their geometric mean (halfway in log between the two)",
}
"""Candidate rules for the calibration scale, from |z| = |error| / standard deviation."""

INNER_CALIBRATION_FOLDS: Final[int] = 5
"""Folds of the inner split on which the calibration rule is chosen."""


def _scale_by_rule(z: NDArray[np.float64], rule: str) -> float:
    one, two = np.quantile(z, COVERAGE_ONE), np.quantile(z, COVERAGE_TWO) / 2.0
    value = {"one": one, "two": two, "both": max(one, two), "between": np.sqrt(one * two)}[rule]
    return float(max(value, 0.5))


def _loo_z(process: gp.GaussianProcess) -> NDArray[np.float64]:
    mean, sd = process.leave_one_out()
    return np.abs(process.y - mean) / sd


def choose_calibration_rule(process: gp.GaussianProcess) -> str:
    """The rule whose scale, set on four fifths of the training rows, covers the other fifth best.

    Each of `INNER_CALIBRATION_FOLDS` parts of the training rows is held out in turn; the
    process (its hyperparameters kept) is conditioned on the rest, each rule sets a scale from
    the rest's closed-form leave-one-out |z|, and the held-out |z| are counted within one and
    two scaled standard deviations. The rule with the smallest |share1 - 0.683| +
    |share2 - 0.954| wins (ties: the order of `CALIBRATION_RULES`).
    """
    n = process.y.size
    folds = np.arange(n) % INNER_CALIBRATION_FOLDS
    held: dict[str, list[float]] = {rule: [] for rule in CALIBRATION_RULES}
    for f in range(INNER_CALIBRATION_FOLDS):
        out = folds == f
        rest = gp.condition(process.x[~out], process.h[~out], process.y[~out], process.hyper)
        z_rest = _loo_z(rest)
        mean, sd = rest.predict(process.x[out], process.h[out])
        z_out = np.abs(process.y[out] - mean) / sd
        for rule in CALIBRATION_RULES:
            held[rule] += list(z_out / _scale_by_rule(z_rest, rule))

    def miss(rule: str) -> float:
        z = np.array(held[rule])
        return abs(np.mean(z <= 1) - COVERAGE_ONE) + abs(np.mean(z <= 2) - COVERAGE_TWO)

    return min(CALIBRATION_RULES, key=miss)


def calibration_scale(process: gp.GaussianProcess, rule: str | None = None) -> float:
    """Scale of the standard deviations from the process's own leave-one-out |z| (>= 0.5).

    Args:
        process: the fitted process.
        rule: one of `CALIBRATION_RULES`; None chooses it (`choose_calibration_rule`).
    """
    return _scale_by_rule(_loo_z(process), rule or choose_calibration_rule(process))


@dataclass(frozen=True)
class FittedGap:
    """A fitted estimator: the chosen model, its process (calibrated) and the design."""

    feature_set: FeatureSet
    process: gp.GaussianProcess
    inputs: NDArray[np.float64]
    basis: NDArray[np.float64]

    def predict(self) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
        """Mean and calibrated standard deviation for every compound, eV."""
        return self.process.predict(self.inputs, self.basis)


def fit_gap(features: GapFeatures, targets: NDArray[np.float64], train: NDArray[np.bool_],
            *, fixed: tuple[str, gp.Hyperparameters, float] | None = None) -> FittedGap:
    """Choose, fit and calibrate the estimator on the training rows.

    Args:
        features: every compound's features.
        targets: measured gaps (eV); only ``targets[train]`` is read.
        train: the training rows.
        fixed: (feature-set name, hyperparameters, scale) to condition on without fitting.
    """
    y = targets[train]
    if fixed is not None:
        name, hyper, scale = fixed
        chosen = next(fs for fs in FEATURE_SETS if fs.name == name)
        inputs, basis = design(features, chosen, train)
        process = gp.condition(inputs[train], basis[train], y, hyper, scale)
        return FittedGap(chosen, process, inputs, basis)
    best: FittedGap | None = None
    for feature_set in FEATURE_SETS:
        inputs, basis = design(features, feature_set, train)
        process = gp.fit(inputs[train], basis[train], y)
        if best is None or process.log_evidence > best.process.log_evidence:
            best = FittedGap(feature_set, process, inputs, basis)
    assert best is not None
    scaled = gp.with_scale(best.process, calibration_scale(best.process))
    return FittedGap(best.feature_set, scaled, best.inputs, best.basis)


@dataclass(frozen=True)
class Validation:
    """Nested leave-one-out results (arrays over the catalogue, NaN where not measured).

    Attributes:
        fingerprint: hash of every input; the stored result is used only while it matches.
        loo_mean_eV, loo_sd_eV: each measured compound predicted without itself.
        loo_feature_set: the model each fold chose ("" where not measured).
        loo_indirect_probability: P(indirect) predicted without the compound (NaN where the
            measured kind is neither direct nor indirect).
        final_set, final_hyper, final_scale: the estimator fitted on every measured gap.
    """

    fingerprint: str
    loo_mean_eV: NDArray[np.float64]
    loo_sd_eV: NDArray[np.float64]
    loo_feature_set: tuple[str, ...]
    loo_indirect_probability: NDArray[np.float64]
    final_set: str
    final_hyper: gp.Hyperparameters
    final_scale: float


def fingerprint(formulas: tuple[str, ...], features: GapFeatures, targets: NDArray[np.float64],
                kinds: tuple[str | None, ...]) -> str:
    """SHA-256 of every input of the validation (values rounded to 1e-9)."""
    payload = {
        "formulas": list(formulas),
        "features": {n: np.round(features.column(n), 9).tolist() for n in GapFeatures.names()},
        "targets": np.round(targets, 9).tolist(),
        "kinds": list(kinds),
        "sets": [[fs.name, list(fs.basis), list(fs.inputs)] for fs in FEATURE_SETS],
        "calibration": [COVERAGE_ONE, COVERAGE_TWO, sorted(CALIBRATION_RULES),
                        INNER_CALIBRATION_FOLDS],
        "gp": [gp.BASIS_PRIOR_SCALE, gp.LENGTH_BOUNDS, gp.SIGNAL_BOUNDS, gp.NOISE_BOUNDS],
    }
    text = json.dumps(payload, sort_keys=True, default=float).replace("NaN", "null")
    return hashlib.sha256(text.encode()).hexdigest()


def _kind_labels(kinds: tuple[str | None, ...]) -> tuple[NDArray[np.bool_], NDArray[np.bool_]]:
    labelled = np.array([k in ("direct", "indirect") for k in kinds])
    indirect = np.array([k == "indirect" for k in kinds])
    return labelled, indirect


def run_validation(formulas: tuple[str, ...], features: GapFeatures,
                   targets: NDArray[np.float64], kinds: tuple[str | None, ...]) -> Validation:
    """Nested leave-one-out of the gap estimator and the kind classifier, then the final fit."""
    n = len(formulas)
    measured = np.isfinite(targets)
    mean = np.full(n, np.nan)
    sd = np.full(n, np.nan)
    chosen = [""] * n
    for i in np.flatnonzero(measured):
        train = measured.copy()
        train[i] = False
        fitted = fit_gap(features, targets, train)
        m, s = fitted.process.predict(fitted.inputs[i], fitted.basis[i])
        mean[i], sd[i], chosen[i] = m[0], s[0], fitted.feature_set.name
    labelled, indirect = _kind_labels(kinds)
    probability = np.full(n, np.nan)
    for i in np.flatnonzero(labelled):
        train = labelled.copy()
        train[i] = False
        probability[i] = predict_indirect(features, train, indirect)[i]
    final = fit_gap(features, targets, measured)
    return Validation(
        fingerprint=fingerprint(formulas, features, targets, kinds),
        loo_mean_eV=mean, loo_sd_eV=sd, loo_feature_set=tuple(chosen),
        loo_indirect_probability=probability,
        final_set=final.feature_set.name, final_hyper=final.process.hyper,
        final_scale=final.process.scale,
    )


def _nan_list(values: NDArray[np.float64]) -> list[float | None]:
    return [None if not np.isfinite(v) else round(float(v), 9) for v in values]


def to_json(formulas: tuple[str, ...], validation: Validation) -> str:
    """The stored form: one line per compound, keyed by formula."""
    document: dict[str, Any] = {
        "description": "Nested leave-one-out validation of the band-gap estimator and its "
                       "final hyperparameters; regenerate with "
                       "`python -m screening.gap_validation --write`.",
        "fingerprint": validation.fingerprint,
        "final": {"feature_set": validation.final_set,
                  "length": validation.final_hyper.length.round(9).tolist(),
                  "signal": round(validation.final_hyper.signal, 9),
                  "noise": round(validation.final_hyper.noise, 9),
                  "scale": round(validation.final_scale, 9)},
        "compounds": {
            f: {"loo_mean_eV": m, "loo_sd_eV": s, "feature_set": c or None,
                "loo_indirect_probability": p}
            for f, m, s, c, p in zip(formulas, _nan_list(validation.loo_mean_eV),
                                     _nan_list(validation.loo_sd_eV), validation.loo_feature_set,
                                     _nan_list(validation.loo_indirect_probability), strict=True)
        },
    }
    return json.dumps(document, indent=1, allow_nan=False) + "\n"


def from_json(formulas: tuple[str, ...], text: str) -> Validation:
    """Inverse of `to_json` (raises KeyError where a formula is missing)."""
    document = json.loads(text)
    rows = [document["compounds"][f] for f in formulas]

    def column(key: str) -> NDArray[np.float64]:
        return np.array([np.nan if r[key] is None else r[key] for r in rows], dtype=float)

    final = document["final"]
    return Validation(
        fingerprint=document["fingerprint"],
        loo_mean_eV=column("loo_mean_eV"), loo_sd_eV=column("loo_sd_eV"),
        loo_feature_set=tuple(r["feature_set"] or "" for r in rows),
        loo_indirect_probability=column("loo_indirect_probability"),
        final_set=final["feature_set"],
        final_hyper=gp.Hyperparameters(np.array(final["length"], dtype=float),
                                       float(final["signal"]), float(final["noise"])),
        final_scale=float(final["scale"]),
    )


def stored_path() -> Path:
    """Path of the stored validation inside the installed package."""
    return Path(str(resources.files("screening").joinpath("data", VALIDATION_FILE)))


def load_or_run(formulas: tuple[str, ...], features: GapFeatures, targets: NDArray[np.float64],
                kinds: tuple[str | None, ...]) -> tuple[Validation, bool]:
    """The stored validation if its fingerprint matches the inputs, else a fresh one.

    Returns:
        (validation, True if it was read from the stored file).
    """
    expected = fingerprint(formulas, features, targets, kinds)
    try:
        stored = from_json(formulas, stored_path().read_text(encoding="utf-8"))
    except (OSError, KeyError, ValueError):
        stored = None
    if stored is not None and stored.fingerprint == expected:
        return stored, True
    return run_validation(formulas, features, targets, kinds), False


def main(argv: list[str] | None = None) -> int:
    """``--write`` regenerates the stored file; ``--check`` exits 1 if it is stale."""
    parser = argparse.ArgumentParser(prog="python -m screening.gap_validation")
    parser.add_argument("--write", action="store_true")
    parser.add_argument("--check", action="store_true")
    args = parser.parse_args(argv)
    from screening.gaps import validation_inputs  # the catalogue, only when run as a tool

    formulas, features, targets, kinds = validation_inputs()
    if args.check:
        expected = fingerprint(formulas, features, targets, kinds)
        try:
            stored = from_json(formulas, stored_path().read_text(encoding="utf-8"))
        except (OSError, KeyError, ValueError):
            print("stored gap validation missing or unreadable", file=sys.stderr)
            return 1
        if stored.fingerprint != expected:
            print("stored gap validation is stale: run --write", file=sys.stderr)
            return 1
        return 0
    text = to_json(formulas, run_validation(formulas, features, targets, kinds))
    if args.write:
        stored_path().write_text(text, encoding="utf-8")
    else:
        sys.stdout.write(text)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
