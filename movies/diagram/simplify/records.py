"""Reidemeister moves as records for the search: which apply, and which undoes which.

The records are the one vocabulary of :mod:`movies.diagram.steps` (a
:class:`~movies.diagram.steps.MoveRecord` holds a move's kind and exactly the arguments of its
function); :func:`apply` replays one record, :func:`replay` a sequence;
a recorded sequence from a start diagram is a certificate that anyone can check with the
ordinary move functions. :func:`candidates` lists the moves that apply to a diagram, and
:func:`inverse` finds the move that undoes a recorded one.

>>> from movies.diagram.constructors import unknot
>>> kink = MoveRecord("R1+", edge=1, hand="L", sign=+1)
>>> d = apply(kink, unknot())
>>> d.crossing_count(), [str(r) for r in candidates(d, ("R1-",))]
(1, ['R1 remove 1 kink 1', 'R1 remove 1 kink 2'])
"""

from __future__ import annotations

from typing import Iterable, Sequence

from movies.diagram import moves
from movies.diagram.steps import MoveRecord, apply
from movies.diagram.isotopy import same_on_sphere
from movies.diagram.model import Dart, Diagram, Side
from movies.errors import InternalError, MoveError

__all__ = ["KINDS", "CHANGE", "MoveRecord", "apply", "replay", "candidates", "inverse", "translate"]

#: the moves the search makes: the Reidemeister moves
KINDS = ("R1+", "R1-", "R2+", "R2-", "R3")

#: how many crossings each kind adds
CHANGE = {"R1+": 1, "R1-": -1, "R2+": 2, "R2-": -2, "R3": 0}

def replay(records: Iterable[MoveRecord], diagram: Diagram) -> Diagram:
    """Replay a sequence of moves from ``diagram``; returns the last frame.

    >>> from movies.diagram.constructors import unknot
    >>> steps = [MoveRecord("R1+", edge=1, hand="L", sign=1), MoveRecord("R1-", crossing=1, kink=2)]
    >>> replay(steps, unknot()) == unknot()
    True
    """
    for record in records:
        diagram = apply(record, diagram)
    return diagram


# ---------------------------------------------------------------------- which moves apply


def _is_monogon(diagram: Diagram, kink: int) -> bool:
    # a kink loop bounds a monogon when one of its sides is a face with nothing else in it
    return any(diagram.faces[diagram.side_face[Side(kink, hand)]] == ((Side(kink, hand),),) for hand in "LR")


def _over_at_both(diagram: Diagram, edge: int) -> bool:
    tail, head = diagram.edge_ends[edge]
    return tail.position % 2 == 1 and head.position % 2 == 1


def _polygon(diagram: Diagram, face: int, size: int) -> list[int] | None:
    """The edges of a face that is a single cycle of ``size`` different edges at as many crossings."""
    cycles = diagram.faces[face]
    if len(cycles) != 1 or len(cycles[0]) != size:
        return None
    edges = [side.edge for side in cycles[0]]
    if len(set(edges)) != size or any(e in diagram.loops for e in edges):
        return None
    if len(set(diagram.face_crossings(face))) != size:
        return None
    return edges


def candidates(diagram: Diagram, kinds: Sequence[str] = KINDS) -> list[MoveRecord]:
    """Every move of the given kinds that applies to ``diagram``, in a fixed order.

    Parameters: ``diagram``; ``kinds``, a sequence of :data:`KINDS`. Returns records, kind by
    kind in the order given, each kind sorted by its arguments. A kink whose outer side holds
    other split pieces is not listed as an R1 removal (only an empty monogon is).
    ``R2+`` lists both choices of which edge goes over for every pair of different edges on a
    common face, and ``R1+`` both sides and both signs on every edge.

    >>> from movies.diagram.constructors import unlink
    >>> [str(r) for r in candidates(unlink(2), ("R2+",))]
    ['R2 add 1 over 2 in face 2', 'R2 add 2 over 1 in face 2']
    """
    found: list[MoveRecord] = []
    for kind in kinds:
        if kind == "R1-":
            for crossing in sorted(diagram.crossings):
                for kink in moves.kinks_at(diagram, crossing):
                    if _is_monogon(diagram, kink):
                        found.append(MoveRecord("R1-", crossing=crossing, kink=kink))
        elif kind == "R2-":
            for face in sorted(diagram.faces):
                edges = _polygon(diagram, face, 2)
                if edges and any(_over_at_both(diagram, e) for e in edges):
                    found.append(MoveRecord("R2-", face=face))
        elif kind == "R3":
            for face in sorted(diagram.faces):
                edges = _polygon(diagram, face, 3)
                if edges and any(_over_at_both(diagram, e) for e in edges):
                    found.append(MoveRecord("R3", face=face))
        elif kind == "R2+":
            for face in sorted(diagram.faces):
                # an edge with the face on both sides is offered once: r2_add uses its left side
                edges = sorted({side.edge for cycle in diagram.faces[face] for side in cycle})
                for over in edges:
                    for under in edges:
                        if over != under:
                            found.append(MoveRecord("R2+", over=over, under=under, face=face))
        elif kind == "R1+":
            for edge in diagram.edges():
                for hand in "LR":
                    for sign in (1, -1):
                        found.append(MoveRecord("R1+", edge=edge, hand=hand, sign=sign))
        else:
            raise MoveError(f"a move kind is one of {', '.join(KINDS)}, not {kind!r}")
    return found


# ---------------------------------------------------------------------- undoing a move


def _strand_before(diagram: Diagram, edge: int) -> int:
    """The edge arriving, along the same strand, at the crossing where ``edge`` starts."""
    tail, _ = diagram.edge_ends[edge]
    return diagram.dart_edge[Dart(tail.crossing, (tail.position + 2) % 4)]


def _strand_after(diagram: Diagram, edge: int) -> int:
    _, head = diagram.edge_ends[edge]
    return diagram.dart_edge[Dart(head.crossing, (head.position + 2) % 4)]


def _undoing_removals(before: Diagram, record: MoveRecord, after: Diagram) -> list[MoveRecord]:
    """Moves that may undo an addition or an R3, the likeliest first (each is checked)."""
    if record.kind == "R3":
        return [MoveRecord("R3", face=record.face)]
    made = set(after.crossings) - set(before.crossings)
    if record.kind == "R1+":
        (crossing,) = made
        kinks = moves.kinks_at(after, crossing)
        # the new loop first; a kink on a circle leaves two loops at the crossing
        kinks.sort(key=lambda e: e in before.edges())
        return [MoveRecord("R1-", crossing=crossing, kink=k) for k in kinks if _is_monogon(after, k)]
    # a bigon at the two new crossings; in a piece of two crossings every face is one
    return [MoveRecord("R2-", face=face) for face in sorted(after.faces)
            if _polygon(after, face, 2) and set(after.face_crossings(face)) == made
            and any(_over_at_both(after, e) for e in _polygon(after, face, 2))]


def inverse(before: Diagram, record: MoveRecord, after: Diagram) -> MoveRecord | None:
    """A move on ``after`` that undoes ``record`` (which took ``before`` to ``after``).

    Parameters: the frame before the move, the move, the frame after it. Returns a record
    whose replay on ``after`` gives a diagram the same on the sphere as ``before`` (names may
    differ), or None when no single move function call can express the undoing (an R2 removal
    that leaves the two strands on one edge: ``r2_add`` needs two different edges).
    Additions are undone by the removal of what they made; R3 by R3 on the new triangle, which
    keeps the face's name; removals by the addition that each candidate check confirms.

    >>> from movies.diagram.constructors import unknot
    >>> add = MoveRecord("R1+", edge=1, hand="L", sign=-1)
    >>> inverse(unknot(), add, apply(add, unknot()))
    MoveRecord('R1-', crossing=1, kink=2)
    """
    kind = record.kind
    if kind in ("R3", "R1+", "R2+"):
        for trial in _undoing_removals(before, record, after):
            if same_on_sphere(apply(trial, after), before):
                return trial
        raise InternalError(f"nothing undoes the move {record}")
    new_loops = sorted(after.loops - before.loops)
    if kind == "R1-":
        kink = record.kink if record.kink is not None else max(moves.kinks_at(before, record.crossing))
        sign = before.signs[record.crossing]
        arriving = _strand_before(before, kink)
        edges = [arriving] if arriving in after.edges() else new_loops
        for edge in edges:
            for hand in "LR":
                trial = MoveRecord("R1+", edge=edge, hand=hand, sign=sign)
                if same_on_sphere(apply(trial, after), before):
                    return trial
        raise InternalError("no kink undoes the R1 removal")
    # R2-: push the strand that was over back across the face where the bigon was; the
    # edges arriving at the bigon keep their names, so (over in, under in) is tried first
    bigon = [side.edge for side in before.faces[record.face][0]]
    top = [e for e in bigon if _over_at_both(before, e)][0]
    bottom = [e for e in bigon if e != top][0]
    likely = [_strand_before(before, top), _strand_before(before, bottom)]
    near = likely + [f(before, e) for e in bigon for f in (_strand_before, _strand_after)]
    edges = list(dict.fromkeys(e for e in near if e in after.edges())) + new_loops
    pairs = [(o, u) for o in edges for u in edges if o != u]
    pairs.sort(key=lambda pair: pair != tuple(likely))
    for over, under in pairs:
        for face in moves.common_faces(after, over, under):
            trial = MoveRecord("R2+", over=over, under=under, face=face)
            try:
                result = apply(trial, after)
            except MoveError:
                continue
            if same_on_sphere(result, before):
                return trial
    return None


def translate(record: MoveRecord, names: dict[str, dict[int, int]]) -> MoveRecord:
    """The same move with its edge, crossing and face names passed through ``names``.

    Parameters: a record; ``names``, maps as :func:`movies.diagram.isotopy.isomorphism` gives
    them (keys ``"edges"``, ``"crossings"``, ``"faces"``). Returns a new record; sides (hands)
    are kept, as an isomorphism on the sphere keeps edge orientations.

    >>> translate(MoveRecord("R2+", over=1, under=2, face=3), {"edges": {1: 7, 2: 8}, "faces": {3: 1}})
    MoveRecord('R2+', over=7, under=8, face=1)
    """
    changes = {}
    for field_name, kind in (("edge", "edges"), ("kink", "edges"), ("over", "edges"), ("under", "edges"),
                             ("crossing", "crossings"), ("face", "faces")):
        value = getattr(record, field_name)
        if value is not None:
            changes[field_name] = names[kind][value]
    return MoveRecord(record.kind, **{**{k: v for k, v in record.arguments().items()}, **changes})
