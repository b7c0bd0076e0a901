"""Direct or indirect: a logistic classifier over physical features.

The inputs (`kind_inputs`, from `screening.gap_features`): the cation's p - s level
splitting (a deep cation s level pulls the s-like Gamma conduction state down), the
coordination, the bond polarity, a filled cation d shell, its p-d repulsion in a
centrosymmetric crystal, and a low empty cation d level (which pulls the X valley down). The
valley order of the sp3 and sp3s* models was tried as an input and classified worse (39
against 46 of 61 right in nested leave-one-out, before the empty d level was added).

P(indirect) = sigma(w . z + w0), z the inputs standardised on the training rows; w minimises
the log loss plus lambda |w|^2 / 2 (the constant is not penalised). lambda is chosen among
`PENALTIES` by five-fold cross-validation on the training rows alone, so a leave-one-out
figure made with `fit_kind` in every fold is nested and honest.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import NDArray
from scipy.optimize import minimize

from screening.gap_features import GapFeatures, standardise

PENALTIES: Final[tuple[float, ...]] = (0.1, 1.0, 10.0)
"""Candidate L2 penalties lambda."""

INNER_FOLDS: Final[int] = 5
"""Folds of the inner cross-validation that chooses lambda."""


def kind_inputs(features: GapFeatures) -> NDArray[np.float64]:
    """Cation p - s splitting, sixfold, polarity, d10, p-d repulsion if sixfold, empty d.

    The last one is the p-d repulsion of a filled cation d shell in a centrosymmetric
    (rocksalt) crystal, where symmetry forbids it at Gamma and lets it push the valence-band
    top up away from Gamma (AgCl, AgBr, CdO: indirect).
    """
    return np.column_stack([
        features.cation_sp_eV,
        features.sixfold_known,
        features.polarity,
        features.d10,
        features.sixfold_known * features.d_repulsion,
        features.empty_d,
    ])


@dataclass(frozen=True)
class KindFit:
    """A fitted classifier: weights of the standardised inputs (constant first) and lambda."""

    weights: NDArray[np.float64]
    penalty: float

    def probability_indirect(self, z: NDArray[np.float64]) -> NDArray[np.float64]:
        """P(indirect) for standardised inputs z (n, k)."""
        return 1.0 / (1.0 + np.exp(-(self.weights[0] + z @ self.weights[1:])))


def _loss(w: NDArray[np.float64], z: NDArray[np.float64], y: NDArray[np.float64],
          penalty: float) -> tuple[float, NDArray[np.float64]]:
    t = w[0] + z @ w[1:]
    p = 1.0 / (1.0 + np.exp(-t))
    loss = np.sum(np.logaddexp(0.0, t) - y * t) + 0.5 * penalty * np.sum(w[1:] ** 2)
    g = p - y
    grad = np.concatenate([[g.sum()], z.T @ g + penalty * w[1:]])
    return float(loss), grad


def _fit_penalty(z: NDArray[np.float64], y: NDArray[np.float64], penalty: float) -> KindFit:
    start = np.zeros(z.shape[1] + 1)
    result = minimize(_loss, start, args=(z, y, penalty), jac=True, method="L-BFGS-B")
    return KindFit(result.x, penalty)


def fit_kind(z: NDArray[np.float64], indirect: NDArray[np.bool_]) -> KindFit:
    """Fit on standardised inputs z (n, k) and labels; lambda by inner five-fold log loss."""
    y = indirect.astype(float)
    folds = np.arange(y.size) % INNER_FOLDS
    best: tuple[float, float] | None = None
    for penalty in PENALTIES:
        loss = 0.0
        for f in range(INNER_FOLDS):
            test = folds == f
            model = _fit_penalty(z[~test], y[~test], penalty)
            p = np.clip(model.probability_indirect(z[test]), 1e-9, 1 - 1e-9)
            loss -= float(np.sum(y[test] * np.log(p) + (1 - y[test]) * np.log(1 - p)))
        if best is None or loss < best[0] - 1e-12:
            best = (loss, penalty)
    assert best is not None
    return _fit_penalty(z, y, best[1])


def predict_indirect(
    features: GapFeatures, train: NDArray[np.bool_], indirect: NDArray[np.bool_]
) -> NDArray[np.float64]:
    """Fit on the training rows (labels ``indirect[train]``) and return P(indirect) for all."""
    z = standardise(kind_inputs(features), train)
    model = fit_kind(z[train], indirect[train])
    return model.probability_indirect(z)
