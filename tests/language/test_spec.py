"""Tests of the one-line diagram notation (grammar/diagram.lark, movies.language.spec)."""

from __future__ import annotations

import pathlib
import re

import pytest

from movies.diagram.constructors import (
    connected_sum,
    disjoint_union,
    empty,
    from_braid,
    from_table,
    mirror,
    reverse,
    torus_link,
    unknot,
    unlink,
)
from movies.diagram.pd import from_pd
from movies.errors import BraidError, DiagramError, InputError, MoviesError, PDCodeError, TableError
from movies.invariants.jones import jones_polynomial
from movies.language.spec import (
    _EXAMPLES,
    KEYWORDS,
    Located,
    SpecDiagramError,
    SpecInputError,
    SpecSyntaxError,
    SpecTableError,
    diagram_grammar,
    diagram_parser,
    parse_diagram,
    parse_handle_diagram,
    read_spec,
)
from support.diagrams import TREFOIL_PD

ROOT = pathlib.Path(__file__).resolve().parents[2]


def error_of(text: str) -> Located:
    with pytest.raises(MoviesError) as caught:
        parse_diagram(text)
    assert isinstance(caught.value, Located), caught.value
    return caught.value


def caret_column(err: Located) -> int:
    """The column (from 1) of the caret in the rendered context."""
    return err.context(span=1000).split("\n")[1].index("^") + 1


# ----------------------------------------------------------------------------- spellings
@pytest.mark.parametrize(
    "text, name",
    [
        ("3_1", "3_1"),
        ("K3_1", "3_1"),
        ("8_20", "8_20"),
        ("10_165", "10_165"),
        ("11n_34", "11n_34"),
        ("11a1", "11a_1"),
        ("k11A1", "11a_1"),
        ("L7a1{0}", "L7a1{0}"),
        ("L7a1", "L7a1{0}"),
        ("L11n459{0, 1, 1}", "L11n459{0,1,1}"),
        ("L2a1 {1}", "L2a1{1}"),
    ],
)
def test_table_names(text, name):
    assert parse_diagram(text) == from_table(name)


def test_words():
    assert parse_diagram("unknot") == unknot()
    assert parse_diagram("empty") == empty() == parse_diagram("unlink(0)")
    assert parse_diagram("unlink(3)") == unlink(3)
    assert parse_diagram("unlink( 1 )") == unknot()


@pytest.mark.parametrize(
    "text, word, strands",
    [
        ("braid[1, 1, -2]", [1, 1, -2], None),
        ("braid[1 1 -2]", [1, 1, -2], None),
        ("braid[1,1,-2]", [1, 1, -2], None),
        ("braid[+1, -1]", [1, -1], None),
        ("braid(4)[1, 2]", [1, 2], 4),
        ("braid (4) [1, 2]", [1, 2], 4),
        ("braid[]", [], None),
        ("braid(3)[]", [], 3),
    ],
)
def test_braids(text, word, strands):
    assert parse_diagram(text) == from_braid(word, strands)


def test_torus():
    assert parse_diagram("torus(2, 5)") == torus_link(2, 5)
    assert parse_diagram("torus(-2, 3)") == torus_link(2, -3)
    assert parse_diagram("torus(3,0)") == from_braid([], 3)


def test_pd_codes():
    trefoil = from_pd(TREFOIL_PD)
    assert parse_diagram("pd[[1,5,2,4],[3,1,4,6],[5,3,6,2]]") == trefoil
    assert parse_diagram("pd [ [1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2] ]") == trefoil
    assert parse_diagram("pd[(1,5,2,4),(3,1,4,6),(5,3,6,2)]") == trefoil
    # LinkInfo column pd_notation_vector: L2a1{0} is {{4, 1, 3, 2}, {2, 3, 1, 4}}
    assert parse_diagram("pd{{4, 1, 3, 2}, {2, 3, 1, 4}}") == from_table("L2a1{0}")


def test_mirror_and_reverse():
    assert parse_diagram("mirror(3_1)") == mirror(from_table("3_1"))
    assert parse_diagram("mirror(mirror(5_2))") == from_table("5_2")
    assert parse_diagram("reverse(5_2)") == reverse(from_table("5_2"))
    link = from_braid([1, 1, 2, 2])  # three components in a chain
    assert link.component_count() == 3
    assert parse_diagram("reverse(braid[1, 1, 2, 2], 1, 3)") == reverse(link, [1, 3])
    assert parse_diagram("reverse(braid[1,1,2,2],2)").linking_matrix() == [[0, -1, 0], [-1, 0, -1], [0, -1, 0]]


def test_sums():
    a, b, c = from_table("3_1"), from_table("4_1"), from_table("5_1")
    assert parse_diagram("3_1 # 4_1") == connected_sum(a, b)
    assert parse_diagram("3_1 #(3, 5) 4_1") == connected_sum(a, b, 3, 5)
    assert parse_diagram("3_1#(3,5)4_1") == connected_sum(a, b, 3, 5)
    assert parse_diagram("3_1 + 4_1") == disjoint_union(a, b)
    assert parse_diagram("3_1 +(2, 1) 4_1") == disjoint_union(a, b, 2, 1)
    assert parse_diagram("3_1 # (4_1)") == connected_sum(a, b)


def test_precedence_and_grouping():
    a, b, c = from_table("3_1"), from_table("4_1"), from_table("5_1")
    assert parse_diagram("3_1 + 4_1 # 5_1") == disjoint_union(a, connected_sum(b, c))
    assert parse_diagram("3_1 # 4_1 + 5_1") == disjoint_union(connected_sum(a, b), c)
    assert parse_diagram("3_1 # 4_1 # 5_1") == connected_sum(connected_sum(a, b), c)
    assert parse_diagram("3_1 # (4_1 # 5_1)") == connected_sum(a, connected_sum(b, c))
    assert parse_diagram("(3_1 + 4_1) # 5_1") == connected_sum(disjoint_union(a, b), c)
    assert parse_diagram("3_1 + 4_1 + 5_1") == disjoint_union(disjoint_union(a, b), c)


def test_line_breaks_and_blanks():
    text = "mirror(\n  3_1\n)\t#\n torus(2, 5)"
    assert parse_diagram(text) == connected_sum(mirror(from_table("3_1")), torus_link(2, 5))


def test_square_knot_is_amphichiral_in_jones():
    d = parse_diagram("3_1 # mirror(3_1)")
    assert d.writhe() == 0 and d.crossing_count() == 6
    # common practice, no source: V(K # mirror K)(t) = V(K)(t) V(K)(1/t) is symmetric under t -> 1/t
    assert jones_polynomial(d) == jones_polynomial(d).substitute_power(-1)


def test_the_reference_page_examples_read():
    page = (ROOT / "grammar" / "README.md").read_text(encoding="utf-8")
    section = page.split("## Writing a diagram", 1)[1].split("## Writing a movie", 1)[0]
    rows = [line for line in section.splitlines() if line.startswith("| `")]
    written = [snippet for row in rows for snippet in re.findall(r"`([^`]+)`", row.split("|")[1])]
    concrete = [s for s in written if not re.search(r"\b[XY]\b|\.\.\.", s)]
    assert len(concrete) >= 15
    for snippet in concrete:
        read = read_spec(snippet)
        if isinstance(read, type(unknot())):
            assert parse_diagram(snippet) == read, snippet
        else:  # a link in a connected sum of S^1 x S^2
            assert parse_handle_diagram(snippet).gates, snippet
    # the page's claim about names in a union
    d = parse_diagram("3_1 + 4_1")
    assert d.edges() == list(range(1, 15)) and sorted(d.crossings) == [1, 2, 3, 4, 5, 6, 7]
    assert set(d.components[2]) == set(range(7, 15))


def test_the_grammar_is_package_data():
    assert diagram_grammar() == (ROOT / "grammar" / "diagram.lark").read_text(encoding="utf-8")
    assert (ROOT / "grammar" / "__init__.py").exists()
    assert diagram_parser() is diagram_parser()


# ----------------------------------------------------------------------------- syntax errors
@pytest.mark.parametrize(
    "text, column, words",
    [
        ("3_1 4_1", 5, "two diagrams in a row need '+'"),
        ("mirror(3_1 unknot)", 12, "two diagrams in a row"),
        ("braid[1, 2", 6, "'[' is never closed"),
        ("torus(2, 3", 6, "'(' is never closed"),
        ("mirror((3_1 + 4_1)", 7, "'(' is never closed"),
        ("braid(3]", 8, "']' does not close the '(' at line 1, column 6"),
        ("3_1 )", 5, "')' closes nothing that was opened"),
        ("3_1 +", 6, "unexpected end of text: a diagram must follow '+' or '#'"),
        ("3_1 #  ", 6, "a diagram must follow"),
        ("", 1, "write a diagram"),
        ("torus(2)", 8, "unexpected ')': torus takes two integers"),
        ("torus(2 5)", 9, "torus takes two integers"),
        ("unlink", 7, "unlink takes the number of circles"),
        ("braid 1 2", 7, "a braid word is a list of nonzero integers in square brackets"),
        ("braid[1, x]", 10, "a braid word is a list"),
        ("pd[[1,2,3,4] [5,6,7,8]]", 14, "a PD code is a list of crossings"),
        ("mirror 3_1", 8, "mirror takes one diagram in parentheses"),
        ("reverse(3_1, )", 14, "reverse takes a diagram"),
        ("3_1 #(1) 4_1", 8, "where two diagrams meet is given by two integers"),
        ("3_1 $ 4_1", 5, "unexpected character '$'; expected '#', '+', 'with' or the end of the text"),
        ("reverse(3_1 1)", 13, "unexpected '1'; expected '#', ')', '+', ',' or 'with'"),
        ("3_1 , 4_1", 5, "unexpected ','; expected '#', '+', 'with' or the end of the text"),
        ("mirorr(3_1)", 1, "'mirorr' is not a word of the notation; did you mean mirror?"),
        ("Unknot", 1, "did you mean unknot?"),
        ("trefoil", 1, "the words are unknot, empty, unlink"),
    ],
)
def test_syntax_errors(text, column, words):
    err = error_of(text)
    assert isinstance(err, SpecSyntaxError) and isinstance(err, InputError)
    assert words in str(err)
    assert err.line == 1 and err.column == column
    assert caret_column(err) == column
    assert str(err).endswith(f"(line 1, column {column})")


def test_error_on_a_later_line_shows_that_line():
    err = error_of("3_1 #\n  4_1\n  5_1 + ")
    assert isinstance(err, SpecSyntaxError)
    assert (err.line, err.column) == (3, 3)
    assert err.context() == "  5_1 + \n  ^"
    late = error_of("unknot +\n\tbraid(2)[1, 1, 0]")
    assert (late.line, late.column) == (2, 17)
    assert late.context() == "\tbraid(2)[1, 1, 0]\n\t               ^"


def test_long_lines_are_cut_around_the_spot():
    text = "3_1 # " * 30 + "4_1 4_1"
    err = error_of(text)
    shown, caret = err.context(span=10).split("\n")
    assert shown == "3_1 # 4_1 4_1" and caret == " " * 10 + "^"


def test_every_example_of_a_mistake_gives_its_hint():
    for label, examples in _EXAMPLES.items():
        for example in examples:
            err = error_of(example)
            assert isinstance(err, SpecSyntaxError) and label in err.reason, (example, err)


# ----------------------------------------------------------------------------- other errors
def test_unknown_table_names():
    err = error_of("3_1 # 3_12")
    assert isinstance(err, SpecTableError) and isinstance(err, TableError)
    assert "no knot named '3_12': the table's 3_… run from 3_1 to 3_1" in str(err)
    assert err.column == 7 and caret_column(err) == 7
    glued = error_of("unknot + K3_1x")
    assert isinstance(glued, SpecTableError) and glued.column == 10
    assert "no knot or link named 'K3_1x'" in str(glued) and "did you mean" in str(glued)
    link = error_of("L7a1{5}")
    assert "L7a1 has no orientation {5}; the table lists {0}, {1}" in str(link)
    dt = error_of("5a1")
    assert "in Dowker–Thistlethwaite numbering 5a_1 is the knot 5_2" in str(dt)


def test_braid_errors_point_at_the_generator():
    err = error_of("braid(3)[1, 3]")
    assert isinstance(err, BraidError)
    assert "generator 3 at position 2 of the braid word is out of range" in str(err)
    assert err.column == 13
    zero = error_of("braid[1, -1, 0, 2]")
    assert "generator 0 at position 3" in str(zero) and zero.column == 14
    strands = error_of("braid(0)[]")
    assert "1 or more, not 0" in str(strands) and strands.column == 7


def test_pd_errors():
    short = error_of("pd[[1,5,2,4],[3,1,4],[5,3,6,2]]")
    assert isinstance(short, PDCodeError)
    assert "crossing 2 of the PD code has 3 labels, not 4" in str(short) and short.column == 14
    once = error_of("unknot + pd[[1, 2, 3, 4]]")
    assert "every label must occur exactly twice" in str(once) and once.column == 10
    assert "the PD code is empty" in str(error_of("pd[]"))
    assert "is not planar" in str(error_of("pd[[1,3,2,4],[2,4,1,3]]"))


def test_names_a_diagram_does_not_have():
    edge = error_of("3_1 #(9, 1) 4_1")
    assert isinstance(edge, SpecDiagramError) and isinstance(edge, DiagramError)
    assert "edge 9 is not in the first diagram (edges: [1, 2, 3, 4, 5, 6])" in str(edge)
    assert edge.column == 7
    other = error_of("3_1 #(1, 9) 4_1")
    assert "edge 9 is not in the second diagram (edges: [1, 2, 3, 4, 5, 6, 7, 8])" in str(other)
    assert other.column == 10
    face = error_of("unknot +(3, 1) unknot")
    assert "face 3 is not in the first diagram (faces: [1, 2])" in str(face) and face.column == 10
    component = error_of("reverse(3_1 + unknot, 1, 3)")
    assert "component 3 is not in the diagram (components: [1, 2])" in str(component)
    assert component.column == 26
    hollow = error_of("3_1 # (unknot # empty)")
    assert "the second diagram of the connected sum is empty" in str(hollow) and hollow.column == 17


def test_other_located_errors():
    negative = error_of("unlink(-2)")
    assert isinstance(negative, SpecInputError) and negative.column == 8
    assert "0 or more circles, not -2" in str(negative)
    with pytest.raises(InputError, match="written as text"):
        parse_diagram(["3_1"])


def test_keywords_are_the_grammar_words():
    quoted = set(re.findall(r'"([a-z]+)"', diagram_grammar()))
    assert quoted == set(KEYWORDS)


def test_the_reference_page_errors_are_what_the_reader_says():
    page = (ROOT / "grammar" / "README.md").read_text(encoding="utf-8")
    block = page.split("### When the text is wrong", 1)[1].split("```")[1].strip("\n").split("\n")
    assert len(block) % 3 == 0 and len(block) >= 9
    for message, text, caret in zip(block[0::3], block[1::3], block[2::3]):
        err = error_of(text)
        assert str(err) == message
        assert err.context() == f"{text}\n{caret}"
    for text, words in (("3_12", "the table's 3_… run from 3_1 to 3_1"),
                        ("3_1 #(9, 1) 4_1", "edge 9 is not in the first diagram (edges: [1, 2, 3, 4, 5, 6])")):
        assert words in " ".join(page.split()) and words in str(error_of(text))
