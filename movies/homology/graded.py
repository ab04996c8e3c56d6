"""Homology of the final complex: ranks over a field, torsion over Z, and modules over F[H].

The input is a :class:`~movies.homology.scanning.FinalComplex`: generators with bidegrees
``(h, q)`` and entries ``c`` standing for ``c·H^((q_target - q_source)/2)``.

* Khovanov homology is the case H = 0: only the entries between equal q-degrees survive, and
  the complex splits into blocks ``(h, q)``; ranks over Q or F_p by Gaussian elimination, over Z
  the Smith normal form gives the torsion.
* Bar-Natan homology over F[H] (a graded principal ideal domain): Gaussian elimination that
  always pivots on an entry with the smallest power of H is the graded Smith normal form
  (every other entry of the pivot's row and column is then a multiple of it). A pivot of
  power ``k`` from degree ``h`` to ``h + 1`` kills a free generator in each of the two degrees
  when ``k = 0`` and leaves a torsion summand ``F[H]/H^k`` at the target's bidegree otherwise.

>>> from movies.homology.scanning import FinalComplex
>>> trefoil = FinalComplex([(0, 1), (0, 3), (2, 5), (2, 7), (3, 7), (3, 9)],
...                        {(3, 4): 2, (3, 5): -1, (2, 4): 1})
>>> khovanov_ranks(trefoil, 0)
{(0, 1): 1, (0, 3): 1, (2, 5): 1, (3, 9): 1}
>>> bar_natan_module(trefoil, 2)
{'free': {(0, 1): 1, (0, 3): 1}, 'torsion': {(3, 9): {1: 1}, (3, 7): {1: 1}}}
"""

from __future__ import annotations

from fractions import Fraction

__all__ = ["khovanov_ranks", "khovanov_integral", "bar_natan_module"]


def _field(p: int):
    """(normalise, divide) for Q (p = 0, Fractions) or F_p."""
    if p:
        return (lambda v: v % p), (lambda a, b: a * pow(b, -1, p) % p)
    # integers stay integers while the pivots are +-1; Fractions only when needed
    return (lambda v: v), (lambda a, b: a * b if b in (1, -1) else Fraction(a) / b)


def _graded_pivots(sources, targets, entries, q, p: int):
    """Pivots (source, target, power of H) of graded elimination over F[H].

    ``sources``/``targets``: generator indices; ``entries``: {(i, j): c}; ``q``: q-degrees.
    """
    norm, div = _field(p)
    rows: dict[int, dict[int, object]] = {}
    src = set(sources)
    tgt = set(targets)
    for (i, j), c in entries.items():
        if i in src and j in tgt:
            c = norm(c)
            if c:
                rows.setdefault(i, {})[j] = c
    cols: dict[int, set] = {}
    for i, row in rows.items():
        for j in row:
            cols.setdefault(j, set()).add(i)
    pivots = []
    # bucket the entries by their power of H so that the smallest is found fast
    while rows:
        # the smallest power of H; among those a coefficient +-1 if there is one
        best = None
        for i, row in rows.items():
            qi = q[i]
            for j, c in row.items():
                key = (q[j] - qi, c not in (1, -1))
                if best is None or key < best[0]:
                    best = (key, i, j)
            if best[0] == (0, False):
                break
        (k, _), i, j = best
        best = (k, i, j)
        k, i, j = best
        prow = rows.pop(i)
        for jj in prow:
            cols[jj].discard(i)
        pv = prow[j]
        for i2 in list(cols.get(j, ())):
            row = rows[i2]
            f = div(row[j], pv)
            for jj, v in prow.items():
                nv = norm(row.get(jj, 0) - f * v)
                if nv:
                    if jj not in row:
                        cols[jj].add(i2)
                    row[jj] = nv
                elif jj in row:
                    del row[jj]
                    cols[jj].discard(i2)
            if not row:
                del rows[i2]
        cols.pop(j, None)
        pivots.append((i, j, k // 2))
    return pivots


def _by_degree(final):
    by: dict[int, list[int]] = {}
    for g, (h, _) in enumerate(final.generators):
        by.setdefault(h, []).append(g)
    return by


def bar_natan_module(final, p: int, degrees=None) -> dict:
    """Bar-Natan homology over F[H], F = Q (``p = 0``) or F_p.

    Returns {"free": {(h, q): rank}, "torsion": {(h, q): {k: count}}}: ``rank`` copies of F[H]
    generated in bidegree ``(h, q)``, and ``count`` summands F[H]/(H^k) generated there.
    With ``degrees`` (a set of homological degrees) only those degrees are computed.

    >>> from movies.homology.scanning import FinalComplex
    >>> bar_natan_module(FinalComplex([(0, -1), (1, 3)], {(0, 1): 1}), 0)
    {'free': {}, 'torsion': {(1, 3): {2: 1}}}
    """
    by = _by_degree(final)
    q = [g[1] for g in final.generators]
    # the free part in each degree: generators minus pivot sources of d_h minus pivot targets
    # of d_(h-1), as multisets of bidegrees (the two eliminations use different bases)
    free: dict = {}
    for hq in final.generators:
        if degrees is None or hq[0] in degrees:
            free[hq] = free.get(hq, 0) + 1
    torsion: dict = {}
    for h in sorted(by):
        if h + 1 not in by:
            continue
        if degrees is not None and h not in degrees and h + 1 not in degrees:
            continue
        for i, j, k in _graded_pivots(by[h], by[h + 1], final.entries, q, p):
            for g in (i, j):
                if final.generators[g] in free:
                    free[final.generators[g]] -= 1
            if k and (degrees is None or h + 1 in degrees):
                key = final.generators[j]
                torsion.setdefault(key, {})
                torsion[key][k] = torsion[key].get(k, 0) + 1
    if any(r < 0 for r in free.values()):  # pragma: no cover - a broken complex
        raise ArithmeticError("negative free rank: the input is not a graded complex")
    free = {hq: r for hq, r in free.items() if r}
    return {"free": dict(sorted(free.items())), "torsion": torsion}


def _blocks(final):
    """Generators by bidegree and the H^0 part of the differential."""
    by: dict = {}
    for g, hq in enumerate(final.generators):
        by.setdefault(hq, []).append(g)
    gens = final.generators
    entries = {(i, j): c for (i, j), c in final.entries.items() if gens[i][1] == gens[j][1]}
    return by, entries


def khovanov_ranks(final, p: int) -> dict:
    """Khovanov homology (H = 0) over Q (``p = 0``) or F_p: {(h, q): dimension}.

    >>> from movies.homology.scanning import FinalComplex
    >>> khovanov_ranks(FinalComplex([(0, 1), (1, 1)], {(0, 1): 2}), 2)
    {(0, 1): 1, (1, 1): 1}
    """
    by, entries = _blocks(final)
    q = [0] * len(final.generators)  # within a block every power of H is 0
    rank: dict = {}
    for (h, qq), members in by.items():
        targets = by.get((h + 1, qq))
        if targets:
            rank[(h, qq)] = len(_graded_pivots(members, targets, entries, q, p))
    result = {}
    for (h, qq), members in sorted(by.items()):
        dim = len(members) - rank.get((h, qq), 0) - rank.get((h - 1, qq), 0)
        if dim:
            result[(h, qq)] = dim
    return result


def _smith(matrix: list[list[int]]) -> list[int]:
    """The nonzero invariant factors of an integer matrix."""
    m = [row[:] for row in matrix if any(row)]
    factors = []
    while m and m[0]:
        nonzero = [(abs(v), a, b) for a, row in enumerate(m) for b, v in enumerate(row) if v]
        if not nonzero:
            break
        _, a, b = min(nonzero)
        while True:
            pv = m[a][b]
            clean = True
            for r in range(len(m)):
                if r != a and m[r][b]:
                    f = m[r][b] // pv
                    if f:
                        m[r] = [x - f * y for x, y in zip(m[r], m[a])]
                    if m[r][b]:
                        clean = False
            for c in range(len(m[a])):
                if c != b and m[a][c]:
                    f = m[a][c] // pv
                    if f:
                        for row in m:
                            row[c] -= f * row[b]
                    if m[a][c]:
                        clean = False
            if clean:
                bad = next((r for r in range(len(m)) if r != a and any(
                    v % pv for c, v in enumerate(m[r]) if c != b)), None)
                if bad is None:
                    break
                m[a] = [x + y for x, y in zip(m[a], m[bad])]
                continue
            nonzero = [(abs(m[r][b]), r, b) for r in range(len(m)) if m[r][b]]
            nonzero += [(abs(m[a][c]), a, c) for c in range(len(m[a])) if m[a][c]]
            _, a, b = min(nonzero)
        factors.append(abs(m[a][b]))
        m = [row[:b] + row[b + 1:] for r, row in enumerate(m) if r != a]
        m = [row for row in m if any(row)]
    return factors


def khovanov_integral(final) -> dict:
    """Khovanov homology over Z: {"free": {(h, q): rank}, "torsion": {(h, q): {n: count}}}.

    >>> from movies.homology.scanning import FinalComplex
    >>> khovanov_integral(FinalComplex([(0, 1), (1, 1)], {(0, 1): 2}))
    {'free': {}, 'torsion': {(1, 1): {2: 1}}}
    """
    by, entries = _blocks(final)
    rows: dict = {}
    for (i, j), c in entries.items():
        rows.setdefault(i, {})[j] = c
    factors: dict = {}
    for (h, qq), members in by.items():
        targets = by.get((h + 1, qq))
        if not targets:
            continue
        pos = {t: k for k, t in enumerate(targets)}
        used = [g for g in members if rows.get(g)]
        if not used:
            continue
        matrix = [[0] * len(targets) for _ in used]
        for a, g in enumerate(used):
            for t, c in rows[g].items():
                matrix[a][pos[t]] = c
        factors[(h, qq)] = _smith(matrix)
    free, torsion = {}, {}
    for (h, qq), members in sorted(by.items()):
        rank = len(factors.get((h, qq), ())) + len(factors.get((h - 1, qq), ()))
        if len(members) - rank:
            free[(h, qq)] = len(members) - rank
        for f in factors.get((h - 1, qq), ()):
            if f > 1:
                torsion.setdefault((h, qq), {})
                torsion[(h, qq)][f] = torsion[(h, qq)].get(f, 0) + 1
    return {"free": free, "torsion": torsion}
