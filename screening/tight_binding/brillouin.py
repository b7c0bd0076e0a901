"""The fcc Brillouin zone: reciprocal vectors, symmetry orbits of k, the standard path."""

from __future__ import annotations

import numpy as np
from numpy.typing import ArrayLike, NDArray

from screening.errors import BondgapInputError
from screening.tight_binding.hamiltonian import (
    DEFAULT_CHUNK,
    ETA_HARRISON_1981,
    HarrisonEta,
    TightBindingParameters,
    band_energies,
    check_k,
)

FCC_RECIPROCAL_2PI_OVER_A: NDArray[np.float64] = np.array(
    [[-1.0, 1.0, 1.0], [1.0, -1.0, 1.0], [1.0, 1.0, -1.0]]
)
"""Primitive reciprocal vectors of the fcc lattice (rows), in units of 2 pi / a."""

_NEIGHBOUR_G = np.array(
    [[i, j, m] for i in (-1, 0, 1) for j in (-1, 0, 1) for m in (-1, 0, 1)], dtype=float
) @ FCC_RECIPROCAL_2PI_OVER_A


def irreducible_k(k: ArrayLike) -> tuple[NDArray[np.float64], NDArray[np.intp]]:
    """Reduce k-points to one representative per orbit of the symmetry of E(k).

    E(k) of the model is unchanged by the 24 operations of T_d (coordinate permutations with
    an even number of sign changes) and by time reversal k -> -k, which together give all
    48 permutations and sign changes of O_h, and by reciprocal-lattice translations (a gauge
    change). Each point is folded into the first Brillouin zone (nearest of the 27
    neighbouring reciprocal-lattice points, a point at the zone edge or one step outside it),
    then mapped to sorted absolute components.

    Args:
        k: wave vectors (nk, 3) in units of 2 pi / a.

    Returns:
        (representatives (nu, 3), inverse (nk,)) with k-point i represented by
        ``representatives[inverse[i]]``.
    """
    kk = check_k(k)
    squared = (
        np.einsum("ij,ij->i", kk, kk)[:, None]
        - 2.0 * kk @ _NEIGHBOUR_G.T
        + np.einsum("ij,ij->i", _NEIGHBOUR_G, _NEIGHBOUR_G)[None, :]
    )
    folded = kk - _NEIGHBOUR_G[np.argmin(squared, axis=1)]
    canonical = np.sort(np.abs(folded), axis=1)
    # one integer key per point (components quantised to 1e-6; |k| < 2 in the first zone)
    quantised = np.rint(canonical * 1e6).astype(np.int64)
    keys = (quantised[:, 0] * 2_000_003 + quantised[:, 1]) * 2_000_003 + quantised[:, 2]
    _, first, inverse = np.unique(keys, return_index=True, return_inverse=True)
    return canonical[first], inverse.ravel()


def band_energies_symmetric(
    k: ArrayLike,
    params: TightBindingParameters,
    eta: HarrisonEta = ETA_HARRISON_1981,
    *,
    chunk: int = DEFAULT_CHUNK,
) -> NDArray[np.float64]:
    """Same result as :func:`band_energies`, diagonalising each symmetry orbit only once.

    For a uniform Brillouin-zone sample (a Monkhorst-Pack grid with equal divisions) this
    cuts the number of diagonalisations by up to 48 (see :func:`irreducible_k`).

    Returns:
        Float array (ncompound, nk, 8), eV.
    """
    representatives, inverse = irreducible_k(k)
    return band_energies(representatives, params, eta, chunk=chunk)[:, inverse]


SPECIAL_POINTS_2PI_OVER_A: dict[str, tuple[float, float, float]] = {
    "Γ": (0.0, 0.0, 0.0),
    "X": (1.0, 0.0, 0.0),
    "L": (0.5, 0.5, 0.5),
    "W": (1.0, 0.5, 0.0),
    "K": (0.75, 0.75, 0.0),
}
"""High-symmetry points of the fcc Brillouin zone in units of 2 pi / a."""

STANDARD_PATH: tuple[str, ...] = ("L", "Γ", "X", "W", "K", "Γ")
"""The band-structure path L-Gamma-X-W-K-Gamma."""


def high_symmetry_path(
    n_points: int = 400,
) -> tuple[NDArray[np.float64], NDArray[np.float64], tuple[tuple[str, float], ...]]:
    """Sample the fcc path L-Gamma-X-W-K-Gamma with points spread in proportion to length.

    Every corner of the path is one of the returned points exactly.

    Args:
        n_points: Total number of k-points (>= 6).

    Returns:
        ``(k, distances, labels)``: k of shape (n_points, 3) in units of 2 pi / a; the
        cumulative path length at each point (units of 2 pi / a); and one
        ``(label, distance)`` pair per corner, in path order.

    Raises:
        BondgapInputError: If ``n_points`` < 6.
    """
    corners = np.array([SPECIAL_POINTS_2PI_OVER_A[name] for name in STANDARD_PATH])
    n_seg = len(STANDARD_PATH) - 1
    if n_points < n_seg + 1:
        raise BondgapInputError(f"n_points must be >= {n_seg + 1}, got {n_points}")
    lengths = np.linalg.norm(np.diff(corners, axis=0), axis=1)
    # points per segment (start included, end excluded); the final corner is appended
    share = lengths / lengths.sum() * (n_points - 1)
    counts = np.maximum(1, np.floor(share).astype(int))
    while counts.sum() < n_points - 1:
        counts[np.argmax(share - counts)] += 1
    while counts.sum() > n_points - 1:
        counts[np.argmax(np.where(counts > 1, counts - share, -np.inf))] -= 1
    pieces = []
    for start, stop, count in zip(corners[:-1], corners[1:], counts, strict=True):
        t = np.arange(count)[:, None] / count
        pieces.append(start + t * (stop - start))
    pieces.append(corners[-1:])
    k = np.concatenate(pieces)
    steps = np.linalg.norm(np.diff(k, axis=0), axis=1)
    distances = np.concatenate([[0.0], np.cumsum(steps)])
    corner_index = np.concatenate([[0], np.cumsum(counts)])
    labels = tuple(
        (name, float(distances[i])) for name, i in zip(STANDARD_PATH, corner_index, strict=True)
    )
    return k, distances, labels
