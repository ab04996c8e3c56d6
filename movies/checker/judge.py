"""Judging a replayed movie: its checkpoints, the surface, the claims about it, and the bounds.

Replay (:mod:`movies.checker.replay`) only moves from frame to frame; everything that is a
claim about a frame or about the surface is judged here, afterwards, from the frames it kept.
Each judgement is a typed record in the :class:`~movies.checker.result.CheckResult`; a judgement
that fails adds a finding. Findings of the steps and of the checkpoints stay in the order of
their lines; those about the whole surface come after them.

>>> from movies.checker.replay import check_movie
>>> [c.outcome for c in check_movie("start unknot\\nexpect crossings 0\\nexpect components 2").checkpoints]
['holds', 'false']
"""

from __future__ import annotations

from dataclasses import dataclass

from movies.bounds.handles import movie_bounds
from movies.bounds.verdicts import BoundsReport, surface_bounds
from movies.checker import search
from movies.checker.distinguish import first_difference
from movies.checker.result import CheckResult, Checkpoint, Claim, Finding
from movies.diagram.constructors import unlink
from movies.errors import InternalError, InternalInconsistency, MoviesError
from movies.invariants.alexander import alexander_polynomial, determinant
from movies.invariants.jones import jones_polynomial
from movies.invariants.signature import signature
from movies.language.movie import MANIFOLDS, Statement
from movies.surface.tracker import Surface, surface_of
from movies.wording import plural

__all__ = ["Expectation", "judge", "ribbon_shown"]


@dataclass(frozen=True)
class Expectation:
    """An ``expect`` line met during replay: the frame it is about and the budget then in force."""

    statement: Statement
    frame: int  # index into the frames
    step: int  # the number of the last step before it (0 at the start)
    budget: float


def _checkpoint(statement: Statement, outcome: str, detail: str) -> Checkpoint:
    return Checkpoint(statement.line, statement.source.split("%")[0].strip(), outcome, detail)


def judge(result: CheckResult, expectations: list[Expectation], with_bounds: bool = True) -> CheckResult:
    """Judge a replayed movie in place and return it.

    Parameters
    ----------
    result : CheckResult
        From replay: frames, transitions, places, step records and the findings of the steps.
    expectations : list of Expectation
        The ``expect`` lines replay passed, each with its frame.
    with_bounds : bool
        Also judge the surface by the s-inequalities (:mod:`movies.bounds.verdicts`).

    Returns
    -------
    CheckResult
        The same result with checkpoints, and, when every step was replayed, the surface, the
        claims and the bounds.

    >>> from movies.checker.replay import check_movie
    >>> check_movie("start unknot\\ndeath 1\\nsurface genus 1").findings[0].message
    'the surface is claimed to be genus 1'
    """
    judging = _Judging(result)
    for expectation in expectations:
        judging.expect(expectation)
    result.findings.sort(key=lambda finding: finding.line)  # steps and checkpoints in reading order
    if result.complete:
        result.surface = surface_of(sorted(result.movie.start.components), result.transitions)
        for statement in result.movie.claims:
            for fact, value in statement.args["facts"]:
                judging.claim(statement, fact, value)
        if with_bounds:
            judging.bounds()
    return result


class _Judging:
    def __init__(self, result: CheckResult) -> None:
        self.result = result

    def find(self, kind: str, statement: Statement, message: str, evidence: str = "", step: int | None = None) -> None:
        self.result.findings.append(Finding(kind, step, statement.line, statement.column, message, evidence))

    def bounds(self) -> None:
        result = self.result
        if result.movie.handles is not None:
            report = self.handle_bounds()
        else:
            report = surface_bounds(result.movie.start, result.frames[-1], result.surface)
        result.bounds = report
        violated = report.violated
        if not violated:
            return
        claims = [f for f in result.findings if f.about == "isotopy step"]
        if not claims:
            raise InternalInconsistency(
                "a movie whose every step was checked breaks the inequality "
                f"'{violated[0].statement}' ({violated[0].lhs} < {violated[0].rhs}); this cannot happen, "
                "so it is a bug of this program: please report it with the movie"
            )
        listed = "; ".join(f"line {f.line}: {f.message}" for f in claims)
        last = result.movie.statements[-1]
        result.findings.append(Finding(
            "false", None, last.line, last.column,
            f"no such surface exists: {violated[0].statement} fails ({violated[0].lhs} < {violated[0].rhs}), "
            "so one of the isotopy claims the movie goes on from is false",
            listed,
        ))

    def handle_bounds(self) -> BoundsReport:
        """For a movie with handles: the S³ inequalities between the twisted approximations, for
        every k of :data:`~movies.bounds.handles.MOVIE_TWISTS`, of the part of the surface in the
        product (up to the fiber caps)."""
        result = self.result
        report = BoundsReport()
        if result.surface is None:
            report.notes.append("no surface: the movie stops at an invalid step")
            return report
        lives = result.movie.lives
        if lives in ("S1xB3", "B2xS2") and not (result.frames[-1].is_empty() or result.frames[0].is_empty()):
            last = result.movie.statements[-1] if result.movie.statements else result.movie.start_statement
            result.findings.append(Finding("false", None, last.line, last.column,
                                           f"the movie says its surface lives in the boundary sum of "
                                           f"{MANIFOLDS[lives]}, but it neither starts nor ends empty", ""))
        cut = result.caps[0][0] if result.caps else len(result.transitions)
        part = surface_of(sorted(result.movie.start.components), result.transitions[:cut])
        end = result.handle_frames[cut]
        if not part.orientable or not part.oriented_by_start:
            report.notes.append("the surface is not oriented compatibly with the start, so the s-inequalities do not "
                                "apply")
            return report
        if part.end_reversed:
            from movies.diagram.constructors import reverse
            from movies.diagram.handles import regated

            end = regated(end, reverse(end.diagram, part.end_reversed))
            report.notes.append(f"the frame is drawn against the orientation the surface induces on components "
                                f"{', '.join(map(str, part.end_reversed))}; s is taken for the induced one")
        report.bounds, values = movie_bounds(result.movie.handles, end, part.euler_characteristic,
                                             part.every_component_meets_start, part.every_component_meets_end)
        report.s = {"start": values[0]["start"], "end": values[0]["end"]}
        report.notes.append(
            "s of the start and the end are those of the diagrams as drawn (k = 0); the bounds hold for every k, since "
            "a movie that keeps off the handles is, for every k, a movie in S^3 between the twisted approximations"
            + (f"; the end is the frame before the fiber caps (step {cut + 1}), and each cap adds a disk" if result.caps
               else ""))
        tight = [b for b in report.bounds if b.tight]
        if tight and part.connected:
            report.least_genus.append(f"the inequality '{tight[0].statement}' is an equality: no connected oriented "
                                      "surface of this kind between these ends has larger Euler characteristic")
        return report

    # -------------------------------------------------------------- checkpoints

    def expect(self, expectation: Expectation) -> None:
        statement = expectation.statement
        a = statement.args
        frame = self.result.frames[expectation.frame]
        what = a["what"]
        number = expectation.step
        here = f"after step {number}" if number else "at the start"
        if what in ("components", "crossings"):
            actual = frame.component_count() if what == "components" else frame.crossing_count()
            self._judge(statement, number, actual == a["value"], f"{what} {a['value']}",
                        f"the frame {here} has {plural(actual, what[:-1])}")
        elif what == "crossingless":
            self._judge(statement, number, frame.is_crossingless(), "crossingless",
                        f"the frame {here} has {frame.crossing_count()} crossings")
        elif what in ("unlink", "isotopic"):
            target = unlink(frame.component_count()) if what == "unlink" else a["diagram"]
            label = "an unlink" if what == "unlink" else f"isotopic to {a['spec']}"
            if what == "unlink" and frame.is_crossingless():
                self.result.checkpoints.append(_checkpoint(statement, "holds", "the frame is crossingless"))
                return
            outcome = search.certify(frame, target, expectation.budget)
            if outcome.certified:
                self.result.checkpoints.append(_checkpoint(statement, "holds", "certified by Reidemeister moves"))
                return
            difference = first_difference(frame, target)
            if difference is not None:
                self.result.checkpoints.append(_checkpoint(statement, "false", f"they differ in {difference}"))
                self.find("false", statement, f"the frame {here} is not {label}", f"they differ in {difference}", number or None)
            else:
                why = f"the search found no Reidemeister moves between them: {outcome.why}; every invariant agrees"
                self.result.checkpoints.append(_checkpoint(statement, "unproved", why))
                self.find("unproved", statement, f"the frame {here} being {label} is unproved", why, number or None)
        else:
            compute = {"signature": signature, "writhe": lambda d: d.writhe(), "determinant": determinant,
                       "jones": jones_polynomial, "alexander": alexander_polynomial}[what]
            try:
                actual = compute(frame)
            except InternalError:
                raise
            except MoviesError as err:
                self.find("false", statement, f"the {what} of the frame {here} is not defined: {err}", step=number or None)
                return
            self._judge(statement, number, actual == a["value"], f"{what} {a['value']}", f"the frame {here} has {what} {actual}")

    def _judge(self, statement: Statement, number: int, holds: bool, claim: str, detail: str) -> None:
        self.result.checkpoints.append(_checkpoint(statement, "holds" if holds else "false", detail))
        if not holds:
            self.find("false", statement, f"expected {claim}", detail, number or None)

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
            holds, detail = ribbon_shown(self.result.movie.start.is_empty(), self.result.frames[-1].is_empty(), s)
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
