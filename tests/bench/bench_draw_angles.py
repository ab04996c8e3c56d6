"""Benchmark: how open the crossings are drawn, and label overlaps, over the tables.

Run: python tests/bench/bench_draw_angles.py [--step N] [--workers W] [--compare]
     (writes tests/bench/results/draw_angles.md)

For every knot up to 12 crossings and every link up to 11 (every N-th with ``--step``): the
smallest crossing angle of the default drawing, read back from the SVG
(tests/draw/readback.py: the chord across the under-strand's gap against the over-strand
between points three gaps away), and whether any two labels overlap in the labelled drawing.
With ``--compare``, the same with the crossings' opening turned off (``OPENING = 0``).
Goals (issue: readable pictures): smallest angle at least 30 degrees in at least 99% of diagrams;
no label overlaps.
"""

from __future__ import annotations

import argparse
import multiprocessing
import os
import platform
import statistics
import sys
import time
from datetime import date
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT / "tests"))

from draw.readback import check_drawing, crossing_angles  # noqa: E402
from draw.test_labels import _labels, _overlapping  # noqa: E402
from movies.diagram.tables import table_names  # noqa: E402
from movies.draw import layout as layout_module  # noqa: E402
from movies.draw.svg import diagram_svg  # noqa: E402
from movies.language.spec import parse_diagram  # noqa: E402

RESULTS = Path(__file__).resolve().parent / "results" / "draw_angles.md"


def _opening(value: float) -> None:
    layout_module.OPENING = value


def one(name: str):
    """(smallest angle, labels overlap, why it does not read back or None, seconds, drawn as a
    closed braid, why the labelled drawing does not read back or None) for one table diagram;
    None for a crossingless one."""
    d = parse_diagram(name)
    if not d.crossings:
        return None
    started = time.perf_counter()
    text = diagram_svg(d)
    seconds = time.perf_counter() - started
    try:
        check_drawing(d, text)
        wrong = None
    except AssertionError as err:
        wrong = f"{name}: {err}"
    labelled = diagram_svg(d, labels=True)
    crowded = bool(_overlapping(_labels(labelled)[0]))
    try:  # the labelled drawing read back too: every face's name inside its face
        check_drawing(d, labelled)
        astray = None
    except AssertionError as err:
        astray = f"{name}: {err}"
    return min(crossing_angles(d, text).values()), crowded, wrong, seconds, layout_module.layout(d).braid, astray


def measure(names, opening: float, workers: int):
    with multiprocessing.Pool(workers, initializer=_opening, initargs=(opening,)) as pool:
        results = pool.map(one, names, chunksize=16)
    smallest, crowded, wrong, seconds, braids, astray = [], [], [], [], 0, []
    for name, result in zip(names, results):
        if result is None:
            continue
        angle, overlap, why, took, braid, named = result
        astray += [named] if named else []
        smallest.append((angle, name))
        crowded += [name] if overlap else []
        wrong += [why] if why else []
        seconds.append(took)
        braids += braid
    return smallest, crowded, wrong, seconds, braids, astray


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--step", type=int, default=1)
    parser.add_argument("--workers", type=int, default=2)
    parser.add_argument("--compare", action="store_true", help="also draw everything with the opening off")
    args = parser.parse_args()
    names = (table_names("knot", 12)[1:] + table_names("link", 11))[::args.step]
    default = layout_module.OPENING
    rows = {}
    runs = [("crossings opened (default)", default)] + ([("opening off (before)", 0.0)] if args.compare else [])
    for label, opening in runs:
        rows[label] = measure(names, opening, args.workers)
        print(label, "done", flush=True)
    layout_module.OPENING = default
    lines = ["# Crossing angles and label overlaps over the tables", "",
             f"{date.today()}, {os.cpu_count()} cores, Python {platform.python_version()}. Every "
             f"{'' if args.step == 1 else f'{args.step}-th '}knot up to 12 crossings and link up to 11 "
             f"({len(names)} diagrams); angles read back from the SVG.", "",
             "| drawing | diagrams | smallest angle ≥ 30° | median of the smallest angle | lowest | "
             "with a label overlap | drawings that do not read back | labelled drawings that do not read back | "
             "drawn as closed braids |",
             "|---|---|---|---|---|---|---|---|---|"]
    for label, (smallest, crowded, wrong, seconds, braids, astray) in rows.items():
        values = [a for a, _ in smallest]
        low = min(smallest)
        lines.append(f"| {label} | {len(values)} | {sum(a >= 30 for a in values) / len(values):.1%} | "
                     f"{statistics.median(values):.1f}° | {low[0]:.1f}° ({low[1]}) | "
                     f"{len(crowded)} ({len(crowded) / len(values):.1%}) | {len(wrong)} | {len(astray)} | {braids} |")
    smallest = rows["crossings opened (default)"][0]
    lines += ["", "Goals: at least 99% with the smallest angle at least 30°; no label overlaps. (Drawing times are "
              "in results/draw.md.)", ""]
    for label, (_, crowded, wrong, _, _, astray) in rows.items():
        lines += [f"Not read back ({label}): " + ("; ".join(wrong) if wrong else "none"), ""]
        lines += [f"Labelled drawings not read back ({label}; a face's name outside its face, where the face "
                  "is too small for it): " + ("; ".join(astray) if astray else "none"), ""]
        lines += [f"Label overlaps ({label}): " + (", ".join(crowded) if crowded else "none"), ""]
    under = [f"{n} {a:.0f}°" for a, n in sorted(smallest) if a < 30]
    lines += [f"Under 30° with the opening on ({len(under)}): " + (", ".join(under) if under else "none")]
    RESULTS.write_text("\n".join(lines) + "\n", encoding="utf-8")
    print("\n".join(lines))
    return 0


if __name__ == "__main__":
    sys.exit(main())
