"""s of null-homologous links in S¹×S² from their twisted approximations, checked against the tables."""

import pytest

from movies.diagram.handles import fibers, twisted
from movies.diagram.tables import table_names, table_row
from movies.errors import InternalError
from movies.homology import approximations
from movies.homology.approximations import NotNullHomologousError, s_of_handles
from movies.homology.links import link_s_values
from movies.invariants.jones import jones_polynomial
from movies.diagram.constructors import mirror
from movies.language.spec import parse_diagram, parse_handle_diagram
from support.handles import balanced_gate
from support.knotinfo_columns import parse_laurent


@pytest.fixture(scope="module")
def knots_by_jones():
    """Table knots up to 9 crossings and their mirrors, by Jones polynomial (KnotInfo jones_polynomial)."""
    found = {}
    for name in table_names("knot", max_crossings=9):
        row = table_row(name)
        # KnotInfo column jones_polynomial, read as exact exponents; the mirror has t -> 1/t
        jones = parse_laurent(row["jones_polynomial"], "t") if name != "0_1" else {0: 1}
        s = int(row["rasmussen_invariant"]) if name != "0_1" else 0
        found.setdefault(tuple(sorted(jones.items())), (name, s))
        found.setdefault(tuple(sorted((-e, c) for e, c in jones.items())), (f"mirror({name})", -s))
    return found


def _identify(diagram, table):
    terms = tuple(sorted(jones_polynomial(diagram).terms()))
    return table[terms]


@pytest.mark.parametrize("spec", ["3_1 with handle across 1 5", "mirror(3_1) with handle across 1 5"])
def test_a_knot_through_a_handle_at_a_crossing_against_the_table(spec, knots_by_jones):
    link = parse_handle_diagram(spec)
    found = s_of_handles(link, ("Q",), most=3)
    for k, s in found["Q"].values.items():
        name, table_s = _identify(twisted(link, k), knots_by_jones)
        # KnotInfo column rasmussen_invariant (over Q) of the knot L(k), negated for a mirror (Rasmussen 2010)
        assert s == table_s, (spec, k, name)
    plus, minus = found["Q"].plus, found["Q"].minus
    if spec.startswith("mirror"):
        # L(k) = m(3_1), m(5_2), m(7_2), ... for k >= 0: s stays -2 above the floor -4, never certified
        assert (plus.low, plus.high, plus.certified) == (-4, -2, False)
        # L(-1) is the unknot: the ceiling 0 is reached, s_- = 0 is certified
        assert minus.certified and minus.low == 0 and minus.at == -1
    else:
        assert plus.certified and plus.low == 0 and plus.at == 1
        assert (minus.low, minus.high, minus.certified) == (2, 4, False)


def test_balanced_fibers_limits():
    found = s_of_handles(fibers(1, 1), ("Q",), most=3)["Q"]
    # the design notes: s(F(1, 1)(k)) = -1 for k >= 1 (not certifiable from the window alone), +1 for k <= -1
    assert [found.values[k] for k in (1, 2, 3)] == [-1, -1, -1]
    assert not found.plus.certified and (found.plus.low, found.plus.high) == (-3, -1)
    assert found.minus.certified and found.minus.low == 1


def test_s_needs_a_null_homologous_link():
    with pytest.raises(NotNullHomologousError, match=r"class \(2,\); these orientations are null-homologous: "
                                                     r"reverse 1; reverse 2"):
        s_of_handles(fibers(2, 0))
    with pytest.raises(NotNullHomologousError, match="no orientation is null-homologous"):
        s_of_handles(fibers(2, 1))


def test_a_sequence_that_breaks_the_theorems_is_an_internal_error(monkeypatch):
    # the checks can fail: feed a rising sequence through the judge
    with pytest.raises(InternalError, match="cannot increase"):
        approximations._judge("Q", {0: 0, 1: 2}, 2)
    with pytest.raises(InternalError, match="outside the window"):
        approximations._judge("Q", {0: 0, 1: -6}, 2)


def test_the_limits_are_ordered(knots_by_jones):
    # s_+ <= s_- for every link (the sequence is non-increasing)
    for spec in ("3_1 with handle across 1 5", "unlink(2) with handle across 1 2"):
        found = s_of_handles(parse_handle_diagram(spec), ("Q",), most=2)["Q"]
        assert found.plus.low <= found.plus.high <= found.minus.low <= found.minus.high


def test_random_null_homologous_links_in_s1xs2():
    import random

    from movies.diagram.handles import handle_diagram
    from movies.homology.links import link_s_values

    rng = random.Random(13)
    names = table_names("knot", max_crossings=6)[1:] + ["L2a1{0}", "L4a1{0}", "L5a1{0}", "L6a3{0}"]
    checked = 0
    for name in rng.sample(names, 10):
        diagram = parse_diagram(name)
        gate = balanced_gate(diagram, rng)
        if gate is None:
            continue
        link = handle_diagram(diagram, [gate])
        # monotone in k and inside the window are checked inside (an internal error otherwise)
        found = s_of_handles(link, ("Q",), most=2)["Q"]
        assert found.plus.low <= found.plus.high <= found.minus.low <= found.minus.high
        # the mirror: m(L)(k) is m(L(-k)), gate for gate (mirroring keeps every name)
        image = handle_diagram(mirror(diagram), [gate])
        for k in (-1, 1):
            mirrored_after = mirror(twisted(link, -k))
            assert jones_polynomial(twisted(image, k)) == jones_polynomial(mirrored_after)
            assert link_s_values(twisted(image, k), ("Q",)) == link_s_values(mirrored_after, ("Q",))
        checked += 1
    assert checked >= 6, checked


# an unknot drawn with two curls, the handle through both curl loops: twisting the loops around
# each other at the handle makes the clasp of a twist knot, so every L(k) is a twist knot and L(0)
# is the unknot. The two diagrams differ in the sign of one curl, i.e. in the clasp.
CLASP_TO_NEGATIVE_TREFOIL = "pd[[1,2,2,3],[3,4,4,1]] with handle across 2 4"
CLASP_TO_FIGURE_EIGHT = "pd[[1,1,2,3],[4,4,3,2]] with handle across 1 4"


@pytest.mark.parametrize("spec", [CLASP_TO_NEGATIVE_TREFOIL, CLASP_TO_FIGURE_EIGHT])
def test_twist_knots_through_one_handle_against_the_table(spec, knots_by_jones):
    link = parse_handle_diagram(spec)
    names = {}
    for k in range(-3, 4):
        name, table_s = _identify(twisted(link, k), knots_by_jones)
        names[k] = name
        # KnotInfo column rasmussen_invariant of the twist knot L(k) (negated for a mirror, Rasmussen 2010)
        assert link_s_values(twisted(link, k), ("Q", "F2")) == {"Q": table_s, "F2": table_s}, (k, name)
    # the twist knots, identified by KnotInfo's jones_polynomial column: L(0) is the unknot
    assert names[0] == "0_1"
    if spec == CLASP_TO_NEGATIVE_TREFOIL:
        assert names[1] == "mirror(3_1)" and {names[-1], names[-2]} == {"4_1", "6_1"}
    else:
        assert names[1] == "4_1" and names[-1] == "3_1"


def test_the_clasp_decides_which_limit_is_certified():
    for field, found in s_of_handles(parse_handle_diagram(CLASP_TO_NEGATIVE_TREFOIL), ("Q", "F2"), most=3).items():
        # the design notes (section 3): L(1) is the negative trefoil, s = -2 = s(L(0)) - 2, the floor of
        # the window, so s_+ = -2 is certified at k = 1; for k < 0 the twist knots have s = 0 (KnotInfo
        # rasmussen_invariant of 4_1, 6_1, 8_1) and s_- is only known to lie in [0, 2]
        assert found.plus == approximations.Limit(-2, -2, 1), field
        assert (found.minus.low, found.minus.high, found.minus.certified) == (0, 2, False), field
    for field, found in s_of_handles(parse_handle_diagram(CLASP_TO_FIGURE_EIGHT), ("Q", "F2"), most=3).items():
        # the mirror-image statements: s(L(k)) = 0 for every computed k >= 0, the floor -2 is never reached,
        # so s_+ is reported as the interval [-2, 0]; L(-1) is the positive trefoil and s_- = 2 is certified
        assert [found.values[k] for k in (0, 1, 2, 3)] == [0, 0, 0, 0]
        assert (found.plus.low, found.plus.high, found.plus.certified) == (-2, 0, False), field
        assert found.minus == approximations.Limit(2, 2, -1), field


# LinkInfo's two-component (2, 2k) torus links, k = 1..4; which orientation is F(1, 1)(k) is read off the
# linking_matrix column (-k) and the chirality off the Jones polynomial, never assumed
TORUS_2_2K = {1: "L2a1", 2: "L4a1", 3: "L6a3", 4: "L8a14"}


def _table_khovanov_of_f11(k):
    """Kh of F(1, 1)(k) in the usual grading, from LinkInfo's khovanov_polynomial column."""
    from homology.helpers import ranks_of
    from movies.diagram.tables import table_row
    from movies.invariants.jones import jones_polynomial
    from support.knotinfo_columns import parse_matrix

    ours = jones_polynomial(twisted(fibers(1, 1), k))
    for orientation in ("{0}", "{1}"):
        row = table_row(TORUS_2_2K[k] + orientation)
        # LinkInfo column khovanov_polynomial; the mirror has (i, j) -> (-i, -j) over Q (Khovanov 2000, Cor. 11)
        ranks = ranks_of(row["khovanov_polynomial"])
        for candidate, lk in ((ranks, 1), ({(-i, -j): r for (i, j), r in ranks.items()}, -1)):
            # LinkInfo column linking_matrix: the off-diagonal entry is the linking number (negated by a mirror)
            if lk * parse_matrix(row["linking_matrix"])[0][1] != -k:
                continue
            image = jones_polynomial(parse_diagram(f"{'mirror(' if lk < 0 else ''}{TORUS_2_2K[k]}{orientation}"
                                                   f"{')' if lk < 0 else ''}"))
            if image == ours:
                return candidate
    raise AssertionError(f"F(1, 1)({k}) not found among the rows of {TORUS_2_2K[k]}")


def test_khovanov_of_the_balanced_fibers_against_the_link_table():
    from movies.homology.approximations import khovanov_of_handles

    computed = {t.k: t for t in khovanov_of_handles(fibers(1, 1), [1, 2, 3, 4])}
    shifted = {}
    for k in (1, 2, 3, 4):
        # the normalisation by hand: F(1, 1)(k) has 2k negative crossings, all in the twist region, whose identity
        # resolution is the all-0 one; the usual grading shifts the bracket by [-2k]{-4k}, so undo that
        shifted[k] = {(i + 2 * k, j + 4 * k): r for (i, j), r in _table_khovanov_of_f11(k).items()}
        assert computed[k].ranks == shifted[k], k
    for k in (2, 3, 4):
        # the stable marks, read off the table's own values: the degrees where k and k - 1 agree
        rows = lambda table, i: {j: r for (h, j), r in table.items() if h == i}  # noqa: E731
        span = range(0, 2 * k + 1)
        assert computed[k].stable == tuple(i for i in span if rows(shifted[k], i) == rows(shifted[k - 1], i))
        # and they grow with k: the homology of the (2, 2k) torus link settles in degrees below 2k - 2
        assert set(range(2 * k - 2)) <= set(computed[k].stable)


def test_khovanov_needs_a_two_divisible_link():
    from movies.errors import NotTwoDivisibleError
    from movies.homology.approximations import khovanov_of_handles

    with pytest.raises(NotTwoDivisibleError, match="strands through each handle here: 3"):
        khovanov_of_handles(fibers(2, 1), [0])
    # 2-divisible but not null-homologous: Kh is defined, s is not
    assert khovanov_of_handles(fibers(2, 0), [1])[0].ranks
