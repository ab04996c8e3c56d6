"""Finding surfaces of small genus, written as a movie and checked.

First by construction (:mod:`movies.checker.changes`): k crossing changes, each a genus-one
piece, then the Seifert surface of the knot they leave, simplified (genus k + its Seifert genus),
for k up to the lower bound from s, the signatures and Fox–Milnor; each set of crossings is
screened on the switched diagram (the Alexander polynomial's span, then a short Reidemeister
search) before it is written as moves.

Then by search: a connected surface of genus g from a knot to the unknot is, read inward, g
pairs of bands (one splits the knot, the next joins the two pieces again: a genus-one piece; the
join sometimes along a path over or under one edge), then the unknot dies. A beam search over
these pairs keeps, from each frame, the few knots that look nearest to the unknot: smallest lower
bound from the signature, then smallest determinant, then fewest crossings. A knot whose
determinant and Jones polynomial are the unknot's goes to the Reidemeister search; when that
removes every crossing, the bands become a movie that :func:`movies.checker.replay.check_movie`
must verify. Where nothing meets the bound, the least genus built is given, and said.

>>> found = find_surface("5_2", budget=30)
>>> found.verdict, found.genus
('verified', 1)
"""

from __future__ import annotations

import math
import time
from itertools import combinations

from movies.bounds.verdicts import search_genus_bounds
from movies.checker import search
from movies.checker.replay import check_movie
from movies.checker.changes import crossing_change_moves, orientable_band, seifert_genus, seifert_moves, switched
from movies.checker.ribbon import SearchResult, band_candidates
from movies.diagram.model import Diagram
from movies.diagram.steps import MoveRecord
from movies.invariants.alexander import alexander_polynomial, determinant
from movies.invariants.jones import jones_polynomial
from movies.invariants.signature import signature
from movies.language.spec import parse_diagram

__all__ = ["find_surface"]


def _banded(record: MoveRecord, diagram: Diagram, components: int):
    """The frame a band leaves when it respects the orientation and leaves ``components`` components."""
    outcome = orientable_band(record, diagram)
    if outcome is None or outcome.diagram.component_count() != components:
        return None
    return outcome.diagram


def _pairs(diagram: Diagram, paths: bool):
    """((split band, join band), knot left) for every genus-one piece from ``diagram``, in a fixed order.

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
                yield (first, second), after


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
    kept: dict = {}  # the least genus built so far, for Ctrl-C
    try:
        return _find_surface(knot, budget, most_genus, beam, search_budget, to, progress, kept)
    except KeyboardInterrupt:
        report = SearchResult(knot, why="stopped by Ctrl-C before a surface was found")
        if "best" in kept:
            _fall_back(report, knot, kept["start"], kept["best"], search_budget, lambda: report)
            if report.verdict == "verified":
                report.why = "stopped by Ctrl-C; " + report.why
        return report


def _find_surface(knot, budget, most_genus, beam, search_budget, to, progress, kept: dict) -> SearchResult:
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

    def done() -> SearchResult:
        report.seconds = time.perf_counter() - started
        return report

    least = max(b.bound for b in search_genus_bounds(start, None if to is None else target))
    fallback = None
    if to is None:  # surfaces by construction first: crossing changes, then Seifert's algorithm
        fallback = _constructed(report, knot, start, least, started + budget * CONSTRUCTED_SHARE, search_budget,
                                progress, kept)
        if report.verdict == "verified":
            return done()
    slice_tries = 0
    if most_genus is None:
        most_genus = max(3, least + 1)
    if fallback is not None:  # the band search only looks below the genus already built
        most_genus = min(most_genus, fallback[0] - 1)
    genus = 0
    for genus in range(1, most_genus + 1):
        scored = []
        for records, frame in level:
            # below the bound no surface can end here: the next level comes from crossing changes alone
            pieces = _pairs(frame, paths=genus == 1) if genus >= least else _single_changes(frame)
            for moves, after in pieces:
                now = time.perf_counter()
                if progress is not None and now - said > 2:
                    said = now
                    progress(f"surface search for {knot}: genus {genus}, {report.tried} pieces in {now - started:.0f} s")
                if now - started > budget:
                    report.why = f"it ran out of time ({budget:g} seconds) at genus {genus} after {report.tried} pieces"
                    return done() if fallback is None else _fall_back(report, knot, start, fallback, search_budget, done)
                report.tried += 1
                chain = records + moves
                if genus >= least and reaches(after) and _write(report, knot, chain, genus, search_budget, to):
                    return done()
                if (genus >= least and to is None and slice_tries < MOST_SLICE_ENDS
                        and _slice_end(report, knot, chain, genus, after, search_budget)):
                    return done()
                slice_tries += _looks_slice(after) if to is None and genus >= least else 0
                det = abs(determinant(after))
                scored.append(((abs(signature(after) - target_signature) // 2, abs(det - target_det),
                                after.crossing_count()), len(scored), chain, after))
        scored.sort(key=lambda item: item[:2])
        level = [(chain, after) for _, _, chain, after in scored[:beam]]
        if not level:
            break
    report.why = (f"no surface of genus at most {genus} found by the band search ({report.tried} genus-one pieces tried)"
                  if genus else "")
    return done() if fallback is None else _fall_back(report, knot, start, fallback, search_budget, done)


#: the share of the budget for surfaces by construction (crossing changes, then Seifert's algorithm)
CONSTRUCTED_SHARE = 0.5
#: seconds the Reidemeister search may take to simplify the knot left by a set of crossing changes
SCREEN_BUDGET = 0.1


def _constructed(report: SearchResult, knot: str, start: Diagram, least: int, until: float, search_budget: float,
                 progress, kept: dict) -> tuple[int, tuple[int, ...], Diagram] | None:
    """Surfaces by construction: k crossing changes (k = 0, 1, ... up to the lower bound), then the
    Seifert surface of the knot they leave, simplified (genus k + its Seifert genus), or, with k at
    the bound, a ribbon disk for it. Writes the first surface that meets the bound into ``report``;
    otherwise returns the least genus built, the crossings changed and the simplified knot left
    (the Seifert surface of ``start`` itself at worst).

    Each set of changes is screened on the switched diagram first (cheap): the Alexander
    polynomial must allow the Seifert genus still needed (its span is at most twice the genus),
    then the Reidemeister search simplifies it for a short time. Only a set that passes is
    written as moves and checked as a movie. ``kept`` holds the least genus built so far (for Ctrl-C)."""
    best = (seifert_genus(start), (), start)
    kept.update(start=start, best=best)
    if best[0] == least and _seifert_end(report, knot, (), least, start, None, search_budget):
        return None
    said = time.perf_counter()
    slice_tries = 0
    for count in range(1, least + 1):
        for crossings in combinations(sorted(start.crossings), count):
            now = time.perf_counter()
            if now > until:
                return best
            if progress is not None and now - said > 2:
                said = now
                progress(f"surface search for {knot}: changing {count} crossings ({', '.join(map(str, crossings))})")
            frame = start
            for crossing in crossings:
                frame = switched(frame, crossing)
            left = least - count
            polynomial = alexander_polynomial(frame)
            if polynomial.span() > 2 * left and not (left == 0 and _looks_slice(frame)):
                continue
            simplified = search.simplify_frame(frame, {"target": "fewest"}, SCREEN_BUDGET).diagram
            genus = count + seifert_genus(simplified)
            if genus < best[0]:
                best = (genus, crossings, simplified)
                kept["best"] = best
            if genus == least and _changed_end(report, knot, start, crossings, simplified, search_budget):
                return None
            if (left == 0 and slice_tries < MOST_SLICE_ENDS and _looks_slice(simplified)):
                slice_tries += 1
                chain, after = _change_chain(start, crossings, search_budget)
                if chain is not None and _slice_end(report, knot, chain, least, after, search_budget,
                                                    f"{_changes_said(chain)}, then a ribbon disk"):
                    return None
    return best


def _change_chain(start: Diagram, crossings: tuple[int, ...], search_budget: float):
    """The moves that change ``crossings`` one after another and then simplify, and the frame left."""
    chain: tuple = ()
    frame = start
    for crossing in crossings:
        changed = crossing_change_moves(frame, crossing)
        if changed is None:
            return None, None
        chain += changed[0]
        frame = changed[1]
    simplified = search.simplify_frame(frame, {"target": "fewest"}, search_budget)
    return chain + simplified.records, simplified.diagram


def _changed_end(report: SearchResult, knot: str, start: Diagram, crossings: tuple[int, ...], screened: Diagram,
                 search_budget: float) -> bool:
    """Write the crossing changes, then the Seifert surface of the knot left; checked as a movie.
    Where the movie's own simplification lands on a diagram of larger Seifert genus than the
    screen's, the movie claims the screen's diagram instead (``isotopic to``; the checker proves it)."""
    chain, after = _change_chain(start, crossings, search_budget)
    if chain is None:
        return False
    genus = len(crossings) + seifert_genus(after)
    if genus == len(crossings) + seifert_genus(screened):
        return _seifert_end(report, knot, chain, genus, after, None, search_budget)
    return _seifert_end(report, knot, chain, len(crossings) + seifert_genus(screened), screened, _spec(screened),
                        search_budget)


def _spec(diagram: Diagram) -> str:
    """The diagram in the notation's ``pd[...]`` form (its crossings as named)."""
    return "pd[" + ",".join("[" + ",".join(map(str, labels)) + "]" for labels in diagram.crossings.values()) + "]"


def _seifert_end(report: SearchResult, knot: str, chain: tuple, genus: int, frame: Diagram, claimed: str | None,
                 search_budget: float) -> bool:
    """The movie: ``chain`` (crossing changes and simplification), optionally ``isotopic to claimed``
    (whose diagram is ``frame``), then Seifert's algorithm on ``frame`` and the circles' deaths."""
    if claimed is not None:
        frame = parse_diagram(claimed)
    if frame.component_count() != 1:
        return False
    moves, circles = seifert_moves(frame)
    lines = [f"title a surface of genus {genus} for {knot}: "
             + (f"{_changes_said(chain)}, then " if chain else "") + "Seifert's algorithm", f"start {knot}"]
    lines += [str(r) for r in chain] + ([f"isotopic to {claimed}"] if claimed else [])
    lines += [str(r) for r in moves] + [f"death {c}" for c in sorted(circles.components)]
    lines.append(f"surface connected, genus {genus}")
    text = "\n".join(lines) + "\n"
    checked = check_movie(text, budget=search_budget)
    if checked.verdict != "verified":
        return False
    report.genus, report.movie, report.verdict = genus, text, checked.verdict
    report.bands = tuple(str(r) for r in tuple(chain) + moves if getattr(r, "kind", "") == "band")
    return True


def _changes_said(chain: tuple) -> str:
    count = sum(1 for r in chain if getattr(r, "kind", "") == "band" and r.twists)
    return f"{count} crossing change{'s' if count != 1 else ''}"


def _fall_back(report: SearchResult, knot: str, start: Diagram, fallback, search_budget: float, done):
    """After the band search: the least genus built by construction, written and checked."""
    genus, crossings, screened = fallback
    why = report.why
    if crossings:
        written = _changed_end(report, knot, start, crossings, screened, search_budget)
    else:
        written = _seifert_end(report, knot, (), genus, start, None, search_budget)
    if written:
        report.why = (f"{why}; " if why else "") + (
            f"no surface of genus {report.genus - 1} or less was found; the surface of genus {report.genus} "
            "given is built by crossing changes and Seifert's algorithm")
    return done()


def _single_changes(frame: Diagram):
    """(moves, knot left) for each crossing changed by its genus-one piece."""
    for crossing in sorted(frame.crossings):
        changed = crossing_change_moves(frame, crossing)
        if changed is not None:
            yield changed


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
               budget: float, how: str = "found by the band search") -> bool:
    """Finish at a slice knot instead of the unknot: the genus-one pieces, then a ribbon disk for
    the knot they leave (found by the ribbon search), written as one movie and checked."""
    if not _looks_slice(after):
        return False
    from movies.checker.ribbon import find_ribbon_disk

    spec = _spec(after)
    disk = find_ribbon_disk(spec, budget=SLICE_END_BUDGET, search_budget=min(budget, 1.0))
    if disk.verdict != "verified" or not disk.movie:
        return False
    steps = [line for line in disk.movie.splitlines()
             if line.strip() and not line.startswith(("title", "start", "surface", "%"))]
    lines = [f"title a surface of genus {genus} for {knot}, {how}", f"start {knot}"]
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
