"""Finding ribbon disks: bands that cut a knot into an unlink, written as a movie and checked.

A ribbon disk with r bands is, read inward, r bands that each split a component (so the
surface stays orientable and planar) leaving an unlink of r + 1 components, then r + 1 deaths.
The search tries band sequences in a fixed order, cheapest first:

1. one band across a face, then one band along a path over or under one edge, then two;
2. two bands across faces (the second on the frame the first leaves).

Each candidate is pruned by what an unlink must have, cheapest test first: the number of
components, every linking number 0, the Jones polynomial of the unlink; only then does the
Reidemeister search try to remove every crossing (within its share of the budget). A sequence
that passes becomes a movie (``simplify to crossingless`` writes out the moves found), which
:func:`movies.checker.replay.check_movie` must verify: nothing rests on the search's own
bookkeeping. The order of the candidates is fixed, so the search is deterministic.

>>> found = find_ribbon_disk("6_1", budget=20)
>>> found.verdict, found.bands
('verified', ('band 1 10 under 3 in face 1',))
"""

from __future__ import annotations

import time
from dataclasses import dataclass, field

from movies.checker import search
from movies.checker.replay import check_movie
from movies.diagram.constructors import unlink
from movies.diagram.model import Diagram
from movies.diagram.steps import MoveRecord, perform
from movies.errors import MoveError
from movies.invariants.jones import jones_polynomial
from movies.language.spec import parse_diagram

__all__ = ["SearchResult", "find_ribbon_disk", "band_candidates"]


@dataclass
class SearchResult:
    """What a surface search found: the movie (verified by the checker) and the genus of its
    surface, or why it stopped."""

    knot: str
    genus: int | None = None
    movie: str | None = None
    verdict: str | None = None
    bands: tuple[str, ...] = ()
    tried: int = 0
    seconds: float = 0.0
    why: str = ""
    notes: list[str] = field(default_factory=list)


def band_candidates(diagram: Diagram, paths: bool = False, crossings: int | None = None) -> list[MoveRecord]:
    """Bands in a fixed order: across one face, or (``paths``) along paths crossing ``crossings``
    edges (default 1), over or under each.

    >>> [str(r) for r in band_candidates(parse_diagram("unknot"))]
    ['band 1 1 in face 1', 'band 1 1 in face 2']
    """
    depth = 0 if not paths else (1 if crossings is None else crossings)
    out = []
    for face in sorted(diagram.faces):
        edges = sorted({side.edge for cycle in diagram.faces[face] for side in cycle})
        if depth == 0:
            out.extend(MoveRecord("band", first=a, second=b, face=face) for a in edges for b in edges if a <= b)
            continue
        for a in edges:
            for path, last in _paths(diagram, face, depth, (a,)):
                used = {a} | {edge for edge, _ in path}
                for b in sorted({side.edge for cycle in diagram.faces[last] for side in cycle} - used):
                    out.append(MoveRecord("band", first=a, second=b, face=face, path=path))
    return out


def _paths(diagram: Diagram, face: int, depth: int, used: tuple[int, ...]):
    """Paths of ``depth`` crossings from ``face``: (((edge, over), ...), the face they end in)."""
    if depth == 0:
        yield (), face
        return
    for crossed in sorted({side.edge for cycle in diagram.faces[face] for side in cycle} - set(used)):
        left, right = diagram.faces_beside(crossed)
        beyond = right if left == face else left
        for rest, last in _paths(diagram, beyond, depth - 1, used + (crossed,)):
            for over in (True, False):
                yield ((crossed, over),) + rest, last


def _splits(record: MoveRecord, diagram: Diagram):
    """The frame a band leaves when it splits a component respecting the orientation, else None."""
    try:
        outcome = perform(record, diagram)
    except MoveError:
        return None
    if outcome.diagram.component_count() != diagram.component_count() + 1 or outcome.transition.twisted:
        return None
    if any(not same for _, _, same in outcome.transition.links):
        return None
    return outcome.diagram


def _unlink_by_invariants(diagram: Diagram) -> bool:
    n = diagram.component_count()
    if any(any(row) for row in diagram.linking_matrix()):
        return False
    return jones_polynomial(diagram) == jones_polynomial(unlink(n))


def find_ribbon_disk(knot: str, budget: float = 60.0, search_budget: float = 2.0, progress=None) -> SearchResult:
    """Look for a ribbon disk of ``knot`` (a diagram in the notation), and check it as a movie; for
    a link, one ribbon disk for each component, disjoint.

    Parameters
    ----------
    knot : str
        A knot in the diagram notation (``6_1``, ``8_20``, ``pd[...]``).
    budget : float
        Seconds for the whole search.
    search_budget : float
        Seconds the Reidemeister search may take for each candidate that passes the invariants.
    progress : callable, optional
        Called with a line of text about every two seconds of searching.

    Returns
    -------
    SearchResult
        ``movie`` and ``verdict`` (``verified``) when found; otherwise ``why`` it stopped (the
        budget, the candidates exhausted, or Ctrl-C, which ends the search and is reported here).
    """
    try:
        return _find_ribbon_disk(knot, budget, search_budget, progress)
    except KeyboardInterrupt:
        return SearchResult(knot, why="stopped by Ctrl-C before a ribbon disk was found")


def _find_ribbon_disk(knot: str, budget: float, search_budget: float, progress) -> SearchResult:
    started = time.perf_counter()
    start = parse_diagram(knot)
    report = SearchResult(knot)
    pieces = start.component_count()  # a link gets one disk for each component

    said = [started]

    def out_of_time() -> bool:
        now = time.perf_counter()
        if progress is not None and now - said[0] > 2:
            said[0] = now
            progress(f"ribbon search for {knot}: {report.tried} candidates in {now - started:.0f} s")
        return now - started > budget

    def finish(records: list[MoveRecord], frame: Diagram) -> bool:
        report.tried += 1
        if not _unlink_by_invariants(frame):
            return False
        found = search.simplify_frame(frame, {"target": "crossingless"}, search_budget)
        if not found.reached:
            return False
        lines = [f"title {'a ribbon disk' if pieces == 1 else 'ribbon disks'} for {knot}, found by the band search", f"start {knot}"]
        lines += [str(r) for r in records]
        lines += ([f"expect components {frame.component_count()}"] if records else []) + ["simplify to crossingless"]
        lines += [f"death {k}" for k in sorted(frame.components)]
        lines.append("surface disk, ribbon" if pieces == 1 else f"surface components {pieces}, genus 0, ribbon")
        text = "\n".join(lines) + "\n"
        # the components keep their names through the Reidemeister moves; the checker replays it all
        checked = check_movie(text, budget=search_budget)
        if checked.verdict != "verified":
            report.notes.append(f"a candidate the checker did not verify ({checked.verdict}): {', '.join(lines[2:-1])}")
            return False
        report.movie, report.verdict, report.bands = text, checked.verdict, tuple(str(r) for r in records)
        report.genus = 0
        return True

    if finish([], start):  # already an unlink: the disks need no band
        report.seconds = time.perf_counter() - started
        return report
    report.tried = 0
    for crossings in (0, 1, 2):  # one band: across a face, then along paths crossing one or two edges
        for record in band_candidates(start, paths=crossings > 0, crossings=crossings):
            if out_of_time():
                report.why = f"it ran out of time ({budget:g} seconds) after {report.tried} candidates"
                break
            frame = _splits(record, start)
            if frame is not None and finish([record], frame):
                break
        if report.movie or report.why:
            break
    if report.movie is None and not report.why:
        for first in band_candidates(start):  # two bands across faces
            middle = _splits(first, start)
            if middle is None:
                continue
            for second in band_candidates(middle):
                if out_of_time():
                    report.why = f"it ran out of time ({budget:g} seconds) after {report.tried} candidates"
                    break
                frame = _splits(second, middle)
                if frame is not None and finish([first, second], frame):
                    break
            if report.movie or report.why:
                break
    if report.movie is None and not report.why:
        report.why = (f"no band sequence it tries (one band across a face or along a path crossing up to two edges, "
                      f"or two bands across faces) leaves an unlink ({report.tried} candidates)")
    report.seconds = time.perf_counter() - started
    return report

