"""The ribbon disk search: what it finds is a movie the checker verifies."""

import json

import pytest

from movies.checker.replay import check_movie
from movies.checker.ribbon import find_ribbon_disk
from movies.cli.main import main
from movies.diagram.tables import table_row


@pytest.mark.parametrize("name", ["6_1", "8_8", "8_20", "9_46", "10_153", "11n_139"])
def test_slice_knots_get_a_checked_ribbon_movie(name):
    # KnotInfo column smooth_four_genus: 0 for each of these
    assert table_row(name)["smooth_four_genus"] == "0"
    found = find_ribbon_disk(name, budget=60)
    assert found.verdict == "verified" and found.movie.startswith("title a ribbon disk")
    # the movie stands on its own: checked again from its text
    result = check_movie(found.movie)
    assert result.verified and result.surface.components[0].genus == 0 and result.frames[-1].is_empty()


def test_the_command_line_certifies_or_explains(tmp_path, capsys):
    out = tmp_path / "r.movie"
    assert main(["find", "ribbon", "6_1", "-o", str(out), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["four_genus_certified"] == 0 and check_movie(out.read_text()).verified
    # KnotInfo determinant of 6_1 is 9, a square: Fox–Milnor allows a disk
    assert table_row("6_1")["determinant"] == "9"
    assert data["four_genus_bounds"][-1] == {"invariant": "Fox–Milnor", "value": 9, "bound": 0}
    # KnotInfo rasmussen_invariant of 3_1 is 2: not slice, nothing to search for
    assert main(["find", "ribbon", "3_1"]) == 1
    assert "not slice: s over Q gives g4 >= 1" in capsys.readouterr().out
    # Fox–Milnor: the determinant of 4_1 is 5 (KnotInfo determinant), not a square, though s and sigma vanish
    assert table_row("4_1")["determinant"] == "5"
    assert main(["find", "ribbon", "4_1"]) == 1
    assert "not slice: Fox–Milnor (the determinant is not a square) gives g4 >= 1" in capsys.readouterr().out
    assert main(["find", "surface", "L2a1{0}"]) == 2
    assert "movies find surface is for knots" in capsys.readouterr().err


def test_ribbon_disks_for_links(capsys):
    # the square knot beside an unknot: one band for the square knot, then three disks (the movie is checked)
    assert main(["find", "ribbon", "3_1 # mirror(3_1) + unknot", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["slice_certified"] and len(data["bands"]) == 1 and check_movie(data["movie"]).verified
    # an unlink needs no band at all
    assert main(["find", "ribbon", "unlink(2)", "--json"]) == 0
    assert json.loads(capsys.readouterr().out)["bands"] == []
    # LinkInfo's L5a1{0} (linking number 0): Beliakova–Wehrli 2008 with two disks needs s of the mirror <= -1
    assert main(["find", "ribbon", "L5a1{0}"]) == 1
    assert "s of the mirror over Q is 1 > -1" in capsys.readouterr().out
    # the Hopf link: linking number 1 (LinkInfo linking_matrix), so no disjoint disks
    assert main(["find", "ribbon", "L2a1{1}"]) == 1
    assert "a linking number is 1, not 0" in capsys.readouterr().out
