"""bondgap's screening engine: pure numpy models of octet compounds and their alloys.

Nothing in this package imports the web layer, the database or any I/O beyond reading the
package's own data files.
"""

MODEL_VERSION = "0.2.0"
