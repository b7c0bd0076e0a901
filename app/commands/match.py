"""`bondgap match SYSTEM --on SUBSTRATE`: alloy compositions that meet a target on a substrate."""

from __future__ import annotations

import argparse
import json
import sys
from typing import Any

from app.commands.common import open_sessions
from app.config import Settings, add_db_argument
from app.finder import DEFAULT_LIMIT, DEFAULT_TOLERANCE_EV, SORT_KEYS, MatchQuery, run_match
from app.finder_payload import match_payload
from app.numbers import fixed, round_estimate, thickness_text
from app.views import caution_line
from screening.epitaxy import GEOMETRIES
from screening.hazards import ROHS_ANNEX_II


def register(sub: argparse._SubParsersAction) -> None:
    """Add the `match` sub-command."""
    parser = sub.add_parser(
        "match",
        help="alloy compositions that meet a target on a substrate",
        description="Find the compositions of an alloy system (a formula without numbers such "
        "as InGaAs or InGaAsP, or all) that meet a band-gap or wavelength target on a "
        "substrate (built-in or one of yours), best first. Mismatch f = (a_layer - a_sub) / "
        "a_sub as a fraction (f > 0: the layer is compressed). --json prints the object of "
        "GET /api/match.",
    )
    parser.add_argument("system", help="alloy system without numbers (InGaAs, InGaAsP) or all")
    parser.add_argument("--on", required=True, metavar="SUBSTRATE",
                        help="substrate: a built-in name (InP, GaAs, ...) or one of yours")
    target = parser.add_mutually_exclusive_group()
    target.add_argument("--gap", metavar="EV", help="target band gap, eV")
    target.add_argument("--wavelength", metavar="NM", help="target photon wavelength, nm")
    parser.add_argument("--tolerance", metavar="EV",
                        help=f"gap tolerance, eV (default {DEFAULT_TOLERANCE_EV})")
    parser.add_argument("--temperature", metavar="K",
                        help="temperature of the gaps, 0 to 2000 K (default 300)")
    parser.add_argument("--max-mismatch", metavar="F",
                        help="largest |mismatch| as a fraction (0.001 = 0.1 %%)")
    parser.add_argument("--thickness", metavar="NM",
                        help="layer thickness that must stay below the critical thickness, nm")
    parser.add_argument("--geometry", default="single-uncapped",
                        help=f"Matthews-Blakeslee geometry: {', '.join(GEOMETRIES)} "
                        "(default single-uncapped)")
    parser.add_argument("--exclude", metavar="ELEMENTS", action="append",
                        help="elements no match may contain, e.g. Cd,Hg (repeatable)")
    parser.add_argument("--no-rohs", action="store_true",
                        help="exclude compositions with an element restricted by RoHS "
                        f"({ROHS_ANNEX_II})")
    parser.add_argument("--sort", default="rank", help=f"order: {', '.join(SORT_KEYS)}")
    parser.add_argument("--desc", action="store_true", help="descending order")
    parser.add_argument("--limit", metavar="N", default=str(DEFAULT_LIMIT),
                        help=f"most matches printed (default {DEFAULT_LIMIT})")
    parser.add_argument("--json", action="store_true", help="print JSON (as the API)")
    add_db_argument(parser)
    parser.set_defaults(func=run)


def render_text(payload: dict[str, Any]) -> str:
    """The matches as an aligned text table, with the conditions and conventions."""
    lines = [f"# {payload['conditions']}",
             f"# mismatch: {payload['mismatch_convention']}",
             f"# critical thickness: Matthews-Blakeslee, {payload['geometry']['name']} "
             f"({payload['geometry']['description']})"]
    if not payload["matches"]:
        return "\n".join([*lines, payload["message"] + "."])
    header = ("formula", "a (A)", "mismatch", "gap (eV)", "+/- (eV)", "wl (nm)", "h_c (nm)")
    rows = []
    for m in payload["matches"]:
        h_c, matched = m["critical_thickness_nm"], m["lattice_matched"]
        gap = m["band_gap_eV"]
        places = 3 if gap is None else round_estimate(gap, m["band_gap_uncertainty_eV"])[2]
        rows.append((
            m["formula"], f"{m['lattice_constant_angstrom']:.4f}",
            f"{m['mismatch']:+.2e}" if m["mismatch"] else "0",
            "-" if gap is None else fixed(gap, places),
            "-" if m["band_gap_uncertainty_eV"] is None else fixed(
                m["band_gap_uncertainty_eV"], places),
            "-" if m["wavelength_nm"] is None else f"{m['wavelength_nm']:.0f}",
            "n/a" if h_c is None and not matched else thickness_text(h_c, matched=matched),
        ))
    widths = [max(len(h), *(len(r[i]) for r in rows)) for i, h in enumerate(header)]
    lines.append("  ".join(h.ljust(w) for h, w in zip(header, widths, strict=True)).rstrip())
    lines += ["  ".join(v.ljust(w) for v, w in zip(r, widths, strict=True)).rstrip()
              for r in rows]
    more = payload["count"] - payload["shown"]
    lines.append(f"{payload['count']} compositions" + (f"; {more} more not shown (--limit)"
                                                       if more else ""))
    caution = caution_line({e for m in payload["matches"] for e in m["fractions"]})
    if caution:
        lines.append(f"Caution: {caution}.")
    return "\n".join(lines)


def run(args: argparse.Namespace) -> int:
    """Print the matches (text or JSON)."""
    query = MatchQuery.parse(
        system=args.system, on=args.on, gap=args.gap, wavelength=args.wavelength,
        tolerance=args.tolerance, temperature=args.temperature,
        max_mismatch=args.max_mismatch, thickness=args.thickness, geometry=args.geometry,
        exclude=args.exclude, no_rohs=args.no_rohs, sort=args.sort, desc=args.desc,
        limit=args.limit,
    )
    sessions = open_sessions(Settings.from_args(args))
    with sessions() as session:
        payload = match_payload(run_match(session, query))
    text = (json.dumps(payload, indent=2, ensure_ascii=False) if args.json
            else render_text(payload))
    sys.stdout.write(text + "\n")
    return 0
