"""Generate or check the committed tables of LDA atomic levels (H to Rn).

Both tables, non-relativistic (``atomic_levels.json``) and scalar-relativistic
(``atomic_levels_sr.json``), are solved and written or checked together.

Usage::

    python -m screening.atoms.generate --write    # solve all 86 atoms twice, write the JSON
    python -m screening.atoms.generate --check    # solve again, compare with the files
"""

from __future__ import annotations

import argparse
import math
import sys
import time
from collections.abc import Sequence

from screening.atoms.levels import AtomLevels
from screening.atoms.table import (
    ENERGY_DECIMALS,
    clear_cache,
    compute_tables,
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
        if atom.valence_p_j_eV is not None and old.valence_p_j_eV is not None:
            pairs.extend(zip(atom.valence_p_j_eV, old.valence_p_j_eV, strict=True))
        elif atom.valence_p_j_eV != old.valence_p_j_eV:
            return float("inf")
        new_d, old_d = atom.lowest_d, old.lowest_d
        if new_d is None or old_d is None or new_d.orbital != old_d.orbital:
            return float("inf")
        if math.isnan(new_d.energy_eV) or math.isnan(old_d.energy_eV):
            if not (math.isnan(new_d.energy_eV) and math.isnan(old_d.energy_eV)):
                return float("inf")
        else:
            pairs.append((new_d.energy_eV, old_d.energy_eV))
        worst = max(worst, max(abs(a - b) for a, b in pairs))
    return worst


def main(argv: Sequence[str] | None = None) -> int:
    """Command line of the table generator; returns the exit code."""
    parser = argparse.ArgumentParser(
        prog="python -m screening.atoms.generate",
        description="Generate or check the committed tables of LDA atomic levels (H to Rn), "
        "non-relativistic and scalar-relativistic.",
    )
    action = parser.add_mutually_exclusive_group(required=True)
    action.add_argument("--write", action="store_true", help="solve all atoms, write the table")
    action.add_argument("--check", action="store_true", help="solve all atoms, compare")
    parser.add_argument("--processes", type=int, default=2, help="worker processes (default 2)")
    args = parser.parse_args(argv)

    start = time.perf_counter()
    tables = dict(zip((False, True), compute_tables(args.processes), strict=True))
    elapsed = time.perf_counter() - start
    print(
        f"solved {len(tables[False])} atoms non- and scalar-relativistically in {elapsed:.1f} s "
        f"with {args.processes} process(es)"
    )
    if args.write:
        for relativistic, atoms in tables.items():
            path = table_path(relativistic)
            path.write_text(table_document(atoms), encoding="utf-8")
            print(f"wrote {path}")
        clear_cache()
        return 0
    tolerance = 10.0**-ENERGY_DECIMALS
    worst = 0.0
    for relativistic, atoms in tables.items():
        difference = _compare(atoms, load_table(relativistic))
        print(
            f"{table_path(relativistic).name}: largest |solver - table| = {difference:.2e} eV "
            f"(stored to {tolerance:.0e} eV)"
        )
        worst = max(worst, difference)
    return 0 if worst <= tolerance else 1


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
