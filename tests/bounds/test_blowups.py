"""Twist steps: the 4-manifold and class they give the surface, and Ren's inequality."""

import random

import pytest

from movies.checker.replay import check_movie
from movies.report.movie import as_json
from movies.diagram import moves
from movies.diagram.tables import table_names
from movies.errors import MoveError
from movies.homology import rasmussen_s
from movies.language.movie import parse_movie
from movies.language.spec import parse_diagram


@pytest.mark.parametrize("n", [2, 3, 4])
def test_unlink_to_torus_link_by_one_twist_is_an_equality(n):
    edges = " ".join(str(k) for k in range(1, n + 1))
    result = check_movie(parse_movie(f"start braid({n})[]\ntwist +1 across {edges}"))  # n concentric circles
    data = as_json(result)
    assert data["verdict"] == "verified"
    surface = data["surface"]
    assert surface["lives_in"] == "S^3 x I # CP^2-bar"
    assert [abs(a) for a in surface["class"]] == [n] and surface["square"] == -n * n
    assert not surface["null_homologous"]
    # Q. Ren (2023): s(T(n,n)) = (n-1)^2 with every strand the same way; Beliakova–Wehrli: s(unlink of n) = 1 - n
    assert data["s"]["start"]["Q"] == 1 - n and data["s"]["end"]["Q"] == (n - 1) ** 2
    # the design's check value (Ren 2023, Cor. 1.4): the inequality for "every component meets the end" is an equality
    first = [b for b in data["bounds"] if "meets the end" in b["statement"]]
    assert first and all(b["tight"] for b in first)
    assert all(b["holds"] for b in data["bounds"])


def _antiparallel_corner(d, crossing):
    """Two edges at a corner of the crossing, one running in and one out."""
    a, b, c, e = d.crossings[crossing]
    return (a, b) if d.signs[crossing] > 0 else (b, c)


def test_a_twist_on_antiparallel_strands_never_increases_s():
    rng = random.Random(41)
    names = table_names("knot", max_crossings=8)[1:]
    checked = 0
    for name in rng.sample(names, 14):
        d = parse_diagram(name)
        crossing = rng.choice(sorted(d.crossings))
        pair = _antiparallel_corner(d, crossing)
        try:
            result = moves.twist(d, pair, +1)
        except MoveError:  # both sides of the first edge fit: name the start face
            faces = d.faces_beside(pair[0])
            result = moves.twist(d, pair, +1, start_face=faces[0])
        assert result.algebraic == 0
        # Q. Ren (2023), Cor. 1.4 with a = 0 and an annulus (chi = 0): s(after) <= s(before)
        assert rasmussen_s(result.diagram) <= rasmussen_s(d)
        checked += 1
    assert checked == 14


def test_a_left_handed_twist_is_never_judged_by_the_right_handed_inequality():
    # an unknot diagram: the table's right-handed trefoil with crossing 1 switched
    text = "start pd[[4,1,5,2],[3,1,4,6],[5,3,6,2]]\ntwist -1 across 1 5\nisotopic to 3_1"
    data = as_json(check_movie(parse_movie(text)))
    assert data["verdict"] == "verified"
    assert data["surface"]["lives_in"] == "S^3 x I # CP^2"
    # KnotInfo rasmussen_invariant: s(3_1) = 2; the unknot has s = 0
    assert (data["s"]["start"]["Q"], data["s"]["end"]["Q"]) == (0, 2)
    assert data["bounds"] and all(b["holds"] for b in data["bounds"])
    assert all(b["statement"].startswith("Ren, -1 twists only") for b in data["bounds"])


def test_both_hands_give_no_bound_and_say_so():
    text = "start braid(2)[]\ntwist +1 across 1 2\ntwist -1 across 1 2 from face 1"
    result = check_movie(parse_movie(text))
    data = as_json(result)
    assert data["surface"]["lives_in"] == "S^3 x I # CP^2-bar # CP^2"
    assert data["bounds"] == []
    assert any("indefinite" in note for note in data["bound_notes"])


def _random_gate(d, rng, size):
    """A gate across ``size`` edges found by walking across faces, or None."""
    first = rng.choice(d.edges())
    face = rng.choice(d.faces_beside(first))
    start, path = face, [first]
    left, right = d.faces_beside(first)
    face = right if face == left else left
    while len(path) < size:
        options = [e for e in d.edges() if e not in path and face in d.faces_beside(e)]
        if not options:
            return None
        edge = rng.choice(options)
        path.append(edge)
        left, right = d.faces_beside(edge)
        face = right if face == left else left
    return path, start


def _oriented_band(d, rng):
    for _ in range(20):
        face = rng.choice(sorted(d.faces))
        sides = [side for cycle in d.faces[face] for side in cycle]
        same = {}
        for side in sides:
            same.setdefault(side.hand, []).append(side.edge)
        hand = rng.choice(sorted(same))
        if len(same[hand]) >= 2:
            first, second = rng.sample(same[hand], 2)
            return first, second, face
    return None


def test_the_inequality_holds_on_every_verified_movie_of_a_random_family():
    rng = random.Random(2026)
    names = table_names("knot", max_crossings=7)[1:]
    judged = with_twists = 0
    for _ in range(40):
        name = rng.choice(names)
        d = parse_diagram(name)
        lines = [f"start {name}"]
        sign = rng.choice([+1, -1])
        for _ in range(rng.randint(1, 2)):
            if rng.random() < 0.5:
                gate = _random_gate(d, rng, rng.randint(2, 3))
                if gate is None:
                    continue
                path, start = gate
                try:
                    d = moves.twist(d, path, sign, start_face=start).diagram
                except MoveError:
                    continue
                lines.append(f"twist {sign:+d} across {' '.join(map(str, path))} from face {start}")
            else:
                band = _oriented_band(d, rng)
                if band is None:
                    continue
                first, second, face = band
                d = moves.saddle(d, first, second, face).diagram
                lines.append(f"band {first} {second} in face {face}")
        if len(d.crossings) > 14:
            continue
        # check_movie raises InternalInconsistency if a verified movie broke an inequality
        result = check_movie(parse_movie("\n".join(lines)))
        assert result.verdict == "verified", lines
        report = result.bounds
        assert all(b.holds for b in report.bounds), (lines, report.bounds)
        judged += bool(report.bounds)
        with_twists += bool(result.surface.blowups) and bool(report.bounds)
    assert judged >= 20 and with_twists >= 10, (judged, with_twists)


@pytest.mark.parametrize("n, q", [(2, 1), (3, 1), (4, 1), (4, 2)])
def test_strands_both_ways_also_give_an_equality(n, q):
    edges = " ".join(str(k) for k in range(1, n + 1))
    reversed_ = ", ".join(str(k) for k in range(1, q + 1))
    data = as_json(check_movie(parse_movie(f"start reverse(braid({n})[], {reversed_})\ntwist +1 across {edges}")))
    p = n - q
    assert data["verdict"] == "verified" and [abs(a) for a in data["surface"]["class"]] == [p - q]
    # Q. Ren (2023): s(T(n,n)) with p strands one way and q the other is (p - q)^2 - 2p + 1
    assert data["s"]["end"]["Q"] == (p - q) ** 2 - 2 * p + 1
    # Ren (2023), Cor. 1.4: (1 - n) - s(T) + A = 0 with A = (p-q)^2 - |p-q|: an equality again
    first = [b for b in data["bounds"] if "meets the end" in b["statement"]]
    assert first and all(b["tight"] for b in first)


def test_a_non_orientable_surface_has_its_class_mod_2():
    # a crossing change of the trefoil, then a band that twists the surface
    data = as_json(check_movie(parse_movie("start 3_1\ntwist +1 across 1 5\nband 1 4 in face 1")))
    surface = data["surface"]
    assert not surface["orientable"]
    assert surface["class"] == [0] and surface["square"] is None and surface["null_homologous"]
    assert data["bounds"] == []
