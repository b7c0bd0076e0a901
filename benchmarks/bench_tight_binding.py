"""Benchmark of the valley sampler (screening/tight_binding/valleys.py), sp3 and sp3s*.

Measures, for 100 compounds and for the catalogue's compounds with the engine's LDA term
values (when ``screening.catalogue`` is importable):
1. ``valleys`` with the sp3s* model and with the sp3 model (19 k-points per compound), cold
   (first call in the process, term values already loaded) and warm (best of repeats);
2. for scale, ``gaps`` of the sp3 model on its 400-point path for the same compounds.
Target: ``valleys`` for 100 compounds well under 0.3 s.

Run: PYTHONPATH=. /work/main/.venv/bin/python benchmarks/bench_tight_binding.py
"""

from __future__ import annotations

import argparse
import os
import platform
import time
from collections.abc import Callable

import numpy as np

from screening.tight_binding import SSTAR_SI_VHD, TightBindingParameters, gaps, valleys


def synthetic_compounds(n: int, seed: int = 7) -> TightBindingParameters:
    """Term values and bond lengths drawn over the octet range (the cost does not depend
    on the values)."""
    rng = np.random.default_rng(seed)
    return TightBindingParameters(
        eps_s_anion_eV=rng.uniform(-25.0, -10.0, n),
        eps_p_anion_eV=rng.uniform(-12.0, -4.0, n),
        eps_s_cation_eV=rng.uniform(-15.0, -4.0, n),
        eps_p_cation_eV=rng.uniform(-8.0, -1.0, n),
        bond_length_angstrom=rng.uniform(1.5, 3.0, n),
    )


def catalogue_parameters() -> tuple[TightBindingParameters, str] | None:
    """The catalogue's compounds with the engine's term values, or None if not importable."""
    try:
        from screening.evaluate import catalogue_table
        from screening.tight_binding import parameters_from_elements
    except ImportError:
        return None
    table = catalogue_table()
    params = parameters_from_elements(
        [c.cation for c in table.compounds], [c.anion for c in table.compounds],
        table.bond_length_used_angstrom,
    )
    return params, f"{params.n_compounds} catalogue compounds (engine LDA term values)"


def timed(fn: Callable[[], object]) -> float:
    t0 = time.perf_counter()
    fn()
    return time.perf_counter() - t0


def best_of(repeats: int, fn: Callable[[], object]) -> float:
    return min(timed(fn) for _ in range(repeats))


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--repeats", type=int, default=5)
    args = parser.parse_args()
    print(f"python {platform.python_version()}, numpy {np.__version__}, "
          f"{os.cpu_count()} CPUs, {platform.machine()}")
    sets = [(synthetic_compounds(100), "100 synthetic compounds")]
    cat = catalogue_parameters()
    if cat is not None:
        sets.append(cat)
    for params, what in sets:
        print(f"\n{what}")
        for label, model in (("sp3s*", SSTAR_SI_VHD), ("sp3", None)):
            cold = timed(lambda p=params, m=model: valleys(p, m))
            warm = best_of(args.repeats, lambda p=params, m=model: valleys(p, m))
            print(f"    valleys ({label:5s}, 19 k-points each): cold {1e3 * cold:7.2f} ms, "
                  f"warm {1e3 * warm:7.2f} ms   target < 300 ms")
        t_gaps = best_of(max(1, args.repeats // 2), lambda p=params: gaps(p))
        print(f"    for scale: gaps (sp3, 400-point path): {1e3 * t_gaps:7.1f} ms")


if __name__ == "__main__":
    main()
