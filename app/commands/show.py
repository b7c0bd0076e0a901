"""`bondgap show FORMULA`: every number about one compound, with unit, route and source."""

from __future__ import annotations

import argparse
import json
from typing import Any

from app import queries, views
from app.commands.common import open_sessions
from app.config import Settings, add_db_argument


def register(sub: argparse._SubParsersAction) -> None:
    """Add the `show` sub-command."""
    parser = sub.add_parser(
        "show",
        help="everything about one compound",
        description="Print every number about one octet binary compound with its unit, route "
        "and source. --json prints the object of GET /api/compounds/FORMULA.",
    )
    parser.add_argument("formula", help="formula such as GaAs, ZnSe, Si (any order: AsGa)")
    parser.add_argument("--json", action="store_true", help="print the report as JSON")
    add_db_argument(parser)
    parser.set_defaults(func=run)


def render_text(report: dict[str, Any]) -> str:
    """The report as aligned plain text, section by section."""
    lines = [
        f"{report['formula']}  ({report['family']}; cation {report['cation']}, "
        f"anion {report['anion']}; engine model {report.get('model_version')})"
    ]
    for section in views.report_sections(report):
        lines += ["", section.title]
        width = max(len(line.label) for line in section.lines)
        for line in section.lines:
            value = f"{line.text} {line.unit}".rstrip()
            source = f"; {line.source}" if line.source else ""
            lines.append(f"  {line.label:<{width}}  {value:<14}  [{line.route}{source}]")
    caution = views.caution_line(report.get("hazards", {}).get("elements") or ())
    if caution:
        lines += ["", f"Caution: {caution}."]
    return "\n".join(lines)


def run(args: argparse.Namespace) -> int:
    """Print one compound's report (text or JSON)."""
    sessions = open_sessions(Settings.from_args(args))
    with sessions() as session:
        report = queries.compound_report(session, formula=args.formula)
    print(json.dumps(report, indent=2, ensure_ascii=False) if args.json else render_text(report))
    return 0
