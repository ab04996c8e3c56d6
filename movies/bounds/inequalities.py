"""The inequalities that s and the signatures impose on a surface, with both sides as numbers.

For an oriented cobordism Σ in S³ × I from L₀ to L₁ and s over any field (Beliakova–Wehrli
normalisation, s(∅) = 1):

- every component of Σ meets L₀:  s(L₁) − s(L₀) ≥ χ(Σ);
- every component of Σ meets L₁:  s(L₀) − s(L₁) ≥ χ(Σ);
- the same two for the mirror movie, from m(L₀) to m(L₁).

A movie that ends empty needs no special case: from L to ∅, s(L) ≤ 1 − χ(Σ).

>>> bounds = cobordism_bounds({"Q": 2}, {"Q": 1}, {"Q": -2}, {"Q": 1}, euler=1,
...                           meets_start=True, meets_end=False)
>>> [(b.lhs, b.rhs, b.holds) for b in bounds]
[(-1, 1, False), (3, 1, True)]
"""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class Bound:
    """One inequality ``lhs ≥ rhs`` as it applies to a surface, with where it comes from."""

    statement: str
    lhs: int
    rhs: int
    field: str
    source: str

    @property
    def holds(self) -> bool:
        return self.lhs >= self.rhs

    @property
    def tight(self) -> bool:
        return self.lhs == self.rhs

    def as_json(self) -> dict:
        return {"statement": self.statement, "lhs": self.lhs, "rhs": self.rhs, "holds": self.holds,
                "tight": self.tight, "field": self.field, "source": self.source}


SOURCE_LINKS = "Beliakova–Wehrli 2008: s bounds the Euler characteristic of oriented cobordisms of links"


def cobordism_bounds(
    s_start: dict[str, int],
    s_end: dict[str, int],
    s_mirror_start: dict[str, int],
    s_mirror_end: dict[str, int],
    euler: int,
    meets_start: bool,
    meets_end: bool,
) -> list[Bound]:
    """The s-inequalities that apply to an oriented surface, for every field given.

    Parameters
    ----------
    s_start, s_end : dict
        s of the first and last frame for each field ("Q", "F2", ...).
    s_mirror_start, s_mirror_end : dict
        s of their mirror images.
    euler : int
        χ(Σ).
    meets_start, meets_end : bool
        Whether every component of Σ meets L₀ (L₁).

    Returns
    -------
    list of Bound
        In the order: movie (meets start, meets end), then mirror movie, field by field.
    """
    bounds: list[Bound] = []
    for field in s_start:
        a, b = s_start[field], s_end[field]
        ma, mb = s_mirror_start[field], s_mirror_end[field]
        if meets_start:
            bounds.append(Bound(f"every component meets the start: s(end) - s(start) >= chi  [{field}]",
                                b - a, euler, field, SOURCE_LINKS))
        if meets_end:
            bounds.append(Bound(f"every component meets the end: s(start) - s(end) >= chi  [{field}]",
                                a - b, euler, field, SOURCE_LINKS))
        if meets_start:
            bounds.append(Bound(f"mirror movie, every component meets the start: s(m end) - s(m start) >= chi  [{field}]",
                                mb - ma, euler, field, SOURCE_LINKS))
        if meets_end:
            bounds.append(Bound(f"mirror movie, every component meets the end: s(m start) - s(m end) >= chi  [{field}]",
                                ma - mb, euler, field, SOURCE_LINKS))
    return bounds


SOURCE_BLOWUPS = ("Q. Ren, 'Lee filtration structure of torus links' (2023), Cor. 1.4: s bounds surfaces "
                  "in negative definite blow-ups of the 4-ball, read here for a cobordism with +1 twists")


def blown_up_bounds(
    s_start: dict[str, int],
    s_end: dict[str, int],
    s_mirror_start: dict[str, int],
    s_mirror_end: dict[str, int],
    euler: int,
    meets_start: bool,
    meets_end: bool,
    turns: set[int],
    excess: int,
) -> list[Bound]:
    """Ren's adjunction inequality in movie form, for a surface through blow-ups.

    ``turns`` holds the signs of the twist steps (a +1 twist is a CP²-bar summand of the cobordism
    W from L₀ to L₁, a −1 twist a CP² summand); ``excess`` is
    A = Σ(aᵢ² − |aᵢ|). Only +1 twists: s(L₁) ≤ s(L₀) − χ + A when every component meets L₁, and
    s(m(L₀)) ≤ s(m(L₁)) − χ + A when every component meets L₀. Only −1 twists: the same for the
    mirror movie (which has only +1 twists). Both signs: none (an empty list).

    >>> [(b.lhs, b.rhs, b.tight) for b in blown_up_bounds({"Q": -1}, {"Q": 1}, {"Q": -1}, {"Q": -1},
    ...     euler=0, meets_start=True, meets_end=True, turns={1}, excess=2)]
    [(0, 0, True), (2, 0, False)]
    """
    if turns != {1} and turns != {-1}:
        return []
    bounds: list[Bound] = []
    plus = turns == {1}
    for field in s_start:
        a, b = s_start[field], s_end[field]
        ma, mb = s_mirror_start[field], s_mirror_end[field]
        if meets_end:
            if plus:
                bounds.append(Bound(f"Ren, +1 twists only, every component meets the end: s(start) - s(end) + A >= chi  [{field}]",
                                    a - b + excess, euler, field, SOURCE_BLOWUPS))
            else:
                bounds.append(Bound(f"Ren, -1 twists only (the mirror movie), every component meets the end: "
                                    f"s(m start) - s(m end) + A >= chi  [{field}]", ma - mb + excess, euler, field,
                                    SOURCE_BLOWUPS))
        if meets_start:
            if plus:
                bounds.append(Bound(f"Ren, +1 twists only, every component meets the start: s(m end) - s(m start) + A >= chi  [{field}]",
                                    mb - ma + excess, euler, field, SOURCE_BLOWUPS))
            else:
                bounds.append(Bound(f"Ren, -1 twists only (the mirror movie), every component meets the start: "
                                    f"s(end) - s(start) + A >= chi  [{field}]", b - a + excess, euler, field,
                                    SOURCE_BLOWUPS))
    return bounds


@dataclass(frozen=True)
class GenusBound:
    """A lower bound for the 4-ball genus of a knot, and the invariant that gives it."""

    invariant: str
    value: int  # the invariant's value
    bound: int  # the lower bound for g4 it gives
    source: str


def four_genus_bounds(s: dict[str, int], signature: int, levine_tristram_max: int) -> list[GenusBound]:
    """Lower bounds for g₄(K) from |s|/2 (each field), |σ|/2 and the largest |σ_ω|/2.

    >>> [(b.invariant, b.bound) for b in four_genus_bounds({"Q": 2, "F2": 2}, -2, 2)]
    [('s over Q', 1), ('s over F2', 1), ('signature', 1), ('Levine–Tristram signature', 1)]
    """
    result = [
        GenusBound(f"s over {field}", value, abs(value) // 2,
                   "Rasmussen 2010: |s(K)| <= 2 g4(K); the same argument holds over any field")
        for field, value in s.items()
    ]
    result.append(GenusBound("signature", signature, abs(signature) // 2,
                             "Murasugi 1965: |sigma(K)| <= 2 g4(K)"))
    result.append(GenusBound("Levine–Tristram signature", levine_tristram_max, levine_tristram_max // 2,
                             "Levine–Tristram signatures at prime-power roots of unity bound 2 g4(K)"))
    return result


def best_genus_bound(bounds: list[GenusBound]) -> GenusBound:
    """The largest lower bound (the first of them on a tie).

    >>> best_genus_bound(four_genus_bounds({"Q": 4}, -2, 4)).invariant
    's over Q'
    """
    return max(bounds, key=lambda b: b.bound)
