"""What s says about surfaces that a link in #ʳ S¹×S² bounds in ♮ʳ S¹×B³ and in ♮ʳ B²×S².

**♮ʳ S¹×B³, every surface.** It is B⁴ with trivial disks for the unlink of the handles drilled
out, so a surface Σ there, bounded by L, is a surface in B⁴ bounded by L(0); and the Dehn twist
along each handle's sphere extends over ♮ʳ S¹×B³, so for every k the approximation L(k) bounds a
copy of Σ in B⁴ too. Every 4-ball inequality therefore holds for every s(L(k)) and every
s(m(L(k))): for Σ with no closed components, s ≤ 1 − χ(Σ) (Beliakova–Wehrli, with s(∅) = 1). The
best computed value of each gives the bound, and the answer says which k it used.

**♮ʳ B²×S², surfaces drawn over this diagram.** Such a surface meets the 2-handles in copies of
their cocores ("fiber caps"); the rest is a cobordism in M_r × I from L to the fibers. When that
cobordism is a movie that keeps off the handles (the surfaces ``movies check`` verifies), it is for
every k a cobordism in S³ from L(k) to the twisted fibers, whose s is 1 − 2P for k ≥ 0; with
Beliakova–Wehrli this gives s(L(k)) ≤ 1 − χ(Σ) for every k ≥ 0, and the same for the mirror
(m(L)(k) = m(L(−k))). Every surface there is null-homologous (the intersection form of ♮ʳ B²×S²
is zero and L is). A surface that slides over a handle changes the approximations; no bound is
claimed for it here.

>>> from movies.diagram.handles import fibers
>>> three, two = surface_questions(fibers(1, 1), genus=0, fields=("Q",))
>>> three.least_genus, [(b.lhs, b.rhs, b.holds) for b in three.bounds]
(0, [(1, 1, True), (1, 1, True)])
>>> two.manifold, two.euler_characteristic, [b.rhs for b in two.bounds]
('B^2 x S^2', 0, [-1, -1])

References
----------
A. Beliakova, S. Wehrli (2008); Q. Ren, "Lee filtration structure of torus links" (2023), Cor. 1.4,
for s of the twisted fibers; C. Manolescu, M. Marengon, S. Sarkar, M. Willis (2019), for the
setting. The arguments are those of the design notes (sections 2 and 4).
"""

from __future__ import annotations

from dataclasses import dataclass, field

from movies.errors import EmptyDiagramError
from movies.bounds.inequalities import Bound
from movies.diagram.constructors import mirror
from movies.diagram.handles import HandleDiagram, twisted
from movies.homology.approximations import s_of_handles
from movies.homology.links import link_s_values

__all__ = ["HandleSurfaceAnswer", "surface_questions", "S1XB3", "B2XS2", "HandlePlace", "handle_place", "movie_bounds",
           "MOVIE_TWISTS"]

S1XB3 = "S^1 x B^3"
B2XS2 = "B^2 x S^2"

SOURCES = {
    S1XB3: ("Beliakova–Wehrli 2008: s(L) <= 1 - chi for a surface in B^4 with no closed components; every L(k) "
            "bounds a copy of the surface in B^4 (the twist along each handle's sphere extends over S^1 x B^3)"),
    B2XS2: ("Beliakova–Wehrli 2008 for the cobordism from L(k) to the twisted fibers, whose s is 1 - 2P for k >= 0 "
            "(Ren 2023, Cor. 1.4, and P annuli); for a surface whose movie keeps off the handles but for fiber caps"),
}

SCOPE = {
    S1XB3: "every surface",
    B2XS2: "surfaces drawn over this diagram, without handle slides",
}


@dataclass
class HandleSurfaceAnswer:
    """Lower bounds for surfaces bounded by a link in #ʳ S¹×S², in one 4-manifold it bounds.

    ``manifold`` is :data:`S1XB3` or :data:`B2XS2` (one summand per handle); ``scope`` says which
    surfaces the bounds are proved for.
    """

    manifold: str
    handles: int
    scope: str
    genus: int
    euler_characteristic: int  # of a connected surface of that genus
    least_genus: int  # no surface in scope without closed components has smaller total genus
    bounds: list[Bound] = field(default_factory=list)
    values: dict = field(default_factory=dict)  # field -> {"L": {k: s(L(k))}, "mirror": {k: s(m(L(k)))}}

    @property
    def allowed(self) -> bool:
        return all(b.holds for b in self.bounds)

    @property
    def name(self) -> str:
        """``S^1 x B^3``, or ``the boundary sum of 2 S^1 x B^3``."""
        return self.manifold if self.handles == 1 else f"the boundary sum of {self.handles} {self.manifold}"

    def as_json(self) -> dict:
        return {"manifold": self.manifold, "handles": self.handles, "scope": self.scope, "genus": self.genus,
                "euler_characteristic": self.euler_characteristic, "least_genus": self.least_genus,
                "allowed_by_s": self.allowed, "bounds": [b.as_json() for b in self.bounds]}


def surface_questions(link: HandleDiagram, genus: int = 0, fields=("Q", "F2"),
                      most: int = 2) -> tuple[HandleSurfaceAnswer, HandleSurfaceAnswer]:
    """Whether s allows a connected surface of genus ``genus`` bounded by ``link`` in ♮ʳ S¹×B³ and in ♮ʳ B²×S².

    Parameters
    ----------
    link : HandleDiagram
        A null-homologous link in #ʳ S¹×S² (else :class:`~movies.errors.NotNullHomologousError`).
    genus : int
        The genus asked about (0 or more).
    fields : sequence of str
        The fields s is taken over.
    most : int
        s(L(k)) and s(m(L(k))) are computed for |k| up to this (fewer on a side whose limit is
        certified early).

    Returns
    -------
    (HandleSurfaceAnswer, HandleSurfaceAnswer)
        For ♮ʳ S¹×B³ and for ♮ʳ B²×S²: for each field the best computed s(L(k)) and s(m(L(k))) among
        the k the manifold allows, as inequalities ``1 - chi >= s`` with the k they came from, and
        the least total genus they allow for a surface without closed components.

    Examples
    --------
    >>> from movies.language.spec import parse_handle_diagram
    >>> three, two = surface_questions(parse_handle_diagram("3_1 with handle across 1 5"), fields=("Q",))
    >>> three.least_genus, three.bounds[0].statement
    (1, 'S^1 x B^3, k = 0: 1 - chi >= s(L(k))  [Q]')
    """
    if link.diagram.is_empty():
        raise EmptyDiagramError("the empty link bounds only closed surfaces, and these bounds are for surfaces whose "
                                "every component meets the link")
    sequences = s_of_handles(link, fields, most=most)  # also refuses links that are not null-homologous
    components = link.diagram.component_count()
    euler = 2 - 2 * genus - components
    answers = {where: HandleSurfaceAnswer(where, len(link.gates), SCOPE[where], genus, euler, 0)
               for where in (S1XB3, B2XS2)}
    best = {S1XB3: 0, B2XS2: 0}
    for name, sequence in sequences.items():
        mirrored = {k: link_s_values(mirror(twisted(link, k)), [name])[name] for k in sequence.values}
        for answer in answers.values():
            answer.values[name] = {"L": dict(sequence.values), "mirror": mirrored}
        # B^2 x S^2 takes k >= 0 for L, and for m(L), whose approximations are m(L(-k)), k <= 0
        for where, keep_l, keep_m in ((S1XB3, lambda k: True, lambda k: True),
                                      (B2XS2, lambda k: k >= 0, lambda k: k <= 0)):
            for what, values, keep in (("s(L(k))", sequence.values, keep_l), ("s(m(L(k)))", mirrored, keep_m)):
                kept = {k: s for k, s in values.items() if keep(k)}
                k, value = max(kept.items(), key=lambda item: (item[1], -abs(item[0])))
                answers[where].bounds.append(Bound(f"{where}, k = {k}: 1 - chi >= {what}  [{name}]", 1 - euler,
                                                   value, name, SOURCES[where]))
                best[where] = max(best[where], value)
    for where, answer in answers.items():
        # c >= 1 components of total genus g: chi = 2c - 2g - b <= 1 - best; c = 1 is the weakest
        answer.least_genus = max(0, -((components - 1 - best[where]) // 2))
    return answers[S1XB3], answers[B2XS2]


# ---------------------------------------------------------------------- a movie with handles

#: the k for which a movie with handles is judged in S³, unless asked otherwise
MOVIE_TWISTS = (-2, -1, 0, 1, 2)

SOURCE_PRODUCT = ("Beliakova–Wehrli 2008, for the movie in S^3 x I between the twisted approximations: a movie that "
                  "keeps off the handles is, for every k, a movie from L0(k) to L1(k) with the same surface")


@dataclass(frozen=True)
class HandlePlace:
    """Where the surface of a movie with handles lives, named for the link on its boundary.

    ``base`` is the 4-manifold; ``also`` other 4-manifolds the same movie is a surface in;
    ``caps`` the fiber caps per handle, (one way, the other way); ``boundary_class`` the class of
    the start in H₁(#ʳ S¹×S²), which decides the surface's class in H₂(X, ∂X) (the map between
    them is injective for both boundary sums).
    """

    base: str
    reading: str
    handles: int
    also: tuple[str, ...] = ()
    caps: tuple[tuple[int, int], ...] = ()
    boundary_class: tuple[int, ...] = ()
    definite: None = None

    @property
    def name(self) -> str:
        return self.base

    @property
    def homology_class(self) -> list[int]:
        return list(self.boundary_class)

    @property
    def square(self) -> int:
        return 0  # the intersection forms of the product and of both boundary sums vanish

    @property
    def null_homologous(self) -> bool:
        return not any(self.boundary_class)

    def sentence(self) -> str:
        also = "".join(f" and in {name}" for name in self.also)
        return f"in {self.base}{also}, {self.reading}"

    def as_json(self) -> dict:
        return {"lives_in": self.base, "also_in": list(self.also), "reading": self.reading, "definite": None,
                "blowups": [], "handles": self.handles, "fiber_caps": [list(c) for c in self.caps],
                "class": self.homology_class, "square": self.square, "null_homologous": self.null_homologous}


def _sum_name(manifold: str, r: int) -> str:
    return manifold if r == 1 else f"\u266e^{r} {manifold}"


def handle_place(handles: int, end_empty: bool, lives: str | None, caps: tuple[tuple[int, int], ...],
                 boundary_class: tuple[int, ...], start_empty: bool = False) -> HandlePlace:
    """Name the 4-manifold of a movie with ``handles`` handles.

    A movie that keeps off the handles is a surface in M_r × I. When it ends empty (or starts
    empty) that collar lies in both boundary sums, so without a statement of its own the movie
    is a surface in ♮ʳ S¹×B³ and in ♮ʳ B²×S², bounded by the other end; fiber caps pass through
    the 2-handles, so only ♮ʳ B²×S². A movie from empty to empty is a closed surface in the product.

    >>> handle_place(1, True, None, (), (0,)).sentence()
    'in S^1 x B^3 and in B^2 x S^2, bounded by the start'
    >>> handle_place(1, False, None, (), (0,), start_empty=True).sentence()
    'in S^1 x B^3 and in B^2 x S^2, bounded by the end'
    >>> handle_place(2, False, None, (), (0, 0)).name
    '#^2 S^1 x S^2 x I'
    """
    product = ("S^1 x S^2" if handles == 1 else f"#^{handles} S^1 x S^2") + " x I"
    if end_empty and start_empty:
        return HandlePlace(product, "closed", handles, (), caps, boundary_class)
    if not (end_empty or start_empty) or lives == "MxI":
        return HandlePlace(product, "from the start to the end", handles, (), caps, boundary_class)
    reading = "bounded by the start" if end_empty else "bounded by the end"
    if any(up or down for up, down in caps) or lives == "B2xS2":
        return HandlePlace(_sum_name(B2XS2, handles), reading, handles, (), caps, boundary_class)
    if lives == "S1xB3":
        return HandlePlace(_sum_name(S1XB3, handles), reading, handles, (), caps, boundary_class)
    return HandlePlace(_sum_name(S1XB3, handles), reading, handles, (_sum_name(B2XS2, handles),), caps,
                       boundary_class)


def movie_bounds(start: HandleDiagram, end, euler: int, meets_start: bool, meets_end: bool,
                 ks=MOVIE_TWISTS, fields=("Q", "F2")) -> tuple[list[Bound], dict]:
    """The S³ inequalities, for every k in ``ks``, for a movie with handles from ``start`` to ``end``.

    ``end`` is the last frame of the part in M_r × I: a :class:`HandleDiagram`, or an empty
    diagram; ``euler``, ``meets_start`` and ``meets_end`` describe that part of the surface.
    For each k the movie is one in S³ from start(k) to end(k), so Beliakova–Wehrli's
    inequalities hold between their s (and their mirrors'). For a movie that ends in fibers,
    capped afterwards, this is the inequality of the design notes through the fibers.

    Returns the bounds, each statement starting with its k, and {k: {"start": s, "end": s}}.

    >>> from movies.diagram.constructors import empty
    >>> from movies.diagram.handles import fibers
    >>> bounds, values = movie_bounds(fibers(1, 1), empty(), euler=0, meets_start=True, meets_end=False, ks=(0, 1),
    ...                               fields=("Q",))
    >>> [(b.statement.split(":")[0], b.lhs, b.rhs, b.holds) for b in bounds]
    [('k = 0', 2, 0, True), ('k = 0', 2, 0, True), ('k = 1', 2, 0, True), ('k = 1', 0, 0, True)]
    """
    from movies.bounds.inequalities import cobordism_bounds

    def s_of(link, k) -> tuple[dict, dict]:
        if not isinstance(link, HandleDiagram) or link.diagram.is_empty():  # the empty link
            return {f: 1 for f in fields}, {f: 1 for f in fields}
        diagram = twisted(link, k)
        return link_s_values(diagram, fields), link_s_values(mirror(diagram), fields)

    bounds: list[Bound] = []
    values: dict = {}
    for k in ks:
        (a, ma), (b, mb) = s_of(start, k), s_of(end, k)
        values[k] = {"start": a, "end": b, "mirror_start": ma, "mirror_end": mb}
        for bound in cobordism_bounds(a, b, ma, mb, euler, meets_start, meets_end):
            bounds.append(Bound(f"k = {k}: {bound.statement}", bound.lhs, bound.rhs, bound.field, SOURCE_PRODUCT))
    return bounds, values
