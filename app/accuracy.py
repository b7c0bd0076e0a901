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
from screening.gaps import D10_CATIONS, FEATURE_NAMES, gap_model

ESTIMATOR = (
    "Eg ≈ b0 + E_TB (b1 + b2 αp + b3 n_d): E_TB the smallest gap of the sp3 tight-binding "
    "model at Γ, X or L, αp the bond polarity (Harrison), n_d = 1 for a cation with a filled d "
    f"shell close below the valence band ({', '.join(sorted(D10_CATIONS))}), else 0. The four "
    "coefficients are fitted by least squares on every measured gap; each compound's "
    "leave-one-out estimate comes from the fit made without it."
)
LIMITS: tuple[str, ...] = (
    "Shallow d states and p-d repulsion: the filled d shells of Zn, Cd, Cu, Ag, Ga and In push "
    "the valence band up and the gap down; the sp3 model has no d states, and the single n_d "
    "term follows this only on average.",
    "Relativistic Hg and Tl: the atom solver is non-relativistic and the model has no "
    "spin-orbit splitting, so Hg and Tl compounds are unreliable (HgTe, measured as a "
    "semimetal, is estimated well above zero).",
    "First-row atoms (N, O, F anions; B, Be, Li cations): short bonds and compact 2p states, "
    "where universal tight-binding parameters fit worst.",
    "Compounds with no chemical neighbour among the measured ones: the estimate extrapolates, "
    "and the family's error bar may understate the error.",
    "The sp3 conduction bands away from Γ are poor (no s* or d states): gaps at X or L, and "
    "so indirect gaps, are less reliable than direct ones.",
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
            "uncertainty_eV": _round(model.uncertainty_eV[i]),
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
    return {
        "temperature_K": 300.0,
        "n": len(rows),
        "mae_eV": _round(model.loo_mae_eV),
        "max_eV": _round(model.loo_max_eV),
        "rms_eV": _round(float(np.sqrt(np.mean(errors**2)))),
        "families": {str(k): v for k, v in families.items()},
        "estimator": ESTIMATOR,
        "coefficients": {name: _round(c) for name, c in
                         zip(FEATURE_NAMES, model.fit.coefficients, strict=True)},
        "largest_errors": [{"formula": r["formula"], "error_eV": r["error_eV"]} for r in worst],
        "limits": list(LIMITS),
        "rows": rows,
    }
