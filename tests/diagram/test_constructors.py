"""Tests of the diagram constructors (movies.diagram.constructors)."""

from __future__ import annotations

import math
from fractions import Fraction

import pytest

from movies.algebra.laurent import LaurentPolynomial as LP
from movies.diagram.constructors import (
    GeneratorError,
    connected_sum,
    disjoint_union,
    empty,
    from_braid,
    from_table,
    mirror,
    reverse,
    torus_link,
    unknot,
    unlink,
)
from movies.diagram.isotopy import same_on_sphere
from movies.diagram.assembly import assemble, trace_cycles
from movies.diagram.model import Side
from movies.diagram.pd import from_pd
from movies.diagram.tables import table_names, table_row
from movies.errors import BraidError, DiagramError, TableError
from movies.invariants.jones import jones_polynomial
from tests.support.knotinfo_columns import parse_braids

HALF = Fraction(1, 2)
T = LP.monomial(1)
#: the Jones polynomial of a split union picks up this factor per extra piece
CIRCLE = -LP.monomial(HALF) - LP.monomial(-HALF)


def jones(diagram):
    return jones_polynomial(diagram)


def bar(poly: LP) -> LP:
    """t -> 1/t."""
    return poly.substitute_power(-1)


def faces_are_traced(d) -> bool:
    """The faces hold exactly the boundary cycles the crossings give, each once."""
    held = sorted(cycle for cycles in d.faces.values() for cycle in cycles)
    return held == trace_cycles(d.crossings, d.signs, d.loops)


def pieces_fit_on_the_sphere(d) -> bool:
    """Pieces and regions form a tree: connected, with one fewer link than pieces plus regions."""
    piece_of = {edge: i for i, piece in enumerate(d.pieces()) for edge in piece}
    links = [(name, piece_of[cycle[0].edge]) for name, cycles in d.faces.items() for cycle in cycles]
    if len(links) != len(d.faces) + d.piece_count() - 1:
        return False
    reach, todo = {("face", next(iter(d.faces)))}, [("face", next(iter(d.faces)))]
    while todo:
        kind, name = todo.pop()
        for face, piece in links:
            for node, other in ((("face", face), ("piece", piece)), (("piece", piece), ("face", face))):
                if node == (kind, name) and other not in reach:
                    reach.add(other)
                    todo.append(other)
    return len(reach) == len(d.faces) + d.piece_count()


def checked(d):
    """``d``, after checking that its faces are the traced cycles, fitted together on the sphere."""
    assert faces_are_traced(d) and pieces_fit_on_the_sphere(d)
    return d


def labels_run_along_components(d) -> bool:
    """Each component carries consecutive labels along its orientation."""
    for edges in d.components.values():
        if list(edges) != list(range(edges[0], edges[0] + len(edges))):
            return False
    return True


# ----------------------------------------------------------------------------- circles
def test_unknot():
    d = unknot()
    assert d.loops == frozenset({1})
    assert d.components == {1: (1,)}
    assert d.faces == {1: ((Side(1, "L"),),), 2: ((Side(1, "R"),),)}
    assert d == from_pd([], loops=1)
    # KnotInfo column jones_polynomial: 0_1 has Jones polynomial 1
    assert jones(d) == 1


@pytest.mark.parametrize("n", [1, 2, 3, 5])
def test_unlink_side_by_side(n):
    d = unlink(n)
    assert d == from_pd([], loops=n)
    assert d.component_count() == n == d.piece_count() == d.loop_count()
    assert len(d.faces) == n + 1
    common = d.faces_beside(1)[1]
    assert set(d.faces[common]) == {(Side(e, "R"),) for e in range(1, n + 1)}
    assert all(d.faces_beside(e)[1] == common for e in range(1, n + 1))
    # common practice, no source: V(n-component unlink) = (-t^(1/2) - t^(-1/2))^(n-1)
    assert jones(d) == CIRCLE ** (n - 1)


def test_empty_diagram():
    d = unlink(0)
    assert d.is_empty() and d.component_count() == 0 and d.piece_count() == 0
    assert d.faces == {1: ()}
    assert empty() == d
    assert torus_link(0, 0) == d


@pytest.mark.parametrize("bad", [-1, 1.5, True, "2"])
def test_unlink_refuses(bad):
    with pytest.raises(DiagramError, match="whole number of circles"):
        unlink(bad)


# ----------------------------------------------------------------------------- braids
def test_braid_trefoil_is_the_table_trefoil():
    d = from_braid([1, 1, 1])
    assert d.signs == {1: 1, 2: 1, 3: 1}
    assert d.seifert_circle_count() == 2
    assert d.components == {1: (1, 2, 3, 4, 5, 6)}
    # KnotInfo columns braid_notation [1,1,1] and pd_notation [[1,5,2,4],[3,1,4,6],[5,3,6,2]]
    assert same_on_sphere(d, from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]))
    assert not same_on_sphere(d, mirror(from_table("3_1")))


def test_braid_reading_of_a_crossing():
    # sigma_1 on two strands, closed: a positive Hopf link
    d = from_braid([1, 1])
    assert d.signs == {1: 1, 2: 1}
    assert d.linking_matrix() == [[0, 1], [1, 0]]
    # LinkInfo column jones_polynomial: L2a1{1} is -x-x^5, x = t^(1/2)
    assert jones(d) == -LP.monomial(HALF) - LP.monomial(Fraction(5, 2))
    neg = from_braid([-1, -1])
    assert neg.signs == {1: -1, 2: -1}
    # the over-strand of a positive crossing runs d -> b, of a negative one b -> d
    for diagram in (d, neg):
        for name, (a, b, c, dd) in diagram.crossings.items():
            over = (dd, b) if diagram.signs[name] > 0 else (b, dd)
            assert diagram.next_edge(over[0]) == over[1]
            assert diagram.next_edge(a) == c


def test_braid_labels_and_orientation():
    d = from_braid([1, -2, 1, -2])
    assert labels_run_along_components(d)
    assert d.crossing_count() == 4 and d.writhe() == 0
    assert checked(d)
    # a connected closure names its faces exactly as assemble does
    assert d.faces == assemble(d.crossings, d.signs, d.loops).faces


def test_braid_strands_inferred_and_explicit():
    assert from_braid([2, 2]).piece_count() == 2  # strand 1 is untouched
    assert from_braid([]).loops == frozenset({1})
    d = from_braid([1, 1, 1], strands=4)
    assert d.crossing_count() == 3 and sorted(d.loops) == [7, 8]
    assert d.seifert_circle_count() == 4


def test_untouched_strands_are_nested_circles():
    d = checked(from_braid([], strands=3))
    # concentric: regions form a chain outer | 1-2 | 2-3 | inner, unlike the side-by-side unlink
    shared = sorted(cycles for cycles in d.faces.values() if len(cycles) == 2)
    assert shared == [((Side(1, "R"),), (Side(2, "L"),)), ((Side(2, "R"),), (Side(3, "L"),))]
    assert not same_on_sphere(d, unlink(3))
    assert same_on_sphere(from_braid([], strands=1), unknot())


def test_split_braid_pieces_share_the_face_between_them():
    d = checked(from_braid([1, 4], strands=5))  # pieces {1,2}, {3} (a circle), {4,5}
    assert d.piece_count() == 3
    circle = next(iter(d.loops))
    left, right = d.faces_beside(circle)
    # the circle sits between the pieces: its left face holds the right side of strand 2's
    # piece, its right face the left side of strand 4's piece
    first_piece = set(d.pieces()[0])
    last_piece = set(d.pieces()[2])
    assert {cycle[0].edge in first_piece for cycle in d.faces[left]} == {True, False}
    assert {cycle[0].edge in last_piece for cycle in d.faces[right]} == {True, False}
    assert sum(len(cycles) == 2 for cycles in d.faces.values()) == 2


def test_split_braid_is_a_union_on_the_sphere():
    d = checked(from_braid([1, 1, 1, 3, 3], strands=4))
    trefoil, hopf = from_braid([1, 1, 1]), from_braid([1, 1])
    # the right side of the trefoil's strand 2 (inner face) opens onto hopf's strand 1 left face
    union = disjoint_union(trefoil, hopf, face=trefoil.faces_beside(4)[1], other_face=hopf.faces_beside(1)[0])
    assert same_on_sphere(d, union)
    assert jones(d) == jones(trefoil) * jones(hopf) * CIRCLE


@pytest.mark.parametrize(
    "word, strands, position, text",
    [
        ([1, 0, 2], None, 2, "generator 0 at position 2"),
        ([1, 2, 3], 3, 3, "generator 3 at position 3 of the braid word is out of range: on 3 strands generators run from ±1 to ±2"),
        ([-4], 2, 1, "generator -4 at position 1"),
        ([1], 1, 1, "on 1 strand there are no generators"),
        ([1, 1.0], None, 2, "generator 1.0 at position 2 of the braid word is not an integer"),
        ([True], None, 1, "is not an integer"),
    ],
)
def test_braid_generator_errors(word, strands, position, text):
    with pytest.raises(GeneratorError) as caught:
        from_braid(word, strands)
    assert text in str(caught.value)
    assert caught.value.position == position
    assert isinstance(caught.value, BraidError)


def test_braid_strand_count_errors():
    with pytest.raises(BraidError, match="1 or more, not 0"):
        from_braid([], 0)
    with pytest.raises(BraidError, match="list of nonzero integers"):
        from_braid(5)


def knot_rows(max_crossings):
    for name in table_names("knot", max_crossings=max_crossings)[1:]:
        yield name, table_row(name)


def test_knotinfo_braid_words_close_to_the_table_knots():
    checked = 0
    for name, row in knot_rows(10):
        # KnotInfo column braid_notation (every word listed)
        for strands, word in parse_braids(row["braid_notation"]):
            d = from_braid(word, strands)
            assert d.component_count() == 1 and labels_run_along_components(d)
            assert d.seifert_circle_count() == strands and d.crossing_count() == len(word)
            # KnotInfo column jones_polynomial
            assert jones(d) == LP.parse(row["jones_polynomial"], "t"), name
            assert jones(d) == jones(from_table(name)), name
            checked += 1
    assert checked >= 250


def test_minimal_braid_words_match_the_table_diagrams():
    other_writhe = set()
    compared = 0
    for name, row in knot_rows(10):
        strands, word = parse_braids(row["braid_notation"])[0]
        if len(word) != int(row["crossing_number"]):
            continue
        d, table = from_braid(word, strands), from_table(name)
        assert d.crossing_count() == table.crossing_count()
        compared += 1
        if d.writhe() != table.writhe():
            other_writhe.add(name)
            # KnotInfo column alternating
            assert row["alternating"] == "N"
    assert compared >= 90
    # Kauffman, Murasugi, Thistlethwaite (1987): reduced alternating diagrams of one knot have
    # one writhe. From memory: the Perko pair, two minimal diagrams of 10_161, differ in writhe.
    assert other_writhe == {"10_161"}


def test_linkinfo_braid_words_close_to_the_table_links():
    checked = 0
    for name in table_names("link", max_crossings=7):
        row = table_row(name)
        if not row["braid_notation"].strip():
            continue
        # LinkInfo column braid_notation ({strands, {word}})
        for strands, word in parse_braids(row["braid_notation"]):
            d = from_braid(word, strands)
            # LinkInfo column components
            assert d.component_count() == int(row["components"]), name
            # LinkInfo column jones_polynomial (x = t^(1/2))
            assert jones(d) == LP.parse(row["jones_polynomial"], "x").substitute_power(HALF, "t"), name
            checked += 1
    assert checked >= 40


# ----------------------------------------------------------------------------- torus links
def test_torus_knots_against_the_table():
    # KnotInfo: 3_1, 5_1, 7_1 are T(2,3), T(2,5), T(2,7); 8_19 is T(3,4)  (from memory)
    for (p, q), name in {(2, 3): "3_1", (2, 5): "5_1", (2, 7): "7_1", (3, 4): "8_19"}.items():
        d = torus_link(p, q)
        assert d.crossing_count() == (p - 1) * q and d.writhe() == (p - 1) * q
        # KnotInfo column jones_polynomial
        assert jones(d) == LP.parse(table_row(name)["jones_polynomial"], "t")
    assert same_on_sphere(torus_link(2, 3), from_table("3_1"))


@pytest.mark.parametrize("p, q", [(2, 4), (3, 3), (4, 6), (3, 5), (4, 4)])
def test_torus_link_components_and_linking(p, q):
    d = torus_link(p, q)
    # common practice, no source: T(p, q) has gcd(p, q) components, each pair linking pq/g^2 times
    g = math.gcd(p, q)
    assert d.component_count() == g
    expected = p * q // g**2
    matrix = d.linking_matrix()
    assert all(matrix[i][j] == (0 if i == j else expected) for i in range(g) for j in range(g))


def test_torus_link_signs_and_degenerate_cases():
    assert torus_link(2, -3).signs == {1: -1, 2: -1, 3: -1}
    assert jones(torus_link(2, -5)) == bar(jones(torus_link(2, 5)))
    assert torus_link(-2, 3) == torus_link(2, -3)
    assert torus_link(-3, -4) == torus_link(3, 4)
    assert torus_link(1, 7) == unknot() == torus_link(1, 0) == torus_link(-1, 4)
    assert torus_link(3, 0) == from_braid([], 3)
    assert torus_link(3, 0).component_count() == 3 == torus_link(0, 3).component_count()
    assert torus_link(0, -2) == unlink(2)
    assert torus_link(3, 1).crossing_count() == 2 and torus_link(3, 1).component_count() == 1
    with pytest.raises(DiagramError, match="integers"):
        torus_link(2, 1.5)


# ----------------------------------------------------------------------------- unions
def test_union_with_defaults_matches_side_by_side():
    assert disjoint_union(unlink(2), unknot()) == unlink(3)
    assert disjoint_union(unknot(), unknot()) == unlink(2)
    trefoil = from_table("3_1")
    assert disjoint_union(trefoil, unknot()) == from_pd(trefoil.pd_code(), loops=1)


def test_union_names_shift_by_kind():
    a, b = from_braid([1, 1, 1]), from_braid([1, -2, 1, -2])
    d = checked(disjoint_union(a, b))
    assert sorted(d.crossings) == [1, 2, 3, 4, 5, 6, 7]
    assert d.crossings[4] == tuple(label + 6 for label in b.crossings[1])
    assert d.components == {1: a.components[1], 2: tuple(e + 6 for e in b.components[1])}
    opened = int(b.faces_beside(1)[1])
    kept = int(a.faces_beside(1)[1])
    assert set(d.faces) == set(a.faces) | {name + len(a.faces) for name in b.faces if name != opened}
    assert len(d.faces[kept]) == 2
    assert checked(d)
    # common practice, no source: V(K1 u K2) = (-t^(1/2) - t^(-1/2)) V(K1) V(K2)
    assert jones(d) == CIRCLE * jones(a) * jones(b)


def test_union_in_a_chosen_face_nests():
    inside = checked(disjoint_union(unknot(), unknot(), face=1, other_face=2))
    assert inside.faces[1] == ((Side(1, "L"),), (Side(2, "R"),))
    assert set(inside.faces) == {1, 2, 3}
    # both circles run the same way around a common centre: the closure of the trivial braid
    assert same_on_sphere(disjoint_union(unknot(), unknot(), face=2, other_face=1), from_braid([], 2))
    assert not same_on_sphere(inside, unlink(2))


def test_union_with_empty_is_the_other():
    trefoil = from_braid([1, 1, 1])
    assert disjoint_union(empty(), trefoil) == trefoil
    assert disjoint_union(trefoil, empty()) == trefoil
    assert disjoint_union(empty(), empty()) == empty()


def test_union_refuses_unknown_faces():
    with pytest.raises(DiagramError, match="face 9 is not in the diagram"):
        disjoint_union(unknot(), unknot(), face=9)
    with pytest.raises(DiagramError, match="face 3 is not in the diagram"):
        disjoint_union(unknot(), unknot(), other_face=3)


# ----------------------------------------------------------------------------- connected sums
def test_trefoil_sum():
    t = from_table("3_1")
    d = connected_sum(t, t)
    assert d.crossing_count() == 6 and d.writhe() == 6
    assert d.component_count() == 1 and d.piece_count() == 1
    assert d.seifert_circle_count() == 3
    assert checked(d)
    # common practice, no source: V(K1 # K2) = V(K1) V(K2)
    assert jones(d) == jones(t) ** 2


def test_sum_does_not_depend_on_the_edges():
    a, b = from_table("3_1"), from_table("4_1")
    results = set()
    for e1 in a.edges():
        for e2 in b.edges():
            d = connected_sum(a, b, e1, e2)
            assert d.crossing_count() == 7 and d.writhe() == 3 and d.seifert_circle_count() == 4
            assert len(d.faces) == len(a.faces) + len(b.faces) - 2
            assert checked(d)
            # common practice, no source: V(K1 # K2) = V(K1) V(K2), for knots at any edges
            results.add(jones(d))
    assert results == {jones(a) * jones(b)}


def test_sum_names():
    a, b = from_braid([1, 1, 1]), from_braid([-1, -1, -1])
    d = checked(connected_sum(a, b, 2, 5))
    assert d.signs == {1: 1, 2: 1, 3: 1, 4: -1, 5: -1, 6: -1}
    assert d.edges() == list(range(1, 13)) and list(d.components) == [1]
    # the band swaps the labels at the two heads: edge 2 now runs on into b's old edge 5 (11)
    expected = {name: list(labels) for name, labels in a.crossings.items()}
    expected.update({name + 3: [label + 6 for label in labels] for name, labels in b.crossings.items()})
    (head_a, at_a), (head_b, at_b) = a.edge_ends[2][1], b.edge_ends[5][1]
    expected[head_a][at_a], expected[head_b + 3][at_b] = 11, 2
    assert d.crossings == {name: tuple(labels) for name, labels in expected.items()}
    assert d.next_edge(2) == b.next_edge(5) + 6
    assert d.next_edge(11) == a.next_edge(2)
    # the faces of a keep their names; the bigons right of the two edges become one face
    assert set(a.faces) <= set(d.faces)
    assert d.faces_beside(2)[1] == a.faces_beside(2)[1] == d.faces_beside(11)[1]
    assert d.faces_beside(2)[0] == a.faces_beside(2)[0] == d.faces_beside(11)[0]


def test_sum_with_the_unknot_changes_nothing_on_the_sphere():
    t = from_braid([1, -2, 1, -2])
    assert same_on_sphere(checked(connected_sum(unknot(), t, 1, 3)), t)
    assert same_on_sphere(checked(connected_sum(t, unknot(), 4)), t)
    assert same_on_sphere(checked(connected_sum(unknot(), unknot())), unknot())


def test_sum_at_a_circle_keeps_the_first_names():
    t = from_braid([1, 1, 1])
    d = checked(connected_sum(unknot(), t))
    # the circle joins edge 1 of the trefoil (edge 2 after the shift), which takes the name 1
    assert d.edges() == [1, 3, 4, 5, 6, 7] and list(d.components) == [1]
    assert d.components[1] == (1, 3, 4, 5, 6, 7)
    assert d.faces_beside(1) == (1, 2)
    e = checked(connected_sum(t, unknot(), 3))
    assert e.edges() == t.edges() and e.crossings == t.crossings and e.components == t.components


def test_sum_carries_what_lies_beside_the_edges():
    trefoil, mirror_image = from_braid([1, 1, 1]), from_braid([-1, -1, -1])
    # a trefoil inside a circle, summed at the circle: the trefoil ends up in the joined face
    nested = disjoint_union(unknot(), trefoil, face=1)
    d = checked(connected_sum(nested, mirror_image, 1, 1))
    assert d.piece_count() == 2 and d.component_count() == 2
    assert len(d.faces[1]) == 2
    # common practice, no source: V(K1 u K2) = (-t^(1/2) - t^(-1/2)) V(K1) V(K2), V(K # unknot) = V(K)
    assert jones(d) == CIRCLE * jones(trefoil) * jones(mirror_image)
    # a circle in the face left of a trefoil edge, summed at that edge
    beside = disjoint_union(trefoil, unknot(), face=trefoil.faces_beside(1)[0])
    e = checked(connected_sum(beside, mirror_image, 1, 2))
    assert e.piece_count() == 2 and e.crossing_count() == 6
    assert sum(len(cycles) == 2 for cycles in e.faces.values()) == 1


def test_sum_of_links_at_each_component():
    hopf, trefoil = from_braid([1, 1]), from_braid([1, 1, 1])
    for edge in hopf.edges():
        d = connected_sum(hopf, trefoil, edge)
        assert d.component_count() == 2 and d.writhe() == 5
        # common practice, no source: V(L # K) = V(L) V(K) for a knot K, whichever component
        assert jones(d) == jones(hopf) * jones(trefoil)


def test_sum_refuses():
    with pytest.raises(DiagramError, match="the first diagram is empty"):
        connected_sum(empty(), unknot())
    with pytest.raises(DiagramError, match="the second diagram is empty"):
        connected_sum(unknot(), empty())
    with pytest.raises(DiagramError, match=r"edge 7 is not in the first diagram \(edges: \[1, 2, 3, 4, 5, 6\]\)"):
        connected_sum(from_braid([1, 1, 1]), unknot(), 7)
    with pytest.raises(DiagramError, match="edge 2 is not in the second diagram"):
        connected_sum(unknot(), unknot(), 1, 2)


# ----------------------------------------------------------------------------- mirror
def test_mirror():
    t = from_table("3_1")
    m = mirror(t)
    assert m.signs == {1: -1, 2: -1, 3: -1}
    # each tuple starts at the old incoming over-strand: 3_1's crossing 1 is [1,5,2,4], over 4 -> 5
    assert m.crossings[1] == (4, 1, 5, 2)
    assert m.faces == t.faces and m.components == t.components
    assert checked(m)
    assert mirror(m) == t
    assert same_on_sphere(m, from_braid([-1, -1, -1]))
    # common practice, no source: V(mirror K)(t) = V(K)(1/t)
    assert jones(m) == bar(jones(t))
    hopf = from_table("L2a1{0}")
    assert mirror(hopf).linking_matrix() == [[0, 1], [1, 0]]
    assert mirror(unknot()) == unknot() and mirror(empty()) == empty()


# ----------------------------------------------------------------------------- reverse
def test_reverse_all_keeps_signs_and_names():
    t = from_table("5_2")
    r = reverse(t)
    assert r.signs == t.signs and set(r.crossings) == set(t.crossings)
    assert set(r.edges()) == set(t.edges()) and set(r.faces) == set(t.faces)
    assert checked(r)
    assert r.components[1] == (1,) + tuple(reversed(t.components[1][1:]))
    for edge in t.edges():
        assert r.next_edge(t.next_edge(edge)) == edge
        left, right = t.faces_beside(edge)
        assert r.faces_beside(edge) == (right, left)
    assert reverse(r) == t
    # KnotInfo column symmetry_type: 5_2 is reversible, so the Jones polynomial agrees
    assert jones(r) == jones(t)


def test_reverse_one_component_against_linkinfo():
    link = from_table("L4a1{0}")
    r = reverse(link, [2])
    assert r.linking_matrix() == [[0, 2], [2, 0]] and link.linking_matrix() == [[0, -2], [-2, 0]]
    assert r.signs == {name: -sign for name, sign in link.signs.items()}
    assert checked(r)
    # LinkInfo column jones_polynomial of the other orientation L4a1{1} (x = t^(1/2))
    expected = LP.parse(table_row("L4a1{1}")["jones_polynomial"], "x").substitute_power(HALF, "t")
    assert jones(r) == expected
    assert jones(reverse(link, [1])) == expected
    assert reverse(reverse(link, [2]), [2]) == link


def test_reverse_circles():
    r = checked(reverse(unlink(2), [1]))
    assert r.faces == {1: ((Side(1, "R"),),), 2: ((Side(1, "L"),), (Side(2, "R"),)), 3: ((Side(2, "L"),),)}
    assert r.components == unlink(2).components
    assert reverse(empty()) == empty()


def test_reverse_refuses_unknown_components():
    with pytest.raises(DiagramError, match=r"component 3 is not in the diagram \(components: \[1, 2\]\)"):
        reverse(from_braid([1, 1]), [3])


# ----------------------------------------------------------------------------- tables
def test_from_table():
    d = from_table("K3_1")
    # KnotInfo column pd_notation
    assert d.pd_code() == [(1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)]
    assert from_table("0_1") == unknot()
    link = from_table("L11n459{0,1,1}")
    # LinkInfo column components
    assert link.component_count() == 4
    with pytest.raises(TableError, match="3_2"):
        from_table("3_2")
