"""Where the surface of a movie lives: the 4-manifold, its class there, and the inequalities.

A movie from L₀ to L₁ sweeps a surface in a cobordism W from the 3-sphere holding L₀ (incoming)
to the one holding L₁ (outgoing): S³ × I, with one blow-up for each twist step. A +1
(right-handed) twist is what the strands get, going outward, when a −1-framed unknot around them
is blown down, so in W it is a CP²-bar summand; a −1 twist is a CP² summand.

The 4-manifold is named the way the field states results, "a link in the boundary of X bounds
a surface in X", with the link on the boundary with its usual orientation:

- a movie that starts empty: the last frame bounds the surface in B⁴ ∪ W, oriented as built
  (a +1 twist is a CP²-bar summand);
- a movie that ends empty (and starts with a link): the first frame lies on the boundary of
  W ∪ B⁴ with the opposite orientation, so it bounds the surface in X = −(W ∪ B⁴): a +1 twist is
  a **CP²** summand, a −1 twist a CP²-bar summand, and squares change sign;
- a movie between two links: W itself, a cobordism from the first frame to the last;
- a movie from empty to empty: the closed manifold S⁴ # ..., oriented as built.

The inequalities (s over every field, each with its source) are those of the cobordism W, which
do not depend on how it is named: for S³ × I, B⁴ and S⁴ the s-inequalities of Beliakova–Wehrli;
through blow-ups of one hand, Ren's inequality; through blow-ups of both hands, none.

>>> from movies.surface.tracker import Blowup
>>> place = ambient(start_empty=False, end_empty=True, blowups=[Blowup(0, +1, 0, 2)])
>>> place.name, place.reading, place.definite
('B^4 # CP^2', 'bounded by the start', 'positive definite')
>>> ambient(start_empty=True, end_empty=False, blowups=[Blowup(3, -1, 0, 2)]).name
'B^4 # CP^2'

References
----------
Q. Ren, "Lee filtration structure of torus links" (2023), Cor. 1.4.
P. Ozsváth, Z. Szabó, "Knot Floer homology and the four-ball genus" (2003), Thm. 1.1.
A. Beliakova, S. Wehrli, "Categorification of the colored Jones polynomial and Rasmussen
invariant of links" (2008).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Sequence

from movies.bounds.inequalities import Bound, blown_up_bounds, cobordism_bounds
from movies.surface.tracker import Blowup

__all__ = ["Summand", "Ambient", "ambient", "twist_for", "applicable_bounds", "SUMMANDS", "READINGS"]

CP2, CP2_BAR = "CP^2", "CP^2-bar"
SUMMANDS = (CP2_BAR, CP2)
#: how the name is to be read, for each shape of movie
READINGS = {
    (False, False): "from the start to the end",
    (True, False): "bounded by the end",
    (False, True): "bounded by the start",
    (True, True): "closed",
}


def _reversed(start_empty: bool, end_empty: bool) -> bool:
    """The named orientation is opposite to W's exactly when the first frame is the boundary."""
    return end_empty and not start_empty


def twist_for(summand: str, start_empty: bool, end_empty: bool) -> int:
    """The twist step (+1 or −1) that passes through ``summand`` as the 4-manifold is named.

    >>> twist_for("CP^2-bar", start_empty=False, end_empty=True)   # K bounds in punctured CP²-bar
    -1
    >>> twist_for("CP^2-bar", start_empty=False, end_empty=False)  # a cobordism in (S³ × I) # CP²-bar
    1
    """
    if summand not in SUMMANDS:
        raise ValueError(f"a summand is {CP2_BAR} or {CP2}, not {summand!r}")
    bar = summand == CP2_BAR
    return -1 if bar == _reversed(start_empty, end_empty) else 1


@dataclass(frozen=True)
class Summand:
    """One blow-up of the named 4-manifold: the twist step it comes from and the class there.

    ``algebraic`` is the surface's entry aᵢ (strands through the gate counted with the surface's
    orientation); ``square`` is the square of the exceptional class as named: −1 for CP²-bar.
    """

    step: int  # index into the transitions
    twist: int
    name: str
    algebraic: int
    strands: int

    @property
    def square(self) -> int:
        return -1 if self.name == CP2_BAR else 1


@dataclass(frozen=True)
class Ambient:
    """The 4-manifold a surface lives in, named for the link on its boundary.

    ``base`` is ``S^3 x I``, ``B^4`` or ``S^4``; ``reading`` says which link is on the boundary
    (:data:`READINGS`); ``orientable`` decides whether the class is integral or only mod 2.
    """

    base: str
    reading: str
    summands: tuple[Summand, ...] = ()
    orientable: bool = True

    @property
    def name(self) -> str:
        return " # ".join([self.base] + [s.name for s in self.summands])

    @property
    def definite(self) -> str | None:
        """``negative definite`` (only CP²-bar), ``positive definite``, ``indefinite``; None
        without blow-ups."""
        kinds = {s.name for s in self.summands}
        if not kinds:
            return None
        if len(kinds) > 1:
            return "indefinite"
        return "negative definite" if kinds == {CP2_BAR} else "positive definite"

    @property
    def homology_class(self) -> list[int]:
        """(a₁, …, a_k); entries mod 2 when the surface is not orientable."""
        if not self.orientable:
            return [s.algebraic % 2 for s in self.summands]
        return [s.algebraic for s in self.summands]

    @property
    def square(self) -> int | None:
        """Σ aᵢ² times the square of each exceptional class (None without an orientation)."""
        if not self.orientable:
            return None
        return sum(s.square * s.algebraic ** 2 for s in self.summands)

    @property
    def null_homologous(self) -> bool:
        return not any(self.homology_class)

    def sentence(self) -> str:
        """How the report says it.

        >>> Ambient("B^4", "bounded by the start").sentence()
        'in B^4, bounded by the start'
        """
        return f"in {self.name}, {self.reading}"

    def as_json(self) -> dict:
        return {
            "lives_in": self.name,
            "reading": self.reading,
            "definite": self.definite,
            "blowups": [{"step": s.step + 1, "summand": s.name, "turns": s.twist, "strands": s.strands,
                         "algebraic": s.algebraic} for s in self.summands],
            "class": self.homology_class,
            "square": self.square,
            "null_homologous": self.null_homologous,
        }


def ambient(start_empty: bool, end_empty: bool, blowups: Sequence[Blowup] = (), orientable: bool = True) -> Ambient:
    """The 4-manifold of a movie with these ends and twist steps, named for its boundary link.

    Parameters
    ----------
    start_empty, end_empty : bool
        Whether the first and the last frame are empty.
    blowups : sequence of Blowup
        The twist steps, in order (from :func:`movies.surface.tracker.surface_of`).
    orientable : bool
        Whether the surface is orientable (else its class is taken mod 2).

    Returns
    -------
    Ambient

    >>> from movies.surface.tracker import Blowup
    >>> place = ambient(False, False, [Blowup(0, +1, 2, 2)])
    >>> place.name, place.reading, place.square
    ('S^3 x I # CP^2-bar', 'from the start to the end', -4)
    """
    base = "S^4" if start_empty and end_empty else "B^4" if start_empty or end_empty else "S^3 x I"
    flip = _reversed(start_empty, end_empty)
    summands = tuple(
        Summand(b.step, b.turns, CP2_BAR if (b.turns > 0) != flip else CP2, b.algebraic, b.strands)
        for b in blowups
    )
    return Ambient(base, READINGS[(start_empty, end_empty)], summands, orientable)


def applicable_bounds(
    place: Ambient,
    s: dict[str, dict[str, int]],
    mirror_s: dict[str, dict[str, int]],
    euler: int,
    meets_start: bool,
    meets_end: bool,
) -> tuple[list[Bound], list[str]]:
    """The s-inequalities that hold for an oriented surface in ``place``, and notes on the choice.

    ``s`` and ``mirror_s`` map ``"start"``/``"end"`` to s over each field (of the ends and of
    their mirrors). Without blow-ups: the cobordism inequalities; with twists of one hand:
    Ren's, with A = Σ(aᵢ² − |aᵢ|); with both hands: none, and a note says why.

    >>> place = ambient(False, True, [Blowup(0, +1, 0, 2)])
    >>> bounds, notes = applicable_bounds(place, {"start": {"Q": 2}, "end": {"Q": 1}},
    ...                                   {"start": {"Q": -2}, "end": {"Q": 1}}, 1, True, False)
    >>> [(b.lhs, b.rhs, b.holds) for b in bounds]
    [(3, 1, True)]
    """
    args = (s["start"], s["end"], mirror_s["start"], mirror_s["end"], euler, meets_start, meets_end)
    if not place.summands:
        return cobordism_bounds(*args), []
    turns = {x.twist for x in place.summands}
    excess = sum(x.algebraic ** 2 - abs(x.algebraic) for x in place.summands)
    if len(turns) > 1:
        return [], [f"{place.name} is indefinite (CP² and CP²-bar summands), so s gives no bound for this surface"]
    return blown_up_bounds(*args, turns, excess), [
        f"the surface passes through blow-ups: only Ren's inequality applies, with A = sum(a_i^2 - |a_i|) = {excess}"]
