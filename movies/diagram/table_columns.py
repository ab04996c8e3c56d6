"""Readers that turn the text columns of the KnotInfo and LinkInfo tables into plain data.

Every reader returns None for a blank entry (the tables leave unknown values blank), and raises
:class:`ColumnTextError` for text it cannot read, quoting the text.

Forms the columns use (every row of both tables has been read):

- Polynomials (``jones_polynomial``, ``alexander_polynomial``, the Khovanov columns): terms joined
  by ``+``/``-`` with or without blanks (``t+ t^3-t^4``, ``-2 + t^(-3) - 2/t^2``); a coefficient
  either multiplies (``3*t^2``) or sits over a power (``2/t^5``, ``-2/x``); exponents bare
  (``t^3``) or in parentheses (``t^(-2)``, ``t^(0)``). LinkInfo also divides by a product in
  parentheses (``1/(q^10*t^4)``) and puts numerators in parentheses (``(2*q)/t``). Fractional
  exponents such as ``t^(-1/2)`` do not occur but are read.
- KnotInfo Jones and Alexander polynomials are in ``t``; LinkInfo's Jones polynomial is in
  ``x = t^(1/2)``, so two-component links have odd powers of ``x``.
- Khovanov columns: monomials ``t^i*q^j`` (``t`` homological, ``q`` quantum degree) with a
  multiplicity. In the integral (and odd integral) columns an extra factor ``T^k`` marks ``Z/k``
  summands (``T^(2)``, and ``T^(3)``, ``T^(4)``, ``T^(8)`` in the odd columns); a term without
  ``T`` is a free summand of that rank. Field columns (rational, mod 2) give dimensions.
- LinkInfo's ``khovanov_polynomial`` is unreduced and uses the same units and normalisation as
  KnotInfo's knot columns: its quantum degrees have the parity of the number of components (odd
  for knots in KnotInfo), its Euler characteristic is ``(q + 1/q)`` times the Jones polynomial at
  ``x = -q`` on every row (for knots this is the familiar ``(q + 1/q) V(q^2)``), and the positive
  Hopf link ``L2a1{1}`` reads ``1 + q^2 + q^4 t^2 + q^6 t^2``. It carries no torsion markers.
- Integers: ``signature``, ``rasmussen_invariant``, ``determinant``, ``crossing_number``.
  ``smooth_four_genus`` is an integer or a range ``[1,2]`` where it is not known.
- Matrices: ``[[ -1, 0], [ -1, -1]]`` in KnotInfo, ``{{0, 1}, {1, 0}}`` in LinkInfo.
- Braids: KnotInfo ``[1,1,1]``; 73 knots list two words, ``[[...],[...]]``; LinkInfo
  ``{2, {1, 1}}`` = {strands, word}, once with a stray ``)`` closing the word
  (``L10a121{1}``), which is read as ``}``.

Two entries disagree with the rest of their row: KnotInfo gives the determinant of 0_1 as 0
(it is 1), and the braid of ``L10n99{0,0,0}`` closes to a link with the linking numbers of
``L10n99{1,0,0}``.

>>> parse_laurent("t+ t^3-t^4", "t")
{Fraction(1, 1): 1, Fraction(3, 1): 1, Fraction(4, 1): -1}
"""

from __future__ import annotations

import functools
import json
import re
from fractions import Fraction

from movies.errors import ColumnTextError

__all__ = [
    "ColumnTextError",
    "parse_laurent_polynomial",
    "parse_laurent",
    "parse_linkinfo_jones",
    "parse_khovanov",
    "parse_int",
    "parse_four_genus",
    "parse_four_genus_bounds",
    "parse_matrix",
    "parse_braid",
    "parse_braids",
]


Exponents = tuple[Fraction, ...]
_Poly = dict[Exponents, Fraction]

_TOKEN = re.compile(r"\s*(?:(\d+)|([A-Za-z])|([-+*/^()]))")


def _tokenize(text: str) -> list[str]:
    tokens, position, end = [], 0, len(text.rstrip())
    while position < end:
        match = _TOKEN.match(text, position)
        if not match:
            raise ColumnTextError(f"unexpected {text[position:].lstrip()[:1]!r} at position "
                                  f"{position} in {text!r}")
        tokens.append(match.group(match.lastindex))
        position = match.end()
    return tokens


class _ExpressionReader:
    """Recursive descent over ``sum := [±] product {± product}``,
    ``product := power {*|/ power}``, ``power := atom [^ exponent]``,
    ``atom := integer | variable | ( sum )``."""

    def __init__(self, text: str, variables: tuple[str, ...]):
        self.text, self.variables = text, variables
        self.tokens, self.index = _tokenize(text), 0
        self.zero: Exponents = tuple(Fraction(0) for _ in variables)

    def fail(self, what: str) -> ColumnTextError:
        return ColumnTextError(f"{what} in {self.text!r}")

    def peek(self) -> str | None:
        return self.tokens[self.index] if self.index < len(self.tokens) else None

    def take(self) -> str:
        token = self.peek()
        if token is None:
            raise self.fail("unexpected end")
        self.index += 1
        return token

    def expect(self, token: str) -> None:
        if self.take() != token:
            raise self.fail(f"expected {token!r} as token {self.index}")

    def read_all(self) -> _Poly:
        value = self.sum()
        if self.peek() is not None:
            raise self.fail(f"unexpected {self.peek()!r} as token {self.index + 1}")
        return value

    def sum(self) -> _Poly:
        sign = -1 if self.peek() == "-" else 1
        if self.peek() in ("+", "-"):
            self.take()
        total: _Poly = {}
        _add_into(total, self.product(), sign)
        while self.peek() in ("+", "-"):
            sign = -1 if self.take() == "-" else 1
            _add_into(total, self.product(), sign)
        return total

    def product(self) -> _Poly:
        value = self.power()
        while self.peek() in ("*", "/"):
            operator, right = self.take(), self.power()
            if operator == "*":
                value = _multiply(value, right)
            else:
                if len(right) != 1 or next(iter(right.values())) == 0:
                    raise self.fail("division by something other than a monomial")
                value = _multiply(value, _power(right, Fraction(-1)))
        return value

    def power(self) -> _Poly:
        base = self.atom()
        if self.peek() != "^":
            return base
        self.take()
        exponent = self.exponent()
        if len(base) != 1:
            if exponent.denominator != 1 or exponent < 0:
                raise self.fail(f"power {exponent} of a sum")
        else:
            coefficient = next(iter(base.values()))
            if coefficient == 0 and exponent <= 0:
                raise self.fail(f"power {exponent} of zero")
            if exponent.denominator != 1 and coefficient != 1:
                raise self.fail(f"fractional power {exponent} of a number")
        return _power(base, exponent)

    def exponent(self) -> Fraction:
        token = self.take()
        if token == "(":
            inner = self.sum()
            self.expect(")")
            if any(monomial != self.zero for monomial in inner):
                raise self.fail("an exponent that is not a number")
            return sum(inner.values(), Fraction(0))
        if token == "-":
            token, sign = self.take(), -1
        else:
            sign = 1
        if not token.isdigit():
            raise self.fail(f"exponent {token!r}")
        return sign * Fraction(int(token))

    def atom(self) -> _Poly:
        token = self.take()
        if token.isdigit():
            return {self.zero: Fraction(int(token))}
        if token == "(":
            inner = self.sum()
            self.expect(")")
            return inner
        if token in self.variables:
            place = self.variables.index(token)
            monomial = tuple(Fraction(int(k == place)) for k in range(len(self.variables)))
            return {monomial: Fraction(1)}
        if token.isalpha():
            raise self.fail(f"unknown variable {token!r} (expected one of "
                            f"{', '.join(self.variables)})")
        raise self.fail(f"unexpected {token!r} as token {self.index}")


def _add_into(total: _Poly, value: _Poly, sign: int) -> None:
    for monomial, coefficient in value.items():
        total[monomial] = total.get(monomial, Fraction(0)) + sign * coefficient


def _multiply(left: _Poly, right: _Poly) -> _Poly:
    product: _Poly = {}
    for m1, c1 in left.items():
        for m2, c2 in right.items():
            monomial = tuple(a + b for a, b in zip(m1, m2))
            product[monomial] = product.get(monomial, Fraction(0)) + c1 * c2
    return product


def _power(base: _Poly, exponent: Fraction) -> _Poly:
    if len(base) == 1:
        (monomial, coefficient), = base.items()
        scaled = tuple(e * exponent for e in monomial)
        factor = coefficient ** int(exponent) if exponent.denominator == 1 else Fraction(1)
        return {scaled: Fraction(factor)}
    result: _Poly = {tuple(Fraction(0) for _ in next(iter(base))): Fraction(1)}
    for _ in range(int(exponent)):
        result = _multiply(result, base)
    return result


# The columns write every term as one monomial: [(]product[)] [/ power-or-(product)]. One regular
# expression per term reads them quickly; any other text goes to the general reader above.
_EXPONENT = r"(?:\d+|-\d+|\([-+]?\d+(?:/\d+)?\))"
_ITEM = rf"(?:\d+|[A-Za-z](?:\^{_EXPONENT})?)"
_PRODUCT = rf"{_ITEM}(?:\s*\*\s*{_ITEM})*"
_TERM = re.compile(rf"\s*([+-]?)\s*(\({_PRODUCT}\)|{_PRODUCT})"
                   rf"(?:\s*/\s*(\({_PRODUCT}\)|{_ITEM}))?\s*")
_ITEM_PARTS = re.compile(r"(\d+)|([A-Za-z])(?:\^(?:(-?\d+)|\(([-+]?\d+)(?:/(\d+))?\)))?")


def _monomial(product: str, variables: tuple[str, ...]) -> tuple[int, list]:
    """(coefficient, exponent list) of a product such as ``2*t^(3)*q^(-1/2)``."""
    coefficient, exponents = 1, [0] * len(variables)
    for number, variable, bare, signed, denominator in _ITEM_PARTS.findall(product):
        if number:
            coefficient *= int(number)
            continue
        if variable not in variables:
            raise ColumnTextError(f"unknown variable {variable!r} (expected one of "
                                  f"{', '.join(variables)})")
        if bare or signed:
            power = int(bare or signed)
            if denominator:
                power = Fraction(power, int(denominator))
        else:
            power = 1
        exponents[variables.index(variable)] += power
    return coefficient, exponents


@functools.lru_cache(maxsize=1 << 16)
def _term_value(numerator: str, denominator: str | None,
                variables: tuple[str, ...]) -> tuple[tuple, int | Fraction]:
    """(exponent tuple, coefficient) of one term; the same terms recur across many rows."""
    coefficient, exponents = _monomial(numerator, variables)
    if denominator:
        divisor, negative = _monomial(denominator, variables)
        if divisor == 0:
            raise ColumnTextError("division by zero")
        exponents = [a - b for a, b in zip(exponents, negative)]
        coefficient = Fraction(coefficient, divisor) if divisor != 1 else coefficient
    return tuple(exponents), coefficient


# A term is an optional sign and then anything but signs and parentheses, or a parenthesised
# group (which may start with a sign, as in t^(-2)).
_TERM_TEXT = re.compile(r"\s*[+-]?(?:[^+\-()]|\([+-]?[^()]*\))+")
_term_cache: dict[tuple[str, tuple[str, ...]], tuple[tuple, int | Fraction]] = {}


def _signed_term(term: str, variables: tuple[str, ...]) -> tuple[tuple, int | Fraction] | None:
    """(exponent tuple, signed coefficient) of one term text, or None if it is not a monomial."""
    cached = _term_cache.get((term, variables))
    if cached is not None:
        return cached
    match = _TERM.fullmatch(term)
    if not match:
        return None
    sign, numerator, denominator = match.groups()
    key, coefficient = _term_value(numerator, denominator, variables)
    if len(_term_cache) > 1 << 18:
        _term_cache.clear()
    _term_cache[term, variables] = result = (key, -coefficient if sign == "-" else coefficient)
    return result


def _read_monomial_sum(text: str, variables: tuple[str, ...]) -> dict[tuple, int | Fraction]:
    """{exponent tuple (ints, or Fractions where fractional): coefficient} of a column entry."""
    terms = _TERM_TEXT.findall(text)
    total: dict[tuple, int | Fraction] = {}
    try:
        values = [_signed_term(term, variables) for term in terms]
    except ColumnTextError as error:
        raise ColumnTextError(f"{error} in {text!r}") from None
    # every term after the first starts at a sign, since only signs end a term's body
    if "".join(terms) != text.rstrip() or None in values:
        value = _ExpressionReader(text, variables).read_all()
        return {tuple(e.numerator if e.denominator == 1 else e for e in monomial):
                c.numerator if c.denominator == 1 else c for monomial, c in value.items()}
    for key, coefficient in values:
        total[key] = total.get(key, 0) + coefficient
    return total


def _integer_terms(text: str, variables: tuple[str, ...]) -> dict[tuple, int] | None:
    """The nonzero terms of a column entry, sorted, with integer coefficients; None if blank."""
    if not text.strip():
        return None
    value = _read_monomial_sum(text, tuple(variables))
    result = {}
    for monomial in sorted(value):
        coefficient = value[monomial]
        if type(coefficient) is Fraction:
            if coefficient.denominator != 1:
                raise ColumnTextError(f"coefficient {coefficient} is not an integer in {text!r}")
            coefficient = coefficient.numerator
        if coefficient:
            result[monomial] = coefficient
    return result


def parse_laurent_polynomial(text: str, variables: tuple[str, ...]) -> dict[Exponents, int] | None:
    """Read a Laurent polynomial in several variables, as the table columns write them.

    Parameters: ``text``, a column entry; ``variables``, the names of the variables in the order
    the exponent tuples use. Returns {exponent tuple (Fractions): integer coefficient}, sorted,
    without zero terms; None for a blank entry.

    >>> parse_laurent_polynomial("1 + 1/(q^6*t^2) + (2*q)/t", ("t", "q"))
    {(Fraction(-2, 1), Fraction(-6, 1)): 1, (Fraction(-1, 1), Fraction(1, 1)): 2, \
(Fraction(0, 1), Fraction(0, 1)): 1}
    """
    value = _integer_terms(text, variables)
    if value is None:
        return None
    return {tuple(Fraction(e) for e in monomial): c for monomial, c in value.items()}


def parse_laurent(text: str, variable: str) -> dict[Fraction, int] | None:
    """Read a Laurent polynomial in one variable (KnotInfo Jones and Alexander columns).

    Parameters: ``text``, a column entry; ``variable``, its variable (``"t"``). Returns
    {Fraction exponent: integer coefficient}; None for a blank entry.

    >>> parse_laurent("t^(-2)-t^(-1)+ 1-t+ t^2", "t") == {-2: 1, -1: -1, 0: 1, 1: -1, 2: 1}
    True
    >>> parse_laurent("-2 + t^(-1/2) - 3/t^2", "t")
    {Fraction(-2, 1): -3, Fraction(-1, 2): 1, Fraction(0, 1): -2}
    """
    value = parse_laurent_polynomial(text, (variable,))
    if value is None:
        return None
    return {monomial[0]: coefficient for monomial, coefficient in value.items()}


def parse_linkinfo_jones(text: str) -> dict[Fraction, int] | None:
    """Read LinkInfo's ``jones_polynomial``, written in ``x = t^(1/2)``, as exponents of ``t``.

    Parameters: ``text``, a column entry. Returns {Fraction exponent of t: integer coefficient};
    None for a blank entry.

    >>> parse_linkinfo_jones("-x-x^5") == {Fraction(1, 2): -1, Fraction(5, 2): -1}
    True
    """
    value = parse_laurent(text, "x")
    if value is None:
        return None
    return {exponent / 2: coefficient for exponent, coefficient in value.items()}


def parse_khovanov(text: str) -> dict[tuple[int, int], dict] | None:
    """Read a Khovanov column into groups by bidegree.

    Works for KnotInfo's ``khovanov_unreduced_integral_polynomial`` and the reduced, odd,
    rational and mod 2 columns, and for LinkInfo's ``khovanov_polynomial``.

    Parameters: ``text``, a column entry. Returns {(i, j): {"free": rank, "torsion": {k: count}}}
    with ``i`` the homological (``t``) and ``j`` the quantum (``q``) degree; ``count`` summands
    ``Z/k`` sit in bidegree (i, j). For the field columns "free" is the dimension and "torsion" is
    empty. None for a blank entry.

    >>> groups = parse_khovanov("q+ q^(3)+ t^(2)*q^(5)+ t^(3)*q^(9)+ t^(3)*q^(7)*T^(2)")
    >>> groups[(3, 7)], groups[(3, 9)]
    ({'free': 0, 'torsion': {2: 1}}, {'free': 1, 'torsion': {}})
    """
    value = _integer_terms(text, ("t", "q", "T"))
    if value is None:
        return None
    groups: dict[tuple[int, int], dict] = {}
    for (i, j, k), count in value.items():
        if not (type(i) is int and type(j) is int and type(k) is int):
            raise ColumnTextError(f"fractional degree in t^{i}*q^{j}*T^{k} in {text!r}")
        if count < 0 or k == 1 or k < 0:
            raise ColumnTextError(f"term {count}*t^{i}*q^{j}*T^{k} is not a rank or a "
                                  f"torsion summand in {text!r}")
        group = groups.setdefault((i, j), {"free": 0, "torsion": {}})
        if k == 0:
            group["free"] += count
        else:
            group["torsion"][k] = group["torsion"].get(k, 0) + count
    return dict(sorted(groups.items()))


def parse_int(text: str) -> int | None:
    """Read an integer column (``signature``, ``rasmussen_invariant``, ``determinant``, ...).

    Parameters: ``text``, a column entry. Returns the integer, or None for a blank entry or text
    that is not a single integer.

    >>> parse_int("-2"), parse_int(" 7 "), parse_int(""), parse_int("[1,2]")
    (-2, 7, None, None)
    """
    stripped = text.strip()
    return int(stripped) if re.fullmatch(r"[+-]?\d+", stripped) else None


def parse_four_genus_bounds(text: str) -> tuple[int, int] | None:
    """Read ``smooth_four_genus`` as bounds: a number ``g`` gives (g, g), a range ``[a,b]`` (a, b).

    Parameters: ``text``, a column entry. Returns (lower, upper), or None for a blank entry.

    >>> parse_four_genus_bounds("1"), parse_four_genus_bounds("[1,2]")
    ((1, 1), (1, 2))
    """
    if not text.strip():
        return None
    single = parse_int(text)
    if single is not None:
        return (single, single)
    match = re.fullmatch(r"\s*\[\s*(\d+)\s*,\s*(\d+)\s*\]\s*", text)
    if not match or int(match.group(1)) > int(match.group(2)):
        raise ColumnTextError(f"not a number or a range [a,b]: {text!r}")
    return (int(match.group(1)), int(match.group(2)))


def parse_four_genus(text: str) -> int | None:
    """Read ``smooth_four_genus`` when it is known.

    Parameters: ``text``, a column entry. Returns the genus, or None when the entry is blank or a
    range such as ``[1,2]``.

    >>> parse_four_genus("1"), parse_four_genus("[1,2]")
    (1, None)
    """
    bounds = parse_four_genus_bounds(text)
    if bounds is None or bounds[0] != bounds[1]:
        return None
    return bounds[0]


_BRACES_TO_BRACKETS = str.maketrans("{}", "[]")
_NESTED_TOKEN = re.compile(r"\s*(?:([-+]?\d+)|([\[\]{}),]))")
_OPENER_OF = {"]": "[", "}": "{", ")": "{"}  # ")" for "}": one LinkInfo braid is written so


def _read_nested(text: str) -> list:
    """Read ``[1, [2, 3]]`` or ``{1, {2, 3}}`` into nested lists of ints."""
    brackets = set(text) & set("[]{}")
    if brackets <= set("[]") or brackets <= set("{}"):
        # the common case at C speed: once braces are brackets, the entry is a JSON list
        try:
            value = json.loads(text.translate(_BRACES_TO_BRACKETS))
        except ValueError:
            pass
        else:
            if isinstance(value, list):
                return value
    tokens, position, end = [], 0, len(text.rstrip())
    while position < end:
        match = _NESTED_TOKEN.match(text, position)
        if not match:
            raise ColumnTextError(f"unexpected {text[position:].lstrip()[:1]!r} in {text!r}")
        tokens.append(int(match.group(1)) if match.group(1) else match.group(2))
        position = match.end()

    def item(index: int) -> tuple[int | list, int]:
        token = tokens[index]
        if isinstance(token, int):
            return token, index + 1
        if token not in ("[", "{"):
            raise ColumnTextError(f"unexpected {token!r} in {text!r}")
        items: list = []
        index += 1
        if tokens[index] not in _OPENER_OF:
            while True:
                value, index = item(index)
                items.append(value)
                if tokens[index] != ",":
                    break
                index += 1
        if _OPENER_OF.get(tokens[index]) != token:
            raise ColumnTextError(f"{token!r} closed by {tokens[index]!r} in {text!r}")
        return items, index + 1

    try:
        value, index = item(0)
    except IndexError:
        raise ColumnTextError(f"unclosed bracket in {text!r}") from None
    if index != len(tokens) or not isinstance(value, list):
        raise ColumnTextError(f"not one bracketed list: {text!r}")
    return value


_MATRIX_CHARACTERS = set("0123456789-, []{}")


def parse_matrix(text: str) -> tuple[tuple[int, ...], ...] | None:
    """Read a matrix (LinkInfo ``linking_matrix``, ``seifert_matrix`` of both tables).

    Parameters: ``text``, a column entry. Returns the rows as tuples of ints; None for a blank
    entry. Rows of different lengths are an error.

    >>> parse_matrix("{{0, 1}, {1, 0}}"), parse_matrix("[[ -1, 0], [ -1, -1]]")
    (((0, 1), (1, 0)), ((-1, 0), (-1, -1)))
    """
    if not text.strip():
        return None
    rows = _read_nested(text)
    plain = (set(text) <= _MATRIX_CHARACTERS and all(type(row) is list for row in rows)
             and text.count("[") + text.count("{") == len(rows) + 1)
    # plain text with one bracket per row can only hold integers; otherwise look at each entry
    if not plain and not all(type(row) is list and all(type(x) is int for x in row)
                             for row in rows):
        raise ColumnTextError(f"not a list of rows of integers: {text!r}")
    if len({len(row) for row in rows}) > 1:
        raise ColumnTextError(f"rows of different lengths in {text!r}")
    return tuple(tuple(row) for row in rows)


def _checked_word(word: list, strands: int | None, text: str) -> tuple[int, tuple[int, ...]]:
    if not all(type(g) is int and g != 0 for g in word):
        raise ColumnTextError(f"a braid word must be nonzero integers: {text!r}")
    needed = max((abs(g) for g in word), default=0) + 1
    if strands is None:
        strands = needed  # a knot's closure is connected, so every generator occurs
    elif needed > strands:
        raise ColumnTextError(f"generator {needed - 1} does not fit {strands} strands: {text!r}")
    return (strands, tuple(word))


def parse_braids(text: str) -> list[tuple[int, tuple[int, ...]]] | None:
    """Read every braid word of a ``braid_notation`` entry.

    Parameters: ``text``, a column entry: KnotInfo ``[1,1,1]`` or ``[[...],[...]]`` (strands
    = largest generator + 1), LinkInfo ``{2, {1, 1}}`` (strands given). Returns a list of
    (strands, word); None for a blank entry.

    >>> parse_braids("[[1,-2,1],[1,1,2,-1]]")
    [(3, (1, -2, 1)), (3, (1, 1, 2, -1))]
    """
    if not text.strip():
        return None
    value = _read_nested(text)
    if text.strip().startswith("{"):
        if len(value) != 2 or type(value[0]) is not int or type(value[1]) is not list:
            raise ColumnTextError(f"expected {{strands, {{word}}}}: {text!r}")
        return [_checked_word(value[1], value[0], text)]
    if all(isinstance(item, list) for item in value) and value:
        return [_checked_word(word, None, text) for word in value]
    return [_checked_word(value, None, text)]


def parse_braid(text: str) -> tuple[int, tuple[int, ...]] | None:
    """Read a ``braid_notation`` entry as (strands, word); of several words, the first.

    Parameters: ``text``, a column entry. Returns (strands, word) with ``word`` a tuple of
    generators (``i`` is σ_i, ``-i`` its inverse); None for a blank entry.

    >>> parse_braid("[1,1,1]"), parse_braid("{2, {1, 1}}")
    ((2, (1, 1, 1)), (2, (1, 1)))
    """
    words = parse_braids(text)
    return None if words is None else words[0]
