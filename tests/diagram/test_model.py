"""The diagram model: faces, sides, pieces, components, Seifert circles, linking, names."""

from __future__ import annotations

import functools
import json
import os

import database_knotinfo
import networkx as nx
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from support.sphere import check_on_sphere
from movies.diagram.assembly import assemble, canonical_cycle, reencode, trace_components, trace_cycles
from movies.diagram.model import Dart, Diagram, Side, head_positions
from movies.diagram.pd import crossing_signs, from_pd
from movies.errors import DiagramError
from support.knotinfo_columns import parse_braids, parse_matrix
from support.diagrams import TREFOIL_PD as TREFOIL, HOPF_PD as HOPF

FIGURE_EIGHT = [[4, 2, 5, 1], [8, 6, 1, 5], [6, 3, 7, 4], [2, 7, 3, 8]]
CURL = [[1, 2, 2, 1]]  # one crossing, two loops: a figure-eight shaped curve

#: tests/bench/sweep_diagrams.py raises this for long runs; 1 keeps the default run fast
SCALE = int(os.environ.get("MOVIES_SWEEP_SCALE", "1"))
PROPERTY = settings(max_examples=40 * SCALE, deadline=None, derandomize=True, database=None,
                    suppress_health_check=[HealthCheck.too_slow])


@functools.lru_cache(maxsize=None)
def knot_rows() -> tuple[dict, ...]:
    """KnotInfo rows with a PD code (row 0 is the header, row 1 the unknot)."""
    return tuple(r for r in database_knotinfo.link_list()[1:] if r["pd_notation"].strip())


@functools.lru_cache(maxsize=None)
def link_rows() -> tuple[dict, ...]:
    return tuple(database_knotinfo.link_list(proper_links=True)[1:])


def link_pd(row):
    return json.loads(row["pd_notation_vector"].replace("{", "[").replace("}", "]"))


def table_diagram(row) -> Diagram:
    return from_pd(json.loads(row["pd_notation"]) if "pd_notation" in row else link_pd(row))


# ---------------------------------------------------------------------- a check from first principles


def test_hopf_faces_by_hand():
    d = from_pd(HOPF)
    # Walking 1 forward into crossing 1 (at b), turning left leaves along a = 4 backwards (4R), which
    # arrives at crossing 2 at d and turns left onto c = 1 forwards: the face 1L 4R. The others alike.
    assert d.faces == {
        1: ((Side(1, "L"), Side(4, "R")),),
        2: ((Side(1, "R"), Side(3, "R")),),
        3: ((Side(2, "L"), Side(4, "L")),),
        4: ((Side(2, "R"), Side(3, "L")),),
    }
    check_on_sphere(d)


def test_trefoil_faces_two_triangles_three_bigons():
    d = from_pd(TREFOIL)
    check_on_sphere(d)
    # common practice, no source: the standard trefoil diagram has 2 triangles and 3 bigons
    assert sorted(len(cycles[0]) for cycles in d.faces.values()) == [2, 2, 2, 3, 3]
    assert all(len(cycles) == 1 for cycles in d.faces.values())
    assert d.faces_beside(1) == (1, 2)
    triangles = [f for f, cycles in d.faces.items() if len(cycles[0]) == 3]
    for face in triangles:
        assert sorted(d.face_crossings(face)) == [1, 2, 3]
    # the two triangles share no edge; together their sides are all six edges, once each
    edges = sorted(s.edge for f in triangles for s in d.faces[f][0])
    assert edges == [1, 2, 3, 4, 5, 6]


def test_faces_beside_matches_the_face_cycles_everywhere():
    for code in (TREFOIL, HOPF, FIGURE_EIGHT, CURL):
        d = from_pd(code, loops=1)
        for edge in d.edges():
            left, right = d.faces_beside(edge)
            assert type(left) is int and type(right) is int
            assert any(Side(edge, "L") in cycle for cycle in d.faces[left])
            assert any(Side(edge, "R") in cycle for cycle in d.faces[right])


def test_a_kink_has_a_monogon_face_with_one_corner():
    d = from_pd(CURL)
    check_on_sphere(d)
    monogons = sorted(f for f, cycles in d.faces.items() if len(cycles[0]) == 1)
    assert len(monogons) == 2 and len(d.faces) == 3
    for face in monogons:
        assert d.face_crossings(face) == [1]
    outer = next(f for f in d.faces if f not in monogons)
    # the outer face meets the crossing twice
    assert d.face_crossings(outer) == [1, 1]


def test_face_crossings_of_a_bigon_are_its_two_ends():
    d = from_pd(HOPF)
    for face in d.faces:
        assert sorted(d.face_crossings(face)) == [1, 2]


@pytest.mark.parametrize("row", [r for r in knot_rows() if int(r["crossing_number"]) <= 8][::3],
                         ids=lambda r: r["name"])
def test_table_knots_have_crossings_plus_two_faces(row):
    d = table_diagram(row)
    check_on_sphere(d)
    assert len(d.faces) == d.crossing_count() + 2


def test_table_links_are_on_the_sphere():
    for row in link_rows()[::60]:
        check_on_sphere(table_diagram(row))


def test_unknown_names_are_diagram_errors_naming_them():
    d = from_pd(TREFOIL)
    with pytest.raises(DiagramError, match=r"edge 9 is not in the diagram \(edges: \[1, 2, 3, 4, 5, 6\]\)"):
        d.faces_beside(9)
    with pytest.raises(DiagramError, match=r"face 7 is not in the diagram \(faces: \[1, 2, 3, 4, 5\]\)"):
        d.face(7)
    with pytest.raises(DiagramError, match=r"face 7 is not in the diagram"):
        d.face_crossings(7)
    with pytest.raises(DiagramError, match=r"crossing 4 is not in the diagram \(crossings: \[1, 2, 3\]\)"):
        d.crossing(4)
    with pytest.raises(DiagramError, match=r"crossing 4 is not in the diagram"):
        d.over_edges(4)
    with pytest.raises(DiagramError, match=r"edge 0 is not in the diagram"):
        d.component_of(0)
    with pytest.raises(DiagramError, match=r"edge 0 is not in the diagram"):
        d.next_edge(0)
    with pytest.raises(DiagramError, match=r"component 2 is not in the diagram \(components: \[1\]\)"):
        d.linking_number(1, 2)


# ---------------------------------------------------------------------- edges and crossings


def test_edge_ends_and_strands_of_the_trefoil_by_hand():
    d = from_pd(TREFOIL)
    # crossing 1 = (1, 5, 2, 4), positive: under 1 -> 2, over 4 -> 5
    assert d.under_edges(1) == (1, 2) and d.over_edges(1) == (4, 5)
    # edge 1 leaves crossing 2 on its over-strand (6 -> 1 at b) and enters crossing 1 at a
    assert d.edge_ends[1] == (Dart(2, 1), Dart(1, 0))
    assert [d.next_edge(e) for e in range(1, 7)] == [2, 3, 4, 5, 6, 1]


def test_over_and_under_edges_at_a_negative_crossing():
    d = from_pd(HOPF)
    # crossing 1 = (4, 1, 3, 2), negative: the over-strand runs b -> d
    assert d.signs[1] == -1
    assert d.under_edges(1) == (4, 3) and d.over_edges(1) == (1, 2)


def test_heads_sit_where_the_sign_says():
    assert head_positions(+1) == (0, 3) and head_positions(-1) == (0, 1)
    for code in (TREFOIL, HOPF, FIGURE_EIGHT, CURL):
        d = from_pd(code)
        for edge, (tail, head) in d.edge_ends.items():
            assert head.position in head_positions(d.signs[head.crossing])
            assert tail.position not in head_positions(d.signs[tail.crossing])
            assert d.crossings[head.crossing][head.position] == edge
            assert d.crossings[tail.crossing][tail.position] == edge


def test_edges_that_do_not_start_and_end_are_refused():
    with pytest.raises(DiagramError, match="ends twice"):
        Diagram({1: (1, 1, 2, 2)}, {1: -1}).edge_ends
    with pytest.raises(DiagramError, match="do not both start and end"):
        Diagram({1: (1, 2, 3, 4)}, {1: 1}).edge_ends


def test_a_loop_follows_itself():
    d = from_pd(TREFOIL, loops=1)
    assert d.next_edge(7) == 7 and d.component_of(7) == 2


# ---------------------------------------------------------------------- pieces, circles, split diagrams


def test_split_code_has_two_pieces():
    d = from_pd([[1, 2, 2, 1], [3, 4, 4, 3]])
    check_on_sphere(d)
    assert d.pieces() == (frozenset({1, 2}), frozenset({3, 4}))
    assert d.piece_count() == 2 and d.component_count() == 2
    # side by side: one region holds a cycle of each piece; 3 + 3 faces less the shared one
    assert len(d.faces) == 5
    shared = [f for f, cycles in d.faces.items() if len(cycles) == 2]
    assert len(shared) == 1
    assert d.region_of_piece(0) == shared and d.region_of_piece(1) == shared


@pytest.mark.parametrize("loops", [0, 1, 2, 3])
@pytest.mark.parametrize("code", [TREFOIL, HOPF, FIGURE_EIGHT, CURL], ids=["3_1", "hopf", "4_1", "curl"])
def test_from_pd_with_loops_places_everything_side_by_side(code, loops):
    d = from_pd(code, loops=loops)
    check_on_sphere(d)
    crossings = len(code)
    top = max(x for row in code for x in row)
    assert sorted(d.loops) == list(range(top + 1, top + 1 + loops))
    assert d.loop_count() == loops and d.piece_count() == 1 + loops
    assert d.component_count() == len(trace_components(d.crossings, d.signs)) + loops
    # each piece contributes its own faces; the common region is counted once
    assert len(d.faces) == (crossings + 2) + 2 * loops - loops
    common = int(d.faces_beside(d.edges()[0])[1])
    for piece in d.pieces():
        # documented placement: the face right of each piece's smallest edge is the common one
        assert int(d.faces_beside(min(piece))[1]) == common
    assert len(d.faces[common]) == 1 + loops
    for index in range(d.piece_count()):
        assert d.region_of_piece(index) == ([common] if loops else [])
    for loop in d.loops:
        assert d.components[d.component_of(loop)] == (loop,)


def test_crossingless_circles_only():
    d = from_pd([], loops=3)
    check_on_sphere(d)
    # circles side by side: 3 insides and one outside
    assert len(d.faces) == 4 and d.piece_count() == 3
    assert d.faces == {1: ((Side(1, "L"),),), 2: ((Side(1, "R"),), (Side(2, "R"),), (Side(3, "R"),)),
                       3: ((Side(2, "L"),),), 4: ((Side(3, "L"),),)}
    assert d.components == {1: (1,), 2: (2,), 3: (3,)}
    assert d.seifert_circles() == [(1,), (2,), (3,)]
    assert d.linking_matrix() == [[0, 0, 0], [0, 0, 0], [0, 0, 0]]
    assert d.is_crossingless() and not d.is_empty() and d.writhe() == 0


def test_the_empty_diagram():
    d = assemble({}, {})
    assert d.is_empty() and d.is_crossingless()
    assert d.faces == {1: ()} and d.components == {} and d.loops == frozenset()
    assert d.pieces() == () and d.piece_count() == 0 and d.component_count() == 0
    assert d.edges() == [] and d.linking_matrix() == [] and d.seifert_circles() == []
    assert d.writhe() == 0 and d.crossing_count() == 0 and d.pd_code() == []
    assert d.next_names("edge", 2) == [1, 2] and d.next_names("face", 1) == [2]
    assert d.next_names("crossing", 1) == [1] and d.next_names("component", 1) == [1]
    assert d.summary().splitlines() == [
        "crossings (PD a b c d, sign):",
        "  (none)",
        "components (edges along the orientation):",
        "  (none)",
        "faces (sides walked with the face on the left; L/R = left/right of the edge):",
        "  1: ",
    ]


# ---------------------------------------------------------------------- components and linking


def test_components_follow_the_orientation():
    assert from_pd(TREFOIL).components == {1: (1, 2, 3, 4, 5, 6)}
    assert from_pd(HOPF).components == {1: (1, 2), 2: (3, 4)}
    d = from_pd(CURL)
    assert d.components == {1: (1, 2)} and d.next_edge(1) == 2 and d.next_edge(2) == 1


def test_linking_matrix_and_linking_numbers_agree():
    d = from_pd(HOPF)
    assert d.linking_matrix() == [[0, -1], [-1, 0]]
    assert d.linking_number(1, 2) == d.linking_number(2, 1) == -1
    assert d.linking_number(1, 1) == 0


@pytest.mark.parametrize("row", link_rows()[::97], ids=lambda r: r["name"])
def test_linking_numbers_of_table_links(row):
    d = table_diagram(row)
    table = [list(r) for r in parse_matrix(row["linking_matrix"])]
    # LinkInfo column linking_matrix
    assert d.linking_matrix() == table
    names = sorted(d.components)
    for i, a in enumerate(names):
        for j, b in enumerate(names):
            assert d.linking_number(a, b) == (table[i][j] if i != j else 0)
    # common practice, no source: the writhe is the self-crossings plus twice the linking numbers
    own = sum(d.signs[c] for c, (a, b, _, _) in d.crossings.items() if d.component_of(a) == d.component_of(b))
    assert d.writhe() == own + sum(map(sum, table))


# ---------------------------------------------------------------------- Seifert circles


def check_seifert(d: Diagram) -> list[tuple[int, ...]]:
    circles = d.seifert_circles()
    assert sorted(e for c in circles for e in c) == d.edges()
    circle_of = {e: i for i, c in enumerate(circles) for e in c}
    for circle in circles:
        for i, edge in enumerate(circle):
            if edge in d.loops:
                assert circle == (edge,)
                continue
            following = circle[(i + 1) % len(circle)]
            _, head = d.edge_ends[edge]
            tail, _ = d.edge_ends[following]
            # the smoothing turns onto the outgoing edge of the other strand at the same crossing
            assert tail.crossing == head.crossing and (tail.position - head.position) % 2 == 1
    graph = nx.MultiGraph()
    graph.add_nodes_from(range(len(circles)))
    for name, (a, b, c, dd) in d.crossings.items():
        # the incoming under-edge and the incoming over-edge lie on the two circles at the crossing
        graph.add_edge(circle_of[a], circle_of[d.over_edges(name)[0]])
    # common practice, no source: the Seifert graph is bipartite (so no crossing joins a circle to itself)
    assert nx.is_bipartite(graph)
    # common practice, no source: chi of the Seifert surface is O - c = 2 - 2g - components (per piece)
    chi = len(circles) - d.crossing_count()
    assert (chi + d.component_count()) % 2 == 0
    return circles


def test_trefoil_seifert_circles_by_hand():
    # at crossing 1 = (1, 5, 2, 4) the smoothing joins 1 -> 5 and 4 -> 2; at 2: 3 -> 1, 6 -> 4;
    # at 3: 5 -> 3, 2 -> 6
    d = from_pd(TREFOIL)
    assert check_seifert(d) == [(1, 5, 3), (2, 6, 4)]


@pytest.mark.parametrize("word, strands", [([1, 1, 1], 2), ([1, -2, 1, -2], 3), ([1, 2, 3, -1, 2], 4),
                                           ([1, 1], 2), ([2, 2, -2], 3), ([1, -3], 5), ([], 3)])
def test_braid_closures_have_one_seifert_circle_per_strand(word, strands):
    from movies.diagram.constructors import from_braid

    d = from_braid(word, strands=strands)
    # common practice, no source: the Seifert circles of a closed braid are its strands
    assert len(check_seifert(d)) == strands


def test_knotinfo_braid_words_close_to_one_seifert_circle_per_strand():
    from movies.diagram.constructors import from_braid

    for row in knot_rows()[:400:7]:
        for strands, word in parse_braids(row["braid_notation"]):
            d = from_braid(list(word), strands=strands)
            # KnotInfo column braid_notation; common practice: one Seifert circle per strand
            assert d.seifert_circle_count() == strands, row["name"]


def test_positive_table_diagrams_give_s_and_genus_from_seifert_circles():
    rows = [r for r in knot_rows()[::3] if set(crossing_signs(json.loads(r["pd_notation"]))) == {1}]
    assert len(rows) > 100
    for row in rows:
        d = table_diagram(row)
        circles = len(check_seifert(d))
        # KnotInfo column rasmussen_invariant; Rasmussen 2010: a positive diagram has s = w - O + 1
        assert int(row["rasmussen_invariant"]) == d.writhe() - circles + 1, row["name"]
        # KnotInfo column three_genus; Cromwell 1989: Seifert's algorithm on a positive diagram
        # gives a minimal genus surface, g = (c - O + 1) / 2
        assert int(row["three_genus"]) == (d.crossing_count() - circles + 1) // 2, row["name"]


def test_alternating_table_diagrams_give_the_genus_from_seifert_circles():
    rows = [r for r in knot_rows()[::11] if r["alternating"] == "Y"]
    assert len(rows) > 300
    for row in rows:
        d = table_diagram(row)
        # KnotInfo column alternating: the table's diagram alternates (each edge joins over to under)
        assert all(t.position % 2 != h.position % 2 for t, h in d.edge_ends.values()), row["name"]
        circles = len(check_seifert(d))
        # KnotInfo column three_genus; Murasugi 1958 / Crowell 1959: on a reduced alternating
        # diagram Seifert's algorithm gives a minimal genus surface
        assert int(row["three_genus"]) == (d.crossing_count() - circles + 1) // 2, row["name"]


def test_seifert_circles_of_mixed_diagrams_satisfy_the_parity():
    for row in knot_rows()[::200] + link_rows()[::150]:
        check_seifert(table_diagram(row))


# ---------------------------------------------------------------------- summary, names, equality


def test_summary_lists_every_name():
    d = from_pd(TREFOIL, loops=1)
    lines = d.summary().splitlines()
    assert lines[0] == "crossings (PD a b c d, sign):"
    assert lines[1:4] == ["  1: 1 5 2 4  +", "  2: 3 1 4 6  +", "  3: 5 3 6 2  +"]
    assert lines[4] == "components (edges along the orientation):"
    assert lines[5:7] == ["  1: 1 2 3 4 5 6", "  2: 7  (crossingless circle)"]
    assert lines[7].startswith("faces (sides walked with the face on the left")
    faces = lines[8:]
    assert len(faces) == len(d.faces) == 6
    for line, name in zip(faces, sorted(d.faces)):
        cycles = " | ".join(" ".join(repr(s) for s in cycle) for cycle in d.faces[name])
        assert line == f"  {name}: {cycles}"
    assert any("|" in line and "7R" in line for line in faces)


def test_summary_of_a_negative_crossing():
    assert "  1: 4 1 3 2  -" in from_pd(HOPF).summary().splitlines()


def test_next_names():
    d = from_pd(TREFOIL, loops=2)
    assert d.next_names("edge", 3) == [9, 10, 11]
    assert d.next_names("crossing", 2) == [4, 5]
    assert d.next_names("face", 1) == [len(d.faces) + 1] == [max(d.faces) + 1]
    assert d.next_names("component", 2) == [4, 5]
    assert d.next_names("edge", 0) == []
    with pytest.raises(KeyError):
        d.next_names("corner", 1)


def test_equality_includes_every_name_and_hash_follows_it(trefoil):
    first, second = from_pd(TREFOIL), from_pd(TREFOIL)
    assert first == second == trefoil and hash(first) == hash(second)
    renamed = trefoil
    faces = dict(renamed.faces)
    faces[9] = faces.pop(5)
    relabelled = Diagram(renamed.crossings, renamed.signs, renamed.loops, renamed.components, faces)
    assert relabelled != first
    assert from_pd(TREFOIL) != from_pd(TREFOIL, loops=1)
    assert first != "not a diagram"


def test_repr_counts():
    assert repr(from_pd(HOPF, loops=1)) == "<Diagram: 2 crossings, 3 components, 2 pieces, writhe -2>"


# ---------------------------------------------------------------------- assembling helpers


def test_trace_cycles_and_components_of_the_hopf_link():
    crossings = {1: (4, 1, 3, 2), 2: (2, 3, 1, 4)}
    assert trace_cycles(crossings, {1: -1, 2: -1}) == [
        (Side(1, "L"), Side(4, "R")), (Side(1, "R"), Side(3, "R")),
        (Side(2, "L"), Side(4, "L")), (Side(2, "R"), Side(3, "L"))]
    assert trace_components(crossings, {1: -1, 2: -1}, loops=[7]) == [(1, 2), (3, 4), (7,)]


def test_canonical_cycle_rotates_to_the_smallest_side():
    cycle = [Side(5, "L"), Side(2, "R"), Side(7, "L"), Side(2, "L")]
    assert canonical_cycle(cycle) == (Side(2, "L"), Side(5, "L"), Side(2, "R"), Side(7, "L"))


@PROPERTY
@given(st.sampled_from(knot_rows()[:300] + link_rows()[:300]), st.randoms(use_true_random=False))
def test_reencode_reads_back_rotated_tuples(row, rng):
    d = table_diagram(row)
    rotated, arriving = {}, set()
    for name, labels in d.crossings.items():
        shift = rng.choice([0, 2])
        rotated[name] = tuple(labels[(i + shift) % 4] for i in range(4))
        for position in head_positions(d.signs[name]):
            arriving.add(Dart(name, (position - shift) % 4))
    tuples, signs = reencode(rotated, arriving)
    assert tuples == dict(d.crossings) and signs == dict(d.signs)


def test_reencode_refuses_an_under_strand_that_does_not_run_through():
    with pytest.raises(DiagramError, match="crossing 1: its under-strand does not run through it"):
        reencode({1: (1, 5, 2, 4)}, {Dart(1, 0), Dart(1, 2)})


def test_assemble_refuses_a_non_planar_piece():
    with pytest.raises(DiagramError, match="is not planar"):
        assemble({1: (1, 3, 2, 4), 2: (2, 4, 1, 3)}, {1: -1, 2: -1})
