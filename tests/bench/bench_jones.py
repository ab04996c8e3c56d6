"""Benchmark of the scanning Jones polynomial (run as ``python tests/bench/bench_jones.py``).

Measures, in one run:
  * the median time for the 12-crossing knots of KnotInfo (median of several repetitions per knot,
    then the median over the knots), side by side with the plain 2^n state sum on a sample;
  * the total time for the whole KnotInfo table up to 12 crossings and the whole LinkInfo table,
    counting agreements with their jones_polynomial columns (any mismatch fails the run);
  * the torus knot T(7,8) (48 crossings, PD code built here from the braid (s1...s6)^8), checked
    against the torus knot formula;
  * a 60-crossing random braid closure (fixed seed) and a 54-crossing alternating closure;
  * peak memory (tracemalloc) for the two large diagrams.
Writes tests/bench/results/jones.md. Exit status 1 on a wrong result, 3 on a missed goal.
"""

from __future__ import annotations

import ast
import datetime
import os
import platform
import random
import statistics
import sys
import time
import tracemalloc
from fractions import Fraction
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT))

import database_knotinfo  # noqa: E402

from movies.algebra.laurent import LaurentPolynomial as LP  # noqa: E402
from movies.diagram.pd import crossing_signs  # noqa: E402
from movies.invariants.jones import jones_polynomial_pd, kauffman_bracket_pd  # noqa: E402

RESULTS = Path(__file__).resolve().parent / "results" / "jones.md"
GOAL_12 = 0.020  # seconds, median over 12-crossing knots
GOAL_T78 = 2.0  # seconds
REPS_SMALL = 5
REPS_LARGE = 7
TABLE_PASSES = 3
BRUTE_SAMPLE = 8


def braid_closure_pd(word, strands):
    """PD code of a braid closure (strands upwards; +i puts the strand at i over, positive)."""
    cur = list(range(1, strands + 1))
    fresh = strands + 1
    pd = []
    for g in word:
        i = abs(g) - 1
        x, y = cur[i], cur[i + 1]
        x2, y2 = fresh, fresh + 1
        fresh += 2
        pd.append((y, y2, x2, x) if g > 0 else (x, y, y2, x2))
        cur[i], cur[i + 1] = x2, y2
    rename, loops = {}, 0
    for i in range(strands):
        if cur[i] == i + 1:
            loops += 1
        else:
            rename[cur[i]] = i + 1
    return [tuple(rename.get(label, label) for label in c) for c in pd], loops


def state_sum_bracket(pd):
    """The plain 2^n state sum, for the side-by-side ratio (integers only, no scanning)."""
    labels = {label: i for i, label in enumerate(dict.fromkeys(x for c in pd for x in c))}
    rows = [tuple(labels[x] for x in c) for c in pd]
    n, m = len(rows), len(labels)
    counts: dict = {}
    for mask in range(1 << n):
        parent = list(range(m))

        def find(x):
            while parent[x] != x:
                parent[x] = parent[parent[x]]
                x = parent[x]
            return x

        a_count = 0
        for i, (a, b, c, d) in enumerate(rows):
            if mask >> i & 1:
                parent[find(a)] = find(d)
                parent[find(b)] = find(c)
            else:
                parent[find(a)] = find(b)
                parent[find(c)] = find(d)
                a_count += 1
        circles = sum(1 for i in range(m) if find(i) == i)
        key = (2 * a_count - n, circles)
        counts[key] = counts.get(key, 0) + 1
    A = LP.monomial(1, variable="A")
    d = -(A**2) - A**-2
    total = LP(variable="A")
    for (e, circles), k in counts.items():
        total = total + k * A**e * d ** (circles - 1)
    return total


def timed(fn, *args):
    start = time.perf_counter()
    result = fn(*args)
    return time.perf_counter() - start, result


def median_time(fn, args, reps):
    times = []
    result = None
    for _ in range(reps):
        dt, result = timed(fn, *args)
        times.append(dt)
    return statistics.median(times), result


def peak_memory(fn, *args):
    tracemalloc.start()
    tracemalloc.reset_peak()
    fn(*args)
    _, peak = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    return peak


def load_tables():
    knots = database_knotinfo.link_list()
    links = database_knotinfo.link_list(proper_links=True)
    assert knots[0]["name"] == "Name" and links[0]["name"] == "Name"  # header rows
    knot_cases = []
    for row in knots[1:]:
        if int(row["crossing_number"]) > 12:
            continue
        pd = [tuple(c) for c in ast.literal_eval(row["pd_notation"])] if row["pd_notation"] else []
        # KnotInfo column jones_polynomial
        expected = LP.parse(row["jones_polynomial"], "t")
        knot_cases.append((row["name"], int(row["crossing_number"]), pd, expected))
    link_cases = []
    for row in links[1:]:
        text = row["pd_notation_vector"].replace("{", "[").replace("}", "]")
        pd = [tuple(c) for c in ast.literal_eval(text)]
        # LinkInfo column jones_polynomial, with x = t^(1/2)
        expected = LP.parse(row["jones_polynomial"], "x").substitute_power(Fraction(1, 2), "t")
        link_cases.append((row["name"], int(row["crossing_number"]), pd, expected))
    return knot_cases, link_cases


def with_writhes(cases):
    return [(name, n, pd, sum(crossing_signs(pd)) if pd else 0, expected) for name, n, pd, expected in cases]


def jones(pd, w):
    return jones_polynomial_pd(pd, w) if pd else jones_polynomial_pd([], 0, loops=1)


def table_pass(cases):
    mismatches = []
    start = time.perf_counter()
    for name, _, pd, w, expected in cases:
        if jones(pd, w) != expected:
            mismatches.append(name)
    return time.perf_counter() - start, mismatches


def main() -> int:
    knot_cases, link_cases = load_tables()
    knot_cases, link_cases = with_writhes(knot_cases), with_writhes(link_cases)
    failures = []

    # 12-crossing knots: median of REPS_SMALL per knot, median over the knots
    twelve = [c for c in knot_cases if c[1] == 12]
    per_knot = []
    for name, _, pd, w, expected in twelve:
        dt, _ = median_time(jones_polynomial_pd, (pd, w), REPS_SMALL)
        per_knot.append(dt)
    per_knot.sort()
    med12 = statistics.median(per_knot)
    p90 = per_knot[int(0.9 * (len(per_knot) - 1))]
    worst12 = per_knot[-1]

    # side by side with the plain state sum, same knots, alternating
    sample = twelve[:: max(1, len(twelve) // BRUTE_SAMPLE)][:BRUTE_SAMPLE]
    scan_t, brute_t = [], []
    for name, _, pd, w, expected in sample:
        for _ in range(3):
            dt1, b1 = timed(kauffman_bracket_pd, pd)
            dt2, b2 = timed(state_sum_bracket, pd)
            scan_t.append(dt1)
            brute_t.append(dt2)
            if b1 != b2:
                failures.append(f"state sum disagrees on {name}")
    ratio = statistics.median(brute_t) / statistics.median(scan_t)

    # whole tables
    knot_times, link_times = [], []
    knot_bad = link_bad = None
    for _ in range(TABLE_PASSES):
        dt, knot_bad = table_pass(knot_cases)
        knot_times.append(dt)
        dt, link_bad = table_pass(link_cases)
        link_times.append(dt)
    if knot_bad:
        failures.append(f"KnotInfo mismatches ({len(knot_bad)}): {', '.join(knot_bad[:20])}")
    if link_bad:
        failures.append(f"LinkInfo mismatches ({len(link_bad)}): {', '.join(link_bad[:20])}")

    # T(7,8)
    t78, loops = braid_closure_pd(list(range(1, 7)) * 8, 7)
    assert loops == 0 and len(t78) == 48
    w78 = sum(crossing_signs(t78))
    time78, v78 = median_time(jones_polynomial_pd, (t78, w78), REPS_LARGE)
    t = LP.monomial(1)
    # V. F. R. Jones (1987), torus knots: (1 - t^2) V(T(p,q)) = t^((p-1)(q-1)/2) (1 - t^(p+1) - t^(q+1) + t^(p+q))
    if v78 * (1 - t**2) != t**21 * (1 - t**8 - t**9 + t**15):
        failures.append(f"T(7,8) gave {v78}")

    # 60-crossing random braid closure
    rng = random.Random(20240601)
    strands = 8
    word = [rng.choice((1, -1)) * rng.randint(1, strands - 1) for _ in range(60)]
    r60, loops60 = braid_closure_pd(word, strands)
    w60 = sum(1 if g > 0 else -1 for g in word)
    if sum(crossing_signs(r60)) != w60:
        failures.append("writhe of the random braid closure is off")
    time60, v60 = median_time(jones_polynomial_pd, (r60, w60, loops60), REPS_LARGE)

    # an alternating 54-crossing closure: 10 strands, six layers of s1 s3 ... s9 s2^-1 ... s8^-1
    layer = list(range(1, 10, 2)) + [-g for g in range(2, 10, 2)]
    weave_word = layer * 6
    weave, loops_w = braid_closure_pd(weave_word, 10)
    ww = sum(1 if g > 0 else -1 for g in weave_word)
    time_weave, v_weave = median_time(jones_polynomial_pd, (weave, ww, loops_w), REPS_LARGE)
    # Kauffman, Murasugi, Thistlethwaite (1987): span V = n for a reduced alternating diagram
    if v_weave.span() != len(weave):
        failures.append(f"alternating weave: span {v_weave.span()} for {len(weave)} crossings")

    mem78 = peak_memory(jones_polynomial_pd, t78, w78)
    mem60 = peak_memory(jones_polynomial_pd, r60, w60, loops60)
    mem12 = max(peak_memory(jones_polynomial_pd, pd, w) for _, _, pd, w, _ in sample)

    goals = [
        ("12-crossing median", med12, GOAL_12),
        ("T(7,8)", time78, GOAL_T78),
    ]
    missed = [name for name, value, goal in goals if value >= goal]

    def ms(x):
        return f"{1000 * x:.2f} ms"

    lines = [
        "# Jones polynomial benchmark",
        "",
        f"Run {datetime.datetime.now().strftime('%Y-%m-%d %H:%M')} on {os.cpu_count()} cores, "
        f"Python {platform.python_version()} ({platform.machine()}). "
        "Produced by `python tests/bench/bench_jones.py`; times are wall clock, one process.",
        "",
        "| case | crossings | time | goal | ratio to goal |",
        "| --- | --- | --- | --- | --- |",
        f"| KnotInfo 12-crossing knots, median over {len(twelve)} knots (median of {REPS_SMALL} each) "
        f"| 12 | {ms(med12)} | {ms(GOAL_12)} | {med12 / GOAL_12:.3f} |",
        f"| same, 90th percentile / slowest | 12 | {ms(p90)} / {ms(worst12)} | | |",
        f"| whole KnotInfo table up to 12 crossings ({len(knot_cases)} knots), total, median of "
        f"{TABLE_PASSES} | 0-12 | {statistics.median(knot_times):.2f} s | | |",
        f"| whole LinkInfo table ({len(link_cases)} links), total, median of {TABLE_PASSES} | 2-11 "
        f"| {statistics.median(link_times):.2f} s | | |",
        f"| torus knot T(7,8), median of {REPS_LARGE} | 48 | {ms(time78)} | {GOAL_T78:.0f} s "
        f"| {time78 / GOAL_T78:.3f} |",
        f"| random braid closure, {strands} strands, seed 20240601, median of {REPS_LARGE} "
        f"| 60 | {ms(time60)} | | |",
        f"| alternating closure, 10 strands, 6 layers, median of {REPS_LARGE} | {len(weave)} "
        f"| {ms(time_weave)} | | |",
        "",
        f"Plain 2^n state sum on {len(sample)} of the 12-crossing knots, measured alternately with "
        f"the scanner in the same run: {ms(statistics.median(brute_t))} against "
        f"{ms(statistics.median(scan_t))} (bracket only), a factor of {ratio:.0f}.",
        "",
        f"Peak memory (tracemalloc): T(7,8) {mem78 / 1024:.0f} KiB, random 60-crossing closure "
        f"{mem60 / 1024:.0f} KiB, 12-crossing knots at most {mem12 / 1024:.0f} KiB.",
        "",
        f"Agreement with the tables: KnotInfo {len(knot_cases) - len(knot_bad)}/{len(knot_cases)}, "
        f"LinkInfo {len(link_cases) - len(link_bad)}/{len(link_cases)} (column jones_polynomial).",
    ]
    if failures:
        lines += ["", "**FAILURES**", ""] + [f"- {f}" for f in failures]
    if missed:
        lines += ["", f"**Goals missed:** {', '.join(missed)}"]
    RESULTS.parent.mkdir(parents=True, exist_ok=True)
    RESULTS.write_text("\n".join(lines) + "\n")
    print("\n".join(lines))
    if failures:
        print("\nFAILED: wrong results, see above", file=sys.stderr)
        return 1
    if missed:
        print(f"\nGOALS MISSED: {', '.join(missed)}", file=sys.stderr)
        return 3
    return 0


if __name__ == "__main__":
    sys.exit(main())
