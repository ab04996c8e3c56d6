"""Benchmark: how much consecutive frames of the example movies' reports move.

Run: python tests/bench/bench_continuity.py   (writes tests/bench/results/continuity.md)

For every example movie with crossings shared by consecutive frames: the mean, over pairs of
consecutive frames, of the mean distance the shared crossings move, as a fraction of the
drawing's width, read back from the SVGs of the HTML report (the crossing point is where the
over-strand's two edges meet). Across an isotopy claim no crossing is shared: the frame after it
is the diagram the claim names, whose crossings are its own whatever their names. Side by side
in one run: the report as it is (the frame after a band drawn from the frame before with the
band's sides as new strands, every other frame laid out anchored to the frame before, then turned
and settled toward it), each frame laid out alone and then turned and settled, and every frame
laid out afresh. Goal: under 0.05 for every example movie.
"""

from __future__ import annotations

import os
import platform
import sys
from datetime import date
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT / "tests"))

from draw.test_continuity import _mean_displacement  # noqa: E402
import movies.draw.frames as frames_module  # noqa: E402
import movies.draw.layout as layout_module  # noqa: E402

RESULTS = Path(__file__).resolve().parent / "results" / "continuity.md"


def main() -> int:
    names = [path.stem for path in sorted((ROOT / "examples" / "movies").glob("*.movie"))]
    rows = []
    for name in names:
        try:
            kept = _mean_displacement(name)
        except ValueError:  # statistics.StatisticsError: no two consecutive frames share a crossing
            continue
        aligned, settled, layout = layout_module.aligned, layout_module.settled, layout_module.layout
        band_layout = frames_module.band_layout
        frames_module.band_layout = lambda *args: None
        layout_module.aligned = lambda lay, previous: lay
        layout_module.settled = lambda diagram, lay, previous: lay
        try:
            layout_module.layout = lambda diagram, previous=None: layout(diagram)
            fresh = _mean_displacement(name)
            layout_module.aligned, layout_module.settled = aligned, settled
            turned = _mean_displacement(name)  # each frame laid out alone, then turned and settled
        finally:
            layout_module.aligned, layout_module.settled, layout_module.layout = aligned, settled, layout
            frames_module.band_layout = band_layout
        rows.append((name, kept, turned, fresh))
    lines = ["# Continuity of the frames in the reports of the example movies", "",
             f"{date.today()}, {os.cpu_count()} cores, Python {platform.python_version()}. Mean move of the crossings "
             "shared by consecutive frames, as a fraction of the drawing's width, read back from the SVGs.", "",
             "| movie | as drawn (from the frame before) | laid out alone, turned and settled | "
             "laid out afresh | under 0.05 |", "|---|---|---|---|---|"]
    for name, kept, turned, fresh in rows:
        lines.append(f"| {name} | {kept:.3f} | {turned:.3f} | {fresh:.3f} | {'yes' if kept < 0.05 else 'no'} |")
    met = sum(kept < 0.05 for _, kept, _, _ in rows)
    lines += ["", f"Goal: under 0.05 for every example movie; met by {met} of {len(rows)}."]
    RESULTS.write_text("\n".join(lines) + "\n", encoding="utf-8")
    print("\n".join(lines))
    return 0


if __name__ == "__main__":
    sys.exit(main())
