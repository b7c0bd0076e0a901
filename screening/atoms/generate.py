"""Generate or check the committed table of LDA atomic levels (H to Rn).

Usage::

    python -m screening.atoms.generate --write    # solve all 86 atoms, write the JSON
    python -m screening.atoms.generate --check    # solve again, compare with the file
"""

from __future__ import annotations

import argparse
import sys
import time
from collections.abc import Sequence

from screening.atoms.levels import AtomLevels
from screening.atoms.table import (
    ENERGY_DECIMALS,
    clear_cache,
    compute_table,
    load_table,
    table_document,
    table_path,
)


def _compare(atoms: Sequence[AtomLevels], stored: dict[int, AtomLevels]) -> float:
    """Largest |difference| in eV between freshly solved atoms and the stored table."""
    worst = 0.0
    for atom in atoms:
        old = stored[atom.Z]
        pairs = [(a.energy_eV, b.energy_eV) for a, b in zip(atom.levels, old.levels, strict=True)]
        pairs.append((atom.total_energy_eV, old.total_energy_eV))
        worst = max(worst, max(abs(a - b) for a, b in pairs))
    return worst


def main(argv: Sequence[str] | None = None) -> int:
    """Command line of the table generator; returns the exit code."""
    parser = argparse.ArgumentParser(
        prog="python -m screening.atoms.generate",
        description="Generate or check the committed table of LDA atomic levels (H to Rn).",
    )
    action = parser.add_mutually_exclusive_group(required=True)
    action.add_argument("--write", action="store_true", help="solve all atoms, write the table")
    action.add_argument("--check", action="store_true", help="solve all atoms, compare")
    parser.add_argument("--processes", type=int, default=2, help="worker processes (default 2)")
    args = parser.parse_args(argv)

    start = time.perf_counter()
    atoms = compute_table(args.processes)
    elapsed = time.perf_counter() - start
    print(f"solved {len(atoms)} atoms in {elapsed:.1f} s with {args.processes} process(es)")
    if args.write:
        path = table_path()
        path.write_text(table_document(atoms), encoding="utf-8")
        clear_cache()
        print(f"wrote {path}")
        return 0
    worst = _compare(atoms, load_table())
    tolerance = 10.0**-ENERGY_DECIMALS
    print(f"largest |solver - table| = {worst:.2e} eV (stored to {tolerance:.0e} eV)")
    return 0 if worst <= tolerance else 1


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
