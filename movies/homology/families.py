"""Families of links that differ by full twists, computed in one scan.

The twisted approximations L(0), L(1), …, L(K) of a link in #ʳ S¹×S² share everything outside
the twist boxes, and L(k + 1) is L(k) with one more full twist in each box. So the common part is
scanned once, the full twists are added one after another, and after the k-th the open ends at
the top of the k-th twist are joined to the ends the common part leaves at the top of the box by
arcs that cross nothing (:func:`~movies.homology.scanning.close_arcs`): that is L(k), read without
rescanning anything. The complex before the joining goes on to L(k + 1).

The plan is read off the diagram L(max(K, 3)) that :func:`~movies.diagram.handles.twisted` makes
(the crossings of each box are named in the order of the braid word, one full twist after
another). Before anything is computed, every member as planned is checked to join every end of
its crossings exactly once and to have the components of L(0); the tests compare each member
with the diagram ``twisted(link, k)`` scanned alone.

>>> from movies.diagram.handles import fibers
>>> plan = twist_family(fibers(1, 1), 3)
>>> len(plan.common), [len(block) for block in plan.blocks], plan.minus
(0, [2, 2, 2], [0, 2, 4, 6])
>>> [values["Q"] for values in family_s(fibers(1, 1), 3).values()]
[-1, -1, -1, -1]
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Iterator, Sequence

from movies.diagram.handles import HandleDiagram, twisted
from movies.diagram.model import Diagram
from movies.diagram.moves.twist import twist
from movies.diagram.scan_order import scan_order
from movies.errors import InternalError
from movies.homology.canonical import canonical_chain, read_canonical, s_from_canonical
from movies.homology.rings import Ring, parse_field
from movies.homology.scanning import CarriedClass, Complex, FinalComplex, add_crossing, close_arcs, finish
from movies.unionfind import partition_roots

__all__ = ["TwistFamily", "twist_family", "family_complexes", "family_s", "family_khovanov"]


@dataclass(frozen=True)
class TwistFamily:
    """How to scan L(0), …, L(K) (or L(0), L(−1), …, L(−K)) of one link.

    ``common``: the PD tuples outside the twist boxes, in scan order; ``blocks[j]``: the PD tuples
    of the (j+1)-th full twist of every box, in braid-word order; ``closings[k]``: for k < K, the
    pairs of edge labels that an arc joins to close the scan after k full twists into L(±k) (none
    for the last member when it is the diagram the plan was read from);
    ``whole``: the diagram with the most twists, read for the plan; ``signs``: the sign of each
    PD tuple; ``minus[k]``, ``plus[k]``: the negative and positive
    crossings of L(±k); ``seifert[k]``: its Seifert circles; ``loops``: crossingless circles away
    from the boxes (in every member; circles through a box that has no crossing in L(0) close in
    the scan); ``components``: the components of every member (a full twist is a pure braid).
    """

    turns: int
    common: tuple
    blocks: tuple
    closings: tuple
    signs: dict
    minus: list
    plus: list
    loops: int
    components: int
    whole: Diagram
    seifert: list

    def crossings_of(self, k: int) -> list:
        """The PD tuples of L(±k): the common part and the first k full twists."""
        return list(self.common) + [c for block in self.blocks[:k] for c in block]


def twist_family(link: HandleDiagram, most: int) -> TwistFamily:
    """The plan for L(0), …, L(most) (``most > 0``, right-handed twists) or L(0), …, L(most)
    going down (``most < 0``, left-handed).

    >>> from movies.diagram.handles import fibers
    >>> plan = twist_family(fibers(2, 0), -2)
    >>> [len(block) for block in plan.blocks], plan.closings[0]  # L(0): two circles round the box
    ([2, 2], ((1, 1), (2, 2)))
    """
    if type(most) is not int or most == 0:
        raise ValueError(f"the last member of a family is a nonzero number of twists, not {most!r}")
    hand = 1 if most > 0 else -1
    count = abs(most)
    built = max(count, 3)  # with three twists or more an edge round from top to bottom is told apart
    diagram = link.diagram
    boxes = []  # per box: its full twists, each a list of crossing names in word order
    for gate in link.gates:
        straight = gate.straight()
        if len(straight) < 2:
            continue  # a full twist of one strand adds no crossing
        before = set(diagram.crossings)
        diagram = twist(diagram, straight, hand * built, gate.start_face(diagram)).diagram
        names = sorted(set(diagram.crossings) - before)
        size = len(straight) * (len(straight) - 1)
        boxes.append([names[j * size:(j + 1) * size] for j in range(built)])
    block_of = {name: (b, j) for b, box in enumerate(boxes) for j, names in enumerate(box) for name in names}
    order = [name for name in _order(link.diagram) if name not in block_of]
    common = tuple(diagram.crossings[name] for name in order)
    blocks = tuple(tuple(diagram.crossings[name] for box in boxes for name in box[j]) for j in range(built))
    ends: dict = {}
    for name, labels in diagram.crossings.items():
        for slot, label in enumerate(labels):
            ends.setdefault(label, []).append((name, slot))
    closings = []
    for k in range(count + 1 if count < built else count):
        pairs = []
        for b in range(len(boxes)):
            pairs += _box_pairs(diagram, ends, block_of, b, k, built)
        closings.append(_chained(pairs))
    signs = {diagram.crossings[name]: diagram.signs[name] for name in diagram.crossings}
    plan = TwistFamily(hand, common, blocks[:count], tuple(closings), signs, [], [], diagram.loop_count(),
                       link.diagram.component_count(), diagram, [])
    for k in range(count + 1):
        crossings = plan.crossings_of(k)
        plan.minus.append(sum(1 for c in crossings if signs[c] < 0))
        plan.plus.append(len(crossings) - plan.minus[-1])
    _check(plan)
    return plan


def _check(plan: TwistFamily) -> None:
    """Each member as planned has the components of L(0), every end of its crossings is joined
    (and no end is joined twice), and L(±K) is the diagram the plan was read from; fills in
    ``plan.seifert``. Raises InternalError otherwise (a bug, never an answer); the tests compare
    every member with ``twisted(link, k)`` besides."""
    plan.seifert.clear()
    for k in range(len(plan.blocks) + 1):
        crossings = plan.crossings_of(k)
        pairs = plan.closings[k] if k < len(plan.closings) else ()
        seen: dict = {}
        for c in crossings:
            for label in c:
                seen[label] = seen.get(label, 0) + 1
        for a, b in pairs:
            for label in {a, b}:
                seen[label] = seen.get(label, 0) + (2 if a == b else 1)
        joins = [(c[0], c[2]) for c in crossings] + [(c[1], c[3]) for c in crossings] + list(pairs)
        labels = sorted(seen)
        index = {label: i for i, label in enumerate(labels)}
        roots = partition_roots(len(labels), [(index[a], index[b]) for a, b in joins])
        components = len(set(roots)) + plan.loops
        loose = sorted(label for label, n in seen.items() if n != 2)
        if components != plan.components or loose:
            raise InternalError(f"the family's member {plan.turns * k} does not match L({plan.turns * k}): "
                                f"{components} components against {plan.components}"
                                + (f"; edges {loose} left open" if loose else ""))
        # the oriented resolution: the 0-smoothing at a positive crossing, the 1-smoothing at a negative one
        oriented = [(c[0], c[1]) if plan.signs[c] > 0 else (c[0], c[3]) for c in crossings] + \
                   [(c[2], c[3]) if plan.signs[c] > 0 else (c[1], c[2]) for c in crossings] + list(pairs)
        circles = partition_roots(len(labels), [(index[a], index[b]) for a, b in oriented])
        plan.seifert.append(len(set(circles)) + plan.loops)


def _order(diagram: Diagram) -> list:
    """The crossing names of a diagram in the scan order of its PD code."""
    names = sorted(diagram.crossings)
    pd = [diagram.crossings[name] for name in names]
    return [names[i] for i in scan_order(pd)] if pd else []


def _box_pairs(diagram: Diagram, ends: dict, block_of: dict, box: int, k: int, built: int) -> list:
    """For each strand of one box: (its edge from full twist k to full twist k + 1, or its edge
    into the bottom of the box for k = 0; its edge out of the top of the box).

    Each strand is followed up from its bottom edge (one end in the first full twist, the other
    outside the box or at its top: a strand that comes straight round), straight through every
    crossing (slot ``s`` to ``s + 2``), until it leaves the top full twist.
    """
    top = (box, built - 1)
    pairs = []
    for label, places in ends.items():
        blocks = [block_of.get(name) for name, _ in places]
        if len(places) != 2 or blocks.count((box, 0)) != 1:
            continue
        other = blocks[1 - blocks.index((box, 0))]
        if other is not None and other[0] == box and other != top:
            continue  # inside the box
        name, slot = places[blocks.index((box, 0))]
        chosen = label if k == 0 else None
        while True:
            out = (slot + 2) % 4
            edge = diagram.crossings[name][out]
            (after, slot), = [(n, t) for n, t in ends[edge] if (n, t) != (name, out)]
            at = block_of.get(after)
            if at is None or at[0] != box or (block_of[name] == top and at == (box, 0)):
                break
            if at == (box, k) and block_of[name] == (box, k - 1):
                chosen = edge
            name = after
        pairs.append((chosen, edge))
    return pairs


def _chained(pairs: list) -> tuple:
    """Pairs joined end to end where they share a label (boxes that follow each other with no
    crossing between), as pairs of the two outer ends."""
    partner: dict = {}
    result = [(a, b) for a, b in pairs if a == b]  # a strand round the box alone: a circle
    for a, b in pairs:
        if a == b:
            continue
        partner.setdefault(a, []).append(b)
        partner.setdefault(b, []).append(a)
    seen = set()
    for label in sorted(partner):
        if label in seen or len(partner[label]) != 1:
            continue
        previous, current = None, label
        seen.add(label)
        while True:
            following = [x for x in partner[current] if x != previous]
            if not following:
                break
            previous, current = current, following[0]
            seen.add(current)
        result.append((label, current))
    return tuple(result)


def family_complexes(plan: TwistFamily, ring: Ring, degrees: tuple[int, int] | None = None,
                     canonical: bool = False) -> Iterator[tuple[int, FinalComplex]]:
    """The complex of each member, L(0) first, from one scan.

    Parameters: the plan; the ring (Z also for Q, or F_p); ``degrees``, the homological degrees
    wanted (as for :func:`~movies.homology.khovanov.bar_natan_complex`); ``canonical``: carry the
    canonical class of the orientation along (every member needs crossings and no loops).
    Yields ``(k, final complex)`` with k signed as the twists, loops included.
    """
    from movies.homology.khovanov import _with_loops

    _check(plan)
    count = len(plan.blocks)
    sequence = plan.crossings_of(count)
    ready = [len(plan.common) + k * (len(plan.blocks[0]) if plan.blocks else 0) for k in range(count + 1)]
    cx = Complex(ring)
    start = cx.add_object(0, (), 0)
    if canonical:
        chain = canonical_chain(plan.whole)  # the plan's PD tuples are those of the whole diagram
        cx.carried.append(CarriedClass(chain.smoothing, chain.minus_h, coords={start: {0: 1}}))
    boundary: list = []

    def window(done: int, members) -> tuple[int, int] | None:
        if degrees is None:
            return None
        lo = min(degrees[0] + plan.minus[k] - (ready[k] - done) for k in members)
        hi = max(degrees[1] + plan.minus[k] for k in members)
        return lo, hi

    def read(k: int, closed: Complex) -> FinalComplex:
        if any(closed.m.values()):
            raise InternalError(f"the scan of L({plan.turns * k}) ended with open ends")
        final = finish(closed, plan.plus[k], plan.minus[k])
        return _with_loops(final, plan.loops) if plan.loops else final

    done = 0
    for k in range(count + 1):
        while done < ready[k]:
            done += 1
            cx, boundary = add_crossing(cx, boundary, sequence[done - 1], window(done, range(k, count + 1)))
        if k < len(plan.closings):
            closed, rest = close_arcs(cx, boundary, plan.closings[k], window(done, [k]))
            if rest:
                raise InternalError(f"closing L({plan.turns * k}) left the ends {rest} open")
            yield plan.turns * k, read(k, closed)
        else:
            if boundary:
                raise InternalError(f"the scan of L({plan.turns * k}) left the ends {boundary} open")
            yield plan.turns * k, read(k, cx)


def family_s(link: HandleDiagram, most: int, fields: Sequence[str] = ("Q",), stop=None) -> dict[int, dict[str, int]]:
    """s(L(k)) for k = 0, ±1, …, ``most`` over each field, from one scan of degrees -1..1.

    ``stop(k, values)``, if given, is asked after each member (``values`` maps field to s) and
    ends the scan early when it answers True. When the diagram with the most twists has
    crossingless circles or several pieces, each member is computed alone (the canonical class is
    coloured by the checkerboard of one piece).

    >>> from movies.diagram.handles import fibers
    >>> family_s(fibers(2, 2), -1, ("Q", "F2"))
    {0: {'Q': -3, 'F2': -3}, -1: {'Q': 1, 'F2': 1}}
    """
    from movies.homology.khovanov import S_DEGREES
    from movies.homology.links import link_s_values

    plan = twist_family(link, most)
    result: dict[int, dict[str, int]] = {}
    if plan.loops or plan.whole.piece_count() != 1:  # the canonical class is coloured on one piece
        for k in range(abs(most) + 1):
            result[plan.turns * k] = link_s_values(twisted(link, plan.turns * k), list(fields))
            if stop is not None and stop(plan.turns * k, result[plan.turns * k]):
                break
        return result
    for k, final in family_complexes(plan, Ring("Z", 0), S_DEGREES, canonical=True):
        q = plan.plus[abs(k)] - plan.minus[abs(k)] - plan.seifert[abs(k)]  # writhe minus Seifert circles
        canonical = read_canonical(final, q)
        result[k] = {field: s_from_canonical(canonical, parse_field(field).name) for field in fields}
        if stop is not None and stop(k, result[k]):
            break
    return result


def family_khovanov(link: HandleDiagram, most: int, field: str = "Q") -> dict[int, dict]:
    """Khovanov homology of L(0), …, L(``most``) over a field, from one scan.

    >>> from movies.diagram.handles import fibers
    >>> sorted(family_khovanov(fibers(1, 1), 1)[1])
    [(-2, -6), (-2, -4), (0, -2), (0, 0)]
    """
    from movies.homology.graded import khovanov_ranks

    ring = parse_field(field)
    scan_ring = Ring("Z", 0) if ring.name == "Q" else ring
    plan = twist_family(link, most)
    return {k: khovanov_ranks(final, ring.p) for k, final in family_complexes(plan, scan_ring)}
