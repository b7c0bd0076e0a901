"""`bondgap shortlist ...`: keep, annotate, compare and export candidates without the browser.

The same store functions as the pages and the API (`app.shortlists`, `app.candidates`,
`app.compare`, `app.exports`, `app.imports`); lists are named by their name (ignoring case).
"""

from __future__ import annotations

import argparse
import json
import sys
from pathlib import Path
from typing import Any

from sqlalchemy.orm import Session

from app import shortlists as store
from app.candidates import load_shortlist
from app.cli import UsageError
from app.commands.common import open_sessions
from app.compare import compare_rows
from app.conditions import Conditions
from app.config import Settings, add_db_argument
from app.exports import (
    SIDECAR_SUFFIX,
    readme_path,
    shortlist_csv,
    shortlist_json,
    shortlist_readme,
    write_cells,
)
from app.imports import MAX_BYTES, check_size, import_measurements
from app.numbers import terminal


def _conditions_options(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("--on", metavar="SUBSTRATE", help="substrate (built-in or yours)")
    parser.add_argument("--temperature", metavar="K", help="temperature of the gaps, K")
    target = parser.add_mutually_exclusive_group()
    target.add_argument("--target-gap", metavar="EV", help="target band gap, eV")
    target.add_argument("--target-wavelength", metavar="NM", help="target wavelength, nm")


def register(sub: argparse._SubParsersAction) -> None:
    """Add the `shortlist` sub-command and its actions."""
    parser = sub.add_parser(
        "shortlist", help="keep, compare and export candidates for a design review",
        description="Shortlists of compounds and alloy compositions, stored in the database "
        "with a note per list and per candidate and the conditions they were chosen under.")
    actions = parser.add_subparsers(dest="action", metavar="ACTION", required=True)

    def action(name: str, help_text: str) -> argparse.ArgumentParser:
        p = actions.add_parser(name, help=help_text, description=help_text)
        add_db_argument(p)
        p.set_defaults(func=run)
        return p

    p = action("create", "create an empty list")
    p.add_argument("name")
    p.add_argument("--note", default="", help="why this list")
    _conditions_options(p)
    p = action("set", "change a list's note or conditions (options not given stay)")
    p.add_argument("name")
    p.add_argument("--note", help="replace the list's note")
    _conditions_options(p)
    p = action("rename", "rename a list")
    p.add_argument("old")
    p.add_argument("new")
    p = action("delete", "delete a list and its candidates")
    p.add_argument("name")
    p.add_argument("--yes", action="store_true", help="confirm the deletion (required)")
    p = action("add", "add candidates (binaries or alloy compositions)")
    p.add_argument("name")
    p.add_argument("formulas", nargs="+", metavar="FORMULA")
    p.add_argument("--note", default="", help="note on the added candidates")
    p = action("remove", "take a candidate off a list")
    p.add_argument("name")
    p.add_argument("formula")
    p = action("note", "replace the note on one candidate")
    p.add_argument("name")
    p.add_argument("formula")
    p.add_argument("text")
    p = action("list", "every list, or one list with its candidates")
    p.add_argument("name", nargs="?")
    p.add_argument("--json", action="store_true", help="print JSON (as the API)")
    p = action("compare", "compare 2 to 8 candidates of a list side by side")
    p.add_argument("name")
    p.add_argument("formulas", nargs="*", metavar="FORMULA", help="default: the whole list")
    p = action("export", "export a list as CSV or JSON, or its crystal cells")
    p.add_argument("name")
    out = p.add_mutually_exclusive_group(required=True)
    out.add_argument("--csv", nargs="?", const="-", metavar="FILE",
                     help="CSV (default stdout); with FILE, also FILE's README beside it "
                     f"(NAME{SIDECAR_SUFFIX}: conditions, units, sources)")
    out.add_argument("--json", nargs="?", const="-", metavar="FILE", help="JSON (default stdout)")
    out.add_argument("--cif", metavar="DIR", help="CIF (and POSCAR) files into a folder")
    p = action("import-measurements", "import your measured values from a CSV file")
    p.add_argument("file", help="CSV with columns formula,property,value,unit,source")


def _conditions(args: argparse.Namespace, session: Session, base: Conditions | None = None
                ) -> Conditions | None:
    given = {k: getattr(args, k) for k in ("on", "temperature", "target_gap",
                                           "target_wavelength")}
    if base is not None and all(v is None for v in given.values()):
        return None
    old = base or Conditions()
    targets = given["target_gap"] is not None or given["target_wavelength"] is not None
    return Conditions.parse(
        substrate=old.substrate if given["on"] is None else given["on"],
        temperature=old.temperature_K if given["temperature"] is None else given["temperature"],
        target_gap=given["target_gap"] if targets else old.target_gap_eV,
        target_wavelength=given["target_wavelength"] if targets else old.target_wavelength_nm,
        session=session)


def _write(destination: str, text: str, what: str = "") -> None:
    if destination == "-":
        sys.stdout.write(text)
        return
    try:
        Path(destination).write_text(text, encoding="utf-8", newline="")
    except OSError as exc:
        raise UsageError(f"cannot write {destination}: {exc.strerror or exc}") from exc
    print(f"wrote {destination}{what}")


def _read(path: str) -> bytes:
    try:
        size = Path(path).stat().st_size
        check_size(size)
        with open(path, "rb") as handle:
            data = handle.read(MAX_BYTES + 1)
    except OSError as exc:
        raise UsageError(f"cannot read {path}: {exc.strerror or exc}") from exc
    check_size(len(data))
    return data


def render_list(data: dict[str, Any]) -> str:
    """One list as text: name, conditions, note, then one line per candidate with its note."""
    c = data["conditions"]
    lines = [f"{data['name']}  (substrate {c['substrate'] or 'none'}, "
             f"{c['temperature_K']:g} K, {len(data['items'])} candidates)"]
    if data["note"]:
        lines += ["  " + line for line in data["note"].splitlines()]
    for item in data["items"]:
        note = item["note"].replace("\n", " / ")
        lines.append(f"  {item['position']:>3}. {item['formula']:<20} {note}".rstrip())
    return "\n".join(lines)


def render_compare(rows: list[Any], formulas: list[str]) -> str:
    """The comparison as an aligned text table; * marks the best cell of a row."""
    head = ["property", *formulas, "best"]
    body = [[f"{r.label}" + (f" ({r.unit})" if r.unit else ""),
             *[terminal(c.text) + (" *" if i in r.best else "") for i, c in enumerate(r.cells)],
             r.rule]
            for r in rows]
    widths = [max(len(x[i]) for x in [head, *body]) for i in range(len(head))]
    return "\n".join("  ".join(v.ljust(w) for v, w in zip(line, widths, strict=True)).rstrip()
                     for line in [head, *body])


def _dispatch(args: argparse.Namespace, session: Session) -> str | None:  # noqa: C901
    act = args.action
    if act == "create":
        made = store.create_shortlist(session, name=args.name, note=args.note,
                                      conditions=_conditions(args, session))
        return f"created shortlist {made.name!r}"
    if act == "list":
        if args.name:
            data = store.shortlist_dict(session, store.get_shortlist(session, name=args.name))
            return json.dumps(data, indent=2, ensure_ascii=False) if args.json else render_list(
                data)
        lists = store.all_shortlists(session)
        if args.json:
            return json.dumps({"shortlists": lists}, indent=2, ensure_ascii=False)
        return "\n".join(f"{s['name']}  ({s['count']} candidates)" for s in lists) or (
            "no shortlists yet: bondgap shortlist create NAME")
    if act == "import-measurements":
        done = import_measurements(session, _read(args.file))
        return (f"imported {done['imported']} value(s) (replaced {done['replaced']}) as "
                f"batch {done['batch']}")
    shortlist = store.get_shortlist(session, name=args.old if act == "rename" else args.name)
    if act == "set":
        store.update_shortlist(session, shortlist_id=shortlist.id, note=args.note,
                               conditions=_conditions(args, session,
                                                      store.conditions_of(shortlist)))
        return f"saved {shortlist.name!r}"
    if act == "rename":
        store.update_shortlist(session, shortlist_id=shortlist.id, name=args.new)
        return f"renamed {args.old!r} to {args.new.strip()!r}"
    if act == "delete":
        if not args.yes:
            raise UsageError(f"deleting {shortlist.name!r} needs --yes")
        return f"deleted {store.delete_shortlist(session, shortlist_id=shortlist.id)!r}"
    if act == "add":
        done = store.add_items(session, shortlist_id=shortlist.id, formulas=args.formulas,
                               note=args.note)
        present = f"; already on it: {', '.join(done['present'])}" if done["present"] else ""
        return f"added {', '.join(done['added']) or 'nothing'}{present}"
    if act == "remove":
        store.remove_item(session, shortlist_id=shortlist.id, formula=args.formula)
        return f"removed {args.formula} from {shortlist.name!r}"
    if act == "note":
        store.set_item_note(session, shortlist_id=shortlist.id, formula=args.formula,
                            note=args.text)
        return f"saved the note on {args.formula}"
    view = load_shortlist(session, shortlist_id=shortlist.id,
                          formulas=getattr(args, "formulas", None) or None)
    if act == "compare":
        text = render_compare(compare_rows(view.candidates, view.conditions), view.formulas)
        return f"{view.data['name']}: {view.conditions.text()}\n{text}"
    if args.cif:
        try:
            paths = write_cells(view.candidates, Path(args.cif))
        except OSError as exc:
            raise UsageError(f"cannot write into {args.cif}: {exc.strerror or exc}") from exc
        return "\n".join(f"wrote {p}" for p in paths)
    if args.csv:
        _write(args.csv, shortlist_csv(view.candidates))
        if args.csv != "-":
            name = Path(args.csv).name
            _write(str(readme_path(Path(args.csv))),
                   shortlist_readme(view.data, view.conditions, name),
                   f" (its README: conditions, units, sources and columns of {name})")
    else:
        _write(args.json, shortlist_json(view.data, view.candidates, view.conditions))
    return None


def run(args: argparse.Namespace) -> int:
    """Carry out one shortlist action; print what was done (or the listing, or the export)."""
    sessions = open_sessions(Settings.from_args(args))
    with sessions() as session:
        text = _dispatch(args, session)
    if text:
        print(text)
    return 0
