"""The band of a saddle is drawn as a band: a strip from one of its edges to the other, across its
face, crossing no other strand. Read back from the SVG of the report."""

import math
import re
import xml.etree.ElementTree as ET
from pathlib import Path

import pytest

from movies.checker.replay import check_movie
from movies.report.html import movie_html

from draw.readback import parse_path

EXAMPLES = Path(__file__).resolve().parents[2] / "examples" / "movies"


def _near(point, polyline) -> float:
    """The distance from a point to a polyline."""  # noqa: D401
    best = math.inf
    for (ax, ay), (bx, by) in zip(polyline, polyline[1:]):
        dx, dy = bx - ax, by - ay
        t = max(0.0, min(1.0, ((point[0] - ax) * dx + (point[1] - ay) * dy) / (dx * dx + dy * dy or 1)))
        best = min(best, math.hypot(point[0] - ax - t * dx, point[1] - ay - t * dy))
    return best


def _crosses(p, q, polyline) -> bool:
    def side(u, v, w):
        return (v[0] - u[0]) * (w[1] - u[1]) - (v[1] - u[1]) * (w[0] - u[0])

    return any(side(p, q, a) * side(p, q, b) < 0 and side(a, b, p) * side(a, b, q) < 0
               for a, b in zip(polyline, polyline[1:]))


def _steps_and_frames(name: str, kind: str):
    """(step index, record, the SVG of the frame it acts on) for each step of ``kind`` of an
    example movie, from its HTML report."""
    result = check_movie(EXAMPLES / f"{name}.movie")
    page = movie_html(result, source=name)
    frames = re.findall(r'<svg xmlns="http://www.w3.org/2000/svg" class="diagram".*?</svg>', page, re.S)
    for index, statement in enumerate(result.movie.steps):
        if statement.record is not None and statement.record.kind == kind:
            yield index, statement.record, frames[index]


@pytest.mark.parametrize("name", ["square-knot-ribbon", "8_20-ribbon", "trefoil-concordance", "5_2-to-5_1-genus-one"])
def test_every_band_across_a_face_is_drawn_between_its_edges(name):
    bands = 0
    for index, record, frame in _steps_and_frames(name, "band"):
        if record.path:
            continue
        root = ET.fromstring(frame)
        strands, core = {}, None
        stroke = None
        for element in root.iter():
            if element.get("class") == "strand":
                strands[int(element.get("data-edge"))] = parse_path(element.get("d"))[0]
                stroke = float(element.get("stroke-width"))
            elif element.get("class") == "band-core":
                core = parse_path(element.get("d"))[0]
        assert core is not None, (name, index)
        p, q = core[0], core[-1]
        # its ends lie on its two edges (the strands are drawn with gaps at crossings: a stroke's width off)
        assert {min(strands, key=lambda e: _near(p, strands[e])), min(strands, key=lambda e: _near(q, strands[e]))} \
            == {record.first, record.second}, (name, index)
        assert max(_near(p, strands[record.first]) if _near(p, strands[record.first]) < _near(q, strands[record.first])
                   else _near(q, strands[record.first]),
                   min(_near(p, strands[record.second]), _near(q, strands[record.second]))) < 2 * stroke
        # and its core crosses no other strand (around the outside, for the outer face)
        others = [line for edge, line in strands.items() if edge not in (record.first, record.second)]
        assert not any(_crosses(u, v, line) for u, v in zip(core, core[1:]) for line in others), (name, index)
        bands += 1
    assert bands >= 1


@pytest.mark.parametrize("name", ["5_1-unknotted-by-twists", "mirror-5_1-least-genus-in-a-blowup"])
def test_every_twist_step_is_drawn_as_a_box_across_its_strands(name):
    twists = 0
    for index, record, frame in _steps_and_frames(name, "twist"):
        root = ET.fromstring(frame)
        strands, box = {}, None
        for element in root.iter():
            if element.get("class") == "strand":
                strands[int(element.get("data-edge"))] = parse_path(element.get("d"))[0]
            elif element.get("class") == "twist":
                box = parse_path(element.get("d"))[0]
                assert element.get("data-turns") == f"{record.turns:+d}"
        assert box is not None, (name, index)
        crossed = {edge for edge, line in strands.items()
                   if any(_crosses(u, v, line) for u, v in zip(box, box[1:]))}
        # the box crosses exactly the strands the twist acts on
        assert crossed == set(record.edges), (name, index, crossed)
        twists += 1
    assert twists >= 1


@pytest.mark.parametrize("name", ["6_1-ribbon-along-a-path"])
def test_a_band_along_a_path_is_drawn_along_it(name):
    bands = 0
    for index, record, frame in _steps_and_frames(name, "band"):
        if not record.path:
            continue
        root = ET.fromstring(frame)
        strands, core, over, stroke = {}, None, {}, None
        for element in root.iter():
            kind = element.get("class")
            if kind == "strand":
                strands[int(element.get("data-edge"))] = parse_path(element.get("d"))[0]
                stroke = float(element.get("stroke-width"))
            elif kind == "band-core" and core is None:
                core = parse_path(element.get("d"))[0]
            elif kind == "band-over":
                over[int(element.get("data-edge"))] = parse_path(element.get("d"))[0]
        assert core is not None, (name, index)
        # it starts on its first edge and ends on its second (a stroke's width off, for the gaps)
        assert _near(core[0], strands[record.first]) < 2 * stroke and _near(core[-1], strands[record.second]) < 2 * stroke
        # it crosses each edge of its path once, in order, and no other strand
        for edge, line in strands.items():
            hits = sum(_crosses(u, v, line) for u, v in zip(core, core[1:]))
            meets = sum(_near(point, line) < 1e-6 for point in core[1:-1])
            if edge in dict(record.path):
                assert hits + meets >= 1, (name, index, edge)
            elif edge not in (record.first, record.second):
                assert hits == 0, (name, index, edge)
        # and is drawn on top exactly where it passes over
        assert set(over) == {edge for edge, is_over in record.path if is_over}
        bands += 1
    assert bands >= 1


def test_the_circle_a_birth_adds_is_drawn_in_its_face():
    # a birth in a face of the trefoil: the frame before shows the new circle, clear of every strand
    result = check_movie("start 3_1\nbirth in face 2\nexpect components 2\n")
    page = movie_html(result, source="birth")
    frame = re.findall(r'<svg xmlns="http://www.w3.org/2000/svg" class="diagram".*?</svg>', page, re.S)[0]
    root = ET.fromstring(frame)
    strands = [parse_path(e.get("d"))[0] for e in root.iter() if e.get("class") == "strand"]
    circles = [e for e in root.iter() if e.get("class") == "birth"]
    assert len(circles) == 1 and circles[0].get("data-face") == "2"
    x, y, r = (float(circles[0].get(k)) for k in ("cx", "cy", "r"))
    assert min(_near((x, y), line) for line in strands) > r
    # and it lies in face 2: the face's label is inside the circle's face, nearer to it than any strand
    label = next(e for e in root.iter() if e.get("class") == "label-face" and e.get("data-face") == "2")
    lx, ly = float(label.get("x")), float(label.get("y"))
    assert not any(_crosses((x, y), (lx, ly), line) for line in strands)
