"""How well the band-gap estimator does: measured against leave-one-out estimate, per compound.

`accuracy_payload` is the one object of the "Model accuracy" page and `GET /api/accuracy`.
Everything is at 300 K, the temperature of the tabulated measurements the estimator is
calibrated on; the uncertainty given with an estimate at any temperature is the family's error
found here. There is therefore no temperature selector on this page.
"""

from __future__ import annotations

import math
from typing import Any

import numpy as np

from app.params import FAMILY_CHOICES
from app.views import wavelength_of
from screening.evaluate import catalogue_table
from screening.gaps import D10_CATIONS, gap_model

ESTIMATOR = (
    "A Gaussian process with a linear mean over physical features of each compound: the "
    "smallest gap of the sp3 or sp3s* tight-binding band structure (lowered by a third of the "
    "spin-orbit splitting), the bond polarity αp (Harrison), the atomic s and p levels, 1/d², "
    "the predicted coordination, the p-d repulsion of a filled cation d shell "
    f"({', '.join(sorted(D10_CATIONS))}) and the pull of an empty cation d level (Ca, Sr, Ba, "
    "Rb). Among a few candidate models the one with the highest marginal likelihood is kept; "
    "its standard deviations are scaled on its own leave-one-out errors by the rule (one "
    "standard deviation right, two right, the larger, or halfway) that covers a held-out "
    "fifth of the training data best. Each compound's leave-one-out estimate comes from a "
    "model that made every one of these choices without it (nested leave-one-out)."
)
LIMITS: tuple[str, ...] = (
    "Few measured neighbours: a compound far from every measured one gets a wide error bar; "
    "oxides and the alkaline-earth chalcogenides (BaO, CaO, ZnO, CdO) are where the band "
    "structure's zincblende picture fits worst, and the largest errors sit there.",
    "Shallow d states: the filled d shells of Zn, Cd, Hg, Cu, Ag, Ga and In push the valence "
    "band up; the model has no d orbitals, only the p-d repulsion feature.",
    "Relativistic Hg and Tl: with scalar-relativistic levels HgTe is estimated at a negative "
    "gap (a semimetal) as measured, HgSe and α-Sn still slightly above zero; measured values "
    "are what the pages show.",
    "The sp3s* conduction valleys use constants taken from silicon alone; the valley order "
    "is right for Si, GaP and AlAs but not for Ge and GaAs, so the direct/indirect verdict "
    "of an estimate is a classifier's, with the accuracy shown above.",
    "Most measured gaps in the seed data are recalled from handbooks (marked \"from memory\"); "
    "an error in them is an error here.",
)


def _round(value: float, digits: int = 6) -> float | None:
    return round(float(value), digits) if math.isfinite(float(value)) else None


def accuracy_payload() -> dict[str, Any]:
    """Measured against leave-one-out estimated gap for every measured compound, at 300 K.

    Returns:
        A JSON-ready dict: `rows` (formula, family, measured_eV with source and wavelength,
        loo_eV ± uncertainty_eV with wavelength, error_eV = loo - measured), the summary
        (`n`, `mae_eV`, `max_eV`, `rms_eV`, `families` with n and RMS), the estimator's formula
        and coefficients, the largest errors and the known limits.
    """
    model = gap_model()
    table = catalogue_table()
    order = {f: i for i, f in enumerate(FAMILY_CHOICES)}
    rows = []
    for i, compound in enumerate(table.compounds):
        measured = float(model.measured_300K_eV[i])
        if not math.isfinite(measured):
            continue
        loo = float(model.cross_validated_300K_eV[i])
        rows.append({
            "formula": compound.formula,
            "family": compound.family,
            "measured_eV": _round(measured),
            "measured_wavelength_nm": _round(wavelength_of(measured) or math.nan, 1),
            "measured_source": table.measured[i]["band_gap"].source,
            "loo_eV": _round(loo),
            "uncertainty_eV": _round(model.cross_validated_uncertainty_eV[i]),
            "loo_wavelength_nm": _round(wavelength_of(loo) or math.nan, 1),
            "error_eV": _round(loo - measured),
        })
    rows.sort(key=lambda r: (order.get(r["family"], len(order)), r["formula"]))
    errors = np.array([r["error_eV"] for r in rows])
    families = {
        family: {"n": sum(r["family"] == family for r in rows),
                 "rms_eV": _round(rms)}
        for family, rms in sorted(model.family_rms_eV.items(), key=lambda kv: order[kv[0]])
    }
    worst = sorted(rows, key=lambda r: -abs(r["error_eV"]))[:5]
    correct, total = model.kind_accuracy()
    hyper = model.validation.final_hyper
    return {
        "temperature_K": 300.0,
        "n": len(rows),
        "mae_eV": _round(model.loo_mae_eV),
        "max_eV": _round(model.loo_max_eV),
        "rms_eV": _round(float(np.sqrt(np.mean(errors**2)))),
        "within_one_uncertainty": _round(model.coverage(1.0), 4),
        "within_two_uncertainties": _round(model.coverage(2.0), 4),
        "kind_correct": correct,
        "kind_total": total,
        "families": {str(k): v for k, v in families.items()},
        "estimator": ESTIMATOR,
        "model": {
            "feature_set": model.feature_set,
            "length_scales": [_round(v, 4) for v in hyper.length],
            "signal_eV": _round(hyper.signal, 4),
            "noise_eV": _round(hyper.noise, 4),
            "calibration_scale": _round(model.validation.final_scale, 4),
        },
        "largest_errors": [{"formula": r["formula"], "error_eV": r["error_eV"]} for r in worst],
        "limits": list(LIMITS),
        "rows": rows,
    }
