"""Giving freed memory back to the system after a large computation.

A finder search over the whole design space allocates and frees about 200 MB of numpy arrays.
The C library's allocator keeps much of what was freed for later use, so the server's resident
memory would stay at its peak. `release_freed_memory` asks glibc's allocator (`malloc_trim`)
to return the free memory it holds; elsewhere (another C library) it does nothing.
"""

from __future__ import annotations

import ctypes
import ctypes.util
from functools import lru_cache
from typing import Any


@lru_cache(maxsize=1)
def _trim() -> Any:
    """Glibc's `malloc_trim`, or None where the C library has none."""
    name = ctypes.util.find_library("c")
    try:
        return getattr(ctypes.CDLL(name), "malloc_trim", None) if name else None
    except OSError:
        return None


def release_freed_memory() -> None:
    """Return the memory freed by the allocator to the system (glibc only; else nothing)."""
    trim = _trim()
    if trim is not None:
        trim(0)
