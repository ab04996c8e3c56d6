"""Tests of the Kauffman bracket and Jones polynomial (movies.invariants.jones)."""

from __future__ import annotations

import ast
import functools
import random
from fractions import Fraction

import database_knotinfo
import pytest
import sympy

from movies.algebra.laurent import LaurentPolynomial as LP
from movies.diagram.pd import crossing_signs, from_pd
from movies.errors import MoviesError, PDCodeError
from movies.invariants.jones import (
    EmptyDiagramError,
    jones_polynomial,
    jones_polynomial_pd,
    kauffman_bracket,
    kauffman_bracket_pd,
)
from movies.diagram.scan_order import scan_order

A = LP.monomial(1, variable="A")
D = -(A**2) - A**-2
HALF = Fraction(1, 2)


def t(e=1, c=1):
    return LP.monomial(e, c, "t")


# ----------------------------------------------------------------------------- reference code
def brute_bracket(pd, loops=0):
    """The bracket as the plain 2^n state sum (union-find on edge labels per state)."""
    pd = [tuple(c) for c in pd]
    n = len(pd)
    labels = list(dict.fromkeys(label for c in pd for label in c))
    index = {label: i for i, label in enumerate(labels)}
    counts = {}
    for mask in range(1 << n):
        parent = list(range(len(labels)))

        def find(x):
            while parent[x] != x:
                parent[x] = parent[parent[x]]
                x = parent[x]
            return x

        def join(x, y):
            parent[find(index[x])] = find(index[y])

        a_count = 0
        for i, (a, b, c, d) in enumerate(pd):
            if mask >> i & 1:
                join(a, d)
                join(b, c)
            else:
                join(a, b)
                join(c, d)
                a_count += 1
        circles = sum(1 for i in range(len(labels)) if find(i) == i) + loops
        key = (2 * a_count - n, circles)
        counts[key] = counts.get(key, 0) + 1
    total = LP(variable="A")
    for (e, circles), k in counts.items():
        total = total + k * A**e * D ** (circles - 1)
    return total


def braid_closure_pd(word, strands):
    """PD code (and crossingless circle count) of the closure of a braid word.

    Strands run upwards; sigma_i (i > 0) has the strand from position i over the one from
    position i+1, which is a positive crossing. Untouched strands become crossingless circles.
    """
    cur = list(range(1, strands + 1))
    fresh = strands + 1
    pd = []
    for g in word:
        i = abs(g) - 1
        x, y = cur[i], cur[i + 1]
        x2, y2 = fresh, fresh + 1
        fresh += 2
        # slots counterclockwise from the incoming under-strand
        pd.append((y, y2, x2, x) if g > 0 else (x, y, y2, x2))
        cur[i], cur[i + 1] = x2, y2
    rename = {}
    loops = 0
    for i in range(strands):
        if cur[i] == i + 1:
            loops += 1
        else:
            rename[cur[i]] = i + 1
    return [tuple(rename.get(label, label) for label in c) for c in pd], loops


def braid_components(word, strands):
    perm = list(range(strands))
    for g in word:
        i = abs(g) - 1
        perm[i], perm[i + 1] = perm[i + 1], perm[i]
    seen, cycles = set(), 0
    for s in range(strands):
        if s not in seen:
            cycles += 1
            while s not in seen:
                seen.add(s)
                s = perm[s]
    return cycles


def random_braid(rng, max_strands=5, max_length=8):
    strands = rng.randint(2, max_strands)
    length = rng.randint(1, max_length)
    return [rng.choice((1, -1)) * rng.randint(1, strands - 1) for _ in range(length)], strands


def relabel(pd, f):
    return [tuple(f(label) for label in c) for c in pd]


def disjoint_union(*pds):
    out, shift = [], 0
    for pd in pds:
        out.extend(relabel(pd, lambda x, s=shift: x + s))
        shift += max((label for c in pd for label in c), default=0)
    return out


def mirror_unoriented(pd):
    """Every crossing changed (read from the old over-strand): bracket A -> A^-1."""
    return [(b, c, d, a) for a, b, c, d in pd]


def writhe(pd):
    return sum(crossing_signs(pd)) if pd else 0


@functools.lru_cache(maxsize=None)
def knotinfo_rows():
    rows = database_knotinfo.link_list()
    assert rows[0]["name"] == "Name"  # the first row holds the column titles
    return rows[1:]


@functools.lru_cache(maxsize=None)
def linkinfo_rows():
    rows = database_knotinfo.link_list(proper_links=True)
    assert rows[0]["name"] == "Name"  # the first row holds the column titles
    return rows[1:]


def knot_pd(row):
    return [tuple(c) for c in ast.literal_eval(row["pd_notation"])]


def link_pd(row):
    text = row["pd_notation_vector"].replace("{", "[").replace("}", "]")
    return [tuple(c) for c in ast.literal_eval(text)]


def row_named(rows, name):
    (row,) = [r for r in rows if r["name"] == name]
    return row


# ----------------------------------------------------------------------------- small values
def test_trefoil():
    pd = [(1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)]
    assert crossing_signs(pd) == [1, 1, 1]
    assert kauffman_bracket_pd(pd) == A**-7 - A**-3 - A**5
    # KnotInfo column jones_polynomial: V(3_1) = t + t^3 - t^4
    assert jones_polynomial_pd(pd, 3) == t(1) + t(3) - t(4)


def test_hopf_links_both_orientations():
    rows = linkinfo_rows()
    negative = link_pd(row_named(rows, "L2a1{0}"))
    positive = link_pd(row_named(rows, "L2a1{1}"))
    assert negative == [(4, 1, 3, 2), (2, 3, 1, 4)] and crossing_signs(negative) == [-1, -1]
    assert positive == [(4, 2, 3, 1), (2, 4, 1, 3)] and crossing_signs(positive) == [1, 1]
    # LinkInfo column jones_polynomial: L2a1{0} is -x^(-5)-x^(-1), x = t^(1/2)
    assert jones_polynomial_pd(negative, -2) == -t(Fraction(-5, 2)) - t(-HALF)
    # LinkInfo column jones_polynomial: L2a1{1} is -x-x^5, x = t^(1/2)
    assert jones_polynomial_pd(positive, 2) == -t(HALF) - t(Fraction(5, 2))


def test_crossingless_unlinks():
    assert kauffman_bracket_pd([], loops=1) == 1
    assert kauffman_bracket_pd([], loops=3) == D**2
    assert jones_polynomial_pd([], 0, loops=1) == 1
    # common practice, no source: V(unlink of 2) = -t^(1/2) - t^(-1/2)
    assert jones_polynomial_pd([], 0, loops=2) == -t(HALF) - t(-HALF)
    # KnotInfo column jones_polynomial: the unknot 0_1 has Jones polynomial 1
    assert LP.parse(row_named(knotinfo_rows(), "0_1")["jones_polynomial"]) == jones_polynomial_pd([], 0, 1)


def test_kinks():
    positive_kink, negative_kink = [(1, 1, 2, 2)], [(1, 2, 2, 1)]
    assert crossing_signs(positive_kink) == [1] and crossing_signs(negative_kink) == [-1]
    assert kauffman_bracket_pd(positive_kink) == -(A**3)
    assert kauffman_bracket_pd(negative_kink) == -(A**-3)
    assert jones_polynomial_pd(positive_kink, 1) == 1
    assert jones_polynomial_pd(negative_kink, -1, loops=1) == -t(HALF) - t(-HALF)


def test_empty_diagram_is_refused():
    with pytest.raises(EmptyDiagramError, match="1/d"):
        kauffman_bracket_pd([])
    with pytest.raises(MoviesError):
        jones_polynomial_pd([], 0)


@pytest.mark.parametrize(
    "pd",
    [
        [(1, 2, 3, 4)],
        [(1, 1, 1, 2), (2, 3, 3, 3)],
        [(1, 2, 3)],
        [(1, 2, 2, 1, 5)],
        "1221",
        [(1, 2, 2, [1])],
        5,
    ],
)
def test_malformed_codes_are_refused(pd):
    with pytest.raises(PDCodeError):
        kauffman_bracket_pd(pd)


def test_bad_writhe_and_loops_are_refused():
    trefoil = [(1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)]
    for bad in (2, 5, -5, 0):
        with pytest.raises(PDCodeError, match="writhe"):
            jones_polynomial_pd(trefoil, bad)
    with pytest.raises(PDCodeError, match="writhe"):
        jones_polynomial_pd([], 2, loops=1)
    with pytest.raises(PDCodeError):
        jones_polynomial_pd(trefoil, 3.0)
    with pytest.raises(PDCodeError):
        kauffman_bracket_pd(trefoil, loops=-1)
    with pytest.raises(PDCodeError):
        kauffman_bracket_pd(trefoil, loops=True)


# ----------------------------------------------------------------------------- scanning against the state sum
def test_scan_matches_state_sum_on_random_braid_closures():
    rng = random.Random(11)
    for _ in range(150):
        word, strands = random_braid(rng)
        pd, loops = braid_closure_pd(word, strands)
        extra = rng.randint(0, 2)
        if not pd and not loops + extra:
            continue
        assert kauffman_bracket_pd(pd, loops + extra) == brute_bracket(pd, loops + extra), word


def test_scan_matches_state_sum_on_split_diagrams():
    rng = random.Random(12)
    for _ in range(40):
        parts = []
        loops = rng.randint(0, 2)
        for _ in range(rng.randint(2, 3)):
            word, strands = random_braid(rng, max_strands=3, max_length=3)
            pd, k = braid_closure_pd(word, strands)
            parts.append(pd)
            loops += k
        pd = disjoint_union(*parts)
        if not pd and not loops:
            continue
        assert kauffman_bracket_pd(pd, loops) == brute_bracket(pd, loops)


def test_scan_matches_state_sum_after_crossing_changes():
    """Table diagrams (not braid-shaped) with random crossings changed: the bracket is unoriented."""
    rng = random.Random(13)
    rows = [r for r in knotinfo_rows() if r["pd_notation"] and int(r["crossing_number"]) <= 9]
    rows += [r for r in linkinfo_rows() if int(r["crossing_number"]) <= 8]
    for row in rng.sample(rows, 25):
        pd = knot_pd(row) if "pd_notation" in row else link_pd(row)
        changed = [(b, c, d, a) if rng.random() < 0.5 else (a, b, c, d) for a, b, c, d in pd]
        assert kauffman_bracket_pd(changed) == brute_bracket(changed), row["name"]


def test_bracket_does_not_depend_on_labels_or_crossing_order():
    rng = random.Random(14)
    for row in knotinfo_rows()[20:400:40]:
        pd = knot_pd(row)
        expected = kauffman_bracket_pd(pd)
        shuffled = pd[:]
        rng.shuffle(shuffled)
        names = {label: f"e{rng.random()}" for c in pd for label in c}
        # reading a crossing from the other end of its under-strand keeps both smoothings
        turned = [c[2:] + c[:2] if rng.random() < 0.5 else c for c in relabel(shuffled, names.get)]
        assert kauffman_bracket_pd(turned) == expected
        assert sorted(scan_order(shuffled)) == list(range(len(pd)))


def test_mirror_inverts_a():
    for row in knotinfo_rows()[1:600:50]:
        pd = knot_pd(row)
        assert kauffman_bracket_pd(mirror_unoriented(pd)) == kauffman_bracket_pd(pd).substitute_power(-1)


# ----------------------------------------------------------------------------- invariance and structure
def test_jones_is_invariant_under_braid_moves():
    rng = random.Random(15)
    for _ in range(40):
        word, strands = random_braid(rng, max_strands=4, max_length=6)
        pd, loops = braid_closure_pd(word, strands)
        base = jones_polynomial_pd(pd, sum(1 if g > 0 else -1 for g in word), loops)
        # a Reidemeister II pair sigma_i sigma_i^-1 at a random place
        i, k = rng.randint(1, strands - 1), rng.randint(0, len(word))
        for e in (1, -1):
            w2 = word[:k] + [e * i, -e * i] + word[k:]
            pd2, loops2 = braid_closure_pd(w2, strands)
            assert jones_polynomial_pd(pd2, sum(1 if g > 0 else -1 for g in w2), loops2) == base
        # Markov stabilisation (a Reidemeister I curl): one more strand and sigma_n^(+-1)
        for e in (1, -1):
            w3 = word + [e * strands]
            pd3, loops3 = braid_closure_pd(w3, strands + 1)
            w = sum(1 if g > 0 else -1 for g in w3)
            assert writhe(pd3) == w
            assert jones_polynomial_pd(pd3, w, loops3) == base
            assert kauffman_bracket_pd(pd3, loops3) == (-(A ** (3 * e))) * kauffman_bracket_pd(pd, loops)


def test_writhe_of_braid_closures_matches_the_signs_of_the_code():
    rng = random.Random(16)
    for _ in range(30):
        word, strands = random_braid(rng)
        pd, _ = braid_closure_pd(word, strands)
        assert writhe(pd) == sum(1 if g > 0 else -1 for g in word)


def test_split_union_multiplies_by_the_circle():
    rng = random.Random(17)
    circle = -t(HALF) - t(-HALF)
    for _ in range(20):
        (w1, s1), (w2, s2) = random_braid(rng), random_braid(rng)
        pd1, l1 = braid_closure_pd(w1, s1)
        pd2, l2 = braid_closure_pd(w2, s2)
        if not (pd1 or l1) or not (pd2 or l2):
            continue
        v1 = jones_polynomial_pd(pd1, sum(1 if g > 0 else -1 for g in w1), l1)
        v2 = jones_polynomial_pd(pd2, sum(1 if g > 0 else -1 for g in w2), l2)
        both = jones_polynomial_pd(disjoint_union(pd1, pd2), sum(1 if g > 0 else -1 for g in w1 + w2), l1 + l2)
        assert both == circle * v1 * v2


def test_value_at_one():
    rng = random.Random(18)
    for _ in range(40):
        word, strands = random_braid(rng, max_strands=6, max_length=14)
        pd, loops = braid_closure_pd(word, strands)
        if not pd and not loops:
            continue
        v = jones_polynomial_pd(pd, sum(1 if g > 0 else -1 for g in word), loops)
        # common practice, no source: V_L(1) = (-2)^(components - 1)
        assert sum(c for _, c in v.terms()) == (-2) ** (braid_components(word, strands) - 1)


def _torus_knot_formula(p, q):
    x = sympy.Symbol("t")
    numerator = x ** ((p - 1) * (q - 1) // 2) * (1 - x ** (p + 1) - x ** (q + 1) + x ** (p + q))
    quotient, remainder = sympy.div(sympy.expand(numerator), 1 - x**2, x)
    assert remainder == 0
    return LP({e: int(c) for (e,), c in sympy.Poly(quotient, x).terms()})


@pytest.mark.parametrize("p, q", [(2, 3), (2, 7), (3, 4), (3, 5), (4, 5), (5, 6), (7, 8)])
def test_torus_knots(p, q):
    pd, loops = braid_closure_pd(list(range(1, p)) * q, p)
    assert loops == 0 and len(pd) == (p - 1) * q
    # V. F. R. Jones, Ann. of Math. 126 (1987), torus knot formula (quoted from memory):
    # V(T(p,q)) = t^((p-1)(q-1)/2) (1 - t^(p+1) - t^(q+1) + t^(p+q)) / (1 - t^2)
    assert jones_polynomial_pd(pd, len(pd)) == _torus_knot_formula(p, q)


@pytest.mark.parametrize("strands, layers", [(4, 5), (6, 4), (8, 3)])
def test_span_of_alternating_closures(strands, layers):
    layer = list(range(1, strands, 2)) + [-g for g in range(2, strands, 2)]
    word = layer * layers
    pd, loops = braid_closure_pd(word, strands)
    v = jones_polynomial_pd(pd, sum(1 if g > 0 else -1 for g in word), loops)
    # Kauffman, Murasugi, Thistlethwaite (1987): a connected reduced alternating diagram with
    # n crossings has span V = n
    assert v.span() == len(pd)


# ----------------------------------------------------------------------------- the tables
def test_knotinfo_spread():
    rows = [r for r in knotinfo_rows() if r["pd_notation"] and int(r["crossing_number"]) <= 12]
    checked = 0
    for row in rows[::10]:
        pd = knot_pd(row)
        v = jones_polynomial_pd(pd, writhe(pd))
        # KnotInfo column jones_polynomial
        assert v == LP.parse(row["jones_polynomial"], "t"), row["name"]
        checked += 1
    assert checked >= 290


def test_linkinfo_spread():
    rows = [r for r in linkinfo_rows() if int(r["crossing_number"]) <= 11]
    checked = 0
    for row in rows[::10]:
        pd = link_pd(row)
        v = jones_polynomial_pd(pd, writhe(pd))
        expected = LP.parse(row["jones_polynomial"], "x").substitute_power(HALF, "t")
        # LinkInfo column jones_polynomial (x = t^(1/2)), PD from column pd_notation_vector
        assert v == expected, row["name"]
        checked += 1
    assert checked >= 410


# ----------------------------------------------------------------------------- the Diagram wrapper
def test_wrapper_on_diagrams():
    trefoil = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]], loops=1)
    v = t(1) + t(3) - t(4)
    assert jones_polynomial(trefoil) == (-t(HALF) - t(-HALF)) * v
    assert kauffman_bracket(trefoil) == D * (A**-7 - A**-3 - A**5)
    hopf = from_pd(link_pd(row_named(linkinfo_rows(), "L2a1{1}")))
    assert jones_polynomial(hopf) == -t(HALF) - t(Fraction(5, 2))


def test_wrapper_uses_the_three_methods():
    class Fake:
        def pd_code(self):
            return [(1, 1, 2, 2)]

        def writhe(self):
            return 1

        def loop_count(self):
            return 2

    assert jones_polynomial(Fake()) == (-t(HALF) - t(-HALF)) ** 2
