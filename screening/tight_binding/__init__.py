"""sp3 nearest-neighbour tight-binding bands of diamond and zincblende octet compounds.

The model
---------
One s and three p orbitals on each of the two atoms of the zincblende primitive cell (anion at
the origin, cation at (a/4)(1, 1, 1)); nearest-neighbour two-centre couplings only, written in
the Slater-Koster form (J. C. Slater and G. F. Koster, Phys. Rev. 94, 1498 (1954)) as set
out for these structures by D. J. Chadi and M. L. Cohen, phys. stat. sol. (b) 68, 405 (1975).
The couplings are Harrison's universal ones, V_ll'm = eta_ll'm hbar^2/(m d^2), with the 1981
coefficients eta_ss_sigma = -1.32, eta_sp_sigma = 1.42, eta_pp_sigma = 2.22, eta_pp_pi = -0.63
(W. A. Harrison, Phys. Rev. B 24, 5835 (1981); also W. A. Harrison, Electronic Structure and
the Properties of Solids, Dover 1989) and hbar^2/m = 7.62 eV angstrom^2. The on-site energies
are atomic s and p term values, supplied by the caller (for the catalogue they come from
``screening.atoms.term_values``). Diamond is the case of equal anion and cation term values.

Basis order of every 8 x 8 matrix: s_a, px_a, py_a, pz_a, s_c, px_c, py_c, pz_c (a = anion,
c = cation). With the anion-to-cation vectors d_j = (a/4) n_j, n_1 = (1, 1, 1),
n_2 = (1, -1, -1), n_3 = (-1, 1, -1), n_4 = (-1, -1, 1), phases e_j = exp(i k.d_j) and the sums
g0 = sum_j e_j, gx = e1 + e2 - e3 - e4, gy = e1 - e2 + e3 - e4, gz = e1 - e2 - e3 + e4, the
anion-cation block is::

              s_c        px_c       py_c       pz_c
    s_a     Vss g0     Vs gx      Vs gy      Vs gz
    px_a   -Vs gx      Vxx g0     Vxy gz     Vxy gy
    py_a   -Vs gy      Vxy gz     Vxx g0     Vxy gx
    pz_a   -Vs gz      Vxy gy     Vxy gx     Vxx g0

with Vs = V_sp_sigma / sqrt(3), Vxx = (V_pp_sigma + 2 V_pp_pi) / 3 and
Vxy = (V_pp_sigma - V_pp_pi) / 3. Wave vectors are given in units of 2 pi / a, so the phases
k.d_j = (pi / 2) k.n_j do not depend on the lattice constant; d enters only through the
couplings. The four lowest bands are filled (eight valence electrons per atom pair).

Known limits
------------
* The conduction bands are poor away from Gamma: with four orbitals per atom and nearest
  neighbours only, the lowest conduction level at X lies far too high, so the indirect gaps
  come out wrong (Si, for instance, gets its conduction minimum at L instead of near X).
  The sp3s* model (``sstar.py``: an extra s* orbital per atom, P. Vogl, H. P. Hjalmarson and
  J. D. Dow, J. Phys. Chem. Solids 44, 365 (1983)) brings X down; ``valleys.py`` gives the
  Gamma, X and L valleys of either model.
* No spin-orbit coupling in H (no split-off band; the Gamma_15 valence top stays triply
  degenerate); ``spin_orbit.py`` gives Delta0 from atomic splittings to first order.
* No d states (no shallow cation d bands in the Ga, In, Zn, Cd and Hg compounds; no d
  admixture in the conduction band).
* Absolute gaps follow the term values used; with universal couplings they rank compounds
  by gap rather than predict it.
"""

from screening.tight_binding.brillouin import (
    FCC_RECIPROCAL_2PI_OVER_A,
    SPECIAL_POINTS_2PI_OVER_A,
    STANDARD_PATH,
    band_energies_symmetric,
    high_symmetry_path,
    irreducible_k,
)
from screening.tight_binding.gaps import (
    DIRECT_TOLERANCE_EV,
    BandGaps,
    GammaLevels,
    gamma_closed_form,
    gaps,
    parameters_from_elements,
)
from screening.tight_binding.hamiltonian import (
    DEFAULT_CHUNK,
    ETA_HARRISON_1981,
    N_BANDS,
    N_VALENCE_BANDS,
    Couplings,
    HarrisonEta,
    TightBindingParameters,
    band_energies,
    couplings,
    hamiltonian,
    phase_sums,
)
from screening.tight_binding.spin_orbit import (
    gamma_gap_with_spin_orbit_eV,
    valence_spin_orbit_eV,
    valence_top_p_weights,
)
from screening.tight_binding.sstar import (
    N_BANDS_SSTAR,
    SSTAR_SI_VHD,
    SSTAR_SI_VHD_NEIGHBOUR,
    SStarModel,
    band_energies_sstar,
    hamiltonian_sstar,
    sstar_levels_eV,
)
from screening.tight_binding.valleys import ValleyGaps, valleys, valleys_from_elements

__all__ = [
    "DEFAULT_CHUNK", "DIRECT_TOLERANCE_EV", "ETA_HARRISON_1981", "FCC_RECIPROCAL_2PI_OVER_A",
    "N_BANDS", "N_VALENCE_BANDS", "SPECIAL_POINTS_2PI_OVER_A", "STANDARD_PATH", "BandGaps",
    "Couplings", "GammaLevels", "HarrisonEta", "TightBindingParameters", "band_energies",
    "band_energies_symmetric", "couplings", "gamma_closed_form", "gaps", "hamiltonian",
    "high_symmetry_path", "irreducible_k", "parameters_from_elements", "phase_sums",
    "N_BANDS_SSTAR", "SSTAR_SI_VHD", "SSTAR_SI_VHD_NEIGHBOUR", "SStarModel", "ValleyGaps",
    "band_energies_sstar", "gamma_gap_with_spin_orbit_eV", "hamiltonian_sstar", "sstar_levels_eV",
    "valence_spin_orbit_eV", "valence_top_p_weights", "valleys", "valleys_from_elements",
]
