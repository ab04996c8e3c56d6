"""The canonical class carried through the scan: s of knots against the table, its internal checks."""

import random

import pytest

from movies.diagram.tables import table_names, table_row
from movies.homology import rasmussen_s
from movies.homology.canonical import _check_cycle, canonical_complex, checkerboard, s_from_canonical
from movies.errors import InternalError
from movies.homology.errors import HomologyError
from movies.homology.scanning import FinalComplex
from movies.language.spec import parse_diagram

SAMPLE = random.Random(17).sample(table_names("knot", max_crossings=11)[1:], 40)


@pytest.mark.parametrize("name", SAMPLE)
def test_knots_against_the_table_and_the_free_part(name):
    d = parse_diagram(name)
    canonical = canonical_complex(d)
    # KnotInfo column rasmussen_invariant
    assert s_from_canonical(canonical, "Q") == int(table_row(name)["rasmussen_invariant"])
    for field in ("F2", "F3"):
        assert s_from_canonical(canonical, field) == rasmussen_s(d, field)


def test_checkerboard_colours_faces_across_every_edge_apart():
    for name in ["3_1", "L6a4{0,0}", "unlink(2)", "3_1 # 4_1", "L7n1{1}"]:
        d = parse_diagram(name)
        colour = checkerboard(d)
        assert set(colour) == set(d.faces)
        for edge in d.edges():
            left, right = d.faces_beside(edge)
            assert colour[left] != colour[right]


def test_the_cycle_checks_can_fail():
    canonical = canonical_complex(parse_diagram("4_1"))
    final = canonical.final
    degree_zero = [i for i, (h, _) in enumerate(final.generators) if h == 0]
    outside = [i for i, (h, _) in enumerate(final.generators) if h != 0]
    with pytest.raises(InternalError, match="term at"):
        _check_cycle(final, {outside[0]: 1}, canonical.q)
    with pytest.raises(InternalError, match="term at"):
        _check_cycle(final, {degree_zero[0]: 1}, final.generators[degree_zero[0]][1] + 2)  # q too high
    # a generator with a nonzero differential is not a cycle on its own
    with pytest.raises(InternalError, match="not a cycle"):
        _check_cycle(FinalComplex([(0, 0), (1, 2)], {(0, 1): 1}), {0: 1}, 0)


def test_needs_a_field_and_crossings():
    d = parse_diagram("3_1")
    with pytest.raises(HomologyError, match="over a field"):
        s_from_canonical(canonical_complex(d), "Z")
    with pytest.raises(HomologyError, match="whose every circle has a crossing"):
        canonical_complex(parse_diagram("unknot"))
