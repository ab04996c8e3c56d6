"""Benchmark: drawing diagrams and writing the HTML report of a movie.

Run: python tests/bench/bench_draw.py   (writes tests/bench/results/draw.md)

Measured, each the median of repeated runs:
- drawing a 50-crossing diagram (closures of random 5-strand braid words, fixed seeds) as SVG,
  and a 100-crossing one (8 strands) with and without labels
  with labels (goal: under 2 s);
- the HTML report of a 40-step movie of random legal moves (goal: under 10 s), the checking
  of the movie itself timed apart;
- the full sweep of the read-back check (tests/draw/readback.py) over every knot of the tables
  up to 10 crossings: how many drawings show their diagram, how many with every gap visible.
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

HERE = Path(__file__).resolve().parent
sys.path.insert(0, str(HERE.parent))  # tests/, for draw.readback and draw.randomized

from draw.randomized import random_movie  # noqa: E402
from draw.readback import check_drawing  # noqa: E402

from movies.checker.replay import check_movie  # noqa: E402
from movies.diagram.constructors import from_braid  # noqa: E402
from movies.diagram.tables import table_names  # noqa: E402
from movies.draw import diagram_svg  # noqa: E402
from movies.report import movie_html  # noqa: E402
from movies.language.movie import parse_movie  # noqa: E402
from movies.language.spec import parse_diagram  # noqa: E402

RESULTS = HERE / "results" / "draw.md"


def timed(action, runs: int) -> tuple[float, float]:
    times = []
    for _ in range(runs):
        started = time.perf_counter()
        action()
        times.append(time.perf_counter() - started)
    return statistics.median(times), min(times)


def main() -> int:
    lines = [
        "# Drawing diagrams and movie reports",
        "",
        f"{date.today()}, {os.cpu_count()} cores, Python {platform.python_version()}. Medians of repeated runs.",
        "",
        "## A 50-crossing diagram as SVG (goal: under 2 s)",
        "",
        "| diagram | crossings | median (s) | fastest (s) | drawing reads back |",
        "|---|---|---|---|---|",
    ]
    ok = True
    for seed in (1, 2, 3):
        rng = random.Random(seed)
        word = [rng.choice([1, -1]) * rng.randint(1, 4) for _ in range(50)]
        diagram = from_braid(word, strands=5)
        median, fastest = timed(lambda: diagram_svg(diagram, labels=True), 5)
        try:
            check_drawing(diagram, diagram_svg(diagram, labels=True), visible=False)
            reads = "yes"
        except AssertionError as err:
            reads = f"no: {err}"
        lines.append(f"| braid closure, seed {seed} | {diagram.crossing_count()} | {median:.3f} | {fastest:.3f} | {reads} |")
        ok &= median < 2.0
    lines += ["", "## A 100-crossing diagram as SVG, without and with labels (goal: under 1 s)", "",
              "| diagram | crossings | median (s) | with labels, median (s) | drawing reads back |", "|---|---|---|---|---|"]
    for seed in (1, 2, 3):
        rng = random.Random(seed)
        diagram = from_braid([rng.choice([1, -1]) * rng.randint(1, 7) for _ in range(100)], strands=8)
        plain, _ = timed(lambda: diagram_svg(diagram), 5)
        labelled, _ = timed(lambda: diagram_svg(diagram, labels=True), 5)
        try:
            check_drawing(diagram, diagram_svg(diagram), visible=False)
            reads = "yes"
        except AssertionError as err:
            reads = f"no: {err}"
        lines.append(f"| braid closure, seed {seed} | {diagram.crossing_count()} | {plain:.3f} | {labelled:.3f} | {reads} |")
    lines += ["", "## The HTML report of a 40-step movie (goal: under 10 s)", "",
              "| seed | steps | frames | most crossings | checking (s) | report (s) | page size (kB) |",
              "|---|---|---|---|---|---|---|"]
    for seed in (1, 2):
        text, frames = random_movie(seed, steps=40, crossings=15)
        result = check_movie(parse_movie(text))
        checking, _ = timed(lambda: check_movie(parse_movie(text)), 3)
        page = movie_html(result)
        median, _ = timed(lambda: movie_html(result), 3)
        lines.append(f"| {seed} | {len(result.steps)} | {len(result.frames)} | {max(f.crossing_count() for f in result.frames)} "
                     f"| {checking:.2f} | {median:.2f} | {len(page.encode()) / 1024:.0f} |")
        ok &= median < 10.0
    names = table_names("knot", max_crossings=10)
    started = time.perf_counter()
    shown = visible = 0
    failures = []
    for name in names:
        diagram = parse_diagram(name)
        text = diagram_svg(diagram, labels=True)
        try:
            check_drawing(diagram, text, visible=False)
            shown += 1
        except AssertionError as err:
            failures.append(f"{name}: {err}")
            continue
        try:
            check_drawing(diagram, text, visible=True)
            visible += 1
        except AssertionError:
            pass
    sweep = time.perf_counter() - started
    lines += ["", "## Read-back sweep over the knot table up to 10 crossings", "",
              "KnotInfo PD codes (database-knotinfo, column pd_notation), every knot from 0_1 to 10_165.", "",
              "| knots | drawings that show their diagram | with every gap visible | time (s) |", "|---|---|---|---|",
              f"| {len(names)} | {shown} | {visible} | {sweep:.1f} |"]
    if failures:
        lines += ["", "Failures:", ""] + [f"- {f}" for f in failures]
    RESULTS.write_text("\n".join(lines) + "\n")
    print("\n".join(lines))
    return 0 if ok and not failures else 3


if __name__ == "__main__":
    raise SystemExit(main())
