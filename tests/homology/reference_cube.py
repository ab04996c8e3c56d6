"""Khovanov homology from the whole cube of resolutions: slow, plain, independent of the engine.

The test oracle for the scanning engine. Conventions (the same as the engine's):

* crossing ``(a, b, c, d)``: the 0-smoothing joins ``a``-``b`` and ``c``-``d``, the 1-smoothing
  ``a``-``d`` and ``b``-``c``;
* a generator is a state ``v`` in {0,1}^n and a label 1 or X on each circle of the resolution;
  its homological degree is ``|v| - n_-`` and its q-degree ``|v| + #1 - #X + n_+ - 2 n_-``;
* the differential is the sum over edges of the cube, the edge changing coordinate ``i`` carries
  the sign ``(-1)^(number of 1s before i)``, merges act by m and splits by Delta with H = 0:
  m(1,1) = 1, m(1,X) = m(X,1) = X, m(X,X) = 0; Delta(1) = 1X + X1, Delta(X) = XX;
* reduced homology through a basepoint on an edge: the subcomplex where the basepoint's circle
  is labelled X, its q-degrees raised by one.

Ranks over Q (Fractions) and F_p by sparse Gaussian elimination, and the torsion over Z by a
small Smith normal form.
"""

from __future__ import annotations

from fractions import Fraction

__all__ = ["cube_complex", "cube_homology", "cube_homology_z"]


def _signs(pd):
    # import here so that the module has no other dependency on the package than signs
    from movies.diagram.pd import crossing_signs

    return crossing_signs(pd)


def _circles(pd, state):
    """circle index of every label in the resolution ``state`` (a tuple of 0/1)."""
    parent = {}

    def find(x):
        parent.setdefault(x, x)
        while parent[x] != x:
            parent[x] = parent[parent[x]]
            x = parent[x]
        return x

    def union(x, y):
        rx, ry = find(x), find(y)
        if rx != ry:
            parent[rx] = ry

    for (a, b, c, d), s in zip(pd, state):
        if s == 0:
            union(a, b)
            union(c, d)
        else:
            union(a, d)
            union(b, c)
    roots = {}
    return {label: roots.setdefault(find(label), len(roots)) for label in sorted(parent)}


def cube_complex(pd, loops=0, basepoint=None):
    """The Khovanov complex (H = 0) of a PD code, as plain data.

    Returns (generators, differential): ``generators`` is a list of (h, q) bidegrees,
    ``differential`` a dict {(source, target): integer coefficient}. With ``basepoint`` (an
    edge label) the reduced complex.
    """
    pd = [tuple(c) for c in pd]
    n = len(pd)
    signs = _signs(pd) if pd else []
    n_plus = sum(1 for s in signs if s > 0)
    n_minus = n - n_plus
    states = [tuple((v >> (n - 1 - i)) & 1 for i in range(n)) for v in range(1 << n)]
    gens = []  # (h, q)
    index = {}  # (state, labels tuple) -> generator index
    per_state = {}  # state -> [(labels, generator index)]
    info = {}
    for state in states:
        circ = _circles(pd, state) if n else {}
        count = (max(circ.values()) + 1 if circ else 0) + loops
        info[state] = (circ, count)
        base = None if basepoint is None else circ[basepoint]
        for lab in range(1 << count):
            labels = tuple((lab >> k) & 1 for k in range(count))  # 1 means X
            if base is not None and labels[base] != 1:
                continue
            xs = sum(labels)
            h = sum(state) - n_minus
            q = sum(state) + (count - xs) - xs + n_plus - 2 * n_minus
            if basepoint is not None:
                q += 1
            index[(state, labels)] = len(gens)
            per_state.setdefault(state, []).append((labels, len(gens)))
            gens.append((h, q))
    diff = {}
    for state in states:
        circ, count = info[state]
        for i in range(n):
            if state[i]:
                continue
            target = state[:i] + (1,) + state[i + 1:]
            sign = -1 if sum(state[:i]) % 2 else 1
            tcirc, tcount = info[target]
            a, b, c, d = pd[i]
            # map circles of the source to circles of the target (the others are untouched)
            for labels, g in per_state.get(state, []):
                images = _edge_map(circ, count, tcirc, tcount, pd[i], labels, loops)
                for tlabels, coeff in images:
                    key = (target, tlabels)
                    if key in index:
                        diff[(g, index[key])] = diff.get((g, index[key]), 0) + sign * coeff
    return gens, {k: v for k, v in diff.items() if v}


def _edge_map(circ, count, tcirc, tcount, crossing, labels, loops):
    """Images of one generator along one edge of the cube: list of (target labels, coeff)."""
    a, b, c, d = crossing
    ca, cc = circ[a], circ[c]
    # every source circle other than those at the crossing survives unchanged in the target:
    # find it through any of its labels
    src_of_label = circ
    tgt_of_label = tcirc
    mapping = {}
    for label, s in src_of_label.items():
        mapping.setdefault(s, set()).add(tgt_of_label[label])
    n_closed = count - loops
    t_closed = tcount - loops
    if ca != cc:  # merge: two circles become one
        la, lc = labels[ca], labels[cc]
        if la and lc:
            return []
        value = la | lc
        out = [0] * tcount
        for s in range(n_closed):
            if s in (ca, cc):
                continue
            (t,) = mapping[s]
            out[t] = labels[s]
        out[tcirc[a]] = value
        for k in range(loops):
            out[t_closed + k] = labels[n_closed + k]
        return [(tuple(out), 1)]
    # split: one circle becomes two
    ta, tb = tcirc[a], tcirc[b]
    base = [0] * tcount
    for s in range(n_closed):
        if s == ca:
            continue
        (t,) = mapping[s]
        base[t] = labels[s]
    for k in range(loops):
        base[t_closed + k] = labels[n_closed + k]
    results = []
    if labels[ca]:  # Delta(X) = X X
        out = list(base)
        out[ta] = out[tb] = 1
        results.append((tuple(out), 1))
    else:  # Delta(1) = 1 X + X 1
        for x, y in ((0, 1), (1, 0)):
            out = list(base)
            out[ta], out[tb] = x, y
            results.append((tuple(out), 1))
    return results


def _unit_pass(rows):
    """Eliminate pivots that are +-1, in integers: (rank found, remaining rows as dicts).

    Row i and column j of a unit pivot go; the other rows change by integer multiples of row i,
    so the rank over any ring and the invariant factors of the rest are those of the whole.
    """
    rows = [dict(r) for r in rows if r]
    cols = {}
    for a, r in enumerate(rows):
        for j in r:
            cols.setdefault(j, set()).add(a)
    alive = set(range(len(rows)))
    rank = 0
    progress = True
    while progress:
        progress = False
        for a in list(alive):
            if a not in alive:
                continue
            r = rows[a]
            j = next((j for j, v in r.items() if v in (1, -1)), None)
            if j is None:
                continue
            pv = r[j]
            alive.discard(a)
            for jj in r:
                cols[jj].discard(a)
            for b in list(cols.get(j, ())):
                rb = rows[b]
                f = rb[j] * pv
                for jj, v in r.items():
                    nv = rb.get(jj, 0) - f * v
                    if nv:
                        if jj not in rb:
                            cols[jj].add(b)
                        rb[jj] = nv
                    else:
                        rb.pop(jj, None)
                        cols[jj].discard(b)
                if not rb:
                    alive.discard(b)
            rank += 1
            progress = True
    return rank, [rows[a] for a in sorted(alive) if rows[a]]


def _rank(rows, p):
    """Rank of a sparse matrix (list of dict rows) over F_p (p > 0) or Q (p = 0)."""
    rank, rows = _unit_pass(rows)
    pivots = {}  # column -> reduced row
    for row in rows:
        row = {k: (Fraction(v) if p == 0 else v % p) for k, v in row.items()}
        row = {k: v for k, v in row.items() if v}
        while row:
            col = min(row)
            if col not in pivots:
                pivots[col] = row
                rank += 1
                break
            prow = pivots[col]
            factor = row[col] / prow[col] if p == 0 else row[col] * pow(prow[col], -1, p) % p
            for k, v in prow.items():
                nv = row.get(k, 0) - factor * v
                if p:
                    nv %= p
                if nv:
                    row[k] = nv
                else:
                    row.pop(k, None)
    return rank


def _blocks(gens, diff):
    """{(h, q): [generators]} and the differential split by source block."""
    by = {}
    for g, hq in enumerate(gens):
        by.setdefault(hq, []).append(g)
    rows = {}
    for (s, t), v in diff.items():
        rows.setdefault(s, {})[t] = v
    return by, rows


def cube_homology(pd, p=0, loops=0, basepoint=None):
    """{(h, q): dimension} of Khovanov homology over Q (p = 0) or F_p, from the cube."""
    gens, diff = cube_complex(pd, loops, basepoint)
    by, rows = _blocks(gens, diff)
    rank = {}
    for hq, members in by.items():
        rank[hq] = _rank([rows.get(g, {}) for g in members], p)
    result = {}
    for (h, q), members in by.items():
        dim = len(members) - rank[(h, q)] - rank.get((h - 1, q), 0)
        if dim:
            result[(h, q)] = dim
    return dict(sorted(result.items()))


def _smith_diagonal(matrix):
    """Nonzero invariant factors of an integer matrix (list of lists)."""
    m = [list(r) for r in matrix]
    out = []
    while True:
        entries = [(abs(v), i, j) for i, r in enumerate(m) for j, v in enumerate(r) if v]
        if not entries:
            return out
        _, i, j = min(entries)
        while True:
            pv = m[i][j]
            done = True
            for k in range(len(m)):
                if k != i and m[k][j]:
                    f = m[k][j] // pv
                    m[k] = [x - f * y for x, y in zip(m[k], m[i])]
                    if m[k][j]:
                        done = False
            for k in range(len(m[0])):
                if k != j and m[i][k]:
                    f = m[i][k] // pv
                    for r in m:
                        r[k] -= f * r[j]
                    if m[i][k]:
                        done = False
            if done:
                # the pivot must divide every remaining entry
                bad = [(a, b) for a, r in enumerate(m) for b, v in enumerate(r)
                       if a != i and b != j and v % pv]
                if not bad:
                    break
                a, _ = bad[0]
                m[i] = [x + y for x, y in zip(m[i], m[a])]
                continue
            entries = [(abs(m[a][j]), a, j) for a in range(len(m)) if m[a][j]]
            entries += [(abs(m[i][b]), i, b) for b in range(len(m[0])) if m[i][b]]
            _, i, j = min(entries)
        out.append(abs(m[i][j]))
        m = [r[:j] + r[j + 1:] for a, r in enumerate(m) if a != i]
        if not m or not m[0]:
            return out


def cube_homology_z(pd, loops=0):
    """Integral Khovanov homology from the cube: {"free": {(h,q): rank}, "torsion": {(h,q): {n: count}}}."""
    gens, diff = cube_complex(pd, loops)
    by, rows = _blocks(gens, diff)
    factors = {}
    for (h, q), members in by.items():
        targets = by.get((h + 1, q), [])
        units, rest = _unit_pass([rows.get(g, {}) for g in members])
        cols = sorted({t for r in rest for t in r})
        pos = {t: k for k, t in enumerate(cols)}
        matrix = [[0] * len(cols) for _ in rest]
        for a, r in enumerate(rest):
            for t, v in r.items():
                matrix[a][pos[t]] = v
        factors[(h, q)] = [1] * units + (_smith_diagonal(matrix) if matrix and cols else [])
    free, torsion = {}, {}
    for (h, q), members in by.items():
        rank = len(factors[(h, q)]) + len(factors.get((h - 1, q), []))
        if len(members) - rank:
            free[(h, q)] = len(members) - rank
        for f in factors.get((h - 1, q), []):
            if f > 1:
                torsion.setdefault((h, q), {})
                torsion[(h, q)][f] = torsion[(h, q)].get(f, 0) + 1
    return {"free": dict(sorted(free.items())), "torsion": dict(sorted(torsion.items()))}
