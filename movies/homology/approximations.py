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
from movies.errors import DiagramError, InternalError, NotNullHomologousError, NotTwoDivisibleError
from movies.homology.families import family_khovanov, family_s

__all__ = ["Limit", "SSequence", "KhovanovTable", "NotNullHomologousError", "NotTwoDivisibleError", "s_of_handles",
           "khovanov_of_handles", "twist_normalisation"]


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
    values: dict[str, dict[int, int]] = {field: {} for field in fields}
    for direction in (1, -1):
        # one scan per direction: the common part once, then one full twist after another
        def certified(k: int, found: dict, direction=direction) -> bool:
            for field in fields:
                values[field][k] = found[field]
            return k != 0 and all(found[f] == values[f][0] - direction * width for f in fields)

        family_s(link, direction * most, fields, stop=certified)
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


@dataclass(frozen=True)
class KhovanovTable:
    """Kh(L(k)) over one field, normalised at the twist regions, and where it agrees with its neighbour.

    ``stable`` lists the homological degrees in which this table equals the one for the computed
    k next to it on the way to 0 (k − 1 for k > 0, k + 1 for k < 0); empty for k = 0.
    """

    k: int
    ranks: dict[tuple[int, int], int]
    stable: tuple[int, ...]

    def as_json(self) -> dict:
        return {"k": self.k, "ranks": [[i, j, r] for (i, j), r in sorted(self.ranks.items())],
                "stable_degrees": list(self.stable)}


def twist_normalisation(link: HandleDiagram, k: int | Sequence[int]) -> tuple[int, int]:
    """The shift (h, q) that takes the usual Khovanov grading of L(k) to the one in which the
    identity resolution of every twist region sits in bidegree (0, 0).

    The usual grading shifts the bracket by [−n₋]{n₊ − 2n₋} over all crossings; here the crossings
    outside the twist regions keep that shift, and each twist region's own crossings are shifted
    so that the resolution that leaves its strands parallel (the 0-smoothing of a right-handed
    twist, the 1-smoothing of a left-handed one) is in degree (0, 0). A full twist crosses each
    pair of strands twice: positively for a right-handed twist on strands running the same way.

    >>> from movies.diagram.handles import fibers
    >>> twist_normalisation(fibers(1, 1), 2), twist_normalisation(fibers(1, 1), -2)
    ((4, 8), (-4, -8))
    """
    ks = [k] * len(link.gates) if isinstance(k, int) else list(k)
    dh = dq = 0
    for directions, turns in zip(link.directions, ks):
        same = sum(1 for i, a in enumerate(directions) for b in directions[i + 1:] if a == b)
        opposite = len(directions) * (len(directions) - 1) // 2 - same
        agree, against = 2 * abs(turns) * same, 2 * abs(turns) * opposite
        positive, negative = (agree, against) if turns > 0 else (against, agree)
        identity = 0 if turns >= 0 else agree + against  # bracket degree of the parallel resolution
        dh += negative - identity
        dq += 2 * negative - positive - identity
    return dh, dq


def khovanov_of_handles(link: HandleDiagram, ks: Sequence[int], field: str = "Q") -> list[KhovanovTable]:
    """Kh(L(k)) for each k, normalised so that each twist region's identity resolution is in
    bidegree (0, 0), with the homological degrees that agree with the neighbouring k marked.

    As k grows the tables settle in more and more homological degrees; the marks say which
    degrees agree across the computed range, not that they stay so beyond it.

    Parameters
    ----------
    link : HandleDiagram
        A 2-divisible link in #ʳ S¹×S² (an even number of strands through every handle).
    ks : sequence of int
        The k to compute.
    field : str
        ``"Q"`` or ``"F<p>"``.

    Returns
    -------
    list of KhovanovTable
        In the order of ``ks``.

    >>> from movies.diagram.handles import fibers
    >>> [(t.k, sorted(t.ranks), t.stable) for t in khovanov_of_handles(fibers(1, 1), [1, 2])]
    [(1, [(0, -2), (0, 0), (2, 2), (2, 4)], ()), (2, [(0, -2), (0, 0), (2, 2), (3, 6), (4, 6), (4, 8)], (0, 1))]
    """
    from movies.homology.khovanov import khovanov_homology

    if not link.two_divisible():
        raise NotTwoDivisibleError(
            "Khovanov homology of a link in #^r S^1 x S^2 is defined when an even number of strands passes "
            "through every handle; strands through each handle here: "
            + ", ".join(str(len(g.edges)) for g in link.gates))
    tables: dict[int, dict[tuple[int, int], int]] = {}
    computed: dict[int, dict] = {}
    for direction in (1, -1):  # one scan per direction, from L(0) to the farthest k asked for
        farthest = max((direction * k for k in ks), default=0)
        if farthest > 0:
            computed.update(family_khovanov(link, direction * farthest, field))
    for k in ks:
        dh, dq = twist_normalisation(link, k)
        found = computed[k] if k in computed else khovanov_homology(twisted(link, k), field)
        tables[k] = {(i + dh, j + dq): r for (i, j), r in found.items() if r}
    result = []
    for k in ks:
        before = k - 1 if k > 0 else k + 1
        stable: tuple[int, ...] = ()
        if k != 0 and before in tables:
            present = {i for i, _ in tables[k]} | {i for i, _ in tables[before]}
            degrees = range(min(present), max(present) + 1) if present else range(0)  # zero rows agree too
            stable = tuple(i for i in degrees
                           if {j: r for (h, j), r in tables[k].items() if h == i}
                           == {j: r for (h, j), r in tables[before].items() if h == i})
        result.append(KhovanovTable(k, tables[k], stable))
    return result
