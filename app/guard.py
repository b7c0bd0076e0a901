"""The request guard: what every HTTP request passes before a route sees it (pure ASGI).

1. Host allow-list (DNS-rebinding defence): a page of another site whose name was made to
   resolve to 127.0.0.1 still sends its own name in `Host`; only loopback names and the names
   the server was told about are served (400 otherwise).
2. State-changing requests (every method but GET, HEAD, OPTIONS):
   * refused (403) when `Sec-Fetch-Site` or `Origin` shows another site, before the body is
     read;
   * refused (413) when the body is over `MAX_BODY_BYTES` (the import's own 1 MB limit answers
     first, with its own message);
   * refused (403) without the install's token (`app.csrf`): the `X-Bondgap-Token` header, or
     for the pages' forms (outside /api/) the hidden `csrf_token` field.
3. `GET /api/token` is refused (403) when `Sec-Fetch-Site` or `Origin` shows another site.
4. Every response carries headers that keep other pages from framing or sniffing ours, and a
   content security policy that runs only the app's own script files.
"""

from __future__ import annotations

from collections.abc import Callable, Iterable
from urllib.parse import parse_qsl, urlsplit

from starlette.exceptions import HTTPException
from starlette.requests import Request
from starlette.responses import Response
from starlette.types import ASGIApp, Message, Receive, Scope, Send

from app.csrf import FORM_FIELD, TOKEN_HEADER, token_matches

LOOPBACK_NAMES: frozenset[str] = frozenset({"127.0.0.1", "localhost", "::1"})
WILDCARD_HOSTS: frozenset[str] = frozenset({"", "0.0.0.0", "::"})
SAFE_METHODS: frozenset[str] = frozenset({"GET", "HEAD", "OPTIONS"})
TOKEN_PATH = "/api/token"
MAX_BODY_BYTES = 2_000_000
"""Largest request body accepted (the CSV import allows 1 MB of file plus the form around it)."""

CONTENT_SECURITY_POLICY = (
    "default-src 'self'; script-src 'self'; style-src 'self' 'unsafe-inline'; "
    "img-src 'self' data: blob:; object-src 'none'; base-uri 'none'; form-action 'self'; "
    "frame-ancestors 'none'"
)
SECURITY_HEADERS: tuple[tuple[bytes, bytes], ...] = (
    (b"content-security-policy", CONTENT_SECURITY_POLICY.encode()),
    (b"x-frame-options", b"DENY"),
    (b"x-content-type-options", b"nosniff"),
    (b"referrer-policy", b"same-origin"),
)

Refuse = Callable[[Request, int, str], Response]
"""Renders a refusal (status, one-line message) as the app answers errors."""


class BodyTooLarge(Exception):
    """The request body went over the limit while it was read."""


def host_name(header: str | None) -> str | None:
    """The host name of a `Host` header, lower case, without port or brackets (None: malformed).

    >>> host_name("[::1]:8000"), host_name("LocalHost:8000"), host_name("a:b")
    ('::1', 'localhost', None)
    """
    text = (header or "").strip().lower()
    if text.startswith("["):
        end = text.find("]")
        name, rest = (text[1:end], text[end + 1:]) if end > 0 else ("", "")
    else:
        name, colon, port = text.partition(":")
        rest = colon + port
    port = rest[1:]
    if not name or (rest and not (rest[0] == ":" and port.isascii() and port.isdigit()
                                  and len(port) <= 5)):
        return None
    return name


def allowed_host_names(host: str, extra: Iterable[str] = ()) -> frozenset[str]:
    """The host names served: loopback, the host bound to (unless a wildcard), and `extra`."""
    names = {n.strip().lower().strip("[]") for n in (host, *extra)}
    return LOOPBACK_NAMES | (names - WILDCARD_HOSTS)


def cross_site(request: Request) -> str | None:
    """Why a request looks sent by another site's page (None: it does not)."""
    site = request.headers.get("sec-fetch-site")
    if site is not None and site not in ("same-origin", "none"):
        return f"Sec-Fetch-Site: {site[:20]}"
    origin = request.headers.get("origin")
    if origin is None:
        return None
    netloc = urlsplit(origin).netloc.lower() if origin != "null" else ""
    if netloc != (request.headers.get("host") or "").strip().lower():
        return f"Origin: {origin[:60]}"
    return None


async def _read_body(receive: Receive, limit: int) -> bytes | None:
    """The whole body (None if the client went away). Raises BodyTooLarge over `limit`."""
    chunks = bytearray()
    while True:
        message = await receive()
        if message["type"] == "http.disconnect":
            return None
        chunks += message.get("body", b"")
        if len(chunks) > limit:
            raise BodyTooLarge
        if not message.get("more_body", False):
            return bytes(chunks)


def _replay(body: bytes, receive: Receive) -> Receive:
    """A `receive` that hands the app the body already read, then the client's messages."""
    pending = [{"type": "http.request", "body": body, "more_body": False}]

    async def replay() -> Message:
        return pending.pop() if pending else await receive()

    return replay


async def _form_token(scope: Scope, body: bytes, receive: Receive) -> str | None:
    """The `csrf_token` field of a form body (urlencoded or multipart), or None."""
    content_type = Request(scope).headers.get("content-type", "")
    if content_type.startswith("application/x-www-form-urlencoded"):
        fields = parse_qsl(body.decode("utf-8", "replace"), keep_blank_values=True)
        return next((v for k, v in fields if k == FORM_FIELD), None)
    if not content_type.startswith("multipart/form-data"):
        return None
    form = await Request(scope, _replay(body, receive)).form()
    try:
        value = form.get(FORM_FIELD)
    finally:
        await form.close()
    return value if isinstance(value, str) else None


class RequestGuard:
    """ASGI middleware: host allow-list, cross-site refusal, body limit, token, headers."""

    def __init__(self, app: ASGIApp, *, hosts: frozenset[str], token: str, refuse: Refuse,
                 max_body: int = MAX_BODY_BYTES) -> None:
        self.app, self.hosts, self.token = app, hosts, token
        self.refuse, self.max_body = refuse, max_body

    async def __call__(self, scope: Scope, receive: Receive, send: Send) -> None:
        """Check one request, then pass it on (or answer the refusal)."""
        if scope["type"] != "http":
            await self.app(scope, receive, send)
            return

        async def send_with_headers(message: Message) -> None:
            if message["type"] == "http.response.start":
                have = {name.lower() for name, _ in message.get("headers", [])}
                extra = [h for h in SECURITY_HEADERS if h[0] not in have]
                message = {**message, "headers": [*message.get("headers", []), *extra]}
            await send(message)

        request = Request(scope)
        refusal = self._refusal(request)
        body: bytes | None = None
        if refusal is None and scope["method"] not in SAFE_METHODS:
            body, refusal = await self._change(request, receive)
            if body is None and refusal is None:
                return  # the client went away
        if refusal is not None:
            response = self.refuse(request, *refusal)
            await response(scope, receive, send_with_headers)
        elif body is None:
            await self.app(scope, receive, send_with_headers)
        else:
            await self.app(scope, _replay(body, receive), send_with_headers)

    def _refusal(self, request: Request) -> tuple[int, str] | None:
        """Refuse a foreign Host, and a change (or the token) asked for by another site."""
        if host_name(request.headers.get("host")) not in self.hosts:
            shown = (request.headers.get("host") or "")[:60]
            return 400, (f"Host header not allowed: {shown!r}; open the app at "
                         "http://127.0.0.1:PORT/ or http://localhost:PORT/")
        why = cross_site(request)
        if why and (request.method not in SAFE_METHODS or request.url.path == TOKEN_PATH):
            return 403, (f"refused: the request comes from another site's page ({why}); "
                         "bondgap takes changes from, and gives its token to, its own pages only")
        return None

    async def _change(self, request: Request, receive: Receive
                      ) -> tuple[bytes | None, tuple[int, str] | None]:
        """Read the body of a change within the limit and check its token: (body, refusal)."""
        too_large = (413, f"the request body is over the limit of {self.max_body / 1e6:g} MB "
                          "for any request (1 MB for a CSV file): nothing was stored")
        length = request.headers.get("content-length", "")
        if length.isascii() and length.isdigit() and int(length) > self.max_body:
            return None, too_large
        try:
            body = await _read_body(receive, self.max_body)
        except BodyTooLarge:
            return None, too_large
        if body is None:
            return None, None
        given = request.headers.get(TOKEN_HEADER)
        if given is None and not request.url.path.startswith("/api/"):
            try:
                given = await _form_token(request.scope, body, receive)
            except HTTPException as exc:  # a malformed multipart form
                return body, (400, f"the form could not be read: {exc.detail}")
        if not token_matches(given, self.token):
            return body, (403, f"refused: {'a wrong' if given else 'no'} bondgap token; send "
                               f"the {TOKEN_HEADER} header (GET /api/token gives it) or use "
                               "the app's own pages")
        return body, None
