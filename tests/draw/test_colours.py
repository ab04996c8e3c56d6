"""Colours by name: a component keeps its colour from frame to frame, a merge takes the colour of
the name it keeps, neighbours in the palette differ in lightness, and a dash pattern takes over
as a second channel past the palette. Read back from the SVG, not from the drawing code's data."""

import re
from pathlib import Path

from movies.checker.replay import check_movie
from movies.draw import PALETTE, diagram_svg
from movies.language.spec import parse_diagram
from movies.report.html import movie_html

EXAMPLES = Path(__file__).resolve().parents[2] / "examples" / "movies"
STRAND = re.compile(r'<path class="strand" [^>]*data-component="(\d+)"[^>]*stroke="(#[0-9a-f]{6})"([^>]*)>')


def _styles(svg: str) -> list[tuple[int, str, str]]:
    return [(int(c), colour, rest) for c, colour, rest in STRAND.findall(svg)]


def test_a_component_keeps_its_colour_in_every_frame_of_a_movie():
    # square-knot-ribbon: a band splits the knot into components 1 and 2, then 1 dies and 2 is left
    for name in ("square-knot-ribbon", "5_2-to-5_1-genus-one", "trefoil-concordance"):
        result = check_movie(EXAMPLES / f"{name}.movie")
        page = movie_html(result, source=name)
        frames = page.split('<svg xmlns="http://www.w3.org/2000/svg" class="diagram"')[1:]
        assert len(frames) >= len(result.frames)
        seen: dict[int, set] = {}
        for frame in frames:
            colours = {}
            for component, colour, _ in _styles(frame):
                seen.setdefault(component, set()).add(colour)
                colours.setdefault(component, colour)
            assert len(set(colours.values())) == len(colours), (name, colours)  # different names, different colours
        assert all(len(c) == 1 for c in seen.values()), (name, seen)


def test_past_the_palette_a_dash_pattern_tells_components_apart():
    svg = diagram_svg(parse_diagram(f"unlink({len(PALETTE) + 2})"))
    styles = {component: (colour, "stroke-dasharray" in rest) for component, colour, rest in _styles(svg)}
    assert [styles[n][1] for n in range(1, len(PALETTE) + 3)] == [False] * len(PALETTE) + [True, True]
    assert styles[1][0] == styles[len(PALETTE) + 1][0]  # the same hue again, now dashed


def _luminance(colour: str) -> float:
    # W3C, Web Content Accessibility Guidelines 2.1, definition of "relative luminance" (sRGB)
    def channel(value: int) -> float:
        c = value / 255
        return c / 12.92 if c <= 0.03928 else ((c + 0.055) / 1.055) ** 2.4

    r, g, b = (int(colour[i:i + 2], 16) for i in (1, 3, 5))
    return 0.2126 * channel(r) + 0.7152 * channel(g) + 0.0722 * channel(b)


def test_neighbouring_colours_differ_in_lightness_and_all_show_on_white():
    values = [_luminance(c) for c in PALETTE]
    # common practice, no source: 0.15 of relative luminance apart reads as different greys in print
    assert all(abs(a - b) >= 0.15 for a, b in zip(values, values[1:] + values[:1])), values
    # W3C WCAG 2.1, "contrast ratio": (L1 + 0.05) / (L2 + 0.05); 2 against white keeps a thin line visible
    assert all((1.05) / (v + 0.05) >= 2 for v in values), values
