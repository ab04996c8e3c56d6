"""s of links from the canonical class, against the theorems that pin it down."""

import random

import pytest

from movies.diagram.constructors import disjoint_union, from_braid, reverse, torus_link, unlink
from movies.homology import rasmussen_s
from movies.homology.links import free_part_s, link_s, link_s_values
from movies.diagram.tables import table_names
from movies.language.spec import parse_diagram
from movies.diagram.simplify import simplify
from support.crossings import switched


@pytest.mark.parametrize("n", [1, 2, 3, 4])
def test_unlinks(n):
    # Beliakova–Wehrli 2008: s(unlink of n components) = 1 - n
    assert link_s(unlink(n)) == 1 - n == link_s(unlink(n), "F2")


def test_knots_agree_with_the_knot_method():
    for name in ["3_1", "4_1", "5_2", "mirror(6_2)", "8_19"]:
        d = parse_diagram(name)
        assert link_s(d) == rasmussen_s(d) and link_s(d, "F3") == rasmussen_s(d, "F3")


def test_split_unions_on_random_pairs():
    rng = random.Random(5)
    names = ["3_1", "mirror(3_1)", "4_1", "5_1", "L2a1{1}", "L4a1{1}", "torus(2, 4)"]
    for _ in range(6):
        a, b = rng.sample(names, 2)
        first, second = parse_diagram(a), parse_diagram(b)
        # Beliakova–Wehrli 2008: s(L1 ⊔ L2) = s(L1) + s(L2) - 1
        assert link_s(disjoint_union(first, second)) == link_s(first) + link_s(second) - 1


TORUS_CASES = [(n, q) for n in range(2, 7) for q in range(n // 2 + 1)]


@pytest.mark.parametrize("n, reversed_count", TORUS_CASES)
def test_torus_links_with_strands_both_ways(n, reversed_count):
    d = torus_link(n, n)
    if reversed_count:
        d = reverse(d, sorted(d.components)[:reversed_count])
    p, q = n - reversed_count, reversed_count
    values = link_s_values(d, ("Q", "F2", "F3"))
    # Q. Ren, "Lee filtration structure of torus links" (2023): s(T(n,n), p one way, q the other) = (p-q)^2 - 2p + 1
    assert set(values.values()) == {(p - q) ** 2 - 2 * p + 1}


def test_random_positive_braid_links():
    rng = random.Random(11)
    checked = 0
    for _ in range(12):
        strands = rng.choice([2, 3])
        word = [rng.randint(1, strands - 1) for _ in range(rng.randint(2, 8))]
        d = from_braid(word, strands=strands)
        if d.component_count() < 2 or d.piece_count() > 1:
            continue
        # from memory: a positive link diagram has s = w - O + 1
        assert link_s(d) == d.writhe() - d.seifert_circle_count() + 1
        checked += 1
    assert checked >= 3


TWO_ORIENTATIONS_IN_DEGREE_0 = ["L2a1{0}", "L2a1{1}", "L4a1{0}", "L6a2{0}", "L6a3{1}", "L7n1{0}", "L8n1{1}"]


@pytest.mark.parametrize("name", TWO_ORIENTATIONS_IN_DEGREE_0)
def test_canonical_class_agrees_with_the_free_part(name):
    d = parse_diagram(name)
    for field in ("Q", "F2"):
        expected = free_part_s(d, field)
        assert expected is not None  # only o and its reverse in degree 0: the free part settles s
        assert link_s(d, field) == expected


def test_the_free_part_alone_cannot_settle_linking_number_zero():
    # the Whitehead link: four free generators in degree 0, so the degrees do not say which is o
    assert free_part_s(parse_diagram("L5a1{0}")) is None
    whitehead = parse_diagram("L5a1{0}")
    # one crossing change unlinks it: find the crossing whose switch the Reidemeister search takes to
    # two crossingless circles
    unlinked = [c for c in sorted(whitehead.crossings)
                if simplify(switched(whitehead, c), "crossingless", budget=2000).reached]
    assert unlinked
    # Beliakova–Wehrli 2008: s(unlink of 2) = -1, and a crossing change is two oriented saddles
    # (chi = -2), so |s(L) + 1| <= 2
    assert abs(link_s(whitehead) + 1) <= 2
    # common practice, no source: s of a two-component link is odd (its q-degrees are)
    assert link_s(whitehead) % 2 == 1


def test_reversing_every_component_keeps_s():
    rng = random.Random(3)
    for name in rng.sample(["L5a1{0}", "L6a4{0,0}", "L7a6{1}", "L7n2{0}", "L8a8{1}", "L9n14{0}"], 4):
        d = parse_diagram(name)
        # common practice, no source: the involution X -> H - X maps the canonical class of o to that of its reverse
        assert link_s(reverse(d, sorted(d.components))) == link_s(d)


def test_a_crossing_change_moves_s_by_at_most_two_and_never_up():
    rng = random.Random(8)
    names = [n for n in table_names("link", max_crossings=9)]
    for name in rng.sample(names, 30):
        d = parse_diagram(name)
        crossing = rng.choice(sorted(d.crossings))
        other = switched(d, crossing)
        plus, minus = (d, other) if d.signs[crossing] > 0 else (other, d)
        s_plus, s_minus = link_s(plus), link_s(minus)
        # Beliakova–Wehrli 2008: two oriented saddles (chi = -2) join L+ and L-, so |s(L+) - s(L-)| <= 2;
        # Q. Ren (2023), Cor. 1.4 with a = 0: the +1 twist that turns L+ into L- does not raise s
        assert 0 <= s_plus - s_minus <= 2, (name, crossing, s_plus, s_minus)
