"""Links in connected sums of S¹×S² as diagrams with handles, and their twisted approximations."""

import pytest

from movies.bounds.verdicts import s_values
from movies.diagram.constructors import from_braid, mirror, reverse, torus_link, unlink
from movies.diagram.handles import fibers, handle_diagram, twisted
from movies.diagram.isotopy import same_on_sphere
from movies.errors import MoveError
from movies.invariants.jones import jones_polynomial
from movies.invariants.signature import signature
from movies.language.spec import parse_diagram


@pytest.mark.parametrize("p, q", [(1, 0), (1, 1), (2, 1), (2, 2), (3, 0)])
def test_fibers_have_the_class_of_their_strands(p, q):
    h = fibers(p, q)
    assert [abs(a) for a in h.homology_class()] == [p - q if p >= q else q - p]
    assert h.null_homologous() is (p == q)
    assert h.two_divisible() is ((p + q) % 2 == 0)
    # L(0) is the diagram itself: p + q circles, an unlink
    assert twisted(h, 0) == h.diagram and h.diagram.component_count() == p + q


def test_the_null_homologous_orientations_of_fibers():
    # an odd number of strands through a handle is never balanced
    assert fibers(2, 1).null_homologous_orientations() == []
    # two circles one way: reversing either balances them; two each way: any two of the four reversed
    assert fibers(2, 0).null_homologous_orientations() == [(1,), (2,)]
    assert len(fibers(2, 2).null_homologous_orientations()) == 6
    # one each way: as given, or all reversed; F(2, 0) needs one of the two reversed
    assert fibers(1, 1).null_homologous_orientations() == [(), (1, 2)]
    assert fibers(1, 0).null_homologous_orientations() == []


@pytest.mark.parametrize("n", [2, 3, 4])
def test_one_twist_of_parallel_fibers_is_the_torus_link(n):
    d = twisted(fibers(n, 0), 1)
    # common practice, no source: a full twist on n parallel strands closes up to T(n, n)
    assert jones_polynomial(d) == jones_polynomial(torus_link(n, n))
    assert d.crossing_count() == n * (n - 1)
    # Q. Ren, "Lee filtration structure of torus links" (2023): s(T(n, n)) = (n - 1)^2, every strand one way
    assert s_values(d)["Q"] == (n - 1) ** 2


@pytest.mark.parametrize("p, k", [(1, 1), (1, 2), (1, 3), (1, 4), (2, 1), (2, 2), (3, 1)])
def test_balanced_fibers_twisted_right_handed_have_s_one_minus_2p(p, k):
    d = twisted(fibers(p, p), k)
    assert d.crossing_count() == k * 2 * p * (2 * p - 1)
    # the design notes, derived from Ren (2023), Cor. 1.4 and p disjoint annuli: s(F(p, p)(k)) = 1 - 2p for k >= 1;
    # at k = 1 this is Ren's published formula for T(2p, 2p) with p strands each way: (p - q)^2 - 2p + 1
    assert s_values(d) == {"Q": 1 - 2 * p, "F2": 1 - 2 * p}


@pytest.mark.parametrize("k", [1, 2, 3])
def test_one_fiber_each_way_twisted_left_handed_has_s_one(k):
    # the design notes: F(1, 1) with left-handed twists has s = +1 (the mirror of T(2, 2k) with a strand reversed)
    assert s_values(twisted(fibers(1, 1), -k))["Q"] == 1


@pytest.mark.parametrize("k", [-2, -1, 1, 2])
def test_the_mirror_of_an_approximation_is_the_opposite_approximation_of_the_mirror(k):
    # m(L)(k) = m(L(-k)): mirroring every crossing turns right-handed twists into left-handed ones
    link = handle_diagram(parse_diagram("3_1"), [([1, 5], None)])
    image = handle_diagram(mirror(link.diagram), [([1, 5], link.gates[0].start_face(link.diagram))])
    assert same_on_sphere(twisted(image, k), mirror(twisted(link, -k))) or (
        jones_polynomial(twisted(image, k)) == jones_polynomial(mirror(twisted(link, -k)))
        and signature(twisted(image, k)) == signature(mirror(twisted(link, -k))))


def test_a_knot_through_a_handle_at_a_crossing():
    # a gate through the corner of a crossing between the edge running in and the one running out
    link = handle_diagram(parse_diagram("3_1"), [([1, 5], None)])
    assert link.homology_class() == (0,) and link.null_homologous()
    # one right-handed twist there changes the positive crossing into a negative one: an unknot
    # common practice, no source: the unknot's Jones polynomial is 1
    assert str(jones_polynomial(twisted(link, 1))) == "1"


def test_two_handles_twist_independently():
    circles = unlink(4)  # four circles side by side
    link = handle_diagram(circles, [([1, 2], None), ([3, 4], None)])
    assert link.homology_class() == (0, 0)
    both = twisted(link, [1, -1])
    assert both.crossing_count() == 4 and both.component_count() == 4
    assert twisted(link, [1, 0]).crossing_count() == 2


def test_gate_errors_name_the_handle():
    with pytest.raises(MoveError, match=r"^handle 1: edge 9 is not in the diagram"):
        handle_diagram(unlink(2), [([1, 9], None)])
    with pytest.raises(MoveError, match=r"^handle 2: the gate crosses edge 3 more than once"):
        handle_diagram(unlink(4), [([1, 2], None), ([3, 4, 3], None)])
    with pytest.raises(MoveError, match=r"^handles 1 and 2 both cross edge 2"):
        handle_diagram(unlink(3), [([1, 2], None), ([2, 3], None)])
    with pytest.raises(MoveError, match=r"^handle 1: no gate crosses edges \[1, 3\] in this order"):
        handle_diagram(from_braid([], strands=3), [([1, 3], None)])
    with pytest.raises(MoveError, match="at least one handle"):
        handle_diagram(unlink(1), [])
    # face 1 of the table's 5_1 is bounded by edges 1, 7, 3, 9 in this order: a gate from edge 1 to edge 3
    # and one from edge 7 to edge 9 would have to cross inside it
    five = parse_diagram("5_1")
    assert [side.edge for side in five.faces[1][0]][:4] == [1, 7, 3, 9]
    with pytest.raises(MoveError, match=r"^handles 1 and 2 cross each other in face 1"):
        handle_diagram(five, [([1, 3], 2), ([7, 9], 3)])
    # either gate alone is fine
    assert handle_diagram(five, [([1, 3], 2)]).gates and handle_diagram(five, [([7, 9], 3)]).gates


def test_reversed_strands_change_the_class_not_the_gates():
    forward = fibers(2, 0)
    backward = handle_diagram(reverse(forward.diagram, [2]), [([1, 2], None)])
    assert [abs(a) for a in forward.homology_class()] == [2] and backward.homology_class() == (0,)


def test_handle_diagrams_in_the_notation():
    from movies.language.spec import parse_handle_diagram

    h = parse_handle_diagram("unlink(4) with handle across 1 2 and handle across 3 4 from face 4")
    assert len(h.gates) == 2 and h.two_divisible()
    # the approximation is an ordinary diagram wherever one is written
    assert parse_diagram("twisted(unlink(4) with handle across 1 2 and handle across 3 4, 1, -1)") == twisted(h, [1, -1])
    assert parse_diagram("twisted(3_1 with handle across 1 5, 2)") == twisted(
        handle_diagram(parse_diagram("3_1"), [([1, 5], None)]), 2)


@pytest.mark.parametrize("text, message, column", [
    ("3_1 with handle across 1 5", "a diagram with handles is a link in a connected sum of S^1 x S^2", 1),
    ("twisted(3_1, 1)", "twisted(...) takes a diagram with handles", 1),
    ("twisted(unlink(2) with handle across 1 2, 1, 2)", "one number of twists, or one for each of the 1 handles", 1),
    ("(3_1 with handle across 1 5) # 4_1", "it cannot be part of a connected sum", 1),
    ("twisted(unlink(2) with handle across 1 9, 1)", "handle 1: edge 9 is not in the diagram", 9),
    ("twisted(unlink(3) with handle across 1 2 and handle across 2 3, 1)", "handles 1 and 2 both cross edge 2", 9),
])
def test_handle_errors_point_at_the_text(text, message, column):
    from movies.errors import SpecDiagramError

    with pytest.raises(SpecDiagramError) as caught:
        parse_diagram(text)
    assert message in str(caught.value) and caught.value.line == 1 and caught.value.column == column


def test_a_twisted_approximation_past_the_crossing_limit_is_refused_before_it_is_built():
    from movies import limits
    from movies.errors import LocatedLimitError

    with limits.using(crossings=10):
        with pytest.raises(LocatedLimitError, match="twisted\\(...\\) would have 12 crossings"):
            parse_diagram("twisted(braid(4)[] with handle across 1 2 3 4, 1)")


def test_a_closed_braid_through_its_axis():
    from movies.diagram.handles import closed_braid

    trefoil = closed_braid([1, 1, 1])
    assert trefoil.homology_class() == (2,) and not trefoil.null_homologous()
    # common practice, no source: one full twist on the closure of a braid adds Delta^2 to the word;
    # sigma_1^3 Delta^2 = sigma_1^5 closes to T(2, 5), KnotInfo's 5_1 (braid_notation [1,1,1,1,1])
    assert jones_polynomial(twisted(trefoil, 1)) == jones_polynomial(parse_diagram("5_1"))
    assert str(jones_polynomial(twisted(trefoil, -1))) == "1"  # sigma_1^3 Delta^-2 = sigma_1: an unknot
    # (sigma_1 sigma_2) Delta^2 = (sigma_1 sigma_2)^4 closes to T(3, 4)
    assert jones_polynomial(twisted(closed_braid([1, 2]), 1)) == jones_polynomial(torus_link(3, 4))
    # with one component reversed, the two strands of T(2, 2k)'s braid pass opposite ways
    balanced = closed_braid([1, 1], reversed_components=[2])
    assert balanced.null_homologous() and balanced.two_divisible()


def test_constructors_in_the_notation():
    from movies.diagram.handles import closed_braid
    from movies.language.spec import parse_handle_diagram

    assert parse_handle_diagram("fibers(2, 1)") == fibers(2, 1)
    assert parse_handle_diagram("axis(braid[1, 1, 1])") == closed_braid([1, 1, 1])
    reversed_ = parse_handle_diagram("reverse(axis(braid[1, 1, 1, 1]), 2)")
    assert reversed_ == closed_braid([1, 1, 1, 1], reversed_components=[2]) and reversed_.null_homologous()
    # mirroring keeps the handles, and the mirror's approximations are the mirrors of the opposite ones
    image = parse_handle_diagram("mirror(fibers(1, 1))")
    assert jones_polynomial(twisted(image, 1)) == jones_polynomial(mirror(twisted(fibers(1, 1), -1)))
    assert parse_diagram("twisted(axis(braid[1, 2]), 1)").crossing_count() == 8
    from movies.errors import SpecDiagramError
    with pytest.raises(SpecDiagramError, match=r"axis\(...\) takes a braid"):
        parse_handle_diagram("axis(3_1)")
