"""The public functions: shapes of the results, errors, progress, special diagrams."""

from __future__ import annotations

import pytest

from movies.diagram.constructors import disjoint_union, from_braid, unknot, unlink
from movies.diagram.pd import from_pd
from movies.errors import MoviesError
from movies.homology import (
    FieldError,
    NotAKnotError,
    bar_natan_homology,
    khovanov_homology,
    poincare_polynomial,
    rasmussen_s,
)
from support.diagrams import TREFOIL_PD as TREFOIL



def test_unknot_and_unlinks():
    # Khovanov 2000: Kh(unknot) = q + q^-1; Kh is multiplicative under disjoint union (common
    # practice, no source)
    assert khovanov_homology(unknot()) == {(0, -1): 1, (0, 1): 1}
    assert khovanov_homology(unlink(2)) == {(0, -2): 1, (0, 0): 2, (0, 2): 1}
    assert khovanov_homology(unlink(0)) == {(0, 0): 1}
    assert khovanov_homology(unknot(), reduced=True) == {(0, 0): 1}
    assert rasmussen_s(unknot()) == 0


def test_split_diagram_is_a_product():
    d = disjoint_union(from_pd(TREFOIL), from_pd(TREFOIL))
    single = khovanov_homology(from_pd(TREFOIL), "F2")
    product: dict = {}
    for (i, j), r in single.items():
        for (k, l), u in single.items():
            product[(i + k, j + l)] = product.get((i + k, j + l), 0) + r * u
    # Kunneth over a field (common practice, no source)
    assert khovanov_homology(d, "F2") == product


def test_kinks_do_not_change_homology():
    # Reidemeister I invariance (Khovanov 2000)
    assert khovanov_homology(from_pd([[1, 1, 2, 2]]), "Z") == {"free": {(0, -1): 1, (0, 1): 1}, "torsion": {}}
    assert khovanov_homology(from_pd([[2, 1, 1, 2]]), "Z") == {"free": {(0, -1): 1, (0, 1): 1}, "torsion": {}}


def test_pd_code_accepted_and_bar_natan_shape():
    result = bar_natan_homology(TREFOIL, "F2")
    assert result["free"] == {(0, 1): 1, (0, 3): 1}
    # over F2[H] the trefoil has two H-torsion summands F2[H]/H in degree 3
    assert result["torsion"] == {(3, 7): {1: 1}, (3, 9): {1: 1}}


def test_poincare_polynomial():
    assert poincare_polynomial(TREFOIL) == "q + q^3 + t^2 q^5 + t^3 q^9"
    assert poincare_polynomial(TREFOIL, "Z") == "q + q^3 + t^2 q^5 + t^3 q^9 + Z/2 t^3 q^7"
    assert poincare_polynomial(TREFOIL, reduced=True) == "q^2 + t^2 q^6 + t^3 q^8"


def test_progress_reports_every_crossing():
    calls = []
    rasmussen_s(from_braid([1, 1, 1, 1, 1]), progress=lambda done, total: calls.append((done, total)))
    assert calls == [(k, 5) for k in range(1, 6)]


def test_interrupt_leaves_nothing_behind():
    def stop(done, total):
        if done == 3:
            raise KeyboardInterrupt

    with pytest.raises(KeyboardInterrupt):
        khovanov_homology(from_braid([1, 1, 1, 1, 1]), progress=stop)
    # a later computation is unaffected
    assert rasmussen_s(from_braid([1, 1, 1, 1, 1])) == 4


def test_errors(hopf):
    with pytest.raises(NotAKnotError, match="2 components"):
        rasmussen_s(hopf)
    with pytest.raises(FieldError, match="not a prime"):
        khovanov_homology(hopf, "F6")
    with pytest.raises(FieldError, match="principal ideal domain"):
        bar_natan_homology(hopf, "Z")
    with pytest.raises(MoviesError, match="basepoint 99"):
        khovanov_homology(hopf, reduced=True, basepoint=99)
