"""Everything the command line reports about homology, from one scan over Z.

The final complex over Z[H] is computed once; tensored with Q or F_p it gives the complex
over that field, so Khovanov homology over every field, its torsion over Z, Bar-Natan homology
and s all come from the same scan.

>>> from movies.diagram.pd import from_pd
>>> facts = homology_summary(from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]))
>>> facts["s"], facts["khovanov_Z"]["torsion"]
({'Q': 2, 'F2': 2}, [[3, 7, 2, 1]])
"""

from __future__ import annotations

from typing import Callable, Sequence

from movies.diagram.model import Diagram
from movies.homology.graded import bar_natan_module, khovanov_integral, khovanov_ranks
from movies.homology.canonical import canonical_complex, s_from_canonical
from movies.homology.khovanov import bar_natan_complex, khovanov_homology
from movies.homology.links import link_s_values
from movies.homology.rings import parse_field


def _triples(ranks: dict) -> list[list[int]]:
    return [[i, j, r] for (i, j), r in sorted(ranks.items()) if r]


def homology_summary(
    diagram: Diagram,
    fields: Sequence[str] = ("Q", "F2"),
    reduced: bool = False,
    bar_natan: bool = False,
    progress: Callable[[int, int], None] | None = None,
) -> dict:
    """Khovanov homology over each field and Z, s of knots, and optionally reduced and Bar-Natan homology.

    Parameters
    ----------
    diagram : Diagram
    fields : sequence of str
        Fields for Khovanov homology and s: "Q", "F2", "F3", ...
    reduced : bool
        Also reduced Khovanov homology over each field (basepoint on the smallest edge).
    bar_natan : bool
        Also Bar-Natan homology over F[H] for each field: free generators and H-torsion.
    progress : callable, optional
        Called with (crossings added, total).

    Returns
    -------
    dict
        ``khovanov`` {field: [[i, j, rank], ...]}, ``khovanov_Z`` {"free": [[i, j, rank]],
        "torsion": [[i, j, order, count]]}, ``s`` {field: int} (of the link with its orientation,
        Beliakova–Wehrli normalisation), and ``reduced_khovanov`` / ``bar_natan`` when asked.
    """
    rings = [parse_field(f) for f in fields]
    if diagram.crossings and diagram.piece_count() == 1:
        # one scan carries the canonical class along: it gives the complex and s at once
        canonical = canonical_complex(diagram, progress)
        final = canonical.final
        s = {ring.name: s_from_canonical(canonical, ring.name) for ring in rings}
    else:
        final = bar_natan_complex(diagram, "Z", progress)
        s = link_s_values(diagram, [ring.name for ring in rings])
    integral = khovanov_integral(final)
    result: dict = {
        "khovanov": {ring.name: _triples(khovanov_ranks(final, ring.p)) for ring in rings},
        "khovanov_Z": {
            "free": _triples(integral["free"]),
            "torsion": [[i, j, order, count] for (i, j), orders in sorted(integral["torsion"].items())
                        for order, count in sorted(orders.items())],
        },
        "s": s,
    }
    if reduced:
        basepoint = min(diagram.edges())
        result["reduced_khovanov"] = {
            ring.name: _triples(khovanov_homology(diagram, ring.name, reduced=True, basepoint=basepoint))
            for ring in rings
        }
    if bar_natan:
        result["bar_natan"] = {}
        for ring in rings:
            module = bar_natan_module(final, ring.p)
            result["bar_natan"][ring.name] = {
                "free": _triples(module["free"]),
                "torsion": [[i, j, k, count] for (i, j), powers in sorted(module["torsion"].items())
                            for k, count in sorted(powers.items())],
            }
    return result


def handle_link_facts(link, fields: Sequence[str], classical: bool = False, reduced: bool = False,
                      bar_natan: bool = False, twists: int = 3) -> dict:
    """``movies invariants`` of a link in #ʳ S¹×S² as data: its class, s and Khovanov homology of
    its twisted approximations; with ``classical``, ``reduced`` or ``bar_natan`` also every L(k)
    as a link in S³ (``approximations``). The command line prints it; a batch stores it.

    >>> from movies.diagram.handles import fibers
    >>> facts = handle_link_facts(fibers(1, 1), ["Q"], twists=1)
    >>> facts["class"], facts["null_homologous"], sorted(facts["s"]["Q"])
    ([0], True, ['s_minus', 's_plus', 'sequence', 'window'])
    """
    from movies.diagram.handles import twisted
    from movies.errors import InputError, NotNullHomologousError, NotTwoDivisibleError
    from movies.homology.approximations import khovanov_of_handles, s_of_handles
    from movies.invariants.summary import classical_invariants

    if twists < 1:
        raise InputError(f"--twists is 1 or more, not {twists}")
    facts: dict = {
        "handles": len(link.gates), "class": list(link.homology_class()),
        "null_homologous": link.null_homologous(), "two_divisible": link.two_divisible(),
        "null_homologous_orientations": [list(o) for o in link.null_homologous_orientations()],
        "s": None, "s_note": "", "khovanov": None, "khovanov_note": "",
    }
    ks = sorted(range(-twists, twists + 1), key=lambda k: (k < 0, abs(k)))
    if classical:
        facts["s_note"] = facts["khovanov_note"] = "not computed (--classical)"
    else:
        try:
            found = s_of_handles(link, fields, most=twists)
            facts["s"] = {field: sequence.as_json() for field, sequence in found.items()}
            ks = sorted(set().union(*(sequence.values for sequence in found.values())), key=lambda k: (k < 0, abs(k)))
        except NotNullHomologousError as err:
            facts["s_note"] = str(err)
        try:
            facts["khovanov"] = {"Q": [t.as_json() for t in khovanov_of_handles(link, sorted(ks), "Q")]}
        except NotTwoDivisibleError as err:
            facts["khovanov_note"] = str(err)
    if classical or reduced or bar_natan:
        approximations = []
        for k in sorted(ks):
            diagram = twisted(link, k)
            entry = {"k": k, **classical_invariants(diagram)}
            if not classical and not diagram.is_empty():
                entry.update(homology_summary(diagram, fields, reduced, bar_natan))
            approximations.append(entry)
        facts["approximations"] = approximations
    return facts


def invariants_facts(diagram: Diagram, fields: Sequence[str], classical: bool = False, reduced: bool = False,
                     bar_natan: bool = False, progress: Callable | None = None) -> dict:
    """``movies invariants`` of a diagram in S³ as data: the classical invariants, and unless
    ``classical`` the homology (:func:`homology_summary`). The command line prints it; a batch
    stores it.

    >>> from movies.diagram.constructors import unknot
    >>> invariants_facts(unknot(), ["Q"])["s"]
    {'Q': 0}
    """
    from movies.invariants.summary import classical_invariants

    facts = classical_invariants(diagram)
    if not classical and not diagram.is_empty():
        facts.update(homology_summary(diagram, fields, reduced, bar_natan, progress=progress))
    return facts
