"""The Kauffman bracket and the Jones polynomial of a PD code, by scanning.

Conventions:

* PD code: a crossing is four edge labels ``(a, b, c, d)`` read counterclockwise from the incoming
  under-strand, so ``a -> c`` is the under-strand. Crossingless circles are not in the code; they
  are counted by ``loops``.
* Bracket: ``<X> = A <0-smoothing> + A^-1 <1-smoothing>``, where the 0-smoothing (A-smoothing)
  joins ``a``-``b`` and ``c``-``d`` and the 1-smoothing (B-smoothing) joins ``a``-``d`` and
  ``b``-``c``; a closed circle is worth ``d = -A^2 - A^-2`` and ``<O> = 1``, so a crossingless
  diagram of ``c`` circles has bracket ``d^(c-1)``.
* Jones: ``V(L) = (-A^3)^(-w) <L>`` with ``A = t^(-1/4)``, ``w`` the writhe. This gives
  ``V(3_1) = t + t^3 - t^4`` for the right-handed trefoil and ``-t^(1/2) - t^(5/2)`` for the
  positive Hopf link.
* The empty diagram (no crossings, no circles) is refused with :class:`EmptyDiagramError`: the
  disjoint-union rule ``<D u O> = d <D>`` would make its bracket ``1/d``, which is not a Laurent
  polynomial.

The algorithm: the crossings of each connected piece are added one at a time, in a greedy order
that keeps the boundary of the processed part short. The state is a dict from a perfect matching
of the current boundary points (a tuple ``partner[i]``) to its coefficient. When a crossing is
added, each state is split into its two smoothings, arcs are joined through the labels that the
crossing glues, and every closed circle multiplies by ``d``. Coefficients are exact integers that
encode a polynomial in ``u = A^2`` by its value at ``u = 2^S`` (``S`` large enough that every
coefficient of the result fits in a balanced base-``2^S`` digit), so the inner loop does only
integer shifts and additions.

>>> trefoil = [(1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)]
>>> print(kauffman_bracket_pd(trefoil))
A^(-7) - A^(-3) - A^5
>>> print(jones_polynomial_pd(trefoil, writhe=3))
t + t^3 - t^4
"""

from __future__ import annotations

from fractions import Fraction

from movies.algebra.laurent import LaurentPolynomial
from movies.errors import EmptyDiagramError, InternalError, PDCodeError
from movies.diagram.scan_order import checked_pd, connected_pieces, piece_order

__all__ = [
    "EmptyDiagramError",
    "kauffman_bracket_pd",
    "jones_polynomial_pd",
    "kauffman_bracket",
    "jones_polynomial",
]


#: d = -A^2 - A^-2, the value of a closed circle
_D = LaurentPolynomial({2: -1, -2: -1}, "A")
_ONE_A = LaurentPolynomial({0: 1}, "A")

# The two smoothings as slot pairings: _ARCS[s][i] is the slot joined to slot i.
_ARC_A = (1, 0, 3, 2)  # a-b, c-d
_ARC_B = (3, 2, 1, 0)  # a-d, b-c


# ------------------------------------------------------------------------------------- checking
def _check_loops(loops) -> int:
    if isinstance(loops, bool) or not isinstance(loops, int) or loops < 0:
        raise PDCodeError(f"loops must be a non-negative integer, not {loops!r}")
    return loops



# ------------------------------------------------------------------------------------- scanning
def _pattern_result(kind, gslot, pat, arc, nk):
    """Smooth one crossing for one local pattern.

    ``kind[s]`` is (0, k) for a slot glued to boundary point number k of the glued list, (1, s2)
    for a slot whose edge returns to slot s2 of the same crossing, (2, r) for a slot whose edge
    is new boundary point r. ``pat[k]`` is the glued index of the state-partner of glued point k,
    or -1 when that partner stays on the boundary. Ends are numbered: ext end k (the outside
    partner of glued point k) is k; new end r is nk + r. Returns (loops, pairs of ends).
    """
    visited = [False] * 4

    def trace(s):
        while True:
            visited[s] = True
            t = arc[s]
            visited[t] = True
            kd, v = kind[t]
            if kd == 2:
                return nk + v
            if kd == 1:
                s = v
                continue
            p = pat[v]
            if p < 0:
                return v
            s = gslot[p]

    pairs = []
    for k in range(nk):
        if pat[k] < 0 and not visited[gslot[k]]:
            pairs.append((k, trace(gslot[k])))
    for s in range(4):
        if kind[s][0] == 2 and not visited[s]:
            pairs.append((nk + kind[s][1], trace(s)))
    loops = 0
    for s0 in range(4):
        if not visited[s0]:
            loops += 1
            s = s0
            while not visited[s]:
                visited[s] = True
                t = arc[s]
                visited[t] = True
                kd, v = kind[t]
                s = v if kd == 1 else gslot[pat[v]]
    return loops, tuple(pairs)


def _decode(value: int, bits: int) -> list:
    """Balanced base-2^bits digits of ``value``, lowest first."""
    digits = []
    base = 1 << bits
    half = base >> 1
    mask = base - 1
    while value:
        r = value & mask
        if r >= half:
            r -= base
        digits.append(r)
        value = (value - r) >> bits
    return digits


def _bracket_piece(cross: list) -> LaurentPolynomial:
    """The bracket (with <O> = 1) of one connected piece with at least one crossing."""
    order = piece_order(cross)
    n = len(cross)
    bits = 2 * n + 3  # every coefficient has |c| <= 4^n (at most 2^n states, <= n+1 circles each)
    two_bits = 2 * bits
    states = {(): 1}
    boundary: list = []
    pos: dict = {}
    offset = 0  # the encoded value is A^offset * bracket, as a polynomial in u = A^2
    for step, ci in enumerate(order):
        c = cross[ci]
        m = len(boundary)
        gl = []  # glued boundary positions
        gslot = []  # slot of each glued position
        kind = [None] * 4
        new_labels = []
        for s, label in enumerate(c):
            p = pos.get(label)
            if p is not None:
                kind[s] = (0, len(gl))
                gl.append(p)
                gslot.append(s)
            else:
                for s2 in range(4):
                    if s2 != s and c[s2] == label:
                        kind[s] = (1, s2)
                        break
                else:
                    kind[s] = (2, len(new_labels))
                    new_labels.append(label)
        glued = set(gl)
        kept = [i for i in range(m) if i not in glued]
        mk = len(kept)
        km = [-1] * m
        for r, i in enumerate(kept):
            km[i] = r
        gidx = {p: k for k, p in enumerate(gl)}
        nk = len(gl)
        new_pos = list(range(mk, mk + len(new_labels)))
        pad = [0] * len(new_labels)
        max_loops = (4 - len(new_labels)) // 2
        final = mk + len(new_labels) == 0
        loop_shift = 1 if final else 0  # the last circle is <O> = 1
        # shifts (in powers of u) for (smoothing, loops): A -> u^(1+m-j), B -> u^(m-j)
        mm = max_loops - loop_shift
        offset += 1 + 2 * mm
        cache: dict = {}
        out: dict = {}
        out_get = out.get
        for key, val in states.items():
            pat = tuple([gidx.get(key[p], -1) for p in gl])
            res = cache.get(pat)
            if res is None:
                res = []
                for arc, extra in ((_ARC_A, 1), (_ARC_B, 0)):
                    loops, pairs = _pattern_result(kind, gslot, pat, arc, nk)
                    j = loops - loop_shift
                    res.append((pairs, bits * (extra + mm - j), j))
                cache[pat] = res
            base = [km[key[i]] for i in kept]
            if pad:
                base.extend(pad)
            ends = [km[key[p]] for p in gl]
            ends.extend(new_pos)
            for pairs, shift, j in res:
                new = base.copy()
                for e1, e2 in pairs:
                    p1 = ends[e1]
                    p2 = ends[e2]
                    new[p1] = p2
                    new[p2] = p1
                v = val << shift
                while j:
                    v = -(v + (v << two_bits))
                    j -= 1
                nkey = tuple(new)
                out[nkey] = out_get(nkey, 0) + v
        states = out
        for p in sorted(glued, reverse=True):
            del boundary[p]
        boundary.extend(new_labels)
        pos = {label: i for i, label in enumerate(boundary)}
    if boundary or len(states) > 1:  # pragma: no cover - every arc is glued by the last crossing
        raise InternalError("the bracket scan ended with open arcs")
    value = states.get((), 0)
    terms = {}
    for k, coeff in enumerate(_decode(value, bits)):
        if coeff:
            terms[Fraction(2 * k - offset)] = coeff
    return LaurentPolynomial._raw(terms, "A")


# ------------------------------------------------------------------------------------- public
def kauffman_bracket_pd(pd, loops: int = 0) -> LaurentPolynomial:
    """The Kauffman bracket, in the variable ``A``, of a PD code plus ``loops`` free circles.

    Normalised by ``<O> = 1``: a diagram of ``c`` crossingless circles has bracket ``d^(c-1)``
    with ``d = -A^2 - A^-2``, and a split union multiplies by ``d``. Raises
    :class:`EmptyDiagramError` for the empty diagram (no crossings, no loops) and
    :class:`~movies.errors.PDCodeError` for a code in which some label does not occur twice.

    >>> print(kauffman_bracket_pd([], loops=2))
    -A^(-2) - A^2
    >>> print(kauffman_bracket_pd([(1, 1, 2, 2)]))  # a positive kink
    -A^3
    >>> print(kauffman_bracket_pd([(4, 1, 3, 2), (2, 3, 1, 4)]))
    -A^(-4) - A^4
    """
    crossings = checked_pd(pd)
    loops = _check_loops(loops)
    if not crossings:
        if loops == 0:
            raise EmptyDiagramError(
                "the empty diagram has no Kauffman bracket: <D u O> = d <D> would make it 1/d, "
                "which is not a Laurent polynomial"
            )
        return _D ** (loops - 1)
    pieces = connected_pieces(crossings)
    result = _ONE_A
    for piece in pieces:
        result = result * _bracket_piece([crossings[i] for i in piece])
    extra = len(pieces) - 1 + loops
    if extra:
        result = result * _D**extra
    return result


def jones_polynomial_pd(pd, writhe: int, loops: int = 0) -> LaurentPolynomial:
    """The Jones polynomial, in ``t``, of a PD code of writhe ``writhe`` plus ``loops`` circles.

    ``V = (-A^3)^(-writhe) <D>`` with ``A = t^(-1/4)``. The writhe is the caller's (the PD code
    alone fixes it only together with an orientation rule); a writhe that no choice of signs can
    give (larger than the crossing count, or of the other parity) is refused with
    :class:`~movies.errors.PDCodeError`.

    >>> print(jones_polynomial_pd([(4, 1, 3, 2), (2, 3, 1, 4)], writhe=-2))
    -t^(-5/2) - t^(-1/2)
    >>> print(jones_polynomial_pd([], writhe=0, loops=1))
    1
    """
    if isinstance(writhe, bool) or not isinstance(writhe, int):
        raise PDCodeError(f"writhe must be an integer, not {writhe!r}")
    bracket = kauffman_bracket_pd(pd, loops)
    n = len(pd)
    if abs(writhe) > n or (writhe - n) % 2:
        raise PDCodeError(
            f"writhe {writhe} is impossible for a PD code with {n} crossing(s): a sum of {n} "
            f"signs +-1 lies between {-n} and {n} and has the parity of {n}"
        )
    sign = -1 if writhe % 2 else 1
    quarter = Fraction(-1, 4)
    terms = {}
    for e, c in bracket.as_dict().items():
        te = (e - 3 * writhe) * quarter
        if te.denominator > 2:
            raise PDCodeError(
                f"writhe {writhe} does not fit this PD code: the Jones polynomial would have the "
                f"exponent {te}"
            )
        terms[te] = sign * c
    return LaurentPolynomial._raw(terms, "t")


def kauffman_bracket(diagram) -> LaurentPolynomial:
    """The Kauffman bracket of a Diagram (its PD code and its crossingless circles).

    >>> from movies.diagram.constructors import unlink
    >>> print(kauffman_bracket(unlink(2)))
    -A^(-2) - A^2
    """
    return kauffman_bracket_pd(diagram.pd_code(), loops=diagram.loop_count())


def jones_polynomial(diagram) -> LaurentPolynomial:
    """The Jones polynomial of a Diagram: its PD code, writhe and crossingless circles.

    ``diagram`` needs ``pd_code()`` (list of 4-tuples in the PD convention above), ``writhe()``
    and ``loop_count()``.

    >>> class Trefoil:
    ...     def pd_code(self): return [(1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)]
    ...     def writhe(self): return 3
    ...     def loop_count(self): return 0
    >>> print(jones_polynomial(Trefoil()))
    t + t^3 - t^4
    """
    return jones_polynomial_pd(diagram.pd_code(), diagram.writhe(), loops=diagram.loop_count())
