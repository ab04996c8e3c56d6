"""How the checker words each step: counts, searches that stop short, unproved claims."""

from movies.checker.replay import check_movie
from movies.report.movie import as_json, as_text
from movies.diagram.simplify import scramble
from movies.language.movie import parse_movie
from movies.language.spec import parse_diagram


def test_one_move_is_singular():
    result = check_movie(parse_movie("start unknot\nR1 add 1 left +\nsimplify"), bounds=False)
    assert result.steps[-1].note == "found 1 Reidemeister move"
    result = check_movie(parse_movie("start unknot\nR1 add 1 left +\nR1 add 1 left +\nsimplify"), bounds=False)
    assert result.steps[-1].note == "found 2 Reidemeister moves"


def test_a_search_that_stops_short_says_why():
    result = check_movie(parse_movie("start 3_1\nsimplify to crossingless"), budget=0.5, bounds=False)
    note = result.steps[-1].note
    assert result.verdict == "conditional" and not result.steps[-1].certified
    assert note.startswith("the search stopped at 3 crossings without reaching a crossingless diagram: ")
    assert "within the budget" not in note and "no sequence of Reidemeister moves" in note


def test_an_unproved_isotopy_claim_gives_its_reason_first():
    knot = parse_diagram("8_20 # mirror(8_20)")
    hard, _ = scramble(knot, 30, seed=1)  # a 31-crossing diagram of the same knot the short search misses
    code = [list(hard.crossings[c]) for c in sorted(hard.crossings)]
    text = f"start 8_20 # mirror(8_20)\nbudget 1 seconds\nisotopic to pd{code}"
    data = as_json(check_movie(parse_movie(text), bounds=False))
    assert data["verdict"] == "conditional"
    note = data["steps"][-1]["note"]
    assert note.startswith("the search found no Reidemeister moves to the claimed diagram: ")
    assert "every invariant agrees" in note
    (finding,) = data["findings"]
    assert finding["kind"] == "unproved" and "the search found no Reidemeister moves between them: " in finding["evidence"]
    assert "UNPROVED: the search found no Reidemeister moves" in as_text(data, "demo")


def test_an_unproved_checkpoint_gives_its_reason():
    knot = parse_diagram("8_20 # mirror(8_20)")
    hard, _ = scramble(knot, 30, seed=1)
    code = [list(hard.crossings[c]) for c in sorted(hard.crossings)]
    text = f"start 8_20 # mirror(8_20)\nbudget 1 seconds\nexpect isotopic to pd{code}"
    data = as_json(check_movie(parse_movie(text), bounds=False))
    (check,) = data["checkpoints"]
    assert check["outcome"] == "unproved"
    assert check["detail"].startswith("the search found no Reidemeister moves between them: ")
