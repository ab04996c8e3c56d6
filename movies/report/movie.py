"""A checked movie as one plain JSON-ready object (the schema is in README.md), and as text.

The text layout reads only the JSON data, so the terminal, the HTML page and a script see the
same facts.

>>> from movies.checker.replay import check_movie
>>> data = as_json(check_movie("start unknot\\ndeath 1\\nsurface disk"))
>>> data["verdict"], data["surface"]["euler_characteristic"], data["end"]
('verified', 1, {'components': 0, 'crossings': 0})
"""

from __future__ import annotations

from movies.checker.judge import ribbon_shown
from movies.checker.result import REFUTED, VERDICT_MEANING, CheckResult
from movies.wording import plural


def _frame(diagram) -> dict:
    return {"components": diagram.component_count(), "crossings": diagram.crossing_count()}


def as_json(result: CheckResult) -> dict:
    """Everything the report says about a checked movie, as plain JSON-ready data.

    The keys are documented in README.md (``movies check --json``); no value is floating point.

    >>> from movies.checker.replay import check_movie
    >>> data = as_json(check_movie("start unlink(2)\\nband 1 2\\ndeath 1"))
    >>> data["verdict"], data["surface"]["lives_in"], data["surface"]["euler_characteristic"]
    ('verified', 'B^4', 0)
    """
    data: dict = {
        "title": result.movie.title,
        "verified": result.verified,
        "verdict": result.verdict,
        "verdict_meaning": VERDICT_MEANING[result.verdict],
        "steps": [
            {
                "step": s.number, "line": s.line, "move": s.source, "kind": s.kind,
                "crossings": s.crossings, "components": s.components, "certified": s.certified,
                "note": s.note, "found_moves": list(s.found),
            }
            for s in result.steps
        ],
        "start": _frame(result.movie.start),
        "end": _frame(result.frames[-1]),
        "findings": [
            {"kind": f.kind, "step": f.step, "line": f.line, "column": f.column, "message": f.message, "evidence": f.evidence}
            for f in result.findings
        ],
        "checkpoints": [
            {"line": c.line, "claim": c.claim, "outcome": c.outcome, "detail": c.detail}
            for c in result.checkpoints
        ],
        "surface": None,
    }
    report = result.bounds
    if report is not None:
        data["s"] = report.s
        data["bounds"] = [b.as_json() for b in report.bounds]
        data["four_genus_bounds"] = {
            end: [{"invariant": g.invariant, "value": g.value, "bound": g.bound, "source": g.source} for g in bounds]
            for end, bounds in report.genus_bounds.items()
        }
        data["least_genus"] = list(report.least_genus)
        data["bound_notes"] = list(report.notes)
    s = result.surface
    if s is not None:
        data["surface"] = {
            **result.ambient().as_json(),
            "euler_characteristic": s.euler_characteristic,
            "births": s.births, "saddles": s.saddles, "deaths": s.deaths,
            "orientable": s.orientable,
            "oriented_by_start": s.oriented_by_start,
            "orientation_broken_at_step": None if s.orientation_broken_at is None else s.orientation_broken_at + 1,
            "ribbon": ribbon_shown(result.movie.start.is_empty(), result.frames[-1].is_empty(), s)[0],
            "connected": s.connected,
            "every_component_meets_start": s.every_component_meets_start,
            "every_component_meets_end": s.every_component_meets_end,
            "components": [
                {
                    "euler_characteristic": c.euler_characteristic, "genus": c.genus, "crosscaps": c.crosscaps,
                    "orientable": c.orientable, "boundary_start": c.boundary_start, "boundary_end": c.boundary_end,
                    "start_components": list(c.start_components), "end_components": list(c.end_components),
                }
                for c in s.components
            ],
            "claims": [{"claim": c.text, "holds": c.holds, "detail": c.detail} for c in result.claims],
        }
    return data


def step_note(step: dict) -> str:
    """The note of a step as the reports show it: uncertified steps are marked.

    >>> step_note({"certified": False, "note": "the search did not reach 0 crossings"})
    'UNPROVED: the search did not reach 0 crossings'
    """
    if step["certified"] or step["note"].startswith(REFUTED):
        return step["note"]
    return f"UNPROVED: {step['note']}"


def as_text(data: dict, source: str) -> str:
    """The readable report of ``movies check``, from :func:`as_json` data.

    >>> from movies.checker.replay import check_movie
    >>> text = as_text(as_json(check_movie("start unknot\\ndeath 1")), "demo")
    >>> text.splitlines()[0], text.splitlines()[-1]
    ('movie  (untitled)   [demo]', 'VERDICT  verified: every step checked and every claim proved')
    """
    lines = [f"movie  {data['title'] or '(untitled)'}   [{source}]", ""]
    table = [("step", "line", "move", "crossings", "components", "")]
    table.append(("0", "", "start", str(data["start"]["crossings"]), str(data["start"]["components"]), ""))
    for step in data["steps"]:
        note = step_note(step)
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
    lines.append("")
    lines.extend(surface_lines(data))
    lines.append("")
    lines.append(f"VERDICT  {data['verdict']}: {data['verdict_meaning']}")
    lines.extend(finding_lines(data))
    return "\n".join(lines)


def surface_lines(data: dict) -> list[str]:
    """The surface, the bounds, the claims and the checkpoints, as the report words them.

    >>> surface_lines({"surface": None, "checkpoints": [], "end": {"components": 0}})
    ['surface  not computed: the movie stops at an invalid step']
    """
    lines: list[str] = []
    s = data["surface"]
    if s is None:
        lines.append("surface  not computed: the movie stops at an invalid step")
    else:
        lines.append(
            f"surface  in {s['lives_in']}, {s['reading']}: Euler characteristic {s['euler_characteristic']} "
            f"({plural(s['births'], 'birth')}, {plural(s['saddles'], 'band')}, {plural(s['deaths'], 'death')})"
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
        if s["blowups"]:
            entries = ", ".join(map(str, s["class"]))
            square = f"square {s['square']}" if s["square"] is not None else "mod 2 (the surface is not orientable)"
            lines.append(f"         class ({entries}) in the blow-ups ({s['definite']}), {square}: "
                         + ("null-homologous" if s["null_homologous"] else "not null-homologous"))
        for index, c in enumerate(s["components"], start=1):
            shape = f"genus {c['genus']}" if c["orientable"] else plural(c["crosscaps"], "crosscap")
            lines.append(
                f"         component {index}: {shape}, χ = {c['euler_characteristic']}, "
                f"{plural(c['boundary_start'], 'boundary circle')} on the start, {c['boundary_end']} on the end"
            )
        lines.append(f"         every component meets the start: {'yes' if s['every_component_meets_start'] else 'no'}; "
                     f"the end: {'yes' if s['every_component_meets_end'] else 'no'}")
        if s["ribbon"]:
            lines.append("         ribbon: yes (no local maxima)")
        elif (data["start"]["components"] == 0) != (data["end"]["components"] == 0) and not s["blowups"]:
            lines.append("         ribbon: not shown by this movie (it has local maxima)")
        for claim in s["claims"]:
            verdict = {True: "holds", False: "FALSE", None: "UNPROVED"}[claim["holds"]]
            lines.append(f"  claim  surface {claim['claim']}: {verdict} ({claim['detail']})")
    if "s" in data:
        lines.append("")
        for end in ("start", "end"):
            values = data["s"].get(end)
            shown = ", ".join(f"{v} over {f}" for f, v in values.items())
            capped = bool(data.get("surface") and any(any(c) for c in data["surface"].get("fiber_caps", ())))
            empty = "   (the empty link)" if data[end]["components"] == 0 and not capped else ""
            if end == "end" and capped:
                empty = "   (the fibers before the caps)"
            lines.append(f"s        {end}: {shown}{empty}")
        lines.extend(bound_lines(data["bounds"]))
        for end, bounds in data["four_genus_bounds"].items():
            shown = ", ".join(f"{b['invariant']} gives {b['bound']}" for b in bounds)
            lines.append(f"  g4 of the {end} knot is at least: {shown}")
        for statement in data["least_genus"]:
            lines.append(f"  least genus: {statement}")
        for note in data["bound_notes"]:
            lines.append(f"  note   {note}")
    for check in data["checkpoints"]:
        lines.append(f"  line {check['line']}  {check['claim']}: {check['outcome']} ({check['detail']})")
    return lines


def bound_lines(bounds: list[dict]) -> list[str]:
    """The inequalities as the report prints them: one line each, or, for a movie with handles
    (statements that start with their k), one line per k and field with each inequality's sides.

    >>> bound_lines([{"statement": "k = 1: every component meets the start: s(end) - s(start) >= chi  [Q]",
    ...               "lhs": 0, "rhs": 0, "holds": True, "tight": True}])
    ['  bound  k = 1 [Q]: s(end) - s(start) = 0 >= chi = 0 (equality)']
    """
    lines = []
    grouped: dict = {}
    for bound in bounds:
        statement = bound["statement"]
        if statement.startswith("k = ") and ": " in statement and statement.endswith("]"):
            k, rest = statement.split(": ", 1)
            text, field = rest.rsplit("  [", 1)
            grouped.setdefault((k, field.rstrip("]")), []).append((text, bound))
            continue
        verdict = "holds" if bound["holds"] else "FAILS"
        tight = ", an equality" if bound["tight"] else ""
        lines.append(f"  bound  {statement}: {bound['lhs']} >= {bound['rhs']} {verdict}{tight}")
    for (k, field), items in grouped.items():
        parts = []
        for text, b in items:
            expression = text.rsplit(": ", 1)[-1].replace(" >= chi", "")  # e.g. "s(end) - s(start)"
            parts.append(f"{expression} = {b['lhs']} >= chi = {b['rhs']}" + ("" if b["holds"] else " FAILS")
                         + (" (equality)" if b["tight"] else ""))
        lines.append(f"  bound  {k} [{field}]: " + "; ".join(parts))
    return lines


def finding_lines(data: dict) -> list[str]:
    """The reasons behind the verdict, one finding (and its evidence) after another.

    >>> finding_lines({"findings": [{"kind": "false", "line": 3, "column": 1, "message": "expected crossings 2",
    ...                              "evidence": "the frame after step 1 has 0 crossings"}]})
    ['  [false] line 3, column 1: expected crossings 2', '      the frame after step 1 has 0 crossings']
    """
    lines = []
    for finding in data["findings"]:
        lines.append(f"  [{finding['kind']}] line {finding['line']}, column {finding['column']}: {finding['message']}")
        if finding["evidence"]:
            lines.append(f"      {finding['evidence']}")
    return lines
