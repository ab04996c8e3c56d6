"""Finding Reidemeister moves by search: records, simplification, isotopy certificates."""

from __future__ import annotations

import pytest

from movies.diagram import moves
from movies.diagram.constructors import disjoint_union, mirror, unknot, unlink
from movies.diagram.model import Side
from movies.diagram.pd import from_pd
from movies.diagram.isotopy import reflect_and_switch, same_on_sphere, same_up_to_reflection
from movies.diagram.simplify import (
    Budget,
    MoveRecord,
    apply,
    candidates,
    certify_isotopy,
    inverse,
    rename,
    replay,
    scramble,
    simplify,
    translate,
)
from movies.diagram.tables import table_row
from movies.errors import DiagramError, MoveError, MoviesError
from movies.language.spec import parse_diagram


def _scrambled(text: str, extra: int, seed: int, hide: int = 4):
    start = parse_diagram(text)
    d, _ = scramble(start, start.crossing_count() + extra, seed, weights=(1, 3, 3), shuffles=10, hide=hide)
    return start, d


def _check_certificate(cert, first, second):
    """Replaying the moves from ``first`` and renaming gives ``second`` exactly."""
    end = replay(cert.moves, first)
    assert end == cert.end
    expected = reflect_and_switch(second) if cert.reflected else second
    assert rename(end, cert.names) == expected


# ---------------------------------------------------------------------- records


def test_record_checks_its_fields():
    with pytest.raises(MoveError, match="not 'R4'"):
        MoveRecord("R4", face=1)
    with pytest.raises(MoveError, match="needs face"):
        MoveRecord("R3")
    with pytest.raises(MoveError, match="not edge"):
        MoveRecord("R2-", face=1, edge=2)
    assert MoveRecord("R1-", crossing=3).kink is None
    assert issubclass(MoveError, MoviesError)


def test_apply_is_the_move_function():
    d, _ = scramble(unknot(), 8, seed=5)
    for record in candidates(d):
        args = record.arguments()
        direct = {
            "R1+": lambda: moves.r1_add(d, args["edge"], args["hand"], args["sign"]),
            "R1-": lambda: moves.r1_remove(d, args["crossing"], args["kink"]),
            "R2+": lambda: moves.r2_add(d, args["over"], args["under"], args["face"]),
            "R2-": lambda: moves.r2_remove(d, args["face"]),
            "R3": lambda: moves.r3(d, args["face"]),
        }[record.kind]()
        assert apply(record, d) == direct
        assert apply(record, d).crossing_count() == d.crossing_count() + {
            "R1+": 1, "R1-": -1, "R2+": 2, "R2-": -2, "R3": 0}[record.kind]


@pytest.mark.parametrize("seed", range(4))
def test_candidates_list_every_removal_and_r3(seed):
    d, _ = scramble(unknot(), 10, seed=seed, weights=(1, 3, 6), shuffles=5)
    listed_r2 = {r.face for r in candidates(d, ("R2-",))}
    listed_r3 = {r.face for r in candidates(d, ("R3",))}
    for face in d.faces:
        for listed, move in ((listed_r2, moves.r2_remove), (listed_r3, moves.r3)):
            if face in listed:
                move(d, face)
            else:
                with pytest.raises(MoveError):
                    move(d, face)
    kinks = {(r.crossing, r.kink) for r in candidates(d, ("R1-",))}
    for crossing in d.crossings:
        for loop in moves.kinks_at(d, crossing):
            assert (crossing, loop) in kinks  # no split pieces here, so every kink is an empty monogon
    for crossing in set(d.crossings) - {c for c, _ in kinks}:
        with pytest.raises(MoveError):
            moves.r1_remove(d, crossing)


@pytest.mark.parametrize("seed", range(3))
def test_inverse_undoes_each_move(seed):
    d, _ = scramble(parse_diagram("5_2"), 12, seed=seed)
    checked = 0
    for record in candidates(d):
        if record.kind == "R2+" and checked % 7:
            checked += 1
            continue
        after = apply(record, d)
        undo = inverse(d, record, after)
        if undo is None:
            assert record.kind == "R2-"
            continue
        assert same_on_sphere(apply(undo, after), d)
        checked += 1
    assert checked > 10


# ---------------------------------------------------------------------- simplify: unknots


@pytest.mark.parametrize("seed", range(6))
def test_random_unknots_become_crossingless(seed):
    d, made = scramble(unknot(), 15, seed=seed, weights=(1, 3, 3), shuffles=10, hide=4)
    assert d.crossing_count() >= 15
    assert replay(made, unknot()) == d
    result = simplify(d, "crossingless")
    assert result.reached and result.stopped == "goal"
    assert result.diagram.crossing_count() == 0 and result.diagram.component_count() == 1
    # the recorded moves are the certificate: they replay to the end, names included
    assert replay(result.moves, d) == result.diagram
    assert result.explored >= len(result.moves)
    # common practice, no source: the unknot diagram with no crossings is one circle
    assert same_on_sphere(result.diagram, unknot())


def test_simplify_is_deterministic():
    d, _ = scramble(unknot(), 15, seed=11, hide=4)
    one, two = simplify(d, "fewest"), simplify(d, "fewest")
    assert one.moves == two.moves and one.diagram == two.diagram and one.explored == two.explored


def test_search_unlocks_removals_with_r3():
    # a braid closure with no kink and no removable bigon: s1 s2 s1 s2^-1 s1^-1 s2^-1 on 3 strands
    d = parse_diagram("braid[1, 2, 1, -2, -1, -2]")
    assert not candidates(d, ("R1-", "R2-"))
    result = simplify(d, "fewest")
    assert "R3" in {m.kind for m in result.moves}
    assert replay(result.moves, d) == result.diagram
    # common practice, no source: (s1 s2 s1)(s2 s1 s2)^-1 is the trivial braid, closing to 3 circles
    assert result.diagram.crossing_count() == 0 and result.diagram.component_count() == 3


def test_r2_additions_unlock_a_stuck_diagram():
    # a 7-crossing diagram of 6_2 (found by the search from a scrambled table diagram): no kink,
    # no removable bigon and not one R3 triangle, so only an R2 addition gets it unstuck
    stuck = from_pd([[135, 31, 29, 137], [3, 11, 130, 131], [5, 1, 6, 12], [6, 29, 31, 18],
                     [11, 5, 12, 130], [137, 1, 134, 135], [134, 3, 131, 18]])
    assert candidates(stuck, ("R1-", "R2-", "R3")) == []
    without = simplify(stuck, "fewest", lift=0)
    assert without.moves == [] and without.stopped == "exhausted"
    result = simplify(stuck, "fewest")
    assert "R2+" in {m.kind for m in result.moves}
    assert replay(result.moves, stuck) == result.diagram
    # KnotInfo column crossing_number (6_2)
    assert result.diagram.crossing_count() == int(table_row("6_2")["crossing_number"])
    cert = certify_isotopy(stuck, parse_diagram("6_2"))
    assert cert is not None
    _check_certificate(cert, stuck, parse_diagram("6_2"))


def test_a_kink_around_a_circle_is_not_an_r1_removal():
    trefoil = parse_diagram("3_1")
    kinked = moves.r1_add(trefoil, 1, "L", 1)
    (loop,) = moves.kinks_at(kinked, max(kinked.crossings))
    (monogon,) = [f for f, cycles in kinked.faces.items() if cycles in (((Side(loop, "L"),),), ((Side(loop, "R"),),))]
    d = moves.birth(kinked, monogon)
    assert candidates(d, ("R1-",)) == []
    result = simplify(d, "fewest")
    assert replay(result.moves, d) == result.diagram
    # KnotInfo column crossing_number (3_1); the circle stays a circle of its own
    assert result.diagram.crossing_count() == 3 and result.diagram.loop_count() == 1
    cert = certify_isotopy(d, parse_diagram("3_1 + unknot"))
    assert cert is not None
    _check_certificate(cert, d, parse_diagram("3_1 + unknot"))


# ---------------------------------------------------------------------- simplify: knots


@pytest.mark.parametrize("name", ["3_1", "4_1", "5_1", "5_2", "6_1"])
def test_scrambled_table_knots_return_to_their_crossing_number(name):
    start, d = _scrambled(name, 9, seed=2)
    result = simplify(d, "fewest")
    assert replay(result.moves, d) == result.diagram
    # KnotInfo column crossing_number
    assert result.diagram.crossing_count() == int(table_row(name)["crossing_number"])
    cert = certify_isotopy(d, start)
    assert cert is not None
    _check_certificate(cert, d, start)


def test_target_crossing_count_and_diagram():
    start, d = _scrambled("4_1", 8, seed=1)
    at_most = simplify(d, 7)
    assert at_most.reached and at_most.diagram.crossing_count() <= 7
    assert replay(at_most.moves, d) == at_most.diagram
    toward = simplify(d, start)
    assert toward.reached and toward.comparison in ("sphere", "reflection")
    assert replay(toward.moves, d) == toward.diagram
    if toward.comparison == "sphere":
        assert same_on_sphere(toward.diagram, start)
    else:
        assert same_up_to_reflection(start, toward.diagram)


def test_budgets_are_respected():
    start, d = _scrambled("5_2", 10, seed=0)
    for budget in (0, 3):
        result = simplify(d, "crossingless", budget=budget)
        assert not result.reached and result.explored <= budget and result.stopped == "moves"
        assert replay(result.moves, d) == result.diagram
    tiny = simplify(d, start, budget=5)
    assert not tiny.reached and tiny.moves == [] and tiny.diagram == d
    assert certify_isotopy(d, start, budget=5) is None
    with pytest.raises(DiagramError):
        simplify(d, "smallest")
    with pytest.raises(DiagramError):
        simplify(d, "fewest", budget=-1)
    assert simplify(d, "fewest", budget=Budget(moves=40, seconds=30)).explored <= 40


# ---------------------------------------------------------------------- certificates


@pytest.mark.parametrize("name,seed", [("3_1", 0), ("4_1", 3), ("6_2", 1), ("7_4", 0)])
def test_certificates_replay_to_the_second_diagram(name, seed):
    start, d = _scrambled(name, 8, seed=seed)
    cert = certify_isotopy(d, start)
    assert cert is not None and cert.first is d and cert.second is start
    _check_certificate(cert, d, start)
    # and the other way round: the moves now undo what was found on the first side
    back = certify_isotopy(start, d)
    assert back is not None
    _check_certificate(back, start, d)


def test_certify_is_deterministic():
    start, d = _scrambled("7_4", 8, seed=3)
    one, two = certify_isotopy(d, start), certify_isotopy(d, start)
    assert one.moves == two.moves and one.names == two.names and one.explored == two.explored


def test_certificate_through_a_reflection():
    start = parse_diagram("5_2")
    flipped = reflect_and_switch(start)
    cert = certify_isotopy(flipped, start)
    assert cert is not None
    _check_certificate(cert, flipped, start)
    if not same_on_sphere(flipped, start):
        # the moves found nothing shorter than the reflection itself, and say so
        assert cert.reflected or cert.moves


def test_different_knots_never_certify():
    trefoil = parse_diagram("3_1")
    # from memory: the trefoil is not isotopic to its mirror image (Dehn, 1914)
    assert certify_isotopy(trefoil, mirror(trefoil), budget=400) is None
    _, scrambled = _scrambled("3_1", 6, seed=1)
    assert certify_isotopy(scrambled, mirror(trefoil), budget=400) is None
    assert certify_isotopy(parse_diagram("4_1"), trefoil, budget=400) is None
    assert not simplify(trefoil, mirror(trefoil), budget=300).reached


def test_split_diagrams_and_unlinks():
    two = unlink(2)
    d, _ = scramble(two, 12, seed=4, weights=(1, 3, 3), shuffles=5, hide=4)
    assert d.piece_count() == 1  # the circles got tangled together
    result = simplify(d, "crossingless")
    assert result.reached and result.diagram.loop_count() == 2
    assert replay(result.moves, d) == result.diagram
    cert = certify_isotopy(d, result.diagram)
    _check_certificate(cert, d, result.diagram)

    split = parse_diagram("3_1 + 4_1")
    d, _ = scramble(split, 15, seed=2, hide=4)
    result = simplify(d, "fewest")
    assert replay(result.moves, d) == result.diagram
    # KnotInfo column crossing_number, for 3_1 and 4_1
    assert result.diagram.crossing_count() == 3 + 4
    cert = certify_isotopy(d, split)
    assert cert is not None
    _check_certificate(cert, d, split)


def test_nested_circles_certify_to_circles_side_by_side():
    # common practice, no source: any two diagrams without crossings of n circles are the n-unlink
    nested = disjoint_union(unknot(), unknot(), face=1)
    assert not same_up_to_reflection(nested, unlink(2))
    cert = certify_isotopy(nested, unlink(2))
    assert cert is not None and cert.moves
    _check_certificate(cert, nested, unlink(2))


def test_records_translate_and_print():
    record = MoveRecord("R1+", edge=4, hand="R", sign=-1)
    assert str(record) == "R1 add 4 right -"  # the movie-language line that writes it
    assert translate(record, {"edges": {4: 9}}) == MoveRecord("R1+", edge=9, hand="R", sign=-1)
    assert len(candidates(unknot(), ("R1+",))) == 4
    with pytest.raises(MoveError):
        candidates(unknot(), ("R5",))
    with pytest.raises(MoveError):
        apply(MoveRecord("R3", face=1), unknot())


def test_trivial_certificates():
    cert = certify_isotopy(unknot(), unknot())
    assert cert.moves == [] and not cert.reflected
    _check_certificate(cert, unknot(), unknot())
    empty = parse_diagram("empty")
    cert = certify_isotopy(empty, empty)
    _check_certificate(cert, empty, empty)
