"""Interpolation rules of alloys: Vegard's law, bowed gaps, and the quaternary gap scheme.

* Lattice constant: Vegard's law (L. Vegard, Z. Phys. 5, 17 (1921)), linear in each site's
  fractions: a = sum_ij p_i q_j a_ij over the binaries of cation i and anion j, which is
  linear for a ternary, bilinear for A(x)B(1-x)C(y)D(1-y), linear for A(x)B(y)C(1-x-y)D.
* Ternary gap, per valley (convention of Vurgaftman, Meyer & Ram-Mohan, J. Appl. Phys. 89,
  5815 (2001), "VMR"): T(u) = (1 - u) E_first + u E_second - u (1 - u) C(u), with
  C(u) = c0 + c1 u the bowing parameter. Written as a cubic polynomial in u.
* Quaternary gap: the weighted mean of its ternary edges,
  Q = sum_e w_e T_e(u_e) / sum_e w_e, w_e = f_first f_second f_other,
  u_e = (1 - f_first + f_second) / 2,
  which is the interpolation of Glisson et al., J. Electron. Mater. 7, 1 (1978), for
  A(x)B(1-x)C(y)D(1-y) (w = x (1 - x) y, ..., u = x or y) and VMR's for A(x)B(y)C(1-x-y)D
  (w = xy, yz, xz with the edge compositions projected as u = (1 - x + y)/2, ...). Where
  every weight vanishes (a pure binary) the binary's own gap is used.

Bowing parameters come from ``seed_data/bowing.csv`` (VMR 2001; Vurgaftman & Meyer 2003 for
the nitrides; each row names its source). Where the table has none for an edge and valley,
:func:`default_bowing` supplies the median of the table's values for that valley with their
standard deviation as the stated uncertainty, and the result is flagged. Hg(1-x)Cd(x)Te uses
the published composition and temperature law of Hansen, Schmit & Casselman instead.
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass
from functools import lru_cache

import numpy as np
from numpy.polynomial import Polynomial
from numpy.typing import ArrayLike, NDArray

from screening.reference import BowingParameter, bowing_parameters


@dataclass(frozen=True)
class EdgeLaw:
    """The gap law of one ternary edge in one valley, as a cubic polynomial in u.

    u is the fraction of the edge's second binary; T(u) = sum_k coefficients[k] u^k (eV).

    Attributes:
        coefficients: (p0, p1, p2, p3) in eV.
        uncertainty_eV: Uncertainty of the bowing parameter (stated, see
            :func:`tabulated_bowing_uncertainty`; 0 for a published composition law).
        source: Where the bowing or law comes from.
        default: True where the bowing is the flagged default.
        uses_endpoints: False for a published law that does not use the end-point gaps.
    """

    coefficients: tuple[float, float, float, float]
    uncertainty_eV: float
    source: str
    default: bool
    uses_endpoints: bool = True


@dataclass(frozen=True)
class DefaultBowing:
    """The bowing assumed where none is tabulated, per valley (eV).

    Attributes:
        value_eV: Median of the tabulated bowing parameters C(1/2) of that valley.
        uncertainty_eV: Their sample standard deviation, stated as the uncertainty.
        count: How many tabulated values it summarises.
    """

    value_eV: float
    uncertainty_eV: float
    count: int

    @property
    def source(self) -> str:
        """Description for reports."""
        return (
            f"default bowing {self.value_eV:.2f} +/- {self.uncertainty_eV:.2f} eV: median and "
            f"standard deviation of the {self.count} tabulated values (seed_data/bowing.csv); "
            "no published value for this alloy"
        )


@lru_cache(maxsize=4)
def default_bowing(valley: str) -> DefaultBowing:
    """Return the default bowing of a valley from the bowing table.

    Args:
        valley: "Gamma", "X" or "L"; any other name (the fundamental-gap fallback) uses every
            row of the table.

    Returns:
        The median of the tabulated C(1/2) and their standard deviation.
    """
    rows = bowing_parameters().values()
    values = [float(p.bowing_at(0.5)) for p in rows if p.valley == valley]
    if len(values) < 3:
        values = [float(p.bowing_at(0.5)) for p in rows]
    return DefaultBowing(float(np.median(values)), float(np.std(values, ddof=1)), len(values))


def bowed_polynomial(gap_first_eV: float, gap_second_eV: float, c0_eV: float, c1_eV: float
                     ) -> tuple[float, float, float, float]:
    """Coefficients in u of (1 - u) E1 + u E2 - u (1 - u)(c0 + c1 u).

    Args:
        gap_first_eV: Gap at u = 0 (eV).
        gap_second_eV: Gap at u = 1 (eV).
        c0_eV: Constant part of the bowing parameter (eV).
        c1_eV: Its slope in u (eV).

    Returns:
        (p0, p1, p2, p3) with T(u) = p0 + p1 u + p2 u^2 + p3 u^3.
    """
    return (
        gap_first_eV,
        gap_second_eV - gap_first_eV - c0_eV,
        c0_eV - c1_eV,
        c1_eV,
    )


@dataclass(frozen=True)
class CompositionLaw:
    """A published gap law of a ternary in its own composition variable x.

    Attributes:
        compound_x0: End point at x = 0.
        compound_x1: End point at x = 1 (x is its fraction).
        valley: The valley the law describes.
        coefficients: Function of temperature (K) -> (p0..p3), E(x) = sum p_k x^k (eV).
        source: The publication.
    """

    compound_x0: str
    compound_x1: str
    valley: str
    coefficients: Callable[[float], tuple[float, float, float, float]]
    source: str


def _hansen(temperature_K: float) -> tuple[float, float, float, float]:
    thermal = 5.35e-4 * temperature_K
    return (-0.302 + thermal, 1.93 - 2.0 * thermal, -0.81, 0.832)


COMPOSITION_LAWS: dict[frozenset[str], CompositionLaw] = {
    frozenset({"HgTe", "CdTe"}): CompositionLaw(
        compound_x0="HgTe",
        compound_x1="CdTe",
        valley="Gamma",
        coefficients=_hansen,
        source=(
            "G. L. Hansen, J. L. Schmit and T. N. Casselman, J. Appl. Phys. 53, 7099 (1982): "
            "E_g = -0.302 + 1.93x - 0.81x^2 + 0.832x^3 + 5.35e-4 T (1 - 2x) eV, x = Cd fraction "
            "(from memory)"
        ),
    ),
}
"""Ternaries whose gap follows a published law rather than end points and a bowing."""


def _in_edge_variable(coefficients: tuple[float, ...], reversed_: bool
                      ) -> tuple[float, float, float, float]:
    """Re-express a cubic in x as a cubic in u, where x = u or x = 1 - u."""
    if not reversed_:
        return tuple(float(c) for c in coefficients)  # type: ignore[return-value]
    composed = Polynomial(coefficients)(Polynomial([1.0, -1.0]))
    padded = np.zeros(4)
    padded[: len(composed.coef)] = composed.coef
    return tuple(float(c) for c in padded)  # type: ignore[return-value]


def edge_law(first: str, second: str, valley: str, gap_first_eV: float, gap_second_eV: float,
             temperature_K: float) -> EdgeLaw:
    """The gap law of the edge first -> second (u = fraction of ``second``) in one valley.

    Args:
        first: Binary at u = 0.
        second: Binary at u = 1.
        valley: "Gamma", "X", "L", or "fundamental" (interpolating the fundamental gaps of end
            points without valley data; always with the default bowing).
        gap_first_eV: End-point gap of ``first`` in this valley at the temperature (eV).
        gap_second_eV: Same for ``second``.
        temperature_K: Temperature (K), used by composition laws.

    Returns:
        The edge's law.
    """
    law = COMPOSITION_LAWS.get(frozenset({first, second}))
    if law is not None and law.valley == valley:
        coefficients = _in_edge_variable(law.coefficients(temperature_K),
                                         reversed_=law.compound_x1 != second)
        return EdgeLaw(coefficients, 0.0, law.source, default=False, uses_endpoints=False)
    param = _bowing_lookup().get((frozenset({first, second}), valley))
    if param is None:
        fallback = default_bowing(valley)
        return EdgeLaw(
            bowed_polynomial(gap_first_eV, gap_second_eV, fallback.value_eV, 0.0),
            fallback.uncertainty_eV, fallback.source, default=True,
        )
    c0, c1 = param.bowing_eV, param.bowing_linear_x_eV
    if param.compound_x1 != second:  # the table's x is 1 - u: C = (c0 + c1) - c1 u
        c0, c1 = c0 + c1, -c1
    return EdgeLaw(bowed_polynomial(gap_first_eV, gap_second_eV, c0, c1),
                   tabulated_bowing_uncertainty(c0 + c1 / 2.0),
                   f"{param.source} ({param.system}, {valley})", default=False)


TABULATED_BOWING_RELATIVE_UNCERTAINTY = 0.2
"""Stated relative uncertainty of a tabulated bowing parameter: the reviews give none, and
published values for one alloy commonly differ by this much (common practice, no source)."""

TABULATED_BOWING_MIN_UNCERTAINTY_EV = 0.05
"""Floor of the stated uncertainty of a tabulated bowing parameter, eV (common practice, no
source)."""


def tabulated_bowing_uncertainty(bowing_eV: float) -> float:
    """Stated uncertainty of a tabulated bowing parameter C (eV): max(0.05, 0.2 |C|)."""
    return max(TABULATED_BOWING_MIN_UNCERTAINTY_EV,
               TABULATED_BOWING_RELATIVE_UNCERTAINTY * abs(bowing_eV))


@lru_cache(maxsize=1)
def _bowing_lookup() -> dict[tuple[frozenset[str], str], BowingParameter]:
    """The bowing table keyed by (end points, valley), read once."""
    return {(frozenset({p.compound_x0, p.compound_x1}), p.valley): p
            for p in bowing_parameters().values()}


def horner(coefficients: NDArray[np.float64], u: ArrayLike) -> NDArray[np.float64]:
    """Evaluate a cubic: coefficients (4,) in ascending powers, at u (any shape)."""
    c = [float(v) for v in coefficients]
    u_arr = np.asarray(u, dtype=float)
    return ((c[3] * u_arr + c[2]) * u_arr + c[1]) * u_arr + c[0]
