"""A diagram as an SVG picture: coloured strands with gaps, arrows, labels and highlights.

Every edge is one ``<path class="strand">`` drawn from its tail crossing to its head crossing,
so the direction of the path is the orientation; ``data-edge``, ``data-component``,
``data-tail`` and ``data-head`` name what it is. Where the edge passes under at a crossing the
path stops short of the crossing point (the gap); where it passes over it runs right through
the point. Crossingless circles are closed paths. Each component has a colour by its name
(:func:`component_style`), so it keeps it from frame to frame.

>>> from movies.diagram.pd import from_pd
>>> text = diagram_svg(from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]), labels=True)
>>> text.startswith("<svg"), text.count('class="strand"'), text.count('class="arrow"')
(True, 6, 6)
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from html import escape

from movies.diagram.model import Diagram, Side
from movies.draw.bands import band_core
from movies.draw.curves import Strands, strands
from movies.draw.geometry import sample, segments_cross
from movies.draw.layout import Layout, drawn_outside, inscribed_disk, layout

#: component colours: component n is drawn in PALETTE[(n - 1) % 8], so a component keeps its colour
#: for as long as it keeps its name (our own choice: strong on white, dark and light in turn, so
#: that neighbours in the order stay apart in greyscale print too)
PALETTE = ("#1f5aa6", "#e8890c", "#1d7350", "#d9739b", "#4b2c82", "#5ab4e0", "#8a4412", "#9a9a9a")
#: the second channel, past the palette: components 9 to 16 dashed, 17 to 24 dotted, and so on
#: (stroke-dasharray in units of the stroke width; "" is a solid line)
DASHES = ("", "4 2", "1 2", "6 2 1 2")


def component_style(name: int) -> tuple[str, str]:
    """The colour and dash pattern of the component named ``name``.

    >>> component_style(1), component_style(9)
    (('#1f5aa6', ''), ('#1f5aa6', '4 2'))
    """
    index = (name - 1) % len(PALETTE)
    return PALETTE[index], DASHES[(name - 1) // len(PALETTE) % len(DASHES)]

#: what highlighting looks like
HIGHLIGHT_FACE = "#ffe9a8"
HIGHLIGHT_EDGE = "#ffb347"
HIGHLIGHT_CROSSING = "#e0218a"


@dataclass(frozen=True)
class Highlight:
    """The place of a move: edges, faces and crossings to mark (names in the diagram).

    >>> Highlight(edges=(4, 10), faces=(1,)).is_empty()
    False
    """

    edges: tuple[int, ...] = ()
    faces: tuple[int, ...] = ()
    crossings: tuple[int, ...] = ()
    #: a band across one face: (first edge, second edge, face), drawn as the band itself
    band: tuple[int, int, int] | None = None
    #: a twist step: (its gate, as a handle's Gate, and its full twists), drawn as a box across the strands
    twist: tuple | None = None
    #: a band along a path: ((edge, over), ...) the edges its core crosses; ``faces`` are then the
    #: faces it runs through, in order, and ``band`` names its first face
    path: tuple[tuple[int, bool], ...] = ()
    #: a birth: the face the new circle appears in, drawn as a dashed circle there
    birth: int | None = None

    def is_empty(self) -> bool:
        """True when nothing is marked."""
        return not (self.edges or self.faces or self.crossings or self.band or self.twist or self.birth)


@dataclass
class _Canvas:
    xmin: float
    ymax: float
    k: float
    pad: float
    width: float
    height: float

    def __call__(self, p) -> tuple[float, float]:
        # SVG's y axis points down; the layout's points up
        return ((p[0] - self.xmin) * self.k + self.pad, (self.ymax - p[1]) * self.k + self.pad)


def _num(v: float) -> str:
    text = f"{v:.4f}".rstrip("0").rstrip(".")
    return "0" if text in ("-0", "") else text


def _path_data(curve: list[tuple], canvas: _Canvas, closed: bool = False) -> str:
    parts = []
    for index, piece in enumerate(curve):
        if index == 0:
            x, y = canvas(piece[1])
            parts.append(f"M{_num(x)} {_num(y)}")
        if piece[0] == "L":
            x, y = canvas(piece[2])
            parts.append(f"L{_num(x)} {_num(y)}")
        else:
            (cx, cy), (x, y) = canvas(piece[2]), canvas(piece[3])
            parts.append(f"Q{_num(cx)} {_num(cy)} {_num(x)} {_num(y)}")
    if closed:
        parts.append("Z")
    return " ".join(parts)


def _trimmed(curve: list[tuple], gaps: tuple[float, float]) -> list[tuple]:
    """Cut the gaps off the straight first and last pieces of an edge's curve."""
    curve = list(curve)

    def cut(p, q, amount):
        length = math.hypot(q[0] - p[0], q[1] - p[1])
        f = min(amount / length, 0.9) if length else 0.0
        return (p[0] + f * (q[0] - p[0]), p[1] + f * (q[1] - p[1]))

    if gaps[0] > 0 and curve[0][0] == "L":
        _, p, q = curve[0]
        curve[0] = ("L", cut(p, q, gaps[0]), q)
    if gaps[1] > 0 and curve[-1][0] == "L":
        _, p, q = curve[-1]
        curve[-1] = ("L", p, cut(q, p, gaps[1]))
    return curve


def _middle(points: list[tuple[float, float]]) -> tuple[tuple[float, float], tuple[float, float]]:
    """The point halfway along a polyline, and the unit tangent there."""
    return _at_fraction(points, 0.5)


def _cycle_points(diagram: Diagram, cycle: tuple[Side, ...], curves: dict[int, list[tuple]]) -> list[tuple[float, float]]:
    points: list[tuple[float, float]] = []
    for side in cycle:
        line = sample(curves[side.edge])
        points.extend(line if side.hand == "L" else line[::-1])
    return points


def _face_path(diagram: Diagram, face: int, curves, canvas: _Canvas, outer: bool) -> str:
    rings = []
    if outer:
        rings.append(f"M0 0 L{_num(canvas.width)} 0 L{_num(canvas.width)} {_num(canvas.height)} L0 {_num(canvas.height)} Z")
    for cycle in diagram.faces[face]:
        pts = [canvas(p) for p in _cycle_points(diagram, cycle, curves)]
        if pts:
            rings.append("M" + " L".join(f"{_num(x)} {_num(y)}" for x, y in pts) + " Z")
    return " ".join(rings)


def diagram_svg(diagram: Diagram, labels: bool = False, highlight: Highlight | dict | None = None,
                size: int = 420, title: str | None = None, gates=(), lay: Layout | None = None) -> str:
    """Draw a diagram as a self-contained SVG document.

    Parameters
    ----------
    diagram : Diagram
        Any diagram, split and crossingless ones and the empty one included.
    labels : bool
        Write edge names (beside each edge, in its component's colour), crossing names (dark,
        on a white disk) and face names (grey, italic, inside each face).
    highlight : Highlight or dict or None
        Edges, faces and crossings to mark (a dict with keys ``edges``, ``faces``,
        ``crossings`` works too); names the diagram does not have are ignored.
    size : int
        Width of the picture in pixels.
    title : str or None
        A tooltip title for the whole picture.
    gates : sequence of Gate
        Handles to draw (:class:`movies.diagram.handles.Gate`): each gate as a dashed black path
        from inside its first face across the middle of each edge it crosses, named h1, h2, ...
    lay : Layout or None
        A layout made already (for a movie's frames: :func:`~movies.draw.layout.aligned` to the
        frame before); by default the diagram is laid out afresh.

    Returns
    -------
    str
        The ``<svg>`` element, with nothing outside it referred to.

    >>> from movies.diagram.constructors import unlink
    >>> diagram_svg(unlink(0)).count("<path")
    0
    >>> from movies.diagram.handles import fibers
    >>> link = fibers(1, 1)
    >>> diagram_svg(link.diagram, gates=link.gates).count('class="gate"')
    1
    """
    if isinstance(highlight, dict):
        highlight = Highlight(**{k: tuple(v) for k, v in highlight.items()})
    highlight = highlight or Highlight()
    lay = lay if lay is not None else layout(diagram)
    drawn = strands(diagram, lay)
    return render(diagram, lay, drawn, labels, highlight, size, title, gates)


def render(diagram: Diagram, lay: Layout, drawn: Strands, labels: bool, highlight: Highlight,
           size: int, title: str | None, gates=()) -> str:
    """The SVG text for a diagram whose layout and curves are already made (see :func:`diagram_svg`).

    >>> from movies.diagram.constructors import unknot
    >>> from movies.draw.curves import strands
    >>> from movies.draw.layout import layout
    >>> d = unknot()
    >>> lay = layout(d)
    >>> render(d, lay, strands(d, lay), False, Highlight(), 200, None).startswith("<svg")
    True
    """
    xmin, ymin, xmax, ymax = lay.bounds
    pad = 14.0
    k = (size - 2 * pad) / (xmax - xmin)
    width, height = float(size), (ymax - ymin) * k + 2 * pad
    canvas = _Canvas(xmin, ymax, k, pad, width, height)
    stroke = min(size / 170, 0.22 * drawn.scale * k)
    if drawn.smallest_gap:
        # a gap must stay visible: no wider than the stroke allows
        stroke = min(stroke, 1.6 * drawn.smallest_gap * k)
    stroke = max(stroke, 0.8)
    colour_of = {name: component_style(name)[0] for name in diagram.components}
    out = [
        f'<svg xmlns="http://www.w3.org/2000/svg" class="diagram" width="{_num(width)}" height="{_num(height)}" '
        f'viewBox="0 0 {_num(width)} {_num(height)}" data-crossings="{diagram.crossing_count()}" '
        f'data-components="{diagram.component_count()}">',
    ]
    if title:
        out.append(f"<title>{escape(title)}</title>")
    out.append(f'<rect x="0" y="0" width="{_num(width)}" height="{_num(height)}" fill="#ffffff"/>')
    root = drawn_outside(diagram, lay) if diagram.faces else None
    band_parts: tuple[list[str], list[str]] = ([], [])
    if highlight.band is not None:
        first, second, face = highlight.band
        faces = tuple(highlight.faces) if highlight.path else (face,)
        band_parts = _band(diagram, (first, second, faces, tuple(highlight.path)), drawn, canvas, stroke, root)
    for face in highlight.faces:
        if band_parts[0] and highlight.band is not None and (face == highlight.band[2] or highlight.path):
            continue  # the band itself is drawn, not its faces
        if face in diagram.faces:
            d = _face_path(diagram, face, drawn.curves, canvas, outer=face == root)
            out.append(f'<path class="hl-face" data-face="{face}" d="{d}" fill="{HIGHLIGHT_FACE}" '
                       f'fill-rule="evenodd" stroke="none"/>')
    for edge in highlight.edges:
        if edge in drawn.curves:
            d = _path_data(drawn.curves[edge], canvas, closed=edge in diagram.loops)
            out.append(f'<path class="hl-edge" data-edge="{edge}" d="{d}" fill="none" stroke="{HIGHLIGHT_EDGE}" '
                       f'stroke-width="{_num(stroke * 4.5)}" stroke-linecap="round" stroke-linejoin="round" opacity="0.85"/>')
    out.extend(band_parts[0])
    for edge in sorted(drawn.curves):
        component = diagram.component_of(edge)
        colour = colour_of[component]
        closed = edge in diagram.loops
        curve = drawn.curves[edge] if closed else _trimmed(drawn.curves[edge], drawn.gaps[edge])
        ends = ""
        if not closed:
            tail, head = diagram.edge_ends[edge]
            ends = f' data-tail="{tail.crossing}" data-head="{head.crossing}"'
        dash = component_style(component)[1]
        dashes = f' stroke-dasharray="{" ".join(_num(float(x) * stroke) for x in dash.split())}"' if dash else ""
        out.append(f'<path class="strand" data-edge="{edge}" data-component="{component}"{ends} '
                   f'd="{_path_data(curve, canvas, closed)}" fill="none" stroke="{colour}"{dashes} '
                   f'stroke-width="{_num(stroke)}" stroke-linecap="round" stroke-linejoin="round"/>')
    for edge in sorted(drawn.curves):
        pts = [canvas(p) for p in sample(drawn.curves[edge])]
        (mx, my), (tx, ty) = _middle(pts)
        length = sum(math.hypot(q[0] - p[0], q[1] - p[1]) for p, q in zip(pts, pts[1:]))
        # an arrow no longer than a fifth of its edge
        a = min(stroke * 2.6, 0.1 * length)
        nx, ny = -ty, tx
        tip = (mx + a * tx, my + a * ty)
        left = (mx - a * tx + 0.75 * a * nx, my - a * ty + 0.75 * a * ny)
        right = (mx - a * tx - 0.75 * a * nx, my - a * ty - 0.75 * a * ny)
        out.append(f'<path class="arrow" data-edge="{edge}" d="M{_num(tip[0])} {_num(tip[1])} L{_num(left[0])} '
                   f'{_num(left[1])} L{_num(right[0])} {_num(right[1])} Z" fill="{colour_of[diagram.component_of(edge)]}"/>')
    out.extend(band_parts[1])  # where the band passes over a strand
    if highlight.birth is not None and highlight.birth in lay.face_points:
        out.extend(_birth(highlight.birth, lay, drawn, canvas, stroke))
    for crossing in highlight.crossings:
        if crossing in lay.crossings:
            x, y = canvas(lay.crossings[crossing])
            out.append(f'<circle class="hl-crossing" data-crossing="{crossing}" cx="{_num(x)}" cy="{_num(y)}" '
                       f'r="{_num(stroke * 5)}" fill="none" stroke="{HIGHLIGHT_CROSSING}" stroke-width="{_num(stroke)}"/>')
    for index, gate in enumerate(gates, start=1):
        out.extend(_gate(diagram, gate, index, drawn, canvas, stroke, colour_of=colour_of))
    if highlight.twist is not None:
        gate, turns = highlight.twist
        out.extend(_gate(diagram, gate, f"{turns:+d}", drawn, canvas, stroke, kind="twist"))
    if labels:
        out.extend(_labels(diagram, lay, drawn, canvas, colour_of, stroke))
    out.append("</svg>")
    return "\n".join(out)


def _gate(diagram: Diagram, gate, index, drawn: Strands, canvas: _Canvas, stroke: float,
          kind: str = "gate", colour_of: dict | None = None) -> list[str]:
    """A handle's gate: a small circle round the strands that pass through the handle (over
    them on one side, under them on the other, so that they pass through it), with its name
    (``h1``, ...); or, with ``kind="twist"``, a twist step's box: a wide band across the strands
    it twists, labelled with its full twists (``+1``).

    Where it crosses an edge is chosen near where it crossed the edge before (near the first
    edge's neighbour for the first), so that a gate through the corner of a crossing stays in
    that corner, and where the straight piece from there meets no other strand; it starts a little
    inside the face beside its first edge and ends a little inside the face beyond its last, and
    runs straight between.
    """
    if not gate.edges or any(edge not in drawn.curves for edge in gate.edges):
        return []  # a handle no strand passes through has no place in the drawing
    lines = {edge: [canvas(p) for p in sample(drawn.curves[edge])] for edge in gate.edges}

    def inner(edge):  # the middle part of an edge, away from its crossings
        line = lines[edge]
        cut = len(line) // 6
        return line[cut:len(line) - cut] or line

    others = [[canvas(p) for p in sample(curve)] for edge, curve in drawn.curves.items() if edge not in lines]

    def clear(p, q) -> bool:  # the straight piece between two crossing points meets no other strand
        return not any(segments_cross(p, q, a, b) for line in others for a, b in zip(line, line[1:]))

    def nearest(candidates, targets):
        ranked = sorted(candidates, key=lambda p: min(math.hypot(p[0] - q[0], p[1] - q[1]) for q in targets))
        return next((p for p in ranked if all(clear(p, q) for q in targets[:1])), ranked[0])

    reach = stroke * 9
    chosen = []
    for position, edge in enumerate(gate.edges):
        if position == 0:
            if len(gate.edges) > 1:  # the closest pair of points on the first two edges with a clear piece between
                pairs = sorted(((p, q) for p in inner(edge) for q in inner(gate.edges[1])),
                               key=lambda pq: math.hypot(pq[0][0] - pq[1][0], pq[0][1] - pq[1][1]))
                chosen.append(next((p for p, q in pairs if clear(p, q)), pairs[0][0]))
            else:
                chosen.append(_middle(lines[edge])[0])
        elif edge == gate.edges[position - 1]:  # a turn-back: cross the edge again a little further on
            px, py = chosen[-1]
            away = [p for p in inner(edge) if math.hypot(p[0] - px, p[1] - py) >= 3 * reach]
            chosen.append(nearest(away or inner(edge), [chosen[-1]]))
        else:
            chosen.append(nearest(inner(edge), [chosen[-1]]))
    here = diagram.side_face[Side(gate.edges[0], gate.hand)]
    points = []
    for position, (edge, (mx, my)) in enumerate(zip(gate.edges, chosen)):
        line = lines[edge]
        at = min(range(len(line) - 1), key=lambda i: math.hypot(line[i][0] - mx, line[i][1] - my))
        tx, ty = line[at + 1][0] - line[at][0], line[at + 1][1] - line[at][1]
        norm = math.hypot(tx, ty) or 1.0
        tx, ty = tx / norm, ty / norm
        left, right = diagram.faces_beside(edge)
        # on the canvas (y down) the left of the direction (tx, ty) is (ty, -tx)
        nx, ny = (ty, -tx) if here == left else (-ty, tx)
        def stub(sign):  # a short way into the face, shorter where another strand is near
            for length in (reach, reach / 2, reach / 4):
                end = (mx + sign * length * nx, my + sign * length * ny)
                if clear((mx, my), end):
                    return end
            return (mx + sign * reach / 8 * nx, my + sign * reach / 8 * ny)

        if position == 0:
            points.append(stub(+1))
        if position > 0 and edge == gate.edges[position - 1]:  # the turn-back bulges into the face between
            points.append((mx + reach * nx, my + reach * ny))
        points.append((mx, my))
        if position + 1 < len(gate.edges) and gate.edges[position + 1] == edge:
            points.append((mx - reach * nx, my - reach * ny))
        here = right if here == left else left
        if position == len(gate.edges) - 1:
            points.append(stub(-1))
    d = "M" + " L".join(f"{_num(x)} {_num(y)}" for x, y in points)
    x, y = points[0]
    edges = " ".join(map(str, gate.edges))
    if kind == "twist":
        return [f'<path class="twist" data-edges="{edges}" data-turns="{index}" d="{d}" fill="none" '
                f'stroke="{HIGHLIGHT_EDGE}" stroke-opacity="0.55" stroke-width="{_num(stroke * 7)}" '
                f'stroke-linecap="butt" stroke-linejoin="round"/>',
                f'<text class="twist-name" x="{_num(x)}" y="{_num(y)}" font-size="{_num(stroke * 9)}" '
                f'fill="#222222" text-anchor="middle">{index}</text>']
    ring = _ellipse(chosen, points, reach)
    lines_all = {e: [canvas(p) for p in sample(curve)] for e, curve in drawn.curves.items()}
    if ring is None or not _through(ring, lines_all, gate.edges):
        # no small circle fits round the bundle: the gate's path, dashed, as a fallback
        return [f'<path class="gate" data-handle="{index}" data-edges="{edges}" d="{d}" '
                f'fill="none" stroke="#222222" stroke-width="{_num(stroke * 1.2)}" stroke-dasharray="{_num(stroke * 3)} '
                f'{_num(stroke * 2)}" stroke-linecap="round"/>',
                f'<text class="gate-name" x="{_num(x)}" y="{_num(y)}" font-size="{_num(stroke * 9)}" '
                f'fill="#222222" text-anchor="middle">h{index}</text>']
    d = "M" + " L".join(f"{_num(px)} {_num(py)}" for px, py in ring) + " Z"
    out = [f'<path class="gate" data-handle="{index}" data-edges="{edges}" d="{d}" '
           f'fill="none" stroke="#222222" stroke-width="{_num(stroke * 1.2)}"/>']
    # on the far half the strands pass over the circle: each drawn again on top, on a white edge
    far = ring[len(ring) // 2:]
    for edge in dict.fromkeys(gate.edges):
        line = lines[edge]
        for i, (a, b) in enumerate(zip(line, line[1:])):
            if any(segments_cross(a, b, p, q) for p, q in zip(far, far[1:])):
                piece = line[max(0, i - 1):i + 3]
                path = "M" + " L".join(f"{_num(px)} {_num(py)}" for px, py in piece)
                colour = (colour_of or {}).get(diagram.component_of(edge), "#222222")
                out += [f'<path class="gate-under" d="{path}" fill="none" stroke="#ffffff" '
                        f'stroke-width="{_num(stroke * 3.4)}" stroke-linecap="butt"/>',
                        f'<path class="gate-under" d="{path}" fill="none" stroke="{colour}" '
                        f'stroke-width="{_num(stroke)}" stroke-linecap="round"/>']
    lx, ly = ring[0]
    out.append(f'<text class="gate-name" x="{_num(lx)}" y="{_num(ly - stroke * 3)}" font-size="{_num(stroke * 9)}" '
               f'fill="#222222" text-anchor="middle">h{index}</text>')
    return out


def _ellipse(chosen: list[tuple[float, float]], path: list[tuple[float, float]], reach: float):
    """A thin ellipse round the points where a gate crosses its strands, long along the gate
    (from its first crossing point to its last; across the strand for one), 48 points closed,
    starting at the end of its long axis beyond the first point; None for no direction.

    >>> ring = _ellipse([(0.0, 0.0), (10.0, 0.0)], [(-3.0, 0.0), (0.0, 0.0), (10.0, 0.0), (13.0, 0.0)], 4.0)
    >>> len(ring), tuple(round(v, 6) + 0.0 for v in ring[0]), tuple(round(v, 6) + 0.0 for v in ring[12])
    (49, (-3.0, 0.0), (5.0, 2.0))
    """
    first, last = chosen[0], chosen[-1]
    ux, uy = last[0] - first[0], last[1] - first[1]
    if math.hypot(ux, uy) < 1e-9:
        ux, uy = path[-1][0] - path[0][0], path[-1][1] - path[0][1]
    size = math.hypot(ux, uy)
    if size < 1e-9:
        return None
    ux, uy = ux / size, uy / size
    spread = max(((p[0] - first[0]) * ux + (p[1] - first[1]) * uy) for p in chosen)
    centre = (first[0] + ux * spread / 2, first[1] + uy * spread / 2)
    a, b = spread / 2 + 0.75 * reach, reach / 2
    ring = []
    for k in range(49):
        t = math.pi + 2 * math.pi * k / 48
        ring.append((centre[0] + a * math.cos(t) * ux + b * math.sin(t) * uy,
                     centre[1] + a * math.cos(t) * uy - b * math.sin(t) * ux))
    return ring


def _through(ring, lines: dict, edges) -> bool:
    """Whether each edge a gate crosses meets the ring twice for each crossing, and no other edge meets it."""
    wanted = {edge: 2 * list(edges).count(edge) for edge in edges}
    for edge, line in lines.items():
        met = sum(segments_cross(a, b, p, q) for a, b in zip(line, line[1:]) for p, q in zip(ring, ring[1:]))
        if met != wanted.get(edge, 0):
            return False
    return True


def _band(diagram: Diagram, band: tuple, drawn: Strands, canvas: _Canvas, stroke: float,
          root: int | None) -> tuple[list[str], list[str]]:
    """A band drawn as a strip: its two sides and its dashed core, across one face or along a path.

    ``band`` is (first edge, second edge, faces, path), as :func:`movies.draw.bands.band_core`
    takes it; the core is found on the curves as drawn. Returns (what goes under the strands,
    what goes over them: the band where it passes over an edge); nothing at all when some piece
    of the core finds no way.
    """
    first, second, faces, path = band
    chain = [first] + [edge for edge, _ in path] + [second]
    if any(edge not in drawn.curves for edge in chain):
        return [], []
    # found in the layout's own units, as the frame after the band is drawn from it (movies.draw.frames)
    lines = {edge: sample(curve) for edge, curve in drawn.curves.items()}
    found = band_core(diagram, band, lines, root)
    if found is None:
        return [], []
    core, crossed_at = [canvas(p) for p in found[0]], found[1]
    edges = " ".join(map(str, chain))
    under = _strip(core, stroke, f'class="band" data-edges="{edges}" data-face="{faces[0]}" '
                                 f'data-faces="{" ".join(map(str, faces))}"')
    over = []
    for (edge, is_over), i in zip(path, crossed_at):
        if is_over:  # a short piece of the band drawn again on top, across the edge it passes over
            m = core[i]
            reach = stroke * 6
            piece = [_towards(m, core[i - 1], reach), m, _towards(m, core[i + 1], reach)]
            over += _strip(piece, stroke, f'class="band-over" data-edge="{edge}"')
    return under, over


def _birth(face: int, lay: Layout, drawn: Strands, canvas: _Canvas, stroke: float) -> list[str]:
    """The circle a birth adds, dashed, about the face's point and clear of every strand."""
    x, y = canvas(lay.face_points[face])
    points = [canvas(p) for curve in drawn.curves.values() for p in sample(curve)]
    room = min((math.hypot(px - x, py - y) for px, py in points), default=40.0)
    radius = min(0.5 * room, 24.0)
    if radius < 2 * stroke:
        return []
    return [f'<circle class="birth" data-face="{face}" cx="{_num(x)}" cy="{_num(y)}" r="{_num(radius)}" fill="none" '
            f'stroke="{HIGHLIGHT_CROSSING}" stroke-width="{_num(stroke)}" '
            f'stroke-dasharray="{_num(stroke * 2.5)} {_num(stroke * 1.5)}"/>']


def _towards(p, q, distance):
    """The point ``distance`` from p toward q (q itself when closer)."""
    length = math.hypot(q[0] - p[0], q[1] - p[1])
    if length <= distance:
        return q
    return (p[0] + (q[0] - p[0]) * distance / length, p[1] + (q[1] - p[1]) * distance / length)


def _strip(core, stroke: float, attributes: str) -> list[str]:
    """A wide pale stroke edged by a thin darker one, and the core dashed along the middle."""
    d = "M" + " L".join(f"{_num(x)} {_num(y)}" for x, y in core)
    return [f'<path {attributes} d="{d}" fill="none" stroke="{HIGHLIGHT_EDGE}" stroke-width="{_num(stroke * 5.4)}" '
            f'stroke-linejoin="round"/>',
            f'<path class="band-inside" d="{d}" fill="none" stroke="{HIGHLIGHT_FACE}" '
            f'stroke-width="{_num(stroke * 3.8)}" stroke-linejoin="round"/>',
            f'<path class="band-core" d="{d}" fill="none" stroke="{HIGHLIGHT_EDGE}" stroke-width="{_num(stroke * 0.6)}" '
            f'stroke-dasharray="{_num(stroke * 2)} {_num(stroke * 1.5)}"/>']


def _at_fraction(points: list[tuple[float, float]], fraction: float):
    """The point a fraction of the way along a polyline, and the unit tangent there: the
    direction of the piece it lies on, passing over pieces of almost no length (where two
    samples all but meet, their difference points any way).

    >>> point, (tx, ty) = _at_fraction([(0.0, 0.0), (1.0, 0.0), (1.0, 1e-17), (2.0, 0.0)], 0.5)
    >>> point, round(tx, 9), round(ty, 9)
    ((1.0, 0.0), 1.0, 0.0)
    """
    lengths = [math.hypot(points[i + 1][0] - points[i][0], points[i + 1][1] - points[i][1]) for i in range(len(points) - 1)]
    total = sum(lengths)
    tiny = 1e-9 * total
    goal = total * fraction
    for i, length in enumerate(lengths):
        if goal <= length and length > 0:
            f = goal / length
            p, q = points[i], points[i + 1]
            here = (p[0] + f * (q[0] - p[0]), p[1] + f * (q[1] - p[1]))
            j = next((k for k in range(i, len(lengths)) if lengths[k] > tiny),
                     next((k for k in range(i, -1, -1) if lengths[k] > tiny), i))
            p, q = points[j], points[j + 1]
            return here, ((q[0] - p[0]) / lengths[j], (q[1] - p[1]) / lengths[j])
        goal -= length
    return points[-1], (1.0, 0.0)


class _Room:
    """Where labels already are, and the strands: a new label goes where it meets neither."""

    #: side of the grid cells the strands' segments are filed under (canvas units)
    CELL = 24.0

    def __init__(self, lines: list[list[tuple[float, float]]], points: list[tuple[float, float]], clearance: float):
        self.boxes: list[tuple[float, float, float, float]] = []
        self.points = points  # crossing points a label must not cover
        self.clearance = clearance
        self.grid: dict[tuple[int, int], list] = {}  # cell -> the segments that pass near it
        for line in lines:
            for a, b in zip(line, line[1:]):
                for cell in self._cells((min(a[0], b[0]), min(a[1], b[1]), max(a[0], b[0]), max(a[1], b[1]))):
                    self.grid.setdefault(cell, []).append((a, b))

    def _cells(self, box):
        x0, y0, x1, y1 = (int(math.floor(v / self.CELL)) for v in box)
        return [(i, j) for i in range(x0, x1 + 1) for j in range(y0, y1 + 1)]

    def free(self, box, strands: bool = True) -> bool:
        x0, y0, x1, y1 = box
        if any(x0 < b[2] and b[0] < x1 and y0 < b[3] and b[1] < y1 for b in self.boxes):
            return False
        if not strands:
            return True
        pad = self.clearance
        if any(x0 - pad < px < x1 + pad and y0 - pad < py < y1 + pad for px, py in self.points):
            return False
        padded = (x0 - pad, y0 - pad, x1 + pad, y1 + pad)
        return not any(_segment_meets_box(a, b, padded) for cell in self._cells(padded)
                       for a, b in self.grid.get(cell, ()))

    def place(self, candidates, size, near=None, within=None) -> tuple[float, float]:
        """The first candidate centre whose box meets no label and no strand; else, among the
        ``near`` candidates, the first that meets no label; else the nearest place on rings around
        the first candidate that meets no label (and no strand, if one does). With ``within`` (a
        test of a centre): a place it fails gives way to the first that passes it and meets no
        label, if there is one. Taken."""
        w, h = size

        def box(c):
            return (c[0] - w / 2, c[1] - h / 2, c[0] + w / 2, c[1] + h / 2)

        x, y = candidates[0]
        rings = [(x + dx * r * w, y + dy * r * h) for r in (0.5, 1, 1.5, 2, 3, 4, 6, 8)
                 for dx, dy in ((0, 1), (0, -1), (1, 0), (-1, 0), (1, 1), (-1, 1), (1, -1), (-1, -1))]
        chosen = next((c for c in candidates if self.free(box(c))), None)
        if chosen is None:
            chosen = next((c for c in (near or []) if self.free(box(c), strands=False)), None)
        if chosen is None:
            # crowded: step outwards from the first candidate until no other label is in the way
            chosen = next((c for c in rings if self.free(box(c))), None) or \
                next((c for c in rings if self.free(box(c), strands=False)), candidates[0])
        if within is not None and not within(chosen):
            # a face's name in the face, on a strand if it must, rather than in the next face
            chosen = next((c for c in [*candidates, *(near or []), *rings] if within(c) and self.free(box(c))), None) \
                or next((c for c in [*candidates, *(near or []), *rings] if within(c) and self.free(box(c), strands=False)),
                        chosen)
        self.boxes.append((chosen[0] - w / 2, chosen[1] - h / 2, chosen[0] + w / 2, chosen[1] + h / 2))
        return chosen


def _inside(point, polygon) -> bool:
    """Whether a point lies inside a polygon (the even-odd rule).

    >>> _inside((1, 1), [(0, 0), (2, 0), (2, 2), (0, 2)]), _inside((3, 1), [(0, 0), (2, 0), (2, 2), (0, 2)])
    (True, False)
    """
    x, y = point
    inside = False
    for (ax, ay), (bx, by) in zip(polygon, polygon[1:] + polygon[:1]):
        if (ay > y) != (by > y) and x < ax + (y - ay) * (bx - ax) / (by - ay):
            inside = not inside
    return inside


def _segment_meets_box(a, b, box) -> bool:
    """Whether the segment ab meets the axis-parallel box (x0, y0, x1, y1)."""
    x0, y0, x1, y1 = box
    if max(a[0], b[0]) < x0 or min(a[0], b[0]) > x1 or max(a[1], b[1]) < y0 or min(a[1], b[1]) > y1:
        return False
    if x0 <= a[0] <= x1 and y0 <= a[1] <= y1:
        return True
    corners = [(x0, y0), (x1, y0), (x1, y1), (x0, y1)]
    return any(segments_cross(a, b, c, d) for c, d in zip(corners, corners[1:] + corners[:1]))


def label_size(text: str, font: float) -> tuple[float, float]:
    """The box a label takes: width and height (sans-serif digits are about 0.6 em wide).

    >>> label_size("12", 11)
    (15.2, 11)
    """
    return round(0.6 * font * len(text) + 2, 4), font


def _labels(diagram, lay, drawn, canvas, colour_of, stroke) -> list[str]:
    """Face, crossing and edge names (in this order: the least room first), each where it meets no
    other label, no strand and no crossing (the first such place about its face's point, in the
    corners of its crossing, or beside its edge; the first candidate when none is free)."""
    out = []
    font = 11
    lines = {edge: [canvas(p) for p in sample(drawn.curves[edge])] for edge in drawn.curves}
    crossing_points = {c: canvas(p) for c, p in lay.crossings.items()}
    room = _Room(list(lines.values()), list(crossing_points.values()), stroke)
    root = drawn_outside(diagram, lay)
    for face, point in sorted(lay.face_points.items()):
        cycles = diagram.faces[face]
        within = None
        if face != root and len(cycles) == 1:
            # the rounded curves cut corners: look for room inside the face as drawn
            polygon = _cycle_points(diagram, cycles[0], drawn.curves)
            point, _ = inscribed_disk(polygon[::3] if len(polygon) > 60 else polygon, point, rounds=2)
            # a small face's name stays inside it, on a strand if it must, never in the next face
            outline = [canvas(p) for p in polygon]
            within = lambda c, outline=outline: _inside(c, outline)  # noqa: E731
        x, y = canvas(point)
        step = font * 0.9
        candidates = [(x, y)] + [(x + dx * step, y + dy * step) for dx, dy in
                                 ((0, 1), (0, -1), (1, 0), (-1, 0), (1, 1), (-1, 1), (1, -1), (-1, -1))]
        # where the face is too small for a label clear of its strands: clear of the other labels at least
        near = [(x + dx * step * f, y + dy * step * f) for f in (0.35, 0.7) for dx, dy in
                ((0, 1), (0, -1), (1, 0), (-1, 0))]
        x, y = room.place(candidates, label_size(str(face), font + 1), near=[(x, y)] + near, within=within)
        out.append(f'<text class="label-face" data-face="{face}" x="{_num(x)}" y="{_num(y + (font + 1) * 0.35)}" '
                   f'font-family="serif" font-style="italic" font-size="{font + 1}" text-anchor="middle" '
                   f'fill="#777777">{face}</text>')
    radius = font * 0.72
    for crossing, point in sorted(lay.crossings.items()):
        # in a corner of the crossing, the one between the under-strand's arrival and the next dart first
        x, y = crossing_points[crossing]
        corners = []
        for k in range(4):
            d0, d1 = drawn.directions[(crossing, k)], drawn.directions[(crossing, (k + 1) % 4)]
            bx, by = d0[0] + d1[0], d0[1] + d1[1]
            norm = math.hypot(bx, by) or 1.0
            corners.append((bx / norm, by / norm))
        candidates = [(x + off * bx, y - off * by) for off in (stroke * 2 + font * 0.9, stroke * 2 + font * 1.3)
                      for bx, by in corners]
        candidates += [(x + off * bx, y - off * by) for off in (stroke * 2 + font * 1.8,) for bx, by in corners]
        cx, cy = room.place(candidates, (2 * radius, 2 * radius), near=candidates)
        out.append(f'<g class="label-crossing" data-crossing="{crossing}"><circle cx="{_num(cx)}" cy="{_num(cy)}" '
                   f'r="{_num(radius)}" fill="#ffffff" stroke="#333333" stroke-width="0.8"/>'
                   f'<text x="{_num(cx)}" y="{_num(cy + font * 0.33)}" font-family="sans-serif" font-size="{font - 2}" '
                   f'text-anchor="middle" fill="#222222" font-weight="bold">{crossing}</text></g>')
    for edge in sorted(drawn.curves):
        pts = lines[edge]
        size = label_size(str(edge), font)
        candidates = []
        for fraction in (0.5, 0.38, 0.62, 0.28, 0.72):
            (mx, my), (tx, ty) = _at_fraction(pts, fraction)
            for side in (1, -1):  # on the strand's left in the picture first
                for off in (stroke * 2 + font * 0.75, stroke * 2 + font * 1.2):
                    candidates.append((mx + side * ty * off, my - side * tx * off))
        x, y = room.place(candidates, size, near=candidates)
        out.append(f'<text class="label-edge" data-edge="{edge}" x="{_num(x)}" y="{_num(y + font * 0.35)}" '
                   f'font-family="sans-serif" font-size="{font}" text-anchor="middle" '
                   f'fill="{colour_of[diagram.component_of(edge)]}">{edge}</text>')
    return out


def svg_repr(diagram: Diagram) -> str:
    """The picture a notebook shows for a diagram (labelled), for ``Diagram._repr_svg_``.

    >>> from movies.diagram.constructors import unknot
    >>> svg_repr(unknot()).count('class="label-face"')
    2
    """
    return diagram_svg(diagram, labels=True, size=360)
