"""The s-inequalities and 4-genus bounds: tight cases, the tables, and the internal-error path."""

import json

import pytest

from movies.bounds import verdicts
from movies.bounds.inequalities import best_genus_bound
from movies.bounds.verdicts import knot_genus_bounds, surface_bounds
from movies.errors import InternalInconsistency
from movies.checker.replay import check_movie
from movies.cli.main import main
from movies.diagram.constructors import torus_link
from movies.diagram.tables import table_names, table_row
from movies.language.movie import parse_movie
from movies.language.spec import parse_diagram
from support.knotinfo_columns import parse_four_genus


@pytest.mark.parametrize("name", table_names("knot", max_crossings=12)[1::40])
def test_no_bound_exceeds_the_four_genus(name):
    g4 = parse_four_genus(table_row(name)["smooth_four_genus"])
    if g4 is None:
        pytest.skip(f"{name}: the table gives a range")
    bounds = knot_genus_bounds(parse_diagram(name))
    # KnotInfo column smooth_four_genus: a lower bound above it would be a bug
    assert all(b.bound <= g4 for b in bounds), (name, g4, bounds)


@pytest.mark.parametrize("p, q", [(2, 3), (2, 5), (3, 4), (3, 5)])
def test_torus_knots_attain_their_bound(p, q):
    best = best_genus_bound(knot_genus_bounds(torus_link(p, q)))
    # Kronheimer–Mrowka (the Milnor conjecture): g4(T(p, q)) = (p - 1)(q - 1)/2, and s attains it
    assert best.bound == (p - 1) * (q - 1) // 2 and best.invariant.startswith("s over")


def test_a_tight_cobordism_is_reported():
    result = check_movie(parse_movie(open("examples/movies/5_2-to-5_1-genus-one.movie").read()))
    report = result.bounds
    # KnotInfo column rasmussen_invariant: s(5_2) = 2, s(5_1) = 4
    assert report.s == {"start": {"Q": 2, "F2": 2}, "end": {"Q": 4, "F2": 4}}
    tight = [b for b in report.bounds if b.tight]
    assert tight and all(b.lhs == -2 == b.rhs for b in tight)
    assert all(b.holds for b in report.bounds)
    assert "equality" in report.least_genus[0]


def test_non_orientable_surfaces_get_no_inequality():
    # a band that twists, then the unknot dies: a Moebius band for the trefoil
    text = "start 3_1\nband 1 4 in face 1\nsimplify to crossingless\ndeath 1"
    result = check_movie(parse_movie(text))
    assert result.surface.components[0].crosscaps == 1  # this band twists: not orientable
    assert result.bounds.bounds == [] and "not oriented" in result.bounds.notes[0]


def test_a_disk_for_the_trefoil_is_refuted(capsys):
    assert main(["bounds", "3_1", "--to", "empty", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    # Rasmussen 2010: s(3_1) = 2 > 0 rules out a slice disk
    assert data["allowed_connected"] is False and data["allowed_by_s_and_signatures"] is False
    assert main(["bounds", "8_20", "--to", "empty", "--json"]) == 0
    assert json.loads(capsys.readouterr().out)["allowed_connected"] is True


def test_a_violation_in_a_verified_movie_is_an_internal_error(monkeypatch, capsys, tmp_path):
    path = tmp_path / "disk.movie"
    path.write_text("start 8_20\nband 6 12 in face 1\nsimplify to crossingless\ndeath 1\ndeath 2\n")
    assert main(["check", str(path)]) == 0
    capsys.readouterr()
    real = verdicts.s_values
    monkeypatch.setattr(verdicts, "s_values", lambda d: {"Q": 6, "F2": 6} if not d.is_empty() else real(d))
    with pytest.raises(InternalInconsistency):
        check_movie(parse_movie(path.read_text()))
    assert main(["check", str(path)]) == 3
    assert "bug of this program" in capsys.readouterr().err


def test_link_ends_with_a_linking_number_zero_sublink_are_judged():
    result = check_movie(parse_movie("start L5a1{0}\nband 1 5 in face 2"))
    assert result.verdict == "verified"
    report = surface_bounds(result.movie.start, result.frames[-1], result.surface)
    # pinned: this program's value for the Whitehead link (checked against theorems in tests/homology/test_links.py)
    assert report.s["start"] == {"Q": -1, "F2": -1}
    assert report.bounds and all(b.holds for b in report.bounds)


def test_hopf_link_end_is_judged():
    result = check_movie(parse_movie("start L2a1{1}\nband 1 3"))
    # positive Hopf link: s = w - O + 1 = 1 for a positive diagram (from memory)
    assert result.bounds.s["start"] == {"Q": 1, "F2": 1}
    assert result.bounds.bounds and all(b.holds for b in result.bounds.bounds)


FORMS = ["every component meets the start: s(end) - s(start)", "every component meets the end: s(start) - s(end)",
         "mirror movie, every component meets the start", "mirror movie, every component meets the end"]


@pytest.mark.parametrize("mirrored", [False, True])
def test_each_inequality_is_tight_on_a_hand_checked_movie(mirrored):
    text = open("examples/movies/5_2-to-5_1-genus-one.movie").read()
    if mirrored:
        text = text.replace("start 5_2", "start mirror(5_2)").replace("isotopic to 5_1", "isotopic to mirror(5_1)")
    result = check_movie(parse_movie(text))
    assert result.verdict == "verified"
    tight = {form for form in FORMS for b in result.bounds.bounds if b.tight and b.statement.startswith(form)}
    # hand-checked: s(5_2) = 2, s(5_1) = 4 (KnotInfo rasmussen_invariant), chi = -2; mirroring negates s
    expected = {FORMS[1], FORMS[2]} if not mirrored else {FORMS[0], FORMS[3]}
    assert tight == expected
