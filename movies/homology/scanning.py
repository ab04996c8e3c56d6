"""Bar-Natan's local algorithm: add crossings one at a time, deloop, eliminate.

The state is a chain complex in Bar-Natan's category of a tangle: its objects are crossingless
matchings of the current boundary points (edge labels of the diagram that are cut), each with a
homological degree and a q-shift; its differential is a sparse matrix of degree-0 dotted
cobordisms in the disk basis of :mod:`movies.homology.cobordisms` (stored at H = 1, powers of H
implied by the shifts).

Adding a crossing ``(a, b, c, d)`` tensors the complex with ``[0-smoothing → 1-smoothing{1}]``
(the 0-smoothing joins a-b and c-d, the 1-smoothing a-d and b-c; the saddle between them),
glued to the boundary along the labels the two share. The sign rule is
``d(x ⊗ y) = dx ⊗ y + (-1)^|x| x ⊗ dy``. Every closed circle that appears is delooped at once,
``O ≅ ∅{+1} ⊕ ∅{-1}``; then every entry that is a unit times the identity between equal
matchings with equal shifts is removed by Gaussian elimination, until none is left.

When every crossing is in, the objects are empty matchings: the complex is a complex of free
graded R[H]-modules (:class:`FinalComplex`), entry ``c`` between ``∅{a}`` and ``∅{b}`` standing
for ``c·H^((b - a)/2)``.

A chain of the closed diagram can ride along (:class:`CarriedClass`): it is stored as a morphism
from one crossingless tangle into each object, tensored with the next crossing's smoothing as the
crossings come in, capped where its circles close, and pushed through every elimination by the
homotopy equivalence (see :meth:`Complex.eliminate`). This is how the canonical class of an
orientation reaches the final complex (:mod:`movies.homology.canonical`).

>>> final = scan([(1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)], RING_Z)
>>> sorted(final.generators)
[(0, 1), (0, 3), (2, 5), (2, 7), (3, 7), (3, 9)]
"""

from __future__ import annotations

import heapq
from dataclasses import dataclass, field

from movies.diagram.scan_order import scan_order
from movies.homology.cobordisms import components, compose_morphisms, expand
from movies.homology.rings import Ring
from movies.unionfind import partition_roots

__all__ = ["FinalComplex", "CarriedClass", "Complex", "add_crossing", "close_arcs", "scan_complex", "scan", "finish",
           "RING_Z"]

RING_Z = Ring("Z", 0)

# The two smoothings as pairs of crossing slots, and each slot's strip within that smoothing.
_SMOOTHING = ((1, 0, 3, 2), (3, 2, 1, 0))
_STRIP = ((0, 0, 1, 1), (0, 1, 1, 0))


@dataclass
class FinalComplex:
    """A complex of free graded R[H]-modules, one generator per empty object.

    ``generators[i] = (h, q)``: homological degree and q-shift of generator ``i`` (already
    shifted by ``[-n_-]{n_+ - 2 n_-}``); ``entries[(i, j)] = c``: the differential sends
    generator ``i`` to ``c·H^k`` times generator ``j`` with ``k = (q_j - q_i) / 2``.
    """

    generators: list[tuple[int, int]]
    entries: dict[tuple[int, int], int] = field(default_factory=dict)
    #: carried chains, each ``{generator: coefficient}`` at H = 1 (see :class:`CarriedClass`)
    carried: list[dict[int, int]] = field(default_factory=list)


@dataclass
class CarriedClass:
    """A chain carried through the scan: one morphism from ``source`` into each object.

    ``source`` is a crossingless matching of the current boundary with q-shift ``q`` (degree
    ``h`` before the final shift); ``coords[i]`` is a morphism ``source -> object i``. For each
    crossing (PD tuple) ``smoothing`` says which of its smoothings the chain uses; when circles of
    ``source`` close, each is capped by the cup labelled X, or X - H when ``minus_h`` holds an
    edge label on it (every edge on one circle must give the same answer).

    >>> carried = CarriedClass({(1, 5, 2, 4): 0}, frozenset())
    >>> carried.source, carried.q, carried.coords
    ((), 0, {})
    """

    smoothing: dict
    minus_h: frozenset
    source: tuple = ()
    q: int = 0
    h: int = 0
    coords: dict[int, dict] = field(default_factory=dict)


class Complex:
    """The complex of a tangle during the scan (see the module docstring).

    ``h``, ``m``, ``q`` map an object id to its homological degree, matching and q-shift;
    ``out[i][j]`` and ``inn[j][i]`` are the same dict, the morphism ``i -> j``.

    >>> cx = Complex(RING_Z)
    >>> a, b, c = cx.add_object(0, (1, 0), 0), cx.add_object(1, (1, 0), 0), cx.add_object(1, (1, 0), 2)
    >>> cx.add_to(a, b, {0: 1}); cx.add_to(a, c, {1: 1})  # the identity, and a dot
    >>> cx.unit_of(a, b), cx.unit_of(a, c)
    (1, None)
    >>> cx.simplify(); sorted(cx.m)
    [2]
    """

    def __init__(self, ring: Ring) -> None:
        self.ring = ring
        self.h: dict[int, int] = {}
        self.m: dict[int, tuple] = {}
        self.q: dict[int, int] = {}
        self.out: dict[int, dict[int, dict]] = {}
        self.inn: dict[int, dict[int, dict]] = {}
        self.carried: list[CarriedClass] = []
        self._next = 0

    def add_object(self, h: int, m: tuple, q: int) -> int:
        i = self._next
        self._next += 1
        self.h[i] = h
        self.m[i] = m
        self.q[i] = q
        self.out[i] = {}
        self.inn[i] = {}
        return i

    def add_to(self, i: int, j: int, morphism: dict, factor: int = 1) -> None:
        """Add ``factor * morphism`` to the entry ``i -> j``, dropping zero terms."""
        reduce = self.ring.reduce
        entry = self.out[i].get(j)
        if entry is None:
            entry = {}
            for k, v in morphism.items():
                v = reduce(v * factor)
                if v:
                    entry[k] = v
            if entry:
                self.out[i][j] = entry
                self.inn[j][i] = entry
            return
        for k, v in morphism.items():
            v = reduce(entry.get(k, 0) + v * factor)
            if v:
                entry[k] = v
            else:
                entry.pop(k, None)
        if not entry:
            del self.out[i][j]
            del self.inn[j][i]

    def unit_of(self, i: int, j: int):
        """The unit ``u`` when the entry ``i -> j`` is ``u`` times an identity, else None."""
        if self.m[i] != self.m[j] or self.q[i] != self.q[j]:
            return None
        entry = self.out[i].get(j)
        if not entry:
            return None
        u = entry.get(0)
        if u is None or len(entry) != 1 or not self.ring.is_unit(u):
            return None
        return u

    def _carry_through(self, carried: CarriedClass, b1: int, b2: int, inv: int) -> None:
        coords = carried.coords
        coords.pop(b1, None)
        at_b2 = coords.pop(b2, None)
        if at_b2 is None:
            return
        reduce = self.ring.reduce
        source, mb = carried.source, self.m[b1]
        for y, gamma in self.out[b1].items():
            if y == b2:
                continue
            comp = compose_morphisms(source, mb, self.m[y], at_b2, gamma)
            if not comp:
                continue
            entry = coords.setdefault(y, {})
            for k, v in comp.items():
                v = reduce(entry.get(k, 0) - inv * v)
                if v:
                    entry[k] = v
                else:
                    entry.pop(k, None)
            if not entry:
                del coords[y]

    def remove(self, i: int) -> None:
        for j in self.out.pop(i):
            del self.inn[j][i]
        for j in self.inn.pop(i):
            del self.out[j][i]
        del self.h[i], self.m[i], self.q[i]

    def eliminate(self, b1: int, b2: int, u: int) -> list[tuple[int, int]]:
        """Gaussian elimination of the isomorphism ``u·id: b1 -> b2``.

        Every entry ``x -> y`` with ``x -> b2`` (δ) and ``b1 -> y`` (γ) becomes
        ``ε - γ u⁻¹ δ``; then ``b1`` and ``b2`` go. Returns the entries that changed (to look
        for new isomorphisms among them). Carried chains go along the homotopy equivalence:
        in b1's degree the b1 coordinate is dropped, in b2's degree ``x ↦ x_E - γ u⁻¹ x_b2``.
        """
        inv = self.ring.inverse(u)
        m = self.m
        mb = m[b1]
        for carried in self.carried:
            self._carry_through(carried, b1, b2, inv)
        sources = [(x, d) for x, d in self.inn[b2].items() if x != b1]
        targets = [(y, g) for y, g in self.out[b1].items() if y != b2]
        changed = []
        for x, delta in sources:
            mx = m[x]
            for y, gamma in targets:
                comp = compose_morphisms(mx, mb, m[y], delta, gamma)
                if comp:
                    self.add_to(x, y, comp, -inv)
                    changed.append((x, y))
        self.remove(b1)
        self.remove(b2)
        return changed

    def simplify(self) -> None:
        """Eliminate isomorphisms until none is left, cheapest first.

        The cost of eliminating ``b1 -> b2`` is the number of compositions it makes,
        (entries into b2) x (entries out of b1); taking the cheapest first (Markowitz's rule)
        keeps the fill-in low. Costs only grow stale by changing, so a popped candidate whose
        cost has risen goes back with its new cost.
        """
        heap = []
        for i, row in self.out.items():
            for j in row:
                if self.unit_of(i, j) is not None:
                    heap.append((self._cost(i, j), i, j))
        heapq.heapify(heap)
        while heap:
            cost, i, j = heapq.heappop(heap)
            if i not in self.m or j not in self.m:
                continue
            u = self.unit_of(i, j)
            if u is None:
                continue
            now = self._cost(i, j)
            if now > cost:
                heapq.heappush(heap, (now, i, j))
                continue
            for x, y in self.eliminate(i, j, u):
                if self.unit_of(x, y) is not None:
                    heapq.heappush(heap, (self._cost(x, y), x, y))

    def _cost(self, i: int, j: int) -> int:
        return (len(self.inn[j]) - 1) * (len(self.out[i]) - 1)

    def size(self) -> int:
        return len(self.m)


class _Step:
    """The geometry of gluing one piece to a tangle with the given boundary labels.

    The piece is a crossing (its two smoothings, :data:`_SMOOTHING`), or a set of arcs joining
    labels in pairs (one smoothing): ``smoothings[s][j]`` is the slot joined to slot ``j``,
    ``strips[s][j]`` numbers the arc through slot ``j``.
    """

    def __init__(self, boundary: list, crossing: tuple, smoothings=_SMOOTHING, strips=_STRIP) -> None:
        n = len(boundary)
        self.n = n
        slots = len(crossing)
        self.slots = slots
        self.smoothings = smoothings
        self.strips = strips
        where = {label: i for i, label in enumerate(boundary)}
        link = [-1] * (n + slots)  # glue partner of each point (old positions, then slots)
        glue = []
        for j, label in enumerate(crossing):
            p = where.get(label)
            if p is not None:
                link[p] = n + j
                link[n + j] = p
                glue.append((p, n + j))
        for j in range(slots):
            for j2 in range(j + 1, slots):
                if crossing[j] == crossing[j2] and crossing[j] not in where:
                    link[n + j] = n + j2
                    link[n + j2] = n + j
                    glue.append((n + j, n + j2))
        self.link = link
        self.glue = glue
        # the new boundary: kept old positions in order, then new slots in slot order
        newpos = [-1] * (n + slots)
        new_boundary = []
        for p in range(n):
            if link[p] < 0:
                newpos[p] = len(new_boundary)
                new_boundary.append(boundary[p])
        for j in range(slots):
            if link[n + j] < 0:
                newpos[n + j] = len(new_boundary)
                new_boundary.append(crossing[j])
        self.newpos = newpos
        self.new_boundary = new_boundary
        self._objects: dict = {}
        self._horizontal: dict = {}
        self._vertical: dict = {}
        self._geometries: dict = {}

    # --------------------------------------------------------------- objects
    def _arcs(self, m: tuple, s: int) -> list:
        n = self.n
        sm = self.smoothings[s]
        return list(m) + [n + sm[j] for j in range(self.slots)]

    def obj(self, m: tuple, s: int) -> tuple[tuple, int]:
        """(new matching, number of closed circles) of ``m`` glued to smoothing ``s``."""
        matching, lowest = self._trace(m, s)
        return matching, len(lowest)

    def closed_circle_labels(self, m: tuple, s: int, boundary: list, crossing: tuple) -> list:
        """One edge label on each closed circle of ``m`` glued to smoothing ``s``, in the order
        :meth:`horizontal` numbers the source circles (by smallest point)."""
        n = self.n
        return [boundary[p] if p < n else crossing[p - n] for p in self._trace(m, s)[1]]

    def _trace(self, m: tuple, s: int) -> tuple[tuple, list[int]]:
        """The new matching, and the smallest point of each closed circle, in increasing order."""
        key = (m, s)
        found = self._objects.get(key)
        if found is not None:
            return found
        arc = self._arcs(m, s)
        link = self.link
        newpos = self.newpos
        new = [0] * len(self.new_boundary)
        visited = [False] * len(arc)
        for start in range(len(arc)):
            if link[start] >= 0 or visited[start]:
                continue
            p = start
            while True:
                visited[p] = True
                p = arc[p]
                visited[p] = True
                if link[p] < 0:
                    break
                p = link[p]
            new[newpos[start]] = newpos[p]
            new[newpos[p]] = newpos[start]
        lowest = []
        for start in range(len(arc)):
            if visited[start]:
                continue
            p, low = start, start
            while not visited[p]:
                visited[p] = True
                p = arc[p]
                visited[p] = True
                low = min(low, p)
                p = link[p]
                low = min(low, p)
            lowest.append(low)
        found = (tuple(new), sorted(lowest))
        self._objects[key] = found
        return found

    # --------------------------------------------------------------- morphisms
    def _geometry(self, top: list, bot: list, piece: list, pieces: int):
        """How the disks and strips glue: (root of each piece, surfaces, n_open, n_src).

        ``top``/``bot``: arc partner of each point in the source/target tangle; ``piece[p]``:
        the disk holding the vertical interval at point ``p``. ``surfaces`` lists
        (root, genus, circle bits) for each connected glued surface; circle bits number the
        open circles first (by smallest new position), then the closed circles of the source,
        then those of the target (each by smallest point).
        """
        link = self.link
        size = len(top)
        roots = partition_roots(pieces, [(piece[p], piece[r]) for p, r in self.glue])
        chi: dict[int, int] = {}
        for r in roots:
            chi[r] = chi.get(r, 0) + 1
        for p, r in self.glue:
            rr = roots[piece[p]]
            chi[rr] -= 1
        # trace the circles of source ∪ target: nodes p (source side) and size + p (target)
        newpos = self.newpos
        seen = [False] * (2 * size)
        open_circles = []  # (smallest new position, root)
        src_closed = []  # (smallest point, root)
        tgt_closed = []
        for start in range(2 * size):
            if seen[start]:
                continue
            node = start
            lowest_new = None
            lowest = None
            sides = 0
            while not seen[node]:
                seen[node] = True
                side, p = divmod(node, size)
                sides |= 1 << side
                q = (top if side == 0 else bot)[p]
                seen[side * size + q] = True
                if lowest is None or p < lowest:
                    lowest = p
                if q < lowest:
                    lowest = q
                lq = link[q]
                if lq < 0:
                    pos = newpos[q]
                    if lowest_new is None or pos < lowest_new:
                        lowest_new = pos
                    node = (1 - side) * size + q
                else:
                    node = side * size + lq
            root = roots[piece[lowest]]
            if lowest_new is not None:
                open_circles.append((lowest_new, root))
            elif sides == 1:
                src_closed.append((lowest, root))
            else:
                tgt_closed.append((lowest, root))
        open_circles.sort()
        src_closed.sort()
        tgt_closed.sort()
        n_open, n_src = len(open_circles), len(src_closed)
        circles_of: dict[int, list[int]] = {}
        for bit, (_, root) in enumerate(open_circles + src_closed + tgt_closed):
            circles_of.setdefault(root, []).append(bit)
        surfaces = []
        for root, bits in circles_of.items():
            twice_genus = 2 - chi[root] - len(bits)
            surfaces.append((root, twice_genus // 2, bits))
        return roots, surfaces, n_open, n_src

    @staticmethod
    def _evaluate(geometry, dotted_pieces) -> dict:
        """The glued surface with dots on ``dotted_pieces``, delooped.

        Returns {(source config, target config): {pattern: coeff}}; bit ``i`` of a config set
        means closed circle ``i`` is replaced by ∅{-1}, clear by ∅{+1}.
        """
        roots, surfaces, n_open, n_src = geometry
        dotted_roots = {roots[x] for x in dotted_pieces}
        full = expand([(g, bits, root in dotted_roots) for root, g, bits in surfaces])
        open_mask = (1 << n_open) - 1
        src_mask = ((1 << n_src) - 1) << n_open
        tgt_shift = n_open + n_src
        result: dict = {}
        for mask, c in full.items():
            pattern = mask & open_mask
            src_dots = (mask & src_mask) >> n_open
            tgt_config = mask >> tgt_shift  # dotted target circle -> ∅{-1}
            # a source circle from ∅{+1} (cup) needs a dot; from ∅{-1} (dotted cup) takes all
            undotted = ((1 << n_src) - 1) & ~src_dots
            sub = src_dots
            while True:
                config = sub | undotted
                target = result.setdefault((config, tgt_config), {})
                target[pattern] = target.get(pattern, 0) + c
                if sub == 0:
                    break
                sub = (sub - 1) & src_dots
        return result

    def horizontal(self, m1: tuple, m2: tuple, pattern: int, s: int) -> dict:
        """The basis element ``pattern: m1 -> m2`` tensored with the identity of smoothing ``s``."""
        key = (m1, m2, pattern, s)
        found = self._horizontal.get(key)
        if found is not None:
            return found
        gkey = (m1, m2, s)
        geometry = self._geometries.get(gkey)
        count, comp = components(m1, m2)
        if geometry is None:
            strip = self.strips[s]
            piece = list(comp) + [count + strip[j] for j in range(self.slots)]
            geometry = self._geometry(self._arcs(m1, s), self._arcs(m2, s), piece, count + self.slots // 2)
            self._geometries[gkey] = geometry
        dotted = [k for k in range(count) if pattern >> k & 1]
        found = self._evaluate(geometry, dotted)
        self._horizontal[key] = found
        return found

    def vertical(self, m: tuple) -> dict:
        """The identity of ``m`` tensored with the saddle from the 0- to the 1-smoothing."""
        found = self._vertical.get(m)
        if found is not None:
            return found
        count, comp = components(m, m)
        piece = list(comp) + [count] * 4
        found = self._evaluate(self._geometry(self._arcs(m, 0), self._arcs(m, 1), piece, count + 1), ())
        self._vertical[m] = found
        return found


def add_crossing(cx: Complex, boundary: list, crossing: tuple, window=None) -> tuple[Complex, list]:
    """The complex of the tangle with ``crossing`` added, delooped and simplified.

    Parameters: the current complex, its boundary labels, the PD tuple of the crossing;
    ``window``, a pair ``(lo, hi)``: only objects of homological degree ``lo <= h <= hi`` are kept
    (the rest of the complex is cut off; see :func:`scan_complex` for when that is exact).
    Returns (new complex, new boundary labels).

    >>> start = Complex(RING_Z); _ = start.add_object(0, (), 0)
    >>> cx, boundary = add_crossing(start, [], (1, 5, 2, 4))
    >>> boundary, cx.size()
    ([1, 5, 2, 4], 2)
    """
    step = _Step(boundary, crossing)
    new, ids = _tensor(cx, step, (0, 1), window)
    for i in list(cx.m):
        sign = -1 if cx.h[i] % 2 else 1
        s0, s1 = ids.get((i, 0)), ids.get((i, 1))
        if s0 is None or s1 is None:
            continue
        for (a, b), piece in step.vertical(cx.m[i]).items():
            new.add_to(s0 + a, s1 + b, piece, sign)
    for carried in cx.carried:
        new.carried.append(_carry_across(carried, cx, step, ids, boundary, crossing, carried.smoothing[crossing]))
    _simplified(new, window)
    return new, step.new_boundary


def close_arcs(cx: Complex, boundary: list, pairs, window=None) -> tuple[Complex, list]:
    """The complex with boundary points joined in pairs by arcs that cross nothing, simplified.

    This closes a tangle without adding crossings: in a family of links that differ by twists
    the common part is scanned once and each member is closed from it (see
    :mod:`movies.homology.families`). Parameters: the complex, its boundary labels, ``pairs`` of
    labels to join, and ``window`` as for :func:`add_crossing`. Returns (new complex, new boundary).

    >>> start = Complex(RING_Z); _ = start.add_object(0, (), 0)
    >>> cx, boundary = add_crossing(start, [], (1, 5, 2, 4))  # a crossing with four open ends
    >>> closed, rest = close_arcs(cx, boundary, [(1, 5), (2, 4)])  # a positive kink: the unknot
    >>> rest, finish(closed, 1, 0).generators
    ([], [(0, -1), (0, 1)])
    """
    labels = tuple(label for pair in pairs for label in pair)
    joined = tuple(j ^ 1 for j in range(len(labels)))
    strips = tuple(j // 2 for j in range(len(labels)))
    step = _Step(boundary, labels, (joined,), (strips,))
    new, ids = _tensor(cx, step, (0,), window)
    for carried in cx.carried:
        new.carried.append(_carry_across(carried, cx, step, ids, boundary, labels, 0))
    _simplified(new, window)
    return new, step.new_boundary


def _tensor(cx: Complex, step: _Step, smoothings, window) -> tuple[Complex, dict]:
    """The objects of ``cx`` glued to each smoothing of the step's piece (smoothing ``s`` one
    degree and one q up per unit of ``s``), delooped, with the entries of ``cx`` carried along."""
    new = Complex(cx.ring)
    lo, hi = window if window is not None else (None, None)
    ids: dict = {}  # (old id, smoothing) -> first new id, for the objects kept
    for i in list(cx.m):
        h, m, q = cx.h[i], cx.m[i], cx.q[i]
        for s in smoothings:
            if window is not None and not lo - 1 <= h + s <= hi + 1:
                continue
            nm, closed = step.obj(m, s)
            first = None
            for config in range(1 << closed):
                k = new.add_object(h + s, nm, q + s + closed - 2 * bin(config).count("1"))
                if first is None:
                    first = k
            ids[(i, s)] = first
    for i, row in cx.out.items():
        m1 = cx.m[i]
        for j, morphism in row.items():
            m2 = cx.m[j]
            for s in smoothings:
                si, sj = ids.get((i, s)), ids.get((j, s))
                if si is None or sj is None:
                    continue
                for pattern, c in morphism.items():
                    for (a, b), piece in step.horizontal(m1, m2, pattern, s).items():
                        new.add_to(si + a, sj + b, piece, c)
    return new, ids


def _simplified(new: Complex, window) -> None:
    """Eliminate; then drop the objects made just outside the window (see :func:`scan_complex`)."""
    new.simplify()
    if window is not None:
        lo, hi = window
        for i in [i for i, h in new.h.items() if not lo <= h <= hi]:
            new.remove(i)


def _carry_across(carried: CarriedClass, cx: Complex, step: _Step, ids: dict,
                  boundary: list, crossing: tuple, s: int) -> CarriedClass:
    """The carried chain tensored with smoothing ``s`` of the piece, its closed circles capped."""
    source, closed = step.obj(carried.source, s)
    minus_h = [label in carried.minus_h for label in step.closed_circle_labels(carried.source, s, boundary, crossing)]
    full = (1 << closed) - 1

    def weight(config: int) -> int:
        # X is the dotted cup (config bit set); X - H is the dotted cup minus H times the cup
        w = 1
        for k in range(closed):
            if not config >> k & 1:
                if not minus_h[k]:
                    return 0
                w = -w
        return w

    coords: dict[int, dict] = {}
    reduce = cx.ring.reduce
    for i, morphism in carried.coords.items():
        first = ids[(i, s)]
        for pattern, c in morphism.items():
            for (a, b), piece in step.horizontal(carried.source, cx.m[i], pattern, s).items():
                w = weight(a & full) if closed else 1
                if not w:
                    continue
                entry = coords.setdefault(first + b, {})
                for k, v in piece.items():
                    entry[k] = entry.get(k, 0) + w * c * v
    coords = {i: e for i, e in ((i, {k: reduce(v) for k, v in e.items() if reduce(v)}) for i, e in coords.items()) if e}
    return CarriedClass(carried.smoothing, carried.minus_h, source, carried.q + s - closed, carried.h + s, coords)


def scan_complex(pd, ring: Ring, order, progress=None, carried=(), degrees=None) -> Complex:
    """The simplified complex of a PD code whose crossings are added in ``order``.

    Parameters: ``pd``, a list of PD 4-tuples (labels that occur once stay on the boundary);
    ``ring``; ``order``, crossing indices; ``progress(done, total)``, called after each crossing;
    ``carried``, :class:`CarriedClass` chains to take along (they start on the one object);
    ``degrees``, a pair ``(lo, hi)`` of homological degrees before the shift ``[-n_-]``: only the
    part of the final complex in those degrees is wanted.
    Returns the :class:`Complex` of the resulting tangle (with ``degrees``, its part in them).

    Why a window is exact: the degree-``d`` part of ``C ⊗ [X0 → X1]`` is made of ``C_d`` and
    ``C_(d-1)`` only, and eliminating an isomorphism between degrees ``h`` and ``h + 1`` changes
    only entries between those two degrees. So the complex cut to degrees ``[lo - r, hi]``, with
    ``r`` crossings still to add, determines the final complex in ``[lo, hi]`` exactly, with
    the same differentials (homology is right in ``lo + 1 .. hi - 1``). For s only degrees -1..1
    matter, which for a positive braid keeps two degrees out of all of them.

    Each step also makes the objects one degree outside the window that come from inside it
    (``C_lo ⊗ X0`` below, ``C_hi ⊗ X1`` above), eliminates as usual, and then drops them: an
    isomorphism from below the window into it only removes its target (the entries it changes
    start below the window), one from the window's top to above only removes its source. Without
    this, objects that those degrees would have cancelled pile up at the window's edges (60 times
    slower on a 60-crossing link with many negative crossings).

    >>> scan_complex([(1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)], RING_Z, [0, 1, 2]).size()
    6
    >>> cx = scan_complex([(1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)], RING_Z, [0, 1, 2], degrees=(-1, 1))
    >>> sorted(cx.h.values())
    [0, 0]
    """
    cx = Complex(ring)
    start = cx.add_object(0, (), 0)
    for chain in carried:
        cx.carried.append(CarriedClass(chain.smoothing, chain.minus_h, coords={start: {0: 1}}))
    boundary: list = []
    for done, index in enumerate(order, start=1):
        window = None if degrees is None else (degrees[0] - (len(order) - done), degrees[1])
        cx, boundary = add_crossing(cx, boundary, pd[index], window)
        if progress is not None:
            progress(done, len(order))
    return cx


def scan(pd, ring: Ring, order=None, progress=None, n_plus=None, n_minus=None) -> FinalComplex:
    """The Bar-Natan complex of a closed diagram, simplified, as a :class:`FinalComplex`.

    Parameters: ``pd``, a list of PD 4-tuples (a closed diagram, every label twice);
    ``ring``, the ground ring; ``order``, the order of crossing indices (default: the
    boundary-keeping greedy order of :func:`movies.diagram.scan_order.scan_order`); ``progress``,
    called with (crossings added, total) after each crossing; ``n_plus``/``n_minus`` the numbers
    of positive and negative crossings (default: computed from the code).
    Returns the final complex with the shifts ``[-n_-]{n_+ - 2 n_-}`` applied.

    >>> final = scan([(1, 1, 2, 2)], RING_Z)  # a kink: homotopy equivalent to the unknot
    >>> sorted(final.generators), final.entries
    ([(0, -1), (0, 1)], {})
    """
    pd = [tuple(c) for c in pd]
    if n_plus is None or n_minus is None:
        from movies.diagram.pd import crossing_signs

        signs = crossing_signs(pd) if pd else []
        n_plus = sum(1 for s in signs if s > 0)
        n_minus = len(signs) - n_plus
    if order is None:
        order = scan_order(pd) if pd else []
    return finish(scan_complex(pd, ring, order, progress), n_plus, n_minus)


def finish(cx: Complex, n_plus: int, n_minus: int, without_h: bool = False) -> FinalComplex:
    """Read a complex of tangles with no boundary as a :class:`FinalComplex`.

    Parameters: the complex and the numbers of positive and negative crossings, which give
    the shifts ``[-n_-]{n_+ - 2 n_-}``; ``without_h``: keep only the entries that preserve the
    q-degree (H = 0; the reduced complex, read through a basepoint where a dot acts as 0).
    Returns generators sorted by bidegree and the entries.

    >>> cx = Complex(RING_Z); _ = cx.add_object(0, (), 1)
    >>> finish(cx, 1, 0)
    FinalComplex(generators=[(0, 2)], entries={}, carried=[])
    """
    index = {}
    gens = []
    for i in sorted(cx.m, key=lambda i: (cx.h[i], cx.q[i], i)):
        index[i] = len(gens)
        gens.append((cx.h[i] - n_minus, cx.q[i] + n_plus - 2 * n_minus))
    entries = {}
    for i, row in cx.out.items():
        for j, morphism in row.items():
            c = morphism.get(0, 0)  # the undotted sheet
            if c and (not without_h or cx.q[i] == cx.q[j]):
                entries[(index[i], index[j])] = c
    carried = [{index[i]: morphism.get(0, 0) for i, morphism in chain.coords.items() if morphism.get(0, 0)}
               for chain in cx.carried]
    return FinalComplex(gens, entries, carried)
