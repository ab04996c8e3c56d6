"""Benchmark: checking a 40-step movie whose frames have about 15 crossings.

Run: python tests/bench/bench_checker.py   (writes tests/bench/results/checker.md)

The movie is made here from a fixed seed: a 15-crossing braid closure, then 40 random legal
moves (kinks added and removed, bigons added and removed, triangles moved, bands), written out
as movie text. The time measured is reading and checking the text, median of repeated runs.
"""

from __future__ import annotations

import os
import platform
import random
import statistics
import sys
import time
from datetime import date
from pathlib import Path

from movies.checker.replay import check_movie
from movies.diagram import moves
from movies.diagram.constructors import from_braid
from movies.errors import MoveError
from movies.language.movie import parse_movie

RESULTS = Path(__file__).resolve().parent / "results" / "checker.md"


def random_movie(seed: int, steps: int = 40) -> tuple[str, list[int]]:
    rng = random.Random(seed)
    word = [rng.choice([1, 2, 3, -1, -2, -3]) for _ in range(15)]
    frame = from_braid(word, strands=4)
    lines = [f"title random movie {seed}", f"start braid(4){word}".replace(" ", "")]
    sizes = []
    while len(lines) - 2 < steps:
        choice = rng.random()
        try:
            if choice < 0.2 and frame.crossing_count() < 18:
                edge = rng.choice(frame.edges())
                hand, sign = rng.choice("LR"), rng.choice([1, -1])
                new = moves.r1_add(frame, edge, hand, sign)
                text = f"R1 add {edge} {'left' if hand == 'L' else 'right'} {'+' if sign > 0 else '-'}"
            elif choice < 0.4:
                kinks = [c for c in frame.crossings if moves.kinks_at(frame, c)]
                c = rng.choice(kinks)
                new, text = moves.r1_remove(frame, c), f"R1 remove {c}"
            elif choice < 0.55 and frame.crossing_count() < 17:
                face = rng.choice(sorted(frame.faces))
                edges = sorted({s.edge for cycle in frame.faces[face] for s in cycle})
                a, b = rng.sample(edges, 2)
                new, text = moves.r2_add(frame, a, b, face), f"R2 add {a} over {b} in face {face}"
            elif choice < 0.75:
                face = rng.choice(sorted(frame.faces))
                new, text = moves.r2_remove(frame, face), f"R2 remove face {face}"
            elif choice < 0.95:
                face = rng.choice(sorted(frame.faces))
                new, text = moves.r3(frame, face), f"R3 face {face}"
            else:
                face = rng.choice(sorted(frame.faces))
                edges = sorted({s.edge for cycle in frame.faces[face] for s in cycle})
                a, b = rng.sample(edges, 2)
                new, text = moves.saddle(frame, a, b, face).diagram, f"band {a} {b} in face {face}"
        except (MoveError, ValueError, IndexError):
            continue
        frame = new
        lines.append(text)
        sizes.append(frame.crossing_count())
    return "\n".join(lines) + "\n", sizes


def main() -> int:
    rows = []
    for seed in (1, 2, 3):
        text, sizes = random_movie(seed)
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
