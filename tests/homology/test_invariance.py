"""Reidemeister moves leave the homology unchanged (the engine on diagrams made by moves)."""

from __future__ import annotations

import random

import pytest

from movies.diagram import moves
from movies.diagram.pd import from_pd
from movies.diagram.tables import lookup
from movies.errors import MoviesError
from movies.homology import bar_natan_homology, khovanov_homology

NAMES = ["3_1", "4_1", "5_2", "L4a1{0}"]


def _moved(name, seed):
    """A few random R1 and R2 moves (and R3 where one applies) on a table diagram."""
    rng = random.Random(seed)
    d = from_pd(lookup(name).pd)
    for _ in range(3):
        kind = rng.choice(("r1", "r2", "r3"))
        if kind == "r1":
            d = moves.r1_add(d, rng.choice(d.edges()), rng.choice("LR"), rng.choice((1, -1)))
        elif kind == "r2":
            face = rng.choice(sorted(d.faces))
            edges = sorted({side.edge for cycle in d.faces[face] for side in cycle})
            if len(edges) >= 2:
                over, under = rng.sample(edges, 2)
                d = moves.r2_add(d, over, under, face)
        else:
            for face in sorted(d.faces):
                try:
                    d = moves.r3(d, face)
                    break
                except MoviesError:  # no R3 at this face
                    continue
    return d


@pytest.mark.parametrize("name", NAMES)
@pytest.mark.parametrize("seed", [1, 2])
def test_reidemeister_invariance(name, seed):
    before = from_pd(lookup(name).pd)
    after = _moved(name, seed)
    assert len(after.crossings) > len(before.crossings) or after.pd_code() != before.pd_code()
    # Khovanov 2000 and Bar-Natan 2005: the homology is a link invariant (Reidemeister moves)
    assert khovanov_homology(after, "Z") == khovanov_homology(before, "Z")
    assert bar_natan_homology(after, "F2") == bar_natan_homology(before, "F2")
    if before.component_count() == 1:  # for links reduced homology depends on the component
        assert khovanov_homology(after, "Q", reduced=True) == khovanov_homology(before, "Q", reduced=True)
