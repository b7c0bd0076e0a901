"""Gaussian-process regression with a linear mean basis, in numpy (no other dependency).

The model of a target y (n values) at inputs X (n x m, standardised by the caller) with basis
functions H (n x p):

    y = H beta + f(X) + noise,   beta ~ N(0, b^2 I),   f ~ GP(0, s_f^2 exp(-|dx / l|^2 / 2)),
    noise ~ N(0, s_n^2),

so y ~ N(0, K) with K = s_f^2 R + b^2 H H^T + s_n^2 I (C. E. Rasmussen and C. K. I. Williams,
Gaussian Processes for Machine Learning, MIT Press (2006), sections 2.2, 2.7 and 5.4). The
hyperparameters (one length scale l per input, s_f, s_n) maximise the log marginal likelihood
(L-BFGS-B with its analytic gradient, eq. 5.9, from fixed starting points, so every fit is
deterministic). The leave-one-out predictions of a fit with its hyperparameters held fixed
are closed form (eq. 5.12): mu_i = y_i - [K^-1 y]_i / [K^-1]_ii, var_i = 1 / [K^-1]_ii.

Predictive standard deviations are those of a new measurement (noise included), times a
calibration scale that the caller sets (`GaussianProcess.scale`).
"""

from __future__ import annotations

from dataclasses import dataclass, replace

import numpy as np
from numpy.typing import ArrayLike, NDArray
from scipy.linalg import cho_factor, cho_solve, solve_triangular
from scipy.optimize import minimize

BASIS_PRIOR_SCALE: float = 10.0
"""b: prior standard deviation of the basis coefficients (units of y per unit basis)."""

LENGTH_BOUNDS: tuple[float, float] = (0.05, 50.0)
"""Bounds of each length scale (in the standardised input units)."""

SIGNAL_BOUNDS: tuple[float, float] = (1e-3, 10.0)
"""Bounds of s_f (units of y)."""

NOISE_BOUNDS: tuple[float, float] = (1e-2, 3.0)
"""Bounds of s_n (units of y); the lower bound keeps K well conditioned."""


@dataclass(frozen=True)
class Hyperparameters:
    """Length scales (one per input), signal and noise standard deviations."""

    length: NDArray[np.float64]
    signal: float
    noise: float

    def as_log(self) -> NDArray[np.float64]:
        """The vector the optimiser works on: logs of (length..., signal, noise)."""
        return np.log(np.concatenate([self.length, [self.signal, self.noise]]))

    @classmethod
    def from_log(cls, theta: NDArray[np.float64]) -> Hyperparameters:
        """Inverse of `as_log`."""
        values = np.exp(theta)
        return cls(length=values[:-2].copy(), signal=float(values[-2]), noise=float(values[-1]))


def _squared_distances(xa: NDArray[np.float64], xb: NDArray[np.float64]) -> NDArray[np.float64]:
    """Per-input squared differences, shape (m, na, nb)."""
    return (xa.T[:, :, None] - xb.T[:, None, :]) ** 2


def _covariance(
    x: NDArray[np.float64], h: NDArray[np.float64], hyper: Hyperparameters
) -> tuple[NDArray[np.float64], NDArray[np.float64], NDArray[np.float64]]:
    """K, the correlation R and the squared differences of the training inputs."""
    d2 = _squared_distances(x, x)
    r = np.exp(-0.5 * np.tensordot(1.0 / hyper.length**2, d2, axes=1))
    k = hyper.signal**2 * r + BASIS_PRIOR_SCALE**2 * (h @ h.T)
    k[np.diag_indices_from(k)] += hyper.noise**2
    return k, r, d2


def negative_log_evidence(
    theta: NDArray[np.float64], x: NDArray[np.float64], h: NDArray[np.float64],
    y: NDArray[np.float64],
) -> tuple[float, NDArray[np.float64]]:
    """-log p(y | X, theta) and its gradient with respect to theta (log hyperparameters)."""
    hyper = Hyperparameters.from_log(theta)
    k, r, d2 = _covariance(x, h, hyper)
    try:
        factor = cho_factor(k, lower=True)
    except np.linalg.LinAlgError:
        return 1e10, np.zeros_like(theta)
    alpha = cho_solve(factor, y)
    value = 0.5 * y @ alpha + np.sum(np.log(np.diag(factor[0]))) + 0.5 * y.size * np.log(2 * np.pi)
    inner = np.outer(alpha, alpha) - cho_solve(factor, np.eye(y.size))
    sr = hyper.signal**2 * r
    grads = [np.sum(inner * sr * d2[i]) / hyper.length[i] ** 2 for i in range(d2.shape[0])]
    grads.append(np.sum(inner * 2.0 * sr))
    grads.append(np.trace(inner) * 2.0 * hyper.noise**2)
    return float(value), -0.5 * np.array(grads)


@dataclass(frozen=True)
class GaussianProcess:
    """A fitted process: training data, hyperparameters, factor of K and K^-1 y.

    Attributes:
        scale: multiplies every predictive standard deviation (1 = as the process says).
    """

    x: NDArray[np.float64]
    h: NDArray[np.float64]
    y: NDArray[np.float64]
    hyper: Hyperparameters
    log_evidence: float
    chol: NDArray[np.float64]
    alpha: NDArray[np.float64]
    scale: float = 1.0

    def predict(
        self, x_new: ArrayLike, h_new: ArrayLike
    ) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
        """Mean and standard deviation (of a new measurement, times `scale`) at new inputs."""
        xs = np.atleast_2d(np.asarray(x_new, dtype=float))
        hs = np.atleast_2d(np.asarray(h_new, dtype=float))
        r = np.exp(-0.5 * np.tensordot(1.0 / self.hyper.length**2,
                                       _squared_distances(xs, self.x), axes=1))
        k_star = self.hyper.signal**2 * r + BASIS_PRIOR_SCALE**2 * (hs @ self.h.T)
        mean = k_star @ self.alpha
        v = solve_triangular(self.chol, k_star.T, lower=True)
        prior = (self.hyper.signal**2 + BASIS_PRIOR_SCALE**2 * np.sum(hs**2, axis=1)
                 + self.hyper.noise**2)
        variance = np.maximum(prior - np.sum(v**2, axis=0), self.hyper.noise**2)
        return mean, self.scale * np.sqrt(variance)

    def leave_one_out(self) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
        """Closed-form leave-one-out means and standard deviations (hyperparameters fixed).

        The standard deviations are the process's own (`scale` not applied).
        """
        k_inv = cho_solve((self.chol, True), np.eye(self.y.size))
        diag = np.diag(k_inv)
        return self.y - self.alpha / diag, 1.0 / np.sqrt(diag)


def condition(
    x: ArrayLike, h: ArrayLike, y: ArrayLike, hyper: Hyperparameters, scale: float = 1.0
) -> GaussianProcess:
    """The process with given hyperparameters conditioned on (x, h, y): one Cholesky."""
    xa, ha, ya = (np.asarray(a, dtype=float) for a in (x, h, y))
    k, _, _ = _covariance(xa, ha, hyper)
    chol = np.linalg.cholesky(k)
    alpha = cho_solve((chol, True), ya)
    log_evidence = -(0.5 * ya @ alpha + np.sum(np.log(np.diag(chol)))
                     + 0.5 * ya.size * np.log(2 * np.pi))
    return GaussianProcess(xa, ha, ya, hyper, float(log_evidence), chol, alpha, scale)


def fit(x: ArrayLike, h: ArrayLike, y: ArrayLike) -> GaussianProcess:
    """Fit the hyperparameters by maximum marginal likelihood and condition on the data.

    Two fixed starts (all length scales 1 and 4; s_f and s_n from the spread of y); the best
    optimum wins. Deterministic for given data.
    """
    xa, ha, ya = (np.asarray(a, dtype=float) for a in (x, h, y))
    m = xa.shape[1]
    spread = float(np.std(ya)) or 1.0
    bounds = ([tuple(np.log(LENGTH_BOUNDS))] * m + [tuple(np.log(SIGNAL_BOUNDS))]
              + [tuple(np.log(NOISE_BOUNDS))])
    best: tuple[float, NDArray[np.float64]] | None = None
    for length in (1.0, 4.0):
        start = Hyperparameters(np.full(m, length), 0.5 * spread, 0.1 * spread).as_log()
        start = np.clip(start, [b[0] for b in bounds], [b[1] for b in bounds])
        result = minimize(negative_log_evidence, start, args=(xa, ha, ya), jac=True,
                          method="L-BFGS-B", bounds=bounds, options={"maxiter": 300})
        if best is None or result.fun < best[0]:
            best = (float(result.fun), result.x)
    assert best is not None
    return condition(xa, ha, ya, Hyperparameters.from_log(best[1]))


def with_scale(process: GaussianProcess, scale: float) -> GaussianProcess:
    """The same process with another calibration scale."""
    return replace(process, scale=float(scale))
