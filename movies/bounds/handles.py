"""What s says about surfaces that a link in #ʳ S¹×S² bounds in ♮ʳ S¹×B³.

M_r = #ʳ S¹×S² is the boundary of ♮ʳ S¹×B³, which is B⁴ with trivial disks for the unlink of the
handles drilled out. A surface Σ there, bounded by L, is a surface in B⁴ bounded by L(0); and the
Dehn twist along each handle's sphere extends over ♮ʳ S¹×B³, so for every k the approximation
L(k) bounds a copy of Σ in B⁴ too. Every 4-ball inequality therefore holds for every s(L(k)) and
every s(m(L(k))): for Σ with no closed components, s ≤ 1 − χ(Σ) (Beliakova–Wehrli, with
s(∅) = 1). The best computed value of each gives the bound, and the answer says which k it used.

Surfaces in ♮ʳ B²×S², which may also meet the cocores of the 2-handles, are not answered here.

>>> from movies.diagram.handles import fibers
>>> answer = s1xb3_question(fibers(1, 1), genus=0, fields=("Q",))
>>> answer.least_genus, [(b.lhs, b.rhs, b.holds) for b in answer.bounds]
(0, [(1, 1, True), (1, 1, True)])

References
----------
A. Beliakova, S. Wehrli (2008); C. Manolescu, M. Marengon, S. Sarkar, M. Willis (2019), for the
setting; the twist extending over S¹×B³ is the argument of the design notes (section 4).
"""

from __future__ import annotations

from dataclasses import dataclass, field

from movies.bounds.inequalities import Bound
from movies.diagram.constructors import mirror
from movies.diagram.handles import HandleDiagram, twisted
from movies.homology.approximations import s_of_handles
from movies.homology.links import link_s_values

__all__ = ["HandleSurfaceAnswer", "s1xb3_question"]

SOURCE = ("Beliakova–Wehrli 2008: s(K) <= 1 - chi for a surface in B^4 with no closed components; every L(k) bounds "
          "a copy of the surface in B^4 (the twist along each handle's sphere extends over S^1 x B^3)")


@dataclass
class HandleSurfaceAnswer:
    """Lower bounds for surfaces in ♮ʳ S¹×B³ bounded by a link, and whether a genus is allowed."""

    genus: int
    euler_characteristic: int  # of a connected surface of that genus
    least_genus: int  # no surface without closed components has smaller total genus
    bounds: list[Bound] = field(default_factory=list)
    values: dict = field(default_factory=dict)  # field -> {"L": {k: s}, "mirror": {k: s(m(L(k)))}}

    @property
    def allowed(self) -> bool:
        return all(b.holds for b in self.bounds)


def s1xb3_question(link: HandleDiagram, genus: int = 0, fields=("Q", "F2"), most: int = 2) -> HandleSurfaceAnswer:
    """Whether s allows a connected surface of genus ``genus`` bounded by ``link`` in ♮ʳ S¹×B³.

    Parameters
    ----------
    link : HandleDiagram
        A null-homologous link in #ʳ S¹×S² (else :class:`~movies.errors.NotNullHomologousError`).
    genus : int
        The genus asked about (0 or more).
    fields : sequence of str
        The fields s is taken over.
    most : int
        s(L(k)) and s(m(L(k))) are computed for |k| up to this.

    Returns
    -------
    HandleSurfaceAnswer
        For each field the best computed s(L(k)) and s(m(L(k))) as inequalities ``1 - chi >= s``,
        with the k they came from, and the least total genus they allow for any surface without
        closed components.
    """
    sequences = s_of_handles(link, fields, most=most)  # also refuses links that are not null-homologous
    components = link.diagram.component_count()
    euler = 2 - 2 * genus - components
    answer = HandleSurfaceAnswer(genus, euler, 0)
    best = 0
    for name, sequence in sequences.items():
        mirrored = {k: link_s_values(mirror(twisted(link, k)), [name])[name] for k in sequence.values}
        answer.values[name] = {"L": dict(sequence.values), "mirror": mirrored}
        for what, values in (("s(L(k))", sequence.values), ("s(m(L(k)))", mirrored)):
            k, value = max(values.items(), key=lambda item: (item[1], -abs(item[0])))
            answer.bounds.append(Bound(f"S^1 x B^3, k = {k}: 1 - chi >= {what}  [{name}]", 1 - euler, value, name,
                                       SOURCE))
            best = max(best, value)
    # a surface of c >= 1 components, total genus g: chi = 2c - 2g - b <= 1 - best; c = 1 is the weakest
    answer.least_genus = max(0, -((components - 1 - best) // 2))
    return answer
