"""The `bondgap` command line: one sub-command per module in `app.commands`.

Bad input exits with code 2 and a one-line message on stderr, never a traceback.
"""

from __future__ import annotations

import argparse
import importlib
import sys
from collections.abc import Sequence

from screening.errors import BondgapInputError

COMMAND_MODULES: tuple[str, ...] = (
    "levels", "serve", "show", "list", "bands", "match", "substrates", "shortlist",
)
"""Modules of `app.commands`, each with `register(subparsers)` that sets `func` on its parser."""


class UsageError(Exception):
    """Bad input found by the CLI layer itself (not by the engine)."""


def build_parser() -> argparse.ArgumentParser:
    """Build the argument parser with every registered sub-command."""
    parser = argparse.ArgumentParser(
        prog="bondgap",
        description="Screen octet binary compounds and alloys for compound-semiconductor devices.",
    )
    sub = parser.add_subparsers(dest="command", metavar="COMMAND", required=True)
    for name in COMMAND_MODULES:
        importlib.import_module(f"app.commands.{name}").register(sub)
    return parser


def main(argv: Sequence[str] | None = None) -> int:
    """Run the CLI; return the process exit code."""
    parser = build_parser()
    args = parser.parse_args(argv)  # argparse itself exits 2 on malformed options
    try:
        code = args.func(args)
    except (BondgapInputError, UsageError) as exc:
        print(f"bondgap: error: {exc}", file=sys.stderr)
        return 2
    except UnicodeEncodeError as exc:  # an argument with bytes that are not UTF-8
        print(f"bondgap: error: text that is not valid UTF-8 ({exc.reason}); nothing was "
              "stored", file=sys.stderr)
        return 2
    except BrokenPipeError:  # e.g. `bondgap list | head`
        return 0
    return int(code or 0)


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
