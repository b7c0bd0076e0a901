"""Benchmark of the composition finder over the whole alloy design space.

Design space: every ternary and quaternary system of the catalogue's III-V and II-VI binaries
with measured data (ternaries on a 0.001 grid, quaternaries on 0.005), screened against one
target: 1310 +/- 20 nm at 300 K, |mismatch| <= 0.1 % and a 100 nm layer below its
Matthews-Blakeslee thickness. The cubic systems are screened on InP, the hexagonal ones (the
nitrides and oxides, which may not be mixed with cubic substrates) on GaN, with the same
target. A second, harder target (a gap window only, so that every point's gap is evaluated)
is timed as well.

The reference is a plain per-point Python loop over the same formulas and the same cascade
(Vegard, mismatch, gap, window, Poisson ratio, critical strain), timed on a random sample of
grid points in the same run and checked against the vectorised results on that sample.

Run: python benchmarks/bench_finder.py   (prints the figures; no assertions on timing)
"""

from __future__ import annotations

import math
import resource
import statistics
import sys
import time
import tracemalloc
from dataclasses import replace
from pathlib import Path

import numpy as np

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

from screening import epitaxy  # noqa: E402
from screening.alloys import FinderQuery, GapWindow, find_compositions, select_systems  # noqa: E402
from screening.alloys.bandgap import gap_tables  # noqa: E402
from screening.alloys.design import design_space  # noqa: E402
from screening.alloys.systems import design_space_systems  # noqa: E402

FAMILIES = ("III-V", "II-VI")
TARGET = GapWindow.from_wavelength(1310.0, 20.0)
MAX_MISMATCH = 1e-3
THICKNESS_NM = 100.0
SAMPLE = 40_000
REPEATS = 5


def queries(gap_only: bool = False, exact_roots: bool = True) -> list[FinderQuery]:
    limits = {} if gap_only else {"max_mismatch": MAX_MISMATCH, "layer_thickness_nm": THICKNESS_NM}
    return [FinderQuery(substrate=epitaxy.substrate_spec(name), gap=TARGET, families=FAMILIES,
                        exact_roots=exact_roots, **limits) for name in ("InP", "GaN")]


def run(batch: list[FinderQuery]) -> tuple[float, int, int]:
    start = time.perf_counter()
    results = [find_compositions(q) for q in batch]
    elapsed = time.perf_counter() - start
    return elapsed, sum(r.points_screened for r in results), sum(len(r) for r in results)


def timed(batch: list[FinderQuery]) -> tuple[float, int, int, float]:
    """Median wall time of REPEATS warm runs, points, matches, peak traced memory (MiB)."""
    times = []
    for _ in range(REPEATS):
        elapsed, points, matches = run(batch)
        times.append(elapsed)
    tracemalloc.start()
    run(batch)
    _, peak = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    return statistics.median(times), points, matches, peak / 2**20


def reference_loop(query: FinderQuery, rows: np.ndarray) -> tuple[float, list[int], list[float]]:
    """The same screen, one grid point at a time in plain Python, same cascade and inputs.

    Uses the same per-binary data and edge polynomials (built once, as the engine does) and
    the same order of tests as the vectorised screen: Vegard lattice constant, mismatch limit,
    gap (lowest channel of the edge interpolation), gap window, Poisson ratio, critical strain.
    It leaves out the survivors' gap uncertainty and the exact roots (both favour the loop).
    """
    systems, _ = select_systems(query)
    space = design_space(systems, query.ternary_step, query.quaternary_step)
    packed = space.packed
    tables = gap_tables(packed, query.temperature_K)
    a_sub = query.substrate.lattice_a_angstrom
    window = query.gap
    max_mismatch = math.inf if query.max_mismatch is None else query.max_mismatch
    thickness = query.layer_thickness_nm
    slots = [[(int(packed.slot_cation[s, k]), int(packed.slot_anion[s, k]),
               int(packed.slot_binary[s, k])) for k in range(len(sy.binaries))]
             for s, sy in enumerate(packed.systems)]
    edges = [[(int(packed.edge_first[s, e]), int(packed.edge_second[s, e]),
               int(packed.edge_other[s, e])) for e in range(len(sy.edges))]
             for s, sy in enumerate(packed.systems)]
    coefficients = tables.coefficients.tolist()
    used = [[c for c in range(4) if tables.channel_used[s, c]] for s in range(len(systems))]
    endpoint = tables.endpoint_gap_eV.tolist()
    lattice = packed.lattice_a_angstrom.tolist()
    c11s, c12s = packed.c11_GPa.tolist(), packed.c12_GPa.tolist()
    zincblende = [sy.structure == "zincblende" for sy in packed.systems]
    system_index = space.system_index.tolist()
    fractions = space.fractions.tolist()
    kept, gaps = [], []
    start = time.perf_counter()
    for i in rows.tolist():
        s, f = system_index[i], fractions[i]
        a = sum(f[c] * f[n] * lattice[b] for c, n, b in slots[s])
        if abs(a / a_sub - 1.0) > max_mismatch + 1e-12:
            continue
        gap = math.inf
        for c in used[s]:
            if len(edges[s]) == 1:
                first, second, _ = edges[s][0]
                u = 0.5 * (1.0 - f[first] + f[second])
                p0, p1, p2, p3 = coefficients[s][0][c]
                value = ((p3 * u + p2) * u + p1) * u + p0
            else:
                total = numerator = 0.0
                for e, (first, second, other) in enumerate(edges[s]):
                    w = f[first] * f[second] * f[other]
                    u = 0.5 * (1.0 - f[first] + f[second])
                    p0, p1, p2, p3 = coefficients[s][e][c]
                    numerator += w * (((p3 * u + p2) * u + p1) * u + p0)
                    total += w
                if total > 0.0:
                    value = numerator / total
                else:
                    value = sum(f[cat] * f[an] * endpoint[b][c] for cat, an, b in slots[s])
            gap = min(gap, value)
        if not window.low_eV - 1e-12 <= gap <= window.high_eV + 1e-12:
            continue
        c11 = sum(f[c] * f[n] * c11s[b] for c, n, b in slots[s])
        c12 = sum(f[c] * f[n] * c12s[b] for c, n, b in slots[s])
        nu = c12 / (c11 + c12) if math.isfinite(c11 + c12) else epitaxy.DEFAULT_POISSON_RATIO
        if thickness is not None:
            t = max(thickness * 10.0 / (a / math.sqrt(2.0)), 1.0)
            eps_c = (1.0 - nu / 4.0) * (math.log(t) + 1.0) / (8.0 * math.pi * t * (1.0 + nu) * 0.5)
            if not zincblende[s] or abs((a_sub - a) / a) >= eps_c:
                continue
        kept.append(i)
        gaps.append(gap)
    return time.perf_counter() - start, kept, gaps


def agreement(query: FinderQuery, kept: list[int], gaps: list[float], rows: np.ndarray) -> str:
    """Compare the loop's matches on the sample with the vectorised grid matches."""
    result = find_compositions(query)
    systems, _ = select_systems(query)
    space = design_space(systems, query.ternary_step, query.quaternary_step)

    def key(s: int, row: np.ndarray) -> tuple:
        return int(s), tuple(np.round(row, 9))

    sample = {key(space.system_index[i], space.fractions[i]) for i in rows}
    found = {key(s, row): gap for s, row, gap in zip(
        result.system_index, result.fractions, result.band_gap_eV, strict=True)
        if key(s, row) in sample}
    loop = {key(space.system_index[i], space.fractions[i]): g
            for i, g in zip(kept, gaps, strict=True)}
    common = set(found) & set(loop)
    worst = max((abs(found[k] - loop[k]) for k in common), default=0.0)
    # The vectorised result lists each composition once: a quaternary grid point with a zero
    # fraction is the same alloy as a ternary grid point and is reported under the ternary.
    only_loop = set(loop) - set(found)
    edge = sum(1 for s, row in only_loop if 0.0 in row[: len(systems[s].elements)])
    return (f"loop kept {len(loop)}, vectorised {len(found)} of the sampled points; "
            f"{len(common)} in common (max |dE| {worst:.1e} eV), {len(set(found) - set(loop))} "
            f"only vectorised, {len(only_loop)} only in the loop, of which {edge} are "
            "quaternary edge points listed once under their ternary")


def compare_with_loop(label: str, query: FinderQuery) -> None:
    systems, _ = select_systems(query)
    space = design_space(systems, query.ternary_step, query.quaternary_step)
    rows = np.sort(np.random.default_rng(1).choice(space.size, size=SAMPLE, replace=False))
    loop_time, kept, gaps = reference_loop(query, rows)
    loop_rate = SAMPLE / loop_time
    grid_only = replace(query, exact_roots=False)
    grid_time = statistics.median(run([grid_only])[0] for _ in range(REPEATS))
    full_time = statistics.median(run([query])[0] for _ in range(REPEATS))
    print(f"{label}, {len(systems)} systems on {query.substrate.name}, {space.size:,} grid points")
    print(f"  plain Python loop, {SAMPLE:,} random grid points: {loop_time:.3f} s -> "
          f"{loop_rate:,.0f} points/s (all points: {space.size / loop_rate:.1f} s)")
    print(f"  vectorised, grid only: {grid_time:.3f} s -> {space.size / grid_time:,.0f} points/s "
          f"-> {space.size / grid_time / loop_rate:,.0f}x the loop")
    print(f"  vectorised, grid + exact roots: {full_time:.3f} s -> "
          f"{space.size / full_time / loop_rate:,.0f}x the loop")
    print(f"  check on the sample: {agreement(grid_only, kept, gaps, rows)}")


def main() -> None:
    systems = design_space_systems(FAMILIES)
    total_points = design_space(systems).size
    print(f"design space: {len(systems)} systems "
          f"({sum(s.form == 'ternary' for s in systems)} ternary, "
          f"{sum(s.form == 'quaternary' for s in systems)} quaternary), "
          f"{total_points:,} grid points (ternaries 0.001, quaternaries 0.005)")
    design_space.cache_clear()
    gap_tables.cache_clear()

    batch = queries()
    tracemalloc.start()
    cold, points, matches = run(batch)
    _, cold_peak = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    print(f"target: {TARGET.description} at 300 K, |f| <= {MAX_MISMATCH:g}, "
          f"{THICKNESS_NM:g} nm below h_c (single uncapped); cubic systems on InP, hexagonal "
          "ones on GaN")
    print(f"  cold (first call: builds grids and tables): {cold:.3f} s, "
          f"peak traced memory {cold_peak / 2**20:.0f} MiB")
    warm, points, matches, peak = timed(batch)
    print(f"  warm (median of {REPEATS}): {warm:.3f} s for {points:,} points "
          f"(grid + exact roots) -> {points / warm:,.0f} points/s; {matches} matches; "
          f"peak traced memory {peak:.0f} MiB")
    hard = queries(gap_only=True)
    warm_hard, points_hard, matches_hard, peak_hard = timed(hard)
    print(f"gap window only (every point's gap evaluated): {warm_hard:.3f} s, "
          f"{points_hard / warm_hard:,.0f} points/s, {matches_hard} matches, "
          f"peak traced memory {peak_hard:.0f} MiB")
    print()
    compare_with_loop("the target above", batch[0])
    compare_with_loop("gap window only", hard[0])
    print(f"process peak RSS: {resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024:.0f} MiB")


if __name__ == "__main__":
    main()
