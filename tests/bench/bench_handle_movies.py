"""Benchmark: checking movies with handles (surfaces in M_r x I and the boundary sums).

Run: python tests/bench/bench_handle_movies.py [--rounds N]   (writes tests/bench/results/handle_movies.md)

Times ``check_movie`` (replay, the gates carried and checked at every step, and the S³
inequalities for k = -2 ... 2) on every bundled movie with handles, and on a 30-step movie with
two handles made here from seeded random walks of steps (off the strands through the gates, and
on them too). Median of N
rounds each, measured in one run.
"""

from __future__ import annotations

import argparse
import os
import platform
import random
import sys
from datetime import date
from pathlib import Path

from movies.checker.replay import check_movie
from movies.diagram.handles import handle_diagram
from movies.language.movie import parse_movie
from movies.language.spec import parse_diagram

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))
from support.handles import median_time, random_steps  # noqa: E402  (the tests' random steps)

ROOT = Path(__file__).resolve().parents[2]
RESULTS = Path(__file__).resolve().parent / "results" / "handle_movies.md"
START = "L4a1{1}"  # both components through both handles, each once each way: across edges 2 6 and 4 8


def thirty_step_movie(seed: int = 30, on_gates: bool = False) -> str:
    """A movie of 30 steps of a two-component link with two handles (with ``on_gates``, steps on
    the strands through the handles too)."""
    link = handle_diagram(parse_diagram(START), [([2, 6], None), ([4, 8], None)])
    records, _ = random_steps(link, random.Random(seed), 30, most_crossings=20, tries=200, on_gates=on_gates)
    return "\n".join([f"start {START} with handle across 2 6 and handle across 4 8"] + [str(r) for r in records])


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rounds", type=int, default=3)
    args = parser.parse_args()
    cases = {}
    for path in sorted((ROOT / "examples" / "movies").glob("*.movie")):
        text = path.read_text()
        if parse_movie(text).handles is not None:
            cases[path.stem] = text
    cases["30 steps, two handles, off the gates' strands (generated)"] = thirty_step_movie()
    cases["30 steps, two handles, on the gates' strands too (generated)"] = thirty_step_movie(on_gates=True)
    lines = ["# Checking movies with handles", "",
             f"{date.today()}, {os.cpu_count()} cores, Python {platform.python_version()}. "
             f"Median of {args.rounds} runs; each check replays every step, carries and checks the gates, and "
             "computes s of both ends (and their mirrors) for k = -2 ... 2.", "",
             "| movie | steps | verdict | median time (s) |", "|---|---|---|---|"]
    for name, text in cases.items():
        seconds, result = median_time(lambda: check_movie(text), args.rounds)
        lines.append(f"| {name} | {len(result.steps)} | {result.verdict} | {seconds:.3f} |")
        print(lines[-1], flush=True)
    RESULTS.write_text("\n".join(lines) + "\n", encoding="utf-8")
    return 0


if __name__ == "__main__":
    sys.exit(main())
