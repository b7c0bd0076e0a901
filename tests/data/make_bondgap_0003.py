"""Make `tests/data/bondgap-0003.db`: a database as bondgap left it at schema revision 0003.

Revision 0003 (user substrates) is the schema before the current one (0004 added shortlists and
measurements). The file is built by the project's own migrations, stopped at 0003, and holds
what a user of that version had: two substrates of their own, two stored compound results and
the model version they were computed with (an older one, so the next start recomputes).
`tests/app/test_old_database.py` starts the app on a copy and checks that nothing is lost.

Run from the project folder (the file is committed; rebuild it only if it must change):

    python tests/data/make_bondgap_0003.py
"""

from __future__ import annotations

import sqlite3
from pathlib import Path

from alembic import command

from app.migrations import alembic_config
from app.models import row_values
from app.store import WRITE_LOCK, make_engine
from screening.report import compound_report

TARGET = Path(__file__).resolve().parent / "bondgap-0003.db"
OLD_MODEL_VERSION = "0.1.0+revision-0003"
SUBSTRATES = [
    (1, "InGaAs buffer", "cubic", 5.75, None, "relaxed buffer, wafer 12 (µm-thick)",
     "2026-11-20 09:15:00.000000"),
    (2, "my AlN template", "wurtzite", 3.112, 4.982, "", "2026-11-21 16:40:30.500000"),
]


def build(path: Path) -> None:
    """Write the 0003 database to `path` (replaced if present)."""
    path.unlink(missing_ok=True)
    engine = make_engine(path)
    with engine.connect() as conn:
        conn.execution_options(**{WRITE_LOCK: True})
        with conn.begin():
            command.upgrade(alembic_config(conn), "0003")
    engine.dispose()
    rows = [row_values(compound_report(f)) for f in ("GaAs", "InP")]
    conn = sqlite3.connect(path)
    with conn:  # one transaction
        for row in rows:
            row["model_version"] = OLD_MODEL_VERSION
            names = ", ".join(row)
            marks = ", ".join(f":{k}" for k in row)
            conn.execute(f"INSERT INTO compound_results ({names}) VALUES ({marks})", row)
        conn.execute("INSERT INTO store_meta VALUES ('model_version', ?)", (OLD_MODEL_VERSION,))
        conn.executemany("INSERT INTO user_substrates VALUES (?, ?, ?, ?, ?, ?, ?)", SUBSTRATES)
    conn.execute("PRAGMA journal_mode=DELETE")  # one self-contained file, no -wal beside it
    conn.execute("VACUUM")
    conn.close()


if __name__ == "__main__":
    build(TARGET)
    print(f"wrote {TARGET} ({TARGET.stat().st_size} bytes)")
