"""A bounded cache of GET responses, valid until the data file changes.

Pages and API answers are pure functions of the URL, the engine and the database. The cache
keys each answer on the request (path, query, Host, Cookie) and on the state of the SQLite file
and its write-ahead log (size and modification time): any committed change, by this server or
by another program such as the command line, moves that state and so retires every entry.
Exports (which carry the time they were made) are never kept. Only 200 answers without
Set-Cookie, of HTML, JSON or CSV, up to `MAX_BODY_BYTES`, are kept; at most `MAX_ENTRIES` of
them and at most `MAX_TOTAL_BYTES` together (least recently used first out).
"""

from __future__ import annotations

import os
from collections import OrderedDict
from pathlib import Path
from typing import Any

from starlette.types import ASGIApp, Message, Receive, Scope, Send

MAX_ENTRIES = 256
"""Most answers kept."""

MAX_BODY_BYTES = 1_000_000
"""Largest answer kept, bytes (a finder answer of 1000 matches is about 0.5 MB)."""

MAX_TOTAL_BYTES = 32_000_000
"""Most bytes of answers kept together (bodies and headers)."""

_CACHEABLE_TYPES = (b"text/html", b"application/json", b"text/csv")


def _file_state(path: Path) -> tuple[int, int]:
    try:
        status = os.stat(path)
    except OSError:
        return (0, 0)
    return (status.st_size, status.st_mtime_ns)


class PageCache:
    """ASGI middleware: answer a repeated GET from memory while the database is unchanged."""

    def __init__(self, app: ASGIApp, db_path: Path) -> None:
        self.app = app
        self.db_path = Path(db_path)
        self.wal_path = Path(f"{db_path}-wal")
        self.entries: OrderedDict[tuple[Any, ...], tuple[int, list[Any], bytes]] = OrderedDict()
        self.bytes_kept = 0

    def _key(self, scope: Scope) -> tuple[Any, ...]:
        headers = dict(scope.get("headers") or ())
        return (scope["path"], scope.get("query_string", b""), headers.get(b"host"),
                headers.get(b"cookie"), _file_state(self.db_path), _file_state(self.wal_path))

    async def __call__(self, scope: Scope, receive: Receive, send: Send) -> None:
        """Serve from the cache, or pass on and keep a cacheable answer."""
        if (scope["type"] != "http" or scope["method"] != "GET"
                or "export" in scope["path"]):  # exports carry the time they were made
            await self.app(scope, receive, send)
            return
        key = self._key(scope)
        hit = self.entries.get(key)
        if hit is not None:
            self.entries.move_to_end(key)
            status, headers, body = hit
            await send({"type": "http.response.start", "status": status, "headers": headers})
            await send({"type": "http.response.body", "body": body})
            return
        start: dict[str, Any] = {}
        chunks: list[bytes] = []
        size = 0

        async def keep(message: Message) -> None:
            nonlocal size
            if message["type"] == "http.response.start":
                start.update(message)
            elif message["type"] == "http.response.body" and size <= MAX_BODY_BYTES:
                body = message.get("body", b"")
                size += len(body)
                chunks.append(body)
            await send(message)

        await self.app(scope, receive, keep)
        headers = start.get("headers") or []
        names = {name.lower(): value for name, value in headers}
        cacheable = (
            start.get("status") == 200
            and size <= MAX_BODY_BYTES
            and b"set-cookie" not in names
            and names.get(b"content-type", b"").startswith(_CACHEABLE_TYPES)
            and key == self._key(scope)  # the data did not change while answering
        )
        if cacheable:
            self._keep(key, (200, list(headers), b"".join(chunks)))

    def _keep(self, key: tuple[Any, ...], entry: tuple[int, list[Any], bytes]) -> None:
        """Add an answer; drop the least recently used ones beyond the count and byte bounds."""
        old = self.entries.pop(key, None)
        if old is not None:
            self.bytes_kept -= _size(old)
        self.entries[key] = entry
        self.bytes_kept += _size(entry)
        while len(self.entries) > MAX_ENTRIES or self.bytes_kept > MAX_TOTAL_BYTES:
            self.bytes_kept -= _size(self.entries.popitem(last=False)[1])


def _size(entry: tuple[int, list[Any], bytes]) -> int:
    """Bytes an entry holds: its body and its headers."""
    return len(entry[2]) + sum(len(name) + len(value) for name, value in entry[1])
