"""Diagrams built from a recipe: braids, torus links, unlinks, sums, mirrors and reversals.

Every constructor returns a checked :class:`~movies.diagram.model.Diagram`. Faces and
components are named as :func:`~movies.diagram.model.assemble` names them (1, 2, ... in the
order of their smallest side / edge) unless a constructor says otherwise.

Pictures, where a constructor needs one:

- A crossingless circle drawn counterclockwise in the plane has the disk it bounds on its left.
  :func:`unknot` is that circle, edge 1: face 1 is its left side (the disk), face 2 its right
  side (the outside). On the sphere both are disks; the names are what tells them apart.
- The empty diagram (:func:`unlink` of 0) has no edges and no components; the whole sphere is
  one face, face 1, with no boundary cycle.
- A braid is drawn with its strands running up, strand positions 1, 2, ... from left to right,
  and is closed by arcs that pass to the right of the braid, each strand returning to the
  bottom of its own position. The closing arcs are concentric: position 1 is outermost.

>>> trefoil = from_braid([1, 1, 1])
>>> trefoil.writhe(), trefoil.seifert_circle_count(), trefoil.pd_code()
(3, 2, [(4, 2, 5, 1), (2, 6, 3, 5), (6, 4, 1, 3)])
>>> connected_sum(trefoil, mirror(trefoil)).writhe()
0
"""

from __future__ import annotations

from typing import Iterable, Sequence

from movies import limits
from movies.diagram.assembly import assemble, canonical_cycle, reencode, trace_cycles
from movies.diagram.model import Diagram, Side
from movies.diagram.moves import saddle
from movies.diagram.pd import from_pd
from movies.diagram.tables import lookup
from movies.errors import BraidError, DiagramError, GeneratorError, InternalError, LimitError

__all__ = [
    "GeneratorError",
    "unknot",
    "unlink",
    "empty",
    "from_braid",
    "torus_link",
    "disjoint_union",
    "connected_sum",
    "mirror",
    "reverse",
    "from_table",
]


# ---------------------------------------------------------------------- circles


def unknot() -> Diagram:
    """One crossingless circle: edge 1, component 1; face 1 on its left, face 2 on its right.

    Returns a new diagram. Drawn counterclockwise in the plane, face 1 is the disk inside.

    >>> d = unknot()
    >>> sorted(d.loops), d.components, d.faces
    ([1], {1: (1,)}, {1: ((1L,),), 2: ((1R,),)})
    """
    return unlink(1)


def unlink(n: int) -> Diagram:
    """``n`` crossingless circles side by side, edges 1..n, components 1..n.

    Parameters: ``n >= 0``. Returns a new diagram in which the right sides of all circles share
    one face (the outside, drawn counterclockwise in the plane) and each left side is a face of
    its own. Faces are numbered by smallest side, so for ``n >= 1`` face 1 is the inside of
    circle 1, face 2 the common outside, then the insides of circles 2, 3, ...
    ``unlink(0)`` is the empty diagram: no components, one face (1) with no boundary.

    >>> unlink(2).faces
    {1: ((1L,),), 2: ((1R,), (2R,)), 3: ((2L,),)}
    >>> unlink(0).faces, unlink(0).is_empty()
    ({1: ()}, True)
    """
    if isinstance(n, bool) or not isinstance(n, int) or n < 0:
        raise DiagramError(f"an unlink has a whole number of circles, 0 or more, not {n!r}")
    limits.check("components", n, f"unlink({n}) would have {n} components")
    return assemble({}, {}, range(1, n + 1))


def empty() -> Diagram:
    """The empty diagram: no crossings, no components, one face (1) that is the whole sphere.

    >>> empty() == unlink(0)
    True
    """
    return unlink(0)


# ---------------------------------------------------------------------- braids


def _check_word(word: Iterable[int], strands: int | None) -> tuple[list[int], int]:
    try:
        word = list(word)
    except TypeError:
        raise BraidError(f"a braid word is a list of nonzero integers, not {word!r}") from None
    for position, generator in enumerate(word, start=1):
        if isinstance(generator, bool) or not isinstance(generator, int):
            raise GeneratorError(
                f"generator {generator!r} at position {position} of the braid word is not an integer",
                position,
            )
        if generator == 0:
            raise GeneratorError(
                f"generator 0 at position {position} of the braid word: generators are nonzero "
                "(i is sigma_i, -i its inverse)",
                position,
            )
    if strands is None:
        widest = max(range(len(word)), key=lambda i: abs(word[i]), default=None)
        strands = 1 if widest is None else abs(word[widest]) + 1
        if strands > limits.current()["strands"]:
            raise LimitError(limits.exceeds("strands", f"generator {word[widest]} at position {widest + 1} of the "
                                            f"braid word needs {strands} strands"), "strands", widest + 1)
    elif isinstance(strands, bool) or not isinstance(strands, int) or strands < 1:
        raise BraidError(f"a braid has a whole number of strands, 1 or more, not {strands!r}")
    limits.check("strands", strands, f"the braid would have {strands} strands")
    limits.check("crossings", len(word), f"the braid word has {len(word)} crossings")
    for position, generator in enumerate(word, start=1):
        if abs(generator) >= strands:
            allowed = "there are no generators" if strands == 1 else f"generators run from ±1 to ±{strands - 1}"
            raise GeneratorError(
                f"generator {generator} at position {position} of the braid word is out of range: "
                f"on {strands} strand{'s' if strands > 1 else ''} {allowed}",
                position,
            )
    return word, strands


def from_braid(word: Sequence[int], strands: int | None = None) -> Diagram:
    """The closure of a braid, oriented along the braid.

    Parameters: ``word``, nonzero integers (``i`` is σ_i crossing strands i and i+1, a positive
    crossing; ``-i`` its inverse); ``strands``, the number of strands (default: the largest
    ``|i|`` plus one). Returns a new diagram. Edge labels run consecutively along each
    component, components taken in the order of their lowest strand position, each starting at
    the bottom of that position. A strand no generator touches is a crossingless circle, nested
    where the closure puts it: between the closing arcs of its neighbours. Raises
    :class:`GeneratorError` for a zero, non-integer or out-of-range generator, naming its
    position in the word (from 1).

    >>> d = from_braid([1, -2], strands=4)
    >>> d.crossing_count(), d.writhe(), d.component_count(), sorted(d.loops)
    (2, 0, 2, [5])
    >>> from_braid([1, 3, 0])
    Traceback (most recent call last):
    ...
    movies.errors.GeneratorError: generator 0 at position 3 of the braid word: generators are nonzero (i is sigma_i, -i its inverse)
    """
    return braid_closure(word, strands)[0]


def braid_closure(word: Sequence[int], strands: int | None = None) -> tuple[Diagram, list[int]]:
    """:func:`from_braid`, and the edge that closes each position (position 1 first).

    The edge at position i runs from the top of the braid round the closure to its bottom;
    position 1's is the outermost. A gate across them all, in order, is the braid axis.

    >>> d, closing = braid_closure([1, 1, 1])
    >>> closing, d.crossing_count()
    ([1, 4], 3)
    """
    word, strands = _check_word(word, strands)
    # Segments of strand between crossings, at positions 0..strands-1 (left to right).
    bottom = list(range(strands))
    current = list(bottom)
    fresh = strands
    raw: list[tuple[tuple[int, int, int, int], int]] = []
    after: dict[int, int] = {}  # incoming segment -> outgoing segment at its crossing
    for generator in word:
        i = abs(generator) - 1
        left_in, right_in = current[i], current[i + 1]
        left_out, right_out = fresh, fresh + 1
        fresh += 2
        # counterclockwise from the incoming under-strand; arms BL, BR, TR, TL
        if generator > 0:  # over-strand BL -> TR
            raw.append(((right_in, right_out, left_out, left_in), +1))
        else:  # over-strand BR -> TL
            raw.append(((left_in, right_in, right_out, left_out), -1))
        after[left_in], after[right_in] = right_out, left_out
        current[i], current[i + 1] = left_out, right_out
    # the closure joins the top of each position to its bottom: one edge, named by the bottom
    rep = {segment: segment for segment in range(fresh)}
    for position in range(strands):
        rep[current[position]] = bottom[position]
    label: dict[int, int] = {}
    for position in range(strands):
        edge = bottom[position]
        while edge not in label:
            label[edge] = len(label) + 1
            if edge not in after:  # an untouched strand
                break
            edge = rep[after[edge]]
    crossings = {
        index: tuple(label[rep[s]] for s in labels) for index, (labels, _) in enumerate(raw, start=1)
    }
    signs = {index: sign for index, (_, sign) in enumerate(raw, start=1)}
    touched = {abs(g) - 1 for g in word} | {abs(g) for g in word}
    loops = [label[bottom[p]] for p in range(strands) if p not in touched]
    shape = assemble(crossings, signs, loops)
    closing = [label[b] for b in bottom]
    return Diagram(shape.crossings, shape.signs, shape.loops, shape.components,
                   _closure_faces(shape, word, strands, closing)), closing


def _closure_faces(shape: Diagram, word: list[int], strands: int, bottom_edges: list[int]):
    """Regions of a braid closure: split pieces are concentric, position 1 outermost."""
    used = {abs(g) for g in word}  # generator p joins positions p-1 and p (0-based)
    runs, start = [], 0
    for position in range(1, strands + 1):
        if position == strands or position not in used:
            runs.append((start, position - 1))
            start = position
    cycles = trace_cycles(shape.crossings, shape.signs, shape.loops)
    cycle_of = {side: cycle for cycle in cycles for side in cycle}
    # strands run up, left of the braid is away from the closure's centre: left side = outer
    outer = [cycle_of[Side(bottom_edges[lo], "L")] for lo, _ in runs]
    inner = [cycle_of[Side(bottom_edges[hi], "R")] for _, hi in runs]
    regions = [(outer[0],)] + [tuple(sorted(pair)) for pair in zip(inner, outer[1:])] + [(inner[-1],)]
    grouped = {cycle for region in regions for cycle in region}
    regions += [(cycle,) for cycle in cycles if cycle not in grouped]
    regions.sort(key=lambda region: min(min(cycle) for cycle in region))
    return {index: region for index, region in enumerate(regions, start=1)}


def torus_link(p: int, q: int) -> Diagram:
    """The torus link T(p, q): the closure of (σ_1 ⋯ σ_{p-1})^q on p strands.

    Parameters: integers ``p`` and ``q``. Negative ``q`` gives the mirror image (inverse
    generators). ``T(p, q)`` with ``p < 0`` is read as ``T(-p, -q)``, the same curve on the
    torus run the other way (isotopic to itself). ``T(1, q)`` is the unknot. ``T(p, 0)`` and
    ``T(0, p)`` are the ``|p|``-component unlink: ``T(p, 0)`` as the closure of the trivial
    braid (concentric circles), ``T(0, q)`` as :func:`unlink` draws it (side by side);
    ``T(0, 0)`` is empty. Returns a new diagram.

    >>> t = torus_link(3, 4)
    >>> t.crossing_count(), t.writhe(), t.component_count()
    (8, 8, 1)
    >>> torus_link(2, -4).linking_matrix(), torus_link(0, 3).loop_count()
    ([[0, -2], [-2, 0]], 3)
    """
    for value in (p, q):
        if isinstance(value, bool) or not isinstance(value, int):
            raise DiagramError(f"a torus link T(p, q) needs integers p and q, not {value!r}")
    if p < 0:
        p, q = -p, -q
    if p == 0:
        limits.check("components", abs(q), f"torus({p}, {q}) would have {abs(q)} components")
        return unlink(abs(q))
    limits.check("strands", p, f"torus({p}, {q}) would have {p} strands")
    limits.check("crossings", (p - 1) * abs(q), f"torus({p}, {q}) would have {(p - 1) * abs(q)} crossings")
    step = list(range(1, p)) if q > 0 else [-g for g in range(1, p)]
    return from_braid(step * abs(q), strands=p)


# ---------------------------------------------------------------------- sums


def _shifted(diagram: Diagram, edge: int, crossing: int, face: int, component: int) -> Diagram:
    """The same diagram with every name of each kind raised by that kind's offset."""
    def side(s: Side) -> Side:
        return Side(s.edge + edge, s.hand)

    return Diagram(
        {name + crossing: tuple(label + edge for label in labels) for name, labels in diagram.crossings.items()},
        {name + crossing: sign for name, sign in diagram.signs.items()},
        frozenset(loop + edge for loop in diagram.loops),
        {name + component: tuple(e + edge for e in edges) for name, edges in diagram.components.items()},
        {name + face: tuple(tuple(side(s) for s in cycle) for cycle in cycles) for name, cycles in diagram.faces.items()},
    )


def _check_sizes(first: Diagram, second: Diagram, what: str, joined: int) -> None:
    """Refuse a union or sum past the limits before it is built (``joined`` components merge)."""
    crossings = first.crossing_count() + second.crossing_count()
    limits.check("crossings", crossings, f"the {what} would have {crossings} crossings")
    components = first.component_count() + second.component_count() - joined
    limits.check("components", components, f"the {what} would have {components} components")


def _right_of_smallest_edge(diagram: Diagram) -> int:
    return int(diagram.faces_beside(diagram.edges()[0])[1])


def disjoint_union(first: Diagram, second: Diagram, face: int | None = None,
                   other_face: int | None = None) -> Diagram:
    """``second`` drawn inside face ``face`` of ``first``, its face ``other_face`` opening onto it.

    Parameters: two diagrams; ``face``, a face of ``first`` (default: the face right of its
    smallest edge); ``other_face``, a face of ``second`` (default: likewise). Returns a new
    diagram. ``first`` keeps every name. Each kind of name of ``second`` (edges, crossings,
    faces, components) is raised by the largest name of that kind in ``first`` (0 if it has
    none); ``other_face`` merges into ``face`` and keeps the name ``face``. With the defaults
    the pieces sit side by side as :func:`~movies.diagram.model.assemble` places them, so
    ``disjoint_union(unlink(2), unknot()) == unlink(3)``. The empty diagram is the unit: the
    union with it is the other diagram, unchanged.

    >>> d = disjoint_union(unknot(), from_braid([1, 1, 1]))
    >>> d.component_count(), d.piece_count(), d.faces[2]
    (2, 2, ((1R,), (2R, 5L)))
    """
    if face is not None:
        first.face(face)
    if other_face is not None:
        second.face(other_face)
    _check_sizes(first, second, "disjoint union", 0)
    if second.is_empty():
        return first
    if first.is_empty():
        return second
    face = _right_of_smallest_edge(first) if face is None else face
    other_face = _right_of_smallest_edge(second) if other_face is None else other_face
    offsets = {
        "edge": max(first.edges(), default=0),
        "crossing": max(first.crossings, default=0),
        "face": max(first.faces, default=0),
        "component": max(first.components, default=0),
    }
    moved = _shifted(second, offsets["edge"], offsets["crossing"], offsets["face"], offsets["component"])
    opened = other_face + offsets["face"]
    faces = dict(first.faces)
    faces[face] = tuple(sorted(first.faces[face] + moved.faces[opened]))
    faces.update((name, cycles) for name, cycles in moved.faces.items() if name != opened)
    return Diagram(
        {**first.crossings, **moved.crossings},
        {**first.signs, **moved.signs},
        first.loops | moved.loops,
        {**first.components, **moved.components},
        dict(sorted(faces.items())),
    )


def connected_sum(first: Diagram, second: Diagram, first_edge: int | None = None,
                  second_edge: int | None = None) -> Diagram:
    """The connected sum at edge ``first_edge`` of ``first`` and ``second_edge`` of ``second``.

    Parameters: two non-empty diagrams and an edge of each (default: the smallest). ``second``
    is placed (by :func:`disjoint_union`) in the face right of ``first_edge``, with the face
    right of ``second_edge`` opening onto it; then a band across that face joins the two edges.
    Both edges have the face on their right, so the band respects the orientation. Returns a
    new diagram that keeps every name of ``first``; ``second``'s names are raised as in
    :func:`disjoint_union`, its component through ``second_edge`` joins ``first``'s (which keeps
    its name), and the faces on the left of the two edges become one (``first``'s name). When
    neither edge is a crossingless circle the band is :func:`~movies.diagram.moves.saddle`
    and both edges keep their names; when one is, the band makes the circle part of the other
    edge, and that edge is named ``first_edge``.

    >>> trefoil = from_braid([1, 1, 1])
    >>> d = connected_sum(trefoil, trefoil, 2, 5)
    >>> d.crossing_count(), d.writhe(), d.component_count(), d.seifert_circle_count()
    (6, 6, 1, 3)
    >>> e = connected_sum(unknot(), trefoil)
    >>> e.pd_code(), e.components
    ([(5, 3, 6, 1), (3, 7, 4, 6), (7, 5, 1, 4)], {1: (1, 3, 4, 5, 6, 7)})
    """
    for diagram, edge, which in ((first, first_edge, "first"), (second, second_edge, "second")):
        if diagram.is_empty():
            raise DiagramError(f"the {which} diagram is empty: a connected sum needs an edge of each")
        if edge is not None and edge not in diagram.edges():
            raise DiagramError(f"edge {edge} is not in the {which} diagram (edges: {diagram.edges()})")
    _check_sizes(first, second, "connected sum", 1)
    first_edge = first.edges()[0] if first_edge is None else first_edge
    second_edge = second.edges()[0] if second_edge is None else second_edge
    face = int(first.faces_beside(first_edge)[1])
    union = disjoint_union(first, second, face, int(second.faces_beside(second_edge)[1]))
    moved_edge = second_edge + max(first.edges())
    if first_edge in union.loops or moved_edge in union.loops:
        return _band_at_circle(union, first_edge, moved_edge)
    result = saddle(union, first_edge, moved_edge, face=face)
    if not result.respects_orientation or result.effect != "merge":  # pragma: no cover - a bug
        raise InternalError(f"the band of the connected sum gave a {result.effect}")
    return result.diagram


def _band_at_circle(union: Diagram, kept: int, gone: int) -> Diagram:
    """An oriented band from edge ``kept`` to edge ``gone`` across the face right of both, when
    at least one of them is a crossingless circle.

    The circle becomes part of the other edge, which is then named ``kept``; no side changes
    its cycle except that the circle's two cycles go. The face left of the circle and the face
    left of the other edge become one region (the smaller name), as the band joins them.
    """
    circle = gone if gone in union.loops else kept
    other = kept if circle == gone else gone
    joined_left = sorted({int(union.faces_beside(circle)[0]), int(union.faces_beside(other)[0])})

    def rename(edge: int) -> int:
        return kept if edge == gone else edge

    crossings = {name: tuple(rename(e) for e in labels) for name, labels in union.crossings.items()}
    loops = (union.loops - {circle, gone}) | ({kept} if other in union.loops else set())
    components = {}
    keeper, leaver = union.component_of(kept), union.component_of(gone)
    for name, edges in union.components.items():
        if name == leaver:
            continue
        if name == keeper:
            edges = tuple(rename(e) for e in union.components[leaver if circle == kept else keeper])
            start = edges.index(min(edges))
            edges = edges[start:] + edges[:start]
        components[name] = edges
    faces: dict[int, list[tuple[Side, ...]]] = {}
    for name, cycles in union.faces.items():
        target = joined_left[0] if name in joined_left else name
        for cycle in cycles:
            if cycle in ((Side(circle, "L"),), (Side(circle, "R"),)):
                continue
            faces.setdefault(target, []).append(canonical_cycle(Side(rename(s.edge), s.hand) for s in cycle))
    return Diagram(crossings, dict(union.signs), frozenset(loops), dict(sorted(components.items())),
                   {name: tuple(sorted(cycles)) for name, cycles in sorted(faces.items())})


# ---------------------------------------------------------------------- mirror and reversal


def mirror(diagram: Diagram) -> Diagram:
    """The mirror image: every crossing switched, everything else (names, faces) kept.

    Each PD tuple is re-read from the old incoming over-strand, which is now the under-strand.
    Returns a new diagram.

    >>> mirror(from_braid([1, 1, 1])).signs
    {1: -1, 2: -1, 3: -1}
    >>> mirror(mirror(from_braid([1, -2, 1]))) == from_braid([1, -2, 1])
    True
    """
    crossings = {}
    for name, (a, b, c, d) in diagram.crossings.items():
        crossings[name] = (d, a, b, c) if diagram.signs[name] > 0 else (b, c, d, a)
    signs = {name: -sign for name, sign in diagram.signs.items()}
    return Diagram(crossings, signs, diagram.loops, dict(diagram.components), dict(diagram.faces))


def reverse(diagram: Diagram, components: Iterable[int] | None = None) -> Diagram:
    """The diagram with the orientation of the named components reversed (all by default).

    Parameters: a diagram; ``components``, names of its components. Returns a new diagram with
    every name kept: each crossing's tuple is re-read from its new incoming under-strand and
    its sign recomputed (it changes when exactly one of its strands is reversed); each
    component lists its edges along the new orientation from its smallest; each face is the same
    region, with the sides of reversed edges changing hand.

    >>> hopf = from_braid([1, 1])
    >>> reverse(hopf, [2]).signs, reverse(hopf).signs
    ({1: -1, 2: -1}, {1: 1, 2: 1})
    >>> reverse(reverse(hopf, [1]), [1]) == hopf
    True
    """
    names = sorted(diagram.components) if components is None else list(components)
    for name in names:
        if name not in diagram.components:
            raise DiagramError(
                f"component {name!r} is not in the diagram (components: {sorted(diagram.components)})"
            )
    flipped = {edge for name in names for edge in diagram.components[name]}
    arriving = {tail if edge in flipped else head for edge, (tail, head) in diagram.edge_ends.items()}
    crossings, signs = reencode(diagram.crossings, arriving)
    components_ = {}
    for name, edges in diagram.components.items():
        if name in names:
            edges = tuple(reversed(edges))
            start = edges.index(min(edges))
            edges = edges[start:] + edges[:start]
        components_[name] = edges
    faces = {
        name: tuple(sorted(canonical_cycle(s.other() if s.edge in flipped else s for s in cycle) for cycle in cycles))
        for name, cycles in diagram.faces.items()
    }
    return Diagram(crossings, signs, diagram.loops, components_, faces)


# ---------------------------------------------------------------------- tables


def from_table(name: str) -> Diagram:
    """The knot or oriented link the tables call ``name``, from the table's PD code.

    Parameters: a name in any spelling :func:`movies.diagram.tables.lookup` accepts. Returns a
    new diagram whose edge names are the table's labels; 0_1 is :func:`unknot`. Raises
    :class:`~movies.errors.TableError` for a name the tables do not have.

    >>> d = from_table("3_1")
    >>> d.pd_code(), d.writhe()
    ([(1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)], 3)
    >>> from_table("0_1") == unknot()
    True
    """
    entry = lookup(name)
    if not entry.pd:
        return unknot()
    return from_pd(entry.pd)
