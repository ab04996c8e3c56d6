"""Benchmark: how many knots of the table get their 4-genus certified.

Run: python tests/bench/bench_four_genus.py [--most-crossings N] [--budget SECONDS] [--batch]
     (writes tests/bench/results/four_genus.md; with --batch through movies batch, resumable)

For every nontrivial knot up to N crossings: the best lower bound from s over Q and F2, the
signature and Levine–Tristram signatures (the Fox–Milnor test rules out genus 0 too); then a
verified movie from the searches (a ribbon disk when the bound is 0 and the determinant a square,
else the least genus the band-pair search finds). Certified: the movie's genus equals the bound.
Disagreements with KnotInfo's smooth_four_genus column (a bound above it, or a verified surface
below it) must be 0. Goal (at 12 crossings): at least 85% certified.
"""

from __future__ import annotations

import argparse
import math
import os
import platform
import statistics
import sys
import time
from datetime import date
from pathlib import Path

from movies.bounds.inequalities import best_genus_bound
from movies.bounds.verdicts import knot_genus_bounds
from movies.checker.genus import find_surface
from movies.checker.ribbon import find_ribbon_disk
from movies.diagram.tables import table_names, table_row
from movies.invariants.alexander import determinant
from movies.language.spec import parse_diagram

RESULTS = Path(__file__).resolve().parent / "results" / "four_genus.md"


def table_genus(text: str):
    """KnotInfo's smooth_four_genus: an integer, or a range [a,b] read as (a, b)."""
    text = (text or "").strip()
    if text.startswith("["):
        low, high = text.strip("[]").split(",")
        return int(low), int(high)
    return (int(text), int(text)) if text else None


def from_batch(args) -> int:
    """The same count through ``movies batch`` (task find-surface, which looks for a ribbon disk first
    where no bound rules one out), resumable: the results database stays in tests/bench/results
    (not in the repository), and running this again goes on where it stopped."""
    import json
    import sqlite3
    import subprocess

    db = RESULTS.with_suffix(".sqlite")
    subprocess.run([sys.executable, "-m", "movies", "batch", "run", "--knots", f"3-{args.most_crossings}",
                    "--task", "find-surface", "--budget", f"{args.budget:g}", "--time-limit",
                    f"{3 * args.budget:g}", "--db", str(db), "--workers", str(args.workers)], check=True)
    with sqlite3.connect(db) as connection:
        rows = connection.execute("SELECT item, status, result, milliseconds FROM results WHERE task = "
                                  "'find-surface' ORDER BY position").fetchall()
    names = table_names("knot", max_crossings=args.most_crossings)[1:]
    by_name = {item: (status, json.loads(result) if result else None, ms) for item, status, result, ms in rows}
    certified, disagreements, times, open_, methods = 0, [], [], [], {}
    for name in names:
        status, result, ms = by_name[name]
        times.append(ms / 1000)
        bound = result["best_lower_bound"] if result else None
        genus = result["genus"] if result else None
        # KnotInfo column smooth_four_genus (an integer, or a range where it is not known)
        table = table_genus(table_row(name).get("smooth_four_genus"))
        if table is not None and ((bound is not None and bound > table[1]) or (genus is not None and genus < table[0])):
            disagreements.append(f"{name}: bound {bound}, surface {genus}, table {table}")
        if result and result.get("four_genus_certified") is not None:
            certified += 1
            title = (result.get("movie") or "").splitlines()[0]
            how = ("crossing changes, then Seifert's algorithm or a ribbon disk"
                   if "Seifert's algorithm" in title or "crossing change" in title
                   else "the ribbon search" if title.startswith("title a ribbon disk") else "the band search")
            methods[how] = methods.get(how, 0) + 1
        else:
            open_.append(f"{name} ({status}; bound {bound}, surface {genus}, table {table})")
    write(args, names, certified, disagreements, times, open_, "movies batch, task find-surface", methods)
    return 0


def write(args, names, certified, disagreements, times, open_, how: str, methods: dict | None = None) -> None:
    ordered = sorted(times)
    lines = ["# 4-genus certified by a verified movie and an invariant bound", "",
             f"{date.today()}, {os.cpu_count()} cores, Python {platform.python_version()}. Every nontrivial knot "
             f"up to {args.most_crossings} crossings; budget {args.budget:g} s for each search ({how}).", "",
             "| knots | certified | fraction | disagreements with smooth_four_genus | median time (s) | "
             "90th percentile (s) |", "|---|---|---|---|---|---|",
             f"| {len(names)} | {certified} | {certified / len(names):.1%} | {len(disagreements)} | "
             f"{statistics.median(times):.2f} | {ordered[min(len(ordered) - 1, int(0.9 * len(ordered)))]:.2f} |", ""]
    if methods:
        lines += ["Certified by: " + "; ".join(f"{how} {count}" for how, count in sorted(methods.items())), ""]
    lines += ["Disagreements:", ""] + [f"- {d}" for d in disagreements] if disagreements else ["Disagreements: none."]
    lines += ["", f"Not certified ({len(open_)}):", ""] + [f"- {x}" for x in open_]
    RESULTS.write_text("\n".join(lines) + "\n", encoding="utf-8")
    print("\n".join(lines[:8]))


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--most-crossings", type=int, default=12)
    parser.add_argument("--budget", type=float, default=60.0)
    parser.add_argument("--batch", action="store_true", help="run through movies batch (resumable)")
    parser.add_argument("--workers", type=int, default=2, help="with --batch: local workers")
    args = parser.parse_args()
    if args.batch:
        return from_batch(args)
    names = table_names("knot", max_crossings=args.most_crossings)[1:]
    certified, disagreements, times, rows = 0, [], [], []
    for name in names:
        started = time.perf_counter()
        knot = parse_diagram(name)
        bound = best_genus_bound(knot_genus_bounds(knot)).bound
        det = abs(determinant(knot))
        if bound == 0 and math.isqrt(det) ** 2 != det:
            bound = 1  # Fox–Milnor: not slice
        if bound == 0:
            found = find_ribbon_disk(name, budget=args.budget)
            genus = 0 if found.verdict == "verified" else None
        else:
            found = find_surface(name, budget=args.budget)
            genus = found.genus if found.verdict == "verified" else None
        times.append(time.perf_counter() - started)
        # KnotInfo column smooth_four_genus (an integer, or a range where it is not known)
        table = table_genus(table_row(name).get("smooth_four_genus"))
        if table is not None and (bound > table[1] or (genus is not None and genus < table[0])):
            disagreements.append(f"{name}: bound {bound}, surface {genus}, table {table}")
        if genus is not None and genus == bound:
            certified += 1
        rows.append((name, bound, genus, table))
        print(name, bound, genus, table, f"{times[-1]:.1f}s", flush=True)
    open_ = [f"{n} (bound {b}, surface {g}, table {t})" for n, b, g, t in rows if g is None or g != b]
    write(args, names, certified, disagreements, times, open_, "one search after another, in this process")
    return 0


if __name__ == "__main__":
    sys.exit(main())
