"""What s and the signatures say about the surface of a checked movie.

For each end: s over Q and F₂ (and of the mirror image); each inequality that applies to the
surface, with both sides; for knot ends, lower bounds for the 4-ball genus and, when one equals
the genus of the surface in the movie, the statement that the surface is as small as possible.

>>> from movies.diagram.constructors import empty
>>> from movies.language.spec import parse_diagram
>>> from movies.surface.tracker import Transition, surface_of
>>> twisted = surface_of([1], [Transition("band", links=((1, 1, True),), twisted=(1,), saddles=1)])
>>> report = surface_bounds(parse_diagram("3_1"), parse_diagram("3_1"), twisted)
>>> report.notes[0]
'the surface is not oriented compatibly with the start, so the s-inequalities do not apply'
"""

from __future__ import annotations

from dataclasses import dataclass, field

from movies.bounds.ambient import Ambient, ambient, applicable_bounds
from movies.bounds.inequalities import Bound, GenusBound, best_genus_bound, four_genus_bounds
from movies.diagram.constructors import mirror
from movies.diagram.model import Diagram
from movies.surface.tracker import Surface
from movies.homology.khovanov import S_DEGREES, bar_natan_complex, s_from_complex
from movies.homology.links import link_s_values
from movies.homology.rings import parse_field
from movies.invariants.signature import levine_tristram_bound, signature

FIELDS = ("Q", "F2")
#: orders of the roots of unity tried for the Levine–Tristram bound (prime powers)
LEVINE_TRISTRAM_ORDERS = (3, 4, 5, 7, 8, 9)


@dataclass
class BoundsReport:
    s: dict = field(default_factory=dict)  # "start"/"end" -> {field: s}
    bounds: list[Bound] = field(default_factory=list)
    genus_bounds: dict = field(default_factory=dict)  # "start"/"end" -> list[GenusBound]
    least_genus: list[str] = field(default_factory=list)
    notes: list[str] = field(default_factory=list)

    @property
    def violated(self) -> list[Bound]:
        return [b for b in self.bounds if not b.holds]


def s_values(diagram: Diagram) -> dict[str, int]:
    """s over Q and F₂ (s(∅) = 1), one scan over Z serving both fields.

    >>> from movies.diagram.constructors import empty, unlink
    >>> s_values(empty()), s_values(unlink(2))
    ({'Q': 1, 'F2': 1}, {'Q': -1, 'F2': -1})
    """
    if diagram.is_empty():
        return {f: 1 for f in FIELDS}
    if diagram.component_count() != 1:
        return link_s_values(diagram, FIELDS)
    final = bar_natan_complex(diagram, "Z", degrees=S_DEGREES)  # one scan over Z serves every field
    return {f: s_from_complex(final, parse_field(f).p) for f in FIELDS}


def mirror_s_values(diagram: Diagram, s: dict[str, int]) -> dict[str, int]:
    """s of the mirror image: −s for knots (Rasmussen 2010), computed afresh for links.

    Parameters: the diagram and its s over each field (from :func:`s_values`). Returns s of the
    mirror image over the same fields.

    >>> from movies.diagram.constructors import torus_link
    >>> hopf = torus_link(2, 2)
    >>> mirror_s_values(hopf, s_values(hopf))  # the negative Hopf link
    {'Q': -1, 'F2': -1}

    References
    ----------
    J. Rasmussen, "Khovanov homology and the slice genus" (2010): s(m(K)) = −s(K) for knots.
    """
    if diagram.is_empty():
        return dict(s)
    if diagram.component_count() == 1:
        return {f: -v for f, v in s.items()}
    return s_values(mirror(diagram))


def knot_genus_bounds(diagram: Diagram) -> list[GenusBound]:
    """Lower bounds for the 4-ball genus of a knot: |s|/2 over Q and F₂, |σ|/2, Levine–Tristram.

    >>> from movies.diagram.constructors import torus_link
    >>> best = best_genus_bound(knot_genus_bounds(torus_link(2, 5)))
    >>> best.invariant, best.bound
    ('s over Q', 2)
    """
    s = s_values(diagram)
    lt = max(levine_tristram_bound(diagram, n) for n in LEVINE_TRISTRAM_ORDERS)
    return four_genus_bounds(s, signature(diagram), lt)


def search_genus_bounds(knot: Diagram, other: Diagram | None = None) -> list[GenusBound]:
    """Lower bounds for the genus of a connected surface from ``knot`` to nothing (the 4-ball
    genus) or, given ``other``, of a cobordism between the two knots; the Fox–Milnor test last.

    Without ``other``: :func:`knot_genus_bounds`. With it: half the difference of s over each
    field and of the signatures. Fox–Milnor: a slice knot's Alexander polynomial is f(t)f(1/t), so
    its determinant is a square; a genus-0 cobordism makes K # m(K') slice, so the product of the
    two determinants must be a square. The Fox–Milnor entry has ``value`` the determinant (or the
    product) and bound 1 when that is not a square, else 0.

    >>> from movies.language.spec import parse_diagram
    >>> [(b.invariant, b.bound) for b in search_genus_bounds(parse_diagram("4_1"))][-1]
    ('Fox–Milnor (the determinant is not a square)', 1)
    >>> max(b.bound for b in search_genus_bounds(parse_diagram("7_1"), parse_diagram("5_1")))
    1

    References
    ----------
    J. Rasmussen (2010); K. Murasugi (1965); R. Fox, J. Milnor (1966).
    """
    import math

    from movies.invariants.alexander import determinant

    if other is None:
        bounds = knot_genus_bounds(knot)
        det = abs(determinant(knot))
    else:
        one, two = s_values(knot), s_values(other)
        bounds = [GenusBound(f"s over {f}", abs(one[f] - two[f]), abs(one[f] - two[f]) // 2,
                             "Rasmussen 2010: |s(K) - s(K')| <= 2g for a cobordism of genus g") for f in one]
        difference = abs(signature(knot) - signature(other))
        bounds.append(GenusBound("signature", difference, difference // 2,
                                 "Murasugi 1965: |sigma(K) - sigma(K')| <= 2g for a cobordism of genus g"))
        det = abs(determinant(knot)) * abs(determinant(other))
    square = math.isqrt(det) ** 2 == det
    bounds.append(GenusBound("Fox–Milnor (the determinant is not a square)" if not square else "Fox–Milnor",
                             det, 0 if square else 1, "Fox–Milnor 1966: the determinant of a slice knot is a square"))
    return bounds


def surface_ambient(start: Diagram, end: Diagram, surface: Surface | None) -> Ambient:
    """The 4-manifold a movie's surface lives in, named for its boundary (:mod:`movies.bounds.ambient`).

    Parameters: the first and the last frame, and the surface (None when the movie stopped at
    an invalid step: then no blow-ups are counted).

    >>> from movies.diagram.constructors import empty, unknot
    >>> surface_ambient(unknot(), empty(), None).sentence()
    'in B^4, bounded by the start'
    """
    return ambient(start.is_empty(), end.is_empty(),
                   surface.blowups if surface is not None else (), surface is None or surface.orientable)


def surface_bounds(start: Diagram, end: Diagram, surface: Surface | None) -> BoundsReport:
    """The s-inequalities and genus bounds for the surface of a movie from ``start`` to ``end``.

    Parameters: the first and the last frame; the surface (None for a movie that stopped at an
    invalid step). Returns a :class:`BoundsReport`: s of both ends, the inequalities that hold
    where the surface lives (:mod:`movies.bounds.ambient`), 4-genus bounds of knot ends, and the
    least-genus statements an equality gives.

    >>> from movies.diagram.constructors import empty, unknot
    >>> from movies.surface.tracker import Transition, surface_of
    >>> disk = surface_of([1], [Transition("death", ended=(1,), deaths=1)])
    >>> [(b.lhs, b.rhs, b.holds) for b in surface_bounds(unknot(), empty(), disk).bounds]
    [(1, 1, True), (1, 1, True), (1, 1, True), (1, 1, True)]

    References
    ----------
    A. Beliakova, S. Wehrli (2008): s bounds the Euler characteristic of oriented cobordisms.
    """
    report = BoundsReport()
    if surface is None:
        report.notes.append("no surface: the movie stops at an invalid step")
        return report
    for label, frame in (("start", start), ("end", end)):
        report.s[label] = s_values(frame)
        if frame.component_count() == 1:
            report.genus_bounds[label] = knot_genus_bounds(frame)
    if not surface.orientable or not surface.oriented_by_start:
        report.notes.append("the surface is not oriented compatibly with the start, so the s-inequalities do not apply")
        return report
    if surface.end_reversed:
        # the inequalities are about the orientation the surface induces on the last frame
        from movies.diagram.constructors import reverse

        end = reverse(end, surface.end_reversed)
        report.s["end"] = s_values(end)
        report.notes.append(f"the last frame is drawn against the orientation the surface induces on components "
                            f"{', '.join(map(str, surface.end_reversed))}; s of the end is taken for the induced one")
    mirror_s = {label: mirror_s_values(frame, report.s[label]) for label, frame in (("start", start), ("end", end))}
    place = surface_ambient(start, end, surface)
    report.bounds, notes = applicable_bounds(place, report.s, mirror_s, surface.euler_characteristic,
                                             surface.every_component_meets_start, surface.every_component_meets_end)
    report.notes.extend(notes)
    if place.definite == "indefinite":
        return report
    if not report.bounds:
        report.notes.append("some component of the surface meets neither end, so no s-inequality applies")
    if surface.blowups:
        tight = [b for b in report.bounds if b.tight]
        if tight and surface.connected:
            report.least_genus.append(
                f"the inequality '{tight[0].statement}' is an equality: the surface has the least genus its "
                f"class allows (no connected oriented surface with these ends, in {place.name} and in this class, "
                f"has larger Euler characteristic)"
            )
        return report
    # least genus: a connected surface with one knot end and the other end empty or a knot
    if surface.connected:
        genus = surface.components[0].genus
        for label, other in (("start", end), ("end", start)):
            if label in report.genus_bounds and (other.is_empty() or other.is_crossingless() and other.component_count() == 1):
                best = best_genus_bound(report.genus_bounds[label])
                if genus and best.bound == genus:
                    report.least_genus.append(
                        f"the surface has the least possible genus ({genus}) for a surface in the 4-ball "
                        f"bounded by the {label} knot: {best.invariant} = {best.value} gives g4 >= {best.bound}"
                    )
        tight = [b for b in report.bounds if b.tight]
        if tight and not report.least_genus:
            report.least_genus.append(
                f"the inequality '{tight[0].statement}' is an equality: no oriented connected cobordism "
                f"between these ends has larger Euler characteristic"
            )
    return report
