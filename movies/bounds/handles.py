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

from movies.bounds.inequalities import Bound
from movies.diagram.constructors import mirror
from movies.diagram.handles import HandleDiagram, twisted
from movies.homology.approximations import s_of_handles
from movies.homology.links import link_s_values

__all__ = ["HandleSurfaceAnswer", "surface_questions", "S1XB3", "B2XS2"]

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
