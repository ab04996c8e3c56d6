"""A movie's frames laid out one from the other, so that the movie reads as one drawing changing.

Each frame is laid out from the frame before (:func:`movies.draw.layout.layout` with
``previous``), then turned and settled toward it. The frame after a band is drawn from the frame
before itself where it can: every strand the band leaves alone keeps its points, and the band's
two sides become the new strands, along the core the picture of the band step showed
(:func:`band_layout`). The report and ``movies frames --svg`` both draw :func:`frame_layouts`.

>>> from movies.language.spec import parse_diagram
>>> from movies.diagram.moves.morse import saddle
>>> knot = parse_diagram("3_1")
>>> after = saddle(knot, 1, 3, 2).diagram
>>> before_lay, after_lay = frame_layouts([knot, after], [(1, 3, (2,), ())])
>>> after_lay.crossings == before_lay.crossings  # the band touches no crossing
True
"""

from __future__ import annotations

import math
import statistics
from dataclasses import replace

import numpy as np

from movies.diagram.model import Diagram
from movies.draw import layout as layout_module
from movies.draw.bands import band_core
from movies.draw.curves import strands
from movies.draw.geometry import (Point, counterclockwise, crossings_between, polyline_length as _length, sample,
                                  segments_cross)
from movies.draw.layout import (OUTER_LABEL, ONE_PIECE, Layout, _in_pd_order, _polygon, _quality, drawn_outside,
                                inscribed_disk)

#: half the width of a band, as fractions of the median edge's length, widest first (less than
#: the margin a band round the drawing keeps, :data:`movies.draw.bands.BAND_MARGIN`)
BAND_HALF_WIDTHS = (0.06, 0.03, 0.015)

#: a frame drawn from a band reaches at most this far from the centre (the bounds of a picture
#: of one piece leave room for labels beyond the unit disk)
RIM = 1.08

#: and if its band sticks out farther, it keeps everything within this radius where it is and
#: presses the ring outside into the rest of that disk
KEPT = 0.7

#: the strands of a frame drawn from a band get points about this many to a typical edge
STEPS_PER_EDGE = 4

#: and leave their crossings along a first step at least this many of those long (or a quarter
#: of their length): the under-strand's gap is cut from it
TIDY = 0.45

#: a frame drawn from the band before it is kept only if it is at least this readable (see ``_quality``)
BAND_QUALITY = 0.5

#: and only if every face has a disk of this radius inside it, room for its name
FACE_ROOM = 0.03

#: and only if every under-strand's gap is at least this wide (a pixel or two at the default size;
#: the narrowest of a table knot's picture up to 9 crossings is 0.0099)
SMALLEST_GAP = 0.006

#: after a band, a frame laid out from the one before whose narrowest gap is under this (under a
#: pixel at the report's size: the gap is all but gone) is laid out alone if that opens it
CLOSING_GAP = 0.006

#: a step whose frame after is a diagram of its own (an isotopy claim names it): laid out afresh
NEW_DIAGRAM = "new"


def frame_layouts(frames, steps=None) -> list[Layout]:
    """The layouts of a movie's frames, each laid out from the one before.

    Parameters
    ----------
    frames : list of Diagram
        The frames, in order.
    steps : list, optional
        What each step does, where it matters to the pictures: the band it adds as (first edge,
        second edge, faces, path) (see :func:`movies.draw.bands.band_core`), whose frame after is
        drawn from the one before by :func:`band_layout` where that works; :data:`NEW_DIAGRAM`
        for a frame that is another diagram (its crossings' names are its own), laid out afresh;
        None for any other step.

    Returns
    -------
    list of Layout

    >>> from movies.diagram.constructors import from_braid
    >>> first, second = frame_layouts([from_braid([1, 1, 1]), from_braid([1, 1, 1])])
    >>> first.crossings == second.crossings
    True
    """
    out: list[Layout] = []
    previous = None
    for index, frame in enumerate(frames):
        step = steps[index - 1] if steps and 0 < index <= len(steps) else None
        if step == NEW_DIAGRAM:
            previous = None
        drawn = band_layout(frames[index - 1], previous, frame, step) if isinstance(step, tuple) else None
        if drawn is None:
            drawn = _from(frame, previous, previous)
            # after a band not drawn from it, a picture held to the frame before (only one of one
            # piece is) can have an under-strand's gap all but closed by the kinks and small faces
            # the band leaves: then the frame laid out alone, turned toward the one before, if that
            # opens it
            held = isinstance(step, tuple) and previous.bounds == ONE_PIECE == drawn.bounds and frame.crossings
            narrowest = strands(frame, drawn).smallest_gap if held else 1.0
            if narrowest < CLOSING_GAP:
                alone = _from(frame, None, previous)
                if strands(frame, alone).smallest_gap > narrowest:
                    drawn = alone
        previous = drawn
        out.append(drawn)
    return out


def _from(frame: Diagram, start: Layout | None, previous: Layout | None) -> Layout:
    """The frame laid out from ``start`` (or alone), turned and settled toward ``previous``."""
    return layout_module.settled(frame, layout_module.aligned(layout_module.layout(frame, start), previous), previous)



def band_layout(before: Diagram, lay: Layout | None, after: Diagram, band: tuple) -> Layout | None:
    """The frame after a band, drawn from the frame before: the same points for every strand the
    band leaves alone, and the band's two sides along its core as the new strands.

    The core is found as the picture of the band step draws it (:func:`band_core` on the curves
    as drawn), with room for the band's width where it can; the two ends of the band cut their edges, the sides cut each edge
    the band crosses twice (the new crossings), and the pieces are matched to the new diagram's
    edges by walking them from the crossings the two frames share. Everything is checked: every
    edge met from both ends as the new diagram says, the new crossings met in PD order, nothing
    crossing where it should not. A picture that sticks out farther than :data:`RIM` has its
    outer ring pressed in.

    Parameters: the frame before, its layout, the frame after and the band (as for
    :func:`frame_layouts`). Returns the layout, or None where the frame before is not one piece
    drawn in the unit disk, the frame after has crossingless circles or several pieces, or some
    check fails (then the frame is laid out as any other).

    >>> from movies.language.spec import parse_diagram
    >>> from movies.diagram.moves.morse import saddle
    >>> from movies.draw.layout import layout
    >>> knot = parse_diagram("4_1")
    >>> after = saddle(knot, 1, 5, 1).diagram
    >>> lay = band_layout(knot, layout(knot), after, (1, 5, (1,), ()))
    >>> sorted(lay.edges) == sorted(after.edges())
    True

    References: common practice, no source.
    """
    if lay is None or band is None or lay.bounds != ONE_PIECE or lay.circles or not before.faces:
        return None
    first, second, faces, path = band
    crossed = [edge for edge, _ in path]
    if (first == second or after.loops or after.piece_count() != 1 or before.piece_count() != 1
            or len(set(crossed)) != len(crossed) or {first, second} & set(crossed)
            or not set(before.crossings) <= set(after.crossings)
            or len(after.crossings) != len(before.crossings) + 2 * len(path)):
        return None
    chain = [first] + crossed + [second]
    if any(edge not in lay.edges for edge in chain):
        return None
    # the picture as drawn: the band's core is found on the curves, as the picture of the band step
    # finds it, and every strand of the frame after starts from its curve
    curves = strands(before, lay).curves
    lines = {edge: sample(curve) for edge, curve in curves.items()}
    found = band_core(before, band, lines, drawn_outside(before, lay))
    if found is None:
        return None
    core, _, room = found
    typical = statistics.median(_length(line) for line in lines.values())
    step = typical / STEPS_PER_EDGE
    # the band's sides stay within the room its core keeps from the strands
    for fraction in [f for f in BAND_HALF_WIDTHS if f < room] or [BAND_HALF_WIDTHS[-1]]:
        drawn = _with_band(before, lay, after, band, core, fraction * typical, step, lines)
        if drawn is not None and _quality(after, drawn) >= BAND_QUALITY \
                and strands(after, drawn).smallest_gap >= SMALLEST_GAP:
            return drawn
    return None


def _thinned(line: list[Point], spacing: float) -> list[Point]:
    """The polyline with its points at least ``spacing`` apart (both ends kept)."""
    out = [line[0]]
    for p in line[1:-1]:
        if math.dist(p, out[-1]) >= spacing and math.dist(p, line[-1]) >= spacing:
            out.append(p)
    return out + [line[-1]]


def _arc(line: list[Point], point: Point) -> float:
    """How far along a polyline its nearest point to ``point`` lies."""
    best, where, walked = math.inf, 0.0, 0.0
    for p, q in zip(line, line[1:]):
        length = math.dist(p, q)
        if length > 0:
            t = max(0.0, min(1.0, ((point[0] - p[0]) * (q[0] - p[0]) + (point[1] - p[1]) * (q[1] - p[1])) / length ** 2))
            near = (p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1]))
            if math.dist(near, point) < best:
                best, where = math.dist(near, point), walked + t * length
        walked += length
    return where


def _cut(line: list[Point], start: float, end: float) -> list[Point]:
    """The part of a polyline between two distances along it (start < end), with its cut points."""
    out: list[Point] = []
    walked = 0.0
    for p, q in zip(line, line[1:]):
        length = math.dist(p, q)
        a, b = walked, walked + length
        if length > 0 and b >= start and a <= end:
            if not out:
                t = (start - a) / length
                out.append((p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1])))
            if b <= end:
                out.append(q)
            else:
                t = (end - a) / length
                out.append((p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1])))
                break
        walked = b
    return [p for k, p in enumerate(out) if k == 0 or math.dist(p, out[k - 1]) > 1e-12]



def _side_lines(core: list[Point], half: float) -> tuple[list[Point], list[Point]]:
    """The inner points of the band's left and right sides: the core's inner points moved
    ``half`` to either side (mitred at its corners)."""
    left, right = [], []
    for a, p, b in zip(core, core[1:], core[2:]):
        normals = []
        for u, v in ((a, p), (p, b)):
            length = math.dist(u, v) or 1.0
            normals.append((-(v[1] - u[1]) / length, (v[0] - u[0]) / length))
        mx, my = normals[0][0] + normals[1][0], normals[0][1] + normals[1][1]
        size = math.hypot(mx, my) or 1.0
        mx, my = mx / size, my / size
        reach = half / max(0.3, mx * normals[0][0] + my * normals[0][1])
        left.append((p[0] + reach * mx, p[1] + reach * my))
        right.append((p[0] - reach * mx, p[1] - reach * my))
    return left, right


def _untangled(line: list[Point]) -> list[Point]:
    """The polyline with every loop it makes cut out: where two of its steps cross, the points
    between go and the crossing point takes their place (the inner side of a band where its core
    turns sharply).

    >>> _untangled([(0, 0), (2, 0), (2, 1), (1, -1), (1, -2)])
    [(0, 0), (1.5, 0.0), (1, -1), (1, -2)]
    """
    line = list(line)
    while True:
        for i in range(len(line) - 3):
            found = next((j for j in range(len(line) - 2, i + 1, -1)
                          if segments_cross(line[i], line[i + 1], line[j], line[j + 1])), None)
            if found is not None:
                (_, _, point), = _meeting(line[i:i + 2], line[found:found + 2])
                line = line[:i + 1] + [point] + line[found + 1:]
                break
        else:
            return line


def _meeting(line: list[Point], other: list[Point]) -> list[tuple[float, float, Point]]:
    """Where two polylines cross: (distance along the first, along the second, the point) each."""
    out = []
    walked = 0.0
    for p, q in zip(line, line[1:]):
        along = 0.0
        for a, b in zip(other, other[1:]):
            rx, ry, sx, sy = q[0] - p[0], q[1] - p[1], b[0] - a[0], b[1] - a[1]
            denominator = rx * sy - ry * sx
            if denominator != 0:
                t = ((a[0] - p[0]) * sy - (a[1] - p[1]) * sx) / denominator
                u = ((a[0] - p[0]) * ry - (a[1] - p[1]) * rx) / denominator
                if 0 <= t < 1 and 0 <= u < 1:
                    out.append((walked + t * math.hypot(rx, ry), along + u * math.hypot(sx, sy),
                                (p[0] + t * rx, p[1] + t * ry)))
            along += math.dist(a, b)
        walked += math.dist(p, q)
    return out


def _with_band(before: Diagram, lay: Layout, after: Diagram, band: tuple, core: list[Point], half: float,
               step: float, lines: dict[int, list[Point]]) -> Layout | None:
    """The frame after the band with sides ``half`` from its core, its strands from ``lines``,
    the frame before as drawn (see :func:`band_layout`)."""
    first, second, _, path = band
    ends = before.edge_ends

    def arm(edge: int, at_head: bool) -> tuple:
        dart = ends[edge][1 if at_head else 0]
        return ("arm", dart.crossing, dart.position)

    pieces: list[tuple[tuple, tuple, list[Point]]] = []  # (node at the start, node at the end, points)
    for edge, line in lines.items():
        if edge not in (first, second) and all(edge != e for e, _ in path):
            pieces.append((arm(edge, False), arm(edge, True), list(line)))
    # the band's ends cut their edges: the cut points are joints, each joining an edge's piece to a side
    left_line, right_line = _side_lines(core, half)
    joints = {}
    for edge, point, inward in ((first, core[0], core[1]), (second, core[-1], core[-2])):
        line = lines[edge]
        at, total = _arc(line, point), _length(line)
        if not half < at < total - half:
            return None
        towards_tail, towards_head = _cut(line, 0.0, at - half), _cut(line, at + half, total)
        if math.dist(towards_tail[-1], towards_head[0]) < 1.5 * half:
            return None  # the edge bends sharply where the band meets it: a narrower band, or none
        pieces.append((arm(edge, False), ("joint", edge, "tail"), towards_tail))
        pieces.append((("joint", edge, "head"), arm(edge, True), towards_head))
        # seen from the core, walking from the first edge to the second: which cut point is on the left
        dx, dy = (inward[0] - point[0], inward[1] - point[1]) if edge == first else (point[0] - inward[0], point[1] - inward[1])
        # by the edge's own direction where the band meets it (its cut points may lie round a bend)
        ahead, behind = _cut(line, 0.0, at + half / 4)[-1], _cut(line, 0.0, at - half / 4)[-1]
        on_left = dx * (behind[1] - ahead[1]) - dy * (behind[0] - ahead[0]) > 0
        joints[(edge, "L")] = ("joint", edge, "tail" if on_left else "head")
        joints[(edge, "R")] = ("joint", edge, "head" if on_left else "tail")
        joints[(edge, "point", "L")] = towards_tail[-1] if on_left else towards_head[0]
        joints[(edge, "point", "R")] = towards_head[0] if on_left else towards_tail[-1]
    sides = {}
    for hand, inner in (("L", left_line), ("R", right_line)):
        sides[hand] = _untangled([joints[(first, "point", hand)]] + inner + [joints[(second, "point", hand)]])
    # each crossed edge is met once by each side: the new crossings
    cuts = {hand: [] for hand in "LR"}
    for j, (edge, _) in enumerate(path):
        line = lines[edge]
        met = {}
        for hand in "LR":
            found = _meeting(sides[hand], line)
            if len(found) != 1:
                return None
            along_side, along_edge, point = found[0]
            cuts[hand].append((along_side, ("new", j, hand), point))
            met[hand] = (along_edge, ("new", j, hand))
        (a, a_node), (b, b_node) = sorted(met.values())
        total = _length(line)
        if not 0 < a < b < total:
            return None
        pieces.append((arm(edge, False), a_node, _cut(line, 0.0, a)))
        pieces.append((a_node, b_node, _cut(line, a, b)))
        pieces.append((b_node, arm(edge, True), _cut(line, b, total)))
    for hand in "LR":
        line, total = sides[hand], _length(sides[hand])
        stops = [(0.0, joints[(first, hand)])] + sorted(cuts[hand]) + [(total, joints[(second, hand)])]
        stops = [(s, node) for s, node, *_ in stops]
        if any(s >= t for (s, _), (t, _) in zip(stops, stops[1:])):
            return None
        for (s, a_node), (t, b_node) in zip(stops, stops[1:]):
            pieces.append((a_node, b_node, _cut(line, s, t)))
    strands = _strands(pieces)
    drawn = _matched(after, strands) if strands is not None else None
    if drawn is None:
        return None
    crossings, edges = drawn
    edges = {edge: _tidied(_thinned(_untangled(points), min(step / 3, _length(points) / 8)),
                           min(TIDY * step, _length(points) / 4)) for edge, points in edges.items()}
    built = _pictured(after, lay, crossings, edges)
    if built is None or (_quality(after, built) >= 1 and _closest(built.edges) >= SPREAD_ROOM * half):
        return built
    # crowded where the band runs close to a strand: pushing the strands apart may give it room
    held = [edge for edge in edges if edge in lines and edges[edge] == lines[edge]]
    spread = _pictured(after, lay, *_spread(after, crossings, edges, set(before.crossings), held, step, half))
    if spread is not None and _quality(after, spread) >= min(1.0, _quality(after, built)):
        return spread
    return built


def _closest(edges: dict[int, list[Point]]) -> float:
    """How close inner points of two different edges come."""
    points = [(k, p) for k, edge in enumerate(sorted(edges)) for p in edges[edge][1:-1]]
    owner = np.asarray([k for k, _ in points])
    xy = np.asarray([p for _, p in points], dtype=float)
    first, second = np.triu_indices(len(xy), 1)
    apart = owner[first] != owner[second]
    if not apart.any():
        return math.inf
    return float(np.sqrt(((xy[first[apart]] - xy[second[apart]]) ** 2).sum(axis=1)).min())


def _pictured(after: Diagram, lay: Layout, crossings: dict[int, Point], edges: dict[int, list[Point]]) -> Layout | None:
    """The layout of these crossings and edges, pressed into the disk of radius RIM, with a point in each
    face; None where strands cross or some crossing's ends are out of PD order."""
    reach = max(math.hypot(*p) for pts in edges.values() for p in pts)
    if reach > RIM:
        # drawn round the outside, the band sticks out of the picture: the ring outside the radius
        # KEPT is pressed into the disk of radius RIM, the middle of the picture stays put
        def pressed(p: Point) -> Point:
            r = math.hypot(*p)
            if r <= KEPT:
                return p
            f = (KEPT + (r - KEPT) * (RIM - KEPT) / (reach - KEPT)) / r
            return (p[0] * f, p[1] * f)

        edges = {edge: [pressed(p) for p in pts] for edge, pts in edges.items()}
        crossings = {name: pressed(p) for name, p in crossings.items()}
    if crossings_between([edges[e] for e in sorted(edges)]) or not _in_pd_order(after, crossings, edges):
        return None
    face_points, outer = {}, None
    for face, (cycle,) in after.faces.items():
        polygon = _polygon(edges, cycle)
        area = sum(p[0] * q[1] - q[0] * p[1] for p, q in zip(polygon, polygon[1:] + polygon[:1]))
        if area < 0:  # walked with the face on the left: only the outside runs clockwise
            if outer is not None:
                return None
            outer, face_points[face] = face, OUTER_LABEL
        else:
            face_points[face], room = inscribed_disk(polygon)
            if room < FACE_ROOM:
                return None  # a sliver of a face, too thin for its name: the frame is laid out anew
    if outer is None:
        return None
    around = frozenset(side.edge for cycle in after.faces[outer] for side in cycle)
    return replace(lay, crossings=crossings, edges=edges, circles={}, face_points=face_points, outside=around,
                   outer=outer, braid=False)


def _tidied(points: list[Point], room: float) -> list[Point]:
    """An edge's polyline without repeated points, nor inner points closer than ``room`` to its
    ends (the strand leaves its crossing along a real step, and the under-strand's gap shows);
    at least one inner point."""
    out = [p for k, p in enumerate(points) if k == 0 or math.dist(p, points[k - 1]) > 1e-12]
    inner = [p for p in out[1:-1] if math.dist(p, out[0]) > room and math.dist(p, out[-1]) > room]
    if not inner:
        inner = [((out[0][0] + out[-1][0]) / 2, (out[0][1] + out[-1][1]) / 2)]
    return [out[0]] + inner + [out[-1]]


def _strands(pieces: list[tuple[tuple, tuple, list[Point]]]) -> list[tuple[tuple, tuple, list[Point]]] | None:
    """The pieces joined through their joints: strands from crossing to crossing, as (node at the
    start, node at the end, points); None unless every joint joins exactly two pieces."""
    at_joint: dict[tuple, list[tuple[int, int]]] = {}
    for index, (start, end, _) in enumerate(pieces):
        for which, node in ((0, start), (1, end)):
            if node[0] == "joint":
                at_joint.setdefault(node, []).append((index, which))
    if any(len(met) != 2 for met in at_joint.values()):
        return None
    used, out = set(), []
    for index, (start, end, points) in enumerate(pieces):
        if index in used or (start[0] == "joint" and end[0] == "joint"):
            continue
        if start[0] == "joint":
            start, end, points = end, start, points[::-1]
        used.add(index)
        line, node = list(points), end
        while node[0] == "joint":
            (other, which), = [(i, w) for i, w in at_joint[node] if i not in used]
            used.add(other)
            s, e, pts = pieces[other]
            line += (pts if which == 0 else pts[::-1])[1:]
            node = e if which == 0 else s
        out.append((start, node, line))
    return out if len(used) == len(pieces) else None


def _matched(after: Diagram, strands: list[tuple[tuple, tuple, list[Point]]]):
    """The strands named as the edges of ``after`` (crossings and edge polylines, tail to head),
    walking out from the crossings it shares with the frame before; None where they disagree."""
    at: dict[tuple, tuple[int, int]] = {}  # (node, first step) -> (strand, which end)
    arms_of: dict[tuple, list[tuple]] = {}
    for index, (start, end, points) in enumerate(strands):
        for which, node, near in ((0, start, points[1] if len(points) > 1 else None),
                                  (1, end, points[-2] if len(points) > 1 else None)):
            if near is None:
                return None
            key = (node, near)
            if key in at:
                return None
            at[key] = (index, which)
            arms_of.setdefault(node, []).append(key)
    point_of: dict[tuple, Point] = {}
    for start, end, points in strands:
        point_of[start], point_of[end] = points[0], points[-1]
    name_of = {node: node[1] for node in arms_of if node[0] == "arm"}
    position: dict[tuple, int] = {key: key[0][2] for node in arms_of if node[0] == "arm" for key in arms_of[node]}
    new_names = set(after.crossings) - {node[1] for node in arms_of if node[0] == "arm"}
    edges: dict[int, list[Point]] = {}
    queue = list(position)
    while queue:
        key = queue.pop()
        node = key[0]
        name, slot = name_of[node], position[key]
        edge = after.crossings[name][slot]
        tail, head = after.edge_ends[edge]
        index, which = at[key]
        start, end, points = strands[index]
        here_is_tail = (tail.crossing, tail.position) == (name, slot)
        far = head if here_is_tail else tail
        line = points if which == 0 else points[::-1]
        line = line if here_is_tail else line[::-1]
        if edge in edges:
            if edges[edge] != line:
                return None
            continue
        edges[edge] = line
        far_node = end if which == 0 else start
        far_key = (far_node, points[-2] if which == 0 else points[1])
        if far_node[0] == "arm":
            if (far_node[1], far_node[2]) != (far.crossing, far.position):
                return None
            continue
        if far_node in name_of:
            if name_of[far_node] != far.crossing or position.get(far_key) != far.position:
                return None
            continue
        if far.crossing not in new_names or far.crossing in name_of.values():
            return None
        name_of[far_node] = far.crossing
        # the four ends of a new crossing in counterclockwise order: PD positions in turn
        centre = point_of[far_node]
        keys = arms_of[far_node]
        if len(keys) != 4:
            return None
        keys = sorted(keys, key=lambda k: math.atan2(k[1][1] - centre[1], k[1][0] - centre[0]))
        shift = keys.index(far_key)
        for rank, k in enumerate(keys):
            position[k] = (far.position + rank - shift) % 4
            if k != far_key:
                queue.append(k)
        if not counterclockwise([(k[1][0] - centre[0], k[1][1] - centre[1]) for k in keys[shift:] + keys[:shift]]):
            return None
    if set(edges) != set(after.edges()) or set(name_of.values()) != set(after.crossings):
        return None
    crossings = {name: point_of[node] for node, name in name_of.items()}
    return crossings, edges


def _resampled(points: list[Point], step: float) -> list[Point]:
    """The polyline walked again with points about ``step`` apart between its second point and
    its last but one (those stay: they give the directions in which it leaves its crossings)."""
    if len(points) < 4:
        return list(points)
    middle = points[1:-1]
    total = _length(middle)
    count = max(1, round(total / step))
    walked = [_cut(middle, 0.0, total * k / count)[-1] for k in range(1, count)]
    return [points[0], middle[0]] + walked + [middle[-1], points[-1]]


#: rounds of the springs that give a band's sides room (see :func:`_spread`)
SPREAD_ROUNDS = 40

#: how hard the new strands are pulled back toward where the band put them (the old ones: as anchors)
SPREAD_PULL = 0.5

#: a frame drawn from a band is crowded where inner points of two edges come closer than this
#: many half widths of the band (its sides are two apart); there they push each other apart
SPREAD_ROOM = 1.5


def _spread(diagram: Diagram, crossings: dict[int, Point], edges: dict[int, list[Point]], old: set[int],
            held: list[int], step: float, half: float) -> tuple[dict[int, Point], dict[int, list[Point]]]:
    """The picture after a band with its new strands given room by springs, never letting two
    strands cross: the crossings of the frame before and the points of the edges it had
    (``old``, ``held``) are pulled back to where they are, the rest (the band's sides and the
    edges it cut, walked again with points ``step`` apart) spread out, held more loosely, and the arms of the new
    crossings turn toward right angles. A round whose moves would make strands cross, or turn
    a crossing's ends out of PD order, is undone for the points involved (or as a whole)."""
    lines = {edge: (pts if edge in held else _resampled(pts, step)) for edge, pts in edges.items()}
    if crossings_between([lines[e] for e in sorted(lines)]):
        lines = edges
    names = sorted(crossings)
    index = {name: i for i, name in enumerate(names)}
    xy = [crossings[name] for name in names]
    ids: dict[int, list[int]] = {}
    for edge in sorted(lines):
        tail, head = diagram.edge_ends[edge]
        inner = list(range(len(xy), len(xy) + len(lines[edge]) - 2))
        xy += lines[edge][1:-1]
        ids[edge] = [index[tail.crossing]] + inner + [index[head.crossing]]
    pts = np.asarray(xy, dtype=float)
    strokes = np.asarray([(a, b) for chain in ids.values() for a, b in zip(chain, chain[1:])], dtype=int)
    anchored = [index[name] for name in names if name in old] + [i for edge in held for i in ids[edge][1:-1]]
    anchors = (np.asarray(anchored, dtype=int), pts[anchored].copy())
    start = pts.copy()
    arms = []
    for name in names:
        if name in old or len(set(diagram.crossings[name])) < 4:
            continue
        row = [index[name]]
        for position, edge in enumerate(diagram.crossings[name]):
            tail, _ = diagram.edge_ends[edge]
            row.append(ids[edge][1] if (tail.crossing, tail.position) == (name, position) else ids[edge][-2])
        arms.append(row)
    arms = np.asarray(arms, dtype=int).reshape(-1, 5)
    quarter = np.arange(4) * (np.pi / 2)
    limit = max(1.0, float(np.sqrt((pts ** 2).sum(axis=1)).max()))

    def crossing_strokes(trial: np.ndarray) -> np.ndarray:
        found = crossings_between([[tuple(trial[a]), tuple(trial[b])] for a, b in strokes])
        return np.asarray([k for i, _, j, _, _ in found for k in (i, j)], dtype=int)

    def rebuilt(trial: np.ndarray) -> tuple[dict[int, Point], dict[int, list[Point]]]:
        points = [(float(x), float(y)) for x, y in trial]
        return ({name: points[index[name]] for name in names},
                {edge: [points[i] for i in chain] for edge, chain in ids.items()})

    # pairs of inner points of different edges: those closer than SPREAD_ROOM half widths push each other apart
    owner = np.full(len(pts), -1)
    for k, (edge, chain) in enumerate(sorted(ids.items())):
        owner[chain[1:-1]] = k
    first, second = np.triu_indices(len(pts), 1)
    apart = (owner[first] >= 0) & (owner[second] >= 0) & (owner[first] != owner[second])
    first, second = first[apart], second[apart]
    room = SPREAD_ROOM * half
    for round_ in range(SPREAD_ROUNDS):
        force = SPREAD_PULL * (start - pts)
        delta = pts[first] - pts[second]
        distance = np.sqrt((delta ** 2).sum(axis=1))
        close = (distance < room) & (distance > 0)
        push = delta[close] * ((room - distance[close]) / distance[close])[:, None]
        np.add.at(force, first[close], push)
        np.add.at(force, second[close], -push)
        if len(arms):
            np.add.at(force, arms[:, 1:].ravel(), layout_module._opening(pts, arms, quarter).reshape(-1, 2) * step)
        force[anchors[0]] = layout_module.ANCHOR_PULL * (anchors[1] - pts[anchors[0]])
        size = np.sqrt((force ** 2).sum(axis=1))
        reach = np.minimum(size, 0.1 * step) * (1 - round_ / SPREAD_ROUNDS)
        move = np.where(size[:, None] > 0, force / np.maximum(size, 1e-300)[:, None] * reach[:, None], 0.0)
        trial = pts + move
        # nothing goes farther out than the farthest point at the start: room is made inside
        far = np.sqrt((trial ** 2).sum(axis=1))
        trial[far > limit] *= (limit / far[far > limit])[:, None]
        for _ in range(8):
            bad = crossing_strokes(trial)
            if not len(bad):
                break
            undo = np.unique(strokes[bad].ravel())
            trial[undo] = pts[undo]
        else:
            continue
        spread_crossings, spread_edges = rebuilt(trial)
        if _in_pd_order(diagram, spread_crossings, spread_edges):
            pts = trial
    return rebuilt(pts)
