"""Finding surfaces of small genus: pairs of bands down to the unknot, written as a movie and checked.

A connected surface of genus g from a knot to the unknot is, read inward, g pairs of bands (one
splits the knot, the next joins the two pieces again: a genus-one piece; a crossing change is one
such pair, the join sometimes along a path over or under one edge), then the unknot dies. It
first changes sets of crossings (each by its pair of bands), as many as the lower bound from s,
the signature and Fox–Milnor and then more; then it runs a beam search over these pairs: from
each frame it keeps, it tries every split band and every join after it (both respecting the orientation),
and it keeps the few knots that look nearest to the unknot: smallest lower bound from the
signature, then smallest determinant, then fewest crossings. A knot whose determinant and Jones
polynomial are the unknot's goes to the Reidemeister search; when that removes every crossing,
the bands become a movie that :func:`movies.checker.replay.check_movie` must verify.

>>> found = find_surface("5_2", budget=30)
>>> found.verdict, found.genus
('verified', 1)
"""

from __future__ import annotations

import math
import time

from movies.bounds.verdicts import search_genus_bounds
from movies.checker import search
from movies.checker.replay import check_movie
from movies.checker.ribbon import SearchResult, band_candidates
from movies.diagram.model import Diagram
from movies.diagram.steps import MoveRecord, perform
from movies.errors import MoveError, MoviesError
from movies.invariants.alexander import determinant
from movies.invariants.jones import jones_polynomial
from movies.invariants.signature import signature
from movies.language.spec import parse_diagram

__all__ = ["find_surface", "crossing_change_bands", "switched"]


def _banded(record: MoveRecord, diagram: Diagram, components: int):
    """The frame a band leaves when it respects the orientation and leaves ``components`` components."""
    try:
        outcome = perform(record, diagram)
    except MoveError:
        return None
    if outcome.diagram.component_count() != components or outcome.transition.twisted:
        return None
    if any(not same for _, _, same in outcome.transition.links):
        return None
    return outcome.diagram


def _pairs(diagram: Diagram, paths: bool):
    """(split band, join band, knot left) for every genus-one piece from ``diagram``, in a fixed order.

    With ``paths`` the join may also run along a path over or under one edge (a crossing change
    needs that at some crossings)."""
    for first in band_candidates(diagram):
        middle = _banded(first, diagram, 2)
        if middle is None:
            continue
        joins = band_candidates(middle) + (band_candidates(middle, paths=True) if paths else [])
        for second in joins:
            if second.first == second.second:
                continue
            after = _banded(second, middle, 1)
            if after is not None:
                yield first, second, after


def switched(diagram: Diagram, crossing: int) -> Diagram:
    """The diagram with ``crossing`` changed (the other strand over), names kept.

    >>> switched(parse_diagram("3_1"), 1).writhe()
    1
    """
    from movies.diagram.pd import from_pd

    names = sorted(diagram.crossings)
    code = [tuple(c) for c in diagram.pd_code()]
    index = names.index(crossing)
    a, b, c, d = code[index]
    for rotated in ((b, c, d, a), (d, a, b, c)):  # read from the old over-strand's incoming edge
        trial = code[:index] + [rotated] + code[index + 1:]
        try:
            result = from_pd(trial, diagram.loop_count())
        except MoviesError:
            continue
        if result.writhe() == diagram.writhe() - 2 * diagram.signs[crossing]:
            return result
    raise MoveError(f"crossing {crossing} could not be changed")  # pragma: no cover - one rotation always reads


def crossing_change_bands(diagram: Diagram, crossing: int, budget: float = 1.0) -> tuple[MoveRecord, MoveRecord] | None:
    """Two bands (a split at a corner of ``crossing``, then a join) that change that crossing, up to isotopy.

    A crossing change is a genus-one piece: the oriented resolution of the crossing is one band
    away from either sign. The pair is found by trying the corner bands and the joins after them
    against the switched diagram (Jones polynomial, then the Reidemeister search).

    >>> first, second = crossing_change_bands(parse_diagram("3_1"), 1)
    >>> perform(second, perform(first, parse_diagram("3_1")).diagram).diagram.component_count()
    1
    """
    target = switched(diagram, crossing)
    target_jones = jones_polynomial(target)
    corner_edges = set(diagram.crossing(crossing))
    pairs = []
    for first in band_candidates(diagram):
        if first.first not in corner_edges or first.second not in corner_edges or first.first == first.second:
            continue
        middle = _banded(first, diagram, diagram.component_count() + 1)
        if middle is None:
            continue
        pairs.append((first, middle))
    for paths in (False, True):  # a join across a face first, then one along a path over or under an edge
        for first, middle in pairs:
            for second in band_candidates(middle, paths=paths):
                if second.first == second.second:
                    continue
                after = _banded(second, middle, diagram.component_count())
                if after is None or jones_polynomial(after) != target_jones:
                    continue
                if search.certify(after, target, budget).certified:
                    return first, second
    return None


def find_surface(knot: str, budget: float = 60.0, most_genus: int | None = None, beam: int = 3,
                 search_budget: float = 2.0, to: str | None = None, progress=None) -> SearchResult:
    """Look for a connected surface of small genus from ``knot`` to the empty diagram (or to the
    knot ``to``: a cobordism, ending with an isotopy claim the checker certifies).

    Parameters
    ----------
    knot : str
        A knot in the diagram notation.
    budget : float
        Seconds for the whole search.
    most_genus : int, optional
        The largest genus tried (default: one more than the lower bound, and at least 3).
    beam : int
        How many knots each level keeps.
    search_budget : float
        Seconds the Reidemeister search may take for each knot that looks like the unknot.
    to : str, optional
        The other end of a cobordism, a knot in the diagram notation.
    progress : callable, optional
        Called with a line of text about every two seconds of searching.

    Returns
    -------
    SearchResult
        The smallest genus found at the first level that reaches the unknot, with its movie and
        the checker's verdict; or why it stopped (Ctrl-C ends the search and is reported here).
    """
    try:
        return _find_surface(knot, budget, most_genus, beam, search_budget, to, progress)
    except KeyboardInterrupt:
        return SearchResult(knot, why="stopped by Ctrl-C before a surface was found")


def _find_surface(knot, budget, most_genus, beam, search_budget, to, progress) -> SearchResult:
    started = time.perf_counter()
    report = SearchResult(knot)
    start = parse_diagram(knot)
    if start.component_count() != 1:
        report.why = "the surface search is for knots"
        return report
    target = parse_diagram(to if to is not None else "unknot")
    if target.component_count() != 1:
        report.why = "the surface search is for knots"
        return report
    target_jones, target_det = jones_polynomial(target), abs(determinant(target))
    target_signature = signature(target)
    if to is not None and search.certify(start, target, search_budget).certified:
        if _write(report, knot, (), 0, search_budget, to):  # the same knot: a concordance, genus 0
            report.seconds = time.perf_counter() - started
            return report
    level: list[tuple[tuple[MoveRecord, ...], Diagram]] = [((), start)]
    said = started

    def reaches(after: Diagram) -> bool:
        if abs(determinant(after)) != target_det or jones_polynomial(after) != target_jones:
            return False
        if to is None:
            return search.simplify_frame(after, {"target": "crossingless"}, search_budget).reached
        return search.certify(after, target, search_budget).certified

    least = max(b.bound for b in search_genus_bounds(start, None if to is None else target))
    slice_tries = 0
    if most_genus is None:
        most_genus = max(3, least + 1)
    for genus in range(1, most_genus + 1):
        if genus >= least:  # the cheap guess first: change `genus` crossings, each by its pair of bands
            for chain, after in _crossing_changes(start, genus, started, budget):
                report.tried += 1
                if reaches(after) and _write(report, knot, chain, genus, search_budget, to):
                    report.seconds = time.perf_counter() - started
                    return report
        scored = []
        for records, frame in level:
            # below the bound no surface can end here: the next level comes from crossing changes alone
            pieces = _pairs(frame, paths=genus == 1) if genus >= least else _single_changes(frame)
            for first, second, after in pieces:
                now = time.perf_counter()
                if progress is not None and now - said > 2:
                    said = now
                    progress(f"surface search for {knot}: genus {genus}, {report.tried} pieces in {now - started:.0f} s")
                if now - started > budget:
                    report.why = f"it ran out of time ({budget:g} seconds) at genus {genus} after {report.tried} pieces"
                    report.seconds = time.perf_counter() - started
                    return report
                report.tried += 1
                chain = records + (first, second)
                if genus >= least and reaches(after) and _write(report, knot, chain, genus, search_budget, to):
                    report.seconds = time.perf_counter() - started
                    return report
                if (genus >= least and to is None and slice_tries < MOST_SLICE_ENDS
                        and _slice_end(report, knot, chain, genus, after, search_budget)):
                    report.seconds = time.perf_counter() - started
                    return report
                slice_tries += _looks_slice(after) if to is None and genus >= least else 0
                det = abs(determinant(after))
                scored.append(((abs(signature(after) - target_signature) // 2, abs(det - target_det),
                                after.crossing_count()), len(scored), chain, after))
        scored.sort(key=lambda item: item[:2])
        level = [(chain, after) for _, _, chain, after in scored[:beam]]
        if not level:
            break
    report.why = f"no surface of genus at most {most_genus} found ({report.tried} genus-one pieces tried)"
    report.seconds = time.perf_counter() - started
    return report


def _single_changes(frame: Diagram):
    """(split band, join band, knot left) for each crossing that its pair of bands changes."""
    for crossing in sorted(frame.crossings):
        pair = crossing_change_bands(frame, crossing)
        if pair is not None:
            yield pair[0], pair[1], perform(pair[1], perform(pair[0], frame).diagram).diagram


def _crossing_changes(start: Diagram, count: int, started: float, budget: float):
    """(bands, knot left) for every set of ``count`` crossings changed one after another, in order."""
    from itertools import combinations

    for crossings in combinations(sorted(start.crossings), count):
        chain: tuple[MoveRecord, ...] = ()
        frame = start
        for crossing in crossings:
            if time.perf_counter() - started > budget or crossing not in frame.crossings:
                break
            pair = crossing_change_bands(frame, crossing)
            if pair is None:
                break
            frame = perform(pair[1], perform(pair[0], frame).diagram).diagram
            chain += pair
        else:
            yield chain, frame
        if time.perf_counter() - started > budget:
            return


#: how many knots left by the genus-one pieces a search tries to finish with a ribbon disk
MOST_SLICE_ENDS = 12
#: seconds of ribbon search for each
SLICE_END_BUDGET = 2.0


def _looks_slice(knot: Diagram) -> bool:
    """Whether the cheap invariants allow a knot to be slice: signature 0 and a square determinant
    (Fox–Milnor); a knot with crossings only (the unknot is reached the other way)."""
    if not knot.crossings or knot.component_count() != 1 or knot.crossing_count() > 14 or signature(knot) != 0:
        return False
    det = abs(determinant(knot))
    return math.isqrt(det) ** 2 == det


def _slice_end(report: SearchResult, knot: str, chain: tuple[MoveRecord, ...], genus: int, after: Diagram,
               budget: float) -> bool:
    """Finish at a slice knot instead of the unknot: the genus-one pieces, then a ribbon disk for
    the knot they leave (found by the ribbon search), written as one movie and checked."""
    if not _looks_slice(after):
        return False
    from movies.checker.ribbon import find_ribbon_disk

    spec = "pd[" + ",".join("[" + ",".join(map(str, labels)) + "]" for labels in after.crossings.values()) + "]"
    disk = find_ribbon_disk(spec, budget=SLICE_END_BUDGET, search_budget=min(budget, 1.0))
    if disk.verdict != "verified" or not disk.movie:
        return False
    steps = [line for line in disk.movie.splitlines()
             if line.strip() and not line.startswith(("title", "start", "surface", "%"))]
    lines = [f"title a surface of genus {genus} for {knot}, found by the band search", f"start {knot}"]
    lines += [str(r) for r in chain] + [f"isotopic to {spec}"] + steps + [f"surface connected, genus {genus}"]
    text = "\n".join(lines) + "\n"
    checked = check_movie(text, budget=budget)
    if checked.verdict != "verified":
        return False
    report.genus, report.movie, report.verdict = genus, text, checked.verdict
    report.bands = tuple(map(str, chain)) + tuple(disk.bands)
    return True


def _write(report: SearchResult, knot: str, chain: tuple[MoveRecord, ...], genus: int, budget: float,
           to: str | None = None) -> bool:
    what = f"a surface of genus {genus} for {knot}" if to is None else f"a cobordism of genus {genus} from {knot} to {to}"
    lines = [f"title {what}, found by the band search", f"start {knot}"]
    lines += [str(r) for r in chain]
    lines += ["simplify to crossingless", "death 1"] if to is None else [f"isotopic to {to}"]
    lines.append(f"surface connected, genus {genus}")
    text = "\n".join(lines) + "\n"
    checked = check_movie(text, budget=budget)
    if checked.verdict != "verified":
        return False
    report.genus, report.movie, report.verdict, report.bands = genus, text, checked.verdict, tuple(map(str, chain))
    return True
