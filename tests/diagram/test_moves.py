"""Reidemeister and Morse moves: the names they keep and make, their refusals, and properties.

The properties run random sequences of legal moves from table knots, unlinks and split diagrams
and check what must not change (link invariants, components, the sphere), that each move undone
gives the diagram back, and that illegal requests are refused with a MoveError.
"""

from __future__ import annotations

import functools
import json
import os

import database_knotinfo
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from support.sphere import check_on_sphere
from movies.diagram.assembly import assemble
from movies.diagram.model import Diagram, Side
from movies.diagram.moves import (
    NewNames, SaddleResult, birth, common_faces, death, kinks_at, r1_add, r1_remove, r2_add, r2_remove, r3, saddle,
)
from movies.diagram.pd import from_pd
from movies.errors import MoveError
from support.diagrams import TREFOIL_PD as TREFOIL, HOPF_PD as HOPF

POSITIVE_HOPF = [[4, 2, 3, 1], [2, 4, 1, 3]]
FIGURE_EIGHT = [[4, 2, 5, 1], [8, 6, 1, 5], [6, 3, 7, 4], [2, 7, 3, 8]]
# the closure of the braid s1 s2 s1 (strand positions 1, 2, 3): a kink at the middle crossing
# and a triangle with one strand over at both of its corners
BRAID_121 = [[5, 2, 6, 1], [3, 3, 4, 2], [4, 5, 1, 6]]

#: tests/bench/sweep_diagrams.py raises this for long runs; 1 keeps the default run fast
SCALE = int(os.environ.get("MOVIES_SWEEP_SCALE", "1"))
MOVES = settings(max_examples=40 * SCALE, deadline=None, derandomize=True, database=None,
                 suppress_health_check=[HealthCheck.too_slow, HealthCheck.data_too_large])
FEW = settings(MOVES, max_examples=15 * SCALE)


def trefoil():
    return from_pd(TREFOIL)


def unknot():
    return from_pd([], loops=1)


def unlink(n):
    return from_pd([], loops=n)


def empty():
    return assemble({}, {})


# ---------------------------------------------------------------------- checks from first principles




def same_on_sphere(first: Diagram, second: Diagram) -> bool:
    isotopy = pytest.importorskip("movies.diagram.isotopy")
    return isotopy.same_on_sphere(first, second)


def over_at_both(d: Diagram, edge: int) -> bool:
    tail, head = d.edge_ends[edge]
    return tail.position % 2 == 1 and head.position % 2 == 1


def corners(d: Diagram, edges) -> set[int]:
    return {d.edge_ends[e][i].crossing for e in edges for i in (0, 1)}


def is_r2_bigon(d: Diagram, face) -> bool:
    """A face with one boundary cycle of two edges, two corners, one edge over at both."""
    cycles = d.faces.get(face)
    if cycles is None or len(cycles) != 1 or len(cycles[0]) != 2:
        return False
    edges = [s.edge for s in cycles[0]]
    if any(e in d.loops for e in edges) or len(corners(d, edges)) != 2:
        return False
    return any(over_at_both(d, e) for e in edges)


def is_r3_triangle(d: Diagram, face) -> bool:
    """A face with one boundary cycle of three edges, three corners, one edge over at both."""
    cycles = d.faces.get(face)
    if cycles is None or len(cycles) != 1 or len(cycles[0]) != 3:
        return False
    edges = [s.edge for s in cycles[0]]
    if len(set(edges)) != 3 or any(e in d.loops for e in edges) or len(corners(d, edges)) != 3:
        return False
    return any(over_at_both(d, e) for e in edges)


def kink_loops(d: Diagram, crossing) -> list[int]:
    labels = d.crossings.get(crossing, ())
    return sorted({x for x in labels if list(labels).count(x) == 2})


def faces_of(d: Diagram, edge: int) -> set[int]:
    return {int(f) for f in d.faces_beside(edge)}


# ---------------------------------------------------------------------- invariants


def jones(d):
    from movies.invariants.jones import jones_polynomial

    return jones_polynomial(d)


def invariants(d: Diagram) -> dict:
    values = {
        "jones": jones(d),
        "linking": d.linking_matrix(),
        "components": d.component_count(),
    }
    return values


# ---------------------------------------------------------------------- starting diagrams


@functools.lru_cache(maxsize=None)
def table_code(name: str):
    if name.startswith("L"):
        rows = database_knotinfo.link_list(proper_links=True)
        row = next(r for r in rows[1:] if r["name"] == name)
        return json.loads(row["pd_notation_vector"].replace("{", "[").replace("}", "]"))
    row = next(r for r in database_knotinfo.link_list()[1:] if r["name"] == name)
    return json.loads(row["pd_notation"])


def nested_circle_in_triangle() -> Diagram:
    d = trefoil()
    triangle = next(f for f, c in d.faces.items() if len(c[0]) == 3)
    return birth(d, triangle)


STARTS = {
    # KnotInfo column pd_notation
    "3_1": lambda: from_pd(table_code("3_1")),
    # KnotInfo column pd_notation
    "4_1": lambda: from_pd(table_code("4_1")),
    # KnotInfo column pd_notation
    "5_2": lambda: from_pd(table_code("5_2")),
    # LinkInfo column pd_notation_vector
    "L2a1{1}": lambda: from_pd(table_code("L2a1{1}")),
    # LinkInfo column pd_notation_vector
    "L4a1{0}": lambda: from_pd(table_code("L4a1{0}")),
    "unknot": unknot,
    "unlink 2": lambda: unlink(2),
    "unlink 3": lambda: unlink(3),
    "3_1 + circle": lambda: from_pd(TREFOIL, loops=1),
    "hopf + 2 circles": lambda: from_pd(HOPF, loops=2),
    "two curls": lambda: from_pd([[1, 2, 2, 1], [3, 4, 4, 3]]),
    "circle in a triangle": nested_circle_in_triangle,
    "s1 s2 s1": lambda: from_pd(BRAID_121),
}


@functools.lru_cache(maxsize=None)
def start(name: str) -> Diagram:
    return STARTS[name]()


@functools.lru_cache(maxsize=None)
def start_invariants(name: str) -> dict:
    return invariants(start(name))


def reidemeister_moves(d: Diagram, grow: bool = True) -> list[tuple]:
    """Every legal Reidemeister move, found from the definitions (not by trying the moves)."""
    moves = []
    if grow:
        moves += [("r1_add", e, h, s) for e in d.edges() for h in "LR" for s in (1, -1)]
        for face, cycles in sorted(d.faces.items()):
            edges = sorted({s.edge for c in cycles for s in c})
            moves += [("r2_add", a, b, face) for a in edges for b in edges if a != b]
    moves += [("r1_remove", c, k) for c in sorted(d.crossings) for k in kink_loops(d, c)]
    moves += [("r2_remove", f) for f in sorted(d.faces) if is_r2_bigon(d, f)]
    moves += [("r3", f) for f in sorted(d.faces) if is_r3_triangle(d, f)]
    return moves


MOVE = {"r1_add": r1_add, "r1_remove": r1_remove, "r2_add": r2_add, "r2_remove": r2_remove, "r3": r3}


def apply(d: Diagram, move: tuple) -> Diagram:
    return MOVE[move[0]](d, *move[1:])


def wander(data, d: Diagram, steps: int, limit: int = 9) -> tuple[Diagram, list]:
    """Apply ``steps`` random legal Reidemeister moves, checking each frame on the sphere."""
    history = []
    for _ in range(steps):
        moves = reidemeister_moves(d, grow=d.crossing_count() < limit) or reidemeister_moves(d)
        move = data.draw(st.sampled_from(moves), label="move")
        history.append(move)
        d = check_on_sphere(apply(d, move))
    return d, history


start_names = st.sampled_from(sorted(STARTS))


# ====================================================================== R1


def test_r1_add_on_an_edge_all_four_kinks_by_hand():
    d = trefoil()
    # new names: crossing 4; edges 7 (the loop) and 8 (the rest of edge 1); face 6 (the monogon)
    # The tuples, counterclockwise from the incoming under-strand, drawn with edge 1 arriving
    # from the south:
    #   L +1: 1 goes under to the north, loops back to the west (left) and over to the east
    #   L -1: 1 comes from the east over to the west, loops round to the south, under to the north
    #   R +1: 1 comes from the west over to the east, loops to the south (right), under to the north
    #   R -1: 1 goes under to the north, loops to the east (right) and over to the west
    expected = {("L", 1): (1, 8, 7, 7), ("L", -1): (7, 1, 8, 7),
                ("R", 1): (7, 7, 8, 1), ("R", -1): (1, 7, 7, 8)}
    for (hand, sign), labels in expected.items():
        e = check_on_sphere(r1_add(d, 1, hand, sign))
        assert e.crossings[4] == labels and e.signs[4] == sign
        assert e.writhe() == 3 + sign
        assert e.components == {1: (1, 7, 8, 2, 3, 4, 5, 6)}
        # the head of edge 1 at crossing 1 is now the head of 8
        assert e.crossings[1] == (8, 5, 2, 4)
        assert kinks_at(e, 4) == [7]
        # the monogon is face 6, on the kink's left for a left kink (counterclockwise loop)
        assert e.faces[6] == ((Side(7, hand),),)
        # the loop lies in the face on that side of edge 1, which keeps its name
        outside = 1 if hand == "L" else 2
        assert e.side_face[Side(7, "R" if hand == "L" else "L")] == outside
        assert int(e.faces_beside(1)[0 if hand == "L" else 1]) == outside
        # faces away from edge 1 are untouched
        for face in (3, 4, 5):
            assert e.faces[face] == d.faces[face]


def test_r1_add_on_a_circle_needs_only_the_loop_edge():
    d = r1_add(unknot(), 1, "L", 1)
    check_on_sphere(d)
    assert d.loops == frozenset() and d.edges() == [1, 2]
    assert d.crossings == {1: (1, 1, 2, 2)} and d.signs == {1: 1}
    assert d.components == {1: (1, 2)}
    assert sorted(d.faces) == [1, 2, 3] and d.faces[3] == ((Side(2, "L"),),)
    assert r1_remove(d, 1) == unknot()


def test_r1_add_with_chosen_names():
    d = r1_add(trefoil(), 3, "R", -1, names=NewNames(crossings=(10,), edges=(20, 21), faces=(30,)))
    check_on_sphere(d)
    assert sorted(d.crossings) == [1, 2, 3, 10]
    assert d.components[1] == (1, 2, 3, 20, 21, 4, 5, 6)
    assert d.faces[30] == ((Side(20, "R"),),)


def test_r1_add_refuses_a_chosen_name_in_use():
    with pytest.raises(MoveError, match="the chosen edge name 2 is already in use"):
        r1_add(trefoil(), 1, "L", 1, names=NewNames(edges=(2,)))
    with pytest.raises(MoveError, match="the chosen crossing name 1 is already in use"):
        r1_add(trefoil(), 1, "L", 1, names=NewNames(crossings=(1,)))


def test_r1_add_refuses_a_chosen_face_name_in_use_without_calling_it_an_internal_error():
    with pytest.raises(MoveError) as info:
        r1_add(trefoil(), 1, "L", 1, names=NewNames(faces=(1,)))
    assert "already in use" in str(info.value)
    # the caller chose a name that is taken: that is not a failure of the program
    assert "internal error" not in str(info.value)


def test_r1_add_errors():
    d = trefoil()
    with pytest.raises(MoveError, match=r"^edge 9 is not in the diagram \(edges: \[1, 2, 3, 4, 5, 6\]\)$"):
        r1_add(d, 9, "L", 1)
    with pytest.raises(MoveError, match=r"""^the side of an edge is "L" or "R", not 'X'$"""):
        r1_add(d, 1, "X", 1)
    with pytest.raises(MoveError, match=r"""not 'l'"""):
        r1_add(d, 1, "l", 1)
    for sign in (0, 2, -2):
        with pytest.raises(MoveError, match=rf"^the sign of a kink is \+1 or -1, not {sign}$"):
            r1_add(d, 1, "L", sign)


@pytest.mark.parametrize("sign", [1.0, True, -1.0], ids=["float 1.0", "True", "float -1.0"])
def test_r1_add_refuses_a_sign_that_is_not_the_integer_plus_or_minus_one(sign):
    # a float or a bool would be stored as the crossing's sign (the writhe would become 1.0)
    with pytest.raises(MoveError, match="the sign of a kink is"):
        r1_add(trefoil(), 1, "L", sign)


def test_r1_remove_gives_back_the_same_diagram_for_every_kink_on_the_trefoil():
    d = trefoil()
    for edge in d.edges():
        for hand in "LR":
            for sign in (1, -1):
                e = r1_add(d, edge, hand, sign)
                assert r1_remove(e, 4) == d
                assert r1_remove(e, 4, kink=7) == d


def test_r1_remove_of_a_curl_keeps_the_smaller_loop_name():
    curl = from_pd([[1, 2, 2, 1]])
    assert kinks_at(curl, 1) == [1, 2]
    # either loop is a kink; without a choice the larger one goes
    d = check_on_sphere(r1_remove(curl, 1))
    assert d.loops == frozenset({1}) and d.components == {1: (1,)} and d.crossings == {}
    e = check_on_sphere(r1_remove(curl, 1, kink=1))
    # the whole component was the kink: a circle named by its smallest remaining edge
    assert e.loops == frozenset({2}) and e.components == {1: (2,)}
    assert same_on_sphere(d, e)


def test_r1_remove_errors():
    d = trefoil()
    with pytest.raises(MoveError, match=r"^crossing 1 is not a kink: no edge runs from it straight back to it "
                                        r"\(its edges are \[1, 5, 2, 4\]\)$"):
        r1_remove(d, 1)
    e = r1_add(d, 2, "L", 1)
    with pytest.raises(MoveError, match=r"^edge 2 is not a kink loop at crossing 4 \(loops there: \[7\]\)$"):
        r1_remove(e, 4, kink=2)


@MOVES
@given(start_names, st.data())
def test_r1_add_then_remove_is_the_identity_and_names_follow_the_rules(name, data):
    d, _ = wander(data, start(name), data.draw(st.integers(0, 3), label="steps"))
    edge = data.draw(st.sampled_from(d.edges()), label="edge")
    hand = data.draw(st.sampled_from("LR"), label="hand")
    sign = data.draw(st.sampled_from((1, -1)), label="sign")
    e = check_on_sphere(r1_add(d, edge, hand, sign))
    [crossing] = d.next_names("crossing", 1)
    kink, after = d.next_names("edge", 2)
    [monogon] = d.next_names("face", 1)
    assert set(e.crossings) == set(d.crossings) | {crossing}
    assert e.signs[crossing] == sign and e.writhe() == d.writhe() + sign
    assert kinks_at(e, crossing) == sorted({kink, edge} if edge in d.loops else {kink})
    assert e.faces[monogon] == ((Side(kink, hand),),)
    new_edges = {kink} if edge in d.loops else {kink, after}
    assert set(e.edges()) == set(d.edges()) | new_edges
    assert sorted(e.components) == sorted(d.components)
    assert e.component_of(edge) == d.component_of(edge)
    # the kink sits in the face on the chosen side of the edge; that face keeps its name
    beside = int(d.faces_beside(edge)[0 if hand == "L" else 1])
    assert e.side_face[Side(kink, "R" if hand == "L" else "L")] == beside
    # faces that do not border the edge are untouched
    for face, cycles in d.faces.items():
        if face not in faces_of(d, edge):
            assert e.faces[face] == cycles
    assert r1_remove(e, crossing) == d


# ====================================================================== R2


def test_r2_add_two_circles_by_hand():
    d = unlink(2)
    e = check_on_sphere(r2_add(d, 1, 2, 2))
    # new crossings 1, 2 (1 is where the pushed edge 1 meets first), edges 3 (the pushed stretch
    # between the crossings) and 4 (the under stretch); circles need no "after" edges
    assert e.edges() == [1, 2, 3, 4] and e.loops == frozenset()
    assert e.over_edges(1) == (1, 3) and e.over_edges(2) == (3, 1)
    assert over_at_both(e, 3) and not over_at_both(e, 4)
    assert e.components == {1: (1, 3), 2: (2, 4)}
    assert e.writhe() == 0 and e.linking_matrix() == [[0, 0], [0, 0]] and e.piece_count() == 1
    # the shared outside stays one face (it had two boundary cycles); the bigon is the new face 4
    assert sorted(e.faces) == [1, 2, 3, 4]
    assert e.faces[4] == ((Side(3, "L"), Side(4, "L")),)
    assert r2_remove(e, 4) == d


def test_r2_add_across_a_triangle_by_hand():
    d = trefoil()
    e = check_on_sphere(r2_add(d, 1, 3, 2))
    # crossings 4 (met first by the pushed edge 1) and 5; edges 7 (pushed stretch), 8 (rest of 1),
    # 9 (stretch of 3 under the finger), 10 (rest of 3)
    assert e.over_edges(4) == (1, 7) and e.over_edges(5) == (7, 8)
    assert e.under_edges(5) == (3, 9) and e.under_edges(4) == (9, 10)
    assert e.components == {1: (1, 7, 8, 2, 3, 9, 10, 4, 5, 6)}
    # face 2 (1R 3R 5R) is cut in three: the part holding its smallest side 1R keeps the name
    assert e.faces[2] == ((Side(1, "R"), Side(10, "R")),)
    bigon = [f for f, c in e.faces.items() if {s.edge for s in c[0]} == {7, 9}]
    assert len(bigon) == 1 and is_r2_bigon(e, bigon[0])
    assert r2_remove(e, bigon[0]) == d


def test_r2_add_names_the_bigon_first_among_the_new_faces():
    # documented order of new names: "the faces: the bigon, then the part of face that does not
    # keep its name"; the trefoil has faces 1..5, so the bigon (sides 7L 9L) must be face 6
    e = r2_add(trefoil(), 1, 3, 2)
    assert e.faces[6] == ((Side(7, "L"), Side(9, "L")),)
    assert e.faces[7] == ((Side(3, "R"), Side(5, "R"), Side(8, "R")),)


def test_r2_add_with_chosen_names():
    e = r2_add(trefoil(), 1, 3, 2, names=NewNames(crossings=(40, 41), edges=(50, 51, 52, 53)))
    check_on_sphere(e)
    assert e.over_edges(40) == (1, 50) and e.over_edges(41) == (50, 51)
    assert e.under_edges(41) == (3, 52) and e.under_edges(40) == (52, 53)


def test_r2_add_joins_two_split_pieces():
    d = from_pd(TREFOIL, loops=1)
    shared = common_faces(d, 1, 7)
    assert len(shared) == 1
    e = check_on_sphere(r2_add(d, 7, 1, shared[0]))
    assert e.piece_count() == 1 and e.crossing_count() == 5 and e.writhe() == 3
    assert e.linking_matrix() == [[0, 0], [0, 0]]
    assert jones(e) == jones(d)


def test_r2_add_errors():
    d = trefoil()
    with pytest.raises(MoveError, match=r"^R2 needs two different edges; to fold edge 1 over itself, "
                                        r"first add a kink on it$"):
        r2_add(d, 1, 1, 1)
    with pytest.raises(MoveError, match=r"^edge 6 does not border face 2 \(it lies between faces 3 and 5\)$"):
        r2_add(d, 1, 6, 2)
    with pytest.raises(MoveError, match=r"^edge 0 is not in the diagram"):
        r2_add(d, 0, 1, 2)
    with pytest.raises(MoveError, match=r"^edge 11 is not in the diagram"):
        r2_add(d, 1, 11, 2)


def test_r2_remove_errors():
    t = trefoil()
    with pytest.raises(MoveError, match=r"^face 2 is not a bigon: its boundary has 3 edges$"):
        r2_remove(t, 2)
    with pytest.raises(MoveError, match=r"^face 2 is not a bigon: it touches 2 split pieces$"):
        r2_remove(unlink(2), 2)
    # the Hopf link's bigons alternate: no edge is over at both ends
    with pytest.raises(MoveError, match=r"^bigon 1 is not an R2 bigon: neither edge 1 nor edge 4 is over "
                                        r"at both crossings \[1, 2\]$"):
        r2_remove(from_pd(HOPF), 1)
    # the outside of a curl has two sides and one corner
    curl = from_pd([[1, 2, 2, 1]])
    with pytest.raises(MoveError, match=r"^face 2 has only one corner crossing \(1\); that is a kink, use R1$"):
        r2_remove(curl, 2)
    with pytest.raises(MoveError, match=r"^face 1 is not a bigon"):
        r2_remove(curl, 1)


def test_r2_remove_keeps_the_arriving_edges_and_the_smaller_face_name():
    d = unlink(2)
    e = r2_add(d, 1, 2, 2)
    back = check_on_sphere(r2_remove(e, 4))
    assert back.edges() == [1, 2] and back.loops == frozenset({1, 2})
    assert back.faces == d.faces


@MOVES
@given(start_names, st.data())
def test_r2_add_then_remove_on_the_new_bigon_gives_the_diagram_back(name, data):
    d, _ = wander(data, start(name), data.draw(st.integers(0, 3), label="steps"))
    face = data.draw(st.sampled_from(sorted(d.faces)), label="face")
    edges = sorted({s.edge for c in d.faces[face] for s in c})
    if len(edges) < 2:
        return
    over = data.draw(st.sampled_from(edges), label="over")
    under = data.draw(st.sampled_from([e for e in edges if e != over]), label="under")
    e = check_on_sphere(r2_add(d, over, under, face))
    first, second = d.next_names("crossing", 2)
    assert set(e.crossings) == set(d.crossings) | {first, second}
    fresh = iter(d.next_names("edge", 4))
    tip = next(fresh)
    over_after = over if over in d.loops else next(fresh)
    mid = next(fresh)
    under_after = under if under in d.loops else next(fresh)
    # the pushed edge meets `first`, runs over along `tip` to `second` and on as `over_after`
    assert e.over_edges(first) == (over, tip) and e.over_edges(second) == (tip, over_after)
    assert {e.under_edges(first), e.under_edges(second)} == {(under, mid), (mid, under_after)}
    assert e.writhe() == d.writhe()
    assert e.component_of(over) == d.component_of(over) and e.component_of(under) == d.component_of(under)
    # the part of the face holding its smallest side keeps the name
    assert min(s for c in d.faces[face] for s in c) in {s for c in e.faces[face] for s in c}
    bigons = [f for f, c in e.faces.items() if len(c) == 1 and {s.edge for s in c[0]} == {tip, mid}]
    assert len(bigons) == 1 and is_r2_bigon(e, bigons[0])
    back = check_on_sphere(r2_remove(e, bigons[0]))
    assert back.edges() == d.edges()
    assert same_on_sphere(back, d)
    assert back == d


@MOVES
@given(start_names, st.data())
def test_r2_add_names_its_new_faces_in_the_documented_order(name, data):
    d, _ = wander(data, start(name), data.draw(st.integers(0, 2), label="steps"))
    face = data.draw(st.sampled_from(sorted(d.faces)), label="face")
    edges = sorted({s.edge for c in d.faces[face] for s in c})
    if len(edges) < 2:
        return
    over = data.draw(st.sampled_from(edges), label="over")
    under = data.draw(st.sampled_from([e for e in edges if e != over]), label="under")
    e = r2_add(d, over, under, face)
    new = sorted(set(e.faces) - set(d.faces))
    assert set(d.faces) <= set(e.faces)
    assert new == d.next_names("face", len(new))
    tip = d.next_names("edge", 1)[0]
    # the bigon is the first new face
    assert tip in {s.edge for s in e.faces[new[0]][0]} and len(e.faces[new[0]][0]) == 2


# ====================================================================== R3


def test_r3_on_the_braid_triangle_by_hand():
    d = check_on_sphere(from_pd(BRAID_121))
    assert d.faces[3] == ((Side(2, "L"), Side(4, "L"), Side(6, "R")),)
    assert is_r3_triangle(d, 3)
    e = check_on_sphere(r3(d, 3))
    # crossings, signs and over/under stay; triangle edges 2, 4, 6 become 7, 8, 9 (in that order)
    assert sorted(e.crossings) == [1, 2, 3] and e.signs == d.signs
    assert e.edges() == [1, 3, 5, 7, 8, 9]
    assert e.faces[3] == ((Side(7, "R"), Side(8, "R"), Side(9, "L")),)
    # the strand through edge 2 ran 1 -> crossing 1 -> 2 -> crossing 2 -> 3; now it meets
    # crossing 2 first: 1 -> crossing 2 -> 7 -> crossing 1 -> 3
    assert e.components == {1: (1, 7, 3, 8), 2: (5, 9)}
    assert e.edge_ends[1][1].crossing == 2
    assert e.edge_ends[7][0].crossing == 2 and e.edge_ends[7][1].crossing == 1
    # the kink moved with the slide: the closing arc 1 is now the loop at crossing 2
    assert kinks_at(e, 2) == [1] and kinks_at(d, 2) == [3]
    assert jones(e) == jones(d) and e.linking_matrix() == d.linking_matrix()
    assert same_on_sphere(r3(e, 3), d)


def test_r3_errors():
    t = trefoil()
    with pytest.raises(MoveError, match=r"^face 1 is not a triangle: its boundary has 2 edges$"):
        r3(t, 1)
    # the trefoil's triangles alternate: every edge is over at one end and under at the other
    with pytest.raises(MoveError) as info:
        r3(t, 2)
    message = str(info.value)
    assert message.startswith("triangle 2 cannot be moved across: no strand is over at both of its corners")
    assert "edge 1 is over at crossing 2 and under at crossing 1" in message
    assert "edge 3 is over at crossing 3 and under at crossing 2" in message
    assert "edge 5 is over at crossing 1 and under at crossing 3" in message
    circled = nested_circle_in_triangle()
    triangle = next(f for f, c in circled.faces.items() if len(c) == 2)
    with pytest.raises(MoveError, match=rf"^face {triangle} is not a triangle: it touches 2 split pieces$"):
        r3(circled, triangle)
    # three kinks on a circle: a face between them has three sides but two corners
    kinked = r1_add(r1_add(r1_add(unlink(2), 2, "R", -1), 2, "L", 1), 3, "L", 1)
    three_sided = [f for f, c in kinked.faces.items() if len(c) == 1 and len(c[0]) == 3]
    assert three_sided
    for face in three_sided:
        with pytest.raises(MoveError, match=rf"^face {face} does not have three different corner crossings"):
            r3(kinked, face)


@MOVES
@given(start_names, st.data())
def test_r3_twice_gives_the_diagram_back_and_keeps_crossings(name, data):
    d, _ = wander(data, start(name), data.draw(st.integers(0, 4), label="steps"))
    triangles = [f for f in sorted(d.faces) if is_r3_triangle(d, f)]
    if not triangles:
        triangles = [f for f in sorted(start("s1 s2 s1").faces) if is_r3_triangle(start("s1 s2 s1"), f)]
        d = start("s1 s2 s1")
    face = data.draw(st.sampled_from(triangles), label="triangle")
    old = sorted(s.edge for s in d.faces[face][0])
    e = check_on_sphere(r3(d, face))
    replacement = dict(zip(old, d.next_names("edge", 3)))
    assert e.signs == d.signs
    assert set(e.edges()) == (set(d.edges()) - set(old)) | set(replacement.values())
    assert {s.edge for s in e.faces[face][0]} == set(replacement.values()) and len(e.faces[face]) == 1
    assert is_r3_triangle(e, face)
    # each crossing keeps which strand is over: the over-strand's triangle edge is replaced by its new edge
    for crossing in d.crossings:
        if crossing in corners(d, old):
            over_old = [x for x in d.over_edges(crossing) if x in old]
            over_new = [x for x in e.over_edges(crossing) if x in replacement.values()]
            assert [replacement[x] for x in over_old] == over_new
        else:
            assert e.crossings[crossing] == d.crossings[crossing]
    assert set(e.faces) == set(d.faces)
    assert invariants(e) == invariants(d)
    assert same_on_sphere(r3(e, face), d)


# ====================================================================== random sequences


@MOVES
@given(start_names, st.data())
def test_random_reidemeister_moves_keep_jones_linking_and_components(name, data):
    d, history = wander(data, start(name), data.draw(st.integers(1, 7), label="steps"))
    before = start_invariants(name)
    after = invariants(d)
    assert after["jones"] == before["jones"], history
    assert after["linking"] == before["linking"], history
    assert after["components"] == before["components"], history
    assert sorted(d.components) == sorted(start(name).components)


@FEW
@given(start_names, st.data())
def test_random_reidemeister_moves_keep_the_signature(name, data):
    module = pytest.importorskip("movies.invariants.signature")
    d, history = wander(data, start(name), data.draw(st.integers(1, 6), label="steps"))
    assert module.signature(d) == module.signature(start(name)), history


@FEW
@given(start_names, st.data())
def test_random_reidemeister_moves_keep_the_alexander_polynomial(name, data):
    module = pytest.importorskip("movies.invariants.alexander")
    d, history = wander(data, start(name), data.draw(st.integers(1, 6), label="steps"))
    assert module.alexander_polynomial(d, "conway") == module.alexander_polynomial(start(name), "conway"), history


def test_the_invariants_seen_by_the_properties_can_tell_diagrams_apart():
    # the checks above would notice a move that changed the link
    assert start_invariants("3_1")["jones"] != start_invariants("4_1")["jones"]
    mirrored = from_pd([[4, 1, 5, 2], [6, 3, 1, 4], [2, 5, 3, 6]])
    assert mirrored.writhe() == -3
    assert start_invariants("3_1")["jones"] != invariants(mirrored)["jones"]
    assert start_invariants("L2a1{1}")["linking"] != invariants(from_pd(HOPF))["linking"]
    assert start_invariants("unlink 2")["components"] != start_invariants("unlink 3")["components"]


# ====================================================================== illegal moves


names = st.integers(min_value=-2, max_value=40)


@MOVES
@given(start_names, st.data())
def test_illegal_moves_are_refused_with_move_error(name, data):
    d, _ = wander(data, start(name), data.draw(st.integers(0, 3), label="steps"))
    kind = data.draw(st.sampled_from(["r1_add", "r1_remove", "r2_add", "r2_remove", "r3",
                                      "saddle", "birth", "death"]), label="kind")
    edges, faces = set(d.edges()), set(d.faces)
    if kind == "r1_add":
        edge = data.draw(names, label="edge")
        hand = data.draw(st.sampled_from(["L", "R", "X", ""]), label="hand")
        sign = data.draw(st.sampled_from([1, -1, 0, 2]), label="sign")
        legal = edge in edges and hand in ("L", "R") and sign in (1, -1)
        call = lambda: r1_add(d, edge, hand, sign)  # noqa: E731
    elif kind == "r1_remove":
        crossing = data.draw(names, label="crossing")
        legal = bool(kink_loops(d, crossing))
        call = lambda: r1_remove(d, crossing)  # noqa: E731
    elif kind == "r2_add":
        over, under = data.draw(names, label="over"), data.draw(names, label="under")
        face = data.draw(names, label="face")
        legal = (over in edges and under in edges and over != under and face in faces
                 and face in faces_of(d, over) and face in faces_of(d, under))
        call = lambda: r2_add(d, over, under, face)  # noqa: E731
    elif kind == "r2_remove":
        face = data.draw(names, label="face")
        legal = is_r2_bigon(d, face)
        call = lambda: r2_remove(d, face)  # noqa: E731
    elif kind == "r3":
        face = data.draw(names, label="face")
        legal = is_r3_triangle(d, face)
        call = lambda: r3(d, face)  # noqa: E731
    elif kind == "saddle":
        first, second = data.draw(names, label="first"), data.draw(names, label="second")
        face = data.draw(st.one_of(st.none(), names), label="face")
        if first in edges and second in edges:
            shared = faces_of(d, first) & faces_of(d, second)
            legal = (len(shared) == 1) if face is None else (face in shared)
        else:
            legal = False
        if legal and first == second:
            return  # a band from an edge to itself: see the tests of that case
        call = lambda: saddle(d, first, second, face)  # noqa: E731
    elif kind == "birth":
        face = data.draw(names, label="face")
        legal = face in faces
        call = lambda: birth(d, face)  # noqa: E731
    else:
        component = data.draw(names, label="component")
        legal = component in d.components and d.components[component][0] in d.loops
        call = lambda: death(d, component)  # noqa: E731
    if legal:
        result = call()
        check_on_sphere(result.diagram if isinstance(result, SaddleResult) else result)
    else:
        with pytest.raises(MoveError):
            call()


def test_unknown_names_for_every_move_are_move_errors():
    d = trefoil()
    calls = {
        "r1_add": lambda: r1_add(d, 99, "L", 1),
        "r1_remove": lambda: r1_remove(d, 99),
        "r2_add edge": lambda: r2_add(d, 99, 1, 1),
        "r2_add face": lambda: r2_add(d, 1, 4, 99),
        "r2_remove": lambda: r2_remove(d, 99),
        "r3": lambda: r3(d, 99),
        "saddle edge": lambda: saddle(d, 1, 99),
        "saddle face": lambda: saddle(d, 1, 4, face=99),
        "birth": lambda: birth(d, 99),
        "death": lambda: death(d, 99),
    }
    wrong = {}
    for what, call in calls.items():
        try:
            call()
        except MoveError as err:
            assert "99" in str(err)
        except Exception as err:  # noqa: BLE001 - reported below
            wrong[what] = type(err).__name__
        else:
            wrong[what] = "accepted"
    assert wrong == {}


# ====================================================================== saddles


def test_saddle_merging_two_circles():
    result = saddle(unlink(2), 1, 2)
    d = check_on_sphere(result.diagram)
    assert result.effect == "merge" and result.respects_orientation and result.face == 2
    assert result.components_before == (1, 2) and result.components_after == (1,)
    # the merged component keeps the smaller name
    assert d.components == {1: (1,)} and d.loops == frozenset({1})
    assert same_on_sphere(d, unknot())


@pytest.mark.parametrize("first, second", [(1, 2), (2, 1)])
def test_a_circle_merged_into_a_kinked_component_keeps_the_smaller_component_name(first, second):
    # component 1 is the circle 1; component 2 is the circle 2 with a kink (edges 2, 3)
    d = r1_add(unlink(2), 2, "L", 1)
    assert d.components == {1: (1,), 2: (2, 3)} and common_faces(d, 1, 2) == [2]
    result = saddle(d, first, second)
    assert result.effect == "merge" and result.respects_orientation
    merged = check_on_sphere(result.diagram)
    # components merged keep the smaller name
    assert list(merged.components) == [1]
    assert result.components_after == (1,)


def test_saddles_on_the_trefoil_by_hand():
    t = trefoil()
    # face 1 = 1L 4R: the edges are walked opposite ways round it, the band is not oriented
    twisted = saddle(t, 1, 4, face=1)
    assert (twisted.effect, twisted.respects_orientation) == ("twist", False)
    assert twisted.diagram.component_count() == 1
    check_on_sphere(twisted.diagram)
    # face 2 = 1R 3R 5R: any two of its edges are walked the same way, the band splits the knot
    split = saddle(t, 1, 3, face=2)
    assert (split.effect, split.respects_orientation) == ("split", True)
    d = check_on_sphere(split.diagram)
    assert d.edges() == t.edges() and sorted(d.components) == [1, 2]
    assert split.components_before == (1,) and split.components_after == (1, 2)
    # the oriented band: edge 1 now runs on along the old 3 and 3 along the old 1
    assert d.next_edge(1) == t.next_edge(3) and d.next_edge(3) == t.next_edge(1)


def test_saddles_on_the_hopf_link_by_hand():
    h = from_pd(HOPF)
    # face 1 = 1L 4R joins the two components across an unoriented band
    result = saddle(h, 1, 4, face=1)
    assert (result.effect, result.respects_orientation) == ("merge", False)
    assert check_on_sphere(result.diagram).component_count() == 1
    # face 3 = 2L 4L: an oriented band; two crossings on one component: an unknot
    result = saddle(h, 2, 4)
    assert (result.effect, result.respects_orientation) == ("merge", True)
    d = check_on_sphere(result.diagram)
    assert d.components.keys() == {1} and d.edges() == h.edges()
    # from memory: the Jones polynomial of the unknot is 1
    assert jones(d) == jones(unknot())


def test_saddle_errors():
    t = trefoil()
    with pytest.raises(MoveError, match=r"^edges 1 and 6 do not border a common face "
                                        r"\(faces of 1: \[1, 2\], of 6: \[3, 5\]\)$"):
        saddle(t, 1, 6)
    with pytest.raises(MoveError, match=r"^edge 6 does not border face 1"):
        saddle(t, 1, 6, face=1)
    with pytest.raises(MoveError, match=r"^edge 9 is not in the diagram"):
        saddle(t, 9, 1)
    # an unknot with two kinks on opposite sides: edges 1 and 4 border the same two faces
    two_kinks = r1_add(r1_add(unknot(), 1, "R", -1), 1, "L", 1)
    assert common_faces(two_kinks, 1, 4) == [1, 2]
    with pytest.raises(MoveError, match=r"^edges 1 and 4 share faces \[1, 2\]; name the face the band runs across$"):
        saddle(two_kinks, 1, 4)
    with pytest.raises(MoveError, match=r"^edges 1 and 1 share faces \[1, 2\]"):
        saddle(unknot(), 1, 1)
    with pytest.raises(MoveError, match=r"^edge 9 is not in the diagram"):
        common_faces(t, 1, 9)


def test_saddle_with_chosen_component_name():
    result = saddle(trefoil(), 1, 3, face=2, names=NewNames(components=(7,)))
    assert sorted(result.diagram.components) == [1, 7]


@pytest.mark.parametrize("face", [1, 2])
def test_a_band_from_a_circle_to_itself_splits_it_in_two_circles_on_the_sphere(face):
    # the band cuts a small circle off; the band's strip joins the face across the circle, so the
    # two circles share the face on the side away from the band: three faces in all
    result = saddle(unknot(), 1, 1, face=face)
    assert result.effect == "split" and result.respects_orientation
    d = result.diagram
    assert d.component_count() == 2 and d.piece_count() == 2
    assert len(d.faces) == 3
    check_on_sphere(d)
    other = 2 if face == 1 else 1
    # the same as a circle born beside the first one, in the face across edge 1 from the band,
    # with the band's side of the new circle as its inner disk
    assert same_on_sphere(d, birth(unknot(), other, counterclockwise=(face == 1)))


@pytest.mark.parametrize("face", [1, 2])
def test_a_band_from_a_knot_edge_to_itself_cuts_off_a_circle_on_the_sphere(face):
    t = trefoil()
    result = saddle(t, 1, 1, face=face)
    assert result.effect == "split" and result.respects_orientation
    d = result.diagram
    assert d.component_count() == 2 and d.loops == frozenset({7})
    # 5 faces of the trefoil and one new disk inside the small circle
    assert len(d.faces) == 6
    check_on_sphere(d)
    left, right = (int(f) for f in t.faces_beside(1))
    across = right if face == left else left
    assert same_on_sphere(d, birth(t, across, counterclockwise=(face == left)))


def sides_on(d: Diagram, face: int) -> list[Side]:
    return [s for c in d.faces[face] for s in c]


@MOVES
@given(start_names, st.data())
def test_saddle_effect_and_orientation_follow_the_rules(name, data):
    d, _ = wander(data, start(name), data.draw(st.integers(0, 3), label="steps"))
    face = data.draw(st.sampled_from(sorted(d.faces)), label="face")
    # edges with exactly one side on the face (for the others the side the band uses is a choice)
    single = [s for s in sides_on(d, face) if s.other() not in sides_on(d, face)]
    if len({s.edge for s in single}) < 2:
        return
    one = data.draw(st.sampled_from(single), label="first")
    two = data.draw(st.sampled_from([s for s in single if s.edge != one.edge]), label="second")
    result = saddle(d, one.edge, two.edge, face=face)
    e = check_on_sphere(result.diagram)
    change = e.component_count() - d.component_count()
    assert result.effect == {-1: "merge", 0: "twist", 1: "split"}[change]
    # common practice, no source: oriented exactly when both arcs are walked the same way round the face
    assert result.respects_orientation == (one.hand == two.hand)
    if result.respects_orientation:
        assert result.effect != "twist"
    same_component = d.component_of(one.edge) == d.component_of(two.edge)
    assert (result.effect == "merge") == (not same_component)
    assert result.face == face
    assert result.components_before == tuple(sorted(d.components))
    assert result.components_after == tuple(sorted(e.components))
    if result.effect == "merge":
        kept = min(d.component_of(one.edge), d.component_of(two.edge))
        gone = max(d.component_of(one.edge), d.component_of(two.edge))
        assert set(e.components) == set(d.components) - {gone} and kept in e.components
    if result.effect == "split":
        assert set(e.components) == set(d.components) | set(d.next_names("component", 1))
    if result.effect == "twist":
        assert set(e.components) == set(d.components)
    if result.respects_orientation and not ({one.edge, two.edge} & d.loops):
        # no edge names change; each edge runs on along the other's old continuation
        assert e.edges() == d.edges()
        assert e.next_edge(one.edge) == d.next_edge(two.edge)
        assert e.next_edge(two.edge) == d.next_edge(one.edge)
        # the same band again, across one of the faces the two edges now share, undoes it
        undone = [g for g in common_faces(e, one.edge, two.edge)
                  if same_on_sphere(saddle(e, one.edge, two.edge, face=g).diagram, d)]
        assert undone


@FEW
@given(start_names, st.data())
def test_a_band_from_an_edge_to_itself_splits_off_a_circle(name, data):
    d, _ = wander(data, start(name), data.draw(st.integers(0, 2), label="steps"))
    edge = data.draw(st.sampled_from(d.edges()), label="edge")
    hand = data.draw(st.sampled_from("LR"), label="hand")
    face = d.side_face[Side(edge, hand)]
    result = saddle(d, edge, edge, face=face)
    assert result.effect == "split" and result.respects_orientation
    e = check_on_sphere(result.diagram)
    assert e.component_count() == d.component_count() + 1
    across = d.side_face[Side(edge, "R" if hand == "L" else "L")]
    assert same_on_sphere(e, birth(d, across, counterclockwise=(hand == "L")))


# ====================================================================== births and deaths


def test_birth_names_and_sides():
    t = trefoil()
    d = check_on_sphere(birth(t, 2))
    # new edge 7 (a new component 2) and the small disk's face 6, on the circle's left
    assert d.loops == frozenset({7}) and d.components[2] == (7,)
    assert d.faces[6] == ((Side(7, "L"),),)
    assert d.side_face[Side(7, "R")] == 2 and len(d.faces[2]) == 2
    e = check_on_sphere(birth(t, 2, counterclockwise=False))
    assert e.faces[6] == ((Side(7, "R"),),) and e.side_face[Side(7, "L")] == 2
    # the small disk on the other side of the circle: a different diagram on the sphere
    assert not same_on_sphere(d, e)
    chosen = birth(t, 3, names=NewNames(edges=(70,), faces=(60,), components=(9,)))
    assert chosen.components[9] == (70,) and chosen.faces[60] == ((Side(70, "L"),),)


def test_birth_in_the_empty_diagram_is_the_unknot_on_the_sphere():
    d = check_on_sphere(birth(empty(), 1))
    assert d.components == {1: (1,)} and d.loops == frozenset({1})
    assert same_on_sphere(d, unknot())
    assert death(d, 1) == empty()


def test_death_errors_and_the_last_circle():
    t = trefoil()
    with pytest.raises(MoveError, match=r"^component 1 is not a crossingless circle \(it passes through 3 "
                                        r"crossings\); only a crossingless circle can die$"):
        death(t, 1)
    with pytest.raises(MoveError, match=r"^component 3 is not in the diagram \(components: \[1\]\)$"):
        death(t, 3)
    gone = death(unknot(), 1)
    assert gone.is_empty() and len(gone.faces) == 1


def test_death_merges_the_two_faces_of_the_circle():
    d = unlink(2)
    e = check_on_sphere(death(d, 2))
    assert e.components == {1: (1,)} and len(e.faces) == 2
    assert e.faces[1] == ((Side(1, "L"),),)


@MOVES
@given(start_names, st.data())
def test_birth_then_death_gives_back_the_same_diagram(name, data):
    d, _ = wander(data, start(name), data.draw(st.integers(0, 3), label="steps"))
    face = data.draw(st.sampled_from(sorted(d.faces)), label="face")
    ccw = data.draw(st.booleans(), label="counterclockwise")
    e = check_on_sphere(birth(d, face, counterclockwise=ccw))
    [circle] = d.next_names("edge", 1)
    [component] = d.next_names("component", 1)
    [disk] = d.next_names("face", 1)
    assert e.components[component] == (circle,)
    assert e.faces[disk] == ((Side(circle, "L" if ccw else "R"),),)
    assert e.side_face[Side(circle, "R" if ccw else "L")] == face
    assert invariants(e)["components"] == d.component_count() + 1
    assert death(e, component) == d
