"""Differential tests: the scanning engine against the whole cube on random diagrams."""

from __future__ import annotations

import random

import pytest

from homology.helpers import assert_euler_matches_jones
from homology.reference_cube import cube_homology, cube_homology_z
from movies.diagram.constructors import from_braid
from movies.diagram.pd import crossing_signs, from_pd
from movies.diagram.tables import lookup, table_names
from movies.homology import bar_natan_complex, khovanov_homology


def _switch(pd, which):
    """Change the crossings with the given indices (over <-> under)."""
    signs = crossing_signs(pd)
    out = []
    for k, (c, s) in enumerate(zip(pd, signs)):
        a, b, cc, d = c
        if k in which:
            c = (d, a, b, cc) if s > 0 else (b, cc, d, a)
        out.append(tuple(c))
    return out


def _random_braids(seed, count, max_len, max_strands):
    rng = random.Random(seed)
    for _ in range(count):
        strands = rng.randint(2, max_strands)
        word = [rng.choice((1, -1)) * rng.randint(1, strands - 1) for _ in range(rng.randint(1, max_len))]
        yield from_braid(word, strands)


def _random_switched(seed, count, max_crossings, exact=False):
    rng = random.Random(seed)
    names = [n for n in table_names("knot", max_crossings) if n != "0_1"]
    names += table_names("link", max_crossings)
    if exact:
        names = [n for n in names if len(lookup(n).pd) == max_crossings]
    for _ in range(count):
        pd = [tuple(c) for c in lookup(rng.choice(names)).pd]
        which = {k for k in range(len(pd)) if rng.random() < 0.4}
        yield from_pd(_switch(pd, which))


def _compare(d, fields=("Q", "F2")):
    pd = d.pd_code()
    for p, field in zip((0, 2, 3), ("Q", "F2", "F3")):
        if field not in fields:
            continue
        got = khovanov_homology(d, field)
        assert got == cube_homology(pd, p, loops=d.loop_count()), (pd, field)
        if field == "Q":
            assert_euler_matches_jones(d, got)


@pytest.mark.parametrize("d", list(_random_braids(7, 30, 8, 4)), ids=lambda d: str(d.pd_code()))
def test_random_braid_closures(d):
    _compare(d, ("Q", "F2", "F3"))
    # the integral homology, with its torsion, from the cube
    assert khovanov_homology(d, "Z") == cube_homology_z(d.pd_code(), loops=d.loop_count())


@pytest.mark.parametrize("d", list(_random_switched(11, 16, 9)), ids=lambda d: str(d.pd_code()))
def test_random_crossing_changes_of_table_diagrams(d):
    _compare(d)
    pd = d.pd_code()
    edge = pd[0][0]
    for p, field in ((0, "Q"), (2, "F2")):
        assert khovanov_homology(d, field, reduced=True, basepoint=edge) == cube_homology(pd, p, basepoint=edge)


@pytest.mark.parametrize("d", list(_random_switched(5, 3, 10, exact=True)), ids=lambda d: str(d.pd_code()))
def test_ten_crossings(d):
    assert len(d.crossings) == 10
    _compare(d, ("Q", "F2"))


def test_final_complex_is_a_complex_over_z_h():
    # d^2 = 0 in Z[H]: the entries compose to zero after the powers of H are put back
    d = from_pd(lookup("8_19").pd)
    final = bar_natan_complex(d)
    square: dict = {}
    for (i, j), c in final.entries.items():
        for (j2, k), c2 in final.entries.items():
            if j2 == j:
                square[(i, k)] = square.get((i, k), 0) + c * c2
    assert not any(square.values())
    # the complex is small: Bar-Natan's simplification leaves few generators
    assert len(final.generators) < 40
