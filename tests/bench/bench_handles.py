"""Benchmark: s of links in connected sums of S¹×S² from their twisted approximations.

Run: python tests/bench/bench_handles.py [--rounds N]   (writes tests/bench/results/handles.md)

For each bundled example (examples/diagrams/*.txt with handles) and for the fibers F(p, p):
the time to compute s(L(k)) over Q and F2 for |k| up to 2 and to judge the limits, median of
N runs; and for the fibers F(p, p) the whole sequence L(0), L(1), L(2) in a fresh process (one
scan for the family, movies.homology.families) with its peak memory, beside each approximation
scanned alone. Goals: every example in under 60 s; F(3, 3) through k = 2 (60 crossings) in under
5 minutes and 4 GB.
"""

from __future__ import annotations

import argparse
import os
import platform
import subprocess
import sys
from datetime import date
from pathlib import Path

from movies.diagram.handles import fibers, twisted
from movies.homology.approximations import s_of_handles
from movies.language.spec import parse_handle_diagram

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))
from support.handles import median_time  # noqa: E402

ROOT = Path(__file__).resolve().parents[2]
RESULTS = Path(__file__).resolve().parent / "results" / "handles.md"


CHILD = """
import resource, time
from movies.diagram.handles import fibers, twisted
from movies.homology.families import family_s
from movies.homology.links import link_s_values
started = time.perf_counter()
value = {call}
print(repr((value, time.perf_counter() - started, resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024)))
"""


def _child(call: str):
    """(value, seconds, peak MB) of one call in a fresh process."""
    import ast

    out = subprocess.run([sys.executable, "-c", CHILD.format(call=call)], capture_output=True, text=True, check=True)
    return ast.literal_eval(out.stdout.strip())


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rounds", type=int, default=3)
    parser.add_argument("--largest", type=int, default=3, help="the largest p of F(p, p)")
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
    lines += ["", "| F(p, p) | k = 0..2, crossings of L(2) | s(L(0)), s(L(1)), s(L(2)) over Q (= F2) | "
              "the family, one scan, fresh process | peak memory | L(2) alone, fresh process |", "|---|---|---|---|---|---|"]
    for p in range(1, args.largest + 1):
        family = _child(f"family_s(fibers({p}, {p}), 2, ('Q', 'F2'))")
        alone = _child(f"link_s_values(twisted(fibers({p}, {p}), 2), ['Q', 'F2'])")
        values, seconds, megabytes = family
        # the note (handles.md, derived from Ren's inequality and annuli): s(F(p, p)(k)) = 1 - 2p
        if any(v != {"Q": 1 - 2 * p, "F2": 1 - 2 * p} for v in values.values()) or alone[0] != values[2]:
            raise SystemExit(f"F({p}, {p}): {values}, L(2) alone {alone[0]}")
        lines.append(f"| F({p}, {p}) | {twisted(fibers(p, p), 2).crossing_count()} | "
                     f"{', '.join(str(values[k]['Q']) for k in (0, 1, 2))} | {seconds:.2f} s | {megabytes:.0f} MB | "
                     f"{alone[1]:.2f} s |")
        print(lines[-1], file=sys.stderr)
    RESULTS.write_text("\n".join(lines) + "\n")
    print("\n".join(lines))
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
