"""Text layouts of the command line's reports.

>>> print(invariants_text("demo", {"components": 1, "crossings": 0, "writhe": 0, "seifert_circles": 1,
...     "split_pieces": 1, "jones": [[0, 1]], "signature": 0, "linking_matrix": [[0]],
...     "alexander": [[0, 1]], "determinant": 1}))
demo
  components       1
  crossings        0   (writhe 0, 1 Seifert circle, 1 split piece)
  Jones            1
  signature        0
  Alexander        1
  determinant      1
  linking numbers  (one component)
"""

from __future__ import annotations

from fractions import Fraction

from movies.algebra.laurent import LaurentPolynomial


def polynomial_text(terms: list[list], variable: str = "t") -> str:
    """A polynomial given as [[exponent, coefficient], ...] in the trade's readable form.

    >>> polynomial_text([[1, 1], [3, 1], [4, -1]])
    't + t^3 - t^4'
    >>> polynomial_text([[-0.5, -1], [0.5, -1]])
    '-t^(-1/2) - t^(1/2)'
    >>> polynomial_text([])
    '0'
    """
    exact = {Fraction(exponent).limit_denominator(2): coefficient for exponent, coefficient in terms}
    return str(LaurentPolynomial(exact, variable=variable))


def homology_polynomial(triples: list[list[int]], torsion: list[list[int]] = ()) -> str:
    """Ranks [[i, j, rank], ...] (and torsion [[i, j, order, count]]) as a polynomial in t and q.

    >>> homology_polynomial([[0, 1, 1], [0, 3, 1], [2, 5, 1], [3, 9, 1]], [[3, 7, 2, 1]])
    'q + q^3 + t^2 q^5 + t^3 q^9 + Z/2 t^3 q^7'
    """
    def monomial(i: int, j: int) -> str:
        parts = [("t" if i == 1 else f"t^{i}") if i else "", ("q" if j == 1 else f"q^{j}") if j else ""]
        return " ".join(p for p in parts if p) or "1"

    terms = [(f"{r} " if r > 1 else "") + monomial(i, j) for i, j, r in triples]
    terms += [(f"{count} " if count > 1 else "") + f"Z/{order} {monomial(i, j)}" for i, j, order, count in torsion]
    return " + ".join(terms) if terms else "0"


def homology_rows(facts: dict) -> list[tuple[str, str]]:
    """Rows of the invariants report for the homology in ``facts`` (if any was computed)."""
    rows: list[tuple[str, str]] = []
    for field, triples in facts.get("khovanov", {}).items():
        rows.append((f"Khovanov ({field})", homology_polynomial(triples)))
    if "khovanov_Z" in facts:
        torsion = facts["khovanov_Z"]["torsion"]
        rows.append(("Khovanov (Z)", "no torsion" if not torsion else "torsion " + homology_polynomial([], torsion)))
    for field, triples in facts.get("reduced_khovanov", {}).items():
        rows.append((f"reduced ({field})", homology_polynomial(triples)))
    for field, module in facts.get("bar_natan", {}).items():
        text = "free " + homology_polynomial(module["free"])
        if module["torsion"]:
            text += "; H-torsion " + ", ".join(f"H^{k} at t^{i} q^{j}" + (f" ({c})" if c > 1 else "")
                                                for i, j, k, c in module["torsion"])
        rows.append((f"Bar-Natan ({field})", text))
    if "s" in facts:
        s = facts["s"]
        rows.append(("s", "(for knots; links come from the canonical class)" if s is None
                     else ", ".join(f"{value} over {field}" for field, value in s.items())))
    return rows


def _plural(count: int, word: str) -> str:
    return f"{count} {word}" + ("" if count == 1 else "s")


def invariants_text(label: str, facts: dict) -> str:
    """The readable report of ``movies invariants``: one row per invariant."""
    rows = [
        ("components", str(facts["components"])),
        (
            "crossings",
            f"{facts['crossings']}   (writhe {facts['writhe']}, "
            f"{_plural(facts['seifert_circles'], 'Seifert circle')}, "
            f"{_plural(facts['split_pieces'], 'split piece')})",
        ),
        ("Jones", polynomial_text(facts["jones"])),
        ("signature", str(facts["signature"])),
        ("Alexander", polynomial_text(facts["alexander"])),
        ("determinant", str(facts["determinant"])),
    ]
    for name, value in homology_rows(facts):
        rows.append((name, value))
    matrix = facts["linking_matrix"]
    if len(matrix) <= 1:
        rows.append(("linking numbers", "(one component)" if matrix else "(no components)"))
    else:
        pairs = [f"lk({i + 1},{j + 1}) = {matrix[i][j]}" for i in range(len(matrix)) for j in range(i + 1, len(matrix))]
        rows.append(("linking numbers", ", ".join(pairs)))
    return "\n".join([label] + [f"  {name:<16} {value}" for name, value in rows])


def check_text(data: dict, source: str) -> str:
    """The readable report of ``movies check``, from :func:`movies.checker.report.as_json` data."""
    lines = [f"movie  {data['title'] or '(untitled)'}   [{source}]", ""]
    table = [("step", "line", "move", "crossings", "components", "")]
    table.append(("0", "", "start", str(data["start"]["crossings"]), str(data["start"]["components"]), ""))
    for step in data["steps"]:
        note = step["note"] if step["certified"] else f"UNPROVED: {step['note']}"
        table.append((str(step["step"]), str(step["line"]), step["move"], str(step["crossings"]),
                      str(step["components"]), note))
    widths = [max(len(row[i]) for row in table) for i in range(5)]
    widths[2] = min(widths[2], 36)
    for row in table:
        move = row[2] if len(row[2]) <= widths[2] else row[2][: widths[2] - 1] + "…"
        cells = [row[0].rjust(widths[0]), row[1].rjust(widths[1]), move.ljust(widths[2]),
                 row[3].rjust(widths[3]), row[4].rjust(widths[4])]
        lines.append(("  " + "  ".join(cells) + ("   " + row[5] if row[5] else "")).rstrip())
    for step in data["steps"]:
        if step["found_moves"]:
            lines.append("")
            lines.append(f"  moves found for step {step['step']} (replay them with the ordinary moves):")
            lines.extend(f"    {move}" for move in step["found_moves"])
    s = data["surface"]
    lines.append("")
    if s is None:
        lines.append("surface  not computed: the movie stops at an invalid step")
    else:
        lines.append(
            f"surface  in {s['lives_in']}: Euler characteristic {s['euler_characteristic']} "
            f"({_plural(s['births'], 'birth')}, {_plural(s['saddles'], 'band')}, {_plural(s['deaths'], 'death')})"
        )
        if not s["orientable"]:
            orient = "not orientable"
        elif s["oriented_by_start"]:
            orient = "orientable, oriented compatibly with the start"
        else:
            orient = (f"orientable, but not compatibly with the orientation of the start "
                      f"(step {s['orientation_broken_at_step']} breaks it)")
        if not s["orientable"] and s["orientation_broken_at_step"]:
            orient += f" (step {s['orientation_broken_at_step']} breaks the orientation)"
        lines.append(f"         {orient}")
        for index, c in enumerate(s["components"], start=1):
            shape = f"genus {c['genus']}" if c["orientable"] else _plural(c["crosscaps"], "crosscap")
            lines.append(
                f"         component {index}: {shape}, χ = {c['euler_characteristic']}, "
                f"{_plural(c['boundary_start'], 'boundary circle')} on the start, {c['boundary_end']} on the end"
            )
        lines.append(f"         every component meets the start: {'yes' if s['every_component_meets_start'] else 'no'}; "
                     f"the end: {'yes' if s['every_component_meets_end'] else 'no'}")
        if data["end"]["components"] == 0:
            lines.append(f"         ribbon (no births): {'yes' if s['ribbon'] else 'no'}")
        for claim in s["claims"]:
            lines.append(f"  claim  surface {claim['claim']}: {'holds' if claim['holds'] else 'FALSE'} ({claim['detail']})")
    if "s" in data:
        lines.append("")
        for end in ("start", "end"):
            values = data["s"].get(end)
            shown = ("not computed (a link)" if values is None
                     else ", ".join(f"{v} over {f}" for f, v in values.items()))
            lines.append(f"s        {end}: {shown}")
        for bound in data["bounds"]:
            verdict = "holds" if bound["holds"] else "FAILS"
            tight = ", an equality" if bound["tight"] else ""
            lines.append(f"  bound  {bound['statement']}: {bound['lhs']} >= {bound['rhs']} {verdict}{tight}")
        for end, bounds in data["four_genus_bounds"].items():
            shown = ", ".join(f"{b['invariant']} gives {b['bound']}" for b in bounds)
            lines.append(f"  g4 of the {end} knot is at least: {shown}")
        for statement in data["least_genus"]:
            lines.append(f"  least genus: {statement}")
        for note in data["bound_notes"]:
            lines.append(f"  note   {note}")
    for check in data["checkpoints"]:
        lines.append(f"  line {check['line']}  {check['claim']}: {check['outcome']} ({check['detail']})")
    lines.append("")
    lines.append(f"VERDICT  {data['verdict']}: {data['verdict_meaning']}")
    for finding in data["findings"]:
        where = f"line {finding['line']}, column {finding['column']}"
        lines.append(f"  [{finding['kind']}] {where}: {finding['message']}")
        if finding["evidence"]:
            lines.append(f"      {finding['evidence']}")
    return "\n".join(lines)
