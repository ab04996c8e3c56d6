"""The surface of a movie: χ, genus, components, boundary and orientation on hand-computed cases."""

import pytest

from movies.checker.replay import check_movie
from movies.report.movie import as_json
from movies.language.movie import parse_movie
from movies.surface.tracker import Transition, surface_of


def surface(text):
    result = check_movie(parse_movie(text))
    assert result.complete, result.findings
    return result, as_json(result)["surface"]


def shape(s):
    return [(c["genus"], c["crosscaps"], c["boundary_start"], c["boundary_end"]) for c in s["components"]]


def test_a_disk():
    _, s = surface("start unknot\ndeath 1")
    assert s["euler_characteristic"] == 1 and shape(s) == [(0, None, 1, 0)]
    assert s["lives_in"] == "B^4" and s["ribbon"] and s["every_component_meets_start"]
    assert not s["every_component_meets_end"]


def test_an_annulus_through_reidemeister_moves():
    _, s = surface("start unknot\nR1 add 1 left +\nR1 add 2 right -\nR1 remove 1\nR1 remove 2")
    assert s["euler_characteristic"] == 0 and shape(s) == [(0, None, 1, 1)]
    assert s["lives_in"] == "S^3 x I" and s["oriented_by_start"]


def test_a_closed_sphere_beside_an_annulus():
    # common practice, no source: a birth later killed by a death is a sphere of its own
    _, s = surface("start unknot\nbirth in face 1\ndeath 2")
    assert s["euler_characteristic"] == 2
    assert sorted(shape(s)) == [(0, None, 0, 0), (0, None, 1, 1)]
    assert not s["connected"]
    assert not s["every_component_meets_start"] and not s["every_component_meets_end"]
    assert s["births"] == 1 and s["deaths"] == 1


def test_pair_of_pants_and_genus_one():
    _, s = surface("start unknot\nband 1 1 in face 1")
    assert s["euler_characteristic"] == -1 and shape(s) == [(0, None, 1, 2)]
    _, s = surface("start unknot\nband 1 1 in face 1\nband 1 2 in face 2")
    # a band that splits and one that merges again: a torus with two holes
    assert s["euler_characteristic"] == -2 and shape(s) == [(1, None, 1, 1)]


def test_a_twisted_band_is_not_orientable():
    result, s = surface("start unknot\nR1 add 1 left +\nband 1 2 in face 1")
    assert result.steps[-1].note.startswith("band across face 1 twists")
    assert s["orientable"] is False and s["orientation_broken_at_step"] == 2
    # punctured Möbius band: chi = -1, two boundary circles, one crosscap
    assert s["euler_characteristic"] == -1 and shape(s) == [(None, 1, 1, 1)]


def test_two_disks():
    _, s = surface("start unlink(2)\ndeath 1\ndeath 2")
    assert s["euler_characteristic"] == 2 and shape(s) == [(0, None, 1, 0), (0, None, 1, 0)]
    assert not s["connected"] and s["every_component_meets_start"]


def test_merge_against_the_orientation_is_orientable_but_not_by_the_start():
    result, s = surface("start reverse(unlink(2), 2)\nband 1 2")
    assert result.steps[0].note.endswith("component 2 is reversed")
    assert s["orientable"] and not s["oriented_by_start"] and s["orientation_broken_at_step"] == 1
    _, t = surface("start unlink(2)\nband 1 2")
    assert t["orientable"] and t["oriented_by_start"]
    assert t["euler_characteristic"] == -1 and shape(t) == [(0, None, 2, 1)]


def test_ribbon_needs_no_births():
    _, s = surface("start unknot\nbirth in face 2\nband 1 2\ndeath 1")
    assert s["euler_characteristic"] == 1 and shape(s) == [(0, None, 1, 0)]
    assert s["ribbon"] is None


@pytest.mark.parametrize("text, ribbon", [
    ("start unknot\nbirth in face 2\nband 1 2\ndeath 1\nsurface ribbon", None),  # a birth: not shown
    ("start empty\nbirth in face 1\nsurface ribbon", True),                     # outward: no deaths
    ("start unknot\nR1 add 1 left +\nR1 remove 1\nsurface ribbon", None),       # not a surface in the 4-ball
    ("start unknot\ndeath 1\nsurface ribbon", True),
])
def test_a_ribbon_claim_is_shown_or_left_unproved_never_refuted(text, ribbon):
    result = check_movie(parse_movie(text))
    (claim,) = result.claims
    fact, holds, detail = claim.fact, claim.holds, claim.detail
    assert fact == "ribbon" and holds is ribbon
    # common practice, no source: a movie with local maxima may still draw a surface isotopic to a ribbon one
    assert result.verdict == ("verified" if ribbon else "conditional"), detail
    if ribbon is None:
        assert "not shown by this movie" in as_json(result)["findings"][0]["message"]


def test_transitions_directly():
    # three components: two merge, one dies, a new one is born and dies
    steps = [
        Transition("band", links=((1, 1, True), (2, 1, True)), saddles=1),
        Transition("death", ended=(3,), deaths=1),
        Transition("birth", started=(4,), births=1),
        Transition("death", ended=(4,), deaths=1),
    ]
    s = surface_of([1, 2, 3], steps)
    assert s.euler_characteristic == 2
    assert [(c.euler_characteristic, c.boundary_start, c.boundary_end) for c in s.components] == [
        (-1, 2, 1), (1, 1, 0), (2, 0, 0)]


@pytest.mark.parametrize("claim, holds", [
    ("disk", True), ("connected", True), ("ribbon", True), ("orientable", True), ("genus 0", True),
    ("euler 1", True), ("components 1", True), ("genus 1", False), ("euler -1", False), ("components 2", False),
])
def test_claims_about_the_surface(claim, holds):
    result = check_movie(parse_movie(f"start unknot\ndeath 1\nsurface {claim}"))
    assert result.verified is holds
    assert result.verdict == ("verified" if holds else "contradicted")
