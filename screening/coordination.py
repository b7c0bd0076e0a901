"""Fourfold or sixfold: Phillips' critical-ionicity rule.

Octet compounds with ionicity fi below the critical value 0.785 crystallise fourfold
(diamond, zincblende, wurtzite); above it, sixfold (rocksalt). J. C. Phillips,
Rev. Mod. Phys. 42, 317 (1970). Near the line the rule cannot decide: a compound whose fi
lies within the route's borderline half-width of 0.785 is reported ``borderline``.
"""

from __future__ import annotations

from typing import Final

import numpy as np
from numpy.typing import ArrayLike, NDArray

from screening.phillips import CRITICAL_IONICITY

BORDERLINE_HALF_WIDTH: Final[dict[str, float]] = {"spectroscopic": 0.02, "predictive": 0.05}
"""Half-width of the borderline band per route (a choice of ours, about each route's error
against Phillips' published ionicities; not fitted)."""


def predicted_coordination(ionicity: ArrayLike, half_width: float) -> NDArray[np.object_]:
    """``fourfold``, ``sixfold`` or ``borderline`` per compound; None where fi is NaN."""
    fi = np.asarray(ionicity, dtype=float)
    labels = np.select(
        [fi < CRITICAL_IONICITY - half_width, fi > CRITICAL_IONICITY + half_width,
         np.isfinite(fi)],
        ["fourfold", "sixfold", "borderline"],
        "",
    ).astype(object)
    labels[labels == ""] = None
    return labels
