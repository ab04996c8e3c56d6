"""Benchmark of the Reidemeister move search (run as ``python tests/bench/bench_simplify.py``).

Measures, in one run, each case with the default budget (``Budget()``):
  * 30-crossing unknot diagrams made by random legal moves (R1+, R2+, R3) from one circle,
    several fixed seeds: how often ``simplify(d, "crossingless")`` gets there, median time,
    median moves applied; how many needed the search (an R3 or an R2 addition) rather than
    greedy removals alone;
  * ``certify_isotopy`` from table knots of 8 to 10 crossings, scrambled by random moves to
    12 crossings more, back to the table diagram: success rate, median time;
  * the same pairs the other way round (from the table diagram to the scrambled one);
  * the same, scrambled harder (20 crossings more, more R3 moves), one seed per knot;
  * how long a call takes to give up: ``simplify(d, "fewest")`` on the table diagrams (which
    have as few crossings as the knot allows, so the search cannot succeed) and
    ``certify_isotopy`` from each table knot to its mirror image.
Every certificate found is replayed and renamed, and must give the second diagram exactly
(exit status 1 if one does not). Writes tests/bench/results/simplify.md.
"""

from __future__ import annotations

import datetime
import os
import platform
import statistics
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT))

from movies.diagram.constructors import mirror, unknot  # noqa: E402
from movies.diagram.isotopy import reflect_and_switch  # noqa: E402
from movies.diagram.simplify import Budget, certify_isotopy, rename, replay, scramble, simplify  # noqa: E402
from movies.language.spec import parse_diagram  # noqa: E402

RESULTS = Path(__file__).resolve().parent / "results" / "simplify.md"
UNKNOT_SEEDS = range(10)
KNOTS = ["8_1", "8_5", "8_10", "8_17", "8_19", "8_20", "9_1", "9_24", "9_35", "9_42", "9_46",
         "10_1", "10_82", "10_124", "10_132", "10_161"]
KNOT_SEEDS = range(2)
EXTRA = 12
HARD_EXTRA = 20


def timed(fn, *args, **kwargs):
    start = time.perf_counter()
    result = fn(*args, **kwargs)
    return time.perf_counter() - start, result


def fmt(seconds: float) -> str:
    return f"{seconds:.2f} s" if seconds >= 1 else f"{1000 * seconds:.0f} ms"


def unknot_rows():
    rows = []
    for seed in UNKNOT_SEEDS:
        d, _ = scramble(unknot(), 30, seed, weights=(1, 3, 3), shuffles=40, hide=10)
        dt, result = timed(simplify, d, "crossingless")
        if replay(result.moves, d) != result.diagram:
            raise SystemExit(f"unknot seed {seed}: the moves do not replay to the end diagram")
        searched = any(m.kind in ("R3", "R2+") for m in result.moves)
        rows.append((seed, d.crossing_count(), result.reached, dt, result.explored, len(result.moves), searched,
                     result.diagram.crossing_count()))
        print("unknot", rows[-1], flush=True)
    return rows


def check(cert, first, second, label):
    end = replay(cert.moves, first)
    expected = reflect_and_switch(second) if cert.reflected else second
    if end != cert.end or rename(end, cert.names) != expected:
        raise SystemExit(f"{label}: the certificate does not replay to the second diagram")


def knot_rows(extra=EXTRA, seeds=KNOT_SEEDS, shuffles=10, hide=4):
    rows = []
    for name in KNOTS:
        start = parse_diagram(name)
        for seed in seeds:
            d, _ = scramble(start, start.crossing_count() + extra, seed, weights=(1, 3, 3), shuffles=shuffles,
                            hide=hide)
            entry = [name, seed, d.crossing_count()]
            for first, second in ((d, start), (start, d)):
                dt, cert = timed(certify_isotopy, first, second)
                if cert is not None:
                    check(cert, first, second, f"{name} seed {seed}")
                entry += [cert is not None, dt, cert.explored if cert else None, len(cert.moves) if cert else None,
                          cert.reflected if cert else None]
            rows.append(tuple(entry))
            print("knot", rows[-1], flush=True)
    return rows


def give_up_rows():
    rows = []
    for name in KNOTS:
        start = parse_diagram(name)
        dt_fewest, result = timed(simplify, start, "fewest")
        if result.diagram.crossing_count() < start.crossing_count():
            raise SystemExit(f"{name}: fewer crossings than the crossing number")
        dt_mirror, cert = timed(certify_isotopy, start, mirror(start))
        rows.append((name, dt_fewest, result.explored, result.stopped, dt_mirror, cert is None))
        print("give up", rows[-1], flush=True)
    return rows


def knot_section(lines, knots, title, note):
    lines.append(title)
    lines.append("")
    lines.append(note)
    lines.append("")
    forward = [(r[3], r[4]) for r in knots]
    backward = [(r[8], r[9]) for r in knots]
    for label, pairs in (("scrambled -> table", forward), ("table -> scrambled", backward)):
        wins = [dt for found, dt in pairs if found]
        lines.append(f"- {label}: certified {len(wins)}/{len(pairs)}; median time {fmt(statistics.median(dt for _, dt in pairs))}"
                     + (f", median over the successes {fmt(statistics.median(wins))}" if wins else ""))
    lines.append("")
    lines.append("| knot | seed | crossings | certified | time | applied | moves | reflected | back: certified | time | applied | moves | reflected |")
    lines.append("| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |")
    for r in knots:
        lines.append("| " + " | ".join(fmt(x) if isinstance(x, float) else ("-" if x is None else str(x)) for x in r) + " |")
    lines.append("")


def main() -> None:
    budget = Budget()
    unknots = unknot_rows()
    knots = knot_rows()
    hard = knot_rows(HARD_EXTRA, range(1), shuffles=40, hide=8)
    give_up = give_up_rows()
    lines = ["# Reidemeister move search benchmark", ""]
    when = datetime.datetime.now(datetime.timezone.utc).strftime("%Y-%m-%d %H:%M UTC")
    lines.append(f"Run {when} on {os.cpu_count()} cores, Python {platform.python_version()} "
                 f"({platform.machine()}). Produced by `python tests/bench/bench_simplify.py`; times are wall "
                 f"clock, one process, on a machine shared with other jobs. Default budget: {budget.moves} moves "
                 f"applied, {budget.seconds:.0f} s cap.")
    lines.append("")
    lines.append("## 30-crossing unknot diagrams, `simplify(d, \"crossingless\")`")
    lines.append("")
    lines.append("Made by `scramble(unknot(), 30, seed, weights=(1, 3, 3), shuffles=40, hide=10)`: random R1+, "
                 "R2+ and R3 moves, each the one of 10 random draws that leaves the fewest removals, then 40 R3 moves.")
    lines.append("")
    ok = [r for r in unknots if r[2]]
    lines.append(f"- reached crossingless: {len(ok)}/{len(unknots)}")
    lines.append(f"- median time: {fmt(statistics.median(r[3] for r in unknots))} "
                 f"(slowest {fmt(max(r[3] for r in unknots))})")
    lines.append(f"- median moves applied (search included): {statistics.median(r[4] for r in unknots):.0f}; "
                 f"median moves recorded: {statistics.median(r[5] for r in unknots):.0f}")
    lines.append(f"- needed the search (an R3 or an R2 addition in the moves): {sum(r[6] for r in unknots)}/{len(unknots)}")
    lines.append("")
    lines.append("| seed | crossings | reached | time | applied | recorded | searched | end crossings |")
    lines.append("| --- | --- | --- | --- | --- | --- | --- | --- |")
    for seed, n, reached, dt, applied, recorded, searched, end in unknots:
        lines.append(f"| {seed} | {n} | {reached} | {fmt(dt)} | {applied} | {recorded} | {searched} | {end} |")
    lines.append("")
    knot_section(lines, knots, f"## `certify_isotopy` on scrambled table knots (8-10 crossings, +{EXTRA} crossings)",
                 f"Knots {', '.join(KNOTS)}; seeds {list(KNOT_SEEDS)}; "
                 f"`scramble(table, crossings + {EXTRA}, seed, weights=(1, 3, 3), shuffles=10, hide=4)`. "
                 "Each certificate found was replayed and renamed into the second diagram exactly.")
    knot_section(lines, hard, f"## The same, scrambled harder (+{HARD_EXTRA} crossings)",
                 f"Seed 0; `scramble(table, crossings + {HARD_EXTRA}, 0, weights=(1, 3, 3), shuffles=40, hide=8)`.")
    lines.append("## Giving up")
    lines.append("")
    lines.append("`simplify(table diagram, \"fewest\")` cannot find fewer crossings (KnotInfo column crossing_number "
                 "is the table diagram's count), so it runs until the budget or the bounded search space is spent; "
                 "`certify_isotopy(table, mirror(table))` returns None when it gives up (None says nothing about "
                 "isotopy; for a knot isotopic to its mirror image a certificate could be found).")
    lines.append("")
    lines.append(f"- simplify \"fewest\": median time to give up {fmt(statistics.median(r[1] for r in give_up))} "
                 f"(slowest {fmt(max(r[1] for r in give_up))})")
    lines.append(f"- certify to the mirror: median time to give up {fmt(statistics.median(r[4] for r in give_up))} "
                 f"(slowest {fmt(max(r[4] for r in give_up))}); gave up {sum(r[5] for r in give_up)}/{len(give_up)}")
    lines.append("")
    lines.append("| knot | fewest: time | applied | stopped | mirror: time | gave up |")
    lines.append("| --- | --- | --- | --- | --- | --- |")
    for r in give_up:
        lines.append("| " + " | ".join(fmt(x) if isinstance(x, float) else str(x) for x in r) + " |")
    lines.append("")
    RESULTS.write_text("\n".join(lines))
    print(RESULTS.read_text())


if __name__ == "__main__":
    main()
