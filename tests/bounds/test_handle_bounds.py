"""Surfaces that links in #ʳ S¹×S² bound in ♮ʳ S¹×B³ and ♮ʳ B²×S², as s of the approximations allows them."""

import json

import pytest

from movies.bounds.handles import B2XS2, S1XB3, surface_questions
from movies.cli.main import main
from movies.diagram.handles import fibers
from movies.language.spec import parse_handle_diagram


def _best(answer):
    return max(b.rhs for b in answer.bounds)


@pytest.mark.parametrize("p", [1, 2])
def test_balanced_fibers_bound_annuli_and_the_bound_is_an_equality(p):
    three, _ = surface_questions(fibers(p, p), genus=0, fields=("Q",))
    # the design notes (section 4): F(p, p) bounds p disjoint annuli in S^1 x B^3 (each pair of opposite fibers,
    # times an interval); their Euler characteristic 0 meets the bound 1 - chi >= max s exactly, max s = s(F(p, p)(-1))
    # = 1 (its mirror bounds the same annuli)
    assert three.manifold == S1XB3 and _best(three) == 1 == 1 - 0
    assert three.least_genus == 0 and three.allowed


@pytest.mark.parametrize("p", [1, 2])
def test_balanced_fibers_bound_disks_in_b2xs2_and_the_bound_is_an_equality(p):
    _, two = surface_questions(fibers(p, p), genus=0, fields=("Q", "F2"))
    # Gompf–Stipsicz, '4-Manifolds and Kirby Calculus', ch. 4: a fiber (the belt circle) bounds a cocore disk;
    # the design notes (section 4): the 2p fibers bound 2p cocore disks of the 2-handle, chi = 2p; the bound
    # 1 - chi >= s(L(0)) = s(unlink of 2p) = 1 - 2p (Rasmussen 2010: s of the unknot is 0; Beliakova–Wehrli 2008:
    # split unions add s - 1) is an equality
    assert two.manifold == B2XS2 and "without handle slides" in two.scope
    assert _best(two) == 1 - 2 * p == 1 - (2 * p)
    assert all(b.statement.startswith("B^2 x S^2, k = 0") for b in two.bounds)
    # ...while in S^1 x B^3 the 2p disks are ruled out: s(F(p, p)(-1)) = 1 > 1 - 2p
    three, _ = surface_questions(fibers(p, p), genus=0, fields=("Q",))
    assert _best(three) > 1 - 2 * p


def test_b2xs2_uses_only_k_at_least_0_and_its_mirror():
    # the clasp whose L(-1) is the positive trefoil: s(L(-1)) = 2 (KnotInfo rasmussen_invariant of 3_1) would forbid
    # a disk, but a twist at the handle does not extend over B^2 x S^2; L(0) is the unknot, which bounds a disk in
    # B^4, a null-homologous disk in B^2 x S^2 (Rasmussen 2010: s(unknot) = 0)
    three, two = surface_questions(parse_handle_diagram("pd[[1,1,2,3],[4,4,3,2]] with handle across 1 4"),
                                   genus=0, fields=("Q",))
    assert not three.allowed and any(b.rhs == 2 and "k = -1" in b.statement for b in three.bounds)
    assert two.allowed and two.least_genus == 0


def test_two_disks_for_two_opposite_fibers_are_ruled_out_in_s1xb3():
    # each fiber alone is not null-homologous, and s says the same: chi = 2 would need s <= -1
    three, _ = surface_questions(fibers(1, 1), genus=0, fields=("Q",))
    assert 1 - 2 < _best(three)


def test_the_trefoil_through_a_handle_bounds_no_disk():
    # L(0) is the trefoil, and a surface in S^1 x B^3 is one in B^4: KnotInfo rasmussen_invariant s(3_1) = 2
    # forbids a disk (Rasmussen 2010), and the bound comes from k = 0, in both manifolds
    spec = "3_1 with handle across 1 5"
    for answer in surface_questions(parse_handle_diagram(spec), genus=0):
        assert not answer.allowed and answer.least_genus == 1
        assert any(b.statement.startswith(f"{answer.manifold}, k = 0") and not b.holds for b in answer.bounds)
    assert all(a.allowed for a in surface_questions(parse_handle_diagram(spec), genus=1))


def test_bounds_on_the_command_line(capsys):
    assert main(["bounds", "3_1 with handle across 1 5"]) == 0
    out = capsys.readouterr().out
    assert "in S^1 x B^3 (every surface): total genus at least 1" in out and "no such surface exists" in out
    assert "in B^2 x S^2 (surfaces drawn over this diagram, without handle slides)" in out
    assert "no bound is claimed" in out
    assert main(["bounds", "fibers(1, 1)", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    three, two = data["manifolds"]
    assert three["manifold"] == "S^1 x B^3" and three["allowed_by_s"] and three["least_genus"] == 0
    assert three["euler_characteristic"] == 0 and two["manifold"] == "B^2 x S^2"
    assert data["values"]["Q"]["L"][0] == [-1, 1]
    assert main(["bounds", "fibers(1, 1)", "--to", "unknot"]) == 2
    assert "do not apply" in capsys.readouterr().err
