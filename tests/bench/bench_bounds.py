"""Benchmark and sweep: 4-genus bounds against the knot table, and s of links across the link table.

Run: python tests/bench/bench_bounds.py   (writes tests/bench/results/bounds.md)

1. For every KnotInfo knot up to 12 crossings whose smooth_four_genus is a single number, no
   lower bound the program reports (|s|/2 over Q and F2, |sigma|/2, Levine–Tristram) may exceed it.
2. For every LinkInfo link and orientation: s over Q where the free part settles it, with the
   total time, and how many need the canonical class (not computed yet).
"""

from __future__ import annotations

import os
import platform
import sys
import time
from datetime import date
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))

from movies.bounds.verdicts import knot_genus_bounds  # noqa: E402
from movies.diagram.tables import table_names, table_row  # noqa: E402
from movies.homology.links import SNotComputedError, link_s  # noqa: E402
from movies.language.spec import parse_diagram  # noqa: E402
from support.knotinfo_columns import parse_four_genus  # noqa: E402

RESULTS = Path(__file__).resolve().parent / "results" / "bounds.md"


def main() -> int:
    started = time.perf_counter()
    checked = exceeded = ranges = 0
    tight = {}
    for name in table_names("knot", max_crossings=12):
        # KnotInfo column smooth_four_genus
        g4 = parse_four_genus(table_row(name)["smooth_four_genus"])
        if g4 is None:
            ranges += 1
            continue
        bounds = knot_genus_bounds(parse_diagram(name))
        checked += 1
        if any(b.bound > g4 for b in bounds):
            exceeded += 1
            print(f"{name}: a bound exceeds g4 = {g4}: {bounds}", file=sys.stderr)
        best = max(b.bound for b in bounds)
        tight[best == g4] = tight.get(best == g4, 0) + 1
    knots_time = time.perf_counter() - started

    started = time.perf_counter()
    computed = refused = 0
    for name in table_names("link"):
        try:
            link_s(parse_diagram(name))
            computed += 1
        except SNotComputedError:
            refused += 1
    links_time = time.perf_counter() - started

    lines = [
        "# Bounds and s of links",
        "",
        f"{date.today()}, {os.cpu_count()} cores, Python {platform.python_version()}.",
        "",
        "## 4-genus bounds against KnotInfo smooth_four_genus (knots up to 12 crossings)",
        "",
        "| knots checked | with a range (skipped) | a bound above g4 | best bound equals g4 | total time (s) |",
        "|---|---|---|---|---|",
        f"| {checked} | {ranges} | {exceeded} | {tight.get(True, 0)} | {knots_time:.1f} |",
        "",
        "## s over Q of every LinkInfo link and orientation",
        "",
        "| oriented links | s computed (free part settles it) | need the canonical class | total time (s) |",
        "|---|---|---|---|",
        f"| {computed + refused} | {computed} | {refused} | {links_time:.1f} |",
    ]
    RESULTS.write_text("\n".join(lines) + "\n")
    print("\n".join(lines))
    return 1 if exceeded else 0


if __name__ == "__main__":
    raise SystemExit(main())
