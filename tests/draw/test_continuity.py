"""Consecutive frames of a report look alike: the crossings a step leaves alone stay near where they
were, read back from the SVG of each frame."""

from __future__ import annotations

import math
import re
import statistics
from pathlib import Path

import pytest

from draw.readback import read_svg
from movies.checker.replay import check_movie
import movies.draw.frames as frames_module
import movies.draw.layout as layout_module
from movies.report.html import movie_html

EXAMPLES = Path(__file__).resolve().parents[2] / "examples" / "movies"
MOVIES = ["trefoil-concordance", "3_1-disk-in-punctured-CP2", "mirror-5_1-least-genus-in-a-blowup",
          "8_20-ribbon", "trefoil-moebius-band"]


def _mean_displacement(name: str) -> float:
    """The mean over consecutive frames of the mean move of their shared crossings, over the width.

    The frame after an isotopy claim is the diagram the claim names: its crossings are its own,
    whatever their names, so no crossing is shared across such a step."""
    result = check_movie(EXAMPLES / f"{name}.movie")
    svgs = re.findall(r'<svg xmlns="http://www.w3.org/2000/svg" class="diagram".*?</svg>', movie_html(result), re.S)
    points = []
    for frame, text in zip(result.frames, svgs):
        strands = read_svg(text)["strands"]
        width = float(re.search(r'width="([0-9.]+)"', text).group(1))
        points.append(({c: strands[frame.over_edges(c)[0]]["points"][-1] for c in frame.crossings}, width))
    moves = []
    for step, ((before, width), (after, _)) in enumerate(zip(points, points[1:])):
        shared = set(before) & set(after) if result.movie.steps[step].kind != "isotopic" else set()
        if shared:
            moves.append(statistics.mean(math.dist(before[c], after[c]) for c in shared) / width)
    return statistics.mean(moves)


def test_frames_are_turned_and_settled_toward_the_frame_before(monkeypatch):
    kept = [_mean_displacement(name) for name in MOVIES]
    layout = layout_module.layout
    monkeypatch.setattr(frames_module, "band_layout", lambda *args: None)
    monkeypatch.setattr(layout_module, "layout", lambda diagram, previous=None: layout(diagram))
    monkeypatch.setattr(layout_module, "aligned", lambda lay, previous: lay)
    monkeypatch.setattr(layout_module, "settled", lambda diagram, lay, previous: lay)
    fresh = [_mean_displacement(name) for name in MOVIES]
    # never worse for a movie, and on these at least a third less in all
    assert all(k <= f + 1e-9 for k, f in zip(kept, fresh)), (kept, fresh)
    assert sum(kept) <= (2 / 3) * sum(fresh), (kept, fresh)


@pytest.mark.parametrize("name", ["trefoil-concordance", "trefoil-moebius-band", "8_20-ribbon",
                                  "5_1-unknotted-by-twists", "mirror-5_1-least-genus-in-a-blowup",
                                  "6_1-ribbon-along-a-path", "mistake-false-isotopy", "5_2-to-5_1-genus-one",
                                  "3_1-from-nothing-in-CP2", "square-knot-ribbon"])
def test_frames_laid_out_from_the_frame_before_move_little(name):
    # each frame starts from the one before (its outside, its crossings; a born circle in a corner;
    # after a band, the band's sides drawn into the frame before): the crossings a step leaves alone
    # move less than 5% of the width on average (each alone: 9% to 43%)
    assert _mean_displacement(name) < 0.05


def test_a_circle_born_in_the_outside_goes_to_a_corner_and_keeps_the_picture_size():
    from movies.draw.layout import CORNERS, layout
    from movies.language.spec import parse_diagram
    from movies.diagram.steps import MoveRecord, perform
    from movies.draw.layout import outer_face

    knot = parse_diagram("5_2")
    before = layout(knot)
    after = perform(MoveRecord("birth", face=outer_face(knot)), knot).diagram
    lay = layout(after, before)
    assert lay.bounds == before.bounds
    (circle,) = lay.circles.values()
    assert circle[0] in CORNERS
    assert max(math.dist(lay.crossings[c], before.crossings[c]) for c in knot.crossings) < 0.05


def test_a_settled_frame_still_reads_back():
    # settling moves points; every frame must still show its own diagram, not a mirror image
    from draw.readback import check_drawing

    for name in MOVIES:
        result = check_movie(EXAMPLES / f"{name}.movie")
        svgs = re.findall(r'<svg xmlns="http://www.w3.org/2000/svg" class="diagram".*?</svg>', movie_html(result), re.S)
        for frame, text in zip(result.frames, svgs):
            check_drawing(frame, text, visible=frame.piece_count() == 1)



def test_the_report_offers_the_frames_side_by_side():
    # a checkbox before the frames turns them into a strip of small drawings (CSS only: the same drawings)
    result = check_movie(EXAMPLES / "square-knot-ribbon.movie")
    page = movie_html(result)
    toggle = page.index('<input type="checkbox" id="mv-strip" class="mv-strip-toggle">')
    frames = page.index('<div class="mv-frames">')
    assert toggle < frames
    inside = page[frames:page.index("<h2>", frames)]
    assert len(re.findall(r'<svg xmlns="http://www.w3.org/2000/svg" class="diagram"', inside)) == len(result.frames)
    assert ".mv-strip-toggle:checked ~ .mv-frames { display: flex;" in page


@pytest.mark.parametrize("name, ats", [("trefoil-concordance", (1, 2)), ("6_1-ribbon-along-a-path", (1,)),
                                       ("5_2-to-5_1-genus-one", (2, 3))])
def test_frames_svg_draws_the_frame_as_the_report_does(tmp_path, capsys, name, ats):
    # after a birth, after a band along a path (drawn from the band), after a second band and an isotopy claim
    from movies.cli.main import main

    result = check_movie(EXAMPLES / f"{name}.movie")
    svgs = re.findall(r'<svg xmlns="http://www.w3.org/2000/svg" class="diagram".*?</svg>', movie_html(result), re.S)
    out = tmp_path / "frame.svg"
    for at in ats:
        assert main(["frames", str(EXAMPLES / f"{name}.movie"), "--at", str(at), "--svg", str(out)]) == 0
        capsys.readouterr()
        frame = result.frames[at]
        places = []
        for text in (svgs[at], out.read_text()):
            strands = read_svg(text)["strands"]
            width = float(re.search(r'width="([0-9.]+)"', text).group(1))
            places.append({c: tuple(v / width for v in strands[frame.over_edges(c)[0]]["points"][-1])
                           for c in frame.crossings})
        assert places[0].keys() == places[1].keys()
        assert all(math.dist(places[0][c], places[1][c]) < 0.02 for c in places[0])
