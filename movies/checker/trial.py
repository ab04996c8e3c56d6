"""Trying a step: what each candidate step would leave, before it is written into a movie.

Finding bands is most of the work of drawing a surface. Given a frame (of a movie, or a diagram)
and candidate steps written in the movie language, each candidate is replayed exactly as
``movies check`` would replay it (the same checks, the handles included), and the frame it
leaves is described: components, crossings, linking numbers, and whether it is an unlink, first
by the invariants (an unlink of n components has the invariants of ``unlink(n)``; agreement proves
nothing), then by the Reidemeister search (crossingless within the budget: then it is one).

>>> from movies.language.spec import parse_diagram
>>> found = try_steps(parse_diagram("unlink(2)"), ["band 1 2", "band 1 7"], budget=1)
>>> [(t.legal, t.components, t.unlink) for t in found]
[(True, 1, 'certified'), (False, None, None)]
>>> found[1].reason
'edge 7 is not in the diagram (edges: [1, 2])'
"""

from __future__ import annotations

from dataclasses import dataclass, field

from movies.checker import search
from movies.checker.distinguish import first_difference
from movies.checker.replay import replay
from movies.diagram.constructors import unlink
from movies.diagram.model import Diagram
from movies.errors import MoviesError
from movies.invariants.summary import classical_invariants
from movies.language.movie import MOVE_KINDS, Movie, parse_movie

__all__ = ["Trial", "try_steps"]


@dataclass
class Trial:
    """One candidate step and what it would leave (``None`` where it does not apply)."""

    step: str
    legal: bool
    reason: str = ""
    note: str = ""
    diagram: Diagram | None = None
    handles: object = None  # the frame's handles after it, for a movie with handles
    components: int | None = None
    crossings: int | None = None
    linking_matrix: list = field(default_factory=list)  # rows and columns in the order of component_names
    component_names: list = field(default_factory=list)
    unlink: str | None = None  # "certified", "invariants agree", "no", or None
    unlink_detail: str = ""
    moves: tuple[str, ...] = ()  # the Reidemeister moves to the crossingless diagram, when found

    def as_json(self) -> dict:
        return {"step": self.step, "legal": self.legal, "reason": self.reason, "note": self.note,
                "components": self.components, "component_names": self.component_names,
                "crossings": self.crossings, "linking_matrix": self.linking_matrix,
                "unlink": self.unlink, "unlink_detail": self.unlink_detail, "moves": list(self.moves),
                **({"handles": [{"edges": list(g.edges), "start_face": g.start_face(self.diagram)}
                                for g in self.handles.gates]} if self.handles is not None else {})}


def try_steps(frame: Diagram, steps: list[str], budget: float = search.DEFAULT_BUDGET, handles=None,
              lives: str | None = None) -> list[Trial]:
    """What each of ``steps`` would leave if it were the next step after ``frame``.

    Parameters
    ----------
    frame : Diagram
        The frame the steps act on, with its names (as ``movies frames`` prints them).
    steps : list of str
        Candidate steps, each one line of the movie language (``band 3 9``, ``R2 remove face 4``, ...).
    budget : float
        Seconds the Reidemeister search may take for each candidate.
    handles : HandleDiagram or None
        The frame's handles, for a frame of a movie with handles: the steps are then checked as
        such a movie checks them.
    lives : str or None
        The movie's ``in`` statement (``"B2xS2"`` allows fiber caps).

    Returns
    -------
    list of Trial
        In the order of ``steps``.
    """
    return [_try(frame, text.strip(), budget, handles, lives) for text in steps]


def _try(frame: Diagram, text: str, budget: float, handles, lives) -> Trial:
    try:
        parsed = parse_movie("start unknot\n" + text)
    except MoviesError as err:
        return Trial(text, False, f"the step does not read: {err}")
    statements = [s for s in parsed.statements if s.kind in MOVE_KINDS]
    if len(statements) != 1 or len(parsed.statements) != 1:
        return Trial(text, False, "give one step (a move, 'simplify' or 'isotopic to ...'), not another statement")
    movie = Movie("", frame, parsed.start_statement, tuple(statements), parsed.text, handles, lives)
    replayed, _ = replay(movie, budget)
    invalid = [f for f in replayed.findings if f.kind == "invalid"]
    if invalid or len(replayed.frames) < 2:
        reason = invalid[0].message.split("does not apply: ", 1)[-1] if invalid else "the step did not apply"
        return Trial(text, False, reason)
    after = replayed.frames[-1]
    facts = classical_invariants(after)
    trial = Trial(text, True, note=replayed.steps[-1].note, diagram=after,
                  handles=replayed.handle_frames[-1] if replayed.handle_frames else None,
                  components=after.component_count(), crossings=after.crossing_count(),
                  linking_matrix=facts["linking_matrix"], component_names=sorted(after.components))
    _judge_unlink(trial, after, budget)
    return trial


def _judge_unlink(trial: Trial, diagram: Diagram, budget: float) -> None:
    if diagram.is_empty() or diagram.is_crossingless():
        trial.unlink, trial.unlink_detail = "certified", "the frame is crossingless"
        return
    difference = first_difference(diagram, unlink(diagram.component_count()))
    if difference is not None:
        trial.unlink, trial.unlink_detail = "no", f"not an unlink: it differs from one in {difference}"
        return
    outcome = search.simplify_frame(diagram, {"target": "crossingless"}, budget)
    if outcome.reached:
        trial.unlink = "certified"
        trial.unlink_detail = f"the Reidemeister search removes every crossing ({len(outcome.moves)} moves)"
        trial.moves = tuple(outcome.moves)
    else:
        trial.unlink = "invariants agree"
        trial.unlink_detail = ("every invariant agrees with the unlink's, but the search did not remove every "
                               f"crossing: {outcome.why}")
