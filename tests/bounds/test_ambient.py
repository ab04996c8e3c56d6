"""Which 4-manifold a surface through blow-ups lives in, named for the link on its boundary.

Property tests over random verified movies from a knot to the empty diagram, with twist steps:
the movie read backwards names the same 4-manifold for the knot; mirroring every frame swaps
CP² and CP²-bar; doing either twice gives the original back; the verdicts and the inequalities
agree in each case.
"""

import random
from collections import Counter
from dataclasses import replace

import pytest

from movies.bounds.ambient import ambient, applicable_bounds, twist_for
from movies.bounds.verdicts import mirror_s_values, s_values
from movies.checker.replay import check_movie
from movies.diagram import moves
from movies.diagram.tables import table_names
from movies.errors import MoveError
from movies.language.movie import parse_movie
from movies.language.spec import parse_diagram
from movies.surface.tracker import Blowup, surface_of


def _corner(d, crossing, antiparallel):
    """Two edges at a corner of a crossing: one running in and one out, or both in."""
    a, b, c, e = d.crossings[crossing]
    if antiparallel:
        return (a, b) if d.signs[crossing] > 0 else (b, c)
    return (a, e) if d.signs[crossing] > 0 else (a, b)


def _random_twist_movie(rng, names):
    """A movie from a table knot to nothing: one or two twists at crossings, then a band at a
    corner of each crossing left (the crossing becomes a kink, which is removed), then deaths.

    Returns (table name, list of steps as (kind, text)), each twist as ("twist", sign, rest).
    """
    name = rng.choice(names)
    d = parse_diagram(name)
    steps = []
    for _ in range(rng.randint(1, 2)):
        pair = _corner(d, rng.choice(sorted(d.crossings)), rng.random() < 0.7)
        sign = rng.choice([1, -1])
        for start in (None, *d.faces_beside(pair[0])):
            try:
                d = moves.twist(d, pair, sign, start_face=start).diagram
            except MoveError:
                continue
            steps.append(("twist", sign, f"across {pair[0]} {pair[1]}" + (f" from face {start}" if start else "")))
            break
    while d.crossings:
        crossing = min(d.crossings)
        first, second = _corner(d, crossing, True)
        face = min(set(d.faces_beside(first)) & set(d.faces_beside(second)))
        d = moves.saddle(d, first, second, face).diagram
        steps.append(("other", 0, f"band {first} {second} in face {face}"))
        d = moves.r1_remove(d, crossing)
        steps.append(("other", 0, f"R1 remove {crossing}"))
    for k in sorted(d.components):
        d = moves.death(d, k)
        steps.append(("other", 0, f"death {k}"))
    return name, steps


def _text(name, steps, mirrored=False):
    lines = [f"start mirror({name})" if mirrored else f"start {name}"]
    for kind, sign, rest in steps:
        lines.append(f"twist {(-sign if mirrored else sign):+d} {rest}" if kind == "twist" else rest)
    return "\n".join(lines)


def _reversed(transitions):
    """The steps read backwards: each inverted, so births and deaths swap and twists change hand."""
    return [replace(t, links=tuple((after, before, same) for before, after, same in t.links),
                    started=t.ended, ended=t.started, births=t.deaths, deaths=t.births, turns=-t.turns)
            for t in reversed(transitions)]


def _bound_numbers(bounds):
    return Counter((b.lhs, b.rhs, b.holds) for b in bounds)


SWAP = {"CP^2": "CP^2-bar", "CP^2-bar": "CP^2"}


def _parts(name):
    base, *summands = name.split(" # ")
    return base, sorted(summands)


def _swapped(name):
    return " # ".join(SWAP.get(part, part) for part in name.split(" # "))


@pytest.fixture(scope="module")
def movies_with_twists():
    rng = random.Random(7)
    names = table_names("knot", max_crossings=7)[1:]
    found = []
    while len(found) < 12:
        name, steps = _random_twist_movie(rng, names)
        if any(kind == "twist" for kind, _, _ in steps):
            found.append((name, steps))
    return found


def test_the_random_family_is_verified_and_passes_through_blowups(movies_with_twists):
    kinds = Counter()
    for name, steps in movies_with_twists:
        result = check_movie(parse_movie(_text(name, steps)))
        assert result.verified, _text(name, steps)
        assert result.surface.blowups and result.surface.oriented_by_start
        assert result.ambient().reading == "bounded by the start"
        kinds[result.ambient().definite] += 1
    assert kinds["positive definite"] and kinds["negative definite"] and kinds["indefinite"], kinds


def test_a_movie_read_backwards_names_the_same_four_manifold(movies_with_twists):
    for name, steps in movies_with_twists:
        result = check_movie(parse_movie(_text(name, steps)))
        forward = result.ambient()
        back = _reversed(result.transitions)
        surface = surface_of([], back)
        place = ambient(True, False, surface.blowups, surface.orientable)
        # the knot is now the last frame: it bounds the surface in the 4-manifold as built (the blow-ups come
        # in the opposite order, and a connected sum does not depend on the order of its summands)
        assert (_parts(place.name), place.reading) == (_parts(forward.name), "bounded by the end")
        assert [abs(a) for a in place.homology_class] == [abs(a) for a in reversed(forward.homology_class)]
        assert place.square == forward.square and place.definite == forward.definite
        assert surface.euler_characteristic == result.surface.euler_characteristic
        assert [c.genus for c in surface.components] == [c.genus for c in result.surface.components]
        # the inequalities are those of the same surface: the same numbers, the same verdicts
        s = {"start": s_values(result.frames[-1]), "end": s_values(result.movie.start)}
        m = {key: mirror_s_values(d, s[key]) for key, d in (("start", result.frames[-1]), ("end", result.movie.start))}
        bounds, _ = applicable_bounds(place, s, m, surface.euler_characteristic,
                                      surface.every_component_meets_start, surface.every_component_meets_end)
        assert bool(bounds) is (place.definite != "indefinite")
        assert _bound_numbers(bounds) == _bound_numbers(result.bounds.bounds)
        # read backwards twice: the movie itself
        again = surface_of(result.movie.start.components, _reversed(back))
        assert ambient(False, True, again.blowups, again.orientable) == forward


def test_mirroring_every_frame_swaps_cp2_and_cp2_bar(movies_with_twists):
    for name, steps in movies_with_twists:
        result = check_movie(parse_movie(_text(name, steps)))
        mirrored = check_movie(parse_movie(_text(name, steps, mirrored=True)))
        assert mirrored.verdict == result.verdict == "verified"
        place, image = result.ambient(), mirrored.ambient()
        assert image.name == _swapped(place.name) and image.square == -place.square
        assert _bound_numbers(mirrored.bounds.bounds) == _bound_numbers(result.bounds.bounds)
        # mirrored twice: the same 4-manifold
        twice = _text(name, [(k, -sign, rest) for k, sign, rest in steps], mirrored=True).replace(
            f"start mirror({name})", f"start mirror(mirror({name}))")
        assert check_movie(parse_movie(twice)).ambient().name == place.name


def test_naming_for_each_shape_of_movie():
    plus, minus = Blowup(0, +1, 2, 2), Blowup(1, -1, 1, 1)
    # a cobordism from L0 to L1: W itself, where a +1 twist is a CP^2-bar summand (blowing down a -1-framed unknot)
    cobordism = ambient(False, False, [plus, minus])
    assert cobordism.name == "S^3 x I # CP^2-bar # CP^2" and cobordism.square == -4 + 1
    assert cobordism.definite == "indefinite"
    # ends empty: the first frame is on the boundary of W ∪ B^4 with the opposite orientation
    assert ambient(False, True, [plus, minus]).name == "B^4 # CP^2 # CP^2-bar"
    assert ambient(False, True, [plus, minus]).square == 4 - 1
    # starts empty: the last frame bounds in B^4 ∪ W as built
    assert ambient(True, False, [plus, minus]).name == "B^4 # CP^2-bar # CP^2"
    assert ambient(True, True, [plus]).name == "S^4 # CP^2-bar"
    assert ambient(False, True, [plus], orientable=False).square is None
    for summand in ("CP^2-bar", "CP^2"):
        for ends in ((False, True), (True, False), (False, False)):
            place = ambient(*ends, [Blowup(0, twist_for(summand, *ends), 0, 2)])
            assert place.summands[0].name == summand
    with pytest.raises(ValueError):
        twist_for("CP^3", False, True)


def test_mixed_hands_give_no_bound():
    place = ambient(False, True, [Blowup(0, +1, 0, 2), Blowup(1, -1, 0, 2)])
    bounds, notes = applicable_bounds(place, {"start": {"Q": 2}, "end": {"Q": 1}},
                                      {"start": {"Q": -2}, "end": {"Q": 1}}, 1, True, False)
    assert bounds == [] and "indefinite" in notes[0]


def test_mirrored_and_read_backwards_the_names_swap_and_undo(movies_with_twists):
    for name, steps in movies_with_twists[:6]:
        result = check_movie(parse_movie(_text(name, steps)))
        mirrored = check_movie(parse_movie(_text(name, steps, mirrored=True)))
        # the mirrored movie read backwards: the knot's mirror bounds the surface in the swapped manifold
        back = _reversed(mirrored.transitions)
        surface = surface_of([], back)
        both = ambient(True, False, surface.blowups, surface.orientable)
        assert _parts(both.name) == _parts(_swapped(result.ambient().name)) and both.square == -result.ambient().square
        # and undoing both (read forwards again, mirrored again) names the original
        again = surface_of(mirrored.movie.start.components, _reversed(back))
        undone = ambient(False, True, again.blowups, again.orientable)
        assert _swapped(undone.name) == result.ambient().name
