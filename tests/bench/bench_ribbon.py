"""Benchmark: ribbon disks for every slice knot of the table up to 12 crossings.

Run: python tests/bench/bench_ribbon.py [--budget SECONDS] [--most-crossings N]
     (writes tests/bench/results/ribbon.md)

Every nontrivial knot whose KnotInfo column smooth_four_genus is 0 goes through
movies.checker.ribbon.find_ribbon_disk with the budget given (default 60 s, the goal's); a knot
counts only when the movie found is verified by the checker. Reports the fraction found (goal:
at least 95%), the median and 90th-percentile time per knot, and the knots missed.
"""

from __future__ import annotations

import argparse
import os
import platform
import statistics
import sys
import time
from datetime import date
from pathlib import Path

from movies.checker.ribbon import find_ribbon_disk
from movies.diagram.tables import table_names, table_row

RESULTS = Path(__file__).resolve().parent / "results" / "ribbon.md"


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--budget", type=float, default=60.0)
    parser.add_argument("--most-crossings", type=int, default=12)
    args = parser.parse_args()
    # KnotInfo column smooth_four_genus: "0" marks the slice knots
    names = [n for n in table_names("knot", max_crossings=args.most_crossings)[1:]
             if table_row(n).get("smooth_four_genus") == "0"]
    times, missed, kinds = [], [], {"one band across a face": 0, "one band along a path": 0, "two bands": 0}
    for name in names:
        started = time.perf_counter()
        found = find_ribbon_disk(name, budget=args.budget)
        times.append(time.perf_counter() - started)
        if found.verdict == "verified":
            kind = ("two bands" if len(found.bands) == 2 else
                    "one band along a path" if (" over " in found.bands[0] or " under " in found.bands[0])
                    else "one band across a face")
            kinds[kind] += 1
        else:
            missed.append(f"{name} ({found.why})")
        print(name, found.verdict, f"{times[-1]:.2f}s", flush=True)
    ok = len(names) - len(missed)
    ordered = sorted(times)
    p90 = ordered[min(len(ordered) - 1, int(0.9 * len(ordered)))]
    lines = ["# Ribbon disks for the slice knots of the table", "",
             f"{date.today()}, {os.cpu_count()} cores, Python {platform.python_version()}. Knots up to "
             f"{args.most_crossings} crossings whose KnotInfo smooth_four_genus is 0; budget {args.budget:g} s each; "
             "a knot counts when the checker verifies the movie found.", "",
             "| knots | found and verified | fraction | median time (s) | 90th percentile (s) | slowest (s) |",
             "|---|---|---|---|---|---|",
             f"| {len(names)} | {ok} | {ok / len(names):.1%} | {statistics.median(times):.2f} | {p90:.2f} | "
             f"{max(times):.2f} |", "",
             "How they were found: " + ", ".join(f"{k}: {v}" for k, v in kinds.items()) + ".", ""]
    lines += ["Missed:", ""] + [f"- {m}" for m in missed] if missed else ["Missed: none."]
    RESULTS.write_text("\n".join(lines) + "\n", encoding="utf-8")
    print("\n".join(lines))
    return 0


if __name__ == "__main__":
    sys.exit(main())
