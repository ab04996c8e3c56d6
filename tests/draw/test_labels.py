"""Labels read back from the SVG: boxes that do not overlap, and crossing names that do not cover
their crossing."""

import xml.etree.ElementTree as ET

from movies.diagram.tables import table_names
from movies.draw import diagram_svg
from movies.language.spec import parse_diagram

from draw.readback import parse_path

SVG = "{http://www.w3.org/2000/svg}"


def _labels(svg: str):
    """(kind, text, box) of every label, and the strands' polylines (y down, as drawn)."""
    root = ET.fromstring(svg)
    labels, strands = [], []
    for element in root.iter():
        kind = element.get("class")
        if kind in ("label-edge", "label-face"):
            size = float(element.get("font-size"))
            x, y = float(element.get("x")), float(element.get("y")) - 0.35 * size
            width = 0.6 * size * len(element.text) + 2  # sans-serif digits are about 0.6 em wide
            labels.append((kind, element.text, (x - width / 2, y - size / 2, x + width / 2, y + size / 2)))
        elif kind == "label-crossing":
            circle = element.find(f"{SVG}circle")
            x, y, r = (float(circle.get(k)) for k in ("cx", "cy", "r"))
            labels.append((kind, element.get("data-crossing"), (x - r, y - r, x + r, y + r)))
        elif kind == "strand":
            strands.append([(px, -py) for px, py in parse_path(element.get("d"))[0]])
    return labels, strands


def _overlapping(labels) -> list[tuple]:
    out = []
    for i, (_, a_text, a) in enumerate(labels):
        for _, b_text, b in labels[i + 1:]:
            if a[0] < b[2] and b[0] < a[2] and a[1] < b[3] and b[1] < a[3]:
                out.append((a_text, b_text))
    return out


def test_the_stevedore_knot_is_labelled_without_overlaps():
    labels, _ = _labels(diagram_svg(parse_diagram("6_1"), labels=True))
    assert len(labels) == 12 + 6 + 8 and _overlapping(labels) == []


def test_labels_do_not_overlap_over_the_table():
    # a spread of the knots up to 12 crossings and links up to 11; before labels looked for room,
    # nearly every diagram had an overlap
    names = table_names("knot", max_crossings=12)[1::60] + table_names("link", 11)[::300]
    crowded = [name for name in names if _overlapping(_labels(diagram_svg(parse_diagram(name), labels=True))[0])]
    assert crowded == []
