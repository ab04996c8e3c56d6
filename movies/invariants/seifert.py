"""The Seifert matrix of the canonical surface that Seifert's algorithm builds on a diagram.

The surface.  Smoothing every crossing along the orientation gives the Seifert circles.  On the
sphere they cut the complement into *regions*; every crossing lies in one region and joins two
circles on its boundary.  Each circle bounds a disk, disks of nested circles are stacked (the
deeper one higher), and every crossing becomes a half-twisted band between two disks.  The
surface is oriented so that its boundary is the link; its positive normal is the one that,
with the orientation of the surface, gives the orientation of space (a disk whose circle runs
counterclockwise, seen from above, has the upward normal).

The Seifert form.  ``V[i][j] = lk(γ_i, γ_j⁺)``, where ``γ_j⁺`` is ``γ_j`` pushed off the surface
along the positive normal.  With this convention the positive Hopf link has ``V = (-1)`` and
the positive trefoil has signature ``-2`` (positive knots have negative signature).

The basis.  For a region ``R`` let ``Σ_R`` be the disks of its boundary circles with the bands of
the crossings in ``R``.  Every face of the diagram lies in one region; walking once around one
boundary cycle of a face (face on the left) and pushing the walk onto the surface gives a loop
on ``Σ_R``, the *face loop*.  The face loops of one connected piece ``K`` of ``Σ_R`` add up to zero,
and dropping one of them per piece leaves a basis of ``H_1(Σ_R)``.  The surface is the union of
the ``Σ_R`` glued along disks in a tree-like way (a Murasugi sum), so these bases together form a
basis of ``H_1`` of the whole surface.

The entries, all computed from the planar structure (no coordinates).  ``x · y`` is the
intersection number on the surface, ``+1`` where the tangents of ``x`` and ``y`` in this order are
positively oriented, and ``lk(x, y⁺) - lk(x, y⁻) = -(x · y)``.

* two loops of one region: ``Σ_R`` is isotopic to a flat (checkerboard) surface, and the entry
  is a sum over the crossings of the region.  At a crossing of sign ``s``
  one face loop passes the band on the side of the two incoming edges ("in") and one on the
  side of the outgoing edges ("out"); the crossing adds ``-s/2`` to ``V[in][in]`` and to
  ``V[out][out]``, ``(s - 1)/2`` to ``V[in][out]`` and ``(s + 1)/2`` to ``V[out][in]``.  The
  symmetric part is the Goeritz form of that surface (Gordon–Litherland); the antisymmetric
  part is ``-(in · out) = -1``: the half twist makes the in- and out-loop cross once.
* a loop ``λ`` of the region on the left of a circle ``C`` and a loop ``μ`` of the region on
  its right: ``Σ`` of the left region lies on the side of the disk of ``C`` that the normal
  points to, ``Σ`` of the right region on the other side, so ``lk(λ, μ⁻) = 0`` and
  ``V[λ][μ] = -(λ · μ)``, counted where their chords cross in the disk of ``C``; ``V[μ][λ] = 0``.
* loops of regions that share no circle: 0 (a sphere separates them).

>>> from movies.diagram.pd import from_pd
>>> seifert_matrix(from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]))
[[-1, 0], [1, -1]]
"""

from __future__ import annotations

from dataclasses import dataclass

from movies.diagram.model import Diagram, Side, head_positions
from movies.errors import DiagramError, InternalError
from movies.unionfind import UnionFind

__all__ = [
    "FaceLoop",
    "SeifertSurface",
    "seifert_surface",
    "seifert_matrix",
    "seifert_genus_of_surface",
]

IN, OUT = "in", "out"


@dataclass(frozen=True)
class FaceLoop:
    """One face loop: boundary cycle ``cycle`` (an index into ``diagram.faces[face]``)."""

    face: int
    cycle: int
    region: int


@dataclass(frozen=True)
class SeifertSurface:
    """The canonical surface of a diagram, with the Seifert matrix in its face-loop basis.

    ``circles``   the Seifert circles (edge cycles along the orientation);
    ``regions``   region number -> the faces in it;
    ``basis``     the face loops of the basis, in the order of the rows of ``matrix``;
    ``matrix``    ``matrix[i][j] = lk(basis[i], basis[j] pushed along the positive normal)``;
    ``pieces``    number of connected components of the surface (one per split piece).
    """

    circles: tuple[tuple[int, ...], ...]
    regions: dict[int, tuple[int, ...]]
    basis: tuple[FaceLoop, ...]
    matrix: tuple[tuple[int, ...], ...]
    pieces: int


def _corner_after(diagram: Diagram, side: Side) -> tuple[int, str | None] | None:
    """The crossing and kind (in / out / None for a turn of a circle) after walking ``side``.

    Walking with the face on the left one arrives at a crossing through position ``p`` and
    leaves through ``p - 1``; the corner between them is a gap of the smoothing exactly when
    both edges arrive there ("in") or both leave ("out").
    """
    if side.edge in diagram.loops:
        return None
    tail, head = diagram.edge_ends[side.edge]
    arrive = head if side.hand == "L" else tail
    incoming = head_positions(diagram.signs[arrive.crossing])
    first, second = arrive.position in incoming, (arrive.position - 1) % 4 in incoming
    if first and second:
        return arrive.crossing, IN
    if not first and not second:
        return arrive.crossing, OUT
    return arrive.crossing, None


def seifert_surface(diagram: Diagram) -> SeifertSurface:
    """Build the canonical surface of ``diagram`` and its Seifert matrix (see the module doc).

    Parameters: ``diagram``, any diagram (split pieces and crossingless circles allowed).
    Returns a :class:`SeifertSurface`; its ``matrix`` is square of size
    ``crossings - circles + pieces`` (the rank of ``H_1`` of the surface).

    >>> from movies.diagram.pd import from_pd
    >>> surface = seifert_surface(from_pd([[4, 2, 5, 1], [8, 6, 1, 5], [6, 3, 7, 4], [2, 7, 3, 8]]))
    >>> len(surface.circles), len(surface.regions), surface.matrix
    (3, 4, ((-1, 1), (0, 1)))
    """
    circles = tuple(diagram.seifert_circles())
    circle_of = {edge: index for index, circle in enumerate(circles) for edge in circle}

    # corners of every face cycle, and which cycle holds each gap of each crossing
    cycles: list[tuple[int, int, tuple[Side, ...]]] = []
    gap_owner: dict[tuple[int, str], int] = {}
    corners_of: list[list[tuple[int, str | None] | None]] = []
    for face in sorted(diagram.faces):
        for index, cycle in enumerate(diagram.faces[face]):
            number = len(cycles)
            cycles.append((face, index, cycle))
            corners = [_corner_after(diagram, side) for side in cycle]
            corners_of.append(corners)
            for corner in corners:
                if corner is not None and corner[1] is not None:
                    if corner in gap_owner:
                        raise DiagramError(f"crossing {corner[0]} has two {corner[1]}-corners")
                    gap_owner[corner] = number
    for name in diagram.crossings:
        if (name, IN) not in gap_owner or (name, OUT) not in gap_owner:
            raise DiagramError(f"the faces do not show both gaps of crossing {name}")

    # regions: faces joined across the gap of each crossing
    faces_union = UnionFind()
    for face in diagram.faces:
        faces_union.find(face)
    for name in diagram.crossings:
        faces_union.union(cycles[gap_owner[(name, IN)]][0], cycles[gap_owner[(name, OUT)]][0])
    region_of_face = {face: faces_union.find(face) for face in diagram.faces}
    regions: dict[int, list[int]] = {}
    for face, region in region_of_face.items():
        regions.setdefault(region, []).append(face)

    # the two circles of each crossing, and the pieces of each region's surface
    pieces_union = UnionFind()
    crossing_region = {}
    for name, (a, b, c, d) in diagram.crossings.items():
        over_in, _ = diagram.over_edges(name)
        region = region_of_face[cycles[gap_owner[(name, IN)]][0]]
        crossing_region[name] = region
        pieces_union.union((region, circle_of[a]), (region, circle_of[over_in]))

    loop_region = [region_of_face[face] for face, _, _ in cycles]
    loop_piece = [pieces_union.find((loop_region[i], circle_of[cycle[0].edge]))
                  for i, (_, _, cycle) in enumerate(cycles)]

    size = len(cycles)
    twice = [[0] * size for _ in range(size)]  # 2V over all face loops

    # the bands: one in-loop and one out-loop at each crossing
    for name, sign in diagram.signs.items():
        into, out = gap_owner[(name, IN)], gap_owner[(name, OUT)]
        twice[into][into] -= sign
        twice[out][out] -= sign
        twice[into][out] += sign - 1
        twice[out][into] += sign + 1

    # the disks: chords of loops from the two sides of each circle
    position = {}
    for index, circle in enumerate(circles):
        if circle[0] in diagram.loops:
            continue
        for place, edge in enumerate(circle):
            position[(index, diagram.edge_ends[edge][1].crossing)] = place
    chords: dict[int, tuple[list, list]] = {}
    for number, (_, _, cycle) in enumerate(cycles):
        corners = corners_of[number]
        gaps = [i for i, corner in enumerate(corners) if corner is not None and corner[1] is not None]
        if not gaps:
            continue
        count = len(cycle)
        for g, start_gap in enumerate(gaps):
            end_gap = gaps[(g + 1) % len(gaps)]
            first = (start_gap + 1) % count  # the run of sides between two gaps lies on one circle
            circle = circle_of[cycle[first].edge]
            start = corners[start_gap][0]
            end = corners[end_gap][0]
            left = cycle[first].hand == "L"
            chords.setdefault(circle, ([], []))[0 if left else 1].append(
                (number, position[(circle, start)], position[(circle, end)]))
    for circle, (on_left, on_right) in chords.items():
        length = len(circles[circle])
        for lam, p, q in on_left:
            if p == q:
                continue
            span = (q - p) % length
            for mu, r, s in on_right:
                crossing_number = (0 < (r - p) % length < span) - (0 < (s - p) % length < span)
                twice[lam][mu] -= 2 * crossing_number

    # basis: drop one face loop per piece of each region's surface
    dropped = {}
    for number in range(size):
        dropped[loop_piece[number]] = number  # the last loop of each piece
    keep = [number for number in range(size) if dropped[loop_piece[number]] != number]
    matrix = []
    for i in keep:
        row = []
        for j in keep:
            if twice[i][j] % 2:
                raise InternalError("half-integral Seifert form entry")  # pragma: no cover
            row.append(twice[i][j] // 2)
        matrix.append(tuple(row))
    basis = tuple(FaceLoop(cycles[i][0], cycles[i][1], loop_region[i]) for i in keep)
    region_names = {region: n for n, region in enumerate(sorted(regions), start=1)}
    basis = tuple(FaceLoop(loop.face, loop.cycle, region_names[loop.region]) for loop in basis)
    return SeifertSurface(
        circles=circles,
        regions={region_names[r]: tuple(sorted(faces)) for r, faces in regions.items()},
        basis=basis,
        matrix=tuple(matrix),
        pieces=diagram.piece_count(),
    )


def seifert_matrix(diagram: Diagram) -> list[list[int]]:
    """The Seifert matrix of the canonical surface, ``V[i][j] = lk(γ_i, γ_j⁺)``.

    Parameters: ``diagram``.  Returns a square integer matrix (list of rows) of size
    ``crossings - circles + pieces``; ``γ⁺`` is the push-off along the positive normal (see the
    module docstring).  A split diagram gives the matrix of its disconnected canonical surface
    (block diagonal); a crossingless diagram gives ``[]``.

    >>> from movies.diagram.pd import from_pd
    >>> seifert_matrix(from_pd([[4, 2, 3, 1], [2, 4, 1, 3]]))  # positive Hopf link
    [[-1]]
    """
    return [list(row) for row in seifert_surface(diagram).matrix]


def seifert_genus_of_surface(diagram: Diagram) -> int:
    """The genus of the canonical surface (summed over its connected components).

    Parameters: ``diagram``.  Returns ``(crossings - circles + 2·pieces - components) / 2``,
    from the Euler characteristic ``circles - crossings``, one surface component per split piece.

    >>> from movies.diagram.pd import from_pd
    >>> seifert_genus_of_surface(from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]))
    1
    """
    twice = (diagram.crossing_count() - diagram.seifert_circle_count()
             + 2 * diagram.piece_count() - diagram.component_count())
    return twice // 2
