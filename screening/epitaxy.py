"""Epitaxy on a substrate: lattice mismatch, pseudomorphic strain and critical thickness.

Sign convention (stated in every output): the mismatch is f = (a_layer - a_sub) / a_sub, so
f > 0 means the layer's relaxed lattice constant is larger than the substrate's and the
pseudomorphic layer is compressed in-plane. The in-plane strain of the layer is
eps_par = (a_sub - a_layer) / a_layer (negative = compressive), eps_perp = -2 (C12/C11) eps_par
on (001). Cubic layers compare their cubic a with a cubic substrate; hexagonal (wurtzite)
layers their in-plane a with a hexagonal substrate's; the two are never mixed.

Critical thickness by the force balance of J. W. Matthews and A. E. Blakeslee, J. Cryst.
Growth 27, 118 (1974), for 60 degree misfit dislocations on (001) (b = a/sqrt(2),
cos alpha = cos lambda = 1/2):

    h_c = b (1 - nu cos^2 alpha) [ln(h_c / b) + 1] / (F pi |eps| (1 + nu) cos lambda),

F = 8 for a single uncapped layer on a thick substrate, 4 for a capped well (two misfit
segments) and 2 for Matthews and Blakeslee's multilayer equation as it is often applied to
single layers (see :data:`GEOMETRIES`). With t = h/b and
K = (1 - nu cos^2 alpha) / (F pi |eps| (1 + nu) cos lambda) it reads t = K (ln t + 1), solved
in closed form by t = -K W_-1(-1 / (e K)) (Lambert W, branch -1) for K >= 1 (computed by
Newton's method in real arithmetic, :func:`reduced_thickness`); for K < 1 no
thickness above one Burgers vector is stable and 0 is returned. The energy balance of
R. People and J. C. Bean, Appl. Phys. Lett. 47, 322 (1985) (erratum 49, 229 (1986)) is offered
beside it. Lengths in angstrom unless a name says nm.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Final

import numpy as np
from numpy.typing import ArrayLike, NDArray
from scipy.special import lambertw

from screening.errors import OutOfRangeError, UnknownChoiceError, UnknownSubstrateError
from screening.reference import substrates

_MISMATCH_SIGN: Final[str] = "f > 0: the layer is larger and is compressed in-plane"
MISMATCH_CONVENTION: Final[str] = (
    f"f = (a_layer - a_substrate) / a_substrate, a fraction (not percent); {_MISMATCH_SIGN}"
)
MISMATCH_PERCENT_CONVENTION: Final[str] = (
    f"f = (a_layer - a_substrate) / a_substrate, shown in percent (100 f); {_MISMATCH_SIGN}"
)
"""The same convention for screens that show the mismatch in percent (pages and tables)."""

DEFAULT_POISSON_RATIO: Final[float] = 1.0 / 3.0
"""Assumed (001) Poisson ratio where elastic constants are missing: a round value inside the
range 0.28-0.36 of the III-V and II-VI compounds of seed_data/elastic.csv. Flagged."""

COS_60: Final[float] = 0.5
"""cos alpha = cos lambda = 1/2 for 60 degree dislocations gliding on {111} over (001)."""

ANGSTROM_PER_NM: Final[float] = 10.0

LATTICE_RANGE_ANGSTROM: Final[tuple[float, float]] = (1.0, 100.0)
"""Lattice constants a substrate may have (A): every crystal's lies well inside (diamond,
3.57 A; the largest common substrates about 6.5 A); beyond it mismatches overflow."""

_NEWTON_STEPS: Final[int] = 40
"""Most Newton steps of :func:`reduced_thickness` (it needs fewer than ten)."""

_MATCHED_STRAIN: Final[float] = 1e-12
"""Below this |strain| a layer counts as lattice-matched: critical thickness infinite."""


@dataclass(frozen=True)
class MisfitGeometry:
    """A Matthews-Blakeslee geometry: the factor F in the denominator F pi.

    Attributes:
        name: Registry key.
        factor: F (8 single uncapped layer, 4 capped well, 2 multilayer form).
        description: What it describes.
        reference: Where the form comes from.
    """

    name: str
    factor: float
    description: str
    reference: str


_MB = "J. W. Matthews and A. E. Blakeslee, J. Cryst. Growth 27, 118 (1974)"

GEOMETRIES: Final[dict[str, MisfitGeometry]] = {
    "single-uncapped": MisfitGeometry(
        "single-uncapped", 8.0,
        "single strained layer on a thick substrate, free surface: one misfit segment (8 pi)",
        _MB,
    ),
    "capped-well": MisfitGeometry(
        "capped-well", 4.0,
        "strained layer buried under a thick cap of substrate material: two misfit segments, "
        "twice the line tension (4 pi)",
        _MB + "; the capped (double-kink) form as commonly quoted",
    ),
    "multilayer-2pi": MisfitGeometry(
        "multilayer-2pi", 2.0,
        "Matthews and Blakeslee's multilayer equation (2 pi) with the layer's own strain in "
        "place of their full misfit f between layers each strained by f/2; widely quoted for "
        "single layers, where it gives about four times the single-uncapped thickness",
        _MB + " (their multilayer form)",
    ),
}
"""Selectable geometry factors of the Matthews-Blakeslee balance."""


def misfit_geometry(name: str) -> MisfitGeometry:
    """Return a registered geometry.

    Raises:
        UnknownChoiceError: Naming the registered geometries.
    """
    try:
        return GEOMETRIES[name]
    except KeyError:
        raise UnknownChoiceError(
            f"unknown critical-thickness geometry {name!r}; choose one of "
            f"{', '.join(GEOMETRIES)}"
        ) from None


def lattice_mismatch(a_layer_angstrom: ArrayLike, a_substrate_angstrom: ArrayLike
                     ) -> NDArray[np.float64]:
    """Lattice mismatch f = (a_layer - a_sub) / a_sub (fraction; > 0: layer compressed).

    As a_layer / a_sub - 1 (the difference of two huge constants would overflow); a ratio
    beyond the largest double is an infinite mismatch, its true limit (no warning).
    """
    a_layer = np.asarray(a_layer_angstrom, dtype=float)
    a_sub = np.asarray(a_substrate_angstrom, dtype=float)
    with np.errstate(over="ignore"):
        return a_layer / a_sub - 1.0


def in_plane_strain(a_layer_angstrom: ArrayLike, a_substrate_angstrom: ArrayLike
                    ) -> NDArray[np.float64]:
    """Pseudomorphic in-plane strain eps_par = (a_sub - a_layer) / a_layer (< 0: compressive).

    As a_sub / a_layer - 1, infinite (its limit, no warning) for a ratio beyond the doubles:
    the critical thickness of such a layer is 0.
    """
    a_layer = np.asarray(a_layer_angstrom, dtype=float)
    with np.errstate(over="ignore"):
        return np.asarray(a_substrate_angstrom, dtype=float) / a_layer - 1.0


def perpendicular_strain_001(in_plane: ArrayLike, c11_GPa: ArrayLike, c12_GPa: ArrayLike
                             ) -> NDArray[np.float64]:
    """Growth-direction strain of a (001) pseudomorphic layer: -2 (C12 / C11) eps_par."""
    return -2.0 * np.asarray(c12_GPa, float) / np.asarray(c11_GPa, float) * np.asarray(
        in_plane, float)


def poisson_ratio_001(c11_GPa: ArrayLike, c12_GPa: ArrayLike
                      ) -> tuple[NDArray[np.float64], NDArray[np.bool_]]:
    """Poisson ratio for biaxial (001) strain, nu = C12 / (C11 + C12).

    Args:
        c11_GPa: C11 (GPa); NaN where unknown.
        c12_GPa: C12 (GPa); NaN where unknown.

    Returns:
        (nu, assumed): :data:`DEFAULT_POISSON_RATIO` and True where C11 or C12 is unknown.
    """
    c11, c12 = np.asarray(c11_GPa, float), np.asarray(c12_GPa, float)
    with np.errstate(invalid="ignore"):
        nu = c12 / (c11 + c12)
    assumed = ~np.isfinite(nu)
    return np.where(assumed, DEFAULT_POISSON_RATIO, nu), assumed


def burgers_vector_60(a_angstrom: ArrayLike) -> NDArray[np.float64]:
    """Length of the a/2 <110> Burgers vector of a 60 degree dislocation, a / sqrt(2) (A)."""
    return np.asarray(a_angstrom, dtype=float) / np.sqrt(2.0)


def matthews_blakeslee_k(strain: ArrayLike, poisson: ArrayLike, geometry: str = "single-uncapped",
                         cos_alpha: float = COS_60, cos_lambda: float = COS_60
                         ) -> NDArray[np.float64]:
    """K = (1 - nu cos^2 alpha) / (F pi |eps| (1 + nu) cos lambda) (inf at zero strain)."""
    factor = misfit_geometry(geometry).factor
    eps = np.abs(np.asarray(strain, dtype=float))
    nu = np.asarray(poisson, dtype=float)
    per_strain = (1.0 - nu * cos_alpha**2) / (factor * np.pi * (1.0 + nu) * cos_lambda)
    with np.errstate(divide="ignore", invalid="ignore"):  # eps = 0 is answered by the where
        k = np.where(eps > _MATCHED_STRAIN, per_strain / eps, np.inf)
    return np.where(np.isnan(eps) | np.isnan(nu), np.nan, k)


def matthews_blakeslee_thickness(
    strain: ArrayLike, burgers_angstrom: ArrayLike, poisson: ArrayLike,
    geometry: str = "single-uncapped", cos_alpha: float = COS_60, cos_lambda: float = COS_60,
) -> NDArray[np.float64]:
    """Critical thickness h_c (angstrom) by the Matthews-Blakeslee force balance.

    Args:
        strain: Misfit strain of the layer (its sign is ignored), broadcastable.
        burgers_angstrom: Burgers vector length b (A).
        poisson: Poisson ratio nu.
        geometry: A key of :data:`GEOMETRIES`.
        cos_alpha: Cosine of the angle between b and the dislocation line.
        cos_lambda: Cosine of the angle between b and the in-plane normal to the line.

    Returns:
        h_c in angstrom: inf for zero strain, 0 where no solution above b exists (K < 1),
        NaN where an input is NaN.

    Raises:
        UnknownChoiceError: An unknown geometry.
    """
    k = matthews_blakeslee_k(strain, poisson, geometry, cos_alpha, cos_lambda)
    b = np.asarray(burgers_angstrom, dtype=float)
    solvable = np.isfinite(k) & (k >= 1.0)
    t = reduced_thickness(np.where(solvable, k, 1.0))
    h = np.where(solvable, t, np.where(np.isinf(k), np.inf, 0.0)) * b
    return np.where(np.isnan(k) | np.isnan(b), np.nan, h)


def reduced_thickness(k: ArrayLike) -> NDArray[np.float64]:
    """The root t >= 1 of t = K (ln t + 1) for finite K >= 1, i.e. -K W_-1(-1 / (e K)).

    With u = ln t + 1 the equation reads u - 1 - ln u = ln K, whose left side is convex and
    rises from 0 at u = 1. Newton's method started above the root, at
    u0 = 1 + ln K + ln(1 + ln K + sqrt(2 ln K)), falls to it monotonically; it runs until no
    step is larger than 1e-14 of u - 1. Real arithmetic only, and only the rows not yet
    converged are stepped (a complex Lambert W costs several times more on a design space).
    """
    shape = np.shape(k)
    log_k = np.log(np.asarray(k, dtype=float).reshape(-1))
    # u - 1 (kept apart from 1 to spare the cancellation), started above the root
    d = log_k + np.log1p(log_k + np.sqrt(2.0 * log_k))
    active = np.flatnonzero(d > 0.0)
    for _ in range(_NEWTON_STEPS):
        x = d[active]
        step = np.maximum((_d_minus_log1p(x) - log_k[active]) * (1.0 + x) / x, 0.0)
        d[active] = x - step
        active = active[step > 1e-14 * x]
        if not len(active):
            break
    with np.errstate(over="ignore"):  # K beyond 1e306 only: t is then infinite in doubles
        return np.exp(d).reshape(shape)


def _d_minus_log1p(d: NDArray[np.float64]) -> NDArray[np.float64]:
    """The value of d - ln(1 + d) for d >= 0, by its Taylor series below 1e-3 (exact there)."""
    small = d < 1e-3
    out = d - np.log1p(d)
    x = d[small]
    out[small] = sum((-1) ** n * x**n / n for n in range(8, 1, -1))
    return out


def matthews_blakeslee_residual(
    thickness_angstrom: ArrayLike, strain: ArrayLike, burgers_angstrom: ArrayLike,
    poisson: ArrayLike, geometry: str = "single-uncapped",
    cos_alpha: float = COS_60, cos_lambda: float = COS_60,
) -> NDArray[np.float64]:
    """Misfit force minus line tension, in units of G b^2 / (1 - nu): zero at h_c.

    Misfit force 2 G (1 + nu)/(1 - nu) b h |eps| cos lambda against the line tension
    G b^2 (1 - nu cos^2 alpha) (ln(h/b) + 1) / (F/2 pi (1 - nu)), F = 8 for one segment.
    """
    factor = misfit_geometry(geometry).factor
    h = np.asarray(thickness_angstrom, float)
    b = np.asarray(burgers_angstrom, float)
    nu = np.asarray(poisson, float)
    eps = np.abs(np.asarray(strain, float))
    misfit = 2.0 * (1.0 + nu) * (h / b) * eps * cos_lambda
    tension = (1.0 - nu * cos_alpha**2) * (np.log(h / b) + 1.0) / (factor / 2.0 * np.pi)
    return misfit - tension


def critical_strain(
    thickness_angstrom: ArrayLike, burgers_angstrom: ArrayLike, poisson: ArrayLike,
    geometry: str = "single-uncapped", cos_alpha: float = COS_60, cos_lambda: float = COS_60,
) -> NDArray[np.float64]:
    """Largest |strain| at which a layer of the given thickness stays below h_c.

    Inverts the Matthews-Blakeslee balance at fixed thickness: with t = h/b >= 1,
    |eps_c| = (1 - nu cos^2 alpha)(ln t + 1) / (F pi t (1 + nu) cos lambda). Since h_c falls
    monotonically with |strain|, h < h_c(eps) exactly when |eps| < eps_c(h); this needs no
    Lambert W. For h < b (t < 1) the bound is that of K = 1, below which h_c < b.

    Args:
        thickness_angstrom: Layer thickness h (A).
        burgers_angstrom: b (A).
        poisson: nu.
        geometry: A key of :data:`GEOMETRIES`.
        cos_alpha: As in :func:`matthews_blakeslee_thickness`.
        cos_lambda: As in :func:`matthews_blakeslee_thickness`.

    Returns:
        |eps_c| (dimensionless).
    """
    factor = misfit_geometry(geometry).factor
    t = np.maximum(np.asarray(thickness_angstrom, float) / np.asarray(burgers_angstrom, float),
                   1.0)
    nu = np.asarray(poisson, float)
    return ((1.0 - nu * cos_alpha**2) * (np.log(t) + 1.0)
            / (factor * np.pi * t * (1.0 + nu) * cos_lambda))


def people_bean_thickness(mismatch: ArrayLike, burgers_angstrom: ArrayLike,
                          a_angstrom: ArrayLike, poisson: ArrayLike) -> NDArray[np.float64]:
    """Critical thickness (angstrom) by the People-Bean energy balance.

    h_c = [(1 - nu)/(1 + nu)] [1 / (16 pi sqrt 2)] (b^2 / a) (1 / f^2) ln(h_c / b); with t = h/b
    and k = [(1 - nu)/(1 + nu)] b / (16 pi sqrt(2) a f^2) this is t = k ln t, solved by
    t = -k W_-1(-1/k) for k >= e (0 below: no solution). An empirical energy balance: for
    SiGe on Si it lies well above Matthews-Blakeslee.

    Args:
        mismatch: Misfit f (sign ignored).
        burgers_angstrom: b (People and Bean used 4 A for SiGe).
        a_angstrom: Lattice constant a of the layer (A).
        poisson: Poisson ratio.
    """
    f = np.abs(np.asarray(mismatch, float))
    nu = np.asarray(poisson, float)
    b = np.asarray(burgers_angstrom, float)
    with np.errstate(divide="ignore"):
        k = (1.0 - nu) / (1.0 + nu) * b / (16.0 * np.pi * np.sqrt(2.0)
                                          * np.asarray(a_angstrom, float) * f**2)
    solvable = np.isfinite(k) & (k >= np.e)
    safe_k = np.where(solvable, k, np.e)
    t = -safe_k * lambertw(-1.0 / safe_k, k=-1).real
    return np.where(solvable, t * b, np.where(np.isinf(k), np.inf, 0.0))


def critical_thickness_nm(
    a_layer_angstrom: ArrayLike, a_substrate_angstrom: ArrayLike, poisson: ArrayLike,
    geometry: str = "single-uncapped",
) -> NDArray[np.float64]:
    """Matthews-Blakeslee critical thickness (nm) of a (001) zincblende/diamond layer.

    Uses the in-plane strain (a_sub - a_layer)/a_layer and b = a_layer / sqrt(2) (the 60 degree
    a/2<110> dislocation of the layer's relaxed lattice).

    Args:
        a_layer_angstrom: Relaxed lattice constant of the layer (A).
        a_substrate_angstrom: Substrate lattice constant (A).
        poisson: Poisson ratio of the layer for (001) biaxial strain.
        geometry: A key of :data:`GEOMETRIES`.

    Returns:
        h_c in nm (inf when lattice-matched, 0 when no thickness above b is stable).
    """
    a_layer = np.asarray(a_layer_angstrom, dtype=float)
    strain = in_plane_strain(a_layer, a_substrate_angstrom)
    h = matthews_blakeslee_thickness(strain, burgers_vector_60(a_layer), poisson, geometry)
    return h / ANGSTROM_PER_NM


@dataclass(frozen=True)
class SubstrateSpec:
    """A substrate as the engine uses it: a name and the lattice constant layers match.

    Attributes:
        name: Substrate name.
        lattice: "cubic" or "hexagonal".
        lattice_a_angstrom: Cubic a, or the in-plane a a hexagonal layer is compared with.
        note: How the value was obtained (e.g. the 30 degree rotation on sapphire).
    """

    name: str
    lattice: str
    lattice_a_angstrom: float
    note: str = ""


LATTICE_OF_SUBSTRATE: Final[dict[str, str]] = {
    "diamond": "cubic",
    "zincblende": "cubic",
    "wurtzite": "hexagonal",
    "hexagonal": "hexagonal",
    "corundum": "hexagonal",
}
"""Lattice kind of each substrate structure (``reference.SUBSTRATE_STRUCTURES``)."""


def substrate_from(name: str, structure: str, lattice_a_angstrom: float) -> SubstrateSpec:
    """A substrate from its structure and lattice constant (the table's or the user's own).

    Sapphire-like (corundum) substrates are given the effective in-plane a / sqrt(3): c-plane
    layers grow rotated by 30 degrees on them.

    Args:
        name: Substrate name.
        structure: One of :data:`LATTICE_OF_SUBSTRATE`'s keys.
        lattice_a_angstrom: Cubic a, or the hexagonal in-plane a (A), > 0.

    Raises:
        UnknownChoiceError: An unknown structure.
        OutOfRangeError: A lattice constant that is not a positive finite number.
    """
    if structure not in LATTICE_OF_SUBSTRATE:
        raise UnknownChoiceError(
            f"unknown substrate structure {structure!r}; choose one of "
            f"{', '.join(LATTICE_OF_SUBSTRATE)}"
        )
    a = float(lattice_a_angstrom)
    low, high = LATTICE_RANGE_ANGSTROM
    if not (np.isfinite(a) and low <= a <= high):
        raise OutOfRangeError(f"substrate lattice constant {lattice_a_angstrom!r} A: give a "
                              f"number from {low:g} to {high:g}")
    if structure == "corundum":
        return SubstrateSpec(name, "hexagonal", a / np.sqrt(3.0),
                             "a / sqrt(3): c-plane layers grow rotated by 30 degrees")
    return SubstrateSpec(name, LATTICE_OF_SUBSTRATE[structure], a)


def substrate_spec(name: str) -> SubstrateSpec:
    """Look a substrate up in the seed table (``seed_data/substrates.csv``).

    Args:
        name: Table name, e.g. "InP", "GaAs", "6H-SiC", "sapphire".

    Raises:
        UnknownSubstrateError: Naming the substrates in the table.
    """
    table = substrates()
    if name not in table:
        raise UnknownSubstrateError(
            f"unknown substrate {name!r}; the table has {', '.join(table)} (or give a lattice "
            "constant for a substrate of your own)"
        )
    row = table[name]
    return substrate_from(name, row.structure, row.lattice_a_angstrom)
