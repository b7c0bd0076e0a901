"""`bondgap serve`: start the web app on this machine (127.0.0.1:8000 unless told otherwise).

The app has no login, so it listens on a loopback address only, unless `--allow-remote` says
otherwise (then a warning goes to stderr). Requests must name the app by a loopback address,
the host it listens on, or a name given with `--allow-host` (DNS-rebinding defence).
"""

from __future__ import annotations

import argparse
import ipaddress
import socket
import sys
from typing import Any

from app.cli import UsageError
from app.config import DEFAULT_HOST, DEFAULT_PORT, Settings, add_db_argument
from app.store import StoreError


def port_number(text: str) -> int:
    """Read a TCP port for argparse: 0-65535 (0 picks a free one)."""
    try:
        port = int(text)
    except ValueError:
        port = -1
    if not 0 <= port <= 65535:
        raise argparse.ArgumentTypeError(f"{text!r} is not a port number (0 to 65535)")
    return port


def register(sub: argparse._SubParsersAction) -> None:
    """Add the `serve` sub-command."""
    parser = sub.add_parser(
        "serve",
        help="start the web app (fills the database on first run)",
        description="Start the web app and print its address. The first run fills the "
        "database from the seed data and the engine (a few seconds).",
    )
    parser.add_argument("--host", default=DEFAULT_HOST,
                        help=f"interface to listen on (default {DEFAULT_HOST}: this machine "
                        "only; another address needs --allow-remote)")
    parser.add_argument("--allow-remote", action="store_true",
                        help="allow listening on an address other machines can reach (the app "
                        "has no login: anyone who can reach it can read and change your data)")
    parser.add_argument("--allow-host", action="append", metavar="NAME",
                        help="also answer requests addressed to this host name (repeatable), "
                        "e.g. the machine's name with --allow-remote")
    parser.add_argument("--port", type=port_number, default=DEFAULT_PORT,
                        help=f"TCP port (default {DEFAULT_PORT}; 0 picks a free one)")
    add_db_argument(parser)
    parser.set_defaults(func=run)


def _address(host: str, port: int) -> tuple[int, int, int, tuple[Any, ...]]:
    """Resolve where to listen: (family, type, proto, address). Raises UsageError."""
    try:
        family, kind, proto, _, address = socket.getaddrinfo(
            host, port, type=socket.SOCK_STREAM, flags=socket.AI_PASSIVE
        )[0]
    except OSError as exc:  # socket.gaierror
        raise UsageError(f"cannot listen on {host}:{port}: {exc.strerror or exc}") from exc
    return family, kind, proto, address


def is_loopback(address: tuple[Any, ...]) -> bool:
    """Whether a resolved socket address is a loopback address (127.0.0.0/8, ::1)."""
    try:
        return ipaddress.ip_address(str(address[0]).split("%")[0]).is_loopback
    except ValueError:
        return False


def bind(host: str, port: int, *, allow_remote: bool = False) -> socket.socket:
    """Open the listening socket before anything else, so a busy port fails at once.

    Args:
        host: Interface name or address.
        port: TCP port (0: any free one).
        allow_remote: Whether a non-loopback address may be used.

    Raises:
        UsageError: The host cannot be resolved, is not loopback without `allow_remote`, or
            the port cannot be bound.
    """
    family, kind, proto, address = _address(host, port)
    if not (allow_remote or is_loopback(address)):
        raise UsageError(f"refusing to listen on {host} ({address[0]}): other machines could "
                         "reach the app, which has no login; add --allow-remote if you mean it")
    sock = socket.socket(family, kind, proto)
    try:
        sock.setsockopt(socket.SOL_SOCKET, socket.SO_REUSEADDR, 1)
        sock.bind(address)
    except OSError as exc:
        sock.close()
        raise UsageError(f"cannot listen on {host}:{port}: {exc.strerror or exc}") from exc
    sock.listen(128)
    sock.set_inheritable(True)
    return sock


def run(args: argparse.Namespace) -> int:
    """Bind, open the store (migrate, seed), print the URL and serve until interrupted."""
    import uvicorn

    from app.main import create_app

    settings = Settings.from_args(args)
    sock = bind(settings.host, settings.port, allow_remote=args.allow_remote)
    try:
        app = create_app(settings)
    except StoreError as exc:
        sock.close()
        raise UsageError(str(exc)) from exc
    host, port = sock.getsockname()[:2]
    shown = f"[{host}]" if ":" in host else host
    if not is_loopback((host,)):
        names = ", ".join(sorted(settings.host_names()))
        print(f"bondgap: WARNING: listening on {host}: anyone who can reach this machine can "
              "read and change your shortlists, substrates and measurements (the app has no "
              f"login). Requests must be addressed to one of: {names} (add names with "
              "--allow-host).", file=sys.stderr, flush=True)
    print(f"bondgap: serving http://{shown}:{port}/ (database {settings.db_path}); "
          "press Ctrl-C to stop", flush=True)
    uvicorn.Server(uvicorn.Config(app, log_level="warning")).run(sockets=[sock])
    return 0
