"""The drawing commands: movies draw, movies check --html, and the notebook hooks."""

import re
import shutil
from pathlib import Path

import pytest

import movies
from movies.cli.main import main

EXAMPLES = Path(__file__).resolve().parents[2] / "examples" / "movies"


def test_draw_svg_from_every_notation(tmp_path):
    for argv in (["3_1"], ["--pd", "[[1,5,2,4],[3,1,4,6],[5,3,6,2]]"], ["--braid", "[1, 1, 1]"]):
        out = tmp_path / "k.svg"
        assert main(["draw", *argv, "-o", str(out)]) == 0
        svg = out.read_text()
        assert svg.startswith("<svg") and 'data-crossings="3"' in svg
        assert len(re.findall(r'class="strand"', svg)) == 6


def test_draw_labels_and_bad_outputs(tmp_path, capsys):
    out = tmp_path / "l.svg"
    assert main(["draw", "L2a1{1}", "-o", str(out), "--labels"]) == 0
    assert 'data-components="2"' in out.read_text()
    assert main(["draw", "3_1", "-o", str(tmp_path / "k.pdf")]) == 2
    assert ".svg or .png" in capsys.readouterr().err
    assert main(["draw", "3_2", "-o", str(out)]) == 2


@pytest.mark.skipif(not shutil.which("chromium") and not shutil.which("rsvg-convert"),
                    reason="no SVG to PNG converter on this machine")
def test_draw_png(tmp_path):
    out = tmp_path / "k.png"
    assert main(["draw", "torus(2, 5)", "-o", str(out)]) == 0
    assert out.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"


def test_check_writes_html(tmp_path, capsys):
    out = tmp_path / "report.html"
    assert main(["check", str(EXAMPLES / "square-knot-ribbon.movie"), "--html", str(out)]) == 0
    page = out.read_text()
    result = movies.check_movie(movies.parse_movie((EXAMPLES / "square-knot-ribbon.movie").read_text()))
    assert page.count("<svg") == len(result.frames)
    assert "VERDICT" in page and "http://" not in page.replace("http://www.w3.org/2000/svg", "")


def test_notebook_hooks():
    d = movies.parse_diagram("4_1")
    assert d._repr_svg_().startswith("<svg")
    result = movies.check_movie(movies.parse_movie("start unknot\ndeath 1"))
    assert result._repr_html_().startswith('<div class="mv-report">')
