"""Questions without a movie: can an oriented cobordism of genus g join two links?

A cobordism here is an oriented surface in S³ × I with no closed components; it has ``c``
components, each meeting both ends (when one end is empty, each meets the other), and total
genus ``g``, so χ = 2c − 2g − (number of boundary circles). Larger χ is harder to reach, so a
connected cobordism (c = 1) is the easiest to allow; each possible c is answered on its own.

What is asked of each shape:

- the s-inequalities of :func:`~movies.bounds.inequalities.cobordism_bounds` over Q and F₂, for
  the cobordism and for its mirror;
- for two knot ends joined by a connected surface, the signatures: |σ_ω(K₀) − σ_ω(K₁)| ≤ 2g at
  ω = −1 and at the roots of unity of prime-power order tried (Murasugi 1965; Tristram 1969);
  for a knot and the empty end, |σ_ω(K)| ≤ 2g, the 4-genus form. Signature bounds for links
  with several components need their nullities and are not asked here; the answer says so.

>>> from movies.language.spec import parse_diagram
>>> answer = cobordism_question(parse_diagram("3_1"), parse_diagram("empty"), genus=0)
>>> [(shape.components, shape.allowed) for shape in answer.shapes]
[(1, False)]
>>> answer.shapes[0].refuted_by[0]
'every component meets the start: s(end) - s(start) >= chi  [Q]'
"""

from __future__ import annotations

from dataclasses import dataclass, field
from math import gcd

from movies.bounds.ambient import Ambient, ambient, applicable_bounds, twist_for
from movies.bounds.inequalities import Bound, cobordism_bounds
from movies.bounds.verdicts import LEVINE_TRISTRAM_ORDERS, mirror_s_values, s_values
from movies.diagram.model import Diagram
from movies.invariants.signature import is_prime_power, levine_tristram
from movies.surface.tracker import Blowup

__all__ = ["CobordismShape", "CobordismAnswer", "cobordism_question", "blown_up_question", "signature_profile"]

SOURCE_SIGNATURE = ("Murasugi 1965; Tristram 1969: a connected oriented genus-g cobordism between knots "
                    "changes the Levine–Tristram signature at a root of prime-power order by at most 2g")


@dataclass
class CobordismShape:
    """One shape of cobordism (its number of components) and what the invariants say of it."""

    components: int
    euler_characteristic: int
    bounds: list[Bound]

    @property
    def allowed(self) -> bool:
        return all(b.holds for b in self.bounds)

    @property
    def refuted_by(self) -> list[str]:
        return [b.statement for b in self.bounds if not b.holds]

    def as_json(self) -> dict:
        return {"components": self.components, "euler_characteristic": self.euler_characteristic,
                "allowed": self.allowed, "bounds": [b.as_json() for b in self.bounds]}


@dataclass
class CobordismAnswer:
    genus: int
    s: dict  # "first"/"second" -> {field: s}
    mirror_s: dict
    shapes: list[CobordismShape] = field(default_factory=list)
    notes: list[str] = field(default_factory=list)
    place: Ambient | None = None  # the blown-up 4-manifold asked about, if any

    @property
    def allowed_connected(self) -> bool:
        return self.shapes[0].allowed

    @property
    def allowed_some(self) -> bool:
        return any(shape.allowed for shape in self.shapes)


def signature_profile(diagram: Diagram) -> dict[str, int]:
    """σ_ω at ω = e^(2πik/n) for the prime-power orders tried, keyed ``"k/n"`` in lowest terms.

    >>> from movies.language.spec import parse_diagram
    >>> signature_profile(parse_diagram("3_1"))["1/2"]
    -2
    """
    profile: dict[str, int] = {}
    if diagram.is_empty():
        return profile
    for n in (2,) + tuple(LEVINE_TRISTRAM_ORDERS):
        for k in range(1, n):
            g = gcd(k, n)
            key = f"{k // g}/{n // g}"
            if key in profile or not is_prime_power(n // g):
                continue
            profile[key] = levine_tristram(diagram, k, n)
    return profile


def _answer_for(first: Diagram, second: Diagram, genus: int):
    """An empty answer with s of both ends and of their mirrors, and those four values."""
    s1, s2 = s_values(first), s_values(second)
    m1, m2 = mirror_s_values(first, s1), mirror_s_values(second, s2)
    return CobordismAnswer(genus, {"first": s1, "second": s2}, {"first": m1, "second": m2}), (s1, s2, m1, m2)


def _signature_bounds(first: Diagram, second: Diagram, genus: int) -> list[Bound]:
    one, other = signature_profile(first), signature_profile(second)
    keys = sorted(set(one) | set(other), key=lambda key: (key != "1/2", key))
    differences = {key: abs(one.get(key, 0) - other.get(key, 0)) for key in keys}
    bounds = [Bound("signature: 2g >= |sigma(first) - sigma(second)|", 2 * genus, differences["1/2"], "signature",
                    SOURCE_SIGNATURE)]
    worst = max(differences, key=lambda key: differences[key])
    if differences[worst] > differences["1/2"]:
        bounds.append(Bound(f"Levine–Tristram at omega = exp(2 pi i {worst}): 2g >= |sigma_omega(first) - sigma_omega(second)|",
                            2 * genus, differences[worst], "Levine–Tristram", SOURCE_SIGNATURE))
    return bounds


def cobordism_question(first: Diagram, second: Diagram, genus: int, components: int | None = None) -> CobordismAnswer:
    """Whether s and the signatures allow an oriented cobordism of total genus ``genus``.

    Parameters
    ----------
    first, second : Diagram
        The two ends (either may be empty, not both).
    genus : int
        The total genus asked about (0 or more).
    components : int, optional
        Ask about this number of components only; by default every possible number, from 1
        (connected) to the number of components of the smaller nonempty end.

    Returns
    -------
    CobordismAnswer
        s of both ends and their mirrors, one :class:`CobordismShape` per number of components,
        and notes on what was not asked.

    >>> from movies.language.spec import parse_diagram
    >>> answer = cobordism_question(parse_diagram("unlink(2)"), parse_diagram("L2a1{1}"), genus=0)
    >>> [(shape.components, shape.euler_characteristic, shape.allowed) for shape in answer.shapes]
    [(1, -2, True), (2, 0, False)]
    """
    sizes = [d.component_count() for d in (first, second)]
    nonempty = [n for n in sizes if n]
    if not nonempty:
        raise ValueError("both ends are empty: there is no cobordism to ask about")
    most = min(nonempty)
    wanted = range(1, most + 1) if components is None else [components]
    if components is not None and not 1 <= components <= most:
        raise ValueError(f"a cobordism whose every component meets both ends has 1 to {most} components, "
                         f"not {components}")
    answer, (s1, s2, m1, m2) = _answer_for(first, second, genus)
    knots_or_empty = all(n <= 1 for n in sizes)
    for c in wanted:
        euler = 2 * c - 2 * genus - sum(sizes)
        bounds = cobordism_bounds(s1, s2, m1, m2, euler, not first.is_empty(), not second.is_empty())
        if knots_or_empty and c == 1:
            bounds += _signature_bounds(first, second, genus)
        answer.shapes.append(CobordismShape(c, euler, bounds))
    if not knots_or_empty:
        answer.notes.append("signature bounds are asked for knot ends only (for links they need the nullities)")
    return answer


def _without_movie(bound: Bound) -> Bound:
    """Ren's inequality as a question states it: the ends are the first and the second link.

    >>> from movies.bounds.inequalities import SOURCE_BLOWUPS
    >>> _without_movie(Bound("Ren, -1 twists only (the mirror movie), every component meets the start: "
    ...                      "s(end) - s(start) + A >= chi  [Q]", -1, 1, "Q", SOURCE_BLOWUPS)).statement
    "Ren's inequality: s(second) - s(first) + A >= chi  [Q]"
    """
    formula = bound.statement.split(": ", 1)[1].replace("start", "first").replace("end", "second")
    return Bound(f"Ren's inequality: {formula}", bound.lhs, bound.rhs, bound.field, bound.source)


def blown_up_question(first: Diagram, second: Diagram, genus: int, homology_class: tuple[int, ...],
                      summand: str = "CP^2-bar") -> CobordismAnswer:
    """Whether s allows a connected oriented surface of genus ``genus`` in a blown-up ball.

    The 4-manifold is named for the link on its boundary (:mod:`movies.bounds.ambient`): with
    ``second`` empty, ``first`` bounds the surface in B⁴ # k ``summand`` (punctured); with both
    ends links, the surface is a cobordism from ``first`` to ``second`` in (S³ × I) # k
    ``summand``; k = len(homology_class), and the class is (a₁, …, a_k). Ren's inequality
    (:func:`~movies.bounds.inequalities.blown_up_bounds`) with A = Σ(aᵢ² − |aᵢ|) decides.

    Parameters
    ----------
    first, second : Diagram
        The ends (``second`` may be empty, not both).
    genus : int
        The genus asked about.
    homology_class : tuple of int
        (a₁, …, a_k); all zero for a null-homologous surface.
    summand : str
        ``"CP^2-bar"`` (negative definite, the default) or ``"CP^2"``.

    Returns
    -------
    CobordismAnswer

    A null-homologous disk for the positive trefoil (s = 2) in a punctured CP²-bar would need
    s ≤ 0; its mirror bounds one:

    >>> from movies.language.spec import parse_diagram
    >>> no = blown_up_question(parse_diagram("3_1"), parse_diagram("empty"), 0, (0,))
    >>> yes = blown_up_question(parse_diagram("mirror(3_1)"), parse_diagram("empty"), 0, (0,))
    >>> no.shapes[0].allowed, yes.shapes[0].allowed
    (False, True)

    References
    ----------
    Q. Ren, "Lee filtration structure of torus links" (2023), Cor. 1.4; P. Ozsváth, Z. Szabó,
    "Knot Floer homology and the four-ball genus" (2003), Thm. 1.1.
    """
    if first.is_empty() and second.is_empty():
        raise ValueError("both ends are empty: there is no surface to ask about")
    ends = (first.is_empty(), second.is_empty())
    twist = twist_for(summand, *ends)
    place = ambient(*ends, [Blowup(index, twist, a, abs(a)) for index, a in enumerate(homology_class)])
    answer, (s1, s2, m1, m2) = _answer_for(first, second, genus)
    euler = 2 - 2 * genus - first.component_count() - second.component_count()
    bounds, _ = applicable_bounds(place, {"start": s1, "end": s2}, {"start": m1, "end": m2}, euler,
                                  not first.is_empty(), not second.is_empty())
    answer.shapes.append(CobordismShape(1, euler, [_without_movie(b) for b in bounds]))
    excess = sum(a * a - abs(a) for a in homology_class)
    answer.place = place
    answer.notes.append(f"A = sum(a_i^2 - |a_i|) = {excess}; s is the only invariant asked")
    return answer
