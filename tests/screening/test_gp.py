"""The Gaussian process of the gap estimator, checked against exact results."""

import numpy as np
import pytest

from screening import gp


def _data(n: int = 30, seed: int = 5) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    rng = np.random.default_rng(seed)
    x = rng.normal(size=(n, 2))
    h = np.column_stack([np.ones(n), x[:, 0]])
    y = 0.3 + 1.5 * x[:, 0] + np.sin(2 * x[:, 1]) + 0.05 * rng.normal(size=n)
    return x, h, y


def test_closed_form_leave_one_out_equals_conditioning_without_the_point() -> None:
    # Rasmussen & Williams (2006), eq. 5.12: the closed form must equal conditioning the same
    # process (hyperparameters fixed) on the other n - 1 points; exact up to round-off.
    x, h, y = _data()
    hyper = gp.Hyperparameters(np.array([0.8, 1.3]), 0.9, 0.07)
    process = gp.condition(x, h, y, hyper)
    mean, sd = process.leave_one_out()
    for i in range(y.size):
        keep = np.arange(y.size) != i
        m, s = gp.condition(x[keep], h[keep], y[keep], hyper).predict(x[i], h[i])
        assert mean[i] == pytest.approx(m[0], abs=1e-8)
        assert sd[i] == pytest.approx(s[0], abs=1e-8)


def test_gradient_of_the_evidence_matches_finite_differences() -> None:
    x, h, y = _data(20)
    theta = gp.Hyperparameters(np.array([0.7, 2.0]), 0.8, 0.1).as_log()
    _, grad = gp.negative_log_evidence(theta, x, h, y)
    step = 1e-6
    for j in range(theta.size):
        up, down = theta.copy(), theta.copy()
        up[j] += step
        down[j] -= step
        numeric = (gp.negative_log_evidence(up, x, h, y)[0]
                   - gp.negative_log_evidence(down, x, h, y)[0]) / (2 * step)
        assert grad[j] == pytest.approx(numeric, rel=1e-4, abs=1e-6)


def test_a_fitted_process_is_deterministic_and_finds_the_noise_level() -> None:
    # Synthetic data with noise 0.05 (our own construction): the fitted noise must be of
    # that order, and two fits must agree exactly.
    x, h, y = _data(60)
    a, b = gp.fit(x, h, y), gp.fit(x, h, y)
    assert a.hyper.noise == b.hyper.noise
    assert 0.01 <= a.hyper.noise <= 0.15


def test_uncertainty_grows_away_from_the_data() -> None:
    x, h, y = _data(40)
    process = gp.fit(x, h, y)
    near = process.predict(x[:1], h[:1])[1][0]
    far_x = np.array([[8.0, 8.0]])
    far = process.predict(far_x, np.array([[1.0, 8.0]]))[1][0]
    assert far > 2 * near
