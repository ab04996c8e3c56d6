"""The full twist on a bundle of strands: names, refusals, torus links, undoing, and properties.

The gate of a twist is a path across the diagram crossing the given edges in order; a box on it
gets the full twist braid. The checks here come from pictures drawn by hand (exact names), from
the torus links and crossing changes a full twist is known to give, and from properties that
hold for every gate: writhe and linking numbers change by the pairs of strands, and the twist
followed by the opposite twist just beside it cancels by Reidemeister II moves.
"""

from __future__ import annotations

import functools
from collections import Counter

import pytest
from hypothesis import HealthCheck, event, given, settings
from hypothesis import strategies as st

from support.crossings import switched
from support.sphere import check_on_sphere
from movies.diagram.constructors import from_braid, reverse, torus_link, unknot, unlink
from movies.diagram.isotopy import canonical_form, same_on_sphere
from movies.diagram.assembly import assemble, check_regions
from movies.diagram.model import Diagram, Side
from movies.diagram.moves import NewNames, TwistResult, birth, r2_remove, twist
from movies.diagram.pd import from_pd
from movies.diagram.tables import table_names
from movies.errors import MoveError
from movies.invariants.jones import jones_polynomial
from movies.language.spec import parse_diagram
from support.diagrams import TREFOIL_PD as TREFOIL


PROPERTY = settings(max_examples=60, deadline=None, derandomize=True, database=None,
                    suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])


def concentric(k: int, reversed_circles: tuple[int, ...] = ()) -> Diagram:
    """Circles 1..k, each inside the one before; counterclockwise except those listed."""
    d = unknot()
    for circle in range(2, k + 1):
        inside = d.faces_beside(circle - 1)[0 if (circle - 1) not in reversed_circles else 1]
        d = birth(d, inside, counterclockwise=circle not in reversed_circles)
    return d


def leaving_gate(d: Diagram, crossing: int) -> tuple[list[int], int]:
    """The two edges leaving ``crossing``, left to right with both strands drawn going up, and
    the face on the left of the first: a gate just above the crossing."""
    a, b, c, e = d.crossings[crossing]
    # a positive crossing, both strands up, is (BR, TR, TL, BL); a negative one (BL, BR, TR, TL)
    edges = [c, b] if d.signs[crossing] > 0 else [e, c]
    return edges, d.faces_beside(edges[0])[0]


def bigons_at(d: Diagram, pair) -> list[int]:
    return [f for f, cycles in sorted(d.faces.items())
            if len(cycles) == 1 and len(cycles[0]) == 2 and set(d.face_crossings(f)) == set(pair)]


def pieces_alone(d: Diagram, pieces) -> Diagram:
    """The diagram of just these split pieces, side by side (names of crossings and edges kept)."""
    edges = frozenset().union(*pieces)
    crossings = {c: labels for c, labels in d.crossings.items() if labels[0] in edges}
    return assemble(crossings, {c: d.signs[c] for c in crossings}, edges & d.loops)


def piece_forms(d: Diagram) -> Counter:
    """Each split piece up to isotopy of the sphere on its own: the diagram with nesting forgotten."""
    return Counter(canonical_form(pieces_alone(d, [piece])) for piece in d.pieces())


def cancels_to(d: Diagram, pairs: list[tuple[int, int]], done) -> bool:
    """Remove the R2 bigons with these corner crossings, in order, then ask ``done``.

    A piece of only two crossings has two bigons with the same corners; both are tried."""
    if not pairs:
        return done(d)
    return any(cancels_to(r2_remove(d, face), pairs[1:], done) for face in bigons_at(d, pairs[0]))


def leaves_a_piece_to_choose(d: Diagram, result: TwistResult, edges) -> bool:
    """True when the gate cuts a face that also holds another split piece: the move puts the
    piece on the side that keeps the face's name, where the picture may have it on the other."""
    faces, directions = result.gate_faces, result.directions
    for i in range(1, len(edges)):
        entry = Side(edges[i - 1], "R" if directions[i - 1] > 0 else "L")
        leave = Side(edges[i], "L" if directions[i] > 0 else "R")
        cycles = d.faces[faces[i]]
        if len(cycles) > 1 and any(entry in cycle and leave in cycle for cycle in cycles):
            return True
    return False


def box_bottoms(before: Diagram, edges, directions, turns) -> list[int]:
    """The edges entering the box of a twist at its bottom, by the documented naming order."""
    k, following, bottoms = len(edges), max(before.edges()) + 1, []
    for edge, direction in zip(edges, directions):
        count = 2 * (k - 1) * abs(turns) - (1 if edge in before.loops else 0)
        mine = list(range(following, following + count))
        following += count
        # up: the bottom piece is the first part; down: the last new piece (a circle: itself)
        bottoms.append(edge if direction > 0 or edge in before.loops else mine[-1])
    return bottoms


def twist_and_undo(d: Diagram, edges, turns, start_face=None) -> tuple[TwistResult, TwistResult, bool]:
    """Twist, then twist back along a gate just below the box; True when R2 moves cancel the two
    boxes to the starting diagram on the sphere (piece by piece, when the lower gate cuts a face
    holding another split piece: which side of the gate that piece lies on is the move's choice,
    not the picture's)."""
    first = twist(d, edges, turns, start_face=start_face)
    e = first.diagram
    bottoms = box_bottoms(d, edges, first.directions, turns)
    west = e.faces_beside(bottoms[0])[0 if first.directions[0] > 0 else 1]
    second = twist(e, bottoms, -turns, start_face=west)
    upper = sorted(set(e.crossings) - set(d.crossings))
    lower = sorted(set(second.diagram.crossings) - set(e.crossings))
    m = len(upper)
    # the lower box is the inverse word: its last crossing meets the upper box's first, and so on
    pairs = [(lower[m - 1 - i], upper[i]) for i in range(m)]
    g = second.diagram
    if not leaves_a_piece_to_choose(e, second, bottoms):
        return first, second, cancels_to(g, pairs, lambda end: same_on_sphere(end, d))
    # the boxes' piece alone (a piece left between the boxes would block the R2 moves)
    boxed = [piece for piece in g.pieces() if any(label in piece for label in g.crossings[upper[0]])]
    rest = piece_forms(pieces_alone(g, [p for p in g.pieces() if p not in boxed]))
    return first, second, cancels_to(pieces_alone(g, boxed), pairs,
                                     lambda end: piece_forms(end) + rest == piece_forms(d))


# ====================================================================== by hand


def test_two_circles_side_by_side_by_hand():
    two = unlink(2)
    result = twist(two, [1, 2], +1)
    # the gate runs from inside circle 1 (its left) out across it, then into circle 2 from its
    # right: circle 1 goes up, circle 2 down
    assert result.gate_faces == (1, 2, 3)
    assert result.directions == (1, -1) and result.algebraic == 0 and result.crossings_added == 2
    d = check_on_sphere(result.diagram)
    # box word s1 s1; new edges 3 (circle 1 between the crossings), 4 (circle 2 between them);
    # crossings 1, 2 bottom to top, both negative (strands run opposite ways)
    assert d.crossings == {1: (4, 1, 2, 3), 2: (3, 2, 1, 4)}
    assert d.signs == {1: -1, 2: -1}
    assert d.loops == frozenset()
    assert d.components == {1: (1, 3), 2: (2, 4)}
    # west of the box: inside circle 1; east: inside circle 2; the outside runs round the box;
    # face 4 is the new bigon between the two crossings
    assert d.faces == {
        1: ((Side(1, "L"), Side(4, "R")),),
        2: ((Side(1, "R"), Side(2, "R")),),
        3: ((Side(2, "L"), Side(3, "R")),),
        4: ((Side(3, "L"), Side(4, "L")),),
    }


def test_two_nested_circles_with_a_third_beside_the_inner_one_by_hand():
    # circle 1 around circles 2 and 3, side by side in the annulus, all counterclockwise
    d = birth(birth(unknot(), 1), 1)
    assert d.faces[1] == ((Side(1, "L"),), (Side(2, "R"),), (Side(3, "R"),))
    result = twist(d, [1, 2], +1)
    # from outside circle 1 (its right) inward: both circles go down
    assert result.gate_faces == (2, 1, 3) and result.directions == (-1, -1)
    e = check_on_sphere(result.diagram)
    # new edges 4 (circle 1 in the box) and 5 (circle 2); crossings positive
    assert e.crossings == {1: (5, 1, 2, 4), 2: (1, 5, 4, 2)}
    assert e.signs == {1: 1, 2: 1}
    assert e.components == {1: (1, 4), 2: (2, 5), 3: (3,)}
    # the annulus keeps its name and circle 3; its two cycles became one around the box
    assert e.faces == {
        1: ((Side(1, "L"), Side(2, "R")), (Side(3, "R"),)),
        2: ((Side(1, "R"), Side(5, "R")),),
        3: ((Side(2, "L"), Side(4, "L")),),
        4: ((Side(3, "L"),),),
        5: ((Side(4, "R"), Side(5, "L")),),
    }
    assert e.piece_count() == 2 and e.linking_matrix() == [[0, 1, 0], [1, 0, 0], [0, 0, 0]]


def test_a_crossing_of_the_trefoil_switched_by_hand():
    t = from_pd(TREFOIL)
    # crossing 1 = (1, 5, 2, 4): edges 2 (under, leaving) and 5 (over, leaving); gate just above
    result = twist(t, [2, 5], -1, start_face=t.faces_beside(2)[0])
    assert result.directions == (1, 1) and result.crossings_added == 2
    d = check_on_sphere(result.diagram)
    # word s1^-1 s1^-1: crossings 4, 5; edge 2 -> 2, 7, 8 and edge 5 -> 5, 9, 10, where 8 and 10
    # take over the ends of 2 and 5 at crossing 3
    assert d.crossings == {1: (1, 5, 2, 4), 2: (3, 1, 4, 6), 3: (10, 3, 6, 8),
                           4: (2, 5, 7, 9), 5: (9, 7, 10, 8)}
    assert d.signs == {1: 1, 2: 1, 3: 1, 4: -1, 5: -1}
    assert d.components == {1: (1, 2, 7, 8, 3, 4, 5, 9, 10, 6)}
    # faces the gate does not reach keep their names and boundaries
    for face in set(t.faces) - set(result.gate_faces):
        assert d.faces[face] == t.faces[face]
    # crossing 1 and the box's first crossing bound an R2 bigon; without it, crossing 1 is switched
    [bigon] = bigons_at(d, (1, 4))
    assert same_on_sphere(r2_remove(d, bigon), switched(t, 1))
    # from memory: changing one crossing of the three-crossing trefoil diagram gives the unknot
    assert jones_polynomial(d) == jones_polynomial(unknot())


def test_chosen_names_are_used_in_the_documented_order():
    two = unlink(2)
    result = twist(two, [1, 2], +1, names=NewNames(crossings=(20, 10), edges=(40, 30), faces=(50,)))
    d = check_on_sphere(result.diagram)
    assert d.crossings == {20: (30, 1, 2, 40), 10: (40, 2, 1, 30)}
    assert d.faces[50] == ((Side(30, "L"), Side(40, "L")),)
    with pytest.raises(MoveError, match=r"^the chosen crossing name 1 is already in use$"):
        twist(from_pd(TREFOIL), [2, 5], -1, start_face=3, names=NewNames(crossings=(1,)))
    with pytest.raises(MoveError, match=r"^the chosen edge name 3 is already in use$"):
        twist(from_pd(TREFOIL), [2, 5], -1, start_face=3, names=NewNames(edges=(3,)))
    with pytest.raises(MoveError, match=r"^the chosen face name 2 is already in use$"):
        twist(from_pd(TREFOIL), [2, 5], -1, start_face=3, names=NewNames(faces=(2,)))


def test_one_strand_gives_the_same_diagram_back():
    t = from_pd(TREFOIL)
    left, right = t.faces_beside(3)
    result = twist(t, [3], +1, start_face=right)
    assert result.diagram is t and result.crossings_added == 0
    assert result.gate_faces == (right, left) and result.directions == (-1,) and result.algebraic == -1
    with pytest.raises(MoveError, match=rf"^a gate across edges \[3\] can start in face {min(left, right)} "
                                        rf"or in face {max(left, right)} \(the two sides of the first edge\); "
                                        r"say which with start_face$"):
        twist(t, [3], +1)
    with pytest.raises(MoveError, match=r"^edge 9 is not in the diagram"):
        twist(t, [9], +1, start_face=left)


# ====================================================================== refusals


def test_errors():
    t = from_pd(TREFOIL)
    two = unlink(2)
    with pytest.raises(MoveError, match=r"^a twist needs at least one edge for its gate to cross$"):
        twist(t, [], +1)
    with pytest.raises(MoveError, match=r"^the edges of a twist are a list of edge names, not 3$"):
        twist(t, 3, +1)
    for turns in (0, True, 1.0, "1", None):
        with pytest.raises(MoveError, match=r"^turns is a nonzero integer \(\+1 a right-handed full twist, "
                                            r"-1 a left-handed one\), not "):
            twist(t, [1, 2], turns)
    with pytest.raises(MoveError, match=r"^edge 7 is not in the diagram \(edges: \[1, 2, 3, 4, 5, 6\]\)$"):
        twist(t, [1, 7], +1)
    with pytest.raises(MoveError, match=r"^the gate crosses edge 1 more than once \(edges \[1, 2, 1\]\); "
                                        r"each edge at most once$"):
        twist(t, [1, 2, 1], +1)
    with pytest.raises(MoveError, match=r"^face 9 is not in the diagram \(faces: \[1, 2, 3\]\)$"):
        twist(two, [1, 2], +1, start_face=9)
    with pytest.raises(MoveError, match=r"^start_face 3 does not border edge 1 \(it lies between faces 1 and 2\)$"):
        twist(two, [1, 2], +1, start_face=3)
    with pytest.raises(MoveError, match=r"^no gate across edges \[1, 2\] from face 2: edges 1 and 2 do not share "
                                        r"a face after crossing 1 from face 2 \(the gate is in face 1; edge 2 "
                                        r"borders faces 3 and 2\)$"):
        twist(two, [1, 2], +1, start_face=2)
    # three circles side by side: started inside circle 1, the gate ends up inside circle 2, away
    # from circle 3; started outside, it is inside circle 1, away from circle 2
    three = unlink(3)
    with pytest.raises(MoveError, match=r"^no gate crosses edges \[1, 2, 3\] in this order: starting in face 1, "
                                        r"edges 2 and 3 do not share a face after crossing 2 from face 2 \(the "
                                        r"gate is in face 3; edge 3 borders faces 4 and 2\); starting in face 2, "
                                        r"edges 1 and 2 do not share a face after crossing 1 from face 2 \(the "
                                        r"gate is in face 1; edge 2 borders faces 3 and 2\)$"):
        twist(three, [1, 2, 3], +1)


def test_a_gate_that_fits_from_both_sides_needs_a_start_face():
    # in the sum of two trefoils the two edges of the joining band, 1 and 7, both lie between
    # faces 1 and 2: a gate across them fits starting on either side of edge 1
    d = parse_diagram("3_1 # 3_1")
    assert set(d.faces_beside(1)) == set(d.faces_beside(7)) == {1, 2}
    with pytest.raises(MoveError, match=r"^a gate across edges \[1, 7\] can start in face 1 or in face 2 \(the two "
                                        r"sides of the first edge\); say which with start_face$"):
        twist(d, [1, 7], +1)
    one = twist(d, [1, 7], +1, start_face=1)
    other = twist(d, [1, 7], +1, start_face=2)
    # the two gates cross the strands in opposite directions, through faces in opposite order
    assert one.directions == (1, -1) and other.directions == (-1, 1)
    assert one.gate_faces == (1, 2, 1) and other.gate_faces == (2, 1, 2)
    for result in (one, other):
        # the band's two strands run opposite ways: two negative crossings
        e = check_on_sphere(result.diagram)
        assert e.writhe() == d.writhe() - 2


def test_a_gate_that_would_cross_itself_is_refused():
    # in the sum of two trefoils the two faces beside the joining band (1 and 2) share its two
    # edges, 1 and 7: a gate through face 2, out across 7 and back in across 1, meets face 2's
    # boundary 1R 3R 5R 7R 9R 11R at 3R, 7R and then 1R, 5R: its two arcs there interleave
    d = parse_diagram("3_1 # 3_1")
    assert d.faces[2] == ((Side(1, "R"), Side(3, "R"), Side(5, "R"), Side(7, "R"), Side(9, "R"), Side(11, "R")),)
    assert set(d.faces_beside(7)) == set(d.faces_beside(1)) == {1, 2}
    with pytest.raises(MoveError, match=r"^no gate across edges \[3, 7, 1, 5\] from face 5: the gate would cross "
                                        r"itself in face 2: its arcs there \(edge 3 to edge 7, edge 1 to edge 5\) "
                                        r"cannot be drawn apart$"):
        twist(d, [3, 7, 1, 5], +1, start_face=5)
    # out across 1 and back across 7 instead: arcs 3R-1R and 7R-5R lie side by side
    result = twist(d, [3, 1, 7, 5], +1)
    assert result.gate_faces == (5, 2, 1, 2, 4)
    e = check_on_sphere(result.diagram)
    assert e.crossing_count() == d.crossing_count() + 12


# ====================================================================== torus links


@pytest.mark.parametrize("k", [2, 3, 4, 5])
def test_concentric_circles_give_the_torus_link(k):
    d = concentric(k)
    plus = twist(d, list(range(1, k + 1)), +1)
    minus = twist(d, list(range(1, k + 1)), -1)
    assert plus.directions == (-1,) * k and plus.crossings_added == k * (k - 1)
    for result, sign in ((plus, 1), (minus, -1)):
        e = check_on_sphere(result.diagram)
        new = set(e.crossings) - set(d.crossings)
        assert {e.signs[c] for c in new} == {sign}
        assert e.linking_matrix() == [[0 if i == j else sign for j in range(k)] for i in range(k)]
        assert e.piece_count() == 1 and e.loop_count() == 0
        # common practice, no source: the closure of the full twist on k strands is T(k,k)
        assert jones_polynomial(e) == jones_polynomial(torus_link(k, sign * k))


def test_the_gate_from_the_inside_out_and_clockwise_circles_give_the_same_torus_link():
    inward = twist(concentric(3), [3, 2, 1], +1, start_face=concentric(3).faces_beside(3)[0])
    assert inward.directions == (1, 1, 1)
    clockwise = torus_link(3, 0)  # the closure of the trivial braid: concentric, clockwise
    result = twist(clockwise, [1, 2, 3], +1)
    assert result.directions == (1, 1, 1)
    expected = jones_polynomial(torus_link(3, 3))
    # common practice, no source: the closure of the full twist on k strands is T(k,k)
    assert jones_polynomial(check_on_sphere(inward.diagram)) == expected
    # common practice, no source: the closure of the full twist on k strands is T(k,k)
    assert jones_polynomial(check_on_sphere(result.diagram)) == expected


def test_two_turns_give_the_torus_link_t_k_2k():
    result = twist(concentric(3), [1, 2, 3], 2)
    assert result.crossings_added == 12 and result.diagram.writhe() == 12
    # common practice, no source: the closure of the n-th power of the full twist on k strands is T(k, nk)
    assert jones_polynomial(result.diagram) == jones_polynomial(torus_link(3, 6))


def test_mixed_directions():
    # circle 2 runs clockwise: directions -1, +1, -1 across the three
    d = concentric(3, reversed_circles=(2,))
    for turns in (1, -1):
        result = twist(d, [1, 2, 3], turns)
        assert result.directions == (-1, 1, -1) and result.algebraic == -1
        e = check_on_sphere(result.diagram)
        # pairs (1,2) and (2,3) run opposite ways, (1,3) the same way
        assert e.linking_matrix() == [[0, -turns, turns], [-turns, 0, -turns], [turns, -turns, 0]]
        assert e.writhe() == -2 * turns
        # common practice, no source: the closure of the full twist on k strands is T(k,k)
        assert jones_polynomial(e) == jones_polynomial(reverse(torus_link(3, 3 * turns), [2]))


def test_anti_parallel_strands_get_two_negative_crossings():
    result = twist(unlink(2), [1, 2], +1)
    e = result.diagram
    assert result.directions == (1, -1) and sorted(e.signs.values()) == [-1, -1]
    # common practice, no source: the Hopf link with linking number -1 is the closure of s1^-2
    assert jones_polynomial(e) == jones_polynomial(from_braid([-1, -1]))


def test_parallel_strands_get_positive_crossings():
    for k in (2, 3, 4):
        d = from_braid([], strands=k)  # concentric circles, all run the same way
        result = twist(d, list(range(1, k + 1)), +1)
        assert result.directions == (1,) * k
        assert sorted(result.diagram.signs.values()) == [1] * (k * (k - 1))


# ====================================================================== crossing changes


@pytest.mark.parametrize("name", ["3_1", "4_1", "5_2", "L4a1{0}"])
def test_a_twist_against_a_crossing_switches_it(name):
    d = parse_diagram(name)
    for crossing in sorted(d.crossings):
        edges, west = leaving_gate(d, crossing)
        sign = d.signs[crossing]
        result = twist(d, edges, -sign, start_face=west)
        e = check_on_sphere(result.diagram)
        assert result.directions == (1, 1)
        first_new = min(set(e.crossings) - set(d.crossings))
        # the crossing and the box make s1 s1^-1 s1^-1 (or its mirror): one R2 move from s1^-1
        [bigon] = bigons_at(e, (crossing, first_new))
        assert same_on_sphere(r2_remove(e, bigon), switched(d, crossing))
        assert jones_polynomial(e) == jones_polynomial(switched(d, crossing))


# ====================================================================== undoing


@pytest.mark.parametrize("turns", [1, -1, 2])
def test_a_twist_and_the_opposite_twist_below_it_cancel(turns):
    cases = [
        (concentric(3), [1, 2, 3], None),
        (unlink(2), [1, 2], None),
        (concentric(3, reversed_circles=(2,)), [1, 2, 3], None),
        (parse_diagram("5_2"), [9, 4, 2], None),
        (parse_diagram("3_1 + unknot"), [1, 7], 1),
        # circle 3 lies in the face the lower gate cuts: compared piece by piece
        (unlink(3), [2, 1], 3),
    ]
    for d, edges, start_face in cases:
        first, second, cancelled = twist_and_undo(d, edges, turns, start_face)
        assert second.directions == first.directions
        assert jones_polynomial(second.diagram) == jones_polynomial(d)
        assert cancelled


def test_a_nested_circle_in_a_face_the_gate_cuts_stays_with_the_face_name():
    t = from_pd(TREFOIL)
    triangle = next(f for f, c in t.faces.items() if len(c[0]) == 3)
    d = birth(t, triangle)  # circle 7 in the triangle
    a, b, _ = [side.edge for side in d.faces[triangle][0]]
    left_a, right_a = d.faces_beside(a)
    start = right_a if left_a == triangle else left_a
    result = twist(d, [a, b], +1, start_face=start)
    assert result.gate_faces[1] == triangle
    e = check_on_sphere(result.diagram)
    assert e.side_face[Side(7, "R")] == triangle and e.piece_count() == 2
    # the part of the triangle holding its smallest old side keeps the name (and the circle)
    old_sides = [s for s in d.faces[triangle][0]]
    keeper = e.side_face[min(old_sides)]
    assert keeper == triangle
    assert any(e.side_face[s] != triangle for s in old_sides)  # the triangle was cut in two


# ====================================================================== properties


START_NAMES = [name for name in table_names(max_crossings=6) if name != "0_1"][::2] + [
    "3_1 # 3_1", "3_1 + unknot", "unlink(3)", "torus(3, 0)", "3_1 +(2,1) (unknot + unknot)",
    "L2a1{1} + unknot", "4_1 # L2a1{0}",
]


@functools.lru_cache(maxsize=None)
def start(name: str) -> Diagram:
    return parse_diagram(name)


@st.composite
def gates(draw, d: Diagram, longest: int = 4):
    """A gate that crosses each face boundary into the face beyond, never the same edge twice."""
    k = draw(st.integers(2, longest), label="k")
    first = draw(st.sampled_from(d.edges()), label="first edge")
    face = draw(st.sampled_from(sorted(set(d.faces_beside(first)))), label="start face")
    edges, here = [], face
    for _ in range(k):
        if edges:
            choices = sorted({s.edge for cycle in d.faces[here] for s in cycle} - set(edges))
            if not choices:
                break
            edge = draw(st.sampled_from(choices), label="edge")
        else:
            edge = first
        left, right = d.faces_beside(edge)
        here = right if here == left else left
        edges.append(edge)
    return edges, face


def interleaved(d: Diagram, result_faces, edges, directions) -> bool:
    """For gates of at most four edges: two arcs in one face on one boundary cycle, interleaved."""
    arcs: dict[int, list[tuple[Side, Side]]] = {}
    for i in range(1, len(edges)):
        arcs.setdefault(result_faces[i], []).append(
            (Side(edges[i - 1], "R" if directions[i - 1] > 0 else "L"),
             Side(edges[i], "L" if directions[i] > 0 else "R")))
    for face, pairs in arcs.items():
        if len(pairs) < 2:
            continue
        assert len(pairs) == 2
        (a, b), (c, e) = pairs
        cycles = [cycle for cycle in d.faces[face] if {a, b, c, e} <= set(cycle)]
        if cycles:
            position = {side: i for i, side in enumerate(cycles[0])}
            low, high = sorted((position[a], position[b]))
            if (low < position[c] < high) != (low < position[e] < high):
                return True
    return False


def walk_faces(d: Diagram, edges, start_face):
    faces, directions = [start_face], []
    for edge in edges:
        left, right = d.faces_beside(edge)
        directions.append(1 if faces[-1] == left else -1)
        faces.append(right if faces[-1] == left else left)
    return faces, directions


@PROPERTY
@given(st.sampled_from(START_NAMES), st.sampled_from([1, -1, 2, -2]), st.data())
def test_random_gates_keep_the_rules(name, turns, data):
    d = start(name)
    edges, start_face = data.draw(gates(d), label="gate")
    faces, directions = walk_faces(d, edges, start_face)
    k = len(edges)
    event(f"{k} edges")
    try:
        result = twist(d, edges, turns, start_face=start_face)
    except MoveError as err:
        assert "internal error" not in str(err)
        assert "would cross itself" in str(err)
        assert interleaved(d, faces, edges, directions)
        event("refused: the gate would cross itself")
        return
    assert not interleaved(d, faces, edges, directions)
    assert list(result.gate_faces) == faces and list(result.directions) == directions
    if k == 1:  # a gate stuck in a face of a circle: one strand, nothing to twist
        assert result.diagram is d and result.crossings_added == 0
        return
    e = check_on_sphere(result.diagram)
    check_regions(e)
    pairs = sum(directions[i] * directions[j] for i in range(k) for j in range(i + 1, k))
    # common practice, no source: in a full twist every two strands cross twice, with the same sign
    assert e.writhe() - d.writhe() == 2 * turns * pairs
    assert result.crossings_added == abs(turns) * k * (k - 1) == e.crossing_count() - d.crossing_count()
    assert sorted(e.components) == sorted(d.components)
    # common practice, no source: in a full twist every two strands cross twice, with the same sign
    for first in d.components:
        for second in d.components:
            if first < second:
                expected = sum(directions[i] * directions[j] for i in range(k) for j in range(k) if i != j
                               and d.component_of(edges[i]) == first and d.component_of(edges[j]) == second)
                assert e.linking_number(first, second) - d.linking_number(first, second) == turns * expected
    # names: new edges and crossings are the next ones; every gate edge keeps its first part
    new_edges = sorted(set(e.edges()) - set(d.edges()))
    count = sum(2 * (k - 1) * abs(turns) - (1 if edge in d.loops else 0) for edge in edges)
    assert new_edges == d.next_names("edge", count)
    assert sorted(set(e.crossings) - set(d.crossings)) == d.next_names("crossing", result.crossings_added)
    for edge in edges:
        if edge in d.loops:
            assert edge not in e.loops
        else:
            assert e.edge_ends[edge][0] == d.edge_ends[edge][0]
            assert e.dart_edge[d.edge_ends[edge][1]] in new_edges
    for face in d.faces:
        assert face in e.faces
        if face not in faces:
            assert e.faces[face] == d.faces[face]
    # undone by the opposite twist just below the box, the diagram comes back on the sphere
    _, back, cancelled = twist_and_undo(d, edges, turns, start_face)
    assert cancelled


def every_gate(d: Diagram, k: int) -> list[tuple[list[int], int]]:
    """Every gate of k edges by the faces (whether or not it can be drawn)."""
    found = []

    def extend(edges, faces):
        if len(edges) == k:
            found.append((edges, faces[0]))
            return
        for edge in sorted({s.edge for cycle in d.faces[faces[-1]] for s in cycle} - set(edges)):
            left, right = d.faces_beside(edge)
            extend(edges + [edge], faces + [right if faces[-1] == left else left])

    for edge in d.edges():
        for face in sorted(set(d.faces_beside(edge))):
            left, right = d.faces_beside(edge)
            extend([edge], [face, right if face == left else left])
    return found


@pytest.mark.parametrize("name", ["3_1 # 3_1", "3_1 # 3_1 + unknot"])
def test_every_four_edge_gate_is_drawn_exactly_when_its_arcs_do_not_interleave(name):
    d = parse_diagram(name)
    outcomes = {"drawn": 0, "refused": 0}
    for edges, start_face in every_gate(d, 4):
        faces, directions = walk_faces(d, edges, start_face)
        crossing = interleaved(d, faces, edges, directions)
        try:
            result = twist(d, edges, +1, start_face=start_face)
        except MoveError as err:
            assert crossing and "would cross itself" in str(err), (edges, start_face, str(err))
            outcomes["refused"] += 1
            continue
        assert not crossing, (edges, start_face)
        pairs = sum(directions[i] * directions[j] for i in range(4) for j in range(i + 1, 4))
        assert result.diagram.writhe() == d.writhe() + 2 * pairs
        outcomes["drawn"] += 1
    assert outcomes["refused"] >= 4 and outcomes["drawn"] > 100
