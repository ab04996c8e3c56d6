"""Tests of the signature, the nullity and the Levine–Tristram signatures (movies.invariants.signature)."""

from __future__ import annotations

import ast
import math
import random
from fractions import Fraction

import pytest
import sympy

from movies.diagram.constructors import connected_sum, disjoint_union, empty, mirror, reverse, unknot, unlink
from movies.diagram.pd import from_pd
from movies.diagram.tables import table_names, table_row
from movies.errors import InputError, MoviesError
from movies.invariants.alexander import alexander_coefficients
from movies.invariants.seifert import seifert_matrix
from movies.invariants import signature as module
from movies.invariants.signature import (
    inertia,
    is_prime_power,
    levine_tristram,
    levine_tristram_all,
    levine_tristram_bound,
    matrix_levine_tristram,
    matrix_signature,
    nullity,
    signature,
)
from support.knotinfo_columns import parse_four_genus, parse_int, parse_matrix
from support.diagrams import TREFOIL_PD as TREFOIL

FIGURE_EIGHT = [[4, 2, 5, 1], [8, 6, 1, 5], [6, 3, 7, 4], [2, 7, 3, 8]]

KNOT_NAMES = [name for name in table_names("knot", max_crossings=12) if name != "0_1"]
KNOT_SPREAD = [table_row(name) for name in KNOT_NAMES[::40]]
LT_SPREAD = [table_row(name) for name in KNOT_NAMES[7::150]]
LINK_SPREAD = [table_row(name) for name in table_names("link")[::100]]


def knot(row):
    return from_pd(parse_matrix(row["pd_notation"]))


def link(row):
    return from_pd(parse_matrix(row["pd_notation_vector"]))


def table_signature_function(text: str, x: Fraction) -> int:
    """Read KnotInfo's signature_function at ω = e^(πix), 0 ≤ x ≤ 1.

    The column lists the jumps as [x, [left, at, right], multiplicity] with x to ten digits
    (irrational in general); a point within 1e-8 of a jump is taken to be the jump.
    """
    value = 0
    for item in ast.literal_eval(text):
        if not isinstance(item, list):
            continue
        jump, (left, at, right), _ = item
        if abs(float(x) - jump) < 1e-8:
            return at
        if x > jump:
            value = right
    return value


# ---------------------------------------------------------------------- rational forms


def test_inertia():
    assert inertia([]) == (0, 0, 0)
    assert inertia([[0, 0], [0, 0]]) == (0, 0, 2)
    assert inertia([[0, 3, 0], [3, 0, 0], [0, 0, -1]]) == (1, 2, 0)
    assert inertia([[Fraction(1, 2), 1], [1, 2]]) == (1, 0, 1)
    with pytest.raises(InputError):
        inertia([[0, 1], [2, 0]])
    with pytest.raises(InputError):
        inertia([[0, 1]])


def test_inertia_against_eigenvalues():
    rng = random.Random(5)
    for _ in range(30):
        size = rng.randint(1, 6)
        half = [[rng.randint(-3, 3) for _ in range(size)] for _ in range(size)]
        matrix = [[half[i][j] + half[j][i] for j in range(size)] for i in range(size)]
        positive, negative, zero = inertia(matrix)
        # sympy's exact characteristic polynomial as an independent oracle (Descartes' rule is
        # exact for a polynomial whose roots are all real)
        poly = sympy.Matrix(matrix).charpoly().all_coeffs()
        assert zero == next(i for i, c in enumerate(reversed(poly)) if c != 0)
        nonzero = [c for c in poly if c != 0]
        changes = sum(1 for a, b in zip(nonzero, nonzero[1:]) if (a > 0) != (b > 0))
        assert positive == changes
        assert positive + negative + zero == size


# ---------------------------------------------------------------------- against the tables


@pytest.mark.parametrize("row", KNOT_SPREAD, ids=lambda row: row["name"])
def test_knot_signature(row):
    # KnotInfo column signature
    assert signature(knot(row)) == parse_int(row["signature"])


@pytest.mark.parametrize("row", LINK_SPREAD, ids=lambda row: row["name"])
def test_link_signature_and_nullity(row):
    diagram = link(row)
    # LinkInfo column signature (same sign convention: the positive Hopf link has -1)
    assert signature(diagram) == parse_int(row["signature"])
    # LinkInfo column nullity
    assert nullity(diagram) == parse_int(row["nullity"])


def test_hopf_link_conventions():
    # LinkInfo L2a1{1}: linking number +1, signature -1; L2a1{0}: -1 and +1
    assert signature(link(table_row("L2a1{1}"))) == -1
    assert signature(link(table_row("L2a1{0}"))) == 1


@pytest.mark.parametrize("row", LT_SPREAD, ids=lambda row: row["name"])
@pytest.mark.parametrize("n", [5, 6, 9])
def test_levine_tristram_against_signature_function(row, n):
    matrix = seifert_matrix(knot(row))
    for k in range(1, n // 2 + 1):
        # KnotInfo column signature_function, at ω = e^(2πik/n)
        assert matrix_levine_tristram(matrix, k, n)[0] == table_signature_function(
            row["signature_function"], Fraction(2 * k, n))


def test_trefoil_at_its_root():
    # KnotInfo column signature_function of 3_1: 0, then -1 at x = 1/3, then -2
    trefoil = from_pd(TREFOIL)
    assert levine_tristram(trefoil, 1, 6) == -1
    assert levine_tristram(trefoil, 1, 7) == 0
    assert levine_tristram(trefoil, 2, 7) == -2


# ---------------------------------------------------------------------- theorems


@pytest.mark.parametrize("row", KNOT_SPREAD[::5], ids=lambda row: row["name"])
def test_mirror_and_reverse(row):
    diagram = knot(row)
    # theorem: σ(mirror) = -σ, at every ω as well (the mirror surface has Seifert matrix -Vᵀ)
    assert signature(mirror(diagram)) == -signature(diagram)
    assert levine_tristram_all(mirror(diagram), 5) == {k: -s for k, s in levine_tristram_all(diagram, 5).items()}
    # theorem: reversing the orientation transposes V, which keeps every signature
    assert signature(reverse(diagram)) == signature(diagram)


def test_connected_sum_and_split_union_add():
    trefoil, eight = from_pd(TREFOIL), from_pd(FIGURE_EIGHT)
    double = connected_sum(trefoil, trefoil)
    # theorem: the signature is additive under connected sum (V is block diagonal)
    assert signature(double) == -4
    assert levine_tristram(double, 1, 3) == 2 * levine_tristram(trefoil, 1, 3)
    # theorem: and under split union (a tube joining the surfaces adds a null class)
    union = disjoint_union(double, mirror(trefoil))
    assert signature(union) == -2
    assert nullity(union) == nullity(double) + nullity(mirror(trefoil)) + 1
    assert signature(disjoint_union(eight, unknot())) == 0


def test_unlinks_and_the_empty_diagram():
    # theorem: the unlink of n components bounds n disks; tubed together: V = 0 of size n - 1
    assert signature(unlink(4)) == 0 and nullity(unlink(4)) == 3
    assert signature(empty()) == 0 and nullity(empty()) == 0
    assert levine_tristram(unlink(2), 1, 3) == 0


@pytest.mark.parametrize("row", KNOT_SPREAD[::4], ids=lambda row: row["name"])
def test_levine_tristram_at_minus_one_and_conjugates(row):
    matrix = seifert_matrix(knot(row))
    sigma = matrix_signature(matrix)
    # definition: at ω = -1 the form is 2(V + Vᵀ)
    assert matrix_levine_tristram(matrix, 1, 2)[0] == sigma
    assert matrix_levine_tristram(matrix, 3, 6)[0] == sigma
    assert matrix_levine_tristram(matrix, 0, 7) == (0, len(matrix))
    # theorem: the forms at ω and ω̄ are complex conjugate, so their signatures agree
    for k in range(1, 7):
        assert matrix_levine_tristram(matrix, k, 7) == matrix_levine_tristram(matrix, 7 - k, 7)


@pytest.mark.parametrize("row", KNOT_SPREAD[1::6], ids=lambda row: row["name"])
def test_nullity_at_roots_of_the_alexander_polynomial(row):
    matrix = seifert_matrix(knot(row))
    t = sympy.Symbol("t")
    delta = sympy.Poly(list(reversed(alexander_coefficients(matrix))), t)
    for n in (3, 4, 6, 10, 12):
        for k in range(1, n):
            if math.gcd(k, n) != 1:
                continue
            # the form is (1 - ω)(V - ω̄Vᵀ), singular exactly where Δ(ω̄) = Δ(ω) = 0; sympy's
            # exact division by the cyclotomic polynomial is the independent check
            root = sympy.Poly(sympy.cyclotomic_poly(n, t), t)
            singular = delta.rem(root).is_zero
            assert (matrix_levine_tristram(matrix, k, n)[1] > 0) == singular


@pytest.mark.parametrize("row", [r for r in KNOT_SPREAD[::2] if parse_four_genus(r["smooth_four_genus"]) is not None],
                         ids=lambda row: row["name"])
def test_four_genus_bounds(row):
    diagram = knot(row)
    genus = parse_four_genus(row["smooth_four_genus"])
    # Murasugi 1965: |σ(K)| ≤ 2 g₄(K); KnotInfo column smooth_four_genus
    assert abs(signature(diagram)) <= 2 * genus
    # Tristram 1969: the same at roots of unity of prime-power order
    assert levine_tristram_bound(diagram, 8) <= 2 * genus


def test_bound_uses_prime_power_orders_only():
    assert [m for m in range(1, 20) if is_prime_power(m)] == [2, 3, 4, 5, 7, 8, 9, 11, 13, 16, 17, 19]
    trefoil = from_pd(TREFOIL)
    assert levine_tristram_bound(trefoil, 6) == 2
    assert levine_tristram_bound(trefoil, 1) == 0


# ---------------------------------------------------------------------- exact arithmetic inside


@pytest.mark.parametrize("order", [3, 5, 8, 9, 12, 15, 17, 20])
def test_cyclotomic_field_arithmetic(order):
    field = module._Field(order)
    rng = random.Random(order)
    zeta = field.power(1)
    assert field.power(order) == field.one
    assert field.mul(zeta, field.conjugate(zeta)) == field.one
    for _ in range(20):
        x = field.normal([rng.randint(-4, 4) for _ in range(field.degree)], rng.randint(1, 5))
        y = field.normal([rng.randint(-4, 4) for _ in range(field.degree)], rng.randint(1, 5))
        assert field.mul(x, y) == field.mul(y, x)
        assert field.conjugate(field.mul(x, y)) == field.mul(field.conjugate(x), field.conjugate(y))
        if not field.is_zero(x):
            assert field.mul(x, field.inverse(x)) == field.one


@pytest.mark.parametrize("order", [3, 4, 5, 7, 12, 30, 61])
def test_cosines_are_isolated_correctly(order):
    for index in range(1, order):
        cosine = module._cosine(order, index)
        lo, exponent = cosine.level(20)
        # the float cosine is only a check on the exact isolation (exactness is not at stake)
        value = math.cos(math.pi * index / order)
        assert lo / 2 ** exponent - 1e-12 <= value <= (lo + 1) / 2 ** exponent + 1e-12


def test_signs_of_real_field_elements():
    field = module._Field(7)
    zeta = field.power(1)
    two_cos = field.add(zeta, field.conjugate(zeta))  # 2 cos(2π·step/7)
    for step in range(1, 7):
        expected = 1 if math.cos(2 * math.pi * step / 7) > 0 else -1
        assert module._sign_of_real(field, two_cos, step) == expected
    # a tiny real number: 2cos(2π/7) - 1.2469796 (cos(2π/7) = 0.62348980...)
    close = field.sub(two_cos, field.normal([12469796] + [0] * 5, 10 ** 7))
    assert module._sign_of_real(field, close, 1) == 1


def test_bad_roots_of_unity():
    trefoil = from_pd(TREFOIL)
    with pytest.raises(InputError):
        levine_tristram(trefoil, 1, 0)
    with pytest.raises(MoviesError):
        levine_tristram(trefoil, 1.5, 4)
