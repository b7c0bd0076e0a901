"""`bondgap serve`: start the web app on this machine (127.0.0.1:8000 unless told otherwise)."""

from __future__ import annotations

import argparse
import ipaddress
import socket

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
                        help=f"interface to listen on (default {DEFAULT_HOST}: this machine only)")
    parser.add_argument("--port", type=port_number, default=DEFAULT_PORT,
                        help=f"TCP port (default {DEFAULT_PORT}; 0 picks a free one)")
    add_db_argument(parser)
    parser.set_defaults(func=run)


def bind(host: str, port: int) -> socket.socket:
    """Open the listening socket before anything else, so a busy port fails at once.

    Raises:
        UsageError: The host cannot be resolved or the port cannot be bound.
    """
    try:
        family, kind, proto, _, address = socket.getaddrinfo(
            host, port, type=socket.SOCK_STREAM, flags=socket.AI_PASSIVE
        )[0]
    except OSError as exc:  # socket.gaierror
        raise UsageError(f"cannot listen on {host}:{port}: {exc.strerror or exc}") from exc
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


def _is_loopback(host: str) -> bool:
    try:
        return ipaddress.ip_address(host).is_loopback
    except ValueError:
        return host == "localhost"


def run(args: argparse.Namespace) -> int:
    """Bind, open the store (migrate, seed), print the URL and serve until interrupted."""
    import uvicorn

    from app.main import create_app

    settings = Settings.from_args(args)
    sock = bind(settings.host, settings.port)
    try:
        app = create_app(settings)
    except StoreError as exc:
        sock.close()
        raise UsageError(str(exc)) from exc
    host, port = sock.getsockname()[:2]
    shown = f"[{host}]" if ":" in host else host
    if not _is_loopback(host):
        print(f"bondgap: note: listening on {host} makes the app reachable from other "
              "machines; it has no login")
    print(f"bondgap: serving http://{shown}:{port}/ (database {settings.db_path}); "
          "press Ctrl-C to stop", flush=True)
    uvicorn.Server(uvicorn.Config(app, log_level="warning")).run(sockets=[sock])
    return 0
