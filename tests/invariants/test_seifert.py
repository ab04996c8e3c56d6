"""Tests of the canonical Seifert surface and its Seifert matrix (movies.invariants.seifert)."""

from __future__ import annotations

import random

import pytest
import sympy

from movies.diagram.constructors import (
    connected_sum,
    disjoint_union,
    from_braid,
    mirror,
    reverse,
    unknot,
    unlink,
)
from movies.diagram.moves import r1_add, r2_add
from movies.diagram.pd import from_pd
from movies.diagram.tables import table_names, table_row
from movies.invariants.alexander import alexander_polynomial, determinant, integer_determinant
from movies.invariants.seifert import seifert_genus_of_surface, seifert_matrix, seifert_surface
from movies.invariants.signature import nullity, signature
from support.knotinfo_columns import parse_braids, parse_int, parse_matrix
from support.diagrams import TREFOIL_PD as TREFOIL

FIGURE_EIGHT = [[4, 2, 5, 1], [8, 6, 1, 5], [6, 3, 7, 4], [2, 7, 3, 8]]
POSITIVE_HOPF = [[4, 2, 3, 1], [2, 4, 1, 3]]

KNOT_NAMES = [name for name in table_names("knot", max_crossings=12) if name != "0_1"]
KNOT_SPREAD = [table_row(name) for name in KNOT_NAMES[::40]]
LINK_SPREAD = [table_row(name) for name in table_names("link")[::60]]
BRAID_SPREAD = [row for row in map(table_row, KNOT_NAMES[::97]) if row["braid_notation"].strip()]


def knot(row):
    return from_pd(parse_matrix(row["pd_notation"]))


def link(row):
    return from_pd(parse_matrix(row["pd_notation_vector"]))


def antisymmetric(matrix):
    size = len(matrix)
    return [[matrix[i][j] - matrix[j][i] for j in range(size)] for i in range(size)]


def rank(matrix) -> int:
    return sympy.Matrix(matrix).rank() if matrix else 0


def is_alternating(diagram) -> bool:
    """Along every edge the strand passes under at exactly one of its two ends."""
    for edge, (tail, head) in diagram.edge_ends.items():
        if (tail.position == 2) == (head.position == 0):
            return False
    return True


# ---------------------------------------------------------------------- small cases by hand


def test_trefoil_matrix_is_the_hand_computed_one():
    # our own hand computation on the face loops: two bigons, each a positive Hopf band (-1)
    assert seifert_matrix(from_pd(TREFOIL)) == [[-1, 0], [1, -1]]


def test_hopf_bands():
    # from memory: the positive Hopf link bounds an annulus with framing -1, the negative +1
    assert seifert_matrix(from_pd(POSITIVE_HOPF)) == [[-1]]
    assert seifert_matrix(from_pd([[4, 1, 3, 2], [2, 3, 1, 4]])) == [[1]]


def test_crossingless_diagrams_have_empty_matrices():
    assert seifert_matrix(unknot()) == []
    assert seifert_matrix(unlink(3)) == []
    assert seifert_genus_of_surface(unlink(3)) == 0
    assert seifert_matrix(from_pd([[1, 1, 2, 2]])) == []  # one kink: two circles, one band


def test_figure_eight_has_nested_seifert_circles():
    surface = seifert_surface(from_pd(FIGURE_EIGHT))
    assert len(surface.circles) == 3
    # three circles on the sphere cut it into four regions; the middle circle has crossings on
    # both sides, so the basis draws on two regions and their disks overlap
    assert len(surface.regions) == 4
    assert len({loop.region for loop in surface.basis}) == 2
    assert integer_determinant(antisymmetric(surface.matrix)) == 1


def test_braid_closures_nest_every_circle():
    surface = seifert_surface(from_braid([1, -2, 1, -2]))  # the figure-eight knot as a 3-braid
    # the three circles of a closed 3-braid are concentric: a chain of four regions
    assert len(surface.circles) == 3 and len(surface.regions) == 4
    # from memory: the figure-eight knot has Alexander polynomial 1 - 3t + t^2 and signature 0
    assert str(alexander_polynomial(from_braid([1, -2, 1, -2]))) == "1 - 3*t + t^2"
    assert signature(from_braid([1, -2, 1, -2])) == 0


# ---------------------------------------------------------------------- structure, on the tables


@pytest.mark.parametrize("row", KNOT_SPREAD, ids=lambda row: row["name"])
def test_knot_matrices_have_unimodular_intersection_form(row):
    diagram = knot(row)
    matrix = seifert_matrix(diagram)
    size = diagram.crossing_count() - diagram.seifert_circle_count() + diagram.piece_count()
    assert len(matrix) == size == 2 * seifert_genus_of_surface(diagram)
    # Seifert 1934: V - Vᵀ is the intersection form of a surface with one boundary circle
    assert integer_determinant(antisymmetric(matrix)) == 1


@pytest.mark.parametrize("row", LINK_SPREAD, ids=lambda row: row["name"])
def test_link_intersection_form_has_one_null_class_per_extra_boundary_circle(row):
    diagram = link(row)
    matrix = seifert_matrix(diagram)
    components = diagram.component_count()
    assert len(matrix) == 2 * seifert_genus_of_surface(diagram) + components - 1
    # theorem: the radical of the intersection form of a connected surface with b boundary
    # circles is spanned by b - 1 of them
    assert rank(antisymmetric(matrix)) == len(matrix) - (components - 1)


@pytest.mark.parametrize("row", KNOT_SPREAD, ids=lambda row: row["name"])
def test_genus_of_canonical_surface(row):
    diagram = knot(row)
    genus = parse_int(row["three_genus"])
    # KnotInfo column three_genus: the canonical surface is a Seifert surface, so never smaller
    assert seifert_genus_of_surface(diagram) >= genus
    if is_alternating(diagram):
        # Crowell 1959, Murasugi 1958: Seifert's algorithm on an alternating diagram gives
        # a surface of minimal genus
        assert seifert_genus_of_surface(diagram) == genus


@pytest.mark.parametrize("row", BRAID_SPREAD, ids=lambda row: row["name"])
def test_braid_closure_diagrams(row):
    strands, word = parse_braids(row["braid_notation"])[0]
    diagram = from_braid(list(word), strands)
    # KnotInfo columns braid_notation and signature: the closed braid is the same knot
    assert signature(diagram) == parse_int(row["signature"])
    # KnotInfo column determinant
    assert determinant(diagram) == parse_int(row["determinant"])


# ---------------------------------------------------------------------- split and nested pieces


def test_split_diagram_is_block_diagonal():
    trefoil = from_pd(TREFOIL)
    with_circle = from_pd(TREFOIL, loops=1)
    assert seifert_matrix(with_circle) == seifert_matrix(trefoil)
    assert seifert_genus_of_surface(with_circle) == 1
    union = disjoint_union(trefoil, from_pd(FIGURE_EIGHT), face=3)
    surface = seifert_surface(union)
    pieces = union.pieces()
    piece_of = [next(i for i, piece in enumerate(pieces)
                     if union.faces[loop.face][loop.cycle][0].edge in piece) for loop in surface.basis]
    assert sorted(piece_of) == [0, 0, 1, 1]
    # the canonical surface of a split diagram is the disjoint union of the pieces' surfaces:
    # loops on different pieces do not link
    for i, row in enumerate(surface.matrix):
        for j, value in enumerate(row):
            if piece_of[i] != piece_of[j]:
                assert value == 0
    assert integer_determinant(antisymmetric(surface.matrix)) == 1


@pytest.mark.parametrize("face", [1, 2, 3, 4, 5])
def test_a_piece_in_any_face_of_another(face):
    trefoil = from_pd(TREFOIL)
    inner = disjoint_union(trefoil, from_pd(FIGURE_EIGHT), face=face)
    # a split piece can be moved across the sphere into any face: the link is the same
    assert signature(inner) == -2
    assert nullity(inner) == 1
    assert determinant(inner) == 0
    assert alexander_polynomial(inner).is_zero()


# ---------------------------------------------------------------------- invariance under moves


def _random_moves(diagram, rng, count):
    for _ in range(count):
        if rng.random() < 0.3 or len(diagram.edges()) < 2:
            edge = rng.choice(diagram.edges())
            diagram = r1_add(diagram, edge, rng.choice("LR"), rng.choice((1, -1)))
            continue
        face = rng.choice(sorted(diagram.faces))
        edges = sorted({side.edge for cycle in diagram.faces[face] for side in cycle})
        if len(edges) < 2:
            continue
        over, under = rng.sample(edges, 2)
        diagram = r2_add(diagram, over, under, face)
    return diagram


@pytest.mark.parametrize("seed", range(8))
def test_invariants_survive_reidemeister_moves(seed):
    rng = random.Random(seed)
    start = rng.choice([from_pd(TREFOIL), from_pd(FIGURE_EIGHT), disjoint_union(from_pd(TREFOIL), unknot()),
                        from_pd(POSITIVE_HOPF), from_braid([1, 1, -2, 1, 3, -2, 3])])
    moved = _random_moves(start, rng, 6)
    # Reidemeister 1927: isotopic diagrams have equal invariants
    assert signature(moved) == signature(start)
    assert nullity(moved) == nullity(start)
    assert alexander_polynomial(moved) == alexander_polynomial(start)
    assert determinant(moved) == determinant(start)


def test_split_pieces_joined_by_a_bigon_still_give_zero():
    two = unlink(2)
    joined = r2_add(two, 1, 2, two.faces_beside(1)[1])
    # the diagram is connected now, but the link is still the split unlink
    assert joined.piece_count() == 1
    assert seifert_matrix(joined) == [[0]]
    assert alexander_polynomial(joined).is_zero()
    assert nullity(joined) == 1 == nullity(two)


def test_mirror_reverse_and_sum_change_the_matrix_as_expected():
    trefoil = from_pd(TREFOIL)
    assert signature(mirror(trefoil)) == 2
    assert signature(reverse(trefoil)) == -2
    total = connected_sum(trefoil, from_pd(FIGURE_EIGHT))
    assert len(seifert_matrix(total)) == 4
    assert integer_determinant(antisymmetric(seifert_matrix(total))) == 1
