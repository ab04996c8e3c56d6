"""Surfaces that links in #ʳ S¹×S² bound in ♮ʳ S¹×B³, as s of the approximations allows them."""

import json

import pytest

from movies.bounds.handles import s1xb3_question
from movies.cli.main import main
from movies.diagram.handles import fibers
from movies.language.spec import parse_handle_diagram


@pytest.mark.parametrize("p", [1, 2])
def test_balanced_fibers_bound_annuli_and_the_bound_is_an_equality(p):
    answer = s1xb3_question(fibers(p, p), genus=0, fields=("Q",))
    # the design notes: F(p, p) bounds p disjoint annuli in S^1 x B^3 (each pair of opposite fibers, times an
    # interval); their Euler characteristic 0 meets the bound 1 - chi >= max s exactly, max s = s(F(p, p)(-1)) = 1
    assert max(b.rhs for b in answer.bounds) == 1 == 1 - 0
    assert answer.least_genus == 0 and answer.allowed


def test_two_disks_for_two_opposite_fibers_are_ruled_out():
    # each fiber alone is not null-homologous, and s says the same: chi = 2 would need s <= -1
    answer = s1xb3_question(fibers(1, 1), genus=0, fields=("Q",))
    best = max(b.rhs for b in answer.bounds)
    assert 1 - 2 < best


def test_the_trefoil_through_a_handle_bounds_no_disk():
    # L(0) is the trefoil, and a surface in S^1 x B^3 is one in B^4: KnotInfo rasmussen_invariant s(3_1) = 2
    # forbids a disk (Rasmussen 2010), and the bound comes from k = 0
    answer = s1xb3_question(parse_handle_diagram("3_1 with handle across 1 5"), genus=0)
    assert not answer.allowed and answer.least_genus == 1
    assert any(b.statement.startswith("S^1 x B^3, k = 0") and not b.holds for b in answer.bounds)
    assert s1xb3_question(parse_handle_diagram("3_1 with handle across 1 5"), genus=1).allowed


def test_bounds_on_the_command_line(capsys):
    assert main(["bounds", "3_1 with handle across 1 5"]) == 0
    out = capsys.readouterr().out
    assert "total genus at least 1" in out and "no such surface exists" in out
    assert main(["bounds", "fibers(1, 1)", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["allowed_by_s"] and data["least_genus"] == 0 and data["euler_characteristic"] == 0
    assert main(["bounds", "fibers(1, 1)", "--to", "unknot"]) == 2
    assert "do not apply" in capsys.readouterr().err
