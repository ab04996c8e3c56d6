"""The one vocabulary of steps: every kind is read, performed, marked and written back the same.

A kind of step that the movie language cannot write, that replay cannot perform, or whose
outcome marks no place fails here.
"""

import pytest

from movies.checker.replay import check_movie
from movies.diagram.simplify.records import candidates
from movies.diagram.steps import KINDS, MoveRecord, Outcome, perform
from movies.errors import MoveError
from movies.language.movie import parse_movie
from movies.language.spec import parse_diagram
from movies.diagram.moves import NewNames

# (spec of the first frame, the lines before, the line of the step)
SAMPLES = {
    "R1+": ("unknot", [], "R1 add 1 left +"),
    "R1-": ("unknot", ["R1 add 1 left +"], "R1 remove 1"),
    "R2+": ("unlink(2)", [], "R2 add 1 over 2 in face 2 new crossings 7 8"),
    "R2-": ("unlink(2)", ["R2 add 1 over 2 in face 2"], None),  # the bigon, as the search finds it
    "R3": ("braid[1, 2, 1]", [], None),                        # a triangle, as the search finds it
    "band": ("unlink(2)", [], "band 1 2 in face 2"),
    "birth": ("unknot", [], "birth cw in face 1"),
    "death": ("unlink(2)", [], "death 2"),
    "cap": ("unlink(2) with handle across 1 2", ["in B2xS2"], "cap fiber 2"),
    "slide": ("braid(2)[1, 1] with handle across 1 3 from face 1", [], "slide handle 1 past crossing 1"),
    "pull": ("unlink(2) with handle across 1 2 2 from face 1", [], "pull back edge 2 through handle 1"),
    "push": ("unknot with handle", [], "push edge 1 through handle 1 in face 2"),
    "twist": ("unlink(2)", [], "twist -1 across 1 2 from face 1"),
}


def _frame_and_line(kind):
    spec, before, line = SAMPLES[kind]
    result = check_movie("\n".join([f"start {spec}", *before]), bounds=False)
    assert result.verified
    frame = result.frames[-1]
    if line is None:
        line = str(candidates(frame, (kind,))[0])
    return spec, before, frame, line


def test_every_kind_has_a_sample():
    assert set(SAMPLES) == set(KINDS)


@pytest.mark.parametrize("kind", KINDS)
def test_every_kind_is_read_performed_marked_and_written_back(kind):
    spec, before, frame, line = _frame_and_line(kind)
    statement = parse_movie("\n".join([f"start {spec}", *before, line])).steps[-1]
    record = statement.record
    assert record.kind == kind
    # written back: the record's text is the line, and reads as the same record
    assert str(record) == line
    assert parse_movie(f"start {spec}\n{str(record)}").steps[-1].record == record
    # performed, with the places it acts on in the frame before it
    outcome = perform(record, frame)
    # a slide or a pull moves a handle's gate, not the link: the frame stays
    assert isinstance(outcome, Outcome) and (outcome.diagram != frame) == (kind not in ("slide", "pull", "push"))
    assert outcome.places.edges or outcome.places.faces or outcome.places.crossings
    # replayed by the checker through the same outcome
    checked = check_movie("\n".join([f"start {spec}", *before, line]), bounds=False)
    assert checked.verdict == "verified" and checked.frames[-1] == outcome.diagram
    assert checked.places[-1] == outcome.places and checked.transitions[-1] == outcome.transition


def test_records_refuse_fields_of_other_kinds():
    with pytest.raises(MoveError, match="needs edges"):
        MoveRecord("twist", turns=1)
    with pytest.raises(MoveError, match="takes"):
        MoveRecord("death", component=1, face=2)
    assert MoveRecord("band", first=1, second=2).face is None  # the face may be left to the move
    assert str(MoveRecord("R3", face=4, names=NewNames(faces=(9,)))) == "R3 face 4 new faces 9"


def test_a_move_that_does_not_apply_says_why():
    with pytest.raises(MoveError):
        perform(MoveRecord("death", component=1), parse_diagram("3_1"))


def test_a_band_along_a_path_is_read_performed_marked_and_written_back():
    # KnotInfo smooth_four_genus of 6_1 is 0; this band, over one strand, leaves the unlink (the example movie)
    line = "band 1 4 over 11 in face 1"
    record = parse_movie(f"start 6_1\n{line}").steps[-1].record
    assert record.path == ((11, True),) and str(record) == line
    outcome = perform(record, parse_diagram("6_1"))
    assert outcome.diagram.component_count() == 2 and outcome.diagram.crossing_count() == 8
    assert outcome.places.edges == (1, 4, 11) and outcome.places.faces == (1, 6)
    assert outcome.transition.saddles == 1 and "along a path through faces 1, 6" in outcome.note
    under = parse_movie("start 6_1\nband 1 4 under 11 in face 1").steps[-1].record
    assert perform(under, parse_diagram("6_1")).diagram != outcome.diagram  # over and under differ
    with pytest.raises(MoveError, match="crosses each edge at most once"):
        perform(MoveRecord("band", first=1, second=4, path=((11, True), (11, False))), parse_diagram("6_1"))
    with pytest.raises(MoveError, match="does not border"):
        perform(MoveRecord("band", first=1, second=4, path=((3, True),), face=1), parse_diagram("6_1"))


@pytest.mark.parametrize("twists, name", [(3, "3_1"), (-3, "mirror(3_1)"), (5, "5_1")])
def test_half_twisted_bands_on_the_unknot_make_the_two_strand_torus_knots(twists, name):
    # a band from the unknot to itself with t half twists leaves the (2, t) torus link (common practice, no
    # source); KnotInfo jones_polynomial of 3_1 and 5_1 (the right-handed ones) fixes which hand is which
    from movies.invariants.jones import jones_polynomial

    line = f"band 1 1 twisted {twists:+d} in face 1"
    record = parse_movie(f"start unknot\n{line}").steps[-1].record
    assert str(record) == line and record.twists == twists
    outcome = perform(record, parse_diagram("unknot"))
    assert jones_polynomial(outcome.diagram) == jones_polynomial(parse_diagram(name))
    assert outcome.transition.twisted  # an odd number of half twists: a Moebius band
