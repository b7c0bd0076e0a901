"""End-point gaps per conduction-band valley, for alloys whose end points differ in valley.

Bowing parameters are tabulated per valley (Gamma, X, L; Vurgaftman, Meyer & Ram-Mohan,
J. Appl. Phys. 89, 5815 (2001), "VMR"): an alloy's gap is the lowest of its valley gaps, each
interpolated between the end points' gaps *of that valley*. The end-point gap of each channel
at temperature T:

* ``fundamental``: :func:`screening.alloys.endpoints.endpoint_gaps`.
* ``Gamma``: the fundamental gap for a direct-gap binary; for an indirect one its measured
  300 K direct gap at Gamma (seed data ``direct_gap_gamma``) moved by its Gamma temperature law
  (VMR), or by the default Varshni shape of ``screening.temperature`` where none is held.
  Semimetals have none (NaN).
* ``X``, ``L``: the VMR valley law at T. For an indirect binary the valley that is lowest at
  300 K is shifted so that it equals the fundamental gap (the measured value stays exact);
  other valleys are VMR's own values. Absent (NaN) where no law is held: the II-VI, nitride
  and boron compounds.

Uncertainties: the fundamental gap's for the channels tied to it; 0 for VMR values and for
measured direct gaps (their sources state none).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from screening.alloys.endpoints import endpoint_gaps
from screening.reference import measured_compounds
from screening.temperature import (
    DEFAULT_ALPHA_MEV_PER_K,
    DEFAULT_BETA_K,
    REFERENCE_TEMPERATURE_K,
    load_varshni_table,
    varshni_shift_eV,
)

CHANNELS: tuple[str, ...] = ("Gamma", "X", "L", "fundamental")
"""Gap channels: the three valleys, and the fundamental gap for end points without valley data."""

GAMMA, X, L, FUNDAMENTAL = range(4)


@dataclass(frozen=True, eq=False)
class ChannelGaps:
    """End-point gaps per channel at one temperature.

    Attributes:
        formulas: The binaries, in the order given.
        temperature_K: Temperature (K).
        gap_eV: Gaps (eV), shape (nbinary, 4) in :data:`CHANNELS` order; NaN where absent.
        uncertainty_eV: Their uncertainties (eV), same shape.
        gap_kind: Measured kind per binary ("direct", "indirect", "semimetal") or None.
    """

    formulas: tuple[str, ...]
    temperature_K: float
    gap_eV: NDArray[np.float64]
    uncertainty_eV: NDArray[np.float64]
    gap_kind: tuple[str | None, ...]


def _default_shift(temperature_K: float) -> float:
    shift = varshni_shift_eV(DEFAULT_ALPHA_MEV_PER_K, DEFAULT_BETA_K, temperature_K)
    reference = varshni_shift_eV(DEFAULT_ALPHA_MEV_PER_K, DEFAULT_BETA_K, REFERENCE_TEMPERATURE_K)
    return float(shift - reference)


def channel_gaps(formulas: Sequence[str], temperature_K: float) -> ChannelGaps:
    """Return every binary's gap per channel (Gamma, X, L, fundamental) at one temperature.

    Args:
        formulas: Normalised binary formulas.
        temperature_K: Temperature in K (>= 0).

    Returns:
        The gaps and their uncertainties (eV).
    """
    names = tuple(formulas)
    measured = measured_compounds()
    laws = load_varshni_table()
    fundamental, fundamental_unc = endpoint_gaps(names, temperature_K)
    fundamental_300, _ = endpoint_gaps(names, REFERENCE_TEMPERATURE_K)
    gaps = np.full((len(names), len(CHANNELS)), np.nan)
    unc = np.zeros_like(gaps)
    kinds: list[str | None] = []
    temps = np.array([temperature_K, REFERENCE_TEMPERATURE_K])
    for n, formula in enumerate(names):  # loop over end-point binaries, not compositions
        data = measured.get(formula, {})
        kind = str(data["gap_kind"].value) if "gap_kind" in data else None
        kinds.append(kind)
        gaps[n, FUNDAMENTAL], unc[n, FUNDAMENTAL] = fundamental[n], fundamental_unc[n]
        valley_laws = {law.valley: law for law in laws.get(formula, ())}
        at = {v: law.gap_eV(temps) for v, law in valley_laws.items()}  # (E(T), E(300 K))
        if kind == "direct":
            gaps[n, GAMMA], unc[n, GAMMA] = fundamental[n], fundamental_unc[n]
        elif kind == "indirect" and "direct_gap_gamma" in data:
            shift = at["Gamma"][0] - at["Gamma"][1] if "Gamma" in at else _default_shift(
                temperature_K)
            gaps[n, GAMMA] = float(data["direct_gap_gamma"].value) + shift
        lowest = min(at, key=lambda v: at[v][1]) if at else None
        for channel, valley in ((X, "X"), (L, "L")):
            if valley not in at:
                continue
            gaps[n, channel] = at[valley][0]
            if kind == "indirect" and valley == lowest:
                gaps[n, channel] += fundamental_300[n] - at[valley][1]
                unc[n, channel] = fundamental_unc[n]
    unc = np.where(np.isnan(gaps), np.nan, unc)
    return ChannelGaps(names, float(temperature_K), gaps, unc, tuple(kinds))
