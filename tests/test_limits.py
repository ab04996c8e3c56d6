"""The limits of movies.limits: every number, size and depth past them is refused before any
work, with a message that names the input and the limit, located in the text where there is one."""

from __future__ import annotations

import json

import pytest

from movies import limits
from movies.checker.replay import check_movie
from movies.cli.main import main
from movies.diagram import constructors
from movies.diagram.pd import from_pd
from movies.errors import InputError, LimitError, LocatedLimitError, MoviesError
from movies.language.movie import parse_movie
from movies.language.spec import parse_diagram

BIG = "9" * 5000  # past Python's own limit for reading an integer (4300 digits)
SHOWN = "99999999…99999999"


def digits_message(shown: str = SHOWN, count: int = 5000) -> str:
    return f"the number {shown} has {count} digits; the limit is 12 (raise it with --limit digits=N)"


def run(capsys, *argv: str) -> tuple[int, str, str]:
    try:
        code = main(list(argv))
    except SystemExit as stop:
        code = stop.code
    out, err = capsys.readouterr()
    return code, out, err


# ---------------------------------------------------------------------- the limits themselves


def test_the_defaults_are_plain_data_with_a_meaning_each():
    assert dict(limits.DEFAULTS) == {"crossings": 2000, "strands": 500, "components": 1000, "depth": 100,
                                     "lines": 100_000, "digits": 12, "seconds": 3600, "blowups": 1000}
    assert set(limits.MEANING) == set(limits.DEFAULTS)


def test_using_changes_some_limits_for_a_block_only():
    with limits.using(crossings=3):
        assert limits.current()["crossings"] == 3
        with pytest.raises(LimitError) as info:
            parse_diagram("torus(2, 4)")
    assert str(info.value).startswith("torus(2, 4) would have 4 crossings; the limit is 3 ")
    assert limits.current()["crossings"] == 2000
    assert parse_diagram("torus(2, 4)").crossing_count() == 4


@pytest.mark.parametrize("changes, fragment", [({"size": 3}, "no limit named 'size'"), ({"depth": 0}, "1 or more"),
                                                ({"depth": "9"}, "whole number")])
def test_using_refuses_unknown_limits_and_bad_values(changes, fragment):
    with pytest.raises(InputError, match=fragment):
        with limits.using(changes):
            pass


# ---------------------------------------------------------------------- numbers past the digits limit


SPEC_DIGITS = [
    ("unlink(<BIG>)", 8),
    ("torus(2, <BIG>)", 10),
    ("braid[1, <BIG>]", 10),
    ("braid(<BIG>)[1]", 7),
    ("pd[[1,5,2,4],[3,1,4,6],[5,3,6,<BIG>]]", 31),
    ("3_1 #(1, <BIG>) 4_1", 10),
    ("3_1 +(<BIG>, 1) 4_1", 7),
    ("reverse(L2a1{1}, <BIG>)", 18),
    ("3_<BIG>", 3),
    ("L2a1{<BIG>}", 6),
]


@pytest.mark.parametrize("text, column", SPEC_DIGITS)
def test_a_number_with_too_many_digits_in_a_diagram_is_refused_where_it_stands(text, column):
    text = text.replace("<BIG>", BIG)
    with pytest.raises(LocatedLimitError) as info:
        parse_diagram(text)
    err = info.value
    assert (err.reason, err.line, err.column, err.name) == (digits_message(), 1, column, "digits")


MOVIE_DIGITS = [
    ("band <BIG> 3", 6), ("band 1 2 in face <BIG>", 18), ("R1 add <BIG> left +", 8),
    ("R1 remove 1 kink <BIG>", 18), ("R2 add 1 over <BIG> in face 2", 15), ("R3 face <BIG>", 9),
    ("birth in face <BIG>", 15), ("death <BIG>", 7), ("twist +1 across 3 <BIG>", 19),
    ("band 1 2 new edges 7 <BIG>", 22), ("budget <BIG> seconds", 8), ("expect crossings <BIG>", 18),
    ("expect components <BIG>", 19), ("expect signature -<BIG>", 19), ("expect jones t^<BIG> + 1", 16),
    ("expect jones <BIG>*t^2", 14), ("expect alexander t^(-<BIG>)", 22), ("simplify to <BIG> crossings", 13),
    ("surface genus <BIG>", 15), ("isotopic to torus(2, <BIG>)", 22),
]


@pytest.mark.parametrize("statement, column", MOVIE_DIGITS)
def test_a_number_with_too_many_digits_in_a_movie_is_refused_where_it_stands(statement, column):
    with pytest.raises(LocatedLimitError) as info:
        parse_movie("start 3_1\n" + statement.replace("<BIG>", BIG))
    assert (info.value.reason, info.value.line, info.value.column) == (digits_message(), 2, column)


def test_a_signed_number_shows_its_sign():
    with pytest.raises(LocatedLimitError) as info:
        parse_movie(f"start unknot\nsurface euler -{BIG}")
    assert info.value.reason == digits_message("-9999999…99999999")
    assert info.value.column == 15


@pytest.mark.parametrize("argv, message", [
    pytest.param(["invariants", "--pd", f"[[1,5,2,4],[3,1,4,6],[5,3,6,{BIG}]]"], f"--pd: {digits_message()}", id="pd"),
    pytest.param(["invariants", "--braid", f"[1, {BIG}]"], f"--braid: {digits_message()}", id="braid"),
    pytest.param(["invariants", "--braid", "[1]", "--strands", BIG], f"--strands: {digits_message()}", id="strands"),
    pytest.param(["invariants", "--braid", "[1]", "--strands", "99999999999999999999999"],
                 "--strands: " + digits_message("99999999999999999999999", 23), id="strands-23"),
    pytest.param(["bounds", "3_1", "--genus", BIG], f"--genus: {digits_message()}", id="genus"),
    pytest.param(["frames", "examples/movies/square-knot-ribbon.movie", "--at", BIG], f"--at: {digits_message()}",
                 id="at"),
    pytest.param(["invariants", "3_1", "--field", f"F{BIG}"], f"the ground ring: {digits_message()}", id="field"),
])
def test_command_line_numbers_past_the_digits_limit_exit_2(capsys, argv, message):
    code, out, err = run(capsys, *argv)
    assert (code, out) == (2, "")
    assert err == f"movies: error: {message}\n"


def test_the_digits_limit_can_be_raised(capsys):
    code, _, err = run(capsys, "invariants", "--classical", "--json", "unlink(0000000000002)", "--limit", "digits=13")
    assert code == 0, err


# ---------------------------------------------------------------------- numbers that fit but are absurd


SPEC_SIZES = [
    ("torus(2, 1000000000)",
     "torus(2, 1000000000) would have 1000000000 crossings; the limit is 2000 (raise it with --limit crossings=N)", 1),
    ("unlink(100000000)",
     "unlink(100000000) would have 100000000 components; the limit is 1000 (raise it with --limit components=N)", 1),
    ("torus(0, 5000)", "torus(0, 5000) would have 5000 components; the limit is 1000 (raise it with --limit components=N)", 1),
    ("torus(600, 1)", "torus(600, 1) would have 600 strands; the limit is 500 (raise it with --limit strands=N)", 1),
    ("mirror(torus(-3, 1001))",
     "torus(3, -1001) would have 2002 crossings; the limit is 2000 (raise it with --limit crossings=N)", 8),
    ("braid[1, -100000]", "generator -100000 at position 2 of the braid word needs 100001 strands; the limit is 500 "
                          "(raise it with --limit strands=N)", 10),
    ("braid(501)[1]", "the braid would have 501 strands; the limit is 500 (raise it with --limit strands=N)", 7),
    ("torus(2, 1000) + torus(2, 1001)",
     "the disjoint union would have 2001 crossings; the limit is 2000 (raise it with --limit crossings=N)", 1),
    ("unlink(600) # unlink(600)",
     "the connected sum would have 1199 components; the limit is 1000 (raise it with --limit components=N)", 1),
]


@pytest.mark.parametrize("text, message, column", SPEC_SIZES)
def test_sizes_past_the_limits_are_refused_before_the_diagram_is_built(text, message, column):
    with pytest.raises(LocatedLimitError) as info:
        parse_diagram(text)
    assert (info.value.reason, info.value.column) == (message, column)


@pytest.mark.parametrize("text, message, column", SPEC_SIZES + [
    (f"torus(3, {10 ** 20})", digits_message(str(10 ** 20), 21), 10),
    ("braid(9223372036854775808)[]", digits_message("9223372036854775808", 19), 7),
])
def test_the_command_line_refuses_sizes_past_the_limits_with_exit_2(capsys, text, message, column):
    code, out, err = run(capsys, "invariants", "--classical", text)
    assert (code, out) == (2, "")
    assert err.splitlines()[0] == f"movies: error: {message} (line 1, column {column})"
    assert "Traceback" not in err


@pytest.mark.parametrize("text, column", SPEC_DIGITS)
def test_the_command_line_refuses_long_numbers_in_a_diagram_with_exit_2(capsys, text, column):
    code, out, err = run(capsys, "draw", text.replace("<BIG>", BIG), "-o", "never-written.svg")
    assert (code, out) == (2, "")
    assert err.splitlines()[0] == f"movies: error: {digits_message()} (line 1, column {column})"


@pytest.mark.parametrize("statement, column", MOVIE_DIGITS)
def test_the_command_line_refuses_long_numbers_in_a_movie_with_exit_2(capsys, tmp_path, statement, column):
    movie = tmp_path / "long.movie"
    movie.write_text("start 3_1\n" + statement.replace("<BIG>", BIG) + "\n")
    code, out, err = run(capsys, "check", str(movie))
    assert (code, out) == (2, "")
    assert err.splitlines()[0] == f"movies: error: {digits_message()} (line 2, column {column})"


def test_a_huge_strand_count_that_fits_the_digits_limit_is_refused_by_the_strand_limit():
    with limits.using(digits=19), pytest.raises(LocatedLimitError) as info:
        parse_diagram("braid(9223372036854775808)[]")
    assert info.value.reason == ("the braid would have 9223372036854775808 strands; the limit is 500 "
                                 "(raise it with --limit strands=N)")
    assert info.value.column == 7
    with pytest.raises(LocatedLimitError) as info:
        parse_diagram("braid(9223372036854775808)[]")
    assert info.value.reason == digits_message("9223372036854775808", 19)


def test_torus_with_a_twenty_digit_twist_is_refused_by_the_digits_limit_then_the_crossing_limit():
    with pytest.raises(LocatedLimitError) as info:
        parse_diagram(f"torus(3, {10 ** 20})")
    assert info.value.reason == digits_message(str(10 ** 20), 21)
    with limits.using(digits=30), pytest.raises(LocatedLimitError) as info:
        parse_diagram(f"torus(3, {10 ** 20})")
    assert info.value.reason.startswith(f"torus(3, {10 ** 20}) would have {2 * 10 ** 20} crossings; the limit is 2000")


def test_the_python_constructors_check_the_same_limits():
    with pytest.raises(LimitError, match=r"^unlink\(5000\) would have 5000 components; the limit is 1000"):
        constructors.unlink(5000)
    with pytest.raises(LimitError, match=r"^the braid word has 2001 crossings; the limit is 2000"):
        constructors.from_braid([1] * 2001)
    with pytest.raises(LimitError, match=r"^the PD code has 2001 crossings; the limit is 2000"):
        from_pd([[1, 1, 2, 2]] * 2001)
    # a huge label is only a name
    assert from_pd([[10 ** 20, 10 ** 20, 10 ** 20 + 1, 10 ** 20 + 1]]).crossing_count() == 1


@pytest.mark.parametrize("argv, message", [
    (["invariants", "--braid", "[1, 99999]"], "generator 99999 at position 2 of the braid word needs 100000 strands; "
                                              "the limit is 500 (raise it with --limit strands=N)"),
    (["invariants", "--braid", "[1]", "--strands", "9999"],
     "the braid would have 9999 strands; the limit is 500 (raise it with --limit strands=N)"),
    (["invariants", "--pd", json.dumps([[1, 1, 2, 2]] * 2001)],
     "the PD code has 2001 crossings; the limit is 2000 (raise it with --limit crossings=N)"),
    (["bounds", "3_1", "--blowups", "100000000"],
     "--blowups 100000000 asks about 100000000 CP²-bar summands; the limit is 1000 (raise it with --limit blowups=N)"),
    (["draw", "torus(200, 201)", "-o", "never-written.svg"],
     "torus(200, 201) would have 39999 crossings; the limit is 2000 (raise it with --limit crossings=N) "
     "(line 1, column 1)"),
])
def test_command_line_sizes_past_the_limits_exit_2(capsys, argv, message):
    code, out, err = run(capsys, *argv)
    assert (code, out) == (2, "")
    assert err.splitlines()[0] == f"movies: error: {message}"


def test_every_subcommand_takes_limit_options(capsys, tmp_path):
    movie = tmp_path / "kink.movie"
    movie.write_text("start unknot\nR1 add 1 left +\nR1 add 1 left +\n")
    for argv in (["invariants", "--classical", "torus(2, 5)"], ["draw", "torus(2, 5)", "-o", str(tmp_path / "t.svg")],
                 ["bounds", "torus(2, 5)"], ["check", str(movie)], ["frames", str(movie)]):
        code, _, err = run(capsys, *argv, "--limit", "crossings=1")
        assert code == 2, argv
        assert "the limit is 1 (raise it with --limit crossings=N)" in err
        code, _, err = run(capsys, *argv, "--limit", "crossings=10")
        assert code in (0, 1), (argv, err)


@pytest.mark.parametrize("option, message", [
    ("crossings", "--limit takes NAME=VALUE with a whole number, e.g. crossings=5000, not 'crossings'"),
    ("size=4", "--limit: there is no limit named 'size'; the limits are crossings, strands, components, depth, lines, "
               "digits, seconds, blowups"),
    ("depth=0", "--limit depth: a limit is 1 or more"),
    ("depth=" + "9" * 40, "--limit depth: 99999999…99999999 is more than any computer could use"),
])
def test_bad_limit_options_exit_2(capsys, option, message):
    code, _, err = run(capsys, "invariants", "3_1", "--limit", option)
    assert (code, err) == (2, f"movies: error: {message}\n")


# ---------------------------------------------------------------------- nesting


def test_deep_mirrors_are_refused_at_the_bracket_past_the_depth_limit():
    text = "mirror(" * 500 + "3_1" + ")" * 500
    with pytest.raises(LocatedLimitError) as info:
        parse_diagram(text)
    assert info.value.reason == "brackets nest 101 deep here; the limit is 100 (raise it with --limit depth=N)"
    assert (info.value.line, info.value.column) == (1, 7 * 100 + 7)


def test_deep_nesting_within_a_raised_limit_is_built_without_recursion():
    with limits.using(depth=5000):
        deep = parse_diagram("mirror(" * 2001 + "3_1" + ")" * 2001)
        grouped = parse_diagram("(" * 3000 + "4_1" + ")" * 3000)
    assert deep.writhe() == -3
    assert grouped.crossing_count() == 4


def test_a_long_chain_of_sums_counts_as_nesting():
    text = " # ".join(["3_1"] * 300)
    with pytest.raises(LocatedLimitError) as info:
        parse_diagram(text)
    assert info.value.reason == ("diagrams nest 101 deep here (each '#', '+', mirror, reverse, twisted and a list of handles is one level); "
                                 "the limit is 100 (raise it with --limit depth=N)")
    assert parse_diagram(" # ".join(["3_1"] * 101)).crossing_count() == 303


def test_deep_brackets_in_a_movie_point_into_the_movie():
    with pytest.raises(LocatedLimitError) as info:
        parse_movie("title deep\nstart " + "(" * 200 + "3_1" + ")" * 200)
    assert (info.value.line, info.value.column) == (2, 7 + 100)


@pytest.mark.parametrize("option", ["--pd", "--braid"])
def test_deep_json_on_the_command_line_exits_2(capsys, option):
    code, _, err = run(capsys, "invariants", option, "[" * 2000 + "]" * 2000)
    assert code == 2
    assert err == (f"movies: error: {option}: brackets nest 101 deep here; the limit is 100 "
                   "(raise it with --limit depth=N) (column 101)\n")


def test_brackets_inside_json_strings_and_spec_comments_do_not_count():
    assert limits.current()["depth"] == 100
    assert parse_diagram("3_1 % " + "(" * 500 + "\n").crossing_count() == 3
    from movies.language.frontend import nesting_problem

    assert nesting_problem('["' + "[" * 500 + '"]', comment=None, strings=True) is None


# ---------------------------------------------------------------------- movies: lines, budgets, frames


def test_a_movie_past_the_line_limit_is_refused_before_it_is_read():
    text = "start unknot\n" + "% a comment\n" * 100_000
    with pytest.raises(LocatedLimitError) as info:
        parse_movie(text)
    assert info.value.reason == ("the movie has 100002 lines; the limit is 100000 "
                                 "(raise it with --limit lines=N)")
    assert (info.value.line, info.value.column) == (100_001, 1)


@pytest.mark.parametrize("value", ["nan", "-1", "inf", "-inf", "1e3", "", "5s", "0x10"])
def test_command_line_budgets_that_are_not_seconds_exit_2(capsys, value):
    code, _, err = run(capsys, "check", "examples/movies/square-knot-ribbon.movie", f"--budget={value}")
    assert (code, err) == (2, f"movies: error: --budget is a number of seconds, 0 or more, such as 5 or 0.5, "
                              f"not {value!r}\n")


def test_a_budget_past_the_seconds_limit_exits_2(capsys):
    code, _, err = run(capsys, "frames", "examples/movies/square-knot-ribbon.movie", "--budget", "3600.5")
    assert (code, err) == (2, "movies: error: --budget 3600.5 would let one search run 3600.5 seconds; the limit is "
                              "3600 (raise it with --limit seconds=N)\n")


def test_the_budget_statement_is_a_whole_number_of_seconds_within_the_limit():
    with pytest.raises(LocatedLimitError) as info:
        parse_movie("start unknot\nbudget 5000 seconds")
    assert info.value.reason == ("budget 5000 seconds would let one search run 5000 seconds; the limit is 3600 "
                                 "(raise it with --limit seconds=N)")
    assert (info.value.line, info.value.column) == (2, 8)
    for bad in ("-1", "nan", "inf", "1.5"):
        with pytest.raises(MoviesError, match="a budget is a whole number of seconds, 0 or more"):
            parse_movie(f"start unknot\nbudget {bad} seconds")
    assert parse_movie("start unknot\nbudget 3600 seconds").statements[0].args == {"seconds": 3600}


@pytest.mark.parametrize("budget", [float("nan"), float("inf"), -1.0, "5"])
def test_check_movie_refuses_a_budget_that_is_not_seconds(budget):
    with pytest.raises(InputError, match="a budget is a number of seconds, 0 or more"):
        check_movie(parse_movie("start unknot"), budget)


def test_a_step_whose_frame_would_pass_the_crossing_limit_is_refused():
    movie = parse_movie("start unknot\n" + "R1 add 1 left +\n" * 4)
    with limits.using(crossings=3), pytest.raises(LocatedLimitError) as info:
        check_movie(movie, 0.1)
    assert info.value.reason == ("step 4 would make a frame of 4 crossings; the limit is 3 "
                                 "(raise it with --limit crossings=N)")
    assert (info.value.line, info.value.column) == (5, 1)


def test_a_twist_on_many_strands_is_refused_before_it_is_made():
    movie = parse_movie("start unlink(50)\ntwist +1 across " + " ".join(str(e) for e in range(1, 51)))
    with pytest.raises(LocatedLimitError) as info:
        check_movie(movie, 0.1)
    assert info.value.reason == ("step 1 would make a frame of 2450 crossings; the limit is 2000 "
                                 "(raise it with --limit crossings=N)")


def test_births_past_the_component_limit_are_refused():
    movie = parse_movie("start unknot\n" + "birth in face 1\n" * 3)
    with limits.using(components=3), pytest.raises(LocatedLimitError, match="step 3 would make a frame of 4 components"):
        check_movie(movie, 0.1)
