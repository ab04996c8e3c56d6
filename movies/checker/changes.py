"""Surfaces built by construction: crossing changes as bands, and Seifert's algorithm as bands.

Two pieces every topologist uses to bound the 4-genus from above, written as moves the checker
replays (nothing here is trusted: the movie they make is verified step by step):

- **A crossing change is a genus-one piece.** A band at a corner of the crossing between an
  incoming and an outgoing arm leaves the crossing as a kink (read inward: the oriented
  resolution); the kink goes by Reidemeister I; a band with one half twist between the same two
  arcs puts the crossing back with the other sign. :func:`crossing_change_moves` builds the three
  moves and checks the frame they leave is the switched diagram up to planar isotopy.
- **Seifert's algorithm is a movie.** A band at an oriented corner of every crossing, then each
  crossing (now a kink) removed, leaves the Seifert circles; they die. The surface is the
  diagram's Seifert surface, of genus (n - s + 1)/2 for a knot with n crossings and s Seifert
  circles (:func:`seifert_moves`).

So k crossing changes to a knot whose diagram has Seifert genus g give a surface of genus k + g.

>>> from movies.language.spec import parse_diagram
>>> moves, after = crossing_change_moves(parse_diagram("3_1"), 1)
>>> [str(m) for m in moves]
['band 1 5 in face 2', 'R1 remove 1', 'band 1 4 twisted +1 in face 1']
>>> parse_diagram("3_1").writhe(), after.writhe()
(3, 1)

References
----------
H. Seifert, Über das Geschlecht von Knoten, Math. Ann. 110 (1935): the surface from the
oriented resolution of every crossing.
"""

from __future__ import annotations

from movies.diagram.assembly import assemble
from movies.diagram.isotopy import isomorphism
from movies.diagram.model import Diagram
from movies.diagram.steps import MoveRecord, perform
from movies.errors import MoveError

__all__ = ["crossing_change_moves", "orientable_band", "seifert_moves", "seifert_genus", "smoothing_band", "switched"]


def switched(diagram: Diagram, crossing: int) -> Diagram:
    """The diagram with ``crossing`` changed (the other strand over); faces and names kept.

    >>> from movies.language.spec import parse_diagram
    >>> switched(parse_diagram("3_1"), 1).writhe()
    1
    """
    crossings, signs = dict(diagram.crossings), dict(diagram.signs)
    a, b, c, d = crossings[crossing]
    # the PD tuple starts at the incoming under-edge: the old over-strand's incoming edge is d or b
    crossings[crossing] = (d, a, b, c) if signs[crossing] > 0 else (b, c, d, a)
    signs[crossing] = -signs[crossing]
    return assemble(crossings, signs, diagram.loops, previous=diagram)


def seifert_genus(diagram: Diagram) -> int:
    """The genus of the Seifert surface of a connected knot diagram: (n - s + 1)/2.

    >>> from movies.language.spec import parse_diagram
    >>> seifert_genus(parse_diagram("5_1")), seifert_genus(parse_diagram("4_1"))
    (2, 1)
    """
    return (diagram.crossing_count() - diagram.seifert_circle_count() + 2 - diagram.component_count()) // 2


def _is_kink(diagram: Diagram, crossing: int) -> bool:
    return len(set(diagram.crossing(crossing))) < 4


def _bands_at(diagram: Diagram, crossing: int, **extra):
    """Bands across one face between two arms of ``crossing`` (no path), in a fixed order."""
    arms = sorted(set(diagram.crossing(crossing)))
    for face in sorted(diagram.faces):
        if crossing not in diagram.face_crossings(face):
            continue
        sides = {side.edge for cycle in diagram.faces[face] for side in cycle}
        for i, first in enumerate(arms):
            for second in arms[i + 1:]:
                if first in sides and second in sides:
                    yield MoveRecord("band", first=first, second=second, face=face, **extra)


def orientable_band(record: MoveRecord, diagram: Diagram):
    """The outcome of a band that respects the orientation (no twist, every component that goes
    on keeps its direction), or None where the band does not apply or does not respect it."""
    try:
        outcome = perform(record, diagram)
    except MoveError:
        return None
    if outcome.transition.twisted or any(not same for _, _, same in outcome.transition.links):
        return None
    return outcome


def smoothing_band(diagram: Diagram, crossing: int) -> tuple[MoveRecord, Diagram] | None:
    """The band at an oriented corner of ``crossing``: afterwards the crossing is a kink whose
    removal leaves the oriented resolution. None for a crossing that is already a kink.

    >>> from movies.language.spec import parse_diagram
    >>> record, after = smoothing_band(parse_diagram("3_1"), 2)
    >>> after.component_count(), _is_kink(after, 2)
    (2, True)
    """
    if _is_kink(diagram, crossing):
        return None
    for record in _bands_at(diagram, crossing):
        outcome = orientable_band(record, diagram)
        if outcome is None:
            continue
        after = outcome.diagram
        if (abs(after.component_count() - diagram.component_count()) == 1 and crossing in after.crossings
                and after.crossing_count() == diagram.crossing_count() and _is_kink(after, crossing)):
            return record, after
    return None


def crossing_change_moves(diagram: Diagram, crossing: int) -> tuple[tuple[MoveRecord, ...], Diagram] | None:
    """Three moves that change ``crossing`` (a genus-one piece): the band at an oriented corner,
    Reidemeister I, and a band with one half twist. Returns the moves and the frame they leave,
    which is checked to be the switched diagram up to planar isotopy; None where no such moves
    are found (a kink).

    Parameters
    ----------
    diagram : Diagram
    crossing : int
        The crossing's name; the other crossings keep theirs.

    >>> from movies.language.spec import parse_diagram
    >>> moves, after = crossing_change_moves(parse_diagram("4_1"), 3)
    >>> len(moves), after.crossing_count(), sorted(after.signs.values())
    (3, 4, [-1, 1, 1, 1])
    """
    smoothed = smoothing_band(diagram, crossing)
    if smoothed is None:
        return None
    first, kinked = smoothed
    straighten = MoveRecord("R1-", crossing=crossing)
    resolved = perform(straighten, kinked).diagram
    target = switched(diagram, crossing)
    sign = -diagram.signs[crossing]
    for candidate in _twisted_bands(resolved):
        outcome = orientable_band(candidate, resolved)
        if outcome is None:
            continue
        after = outcome.diagram
        new = set(after.crossings) - set(resolved.crossings)
        if (after.component_count() != diagram.component_count() or len(new) != 1
                or after.signs[new.pop()] != sign):
            continue
        if isomorphism(after, target) is not None:
            return (first, straighten, candidate), after
    return None  # pragma: no cover - the band that undoes the first one, twisted, is always among them


def _twisted_bands(diagram: Diagram):
    """Bands across one face between two different edges, with one half twist either way."""
    from dataclasses import replace

    from movies.checker.ribbon import band_candidates

    for record in band_candidates(diagram):
        if record.first != record.second:
            for twists in (1, -1):
                yield replace(record, twists=twists)


def seifert_moves(diagram: Diagram) -> tuple[tuple[MoveRecord, ...], Diagram]:
    """Seifert's algorithm as moves: a band at an oriented corner of every crossing, then every
    crossing (each now a kink) removed by Reidemeister I. Returns the moves and the crossingless
    frame of Seifert circles they leave (which then die). A crossing that has become a kink on
    the way is only removed: its band would split off one more circle, which changes nothing in
    the genus.

    >>> from movies.language.spec import parse_diagram
    >>> moves, circles = seifert_moves(parse_diagram("6_2"))
    >>> len(moves), circles.component_count(), circles.crossing_count()
    (12, 3, 0)
    """
    moves: list[MoveRecord] = []
    frame = diagram
    for crossing in sorted(diagram.crossings):
        smoothed = smoothing_band(frame, crossing)
        if smoothed is not None:
            moves.append(smoothed[0])
            frame = smoothed[1]
    while frame.crossings:
        kink = next((c for c in sorted(frame.crossings) if _is_kink(frame, c)), None)
        if kink is None:  # pragma: no cover - every crossing was made a kink above
            raise MoveError("Seifert's algorithm left a crossing that is not a kink")
        record = MoveRecord("R1-", crossing=kink)
        frame = perform(record, frame).diagram
        moves.append(record)
    return tuple(moves), frame
