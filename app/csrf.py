"""The token that shows a change comes from bondgap's own pages or from a local program.

bondgap has no login, so any web page the user visits could try to post to it (cross-site
request forgery). Every state-changing request must carry a token that only bondgap's own pages
and same-origin requests can read: the pages carry it (a hidden `csrf_token` field in every POST
form, `<meta name="bondgap-token">` for scripts), and API clients fetch it from
`GET /api/token`, whose JSON another site's page cannot read (no CORS headers; the request
guard also refuses it when the `Origin` shows another site).

The token is HMAC-SHA256 of a fixed purpose string under a per-install random secret (32
bytes), created on the first start of the web app and kept in `store_meta` under
`csrf_secret`: the secret itself never leaves the database. Deleting that row makes a new secret
(and a new token) on the next start.
"""

from __future__ import annotations

import hashlib
import hmac
import secrets

from sqlalchemy import Engine, select
from sqlalchemy.dialects.sqlite import insert

from app.models import StoreMeta
from app.store import WRITE_LOCK

SECRET_KEY = "csrf_secret"
"""`store_meta` key of the per-install secret."""
TOKEN_HEADER = "X-Bondgap-Token"
"""Request header that carries the token (JSON API, scripts; pages may use it too)."""
FORM_FIELD = "csrf_token"
"""Form field that carries the token in the pages' POST forms."""
PURPOSE = b"bondgap state-changing request v1"


def _stored_secret(engine: Engine) -> str | None:
    with engine.connect() as conn:
        return conn.scalar(select(StoreMeta.value).where(StoreMeta.key == SECRET_KEY))


def install_token(engine: Engine) -> str:
    """Return this install's token, creating the secret on first use (one write transaction).

    Args:
        engine: The store's engine (already migrated).

    Returns:
        The token, 64 hex digits.
    """
    secret = _stored_secret(engine)
    if secret is None:
        with engine.connect() as conn:
            conn.execution_options(**{WRITE_LOCK: True})
            with conn.begin():
                conn.execute(insert(StoreMeta).values(key=SECRET_KEY,
                                                      value=secrets.token_hex(32))
                             .on_conflict_do_nothing(index_elements=["key"]))
        secret = _stored_secret(engine)
        assert secret is not None
    return hmac.new(secret.encode(), PURPOSE, hashlib.sha256).hexdigest()


def token_matches(given: str | None, token: str) -> bool:
    """Compare a token sent with a request to the right one, in constant time."""
    if not given:
        return False
    return hmac.compare_digest(given.encode("utf-8", "replace"), token.encode())
