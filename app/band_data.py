"""Band structure of one compound as the API, the CLI and the compound page show it.

`bands_payload` is the one object (`GET /api/compounds/{formula}/bands`, `bondgap bands --json`);
`bands_csv` and `bands_text` render it. Energies are in eV relative to the valence-band top;
k-points and path distances in units of 2π/a.
"""

from __future__ import annotations

import csv
import io
from typing import Any

import numpy as np

from app.params import DEFAULT_POINTS
from screening.bands import MODEL_LIMITS, band_structure
from screening.tight_binding import N_VALENCE_BANDS

MODEL = "sp3 nearest-neighbour tight-binding model (Harrison 1981 universal parameters)"
ENERGY_UNIT = "eV relative to the valence-band top"
K_UNIT = "2π/a"
N_BANDS = 2 * N_VALENCE_BANDS
CSV_COLUMNS: tuple[str, ...] = (
    "distance", "kx", "ky", "kz", "label", *(f"band{i}" for i in range(1, N_BANDS + 1)),
)


def bands_payload(formula: str, points: int = DEFAULT_POINTS) -> dict[str, Any]:
    """The band structure of one compound along L-Γ-X-W-K-Γ, energies relative to the VBM.

    Args:
        formula: Any accepted spelling of an octet binary.
        points: Number of k-points on the path (6 to 2000).

    Returns:
        A JSON-ready dict: `labels` (corner label and distance), per point `distance`, `k`,
        `label` ("" between corners) and `bands_eV` (8 values), the smallest gap on the path,
        where the band edges lie, units and the model's limits.

    Raises:
        BondgapInputError: Bad formula or number of points (the engine's message).
    """
    bs = band_structure(formula, n_points=points)
    energies = bs.energies_eV - bs.valence_top_eV
    point_labels = [""] * len(bs.distance)
    for name, distance in bs.labels:
        point_labels[int(np.argmin(np.abs(bs.distance - distance)))] = name
    top = int(np.argmax(energies[:, N_VALENCE_BANDS - 1]))
    bottom = int(np.argmin(energies[:, N_VALENCE_BANDS]))
    direct = bool(np.allclose(bs.k_2pi_over_a[top], bs.k_2pi_over_a[bottom]))
    return {
        "formula": bs.formula,
        "model": MODEL,
        "model_limits": MODEL_LIMITS,
        "path": "-".join(name for name, _ in bs.labels),
        "units": {"energy": ENERGY_UNIT, "k": K_UNIT, "distance": K_UNIT},
        "points": len(bs.distance),
        "bond_length_angstrom": round(bs.bond_length_angstrom, 6),
        "valence_top_absolute_eV": round(bs.valence_top_eV, 6),
        "gap_eV": round(bs.gap_eV, 6),
        "direct": direct,
        "valence_top": {"distance": round(float(bs.distance[top]), 6),
                        "label": point_labels[top] or None, "energy_eV": 0.0},
        "conduction_bottom": {"distance": round(float(bs.distance[bottom]), 6),
                              "label": point_labels[bottom] or None,
                              "energy_eV": round(float(energies[bottom, N_VALENCE_BANDS]), 6)},
        "labels": [{"label": name, "distance": round(d, 6)} for name, d in bs.labels],
        "distance": np.round(bs.distance, 6).tolist(),
        "k": (np.round(bs.k_2pi_over_a, 6) + 0.0).tolist(),  # + 0.0: no "-0.0"
        "label": point_labels,
        "bands_eV": (np.round(energies, 5) + 0.0).tolist(),
        "valleys": _valleys(energies, point_labels),
    }


VALLEYS: tuple[str, ...] = ("Γ", "X", "L")
"""The conduction-band valleys a band-gap discussion names."""


def _valleys(energies: np.ndarray, point_labels: list[str]) -> list[dict[str, Any]]:
    """Each valley: the conduction band there above the VBM, and the direct gap there.

    `energies` are relative to the valence-band maximum over the path, so the lowest conduction
    level at a point is that valley's height above the VBM; the direct (vertical) gap subtracts
    the highest valence level at the same point.
    """
    found = []
    for name in VALLEYS:
        if name not in point_labels:
            continue
        i = point_labels.index(name)
        conduction = float(energies[i, N_VALENCE_BANDS])
        found.append({"label": name, "above_vbm_eV": round(conduction, 6),
                      "direct_gap_eV": round(conduction - float(energies[i, N_VALENCE_BANDS - 1]),
                                             6)})
    return found


def header_lines(payload: dict[str, Any]) -> list[str]:
    """Comment lines (starting with "# ") that say what the numbers are and in which units."""
    top, bottom = payload["valence_top"], payload["conduction_bottom"]
    where = f"valence top at {top['label'] or 'd=' + str(top['distance'])}, conduction bottom "
    where += f"at {bottom['label'] or 'd=' + str(bottom['distance'])}"
    return [
        f"# {payload['formula']}: bands of the {payload['model']}, path {payload['path']}, "
        f"{payload['points']} k-points",
        f"# band1..band{N_BANDS}: energies in {ENERGY_UNIT} (0 eV = "
        f"{payload['valence_top_absolute_eV']:.4f} eV on the model's free-atom scale)",
        f"# distance, kx, ky, kz: units of {K_UNIT} (bond length used "
        f"{payload['bond_length_angstrom']:.4f} Å); label: high-symmetry point",
        f"# smallest gap on the path {payload['gap_eV']:.3f} eV, "
        f"{'direct' if payload['direct'] else 'indirect'} ({where})",
        f"# model limits: {payload['model_limits']}",
    ]


def _rows(payload: dict[str, Any]) -> list[list[Any]]:
    return [
        [d, *k, label, *bands]
        for d, k, label, bands in zip(payload["distance"], payload["k"], payload["label"],
                                      payload["bands_eV"], strict=True)
    ]


def bands_csv(payload: dict[str, Any]) -> str:
    """The bands as CSV: the header lines, a header row, one row per k-point."""
    out = io.StringIO()
    out.write("\n".join(header_lines(payload)) + "\n")
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow(CSV_COLUMNS)
    writer.writerows(_rows(payload))
    return out.getvalue()


def bands_text(payload: dict[str, Any]) -> str:
    """The bands as an aligned text table under the same header lines."""
    head = [f"{'distance':>9}", *(f"{c:>8}" for c in ("kx", "ky", "kz")), f"{'label':<5}",
            *(f"{f'band{i}':>9}" for i in range(1, N_BANDS + 1))]
    lines = [*header_lines(payload), "  ".join(head)]
    for d, kx, ky, kz, label, *bands in _rows(payload):
        cells = [f"{d:9.5f}", f"{kx:8.5f}", f"{ky:8.5f}", f"{kz:8.5f}", f"{label:<5}",
                 *(f"{e:9.4f}" for e in bands)]
        lines.append("  ".join(cells))
    return "\n".join(lines) + "\n"
