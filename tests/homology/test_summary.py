"""One scan over Z gives homology over every field: checked against separate scans, and the CLI."""

import json

import pytest

from movies.cli.main import main
from movies.diagram.tables import table_names
from movies.homology.links import link_s_values
from movies.homology import khovanov_homology, rasmussen_s
from movies.homology.summary import homology_summary
from movies.language.spec import parse_diagram

SPREAD = table_names("knot", max_crossings=9)[1::7] + ["L4a1{0}", "L5a1{1}", "torus(3, 3)"]


@pytest.mark.parametrize("name", SPREAD)
def test_fields_from_one_integral_scan_agree_with_their_own_scans(name):
    d = parse_diagram(name)
    facts = homology_summary(d, ("Q", "F2", "F3"))
    for field in ("Q", "F2", "F3"):
        own = khovanov_homology(d, field)
        assert facts["khovanov"][field] == [[i, j, r] for (i, j), r in sorted(own.items()) if r]
    integral = khovanov_homology(d, "Z")
    assert facts["khovanov_Z"]["free"] == [[i, j, r] for (i, j), r in sorted(integral["free"].items()) if r]
    if d.component_count() == 1:
        assert facts["s"] == {f: rasmussen_s(d, f) for f in ("Q", "F2", "F3")}
    else:
        assert facts["s"] == link_s_values(d, ("Q", "F2", "F3"))


def test_invariants_json_has_homology(capsys):
    assert main(["invariants", "3_1", "--json"]) == 0
    facts = json.loads(capsys.readouterr().out)
    # KnotInfo column khovanov_unreduced_integral_polynomial of 3_1: q+ q^(3)+ t^(2)*q^(5)+ t^(3)*q^(9)+ t^(3)*q^(7)*T^(2)
    assert facts["khovanov"]["Q"] == [[0, 1, 1], [0, 3, 1], [2, 5, 1], [3, 9, 1]]
    assert facts["khovanov_Z"] == {"free": [[0, 1, 1], [0, 3, 1], [2, 5, 1], [3, 9, 1]], "torsion": [[3, 7, 2, 1]]}
    # universal coefficients: the Z/2 at (3, 7) gives F2 classes at (3, 7) and (2, 7)
    assert facts["khovanov"]["F2"] == [[0, 1, 1], [0, 3, 1], [2, 5, 1], [2, 7, 1], [3, 7, 1], [3, 9, 1]]
    # KnotInfo column rasmussen_invariant of 3_1
    assert facts["s"] == {"Q": 2, "F2": 2}


def test_invariants_options(capsys):
    assert main(["invariants", "4_1", "--json", "--field", "F3", "--reduced", "--bar-natan"]) == 0
    facts = json.loads(capsys.readouterr().out)
    assert set(facts["khovanov"]) == {"Q", "F2", "F3"}
    # KnotInfo column rasmussen_invariant of 4_1
    assert facts["s"] == {"Q": 0, "F2": 0, "F3": 0}
    # KnotInfo column khovanov_reduced_rational_polynomial of 4_1: 1/(q^4*t^2)+ 1/(q^2*t)+ 1+ q^2*t+ q^4*t^2
    assert facts["reduced_khovanov"]["Q"] == [[-2, -4, 1], [-1, -2, 1], [0, 0, 1], [1, 2, 1], [2, 4, 1]]
    free = facts["bar_natan"]["Q"]["free"]
    assert free == [[0, -1, 1], [0, 1, 1]]
    assert main(["invariants", "4_1", "--json", "--classical"]) == 0
    assert "khovanov" not in json.loads(capsys.readouterr().out)
    assert main(["invariants", "4_1", "--field", "F4"]) == 2
    assert "not a prime" in capsys.readouterr().err


def test_invariants_text_shows_homology(capsys):
    assert main(["invariants", "mirror(3_1)"]) == 0
    out = capsys.readouterr().out
    # duality: torsion at (i, j) of K sits at (1 - i, -j) for the mirror image (from memory)
    assert "Khovanov (Z)     torsion Z/2 t^-2 q^-7" in out
    # KnotInfo column rasmussen_invariant of 3_1, negated for the mirror image
    assert "s                -2 over Q, -2 over F2" in out
