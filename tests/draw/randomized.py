"""Diagrams and movies made at random from a seed, for the drawing tests and benchmark."""

from __future__ import annotations

import random

from movies.diagram import moves
from movies.diagram.constructors import disjoint_union, from_braid, mirror, unknot
from movies.diagram.tables import table_names
from movies.errors import MoveError
from movies.language.spec import parse_diagram


def random_braid(seed: int, length: int = 12, strands: int = 4):
    """The closure of a random braid word (some strands may stay untouched: circles)."""
    rng = random.Random(seed)
    word = [rng.choice([1, -1]) * rng.randint(1, strands - 1) for _ in range(rng.randint(1, length))]
    return from_braid(word, strands=strands)


def random_split(seed: int, pieces: int = 3):
    """Pieces nested in random faces of each other: knots, braid closures and circles."""
    rng = random.Random(seed)
    knots = table_names("knot", max_crossings=7)

    def piece():
        pick = rng.random()
        if pick < 0.3:
            return unknot()
        if pick < 0.65:
            d = parse_diagram(rng.choice(knots[1:]))
            return mirror(d) if rng.random() < 0.5 else d
        return random_braid(rng.randint(0, 10 ** 6), length=6, strands=3)

    diagram = piece()
    for _ in range(pieces - 1):
        other = piece()
        diagram = disjoint_union(diagram, other, rng.choice(sorted(diagram.faces)), rng.choice(sorted(other.faces)))
    return diagram


def random_movie(seed: int, steps: int = 40, crossings: int = 15) -> tuple[str, list]:
    """A movie text of random legal moves from a braid closure, and the frames it passes."""
    rng = random.Random(seed)
    word = [rng.choice([1, 2, 3, -1, -2, -3]) for _ in range(crossings)]
    frame = from_braid(word, strands=4)
    lines = [f"title random movie {seed}", f"start braid(4){word}".replace(" ", "")]
    frames = [frame]
    while len(lines) - 2 < steps:
        choice = rng.random()
        try:
            if choice < 0.2 and frame.crossing_count() < crossings + 3:
                edge = rng.choice(frame.edges())
                hand, sign = rng.choice("LR"), rng.choice([1, -1])
                new = moves.r1_add(frame, edge, hand, sign)
                text = f"R1 add {edge} {'left' if hand == 'L' else 'right'} {'+' if sign > 0 else '-'}"
            elif choice < 0.4:
                kinks = [c for c in frame.crossings if moves.kinks_at(frame, c)]
                c = rng.choice(kinks)
                new, text = moves.r1_remove(frame, c), f"R1 remove {c}"
            elif choice < 0.55 and frame.crossing_count() < crossings + 2:
                face = rng.choice(sorted(frame.faces))
                edges = sorted({s.edge for cycle in frame.faces[face] for s in cycle})
                a, b = rng.sample(edges, 2)
                new, text = moves.r2_add(frame, a, b, face), f"R2 add {a} over {b} in face {face}"
            elif choice < 0.75:
                face = rng.choice(sorted(frame.faces))
                new, text = moves.r2_remove(frame, face), f"R2 remove face {face}"
            elif choice < 0.92:
                face = rng.choice(sorted(frame.faces))
                new, text = moves.r3(frame, face), f"R3 face {face}"
            elif choice < 0.96:
                face = rng.choice(sorted(frame.faces))
                new, text = moves.birth(frame, face), f"birth in face {face}"
            else:
                face = rng.choice(sorted(frame.faces))
                edges = sorted({s.edge for cycle in frame.faces[face] for s in cycle})
                a, b = rng.sample(edges, 2)
                new, text = moves.saddle(frame, a, b, face).diagram, f"band {a} {b} in face {face}"
        except (MoveError, ValueError, IndexError):
            continue
        frame = new
        frames.append(frame)
        lines.append(text)
    return "\n".join(lines) + "\n", frames
