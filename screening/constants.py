"""Physical constants used by the engine, with their source.

CODATA 2018 (E. Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)) unless noted.
"""

HARTREE_EV: float = 27.211386245988
"""Hartree energy in eV (CODATA 2018)."""

BOHR_ANGSTROM: float = 0.529177210903
"""Bohr radius in angstrom (CODATA 2018)."""

E2_EV_ANGSTROM: float = 14.399645
"""e^2/(4 pi eps0) in eV angstrom (CODATA 2018)."""

HBAR2_OVER_M_EV_ANGSTROM2: float = 7.62
"""hbar^2/m_e in eV angstrom^2, Harrison's rounding of 7.61996 (W. A. Harrison, Electronic
Structure and the Properties of Solids, Freeman 1980)."""

HC_EV_NM: float = 1239.84198
"""h c in eV nm (CODATA 2018): photon wavelength in nm = HC_EV_NM / energy in eV."""
