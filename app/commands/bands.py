"""`bondgap bands FORMULA`: bands of the sp3 tight-binding model along L-Γ-X-W-K-Γ."""

from __future__ import annotations

import argparse
import json
import sys

from app.band_data import bands_csv, bands_payload, bands_text
from app.params import DEFAULT_POINTS, parse_points


def register(sub: argparse._SubParsersAction) -> None:
    """Add the `bands` sub-command."""
    parser = sub.add_parser(
        "bands",
        help="band structure of one compound (sp3 tight binding)",
        description="Print the bands of the sp3 tight-binding model along L-Γ-X-W-K-Γ: one "
        "row per k-point with the path distance, kx, ky, kz (units of 2π/a), the high-symmetry "
        "label and band1..band8 in eV relative to the valence-band top. Header lines starting "
        "with # give units, the smallest gap and the model's limits. --json prints the object "
        "of GET /api/compounds/FORMULA/bands.",
    )
    parser.add_argument("formula", help="formula such as GaAs, ZnSe, Si (any order: AsGa)")
    parser.add_argument("--points", metavar="N", default=str(DEFAULT_POINTS),
                        help="number of k-points on the path, 6 to 2000 "
                        f"(default {DEFAULT_POINTS})")
    output = parser.add_mutually_exclusive_group()
    output.add_argument("--csv", action="store_true", help="print CSV (header lines start with #)")
    output.add_argument("--json", action="store_true", help="print JSON (as the API)")
    parser.set_defaults(func=run)


def run(args: argparse.Namespace) -> int:
    """Print the band structure as a text table, CSV or JSON."""
    payload = bands_payload(args.formula, points=parse_points(args.points))
    if args.json:
        text = json.dumps(payload, indent=2, ensure_ascii=False) + "\n"
    elif args.csv:
        text = bands_csv(payload)
    else:
        text = bands_text(payload)
    sys.stdout.write(text)
    return 0
