"""`bondgap list`: the compound table, filtered and sorted, as text, JSON or CSV."""

from __future__ import annotations

import argparse
import json
import sys
from typing import Any

from app import queries, views
from app.columns import COLUMNS_BY_KEY
from app.commands.common import open_sessions
from app.config import Settings, add_db_argument
from app.numbers import terminal
from screening.hazards import ROHS_ANNEX_II, ROHS_SOURCE

TEXT_COLUMNS: tuple[str, ...] = (
    "formula", "family", "structure_observed", "band_gap_eV", "band_gap_estimate_eV",
    "wavelength_nm", "band_gap_kind", "lattice_constant_angstrom",
    "ionicity_spectroscopic", "ionicity_predictive", "polarity", "coordination_predicted",
)
"""Columns of the plain-text table (--json and --csv give all of them)."""


def register(sub: argparse._SubParsersAction) -> None:
    """Add the `list` sub-command."""
    parser = sub.add_parser(
        "list",
        help="the compound table, filtered and sorted",
        description="List compounds. Filters combine; band gaps are those at --temperature "
        "(default 300 K), and the gap and wavelength windows apply to the gap shown: measured "
        "where known, else the estimate. --json prints the object of GET /api/compounds, "
        "--csv its rows.",
    )
    parser.add_argument("--family", help=f"one of {', '.join(queries.FAMILY_CHOICES)}")
    parser.add_argument("--structure", help=f"one of {', '.join(queries.STRUCTURE_CHOICES)}")
    parser.add_argument("--temperature", metavar="K",
                        help="temperature of the band gaps, 0 to 2000 K (default 300)")
    parser.add_argument("--gap-min", metavar="EV", help="lowest band gap, eV")
    parser.add_argument("--gap-max", metavar="EV", help="highest band gap, eV")
    parser.add_argument("--wl-min", metavar="NM", help="shortest photon wavelength of the gap, nm")
    parser.add_argument("--wl-max", metavar="NM", help="longest photon wavelength of the gap, nm")
    parser.add_argument("--kind", help=f"gap kind: {', '.join(queries.KIND_CHOICES)} (measured, "
                        "else from the sp3 model)")
    parser.add_argument("--measured-only", action="store_true",
                        help="only compounds with a measured band gap")
    parser.add_argument("--exclude", metavar="ELEMENTS",
                        help="leave out compounds containing these elements, e.g. As,Cd")
    parser.add_argument("--no-rohs", action="store_true",
                        help="leave out compounds with an element restricted by RoHS "
                        f"({ROHS_ANNEX_II})")
    parser.add_argument("--sort", metavar="COLUMN", default="formula",
                        help=f"column to sort by: {', '.join(COLUMNS_BY_KEY)}")
    parser.add_argument("--desc", action="store_true", help="sort in descending order")
    output = parser.add_mutually_exclusive_group()
    output.add_argument("--json", action="store_true", help="print JSON (as the API)")
    output.add_argument("--csv", action="store_true", help="print CSV")
    add_db_argument(parser)
    parser.set_defaults(func=run)


def render_text(rows: list[dict[str, Any]]) -> str:
    """Rows as an aligned text table with a header line."""
    columns = [COLUMNS_BY_KEY[k] for k in TEXT_COLUMNS]
    header = [c.label + (f" ({c.unit})" if c.unit else "") for c in columns]
    body = [[terminal(" ".join(p for p in c.cell(row) if p)) for c in columns] for row in rows]
    widths = [max(len(h), *(len(r[i]) for r in body)) for i, h in enumerate(header)]
    lines = ["  ".join(h.ljust(w) for h, w in zip(header, widths, strict=True)).rstrip()]
    lines += ["  ".join(v.ljust(w) for v, w in zip(r, widths, strict=True)).rstrip() for r in body]
    lines.append(f"{len(rows)} compounds; marks: m measured, est. estimate ± leave-one-out "
                 "error of the family, model from the sp3 model")
    caution = views.caution_line(e for row in rows for e in row["hazard_elements"])
    rohs = sorted({e for row in rows for e in row["rohs_restricted"]})
    if caution:
        rohs_text = f" RoHS: {', '.join(rohs)} restricted by {ROHS_SOURCE}." if rohs else ""
        lines.append(f"Caution: {caution}.{rohs_text}")
    return "\n".join(lines)


def run(args: argparse.Namespace) -> int:
    """Print the filtered, sorted table."""
    query = queries.TableQuery.parse(
        family=args.family,
        structure=args.structure,
        gap_min=args.gap_min,
        gap_max=args.gap_max,
        measured_only=args.measured_only,
        sort=args.sort,
        desc=args.desc,
        temperature=args.temperature,
        wl_min=args.wl_min,
        wl_max=args.wl_max,
        kind=args.kind,
        exclude=args.exclude,
        no_rohs=args.no_rohs,
    )
    sessions = open_sessions(Settings.from_args(args))
    with sessions() as session:
        if args.json:
            text = json.dumps(queries.table_payload(session, query=query), indent=2,
                              ensure_ascii=False)
        elif args.csv:
            text = queries.rows_csv(queries.table_rows(session, query=query)).rstrip("\n")
        else:
            text = render_text(queries.table_rows(session, query=query))
    sys.stdout.write(text + "\n")
    return 0
