"""Where a move acts, as the pictures mark it."""

from movies.diagram.constructors import unlink
from movies.report.places import place_of
from movies.language.movie import parse_movie


def _twist_statement(text):
    return parse_movie(f"start unknot\n{text}").statements[-1]


def test_a_twist_marks_its_gate():
    highlight = place_of(_twist_statement("twist +1 across 1 2"), unlink(2))
    # the gate of two circles side by side runs from inside circle 1, through the outside, into circle 2
    assert highlight.edges == (1, 2) and highlight.faces == (1, 2, 3)


def test_a_gate_that_does_not_fit_still_marks_its_edges():
    highlight = place_of(_twist_statement("twist +1 across 1 7"), unlink(2))
    assert highlight.edges == (1, 7)
