"""Reading movie files: every statement, errors with line and column, and fuzzing."""

import subprocess
import sys

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from movies.cli.main import main
from movies.errors import InputError, MoviesError
from movies.diagram.moves import NewNames
from movies.diagram.steps import MoveRecord
from movies.language.movie import MovieSyntaxError, parse_movie

EVERY_STATEMENT = """\
title every statement once   % a comment
start 3_1 # mirror(3_1)
band 4 10 in face 1 new edges 40, faces 50
R1 add 5 left + new crossings 9
R1 add 5 R -
R1 remove 9 kink 12
R2 add 4 over 8 in face 2
R2 remove face 6
R3 face 5
birth in face 2
birth cw face 3
death 4
simplify
simplify to crossingless
simplify to 3 crossings
simplify to unknot + unknot
isotopic to unlink(2)
expect components 2
expect crossings 0
expect crossingless
expect unlink
expect isotopic to unlink(2)
expect signature -2
expect writhe 3
expect determinant 9
expect jones t + t^3 - t^4
expect alexander 1 - t + t^2
surface disk, connected, ribbon, orientable, genus 0, euler -1, components 2
budget 3 seconds
"""


def test_every_statement_reads():
    movie = parse_movie(EVERY_STATEMENT)
    assert movie.title == "every statement once"
    assert movie.start.crossing_count() == 6
    kinds = [s.kind for s in movie.statements]
    assert kinds[:12] == ["band", "R1+", "R1+", "R1-", "R2+", "R2-", "R3", "birth", "birth", "death",
                          "simplify", "simplify"]
    band = movie.statements[0]
    assert band.record == MoveRecord("band", first=4, second=10, face=1, names=NewNames(edges=(40,), faces=(50,)))
    assert band.line == 3 and band.column == 1
    assert movie.statements[1].record.names == NewNames(crossings=(9,))
    assert movie.statements[2].record.hand == "R" and movie.statements[2].record.sign == -1
    assert movie.statements[3].record == MoveRecord("R1-", crossing=9, kink=12)
    assert movie.statements[8].record.counterclockwise is False
    targets = [s.args["target"] for s in movie.statements if s.kind == "simplify"]
    assert targets == ["fewest", "crossingless", "crossings", "diagram"]
    expects = [s.args["what"] for s in movie.statements if s.kind == "expect"]
    assert expects == ["components", "crossings", "crossingless", "unlink", "isotopic", "signature",
                       "writhe", "determinant", "jones", "alexander"]
    (claim,) = movie.claims
    assert claim.args["facts"] == [("disk", None), ("connected", None), ("ribbon", None), ("orientable", None),
                                   ("genus", 0), ("euler", -1), ("components", 2)]


@pytest.mark.parametrize(
    "text, line, column, fragment",
    [
        ("start unknot\nR1 5 left +", 2, 4, "R1 add EDGE"),
        ("start unknot\nR1 add 5 left", 2, 14, "sign"),
        ("start unknot\nband 3", 2, 7, "two edges"),
        ("start unknot\nR2 add 4 8 in face 2", 2, 10, "over"),
        ("start unknot\nbnad 3 4", 2, 1, "did you mean 'band'"),
        ("start unknot\n\n   surface sphere", 3, 12, "after 'surface'"),
        ("start 3_1 # mirror(3_2)", 1, 20, "3_2"),
        ("start unknot\nisotopic to braid[1, 2", 2, 18, "never closed"),
        ("start unknot\nexpect jones t +* 3", 2, 14, "polynomial"),
        ("band 1 2\nstart unknot", 1, 1, "before the first frame"),
        ("title nothing else", 1, 1, "no first frame"),
        ("start unknot\nstart unknot", 2, 1, "one 'start'"),
        ("start unknot\nexpect signature two", 2, 18, "integer"),
    ],
)
def test_errors_point_at_the_spot(text, line, column, fragment):
    with pytest.raises(InputError) as caught:
        parse_movie(text)
    err = caught.value
    assert (err.line, err.column) == (line, column)
    assert fragment in str(err)
    picture = err.context().split("\n")
    assert picture[1].rstrip().endswith("^")
    assert len(picture[1].rstrip()) - 1 == min(column - 1, 40)


def test_check_command_exit_2_with_a_caret(tmp_path, capsys):
    path = tmp_path / "bad.movie"
    path.write_text("start unknot\nR2 remove 6\n")
    assert main(["check", str(path)]) == 2
    err = capsys.readouterr().err
    assert "line 2, column 11" in err and "face" in err
    assert err.rstrip().endswith("^")
    assert main(["check", str(tmp_path / "missing.movie")]) == 2


WORDS = ["title", "start", "band", "R1", "R2", "R3", "add", "remove", "over", "in", "face", "birth", "death",
         "cw", "ccw", "simplify", "to", "isotopic", "expect", "surface", "disk", "genus", "euler", "budget",
         "seconds", "new", "edges", "faces", "left", "right", "L", "R", "+", "-", "kink", "crossingless",
         "unlink", "components", "crossings", "signature", "jones", "3_1", "unknot", "#", "mirror(", ")",
         "1", "2", "17", "-3", ",", "%", "\n", "\n", "\n", "   "]


@settings(max_examples=300, deadline=None, derandomize=True, suppress_health_check=[HealthCheck.too_slow])
@given(st.lists(st.sampled_from(WORDS), max_size=40))
def test_token_streams_fail_cleanly(tokens):
    text = "start unknot\n" + " ".join(tokens)
    try:
        parse_movie(text)
    except MoviesError as err:
        assert isinstance(err, InputError)
        assert str(err)


@settings(max_examples=300, deadline=None, derandomize=True)
@given(st.text(max_size=80))
def test_random_text_fails_cleanly(text):
    try:
        parse_movie(text)
    except MoviesError as err:
        assert isinstance(err, InputError)


def test_fuzzed_file_through_the_command_line_exits_2(tmp_path):
    path = tmp_path / "noise.movie"
    path.write_text("start unknot\nR3 face face\n\x00\x01 band ((\n")
    result = subprocess.run([sys.executable, "-m", "movies", "check", str(path)], capture_output=True, text=True)
    assert result.returncode == 2
    assert "Traceback" not in result.stderr and "line 2" in result.stderr


def test_the_reference_page_statements_read():
    from pathlib import Path
    import re

    page = (Path(__file__).resolve().parents[2] / "grammar" / "README.md").read_text(encoding="utf-8")
    section = page.split("## Writing a movie", 1)[1].split("### Verdicts", 1)[0]
    rows = [line for line in section.splitlines() if line.startswith("| `")]
    snippets = [re.findall(r"`([^`]+)`", row.split("|")[1])[0] for row in rows]
    assert len(snippets) >= 18
    for snippet in snippets:
        if snippet.startswith("title"):
            text = snippet + "\nstart unknot"
        elif snippet.startswith("start"):
            text = snippet
        elif snippet.startswith(("in ", "cap ")):  # statements of a movie with handles
            text = "start unlink(2) with handle across 1 2\n" + snippet
        else:
            text = "start unknot\n" + snippet
        parse_movie(text)
    blocks = re.findall(r"```\n(.*?)```", section, re.S)
    from movies.checker.replay import check_movie

    assert len(blocks) >= 2  # a small movie, and a crossing change written as a twist
    for block in blocks:
        assert check_movie(parse_movie(block)).verified
