"""The app's settings: one object, resolved once from the command line and the environment.

Database path, first match wins:

1. `--db PATH` on the command line;
2. the environment variable `BONDGAP_DB`;
3. `./bondgap.db` if that file exists in the current folder;
4. `bondgap.db` in the user's data folder: `$XDG_DATA_HOME/bondgap/` (default
   `~/.local/share/bondgap/`) on Linux, `~/Library/Application Support/bondgap/` on macOS,
   `%LOCALAPPDATA%/bondgap/` on Windows.

The server binds 127.0.0.1:8000 unless told otherwise, and answers only requests whose `Host`
header names a loopback address, the host it was bound to, or a name given with `--allow-host`.
"""

from __future__ import annotations

import argparse
import importlib.util
import os
import sys
from collections.abc import Mapping
from dataclasses import dataclass, field
from pathlib import Path

import app as _app_package

DB_ENV_VAR = "BONDGAP_DB"
"""Environment variable that names the database file (below `--db`, above the defaults)."""

DEFAULT_HOST = "127.0.0.1"
"""Loopback only: the app has no login, so other machines must not reach it by default."""

DEFAULT_PORT = 8000
"""Default TCP port of `bondgap serve`."""

REPO_ROOT = Path(_app_package.__file__).resolve().parent.parent
"""The project folder: `templates/` and `static/` live here, beside `app/`."""

TEMPLATES_DIR = REPO_ROOT / "templates"
STATIC_DIR = REPO_ROOT / "static"


def _plotly_js_path() -> Path:
    """Locate plotly.js inside the installed `plotly` package without importing it (~60 ms)."""
    spec = importlib.util.find_spec("plotly")
    origin = spec.origin if spec and spec.origin else "plotly/__init__.py"
    return Path(origin).parent / "package_data" / "plotly.min.js"


PLOTLY_JS = _plotly_js_path()
"""The one file of the installed plotly package that the pages load (served by one route)."""


def user_data_dir(environ: Mapping[str, str] | None = None) -> Path:
    """Return the per-user folder where bondgap keeps its database by default.

    Args:
        environ: Environment to read (defaults to `os.environ`).

    Returns:
        The folder (not created here).
    """
    env = os.environ if environ is None else environ
    home = Path(env.get("HOME") or Path.home())
    if sys.platform == "win32":  # pragma: no cover - not run on our Linux CI
        base = Path(env.get("LOCALAPPDATA") or home / "AppData" / "Local")
    elif sys.platform == "darwin":  # pragma: no cover
        base = home / "Library" / "Application Support"
    else:
        base = Path(env.get("XDG_DATA_HOME") or home / ".local" / "share")
    return base / "bondgap"


def resolve_db_path(
    cli_value: str | os.PathLike[str] | None = None,
    *,
    environ: Mapping[str, str] | None = None,
    cwd: Path | None = None,
) -> Path:
    """Pick the database file: `--db` > `BONDGAP_DB` > `./bondgap.db` if present > data folder.

    Args:
        cli_value: The `--db` option, if given.
        environ: Environment to read (defaults to `os.environ`).
        cwd: Folder searched for an existing `bondgap.db` (defaults to the current folder).

    Returns:
        An absolute path (the file may not exist yet).
    """
    env = os.environ if environ is None else environ
    if cli_value:
        return Path(cli_value).expanduser().resolve()
    if env.get(DB_ENV_VAR):
        return Path(env[DB_ENV_VAR]).expanduser().resolve()
    local = (cwd or Path.cwd()) / "bondgap.db"
    if local.is_file():
        return local.resolve()
    return user_data_dir(env) / "bondgap.db"


@dataclass(frozen=True)
class Settings:
    """Everything the app and the CLI need to know about where and how to run.

    Attributes:
        db_path: SQLite database file (created and migrated on first use).
        host: Interface `bondgap serve` binds to.
        port: TCP port `bondgap serve` listens on (0: any free port).
        templates_dir: Jinja2 templates.
        static_dir: CSS and JavaScript served under `/static/`.
        plotly_js: The plotly.js bundle served at `/vendor/plotly.min.js`.
        allowed_hosts: Host names served besides the loopback names and `host`
            (`bondgap serve --allow-host NAME`); any other `Host` header is refused.
    """

    db_path: Path
    host: str = DEFAULT_HOST
    port: int = DEFAULT_PORT
    templates_dir: Path = field(default=TEMPLATES_DIR)
    static_dir: Path = field(default=STATIC_DIR)
    plotly_js: Path = field(default=PLOTLY_JS)
    allowed_hosts: tuple[str, ...] = ()

    def host_names(self) -> frozenset[str]:
        """Host names the app answers to: 127.0.0.1, localhost, ::1, `host`, `allowed_hosts`."""
        from app.guard import allowed_host_names

        return allowed_host_names(self.host, self.allowed_hosts)

    @classmethod
    def from_args(cls, args: argparse.Namespace) -> Settings:
        """Build settings from CLI arguments (`db`; `host`, `port`, `allow_host` where present)."""
        return cls(
            db_path=resolve_db_path(getattr(args, "db", None)),
            host=getattr(args, "host", None) or DEFAULT_HOST,
            port=DEFAULT_PORT if getattr(args, "port", None) is None else args.port,
            allowed_hosts=tuple(getattr(args, "allow_host", None) or ()),
        )


def add_db_argument(parser: argparse.ArgumentParser) -> None:
    """Add the `--db PATH` option to a sub-command's parser."""
    parser.add_argument(
        "--db",
        metavar="PATH",
        help=f"SQLite database file (default: ${DB_ENV_VAR}, else ./bondgap.db if present, "
        "else bondgap.db in your user data folder)",
    )
