"""A handle's gate is drawn as a small circle round its bundle: each strand through the handle passes
through the circle (meets it twice, over it once), and no other strand meets it. Read back from the SVG."""

from __future__ import annotations

import re

import pytest

from draw.readback import read_svg
from movies.draw import diagram_svg
from movies.language.spec import parse_handle_diagram


def _loop(text: str, handle: int) -> list[tuple[float, float]]:
    d = re.search(rf'<path class="gate" data-handle="{handle}" data-edges="[0-9 ]+" d="([^"]+)"', text).group(1)
    assert d.rstrip().endswith("Z"), "the gate is drawn as a closed circle"
    return [(float(x), float(y)) for x, y in re.findall(r"([-0-9.]+) ([-0-9.]+)", d)]


def _meets(line, loop) -> int:
    def side(u, v, w):
        return (v[0] - u[0]) * (w[1] - u[1]) - (v[1] - u[1]) * (w[0] - u[0])

    return sum(side(a, b, p) * side(a, b, q) < 0 and side(p, q, a) * side(p, q, b) < 0
               for a, b in zip(line, line[1:]) for p, q in zip(loop, loop[1:] + loop[:1]))


@pytest.mark.parametrize("spec", ["unlink(4) with handle across 1 2 and handle across 3 4",
                                  "3_1 with handle across 1 5", "6_1 with handle across 2 6 from face 4"])
def test_each_strand_of_the_bundle_passes_through_the_gate(spec):
    link = parse_handle_diagram(spec)
    text = diagram_svg(link.diagram, gates=link.gates)
    strands = read_svg(text)["strands"]
    for number, gate in enumerate(link.gates, start=1):
        loop = [(x, -y) for x, y in _loop(text, number)]  # the read-back strands have y up
        for edge, info in strands.items():
            assert _meets(info["points"], loop) == 2 * list(gate.edges).count(edge), (number, edge)
        assert f">h{number}<" in text
    # over the circle on its far side: a piece of each strand drawn again on top
    assert text.count('class="gate-under"') >= 2 * len(link.gates)
