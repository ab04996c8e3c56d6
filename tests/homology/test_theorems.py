"""s and Khovanov homology against theorems, on torus knots, positive braids, sums and mirrors."""

from __future__ import annotations

import random

import pytest

from homology.helpers import assert_complex_euler_matches_jones, assert_euler_matches_jones
from movies.diagram.constructors import connected_sum, from_braid, mirror, torus_link
from movies.diagram.pd import from_pd
from movies.diagram.tables import lookup, table_names
from movies.homology import bar_natan_homology, khovanov_homology, rasmussen_s

TORUS = [(2, 3), (2, 5), (2, 7), (3, 4), (3, 5), (3, 7), (4, 5), (4, 7), (5, 6)]


@pytest.mark.parametrize("p,q", TORUS)
def test_positive_torus_knots(p, q):
    d = torus_link(p, q)
    assert d.component_count() == 1 and set(d.signs.values()) == {1}
    # Rasmussen 2010, Thm. 4 (s of a positive knot; for torus knots the Milnor conjecture):
    # s(T(p, q)) = (p - 1)(q - 1)
    assert rasmussen_s(d) == (p - 1) * (q - 1)
    if p * q < 20:
        assert_complex_euler_matches_jones(d)


@pytest.mark.parametrize("p,q", TORUS[:6])
def test_negative_torus_knots_over_f2(p, q):
    # Rasmussen 2010 with s(mirror) = -s; over F2 through Bar-Natan's theory (Turner 2006)
    assert rasmussen_s(mirror(torus_link(p, q)), "F2") == -(p - 1) * (q - 1)


def _positive_braid_knots(seed, count):
    rng = random.Random(seed)
    found = []
    while len(found) < count:
        strands = rng.randint(2, 5)
        word = [rng.randint(1, strands - 1) for _ in range(rng.randint(strands, 14))]
        if set(word) != set(range(1, strands)):
            continue
        d = from_braid(word, strands)
        if d.component_count() == 1:
            found.append(word)
    return found


@pytest.mark.parametrize("word", _positive_braid_knots(3, 14), ids=str)
def test_positive_diagrams(word):
    d = from_braid(word)
    # Rasmussen 2010, Thm. 4 (positive knots): for a positive diagram
    # s = w - O + 1, w the writhe and O the number of Seifert circles
    expected = d.writhe() - d.seifert_circle_count() + 1
    assert rasmussen_s(d) == expected
    assert rasmussen_s(d, "F2") == expected
    assert_complex_euler_matches_jones(d)


def _knot_pairs(seed, count):
    rng = random.Random(seed)
    names = [n for n in table_names("knot", 8) if n != "0_1"]
    return [(rng.choice(names), rng.choice(names)) for _ in range(count)]


@pytest.mark.parametrize("first,second", _knot_pairs(17, 6))
def test_connected_sums_and_mirrors(first, second):
    a, b = from_pd(lookup(first).pd), from_pd(lookup(second).pd)
    sa, sb = rasmussen_s(a), rasmussen_s(b)
    # Rasmussen 2010, Thm. 2: s(K1 # K2) = s(K1) + s(K2); Thm. 3: s(mirror K) = -s(K)
    assert rasmussen_s(connected_sum(a, b)) == sa + sb
    assert rasmussen_s(mirror(a)) == -sa
    assert_complex_euler_matches_jones(connected_sum(a, b))
    assert rasmussen_s(connected_sum(a, mirror(b)), "F2") == sa - sb


def test_free_part_of_links():
    # Lee 2005, Prop. 2.3 (carried to Bar-Natan's theory by Turner 2006 and Khovanov 2006): the
    # free part of Bar-Natan homology of an n-component link has rank 2^n
    for name in table_names("link", 7)[::5]:
        d = from_pd(lookup(name).pd)
        free = bar_natan_homology(d, "Q")["free"]
        assert sum(free.values()) == 2 ** d.component_count()
        assert_complex_euler_matches_jones(d, "Q")


def test_mirror_dualises_khovanov_homology():
    # Khovanov 2000, "A categorification of the Jones polynomial", mirror duality (from memory):
    # over a field Kh^{i,j}(mirror L) = Kh^{-i,-j}(L)
    for name in ["8_19", "9_42", "10_132", "L6a4{0,0}"]:
        d = from_pd(lookup(name).pd)
        kh = khovanov_homology(d, "F3")
        assert_euler_matches_jones(d, kh)
        assert khovanov_homology(mirror(d), "F3") == {(-i, -j): r for (i, j), r in kh.items()}
