"""The least-genus search: what it finds is a movie the checker verifies, never below the table's genus."""

import json

import pytest

from movies.checker.genus import find_surface
from movies.checker.replay import check_movie
from movies.cli.main import main
from movies.diagram.tables import table_row


@pytest.mark.parametrize("name", ["3_1", "4_1", "5_2", "6_2", "5_1"])
def test_the_surface_found_is_verified_and_meets_the_table(name):
    found = find_surface(name, budget=60)
    result = check_movie(found.movie)
    assert result.verified and result.surface.connected and result.frames[-1].is_empty()
    assert result.surface.components[0].genus == found.genus
    # KnotInfo column smooth_four_genus: these knots have 4-genus 1, 1, 1, 1, 2, and the search reaches it
    assert found.genus == int(table_row(name)["smooth_four_genus"])


def test_the_command_line_certifies_the_genus(capsys):
    assert main(["find", "surface", "5_2", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    # KnotInfo rasmussen_invariant of 5_2 is 2: s gives g4 >= 1, and the surface has genus 1
    assert data["genus"] == 1 and data["best_lower_bound"] == 1 and data["four_genus_certified"] == 1
    assert main(["find", "surface", "L2a1{0}"]) == 2


def test_fox_milnor_certifies_genus_one_where_s_and_the_signature_vanish(capsys):
    # KnotInfo: 4_1 has rasmussen_invariant 0, signature 0, determinant 5 and smooth_four_genus 1
    assert main(["find", "surface", "4_1", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["best_lower_bound"] == 1 and data["four_genus_certified"] == 1 == int(table_row("4_1")["smooth_four_genus"])


def test_a_genus_one_piece_may_end_at_a_slice_knot_instead_of_the_unknot():
    # KnotInfo column smooth_four_genus: 9_37 has 4-genus 1; no crossing change of its diagram reaches the unknot
    # in one genus-one piece, but one reaches a ribbon knot, and the movie goes on with its ribbon disk
    found = find_surface("9_37", budget=60)
    result = check_movie(found.movie)
    assert result.verified and found.genus == 1 == int(table_row("9_37")["smooth_four_genus"])
    assert result.surface.connected and result.surface.components[0].genus == 1
    assert any(line.startswith("isotopic to pd[") for line in found.movie.splitlines())


def test_a_slice_knot_gets_a_disk_from_find_surface(capsys):
    # KnotInfo column smooth_four_genus: 6_1 has 4-genus 0; no invariant rules a disk out, so the ribbon search runs
    # first, and the disk it finds is checked and certified
    assert main(["find", "surface", "6_1", "--json", "--budget", "60"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["genus"] == 0 == data["four_genus_certified"] == int(table_row("6_1")["smooth_four_genus"])
    assert check_movie(data["movie"]).verified


def test_a_cobordism_between_two_knots(capsys):
    found = find_surface("7_1", budget=60, to="5_1")
    result = check_movie(found.movie)
    assert result.verified and result.surface.components[0].genus == 1 == found.genus
    # KnotInfo rasmussen_invariant: s(7_1) = 6, s(5_1) = 4, so every cobordism has genus >= 1 (Rasmussen 2010)
    assert main(["find", "surface", "7_1", "--to", "5_1", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["genus_certified"] == 1 and "four_genus_certified" not in data
    assert main(["find", "ribbon", "6_1", "--to", "3_1"]) == 2


def test_a_search_reports_progress_and_stops_on_ctrl_c():
    from movies.checker.ribbon import find_ribbon_disk

    lines = []

    def interrupt(line):
        lines.append(line)
        raise KeyboardInterrupt

    import movies.checker.genus as genus_module

    # a search that runs long enough to report (9_48: no genus-one piece found within half a minute); the first
    # report stops it
    found = genus_module.find_surface("9_48", budget=60, progress=interrupt)
    assert lines[0].startswith("surface search for 9_48")
    # stopped, it gives the best surface built so far, checked as a movie
    assert found.why.startswith("stopped by Ctrl-C; ") and check_movie(found.movie).verified
    # KnotInfo column smooth_four_genus: never below it
    assert found.genus >= int(table_row("9_48")["smooth_four_genus"])
    found = find_ribbon_disk("12a_631", budget=60, progress=interrupt)
    assert found.why == "stopped by Ctrl-C before a ribbon disk was found"
