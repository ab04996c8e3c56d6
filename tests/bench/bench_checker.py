"""Benchmark: checking a 40-step movie whose frames have about 15 crossings.

Run: python tests/bench/bench_checker.py   (writes tests/bench/results/checker.md)

The movie is made from a fixed seed (tests/draw/randomized.py): a 15-crossing braid closure, then
40 random legal moves (kinks and bigons added and removed, triangles moved, births, bands),
written out as movie text. The time measured is reading and checking the text, median of repeated runs.
"""

from __future__ import annotations

import os
import platform
import statistics
import sys
import time
from datetime import date
from pathlib import Path

from movies.checker.replay import check_movie
from movies.language.movie import parse_movie

RESULTS = Path(__file__).resolve().parent / "results" / "checker.md"
sys.path.insert(0, str(Path(__file__).resolve().parents[1]))
from draw.randomized import random_movie  # noqa: E402  (the same random movies the drawing bench uses)


def main() -> int:
    rows = []
    for seed in (1, 2, 3):
        text, frames = random_movie(seed)
        sizes = [frame.crossing_count() for frame in frames[1:]]
        times = []
        for _ in range(5):
            started = time.perf_counter()
            result = check_movie(parse_movie(text))
            times.append(time.perf_counter() - started)
        if not result.verified:
            print(f"seed {seed}: the generated movie was not verified: {result.findings}", file=sys.stderr)
            return 1
        rows.append((seed, len(result.steps), statistics.median(sizes), max(sizes), statistics.median(times), min(times)))
    lines = [
        "# Checking a 40-step movie",
        "",
        f"{date.today()}, {os.cpu_count()} cores, Python {platform.python_version()}. "
        "Median of 5 runs of reading and checking the movie text. Goal: under 1 s.",
        "",
        "| seed | steps | median crossings | most crossings | median time (s) | fastest (s) |",
        "|---|---|---|---|---|---|",
    ]
    for seed, steps, median_size, most, median_time, fastest in rows:
        lines.append(f"| {seed} | {steps} | {median_size} | {most} | {median_time:.3f} | {fastest:.3f} |")
    RESULTS.write_text("\n".join(lines) + "\n")
    print("\n".join(lines))
    return 0 if all(r[4] < 1.0 for r in rows) else 3


if __name__ == "__main__":
    raise SystemExit(main())
