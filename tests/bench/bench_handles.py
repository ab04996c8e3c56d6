"""Benchmark: s of links in connected sums of S¹×S² from their twisted approximations.

Run: python tests/bench/bench_handles.py [--rounds N]   (writes tests/bench/results/handles.md)

For each bundled example (examples/diagrams/*.txt with handles) and for the fibers F(p, p):
the time to compute s(L(k)) over Q and F2 for |k| up to 2 and to judge the limits, median of
N runs, and the time of each single approximation L(k) for F(p, p). Goals: every example in
under 60 s; F(3, 3) through k = 2 (60 crossings) in under 5 minutes.
"""

from __future__ import annotations

import argparse
import os
import platform
import sys
from datetime import date
from pathlib import Path

from movies.diagram.handles import fibers, twisted
from movies.homology.approximations import s_of_handles
from movies.homology.links import link_s_values
from movies.language.spec import parse_handle_diagram

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))
from support.handles import median_time  # noqa: E402

ROOT = Path(__file__).resolve().parents[2]
RESULTS = Path(__file__).resolve().parent / "results" / "handles.md"


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rounds", type=int, default=3)
    parser.add_argument("--largest", type=int, default=3, help="the largest p of F(p, p)")
    parser.add_argument("--most-crossings", type=int, default=40,
                        help="approximations with more crossings are listed as not run (F(3, 3) at k = 2 has 60)")
    args = parser.parse_args()
    lines = [
        "# s of links in connected sums of S¹×S²",
        "",
        f"{date.today()}, {os.cpu_count()} cores, Python {platform.python_version()}. Median of {args.rounds} runs.",
        "",
        "| link | handles | |k| up to | s+ over Q | s- over Q | median time (s) |",
        "|---|---|---|---|---|---|",
    ]
    for path in sorted((ROOT / "examples" / "diagrams").glob("*.txt")):
        text = path.read_text()
        if "with handle" not in text:
            continue
        link = parse_handle_diagram(text)
        seconds, found = median_time(lambda: s_of_handles(link, ("Q", "F2"), most=2), args.rounds)
        q = found["Q"]
        show = lambda limit: str(limit.low) if limit.certified else f"[{limit.low}, {limit.high}]"  # noqa: E731
        lines.append(f"| {path.stem} | {len(link.gates)} | 2 | {show(q.plus)} | {show(q.minus)} | {seconds:.3f} |")
        print(lines[-1], file=sys.stderr)
    lines += ["", "| F(p, p) | k | crossings | s over Q and F2 | median time (s) |", "|---|---|---|---|---|"]
    for p in range(1, args.largest + 1):
        for k in (1, 2):
            diagram = twisted(fibers(p, p), k)
            if diagram.crossing_count() > args.most_crossings:
                lines.append(f"| F({p}, {p}) | {k} | {diagram.crossing_count()} | not run (over --most-crossings "
                             f"{args.most_crossings}) | |")
                continue
            seconds, found = median_time(lambda: link_s_values(diagram, ("Q", "F2")), 1 if diagram.crossing_count() > 40 else args.rounds)
            lines.append(f"| F({p}, {p}) | {k} | {diagram.crossing_count()} | {found['Q']}, {found['F2']} | {seconds:.3f} |")
            print(lines[-1], file=sys.stderr)
    RESULTS.write_text("\n".join(lines) + "\n")
    print("\n".join(lines))
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
