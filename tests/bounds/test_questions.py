"""Questions without a movie: which cobordisms s and the signatures allow."""

import json

import pytest

from movies.bounds.questions import blown_up_question, cobordism_question, signature_profile
from movies.cli.main import main
from movies.homology import rasmussen_s
from movies.language.spec import parse_diagram


def test_two_annuli_cannot_join_the_unlink_to_the_hopf_link():
    answer = cobordism_question(parse_diagram("unlink(2)"), parse_diagram("L2a1{1}"), genus=0)
    # Beliakova–Wehrli 2008: s(unlink of 2) = -1; from memory: a positive diagram has s = w - O + 1 = 1
    assert answer.s == {"first": {"Q": -1, "F2": -1}, "second": {"Q": 1, "F2": 1}}
    connected, annuli = answer.shapes
    assert (connected.components, connected.euler_characteristic, connected.allowed) == (1, -2, True)
    assert (annuli.components, annuli.euler_characteristic, annuli.allowed) == (2, 0, False)
    assert any("meets the end" in statement for statement in annuli.refuted_by)
    assert answer.allowed_some and answer.notes  # links: the signatures are not asked, and it says so


@pytest.mark.parametrize("first, second, genus, allowed", [
    ("torus(3,4)", "3_1", 1, False),
    ("torus(3,4)", "3_1", 2, True),
    ("torus(2,5)", "3_1", 1, True),
    ("3_1", "mirror(3_1)", 1, False),
    ("3_1", "mirror(3_1)", 2, True),
    ("4_1", "empty", 0, True),
])
def test_knot_cobordisms(first, second, genus, allowed):
    answer = cobordism_question(parse_diagram(first), parse_diagram(second), genus)
    # Rasmussen 2010: |s(K0) - s(K1)| <= 2g for a genus-g cobordism of knots, s(T(p,q)) = (p-1)(q-1)
    assert answer.allowed_connected is allowed
    assert [b.field for b in answer.shapes[0].bounds][-1] in ("signature", "Levine–Tristram")


def test_signatures_can_refute_where_s_cannot():
    knot = parse_diagram("9_42")
    answer = cobordism_question(knot, parse_diagram("empty"), genus=0)
    # KnotInfo rasmussen_invariant: s(9_42) = 0, so s allows a disk
    assert all(b.holds for b in answer.shapes[0].bounds if b.field in ("Q", "F2"))
    # KnotInfo signature: sigma(9_42) = 2; Murasugi 1965: |sigma| <= 2 g4, so no disk
    assert signature_profile(knot)["1/2"] == 2
    assert not answer.allowed_connected and answer.shapes[0].refuted_by[0].startswith("signature")


def test_levine_tristram_profile_keys_are_prime_power_orders():
    profile = signature_profile(parse_diagram("5_1"))
    assert "1/2" in profile and "1/3" in profile and "1/6" not in profile
    # KnotInfo signature: 5_1 has signature -4
    assert profile["1/2"] == -4


def test_components_option(capsys):
    assert main(["bounds", "unlink(2)", "--to", "L2a1{1}", "--components", "2", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert [c["components"] for c in data["cobordisms"]] == [2]
    assert data["allowed_connected"] is None and data["allowed_by_s_and_signatures"] is False
    assert main(["bounds", "unlink(2)", "--to", "L2a1{1}", "--components", "3"]) == 2
    assert "1 to 2 components" in capsys.readouterr().err
    assert main(["bounds", "empty", "--to", "empty"]) == 2
    assert main(["bounds", "3_1", "--to", "4_1", "--genus", "1"]) == 0
    assert "allowed by these invariants" in capsys.readouterr().out


@pytest.mark.parametrize("name, s", [("3_1", 2), ("mirror(3_1)", -2), ("4_1", 0), ("5_1", 4), ("mirror(5_2)", -2)])
def test_null_homologous_disks_in_a_punctured_blown_up_ball(name, s):
    # KnotInfo column rasmussen_invariant: s(3_1) = 2, s(4_1) = 0, s(5_1) = 4, s(5_2) = 2; Rasmussen 2010: s(m(K)) = -s(K)
    assert rasmussen_s(parse_diagram(name)) == s
    in_bar = blown_up_question(parse_diagram(name), parse_diagram("empty"), 0, (0,), "CP^2-bar")
    in_plus = blown_up_question(parse_diagram(name), parse_diagram("empty"), 0, (0,), "CP^2")
    # Ozsváth–Szabó, "Knot Floer homology and the four-ball genus" (2003), Thm 1.1, and Q. Ren (2023), Cor. 1.4:
    # K on the boundary of a negative definite X bounding a null-homologous disk forces s(K) <= 0 (tau(K) <= 0)
    assert in_bar.place.name == "B^4 # CP^2-bar" and in_bar.place.definite == "negative definite"
    assert in_bar.shapes[0].allowed is (s <= 0)
    # common practice, no source: reversing the orientation of the pair, K bounds in punctured CP^2 iff m(K)
    # bounds in punctured CP^2-bar
    assert in_plus.place.name == "B^4 # CP^2"
    assert in_plus.shapes[0].allowed is (-s <= 0)


def test_the_positive_trefoil_bounds_no_null_homologous_disk_in_a_punctured_cp2_bar(capsys):
    # Ozsváth–Szabó (2003), Thm 1.1: tau(3_1) = 1 > 0, so no null-homologous disk in a negative definite 4-manifold;
    # Ren (2023), Cor. 1.4, gives the same from s(3_1) = 2 (KnotInfo rasmussen_invariant)
    assert main(["bounds", "3_1", "--blowups", "1"]) == 0
    out = capsys.readouterr().out
    assert "3_1 bounding a null-homologous disk in B^4 # CP^2-bar (punctured, negative definite)" in out
    assert "no such surface exists: no null-homologous disk" in out
    # its mirror bounds one: change a crossing by a left-handed twist (the same theorem allows it)
    assert main(["bounds", "mirror(3_1)", "--blowups", "1"]) == 0
    assert "allowed by s" in capsys.readouterr().out
    # and in a punctured CP^2 the trefoil itself is allowed (examples/movies/3_1-disk-in-punctured-CP2.movie draws it)
    assert main(["bounds", "3_1", "--blowups", "1", "--summand", "CP2", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["lives_in"] == "B^4 # CP^2" and data["definite"] == "positive definite" and data["allowed_by_s"]
    assert main(["bounds", "3_1", "--blowups", "1", "--summand", "CP3"]) == 2
    assert "a summand is CP2-bar or CP2" in capsys.readouterr().err


def test_a_cobordism_through_blowups_is_named_as_a_cobordism(capsys):
    assert main(["bounds", "3_1", "--to", "unknot", "--blowups", "1", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["lives_in"] == "S^3 x I # CP^2-bar" and data["reading"] == "from the start to the end"


def test_a_class_relaxes_the_bound():
    knot = parse_diagram("5_1")  # s = 4 (KnotInfo rasmussen_invariant of 5_1)
    empty = parse_diagram("empty")
    assert not blown_up_question(knot, empty, 0, (0, 0)).shapes[0].allowed
    # Ren (2023), Cor. 1.4: s(K) <= 1 - chi + A with A = sum(a^2 - |a|); class (2, 2) gives A = 4: 4 <= 4, an equality
    (bound, *_) = blown_up_question(knot, empty, 0, (2, 2)).shapes[0].bounds
    assert bound.holds and bound.tight
    assert blown_up_question(knot, empty, 0, (2, 2)).place.square == -8
    assert blown_up_question(knot, empty, 2, (0, 0)).shapes[0].allowed


def test_blowups_on_the_command_line(capsys):
    assert main(["bounds", "3_1", "--blowups", "1", "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert data["allowed_by_s"] is False and data["class"] == [0] and data["square"] == 0
    assert main(["bounds", "3_1", "--blowups", "2", "--class", "1,1", "--genus", "1"]) == 0
    assert "allowed by s" in capsys.readouterr().out
    assert main(["bounds", "3_1", "--blowups", "2", "--class", "1"]) == 2
    assert "one entry per blow-up" in capsys.readouterr().err
    assert main(["bounds", "3_1", "--class", "1"]) == 2
    assert main(["bounds", "3_1", "--blowups", "1", "--class", "x"]) == 2
