"""Benchmark of the sp3 tight-binding band engine (screening/tight_binding.py).

Measures, in one run:
1. a uniform Brillouin-zone sample of 10^5 k-points for one compound (a 40 x 50 x 50
   Monkhorst-Pack grid in the primitive reciprocal cell): wall time and k-points per second
   of ``band_energies``;
2. the same work as a plain per-k-point loop (build one 8 x 8 matrix, call eigvalsh, repeat),
   timed on a subset and expressed per k-point, in two variants: the module's own
   ``hamiltonian`` called for one k-point at a time, and a minimal hand-written scalar builder;
   the ratio of each against the batched run;
3. band structures of every catalogue compound along a 400-point L-Gamma-X-W-K-Gamma path,
   and ``gaps`` for all of them.

The band cost does not depend on the parameter values, so the compound set is synthetic
(term values and bond lengths drawn over the octet range) with the catalogue's size when
``screening.catalogue`` is importable, else 90 sets.

Run: /work/venv/bin/python benchmarks/bench_bands.py
"""

from __future__ import annotations

import argparse
import os
import platform
import time
from collections.abc import Callable

import numpy as np

from screening.tight_binding import (
    DEFAULT_CHUNK,
    TightBindingParameters,
    band_energies,
    band_energies_symmetric,
    couplings,
    gaps,
    hamiltonian,
    high_symmetry_path,
)

FCC_RECIPROCAL = np.array([[-1.0, 1.0, 1.0], [1.0, -1.0, 1.0], [1.0, 1.0, -1.0]])
"""Primitive reciprocal vectors of the fcc lattice, rows, in units of 2 pi / a."""

GAAS_LDA = TightBindingParameters(
    eps_s_anion_eV=-14.250,
    eps_p_anion_eV=-5.374,
    eps_s_cation_eV=-8.926,
    eps_p_cation_eV=-2.766,
    bond_length_angstrom=2.448,
)
"""GaAs with NIST LDA term values (Kotochigova et al. 1997, via pymatgen)."""


def monkhorst_pack(n1: int, n2: int, n3: int) -> np.ndarray:
    """Uniform grid of n1 n2 n3 k-points in the primitive reciprocal cell, 2 pi / a units."""
    axes = [(np.arange(n) + 0.5) / n - 0.5 for n in (n1, n2, n3)]
    u = np.stack(np.meshgrid(*axes, indexing="ij"), axis=-1).reshape(-1, 3)
    return u @ FCC_RECIPROCAL


def synthetic_compounds(n: int, seed: int = 7) -> TightBindingParameters:
    rng = np.random.default_rng(seed)
    return TightBindingParameters(
        eps_s_anion_eV=rng.uniform(-25.0, -10.0, n),
        eps_p_anion_eV=rng.uniform(-12.0, -4.0, n),
        eps_s_cation_eV=rng.uniform(-15.0, -4.0, n),
        eps_p_cation_eV=rng.uniform(-8.0, -1.0, n),
        bond_length_angstrom=rng.uniform(1.5, 3.0, n),
    )


def catalogue_size() -> tuple[int, str]:
    try:
        from screening.catalogue import catalogue
    except ImportError:
        return 90, "90 synthetic parameter sets (catalogue not importable)"
    n = len(catalogue())
    return n, f"{n} synthetic parameter sets, the size of screening.catalogue"


def best_of(repeats: int, fn: Callable[[], object]) -> float:
    times = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return min(times)


def loop_module_builder(k: np.ndarray, params: TightBindingParameters) -> np.ndarray:
    """Reference loop: the module's hamiltonian for one k-point, then eigvalsh."""
    out = np.empty((len(k), 8))
    for i in range(len(k)):
        out[i] = np.linalg.eigvalsh(hamiltonian(k[i : i + 1], params)[0, 0])
    return out


def loop_scalar_builder(k: np.ndarray, params: TightBindingParameters) -> np.ndarray:
    """Reference loop: a minimal hand-written 8 x 8 builder per k-point, then eigvalsh."""
    c = couplings(params)
    vss, vs, vxx, vxy = (float(x[0]) for x in (c.v_ss_eV, c.v_s_eV, c.v_xx_eV, c.v_xy_eV))
    onsite = [
        params.eps_s_anion_eV[0],
        *[params.eps_p_anion_eV[0]] * 3,
        params.eps_s_cation_eV[0],
        *[params.eps_p_cation_eV[0]] * 3,
    ]
    directions = np.array([[1, 1, 1], [1, -1, -1], [-1, 1, -1], [-1, -1, 1]], dtype=float)
    diag = np.arange(8)
    out = np.empty((len(k), 8))
    for i in range(len(k)):
        e1, e2, e3, e4 = np.exp(0.5j * np.pi * (directions @ k[i]))
        g0, gx = e1 + e2 + e3 + e4, e1 + e2 - e3 - e4
        gy, gz = e1 - e2 + e3 - e4, e1 - e2 - e3 + e4
        block = np.array(
            [
                [vss * g0, vs * gx, vs * gy, vs * gz],
                [-vs * gx, vxx * g0, vxy * gz, vxy * gy],
                [-vs * gy, vxy * gz, vxx * g0, vxy * gx],
                [-vs * gz, vxy * gy, vxy * gx, vxx * g0],
            ]
        )
        h = np.zeros((8, 8), dtype=complex)
        h[:4, 4:] = block
        h[4:, :4] = block.conj().T
        h[diag, diag] = onsite
        out[i] = np.linalg.eigvalsh(h)
    return out


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--repeats", type=int, default=3, help="best of this many runs")
    parser.add_argument("--loop-k", type=int, default=3000, help="k-points timed in the loops")
    args = parser.parse_args()

    print(
        f"python {platform.python_version()}, numpy {np.__version__}, "
        f"{os.cpu_count()} cores, {platform.machine()}"
    )

    # 1. uniform sample, one compound
    k_bz = monkhorst_pack(47, 47, 47)
    n_k = len(k_bz)
    band_energies(k_bz[:4096], GAAS_LDA)  # warm-up
    t_batch = best_of(args.repeats, lambda: band_energies(k_bz, GAAS_LDA))
    rate_batch = n_k / t_batch
    print(f"\n[1] uniform BZ sample, GaAs, {n_k} k-points (47x47x47 Monkhorst-Pack grid)")
    print(
        f"    band_energies (batched, chunked):  {t_batch:.3f} s   {rate_batch:,.0f} k-points/s"
        f"   ({1e6 / rate_batch:.2f} us per k-point)   target < 2 s"
    )

    h_chunk = hamiltonian(k_bz[:DEFAULT_CHUNK], GAAS_LDA)[0]
    t_eig = best_of(5 * args.repeats, lambda: np.linalg.eigvalsh(h_chunk))
    print(
        f"    of which numpy.linalg.eigvalsh alone: {1e6 * t_eig / len(h_chunk):.2f} us per "
        f"matrix (batches of {DEFAULT_CHUNK}; LAPACK zheevd, the floor of this route)"
    )

    band_energies_symmetric(k_bz[:4096], GAAS_LDA)  # warm-up
    t_sym = best_of(args.repeats, lambda: band_energies_symmetric(k_bz, GAAS_LDA))
    rate_sym = n_k / t_sym
    print(
        f"    band_energies_symmetric (each O_h orbit once): {t_sym:.3f} s   "
        f"{rate_sym:,.0f} k-points/s"
    )

    # 2. per-k-point loops on a subset, same run
    sub = k_bz[:: max(1, n_k // args.loop_k)][: args.loop_k]
    reference = band_energies(sub, GAAS_LDA)[0]
    print(
        f"\n[2] plain per-k-point loops (build one matrix, eigvalsh, repeat), {len(sub)} k-points"
    )
    for name, loop in (
        ("module hamiltonian() per k-point", loop_module_builder),
        ("minimal scalar builder per k-point", loop_scalar_builder),
    ):
        np.testing.assert_allclose(loop(sub[:50], GAAS_LDA), reference[:50], atol=1e-11)
        t_loop = best_of(max(1, args.repeats - 1), lambda lp=loop: lp(sub, GAAS_LDA))
        rate_loop = len(sub) / t_loop
        print(
            f"    {name:36s} {1e6 / rate_loop:7.2f} us per k-point  {rate_loop:>10,.0f} k/s"
            f"   batched is {rate_batch / rate_loop:5.1f}x faster, symmetric "
            f"{rate_sym / rate_loop:5.1f}x   (10^5 k would take {1e5 / rate_loop:.1f} s)"
        )

    # 3. all compounds along the path
    n_c, what = catalogue_size()
    params = synthetic_compounds(n_c)
    k_path, _, _ = high_symmetry_path(400)
    band_energies(k_path[:10], params)  # warm-up
    t_path = best_of(args.repeats, lambda: band_energies(k_path, params))
    n_mat = n_c * len(k_path)
    print(f"\n[3] band structures, {what}, 400-point L-G-X-W-K-G path: {n_mat} matrices")
    print(f"    band_energies: {t_path:.3f} s   {n_mat / t_path:,.0f} k-points/s")
    t_gaps = best_of(args.repeats, lambda: gaps(params))
    print(f"    gaps (Gamma, X, L + 400-point path, min gap, direct): {t_gaps:.3f} s")


if __name__ == "__main__":
    main()
