"""Random links with handles and random steps that keep off them, for the tests and the benchmarks."""

from __future__ import annotations

import statistics
import time

from movies.checker import search
from movies.checker.ribbon import band_candidates
from movies.diagram.handles import carried, handle_diagram, keep_off, pieces, swept, twisted
from movies.diagram.isotopy import same_on_sphere
from movies.diagram.moves.twist import gate_path
from movies.diagram.steps import MoveRecord, perform
from movies.errors import MoveError


def balanced_gate(diagram, rng):
    """A gate across two edges of one face running opposite ways through it (a = 0), as
    ``(edges, start face)``, or None."""
    faces = sorted(diagram.faces)
    rng.shuffle(faces)
    for face in faces:
        edges = sorted({side.edge for cycle in diagram.faces[face] for side in cycle})
        rng.shuffle(edges)
        for first in edges:
            for second in edges:
                if first == second:
                    continue
                start = [f for f in diagram.faces_beside(first) if f != face]
                if not start:
                    continue
                try:
                    _, directions = gate_path(diagram, [first, second], start[0])
                except MoveError:
                    continue
                if sum(directions) == 0:
                    return [first, second], start[0]
    return None


def random_steps(link, rng, count, most_crossings=None, tries=20, on_gates=False):
    """Up to ``count`` random steps (kinks, births, bands, fingers) that the checker accepts in a
    movie with the handles of ``link``, found by trying; the records and the handles after each
    (the first is ``link``). Unless ``on_gates``, only steps that touch no edge a gate crosses."""
    records, frames = [], [link]
    for _ in range(count * tries):
        if len(records) == count:
            break
        d = frames[-1].diagram
        kind = rng.choice(["R1+", "birth", "band", "R2+"])
        try:
            if kind == "R1+":
                record = MoveRecord("R1+", edge=rng.choice(sorted(d.edges())), hand=rng.choice("LR"),
                                    sign=rng.choice((1, -1)))
            elif kind == "birth":
                record = MoveRecord("birth", face=rng.choice(sorted(d.faces)))
            else:
                face = rng.choice(sorted(d.faces))
                around = sorted({side.edge for cycle in d.faces[face] for side in cycle})
                if len(around) < 2:
                    continue
                a, b = rng.sample(around, 2)
                record = (MoveRecord("band", first=a, second=b, face=face) if kind == "band"
                          else MoveRecord("R2+", over=a, under=b, face=face))
            outcome = perform(record, d)
            if most_crossings is not None and outcome.diagram.crossing_count() > most_crossings:
                continue
            crossed = {edge for gate in frames[-1].gates for edge in gate.edges}
            if not on_gates and crossed & set(outcome.places.edges):
                continue
            keep_off(frames[-1], record, "a random step")
            after = carried(frames[-1], outcome.diagram, pieces(record, d, outcome.diagram), outcome.reversed_edges,
                            swept(record, d, outcome.diagram), band=record.kind == "band")
        except MoveError:
            continue
        records.append(record)
        frames.append(after)
    return records, frames


def random_link_with_a_handle(diagram, rng):
    """``diagram`` with one balanced handle, or None when no face gives one."""
    gate = balanced_gate(diagram, rng)
    return None if gate is None else handle_diagram(diagram, [gate])


def median_time(work, rounds: int):
    """The median of ``rounds`` timings of ``work()``, and its last value."""
    times, value = [], None
    for _ in range(rounds):
        started = time.perf_counter()
        value = work()
        times.append(time.perf_counter() - started)
    return statistics.median(times), value


def approximation(link, frame, k):
    """L(k) of a frame with handles, or the frame itself once no handle has a strand through it."""
    return twisted(link, k) if link is not None else frame


def approximations_related(kind, record, before, after, k, budget=10.0):
    """Whether L(k) after a step comes from L(k) before it by a step of the same kind, proved by
    moves: the same record (the diagrams equal on the sphere), or else, for a band, some band
    across one face followed by Reidemeister moves the search certifies, and for a Reidemeister
    move, slide, pull-back or simplify, an isotopy the search certifies.

    ``before`` and ``after`` are (handles or None, frame)."""
    a, b = approximation(*before, k), approximation(*after, k)
    if record is not None:
        try:
            if same_on_sphere(perform(record, a).diagram, b):
                return True
        except MoveError:
            pass
    if kind == "band":  # an untwisted band across one face first, then with half twists (a turn-back is drawn
        # straightened in L(k), so the band across it carries the twists the handle put on it)
        for twists in (0, 2, -2, 1, -1, 4, -4):
            for band in band_candidates(a):
                band = MoveRecord("band", first=band.first, second=band.second, face=band.face, twists=twists or None)
                try:
                    moved = perform(band, a).diagram
                except MoveError:
                    continue
                if moved.component_count() == b.component_count() and search.certify(moved, b, budget).certified:
                    return True
        return False
    if kind in ("birth", "death"):
        return False
    return search.certify(a, b, budget).certified
