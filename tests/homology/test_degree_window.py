"""The scan cut to a window of homological degrees gives the same answers inside the window.

s only needs Bar-Natan homology in degree 0, so the engine scans only degrees -1..1 for it
(``scan_complex(..., degrees=...)``). These tests compare the cut scan with the whole one, and s
from the cut scan with the table.
"""

from __future__ import annotations

import random

import pytest

from movies.diagram.constructors import from_braid, mirror, torus_link
from movies.diagram.tables import table_names, table_row
from movies.homology.canonical import canonical_complex, s_from_canonical
from movies.homology.graded import bar_natan_module, khovanov_integral
from movies.homology.khovanov import S_DEGREES, bar_natan_complex, rasmussen_s, s_from_complex
from movies.language.spec import parse_diagram

KNOTS = random.Random(5).sample(table_names("knot", max_crossings=12)[1:], 30)
LINKS = random.Random(6).sample(table_names("link", 10), 12)


def _inside(table: dict, lo: int, hi: int) -> dict:
    return {k: v for k, v in table.items() if lo < k[0] < hi}


@pytest.mark.parametrize("name", KNOTS)
def test_s_from_the_window_against_the_table(name):
    d = parse_diagram(name)
    cut = bar_natan_complex(d, "Z", degrees=S_DEGREES)
    # KnotInfo column rasmussen_invariant (over Q)
    assert s_from_complex(cut, 0) == int(table_row(name)["rasmussen_invariant"])
    whole = bar_natan_complex(d, "Z")
    assert s_from_complex(cut, 2) == s_from_complex(whole, 2)
    # Rasmussen 2010: s of the mirror image is -s
    assert s_from_complex(bar_natan_complex(mirror(d), "Z", degrees=S_DEGREES), 0) == -s_from_complex(cut, 0)


@pytest.mark.parametrize("name", LINKS + ["3_1 # 4_1", "8_20", "12n_242"])
@pytest.mark.parametrize("window", [(-2, 2), (1, 4), (-5, -1)])
def test_homology_inside_a_window_equals_the_whole(name, window):
    d = parse_diagram(name)
    whole = bar_natan_complex(d, "Z")
    cut = bar_natan_complex(d, "Z", degrees=window)
    lo, hi = window
    assert all(lo <= h <= hi for h, _ in cut.generators)
    for p in (0, 2):
        full = bar_natan_module(whole, p)
        part = bar_natan_module(cut, p)
        for key in ("free", "torsion"):
            assert _inside(part[key], lo, hi) == _inside(full[key], lo, hi)
    integral, part = khovanov_integral(whole), khovanov_integral(cut)
    for key in ("free", "torsion"):
        assert _inside(part[key], lo, hi) == _inside(integral[key], lo, hi)


def test_a_wrong_window_would_show():
    # the checks above can fail: homology at the edge of a window is not the whole complex's
    d = parse_diagram("6_1")
    whole = khovanov_integral(bar_natan_complex(d, "Z"))["free"]
    cut = khovanov_integral(bar_natan_complex(d, "Z", degrees=(-1, 0)))["free"]
    assert {k: v for k, v in cut.items() if k[0] == 0} != {k: v for k, v in whole.items() if k[0] == 0}


@pytest.mark.parametrize("name", LINKS)
def test_link_s_through_the_canonical_class_in_a_window(name):
    d = parse_diagram(name)
    if d.piece_count() != 1 or d.loops:
        pytest.skip("one piece with crossings only")
    whole, cut = canonical_complex(d), canonical_complex(d, degrees=S_DEGREES)
    for field in ("Q", "F2", "F3"):
        assert s_from_canonical(cut, field) == s_from_canonical(whole, field)


@pytest.mark.parametrize("p, q", [(2, 7), (3, 5), (4, 5), (5, 6), (6, 7)])
def test_positive_torus_knots(p, q):
    # Rasmussen 2010, positive knots: s = 2g = (p - 1)(q - 1) for T(p, q)
    knot = torus_link(p, q)
    assert rasmussen_s(knot) == (p - 1) * (q - 1)
    assert rasmussen_s(mirror(knot), "F2") == -(p - 1) * (q - 1)


def test_a_positive_braid_that_is_not_a_torus_knot():
    # Rasmussen 2010: s of a positive braid closure is w - n + 1 (writhe minus strands plus one)
    word = [1, 1, 2, 1, 1, 3, 2, 2, 3, 3, 1, 2, 3]
    knot = from_braid(word)
    assert knot.component_count() == 1
    assert rasmussen_s(knot) == len(word) - 4 + 1
