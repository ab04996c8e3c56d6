"""Drawings read back from their SVG text show exactly the diagram they were drawn from.

Each check parses the path data of the picture (tests/draw/readback.py) and confirms: the
strands cross at the diagram's crossings and nowhere else, the under-strand is the one with the
gap, the four ends leave each crossing counterclockwise in PD order, every path runs along its
edge's orientation, and split pieces and face labels lie in the faces the diagram says.
"""

from __future__ import annotations

import xml.etree.ElementTree as ET

import pytest

from draw.randomized import random_braid, random_movie, random_split
from draw.readback import _inside, _signed_area, check_drawing, parse_path, read_svg
from movies.diagram.constructors import disjoint_union, empty, from_braid, mirror, unknot, unlink
from movies.diagram.pd import from_pd
from movies.diagram.tables import table_names
from movies.draw import Highlight, diagram_svg, svg_repr
from movies.language.spec import parse_diagram

KNOTS = table_names("knot", max_crossings=10)
LINKS = table_names("link", max_crossings=8)


# KnotInfo PD codes (database-knotinfo, column pd_notation), every 5th knot up to 10 crossings
@pytest.mark.parametrize("name", KNOTS[::5])
def test_table_knots_read_back(name):
    diagram = parse_diagram(name)
    check_drawing(diagram, diagram_svg(diagram, labels=True))


# LinkInfo PD codes (database-knotinfo), a spread of the links up to 8 crossings
@pytest.mark.parametrize("name", LINKS[::12])
def test_table_links_read_back(name):
    diagram = parse_diagram(name)
    check_drawing(diagram, diagram_svg(diagram, labels=True))


@pytest.mark.parametrize("seed", range(12))
def test_random_braid_closures_read_back(seed):
    diagram = random_braid(seed, length=14, strands=4 + seed % 2)
    # crowded twists can leave gaps too narrow to see; the geometry must still be right
    check_drawing(diagram, diagram_svg(diagram, labels=True), visible=False)


@pytest.mark.parametrize("seed", range(10))
def test_random_split_diagrams_read_back(seed):
    diagram = random_split(seed, pieces=2 + seed % 3)
    assert diagram.piece_count() >= 2
    check_drawing(diagram, diagram_svg(diagram, labels=True), visible=False)


def test_frames_of_a_random_movie_read_back():
    # kinks, bigons, triangles moved, births and bands: frames of every shape the moves make
    _, frames = random_movie(5, steps=24, crossings=8)
    for frame in frames[::3]:
        check_drawing(frame, diagram_svg(frame, labels=True), visible=False)


@pytest.mark.parametrize("spec", ["unknot", "unlink(3)", "3_1 # mirror(3_1)", "pd[[1,1,2,2]]",
                                  "braid(4)[1, -2]", "torus(3, 4)", "3_1 + unknot + 4_1"])
def test_special_diagrams_read_back(spec):
    diagram = parse_diagram(spec)
    check_drawing(diagram, diagram_svg(diagram, labels=True), visible=diagram.piece_count() == 1)


def test_circles_nested_in_each_other_read_back():
    # a circle inside a circle inside a face of the trefoil
    inner = disjoint_union(unknot(), unknot(), face=1, other_face=2)
    diagram = disjoint_union(parse_diagram("3_1"), inner, face=3, other_face=2)
    check_drawing(diagram, diagram_svg(diagram, labels=True))


def test_the_readback_tells_a_knot_from_its_mirror():
    # the check is not vacuous: the trefoil's picture is not a picture of its mirror image,
    # nor of the trefoil with one crossing changed
    trefoil = parse_diagram("3_1")
    picture = diagram_svg(trefoil)
    check_drawing(trefoil, picture)
    with pytest.raises(AssertionError):
        check_drawing(mirror(trefoil), picture)
    with pytest.raises(AssertionError):
        check_drawing(from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [2, 5, 3, 6]]), picture)


def test_a_picture_with_a_stray_crossing_fails_the_readback():
    trefoil = parse_diagram("3_1")
    picture = diagram_svg(trefoil)
    root = ET.fromstring(picture)
    paths = [e for e in root.iter() if e.get("class") == "strand"]
    # push edge 1 straight across the picture: it now crosses other strands where no crossing is
    first = paths[0]
    start, end = first.get("d").split()[0:2], first.get("d").split()[-2:]
    first.set("d", f"{start[0]} {start[1]} L0 0 L420 420 L{end[0]} {end[1]}")
    with pytest.raises(AssertionError):
        check_drawing(trefoil, ET.tostring(root, encoding="unicode"))


def test_empty_diagram_draws_only_its_face_name():
    text = diagram_svg(empty(), labels=True)
    read = read_svg(text)
    assert read["strands"] == {} and list(read["faces"]) == [1]


def test_labels_name_every_edge_crossing_and_face():
    diagram = parse_diagram("5_2")
    root = ET.fromstring(diagram_svg(diagram, labels=True))
    edges = sorted(int(e.get("data-edge")) for e in root.iter() if e.get("class") == "label-edge")
    crossings = sorted(int(e.get("data-crossing")) for e in root.iter() if e.get("class") == "label-crossing")
    faces = sorted(int(e.get("data-face")) for e in root.iter() if e.get("class") == "label-face")
    assert edges == diagram.edges() and crossings == sorted(diagram.crossings) and faces == sorted(diagram.faces)
    texts = {e.get("data-edge"): e.text for e in root.iter() if e.get("class") == "label-edge"}
    assert all(texts[k] == k for k in texts)
    # no labels unless asked
    assert "label-" not in diagram_svg(diagram)


def _face_rings(d: str) -> list[list[tuple[float, float]]]:
    rings, current = [], []
    for part in d.replace("Z", " Z").split("M")[1:]:
        points, _ = parse_path("M" + part)
        rings.append(points)
    return rings


@pytest.mark.parametrize("spec, face", [("3_1", 3), ("3_1", 2), ("3_1 + unknot", 2), ("unlink(2)", 1)])
def test_a_highlighted_face_covers_its_label_and_nothing_else(spec, face):
    diagram = parse_diagram(spec)
    text = diagram_svg(diagram, labels=True, highlight={"faces": [face]})
    root = ET.fromstring(text)
    (shade,) = [e for e in root.iter() if e.get("class") == "hl-face"]
    assert shade.get("data-face") == str(face) and shade.get("fill-rule") == "evenodd"
    rings = _face_rings(shade.get("d"))
    labels = read_svg(text)["faces"]

    def shaded(point) -> bool:
        return sum(_inside(point, ring) for ring in rings) % 2 == 1

    for name, point in labels.items():
        assert shaded(point) == (name == face), f"label of face {name}"


def test_highlighted_edges_and_crossings_are_marked():
    diagram = parse_diagram("4_1")
    text = diagram_svg(diagram, highlight=Highlight(edges=(2, 5), crossings=(3,), faces=(99,)))
    root = ET.fromstring(text)
    assert sorted(int(e.get("data-edge")) for e in root.iter() if e.get("class") == "hl-edge") == [2, 5]
    (ring,) = [e for e in root.iter() if e.get("class") == "hl-crossing"]
    assert ring.get("data-crossing") == "3"
    # the ring is centred where the over-strand passes through crossing 3
    strands = read_svg(text)["strands"]
    over_in, _ = diagram.over_edges(3)
    x, y = strands[over_in]["points"][-1]
    assert (float(ring.get("cx")), -float(ring.get("cy"))) == pytest.approx((x, y), abs=1e-3)
    # an unknown face is ignored
    assert "hl-face" not in text


def test_components_get_different_colours_and_circles_run_their_way():
    diagram = unlink(3)
    text = diagram_svg(diagram)
    read = check_drawing(diagram, text)
    assert len(set(read["colours"].values())) == 3
    # unlink(n) circles run counterclockwise (their disks on the left)
    for edge, info in read["strands"].items():
        assert _signed_area(info["points"]) > 0
    # a circle with a trefoil in its disk
    around = disjoint_union(unknot(), parse_diagram("3_1"), face=1)
    check_drawing(around, diagram_svg(around, labels=True), visible=False)


def test_notebook_picture_is_labelled():
    assert 'class="label-edge"' in svg_repr(from_braid([1, 1, 1]))


def test_arrows_turned_around_fail_the_readback():
    diagram = parse_diagram("4_1")
    root = ET.fromstring(diagram_svg(diagram))
    for element in root.iter():
        if element.get("class") == "arrow":
            points, _ = parse_path(element.get("d"))
            (tx, ty), (lx, ly), (rx, ry) = points[:3]
            # the same triangle pointing the other way: the tip where the base was
            bx, by = (lx + rx) / 2, (ly + ry) / 2
            cx, cy = tx - bx, ty - by
            element.set("d", f"M{bx} {-by} L{lx + cx} {-(ly + cy)} L{rx + cx} {-(ry + cy)} Z")
    with pytest.raises(AssertionError, match="arrow"):
        check_drawing(diagram, ET.tostring(root, encoding="unicode"))
