"""`bondgap levels SYMBOL [SYMBOL ...]`: LDA orbital energies (term values) of free atoms.

Each level is given non-relativistically (``energy_eV``) and scalar-relativistically
(``scalar_relativistic_energy_eV``, scaled ZORA), with the spin-orbit splitting of the valence p
level (``spin_orbit_splitting_eV``).
"""

from __future__ import annotations

import argparse
import json
from typing import Any

import numpy as np

from screening.atoms import AtomLevels, atom_levels, spin_orbit_splitting_eV, valence_s_p


def register(sub: argparse._SubParsersAction) -> None:
    """Add the `levels` sub-command."""
    parser = sub.add_parser(
        "levels",
        help="LDA orbital energies (term values) of free atoms",
        description="Print each element's ground-state configuration and its valence s and p "
        "LDA orbital energies in eV (occupied or not), non-relativistic and scalar-relativistic "
        "(SR, scaled ZORA), and the spin-orbit splitting E(p3/2) - E(p1/2) of the valence p, "
        "from the committed tables of the all-electron atom solver (H to Rn). --all adds the "
        "core and d/f levels.",
    )
    parser.add_argument("symbols", nargs="+", metavar="SYMBOL", help="element symbol, e.g. Zn")
    parser.add_argument("--json", action="store_true", help="print a JSON list")
    parser.add_argument(
        "--all", action="store_true", help="list every occupied level, core included"
    )
    parser.set_defaults(func=run)


def _shown_levels(atom: AtomLevels, show_all: bool) -> list[dict[str, Any]]:
    """The levels to print: all of them, or the valence s and p (with their SR energies)."""
    if show_all:
        chosen = list(atom.levels)
    else:
        chosen = [atom.level(shell.label) for shell in valence_s_p(atom.Z)]
    relativistic = atom_levels(atom.element, relativistic=True)
    return [
        {
            "orbital": lv.orbital,
            "occupation": lv.occupation,
            "energy_eV": lv.energy_eV,
            "scalar_relativistic_energy_eV": relativistic.level(lv.orbital).energy_eV,
        }
        for lv in chosen
    ]


def _spin_orbit(atom: AtomLevels) -> float:
    """Spin-orbit splitting of the valence p level in eV (from the relativistic table)."""
    return float(spin_orbit_splitting_eV(atom.element)[0])


def _lowest_d(atom: AtomLevels) -> dict[str, Any] | None:
    """The lowest d level (occupied shell or the lowest empty one), NR and SR; None if unbound."""
    nr, sr = atom.lowest_d, atom_levels(atom.element, relativistic=True).lowest_d
    if nr is None or sr is None or not np.isfinite(nr.energy_eV):
        return None
    return {"orbital": nr.orbital, "occupation": nr.occupation, "energy_eV": nr.energy_eV,
            "scalar_relativistic_energy_eV": sr.energy_eV}


def render_text(atoms: list[AtomLevels], show_all: bool) -> str:
    """Plain-text listing: one header line per element, one line per level."""
    lines: list[str] = []
    for atom in atoms:
        lines.append(f"{atom.element} (Z = {atom.Z})  {atom.configuration}")
        valence_p = valence_s_p(atom.Z)[1].label
        for level in _shown_levels(atom, show_all):
            note = ""
            if not level["occupation"]:
                note = "  (unoccupied)" if level["energy_eV"] < 0 else "  (unoccupied, not bound)"
            if level["orbital"] == valence_p and level["energy_eV"] < 0:
                note += f"  spin-orbit {_spin_orbit(atom):.4f} eV"
            lines.append(
                f"  {level['orbital']:<3} occupation {level['occupation']:>4g}"
                f"  {level['energy_eV']:>12.4f} eV"
                f"  SR {level['scalar_relativistic_energy_eV']:>12.4f} eV{note}"
            )
        d = _lowest_d(atom)
        if d is not None and not d["occupation"]:
            lines.append(
                f"  {d['orbital']:<3} occupation    0  {d['energy_eV']:>12.4f} eV"
                f"  SR {d['scalar_relativistic_energy_eV']:>12.4f} eV  (lowest empty d)"
            )
    return "\n".join(lines)


def run(args: argparse.Namespace) -> int:
    """Print the levels of every requested element (text or JSON)."""
    atoms = [atom_levels(symbol) for symbol in args.symbols]  # all validated before printing
    if args.json:
        payload = [
            {
                "element": atom.element,
                "configuration": atom.configuration,
                "levels": _shown_levels(atom, args.all),
                "spin_orbit_splitting_eV": _spin_orbit(atom),
                "lowest_d": _lowest_d(atom),
            }
            for atom in atoms
        ]
        print(json.dumps(payload, indent=2))
    else:
        print(render_text(atoms, args.all))
    return 0
