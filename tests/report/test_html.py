"""The HTML report of a checked movie: every frame drawn, the next move's place marked, the
terminal report's wording, nothing fetched from elsewhere."""

from __future__ import annotations

import re
import xml.etree.ElementTree as ET
from pathlib import Path

import pytest

from draw.readback import check_drawing
from movies.checker.replay import check_movie
from movies.report.movie import as_json
from movies.report.movie import as_text as check_text
from movies.report import html_repr, movie_html
from movies.report.movie import surface_lines
from movies.language.movie import parse_movie

EXAMPLES = Path(__file__).resolve().parents[2] / "examples" / "movies"
MOVIES = sorted(EXAMPLES.glob("*.movie"))


def _checked(path: Path):
    return check_movie(parse_movie(path.read_text()))


def _drawings(page: str) -> list[ET.Element]:
    return [ET.fromstring(m.group(0)) for m in re.finditer(r"<svg.*?</svg>", page, re.S)]


@pytest.mark.parametrize("path", MOVIES, ids=lambda p: p.stem)
def test_every_frame_is_drawn_and_nothing_is_fetched(path):
    result = _checked(path)
    page = movie_html(result, source=str(path.relative_to(EXAMPLES.parents[1])))
    drawings = _drawings(page)
    assert len(drawings) == len(result.frames)
    for index, (svg, frame) in enumerate(zip(drawings, result.frames)):
        assert int(svg.get("data-crossings")) == frame.crossing_count()
        assert int(svg.get("data-components")) == frame.component_count()
    # self-contained: no scripts, no links, no fonts or images from elsewhere
    lowered = page.lower()
    assert "<script" not in lowered and "<link" not in lowered and "@import" not in lowered
    assert "url(" not in lowered and "<img" not in lowered
    assert re.findall(r"https?://[^\"' ]+", page) == ["http://www.w3.org/2000/svg"] * len(drawings)


def test_the_frames_of_the_square_knot_movie_read_back_and_mark_each_move():
    result = _checked(EXAMPLES / "square-knot-ribbon.movie")
    drawings = re.findall(r"<svg.*?</svg>", movie_html(result), re.S)
    for text, frame in zip(drawings, result.frames):
        check_drawing(frame, text)
    first, _, before_death_1, before_death_2, last = [ET.fromstring(t) for t in drawings]

    def marked(svg, cls, key):
        return sorted(int(e.get(key)) for e in svg.iter() if e.get("class") == cls)

    # step 1 is "band 4 10 in face 1": its two edges are marked in frame 0, and the band itself is drawn across face 1
    assert marked(first, "hl-edge", "data-edge") == [4, 10] and marked(first, "band", "data-face") == [1]
    # steps 3 and 4 are "death 1", "death 2": the circle that dies is marked in the frame before
    assert marked(before_death_1, "hl-edge", "data-edge") == list(result.frames[2].components[1])
    assert marked(before_death_2, "hl-edge", "data-edge") == list(result.frames[3].components[2])
    # the last frame has no next move
    assert marked(last, "hl-edge", "data-edge") == [] and marked(last, "hl-face", "data-face") == []


@pytest.mark.parametrize("path", MOVIES, ids=lambda p: p.stem)
def test_the_report_says_what_the_terminal_report_says(path):
    result = _checked(path)
    data = as_json(result)
    terminal = check_text(data, str(path))
    page = movie_html(result, source=str(path))
    import html as _html

    text = _html.unescape(re.sub(r"<[^>]+>", "", page))
    for line in surface_lines(data):
        assert line in terminal
        assert line.strip() in text
    verdict = f"VERDICT  {data['verdict']}: {data['verdict_meaning']}"
    assert verdict in terminal
    assert f"VERDICT \N{NO-BREAK SPACE}{data['verdict']}: {data['verdict_meaning']}" in text
    for finding in data["findings"]:
        assert finding["message"] in text
    for step in data["steps"]:
        assert step["move"] in text and step["note"] in text


def test_an_invalid_step_is_shown_after_the_frame_it_fails_on():
    result = _checked(EXAMPLES / "mistake-illegal-move.movie")
    assert result.verdict == "invalid"
    page = movie_html(result)
    (stop,) = re.findall(r'<div class="mv-next mv-stop">(.*?)</div></div>', page, re.S)
    finding = [f for f in result.findings if f.kind == "invalid"][0]
    assert f"step {finding.step}" in stop and "does not apply" in stop
    # the stop box follows the last frame drawn
    last = page.rindex("<svg")
    assert page.index('class="mv-next mv-stop"') > last


def test_notebook_fragment_is_the_report_without_a_document_around_it():
    result = _checked(EXAMPLES / "trefoil-concordance.movie")
    fragment = html_repr(result)
    assert fragment.startswith('<div class="mv-report">') and "<html" not in fragment
    assert fragment.count("<svg") == len(result.frames)
