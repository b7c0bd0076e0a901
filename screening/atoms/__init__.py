"""All-electron LDA atoms: orbital energies (term values) of the neutral atoms H to Rn.

A self-consistent, spherical Kohn-Sham solver (Slater exchange + VWN5 correlation) on a
logarithmic radial grid with Richardson extrapolation, non-relativistic or scalar-relativistic
(scaled ZORA, with the spin-orbit splitting of the valence p level), and the tables of its
results for Z = 1 to 86 committed in ``screening/data/atomic_levels.json`` (non-relativistic)
and ``screening/data/atomic_levels_sr.json`` (scalar-relativistic).

Public API:
    `solve_atom` runs the SCF now; `atom_levels`, `term_values`, `spin_orbit_splitting_eV` and
    `lowest_d_level_eV` read the committed tables.
"""

from typing import Any

from screening.atoms.configurations import CONFIGURATIONS, MAX_Z, lowest_d_shell, valence_s_p
from screening.atoms.levels import AtomLevels, Level
from screening.atoms.table import (
    atom_levels,
    lowest_d_level_eV,
    spin_orbit_splitting_eV,
    term_values,
)

_SOLVER_NAMES = {"solve_atom": "solver", "DEFAULT_SETTINGS": "solver", "ScfSettings": "scf"}


def __getattr__(name: str) -> Any:
    """Load the solver (and scipy) only when it is used: reading the table needs neither."""
    if name in _SOLVER_NAMES:
        import importlib

        return getattr(importlib.import_module(f"screening.atoms.{_SOLVER_NAMES[name]}"), name)
    raise AttributeError(f"module 'screening.atoms' has no attribute {name!r}")

__all__ = [
    "CONFIGURATIONS",
    "DEFAULT_SETTINGS",
    "MAX_Z",
    "AtomLevels",
    "Level",
    "ScfSettings",
    "atom_levels",
    "lowest_d_level_eV",
    "lowest_d_shell",
    "solve_atom",
    "spin_orbit_splitting_eV",
    "term_values",
    "valence_s_p",
]
