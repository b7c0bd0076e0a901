"""A content fingerprint of the engine: its code, its generated data and the seed data.

Stored results carry it, so that any change to a model or a reference value makes the store
recompute, without anyone having to remember to bump a number.
"""

from __future__ import annotations

import hashlib
import os
from pathlib import Path

_PACKAGE = Path(__file__).resolve().parent


def _seed_data_dir() -> Path:
    override = os.environ.get("BONDGAP_SEED_DATA")
    return Path(override) if override else _PACKAGE.parent / "seed_data"


def engine_fingerprint() -> str:
    """First 12 hex digits of a SHA-256 over the engine's source, data and seed files."""
    files = sorted(_PACKAGE.rglob("*.py")) + sorted((_PACKAGE / "data").glob("*"))
    seed = _seed_data_dir()
    if seed.is_dir():
        files += sorted(seed.glob("*.csv"))
    digest = hashlib.sha256()
    for path in files:
        if path.is_file():
            digest.update(path.name.encode())
            digest.update(path.read_bytes())
    return digest.hexdigest()[:12]
