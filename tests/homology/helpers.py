"""Shared helpers of the homology tests: Euler characteristics and column readings."""

from __future__ import annotations

from movies.invariants.jones import jones_polynomial
from support.knotinfo_columns import parse_khovanov


def euler(ranks: dict) -> dict[int, int]:
    """{q: sum over i of (-1)^i rank} of a {(i, q): rank} table, zeros dropped."""
    out: dict[int, int] = {}
    for (i, q), r in ranks.items():
        out[q] = out.get(q, 0) + (-r if i % 2 else r)
    return {q: c for q, c in out.items() if c}


def jones_in_q(diagram, reduced: bool = False) -> dict[int, int]:
    """(q + 1/q) V, or V alone when reduced, with t^(1/2) = -q, as {q exponent: coefficient}."""
    terms = {}
    for e, c in jones_polynomial(diagram).terms():
        k = int(2 * e)  # t^e = (t^(1/2))^(2e) = (-q)^(2e)
        terms[k] = terms.get(k, 0) + (-c if k % 2 else c)
    if reduced:
        return {k: c for k, c in terms.items() if c}
    out: dict[int, int] = {}
    for k, c in terms.items():
        out[k + 1] = out.get(k + 1, 0) + c
        out[k - 1] = out.get(k - 1, 0) + c
    return {k: c for k, c in out.items() if c}


def assert_euler_matches_jones(diagram, ranks: dict, reduced: bool = False) -> None:
    """The graded Euler characteristic of Kh is (q + 1/q) V(t^(1/2) = -q) (V for reduced)."""
    # Khovanov 2000, Bar-Natan 2002 "On Khovanov's categorification of the Jones polynomial":
    # the graded Euler characteristic of Kh is the unnormalised Jones polynomial
    assert euler(ranks) == jones_in_q(diagram, reduced), (euler(ranks), jones_in_q(diagram, reduced))


def ranks_of(text: str) -> dict:
    """{(i, j): rank} of a field column (or the free part of an integral one)."""
    groups = parse_khovanov(text)
    return {k: v["free"] for k, v in groups.items() if v["free"]}


def integral_of(text: str) -> dict:
    """The integral column in the engine's shape: {"free": ..., "torsion": ...}."""
    groups = parse_khovanov(text)
    return {
        "free": {k: v["free"] for k, v in groups.items() if v["free"]},
        "torsion": {k: v["torsion"] for k, v in groups.items() if v["torsion"]},
    }


def assert_complex_euler_matches_jones(diagram, field: str = "F2") -> None:
    """The same check on the simplified Bar-Natan complex itself (its generators at H = 0)."""
    from movies.homology import bar_natan_complex

    generators = bar_natan_complex(diagram, field).generators
    ranks: dict = {}
    for hq in generators:
        ranks[hq] = ranks.get(hq, 0) + 1
    assert_euler_matches_jones(diagram, ranks)
