"""s of a null-homologous link in #ʳ S¹×S², from its twisted approximations L(k) in S³.

For a link L in M_r drawn with handles (:mod:`movies.diagram.handles`), L(k) has k full twists
at every handle. Two facts about the S³ numbers s(L(k)) make their limits computable:

- **monotone**: L(k) → L(k+1) is a cobordism through one blow-up around a bundle with a = 0,
  so s(L(k+1)) ≤ s(L(k)) (Ren's inequality);
- **bounded**: pairing the 2p strands of a bundle by p bands and undoing the twist gives a
  cobordism L(0) → L(k) with χ = −2P (P = Σ pᵢ) whose components meet both ends, so
  |s(L(k)) − s(L(0))| ≤ 2P.

So s₊ = lim s(L(k)) as k → +∞ and s₋ = lim as k → −∞ exist, with s₊ ≤ s₋. A limit is
**certified** when the sequence reaches the end of the window (s(L(0)) − 2P for s₊, s(L(0)) + 2P
for s₋): from there on it cannot move. Otherwise what is proved is an interval, and that is what
is reported; a value is never printed as s unless it is certified. Both facts are checked on
every computation, and a violation is an internal error, never an answer.

>>> from movies.diagram.handles import fibers
>>> found = s_of_handles(fibers(1, 1), fields=("Q",), most=2)["Q"]
>>> found.values, found.plus, found.minus
({0: -1, 1: -1, 2: -1, -1: 1}, Limit(low=-3, high=-1, at=None), Limit(low=1, high=1, at=-1))

References
----------
C. Manolescu, M. Marengon, S. Sarkar, M. Willis, "A generalization of Rasmussen's invariant,
with applications to surfaces in some four-manifolds" (2019); Q. Ren, "Lee filtration structure
of torus links" (2023), Cor. 1.4.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Sequence

from movies.diagram.handles import HandleDiagram, twisted
from movies.errors import DiagramError, InternalError, NotNullHomologousError
from movies.homology.links import link_s_values

__all__ = ["Limit", "SSequence", "NotNullHomologousError", "s_of_handles"]


@dataclass(frozen=True)
class Limit:
    """What is proved about a limit of s(L(k)): it lies in [low, high]; certified when they meet.

    ``at`` is the k at which the sequence reached the end of the window (None if it did not).
    """

    low: int
    high: int
    at: int | None = None

    @property
    def certified(self) -> bool:
        return self.low == self.high

    def as_json(self) -> dict:
        return {"low": self.low, "high": self.high, "certified": self.certified, "reached_at_k": self.at}


@dataclass(frozen=True)
class SSequence:
    """s(L(k)) over one field for the k computed, the window, and what it proves of s₊ and s₋."""

    field: str
    values: dict[int, int]
    floor: int
    ceiling: int
    plus: Limit
    minus: Limit

    def as_json(self) -> dict:
        return {"sequence": [[k, self.values[k]] for k in sorted(self.values)], "window": [self.floor, self.ceiling],
                "s_plus": self.plus.as_json(), "s_minus": self.minus.as_json()}


def s_of_handles(link: HandleDiagram, fields: Sequence[str] = ("Q", "F2"), most: int = 3) -> dict[str, SSequence]:
    """s(L(k)) for k = 0, ±1, … up to ±``most`` (stopping early on each side once the limit is
    certified), and the intervals they prove for s₊ and s₋, over each field.

    Parameters
    ----------
    link : HandleDiagram
        A null-homologous link in #ʳ S¹×S², with its orientation.
    fields : sequence of str
        ``"Q"``, ``"F2"``, ``"F3"``, ...
    most : int
        The largest |k| computed.

    Returns
    -------
    dict
        field -> :class:`SSequence`.

    Raises
    ------
    NotNullHomologousError
        For a link whose class is not zero (naming the class and the orientations that are).
    InternalError
        If a computed sequence is not monotone or leaves the window (a bug, never an answer).
    """
    if not link.null_homologous():
        orientations = link.null_homologous_orientations()
        shown = "; ".join("as given" if not o else "reverse " + ", ".join(map(str, o)) for o in orientations[:6])
        raise NotNullHomologousError(
            f"s is defined for null-homologous links only; this one has class {link.homology_class()}"
            + (f"; these orientations are null-homologous: {shown}" if orientations else
               "; no orientation is null-homologous (an odd number of strands passes through some handle)"))
    if most < 1:
        raise DiagramError(f"the largest |k| is 1 or more, not {most}")
    fields = list(fields)
    width = sum(len(gate.edges) for gate in link.gates)  # 2P
    start = link_s_values(link.diagram, fields)
    values = {field: {0: start[field]} for field in fields}
    for direction in (1, -1):
        open_fields = list(fields)
        for step in range(1, most + 1):
            k = direction * step
            found = link_s_values(twisted(link, k), open_fields)
            for field in open_fields:
                values[field][k] = found[field]
            open_fields = [f for f in open_fields if values[f][k] != start[f] - direction * width]
            if not open_fields:
                break
    return {field: _judge(field, values[field], width) for field in fields}


def _judge(field: str, values: dict[int, int], width: int) -> SSequence:
    ks = sorted(values)
    floor, ceiling = values[0] - width, values[0] + width
    for a, b in zip(ks, ks[1:]):
        if values[b] > values[a]:
            raise InternalError(f"s(L(k)) over {field} rose from {values[a]} at k = {a} to {values[b]} at k = {b}, "
                                "but it cannot increase with k")
    for k in ks:
        if not floor <= values[k] <= ceiling:
            raise InternalError(f"s(L({k})) over {field} is {values[k]}, outside the window [{floor}, {ceiling}]")
    top, bottom = max(ks), min(ks)
    plus_at = next((k for k in ks if k >= 0 and values[k] == floor), None)
    minus_at = next((k for k in reversed(ks) if k <= 0 and values[k] == ceiling), None)
    plus = Limit(floor, floor, plus_at) if plus_at is not None else Limit(floor, values[top])
    minus = Limit(ceiling, ceiling, minus_at) if minus_at is not None else Limit(values[bottom], ceiling)
    return SSequence(field, dict(sorted(values.items(), key=lambda item: (item[0] < 0, abs(item[0])))), floor,
                     ceiling, plus, minus)
