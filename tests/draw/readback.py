"""Reading a drawing back: the geometry of an SVG picture, checked against its diagram.

Only the SVG text is used: the path data of every ``strand`` (sampled into polylines), its
``data-*`` names, and the face labels. :func:`check_drawing` raises ``AssertionError`` with a
reason when the picture does not show the diagram.
"""

from __future__ import annotations

import math
import re
import xml.etree.ElementTree as ET

from movies.draw.geometry import crossings_between

SVG = "{http://www.w3.org/2000/svg}"
_TOKEN = re.compile(r"[MLQZ]|-?\d+(?:\.\d+)?")


def parse_path(d: str, steps: int = 8) -> tuple[list[tuple[float, float]], bool]:
    """Path data (M, L, Q, Z) -> sampled polyline in y-up coordinates, and whether it closes."""
    tokens = _TOKEN.findall(d)
    points: list[tuple[float, float]] = []
    closed = False
    i = 0
    command = None
    while i < len(tokens):
        if tokens[i] in "MLQZ":
            command = tokens[i]
            i += 1
            if command == "Z":
                closed = True
            continue
        if command in ("M", "L"):
            points.append((float(tokens[i]), -float(tokens[i + 1])))
            i += 2
        elif command == "Q":
            p0 = points[-1]
            c = (float(tokens[i]), -float(tokens[i + 1]))
            p1 = (float(tokens[i + 2]), -float(tokens[i + 3]))
            for k in range(1, steps + 1):
                t = k / steps
                u = 1 - t
                points.append((u * u * p0[0] + 2 * u * t * c[0] + t * t * p1[0],
                               u * u * p0[1] + 2 * u * t * c[1] + t * t * p1[1]))
            i += 4
        else:
            raise AssertionError(f"unexpected path data {tokens[i]!r}")
    if closed and points and points[0] == points[-1]:
        points.pop()
    return points, closed


def read_svg(text: str) -> dict:
    """The strands, arrows and face labels of a picture."""
    root = ET.fromstring(text)
    strands, arrows, faces, colours = {}, {}, {}, {}
    stroke = None
    for element in root.iter():
        cls = element.get("class")
        if cls == "strand":
            edge = int(element.get("data-edge"))
            assert edge not in strands, f"edge {edge} is drawn twice"
            points, closed = parse_path(element.get("d"))
            strands[edge] = {
                "points": points, "closed": closed, "component": int(element.get("data-component")),
                "tail": element.get("data-tail"), "head": element.get("data-head"),
            }
            # a component's style is its colour and its dash pattern (past the palette, hues repeat dashed)
            colours[edge] = (element.get("stroke"), element.get("stroke-dasharray") is not None)
            stroke = float(element.get("stroke-width"))
        elif cls == "arrow":
            arrows[int(element.get("data-edge"))] = parse_path(element.get("d"))[0]
        elif cls == "label-face":
            size = float(element.get("font-size"))
            faces[int(element.get("data-face"))] = (float(element.get("x")), -(float(element.get("y")) - 0.35 * size))
    return {"strands": strands, "arrows": arrows, "faces": faces, "colours": colours, "stroke": stroke}


def _to_segment(c, p, q) -> float:
    """The distance from the point c to the segment pq.

    >>> _to_segment((0, 1), (-1, 0), (1, 0)), _to_segment((3, 0), (-1, 0), (1, 0))
    (1.0, 2.0)
    """
    dx, dy = q[0] - p[0], q[1] - p[1]
    length2 = dx * dx + dy * dy
    t = 0.0 if length2 == 0 else max(0.0, min(1.0, ((c[0] - p[0]) * dx + (c[1] - p[1]) * dy) / length2))
    return _distance(c, (p[0] + t * dx, p[1] + t * dy))


def _distance(p, q) -> float:
    return math.hypot(p[0] - q[0], p[1] - q[1])


def _signed_area(points) -> float:
    return sum(points[i][0] * points[(i + 1) % len(points)][1] - points[(i + 1) % len(points)][0] * points[i][1]
               for i in range(len(points))) / 2


def _inside(point, polygon) -> bool:
    x, y = point
    inside = False
    for i in range(len(polygon)):
        (xa, ya), (xb, yb) = polygon[i], polygon[(i + 1) % len(polygon)]
        if (ya > y) != (yb > y) and x < xa + (y - ya) * (xb - xa) / (yb - ya):
            inside = not inside
    return inside


def _away(points, centre, radius):
    """The first sampled point of a path (from its start) farther than ``radius`` from ``centre``."""
    for p in points:
        if _distance(p, centre) > radius:
            return p
    return points[-1]


def _near_end(points, centre, radius):
    """The start of a path up to and including its first point farther than ``radius`` from ``centre``."""
    for k, p in enumerate(points):
        if _distance(p, centre) > radius:
            return points[: k + 1]
    return list(points)


def _hits(chord, polyline) -> list[tuple[float, float]]:
    """Where a segment meets a polyline, touching included, each point once."""
    (ax, ay), (bx, by) = chord
    found = []
    for k in range(len(polyline) - 1):
        (px, py), (qx, qy) = polyline[k], polyline[k + 1]
        rx, ry, sx, sy = bx - ax, by - ay, qx - px, qy - py
        denom = rx * sy - ry * sx
        if abs(denom) < 1e-12:
            continue
        t = ((px - ax) * sy - (py - ay) * sx) / denom
        u = ((px - ax) * ry - (py - ay) * rx) / denom
        if -1e-9 <= t <= 1 + 1e-9 and -1e-9 <= u <= 1 + 1e-9:
            point = (ax + t * rx, ay + t * ry)
            if all(_distance(point, q) > 1e-6 for q in found):
                found.append(point)
    return found


def check_drawing(diagram, text: str, visible: bool = True) -> dict:
    """Assert that the picture shows ``diagram``; returns what was read (for further checks).

    Checked: one path per edge, in its component's colour; each edge's path runs from its
    tail crossing to its head crossing; at every crossing the over-strand runs through one
    point and the under-strand stops short on both sides (the gap); the four ends leave that
    point counterclockwise in PD order; the drawn paths, with each gap closed by a straight
    chord, cross nowhere except each chord with its own over-strand, exactly once; nothing else
    comes into a gap; and for every face, the other pieces in it and its label lie on the
    face's side of each of its boundary cycles. With ``visible`` every gap must be at least half
    the stroke width; without, only wide enough to read back (pieces nested deep in small
    faces are drawn small, and face labels are then not checked either).
    """
    read = read_svg(text)
    strands = read["strands"]
    assert sorted(strands) == diagram.edges(), "the drawn edges are not the diagram's edges"
    for edge, info in strands.items():
        assert info["component"] == diagram.component_of(edge), f"edge {edge} has the wrong component"
        assert info["closed"] == (edge in diagram.loops), f"edge {edge}: closed path exactly for a circle"
    colour_of = {}
    for edge, colour in read["colours"].items():
        colour_of.setdefault(diagram.component_of(edge), set()).add(colour)
    assert all(len(c) == 1 for c in colour_of.values()), "a component drawn in several colours"
    if len(colour_of) <= 8:
        assert len({next(iter(c)) for c in colour_of.values()}) == len(colour_of), "two components share a style"
    stroke = read["stroke"] or 1.0

    # the crossing points, from the over-strand
    point, gap = {}, {}
    for name in diagram.crossings:
        over_in, over_out = diagram.over_edges(name)
        end, start = strands[over_in]["points"][-1], strands[over_out]["points"][0]
        assert _distance(end, start) < 1e-6, f"crossing {name}: the over-strand is broken"
        point[name] = end
    for name, (a, b, c, d) in diagram.crossings.items():
        p = point[name]
        ends = [strands[a]["points"][-1], strands[c]["points"][0]]
        gaps = [_distance(q, p) for q in ends]
        # a visible gap: at least half the stroke width on either side of the crossing point
        least = 0.5 * stroke if visible else 0.01
        assert min(gaps) >= least, f"crossing {name}: the under-strand has no visible gap ({gaps})"
        gap[name] = max(gaps)
    for edge, info in strands.items():
        if edge in diagram.loops:
            continue
        tail, head = diagram.edge_ends[edge]
        assert info["tail"] == str(tail.crossing) and info["head"] == str(head.crossing)
        slack_t = gap[tail.crossing] + 1e-6
        slack_h = gap[head.crossing] + 1e-6
        assert _distance(info["points"][0], point[tail.crossing]) <= slack_t, f"edge {edge} does not start at its tail"
        assert _distance(info["points"][-1], point[head.crossing]) <= slack_h, f"edge {edge} does not end at its head"

    # counterclockwise PD order around every crossing
    for name, labels in diagram.crossings.items():
        p = point[name]
        angles = []
        for position, edge in enumerate(labels):
            tail, head = diagram.edge_ends[edge]
            pts = strands[edge]["points"]
            leaving = (tail.crossing, tail.position) == (name, position)
            q = _away(pts if leaving else pts[::-1], p, 1.5 * gap[name])
            angles.append(math.atan2(q[1] - p[1], q[0] - p[0]))
        turns = [(angles[(k + 1) % 4] - angles[k]) % (2 * math.pi) for k in range(4)]
        assert abs(sum(turns) - 2 * math.pi) < 1e-6, f"crossing {name}: the strands leave out of PD order"

    # whole strands: drawn paths plus a chord across each gap
    lines, closed, owner = [], [], []
    for edge in sorted(strands):
        lines.append(strands[edge]["points"])
        closed.append(strands[edge]["closed"])
        owner.append(("edge", edge))
    chords = {}
    for name, (a, b, c, d) in diagram.crossings.items():
        chords[name] = (strands[a]["points"][-1], strands[c]["points"][0])
        lines.append(list(chords[name]))
        closed.append(False)
        owner.append(("chord", name))
    for i, _, j, _, where in crossings_between(lines, closed):
        first, second = owner[i], owner[j]
        kinds = {first[0], second[0]}
        assert kinds == {"chord", "edge"}, f"strands cross away from every crossing, at {where}"
        chord = first if first[0] == "chord" else second
        edge = second if first[0] == "chord" else first
        assert edge[1] in diagram.over_edges(chord[1]), f"the gap at crossing {chord[1]} is crossed by edge {edge[1]}"
    for name in diagram.crossings:
        over_in, over_out = diagram.over_edges(name)
        # the over-strand near the crossing (a kink's loop is both over- and under-strand there)
        arriving = _near_end(strands[over_in]["points"][::-1], point[name], 3 * gap[name])[::-1]
        leaving = _near_end(strands[over_out]["points"], point[name], 3 * gap[name])
        over = arriving + leaving[1:]
        assert len(_hits(chords[name], over)) == 1, f"crossing {name}: the over-strand does not cross the gap once"
        # nothing else comes into the gap
        for edge, info in strands.items():
            if edge in diagram.crossings[name]:
                continue
            nearest = min(_distance(q, point[name]) for q in info["points"])
            assert nearest > gap[name], f"edge {edge} runs through the gap at crossing {name}"

    # arrows point along the orientation: from the base to the tip is forward along the path
    for edge, tri in read["arrows"].items():
        tip, base = tri[0], ((tri[1][0] + tri[2][0]) / 2, (tri[1][1] + tri[2][1]) / 2)
        if _distance(tip, base) < 1.0:
            continue  # too small to read a direction off after rounding
        pts = strands[edge]["points"]
        steps = [i for i in range(len(pts) - 1) if _distance(pts[i], pts[i + 1]) > 1e-9]
        # the arrow is centred on the path: the steps of the path near its centre run its way
        centre = ((tip[0] + base[0]) / 2, (tip[1] + base[1]) / 2)
        reach = _distance(tip, base)
        # a step is near when some point of it is (a long straight step can pass the arrow with both ends far)
        near = [i for i in steps if _to_segment(centre, pts[i], pts[i + 1]) <= reach]
        dots = [(pts[i + 1][0] - pts[i][0]) * (tip[0] - base[0]) + (pts[i + 1][1] - pts[i][1]) * (tip[1] - base[1])
                for i in near]
        if any(d < 0 for d in dots) and any(d > 0 for d in dots):
            continue  # the path turns back within the arrow's length (a hairpin): no direction to read
        assert dots, f"the arrow on edge {edge} is not on its path"
        assert all(d > 0 for d in dots), f"the arrow on edge {edge} points backwards"

    # faces: each boundary cycle has the face on its left
    piece_of = {edge: i for i, piece in enumerate(diagram.pieces()) for edge in piece}

    def polygon(cycle):
        pts = []
        for side in cycle:
            line = strands[side.edge]["points"]
            pts.extend(line if side.hand == "L" else line[::-1])
        return pts

    for face, cycles in diagram.faces.items():
        polygons = [polygon(cycle) for cycle in cycles]
        for cycle, poly in zip(cycles, polygons):
            bounded = _signed_area(poly) > 0  # counterclockwise: the face is the inside
            for other in cycles:
                if other is cycle:
                    continue
                probe = strands[other[0].edge]["points"][0]
                assert _inside(probe, poly) == bounded, f"face {face}: piece {piece_of[other[0].edge]} is on the wrong side"
            if face in read["faces"] and visible:
                assert _inside(read["faces"][face], poly) == bounded, f"the label of face {face} is outside it"
    return read


def crossing_angles(diagram, text: str) -> dict:
    """The angle (degrees, 0 to 90) between the two strands at each crossing, read from the SVG.

    The under-strand's direction is the chord across its gap (from the end of the edge arriving
    to the start of the edge leaving); the over-strand's runs between its first drawn points
    three gaps away on either side of the crossing point: the angle a reader sees, not the
    tangents alone (a strand bent hard just beside the crossing does not count as square).
    """
    strands = read_svg(text)["strands"]
    angles = {}
    for name, (a, b, c, d) in diagram.crossings.items():
        over_in, over_out = diagram.over_edges(name)
        p = strands[over_in]["points"][-1]
        u0, u1 = strands[a]["points"][-1], strands[c]["points"][0]
        reach = 3 * max(_distance(u0, p), _distance(u1, p))
        before = _away(strands[over_in]["points"][::-1], p, reach)
        after = _away(strands[over_out]["points"], p, reach)
        over = (after[0] - before[0], after[1] - before[1])
        under = (u1[0] - u0[0], u1[1] - u0[1])
        cross = abs(over[0] * under[1] - over[1] * under[0])
        dot = abs(over[0] * under[0] + over[1] * under[1])
        angles[name] = math.degrees(math.atan2(cross, dot))
    return angles
