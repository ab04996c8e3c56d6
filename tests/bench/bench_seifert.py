"""Whole-table check of the Seifert-matrix invariants (run as ``python tests/bench/bench_seifert.py``).

For every KnotInfo knot up to 12 crossings (or ``--max-crossings``), from its PD code:
  * signature against the column ``signature``;
  * Alexander polynomial, table normalisation, against ``alexander_polynomial``;
  * determinant against ``determinant``;
  * the theorems det(V - Vᵀ) = 1 (Seifert matrix of a knot) and Δ(1) = 1 (Conway normalisation).
The same knots drawn as closed braids (column ``braid_notation``; every Seifert circle nested):
signature and Alexander polynomial again.  Levine–Tristram signatures at e^(2πik/n), 0 < k ≤ n/2,
for each order n in ``--lt-orders``, against the column ``signature_function``.
For every LinkInfo link (or those up to ``--link-crossings``): ``signature``, ``determinant``,
``nullity`` and ``conway_polynomial``.  Times: the canonical surface with its Seifert matrix
(total and median per diagram), and each invariant on top of it.  Any mismatch is printed and
makes the exit status 1.  Writes tests/bench/results/seifert.md.
"""

from __future__ import annotations

import argparse
import ast
import datetime
import platform
import statistics
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT))
sys.path.insert(0, str(ROOT / "tests"))

import database_knotinfo  # noqa: E402

from movies.diagram.constructors import from_braid  # noqa: E402
from movies.diagram.pd import from_pd  # noqa: E402
from movies.invariants.alexander import (  # noqa: E402
    alexander_coefficients,
    alexander_polynomial,
    conway_polynomial,
    determinant,
)
from movies.invariants.seifert import seifert_surface  # noqa: E402
from movies.invariants.signature import matrix_levine_tristram, matrix_signature, nullity  # noqa: E402
from movies.invariants.alexander import integer_determinant  # noqa: E402
from support.knotinfo_columns import parse_braids, parse_int, parse_laurent, parse_matrix  # noqa: E402

RESULTS = Path(__file__).resolve().parent / "results" / "seifert.md"


def timed(function, *args):
    start = time.perf_counter()
    value = function(*args)
    return value, time.perf_counter() - start


def signature_function(text: str, x: float) -> int:
    """KnotInfo's signature_function at ω = e^(πix): jumps [x, [left, at, right], multiplicity]."""
    value = 0
    for item in ast.literal_eval(text):
        if isinstance(item, list):
            jump, (left, at, right), _ = item
            if abs(x - jump) < 1e-8:  # the column gives x to ten digits
                return at
            if x > jump:
                value = right
    return value


def check_knots(max_crossings: int, orders: list[int], failures: list[str]) -> dict:
    rows = [row for row in database_knotinfo.link_list()[1:]
            if row["pd_notation"].strip() and int(row["crossing_number"]) <= max_crossings]
    times = {"surface": [], "signature": [], "alexander": [], "determinant": [],
             "braid closure: surface + signature + Alexander": [], "Levine–Tristram (one root)": []}
    braids = 0
    roots = 0
    checked = 0
    for row in rows:
        name = row["name"]
        diagram = from_pd(parse_matrix(row["pd_notation"]))
        surface, seconds = timed(seifert_surface, diagram)
        times["surface"].append(seconds)
        sig, seconds = timed(matrix_signature, surface.matrix)
        times["signature"].append(seconds)
        alexander, seconds = timed(alexander_polynomial, diagram)
        times["alexander"].append(seconds)
        det, seconds = timed(determinant, diagram)
        times["determinant"].append(seconds)
        expected_alexander = parse_laurent(row["alexander_polynomial"], "t")
        got_alexander = {e: c for e, c in alexander.terms()}
        matrix = surface.matrix
        size = len(matrix)
        antisymmetric = integer_determinant([[matrix[i][j] - matrix[j][i] for j in range(size)]
                                             for i in range(size)])
        if sig != parse_int(row["signature"]):
            failures.append(f"{name}: signature {sig}, table {row['signature']}")
        if got_alexander != expected_alexander:
            failures.append(f"{name}: Alexander {alexander}, table {row['alexander_polynomial']}")
        if det != parse_int(row["determinant"]):
            failures.append(f"{name}: determinant {det}, table {row['determinant']}")
        if antisymmetric != 1:
            failures.append(f"{name}: det(V - Vᵀ) = {antisymmetric}, not 1")
        if sum(alexander_coefficients(matrix)) != 1 and size:
            failures.append(f"{name}: det(V - Vᵀ) at t = 1 is not 1")
        checked += 1
        if row["braid_notation"].strip():
            strands, word = parse_braids(row["braid_notation"])[0]
            start = time.perf_counter()
            closed = from_braid(list(word), strands)
            braid_sig = matrix_signature(seifert_surface(closed).matrix)
            braid_alexander = alexander_polynomial(closed)
            times["braid closure: surface + signature + Alexander"].append(time.perf_counter() - start)
            braids += 1
            if braid_sig != sig or braid_alexander != alexander:
                failures.append(f"{name}: the closed braid gives signature {braid_sig}, Alexander {braid_alexander}")
        for order in orders:
            for k in range(1, order // 2 + 1):
                value, seconds = timed(matrix_levine_tristram, matrix, k, order)
                times["Levine–Tristram (one root)"].append(seconds)
                roots += 1
                expected = signature_function(row["signature_function"], 2 * k / order)
                if value[0] != expected:
                    failures.append(f"{name}: Levine–Tristram at e^(2πi·{k}/{order}) is {value[0]}, table {expected}")
    return {"count": checked, "times": times, "braids": braids, "roots": roots}


def check_links(max_crossings: int, failures: list[str]) -> dict:
    rows = [row for row in database_knotinfo.link_list(proper_links=True)[1:]
            if int(row["crossing_number"]) <= max_crossings]
    times = {"surface": [], "signature": [], "conway": []}
    for row in rows:
        name = row["name"]
        diagram = from_pd(parse_matrix(row["pd_notation_vector"]))
        surface, seconds = timed(seifert_surface, diagram)
        times["surface"].append(seconds)
        sig, seconds = timed(matrix_signature, surface.matrix)
        times["signature"].append(seconds)
        conway, seconds = timed(conway_polynomial, diagram)
        times["conway"].append(seconds)
        if sig != parse_int(row["signature"]):
            failures.append(f"{name}: signature {sig}, table {row['signature']}")
        if determinant(diagram) != parse_int(row["determinant"]):
            failures.append(f"{name}: determinant {determinant(diagram)}, table {row['determinant']}")
        if parse_int(row["nullity"]) is not None and nullity(diagram) != parse_int(row["nullity"]):
            failures.append(f"{name}: nullity {nullity(diagram)}, table {row['nullity']}")
        expected = parse_laurent(row["conway_polynomial"], "z")
        if expected is not None and {e: c for e, c in conway.terms()} != expected:
            failures.append(f"{name}: Conway {conway}, table {row['conway_polynomial']}")
    return {"count": len(rows), "times": times}


def describe(times: list[float]) -> str:
    if not times:
        return "not run"
    return f"total {sum(times):.2f} s, median {statistics.median(times) * 1000:.2f} ms, max {max(times) * 1000:.1f} ms"


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--max-crossings", type=int, default=12, help="knots up to this many crossings")
    parser.add_argument("--link-crossings", type=int, default=11, help="links up to this many crossings")
    parser.add_argument("--lt-orders", default="5,8", help="orders n of the roots for Levine–Tristram, comma-separated")
    args = parser.parse_args()
    failures: list[str] = []
    start = time.perf_counter()
    orders = [int(n) for n in args.lt_orders.split(",") if n.strip()]
    knots = check_knots(args.max_crossings, orders, failures)
    links = check_links(args.link_crossings, failures)
    wall = time.perf_counter() - start
    lines = [
        "# Seifert matrix, signature, Alexander polynomial, determinant: whole-table check",
        "",
        f"Run {datetime.date.today().isoformat()}, Python {platform.python_version()}, {platform.machine()}.",
        f"Command: python tests/bench/bench_seifert.py {' '.join(sys.argv[1:])}".rstrip() + ".",
        "",
        f"KnotInfo knots up to {args.max_crossings} crossings: {knots['count']} checked against the columns "
        "signature, alexander_polynomial, determinant; also det(V - Vᵀ) = 1 and Δ(1) = 1.",
        f"{knots['braids']} of them also as closed braids (braid_notation): signature and Alexander polynomial.",
        f"Levine–Tristram signatures at {knots['roots']} roots e^(2πik/n), 0 < k ≤ n/2, n in {orders}, "
        "against signature_function.",
        "",
    ]
    for key, values in knots["times"].items():
        lines.append(f"- {key}: {describe(values)}")
    lines += [
        "",
        f"LinkInfo links up to {args.link_crossings} crossings: {links['count']} checked against the columns "
        "signature, determinant, nullity, conway_polynomial.",
        "",
    ]
    for key, values in links["times"].items():
        lines.append(f"- {key}: {describe(values)}")
    lines += ["", f"Wall time {wall:.1f} s.", "",
              f"Mismatches: {len(failures)}" + ("" if not failures else ":")]
    lines += [f"- {failure}" for failure in failures[:50]]
    text = "\n".join(lines) + "\n"
    RESULTS.parent.mkdir(parents=True, exist_ok=True)
    RESULTS.write_text(text)
    print(text)
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
