"""`bondgap show FORMULA`: every number about one compound, with unit, route and source."""

from __future__ import annotations

import argparse
import json
from typing import Any

from app import alloy_views, gap_views, queries, views
from app.commands.common import open_sessions
from app.config import Settings, add_db_argument
from app.numbers import terminal
from app.params import parse_temperature


def register(sub: argparse._SubParsersAction) -> None:
    """Add the `show` sub-command."""
    parser = sub.add_parser(
        "show",
        help="everything about one compound or alloy",
        description="Print every number about one octet binary compound or alloy (e.g. "
        "In0.53Ga0.47As) with its unit, route and source; band gaps at --temperature (default "
        "300 K); --on SUBSTRATE adds mismatch, strain and critical thickness. --json prints "
        "the object of GET /api/compounds/FORMULA?temperature=K&on=SUBSTRATE.",
    )
    parser.add_argument("formula", help="formula such as GaAs, ZnSe, Si (any order: AsGa), or "
                        "an alloy such as In0.53Ga0.47As")
    parser.add_argument("--json", action="store_true", help="print the report as JSON")
    parser.add_argument("--on", metavar="SUBSTRATE",
                        help="a substrate (built-in or yours): mismatch, strain, h_c")
    parser.add_argument("--geometry", default="single-uncapped",
                        help="Matthews-Blakeslee geometry of the critical thickness")
    parser.add_argument("--temperature", metavar="K",
                        help="temperature of the band gaps, 0 to 2000 K (default 300)")
    add_db_argument(parser)
    parser.set_defaults(func=run)


def render_text(report: dict[str, Any]) -> str:
    """The report as aligned plain text, section by section."""
    lines = [
        f"{report['formula']}  ({report['family']}; cation {report['cation']}, "
        f"anion {report['anion']}; engine model {report.get('model_version')})"
    ]
    if report.get("alloy"):
        sections = [alloy_views.gap_section(report), alloy_views.composition_section(report),
                    alloy_views.lattice_section(report), *alloy_views.vca_sections(report)]
    else:
        sections = [
            gap_views.band_gap_section(report),
            *views.report_sections(report),
            gap_views.tight_binding_section(report),
        ]
    if report.get("epitaxy"):
        sections.insert(1, alloy_views.epitaxy_section(report["epitaxy"]))
    for section in sections:
        lines += ["", section.title]
        width = max(len(line.label) for line in section.lines)
        for line in section.lines:
            value = terminal(f"{line.text} {line.unit}".rstrip())
            if line.wavelength_text:
                value += f" ({line.wavelength_text})"
            source = f"; {line.source}" if line.source else ""
            lines.append(f"  {line.label:<{width}}  {value:<14}  [{line.route}{source}]")
    caution = views.caution_line(report.get("hazards", {}).get("caution_elements") or ())
    if caution:
        lines += ["", f"Caution: {caution}."]
    return "\n".join(lines)


def run(args: argparse.Namespace) -> int:
    """Print one compound's report (text or JSON)."""
    temperature = parse_temperature(args.temperature)
    sessions = open_sessions(Settings.from_args(args))
    with sessions() as session:
        report = queries.compound_report(session, formula=args.formula,
                                         temperature_K=temperature, on=args.on,
                                         geometry=args.geometry)
    print(json.dumps(report, indent=2, ensure_ascii=False) if args.json else render_text(report))
    return 0
