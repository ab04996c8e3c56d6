"""Crossings drawn open: the angle between the strands, read back from the SVG."""

from __future__ import annotations

import pytest

from draw.readback import check_drawing, crossing_angles
from movies.diagram.tables import table_names
from movies.draw import layout as layout_module
from movies.draw.svg import diagram_svg
from movies.language.spec import parse_diagram

SAMPLE = table_names("knot", 12)[1::150] + table_names("link", 11)[::400] + ["3_1", "8_20", "torus(3, 4)"]


@pytest.mark.parametrize("name", SAMPLE)
def test_every_crossing_opens_at_least_thirty_degrees(name):
    # common practice, no source: below about 30 degrees over and under are hard to tell apart
    d = parse_diagram(name)
    text = diagram_svg(d)
    check_drawing(d, text)
    assert min(crossing_angles(d, text).values()) >= 30


def test_without_the_opening_some_crossing_is_shallow(monkeypatch):
    # the measurement can fail: the plain spring layout leaves this one at about 13 degrees
    monkeypatch.setattr(layout_module, "OPENING", 0.0)
    monkeypatch.setattr(layout_module, "OTHER_OUTSIDES", 0)
    d = parse_diagram("12n_642")
    assert min(crossing_angles(d, diagram_svg(d)).values()) < 30
