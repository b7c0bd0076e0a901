"""All-electron LDA atoms: orbital energies (term values) of the neutral atoms H to Rn.

A self-consistent, spherical, non-relativistic Kohn-Sham solver (Slater exchange + VWN5
correlation) on a logarithmic radial grid with Richardson extrapolation, and the table of its
results for Z = 1 to 86 committed in ``screening/data/atomic_levels.json``.

Public API:
    `solve_atom` runs the SCF now; `atom_levels` and `term_values` read the committed table.
"""

from screening.atoms.configurations import CONFIGURATIONS, MAX_Z, valence_s_p
from screening.atoms.levels import AtomLevels, Level
from screening.atoms.scf import ScfSettings
from screening.atoms.solver import DEFAULT_SETTINGS, solve_atom
from screening.atoms.table import atom_levels, term_values

__all__ = [
    "CONFIGURATIONS",
    "DEFAULT_SETTINGS",
    "MAX_Z",
    "AtomLevels",
    "Level",
    "ScfSettings",
    "atom_levels",
    "solve_atom",
    "term_values",
    "valence_s_p",
]
