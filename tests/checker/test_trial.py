"""Trying candidate steps on a frame: legal or not, and what each leaves."""

import json

from movies.checker.trial import try_steps
from movies.cli.main import main
from movies.language.spec import parse_diagram, parse_handle_diagram


def test_the_ribbon_band_of_the_square_knot_leaves_a_certified_unlink():
    # the bundled example's band: its movie checks the same frame as an unlink (examples/movies)
    (good, bad, garbled) = try_steps(parse_diagram("3_1 # mirror(3_1)"),
                                     ["band 4 10 in face 1", "band 1 99", "band four"], budget=5)
    assert good.legal and good.components == 2 and good.linking_matrix == [[0, 0], [0, 0]]
    assert good.unlink == "certified" and good.moves
    assert not bad.legal and "edge 99 is not in the diagram" in bad.reason
    assert not garbled.legal and garbled.reason.startswith("the step does not read")


def test_a_band_that_leaves_a_linked_pair_is_not_an_unlink():
    # common practice, no source: linking numbers of the two pieces decide at once
    (trial,) = try_steps(parse_diagram("6_1"), ["band 4 10"], budget=1)
    assert trial.legal and trial.unlink == "no" and "linking numbers" in trial.unlink_detail


def test_steps_on_a_frame_with_handles_are_checked_as_a_movie_with_handles():
    link = parse_handle_diagram("5_1 with handle across 1 3 from face 2")
    kept, cut = try_steps(link.diagram, ["band 9 5 in face 1", "band 7 5 in face 1"], budget=1, handles=link)
    assert kept.legal and kept.handles.gates[0].edges == (1, 3)
    assert not cut.legal and "cuts through a handle's gate" in cut.reason


def test_movies_try_on_the_command_line(tmp_path, capsys):
    path = "examples/movies/square-knot-ribbon.movie"
    assert main(["try", path, "--at", "0", "band 4 10 in face 1", "--json", "--svg", str(tmp_path / "t.svg")]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["trials"][0]["unlink"] == "certified" and data["trials"][0]["components"] == 2
    assert (tmp_path / "t-1.svg").read_text().startswith("<svg")
    assert main(["try", "6_1", "band 4 10"]) == 0
    assert "unlink: no" in capsys.readouterr().out
    assert main(["try", "6_1", "--at", "2", "band 4 10"]) == 2
    assert "--at is for a movie file" in capsys.readouterr().err
    assert main(["try", path, "--at", "9", "band 1 2"]) == 2
    assert "there is no frame after step 9" in capsys.readouterr().err
