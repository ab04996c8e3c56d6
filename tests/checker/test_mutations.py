"""Mutants of the verified examples: the checker never calls a broken movie verified.

Each mutant changes one step of a verified example (another edge, the other side, the other
sign, over and under swapped, another face, another component). Whatever the checker says, a
mutant it calls verified is replayed here with the diagram engine alone, and must really be a
valid movie whose frames agree with the checker's.
"""

import random
from dataclasses import replace
from pathlib import Path

import pytest

from movies.checker.replay import check_movie
from movies.diagram import moves
from movies.errors import MoveError
from movies.language.movie import parse_movie

EXAMPLES = Path(__file__).resolve().parents[2] / "examples" / "movies"
VERIFIED = ["square-knot-ribbon", "8_20-ribbon", "5_2-sum-ribbon", "5_2-to-5_1-genus-one",
            "trefoil-concordance", "trefoil-moebius-band"]
PER_EXAMPLE = 12


def mutants(movie, frames, rng):
    """(description, mutated movie) pairs, each changing one argument of one explicit step."""
    steps = [s for s in movie.statements if s.kind in ("band", "R1+", "R1-", "R2+", "R2-", "R3", "birth", "death")]
    out = []
    for statement in steps:
        index = movie.statements.index(statement)
        number = [s for s in movie.statements if s.kind in
                  ("band", "R1+", "R1-", "R2+", "R2-", "R3", "birth", "death", "simplify", "isotopic")].index(statement)
        frame = frames[number]
        a = {k: v for k, v in statement.record.arguments().items() if v is not None}
        options = []
        for key in ("first", "second", "edge", "over", "under"):
            if key in a:
                for edge in frame.edges():
                    if edge != a[key]:
                        options.append((key, edge))
        if "face" in a:
            options += [("face", f) for f in list(frame.faces) + [max(frame.faces) + 1] if f != a["face"]]
        if "hand" in a:
            options.append(("hand", "R" if a["hand"] == "L" else "L"))
        if "sign" in a:
            options.append(("sign", -a["sign"]))
        if "over" in a:
            options.append(("swap", None))
        if "crossing" in a:
            options += [("crossing", c) for c in frame.crossings if c != a["crossing"]]
        if "component" in a:
            options += [("component", k) for k in frame.components if k != a["component"]]
        for key, value in options:
            b = {}
            if key == "swap":
                b["over"], b["under"] = a["under"], a["over"]
            else:
                b[key] = value
            changed = replace(statement, record=replace(statement.record, **b))
            statements = movie.statements[:index] + (changed,) + movie.statements[index + 1:]
            out.append((f"line {statement.line}: {key} -> {value}", replace(movie, statements=statements)))
    rng.shuffle(out)
    return out[:PER_EXAMPLE]


def replay_alone(movie, result):
    """Replay every step with the move functions; simplify steps through the moves the checker found."""
    frame = movie.start
    records = iter(result.steps)
    for statement in movie.statements:
        if statement.kind not in ("band", "R1+", "R1-", "R2+", "R2-", "R3", "birth", "death", "simplify", "isotopic"):
            continue
        record = next(records)
        a = statement.record.arguments() if statement.record is not None else statement.args
        if statement.kind == "band":
            frame = moves.saddle(frame, a["first"], a["second"], a["face"]).diagram
        elif statement.kind == "R1+":
            frame = moves.r1_add(frame, a["edge"], a["hand"], a["sign"])
        elif statement.kind == "R1-":
            frame = moves.r1_remove(frame, a["crossing"], a["kink"])
        elif statement.kind == "R2+":
            frame = moves.r2_add(frame, a["over"], a["under"], a["face"])
        elif statement.kind == "R2-":
            frame = moves.r2_remove(frame, a["face"])
        elif statement.kind == "R3":
            frame = moves.r3(frame, a["face"])
        elif statement.kind == "birth":
            frame = moves.birth(frame, a["face"], a["counterclockwise"])
        elif statement.kind == "death":
            frame = moves.death(frame, a["component"])
        elif statement.kind == "simplify":
            found = parse_movie("start unknot\n" + "\n".join(record.found))
            for step in found.statements:
                frame = _explicit(frame, step)
        else:  # an isotopy claim: the checker certified it (a verified movie has no unproved claims)
            assert record.certified
            frame = a["diagram"]
    return frame


def _explicit(frame, step):
    a = step.record.arguments()
    return {
        "R1+": lambda: moves.r1_add(frame, a["edge"], a["hand"], a["sign"]),
        "R1-": lambda: moves.r1_remove(frame, a["crossing"], a["kink"]),
        "R2+": lambda: moves.r2_add(frame, a["over"], a["under"], a["face"]),
        "R2-": lambda: moves.r2_remove(frame, a["face"]),
        "R3": lambda: moves.r3(frame, a["face"]),
    }[step.kind]()


@pytest.mark.parametrize("name", VERIFIED)
def test_mutants_are_never_wrongly_verified(name):
    movie = parse_movie((EXAMPLES / f"{name}.movie").read_text())
    original = check_movie(movie, budget=1)
    assert original.verified
    rng = random.Random(name)
    verdicts = []
    for description, mutant in mutants(movie, original.frames, rng):
        result = check_movie(mutant, budget=1)
        verdicts.append(result.verdict)
        if result.verified:
            try:
                end = replay_alone(mutant, result)
            except MoveError as err:  # pragma: no cover - this is the failure the test exists for
                pytest.fail(f"{name}, {description}: called verified, but a step is illegal: {err}")
            assert end == result.frames[-1], description
    # the mutants must exercise the checker, not all pass through
    assert any(v != "verified" for v in verdicts)
