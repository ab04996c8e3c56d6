"""Answers of ``movies bounds`` to questions without a movie, as the terminal shows them.

>>> from movies.bounds.questions import blown_up_question
>>> from movies.language.spec import parse_diagram
>>> answer = blown_up_question(parse_diagram("3_1"), parse_diagram("empty"), 0, (0,))
>>> blown_up_lines("3_1", "empty", answer)[-2]
'    no such surface exists: no null-homologous disk'
"""

from __future__ import annotations


def cobordism_lines(label: str, answer) -> list[str]:
    """The readable answer of ``movies bounds A --to B``: one block per number of components.

    >>> from movies.bounds.questions import cobordism_question
    >>> from movies.language.spec import parse_diagram
    >>> answer = cobordism_question(parse_diagram("3_1"), parse_diagram("unknot"), genus=1)
    >>> cobordism_lines("unknot", answer)[2]
    '  to unknot, connected, total genus 1 (Euler characteristic -2)'
    """
    lines = [f"  s: first {_fields(answer.s['first'])}; second {_fields(answer.s['second'])}",
             f"  s of the mirrors: first {_fields(answer.mirror_s['first'])}; "
             f"second {_fields(answer.mirror_s['second'])}"]
    for shape in answer.shapes:
        what = "connected" if shape.components == 1 else f"{shape.components} components, each meeting both ends"
        lines.append(f"  to {label}, {what}, total genus {answer.genus} (Euler characteristic {shape.euler_characteristic})")
        lines += [f"    {b.statement}: {b.lhs} >= {b.rhs} {'holds' if b.holds else 'FAILS'}" for b in shape.bounds]
        lines.append("    allowed by these invariants" if shape.allowed else "    no such cobordism exists")
    lines += [f"  note: {note}" for note in answer.notes]
    return lines


def blown_up_lines(first: str, second: str, answer) -> list[str]:
    """The readable answer of ``movies bounds K --blowups N``: the 4-manifold, the class, the verdict.

    The 4-manifold is named for the link on its boundary, with its usual orientation.
    """
    place, shape = answer.place, answer.shapes[0]
    klass = ", ".join(map(str, place.homology_class))
    if second == "empty":
        what = ("a null-homologous disk" if answer.genus == 0 and place.null_homologous
                else f"a connected surface of genus {answer.genus} in the class ({klass})")
        where = f"{first} bounding {what} in {place.name} (punctured, {place.definite})"
    else:
        what = ("a null-homologous annulus" if answer.genus == 0 and place.null_homologous
                else f"a connected cobordism of genus {answer.genus} in the class ({klass})")
        where = f"{what} from {first} to {second} in {place.name} ({place.definite})"
    lines = [f"  s: first {_fields(answer.s['first'])}; second {_fields(answer.s['second'])}",
             f"  s of the mirrors: first {_fields(answer.mirror_s['first'])}; "
             f"second {_fields(answer.mirror_s['second'])}",
             f"  {where}: square {place.square}, Euler characteristic {shape.euler_characteristic}"]
    lines += [f"    {b.statement}: {b.lhs} >= {b.rhs} {'holds' if b.holds else 'FAILS'}" for b in shape.bounds]
    lines.append("    allowed by s" if shape.allowed else f"    no such surface exists: {_no(what)}")
    lines += [f"  note: {note}" for note in answer.notes]
    return lines


def _no(what: str) -> str:
    """'a null-homologous disk' -> 'no null-homologous disk'."""
    return "no " + what.split(" ", 1)[1]


def _fields(values: dict) -> str:
    return ", ".join(f"{v} over {f}" for f, v in values.items())


def handle_surface_lines(answers) -> list[str]:
    """The readable answer of ``movies bounds`` for a link in #ʳ S¹×S²: one block per 4-manifold it bounds.

    >>> from movies.bounds.handles import surface_questions
    >>> from movies.diagram.handles import fibers
    >>> handle_surface_lines(surface_questions(fibers(1, 1), fields=("Q",)))[0]
    '  in S^1 x B^3 (every surface): total genus at least 0 for a surface with no closed components'
    """
    lines = []
    for answer in answers:
        lines += [f"  in {answer.name} ({answer.scope}): total genus at least {answer.least_genus} "
                  "for a surface with no closed components",
                  f"    a connected surface of genus {answer.genus} (Euler characteristic {answer.euler_characteristic}):"]
        lines += [f"      {b.statement}: {b.lhs} >= {b.rhs} {'holds' if b.holds else 'FAILS'}" for b in answer.bounds]
        lines.append("      allowed by s" if answer.allowed else
                     "      no such surface exists" + ("" if answer.scope == "every surface" else f" ({answer.scope})"))
    lines.append("  note: in B^2 x S^2 a surface that slides over a handle changes the approximations L(k); "
                 "no bound is claimed for such surfaces")
    return lines
