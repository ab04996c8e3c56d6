"""The plane geometry under the drawings: sampling, crossing segments, room inside a polygon."""

from __future__ import annotations

import random
from fractions import Fraction

import numpy as np
import pytest

from movies.draw.geometry import crossings_between, sample
from movies.draw.layout import _conjugate_gradient, inscribed_disk


def _proper_exact(p, q, r, s) -> bool:
    """Whether segments pq and rs cross at a point inside both, in exact arithmetic."""
    p, q, r, s = [tuple(Fraction(v) for v in point) for point in (p, q, r, s)]

    def orient(a, b, c):
        value = (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0])
        return (value > 0) - (value < 0)

    return orient(p, q, r) * orient(p, q, s) < 0 and orient(r, s, p) * orient(r, s, q) < 0


def _wiggle(rng, steps):
    """A polyline of short steps and a few long ones (the grid of cells and the long-segment path)."""
    x, y = rng.randint(0, 40) / 4, rng.randint(0, 40) / 4
    line = [(x, y)]
    for _ in range(steps):
        reach = rng.choice([1, 1, 1, 20])
        x, y = x + rng.randint(-reach, reach) / 8, y + rng.randint(-reach, reach) / 8
        line.append((x, y))
    return line


@pytest.mark.parametrize("seed", range(12))
def test_crossings_between_agrees_with_exact_orientation_tests(seed):
    rng = random.Random(seed)
    if seed < 6:
        lines = [[(rng.randint(0, 40) / 4, rng.randint(0, 40) / 4) for _ in range(rng.randint(2, 6))] for _ in range(6)]
    else:
        lines = [_wiggle(rng, rng.randint(5, 40)) for _ in range(5)]
    expected = set()
    segments = [(i, k, line[k], line[k + 1]) for i, line in enumerate(lines) for k in range(len(line) - 1)]
    for x in range(len(segments)):
        for y in range(x + 1, len(segments)):
            i, s, p, q = segments[x]
            j, t, r, u = segments[y]
            if _proper_exact(p, q, r, u):
                expected.add((i, s, j, t))
    found = {(i, s, j, t) for i, s, j, t, _ in crossings_between(lines)}
    assert found == expected


def test_touching_at_an_end_is_not_a_crossing():
    # two strands meeting at one point, as the four ends at a crossing point do
    assert crossings_between([[(0, 0), (1, 1)], [(1, 1), (2, 0)], [(1, 1), (1, 3)]]) == []
    # a closed polyline that crosses itself once (a figure eight)
    assert len(crossings_between([[(0, 0), (2, 2), (2, 0), (0, 2)]], closed=[True])) == 1


def test_sample_follows_the_quadratic():
    points = sample([("Q", (0.0, 0.0), (1.0, 2.0), (2.0, 0.0))], steps=4)
    # B(t) = (2t, 4t(1-t))
    assert points == [(0.0, 0.0), (0.5, 0.75), (1.0, 1.0), (1.5, 0.75), (2.0, 0.0)]


def test_inscribed_disk_of_an_l_shape_lies_inside_it():
    polygon = [(0, 0), (6, 0), (6, 2), (2, 2), (2, 6), (0, 6)]
    (x, y), r = inscribed_disk(polygon)
    # the best disk touches the inner corner (2, 2) and both outer sides: r = 2 - 2 / (1 + sqrt 2)
    assert r == pytest.approx(2 * 2 ** 0.5 / (1 + 2 ** 0.5), rel=0.02)
    for (ax, ay), (bx, by) in zip(polygon, polygon[1:] + polygon[:1]):
        # distance from the centre to each side is at least the radius
        t = max(0.0, min(1.0, ((x - ax) * (bx - ax) + (y - ay) * (by - ay)) / ((bx - ax) ** 2 + (by - ay) ** 2)))
        assert ((x - ax - t * (bx - ax)) ** 2 + (y - ay - t * (by - ay)) ** 2) ** 0.5 >= r - 1e-9
    assert 0 < x < 2 and 0 < y < 2


def test_conjugate_gradient_solves_a_laplacian_system():
    rng = np.random.default_rng(3)
    n = 40
    weights = rng.uniform(0.1, 2.0, size=(n, n))
    weights = np.triu(weights, 1)
    weights = weights + weights.T
    matrix = np.diag(weights.sum(axis=1) + 1.0) - weights
    rhs = rng.normal(size=(n, 2))
    solved = _conjugate_gradient(lambda v: matrix @ v, rhs, np.zeros((n, 2)), np.diag(matrix).copy())
    assert np.allclose(matrix @ solved, rhs, atol=1e-9)
