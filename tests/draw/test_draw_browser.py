"""A browser opens the report of every bundled movie: it renders, and it shows one drawing per frame.

Needs headless Chromium (Debian packages ``chromium`` and ``chromium-driver``); skipped without it.
"""

from __future__ import annotations

import re
import shutil
import struct
import subprocess
import zlib
from pathlib import Path

import pytest

from movies.checker.replay import check_movie
from movies.report import movie_html
from movies.language.movie import parse_movie

EXAMPLE = Path(__file__).resolve().parents[2] / "examples" / "movies" / "square-knot-ribbon.movie"
BROWSER = shutil.which("chromium") or shutil.which("chromium-browser")

pytestmark = pytest.mark.skipif(BROWSER is None, reason="headless Chromium is not installed (apt-get install chromium chromium-driver)")

FLAGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
         "--disable-background-networking", "--disable-component-update", "--disable-sync"]


def _run(tmp_path: Path, *extra: str) -> subprocess.CompletedProcess:
    profile = tmp_path / f"profile-{len(list(tmp_path.iterdir()))}"
    return subprocess.run([BROWSER, *FLAGS, f"--user-data-dir={profile}", *extra],
                          capture_output=True, text=True, timeout=120, cwd=tmp_path)


def decode_png(data: bytes) -> tuple[int, int, list[bytes]]:
    """Width, height and the raw RGB(A) rows of an 8-bit truecolour PNG (standard library only)."""
    assert data[:8] == b"\x89PNG\r\n\x1a\n", "not a PNG"
    pos, chunks, header = 8, [], None
    while pos < len(data):
        (length,) = struct.unpack(">I", data[pos:pos + 4])
        kind, body = data[pos + 4:pos + 8], data[pos + 8:pos + 8 + length]
        if kind == b"IHDR":
            header = struct.unpack(">IIBBBBB", body)
        elif kind == b"IDAT":
            chunks.append(body)
        pos += 12 + length
    width, height, depth, colour, _, _, interlace = header
    assert depth == 8 and colour in (2, 6) and interlace == 0, "only 8-bit RGB/RGBA PNGs are read here"
    channels = 3 if colour == 2 else 4
    raw = zlib.decompress(b"".join(chunks))
    stride = width * channels
    rows, previous = [], bytearray(stride)
    for y in range(height):
        kind = raw[y * (stride + 1)]
        line = bytearray(raw[y * (stride + 1) + 1:(y + 1) * (stride + 1)])
        for x in range(stride):
            left = line[x - channels] if x >= channels else 0
            up = previous[x]
            corner = previous[x - channels] if x >= channels else 0
            if kind == 1:
                line[x] = (line[x] + left) & 255
            elif kind == 2:
                line[x] = (line[x] + up) & 255
            elif kind == 3:
                line[x] = (line[x] + (left + up) // 2) & 255
            elif kind == 4:
                p = left + up - corner
                pa, pb, pc = abs(p - left), abs(p - up), abs(p - corner)
                line[x] = (line[x] + (left if pa <= pb and pa <= pc else up if pb <= pc else corner)) & 255
        rows.append(bytes(line))
        previous = line
    return width, height, rows


EXAMPLES = sorted(EXAMPLE.parent.glob("*.movie"))


@pytest.fixture(scope="module", params=[path.stem for path in EXAMPLES])
def report(request, tmp_path_factory) -> tuple[Path, int]:
    # every bundled example's report, one at a time
    folder = tmp_path_factory.mktemp(request.param)
    path = EXAMPLE.parent / f"{request.param}.movie"
    result = check_movie(parse_movie(path.read_text()))
    page = folder / "report.html"
    page.write_text(movie_html(result, source=f"examples/movies/{path.name}"), encoding="utf-8")
    return page, len(result.frames)


def test_the_report_has_one_drawing_per_frame_in_the_browser(report, tmp_path):
    page, frames = report
    run = _run(tmp_path, "--dump-dom", page.as_uri())
    assert run.returncode == 0, run.stderr[-2000:]
    dom = run.stdout
    assert "VERDICT" in dom
    # the DOM the browser built, after parsing: one <svg> per frame, each with its strands
    assert len(re.findall(r"<svg\b", dom)) == frames
    drawings = re.findall(r"<svg\b.*?</svg>", dom, re.S)
    assert all('class="strand"' in drawing or 'data-crossings="0"' in drawing for drawing in drawings)
    assert len(re.findall(r'class="strand"', dom)) > 0


def test_the_report_renders_to_a_picture_that_is_not_blank(report, tmp_path):
    page, frames = report
    shot = tmp_path / "shot.png"
    run = _run(tmp_path, f"--screenshot={shot}", "--window-size=1200,3000", "--hide-scrollbars", page.as_uri())
    assert shot.exists(), run.stderr[-2000:]
    width, height, rows = decode_png(shot.read_bytes())
    assert (width, height) == (1200, 3000)
    channels = len(rows[0]) // width
    # count pixels clearly away from white and from the page's cream background
    inked = coloured = 0
    for row in rows[::2]:
        for x in range(0, width * channels, channels * 2):
            r, g, b = row[x], row[x + 1], row[x + 2]
            if min(r, g, b) < 200:
                inked += 1
            if max(r, g, b) - min(r, g, b) > 60:
                coloured += 1
    sampled = (height // 2) * (width // 2)
    assert inked > 0.002 * sampled, f"only {inked} dark pixels of {sampled}: the page looks blank"
    # the strands are drawn in colour, not only black text
    assert coloured > 200
