"""Dotted cobordisms between crossingless tangles, reduced to the disk basis.

A crossingless tangle on ``n`` boundary points (numbered 0..n-1) is a perfect matching, stored
as a tuple ``m`` with ``m[i]`` the partner of point ``i``. Between two matchings ``m1`` and ``m2``
the degree-0 morphisms of Bar-Natan's category (with the relations sphere = 0, dotted sphere =
1, two dots = H times one dot, neck cutting) form a free module over R[H] with one basis element
for each way to put a dot or no dot on the disks bounding the components of ``m1 ∪ m2``. The
components are numbered in the order of their smallest point (see :func:`components`); a
*pattern* is a bitmask, bit ``k`` set when disk ``k`` carries a dot.

Degrees pin down the powers of H. A basis element with pattern ``p`` from ``m1{a}`` to
``m2{b}`` has q-degree ``c - n/2 - 2|p| + b - a - 2k`` when it is multiplied by ``H^k`` (``c`` the
number of components), so in a degree-0 morphism every pattern comes with exactly one power of
H, and that power follows from the shifts. A morphism is therefore stored as
``{pattern: coefficient}`` and every computation is done at H = 1; the powers are read back off
the shifts where they are needed (only at the very end, or for H = 0).

At H = 1 the algebra is spanned by the idempotents e = X and f = 1 - X, with
Delta(e) = e ⊗ e and Delta(f) = -f ⊗ f: a connected surface with genus g, b boundary circles
and d dots is X for d >= 1 and e + (-1)^g f otherwise, pushed to its b circles by b - 1 splits.

>>> components((1, 0, 3, 2), (3, 2, 1, 0))
(1, (0, 0, 0, 0))
>>> sorted(compose((1, 0, 3, 2), (3, 2, 1, 0), (1, 0, 3, 2), 0, 0).items())
[(0, -1), (1, 1), (2, 1)]
"""

from __future__ import annotations

from movies.unionfind import partition_roots

__all__ = ["components", "component_terms", "compose", "compose_morphisms", "h_power"]

_components_cache: dict = {}


def components(m1: tuple, m2: tuple) -> tuple[int, tuple[int, ...]]:
    """The components of the closed curves ``m1 ∪ m2``.

    Parameters: two matchings on the same points. Returns ``(count, comp)`` with ``comp[i]`` the
    component through point ``i``; components are numbered by their smallest point.

    >>> components((1, 0), (1, 0))
    (1, (0, 0))
    >>> components((1, 0, 3, 2), (1, 0, 3, 2))
    (2, (0, 0, 1, 1))
    """
    key = (m1, m2)
    found = _components_cache.get(key)
    if found is not None:
        return found
    n = len(m1)
    comp = [-1] * n
    k = 0
    for i in range(n):
        if comp[i] < 0:
            j = i
            while comp[j] < 0:
                comp[j] = k
                j = m1[j]
                comp[j] = k
                j = m2[j]
            k += 1
    found = (k, tuple(comp))
    if len(_components_cache) > 400_000:
        _components_cache.clear()
    _components_cache[key] = found
    return found


def h_power(m1: tuple, m2: tuple, pattern: int, shift1: int, shift2: int) -> int:
    """The power of H that the basis element ``pattern`` carries in a degree-0 morphism.

    Parameters: source and target matchings, the pattern, and the q-shifts of source and
    target. Returns ``k`` (an integer; negative would mean the term cannot occur).

    >>> h_power((), (), 0, 1, 3)
    1
    >>> h_power((1, 0), (1, 0), 0, 0, 0), h_power((1, 0), (1, 0), 1, 0, 2)
    (0, 0)
    """
    count, _ = components(m1, m2)
    twice = count - len(m1) // 2 - 2 * bin(pattern).count("1") + shift2 - shift1
    return twice // 2


_terms_cache: dict = {}


def component_terms(genus: int, circles: int, dotted: bool) -> tuple[tuple[int, int], ...]:
    """A connected surface in the disk basis of its boundary circles, at H = 1.

    Parameters: its genus, its number of boundary circles (at least one) and whether it has a
    dot. Returns ``((mask, coefficient), ...)`` where bit ``i`` of ``mask`` dots circle ``i``.

    >>> component_terms(0, 1, False)  # a disk
    ((0, 1),)
    >>> component_terms(0, 2, False)  # neck cutting: dot on either side minus H times neither
    ((0, -1), (1, 1), (2, 1))
    >>> component_terms(1, 1, False)  # a handle: 2 dot - H
    ((0, -1), (1, 2))
    """
    key = (genus, circles, dotted)
    found = _terms_cache.get(key)
    if found is not None:
        return found
    full = (1 << circles) - 1
    if dotted:
        found = ((full, 1),)
    else:
        # e + (-1)^g f, then b - 1 splits: e^{⊗b} + (-1)^(g+b-1) f^{⊗b}; f = 1 - X
        sign = -1 if (genus + circles - 1) % 2 else 1
        terms = []
        for mask in range(full + 1):
            c = sign * (-1 if bin(mask).count("1") % 2 else 1)
            if mask == full:
                c += 1
            if c:
                terms.append((mask, c))
        found = tuple(terms)
    _terms_cache[key] = found
    return found


def expand(groups) -> dict[int, int]:
    """Multiply out connected surfaces: ``groups`` is a list of (genus, circle bits, dotted).

    ``circle bits`` lists the global bit of each boundary circle of that surface. Returns
    {mask over all circles: coefficient}.

    >>> expand([(0, [0], False), (0, [1], True)])
    {2: 1}
    """
    result = {0: 1}
    for genus, bits, dotted in groups:
        terms = component_terms(genus, len(bits), dotted)
        if len(terms) == 1 and terms[0][1] == 1:
            local = terms[0][0]
            mask = 0
            for i, b in enumerate(bits):
                if local >> i & 1:
                    mask |= 1 << b
            if mask:
                result = {k | mask: v for k, v in result.items()}
            continue
        new: dict[int, int] = {}
        for local, c in terms:
            mask = 0
            for i, b in enumerate(bits):
                if local >> i & 1:
                    mask |= 1 << b
            for k, v in result.items():
                key = k | mask
                new[key] = new.get(key, 0) + v * c
        result = {k: v for k, v in new.items() if v}
    return result


_compose_geometry: dict = {}
_compose_cache: dict = {}


def _geometry(mx: tuple, m: tuple, my: tuple):
    """How the disks of mx -> m and m -> my glue: (cd, cg, root of each piece, groups)."""
    key = (mx, m, my)
    found = _compose_geometry.get(key)
    if found is not None:
        return found
    cd, compd = components(mx, m)
    cg, compg = components(m, my)
    co, compo = components(mx, my)
    n = len(m)
    roots = partition_roots(cd + cg, [(compd[p], cd + compg[p]) for p in range(n) if p < m[p]])
    # boundary circles: components of mx ∪ my; circle k contains its smallest point
    circles_of: dict[int, list[int]] = {}
    first = [-1] * co
    for p in range(n):
        k = compo[p]
        if first[k] < 0:
            first[k] = p
            circles_of.setdefault(roots[compd[p]], []).append(k)
    pieces_of: dict[int, int] = {}
    for r in roots:
        pieces_of[r] = pieces_of.get(r, 0) + 1
    edges_of: dict[int, int] = {}
    for p in range(n):
        if p < m[p]:
            r = roots[compd[p]]
            edges_of[r] = edges_of.get(r, 0) + 1
    groups = []
    for r, circles in circles_of.items():
        chi = pieces_of[r] - edges_of.get(r, 0)
        twice_genus = 2 - chi - len(circles)
        groups.append((r, twice_genus // 2, circles))
    found = (cd, roots, groups)
    if len(_compose_geometry) > 200_000:
        _compose_geometry.clear()
    _compose_geometry[key] = found
    return found


def compose(mx: tuple, m: tuple, my: tuple, pd: int, pg: int) -> dict[int, int]:
    """Compose basis elements ``pd: mx -> m`` and ``pg: m -> my``, at H = 1.

    Parameters: three matchings on the same points and the two patterns. Returns
    {pattern of mx -> my: integer coefficient}.

    >>> compose((1, 0), (1, 0), (1, 0), 1, 1)  # two dots on one sheet: H times one dot
    {1: 1}
    """
    key = (mx, m, my, pd, pg)
    found = _compose_cache.get(key)
    if found is not None:
        return found
    cd, roots, groups = _geometry(mx, m, my)
    dotted = set()
    for i in range(len(roots)):
        bit = (pd >> i & 1) if i < cd else (pg >> (i - cd) & 1)
        if bit:
            dotted.add(roots[i])
    found = expand([(g, circles, r in dotted) for r, g, circles in groups])
    if len(_compose_cache) > 400_000:
        _compose_cache.clear()
    _compose_cache[key] = found
    return found


def compose_morphisms(mx: tuple, m: tuple, my: tuple, first: dict, second: dict) -> dict[int, int]:
    """Compose morphisms ``first: mx -> m`` and ``second: m -> my`` (dicts pattern -> coeff).

    Returns the composite as a dict without zero coefficients (integers, not reduced).

    >>> compose_morphisms((1, 0), (1, 0), (1, 0), {0: 2}, {1: 3})
    {1: 6}
    """
    result: dict[int, int] = {}
    for pd, cd in first.items():
        for pg, cg in second.items():
            c = cd * cg
            for k, v in compose(mx, m, my, pd, pg).items():
                result[k] = result.get(k, 0) + c * v
    return {k: v for k, v in result.items() if v}
