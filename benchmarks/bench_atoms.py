"""Time the all-electron LDA atom solver: both 86-element tables, per atom, and lookups.

Non-relativistic and scalar-relativistic (scaled ZORA, with the valence p spin-orbit pair)
solutions are timed separately per atom; the pool run times the generator's job, both tables.

Run:  /work/venv/bin/python benchmarks/bench_atoms.py [--processes N ...] [--skip-serial]

Prints wall times; asserts nothing about them.
"""

from __future__ import annotations

import argparse
import os
import statistics
import time
from multiprocessing import Pool

from screening.atoms import MAX_Z, solve_atom
from screening.atoms.table import compute_tables, load_table, spin_orbit_splitting_eV, term_values


def timed_solve(z: int, relativistic: bool = False) -> tuple[int, float]:
    start = time.perf_counter()
    solve_atom(z, relativistic=relativistic)
    return z, time.perf_counter() - start


def run_serial(relativistic: bool) -> None:
    start = time.perf_counter()
    per_atom = dict(timed_solve(z, relativistic) for z in range(1, MAX_Z + 1))
    wall = time.perf_counter() - start
    times = list(per_atom.values())
    slowest = max(per_atom, key=per_atom.__getitem__)
    kind = "scalar-relativistic" if relativistic else "non-relativistic"
    print(f"serial, 1 process, {kind}: {wall:.1f} s wall for {MAX_Z} atoms")
    print(
        f"  per atom: mean {statistics.mean(times):.3f} s, median {statistics.median(times):.3f} s,"
        f" min {min(times):.3f} s, max {max(times):.3f} s (Z = {slowest})"
    )
    for first, last in ((1, 18), (19, 36), (37, 54), (55, 86)):
        chunk = [per_atom[z] for z in range(first, last + 1)]
        print(f"  Z = {first:>2}..{last:<2}: mean {statistics.mean(chunk):.3f} s per atom")


def run_pool(processes: int) -> None:
    start = time.perf_counter()
    with Pool(processes) as pool:
        results = pool.map(timed_solve, range(MAX_Z, 0, -1), chunksize=1)
    wall = time.perf_counter() - start
    cpu = sum(t for _, t in results)
    print(
        f"pool of {processes} processes, non-relativistic only: {wall:.1f} s wall for {MAX_Z} "
        f"atoms ({wall / MAX_Z:.3f} s per atom of wall time, {cpu:.1f} s summed over atoms)"
    )
    start = time.perf_counter()
    compute_tables(processes)
    print(
        f"generator's job (both tables, {processes} processes): "
        f"{time.perf_counter() - start:.1f} s wall"
    )


def run_lookups() -> None:
    start = time.perf_counter()
    load_table.cache_clear()
    load_table()
    load = time.perf_counter() - start
    symbols = ["Ga", "As", "In", "P", "Zn", "Se", "Cd", "Te", "Al", "Sb"] * 1000
    term_values(symbols[:1])
    start = time.perf_counter()
    term_values(symbols)
    lookup = time.perf_counter() - start
    start = time.perf_counter()
    load_table(True)
    term_values(symbols, relativistic=True)
    spin_orbit_splitting_eV(symbols)
    relativistic = time.perf_counter() - start
    print(
        f"table load from JSON: {load * 1e3:.1f} ms; term_values of {len(symbols)} symbols: "
        f"{lookup * 1e3:.1f} ms; relativistic table load + term_values + "
        f"spin_orbit_splitting_eV: {relativistic * 1e3:.1f} ms"
    )


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__)
    parser.add_argument("--processes", type=int, nargs="*", default=[2])
    parser.add_argument("--skip-serial", action="store_true")
    args = parser.parse_args()
    print(f"machine: {os.cpu_count()} cores")
    run_lookups()
    if not args.skip_serial:
        run_serial(False)
        run_serial(True)
    for processes in args.processes:
        run_pool(processes)


if __name__ == "__main__":
    main()
