"""Temperature dependence of band gaps, and the photon wavelength of a gap.

Forms
-----
* Varshni: E_g(T) = E_g(0) - alpha T^2 / (T + beta) (Y. P. Varshni, Physica 34, 149 (1967)).
  With beta = 0 it is the linear form E_g(0) - alpha T, which is how Vurgaftman, Meyer and
  Ram-Mohan's linear InP X-valley law is stored.
* Bose-Einstein, as Vurgaftman, Meyer and Ram-Mohan write it for the GaP Gamma valley:
  E_g(T) = E_g(0) + a_B [1 - coth(theta / T)].

Parameters per valley (Gamma, X, L) are read from ``seed_data/varshni.csv``; the III-V values are
those of I. Vurgaftman, J. R. Meyer and L. R. Ram-Mohan, J. Appl. Phys. 89, 5815 (2001)
("VMR 2001"), each row naming its source and whether it was recalled from memory.

Gap at a temperature
--------------------
The engine keeps the measured 300 K gap exactly and borrows only the *shape* of the temperature
law: for a compound with valleys v,

    E_g(T) = E_g,measured(300 K) + min_v E_v(T) - min_v E_v(300 K),

so the measured value is returned unchanged at 300 K and a crossover between valleys (the
fundamental valley changing with temperature) is followed. With a single valley this is
E_g(300 K) + V(T) - V(300 K), V the Varshni shift. Where the table has no entry for a compound,
the Varshni shape with :data:`DEFAULT_ALPHA_MEV_PER_K` and :data:`DEFAULT_BETA_K` is used and
the result is flagged ``assumed``. A measured 300 K gap <= 0 (the semimetals HgTe, HgSe, whose
gap grows with temperature) gives NaN: the laws here do not describe them.
"""

from __future__ import annotations

import csv
import math
from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from functools import lru_cache
from pathlib import Path

import numpy as np
from numpy.typing import ArrayLike, NDArray

from screening.constants import HC_EV_NM
from screening.errors import BondgapInputError
from screening.reference import SeedDataError, seed_data_dir

VARSHNI_FILE = "varshni.csv"
VARSHNI_COLUMNS = (
    "formula",
    "valley",
    "eg0_eV",
    "alpha_meV_per_K",
    "beta_K",
    "source",
    "from_memory",
    "note",
)
VALLEYS = ("Gamma", "X", "L")

REFERENCE_TEMPERATURE_K: float = 300.0
"""Temperature of the measured gaps the engine holds (K)."""

DEFAULT_ALPHA_MEV_PER_K: float = 0.5
"""Assumed Varshni alpha (meV/K) where the table has no entry: a round value typical of the
VMR 2001 III-V table (GaAs Gamma 0.5405 meV/K; the Gamma values span 0.28-0.89). Common
practice, no source."""

DEFAULT_BETA_K: float = 200.0
"""Assumed Varshni beta (K) where the table has no entry: a round value typical of the VMR 2001
III-V table (GaAs 204 K; the Gamma values span 93-530 K). Common practice, no source."""

DEFAULT_SOURCE = (
    f"assumed: Varshni alpha = {DEFAULT_ALPHA_MEV_PER_K} meV/K, beta = {DEFAULT_BETA_K:g} K, "
    "typical III-V values (common practice, no source)"
)

_VMR_2001 = "I. Vurgaftman, J. R. Meyer and L. R. Ram-Mohan, J. Appl. Phys. 89, 5815 (2001)"


@dataclass(frozen=True)
class BoseEinsteinLaw:
    """Parameters of E(T) = E(0) + a_B [1 - coth(theta / T)].

    Attributes:
        a_B_eV: Amplitude (eV).
        theta_K: Temperature scale (K).
        source: Publication.
    """

    a_B_eV: float
    theta_K: float
    source: str


BOSE_EINSTEIN_LAWS: dict[tuple[str, str], BoseEinsteinLaw] = {
    ("GaP", "Gamma"): BoseEinsteinLaw(a_B_eV=0.1081, theta_K=164.0, source=_VMR_2001),
}
"""Valleys whose table row leaves alpha and beta blank and uses the Bose-Einstein form; E(0)
comes from the table row. Recalled from memory of VMR 2001."""


@dataclass(frozen=True)
class ValleyLaw:
    """Temperature law of one valley of one compound, as read from the table.

    Attributes:
        formula: Normalised formula (cation first; elements as "Si").
        valley: "Gamma", "X" or "L": where the conduction-band minimum of this gap lies.
        eg0_eV: Gap to this valley at 0 K (eV).
        alpha_meV_per_K: Varshni alpha (meV/K); None for the Bose-Einstein form.
        beta_K: Varshni beta (K); None for the Bose-Einstein form.
        source: Publication the row comes from.
        from_memory: True where the values were recalled rather than checked in print.
        note: Free text from the table.
        bose_einstein: The Bose-Einstein parameters, or None for the Varshni form.
    """

    formula: str
    valley: str
    eg0_eV: float
    alpha_meV_per_K: float | None
    beta_K: float | None
    source: str
    from_memory: bool
    note: str
    bose_einstein: BoseEinsteinLaw | None = None

    def gap_eV(self, temperature_K: ArrayLike) -> NDArray[np.float64]:
        """Return this valley's gap at the given temperatures (K), in eV."""
        if self.bose_einstein is not None:
            law = self.bose_einstein
            return bose_einstein_eV(self.eg0_eV, law.a_B_eV, law.theta_K, temperature_K)
        assert self.alpha_meV_per_K is not None and self.beta_K is not None
        return varshni_eV(self.eg0_eV, self.alpha_meV_per_K, self.beta_K, temperature_K)


_COLD_X = 350.0
"""theta / T beyond which 1 - coth(theta / T) is 0 in doubles (exp(-700) is about 1e-304)."""


def _temperatures(temperature_K: ArrayLike) -> NDArray[np.float64]:
    t = np.asarray(temperature_K, dtype=np.float64)
    if not np.all(np.isfinite(t)) or np.any(t < 0.0):
        raise BondgapInputError(f"temperatures must be finite and >= 0 K, got {temperature_K!r}")
    return t


def varshni_shift_eV(
    alpha_meV_per_K: ArrayLike, beta_K: ArrayLike, temperature_K: ArrayLike
) -> NDArray[np.float64]:
    """Return the Varshni shift -alpha T^2 / (T + beta) in eV (0 at T = 0, also for beta = 0).

    Args:
        alpha_meV_per_K: alpha (meV/K), broadcastable.
        beta_K: beta (K), >= 0, broadcastable.
        temperature_K: Temperatures (K), >= 0, broadcastable.

    Returns:
        The broadcast array of shifts (eV), <= 0 for alpha >= 0.

    Raises:
        BondgapInputError: For a negative or non-finite temperature or beta.
    """
    t = _temperatures(temperature_K)
    alpha = np.asarray(alpha_meV_per_K, dtype=np.float64) * 1e-3
    beta = np.asarray(beta_K, dtype=np.float64)
    if np.any(beta < 0.0) or not np.all(np.isfinite(beta)):
        raise BondgapInputError(f"beta must be finite and >= 0 K, got {beta_K!r}")
    t, alpha, beta = np.broadcast_arrays(t, alpha, beta)
    denominator = t + beta
    # T * (T / (T + beta)): T^2 itself would overflow above 1e154 K and underflow below 1e-154
    share = np.divide(t, denominator, out=np.zeros(t.shape), where=denominator > 0.0)
    return -alpha * (t * share)


def varshni_eV(
    eg0_eV: ArrayLike, alpha_meV_per_K: ArrayLike, beta_K: ArrayLike, temperature_K: ArrayLike
) -> NDArray[np.float64]:
    """Return the Varshni gap E_g(0) - alpha T^2 / (T + beta), broadcast over all inputs.

    Use shapes (ncompound, 1) for the parameters and (ntemperature,) for T to get a
    compounds x temperatures table.

    Args:
        eg0_eV: Gap at 0 K (eV).
        alpha_meV_per_K: alpha (meV/K).
        beta_K: beta (K), >= 0.
        temperature_K: Temperatures (K), >= 0.

    Returns:
        Gaps (eV), the broadcast shape of the inputs.
    """
    return np.asarray(eg0_eV, dtype=np.float64) + varshni_shift_eV(
        alpha_meV_per_K, beta_K, temperature_K
    )


def bose_einstein_eV(
    eg0_eV: ArrayLike, a_B_eV: ArrayLike, theta_K: ArrayLike, temperature_K: ArrayLike
) -> NDArray[np.float64]:
    """Return E(0) + a_B [1 - coth(theta / T)], the form VMR 2001 use for the GaP Gamma gap.

    Args:
        eg0_eV: Gap at 0 K (eV).
        a_B_eV: Amplitude (eV).
        theta_K: Temperature scale (K), > 0.
        temperature_K: Temperatures (K), >= 0; at 0 K the gap is E(0).

    Returns:
        Gaps (eV), the broadcast shape of the inputs.
    """
    t = _temperatures(temperature_K)
    theta = np.asarray(theta_K, dtype=np.float64)
    t, theta = np.broadcast_arrays(t, theta)
    # 1 - coth x = -2 / (exp(2 x) - 1) with x = theta / T. Below T = theta / _COLD_X the term
    # is under exp(-2 _COLD_X) (1e-304) and is 0 in doubles; theta / T is not even formed
    # there (it overflows for T near 1e-310 K).
    warm = t > theta / _COLD_X
    x = np.divide(theta, t, out=np.full(t.shape, _COLD_X), where=warm)
    one_minus_coth = np.where(warm, -2.0 / np.expm1(2.0 * x), 0.0)
    return np.asarray(eg0_eV, dtype=np.float64) + np.asarray(a_B_eV) * one_minus_coth


def wavelength_nm(gap_eV: ArrayLike) -> NDArray[np.float64]:
    """Return the photon wavelength (nm) of a gap: lambda = h c / E_g = 1239.84 / E_g.

    Args:
        gap_eV: Gaps (eV), any shape.

    Returns:
        Wavelengths (nm); NaN where the gap is <= 0 or NaN (no photon of that energy: a
        semimetal, or an unknown gap).
    """
    gap = np.asarray(gap_eV, dtype=np.float64)
    positive = gap > 0.0
    return np.divide(HC_EV_NM, gap, out=np.full(gap.shape, np.nan), where=positive)


def varshni_table_path(data_dir: Path | str | None = None) -> Path:
    """Return the path of ``varshni.csv`` in ``data_dir`` (default: the seed-data directory)."""
    base = seed_data_dir() if data_dir is None else Path(data_dir).expanduser().resolve()
    return base / VARSHNI_FILE


def load_varshni_table(data_dir: Path | str | None = None) -> dict[str, tuple[ValleyLaw, ...]]:
    """Read ``varshni.csv``: formula -> its valley laws, in file order.

    A row with alpha and beta both blank uses the Bose-Einstein form and must have an entry in
    :data:`BOSE_EINSTEIN_LAWS`.

    Args:
        data_dir: Directory holding ``varshni.csv``; default ``screening.reference.seed_data_dir``.

    Returns:
        A new dict keyed by normalised formula.

    Raises:
        SeedDataError: If the file is missing or a row is malformed (the message names the file
            and line).
    """
    return dict(_load(varshni_table_path(data_dir)))


@lru_cache(maxsize=8)
def _load(path: Path) -> dict[str, tuple[ValleyLaw, ...]]:
    if not path.is_file():
        raise SeedDataError(f"{path}: seed-data file not found")
    table: dict[str, list[ValleyLaw]] = {}
    with path.open(newline="", encoding="utf-8") as handle:
        reader = csv.reader(handle)
        header = tuple(h.strip() for h in next(reader, []))
        if header != VARSHNI_COLUMNS:
            raise SeedDataError(
                f"{path}:1: header must be exactly {','.join(VARSHNI_COLUMNS)}; found {header!r}"
            )
        for record in reader:
            if not any(cell.strip() for cell in record):
                continue
            where = f"{path}:{reader.line_num}"
            if len(record) != len(VARSHNI_COLUMNS):
                raise SeedDataError(f"{where}: expected {len(VARSHNI_COLUMNS)} fields")
            row = dict(zip(VARSHNI_COLUMNS, (c.strip() for c in record), strict=True))
            law = _row_law(where, row)
            laws = table.setdefault(law.formula, [])
            if any(other.valley == law.valley for other in laws):
                raise SeedDataError(f"{where}: duplicate {law.formula} {law.valley} row")
            laws.append(law)
    return {formula: tuple(laws) for formula, laws in table.items()}


def _row_number(where: str, column: str, text: str) -> float:
    try:
        value = float(text)
    except ValueError:
        raise SeedDataError(f"{where}: {column} {text!r} is not a number") from None
    if not math.isfinite(value) or value < 0.0:
        raise SeedDataError(f"{where}: {column} {text!r} must be a finite number >= 0")
    return value


def _row_law(where: str, row: dict[str, str]) -> ValleyLaw:
    formula, valley = row["formula"], row["valley"]
    if valley not in VALLEYS:
        raise SeedDataError(f"{where}: valley {valley!r} is not one of {', '.join(VALLEYS)}")
    if not row["source"]:
        raise SeedDataError(f"{where}: missing source (every value needs one)")
    flag = row["from_memory"].lower()
    if flag not in ("true", "false"):
        raise SeedDataError(f"{where}: from_memory must be 'true' or 'false'")
    eg0 = _row_number(where, "eg0_eV", row["eg0_eV"])
    alpha_text, beta_text = row["alpha_meV_per_K"], row["beta_K"]
    bose = None
    alpha = beta = None
    if alpha_text == "" and beta_text == "":
        bose = BOSE_EINSTEIN_LAWS.get((formula, valley))
        if bose is None:
            raise SeedDataError(
                f"{where}: alpha and beta are blank but {formula} {valley} has no "
                "Bose-Einstein law in screening.temperature.BOSE_EINSTEIN_LAWS"
            )
    else:
        alpha = _row_number(where, "alpha_meV_per_K", alpha_text)
        beta = _row_number(where, "beta_K", beta_text)
    return ValleyLaw(
        formula=formula,
        valley=valley,
        eg0_eV=eg0,
        alpha_meV_per_K=alpha,
        beta_K=beta,
        source=row["source"],
        from_memory=flag == "true",
        note=row["note"],
        bose_einstein=bose,
    )


@dataclass(frozen=True, eq=False)
class GapAtTemperature:
    """Gap of one compound at one or more temperatures.

    Attributes:
        formula: Normalised formula.
        temperature_K: The temperatures asked for (K), as given (scalar or array).
        gap_eV: Gap at each temperature (eV), the shape of ``temperature_K``.
        gap_300K_eV: The measured 300 K gap it was anchored to (eV).
        valley: Lowest valley at each temperature ("Gamma", "X", "L"; "" where assumed).
        assumed: True where the default Varshni shape was used (no table entry).
        source: Where the temperature law comes from.
    """

    formula: str
    temperature_K: NDArray[np.float64]
    gap_eV: NDArray[np.float64]
    gap_300K_eV: float
    valley: NDArray[np.str_]
    assumed: bool
    source: str


@dataclass(frozen=True, eq=False)
class GapsAtTemperature:
    """Gaps of many compounds at many temperatures.

    Attributes:
        formulas: The compounds, in the order given.
        temperature_K: Temperatures (K), shape (ntemperature,).
        gap_eV: Gaps (eV), shape (ncompound, ntemperature).
        valley: Lowest valley per compound and temperature ("" where assumed).
        assumed: Per compound: True where the default Varshni shape was used.
        sources: Per compound: where its temperature law comes from.
    """

    formulas: tuple[str, ...]
    temperature_K: NDArray[np.float64]
    gap_eV: NDArray[np.float64]
    valley: NDArray[np.str_]
    assumed: NDArray[np.bool_]
    sources: tuple[str, ...]


def gaps_at_temperature(
    formulas: Sequence[str],
    gap_300K_eV: ArrayLike,
    temperature_K: ArrayLike,
    table: Mapping[str, Sequence[ValleyLaw]] | None = None,
) -> GapsAtTemperature:
    """Move measured 300 K gaps to other temperatures with each compound's valley laws.

    E_g(T) = E_g(300 K) + min_v E_v(T) - min_v E_v(300 K) over the compound's tabulated valleys
    (see the module docstring); compounds not in the table use the Varshni shape with
    :data:`DEFAULT_ALPHA_MEV_PER_K`, :data:`DEFAULT_BETA_K` and are flagged ``assumed``.

    Args:
        formulas: Normalised formulas (cation first; elements as "Si"), ncompound of them.
        gap_300K_eV: Measured 300 K gaps (eV), scalar or shape (ncompound,). NaN stays NaN;
            a gap <= 0 gives NaN.
        temperature_K: Temperatures (K), scalar or 1-D, >= 0.
        table: formula -> valley laws; default :func:`load_varshni_table`.

    Returns:
        A :class:`GapsAtTemperature` with gaps of shape (ncompound, ntemperature).

    Raises:
        BondgapInputError: For negative temperatures or mismatched lengths.
    """
    laws_by_formula = load_varshni_table() if table is None else table
    names = tuple(formulas)
    temps = np.atleast_1d(_temperatures(temperature_K))
    if temps.ndim != 1:
        raise BondgapInputError(f"temperature_K must be a scalar or 1-D, got {temps.shape}")
    gap300 = np.asarray(gap_300K_eV, dtype=np.float64)
    try:
        gap300 = np.broadcast_to(gap300, (len(names),))
    except ValueError:
        raise BondgapInputError(
            f"need one 300 K gap per formula: {len(names)} formulas, gaps of shape {gap300.shape}"
        ) from None
    grid = np.concatenate([[REFERENCE_TEMPERATURE_K], temps])
    # valley energies: (ncompound, nvalley, 1 + ntemperature), +inf where a valley is absent
    energies = np.full((len(names), len(VALLEYS), grid.size), np.inf)
    assumed = np.zeros(len(names), dtype=bool)
    sources = []
    for i, formula in enumerate(names):
        laws = laws_by_formula.get(formula, ())
        if not laws:
            assumed[i] = True
            sources.append(DEFAULT_SOURCE)
            energies[i, 0] = varshni_eV(0.0, DEFAULT_ALPHA_MEV_PER_K, DEFAULT_BETA_K, grid)
            continue
        for law in laws:
            energies[i, VALLEYS.index(law.valley)] = law.gap_eV(grid)
        sources.append("; ".join(sorted({law.source for law in laws})))
    lowest = energies.min(axis=1)
    gaps = gap300[:, None] + (lowest[:, 1:] - lowest[:, :1])
    gaps = np.where(gap300[:, None] > 0.0, gaps, np.nan)
    valley = np.asarray(VALLEYS)[energies[:, :, 1:].argmin(axis=1)]
    valley = np.where(assumed[:, None], "", valley)
    return GapsAtTemperature(
        formulas=names,
        temperature_K=temps,
        gap_eV=gaps,
        valley=valley,
        assumed=assumed,
        sources=tuple(sources),
    )


def gap_at(
    formula: str,
    gap_300K_eV: float,
    temperature_K: ArrayLike,
    table: Mapping[str, Sequence[ValleyLaw]] | None = None,
) -> GapAtTemperature:
    """Move one compound's measured 300 K gap to other temperatures.

    Args:
        formula: Normalised formula (cation first; elements as "Si").
        gap_300K_eV: Measured gap at 300 K (eV).
        temperature_K: A temperature or 1-D array of temperatures (K), >= 0.
        table: formula -> valley laws; default :func:`load_varshni_table`.

    Returns:
        A :class:`GapAtTemperature`; ``gap_eV`` has the shape of ``temperature_K``.
    """
    temps = np.asarray(temperature_K, dtype=np.float64)
    many = gaps_at_temperature([formula], gap_300K_eV, temps.ravel(), table)
    return GapAtTemperature(
        formula=formula,
        temperature_K=temps,
        gap_eV=many.gap_eV[0].reshape(temps.shape),
        gap_300K_eV=float(gap_300K_eV),
        valley=many.valley[0].reshape(temps.shape),
        assumed=bool(many.assumed[0]),
        source=many.sources[0],
    )
