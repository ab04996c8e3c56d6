"""Signatures from the Seifert matrix: the signature, the nullity and Levine–Tristram signatures.

All exact.  The signature of ``V + Vᵀ`` comes from a symmetric Gaussian elimination over the
rationals (a congruence, so Sylvester's law of inertia applies).  For ``ω = e^(2πik/n)`` the
Levine–Tristram signature is the signature of the Hermitian matrix ``(1 - ω)V + (1 - ω̄)Vᵀ``; it
is computed by a Hermitian elimination in the cyclotomic field ``Q(ω)``, with elements stored as
integer coefficient vectors modulo the cyclotomic polynomial.  The pivots are real numbers of the
field; the sign of each is decided exactly: written as a polynomial in ``y = cos(2πk/n)``, it is
evaluated on ever smaller rational intervals around ``y`` (isolated as a root of a Chebyshev
polynomial) until the interval excludes zero.

Conventions: ``σ(3_1) = -2`` for the positive trefoil (positive knots have negative signature);
``σ_ω`` at ``ω = -1`` is ``σ``; at ``ω = 1`` the matrix is zero and ``σ_1 = 0``.

>>> from movies.diagram.pd import from_pd
>>> trefoil = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])
>>> signature(trefoil), levine_tristram(trefoil, 1, 6), levine_tristram(trefoil, 1, 3)
(-2, -1, -2)
"""

from __future__ import annotations

from fractions import Fraction
from functools import lru_cache
from math import gcd
from typing import Sequence

from movies.diagram.model import Diagram
from movies.errors import InputError, InternalError
from movies.invariants.seifert import seifert_surface

__all__ = [
    "inertia",
    "matrix_signature",
    "matrix_levine_tristram",
    "signature",
    "nullity",
    "levine_tristram",
    "levine_tristram_all",
    "levine_tristram_bound",
    "is_prime_power",
]

Matrix = Sequence[Sequence[int]]


# ---------------------------------------------------------------------------- rational forms


def inertia(matrix: Sequence[Sequence]) -> tuple[int, int, int]:
    """(positive, negative, zero) eigenvalue counts of a symmetric rational matrix, exactly.

    Parameters: ``matrix``, a symmetric matrix of ints or Fractions.  Returns the inertia,
    found by symmetric elimination (a congruence, so Sylvester's law of inertia applies).

    >>> inertia([[0, 1], [1, 0]]), inertia([[2, 1], [1, 2]]), inertia([[1, 1], [1, 1]])
    ((1, 1, 0), (2, 0, 0), (1, 0, 1))
    """
    size = len(matrix)
    work = [[Fraction(x) for x in row] for row in matrix]
    if any(len(row) != size for row in work):
        raise InputError("the matrix is not square")
    if any(work[i][j] != work[j][i] for i in range(size) for j in range(i)):
        raise InputError("the matrix is not symmetric")
    active = list(range(size))
    positive = negative = 0
    while active:
        pivot = next((i for i in active if work[i][i] != 0), None)
        if pivot is None:
            pair = next(((i, j) for i in active for j in active if i < j and work[i][j] != 0), None)
            if pair is None:
                break
            i, j = pair  # e_i + e_j has square 2·work[i][j] ≠ 0
            for k in range(size):
                work[i][k] += work[j][k]
            for k in range(size):
                work[k][i] += work[k][j]
            pivot = i
        value = work[pivot][pivot]
        if value > 0:
            positive += 1
        else:
            negative += 1
        active.remove(pivot)
        row = work[pivot]
        for i in active:
            factor = work[i][pivot] / value
            if factor:
                target = work[i]
                for j in active:
                    target[j] -= factor * row[j]
    return positive, negative, size - positive - negative


def matrix_signature(seifert: Matrix) -> int:
    """The signature of ``V + Vᵀ`` for a square integer matrix ``V``.

    >>> matrix_signature([[-1, 0], [1, -1]])
    -2
    """
    size = len(seifert)
    positive, negative, _ = inertia([[seifert[i][j] + seifert[j][i] for j in range(size)] for i in range(size)])
    return positive - negative


# ---------------------------------------------------------------------------- cyclotomic fields


def _poly_divide_exact(numerator: list[int], denominator: list[int]) -> list[int]:
    """Exact division of integer polynomials (coefficients from degree 0), monic denominator."""
    num = list(numerator)
    out = [0] * (len(num) - len(denominator) + 1)
    for k in range(len(out) - 1, -1, -1):
        coeff = num[k + len(denominator) - 1]
        out[k] = coeff
        if coeff:
            for i, d in enumerate(denominator):
                num[k + i] -= coeff * d
    if any(num):
        raise InternalError("inexact polynomial division")  # pragma: no cover
    return out


@lru_cache(maxsize=None)
def _cyclotomic_polynomial(order: int) -> tuple[int, ...]:
    """Coefficients (degree 0 first) of the ``order``-th cyclotomic polynomial."""
    poly = [-1] + [0] * (order - 1) + [1]
    for divisor in range(1, order):
        if order % divisor == 0:
            poly = _poly_divide_exact(poly, list(_cyclotomic_polynomial(divisor)))
    return tuple(poly)


class _Field:
    """``Q(ζ)`` for a primitive root of unity ``ζ`` of the given order.

    An element is ``(numerators, denominator)``: the number ``Σ numerators[j] ζ^j / denominator``
    with ``j < φ(order)``, the denominator positive and the whole in lowest terms.
    """

    def __init__(self, order: int):
        self.order = order
        self.modulus = _cyclotomic_polynomial(order)
        self.degree = len(self.modulus) - 1
        self.sparse_modulus = [(i, c) for i, c in enumerate(self.modulus[:-1]) if c]
        self.zero = ((0,) * self.degree, 1)
        self.one = self.power(0)

    def normal(self, numerators: list[int], denominator: int):
        common = denominator
        for value in numerators:
            if value:
                common = gcd(common, value)
                if common == 1:
                    break
        if denominator < 0:
            common = -common
        if common != 1:
            numerators = [value // common for value in numerators]
            denominator //= common
        return tuple(numerators), denominator

    def reduce(self, coefficients: list[int]) -> list[int]:
        """Coefficients of a polynomial in ζ, reduced modulo ``ζ^order = 1`` and the cyclotomic polynomial."""
        degree, order = self.degree, self.order
        if len(coefficients) > order:
            folded = coefficients[:order]
            for k in range(order, len(coefficients)):
                folded[k % order] += coefficients[k]
            coefficients = folded
        for k in range(len(coefficients) - 1, degree - 1, -1):
            value = coefficients[k]
            if value:
                base = k - degree
                for i, c in self.sparse_modulus:
                    coefficients[base + i] -= value * c
        return coefficients[:degree] + [0] * (degree - len(coefficients[:degree]))

    def power(self, exponent: int):
        exponent %= self.order
        coefficients = [0] * max(exponent + 1, self.degree)
        coefficients[exponent] = 1
        return self.normal(self.reduce(coefficients), 1)

    def integer(self, value: int):
        return self.normal([value] + [0] * (self.degree - 1), 1)

    def add(self, x, y):
        (a, p), (b, q) = x, y
        if p == q:
            return self.normal([u + v for u, v in zip(a, b)], p)
        return self.normal([u * q + v * p for u, v in zip(a, b)], p * q)

    def neg(self, x):
        return tuple(-u for u in x[0]), x[1]

    def sub(self, x, y):
        return self.add(x, self.neg(y))

    def mul(self, x, y):
        (a, p), (b, q) = x, y
        # Kronecker substitution: pack each vector into one integer, multiply once, unpack
        bound = max(map(abs, a)) * max(map(abs, b)) * self.degree
        if bound == 0:
            return self.zero
        width = bound.bit_length() + 2
        packed = 0
        for u in reversed(a):
            packed = (packed << width) + u
        other = 0
        for v in reversed(b):
            other = (other << width) + v
        product = packed * other
        mask, half, base = (1 << width) - 1, 1 << (width - 1), 1 << width
        coefficients = []
        for _ in range(2 * self.degree - 1):
            digit = product & mask
            product >>= width
            if digit >= half:
                digit -= base
                product += 1
            coefficients.append(digit)
        return self.normal(self.reduce(coefficients), p * q)

    def is_zero(self, x) -> bool:
        return not any(x[0])

    def conjugate(self, x):
        total = [0] * (self.order + 1)
        for j, u in enumerate(x[0]):
            if u:
                total[(-j) % self.order] += u
        return self.normal(self.reduce(total), x[1])

    def galois(self, x, exponent: int):
        """The image of ``x`` under the automorphism ``ζ -> ζ^exponent``."""
        total = [0] * (self.order + 1)
        for j, u in enumerate(x[0]):
            if u:
                total[(j * exponent) % self.order] += u
        return self.normal(self.reduce(total), x[1])

    def inverse(self, x):
        """``1/x`` as the product of the other Galois conjugates of ``x`` over its norm."""
        if self.is_zero(x):
            raise ZeroDivisionError("inverse of zero in a cyclotomic field")
        numerators, denominator = x
        whole = (numerators, 1)
        product = self.one
        for exponent in range(2, self.order):
            if gcd(exponent, self.order) == 1:
                product = self.mul(product, self.galois(whole, exponent))
        norm = self.mul(product, whole)  # a rational number: Π of all conjugates
        (constant, *rest), norm_denominator = norm
        if any(rest):
            raise InternalError("the norm is not rational")  # pragma: no cover
        # 1/x = denominator · product / norm
        scale_numerator = denominator * norm_denominator
        return self.normal([u * scale_numerator * (1 if constant > 0 else -1) for u in product[0]],
                           product[1] * abs(constant))


# ---------------------------------------------------------------------------- exact real signs


@lru_cache(maxsize=None)
def _chebyshev_first_kind(count: int) -> tuple[tuple[int, ...], ...]:
    """T_0, ..., T_{count-1} as integer coefficient tuples (degree 0 first)."""
    polys = [[1], [0, 1]]
    while len(polys) < count:
        previous, current = polys[-2], polys[-1]
        following = [0] + [2 * c for c in current]
        for i, c in enumerate(previous):
            following[i] -= c
        polys.append(following)
    return tuple(tuple(p) for p in polys[:count])


def _roots_above(order: int, numerator: int, exponent: int) -> int:
    """How many of the numbers cos(πj/order), 0 < j < order, exceed ``numerator / 2^exponent``.

    Those are the roots of the Chebyshev polynomial ``U_{order-1}``; ``U_0, ..., U_{order-1}``
    is a Sturm chain (three-term recurrence), so the count is the number of sign changes in it.
    ``W_k = 2^(k·exponent) U_k(x)`` keeps the recurrence in integers.
    """
    changes, last = 0, 1  # W_0 = 1
    square = 1 << (2 * exponent)
    previous, current = 1, 2 * numerator
    for _ in range(1, order):
        if current:
            if (current > 0) != (last > 0):
                changes += 1
            last = current
        previous, current = current, 2 * numerator * current - square * previous
    return changes


class _Cosine:
    """Ever finer dyadic intervals around y = cos(π·index/order), a simple root of ``U_{order-1}``.

    ``levels[i] = (lo, exponent)`` stands for the interval ``[lo, lo + 1] / 2^exponent`` that
    holds y and no other root; each level halves the previous one.  Shared by all signs.
    """

    def __init__(self, order: int, index: int):
        self.order, self.index = order, index
        lo, exponent = (0 if _roots_above(order, 0, 0) >= index else -1), 0
        while _roots_above(order, lo, exponent) - _roots_above(order, lo + 1, exponent) > 1:
            lo, exponent = self._halve(lo, exponent)
        self.levels = [(lo, exponent)]

    def _halve(self, lo: int, exponent: int) -> tuple[int, int]:
        lo, exponent = 2 * lo, exponent + 1
        if _roots_above(self.order, lo + 1, exponent) >= self.index:  # y > midpoint
            lo += 1
        return lo, exponent

    def level(self, number: int) -> tuple[int, int]:
        while len(self.levels) <= number:
            self.levels.append(self._halve(*self.levels[-1]))
        return self.levels[number]


@lru_cache(maxsize=None)
def _cosine(order: int, index: int) -> _Cosine:
    return _Cosine(order, index)


def _sign_of_real(field: _Field, element, step: int) -> int:
    """The sign of a real element of ``Q(ζ)`` under ``ζ -> e^(2πi·step/order)``."""
    order = field.order
    chebyshev = _chebyshev_first_kind(field.degree)
    # Re(ζ^j) = cos(2π·step·j/order) = T_j(y) with y = cos(2π·step/order)
    poly = [0] * field.degree
    for j, value in enumerate(element[0]):
        if value:
            for i, c in enumerate(chebyshev[j]):
                poly[i] += value * c
    while len(poly) > 1 and poly[-1] == 0:
        poly.pop()
    if len(poly) == 1:
        return (poly[0] > 0) - (poly[0] < 0)
    index = (2 * step) % (2 * order)
    if index > order:
        index = 2 * order - index
    cosine = _cosine(order, index)
    degree = len(poly) - 1
    slope = sum(k * abs(c) for k, c in enumerate(poly))  # bounds |poly'| on [-1, 1]
    number = 0
    while True:
        lo, exponent = cosine.level(number)
        # the midpoint m = (2·lo + 1) / 2^q, q = exponent + 1; value = 2^(q·degree)·poly(m)
        q = exponent + 1
        middle = 2 * lo + 1
        value = 0
        for i in range(degree, -1, -1):
            value = value * middle + (poly[i] << (q * (degree - i)))
        # |poly(x) - poly(m)| ≤ slope·2^-q on the interval, which holds y
        if abs(value) > slope << (q * degree - q):
            return 1 if value > 0 else -1
        number += 1


def _hermitian_signature(field: _Field, matrix: list[list], step: int) -> tuple[int, int, int]:
    """(positive, negative, zero) for a Hermitian matrix over ``field`` at ``ζ -> e^(2πi·step/order)``."""
    size = len(matrix)
    work = [list(row) for row in matrix]
    active = list(range(size))
    positive = negative = 0
    zeta = field.power(1)
    while active:
        pivot = next((i for i in active if not field.is_zero(work[i][i])), None)
        if pivot is None:
            pair = next(((i, j) for i in active for j in active
                         if i < j and not field.is_zero(work[j][i])), None)
            if pair is None:
                break
            i, j = pair
            entry = work[j][i]
            real_part = field.add(entry, field.conjugate(entry))
            alpha = field.one if not field.is_zero(real_part) else zeta
            alpha_bar = field.conjugate(alpha)
            for k in range(size):
                work[i][k] = field.add(work[i][k], field.mul(alpha, work[j][k]))
            for k in range(size):
                work[k][i] = field.add(work[k][i], field.mul(alpha_bar, work[k][j]))
            pivot = i
        value = work[pivot][pivot]
        if _sign_of_real(field, value, step) > 0:
            positive += 1
        else:
            negative += 1
        active.remove(pivot)
        inverse = field.inverse(value)
        row = work[pivot]
        for place, i in enumerate(active):
            if field.is_zero(work[i][pivot]):
                continue
            factor = field.mul(work[i][pivot], inverse)
            target = work[i]
            for j in active[place:]:  # the Schur complement is Hermitian: fill the rest by symmetry
                if not field.is_zero(row[j]):
                    target[j] = field.sub(target[j], field.mul(factor, row[j]))
                    if j != i:
                        work[j][i] = field.conjugate(target[j])
    return positive, negative, size - positive - negative


def _reduced_root(k: int, n: int) -> tuple[int, int]:
    if not isinstance(n, int) or isinstance(n, bool) or n < 1:
        raise InputError(f"the order of the root of unity must be a positive integer, not {n!r}")
    if not isinstance(k, int) or isinstance(k, bool):
        raise InputError(f"the exponent of the root of unity must be an integer, not {k!r}")
    k %= n
    common = gcd(k, n)
    return k // common, n // common


def matrix_levine_tristram(seifert: Matrix, k: int, n: int) -> tuple[int, int]:
    """(signature, nullity) of ``(1 - ω)V + (1 - ω̄)Vᵀ`` for ``ω = e^(2πik/n)``, exactly.

    Parameters: ``seifert`` a square integer matrix ``V``; ``k``, ``n`` integers, ``n ≥ 1``.
    Returns the signature and the nullity of that Hermitian matrix.

    >>> matrix_levine_tristram([[-1, 0], [1, -1]], 1, 6)
    (-1, 1)
    """
    step, order = _reduced_root(k, n)
    size = len(seifert)
    if order == 1:
        return 0, size
    if order == 2:
        positive, negative, zero = inertia([[2 * (seifert[i][j] + seifert[j][i]) for j in range(size)]
                                            for i in range(size)])
        return positive - negative, zero
    field = _Field(order)
    omega = field.power(1)
    one_minus = field.sub(field.one, omega)
    one_minus_bar = field.conjugate(one_minus)
    matrix = [[field.add(field.mul(one_minus, field.integer(seifert[i][j])),
                         field.mul(one_minus_bar, field.integer(seifert[j][i])))
               for j in range(size)] for i in range(size)]
    positive, negative, zero = _hermitian_signature(field, matrix, step)
    return positive - negative, zero


# ---------------------------------------------------------------------------- diagrams


def signature(diagram: Diagram) -> int:
    """The signature of the link: the signature of ``V + Vᵀ`` for the canonical Seifert matrix.

    Parameters: ``diagram``.  Returns an int; ``σ(3_1) = -2`` for the positive trefoil.

    >>> from movies.diagram.pd import from_pd
    >>> signature(from_pd([[4, 2, 3, 1], [2, 4, 1, 3]]))  # positive Hopf link
    -1
    """
    return matrix_signature(seifert_surface(diagram).matrix)


def nullity(diagram: Diagram) -> int:
    """The nullity of the link: nullity of ``V + Vᵀ`` for a connected Seifert surface.

    Parameters: ``diagram``.  Returns an int.  The canonical surface of a split diagram has one
    component per piece; tubes joining them add one null class each, so ``pieces - 1`` is added.

    >>> from movies.diagram.pd import from_pd
    >>> nullity(from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])), nullity(from_pd([], loops=3))
    (0, 2)
    """
    surface = seifert_surface(diagram)
    size = len(surface.matrix)
    _, _, zero = inertia([[surface.matrix[i][j] + surface.matrix[j][i] for j in range(size)]
                          for i in range(size)])
    return zero + max(surface.pieces - 1, 0)


def levine_tristram(diagram: Diagram, k: int, n: int) -> int:
    """The Levine–Tristram signature at ``ω = e^(2πik/n)``.

    Parameters: ``diagram``; integers ``k`` and ``n ≥ 1``.  Returns the signature of
    ``(1 - ω)V + (1 - ω̄)Vᵀ`` (0 at ``ω = 1``; the signature at ``ω = -1``).

    >>> from movies.diagram.pd import from_pd
    >>> trefoil = from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]])
    >>> [levine_tristram(trefoil, k, 12) for k in range(12)]
    [0, 0, -1, -2, -2, -2, -2, -2, -2, -2, -1, 0]
    """
    return matrix_levine_tristram(seifert_surface(diagram).matrix, k, n)[0]


def levine_tristram_all(diagram: Diagram, n: int) -> dict[int, int]:
    """The Levine–Tristram signatures at every ``n``-th root of unity ``e^(2πik/n)``, ``0 ≤ k < n``.

    Parameters: ``diagram``; ``n ≥ 1``.  Returns ``{k: σ}``.

    >>> from movies.diagram.pd import from_pd
    >>> levine_tristram_all(from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]), 4)
    {0: 0, 1: -2, 2: -2, 3: -2}
    """
    matrix = seifert_surface(diagram).matrix
    return {k: matrix_levine_tristram(matrix, k, n)[0] for k in range(n)}


def is_prime_power(number: int) -> bool:
    """True when ``number`` is ``p^e`` for a prime ``p`` and ``e ≥ 1``.

    >>> [m for m in range(1, 13) if is_prime_power(m)]
    [2, 3, 4, 5, 7, 8, 9, 11]
    """
    if number < 2:
        return False
    p = next(d for d in range(2, number + 1) if number % d == 0)
    while number % p == 0:
        number //= p
    return number == 1


def levine_tristram_bound(diagram: Diagram, n: int) -> int:
    """The largest ``|σ_ω|`` over the ``n``-th roots of unity ``ω`` whose order is a prime power.

    Parameters: ``diagram``; ``n ≥ 1``.  Returns an int.  For a knot, ``|σ_ω| ≤ 2·g₄`` at every
    root of unity of prime-power order (Tristram; Levine), so half of this, rounded up, bounds
    the smooth four-genus from below.  Roots of other orders are left out because there the
    signature need not be a concordance invariant.

    >>> from movies.diagram.pd import from_pd
    >>> levine_tristram_bound(from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]), 6)
    2
    """
    matrix = seifert_surface(diagram).matrix
    best = 0
    for k in range(1, n):
        _, order = _reduced_root(k, n)
        if is_prime_power(order):
            best = max(best, abs(matrix_levine_tristram(matrix, k, n)[0]))
    return best
