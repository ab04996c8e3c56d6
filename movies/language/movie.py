"""Reading a movie file (the language of ``grammar/movie.lark``) into plain statements.

A movie is one statement per line; ``%`` starts a comment. The statements, in the order a movie
usually has them (the full reference is ``grammar/README.md``, "Writing a movie"):

=================================  =========================================================
``title TEXT``                     a title for the report
``start DIAGRAM``                  the first frame, in the diagram notation
``band E F [in face G]``           a band (saddle) between edges E and F across face G
``R1 add E left|right +|-``        a kink on edge E into the face on that side, with that sign
``R1 remove C [kink E]``           remove the kink at crossing C
``R2 add E over F in face G``      push edge E over edge F across face G
``R2 remove face G``               remove the bigon G
``R3 face G``                      move a strand across the triangle G
``birth [cw] in face G``           a new circle in face G (counterclockwise unless ``cw``)
``death K``                        cap off component K, a crossingless circle
``twist +1|-1 across E F ...``     a full twist on the strands a gate crosses (edges E, F, ... in
                                   order; ``from face G`` where the gate starts, when needed)
``simplify [to TARGET]``           let the checker find Reidemeister moves (TARGET: ``crossingless``,
                                   ``N crossings`` or a diagram)
``isotopic to DIAGRAM``            claim the frame is isotopic to DIAGRAM; go on from DIAGRAM
``expect ...``                     a checkpoint: ``components N``, ``crossings N``, ``crossingless``,
                                   ``unlink``, ``isotopic to DIAGRAM``, ``signature N``,
                                   ``writhe N``, ``determinant N``, ``jones POLY``, ``alexander POLY``
``surface FACT, ...``              claims about the surface: ``disk``, ``connected``, ``ribbon``,
                                   ``orientable``, ``genus N``, ``euler N``, ``components N``
``budget N seconds``               time allowed to each later search
=================================  =========================================================

Moves may end with ``new edges 20 21, faces 7`` to choose the names of what they create.

>>> movie = parse_movie('''title demo
... start unknot
... R1 add 1 left +
... R1 remove 1
... death 1
... surface disk''')
>>> [s.kind for s in movie.steps], movie.claims[0].args
(['R1+', 'R1-', 'death'], {'facts': [('disk', None)]})
>>> movie.steps[0].record
MoveRecord('R1+', edge=1, hand='L', sign=1)
"""

from __future__ import annotations

import difflib
import functools
import re
from dataclasses import dataclass, field
from typing import Any

from lark import Lark, Token, Transformer, v_args
from lark.exceptions import UnexpectedCharacters, UnexpectedEOF, UnexpectedInput, UnexpectedToken, VisitError

from movies import limits
from movies.algebra.laurent import LaurentPolynomial
from movies.diagram.model import Diagram
from movies.diagram.moves import NewNames
from movies.diagram.steps import MoveRecord
from movies.errors import (
    InputError,
    InternalError,
    LimitError,
    LocatedError,
    LocatedLimitError,
    MoveError,
    MovieInputError,
    MovieSyntaxError,
    MoviesError,
)
from movies.language.frontend import Lines, check_digits, grammar_text, read_int
from movies.diagram.handles import HandleDiagram
from movies.language.spec import parse_diagram, read_spec

__all__ = ["Statement", "Movie", "MovieSyntaxError", "MovieInputError", "parse_movie", "STATEMENT_WORDS"]

#: the words a statement can start with
STATEMENT_WORDS = (
    "title", "start", "band", "R1", "R2", "R3", "birth", "death", "cap", "slide", "pull", "push", "twist",
    "simplify", "isotopic",
    "expect", "surface", "budget", "in",
)

#: statements that change the frame
MOVE_KINDS = ("band", "R1+", "R1-", "R2+", "R2-", "R3", "birth", "death", "cap", "slide", "pull", "push", "twist",
              "simplify", "isotopic")
#: the 4-manifolds a movie with handles may say its surface lives in (``in MANIFOLD``)
MANIFOLDS = {"S1xB3": "S^1 x B^3", "B2xS2": "B^2 x S^2", "MxI": "M x I"}


@dataclass(frozen=True)
class Statement:
    """One statement of a movie, as plain data.

    ``kind`` is one of ``title start band R1+ R1- R2+ R2- R3 birth death twist simplify
    isotopic expect surface budget``; a move (``band`` to ``twist``) carries its
    :class:`~movies.diagram.steps.MoveRecord` in ``record``, every other statement its
    arguments in ``args`` (diagrams already read); ``line`` and ``column`` locate it;
    ``source`` is its line of text.
    """

    kind: str
    line: int
    column: int
    source: str
    args: dict = field(default_factory=dict)
    record: MoveRecord | None = None


@dataclass(frozen=True)
class Movie:
    """A parsed movie: title, first frame, and the statements after it in order."""

    title: str
    start: Diagram
    start_statement: Statement
    statements: tuple[Statement, ...]
    text: str
    #: the first frame's handles (a link in #ʳ S¹×S²), or None for a movie in S³
    handles: HandleDiagram | None = None
    #: where a movie with handles says its surface lives: a key of :data:`MANIFOLDS`, or None
    lives: str | None = None

    @property
    def steps(self) -> list[Statement]:
        """The statements that change the frame."""
        return [s for s in self.statements if s.kind in MOVE_KINDS]

    @property
    def claims(self) -> list[Statement]:
        """The ``surface`` statements."""
        return [s for s in self.statements if s.kind == "surface"]


# ---------------------------------------------------------------------- the grammar


def movie_grammar() -> str:
    """The text of ``movie.lark`` (from the installed package, or the checkout's grammar folder).

    >>> movie_grammar().startswith("// A movie: one statement per line.")
    True
    """
    return grammar_text("movie.lark")


@functools.lru_cache(maxsize=1)
def movie_parser() -> Lark:
    """The LALR parser of the movie language, built once.

    >>> movie_parser().parse("start unknot\\ndeath 1\\n").children[1].data == "death"
    True
    """
    # cache=True keeps the LALR tables in a temporary file keyed by the grammar (lark's own option): 2-3x faster start
    return Lark(movie_grammar(), parser="lalr", propagate_positions=True, maybe_placeholders=True, cache=True)


# ---------------------------------------------------------------------- friendly syntax errors

# Example mistakes: lark matches the parser state of an error against the state these reach.
_EXAMPLES: dict[str, list[str]] = {
    "write 'R1 add EDGE left|right +|-' to add a kink, or 'R1 remove CROSSING'": [
        "start unknot\nR1 5 left +", "start unknot\nR1 kink 5",
    ],
    "the side of an edge is 'left' or 'right' (or L, R), then the sign + or -": [
        "start unknot\nR1 add 5 +", "start unknot\nR1 add 5 up +",
    ],
    "a kink needs a sign after the side: + or -": ["start unknot\nR1 add 5 left", "start unknot\nR1 add 5 left 1"],
    "write 'R2 add EDGE over EDGE in face FACE' or 'R2 remove face FACE'": [
        "start unknot\nR2 4 over 8", "start unknot\nR2 add 4 8 in face 2", "start unknot\nR2 add 4 under 8 in face 2",
    ],
    "R2 add needs the face the pushed edge crosses: '... in face FACE'": ["start unknot\nR2 add 4 over 8"],
    "name the face: 'face FACE'": [
        "start unknot\nR2 remove 6", "start unknot\nR3 5", "start unknot\nbirth 3", "start unknot\nbirth cw 3",
    ],
    "a band joins two edges: 'band EDGE EDGE [in face FACE]'": ["start unknot\nband 3", "start unknot\nband"],
    "death takes the component that dies: 'death COMPONENT'": ["start unknot\ndeath", "start unknot\ndeath face 2"],
    "a twist is 'twist +1 across EDGE EDGE ... [from face FACE]' (or -1 for a left-handed twist)": [
        "start unknot\ntwist 1 across 3 4", "start unknot\ntwist +2 across 3 4", "start unknot\ntwist +1 3 4",
        "start unknot\ntwist across 3 4", "start unknot\ntwist +1 across", "start unknot\ntwist +1 across 3 4 from 2",
    ],
    "after 'expect': components N, crossings N, crossingless, unlink, isotopic to DIAGRAM, "
    "or signature/writhe/determinant/jones/alexander and a value": [
        "start unknot\nexpect", "start unknot\nexpect genus 1", "start unknot\nexpect knot 3_1",
    ],
    "after 'surface': disk, connected, ribbon, orientable, genus N, euler N or components N, "
    "separated by commas": [
        "start unknot\nsurface", "start unknot\nsurface sphere", "start unknot\nsurface genus",
        "start unknot\nsurface disk genus 0",
    ],
    "the first frame: 'start DIAGRAM', e.g. 'start 3_1 # mirror(3_1)'": ["start"],
    "a budget is a whole number of seconds, 0 or more: 'budget 5 seconds'": [
        "start unknot\nbudget", "start unknot\nbudget -1 seconds", "start unknot\nbudget x seconds",
        "start unknot\nbudget 5 minutes",
    ],
    "one statement per line": ["start unknot\ndeath 1 death 2", "start unknot\nband 1 2 3"],
}


def _position(lines: Lines, err: UnexpectedInput) -> tuple[int, int]:
    line = getattr(err, "line", None)
    column = getattr(err, "column", None)
    if isinstance(line, int) and line > 0:
        return line, column if isinstance(column, int) and column > 0 else 1
    return len(lines), len(lines[len(lines)]) + 1


def _syntax_error(text: str, err: UnexpectedInput) -> MovieSyntaxError:
    lines = Lines(text)
    line, column = _position(lines, err)
    if isinstance(err, UnexpectedEOF):
        return MovieSyntaxError("the movie ends in the middle of a statement", text, line, column)
    hint = None
    try:
        hint = err.match_examples(movie_parser().parse, _EXAMPLES, use_accepts=False)
    except Exception:  # pragma: no cover - a failure of the hint machinery must not hide the error
        hint = None
    row = lines[line]
    if isinstance(err, UnexpectedCharacters):
        got = row[column - 1: column + 11].split(" ")[0] or repr(err.char)
    else:
        token = err.token if isinstance(err, UnexpectedToken) else None
        shown = str(token).split()[0] if token is not None and str(token).split() else str(token)
        got = "the end of the line" if token is not None and token.type in ("_NL", "$END") else f"'{shown}'"
    first_word = row.strip().split(" ")[0] if row.strip() else ""
    if column == len(row) - len(row.lstrip()) + 1 and first_word not in STATEMENT_WORDS:
        close = difflib.get_close_matches(first_word[:40], STATEMENT_WORDS, n=1)
        shown_word = first_word if len(first_word) <= 40 else first_word[:40] + "…"
        reason = f"no statement starts with '{shown_word}'"
        reason += f"; did you mean '{close[0]}'?" if close else f"; statements start with {', '.join(STATEMENT_WORDS)}"
        return MovieSyntaxError(reason, text, line, column)
    reason = f"unexpected {got}"
    if hint:
        reason += f": {hint}"
    return MovieSyntaxError(reason, text, line, column)


# ---------------------------------------------------------------------- from the tree to statements


class _Reader(Transformer):
    """Builds one :class:`Statement` per line of the parse tree, one method per grammar rule.

    Move lines become :class:`~movies.diagram.steps.MoveRecord` records (the step vocabulary the
    checker, the search and the report share); the small rules (``in_face``, ``new_names``,
    ``gate_edges``, the facts of a claim) become plain values first, bottom up. Every number is
    checked against the digits limit; the text's lines are split once.
    """

    def __init__(self, text: str) -> None:
        super().__init__(visit_tokens=False)
        self.text = text
        self.lines = Lines(text)

    # ------------------------------------------------------------ values
    def number(self, token: Token) -> int:
        return read_int(token, self.text)

    def diagram(self, token: Token, handles: bool = False) -> Diagram:
        """Read the diagram notation in ``token``; its errors point into the movie file.

        With ``handles`` a diagram with handles is read too (as a :class:`HandleDiagram`).
        """
        source = str(token).rstrip()
        try:
            return read_spec(source) if handles else parse_diagram(source)
        except LocatedError as err:
            line = token.line + err.line - 1
            column = (token.column + err.column - 1) if err.line == 1 else err.column
            raise err.moved(self.text, line, column) from None
        except InternalError:
            raise
        except MoviesError as err:
            raise MovieInputError(str(err), self.text, token.line, token.column) from None

    def digits_in(self, token: Token) -> None:
        """Refuse a number inside free text (a polynomial, a value) that has too many digits."""
        for run in re.finditer(r"[0-9]+", str(token)):
            check_digits(run.group(), self.text, token.line, token.column + run.start())

    def polynomial(self, token: Token, variable: str = "t") -> LaurentPolynomial:
        self.digits_in(token)
        try:
            return LaurentPolynomial.parse(str(token).strip(), variable=variable)
        except (ValueError, ArithmeticError) as err:  # the polynomial reader's own errors; say where
            raise MovieInputError(f"cannot read the polynomial '{str(token).strip()}': {err}",
                                  self.text, token.line, token.column) from None

    def _statement(self, meta, kind: str, **args) -> Statement:
        return Statement(kind, meta.line, meta.column, self.lines[meta.line], args)

    def _move(self, meta, kind: str, **fields) -> Statement:
        try:
            record = MoveRecord(kind, **fields)
        except MoveError as err:  # pragma: no cover - the grammar gives every move its fields
            raise InternalError(f"the reader built a {kind} move it cannot record: {err}") from err
        return Statement(kind, meta.line, meta.column, self.lines[meta.line], {}, record)

    # ------------------------------------------------------------ small rules
    def in_face(self, children) -> int:
        return self.number(children[0])

    def gate_start(self, children) -> int:
        return self.number(children[0])

    def gate_edges(self, children) -> tuple[int, ...]:
        return tuple(self.number(token) for token in children)

    def name_group(self, children) -> tuple[str, tuple[int, ...]]:
        return str(children[0]).rstrip("s") + "s", tuple(self.number(token) for token in children[1:])

    def new_names(self, children) -> NewNames:
        chosen: dict[str, list[int]] = {}
        for kind, values in children:
            chosen.setdefault(kind, []).extend(values)
        return NewNames(**{kind: tuple(values) for kind, values in chosen.items()})

    def disk(self, children):
        return ("disk", None)

    def connected(self, children):
        return ("connected", None)

    def ribbon(self, children):
        return ("ribbon", None)

    def orientable(self, children):
        return ("orientable", None)

    def genus(self, children):
        return ("genus", self.number(children[0]))

    def euler(self, children):
        return ("euler", self.number(children[0]))

    def surface_components(self, children):
        return ("components", self.number(children[0]))

    # ------------------------------------------------------------ moves
    @v_args(meta=True)
    def band(self, meta, c):
        path = tuple(x for x in c[2:-4])
        return self._move(meta, "band", first=self.number(c[0]), second=self.number(c[1]), face=c[-3], names=c[-2],
                          path=path or None, twists=c[-4], leaving=c[-1])

    def leaving(self, children) -> tuple[tuple[int, tuple[int, ...]], ...]:
        return tuple(children)

    def gate_after(self, children) -> tuple[int, tuple[int, ...]]:
        return self.number(children[0]), tuple(self.number(token) for token in children[1:])

    def band_twists(self, children) -> int | None:
        value = self.number(children[0])
        if value == 0:
            return None
        return value

    def over_edge(self, children):
        return (self.number(children[0]), True)

    def under_edge(self, children):
        return (self.number(children[0]), False)

    @v_args(meta=True)
    def r1_add(self, meta, c):
        return self._move(meta, "R1+", edge=self.number(c[0]), hand="L" if str(c[1]) in ("left", "L") else "R",
                          sign=+1 if str(c[2]) == "+" else -1, names=c[3])

    @v_args(meta=True)
    def r1_remove(self, meta, c):
        return self._move(meta, "R1-", crossing=self.number(c[0]), kink=None if c[1] is None else self.number(c[1]))

    @v_args(meta=True)
    def r2_add(self, meta, c):
        return self._move(meta, "R2+", over=self.number(c[0]), under=self.number(c[1]), face=c[2], names=c[3])

    @v_args(meta=True)
    def r2_remove(self, meta, c):
        return self._move(meta, "R2-", face=c[0])

    @v_args(meta=True)
    def r3(self, meta, c):
        return self._move(meta, "R3", face=c[0], names=c[1])

    @v_args(meta=True)
    def birth(self, meta, c):
        return self._move(meta, "birth", face=c[1], counterclockwise=c[0] is None or str(c[0]) == "ccw", names=c[2])

    @v_args(meta=True)
    def death(self, meta, c):
        return self._move(meta, "death", component=self.number(c[0]))

    @v_args(meta=True)
    def cap(self, meta, c):
        return self._move(meta, "cap", component=self.number(c[0]))

    @v_args(meta=True)
    def slide(self, meta, c):
        return self._move(meta, "slide", handle=self.number(c[0]), crossing=self.number(c[1]))

    @v_args(meta=True)
    def slide_strand(self, meta, c):
        return self._move(meta, "slide", handle=self.number(c[0]), crossings=tuple(self.number(t) for t in c[1:]))

    @v_args(meta=True)
    def pull(self, meta, c):
        return self._move(meta, "pull", handle=self.number(c[1]), edge=self.number(c[0]))

    @v_args(meta=True)
    def push(self, meta, c):
        return self._move(meta, "push", handle=self.number(c[1]), edge=self.number(c[0]), face=c[2])

    @v_args(meta=True)
    def lives(self, meta, c):
        return self._statement(meta, "lives", manifold=str(c[0]))

    @v_args(meta=True)
    def twist(self, meta, c):
        return self._move(meta, "twist", edges=c[1], turns=+1 if str(c[0]) == "+1" else -1, start_face=c[2],
                          names=c[3])

    # ------------------------------------------------------------ the other statements
    @v_args(meta=True)
    def title(self, meta, c):
        return self._statement(meta, "title", text=str(c[0]).strip() if c and c[0] is not None else "")

    @v_args(meta=True)
    def first(self, meta, c):
        read = self.diagram(c[0], handles=True)
        if isinstance(read, HandleDiagram):
            return self._statement(meta, "start", diagram=read.diagram, handles=read, spec=str(c[0]).strip())
        return self._statement(meta, "start", diagram=read, handles=None, spec=str(c[0]).strip())

    @v_args(meta=True)
    def simplify(self, meta, c):
        return self._statement(meta, "simplify", **self.target(c[0]))

    @v_args(meta=True)
    def isotopic(self, meta, c):
        read = self.diagram(c[0], handles=True)
        if isinstance(read, HandleDiagram):
            return self._statement(meta, "isotopic", diagram=read.diagram, handles=read, spec=str(c[0]).strip())
        return self._statement(meta, "isotopic", diagram=read, handles=None, spec=str(c[0]).strip())

    @v_args(meta=True)
    def claim(self, meta, c):
        return self._statement(meta, "surface", facts=list(c))

    @v_args(meta=True)
    def budget(self, meta, c):
        token = c[0]
        seconds = self.number(token)
        try:
            limits.check("seconds", seconds, f"budget {seconds} seconds would let one search run {seconds} seconds")
        except LimitError as err:
            raise LocatedLimitError(str(err), self.text, token.line, token.column, "seconds") from None
        return self._statement(meta, "budget", seconds=seconds)

    @v_args(meta=True)
    def expect_components(self, meta, c):
        return self._statement(meta, "expect", what="components", value=self.number(c[0]))

    @v_args(meta=True)
    def expect_crossings(self, meta, c):
        return self._statement(meta, "expect", what="crossings", value=self.number(c[0]))

    @v_args(meta=True)
    def expect_crossingless(self, meta, c):
        return self._statement(meta, "expect", what="crossingless")

    @v_args(meta=True)
    def expect_unlink(self, meta, c):
        return self._statement(meta, "expect", what="unlink")

    @v_args(meta=True)
    def expect_isotopic(self, meta, c):
        return self._statement(meta, "expect", what="isotopic", diagram=self.diagram(c[0]), spec=str(c[0]).strip())

    @v_args(meta=True)
    def expect_value(self, meta, c):
        invariant, value = str(c[0]), c[1]
        if invariant in ("jones", "alexander"):
            return self._statement(meta, "expect", what=invariant, value=self.polynomial(value))
        words = str(value).strip()
        if not re.fullmatch(r"[+-]?[0-9]+", words):
            raise MovieInputError(f"the {invariant} is an integer, not '{words}'", self.text, value.line, value.column)
        self.digits_in(value)
        return self._statement(meta, "expect", what=invariant, value=int(words))

    def target(self, token: Token | None) -> dict[str, Any]:
        if token is None:
            return {"target": "fewest"}
        words = str(token).split()
        if words == ["crossingless"]:
            return {"target": "crossingless"}
        if len(words) == 2 and re.fullmatch(r"[0-9]+", words[0]) and words[1] in ("crossings", "crossing"):
            self.digits_in(token)
            return {"target": "crossings", "crossings": int(words[0])}
        return {"target": "diagram", "diagram": self.diagram(token), "spec": str(token).strip()}

    def __default__(self, data, children, meta):  # pragma: no cover - every rule has its method
        raise InternalError(f"a statement the reader does not know: {data}")


def parse_movie(text: str) -> Movie:
    """Read a movie file.

    Parameters
    ----------
    text : str
        The whole file.

    Returns
    -------
    Movie
        Title, first frame and statements, every diagram already read.

    Raises
    ------
    MovieSyntaxError
        Text the language cannot read: line, column, and ``context()`` with a caret.
    LocatedLimitError
        Text past a limit of :mod:`movies.limits` (lines of the movie, digits of a number, the
        limits of each diagram), refused before the statements are read.

    Reading takes time in proportion to the length of the text (and the diagrams in it).

    >>> parse_movie("start 3_1\\nbnad 2 3")
    Traceback (most recent call last):
    ...
    movies.errors.MovieSyntaxError: no statement starts with 'bnad'; did you mean 'band'? (line 2, column 1)
    """
    if not isinstance(text, str):
        raise InputError(f"a movie is written as text, not {type(text).__name__}")
    count = text.count("\n") + 1
    most = limits.current()["lines"]
    if count > most:
        raise LocatedLimitError(limits.exceeds("lines", f"the movie has {count} lines"), text, most + 1, 1, "lines")
    try:
        tree = movie_parser().parse(text if text.endswith("\n") else text + "\n")
    except UnexpectedInput as err:
        raise _syntax_error(text, err) from None
    reader = _Reader(text)
    try:
        statements = [reader.transform(child) for child in tree.children]
    except VisitError as err:  # lark wraps what a rule's method raises; ours are the errors to show
        raise err.orig_exc from None
    starts = [s for s in statements if s.kind == "start"]
    if not starts:
        raise MovieSyntaxError("the movie has no first frame: write 'start DIAGRAM' before the first step", text, 1, 1)
    first = starts[0]
    if len(starts) > 1:
        again = starts[1]
        raise MovieSyntaxError("a movie has one 'start'; use 'isotopic to DIAGRAM' to go on from a new diagram", text, again.line, again.column)
    early = [s for s in statements if s.kind in MOVE_KINDS + ("expect",) and (s.line < first.line)]
    if early:
        raise MovieSyntaxError("this step comes before the first frame ('start DIAGRAM')", text, early[0].line, early[0].column)
    titles = [s.args["text"] for s in statements if s.kind == "title"]
    places = [s for s in statements if s.kind == "lives"]
    if len(places) > 1:
        raise MovieSyntaxError("a movie says once where its surface lives ('in S1xB3', 'in B2xS2' or 'in MxI')",
                               text, places[1].line, places[1].column)
    if places and first.args["handles"] is None:
        raise MovieSyntaxError("'in MANIFOLD' is for a movie with handles (a first frame 'DIAGRAM with handle across "
                               "...'); a movie in S^3 needs no such line", text, places[0].line, places[0].column)
    rest = tuple(s for s in statements if s.kind not in ("start", "title", "lives"))
    return Movie(titles[0] if titles else "", first.args["diagram"], first, rest, text, first.args["handles"],
                 places[0].args["manifold"] if places else None)
