"""Benchmark: twist steps, and movies through blown-up balls.

Run: python tests/bench/bench_blowups.py   (writes tests/bench/results/blowups.md)

1. The twist move alone: a +1 full twist on k concentric circles (k(k-1) new crossings), median
   of repeated runs, beside a Reidemeister II move on the same frame as a yardstick.
2. Checking the movie "unlink of n, one +1 twist on all n strands" (the end is T(n, n)): the
   whole check (the move, the surface, s of both ends and their mirrors), median of runs.
"""

from __future__ import annotations

import os
import platform
import statistics
import time
from datetime import date
from pathlib import Path

from movies.checker.replay import check_movie
from movies.diagram import moves
from movies.diagram.constructors import from_braid
from movies.language.movie import parse_movie

RESULTS = Path(__file__).resolve().parent / "results" / "blowups.md"
REPEATS = 7


def _median(function, repeats=REPEATS) -> float:
    times = []
    for _ in range(repeats):
        started = time.perf_counter()
        function()
        times.append(time.perf_counter() - started)
    return statistics.median(times)


def main() -> int:
    move_rows = []
    for k in (2, 4, 6, 8, 10):
        circles = from_braid([], strands=k)
        edges = list(range(1, k + 1))
        result = moves.twist(circles, edges, +1)
        assert result.crossings_added == k * (k - 1)
        twist_time = _median(lambda: moves.twist(circles, edges, +1))
        r2_time = _median(lambda: moves.r2_add(circles, 1, 2, 2))
        move_rows.append(f"| {k} | {k * (k - 1)} | {twist_time * 1000:.2f} | {r2_time * 1000:.2f} | "
                         f"{twist_time / r2_time:.1f} |")
    check_rows = []
    for n in (2, 3, 4, 5):
        edges = " ".join(str(k) for k in range(1, n + 1))
        text = f"start braid({n})[]\ntwist +1 across {edges}"
        result = check_movie(parse_movie(text))
        assert result.verified and all(b.holds for b in result.bounds.bounds)
        tight = sum(b.tight for b in result.bounds.bounds)
        elapsed = _median(lambda: check_movie(parse_movie(text)), repeats=3 if n == 5 else REPEATS)
        check_rows.append(f"| {n} | {n * (n - 1)} | {result.bounds.s['end']['Q']} | {tight} | {elapsed:.3f} |")
    lines = [
        "# Twist steps and blown-up balls",
        "",
        f"{date.today()}, {os.cpu_count()} cores, Python {platform.python_version()}; medians.",
        "",
        "## The twist move on k concentric circles",
        "",
        "| k | crossings added | twist (ms) | R2 add on the same frame (ms) | ratio |",
        "|---|---|---|---|---|",
        *move_rows,
        "",
        "## Checking unlink of n -> T(n, n) by one +1 twist (s of both ends and mirrors included)",
        "",
        "| n | crossings at the end | s(T(n, n)) over Q | tight inequalities (Q and F2) | check (s) |",
        "|---|---|---|---|---|",
        *check_rows,
    ]
    RESULTS.write_text("\n".join(lines) + "\n")
    print("\n".join(lines))
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
