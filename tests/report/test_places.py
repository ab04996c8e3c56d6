"""Where a step acts, as the pictures mark it: the places each step's outcome names."""

from movies.checker.replay import check_movie
from movies.diagram.constructors import unlink
from movies.diagram.steps import MoveRecord, Places, perform, places_named


def test_a_twist_marks_its_gate():
    places = perform(MoveRecord("twist", edges=(1, 2), turns=1), unlink(2)).places
    # the gate of two circles side by side runs from inside circle 1, through the outside, into circle 2
    assert places.edges == (1, 2) and places.faces == (1, 2, 3)


def test_a_step_that_does_not_apply_still_marks_what_it_names():
    result = check_movie("start unlink(2)\ntwist +1 across 1 7")
    assert result.verdict == "invalid"
    assert result.places == [Places(edges=(1, 7))]
    assert places_named(MoveRecord("R1-", crossing=3)) == Places(crossings=(3,))


def test_every_step_of_a_movie_has_its_places():
    result = check_movie("start unlink(2)\nband 1 2 in face 2\nR1 add 1 left +\nsimplify\ndeath 1")
    assert result.verified and len(result.places) == len(result.steps) == 4
    band, kink, search, death = result.places
    assert band == Places(edges=(1, 2), faces=(2,))
    assert kink.edges == (1,) and len(kink.faces) == 1
    assert search == Places()  # a search marks nothing: it is not one move
    assert death == Places(edges=tuple(result.frames[3].components[1]))  # the circle that dies
