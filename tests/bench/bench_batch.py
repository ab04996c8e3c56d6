"""Benchmark: a whole table range through ``movies batch``, on one worker and on two, in one run.

Run: python tests/bench/bench_batch.py [--high 13]   (writes tests/bench/results/batch.md)

Every knot of the table from 3 to HIGH crossings (12,965 up to 13), task ``invariants`` with its
defaults (the classical invariants, Khovanov homology over Q, F2 and Z, s over Q and F2), on a
local cluster of 1 worker and then of 2, each into a fresh database. Records the wall time of each
whole command (start-up of the cluster included), the ratio, the median time per item, that the
two databases hold the same results, and the agreement with KnotInfo's rasmussen_invariant and
khovanov_unreduced_integral_polynomial columns where they are filled (from the summary).
"""

from __future__ import annotations

import argparse
import json
import os
import platform
import sqlite3
import subprocess
import sys
import tempfile
import time
from datetime import date
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
RESULTS = Path(__file__).resolve().parent / "results" / "batch.md"


def run(high: int, workers: int, db: Path) -> float:
    start = time.monotonic()
    subprocess.run([sys.executable, "-m", "movies", "batch", "run", "--knots", f"3-{high}", "--task", "invariants",
                    "--workers", str(workers), "--db", str(db), "--time-limit", "600"], check=True, cwd=ROOT,
                   stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
    return time.monotonic() - start


def rows(db: Path) -> list[tuple]:
    with sqlite3.connect(db) as connection:
        return sorted(connection.execute("SELECT item, status, result FROM results"))


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--high", type=int, default=13)
    args = parser.parse_args()
    folder = Path(tempfile.mkdtemp())
    one, two = folder / "one.sqlite", folder / "two.sqlite"
    seconds = {1: run(args.high, 1, one), 2: run(args.high, 2, two)}
    same = rows(one) == rows(two)
    summary = json.loads(subprocess.run([sys.executable, "-m", "movies", "batch", "summary", str(two), "--json"],
                                        check=True, cwd=ROOT, capture_output=True, text=True).stdout)[0]
    tables = summary["tables"]
    lines = ["# A table range through movies batch, on one worker and on two", "",
             f"{date.today()}, {os.cpu_count()} cores, Python {platform.python_version()}. Every knot of 3 to "
             f"{args.high} crossings, task invariants with its defaults (classical invariants, Khovanov homology "
             "over Q, F2 and Z, s over Q and F2); a local cluster of 1 and of 2 workers, each run into a fresh "
             "database, one after the other in this run. Wall time of the whole command, cluster start-up "
             "included.", "",
             "| workers | items | wall time (s) | median per item (ms) |", "|---|---|---|---|",
             f"| 1 | {summary['items']} | {seconds[1]:.1f} | (see 2) |",
             f"| 2 | {summary['items']} | {seconds[2]:.1f} | {summary['milliseconds']['median']} |", "",
             f"Speed-up with 2 workers: {seconds[1] / seconds[2]:.2f}x. The two databases hold the same results: "
             f"{'yes' if same else 'NO'}. Status: " + ", ".join(f"{n} {k}" for k, n in summary["status"].items()) + ".",
             "", "Agreement with KnotInfo (where the column is filled):", ""]
    for column, counts in tables.items():
        lines.append(f"- {column}: {counts['agree']} of {counts['compared']} agree"
                     + (f"; first differences: {counts['disagree']}" if counts["disagree"] else ""))
    RESULTS.write_text("\n".join(lines) + "\n", encoding="utf-8")
    print("\n".join(lines))
    return 0 if same and all(c["agree"] == c["compared"] for c in tables.values()) else 1


if __name__ == "__main__":
    sys.exit(main())
