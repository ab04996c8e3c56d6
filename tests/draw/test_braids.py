"""Closed braids drawn as closed braids: levels round an axis, read back from the SVG."""

from __future__ import annotations

import math
import re

import pytest

from draw.readback import check_drawing, crossing_angles, read_svg
from movies.diagram.constructors import from_braid, torus_link
from movies.diagram.tables import table_row
from movies.draw import diagram_svg
from movies.draw.braids import braid_plan
from movies.draw.layout import layout
from movies.language.spec import parse_diagram

BRAIDS = {
    "T(3,4)": torus_link(3, 4),
    "T(2,7)": torus_link(2, 7),
    "T(4,5)": torus_link(4, 5),
    "T(5,6)": torus_link(5, 6),
    "sigma1^3 sigma2": from_braid([1, 1, 1, 2]),
    "(s1 s2^-1)^3": from_braid([1, -2, 1, -2, 1, -2]),
    "four strands": from_braid([1, 2, 3, 1, 2, 3, -1]),
}


def _circumcentre(a, b, c):
    d = 2 * (a[0] * (b[1] - c[1]) + b[0] * (c[1] - a[1]) + c[0] * (a[1] - b[1]))
    x = ((a[0] ** 2 + a[1] ** 2) * (b[1] - c[1]) + (b[0] ** 2 + b[1] ** 2) * (c[1] - a[1])
         + (c[0] ** 2 + c[1] ** 2) * (a[1] - b[1])) / d
    y = ((a[0] ** 2 + a[1] ** 2) * (c[0] - b[0]) + (b[0] ** 2 + b[1] ** 2) * (a[0] - c[0])
         + (c[0] ** 2 + c[1] ** 2) * (b[0] - a[0])) / d
    return x, y


def _crossing_points(diagram, text):
    strands = read_svg(text)["strands"]
    return {c: strands[diagram.over_edges(c)[0]]["points"][-1] for c in diagram.crossings}


@pytest.mark.parametrize("name", sorted(BRAIDS))
def test_a_braid_closure_is_drawn_round_an_axis(name):
    diagram = BRAIDS[name]
    lay = layout(diagram)
    assert lay.braid
    text = diagram_svg(diagram)
    check_drawing(diagram, text)  # the right over-strands, no other meetings, not the mirror image
    assert min(crossing_angles(diagram, text).values()) >= 45
    # the crossings between the same two levels lie on one circle about the axis
    plan = braid_plan(diagram)
    level = {edge: i for i, circle in enumerate(plan.levels) for edge in circle}
    points = _crossing_points(diagram, text)
    rings: dict[tuple, list] = {}
    for c, labels in diagram.crossings.items():
        rings.setdefault(tuple(sorted({level[e] for e in labels})), []).append(points[c])
    # the axis: the centre of the circle through three crossings of the fullest ring
    fullest = max(rings.values(), key=len)
    centre = _circumcentre(fullest[0], fullest[len(fullest) // 3], fullest[2 * len(fullest) // 3])
    for ring in rings.values():
        radii = [math.dist(p, centre) for p in ring]
        assert max(radii) - min(radii) < 0.02 * float(re.search(r'width="([0-9.]+)"', text).group(1))


def test_the_levels_of_a_torus_knot_are_its_strands():
    # KnotInfo column braid_index: 8_19 is T(3,4), of braid index 3; 10_124 is T(3,5), also 3
    for name in ("8_19", "10_124"):
        plan = braid_plan(parse_diagram(name))
        assert plan is not None and len(plan.levels) == int(table_row(name)["braid_index"])


def test_a_diagram_that_is_not_a_closed_braid_is_drawn_as_before():
    for name in ("5_2", "7_7", "6_1"):
        diagram = parse_diagram(name)
        assert braid_plan(diagram) is None and not layout(diagram).braid


def test_frames_derived_from_a_braid_stay_braided_while_they_can():
    from movies.checker.replay import check_movie
    from movies.draw.frames import frame_layouts

    text = "start braid(3)[1, 1, 1, 2]\nR1 remove 4\nexpect crossings 3\n"
    result = check_movie(text)
    lays = frame_layouts(result.frames)
    assert result.verified and all(lay.braid for lay in lays)
    # the three crossings the step leaves stay put
    moved = [math.dist(lays[0].crossings[c], lays[1].crossings[c]) for c in result.frames[1].crossings]
    assert max(moved) < 0.1
