"""The sp3 Hamiltonian H(k) and its bands (see the package docstring for the model)."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np
from numpy.typing import ArrayLike, NDArray

from screening.constants import HBAR2_OVER_M_EV_ANGSTROM2
from screening.errors import BondgapInputError
from screening.harrison import ETA_1981, UniversalEta

N_BANDS: int = 8
"""Bands per k-point: s and three p orbitals on each of two atoms."""

N_VALENCE_BANDS: int = 4
"""Filled bands: eight valence electrons per atom pair, two per band."""

DEFAULT_CHUNK: int = 2048
"""Default number of 8 x 8 matrices built and diagonalised per batch (about 2 MB complex)."""


HarrisonEta = UniversalEta
"""The universal coefficients, shared with the bond-orbital model (`screening.harrison`)."""

ETA_HARRISON_1981 = ETA_1981
"""Harrison's 1981 universal coefficients, the set the engine uses."""


def _as_1d(name: str, value: ArrayLike) -> NDArray[np.float64]:
    arr = np.asarray(value, dtype=np.float64)
    if arr.ndim > 1:
        raise BondgapInputError(f"{name} must be a scalar or a 1-D array, got shape {arr.shape}")
    if not np.all(np.isfinite(arr)):
        raise BondgapInputError(f"{name} must be finite numbers, got {arr!r}")
    return np.atleast_1d(arr)


@dataclass(frozen=True, eq=False)
class TightBindingParameters:
    """On-site energies and bond lengths of one or more compounds.

    Scalars and 1-D arrays broadcast against each other; after construction every field is a
    1-D float array of the same length, one entry per compound.

    Attributes:
        eps_s_anion_eV: Anion s term value (eV).
        eps_p_anion_eV: Anion p term value (eV).
        eps_s_cation_eV: Cation s term value (eV).
        eps_p_cation_eV: Cation p term value (eV).
        bond_length_angstrom: Nearest-neighbour distance d (angstrom), > 0.

    Raises:
        BondgapInputError: If an input is not finite, not at most 1-D, the lengths do not
            broadcast, or a bond length is not positive.
    """

    eps_s_anion_eV: NDArray[np.float64]
    eps_p_anion_eV: NDArray[np.float64]
    eps_s_cation_eV: NDArray[np.float64]
    eps_p_cation_eV: NDArray[np.float64]
    bond_length_angstrom: NDArray[np.float64]

    def __post_init__(self) -> None:
        names = (
            "eps_s_anion_eV",
            "eps_p_anion_eV",
            "eps_s_cation_eV",
            "eps_p_cation_eV",
            "bond_length_angstrom",
        )
        arrays = [_as_1d(name, getattr(self, name)) for name in names]
        try:
            arrays = list(np.broadcast_arrays(*arrays))
        except ValueError as exc:
            shapes = [a.shape for a in arrays]
            raise BondgapInputError(
                f"parameter arrays must have one common length (or length 1), got {shapes}"
            ) from exc
        if np.any(arrays[-1] <= 0.0):
            raise BondgapInputError(f"bond_length_angstrom must be positive, got {arrays[-1]!r}")
        for name, arr in zip(names, arrays, strict=True):
            arr = arr.copy()
            arr.setflags(write=False)
            object.__setattr__(self, name, arr)

    @property
    def n_compounds(self) -> int:
        """Number of compounds (parameter sets) held."""
        return int(self.bond_length_angstrom.shape[0])

    def subset(self, index: slice | ArrayLike) -> TightBindingParameters:
        """Return the parameters of the compounds picked by ``index`` (a slice or indices)."""
        return TightBindingParameters(
            eps_s_anion_eV=self.eps_s_anion_eV[index],
            eps_p_anion_eV=self.eps_p_anion_eV[index],
            eps_s_cation_eV=self.eps_s_cation_eV[index],
            eps_p_cation_eV=self.eps_p_cation_eV[index],
            bond_length_angstrom=self.bond_length_angstrom[index],
        )


@dataclass(frozen=True, eq=False)
class Couplings:
    """Nearest-neighbour couplings of the 8 x 8 Hamiltonian, one entry per compound (eV).

    Attributes:
        v_ss_eV: V_ss_sigma.
        v_s_eV: V_sp_sigma / sqrt(3), the s-p element per bond direction cosine.
        v_xx_eV: (V_pp_sigma + 2 V_pp_pi) / 3.
        v_xy_eV: (V_pp_sigma - V_pp_pi) / 3.
    """

    v_ss_eV: NDArray[np.float64]
    v_s_eV: NDArray[np.float64]
    v_xx_eV: NDArray[np.float64]
    v_xy_eV: NDArray[np.float64]


def couplings(params: TightBindingParameters, eta: HarrisonEta = ETA_HARRISON_1981) -> Couplings:
    """Return the Slater-Koster combinations of Harrison's d^-2 couplings.

    Args:
        params: Term values and bond lengths.
        eta: Universal coefficients (default: Harrison 1981).

    Returns:
        The four couplings that fill the anion-cation block, each of shape (ncompound,), eV.
    """
    scale = HBAR2_OVER_M_EV_ANGSTROM2 / params.bond_length_angstrom**2
    v_ss = eta.ss_sigma * scale
    v_sp = eta.sp_sigma * scale
    v_pps = eta.pp_sigma * scale
    v_ppp = eta.pp_pi * scale
    return Couplings(
        v_ss_eV=v_ss,
        v_s_eV=v_sp / np.sqrt(3.0),
        v_xx_eV=(v_pps + 2.0 * v_ppp) / 3.0,
        v_xy_eV=(v_pps - v_ppp) / 3.0,
    )


_BOND_DIRECTIONS = np.array(
    [[1.0, 1.0, 1.0], [1.0, -1.0, -1.0], [-1.0, 1.0, -1.0], [-1.0, -1.0, 1.0]]
)
"""n_j: anion-to-cation vectors in units of a/4."""

_PHASE_SUM_SIGNS = np.array(
    [[1.0, 1.0, 1.0, 1.0], [1.0, 1.0, -1.0, -1.0], [1.0, -1.0, 1.0, -1.0], [1.0, -1.0, -1.0, 1.0]]
)
"""Rows give g0, gx, gy, gz as signed sums of the four bond phases."""

# Anion-cation block entries: (anion orbital, cation orbital, coupling, phase sum, sign), with
# orbitals as indices into the basis, coupling 0 = Vss, 1 = Vs, 2 = Vxx, 3 = Vxy and phase sum
# 0 = g0, 1 = gx, 2 = gy, 3 = gz: H[anion, cation] = sign * coupling * g.
BLOCK_ENTRIES: tuple[tuple[int, int, int, int, float], ...] = (
    (0, 4, 0, 0, 1.0),
    (0, 5, 1, 1, 1.0),
    (0, 6, 1, 2, 1.0),
    (0, 7, 1, 3, 1.0),
    (1, 4, 1, 1, -1.0),
    (2, 4, 1, 2, -1.0),
    (3, 4, 1, 3, -1.0),
    (1, 5, 2, 0, 1.0),
    (2, 6, 2, 0, 1.0),
    (3, 7, 2, 0, 1.0),
    (1, 6, 3, 3, 1.0),
    (2, 5, 3, 3, 1.0),
    (1, 7, 3, 2, 1.0),
    (3, 5, 3, 2, 1.0),
    (2, 7, 3, 1, 1.0),
    (3, 6, 3, 1, 1.0),
)
"""The 8 x 8 anion-cation block of the package docstring, one entry per non-zero element."""


def check_k(k: ArrayLike) -> NDArray[np.float64]:
    """Return k-points as a float array (nk, 3), or raise a clear error for any other shape."""
    arr = np.asarray(k, dtype=np.float64)
    if arr.ndim == 1 and arr.shape[0] == 3:
        arr = arr[None, :]
    if arr.ndim != 2 or arr.shape[1] != 3:
        raise BondgapInputError(f"k-points must have shape (nk, 3), got {arr.shape}")
    if not np.all(np.isfinite(arr)):
        raise BondgapInputError("k-points must be finite numbers")
    return arr


def phase_sums(k: ArrayLike) -> NDArray[np.complex128]:
    """Return the Bloch phase sums g0, gx, gy, gz at each k-point.

    Args:
        k: Wave vectors, shape (nk, 3) (or (3,)), in units of 2 pi / a.

    Returns:
        Complex array of shape (nk, 4): columns g0, gx, gy, gz.
    """
    kk = check_k(k)
    phases = np.exp(0.5j * np.pi * (kk @ _BOND_DIRECTIONS.T))
    return phases @ _PHASE_SUM_SIGNS.T


def _onsite(params: TightBindingParameters) -> NDArray[np.float64]:
    """Diagonal of H, shape (ncompound, 8), in basis order."""
    ea_s, ea_p = params.eps_s_anion_eV, params.eps_p_anion_eV
    ec_s, ec_p = params.eps_s_cation_eV, params.eps_p_cation_eV
    return np.stack([ea_s, ea_p, ea_p, ea_p, ec_s, ec_p, ec_p, ec_p], axis=-1)


def build_matrices(
    g: NDArray[np.complex128],
    onsite: NDArray[np.float64],
    coupling_table: NDArray[np.float64],
    entries: tuple[tuple[int, int, int, int, float], ...],
    *,
    upper: bool,
) -> NDArray[np.complex128]:
    """Assemble H for compounds x k-points from phase sums (any basis size).

    Args:
        g: Phase sums, (nk, 4).
        onsite: Diagonals, (nc, n); n is the basis size.
        coupling_table: Couplings, shape (nc, ncoupling), indexed by the entries.
        entries: (anion orbital, cation orbital, coupling column, phase sum, sign) per
            non-zero anion-cation element; H[anion, cation] = sign * coupling * g.
        upper: Also fill the upper triangle (False fills the lower one only: enough for
            ``eigvalsh(..., UPLO="L")``).

    Returns:
        Array (nc, nk, n, n).
    """
    nc, n = onsite.shape
    nk = g.shape[0]
    h = np.zeros((nc, nk, n, n), dtype=np.complex128)
    g_conj = np.conj(g)
    for anion, cation, t, m, sign in entries:
        v = (sign * coupling_table[:, t])[:, None]
        value, value_conj = v * g[None, :, m], v * g_conj[None, :, m]
        # H[anion, cation] = value; its Hermitian partner H[cation, anion] = conj(value)
        if cation > anion:
            h[:, :, cation, anion] = value_conj
            if upper:
                h[:, :, anion, cation] = value
        else:
            h[:, :, anion, cation] = value
            if upper:
                h[:, :, cation, anion] = value_conj
    diag = np.arange(n)
    h[:, :, diag, diag] = onsite[:, None, :]
    return h


def eigenvalues_in_batches(
    k: ArrayLike,
    onsite: NDArray[np.float64],
    coupling_table: NDArray[np.float64],
    entries: tuple[tuple[int, int, int, int, float], ...],
    chunk: int,
) -> NDArray[np.float64]:
    """Sorted eigenvalues (nc, nk, n) of the matrices of :func:`build_matrices`, in batches.

    Raises:
        BondgapInputError: If ``chunk`` < 1 or the k-points are malformed.
    """
    if chunk < 1:
        raise BondgapInputError(f"chunk must be >= 1, got {chunk}")
    g_all = phase_sums(k)
    nc, n = onsite.shape
    nk = g_all.shape[0]
    out = np.empty((nc, nk, n), dtype=np.float64)
    c_step = min(nc, chunk)
    k_step = max(1, chunk // c_step)
    for k0 in range(0, nk, k_step):
        g = g_all[k0 : k0 + k_step]
        for c0 in range(0, nc, c_step):
            h = build_matrices(
                g, onsite[c0 : c0 + c_step], coupling_table[c0 : c0 + c_step], entries,
                upper=False,
            )
            out[c0 : c0 + c_step, k0 : k0 + k_step] = np.linalg.eigvalsh(h, UPLO="L")
    return out


def _coupling_table(params: TightBindingParameters, eta: HarrisonEta) -> NDArray[np.float64]:
    c = couplings(params, eta)
    return np.stack([c.v_ss_eV, c.v_s_eV, c.v_xx_eV, c.v_xy_eV], axis=-1)


def hamiltonian(
    k: ArrayLike, params: TightBindingParameters, eta: HarrisonEta = ETA_HARRISON_1981
) -> NDArray[np.complex128]:
    """Build the full Hermitian 8 x 8 Hamiltonians for every compound at every k-point.

    Not chunked: memory is 1 kB per (compound, k-point) pair; use :func:`band_energies` for
    large samples.

    Args:
        k: Wave vectors, shape (nk, 3) (or (3,)), in units of 2 pi / a.
        params: Term values and bond lengths of ncompound compounds.
        eta: Universal coefficients (default: Harrison 1981).

    Returns:
        Complex array (ncompound, nk, 8, 8) in eV, basis order s_a, px_a, py_a, pz_a, s_c,
        px_c, py_c, pz_c.
    """
    return build_matrices(
        phase_sums(k), _onsite(params), _coupling_table(params, eta), BLOCK_ENTRIES, upper=True
    )


def band_energies(
    k: ArrayLike,
    params: TightBindingParameters,
    eta: HarrisonEta = ETA_HARRISON_1981,
    *,
    chunk: int = DEFAULT_CHUNK,
) -> NDArray[np.float64]:
    """Return the eight band energies, sorted ascending, for every compound and k-point.

    The Hamiltonians are built and diagonalised in batches of at most ``chunk`` matrices
    (compounds x k-points), so memory stays near 1 kB x chunk whatever the sample size.
    Only the lower triangle is filled; ``numpy.linalg.eigvalsh`` reads only that.

    Args:
        k: Wave vectors, shape (nk, 3) (or (3,)), in units of 2 pi / a.
        params: Term values and bond lengths of ncompound compounds.
        eta: Universal coefficients (default: Harrison 1981).
        chunk: Largest number of 8 x 8 matrices per batch (>= 1).

    Returns:
        Float array (ncompound, nk, 8), eV. Bands 0-3 are the valence bands, 4-7 conduction.

    Raises:
        BondgapInputError: If ``chunk`` < 1 or the k-points are malformed.
    """
    return eigenvalues_in_batches(
        k, _onsite(params), _coupling_table(params, eta), BLOCK_ENTRIES, chunk
    )
