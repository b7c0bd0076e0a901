"""Result types of the atom solver: one orbital level and the levels of one atom (eV)."""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class Level:
    """One Kohn-Sham orbital energy of a free atom.

    Attributes:
        orbital: Spectroscopic label such as ``"4p"``.
        n: Principal quantum number.
        l: Angular momentum quantum number (0 = s, 1 = p, 2 = d, 3 = f).
        occupation: Electrons in the orbital in the ground-state configuration (0 for an
            unoccupied valence level).
        energy_eV: Orbital eigenvalue in eV relative to the vacuum level (negative = bound).
    """

    orbital: str
    n: int
    l: int  # noqa: E741 - the quantum number's conventional name
    occupation: float
    energy_eV: float


@dataclass(frozen=True)
class AtomLevels:
    """Kohn-Sham (LDA) levels of one neutral atom in its ground-state configuration.

    Non-relativistic, or scalar-relativistic (scaled ZORA) with the spin-orbit pair of the
    valence p level.

    Attributes:
        element: Element symbol.
        Z: Atomic number.
        configuration: Ground-state configuration, e.g. ``"[Ar] 3d10 4s2"``.
        levels: Every occupied orbital plus the unoccupied valence s and p, sorted by (n, l).
        total_energy_eV: LDA total energy of the atom in eV (for a relativistic solution with
            the plain ZORA kinetic energy).
        relativistic: True for scalar-relativistic levels (scaled ZORA).
        valence_p_j_eV: Relativistic solutions only: energies in eV of the valence p level's
            j = 1/2 and j = 3/2 states, (E(p1/2), E(p3/2)), in the final scalar potential;
            (0, 0) where that p level is not bound.
        lowest_d: The lowest d level (`screening.atoms.configurations.lowest_d_shell`): the
            outermost occupied d (occupation > 0; the same level as in ``levels``) or, where
            the (n-1)d shell is empty, the lowest unoccupied d eigenvalue of the final
            self-consistent potential; energy NaN where the potential binds no such d state.
            None only for results made without it.
    """

    element: str
    Z: int
    configuration: str
    levels: tuple[Level, ...]
    total_energy_eV: float
    relativistic: bool = False
    valence_p_j_eV: tuple[float, float] | None = None
    lowest_d: Level | None = None

    @property
    def spin_orbit_splitting_eV(self) -> float | None:
        """Delta_p = E(p3/2) - E(p1/2) of the valence p level in eV; None if non-relativistic."""
        if self.valence_p_j_eV is None:
            return None
        return self.valence_p_j_eV[1] - self.valence_p_j_eV[0]

    def level(self, orbital: str) -> Level:
        """Return the level with spectroscopic label ``orbital`` (e.g. ``"4s"``).

        Raises:
            KeyError: The atom has no such level in ``levels``.
        """
        for level in self.levels:
            if level.orbital == orbital:
                return level
        raise KeyError(f"{self.element} has no level {orbital!r} in its table")
