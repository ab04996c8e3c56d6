"""Checking a movie: replay every step on the diagrams, then judge every claim.

Replay moves from frame to frame through the step vocabulary (:mod:`movies.diagram.steps`) and
the Reidemeister search, keeping the frames, what each step did to the components and where it
acted; :mod:`movies.checker.judge` then judges the checkpoints, the surface, the claims and the
bounds. The result is plain data (:class:`~movies.checker.result.CheckResult`).

>>> from movies.language.movie import parse_movie
>>> result = check_movie(parse_movie('''start unknot
... R1 add 1 left +
... R1 remove 1
... death 1
... surface disk'''))
>>> result.verdict, result.surface.euler_characteristic, len(result.frames)
('verified', 1, 4)
"""

from __future__ import annotations

import math

from movies import limits
from movies.checker import search
from movies.checker.distinguish import first_difference
from movies.checker.judge import Expectation, judge
from movies.checker.result import REFUTED, CheckResult, Finding, StepRecord
from movies.diagram.handles import (HandleDiagram, capped, carried, fiber_of, keep_off, pieces, pulled, pushed, slid, swept,
                                   slid_past_strand)
from movies.diagram.model import Diagram
from movies.diagram.steps import MoveRecord, Places, Transition, growth, identity_transition, perform, places_named
from movies.errors import InputError, LocatedLimitError, MoveError
from movies.language.files import read_movie
from movies.language.movie import MOVE_KINDS, Movie, Statement
from movies.wording import plural


def _names_in(diagram: Diagram) -> str:
    def short(values) -> str:
        values = sorted(values)
        return ", ".join(map(str, values)) if values else "none"

    return (
        f"edges {short(diagram.edges())}; crossings {short(diagram.crossings)}; "
        f"faces {short(diagram.faces)}; components {short(diagram.components)}"
    )


class _Replay:
    def __init__(self, movie: Movie, budget: float) -> None:
        self.movie = movie
        self.result = CheckResult(movie)
        self.budget = budget
        self.frame = movie.start
        self.result.frames.append(self.frame)
        self.number = 0
        self.handles = movie.handles  # the current frame's handles (a movie in #ʳ S¹×S²), or None
        if movie.handles is not None:
            self.result.handle_frames.append(self.handles)

    def find(self, kind: str, statement: Statement, message: str, evidence: str = "", step: int | None = None,
             about: str = "") -> None:
        self.result.findings.append(
            Finding(kind, step if step is not None else (self.number or None), statement.line, statement.column,
                    message, evidence, about)
        )

    def record(self, statement: Statement, certified: bool, note: str = "", found: tuple[str, ...] = ()) -> None:
        self.result.steps.append(
            StepRecord(self.number, statement.line, statement.kind, statement.source.split("%")[0].strip(),
                       self.frame.crossing_count(), self.frame.component_count(), certified, note, found)
        )

    def run(self) -> tuple[CheckResult, list[Expectation]]:
        """Every step in order, until one does not apply; the ``expect`` lines met on the way."""
        expectations: list[Expectation] = []
        for statement in self.movie.statements:
            if statement.kind == "budget":
                self.budget = statement.args["seconds"]
            elif statement.kind in MOVE_KINDS:
                self.number += 1
                if not self.step(statement):
                    break
            elif statement.kind == "expect":
                expectations.append(Expectation(statement, len(self.result.frames) - 1, self.number, self.budget))
        return self.result, expectations

    # -------------------------------------------------------------- steps

    def step(self, statement: Statement) -> bool:
        before = self.frame
        try:
            if self.movie.handles is not None:
                self.admit(statement)
            elif statement.kind in ("cap", "slide", "pull", "push"):
                raise MoveError(f"'{statement.kind}' is a step of a movie with handles; this one starts without any "
                                "(write the first frame as 'DIAGRAM with handle across ...')")
            if statement.kind == "simplify":
                self.result.places.append(Places())
                new, transition, certified, note, found = self.simplify(statement)
            elif statement.kind == "isotopic":
                self.result.places.append(Places())
                new, transition, certified, note, found = self.isotopic(statement)
            else:
                record = statement.record
                self.check_size(statement, record, before)
                self.result.places.append(places_named(record))  # what the step names, until it applies
                outcome = perform(record, before)
                new, transition, note, self.result.places[-1] = (outcome.diagram, outcome.transition, outcome.note,
                                                                  outcome.places)
                certified, found = True, ()
                if self.movie.handles is not None:
                    next_handles = self.carry(record, outcome)
        except MoveError as err:
            self.find("invalid", statement, f"step {self.number} ({statement.kind}) does not apply: {err}",
                      f"frame {self.number - 1} has {_names_in(before)}")
            return False
        self.frame = new
        self.result.frames.append(new)
        self.result.transitions.append(transition)
        self.record(statement, certified, note, found)
        if self.movie.handles is not None:
            if statement.kind not in ("simplify", "isotopic"):
                self.handles = next_handles
            self.result.handle_frames.append(self.handles)
        return True

    # -------------------------------------------------------------- handles

    def admit(self, statement: Statement) -> None:
        """Refuse, before it is made, a step a movie with handles cannot take."""
        kind = statement.kind
        if self.result.caps and kind != "cap":
            raise MoveError("after a fiber cap only more caps may follow: the surface's part in the product ends at "
                            "the fibers, which the cocores of the 2-handles cap off")
        if kind == "twist":
            raise MoveError("a twist step in a movie with handles is not offered: at a gate it is a Dehn twist along "
                            "the handle's sphere, a diffeomorphism and not an isotopy (see the language reference), "
                            "and away from the gates it would add blow-ups to the product")
        if kind == "isotopic":
            claimed = statement.args["handles"]
            if claimed is None or len(claimed.gates) != len(self.handles.gates):
                raise MoveError("in a movie with handles an isotopy claim names the handles too ('isotopic to DIAGRAM "
                                f"with handle across ...'), as many as the frame has ({len(self.movie.handles.gates)})")
        if kind == "death":
            component = statement.record.component
            if component in self.frame.components:
                edges = set(self.frame.components[component])
                for index, gate in enumerate(self.handles.gates, start=1):
                    if edges & set(gate.edges):
                        raise MoveError(f"component {component} passes through handle {index}, so it bounds no disk "
                                        "there: pull it back off the handle first if it turns straight back, or, "
                                        "as a fiber, cap it with 'cap fiber C' in the boundary sum of B^2 x S^2")
        if kind == "cap":
            if self.movie.lives != "B2xS2":
                raise MoveError("a fiber cap is a disk through a 2-handle of the boundary sum of B^2 x S^2: say "
                                "'in B2xS2' in the movie")
            fiber_of(self.handles, statement.record.component)

    def carry(self, record: MoveRecord, outcome) -> HandleDiagram:
        """The handles after a step (a handle move, a fiber cap, or a step beside the handles)."""
        if record.kind == "slide":
            if record.crossing is not None:
                return slid(self.handles, record.handle, record.crossing)
            return slid_past_strand(self.handles, record.handle, record.crossings)
        if record.kind == "pull":
            return pulled(self.handles, record.handle, record.edge)
        if record.kind == "push":
            return pushed(self.handles, record.handle, record.edge, record.face)
        if record.kind == "cap":
            handle, direction = fiber_of(self.handles, record.component)
            self.result.caps.append((self.number - 1, handle, direction))
            return capped(self.handles, record.component, outcome.diagram)
        keep_off(self.handles, record, f"'{record}'")
        return carried(self.handles, outcome.diagram, pieces(record, self.frame, outcome.diagram),
                       outcome.reversed_edges, swept(record, self.frame, outcome.diagram), band=record.kind == "band",
                       leaving=record.leaving)

    def check_size(self, statement: Statement, record: MoveRecord, before: Diagram) -> None:
        """Refuse a move whose frame would be past the limits, before it is made."""
        added_crossings, added_components = growth(record)
        crossings = before.crossing_count() + added_crossings
        components = before.component_count() + added_components
        for name, value, what in (("crossings", crossings, "crossings"), ("components", components, "components")):
            if value > limits.current()[name]:
                raise LocatedLimitError(limits.exceeds(name, f"step {self.number} would make a frame of {value} {what}"),
                                        self.movie.text, statement.line, statement.column, name)

    def simplify(self, statement: Statement):
        target = statement.args
        outcome = search.simplify_frame(self.frame, target, self.budget, self.handles)
        found = tuple(outcome.moves)
        if self.handles is not None:
            self.handles_after(outcome.records)
        if outcome.reached:
            note = f"found {plural(len(found), 'Reidemeister move')}"
        else:
            note = (f"the search stopped at {plural(outcome.diagram.crossing_count(), 'crossing')} without reaching "
                    f"{search.describe_target(target)}: {outcome.why}")
            self.find("unproved", statement, f"step {self.number}: {note}; the movie goes on from the diagram it reached")
        transition = identity_transition("simplify", sorted(self.frame.components))
        return outcome.diagram, transition, outcome.reached, note, found

    def isotopic_off_handles(self, statement: Statement):
        """An isotopy claim in a movie with handles: the frame and the claimed diagram, handles included,
        are claimed isotopic in the complement of the handles (so that every L(k) is isotopic to the
        claimed diagram's). No search certifies it; an invariant of some L(k), or the class, refutes it."""
        given, claimed = statement.args["diagram"], statement.args["handles"]
        spec = statement.args["spec"]
        difference = None
        if given == self.frame and claimed.gates == self.handles.gates:
            links = tuple((k, k, True) for k in sorted(self.frame.components))
            self.handles = claimed
            return given, Transition("isotopic", links=links), True, "the same diagram with the same handles", ()
        if self.handles.homology_class() != claimed.homology_class():
            difference = (f"their classes in H_1: {self.handles.homology_class()} and {claimed.homology_class()}")
        else:
            from movies.bounds.handles import MOVIE_TWISTS
            from movies.diagram.handles import twisted

            for k in MOVIE_TWISTS:
                found = first_difference(twisted(self.handles, k), twisted(claimed, k))
                if found is not None:
                    difference = f"{found} of the approximations at k = {k}"
                    break
        if difference is not None:
            self.find("false", statement, f"step {self.number}: the frame is not isotopic to {spec} off the handles",
                      f"they differ in {difference}", about="isotopy step")
        else:
            self.find("unproved", statement, f"step {self.number}: isotopic to {spec} off the handles is unproved",
                      "no search runs between diagrams with handles; the class and every invariant of the "
                      "approximations L(k), k = -2 ... 2, agree", about="isotopy step")
        self.handles = claimed
        if self.frame.component_count() != given.component_count():
            return given, Transition("isotopic", links=(), ended=tuple(self.frame.components),
                                     started=tuple(given.components)), False, "refuted", ()
        pairs = zip(sorted(self.frame.components), sorted(given.components))
        matched = "components matched in order of their names"
        note = (f"{REFUTED}: they differ in {difference}; the movie goes on from the claimed diagram, {matched}"
                if difference is not None else f"unproved; the movie goes on from the claimed diagram ({matched})")
        return given, Transition("isotopic", links=tuple((a, b, True) for a, b in pairs)), False, note, ()

    def handles_after(self, moves) -> None:
        """Carry the handles along the moves a search found, refusing any that touches a gate."""
        frame, handles = self.frame, self.handles
        for move in moves:
            done = perform(move, frame)
            frame, handles = done.diagram, carried(handles, done.diagram, pieces(move, frame, done.diagram),
                                                   sweeps=swept(move, frame, done.diagram))
        self.handles = handles

    def isotopic(self, statement: Statement):
        if self.movie.handles is not None:
            return self.isotopic_off_handles(statement)
        if statement.args["handles"] is not None:
            raise MoveError("this movie has no handles, so the claimed diagram cannot have any")
        given = statement.args["diagram"]
        outcome = search.certify(self.frame, given, self.budget)
        if outcome.certified:
            links = tuple((k, outcome.components[k], True) for k in sorted(self.frame.components))
            return given, Transition("isotopic", links=links), True, "certified by Reidemeister moves", tuple(outcome.moves)
        difference = first_difference(self.frame, given)
        if difference is not None:
            self.find("false", statement, f"step {self.number}: the frame is not isotopic to {statement.args['spec']}",
                      f"they differ in {difference}", about="isotopy step")
        else:
            self.find("unproved", statement, f"step {self.number}: isotopic to {statement.args['spec']} is unproved",
                      f"the search found no Reidemeister moves between them: {outcome.why}; every invariant agrees",
                      about="isotopy step")
        if self.frame.component_count() != given.component_count():
            # the claim is false, and the surface cannot be followed through it
            return given, Transition("isotopic", links=(), ended=tuple(self.frame.components),
                                     started=tuple(given.components)), False, "refuted", ()
        pairs = zip(sorted(self.frame.components), sorted(given.components))
        matched = "components matched in order of their names"
        if difference is not None:
            note = f"{REFUTED}: they differ in {difference}; the movie goes on from the claimed diagram, {matched}"
        else:
            note = (f"the search found no Reidemeister moves to the claimed diagram: {outcome.why}; every invariant "
                    f"agrees, and the movie goes on from the claimed diagram ({matched})")
        return given, Transition("isotopic", links=tuple((a, b, True) for a, b in pairs)), False, note, ()

def replay(movie: Movie, budget: float = search.DEFAULT_BUDGET) -> tuple[CheckResult, list[Expectation]]:
    """Replay a parsed movie's steps without judging it: the frames, steps and findings so far,
    and the ``expect`` lines met on the way (for :func:`movies.checker.judge.judge`).

    >>> from movies.language.movie import parse_movie
    >>> result, _ = replay(parse_movie("start unlink(2)\\nband 1 2"))
    >>> [frame.component_count() for frame in result.frames]
    [2, 1]
    """
    return _Replay(movie, budget).run()


def check_movie(movie, budget: float = search.DEFAULT_BUDGET, bounds: bool = True) -> CheckResult:
    """Replay a movie and judge it.

    Parameters
    ----------
    movie : str, os.PathLike or Movie
        The movie's text, a path to a movie file, or a movie from
        :func:`movies.language.movie.parse_movie` (see :func:`movies.language.files.read_movie`).
    budget : float
        Seconds each search (simplify steps, isotopy claims) may take, unless the movie sets
        its own with ``budget N seconds``.
    bounds : bool
        Also judge the surface by the s-inequalities (:mod:`movies.bounds.verdicts`).

    Returns
    -------
    CheckResult
        Its ``verdict`` is ``verified``, ``conditional``, ``contradicted`` or ``invalid``.

    >>> check_movie("start unknot\\ndeath 1\\nsurface disk").verdict
    'verified'
    >>> check_movie("examples/movies/trefoil-concordance.movie").verdict
    'verified'

    Raises :class:`~movies.errors.InputError` for a budget that is not a number of seconds
    (negative, not a number, infinite), and :class:`~movies.errors.LocatedLimitError` for a
    budget or a step whose frame would be past the limits of :mod:`movies.limits`.
    """
    if isinstance(budget, bool) or not isinstance(budget, (int, float)) or not 0 <= budget < float("inf"):
        raise InputError(f"a budget is a number of seconds, 0 or more, not {budget!r}")
    limits.check("seconds", math.ceil(budget), f"a budget of {budget} seconds would let one search run {budget} seconds")
    replayed, expectations = replay(read_movie(movie), budget)
    return judge(replayed, expectations, bounds)
