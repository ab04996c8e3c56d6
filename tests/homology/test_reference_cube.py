"""The whole-cube reference against the tables: it pins down the conventions the engine uses."""

from __future__ import annotations

import pytest

from homology.helpers import integral_of, ranks_of
from homology.reference_cube import cube_homology, cube_homology_z
from movies.diagram.constructors import mirror
from movies.diagram.pd import from_pd
from movies.diagram.tables import lookup, table_row

KNOTS = ["3_1", "4_1", "5_1", "5_2", "6_1"]
LINKS = ["L2a1{0}", "L2a1{1}", "L4a1{0}", "L4a1{1}"]


def test_unknot():
    # Khovanov 2000: Kh(unknot) = q + q^-1
    assert cube_homology([], loops=1) == {(0, -1): 1, (0, 1): 1}
    assert cube_homology([], p=2, loops=1) == {(0, -1): 1, (0, 1): 1}


def test_trefoil_values_of_the_design_page():
    trefoil = [(1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)]
    # KnotInfo column khovanov_unreduced_integral_polynomial: Kh(3_1; Q) = q + q^3 + t^2 q^5 + t^3 q^9, over Z a Z/2 at t^3 q^7
    assert cube_homology(trefoil) == {(0, 1): 1, (0, 3): 1, (2, 5): 1, (3, 9): 1}
    assert cube_homology_z(trefoil)["torsion"] == {(3, 7): {2: 1}}


@pytest.mark.parametrize("name", KNOTS)
def test_knots_against_knotinfo(name):
    pd = lookup(name).pd
    row = table_row(name)
    # KnotInfo column khovanov_unreduced_integral_polynomial
    assert cube_homology_z(pd) == integral_of(row["khovanov_unreduced_integral_polynomial"])
    # KnotInfo column khovanov_reduced_rational_polynomial
    assert cube_homology(pd, basepoint=pd[0][0]) == ranks_of(row["khovanov_reduced_rational_polynomial"])
    # KnotInfo column khovanov_reduced_mod2_polynomial
    assert cube_homology(pd, p=2, basepoint=pd[0][0]) == ranks_of(row["khovanov_reduced_mod2_polynomial"])


def test_mirror_trefoil():
    d = mirror(from_pd(lookup("3_1").pd))
    got = cube_homology_z(d.pd_code())
    # Khovanov 2000, mirror duality with the universal coefficient theorem (from memory): the
    # free part goes to (-i, -j), torsion from (i, j) to (1 - i, -j)
    assert got["free"] == {(0, -1): 1, (0, -3): 1, (-2, -5): 1, (-3, -9): 1}
    assert got["torsion"] == {(-2, -7): {2: 1}}


@pytest.mark.parametrize("name", LINKS)
def test_links_against_linkinfo(name):
    pd = lookup(name).pd
    # LinkInfo column khovanov_polynomial (unreduced, rational)
    assert cube_homology(pd) == ranks_of(table_row(name)["khovanov_polynomial"])
