"""Reading a diagram written in one line of text, the notation of ``grammar/diagram.lark``.

The notation (``grammar/README.md``, "Writing a diagram", has the full reference):

================================  ============================================================
``3_1``, ``11n_34``, ``L7a1{0}``  a knot or oriented link from the tables, by name
``unknot``, ``unlink(3)``         one crossingless circle, n circles side by side
``empty``                         the empty diagram (no components)
``braid[1, 1, -2]``               the closure of a braid (strands: largest generator + 1)
``braid(4)[1, 2]``                the same with the number of strands given
``torus(2, 5)``                   the torus link T(2, 5)
``pd[[1,5,2,4],...]``             a PD code; ``pd{{4, 1, 3, 2}, ...}`` also reads
``mirror(X)``                     the mirror image
``reverse(X)``, ``reverse(X, 2)`` every component, or the listed ones, reversed
``X # Y``, ``X #(3, 5) Y``        connected sum, at the smallest edges or at edges 3 of X, 5 of Y
``X + Y``, ``X +(2, 1) Y``        disjoint union, side by side or Y's face 1 opening onto X's face 2
``( ... )``                       grouping; ``#`` binds tighter than ``+``
================================  ============================================================

Errors carry the line and column of the spot: :class:`SpecSyntaxError` for text the grammar
cannot read (or a word it does not know), located versions of the constructors' errors
(:class:`SpecTableError` for an unknown table name, ...) for text that reads but names something
that does not exist, and :class:`LocatedLimitError` for text past a limit of
:mod:`movies.limits` (all classes of :mod:`movies.errors`). Each has ``context()``, the
offending line with a caret under the spot. Reading takes time in proportion to the text: the
tree is built and walked without recursion, and nesting is bounded by the ``depth`` limit.

>>> parse_diagram("3_1 # mirror(3_1)").writhe()
0
>>> parse_diagram("torus(2, 5) + unknot").component_count()
2
>>> try:
...     parse_diagram("braid[1, 2")
... except SpecSyntaxError as err:
...     print(err)
...     print(err.context())
'[' is never closed (line 1, column 6)
braid[1, 2
     ^
"""

from __future__ import annotations

import difflib
import functools
import math
import re

from lark import Lark, Token, Tree
from lark.exceptions import UnexpectedCharacters, UnexpectedEOF, UnexpectedInput, UnexpectedToken

from movies import limits
from movies.diagram import constructors
from movies.diagram.handles import HandleDiagram, closed_braid, fibers, handle_diagram, regated, twisted
from movies.diagram.model import Diagram
from movies.diagram.pd import from_pd
from movies.diagram.tables import canonical_name, lookup
from movies.errors import (
    BraidError,
    GeneratorError,
    InputError,
    InternalError,
    LimitError,
    Located,
    LocatedError,
    LocatedLimitError,
    MoviesError,
    SpecBraidError,
    SpecDiagramError,
    SpecInputError,
    SpecPDCodeError,
    SpecSyntaxError,
    SpecTableError,
    TableError,
    located,
)
from movies.language.frontend import check_digits, check_nesting, depth_message, grammar_text, position, read_int

__all__ = [
    "Located",
    "LocatedError",
    "LocatedLimitError",
    "SpecSyntaxError",
    "SpecInputError",
    "SpecTableError",
    "SpecBraidError",
    "SpecPDCodeError",
    "SpecDiagramError",
    "KEYWORDS",
    "diagram_grammar",
    "diagram_parser",
    "parse_diagram",
    "parse_handle_diagram",
    "read_spec",
]

#: the words of the notation
KEYWORDS = ("unknot", "empty", "unlink", "braid", "torus", "pd", "mirror", "reverse", "twisted", "with", "handle",
            "across", "and", "from", "face", "fibers", "axis")


# ---------------------------------------------------------------------- the parser


def diagram_grammar() -> str:
    """The text of the grammar, read from the installed package data ``movies.grammar``.

    >>> diagram_grammar().count("-> connected_sum")
    1
    """
    return grammar_text("diagram.lark")


@functools.cache
def diagram_parser() -> Lark:
    """The LALR parser of the notation, built once.

    >>> diagram_parser().parse("unknot").children[0].data
    'unknot'
    """
    # cache=True keeps the LALR tables in a temporary file keyed by the grammar (lark's own option): 2-3x faster start
    return Lark(diagram_grammar(), parser="lalr", propagate_positions=True, maybe_placeholders=True, cache=True)


def parse_diagram(text: str) -> Diagram:
    """The diagram that ``text`` describes.

    Parameters: ``text``, one diagram in the notation of the module docstring (line breaks
    allowed). Returns a new :class:`~movies.diagram.model.Diagram`. Raises
    :class:`SpecSyntaxError` for text that does not read, the located errors
    (:class:`SpecTableError`, :class:`SpecBraidError`, :class:`SpecPDCodeError`,
    :class:`SpecDiagramError`, :class:`SpecInputError`) for text that reads but names what
    does not exist, and :class:`LocatedLimitError` for text past a limit of
    :mod:`movies.limits` (checked before the diagram is built); all carry ``line``, ``column``
    and ``context()``.

    >>> parse_diagram("braid(3)[1, -2, 1, -2]").crossing_count()
    4
    >>> parse_diagram("3_99")
    Traceback (most recent call last):
    ...
    movies.errors.SpecTableError: no knot named '3_99': the table's 3_… run from 3_1 to 3_1 (line 1, column 1)
    >>> parse_diagram("torus(2, 1000000000)")
    Traceback (most recent call last):
    ...
    movies.errors.LocatedLimitError: torus(2, 1000000000) would have 1000000000 crossings; the limit is 2000 (raise it with --limit crossings=N) (line 1, column 1)
    """
    if not isinstance(text, str):
        raise InputError(f"a diagram is written as text, not {type(text).__name__}")
    result = _read(text)
    if isinstance(result, HandleDiagram):
        raise SpecDiagramError("a diagram with handles is a link in a connected sum of S^1 x S^2; where a "
                               "link in S^3 is wanted, write twisted(DIAGRAM with handle ..., k)", text, 1, 1)
    return result


def parse_handle_diagram(text: str) -> HandleDiagram:
    """The link in #ʳ S¹×S² that ``text`` describes: a diagram ``with handle across E1 E2 ...``.

    Each handle is a gate, as a twist step's: the edges it crosses in order, and ``from face F``
    where it starts when both sides of the first edge would do; more handles are joined by
    ``and``. Raises the errors of :func:`parse_diagram`, and a :class:`SpecDiagramError` for a
    diagram without handles or gates that do not fit (naming the handle and the reason).

    >>> h = parse_handle_diagram("unlink(2) with handle across 1 2")
    >>> h.homology_class(), h.null_homologous()
    ((0,), True)
    >>> parse_diagram("twisted(unlink(2) with handle across 1 2, 1)").crossing_count()
    2
    """
    if not isinstance(text, str):
        raise InputError(f"a diagram is written as text, not {type(text).__name__}")
    result = _read(text)
    if not isinstance(result, HandleDiagram):
        raise SpecDiagramError("this diagram has no handles: write DIAGRAM with handle across E1 E2 ...", text, 1, 1)
    return result


def read_spec(text: str) -> Diagram | HandleDiagram:
    """The diagram, or the diagram with handles, that ``text`` describes (for readers of both).

    >>> type(read_spec("3_1")).__name__, type(read_spec("unlink(2) with handle across 1 2")).__name__
    ('Diagram', 'HandleDiagram')
    """
    if not isinstance(text, str):
        raise InputError(f"a diagram is written as text, not {type(text).__name__}")
    return _read(text)


def _read(text: str):
    """The diagram or handle diagram ``text`` describes, every limit checked before it is built."""
    check_nesting(text)
    try:
        tree = diagram_parser().parse(text)
    except UnexpectedInput as err:
        raise _syntax_error(text, err) from None
    root = tree.children[0]
    _check_tree(text, root)
    _check_sizes(text, root)
    return _Builder(text).build(root)


#: how an error names the kind of node a diagram with handles cannot be part of
_ROLE = {"union": "a disjoint union", "connected_sum": "a connected sum", "mirror": "mirror(...)",
         "reverse": "reverse(...)", "with_handles": "another list of handles"}

#: what counts as one level of nesting, beside brackets
_LEVELS = " (each '#', '+', mirror, reverse, twisted and a list of handles is one level)"
#: the parts of the tree that hold diagrams, by the kind of node
_PARTS = {"mirror": (0,), "reverse": (0,), "union": (0, 2), "connected_sum": (0, 2), "with_handles": (0,),
          "twisted": (0,), "axis": (0,)}


def _check_tree(text: str, root) -> None:
    """Before anything is built: every number within the digits limit, and diagrams made of
    diagrams (``#``, ``+``, mirror, reverse) nested no deeper than the depth limit."""
    deepest = limits.current()["depth"]
    stack = [(root, 0)]
    while stack:
        node, depth = stack.pop()
        if isinstance(node, Token):
            if node.type == "INT":
                check_digits(str(node), text, node.line, node.column)
            elif node.type == "TABLE_NAME":
                for run in re.finditer(r"[0-9]+", str(node)):
                    line, column = position(str(node), run.start())
                    check_digits(run.group(), text, node.line + line - 1,
                                 column + (node.column - 1 if line == 1 else 0))
            continue
        if node is None:
            continue
        if node.data in _PARTS:
            depth += 1
            if depth > deepest:
                raise LocatedLimitError(depth_message(depth, "diagrams", _LEVELS),
                                        text, node.meta.line, node.meta.column, "depth")
        stack.extend((child, depth) for child in node.children)


def _post_order(root):
    """The diagram nodes of the tree, each after the diagrams it is made of (no recursion)."""
    order, stack = [], [root]
    while stack:
        node = stack.pop()
        order.append(node)
        stack.extend(node.children[i] for i in _PARTS.get(node.data, ()))
    return reversed(order)


def _leaf_size(node) -> tuple[int, int]:
    """Crossings and components of a diagram that is not made of others, read off the text
    without building it (0 where that is not cheap: the constructors check those themselves)."""
    kind, children = node.data, node.children
    try:
        if kind == "table":
            entry = lookup(str(children[0]))
            return len(entry.pd), entry.components
        if kind == "unknot":
            return 0, 1
        if kind == "unlink":
            return 0, max(0, int(children[0]))
        if kind == "torus":
            p, q = int(children[0]), int(children[1])
            p, q = (-p, -q) if p < 0 else (p, q)
            return ((0, abs(q)) if p == 0 else ((p - 1) * abs(q), math.gcd(p, q) if q else p))
        if kind == "braid":
            return len(children[1].children), 0
        if kind == "pd":
            return len(children[0].children), 0
    except InternalError:
        raise
    except (MoviesError, ValueError):  # the builder reports what is wrong with it, where it is
        pass
    return 0, 0


def _bundles(node) -> list[int]:
    """How many strands pass through each handle of a diagram-with-handles node, read off the text."""
    try:
        if node.data == "with_handles":
            return [0 if h.data == "free_handle" else
                    len([t for t in h.children if isinstance(t, Token)]) - (h.children[-1] is not None)
                    for h in node.children[1:]]
        if node.data == "fibers":
            return [abs(int(node.children[0])) + abs(int(node.children[1]))]
        if node.data == "axis" and node.children[0].data == "braid":
            strands, word = node.children[0].children
            count = int(strands.children[0]) if strands is not None else max((abs(int(g)) for g in word.children),
                                                                              default=0) + 1
            return [count]
    except ValueError:  # the builder reports what is wrong, where it is
        pass
    return []


def _check_sizes(text: str, root) -> None:
    """Refuse a union or connected sum past the crossing or component limit before any of its
    parts is built: their sizes add up."""
    sizes: dict[int, tuple[int, int]] = {}
    for node in _post_order(root):
        parts = [sizes.pop(id(node.children[i])) for i in _PARTS.get(node.data, ())]
        if node.data in ("union", "connected_sum"):
            (c1, k1), (c2, k2) = parts
            size = (c1 + c2, k1 + k2 - (node.data == "connected_sum" and k1 > 0 and k2 > 0))
            what = "disjoint union" if node.data == "union" else "connected sum"
            for name, value in zip(("crossings", "components"), size):
                if value > limits.current()[name]:
                    raise LocatedLimitError(limits.exceeds(name, f"the {what} would have {value} {name}"),
                                            text, node.meta.line, node.meta.column, name)
        elif node.data == "twisted":
            (crossings, components), = parts
            inner, turns = node.children[0], node.children[1:]
            bundles = _bundles(inner)
            amounts = [abs(int(t)) for t in turns] * (len(bundles) if len(turns) == 1 else 1)
            size = (crossings + sum(k * n * (n - 1) for k, n in zip(amounts, bundles)), components)
            if size[0] > limits.current()["crossings"]:
                raise LocatedLimitError(limits.exceeds("crossings", f"twisted(...) would have {size[0]} crossings"),
                                        text, node.meta.line, node.meta.column, "crossings")
        else:
            size = parts[0] if parts else _leaf_size(node)
        sizes[id(node)] = size


# ---------------------------------------------------------------------- syntax errors

# Common mistakes, matched by the parser state they fail in (lark's ``match_examples``).
_ATOMS = ("4_1", "unknot", "empty", "unlink(2)", "braid[1]", "braid(3)[1]", "torus(2, 3)",
          "pd[[1,1,2,2]]", "mirror(4_1)", "reverse(4_1)", "reverse(4_1, 1)", "(4_1)")
_TWO_IN_A_ROW = "two diagrams in a row need '+' (disjoint union) or '#' (connected sum) between them"
_EXAMPLES: dict[str, list[str]] = {
    "write a diagram, such as 3_1, unknot, braid[1, 1, 1] or torus(2, 5)":
        ["", "+ 3_1", "# 3_1", ", 3_1", "1"],
    "a diagram must follow '+' or '#'":
        ["3_1 +", "3_1 #", "3_1 + #", "3_1 # +", "3_1 #(1, 2)", "3_1 +(1, 2)", "3_1 # ,", "3_1 # 1"],
    _TWO_IN_A_ROW:
        [f"{before}{atom} {other}{after}" for atom in _ATOMS for other in ("3_1", "unknot", "(3_1)")
         for before, after in (("", ""), ("(", ")"), ("mirror(", ")"), ("reverse(", ")"))],
    "unlink takes the number of circles in parentheses, as in unlink(3)":
        ["unlink", "unlink 3", "unlink()", "unlink(3, 4)", "unlink(a)"],
    "torus takes two integers in parentheses, as in torus(2, 5)":
        ["torus", "torus 2, 5", "torus()", "torus(2)", "torus(2 5)", "torus(2,)", "torus(2, 3, 4)"],
    "a braid word is a list of nonzero integers in square brackets, as in braid[1, -2, 1] "
    "or braid(4)[1, 2] with the number of strands":
        ["braid", "braid 1", "braid(1, 2)", "braid(3)", "braid(3) 1", "braid[1, x]", "braid[1,, 2]",
         "braid()", "braid[a]", "braid(3)(1)"],
    "a PD code is a list of crossings of four labels each, as in pd[[1,5,2,4],[3,1,4,6],[5,3,6,2]]":
        ["pd", "pd 1", "pd[1, 2]", "pd[[1, 2], 3]", "pd[[1, x]]", "pd[[1,2,3,4] [5,6,7,8]]", "pd[[]]",
         "pd[[1,2,3,4],]", "pd{1}", "pd(1)"],
    "mirror takes one diagram in parentheses, as in mirror(3_1)":
        ["mirror", "mirror 3_1", "mirror()", "mirror(3_1, 1)"],
    "reverse takes a diagram and, to reverse only some components, their numbers, "
    "as in reverse(L4a1, 2)":
        ["reverse", "reverse 3_1", "reverse()", "reverse(3_1, )", "reverse(3_1, x)",
         "reverse(3_1, 1 2)"],
    "where two diagrams meet is given by two integers, as in 3_1 #(1, 4) 4_1":
        ["3_1 #(1) 4_1", "3_1 #(1 2) 4_1", "3_1 #(1, ) 4_1", "3_1 #(1, 2, 3) 4_1", "3_1 +(1) 4_1",
         "3_1 +(1 2) 4_1", "3_1 +(1, 2, 3) 4_1", "3_1 #(1, x) 4_1", "3_1 +(1, x) 4_1"],
}

#: characters the notation uses; any other one is reported as it is, without a hint
_ALPHABET = re.compile(r"[A-Za-z0-9_+#,()\[\]{}-]")
_ATOM_STARTS = {"TABLE_NAME", "WORD", "LPAR"} | {word.upper() for word in KEYWORDS}
#: labels that fit only some of the tokens that can fail in their state
_ONLY_BEFORE = {_TWO_IN_A_ROW: _ATOM_STARTS}
_NAME_CHAR = re.compile(r"[A-Za-z0-9_]")
_OPENERS = {"(": ")", "[": "]", "{": "}"}
_CLOSERS = {close: open_ for open_, close in _OPENERS.items()}
_DESCRIPTIONS = {"TABLE_NAME": "a table name", "INT": "an integer", "WORD": "a word", "$END": "the end of the text"}


_position = position


def _end_offset(text: str) -> int:
    """Just after the last character that is not a blank."""
    return len(text.rstrip())


def _bracket_problem(text: str, offset: int, at_end: bool) -> tuple[str, int] | None:
    """A mismatched, unopened or unclosed bracket in ``text[:offset]`` (and at ``offset``).

    Returns the reason and the offset to point at: the closing bracket that is wrong, or the
    opening bracket that the end of the text leaves open.
    """
    stack: list[tuple[str, int]] = []
    for index, char in enumerate(text[:offset + 1]):
        if char in _OPENERS and index < offset:
            stack.append((char, index))
        elif char in _CLOSERS:
            if not stack:
                return f"'{char}' closes nothing that was opened", index
            opener, where = stack[-1]
            if _OPENERS[opener] != char:
                line, column = _position(text, where)
                return f"'{char}' does not close the '{opener}' at line {line}, column {column}", index
            stack.pop()
    if at_end and stack:
        opener, where = stack[-1]
        return f"'{opener}' is never closed", where
    return None


def _describe(names: set[str]) -> str:
    """Readable names for a set of terminal names."""
    parser = diagram_parser()
    names = set(names)
    words = []
    if "TABLE_NAME" in names:
        names -= _ATOM_STARTS
        words.append("a diagram")
    for name in sorted(names):
        if name in _DESCRIPTIONS:
            words.append(_DESCRIPTIONS[name])
        else:
            words.append(f"'{parser.get_terminal(name).pattern.value}'")
    words.sort(key=lambda w: (w == "the end of the text", w))
    if not words:
        return "nothing more"
    if len(words) == 1:
        return words[0]
    return ", ".join(words[:-1]) + " or " + words[-1]


def _unknown_word(word: str) -> str:
    close = difflib.get_close_matches(word.lower(), KEYWORDS, n=2, cutoff=0.6)
    hint = f"; did you mean {' or '.join(close)}?" if close else (
        f"; the words are {', '.join(KEYWORDS)}, and table names look like 3_1 or L7a1{{0}}")
    return f"'{word}' is not a word of the notation{hint}"


def _glued_name(text: str, offset: int) -> LocatedError | None:
    """A run of letters and digits that the lexer split in two (``3_1x``), read as a table name."""
    if not (0 < offset < len(text) and _NAME_CHAR.match(text[offset - 1]) and _NAME_CHAR.match(text[offset])):
        return None
    start, end = offset, offset
    while start > 0 and _NAME_CHAR.match(text[start - 1]):
        start -= 1
    while end < len(text) and _NAME_CHAR.match(text[end]):
        end += 1
    try:
        canonical_name(text[start:end])
    except (TableError, LimitError) as err:
        return located(err, text, *_position(text, start))
    return None  # pragma: no cover - a whole table name is one token


def _accepts(text: str) -> set[str]:
    """The terminals the parser would take at the spot where ``text`` stops reading.

    LALR tables merge look-aheads across contexts, so the error's own list can name tokens
    that would fail a step later; asking the parser in the state just before the bad token
    tells the truth. That state is rebuilt by feeding the tokens read so far once more: two
    passes over the text, where keeping a copy of the state at every token would cost the
    square of its length.
    """
    interactive = diagram_parser().parse_interactive(text)
    tokens = interactive.lexer_thread.lex(interactive.parser_state)
    read: list[Token] = []
    while True:
        try:
            token = next(tokens)
        except StopIteration:
            break
        except UnexpectedInput:  # the lexer found no token here: the state is as it was
            return set(interactive.accepts())
        try:
            interactive.feed_token(token)
        except UnexpectedInput:
            return _accepts_after(text, read)
        read.append(token)
    try:
        interactive.feed_eof()
    except UnexpectedInput:
        return _accepts_after(text, read)
    return set()  # pragma: no cover - the text parses


def _accepts_after(text: str, read: list[Token]) -> set[str]:
    """What the parser takes after the tokens ``read`` (which it took one by one before)."""
    again = diagram_parser().parse_interactive(text)
    for token in read:
        again.feed_token(token)
    return set(again.accepts())


def _syntax_error(text: str, err: UnexpectedInput) -> Located:
    at_end = isinstance(err, UnexpectedEOF) or (
        isinstance(err, UnexpectedToken) and err.token.type == "$END")
    if at_end:
        offset = _end_offset(text)
        what, kind = "unexpected end of text", "$END"
    elif isinstance(err, UnexpectedCharacters):
        offset = err.pos_in_stream
        what, kind = f"unexpected character '{err.char}'", None
    else:
        offset = err.token.start_pos
        what, kind = f"unexpected '{err.token}'", err.token.type
    line, column = _position(text, offset)
    history = getattr(err, "token_history", None) or []
    bracket = _bracket_problem(text, offset, at_end)
    if bracket:
        reason, where = bracket
        return SpecSyntaxError(reason, text, *_position(text, where))
    glued = _glued_name(text, offset)
    if glued is not None:
        return glued
    if history and history[-1] is not None and history[-1].type == "WORD":
        word = history[-1]
        return SpecSyntaxError(_unknown_word(str(word)), text, word.line, word.column)
    foreign = isinstance(err, UnexpectedCharacters) and not _ALPHABET.fullmatch(err.char)
    # lark 1.3 cannot report a same-state example with other accepts (it formats the state
    # with %d), so examples are matched by parser state alone
    hint = None if foreign or err.state is None else err.match_examples(
        diagram_parser().parse, _EXAMPLES, use_accepts=False)
    if hint in _ONLY_BEFORE and kind not in _ONLY_BEFORE[hint]:
        hint = None
    reason = f"{what}: {hint}" if hint else f"{what}; expected {_describe(_accepts(text))}"
    return SpecSyntaxError(reason, text, line, column)


# ---------------------------------------------------------------------- building the diagram


class _Builder:
    """Turns a parse tree into a diagram, pointing errors at the part of the text at fault.

    The tree is walked with a stack of its own, not by recursion, so that how deep a diagram
    may nest is a limit of :mod:`movies.limits` and never Python's.
    """

    def __init__(self, text: str) -> None:
        self.text = text

    def fail(self, err: MoviesError, where) -> LocatedError:
        return located(err, self.text, where.line, where.column)

    def where(self, node):
        return node.meta if isinstance(node, Tree) else node

    def build(self, root) -> Diagram:
        built: dict[int, Diagram] = {}
        stack = [(root, False)]
        while stack:
            node, ready = stack.pop()
            parts = _PARTS.get(node.data, ())
            if parts and not ready:
                stack.append((node, True))
                stack.extend((node.children[i], False) for i in reversed(parts))
                continue
            built[id(node)] = self.make(node, [built.pop(id(node.children[i])) for i in parts])
        return built[id(root)]

    def make(self, node, parts: list[Diagram]) -> Diagram:
        method = getattr(self, f"_{node.data}")
        if node.data not in ("twisted", "mirror", "reverse") and any(isinstance(part, HandleDiagram) for part in parts):
            raise SpecDiagramError("a diagram with handles stands alone or inside twisted(...); it cannot be "
                                   f"part of {_ROLE.get(node.data, node.data)}", self.text, node.meta.line,
                                   node.meta.column)
        try:
            return method(node, *parts) if parts else method(node, *node.children)
        except (LocatedError, InternalError):
            raise
        except MoviesError as err:
            raise self.fail(err, self.where(node)) from None

    def number(self, token: Token) -> int:
        return read_int(token, self.text)

    def _table(self, node, name: Token) -> Diagram:
        return constructors.from_table(str(name))

    def _unknot(self, node) -> Diagram:
        return constructors.unknot()

    def _empty(self, node) -> Diagram:
        return constructors.empty()

    def _word(self, node, word: Token) -> Diagram:
        raise SpecSyntaxError(_unknown_word(str(word)), self.text, word.line, word.column)

    def _unlink(self, node, count: Token) -> Diagram:
        if self.number(count) < 0:
            raise SpecInputError(f"an unlink has 0 or more circles, not {count}", self.text, count.line, count.column)
        return constructors.unlink(self.number(count))

    def _torus(self, node, p: Token, q: Token) -> Diagram:
        return constructors.torus_link(self.number(p), self.number(q))

    def _braid(self, node, strands: Tree | None, word: Tree) -> Diagram:
        generators = [self.number(token) for token in word.children]
        count = self.number(strands.children[0]) if strands is not None else None
        try:
            return constructors.from_braid(generators, count)
        except GeneratorError as err:
            raise self.fail(err, word.children[err.position - 1]) from None
        except LimitError as err:
            if err.position is not None:
                raise self.fail(err, word.children[err.position - 1]) from None
            raise self.fail(err, strands.children[0] if strands is not None else node.meta) from None
        except BraidError as err:
            raise self.fail(err, strands.children[0] if strands is not None else node.meta) from None

    def _pd(self, node, code: Tree) -> Diagram:
        rows = []
        limits.check("crossings", len(code.children), f"the PD code has {len(code.children)} crossings")
        for index, crossing in enumerate(code.children, start=1):
            if len(crossing.children) != 4:
                raise SpecPDCodeError(
                    f"crossing {index} of the PD code has {len(crossing.children)} label"
                    f"{'' if len(crossing.children) == 1 else 's'}, not 4",
                    self.text, crossing.meta.line, crossing.meta.column)
            rows.append([self.number(label) for label in crossing.children])
        return from_pd(rows)

    def _with_handles(self, node, diagram: Diagram) -> HandleDiagram:
        gates = []
        for handle in node.children[1:]:
            if handle.data == "free_handle":
                gates.append(((), None))
                continue
            *edges, face = handle.children
            gates.append(([self.number(edge) for edge in edges], None if face is None else self.number(face)))
        return handle_diagram(diagram, gates)

    def _fibers(self, node, p: Token, q: Token) -> HandleDiagram:
        return fibers(self.number(p), self.number(q))

    def _axis(self, node, inner) -> HandleDiagram:
        braid = node.children[0]
        if not isinstance(braid, Tree) or braid.data != "braid":
            raise SpecDiagramError("axis(...) takes a braid, as in axis(braid[1, 1, 1]): its axis is the handle",
                                   self.text, node.meta.line, node.meta.column)
        strands, word = braid.children
        generators = [self.number(token) for token in word.children]
        return closed_braid(generators, self.number(strands.children[0]) if strands is not None else None)

    def _twisted(self, node, inner) -> Diagram:
        turns = [self.number(token) for token in node.children[1:]]
        if not isinstance(inner, HandleDiagram):
            raise SpecDiagramError("twisted(...) takes a diagram with handles, as in "
                                   "twisted(3_1 with handle across 1 5, 1)", self.text, node.meta.line, node.meta.column)
        if len(turns) not in (1, len(inner.gates)):
            raise SpecDiagramError(f"twisted(...) takes one number of twists, or one for each of the "
                                   f"{len(inner.gates)} handles, not {len(turns)}", self.text, node.meta.line,
                                   node.meta.column)
        return twisted(inner, turns[0] if len(turns) == 1 else turns)

    def _mirror(self, node, inner: Diagram) -> Diagram:
        if isinstance(inner, HandleDiagram):
            return regated(inner, constructors.mirror(inner.diagram))
        return constructors.mirror(inner)

    def _reverse(self, node, diagram: Diagram) -> Diagram:
        if isinstance(diagram, HandleDiagram):
            return regated(diagram, self._reverse(node, diagram.diagram))
        numbers = node.children[1:]
        for number in numbers:
            if self.number(number) not in diagram.components:
                raise SpecDiagramError(
                    f"component {number} is not in the diagram "
                    f"(components: {sorted(diagram.components)})", self.text, number.line, number.column)
        return constructors.reverse(diagram, [self.number(n) for n in numbers] if numbers else None)

    def _union(self, node, first: Diagram, second: Diagram) -> Diagram:
        places = node.children[1]
        if places is None:
            return constructors.disjoint_union(first, second)
        face, other = places.children
        self.check_name(first.faces, face, "face", "first")
        self.check_name(second.faces, other, "face", "second")
        return constructors.disjoint_union(first, second, self.number(face), self.number(other))

    def _connected_sum(self, node, first: Diagram, second: Diagram) -> Diagram:
        left, places, right = node.children
        for diagram, side, which in ((first, left, "first"), (second, right, "second")):
            if diagram.is_empty():
                raise SpecDiagramError(f"the {which} diagram of the connected sum is empty; "
                                       "a connected sum needs an edge of each",
                                       self.text, self.where(side).line, self.where(side).column)
        if places is None:
            return constructors.connected_sum(first, second)
        edge, other = places.children
        self.check_name(first.edges(), edge, "edge", "first")
        self.check_name(second.edges(), other, "edge", "second")
        return constructors.connected_sum(first, second, self.number(edge), self.number(other))

    def check_name(self, names, token: Token, kind: str, which: str) -> None:
        if self.number(token) not in names:
            raise SpecDiagramError(f"{kind} {token} is not in the {which} diagram "
                                   f"({kind}s: {sorted(names)})", self.text, token.line, token.column)
