"""A long sweep of the diagram tests (run as ``python tests/bench/sweep_diagrams.py [scale]``).

1. Every row of the KnotInfo table: the signs read from ``pd_notation`` against the independent
   reading of tests/diagram/test_pd.py; positive table diagrams have negative ``signature``; knots whose
   ``positive`` column is ``N`` have no positive table diagram.
2. Every row of the LinkInfo table: ``linking_matrix`` and ``components``.
3. tests/diagram/test_pd.py, tests/diagram/test_model.py and tests/diagram/test_moves.py with every property test run
   ``scale`` times as many examples (default 10).

Prints what it checked; exit status 1 when anything disagrees.
"""

from __future__ import annotations

import json
import os
import subprocess
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT))
sys.path.insert(0, str(ROOT / "tests"))

from movies.diagram.pd import crossing_signs, from_pd  # noqa: E402
from support.knotinfo_columns import parse_matrix  # noqa: E402
from test_pd import independent_signs, knot_rows, link_pd, link_rows  # noqa: E402


def knots() -> list[str]:
    wrong = []
    for row in knot_rows():
        code = json.loads(row["pd_notation"])
        signs = crossing_signs(code)
        if signs != independent_signs(code):
            wrong.append(f"{row['name']}: signs differ from the independent reading")
        if set(signs) == {1} and int(row["signature"]) >= 0:
            wrong.append(f"{row['name']}: positive diagram with signature {row['signature']}")
        if row["positive"] == "N" and set(signs) == {1}:
            wrong.append(f"{row['name']}: positive diagram of a knot the table calls not positive")
    return wrong


def links() -> list[str]:
    wrong = []
    for row in link_rows():
        d = from_pd(link_pd(row))
        if d.linking_matrix() != [list(r) for r in parse_matrix(row["linking_matrix"])]:
            wrong.append(f"{row['name']}: linking matrix {d.linking_matrix()} against {row['linking_matrix']}")
        if d.component_count() != int(row["components"]):
            wrong.append(f"{row['name']}: {d.component_count()} components against {row['components']}")
    return wrong


def main() -> int:
    scale = sys.argv[1] if len(sys.argv) > 1 else "10"
    failures = []
    for name, sweep in (("KnotInfo rows", knots), ("LinkInfo rows", links)):
        start = time.perf_counter()
        wrong = sweep()
        print(f"{name}: {len(wrong)} disagreements ({time.perf_counter() - start:.1f} s)")
        for line in wrong[:20]:
            print("  ", line)
        failures += wrong
    start = time.perf_counter()
    env = dict(os.environ, MOVIES_SWEEP_SCALE=scale, PYTHONPATH=str(ROOT))
    run = subprocess.run(
        [sys.executable, "-m", "pytest", "-q", "-p", "no:cacheprovider",
         "tests/diagram/test_pd.py", "tests/diagram/test_model.py", "tests/diagram/test_moves.py"],
        cwd=ROOT, env=env,
    )
    print(f"property tests at scale {scale}: exit status {run.returncode} ({time.perf_counter() - start:.1f} s)")
    return 1 if failures or run.returncode else 0


if __name__ == "__main__":
    sys.exit(main())
