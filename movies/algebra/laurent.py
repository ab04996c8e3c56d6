"""Exact Laurent polynomials in one variable with rational exponents.

A :class:`LaurentPolynomial` is a finite sum ``c_1 t^(e_1) + ... + c_k t^(e_k)`` with integer
coefficients ``c_i`` and exponents ``e_i`` that are :class:`fractions.Fraction` values, so
``t^(1/2)`` (the Jones polynomial of a link with an even number of components) and ``A^(-3)``
(the Kauffman bracket) live in the same class. Values are immutable and hashable; the terms sit in
a plain dict ``{Fraction exponent: int coefficient}`` with no zero coefficients.

>>> t = LaurentPolynomial.monomial(1)
>>> p = t + t**3 - t**4
>>> print(p)
t + t^3 - t^4
>>> p.terms()
[(Fraction(1, 1), 1), (Fraction(3, 1), 1), (Fraction(4, 1), -1)]
>>> print(LaurentPolynomial({Fraction(-1, 2): -1, Fraction(1, 2): -1}))
-t^(-1/2) - t^(1/2)
>>> LaurentPolynomial.parse("t+ t^3-t^4") == p
True
"""

from __future__ import annotations

import re
from fractions import Fraction
from operator import index as _as_int
from typing import Iterable, Mapping, Union

__all__ = ["LaurentPolynomial"]

_ONE = Fraction(1)
_ZERO = Fraction(0)

Exponent = Union[int, Fraction, str]
_VARIABLE_RE = re.compile(r"[A-Za-z_][A-Za-z_0-9]*\Z")


def _exponent(value) -> Fraction:
    """An exponent as a Fraction; ints, Fractions and strings such as ``"-1/2"`` are accepted."""
    if isinstance(value, Fraction):
        return value
    if isinstance(value, int):
        return Fraction(value)
    if isinstance(value, str):
        return Fraction(value.strip())
    if isinstance(value, float):
        raise TypeError(f"exponent {value!r} is a float; use an int or a Fraction")
    return Fraction(value)


def _coefficient(value) -> int:
    if isinstance(value, bool) or not isinstance(value, int):
        try:
            value = _as_int(value)
        except TypeError:
            raise TypeError(f"coefficient {value!r} is not an integer") from None
    return int(value)


class LaurentPolynomial:
    """An immutable sparse Laurent polynomial with integer coefficients and rational exponents.

    Build it from a mapping ``{exponent: coefficient}``, from an iterable of ``(exponent,
    coefficient)`` pairs (repeated exponents are added up), or from an int (a constant).

    >>> LaurentPolynomial({2: 3, -1: 1}, variable="A")
    LaurentPolynomial('A^(-1) + 3*A^2')
    >>> LaurentPolynomial([(1, 1), (1, 1), (0, -2)]).terms()
    [(Fraction(0, 1), -2), (Fraction(1, 1), 2)]
    >>> LaurentPolynomial(7) == 7
    True
    """

    __slots__ = ("_terms", "_variable", "_hash")

    def __init__(
        self,
        terms: Union[Mapping[Exponent, int], Iterable[tuple], int, None] = None,
        variable: str = "t",
    ):
        if not isinstance(variable, str) or not _VARIABLE_RE.match(variable):
            raise ValueError(f"variable name {variable!r} is not an identifier")
        data: dict = {}
        if terms is None:
            pass
        elif isinstance(terms, LaurentPolynomial):
            data = dict(terms._terms)
        elif isinstance(terms, int) and not isinstance(terms, bool):
            if terms:
                data[_ZERO] = terms
        elif isinstance(terms, Mapping):
            for exp, coeff in terms.items():
                e = _exponent(exp)
                data[e] = data.get(e, 0) + _coefficient(coeff)
        else:
            for exp, coeff in terms:
                e = _exponent(exp)
                data[e] = data.get(e, 0) + _coefficient(coeff)
        self._terms = {e: c for e, c in data.items() if c}
        self._variable = variable
        self._hash = None

    # ----------------------------------------------------------------------------- construction
    @classmethod
    def _raw(cls, terms: dict, variable: str) -> "LaurentPolynomial":
        """Wrap a dict that already has Fraction keys and no zero values (no copying, no checks)."""
        obj = object.__new__(cls)
        obj._terms = terms
        obj._variable = variable
        obj._hash = None
        return obj

    @classmethod
    def monomial(cls, exponent: Exponent = 0, coefficient: int = 1, variable: str = "t"):
        """The single term ``coefficient * variable^exponent``.

        >>> print(LaurentPolynomial.monomial(Fraction(-3, 4), -2, "q"))
        -2*q^(-3/4)
        """
        return cls({exponent: coefficient}, variable)

    @classmethod
    def parse(cls, text: str, variable: str | None = None) -> "LaurentPolynomial":
        """Read a polynomial written the way the knot tables print them.

        Accepted terms: an optional sign, an optional integer coefficient, then optionally
        ``*`` or ``/`` and the variable with an optional power ``^k``, ``^(-k)`` or ``^(p/q)``
        (``**`` works as ``^``). ``2/x^5`` means ``2*x^(-5)``. Spaces are ignored. The variable
        is the one letter-name used in the text unless ``variable`` names it; a constant
        polynomial gets ``variable`` or ``"t"``.

        >>> print(LaurentPolynomial.parse("x^(-7)-2/x^5 + x^(-3)-2/x + x-x^3"))
        x^(-7) - 2*x^(-5) + x^(-3) - 2*x^(-1) + x - x^3
        >>> print(LaurentPolynomial.parse("-t^(-1/2) - t^(1/2)"))
        -t^(-1/2) - t^(1/2)
        >>> LaurentPolynomial.parse("1").terms()
        [(Fraction(0, 1), 1)]
        """
        if not isinstance(text, str):
            raise TypeError("parse() needs a string")
        s = re.sub(r"\s+", "", text).replace("**", "^")
        if not s:
            raise ValueError("empty polynomial text")
        names = set(re.findall(r"[A-Za-z_][A-Za-z_0-9]*", s))
        if len(names) > 1:
            raise ValueError(f"polynomial text {text!r} uses several variables: {sorted(names)}")
        if names:
            (found,) = names
            if variable is not None and variable != found:
                raise ValueError(f"polynomial text {text!r} is in {found}, not in {variable}")
            variable = found
        elif variable is None:
            variable = "t"
        var = re.escape(variable)
        term = re.compile(
            r"([+-])?(\d+)?(?:([*/])?(" + var + r")(?:\^(?:\((-?\d+(?:/\d+)?)\)|(-?\d+)))?)?"
        )
        data: dict = {}
        pos = 0
        first = True
        while pos < len(s):
            m = term.match(s, pos)
            if m is None or m.end() == pos:
                raise ValueError(f"cannot read polynomial text {text!r} at position {pos}")
            sign, digits, op, name, pexp, iexp = m.groups()
            if sign is None and not first:
                raise ValueError(f"missing sign between terms in {text!r} at position {pos}")
            if digits is None and name is None:
                raise ValueError(f"empty term in {text!r} at position {pos}")
            if op is not None and (digits is None or name is None):
                raise ValueError(f"misplaced {op!r} in {text!r} at position {pos}")
            coeff = int(digits) if digits is not None else 1
            if sign == "-":
                coeff = -coeff
            if name is None:
                exp = _ZERO
            else:
                raw = pexp if pexp is not None else iexp
                exp = Fraction(raw) if raw is not None else _ONE
                if op == "/":
                    exp = -exp
            data[exp] = data.get(exp, 0) + coeff
            pos = m.end()
            first = False
        return cls._raw({e: c for e, c in data.items() if c}, variable)

    # ----------------------------------------------------------------------------- inspection
    @property
    def variable(self) -> str:
        """The name of the variable, used when printing (``"t"`` unless set)."""
        return self._variable

    def terms(self) -> list:
        """The nonzero terms as a list of ``(Fraction exponent, int coefficient)``, by exponent.

        >>> LaurentPolynomial({3: 1, -1: 2, 0: 0}).terms()
        [(Fraction(-1, 1), 2), (Fraction(3, 1), 1)]
        """
        return sorted(self._terms.items())

    def as_dict(self) -> dict:
        """A fresh dict ``{Fraction exponent: int coefficient}`` of the nonzero terms."""
        return dict(self._terms)

    def coefficient(self, exponent: Exponent) -> int:
        """The coefficient of ``variable^exponent`` (0 when absent).

        >>> LaurentPolynomial({"1/2": 5}).coefficient(Fraction(1, 2))
        5
        """
        return self._terms.get(_exponent(exponent), 0)

    def is_zero(self) -> bool:
        """True for the zero polynomial.

        >>> LaurentPolynomial().is_zero(), LaurentPolynomial(1).is_zero()
        (True, False)
        """
        return not self._terms

    def is_constant(self) -> bool:
        """True when there is no term with a nonzero exponent (zero included)."""
        return not self._terms or (len(self._terms) == 1 and _ZERO in self._terms)

    def min_degree(self) -> Fraction:
        """The lowest exponent; ValueError for the zero polynomial.

        >>> LaurentPolynomial({-2: 1, 5: 1}).min_degree()
        Fraction(-2, 1)
        """
        if not self._terms:
            raise ValueError("the zero polynomial has no degree")
        return min(self._terms)

    def max_degree(self) -> Fraction:
        """The highest exponent; ValueError for the zero polynomial.

        >>> LaurentPolynomial({-2: 1, 5: 1}).max_degree()
        Fraction(5, 1)
        """
        if not self._terms:
            raise ValueError("the zero polynomial has no degree")
        return max(self._terms)

    def span(self) -> Fraction:
        """``max_degree() - min_degree()`` (the breadth); ValueError for zero.

        >>> LaurentPolynomial.parse("t + t^3 - t^4").span()
        Fraction(3, 1)
        """
        return self.max_degree() - self.min_degree()

    def __len__(self) -> int:
        return len(self._terms)

    def __bool__(self) -> bool:
        return bool(self._terms)

    # ----------------------------------------------------------------------------- changes of variable
    def substitute_power(self, k: Exponent, variable: str | None = None) -> "LaurentPolynomial":
        """Substitute ``t -> t^k`` for a nonzero rational ``k``; optionally rename the variable.

        >>> A = LaurentPolynomial.monomial(1, variable="A")
        >>> print((A**-4 + 1).substitute_power(Fraction(-1, 4), "t"))
        1 + t
        """
        kk = _exponent(k)
        if kk == 0:
            raise ValueError("substitute_power needs a nonzero power")
        return LaurentPolynomial._raw(
            {e * kk: c for e, c in self._terms.items()},
            self._variable if variable is None else variable,
        )

    def with_variable(self, variable: str) -> "LaurentPolynomial":
        """The same terms printed in another variable."""
        return LaurentPolynomial(self._terms, variable)

    def shift(self, exponent: Exponent) -> "LaurentPolynomial":
        """Multiply by ``variable^exponent``.

        >>> print(LaurentPolynomial.parse("1 + t").shift(-1))
        t^(-1) + 1
        """
        e0 = _exponent(exponent)
        return LaurentPolynomial._raw({e + e0: c for e, c in self._terms.items()}, self._variable)

    # ----------------------------------------------------------------------------- arithmetic
    def _coerce(self, other):
        if isinstance(other, LaurentPolynomial):
            if other._variable != self._variable and not (self.is_constant() or other.is_constant()):
                raise ValueError(
                    f"cannot combine polynomials in {self._variable} and in {other._variable}"
                )
            return other
        if isinstance(other, int) and not isinstance(other, bool):
            return LaurentPolynomial._raw({_ZERO: other} if other else {}, self._variable)
        return None

    def _result_variable(self, other: "LaurentPolynomial") -> str:
        if self._variable == other._variable or not self.is_constant():
            return self._variable
        return other._variable

    def __add__(self, other):
        o = self._coerce(other)
        if o is None:
            return NotImplemented
        out = dict(self._terms)
        for e, c in o._terms.items():
            v = out.get(e, 0) + c
            if v:
                out[e] = v
            else:
                out.pop(e, None)
        return LaurentPolynomial._raw(out, self._result_variable(o))

    __radd__ = __add__

    def __neg__(self):
        return LaurentPolynomial._raw({e: -c for e, c in self._terms.items()}, self._variable)

    def __pos__(self):
        return self

    def __sub__(self, other):
        o = self._coerce(other)
        if o is None:
            return NotImplemented
        return self + (-o)

    def __rsub__(self, other):
        o = self._coerce(other)
        if o is None:
            return NotImplemented
        return o + (-self)

    def __mul__(self, other):
        o = self._coerce(other)
        if o is None:
            return NotImplemented
        out: dict = {}
        for e1, c1 in self._terms.items():
            for e2, c2 in o._terms.items():
                e = e1 + e2
                out[e] = out.get(e, 0) + c1 * c2
        return LaurentPolynomial._raw({e: c for e, c in out.items() if c}, self._result_variable(o))

    __rmul__ = __mul__

    def __pow__(self, n):
        """Integer powers; negative powers only for a single term (``+-t^e``).

        >>> t = LaurentPolynomial.monomial(1)
        >>> print((1 + t) ** 2)
        1 + 2*t + t^2
        >>> print((-t) ** -3)
        -t^(-3)
        """
        if isinstance(n, bool) or not isinstance(n, int):
            return NotImplemented
        if n < 0:
            if len(self._terms) != 1 or abs(next(iter(self._terms.values()))) != 1:
                raise ValueError("only a monomial with coefficient +-1 has a negative power")
            ((e, c),) = self._terms.items()
            return LaurentPolynomial._raw({e * n: 1 if c == 1 or n % 2 == 0 else -1}, self._variable)
        result = LaurentPolynomial._raw({_ZERO: 1}, self._variable)
        base = self
        while n:
            if n & 1:
                result = result * base
            n >>= 1
            if n:
                base = base * base
        return result

    # ----------------------------------------------------------------------------- comparison
    def __eq__(self, other):
        if isinstance(other, LaurentPolynomial):
            if self._terms != other._terms:
                return False
            return self._variable == other._variable or self.is_constant()
        if isinstance(other, int) and not isinstance(other, bool):
            return self._terms == ({_ZERO: other} if other else {})
        return NotImplemented

    def __ne__(self, other):
        r = self.__eq__(other)
        return r if r is NotImplemented else not r

    def __hash__(self):
        h = self._hash
        if h is None:
            if not self._terms:
                h = hash(0)
            elif self.is_constant():
                h = hash(self._terms[_ZERO])
            else:
                h = hash((self._variable, frozenset(self._terms.items())))
            self._hash = h
        return h

    # ----------------------------------------------------------------------------- printing
    def __str__(self):
        """Ascending exponents, ``2*t^3``, ``t^(-1)``, ``t^(1/2)``; ``0`` for zero."""
        if not self._terms:
            return "0"
        v = self._variable
        parts = []
        for e, c in sorted(self._terms.items()):
            if e == 0:
                body = str(abs(c))
            else:
                if e == 1:
                    power = v
                elif e.denominator == 1 and e > 0:
                    power = f"{v}^{e.numerator}"
                else:
                    power = f"{v}^({e})"
                body = power if abs(c) == 1 else f"{abs(c)}*{power}"
            if not parts:
                parts.append(("-" if c < 0 else "") + body)
            else:
                parts.append(("- " if c < 0 else "+ ") + body)
        return " ".join(parts)

    def __repr__(self):
        return f"LaurentPolynomial({str(self)!r})"
