"""Alloy band gaps over compositions of many systems: the lowest valley, with its uncertainty.

Per temperature, :func:`gap_tables` turns every system's ternary edges into cubic polynomials
per channel (Gamma, X, L, and the fundamental-gap fallback; see ``valleys`` and
``interpolation``) and decides which channels a system's gap is the minimum over.
:func:`band_gap` evaluates the Glisson/VMR weighted mean of the edges for each channel and
takes the lowest; :func:`gap_uncertainty` propagates the bowing and end-point uncertainties.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache

import numpy as np
from numpy.typing import NDArray

from screening.alloys.interpolation import edge_law, horner
from screening.alloys.model import (
    WIDTH,
    PackedSystems,
    binary_weights,
    system_runs,
)
from screening.alloys.systems import AlloySystem
from screening.alloys.valleys import CHANNELS, FUNDAMENTAL, channel_gaps

VALLEY_CHANNELS = (0, 1, 2)
"""Channel indices of the three valleys (Gamma, X, L) in :data:`CHANNELS`."""

_CONSISTENCY_EV = 1e-6
"""Largest difference between an end point's lowest valley and its fundamental gap."""


@dataclass(frozen=True, eq=False)
class GapTables:
    """Each system's edge gap laws at one temperature.

    Attributes:
        temperature_K: Temperature (K).
        coefficients: (nsystem, 4 edges, 4 channels, 4 powers) cubic coefficients in u (eV);
            NaN for a channel the system does not use.
        bowing_uncertainty_eV: (nsystem, 4, 4) uncertainty of each edge's bowing (eV).
        default_bowing: (nsystem, 4, 4) True where the bowing is the flagged default.
        uses_endpoints: (nsystem, 4, 4) False for a published composition law.
        endpoint_gap_eV: (nbinary + 1, 4) end-point gaps per channel (padding 0).
        endpoint_uncertainty_eV: (nbinary + 1, 4) their uncertainties.
        channel_used: (nsystem, 4) channels each system's gap is the minimum over.
        sources: Per system, per edge, per channel: where the law comes from.
    """

    temperature_K: float
    coefficients: NDArray[np.float64]
    bowing_uncertainty_eV: NDArray[np.float64]
    default_bowing: NDArray[np.bool_]
    uses_endpoints: NDArray[np.bool_]
    endpoint_gap_eV: NDArray[np.float64]
    endpoint_uncertainty_eV: NDArray[np.float64]
    channel_used: NDArray[np.bool_]
    sources: tuple[tuple[tuple[str, ...], ...], ...]



def _channels_used(system: AlloySystem, finite: NDArray[np.bool_],
                   endpoint: NDArray[np.float64], binary_index: list[int]) -> NDArray[np.bool_]:
    """Channels a system's gap is the minimum over.

    The valley channels whose every edge has a law, unless an end point's lowest valley among
    them is not its fundamental gap: then only the fundamental channel (default bowing).
    """
    used = np.zeros(len(CHANNELS), dtype=bool)
    n_edges = len(system.edges)
    for c in VALLEY_CHANNELS:
        used[c] = bool(finite[:n_edges, c].all())
    consistent = used.any()
    for b in binary_index:
        fundamental = endpoint[b, FUNDAMENTAL]
        valleys = endpoint[b, list(VALLEY_CHANNELS)][used[list(VALLEY_CHANNELS)]]
        valleys = valleys[np.isfinite(valleys)]
        if np.isfinite(fundamental) and (
            valleys.size == 0 or abs(valleys.min() - fundamental) > _CONSISTENCY_EV
        ):
            consistent = False
    if not consistent:
        used[:] = False
        used[FUNDAMENTAL] = bool(finite[:n_edges, FUNDAMENTAL].all())
    return used


@lru_cache(maxsize=16)
def gap_tables(packed: PackedSystems, temperature_K: float) -> GapTables:
    """Build (and cache) every system's edge gap laws at one temperature.

    Args:
        packed: The packed systems.
        temperature_K: Temperature (K, >= 0).

    Returns:
        The tables.
    """
    channels = channel_gaps(packed.binaries[:-1], temperature_K)
    endpoint = np.vstack([channels.gap_eV, np.zeros((1, len(CHANNELS)))])
    endpoint_unc = np.vstack([channels.uncertainty_eV, np.zeros((1, len(CHANNELS)))])
    index = {b: i for i, b in enumerate(packed.binaries)}
    n = len(packed.systems)
    shape = (n, WIDTH, len(CHANNELS))
    coefficients = np.zeros((*shape, 4))
    uncertainty = np.zeros(shape)
    default = np.zeros(shape, dtype=bool)
    uses_endpoints = np.ones(shape, dtype=bool)
    used = np.zeros((n, len(CHANNELS)), dtype=bool)
    sources: list[tuple[tuple[str, ...], ...]] = []
    for s, system in enumerate(packed.systems):  # loop over systems and their few edges
        edge_sources = []
        for e, edge in enumerate(system.edges):
            first, second = system.binaries[edge.slot_first], system.binaries[edge.slot_second]
            laws = [edge_law(first, second, channel, endpoint[index[first], c],
                             endpoint[index[second], c], temperature_K)
                    for c, channel in enumerate(CHANNELS)]
            coefficients[s, e] = [law.coefficients for law in laws]
            uncertainty[s, e] = [law.uncertainty_eV for law in laws]
            default[s, e] = [law.default for law in laws]
            uses_endpoints[s, e] = [law.uses_endpoints for law in laws]
            edge_sources.append(tuple(law.source for law in laws))
        sources.append(tuple(edge_sources))
        finite = np.isfinite(coefficients[s]).all(axis=-1)
        used[s] = _channels_used(system, finite, endpoint,
                                 [index[b] for b in system.binaries])
        coefficients[s, : len(system.edges), ~used[s]] = np.nan
    return GapTables(float(temperature_K), coefficients, uncertainty, default, uses_endpoints,
                     endpoint, endpoint_unc, used, tuple(sources))


def _one_system_gap(packed: PackedSystems, tables: GapTables, s: int, f: NDArray[np.float64]
                    ) -> tuple[NDArray[np.float64], NDArray[np.intp]]:
    """Gap and channel of compositions f (n, 5) of one system s (scalar coefficients)."""
    columns = np.ascontiguousarray(f.T)
    n_edges = int(packed.n_edges[s])
    first, second, other = packed.edge_first[s], packed.edge_second[s], packed.edge_other[s]
    u = [0.5 * (1.0 - columns[first[e]] + columns[second[e]]) for e in range(n_edges)]
    weight = [columns[first[e]] * columns[second[e]] * columns[other[e]]
              for e in range(n_edges)]
    total = sum(weight) if n_edges > 1 else None
    gap = np.full(len(f), np.inf)
    channel = np.full(len(f), -1, dtype=np.intp)
    for c in np.flatnonzero(tables.channel_used[s]):
        if total is None:  # a ternary's gap is its one edge
            value = horner(tables.coefficients[s, 0, c], u[0])
        else:
            value = weight[0] * horner(tables.coefficients[s, 0, c], u[0])
            for e in range(1, n_edges):
                value += weight[e] * horner(tables.coefficients[s, e, c], u[e])
            value /= np.where(total > 0.0, total, 1.0)
        lower = value < gap
        gap = np.where(lower, value, gap)
        channel = np.where(lower, c, channel)
    if total is not None:
        vertex = np.flatnonzero(total <= 0.0)
        if len(vertex):  # pure binaries of a quaternary: their own lowest channel
            slots = np.stack([columns[i, vertex] * columns[j, vertex] for i, j in
                              zip(packed.slot_cation[s], packed.slot_anion[s], strict=True)])
            binary = packed.slot_binary[s, np.argmax(slots, axis=0)]
            values = np.where(tables.channel_used[s], tables.endpoint_gap_eV[binary], np.inf)
            values = np.where(np.isnan(values), np.inf, values)
            lowest = values.min(axis=1)
            channel[vertex] = np.where(np.isfinite(lowest), np.argmin(values, axis=1), -1)
            gap[vertex] = lowest
    return np.where(channel >= 0, gap, np.nan), channel


def band_gap(packed: PackedSystems, tables: GapTables, system_index: NDArray[np.intp],
             fractions: NDArray[np.float64]) -> tuple[NDArray[np.float64], NDArray[np.intp]]:
    """The alloy gap: the lowest channel (eV), and which channel it is (-1 where unknown).

    The compositions are grouped by system; each group is evaluated with that system's
    coefficients as scalars (a loop over the systems present, each vectorised over its
    compositions), which avoids gathering per-point coefficient arrays.
    """
    order, runs = system_runs(system_index)
    ordered = fractions if order is None else fractions[order]
    gap = np.empty(len(system_index))
    channel = np.empty(len(system_index), dtype=np.intp)
    for s, start, stop in runs:
        gap[start:stop], channel[start:stop] = _one_system_gap(packed, tables, s,
                                                               ordered[start:stop])
    if order is not None:
        gap[order], channel[order] = gap.copy(), channel.copy()
    return gap, channel


def gap_uncertainty(packed: PackedSystems, tables: GapTables, system_index: NDArray[np.intp],
                    fractions: NDArray[np.float64], channel: NDArray[np.intp]
                    ) -> tuple[NDArray[np.float64], NDArray[np.bool_]]:
    """Uncertainty of the gap in its channel, and whether a default bowing entered it.

    The bowing uncertainties of the edges (independent) and the end-point uncertainties
    (independent) are propagated through the interpolation and added in quadrature:
    dQ/dc0_e = -(w_e / sum w) u_e (1 - u_e); dQ/dE_b = sum_e (w_e / sum w) * ((1 - u_e) or
    u_e) over the edges that end at binary b.

    Args:
        packed: The packed systems.
        tables: Gap tables at the temperature of the gaps.
        system_index: (npoint,) system of each composition.
        fractions: (npoint, 5) site fractions.
        channel: (npoint,) channel of each gap (-1: unknown gap).

    Returns:
        (uncertainty in eV, default-bowing flag), NaN / False where the gap is unknown.
    """
    order, runs = system_runs(system_index)
    ordered = (fractions, channel) if order is None else (fractions[order], channel[order])
    sigma = np.empty(len(system_index))
    flag = np.empty(len(system_index), dtype=bool)
    for s, start, stop in runs:
        sigma[start:stop], flag[start:stop] = _one_system_uncertainty(
            packed, tables, s, ordered[0][start:stop], ordered[1][start:stop])
    if order is not None:
        sigma[order], flag[order] = sigma.copy(), flag.copy()
    return sigma, flag


def _one_system_uncertainty(packed: PackedSystems, tables: GapTables, s: int,
                            f: NDArray[np.float64], channel: NDArray[np.intp]
                            ) -> tuple[NDArray[np.float64], NDArray[np.bool_]]:
    """:func:`gap_uncertainty` of compositions f (n, 5) of one system s.

    The padding edges of a system (weight 0) add nothing, so only its own edges are visited.
    """
    columns = np.ascontiguousarray(f.T)
    n = len(f)
    n_edges = int(packed.n_edges[s])
    first, second, other = packed.edge_first[s], packed.edge_second[s], packed.edge_other[s]
    u = [0.5 * (1.0 - columns[first[e]] + columns[second[e]]) for e in range(n_edges)]
    if n_edges == 1:
        weight = [np.ones(n)]
    else:
        weight = [columns[first[e]] * columns[second[e]] * columns[other[e]]
                  for e in range(n_edges)]
    total = weight[0]
    for e in range(1, n_edges):
        total = total + weight[e]
    share = [np.divide(w, total, out=np.zeros(n), where=total > 0.0) for w in weight]
    ch = np.clip(channel, 0, None)
    bowing_var = np.zeros(n)
    flag = np.zeros(n, dtype=bool)
    slot_sensitivity = np.zeros((WIDTH, n))
    for e in range(n_edges):
        curve = share[e] * u[e] * (1.0 - u[e])
        bowing_var += (curve * tables.bowing_uncertainty_eV[s, e][ch]) ** 2
        flag |= (curve > 0.0) & tables.default_bowing[s, e][ch]
        endpoint_share = np.where(tables.uses_endpoints[s, e][ch], share[e], 0.0)
        slot_sensitivity[packed.edge_slot_first[s, e]] += endpoint_share * (1.0 - u[e])
        slot_sensitivity[packed.edge_slot_second[s, e]] += endpoint_share * u[e]
    slot_sensitivity = slot_sensitivity.T
    vertex = np.flatnonzero(total <= 0.0)
    if len(vertex):
        slot_sensitivity[vertex] = binary_weights(packed, np.full(len(vertex), s), f[vertex])
    sigma_end = tables.endpoint_uncertainty_eV[packed.slot_binary[s]].T[ch]  # (n, slot)
    end_var = np.where(slot_sensitivity > 0.0, (slot_sensitivity * sigma_end) ** 2, 0.0).sum(1)
    unknown = channel < 0
    return (np.where(unknown, np.nan, np.sqrt(bowing_var + end_var)), flag & ~unknown)
