"""A checked movie as one plain JSON-ready object (the schema is in README.md).

>>> from movies.language.movie import parse_movie
>>> from movies.checker.replay import check_movie
>>> data = as_json(check_movie(parse_movie("start unknot\\ndeath 1\\nsurface disk")))
>>> data["verdict"], data["surface"]["euler_characteristic"], data["end"]
('verified', 1, {'components': 0, 'crossings': 0})
"""

from __future__ import annotations

from movies.checker.replay import VERDICT_MEANING, CheckResult


def _frame(diagram) -> dict:
    return {"components": diagram.component_count(), "crossings": diagram.crossing_count()}


def where_it_lives(result: CheckResult) -> str:
    """S³ × I, B⁴ (one end empty) or S⁴ (both empty)."""
    empty = [result.movie.start.is_empty(), result.frames[-1].is_empty()]
    if all(empty):
        return "S^4"
    if any(empty):
        return "B^4"
    return "S^3 x I"


def as_json(result: CheckResult) -> dict:
    """Everything the report says, as plain data."""
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
            {"line": statement.line, "claim": statement.source.split("%")[0].strip(), "outcome": outcome, "detail": detail}
            for statement, outcome, detail in result.checkpoints
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
            "lives_in": where_it_lives(result),
            "euler_characteristic": s.euler_characteristic,
            "births": s.births, "saddles": s.saddles, "deaths": s.deaths,
            "orientable": s.orientable,
            "oriented_by_start": s.oriented_by_start,
            "orientation_broken_at_step": None if s.orientation_broken_at is None else s.orientation_broken_at + 1,
            "ribbon": result.frames[-1].is_empty() and s.births == 0,
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
            "claims": [{"claim": fact if value is None else f"{fact} {value}", "holds": holds, "detail": detail}
                       for fact, value, holds, detail in result.claims],
        }
    return data
