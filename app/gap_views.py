"""The band-gap part of a compound's page and text: gap lines, sp3 model gaps, band chart data.

An estimate is never shown without its uncertainty and never in place of a measurement: the
measured gap and the estimate are separate, labelled lines, each with its photon wavelength.
"""

from __future__ import annotations

from typing import Any

from app.band_data import bands_payload
from app.views import Line, Section, dig, wavelength_of
from screening.bands import MODEL_LIMITS

ESTIMATOR = ("Gaussian process over the band structure's physical features "
             "(tight-binding gap, polarity, atomic levels, p-d repulsion)")
TIGHT_BINDING = "J. C. Slater and G. F. Koster, Phys. Rev. 94, 1498 (1954); " \
    "W. A. Harrison, Phys. Rev. B 24, 5835 (1981)"
CHART_POINTS = 300
"""k-points of the band chart on the compound page."""


def _moved(gap: dict[str, Any]) -> str:
    """How a 300 K value reaches the block's temperature ("" at 300 K)."""
    temperature = gap["temperature_K"]
    if temperature == 300.0:
        return ""
    law = "assumed temperature law" if gap.get("temperature_law_assumed") else "temperature law"
    return f", moved to {temperature:g} K by the {law}"


def _error_bar_text(model: dict[str, Any]) -> str:
    """How the ± of an estimate was validated, in one sentence."""
    one, two = model.get("within_one_uncertainty"), model.get("within_two_uncertainties")
    text = (f"fit of ours on {model.get('n_measured')} measured gaps; ± is the estimate's own "
            "predictive uncertainty")
    if one is not None and two is not None:
        text += (f", validated by nested leave-one-out: {100 * one:.0f} % of held-out errors "
                 f"within ±1, {100 * two:.0f} % within ±2")
    return text


def _range(gap: dict[str, Any]) -> tuple[float, float | None] | None:
    """The estimate's wavelength range, where it is an estimate with a positive gap."""
    span = gap.get("wavelength_range_nm")
    if not span:
        return None
    return (float(span[0]), None if span[1] is None else float(span[1]))


def _semimetal_note(gap: dict[str, Any]) -> str:
    """A warning where the estimate is, or may be, a semimetal."""
    if gap.get("value_source") == "measured":
        return ""
    if gap.get("semimetal"):
        return "; negative: a semimetal in this estimate, no emission wavelength"
    if gap.get("may_be_semimetal"):
        return "; its range reaches zero: the compound may be a semimetal"
    return ""


def band_gap_section(report: dict[str, Any]) -> Section:
    """The band-gap block: measured at T, estimate ± uncertainty, leave-one-out, kind, law.

    Args:
        report: An engine report with `band_gap` (docs/report-schema.md).
    """
    gap = report["band_gap"]
    temperature = gap["temperature_K"]
    model = gap.get("model") or {}
    measured = dig(report, "measured.band_gap_eV") or {}
    measured_source = str(measured.get("source") or "no measured value in the seed data")
    if measured.get("from_memory"):
        measured_source += " (from memory)"
    family_error = _error_bar_text(model)
    kind_item = dig(report, "measured.gap_kind") or {}
    has_measured = gap.get("measured_eV") is not None
    loo = gap.get("cross_validated_eV")
    so = report.get("spin_orbit") or {}
    lines = [
        Line(f"Band gap at {temperature:g} K, measured", gap.get("measured_eV"), "eV",
             "measured at 300 K" + _moved(gap) if has_measured else "measured",
             measured_source, wavelength_nm=wavelength_of(gap.get("measured_eV")),
             key="measured"),
        Line(f"Band gap at {temperature:g} K, estimate", gap.get("estimate_eV"), "eV",
             ESTIMATOR + _moved(gap) + _semimetal_note(gap), family_error,
             uncertainty=gap.get("uncertainty_eV"),
             wavelength_nm=wavelength_of(gap.get("estimate_eV")), key="estimate",
             wavelength_range_nm=_range(gap)),
        Line("Leave-one-out estimate", loo, "eV",
             "the estimator refitted without this compound" + _moved(gap) if has_measured
             else "no measured gap to leave out", family_error,
             uncertainty=gap.get("cross_validated_uncertainty_eV") if loo is not None else None,
             wavelength_nm=wavelength_of(loo), key="cross_validated"),
        Line("Gap kind", gap.get("kind"), "", gap.get("kind_source") or "",
             str(kind_item.get("source") or MODEL_LIMITS), key="kind"),
        Line("Valence-band spin-orbit splitting Δ0", so.get("splitting_eV"), "eV",
             str(so.get("route") or ""), str(so.get("source") or ""), key="spin_orbit"),
        Line("Temperature law", "assumed" if gap.get("temperature_law_assumed") else "published",
             "", "Varshni law: its shift from 300 K moves measured gap and estimate alike",
             gap.get("temperature_law") or "", key="temperature_law"),
        Line("Estimator: mean absolute error", model.get("loo_mae_eV"), "eV",
             f"leave-one-out over all {model.get('n_measured')} measured gaps at 300 K",
             "see the model accuracy page", key="model_mae"),
        Line("Estimator: largest error", model.get("loo_max_eV"), "eV",
             f"leave-one-out over all {model.get('n_measured')} measured gaps at 300 K",
             "see the model accuracy page", key="model_max"),
    ]
    return Section(f"Band gap at {temperature:g} K", tuple(lines))


def tight_binding_section(report: dict[str, Any],
                          bands: dict[str, Any] | None = None) -> Section:
    """The sp3 model's own gaps (raw model output, before calibration), with wavelengths.

    The conduction valleys (Γ, X, L) are given above the valence-band maximum, as tabulated
    valley gaps are; the direct (vertical) gaps at the same points follow, labelled as such.

    Args:
        report: An engine report of a binary.
        bands: Its `bands_payload` if already computed (else computed here).
    """
    bands = bands or bands_payload(report["formula"], points=CHART_POINTS)
    route = "sp3 tight binding; raw model output, not an estimate of the measured gap"
    valley_route = route + "; lowest conduction level there minus the valence-band maximum"

    def line(label: str, value: Any, route: str, key: str) -> Line:
        return Line(label, value, "eV", route, TIGHT_BINDING, wavelength_nm=wavelength_of(value),
                    key=key)

    lines = [line(f"{v['label']} valley above the valence-band maximum", v["above_vbm_eV"],
                  valley_route, f"{VALLEY_KEYS[v['label']]}_valley_eV")
             for v in bands["valleys"]]
    lines.append(line(f"Smallest gap along the path {bands['path']}",
                      dig(report, "tight_binding.min_gap_eV"), route, "min_gap_eV"))
    lines += [line(f"Direct gap at {name}", dig(report, f"tight_binding.{key}_gap_eV"),
                   route + "; vertical: conduction minus valence at the same point",
                   f"{key}_gap_eV") for name, key in VALLEY_KEYS.items()]
    direct = dig(report, "tight_binding.direct")
    lines.append(Line("Direct in the model", None if direct is None else
                      ("yes" if direct else "no"), "", route, MODEL_LIMITS, key="direct"))
    return Section("Band edges of the sp3 model", tuple(lines))


VALLEY_KEYS: dict[str, str] = {"Γ": "gamma", "X": "x", "L": "l"}
"""Point label -> the key stem of the report's `tight_binding` gaps ("x" -> x_gap_eV)."""


def gap_summary(report: dict[str, Any]) -> dict[str, Any]:
    """The gap shown first on the page: value at T, measured or estimate, its wavelength."""
    gap = report["band_gap"]
    return {
        "value_eV": gap.get("value_eV"),
        "source": gap.get("value_source"),
        "uncertainty_eV": gap.get("uncertainty_eV") if gap.get("value_source") != "measured"
        else None,
        "wavelength_nm": gap.get("wavelength_nm"),
        "wavelength_range_nm": gap.get("wavelength_range_nm"),
        "semimetal": gap.get("semimetal"),
        "may_be_semimetal": gap.get("may_be_semimetal"),
        "temperature_K": gap["temperature_K"],
        "kind": gap.get("kind"),
        "kind_source": gap.get("kind_source"),
    }


def band_chart(report: dict[str, Any], bands: dict[str, Any] | None = None) -> dict[str, Any]:
    """Data of the band chart: bands relative to the VBM, corners, model gap, gap at T."""
    bands = bands or bands_payload(report["formula"], points=CHART_POINTS)
    return {
        "formula": bands["formula"],
        "distance": bands["distance"],
        "bands": [list(b) for b in zip(*bands["bands_eV"], strict=True)],
        "labels": bands["labels"],
        "model_gap_eV": bands["gap_eV"],
        "direct": bands["direct"],
        "valence_top": bands["valence_top"],
        "conduction_bottom": bands["conduction_bottom"],
        "shown_gap": gap_summary(report),
        "limits": bands["model_limits"],
    }
