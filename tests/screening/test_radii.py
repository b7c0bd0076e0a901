import numpy as np
import pytest

from screening.radii import PAULING_TETRAHEDRAL_RADII_ANGSTROM, fit_radii


def test_exact_sums_are_recovered_by_leave_one_out() -> None:
    # Synthetic case with a known answer: bond lengths that are exact sums of Pauling's radii
    # are predicted exactly when each is held out (the prior pins the same radii).
    r = PAULING_TETRAHEDRAL_RADII_ANGSTROM
    pairs = [("Ga", "As"), ("Ga", "P"), ("In", "As"), ("In", "P"), ("Al", "As"), ("Zn", "Se")]
    d = np.array([r[a] + r[b] for a, b in pairs])
    fit = fit_radii([a + b for a, b in pairs], [p[0] for p in pairs], [p[1] for p in pairs],
                    d, np.zeros(len(d), bool), ["Ga", "As", "In", "P", "Al", "Zn", "Se"])
    assert fit.loo_max_angstrom == pytest.approx(0.0, abs=1e-12)
    assert fit.estimate(["Ga"], ["As"])[0] == pytest.approx(r["Ga"] + r["As"])


def test_missing_element_is_an_error() -> None:
    with pytest.raises(ValueError, match="Li"):
        fit_radii(["GaAs"], ["Ga"], ["As"], [2.448], [False], ["Ga", "As", "Li"])
