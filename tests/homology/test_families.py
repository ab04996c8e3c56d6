"""Families L(0), …, L(K) from one scan agree with each member computed alone, and with the table."""

from __future__ import annotations

import pytest

from movies.diagram.handles import fibers, twisted
from movies.diagram.tables import table_row
from movies.errors import InternalError
from movies.homology.families import family_complexes, family_khovanov, family_s, twist_family
from movies.homology.khovanov import khovanov_homology
from movies.homology.links import link_s_values
from movies.homology.scanning import RING_Z
from movies.language.spec import parse_handle_diagram

LINKS = [
    "unlink(2) with handle across 1 2",
    "fibers(3, 1)",
    "unlink(4) with handle across 1 2 and handle across 3 4 from face 4",
    "L4a1{1} with handle across 2 6 and handle across 4 8",
    "pd[[1,2,2,3],[3,4,4,1]] with handle across 2 4",
    "3_1 with handle across 1 5",
    "4_1 with handle across 1 5",
    "4_1 with handle across 1 4",
]


@pytest.mark.parametrize("text", LINKS)
@pytest.mark.parametrize("most", [3, -3, 1, -1])
def test_each_member_equals_the_diagram_alone(text, most):
    link = fibers(3, 1) if text == "fibers(3, 1)" else parse_handle_diagram(text)
    together = family_s(link, most, ("Q", "F2"))
    assert sorted(together, key=abs) == [k * (1 if most > 0 else -1) for k in range(abs(most) + 1)]
    for k, values in together.items():
        assert values == link_s_values(twisted(link, k), ["Q", "F2"])
    if abs(most) <= 2 or "L4a1" not in text:
        for k, ranks in family_khovanov(link, most).items():
            assert ranks == khovanov_homology(twisted(link, k))


def test_fibers_f22_in_both_directions_and_over_f3():
    link = fibers(2, 2)
    for k, values in family_s(link, 4, ("Q", "F3")).items():
        assert values == link_s_values(twisted(link, k), ["Q", "F3"])
    for k, ranks in family_khovanov(link, -2, "F2").items():
        assert ranks == khovanov_homology(twisted(link, k), "F2")


def test_twist_knots_against_the_table():
    # examples/diagrams/twist-knots-through-a-handle.txt: L(1) is the negative trefoil, L(2) the
    # mirror of 5_2, L(-1), L(-2), L(-3) are 4_1, 6_1, 8_1.
    link = parse_handle_diagram("pd[[1,2,2,3],[3,4,4,1]] with handle across 2 4")
    up, down = family_s(link, 2), family_s(link, -3)
    # KnotInfo column rasmussen_invariant, negated for a mirror image (Rasmussen 2010)
    assert up[1]["Q"] == -int(table_row("3_1")["rasmussen_invariant"])
    assert up[2]["Q"] == -int(table_row("5_2")["rasmussen_invariant"])
    for k, name in [(-1, "4_1"), (-2, "6_1"), (-3, "8_1")]:
        assert down[k]["Q"] == int(table_row(name)["rasmussen_invariant"])


def test_stop_ends_the_scan_early():
    seen = []
    family_s(fibers(2, 2), 5, stop=lambda k, values: seen.append(k) or k == 2)
    assert seen == [0, 1, 2]


@pytest.mark.parametrize("text", LINKS)
def test_the_plan_counts_what_each_member_has(text):
    link = fibers(3, 1) if text == "fibers(3, 1)" else parse_handle_diagram(text)
    for most in (3, -2):
        plan = twist_family(link, most)
        for k in range(abs(most) + 1):
            member = twisted(link, plan.turns * k)
            assert len(plan.crossings_of(k)) == len(member.crossings)
            assert plan.minus[k] == sum(1 for s in member.signs.values() if s < 0)
            assert plan.seifert[k] == member.seifert_circle_count()
            assert plan.components == member.component_count()


def test_a_broken_plan_is_refused():
    plan = twist_family(fibers(2, 2), 2)
    assert [len(b) for b in plan.blocks] == [12, 12]
    assert plan.minus == [0, 8, 16]  # 4 of the 6 pairs of strands run opposite ways, twice each
    broken = plan.__class__(**{**plan.__dict__, "closings": (plan.closings[0][:-1],) + plan.closings[1:]})
    with pytest.raises(InternalError, match="does not match"):
        list(family_complexes(broken, RING_Z))


def test_a_family_needs_a_nonzero_last_member():
    with pytest.raises(ValueError):
        twist_family(fibers(1, 1), 0)
