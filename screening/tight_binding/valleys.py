"""Conduction valleys Gamma, X (with the Delta-line minimum near X) and L, per compound.

A short k sample instead of a dense path: Gamma, L, and the Delta line Gamma-X from
k = (0.5, 0, 0) to X = (1, 0, 0) (units of 2 pi / a), where the Si-like minimum lies; the lowest
point of that line is refined by a parabola through it and its two neighbours. Valley energies
are the lowest conduction level there minus the valence top at Gamma (the convention of
tabulated valley gaps, e.g. I. Vurgaftman, J. R. Meyer and L. R. Ram-Mohan, J. Appl. Phys. 89,
5815 (2001)). The valence top is taken at Gamma, where it lies in these models.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import NDArray

from screening.tight_binding.gaps import parameters_from_elements
from screening.tight_binding.hamiltonian import (
    DEFAULT_CHUNK,
    ETA_HARRISON_1981,
    N_VALENCE_BANDS,
    TightBindingParameters,
    band_energies,
)
from screening.tight_binding.sstar import SSTAR_SI_VHD, SStarModel, band_energies_sstar

N_DELTA: int = 17
"""Points on the Delta line from k = 0.5 to 1 (2 pi / a), X included: steps of 1/32."""

_DELTA_X = np.linspace(0.5, 1.0, N_DELTA)
_K_SAMPLE = np.concatenate(
    [np.zeros((1, 3)), np.full((1, 3), 0.5), np.column_stack([_DELTA_X, np.zeros((N_DELTA, 2))])]
)
"""Gamma, L, then the Delta line (X last)."""

VALLEY_TOLERANCE_EV: float = 1e-9
"""A valley within this of the lowest counts as the minimum (Gamma wins ties: direct)."""


@dataclass(frozen=True, eq=False)
class ValleyGaps:
    """Conduction valleys above the valence top at Gamma, one entry per compound (eV).

    Attributes:
        gamma_eV: Lowest conduction level at Gamma.
        x_eV: Lowest conduction level on the Delta line near X (its minimum; X itself when
            the band falls all the way to X).
        x_point_eV: Lowest conduction level at X itself.
        delta_min_k_2pi_over_a: Position of the Delta-line minimum, k_x in 2 pi / a (1 = X).
        l_eV: Lowest conduction level at L.
        min_eV: Smallest of gamma_eV, x_eV, l_eV; negative if the bands overlap.
        kind: "direct" where Gamma is the lowest valley, else "indirect" (string array).
        lowest: "Γ", "X" or "L": the lowest valley (string array).
        with_sstar: True for the sp3s* model, False for the sp3 model.
    """

    gamma_eV: NDArray[np.float64]
    x_eV: NDArray[np.float64]
    x_point_eV: NDArray[np.float64]
    delta_min_k_2pi_over_a: NDArray[np.float64]
    l_eV: NDArray[np.float64]
    min_eV: NDArray[np.float64]
    kind: NDArray[np.str_]
    lowest: NDArray[np.str_]
    with_sstar: bool


def _parabola_minimum(
    line: NDArray[np.float64], step: float, start: float
) -> tuple[NDArray[np.float64], NDArray[np.float64]]:
    """Minimum and position of sampled rows (nc, n), refined by a parabola at interior minima."""
    n = line.shape[1]
    i = np.argmin(line, axis=1)
    rows = np.arange(line.shape[0])
    j = np.clip(i, 1, n - 2)
    left, mid, right = line[rows, j - 1], line[rows, j], line[rows, j + 1]
    curvature = left - 2.0 * mid + right
    interior = (i > 0) & (i < n - 1) & (curvature > 0.0)
    safe = np.where(interior, curvature, 1.0)
    shift = np.where(interior, 0.5 * (left - right) / safe, 0.0)
    value = np.where(interior, mid - 0.25 * (left - right) * shift, line[rows, i])
    position = start + step * np.where(interior, j + shift, i)
    return value, position


def valleys(
    params: TightBindingParameters,
    model: SStarModel | None = SSTAR_SI_VHD,
    *,
    chunk: int = DEFAULT_CHUNK,
) -> ValleyGaps:
    """Return the Gamma, X and L conduction valleys of every compound.

    Costs 19 k-points per compound (about 1 ms for 100 compounds with s*).

    Args:
        params: Term values and bond lengths of ncompound compounds.
        model: sp3s* constants (default :data:`SSTAR_SI_VHD`); None for the plain sp3 model
            with Harrison's 1981 couplings (the engine's 8 x 8 model).
        chunk: Largest number of matrices per diagonalisation batch.

    Returns:
        A :class:`ValleyGaps` with arrays of shape (ncompound,).
    """
    if model is None:
        bands = band_energies(_K_SAMPLE, params, ETA_HARRISON_1981, chunk=chunk)
    else:
        bands = band_energies_sstar(_K_SAMPLE, params, model, chunk=chunk)
    top = bands[:, 0, N_VALENCE_BANDS - 1]
    conduction = bands[:, :, N_VALENCE_BANDS] - top[:, None]
    gamma, l_valley = conduction[:, 0], conduction[:, 1]
    x_valley, x_k = _parabola_minimum(conduction[:, 2:], _DELTA_X[1] - _DELTA_X[0], _DELTA_X[0])
    stacked = np.stack([gamma, x_valley, l_valley], axis=-1)
    low = stacked.min(axis=1)
    names = np.array(["Γ", "X", "L"])
    lowest = np.where(gamma - low <= VALLEY_TOLERANCE_EV, "Γ", names[np.argmin(stacked, axis=1)])
    return ValleyGaps(
        gamma_eV=gamma,
        x_eV=x_valley,
        x_point_eV=conduction[:, -1],
        delta_min_k_2pi_over_a=x_k,
        l_eV=l_valley,
        min_eV=low,
        kind=np.where(lowest == "Γ", "direct", "indirect"),
        lowest=lowest,
        with_sstar=model is not None,
    )


def valleys_from_elements(
    cations: list[str] | tuple[str, ...],
    anions: list[str] | tuple[str, ...],
    bond_length_angstrom: NDArray[np.float64] | float,
    model: SStarModel | None = SSTAR_SI_VHD,
) -> ValleyGaps:
    """Valleys from element symbols, with the engine's atomic term values.

    Args:
        cations: Cation symbols, one per compound (for an element, the element itself).
        anions: Anion symbols, same length.
        bond_length_angstrom: Nearest-neighbour distances (angstrom), scalar or per compound.
        model: sp3s* constants (default :data:`SSTAR_SI_VHD`); None for the sp3 model.

    Raises:
        BondgapInputError: If the symbol lists differ in length.
        UnknownElementError: A symbol that is not an element of Z = 1 to 86.
    """
    params = parameters_from_elements(cations, anions, bond_length_angstrom)
    return valleys(params, model)
