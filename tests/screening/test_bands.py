import numpy as np
import pytest

from screening.bands import band_structure
from screening.errors import BondgapInputError
from screening.evaluate import catalogue_table
from screening.gaps import gap_model


def test_path_labels_and_shape() -> None:
    bands = band_structure("GaAs", n_points=200)
    assert [name for name, _ in bands.labels] == ["L", "Γ", "X", "W", "K", "Γ"]
    assert bands.energies_eV.shape == (200, 8)
    assert np.all(np.diff(bands.distance) >= 0)


def test_path_gap_matches_the_catalogue_gap_of_a_direct_compound() -> None:
    # The catalogue's minimum gap samples the same path plus Gamma, X, L.
    table = catalogue_table()
    tb = gap_model().tight_binding
    i = table.index("GaAs")
    assert tb.direct[i]
    assert band_structure("GaAs").gap_eV == pytest.approx(tb.min_gap_eV[i], abs=1e-9)


@pytest.mark.parametrize("n", [0, 5, 10**6])
def test_bad_point_count_is_refused(n: int) -> None:
    with pytest.raises(BondgapInputError, match="n_points"):
        band_structure("GaAs", n_points=n)
