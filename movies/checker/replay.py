"""Checking a movie: replay every step on the diagrams, judge every claim, keep the surface.

The result is plain data (:class:`CheckResult`): the frames, one record per step, the
surface, the findings (an invalid step, a false claim, an unproved claim) and the verdict.

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
from dataclasses import dataclass, field

from movies import limits
from movies.checker import search
from movies.diagram.steps import MoveRecord, Places, growth, perform, places_named
from movies.diagram.constructors import unlink
from movies.bounds.ambient import Ambient
from movies.bounds.verdicts import BoundsReport, surface_ambient, surface_bounds
from movies.diagram.model import Diagram
from movies.errors import InputError, InternalError, InternalInconsistency, LocatedLimitError, MoveError, MoviesError
from movies.invariants.alexander import alexander_polynomial, determinant
from movies.checker.distinguish import first_difference
from movies.invariants.jones import jones_polynomial
from movies.invariants.signature import signature
from movies.language.files import read_movie
from movies.wording import plural
from movies.language.movie import MOVE_KINDS, Movie, Statement
from movies.diagram.steps import Transition, identity_transition
from movies.surface.tracker import Surface, surface_of

#: how a step note begins when the step is a claim shown false
REFUTED = "FALSE"

#: the four verdicts, best first
VERIFIED, CONDITIONAL, CONTRADICTED, INVALID = "verified", "conditional", "contradicted", "invalid"

VERDICT_MEANING = {
    VERIFIED: "every step checked and every claim proved",
    CONDITIONAL: "every step checked; some isotopy claims are unproved but agree on every invariant",
    CONTRADICTED: "a checkpoint or claim is false",
    INVALID: "a step is not a legal move",
}


@dataclass(frozen=True)
class Finding:
    """Something the report must say: ``kind`` is ``invalid``, ``false`` or ``unproved``."""

    kind: str
    step: int | None  # step number (1, 2, ...), None for claims about the whole surface
    line: int
    column: int
    message: str
    evidence: str = ""
    #: "isotopy step" for a claim the movie goes on from (the surface rests on it)
    about: str = ""


@dataclass(frozen=True)
class StepRecord:
    """One step of the movie as checked."""

    number: int
    line: int
    kind: str
    source: str
    crossings: int
    components: int
    certified: bool
    note: str = ""
    found: tuple[str, ...] = ()  # moves the checker found (simplify, isotopy claims), as text


@dataclass(frozen=True)
class Checkpoint:
    """One ``expect`` line as judged: ``outcome`` is ``holds``, ``false`` or ``unproved``."""

    line: int
    claim: str
    outcome: str
    detail: str


@dataclass(frozen=True)
class Claim:
    """One fact of a ``surface`` line as judged: ``holds`` is True, False, or None (not shown)."""

    fact: str
    value: int | None
    holds: bool | None
    detail: str

    @property
    def text(self) -> str:
        return self.fact if self.value is None else f"{self.fact} {self.value}"


@dataclass
class CheckResult:
    """Everything the checker learned about one movie."""

    movie: Movie
    frames: list[Diagram] = field(default_factory=list)
    steps: list[StepRecord] = field(default_factory=list)
    findings: list[Finding] = field(default_factory=list)
    checkpoints: list[Checkpoint] = field(default_factory=list)
    claims: list[Claim] = field(default_factory=list)
    surface: Surface | None = None
    transitions: list[Transition] = field(default_factory=list)
    places: list[Places] = field(default_factory=list)  # where each step acts, in the frame before it
    bounds: BoundsReport | None = None  # once judged

    def ambient(self) -> Ambient:
        """The 4-manifold the surface lives in, named for its boundary link."""
        return surface_ambient(self.movie.start, self.frames[-1], self.surface)

    @property
    def verdict(self) -> str:
        kinds = {f.kind for f in self.findings}
        if "invalid" in kinds:
            return INVALID
        if "false" in kinds:
            return CONTRADICTED
        if "unproved" in kinds:
            return CONDITIONAL
        return VERIFIED

    @property
    def verified(self) -> bool:
        return self.verdict == VERIFIED

    @property
    def complete(self) -> bool:
        """True when every step was replayed (no invalid step stopped the replay)."""
        return not any(f.kind == "invalid" for f in self.findings)


def _names_in(diagram: Diagram) -> str:
    def short(values) -> str:
        values = sorted(values)
        return ", ".join(map(str, values)) if values else "none"

    return (
        f"edges {short(diagram.edges())}; crossings {short(diagram.crossings)}; "
        f"faces {short(diagram.faces)}; components {short(diagram.components)}"
    )


def _checkpoint(statement: Statement, outcome: str, detail: str) -> Checkpoint:
    return Checkpoint(statement.line, statement.source.split("%")[0].strip(), outcome, detail)


class _Replay:
    def __init__(self, movie: Movie, budget: float, with_bounds: bool = True) -> None:
        self.with_bounds = with_bounds
        self.movie = movie
        self.result = CheckResult(movie)
        self.budget = budget
        self.frame = movie.start
        self.result.frames.append(self.frame)
        self.number = 0

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

    def run(self) -> CheckResult:
        for statement in self.movie.statements:
            if statement.kind == "budget":
                self.budget = statement.args["seconds"]
            elif statement.kind in MOVE_KINDS:
                self.number += 1
                if not self.step(statement):
                    break
            elif statement.kind == "expect":
                self.expect(statement)
        result = self.result
        if result.complete:
            result.surface = surface_of(sorted(self.movie.start.components), result.transitions)
            for statement in self.movie.claims:
                for fact, value in statement.args["facts"]:
                    self.claim(statement, fact, value)
            if self.with_bounds:
                self.judge_bounds()
        return result

    def judge_bounds(self) -> None:
        report = surface_bounds(self.movie.start, self.result.frames[-1], self.result.surface)
        self.result.bounds = report
        violated = report.violated
        if not violated:
            return
        claims = [f for f in self.result.findings if f.about == "isotopy step"]
        if not claims:
            raise InternalInconsistency(
                "a movie whose every step was checked breaks the inequality "
                f"'{violated[0].statement}' ({violated[0].lhs} < {violated[0].rhs}); this cannot happen, "
                "so it is a bug of this program: please report it with the movie"
            )
        listed = "; ".join(f"line {f.line}: {f.message}" for f in claims)
        last = self.movie.statements[-1]
        self.result.findings.append(Finding(
            "false", None, last.line, last.column,
            f"no such surface exists: {violated[0].statement} fails ({violated[0].lhs} < {violated[0].rhs}), "
            "so one of the isotopy claims the movie goes on from is false",
            listed,
        ))

    # -------------------------------------------------------------- steps

    def step(self, statement: Statement) -> bool:
        before = self.frame
        try:
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
        except MoveError as err:
            self.find("invalid", statement, f"step {self.number} ({statement.kind}) does not apply: {err}",
                      f"frame {self.number - 1} has {_names_in(before)}")
            return False
        self.frame = new
        self.result.frames.append(new)
        self.result.transitions.append(transition)
        self.record(statement, certified, note, found)
        return True

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
        outcome = search.simplify_frame(self.frame, target, self.budget)
        found = tuple(outcome.moves)
        if outcome.reached:
            note = f"found {plural(len(found), 'Reidemeister move')}"
        else:
            note = (f"the search stopped at {plural(outcome.diagram.crossing_count(), 'crossing')} without reaching "
                    f"{search.describe_target(target)}: {outcome.why}")
            self.find("unproved", statement, f"step {self.number}: {note}; the movie goes on from the diagram it reached")
        transition = identity_transition("simplify", sorted(self.frame.components))
        return outcome.diagram, transition, outcome.reached, note, found

    def isotopic(self, statement: Statement):
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

    # -------------------------------------------------------------- checkpoints

    def expect(self, statement: Statement) -> None:
        a = statement.args
        frame = self.frame
        what = a["what"]
        here = f"after step {self.number}" if self.number else "at the start"
        if what in ("components", "crossings"):
            actual = frame.component_count() if what == "components" else frame.crossing_count()
            self._judge(statement, actual == a["value"], f"{what} {a['value']}",
                        f"the frame {here} has {plural(actual, what[:-1])}")
        elif what == "crossingless":
            self._judge(statement, frame.is_crossingless(), "crossingless", f"the frame {here} has {frame.crossing_count()} crossings")
        elif what in ("unlink", "isotopic"):
            target = unlink(frame.component_count()) if what == "unlink" else a["diagram"]
            label = "an unlink" if what == "unlink" else f"isotopic to {a['spec']}"
            if what == "unlink" and frame.is_crossingless():
                self.result.checkpoints.append(_checkpoint(statement, "holds", "the frame is crossingless"))
                return
            outcome = search.certify(frame, target, self.budget)
            if outcome.certified:
                self.result.checkpoints.append(_checkpoint(statement, "holds", "certified by Reidemeister moves"))
                return
            difference = first_difference(frame, target)
            if difference is not None:
                self.result.checkpoints.append(_checkpoint(statement, "false", f"they differ in {difference}"))
                self.find("false", statement, f"the frame {here} is not {label}", f"they differ in {difference}")
            else:
                why = f"the search found no Reidemeister moves between them: {outcome.why}; every invariant agrees"
                self.result.checkpoints.append(_checkpoint(statement, "unproved", why))
                self.find("unproved", statement, f"the frame {here} being {label} is unproved", why)
        else:
            compute = {"signature": signature, "writhe": lambda d: d.writhe(), "determinant": determinant,
                       "jones": jones_polynomial, "alexander": alexander_polynomial}[what]
            try:
                actual = compute(frame)
            except InternalError:
                raise
            except MoviesError as err:
                self.find("false", statement, f"the {what} of the frame {here} is not defined: {err}")
                return
            self._judge(statement, actual == a["value"], f"{what} {a['value']}", f"the frame {here} has {what} {actual}")

    def _judge(self, statement: Statement, holds: bool, claim: str, detail: str) -> None:
        self.result.checkpoints.append(_checkpoint(statement, "holds" if holds else "false", detail))
        if not holds:
            self.find("false", statement, f"expected {claim}", detail)

    # -------------------------------------------------------------- claims about the surface

    def claim(self, statement: Statement, fact: str, value: int | None) -> None:
        s = self.result.surface
        if s is None:  # pragma: no cover - claims are judged only after a complete replay
            raise InternalError("a surface claim was judged before the surface was known")
        comps = s.components
        if fact == "disk":
            holds = len(comps) == 1 and comps[0].orientable and comps[0].euler_characteristic == 1 and comps[0].boundary == 1
            detail = _shape(s)
        elif fact == "connected":
            holds, detail = s.connected, f"the surface has {plural(len(comps), 'component')}"
        elif fact == "components":
            holds, detail = len(comps) == value, f"the surface has {plural(len(comps), 'component')}"
        elif fact == "ribbon":
            holds, detail = ribbon_shown(self.result.movie.start.is_empty(), self.frame.is_empty(), s)
        elif fact == "orientable":
            holds, detail = s.orientable, "orientable" if s.orientable else "a band makes it non-orientable"
        elif fact == "genus":
            genera = [c.genus for c in comps]
            holds = all(g is not None for g in genera) and sum(genera) == value
            detail = f"genus {'+'.join(str(g) for g in genera)}" if all(g is not None for g in genera) else "not orientable"
        elif fact == "euler":
            holds, detail = s.euler_characteristic == value, f"Euler characteristic {s.euler_characteristic}"
        else:  # pragma: no cover
            raise InternalError(f"a surface fact the checker does not know: {fact}")
        self.result.claims.append(Claim(fact, value, holds, detail))
        said = fact if value is None else f"{fact} {value}"
        if holds is None:
            self.find("unproved", statement, f"the surface is claimed to be {said}: not shown by this movie", detail,
                      step=None)
        elif not holds:
            self.find("false", statement, f"the surface is claimed to be {said}", detail, step=None)


def ribbon_shown(start_empty: bool, end_empty: bool, surface: Surface) -> tuple[bool | None, str]:
    """Whether the movie shows its surface to be ribbon in the 4-ball: True, or None (not shown).

    A surface in B⁴ is ribbon when the distance from the centre has no local maxima on it. A
    movie from a link to nothing shows that when it has no births (read inward, a birth is a
    local maximum); one from nothing to a link, when it has no deaths. A movie with births may
    still draw a surface isotopic to a ribbon one, so this is never a contradiction.

    >>> from movies.surface.tracker import surface_of, Transition
    >>> ribbon_shown(False, True, surface_of([1], [Transition("death", ended=(1,), deaths=1)]))
    (True, 'no births: the movie read inward has no local maxima')
    """
    if surface.blowups:
        return None, "the surface passes through blow-ups, not the 4-ball"
    if start_empty == end_empty:
        return None, "ribbon is said of a surface in the 4-ball: a movie from a link to nothing or from nothing to a link"
    if end_empty:
        if surface.births == 0:
            return True, "no births: the movie read inward has no local maxima"
        return None, f"the movie has {plural(surface.births, 'birth')} (local maxima read inward)"
    if surface.deaths == 0:
        return True, "no deaths: the movie read outward has no local maxima"
    return None, f"the movie has {plural(surface.deaths, 'death')} (local maxima read outward)"


def _shape(s: Surface) -> str:
    parts = []
    for c in s.components:
        kind = f"genus {c.genus}" if c.orientable else plural(c.crosscaps, "crosscap")
        parts.append(f"{kind}, {plural(c.boundary, 'boundary circle')}")
    return "; ".join(parts) if parts else "empty"


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
    return _Replay(read_movie(movie), budget, bounds).run()
