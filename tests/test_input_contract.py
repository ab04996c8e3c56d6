"""Every input ends in a clear answer: a result, or a located error of the package (exit 2), or
a verdict (exit 0 or 1); never a traceback, never exit 3 for a fault of the input. Ctrl-C ends a
long computation with exit 130. Reading is linear in the length of the text."""

from __future__ import annotations

import importlib
import inspect
import os
import pkgutil
import signal
import subprocess
import sys
import tempfile
import time
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st
from lark.parsers.lalr_parser_state import ParserState

import movies
from movies import errors, limits
from movies.cli.main import main
from movies.diagram.moves import base as moves_base
from movies.errors import DiagramError, InternalError, LocatedError, MoviesError
from movies.language.movie import parse_movie
from movies.language.spec import parse_diagram
from support import hostile

ROOT = Path(__file__).resolve().parents[1]
EXAMPLES = hostile.example_texts()


def fuzz(examples: int) -> settings:
    """Repeatable runs: a fixed sequence of examples, no deadline (some inputs build diagrams)."""
    return settings(derandomize=True, deadline=None, max_examples=examples, suppress_health_check=list(HealthCheck))


randoms = st.randoms(use_true_random=False)


def assert_located(err: MoviesError, text: str) -> None:
    """A reader's error: a located error of the package, never an internal one, with its place."""
    assert isinstance(err, LocatedError), f"{type(err).__name__} is not located: {err}"
    assert not isinstance(err, InternalError)
    assert isinstance(err.line, int) and isinstance(err.column, int)
    assert 1 <= err.line <= text.count("\n") + 2 and err.column >= 1
    assert str(err).endswith(f"(line {err.line}, column {err.column})")
    picture = err.context()
    assert picture.endswith("^") and "\n" in picture


def read_or_refuse(read, text: str) -> None:
    try:
        read(text)
    except MoviesError as err:
        assert_located(err, text)


# ---------------------------------------------------------------------- the readers, fuzzed


@fuzz(600)
@given(randoms)
def test_the_diagram_reader_returns_or_refuses_with_a_place(rng):
    read_or_refuse(parse_diagram, hostile.spec(rng))


@fuzz(300)
@given(randoms)
def test_the_movie_reader_returns_or_refuses_with_a_place(rng):
    read_or_refuse(parse_movie, hostile.movie(rng))


@fuzz(300)
@given(randoms)
def test_mutated_example_movies_are_read_or_refused_with_a_place(rng):
    read_or_refuse(parse_movie, hostile.mutated_example(rng, EXAMPLES))


@pytest.mark.parametrize("text", [
    "", "(", ")", "]", "{", "%", "\n\n", "#", "+", "-", "pd[]", "braid[]", "braid()[]", "torus(,)", "unlink(-0)",
    "3_1 #(0, 0) 3_1", "reverse(empty, 1)", "empty # empty", "é", "3_1\x00", "\ufeff3_1", "L2a1{", "L2a1{}",
    "L7a1{" + "0," * 3000 + "0}", "x" * 100_000, "3_" + "1" * 12, "pd{{1,1,2,2}}" * 3,
])
def test_edge_cases_of_the_notation_are_read_or_refused_with_a_place(text):
    read_or_refuse(parse_diagram, text)
    read_or_refuse(parse_movie, "start " + text)


def test_the_fuzzed_inputs_reach_every_outcome():
    """The generators are not idle: they make diagrams that read, and each kind of refusal."""
    import random

    rng = random.Random(3)
    seen = set()
    for _ in range(600):
        text = hostile.spec(rng)
        try:
            parse_diagram(text)
            seen.add("read")
        except MoviesError as err:
            seen.add(type(err).__name__)
    assert {"read", "SpecSyntaxError", "LocatedLimitError", "SpecTableError", "SpecBraidError"} <= seen


# ---------------------------------------------------------------------- the command line, fuzzed


@fuzz(300)
@given(randoms)
def test_the_command_line_ends_in_0_1_or_2_without_a_traceback(capsys, rng):
    with tempfile.TemporaryDirectory() as folder:
        movie_file = os.path.join(folder, "input.movie")
        with open(movie_file, "w", encoding="utf-8") as handle:
            handle.write(rng.choice([hostile.mutated_example(rng, EXAMPLES), hostile.movie(rng),
                                     hostile.plausible_movie(rng)]))
        argv = hostile.argv(rng, movie_file, os.path.join(folder, "drawing.svg"))
        capsys.readouterr()
        try:
            code = main(argv)
        except SystemExit as stop:  # argparse's own usage errors
            code = stop.code
    out, err = capsys.readouterr()
    assert code in (0, 1, 2), (argv, err)
    assert "Traceback" not in err and "internal error" not in err, (argv, err)
    if code == 2:
        assert "movies: error: " in err and out == "", (argv, err)


# ---------------------------------------------------------------------- errors


def _package_modules():
    for info in pkgutil.walk_packages(movies.__path__, "movies."):
        if not info.name.endswith("__main__"):  # importing it runs the command
            yield importlib.import_module(info.name)


def test_every_error_class_of_the_package_lives_in_movies_errors_under_one_root():
    found = {}
    for module in _package_modules():
        for name, value in vars(module).items():
            if inspect.isclass(value) and issubclass(value, BaseException) and value.__module__.startswith("movies"):
                found[f"{module.__name__}.{name}"] = value
    assert found, "no error classes found"
    for where, value in found.items():
        assert value.__module__ == "movies.errors", f"{where} is defined outside movies.errors"
        assert issubclass(value, errors.MoviesError), where
    assert errors.InternalError.exit_code == 3 and errors.MoviesError.exit_code == 2
    assert issubclass(errors.InternalInconsistency, errors.InternalError)


def test_both_readers_raise_the_one_located_error_class():
    with pytest.raises(errors.MovieSyntaxError) as movie_error:
        parse_movie("start 3_1\nbnad 2 3")
    with pytest.raises(errors.SpecSyntaxError) as spec_error:
        parse_diagram("braid[1, 2")
    for err in (movie_error.value, spec_error.value):
        assert isinstance(err, LocatedError)
        assert type(err).context is LocatedError.context
    assert movie_error.value.context() == "bnad 2 3\n^"
    assert spec_error.value.context() == "braid[1, 2\n     ^"


def test_an_internal_error_exits_3_and_is_never_an_invalid_step(monkeypatch, capsys, tmp_path):
    movie = tmp_path / "kink.movie"
    movie.write_text("start unknot\nR1 add 1 left +\n")

    def broken(*args, **kwargs):
        raise DiagramError("the faces do not match the diagram's boundary cycles")

    monkeypatch.setattr(moves_base, "assemble", broken)
    with pytest.raises(InternalError, match="the move produced an invalid diagram"):
        movies.check_movie(parse_movie(movie.read_text()), 0.1)
    code = main(["check", str(movie)])
    out, err = capsys.readouterr()
    assert (code, out) == (3, "")
    assert err == ("movies: internal error: the move produced an invalid diagram: the faces do not match the "
                   "diagram's boundary cycles; please report it (MOVIES_DEBUG=1 shows the traceback)\n")


def test_an_internal_error_inside_a_diagram_spec_is_not_turned_into_an_input_error(monkeypatch):
    from movies.diagram import constructors

    def broken(first, second):
        raise InternalError("a mirror that is not one")

    monkeypatch.setattr(constructors, "mirror", lambda diagram: broken(diagram, diagram))
    with pytest.raises(InternalError) as info:
        parse_diagram("mirror(3_1)")
    assert not isinstance(info.value, LocatedError)
    with pytest.raises(TypeError):
        errors.located(info.value, "mirror(3_1)", 1, 1)


# ---------------------------------------------------------------------- reading is linear


class CountingText(str):
    """Text that counts the characters its whole-text methods go over."""

    scanned = 0

    def _scan(self):
        CountingText.scanned += len(self)

    def split(self, *args, **kwargs):
        self._scan()
        return super().split(*args, **kwargs)

    def splitlines(self, *args, **kwargs):
        self._scan()
        return super().splitlines(*args, **kwargs)

    def count(self, *args, **kwargs):
        self._scan()
        return super().count(*args, **kwargs)

    def find(self, *args, **kwargs):
        self._scan()
        return super().find(*args, **kwargs)

    def rfind(self, *args, **kwargs):
        self._scan()
        return super().rfind(*args, **kwargs)

    def endswith(self, *args, **kwargs):
        self._scan()
        return super().endswith(*args, **kwargs)

    def strip(self, *args, **kwargs):
        self._scan()
        return super().strip(*args, **kwargs)


@pytest.mark.parametrize("statements", [2_000, 20_000])
def test_reading_a_movie_goes_over_its_text_a_fixed_number_of_times(statements):
    text = CountingText("title long\nstart 3_1\n" + "expect crossings 3\nR1 add 1 left +\n" * (statements // 2))
    CountingText.scanned = 0
    movie = parse_movie(text)
    assert len(movie.statements) == statements
    # once per statement would be `statements` times the length of the text
    assert CountingText.scanned <= 4 * len(text)


@pytest.mark.parametrize("brackets", [2_000, 20_000])
def test_a_syntax_error_after_many_open_brackets_costs_work_linear_in_the_text(monkeypatch, brackets):
    copied = []
    original = ParserState.copy

    def counting(self, *args, **kwargs):
        copied.append(len(self.state_stack))
        return original(self, *args, **kwargs)

    monkeypatch.setattr(ParserState, "copy", counting)
    text = "(" * brackets + "3_1 4_1"
    with limits.using(depth=brackets), pytest.raises(errors.SpecSyntaxError) as info:
        parse_diagram(text)
    assert info.value.column == brackets + 5
    # copying the parser's stack at every token would copy about brackets² / 2 entries
    assert sum(copied) <= 20 * len(text)


def test_twenty_thousand_open_brackets_are_refused_by_the_depth_limit_at_once():
    with pytest.raises(errors.LocatedLimitError) as info:
        parse_diagram("(" * 20_000)
    assert (info.value.name, info.value.column) == ("depth", 101)


# ---------------------------------------------------------------------- Ctrl-C


def _interrupted(argv: list[str], after: float) -> tuple[int, str]:
    env = {**os.environ, "PYTHONPATH": str(ROOT)}
    process = subprocess.Popen([sys.executable, "-m", "movies", *argv], cwd=ROOT, env=env,
                               stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    time.sleep(after)
    assert process.poll() is None, "the command ended before it could be interrupted"
    process.send_signal(signal.SIGINT)
    try:
        _, err = process.communicate(timeout=15)
    except subprocess.TimeoutExpired:
        process.kill()
        process.communicate()
        pytest.fail(f"{argv} did not stop within 15 s of Ctrl-C")
    return process.returncode, err


@pytest.mark.parametrize("argv", [
    ["draw", "torus(40, 41)", "-o", "{tmp}/torus.svg"],
    ["invariants", "torus(9, 10)"],
])
def test_ctrl_c_stops_a_long_computation_with_exit_130(tmp_path, argv):
    code, err = _interrupted([arg.replace("{tmp}", str(tmp_path)) for arg in argv], after=2.5)
    assert code == 130
    assert err == "movies: interrupted\n"
