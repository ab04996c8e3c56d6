"""Tests of the Alexander and Conway polynomials and the determinant (movies.invariants.alexander)."""

from __future__ import annotations

import random
from fractions import Fraction

import pytest
import sympy

from movies.algebra.laurent import LaurentPolynomial as LP
from movies.diagram.constructors import connected_sum, disjoint_union, empty, from_braid, mirror, unknot, unlink
from movies.diagram.pd import from_pd
from movies.diagram.tables import table_names, table_row
from movies.errors import DiagramError, InputError
from movies.invariants.alexander import (
    alexander_coefficients,
    alexander_polynomial,
    conway_polynomial,
    determinant,
    integer_determinant,
)
from movies.invariants.seifert import seifert_genus_of_surface
from support.knotinfo_columns import parse_int, parse_laurent, parse_matrix
from support.diagrams import TREFOIL_PD as TREFOIL

FIGURE_EIGHT = [[4, 2, 5, 1], [8, 6, 1, 5], [6, 3, 7, 4], [2, 7, 3, 8]]

KNOT_NAMES = [name for name in table_names("knot", max_crossings=12) if name != "0_1"]
KNOT_SPREAD = [table_row(name) for name in KNOT_NAMES[3::40]]
THIRTEEN_SPREAD = [table_row(name) for name in table_names("knot") if name.startswith("13")][::1000]
LINK_SPREAD = [table_row(name) for name in table_names("link")[5::70]]


def knot(row):
    return from_pd(parse_matrix(row["pd_notation"]))


def link(row):
    return from_pd(parse_matrix(row["pd_notation_vector"]))


def terms(polynomial: LP) -> dict:
    return dict(polynomial.terms())


def at(polynomial: LP, value: int) -> Fraction:
    """Value at t = value for integral exponents, at t^(1/2) = value for half-integral ones."""
    half = any(e.denominator == 2 for e, _ in polynomial.terms())
    return sum(Fraction(value) ** (int(2 * e) if half else int(e)) * c for e, c in polynomial.terms())


def norm_at_minus_one(polynomial: LP) -> int:
    """|Δ(-1)|² with t^(1/2) = i, in exact Gaussian integers."""
    real = imaginary = 0
    for e, c in polynomial.terms():
        power = int(2 * e) % 4  # i^(2e)
        real += c * (1, 0, -1, 0)[power]
        imaginary += c * (0, 1, 0, -1)[power]
    return real * real + imaginary * imaginary


def is_alternating(diagram) -> bool:
    return all((tail.position == 2) != (head.position == 0) for tail, head in diagram.edge_ends.values())


# ---------------------------------------------------------------------- against the tables


@pytest.mark.parametrize("row", KNOT_SPREAD, ids=lambda row: row["name"])
def test_knot_polynomials_and_determinant(row):
    diagram = knot(row)
    # KnotInfo column alexander_polynomial (lowest exponent 0, lowest coefficient positive)
    assert terms(alexander_polynomial(diagram)) == parse_laurent(row["alexander_polynomial"], "t")
    # KnotInfo column conway_polynomial
    assert terms(conway_polynomial(diagram)) == parse_laurent(row["conway_polynomial"], "z")
    # KnotInfo column determinant
    assert determinant(diagram) == parse_int(row["determinant"])


@pytest.mark.parametrize("row", THIRTEEN_SPREAD, ids=lambda row: row["name"])
def test_thirteen_crossing_rows_use_the_conway_sign(row):
    conway = alexander_polynomial(knot(row), "conway")
    shifted = conway.shift(-conway.min_degree())
    # KnotInfo column alexander_polynomial, 13 crossings: lowest exponent 0, sign with Δ(1) = 1
    assert terms(shifted) == parse_laurent(row["alexander_polynomial"], "t")


@pytest.mark.parametrize("row", LINK_SPREAD, ids=lambda row: row["name"])
def test_link_conway_polynomial_and_determinant(row):
    diagram = link(row)
    # LinkInfo column conway_polynomial
    assert terms(conway_polynomial(diagram)) == parse_laurent(row["conway_polynomial"], "z")
    # LinkInfo column determinant
    assert determinant(diagram) == parse_int(row["determinant"])


def test_hopf_links():
    # LinkInfo column conway_polynomial: L2a1{1} (linking +1) has z, L2a1{0} has -z
    assert str(conway_polynomial(link(table_row("L2a1{1}")))) == "z"
    assert str(conway_polynomial(link(table_row("L2a1{0}")))) == "-z"
    assert str(alexander_polynomial(link(table_row("L2a1{0}")), "conway")) == "t^(-1/2) - t^(1/2)"


# ---------------------------------------------------------------------- theorems


@pytest.mark.parametrize("row", KNOT_SPREAD + LINK_SPREAD, ids=lambda row: row["name"])
def test_symmetry_and_value_at_one(row):
    diagram = knot(row) if "pd_notation" in row else link(row)
    components = diagram.component_count()
    conway = alexander_polynomial(diagram, "conway")
    mirrored = LP({-e: c for e, c in conway.terms()})
    # Conway 1969 (Torres 1953): Δ(1/t) = (-1)^(components - 1) Δ(t) in the Conway normalisation
    assert mirrored == (conway if components % 2 else -conway)
    # Torres 1953: Δ(1) = 1 for a knot, 0 for a link of several components
    assert at(conway, 1) == (1 if components == 1 else 0)
    # definition: the determinant is |Δ(-1)|
    assert determinant(diagram) ** 2 == norm_at_minus_one(conway)


@pytest.mark.parametrize("row", KNOT_SPREAD, ids=lambda row: row["name"])
def test_degree_and_genus(row):
    diagram = knot(row)
    span = alexander_polynomial(diagram).span()
    # Seifert 1934: span Δ ≤ 2 g of any Seifert surface; the table's g (three_genus) as well
    assert span <= 2 * parse_int(row["three_genus"]) <= 2 * seifert_genus_of_surface(diagram)
    if is_alternating(diagram):
        # Crowell 1959, Murasugi 1958: equality for alternating diagrams
        assert span == 2 * seifert_genus_of_surface(diagram)


def test_mirror_connected_sum_and_split_union():
    trefoil, eight = from_pd(TREFOIL), from_pd(FIGURE_EIGHT)
    # theorem: a knot and its mirror have the same Alexander polynomial; ∇(mirror)(z) = ∇(-z)
    assert alexander_polynomial(mirror(trefoil)) == alexander_polynomial(trefoil)
    hopf = link(table_row("L2a1{1}"))
    assert conway_polynomial(mirror(hopf)) == -conway_polynomial(hopf)
    # theorem: Δ(K₁ # K₂) = Δ(K₁)Δ(K₂), so determinants multiply
    total = connected_sum(trefoil, eight)
    assert alexander_polynomial(total) == alexander_polynomial(trefoil) * alexander_polynomial(eight)
    assert determinant(total) == 15
    # theorem: a split link has Δ = 0 and determinant 0
    assert alexander_polynomial(disjoint_union(trefoil, eight)).is_zero()
    assert determinant(disjoint_union(trefoil, unknot())) == 0
    assert conway_polynomial(unlink(2)).is_zero()


def test_unknot_and_torus_knots():
    # from memory: Δ(unknot) = 1; T(2,5) = 1 - t + t^2 - t^3 + t^4; T(3,4): 1 - t + t^3 - t^5 + t^6
    assert str(alexander_polynomial(unknot())) == "1"
    assert str(alexander_polynomial(from_braid([1] * 5))) == "1 - t + t^2 - t^3 + t^4"
    assert str(alexander_polynomial(from_braid([1, 2] * 4))) == "1 - t + t^3 - t^5 + t^6"
    assert determinant(from_braid([1] * 5)) == 5


# ---------------------------------------------------------------------- exact helpers


def test_integer_determinant_against_sympy():
    rng = random.Random(11)
    for _ in range(40):
        size = rng.randint(1, 7)
        matrix = [[rng.randint(-4, 4) for _ in range(size)] for _ in range(size)]
        # sympy Matrix.det as an independent oracle
        assert integer_determinant(matrix) == sympy.Matrix(matrix).det()


def test_alexander_coefficients_against_sympy():
    rng = random.Random(12)
    for _ in range(25):
        size = rng.randint(1, 7)
        matrix = [[rng.randint(-2, 2) for _ in range(size)] for _ in range(size)]
        V = sympy.Matrix(matrix)
        coefficients = alexander_coefficients(matrix)
        assert len(coefficients) == size + 1
        for point in (-3, 7, 12):  # points away from the interpolation nodes 0..size
            # sympy Matrix.det of V - t·Vᵀ at t = point as an independent oracle
            assert sum(c * point ** i for i, c in enumerate(coefficients)) == (V - point * V.T).det()


def test_errors():
    with pytest.raises(InputError):
        alexander_polynomial(from_pd(TREFOIL), "symmetric-ish")
    with pytest.raises(DiagramError):
        alexander_polynomial(empty())
    with pytest.raises(DiagramError):
        determinant(empty())
