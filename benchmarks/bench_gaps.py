"""Cold cost of the whole catalogue's band gaps and uncertainties (target: under 1 s).

Run: `python benchmarks/bench_gaps.py`. Each measurement runs in a fresh Python process so the
caches are cold; it times `screening.gaps.gaps_at(300)` after the imports, and the imports too.
"""

from __future__ import annotations

import statistics
import subprocess
import sys

TARGET_S = 1.0
PROBE = """
import time
t0 = time.perf_counter()
from screening.gaps import gaps_at
t1 = time.perf_counter()
at = gaps_at(300.0)
t2 = time.perf_counter()
assert at.uncertainty_eV.size > 0
print(f"{t1 - t0:.4f} {t2 - t1:.4f}")
"""


def main() -> int:
    imports, gaps = [], []
    for _ in range(5):
        out = subprocess.run([sys.executable, "-c", PROBE], check=True, capture_output=True,
                             text=True).stdout.split()
        imports.append(float(out[0]))
        gaps.append(float(out[1]))
    median = statistics.median(gaps)
    print(f"imports: median {statistics.median(imports):.3f} s")
    print(f"catalogue gaps + uncertainties, cold: median {median:.3f} s, max {max(gaps):.3f} s "
          f"(target < {TARGET_S:.1f} s)")
    return 0 if median < TARGET_S else 1


if __name__ == "__main__":
    raise SystemExit(main())
