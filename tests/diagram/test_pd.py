"""Reading PD codes: validation errors, orientation, crossing signs, and the codes of the tables."""

from __future__ import annotations

import functools
import json
import os
import random
from fractions import Fraction

import database_knotinfo
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from movies.diagram.pd import crossing_signs, from_pd, normalize_pd
from movies.errors import InputError, MoviesError, PDCodeError
from support.knotinfo_columns import parse_laurent, parse_matrix
from support.diagrams import TREFOIL_PD as TREFOIL, HOPF_PD as HOPF_NEGATIVE


#: tests/bench/sweep_diagrams.py raises this for long runs; 1 keeps the default run fast
SCALE = int(os.environ.get("MOVIES_SWEEP_SCALE", "1"))
PROPERTY = settings(max_examples=60 * SCALE, deadline=None, derandomize=True, database=None,
                    suppress_health_check=[HealthCheck.too_slow])


# ---------------------------------------------------------------------- the tables


@functools.lru_cache(maxsize=None)
def knot_rows() -> tuple[dict, ...]:
    """KnotInfo rows with a crossing (row 0 is the header, row 1 the unknot with no PD code)."""
    return tuple(row for row in database_knotinfo.link_list()[1:] if row["pd_notation"].strip())


@functools.lru_cache(maxsize=None)
def link_rows() -> tuple[dict, ...]:
    """LinkInfo rows (row 0 is the header)."""
    return tuple(database_knotinfo.link_list(proper_links=True)[1:])


@functools.lru_cache(maxsize=None)
def knot_row(name: str) -> dict:
    return next(row for row in knot_rows() if row["name"] == name)


@functools.lru_cache(maxsize=None)
def link_row(name: str) -> dict:
    return next(row for row in link_rows() if row["name"] == name)


def knot_pd(row: dict) -> list[list[int]]:
    return json.loads(row["pd_notation"])


def link_pd(row: dict) -> list[list[int]]:
    return json.loads(row["pd_notation_vector"].replace("{", "[").replace("}", "]"))


def spread(rows, step: int):
    return rows[::step]


# ---------------------------------------------------------------------- an independent reading


def strand_walks(code):
    """Components of a PD code as lists of (crossing, in-position, out-position), walked in the
    direction of the first dart; plus the vote of its under-crossings (+1 along, -1 against).

    Written from the definition: a strand enters a crossing at a position and leaves at the
    opposite one; a label joins its two darts.
    """
    where: dict[int, list[tuple[int, int]]] = {}
    for i, row in enumerate(code):
        for p, label in enumerate(row):
            where.setdefault(label, []).append((i, p))
    seen: set[tuple[int, int]] = set()
    walks = []
    for i in range(len(code)):
        for p in range(4):
            if (i, p) in seen:
                continue
            walk, votes = [], set()
            dart = (i, p)
            while dart not in seen:
                out = (dart[0], (dart[1] + 2) % 4)
                seen.update({dart, out})
                walk.append((dart[0], dart[1], out[1]))
                if dart[1] == 0:
                    votes.add(+1)
                elif out[1] == 0:
                    votes.add(-1)
                label = code[out[0]][out[1]]
                a, b = where[label]
                dart = b if a == out else a
            walks.append((walk, votes))
    return walks


def independent_signs(code):
    """Signs from the definition, or None when the under-strands do not orient every component."""
    arriving = {}
    for walk, votes in strand_walks(code):
        if len(votes) != 1:
            return None
        forward = votes == {+1}
        for crossing, enter, leave in walk:
            arriving[(crossing, enter)] = forward
            arriving[(crossing, leave)] = not forward
    return [+1 if arriving[(i, 3)] else -1 for i in range(len(code))]


def euler_characteristics(code):
    """V - E + F of each connected piece of the 4-valent map the code describes.

    Faces are the orbits of (rotate counterclockwise at the vertex) after (cross the edge): no
    orientation of the strands is used, so this is independent of how the package traces faces.
    """
    where: dict[int, list[tuple[int, int]]] = {}
    for i, row in enumerate(code):
        for p, label in enumerate(row):
            where.setdefault(label, []).append((i, p))

    def across(dart):
        a, b = where[code[dart[0]][dart[1]]]
        return b if a == dart else a

    parent = list(range(len(code)))

    def find(x):
        while parent[x] != x:
            x = parent[x]
        return x

    for a, b in where.values():
        parent[find(a[0])] = find(b[0])
    face_count: dict[int, int] = {}
    seen = set()
    for i in range(len(code)):
        for p in range(4):
            if (i, p) in seen:
                continue
            dart = (i, p)
            while dart not in seen:
                seen.add(dart)
                far = across(dart)
                dart = (far[0], (far[1] + 1) % 4)
            face_count[find(i)] = face_count.get(find(i), 0) + 1
    result = []
    for root in sorted(set(find(i) for i in range(len(code)))):
        vertices = sum(1 for i in range(len(code)) if find(i) == root)
        result.append(vertices - 2 * vertices + face_count[root])
    return result


def label_components(code):
    """Components as sets of labels (strands pair positions 0-2 and 1-3)."""
    return [frozenset(code[c][i] for c, i, o in walk) | frozenset(code[c][o] for c, i, o in walk)
            for walk, _ in strand_walks(code)]


def mirror_code(code, signs):
    """The mirror image: each tuple re-read from its old incoming over-strand."""
    return [[d, a, b, c] if s > 0 else [b, c, d, a] for (a, b, c, d), s in zip(code, signs)]


# ---------------------------------------------------------------------- validation errors


def test_a_label_that_occurs_once_is_named():
    with pytest.raises(PDCodeError, match=r"^label 4 occurs once; every label must occur exactly twice$"):
        from_pd([[1, 1, 1, 2], [2, 3, 3, 4]])


def test_several_labels_that_occur_once_are_all_named():
    with pytest.raises(PDCodeError, match=r"labels 1, 2, 3, 4 occur once each"):
        from_pd([[1, 2, 3, 4]])
    with pytest.raises(PDCodeError, match=r"labels 4, 5 occur once each"):
        from_pd([[1, 1, 2, 2], [3, 3, 4, 5]])


def test_labels_that_occur_three_times_are_named_with_their_counts():
    with pytest.raises(PDCodeError) as info:
        from_pd([[1, 1, 1, 2], [2, 2, 3, 3]])
    message = str(info.value)
    assert "1 (3 times)" in message and "2 (3 times)" in message
    assert "more than twice" in message and "3 (" not in message
    with pytest.raises(PDCodeError, match=r"1 \(4 times\)"):
        from_pd([[1, 1, 1, 1]])


def test_the_smallest_non_planar_code_is_refused():
    with pytest.raises(PDCodeError) as info:
        from_pd([[1, 3, 2, 4], [2, 4, 1, 3]])
    message = str(info.value)
    assert "not planar" in message
    assert "2 crossings, 4 edges and 2 faces" in message and "Euler characteristic 0, not 2" in message


def test_a_crossing_joined_to_itself_across_is_not_planar():
    # both strands close up through the opposite position: a torus, not a sphere
    assert euler_characteristics([[1, 2, 1, 2]]) == [0]
    with pytest.raises(PDCodeError, match="not planar"):
        from_pd([[1, 2, 1, 2]])


def test_a_trefoil_with_one_crossing_reflected_is_not_planar():
    # swapping b and d at one crossing keeps the under-strand (so the orientation is fine)
    code = [[1, 4, 2, 5], [3, 1, 4, 6], [5, 3, 6, 2]]
    assert independent_signs(code) is not None
    assert euler_characteristics(code) != [2]
    with pytest.raises(PDCodeError, match="not planar"):
        from_pd(code)


def test_the_non_planar_piece_of_a_split_code_is_named():
    code = [[1, 2, 2, 1], [3, 5, 4, 6], [4, 6, 3, 5]]
    assert euler_characteristics(code) == [2, 0]
    with pytest.raises(PDCodeError, match=r"not planar: the piece through edges \[3, 4, 5, 6\]"):
        from_pd(code)


def random_code(rng: random.Random, crossings: int) -> list[list[int]]:
    slots = [label for label in range(1, 2 * crossings + 1) for _ in range(2)]
    rng.shuffle(slots)
    return [slots[4 * i: 4 * i + 4] for i in range(crossings)]


def test_a_random_pairing_that_is_oriented_but_not_planar_is_refused():
    rng = random.Random(20240611)
    found = 0
    while found < 5:
        code = random_code(rng, rng.randint(2, 6))
        if independent_signs(code) is None or all(chi == 2 for chi in euler_characteristics(code)):
            continue
        found += 1
        with pytest.raises(PDCodeError, match="not planar"):
            from_pd(code)


@PROPERTY
@given(st.integers(min_value=1, max_value=6), st.randoms(use_true_random=False))
def test_random_pairings_are_read_or_refused_exactly_as_the_definition_says(crossings, rng):
    code = random_code(rng, crossings)
    signs = independent_signs(code)
    planar = all(chi == 2 for chi in euler_characteristics(code))
    try:
        diagram = from_pd(code)
    except PDCodeError:
        assert signs is None or not planar
        return
    assert planar
    if signs is not None:
        assert [diagram.signs[i + 1] for i in range(crossings)] == signs
        assert crossing_signs(code) == signs


def test_an_inconsistent_orientation_names_the_component():
    # the trefoil with crossing 1 read from its outgoing under-strand: 2 -> 1 there, 3 -> 4 at crossing 2
    with pytest.raises(PDCodeError) as info:
        from_pd([[2, 4, 1, 5], [3, 1, 4, 6], [5, 3, 6, 2]])
    message = str(info.value)
    assert "orientation is inconsistent" in message
    assert "edges 1, 2, 3, 4, 5, 6" in message


def test_an_inconsistent_orientation_on_one_component_of_a_link():
    # LinkInfo's L4a1{0} with crossing 1 read from its outgoing under-strand: the component
    # 5, 6, 7, 8 now runs 7 -> 6 under crossing 1 and 8 -> 5 under crossing 2
    code = link_pd(link_row("L4a1{0}"))
    assert code[0] == [6, 1, 7, 2]
    from_pd(code)
    code[0] = [7, 2, 6, 1]
    with pytest.raises(PDCodeError, match=r"inconsistent on the component with edges 5, 6, 7, 8:"):
        from_pd(code)


def test_the_empty_code_is_refused_but_circles_alone_are_read():
    with pytest.raises(PDCodeError, match="empty"):
        from_pd([])
    circles = from_pd([], loops=2)
    assert sorted(circles.loops) == [1, 2] and circles.component_count() == 2


@pytest.mark.parametrize("bad", [1.0, "1", None, True, Fraction(1), [1]])
def test_non_integer_labels_are_refused(bad):
    with pytest.raises(PDCodeError) as info:
        from_pd([[1, 5, 2, 4], [3, bad, 4, 6], [5, 3, 6, 2]])
    assert str(info.value).startswith("crossing 2 of the PD code has the label ")
    assert "labels are integers" in str(info.value)


@pytest.mark.parametrize("row, length", [([3, 1, 4], 3), ([3, 1, 4, 6, 7], 5), ([], 0)])
def test_rows_of_the_wrong_length_are_refused(row, length):
    with pytest.raises(PDCodeError, match=rf"^crossing 2 of the PD code has {length} labels, not 4$"):
        from_pd([[1, 5, 2, 4], row, [5, 3, 6, 2]])


@pytest.mark.parametrize("code", [5, None, [5], [[1, 1, 2, 2], 7]])
def test_things_that_are_not_lists_of_rows_are_refused(code):
    with pytest.raises(PDCodeError, match="a PD code is a list of crossings"):
        from_pd(code)


def test_pd_errors_are_input_errors_of_the_package():
    with pytest.raises(InputError):
        from_pd([[1, 2, 3, 4]])
    assert issubclass(PDCodeError, MoviesError)


def test_normalize_pd_returns_tuples_and_accepts_tuples():
    assert normalize_pd(((1, 5, 2, 4), [3, 1, 4, 6], (5, 3, 6, 2))) == [tuple(r) for r in TREFOIL]
    assert normalize_pd([]) == []


# ---------------------------------------------------------------------- orientation and signs


def test_the_table_trefoil_is_positive():
    # KnotInfo column pd_notation: the table's 3_1 has three positive crossings (from memory)
    assert crossing_signs(TREFOIL) == [1, 1, 1]
    # KnotInfo column pd_notation
    assert knot_pd(knot_row("3_1")) == TREFOIL
    assert from_pd(TREFOIL).writhe() == 3


def test_the_mirror_trefoil_is_negative():
    mirrored = mirror_code(TREFOIL, [1, 1, 1])
    assert crossing_signs(mirrored) == [-1, -1, -1]
    assert from_pd(mirrored).writhe() == -3


def test_sign_rule_on_one_crossing_by_hand():
    # [1, 2, 2, 1]: the under-strand arrives along 1 at a and leaves along 2 at c; edge 2 comes
    # back into b, so the over-strand runs b -> d: negative.
    assert crossing_signs([[1, 2, 2, 1]]) == [-1]
    # [1, 1, 2, 2]: edge 2 leaves at c and comes back into d, so the over-strand runs d -> b: positive.
    assert crossing_signs([[1, 1, 2, 2]]) == [1]


def test_a_component_that_never_passes_under_is_oriented_by_increasing_labels():
    # a circle 1,2,3,4 that is under at every crossing, and a curve 5,6,7,8 weaving over it
    consecutive = [[1, 5, 2, 6], [2, 7, 3, 6], [3, 7, 4, 8], [4, 5, 1, 8]]
    assert all(chi == 2 for chi in euler_characteristics(consecutive))
    # by hand, along 5 -> 6 -> 7 -> 8: the over-strand runs 5 -> 6 = b -> d at crossing 1,
    # 6 -> 7 = d -> b at crossing 2, 7 -> 8 = b -> d at 3, 8 -> 5 = d -> b at 4
    assert crossing_signs(consecutive) == [-1, 1, -1, 1]
    # the same curve numbered the other way round (5 <-> 8, 6 <-> 7) is reversed: every crossing
    # is between the two components, so every sign changes
    backward = [[{5: 8, 6: 7, 7: 6, 8: 5}.get(x, x) for x in row] for row in consecutive]
    assert crossing_signs(backward) == [1, -1, 1, -1]


def test_a_never_under_component_with_labels_out_of_order_is_refused():
    scrambled = [[1, 5, 2, 7], [2, 6, 3, 7], [3, 6, 4, 8], [4, 5, 1, 8]]
    assert all(chi == 2 for chi in euler_characteristics(scrambled))
    with pytest.raises(PDCodeError) as info:
        from_pd(scrambled)
    message = str(info.value)
    assert "never passes under" in message and "5, 6, 7, 8" in message
    assert "not numbered consecutively" in message


def test_a_two_edge_component_that_is_never_under_runs_from_its_smaller_label_at_its_first_crossing():
    # a circle 1,2 pushed under the circle 3,4 (an R2 pair); 3,4 is over at both crossings
    code = [[1, 3, 2, 4], [2, 3, 1, 4]]
    assert all(chi == 2 for chi in euler_characteristics(code))
    # over-strand at crossing 1 runs b -> d (3 -> 4): negative; at crossing 2 it comes back 4 -> 3
    assert crossing_signs(code) == [-1, 1]
    swapped = [[1, 4, 2, 3], [2, 4, 1, 3]]
    # now b = 4, d = 3 at crossing 1, and the rule runs the circle 3 -> 4: d -> b, positive
    assert crossing_signs(swapped) == [1, -1]
    assert from_pd(code).linking_matrix() == [[0, 0], [0, 0]]


@PROPERTY
@given(st.sampled_from(knot_rows()[:400]), st.randoms(use_true_random=False))
def test_renaming_labels_and_reordering_crossings_permutes_the_signs(row, rng):
    code = knot_pd(row)
    signs = crossing_signs(code)
    labels = sorted({x for r in code for x in r})
    image = rng.sample(range(-50, 200), len(labels))
    rename = dict(zip(labels, image))
    order = list(range(len(code)))
    rng.shuffle(order)
    renamed = [[rename[x] for x in code[i]] for i in order]
    # every component of a knot passes under, so the labels play no part in the orientation
    assert crossing_signs(renamed) == [signs[i] for i in order]


@PROPERTY
@given(st.sampled_from(spread(link_rows(), 3)), st.randoms(use_true_random=False))
def test_reversing_components_changes_exactly_the_signs_between_reversed_and_kept(row, rng):
    code = link_pd(row)
    signs = crossing_signs(code)
    components = label_components(code)
    flipped = {label for comp in components if rng.random() < 0.5 for label in comp}
    reread = []
    for a, b, c, d in code:
        # reversing the under-strand means reading from c; the over-strand's direction is not written
        reread.append([c, d, a, b] if a in flipped else [a, b, c, d])
    expected = [s if ((row_[0] in flipped) == (row_[1] in flipped)) else -s for row_, s in zip(code, signs)]
    assert crossing_signs(reread) == expected


def test_reversing_every_component_keeps_every_sign_on_the_tables():
    for row in spread(knot_rows(), 25) + spread(link_rows(), 25):
        code = knot_pd(row) if "pd_notation" in row else link_pd(row)
        # common practice, no source: reversing both strands of a crossing keeps its sign
        assert crossing_signs([[c, d, a, b] for a, b, c, d in code]) == crossing_signs(code)


def test_signs_agree_with_the_independent_reading_on_the_tables():
    for row in spread(knot_rows(), 10):
        code = knot_pd(row)
        assert crossing_signs(code) == independent_signs(code), row["name"]
    for row in spread(link_rows(), 5):
        code = link_pd(row)
        assert crossing_signs(code) == independent_signs(code), row["name"]


def test_from_pd_keeps_labels_as_edge_names_and_numbers_crossings_in_order():
    d = from_pd(TREFOIL, loops=2)
    assert d.pd_code() == [tuple(r) for r in TREFOIL]
    assert sorted(d.crossings) == [1, 2, 3]
    assert d.edges() == [1, 2, 3, 4, 5, 6, 7, 8]
    assert sorted(d.loops) == [7, 8]
    assert d.signs == {1: 1, 2: 1, 3: 1}


# ---------------------------------------------------------------------- KnotInfo sign patterns


def sign_set(code) -> set[int]:
    return set(crossing_signs(code))


def test_positive_knots_whose_positive_diagram_is_the_table_diagram_have_only_positive_crossings():
    rows = [r for r in knot_rows() if r["positive"] == "Y" and r["positive_pd_notation"] == r["pd_notation"]]
    assert len(rows) > 100
    for row in rows:
        # KnotInfo columns positive, positive_pd_notation, pd_notation
        assert sign_set(knot_pd(row)) == {1}, row["name"]


def test_positive_knots_up_to_ten_crossings_have_positive_table_diagrams():
    rows = [r for r in knot_rows() if r["positive"] == "Y" and int(r["crossing_number"]) <= 10]
    assert len(rows) > 30 and "3_1" in {r["name"] for r in rows}
    for row in rows:
        # KnotInfo columns positive and pd_notation
        assert sign_set(knot_pd(row)) == {1}, row["name"]


def test_knots_that_are_not_positive_never_have_a_positive_table_diagram():
    rows = [r for r in knot_rows() if r["positive"] == "N"]
    assert len(rows) > 1000
    for row in spread(rows, 3):
        # KnotInfo column positive: a knot with a positive diagram is a positive knot
        assert sign_set(knot_pd(row)) != {1}, row["name"]


def test_positive_table_diagrams_have_negative_signature():
    rows = [r for r in spread(knot_rows(), 4) if sign_set(knot_pd(r)) == {1}]
    assert len(rows) > 100
    for row in rows:
        # KnotInfo column signature; Przytycki 1989, "Positive knots have negative signature"
        assert int(row["signature"]) < 0, row["name"]


def test_the_other_positive_pd_column_is_drawn_mirrored_where_it_differs():
    # positive_pd_notation sometimes differs from pd_notation; read by our convention those rows
    # are all-negative diagrams, and their Jones polynomial is V(1/t) of the table's knot
    from movies.invariants.jones import jones_polynomial_pd

    rows = [r for r in knot_rows()
            if r["positive"] == "Y" and r["positive_pd_notation"].startswith("[")
            and r["positive_pd_notation"] != r["pd_notation"]]
    assert rows
    for row in rows[:3]:
        other = json.loads(row["positive_pd_notation"])
        signs = crossing_signs(other)
        assert set(signs) == {-1}
        jones = jones_polynomial_pd(other, writhe=sum(signs)).as_dict()
        # KnotInfo columns positive_pd_notation and jones_polynomial
        table = parse_laurent(row["jones_polynomial"], "t")
        assert jones == {-e: c for e, c in table.items()}, row["name"]


def test_signs_read_from_the_table_give_the_table_jones_polynomial_not_the_mirror_one():
    from movies.invariants.jones import jones_polynomial_pd

    chiral = 0
    for row in spread([r for r in knot_rows() if int(r["crossing_number"]) <= 10], 6):
        code = knot_pd(row)
        table = parse_laurent(row["jones_polynomial"], "t")
        mirrored = {-e: c for e, c in table.items()}
        ours = jones_polynomial_pd(code, writhe=sum(crossing_signs(code))).as_dict()
        # KnotInfo column jones_polynomial
        assert ours == table, row["name"]
        if mirrored != table:
            chiral += 1
            assert ours != mirrored
    assert chiral > 20


# ---------------------------------------------------------------------- LinkInfo


def test_the_two_hopf_links_have_linking_number_minus_one_and_one():
    negative = from_pd(link_pd(link_row("L2a1{0}")))
    positive = from_pd(link_pd(link_row("L2a1{1}")))
    assert link_pd(link_row("L2a1{0}")) == HOPF_NEGATIVE
    # LinkInfo column linking_matrix
    assert negative.linking_matrix() == [list(r) for r in parse_matrix(link_row("L2a1{0}")["linking_matrix"])]
    # LinkInfo column linking_matrix
    assert positive.linking_matrix() == [list(r) for r in parse_matrix(link_row("L2a1{1}")["linking_matrix"])]
    assert negative.linking_matrix() == [[0, -1], [-1, 0]]
    assert positive.linking_matrix() == [[0, 1], [1, 0]]
    assert negative.signs == {1: -1, 2: -1} and positive.signs == {1: 1, 2: 1}


def test_linking_matrices_of_a_spread_of_links_match_the_table():
    rows = spread(link_rows(), 4)
    assert len(rows) > 1000
    for row in rows:
        d = from_pd(link_pd(row))
        # LinkInfo column linking_matrix (components ordered by their smallest label)
        assert d.linking_matrix() == [list(r) for r in parse_matrix(row["linking_matrix"])], row["name"]


def test_component_counts_of_a_spread_of_links_match_the_table():
    for row in spread(link_rows(), 3):
        code = link_pd(row)
        # LinkInfo column components
        assert from_pd(code).component_count() == int(row["components"]), row["name"]
        assert len(label_components(code)) == int(row["components"])


def test_the_two_orientations_of_a_two_component_link_have_opposite_linking_numbers():
    # LinkInfo lists each orientation of a link with its own code; for two components the two
    # orientations differ by reversing one component, which negates the linking number
    by_link: dict[str, list[dict]] = {}
    for row in link_rows():
        if row["components"] == "2":
            by_link.setdefault(row["name_unoriented"], []).append(row)
    pairs = [rows for rows in by_link.values() if len(rows) == 2]
    assert len(pairs) > 100
    for first, second in pairs[::10]:
        one = from_pd(link_pd(first)).linking_number(1, 2)
        other = from_pd(link_pd(second)).linking_number(1, 2)
        # common practice, no source: reversing one component negates the linking number
        assert one == -other, (first["name"], second["name"])
        # LinkInfo column linking_matrix
        assert one == parse_matrix(first["linking_matrix"])[0][1]
