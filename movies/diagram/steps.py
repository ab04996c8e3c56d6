"""One vocabulary of steps: a typed record per move, and one outcome shape for all of them.

A :class:`MoveRecord` holds a move's kind and exactly the arguments its function in
:mod:`movies.diagram.moves` takes. The movie reader builds one for every move line, the
Reidemeister search builds one for every move it finds, the checker replays them and the report
draws where they act, all through :func:`perform`, the one place that knows which function each
kind calls. ``str(record)`` is the line of the movie language that writes the move, so a record
found by a search can be pasted into a movie.

:func:`perform` returns an :class:`Outcome`: the new diagram, what the step did to the components
(a :class:`Transition`, which the surface tracker reads), the places it acted on in the frame
before it (:class:`Places`, which the drawing marks), and a note for the report. Nothing
downstream runs a move again to learn any of these. :func:`apply` is the fast path that only
returns the diagram (the search calls it thousands of times).

>>> from movies.diagram.constructors import unknot, unlink
>>> kink = MoveRecord("R1+", edge=1, hand="L", sign=+1)
>>> str(kink), apply(kink, unknot()).crossing_count()
('R1 add 1 left +', 1)
>>> outcome = perform(MoveRecord("band", first=1, second=2), unlink(2))
>>> outcome.transition.links, outcome.places, outcome.note
(((1, 1, True), (2, 1, True)), Places(edges=(1, 2), faces=(2,), crossings=()), 'band across face 2 merges components 1 and 2')

To add a move: its function in :mod:`movies.diagram.moves`, its fields in :data:`FIELDS`, its
text in :meth:`MoveRecord.__str__`, a case in :data:`_CALL`, in :func:`_outcome` and (if it adds
crossings or components) in :func:`growth`, and its grammar rule with a Transformer method in
:mod:`movies.language.movie`.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Callable, Sequence

from movies.diagram import moves
from movies.diagram.model import Diagram
from movies.diagram.moves import NewNames
from movies.errors import InternalError, MoveError
from movies.wording import plural

__all__ = [
    "KINDS", "FIELDS", "MoveRecord", "Transition", "Places", "Outcome",
    "perform", "apply", "identity_transition", "places_named", "growth",
]

#: the fields each kind of move takes, in the order of its function's arguments
FIELDS = {
    "R1+": ("edge", "hand", "sign", "names"),
    "R1-": ("crossing", "kink"),
    "R2+": ("over", "under", "face", "names"),
    "R2-": ("face",),
    "R3": ("face", "names"),
    "band": ("first", "second", "face", "names", "path", "twists", "leaving"),
    "birth": ("face", "counterclockwise", "names"),
    "death": ("component",),
    "cap": ("component",),
    "slide": ("handle", "crossing", "crossings"),
    "pull": ("handle", "edge"),
    "push": ("handle", "edge", "face"),
    "twist": ("edges", "turns", "start_face", "names"),
}
#: every kind of move step
KINDS = tuple(FIELDS)
#: fields a record may leave out
_OPTIONAL = {"kink", "names", "start_face", "path", "twists", "crossings", "leaving"} | {
    "band:face", "birth:counterclockwise", "slide:crossing", "push:face"}
_ALL = ("edge", "hand", "sign", "crossing", "kink", "over", "under", "face", "first", "second",
        "counterclockwise", "component", "edges", "turns", "start_face", "names", "path", "twists", "handle",
        "crossings", "leaving")
#: per kind, the fields it must have and the fields it must not
_REQUIRED = {kind: tuple(name for name in fields if name not in _OPTIONAL and f"{kind}:{name}" not in _OPTIONAL)
             for kind, fields in FIELDS.items()}
_FOREIGN = {kind: tuple(name for name in _ALL if name not in fields) for kind, fields in FIELDS.items()}


@dataclass(frozen=True, order=True)
class MoveRecord:
    """One move step and the exact arguments of its move function.

    ``kind`` is one of :data:`KINDS`; the fields it takes are :data:`FIELDS` of it, the others
    stay ``None``. ``names`` (a :class:`~movies.diagram.moves.NewNames`) chooses the names of what
    the move creates.

    >>> MoveRecord("R2+", over=3, under=5, face=2)
    MoveRecord('R2+', over=3, under=5, face=2)
    >>> MoveRecord("R4", face=1)
    Traceback (most recent call last):
    ...
    movies.errors.MoveError: a move is one of R1+, R1-, R2+, R2-, R3, band, birth, death, cap, slide, pull, push, twist, not 'R4'
    """

    kind: str
    edge: int | None = None
    hand: str | None = None
    sign: int | None = None
    crossing: int | None = None
    kink: int | None = None
    over: int | None = None
    under: int | None = None
    face: int | None = None
    first: int | None = None
    second: int | None = None
    counterclockwise: bool | None = None
    component: int | None = None
    edges: tuple[int, ...] | None = None
    turns: int | None = None
    start_face: int | None = None
    names: NewNames | None = None
    #: a band's path: the edges its core crosses, in order, each (edge, True) over or (edge, False) under
    path: tuple[tuple[int, bool], ...] | None = None
    #: a band's half twists, right-handed for positive numbers
    twists: int | None = None
    #: the handle a slide moves or a strand is pulled back through (1, 2, ...)
    handle: int | None = None
    #: where a strand crossing a handle's whole bundle crosses its strands, in the gate's order
    crossings: tuple[int, ...] | None = None
    #: for a band in a movie with handles: the edges some gates cross afterwards, (handle, edges) each, where
    #: the band could pass on either side of a strand's passage through a handle
    leaving: tuple[tuple[int, tuple[int, ...]], ...] | None = None

    def __post_init__(self) -> None:
        kind = self.kind
        if kind not in FIELDS:
            raise MoveError(f"a move is one of {', '.join(KINDS)}, not {kind!r}")
        values = self.__dict__  # the search makes many records: plain lookups, no getattr
        if kind == "birth" and values["counterclockwise"] is None:
            object.__setattr__(self, "counterclockwise", True)  # circles are born counterclockwise
        for name in _REQUIRED[kind]:
            if values[name] is None:
                raise MoveError(f"a {kind} move needs {name}")
        for name in _FOREIGN[kind]:
            if values[name] is not None:
                raise MoveError(f"a {kind} move takes {', '.join(FIELDS[kind])}, not {name}")
        if kind == "slide" and (values["crossing"] is None) == (values["crossings"] is None):
            raise MoveError("a slide goes past one crossing of two of the handle's strands, or past the crossings of "
                            "one strand with the whole bundle: give crossing or crossings, not both")

    def arguments(self) -> dict[str, object]:
        """The keyword arguments of the move function, in its order.

        >>> MoveRecord("R1-", crossing=4, kink=9).arguments()
        {'crossing': 4, 'kink': 9}
        """
        return {name: getattr(self, name) for name in FIELDS[self.kind]}

    def __repr__(self) -> str:
        args = ", ".join(f"{k}={v!r}" for k, v in self.arguments().items() if v is not None)
        return f"MoveRecord({self.kind!r}, {args})"

    def __str__(self) -> str:
        """The movie-language line that writes this move.

        >>> str(MoveRecord("twist", edges=(4, 9), turns=-1, start_face=2))
        'twist -1 across 4 9 from face 2'
        >>> str(MoveRecord("birth", face=3, counterclockwise=False, names=NewNames(edges=(20,))))
        'birth cw in face 3 new edges 20'
        """
        k = self.kind
        if k == "R1+":
            text = f"R1 add {self.edge} {'left' if self.hand == 'L' else 'right'} {'+' if self.sign > 0 else '-'}"
        elif k == "R1-":
            text = f"R1 remove {self.crossing}" + (f" kink {self.kink}" if self.kink is not None else "")
        elif k == "R2+":
            text = f"R2 add {self.over} over {self.under} in face {self.face}"
        elif k == "R2-":
            text = f"R2 remove face {self.face}"
        elif k == "R3":
            text = f"R3 face {self.face}"
        elif k == "band":
            text = (f"band {self.first} {self.second}"
                    + "".join(f" {'over' if over else 'under'} {edge}" for edge, over in self.path or ())
                    + (f" twisted {self.twists:+d}" if self.twists else "")
                    + (f" in face {self.face}" if self.face is not None else ""))
            if self.leaving:
                return text + _names_text(self.names) + " leaving " + " and ".join(
                    f"handle {handle} across {' '.join(map(str, edges))}" for handle, edges in self.leaving)
        elif k == "birth":
            text = f"birth{'' if self.counterclockwise else ' cw'} in face {self.face}"
        elif k == "death":
            text = f"death {self.component}"
        elif k == "cap":
            text = f"cap fiber {self.component}"
        elif k == "slide":
            text = (f"slide handle {self.handle} past crossing {self.crossing}" if self.crossing is not None
                    else f"slide handle {self.handle} past crossings {' '.join(map(str, self.crossings))}")
        elif k == "pull":
            text = f"pull back edge {self.edge} through handle {self.handle}"
        elif k == "push":
            text = f"push edge {self.edge} through handle {self.handle}" + (
                f" in face {self.face}" if self.face is not None else "")
        else:
            text = (f"twist {self.turns:+d} across {' '.join(map(str, self.edges))}"
                    + (f" from face {self.start_face}" if self.start_face is not None else ""))
        return text + _names_text(self.names)


def _names_text(names: NewNames | None) -> str:
    if names is None:
        return ""
    groups = [f"{kind} {' '.join(map(str, values))}" for kind, values in
              (("edges", names.edges), ("crossings", names.crossings), ("faces", names.faces),
               ("components", names.components)) if values]
    return " new " + ", ".join(groups) if groups else ""


@dataclass(frozen=True)
class Transition:
    """What one step does to the components, as the surface tracker reads it.

    ``links``: (before, after, same orientation) for components that continue (a component
    not named in ``links`` or ``ended`` continues unchanged); ``started``: components that
    appear (births); ``ended``: components that disappear (deaths); ``twisted``: components that
    a band twists (the surface is not orientable there); ``births``, ``deaths``, ``saddles``: the
    Morse points the step adds; ``turns`` (+1 or −1) and ``gate`` ((component, direction ±1) per
    strand) for a twist step, which takes the surface through a blow-up.
    """

    kind: str
    links: tuple[tuple[int, int, bool], ...] = ()
    started: tuple[int, ...] = ()
    ended: tuple[int, ...] = ()
    twisted: tuple[int, ...] = ()
    births: int = 0
    deaths: int = 0
    saddles: int = 0
    turns: int = 0
    gate: tuple[tuple[int, int], ...] = ()


def identity_transition(kind: str, components: Sequence[int]) -> Transition:
    """Every component continues with its orientation (Reidemeister moves, isotopies).

    >>> identity_transition("R2+", [1, 2]).links
    ((1, 1, True), (2, 2, True))
    """
    return Transition(kind, links=tuple((k, k, True) for k in components))


@dataclass(frozen=True)
class Places:
    """Where a step acts, named in the frame before it: what a drawing marks."""

    edges: tuple[int, ...] = ()
    faces: tuple[int, ...] = ()
    crossings: tuple[int, ...] = ()


@dataclass(frozen=True)
class Outcome:
    """Everything one step did: the new frame, the components, the places, a note."""

    diagram: Diagram
    transition: Transition
    places: Places
    note: str = ""
    #: edges (names before the step) that run the other way after it: see SaddleResult
    reversed_edges: tuple[int, ...] = ()


def _chosen(record: MoveRecord) -> dict:
    return {"names": record.names} if record.names is not None else {}


#: the move function each kind calls, with the record's arguments
_CALL: dict[str, Callable[[Diagram, MoveRecord], object]] = {
    "R1+": lambda d, r: moves.r1_add(d, r.edge, r.hand, r.sign, **_chosen(r)),
    "R1-": lambda d, r: moves.r1_remove(d, r.crossing, r.kink),
    "R2+": lambda d, r: moves.r2_add(d, r.over, r.under, r.face, **_chosen(r)),
    "R2-": lambda d, r: moves.r2_remove(d, r.face),
    "R3": lambda d, r: moves.r3(d, r.face, **_chosen(r)),
    "band": lambda d, r: (moves.path_band(d, r.first, r.second, r.path or (), r.face, twists=r.twists or 0,
                                          **_chosen(r)) if r.path or r.twists
                          else moves.saddle(d, r.first, r.second, r.face, **_chosen(r))),
    "birth": lambda d, r: moves.birth(d, r.face, r.counterclockwise, **_chosen(r)),
    "death": lambda d, r: moves.death(d, r.component),
    # a fiber cap removes a crossingless circle as a death does; that it is a fiber of a handle is
    # checked where the handles are known (the replay)
    "cap": lambda d, r: moves.death(d, r.component),
    # sliding a handle moves its gate, not the link: the frame stays; the replay moves the gate
    "slide": lambda d, r: d if all(c in d.crossings for c in _slid_past(r)) else _no_crossing(d, _slid_past(r)),
    # pulling a strand back through a handle moves it off the handle's sphere: the frame stays
    "pull": lambda d, r: d if r.edge in d.edges() else _no_edge(d, r.edge),
    "push": lambda d, r: d if r.edge in d.edges() else _no_edge(d, r.edge),
    "twist": lambda d, r: moves.twist(d, r.edges, r.turns, r.start_face, **_chosen(r)),
}


def _slid_past(record: MoveRecord) -> tuple[int, ...]:
    return (record.crossing,) if record.crossing is not None else record.crossings


def _no_crossing(diagram: Diagram, crossings: tuple[int, ...]):
    missing = next(c for c in crossings if c not in diagram.crossings)
    raise MoveError(f"crossing {missing} is not in the diagram (crossings: {sorted(diagram.crossings)})")


def _no_edge(diagram: Diagram, edge: int):
    raise MoveError(f"edge {edge} is not in the diagram (edges: {', '.join(map(str, diagram.edges()))})")


def apply(record: MoveRecord, diagram: Diagram) -> Diagram:
    """The diagram after one move; raises :class:`~movies.errors.MoveError` where it does not apply.

    >>> from movies.diagram.constructors import unknot
    >>> apply(MoveRecord("R1+", edge=1, hand="R", sign=-1), unknot()).writhe()
    -1
    """
    result = _CALL[record.kind](diagram, record)
    return result if isinstance(result, Diagram) else result.diagram


def perform(record: MoveRecord, diagram: Diagram) -> Outcome:
    """One move with everything it did: see :class:`Outcome`.

    Raises :class:`~movies.errors.MoveError` (with the reason) where the move does not apply.

    >>> from movies.diagram.constructors import unlink
    >>> outcome = perform(MoveRecord("twist", edges=(1, 2), turns=1), unlink(2))
    >>> outcome.diagram.crossing_count(), outcome.transition.gate, outcome.places.faces
    (2, ((1, 1), (2, -1)), (1, 2, 3))
    """
    return _outcome(record, diagram, _CALL[record.kind](diagram, record))


def _outcome(record: MoveRecord, before: Diagram, result) -> Outcome:
    kind = record.kind
    if kind == "band" and (record.path or record.twists):
        crossed = tuple(edge for edge, _ in record.path or ())
        where = (f"along a path through faces {', '.join(map(str, result.faces))}" if crossed
                 else f"across face {result.faces[0]}")
        if record.twists:
            where += f" with {abs(record.twists)} {'right' if record.twists > 0 else 'left'}-handed half twist" + (
                "s" if abs(record.twists) > 1 else "")
        return Outcome(result.diagram, _band_transition(result.saddle),
                       Places(edges=(record.first, record.second) + crossed, faces=result.faces),
                       _band_note(result.saddle, where), result.saddle.reversed_edges)
    if kind == "band":
        return Outcome(result.diagram, _band_transition(result),
                       Places(edges=(record.first, record.second), faces=(result.face,)), _band_note(result),
                       result.reversed_edges)
    if kind == "twist":
        gate = tuple((before.component_of(edge), d) for edge, d in zip(record.edges, result.directions))
        transition = Transition("twist", links=tuple((k, k, True) for k in sorted(before.components)),
                                turns=record.turns, gate=gate)
        return Outcome(result.diagram, transition, Places(edges=tuple(record.edges), faces=tuple(result.gate_faces)),
                       twist_note(record.turns, len(record.edges), result.algebraic))
    if kind == "birth":
        (born,) = sorted(set(result.components) - set(before.components))
        return Outcome(result, Transition("birth", started=(born,), births=1), Places(faces=(record.face,)),
                       f"component {born} is born")
    if kind == "death":
        return Outcome(result, Transition("death", ended=(record.component,), deaths=1),
                       Places(edges=tuple(before.components[record.component])), f"component {record.component} dies")
    if kind == "slide":
        past = _slid_past(record)
        said = (f"crossing {record.crossing}" if record.crossing is not None
                else f"the strand through crossings {', '.join(map(str, past))}")
        return Outcome(result, identity_transition(kind, sorted(before.components)), Places(crossings=past),
                       f"handle {record.handle} slides past {said}")
    if kind == "pull":
        return Outcome(result, identity_transition(kind, sorted(before.components)), Places(edges=(record.edge,)),
                       f"edge {record.edge} is pulled back through handle {record.handle}")
    if kind == "push":
        return Outcome(result, identity_transition(kind, sorted(before.components)), Places(edges=(record.edge,)),
                       f"a finger of edge {record.edge} is pushed through handle {record.handle} and back")
    if kind == "cap":
        return Outcome(result, Transition("cap", ended=(record.component,), deaths=1),
                       Places(edges=tuple(before.components[record.component])),
                       f"fiber {record.component} is capped off by a cocore of a 2-handle")
    return Outcome(result, identity_transition(kind, sorted(before.components)), _reidemeister_places(record, before))


def _reidemeister_places(record: MoveRecord, before: Diagram) -> Places:
    kind = record.kind
    if kind == "R1+":
        left, right = before.faces_beside(record.edge)
        return Places(edges=(record.edge,), faces=(left if record.hand == "L" else right,))
    if kind == "R1-":
        loops = (record.kink,) if record.kink is not None else tuple(moves.kinks_at(before, record.crossing))
        return Places(edges=loops, crossings=(record.crossing,))
    if kind == "R2+":
        return Places(edges=(record.over, record.under), faces=(record.face,))
    if kind in ("R2-", "R3"):
        return Places(faces=(record.face,), crossings=tuple(sorted(set(before.face_crossings(record.face)))))
    raise InternalError(f"no places for a move of kind {kind}")


def growth(record: MoveRecord) -> tuple[int, int]:
    """How many crossings and components a move adds at most, known before it is made.

    The checker compares these with the limits before it performs the move.

    >>> growth(MoveRecord("twist", edges=(1, 2, 3), turns=-1)), growth(MoveRecord("birth", face=1))
    ((6, 0), (0, 1))
    """
    kind = record.kind
    if kind == "twist":
        strands = len(record.edges)
        return abs(record.turns) * strands * (strands - 1), 0
    if kind == "band":
        # two crossings for each edge a band's path crosses, one for each half twist
        return 2 * len(record.path or ()) + abs(record.twists or 0), 0
    return {"R1+": 1, "R2+": 2}.get(kind, 0), int(kind == "birth")


def places_named(record: MoveRecord) -> Places:
    """What a move that did not apply names: its edges, faces and crossings, as written.

    >>> places_named(MoveRecord("R2+", over=4, under=7, face=2))
    Places(edges=(4, 7), faces=(2,), crossings=())
    """
    edges = tuple(v for v in (record.edge, record.first, record.second, record.over, record.under, record.kink)
                  if v is not None) + tuple(record.edges or ()) + tuple(edge for edge, _ in record.path or ())
    faces = tuple(v for v in (record.face, record.start_face) if v is not None)
    crossings = ((record.crossing,) if record.crossing is not None else ()) + tuple(record.crossings or ())
    return Places(edges=edges, faces=faces, crossings=crossings)


def _band_transition(result: moves.SaddleResult) -> Transition:
    """The components before and after a band, with their orientations."""
    before, after = set(result.components_before), set(result.components_after)
    if result.effect == "merge":
        merged = min(result.joined)
        links = tuple((k, merged, k != result.reversed_component) for k in result.joined)
        return Transition("band", links=links, saddles=1)
    if result.effect == "split":
        (old,) = result.joined
        (new,) = after - before
        return Transition("band", links=((old, old, True), (old, new, True)), saddles=1)
    (old,) = result.joined
    return Transition("band", links=((old, old, True),), twisted=(old,), saddles=1)


def _band_note(result: moves.SaddleResult, where: str = "") -> str:
    joined = " and ".join(map(str, result.joined))
    what = {
        "merge": f"merges components {joined}",
        "split": f"splits component {joined} in two",
        "twist": f"twists component {joined} (the band makes the surface non-orientable)",
    }[result.effect]
    if not result.respects_orientation and result.effect == "merge":
        what += f"; it does not respect the orientation, component {result.reversed_component} is reversed"
    return f"band {where or f'across face {result.face}'} {what}"


def twist_note(turns: int, strands: int, algebraic: int) -> str:
    """What a twist step says in the report.

    Which summand the blow-up is (CP² or CP²-bar) depends on which end of the movie is the
    boundary; the surface's report names it (:mod:`movies.bounds.ambient`).

    >>> twist_note(+1, 2, 0)
    'a right-handed full twist on 2 strands (algebraic 0): one blow-up'
    """
    hand = "right" if turns > 0 else "left"
    return f"a {hand}-handed full twist on {plural(strands, 'strand')} (algebraic {algebraic}): one blow-up"
