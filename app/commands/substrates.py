"""`bondgap substrates [list|add|delete]`: the built-in substrates and the user's own."""

from __future__ import annotations

import argparse
import json
import sys
from typing import Any

from app.commands.common import open_sessions
from app.config import Settings, add_db_argument
from app.substrates import STRUCTURE_CHOICES, add_substrate, delete_substrate, substrate_rows
from screening.epitaxy import MISMATCH_CONVENTION


def register(sub: argparse._SubParsersAction) -> None:
    """Add the `substrates` sub-command and its actions."""
    parser = sub.add_parser(
        "substrates",
        help="list, add or delete substrates",
        description="List the built-in substrates (with sources) and yours, add one of your "
        "own (kept in the database) or delete one. Built-in names cannot be used. Options "
        "such as --db go after the action: bondgap substrates list --db PATH.",
    )
    actions = parser.add_subparsers(dest="action", metavar="ACTION")
    listing = actions.add_parser("list", help="list every substrate (the default)")
    listing.add_argument("--json", action="store_true", help="print JSON (as the API)")
    add_db_argument(listing)
    add = actions.add_parser("add", help="add a substrate of your own")
    add.add_argument("name", help="1 to 40 letters, digits, space and . _ ( ) + -")
    add.add_argument("--structure", required=True, help=f"one of {', '.join(STRUCTURE_CHOICES)}")
    add.add_argument("--a", required=True, metavar="ANGSTROM",
                     help="cubic a, or hexagonal in-plane a (2 to 10)")
    add.add_argument("--c", metavar="ANGSTROM", help="hexagonal c (hexagonal substrates only)")
    add.add_argument("--note", default="", help="one line, at most 200 characters")
    add_db_argument(add)
    remove = actions.add_parser("delete", help="delete a substrate of your own")
    remove.add_argument("name")
    add_db_argument(remove)
    parser.set_defaults(func=run, action=None)


def render_text(rows: list[dict[str, Any]]) -> str:
    """Substrates as an aligned text table."""
    header = ("name", "structure", "a (A)", "c (A)", "matched a (A)", "source")
    body = [(r["name"], r["structure"], f"{r['a_angstrom']:.5g}",
             "-" if r["c_angstrom"] is None else f"{r['c_angstrom']:.5g}",
             f"{r['matched_a_angstrom']:.4f}", r["source"] if r["built_in"] else "yours")
            for r in rows]
    widths = [max(len(h), *(len(b[i]) for b in body)) for i, h in enumerate(header)]
    lines = ["  ".join(h.ljust(w) for h, w in zip(header, widths, strict=True)).rstrip()]
    lines += ["  ".join(v.ljust(w) for v, w in zip(b, widths, strict=True)).rstrip()
              for b in body]
    return "\n".join(lines)


def run(args: argparse.Namespace) -> int:
    """List, add or delete."""
    sessions = open_sessions(Settings.from_args(args))
    with sessions() as session:
        if args.action == "add":
            row = add_substrate(session, name=args.name, structure=args.structure,
                                a_angstrom=args.a, c_angstrom=args.c, note=args.note)
            print(f"added substrate {row['name']} ({row['structure']}, a = "
                  f"{row['a_angstrom']:g} A)")
            return 0
        if args.action == "delete":
            print(f"deleted substrate {delete_substrate(session, args.name)}")
            return 0
        rows = substrate_rows(session)
    if getattr(args, "json", False):
        payload = {"substrates": rows, "mismatch_convention": MISMATCH_CONVENTION}
        text = json.dumps(payload, indent=2, ensure_ascii=False)
    else:
        text = render_text(rows)
    sys.stdout.write(text + "\n")
    return 0
