"""What checking a movie produces, as plain typed data: the frames, the steps, the findings, the verdict.

:mod:`movies.checker.replay` fills in the frames, transitions, places and step records;
:mod:`movies.checker.judge` adds the checkpoints, the claims, the surface and the bounds; the
report layer reads the result and computes nothing.

>>> from movies.checker.replay import check_movie
>>> result = check_movie("start unknot\\ndeath 1")
>>> result.verdict, [type(frame).__name__ for frame in result.frames]
('verified', ['Diagram', 'Diagram'])
"""

from __future__ import annotations

from dataclasses import dataclass, field

from movies.bounds.ambient import Ambient
from movies.bounds.handles import HandlePlace, handle_place
from movies.bounds.verdicts import BoundsReport, surface_ambient
from movies.diagram.model import Diagram
from movies.diagram.steps import Places, Transition
from movies.language.movie import Movie
from movies.surface.tracker import Surface

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
    #: for a movie with handles, each frame's handles (None once every gate is capped off)
    handle_frames: list = field(default_factory=list)
    #: for a movie with handles: the fiber caps, (step index, handle, direction) each
    caps: list[tuple[int, int, int]] = field(default_factory=list)

    def ambient(self) -> Ambient | HandlePlace:
        """The 4-manifold the surface lives in, named for its boundary link."""
        handles = self.movie.handles
        if handles is not None:
            caps = [[0, 0] for _ in handles.gates]
            for _, handle, direction in self.caps:
                caps[handle - 1][0 if direction > 0 else 1] += 1
            return handle_place(len(handles.gates), self.frames[-1].is_empty(), self.movie.lives,
                                tuple(tuple(c) for c in caps), handles.homology_class(), self.frames[0].is_empty())
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
