"""Where a band runs in a picture: its core, from one edge through the faces of its path to the other.

The core is a polyline made of one straight piece per face (or, across the outer face where no
straight piece will do, a detour round the drawing in the margin). Each piece joins a point of one
edge to a point of the next (away from their ends), leaves each edge into that piece's face, and
crosses no strand; the pieces meet on the crossed edges, and the shortest such chain is the core.
The SVG draws the band along it (:mod:`movies.draw.svg`), and the frame after the band is drawn
with the band's two sides along it (:mod:`movies.draw.frames`): the same function serves both.

>>> from movies.language.spec import parse_diagram
>>> from movies.draw.layout import drawn_outside, layout
>>> d = parse_diagram("3_1")
>>> lay = layout(d)
>>> core, crossed, room = band_core(d, (1, 3, (2,), ()), lay.edges, drawn_outside(d, lay))
>>> len(core), crossed, room  # one straight piece across face 2, well clear of the strands
(2, [], 0.08)
>>> core, crossed, room = band_core(d, (2, 4, (3,), ()), lay.edges, 3)
>>> len(core) > 2  # face 3 is outside: round the drawing
True
"""

from __future__ import annotations

import math

import numpy as np

from movies.diagram.model import Diagram
from movies.draw.geometry import Point, clear_of, polyline_length as _length, segments_cross

#: how far beyond the drawing a band across the outer face runs, as a fraction of the median
#: edge's length (the same in a layout's units and on the SVG canvas)
BAND_MARGIN = 0.2

#: and at most this fraction of the drawing's radius
BAND_MARGIN_SHARE = 0.1

#: how far the core keeps from every strand (but near its ends), as fractions of the median
#: edge's length, the most it can first: room for the band's width
BAND_ROOM = (0.08, 0.04, 0.02, 0.0)

#: where it can, a band's ends keep this far from the crossings along their edges (as a fraction
#: of the median edge's length), or a third of their edge's length where that is less
AWAY = 0.35

#: at most this many points of each end, and of the face's rim, are tried for a way through a face
THROUGH_POINTS = 14, 90


def band_core(diagram: Diagram, band: tuple, lines: dict[int, list[Point]], root: int | None,
              y_down: bool = False) -> tuple[list[Point], list[int], float] | None:
    """The core of a band in a picture, and where on it the crossed edges are met.

    Parameters
    ----------
    diagram : Diagram
        The frame the band acts on.
    band : tuple
        (first edge, second edge, faces, path): one face and no path for a band across a face;
        else the faces the core runs through, in order, and ((edge, over), ...) the edges it crosses.
    lines : dict
        Every edge -> its points, tail to head (a circle's last point its first): the core starts,
        crosses and ends at points of the band's edges, and crosses no strand anywhere else.
    root : int or None
        The face drawn outside: a piece across it may go round the drawing, :data:`BAND_MARGIN`
        of a typical edge's length beyond it.
    y_down : bool
        Whether the y axis points down (the SVG canvas) rather than up (a layout).

    Returns
    -------
    (core, crossed_at, room) or None
        The core's points from the first edge to the second, the index in it of the point on
        each crossed edge, and how far it keeps from the strands (as a fraction of the median
        edge's length, one of :data:`BAND_ROOM`); None when some piece finds no way.

    References: common practice, no source (a shortest chain over candidate points).
    """
    first, second, faces, path = band
    chain = [first] + [edge for edge, _ in path] + [second]
    if any(edge not in lines for edge in chain) or any(f not in diagram.faces for f in faces) \
            or len(faces) != len(chain) - 1:
        return None
    lengths = sorted(_length(line) for line in lines.values())
    typical = lengths[len(lengths) // 2]
    points = np.asarray([p for line in lines.values() for p in line], dtype=float)
    spread = float(np.sqrt(((points - points.mean(axis=0)) ** 2).sum(axis=1)).max())
    # round the drawing close enough to stay in the picture's margin
    margin = min(BAND_MARGIN * typical, BAND_MARGIN_SHARE * spread)
    # room for the band's width beside its core, the most first; its ends well away from the
    # crossings, as a band is usually drawn (the middle third of a short edge), then nearer (a
    # sixth of their points off, then as far as a quarter of a typical edge)
    for share in BAND_ROOM:
        for keep_off in ((AWAY * typical, 1 / 3), None, (0.25 * typical, 1 / 6)):
            found = _chain(diagram, band, lines, root, margin, y_down, keep_off, share * typical)
            if found is not None:
                return found + (share,)
    return None


def _chain(diagram: Diagram, band: tuple, lines: dict[int, list[Point]], root: int | None, margin: float,
           y_down: bool, keep_off: tuple[float, float] | None, room: float) -> tuple[list[Point], list[int]] | None:
    """The core as :func:`band_core` finds it, its ends and crossings a sixth of their edge's points
    from the edge's crossings, or with ``keep_off`` (a distance, a share), that far along the edge
    or that share of its length, whichever is less; each piece ``room`` from every strand but
    near its ends."""
    first, second, faces, path = band
    chain = [first] + [edge for edge, _ in path] + [second]
    everything = list(lines.values())

    def inner(edge):
        line = lines[edge]
        if edge in diagram.loops:
            return _straight(line, room)
        if keep_off is None:
            cut = len(line) // 6
            return _straight(line[cut:len(line) - cut] or line, room, line)
        total, walked, out = _length(line), 0.0, []
        cut = min(keep_off[0], keep_off[1] * total)
        for k, p in enumerate(line):
            walked += math.dist(line[k - 1], p) if k else 0.0
            if cut <= walked <= total - cut:
                out.append(p)
        return _straight(out or line, room, line)

    def into_face(edge, index, target, face) -> bool:
        line = lines[edge]
        a, b = line[max(index - 1, 0)], line[min(index + 1, len(line) - 1)]
        tx, ty = b[0] - a[0], b[1] - a[1]
        cross = tx * (target[1] - line[index][1]) - ty * (target[0] - line[index][0])
        left, right = diagram.faces_beside(edge)
        # with y up a positive cross product is to the left of the direction of travel; with y down, right
        return (face == right) == ((cross > 0) == y_down) or left == right

    def clear(p, q, others) -> bool:  # touching a strand at an end of the segment does not count
        if any(segments_cross(p, q, a, b) for line in everything for a, b in zip(line, line[1:])):
            return False
        return not room or bool(_roomy(np.array([p]), np.array([q]), others, room)[0])

    # the core's point on each edge of the chain: any inner point of the ends, every third inner
    # point of the crossed edges; the cheapest chain of valid pieces (shortest total length) wins
    options = [inner(first)] + [inner(edge)[::3] or inner(edge) for edge, _ in path] + [inner(second)]
    best: dict = {p: (0.0, None) for p in options[0]}  # point -> (length so far, previous point)
    steps = []
    for k, face in enumerate(faces):
        here, there = chain[k], chain[k + 1]
        # room is kept from every strand but the two edges this piece joins (it leaves them at an angle)
        others = [line for edge, line in lines.items() if edge not in (here, there)]
        pairs = sorted((best[p][0] + math.hypot(q[0] - p[0], q[1] - p[1]), p, q)
                       for p in best for q in options[k + 1] if q != p)
        reached: dict = {}
        for total, p, q in pairs:
            if q in reached:
                continue
            if into_face(here, lines[here].index(p), q, face) and into_face(there, lines[there].index(q), p, face) \
                    and clear(p, q, others):
                reached[q] = (total, p, [])
        if not reached and face == root:
            # across the outer face: out from one edge, round the drawing in the margin, and in
            round_ = _around(inner(here), inner(there), everything, margin, lambda p, q: clear(p, q, others))
            if round_ is not None and (k == 0 or round_[0] in best):
                length = sum(math.hypot(b[0] - a[0], b[1] - a[1]) for a, b in zip(round_, round_[1:]))
                reached[round_[-1]] = (best.get(round_[0], (0.0,))[0] + length, round_[0], round_[1:-1])
                if k == 0:
                    best = {round_[0]: (0.0, None)}
        if not reached:
            # no straight piece crosses the face (it bends, or is narrow): a way through it
            reached = _through_face(diagram, face, (here, best), (there, options[k + 1]), lines, y_down, into_face,
                                    room)
        steps.append(reached)
        best = {q: value[:2] for q, value in reached.items()}
        if not best:
            return None
    q = min(best, key=lambda point: best[point][0])
    pieces = []
    for reached in reversed(steps):
        _, p, via = reached[q]
        pieces.append([p] + via + [q])
        q = p
    pieces.reverse()
    core, crossed_at = list(pieces[0]), []
    for piece in pieces[1:]:
        crossed_at.append(len(core) - 1)  # the point where the core meets a crossed edge
        core += piece[1:]
    return core, crossed_at


def _around(first: list, second: list, lines: list, margin: float, clear) -> list | None:
    """A core for a band across the outer face: out from an outermost point of one edge's part
    ``first`` (the points it may start from), around the drawing ``margin`` beyond it, and in to
    one of the other's; None if a piece of it would cross a strand."""
    points = [p for line in lines for p in line]
    cx = sum(p[0] for p in points) / len(points)
    cy = sum(p[1] for p in points) / len(points)
    radius = max(math.hypot(p[0] - cx, p[1] - cy) for p in points) + margin

    def outer_part(line):  # near the outside of the drawing
        far = max(math.hypot(t[0] - cx, t[1] - cy) for t in line)
        return [t for t in line if math.hypot(t[0] - cx, t[1] - cy) >= 0.85 * far]

    def angle(t):
        return math.atan2(t[1] - cy, t[0] - cx)

    def turn_between(u, v):  # the shorter way round
        return (angle(v) - angle(u) + math.pi) % (2 * math.pi) - math.pi

    p, q = min(((u, v) for u in outer_part(first) for v in outer_part(second)),
               key=lambda pair: abs(turn_between(*pair)))
    a, turn = angle(p), turn_between(p, q)
    steps = max(2, int(abs(turn) / 0.15))
    arc = [(cx + radius * math.cos(a + turn * k / steps), cy + radius * math.sin(a + turn * k / steps))
           for k in range(steps + 1)]
    core = [p] + arc + [q]
    return core if all(clear(u, v) for u, v in zip(core, core[1:])) else None


def _through_face(diagram: Diagram, face: int, start: tuple, end: tuple, lines: dict[int, list[Point]],
                  y_down: bool, into_face, room: float) -> dict:
    """The shortest ways across a face from points of one edge to points of another, through
    points just inside the face's rim (a visibility graph), each leaving its edges into the face
    and crossing no strand. ``start`` is (edge, {point: (length so far, ...)}), ``end`` (edge, its
    points). Returns {point reached: (length, point left from, [the points between])}."""
    here, best = start
    there, targets = end
    sources = list(best)[::max(1, len(best) // THROUGH_POINTS[0])]
    targets = list(targets)[::max(1, len(targets) // THROUGH_POINTS[0])]
    steps = [math.dist(p, q) for line in lines.values() for p, q in zip(line, line[1:]) if p != q]
    if not steps:
        return {}
    depth = max(0.5 * float(np.median(steps)), 1.5 * room)
    rim = []
    for cycle in diagram.faces[face]:
        points: list[Point] = []
        for side in cycle:
            line = lines[side.edge]
            points.extend(line[:-1] if side.hand == "L" else line[::-1][:-1])
        for i, p in enumerate(points):
            a, b = points[i - 1], points[(i + 1) % len(points)]
            tx, ty = b[0] - a[0], b[1] - a[1]
            size = math.hypot(tx, ty)
            if size == 0:
                continue
            # the face lies on the left of its cycle (on the right when the y axis points down)
            nx, ny = (-ty / size, tx / size) if not y_down else (ty / size, -tx / size)
            rim += [(p[0] + depth * nx, p[1] + depth * ny), (p[0] + depth / 3 * nx, p[1] + depth / 3 * ny)]
    if room and rim:
        # a way bends only at points with room about them (the pieces' sides are checked apart)
        strands = np.asarray([p for line in lines.values() for p in line], dtype=float)
        near = np.sqrt(((np.asarray(rim)[:, None, :] - strands[None]) ** 2).sum(axis=2)).min(axis=1)
        rim = [p for p, d in zip(rim, near) if d >= room]
    rim = rim[::max(1, len(rim) // THROUGH_POINTS[1])]
    nodes = sources + rim + targets
    count, s, w = len(nodes), len(sources), len(rim)
    xy = np.asarray(nodes, dtype=float)
    i, j = np.triu_indices(count, 1)
    # no piece from one end point to another of the same end, and no straight piece (that failed)
    keep = ~(((i < s) & (j < s)) | ((i >= s + w) & (j >= s + w)) | ((i < s) & (j >= s + w)))
    i, j = i[keep], j[keep]
    clear = clear_of(xy[i], xy[j], list(lines.values()))
    if room:
        clear &= _roomy(xy[i], xy[j], [line for edge, line in lines.items() if edge not in (here, there)], room)
    allowed = np.full((count, count), np.inf)
    for a, b in zip(i[clear], j[clear]):
        a, b = int(a), int(b)
        if a < s and not into_face(here, lines[here].index(nodes[a]), nodes[b], face):
            continue
        if b >= s + w and not into_face(there, lines[there].index(nodes[b]), nodes[a], face):
            continue
        allowed[a, b] = allowed[b, a] = math.dist(nodes[a], nodes[b])
    # Dijkstra from every start point at once, passing only through rim points
    distance = np.full(count, np.inf)
    distance[:s] = [best[p][0] for p in sources]
    previous = [-1] * count
    done = np.zeros(count, dtype=bool)
    for _ in range(count):
        left = np.where(done, np.inf, distance)
        at = int(left.argmin())
        if not np.isfinite(left[at]):
            break
        done[at] = True
        if at >= s + w:
            continue  # an end point is where a way stops
        better = distance[at] + allowed[at] < distance
        better[:s] = False
        distance[better] = distance[at] + allowed[at][better]
        for k in np.nonzero(better)[0]:
            previous[int(k)] = at
    reached = {}
    for k in range(s + w, count):
        if np.isfinite(distance[k]):
            via, at = [], previous[k]
            while at >= s:
                via.append(nodes[at])
                at = previous[at]
            reached[nodes[k]] = (float(distance[k]), nodes[at], via[::-1])
    return reached



def _roomy(starts: np.ndarray, ends: np.ndarray, lines: list[list[Point]], room: float) -> np.ndarray:
    """For each segment, whether the two segments ``room`` to either side of it (each shortened
    by ``room`` at both ends) cross no strand; segments shorter than twice that pass."""
    starts, ends = np.asarray(starts, dtype=float).reshape(-1, 2), np.asarray(ends, dtype=float).reshape(-1, 2)
    along = ends - starts
    length = np.sqrt((along ** 2).sum(axis=1))
    long = length > 2 * room
    ok = np.ones(len(starts), dtype=bool)
    if long.any():
        t = along[long] / length[long, None]
        n = np.stack([-t[:, 1], t[:, 0]], axis=1)
        for side in (1.0, -1.0):
            a = starts[long] + room * t + side * room * n
            b = ends[long] - room * t + side * room * n
            ok[long] &= clear_of(a, b, lines)
    return ok


def _straight(points: list[Point], room: float, line: list[Point] | None = None) -> list[Point]:
    """The points of a line (``line``, or ``points`` themselves) about which it runs roughly
    straight for ``room`` each way: a band as wide as that may meet the line there (at a sharp
    bend, its two sides would leave from the two arms of the bend). All of them without room."""
    line = line or points
    if not room or len(line) < 3:
        return points
    xy = np.asarray(line, dtype=float)
    walked = np.concatenate([[0.0], np.cumsum(np.sqrt((np.diff(xy, axis=0) ** 2).sum(axis=1)))])
    at = {p: walked[k] for k, p in enumerate(line)}
    out = []
    for p in points:
        s = at[p]
        before = (np.interp(s - room, walked, xy[:, 0]), np.interp(s - room, walked, xy[:, 1]))
        after = (np.interp(s + room, walked, xy[:, 0]), np.interp(s + room, walked, xy[:, 1]))
        if math.dist(before, after) >= 1.5 * min(room, s, walked[-1] - s):
            out.append(p)
    return out
