"""bondgap's screening engine: pure numpy models of octet compounds and their alloys.

Nothing in this package imports the web layer, the database or any I/O beyond reading the
package's own data files and the seed data.
"""

from screening.fingerprint import engine_fingerprint

ENGINE_RELEASE = "0.2.0"
"""The engine's release number."""

MODEL_VERSION = f"{ENGINE_RELEASE}+{engine_fingerprint()}"
"""Release plus a fingerprint of the engine's code and data: stored results are recomputed
whenever it changes."""
