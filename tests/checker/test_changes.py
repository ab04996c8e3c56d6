"""Surfaces by construction: crossing changes as moves, Seifert's algorithm as moves, checked as movies."""

import pytest

from movies.checker.changes import crossing_change_moves, seifert_genus, seifert_moves, switched
from movies.checker.genus import find_surface
from movies.checker.replay import check_movie
from movies.diagram.isotopy import isomorphism
from movies.diagram.tables import table_names, table_row
from movies.language.spec import parse_diagram


def _spec(diagram):
    return "pd[" + ",".join("[" + ",".join(map(str, c)) + "]" for c in diagram.crossings.values()) + "]"


@pytest.mark.parametrize("name", ["3_1", "4_1", "6_2", "8_19", "10_132", "12n_100"])
def test_every_crossing_change_is_a_genus_one_movie_to_the_switched_diagram(name):
    knot = parse_diagram(name)
    for crossing in sorted(knot.crossings):
        moves, after = crossing_change_moves(knot, crossing)
        target = switched(knot, crossing)
        assert isomorphism(after, target) is not None
        assert after.writhe() == knot.writhe() - 2 * knot.signs[crossing]
        text = "\n".join([f"start {name}", *map(str, moves), f"isotopic to {_spec(target)}",
                          "surface connected, genus 1"]) + "\n"
        assert check_movie(text).verified


def test_switching_a_crossing_twice_gives_the_diagram_back():
    knot = parse_diagram("7_4")
    for crossing in knot.crossings:
        assert isomorphism(switched(switched(knot, crossing), crossing), knot) is not None
        assert switched(knot, crossing) != knot


def test_one_change_of_the_trefoil_is_its_least_genus_surface():
    knot = parse_diagram("3_1")
    moves, after = crossing_change_moves(knot, 1)
    text = "\n".join(["start 3_1", *map(str, moves), "simplify to crossingless", "death 1",
                      "surface connected, genus 1"]) + "\n"
    result = check_movie(text)
    # KnotInfo column smooth_four_genus: 3_1 has 4-genus 1
    assert result.verified and result.surface.components[0].genus == 1 == int(table_row("3_1")["smooth_four_genus"])


@pytest.mark.parametrize("name", [n for n in table_names("knot", max_crossings=9)[1:] if n in {
    "3_1", "4_1", "5_1", "5_2", "6_1", "6_2", "6_3", "7_1", "7_7", "8_12", "8_18", "9_1", "9_40"}])
def test_seifert_surface_of_an_alternating_diagram_has_the_knot_genus(name):
    knot = parse_diagram(name)
    moves, circles = seifert_moves(knot)
    assert circles.crossing_count() == 0
    text = "\n".join([f"start {name}", *map(str, moves), *(f"death {c}" for c in sorted(circles.components)),
                      f"surface connected, genus {seifert_genus(knot)}"]) + "\n"
    result = check_movie(text)
    assert result.verified and result.surface.components[0].genus == seifert_genus(knot)
    # KnotInfo column three_genus; Crowell and Murasugi (1959): Seifert's algorithm on a reduced alternating
    # diagram gives a surface of least genus
    assert seifert_genus(knot) == int(table_row(name)["three_genus"])


def test_seifert_genus_of_a_non_alternating_diagram_bounds_the_knot_genus_from_above():
    for name in ("8_19", "8_20", "10_132", "12n_100"):
        # KnotInfo column three_genus (the diagram's Seifert surface can only be larger)
        assert seifert_genus(parse_diagram(name)) >= int(table_row(name)["three_genus"])


def test_the_search_certifies_a_genus_four_knot_by_its_seifert_surface():
    found = find_surface("12a_276", budget=30)
    result = check_movie(found.movie)
    # KnotInfo column smooth_four_genus: 12a_276 has 4-genus 4 (and s gives the bound 4)
    assert found.genus == 4 == int(table_row("12a_276")["smooth_four_genus"])
    assert result.verified and result.surface.connected and result.surface.components[0].genus == 4
    assert "Seifert's algorithm" in found.movie.splitlines()[0]


def test_two_changes_then_a_seifert_surface():
    found = find_surface("12a_190", budget=30)
    result = check_movie(found.movie)
    # KnotInfo column smooth_four_genus: 12a_190 has 4-genus 2
    assert found.genus == 2 == int(table_row("12a_190")["smooth_four_genus"])
    assert result.verified and result.surface.components[0].genus == 2
    assert sum(" twisted " in line for line in found.movie.splitlines()) >= 1


def test_when_nothing_meets_the_bound_the_least_genus_built_is_given_and_said():
    found = find_surface("11n_45", budget=2)
    result = check_movie(found.movie)
    assert result.verified and result.surface.components[0].genus == found.genus
    # KnotInfo column smooth_four_genus: the surface found can never be below it
    assert found.genus >= int(table_row("11n_45")["smooth_four_genus"])
    assert "built by crossing changes and Seifert's algorithm" in found.why
