"""Movies with handles: surfaces in the product of #ʳ S¹×S² with an interval and in the boundary
sums of S¹×B³ and B²×S², checked step by step and judged for every k by the S³ inequalities."""

import random

import pytest

from movies.checker.replay import check_movie
from movies.diagram.handles import gate_faces, twisted
from movies.diagram.isotopy import same_on_sphere
from movies.diagram.steps import MoveRecord, perform
from movies.diagram.tables import table_names
from movies.language.movie import parse_movie
from movies.language.spec import parse_diagram
from movies.report.movie import as_json
from support.handles import approximations_related, random_link_with_a_handle, random_steps

TREFOIL = "3_1 with handle across 1 5"


def _invalid(text):
    result = check_movie(text)
    assert result.verdict == "invalid", [f.message for f in result.findings]
    return result.findings[0].message


@pytest.mark.parametrize("step, reason", [
    ("band 1 2 twisted 1", "acts on edge 1, which handle 1 crosses"),
    ("death 1", "component 1 passes through handle 1, so it bounds no disk there"),
    ("twist +1 across 1 2", "a twist step in a movie with handles is not offered"),
    ("isotopic to unlink(2)", "in a movie with handles an isotopy claim names the handles too"),
    ("cap fiber 1", "say 'in B2xS2' in the movie"),
])
def test_steps_a_movie_with_handles_refuses(step, reason):
    assert reason in _invalid(f"start unlink(2) with handle across 1 2\n{step}")


def test_a_cap_needs_a_fiber_and_only_caps_follow_it():
    assert "passes through no handle" in _invalid("start unlink(3) with handle across 1 2\nin B2xS2\ncap fiber 3")
    assert "has crossings" in _invalid(f"start {TREFOIL}\nin B2xS2\ncap fiber 1")
    assert "after a fiber cap only more caps may follow" in _invalid(
        "start unlink(3) with handle across 1 2\nin B2xS2\ncap fiber 1\ndeath 3")


def test_a_band_across_a_face_the_gate_runs_through_must_keep_to_one_side():
    # face 1 of 5_1 is bounded by edges 1, 7, 3, 9, 5 in this order; the gate enters it across edge 1 and leaves
    # across edge 3. A band between edges 9 and 5 stays on one side of the gate; one between 7 and 5 cuts it.
    start = "start 5_1 with handle across 1 3 from face 2"
    assert [side.edge for side in parse_diagram("5_1").faces[1][0]] == [1, 7, 3, 9, 5]
    assert check_movie(f"{start}\nband 9 5 in face 1").verdict == "verified"
    assert "the step cuts through a handle's gate" in _invalid(f"{start}\nband 7 5 in face 1")


def test_the_declared_manifold_must_fit():
    with pytest.raises(Exception, match="a movie in S\\^3 needs no such line"):
        parse_movie("start unknot\nin S1xB3")
    with pytest.raises(Exception, match="says once where its surface lives"):
        parse_movie("start unlink(2) with handle across 1 2\nin S1xB3\nin B2xS2")
    result = check_movie(f"start {TREFOIL}\nin S1xB3\nR1 add 3 left +")
    assert result.verdict == "contradicted" and "neither starts nor ends empty" in result.findings[0].message


def test_the_balanced_fibers_bound_disks_in_b2xs2():
    for p in (1, 2):
        edges = " ".join(str(e) for e in range(1, 2 * p + 1))
        caps = "\n".join(f"cap fiber {c}" for c in range(1, 2 * p + 1))
        spec = f"reverse(braid({2 * p})[], {', '.join(str(c) for c in range(p + 1, 2 * p + 1))}) with handle across {edges}"
        result = check_movie(f"start {spec}\nin B2xS2\n{caps}\nsurface components {2 * p}")
        data = as_json(result)
        assert result.verdict == "verified"
        # Gompf–Stipsicz, '4-Manifolds and Kirby Calculus', ch. 4: the belt circle of a 2-handle (a meridian of its
        # attaching circle: here a fiber) bounds its cocore disk.
        # the design notes (section 4): F(p, p) bounds 2p cocore disks in B^2 x S^2, chi = 2p; the start is
        # null-homologous (p strands each way), and so is the surface
        assert data["surface"]["lives_in"] == "B^2 x S^2" and data["surface"]["fiber_caps"] == [[p, p]]
        assert data["surface"]["euler_characteristic"] == 2 * p and data["surface"]["null_homologous"]
        assert all(b["holds"] and b["tight"] for b in data["bounds"])


def test_where_a_movie_with_handles_lives():
    from movies.bounds.handles import handle_place

    result = check_movie(f"start {TREFOIL}\nR1 add 3 left +\nR1 remove 4")
    data = as_json(result)
    assert result.verdict == "verified" and data["surface"]["lives_in"] == "S^1 x S^2 x I"
    # a circle off the handles dies as in S^3; the fibers are capped
    result = check_movie("start unlink(3) with handle across 1 2\nin B2xS2\ndeath 3\ncap fiber 1\ncap fiber 2")
    assert result.verdict == "verified" and as_json(result)["surface"]["lives_in"] == "B^2 x S^2"
    # a movie that ends empty without caps lies in a collar of the boundary, so in both boundary sums
    place = handle_place(2, True, None, ((0, 0), (0, 0)), (0, 0))
    assert (place.name, place.also) == ("\u266e^2 S^1 x B^3", ("\u266e^2 B^2 x S^2",))


def test_twisting_commutes_with_every_step_that_keeps_off_the_handles():
    # the design notes (section 2), tested rather than assumed: a step that keeps off the gates is, for every k,
    # the same step between the twisted approximations
    rng = random.Random(14)
    names = table_names("knot", max_crossings=7)[1:]
    checked = 0
    for name in rng.sample(names, 8):
        link = random_link_with_a_handle(parse_diagram(name), rng)
        if link is None:
            continue
        records, frames = random_steps(link, rng, 4)
        for record, before, after in zip(records, frames, frames[1:]):
            for k in (-1, 1, 2):
                moved = perform(record, twisted(before, k)).diagram
                assert same_on_sphere(moved, twisted(after, k)), (name, str(record), k)
                checked += 1
    assert checked >= 30, checked


def _checked_random_movie(name, link, records):
    """Check the movie of ``records`` from ``name`` with ``link``'s handle: it must be verified and
    break no inequality (a broken one would raise inside check_movie)."""
    gate = " ".join(map(str, link.gates[0].edges))
    text = "\n".join([f"start {name} with handle across {gate} from face {link.gates[0].start_face(link.diagram)}"]
                     + [str(r) for r in records])
    result = check_movie(text)
    assert result.verdict == "verified", (text, [f.message for f in result.findings])
    assert all(b.holds for b in result.bounds.bounds)
    return result, text


def test_random_verified_handle_movies_never_break_an_inequality():
    # a verified movie whose bounds failed would raise an internal inconsistency inside check_movie
    rng = random.Random(41)
    names = table_names("knot", max_crossings=6)[1:]
    verified = 0
    for name in rng.sample(names, 6):
        link = random_link_with_a_handle(parse_diagram(name), rng)
        if link is None:
            continue
        records, _ = random_steps(link, rng, 3)
        _checked_random_movie(name, link, records)
        verified += 1
    assert verified >= 4, verified


def test_a_band_that_reverses_a_strand_through_a_handle_keeps_the_gate():
    # the new circle's orientation wins the band here, so the trefoil's edges change direction and left and right
    # trade places at the gate; the gate must still start in the same face (face 1, beside edge 1)
    result = check_movie(f"start {TREFOIL}\nbirth in face 5\nband 7 3 in face 5")
    assert result.verdict == "verified"
    last = result.handle_frames[-1]
    assert last.gates[0].edges == (1, 5) and last.gates[0].start_face(last.diagram) == 1
    for k in (-1, 1):
        before = result.handle_frames[-2]
        moved = perform(MoveRecord("band", first=7, second=3, face=5), twisted(before, k)).diagram
        assert same_on_sphere(moved, twisted(last, k))


def test_isotopy_claims_off_the_handles():
    start = "start reverse(braid(2)[], 2) with handle across 1 2"
    # the same diagram with the same handles: certified
    assert check_movie(f"{start}\nisotopic to reverse(braid(2)[], 2) with handle across 1 2").verdict == "verified"
    # a class that differs refutes the claim (fibers(2, 0) runs both strands one way)
    result = check_movie(f"{start}\nisotopic to braid(2)[] with handle across 1 2")
    assert result.verdict == "contradicted" and "their classes in H_1" in result.findings[0].evidence
    # agreement on every approximation leaves the claim unproved: the two circles drawn the other way round
    result = check_movie(f"{start}\nisotopic to reverse(braid(2)[], 1) with handle across 1 2")
    assert result.verdict == "conditional" and "is unproved" in result.findings[0].message


def test_every_frame_is_drawn_with_its_gates(tmp_path, capsys):
    import json
    import re

    from movies.cli.main import main
    from movies.report.html import movie_html

    path = "examples/movies/trefoil-concordance-in-S1xS2.movie"
    result = check_movie(path)
    page = movie_html(result, source=path)
    # one gate per frame, read back from the drawing: the edges it crosses are the handle's
    gates = re.findall(r'<path class="gate" data-handle="1" data-edges="([0-9 ]+)"', page)
    assert gates == ["1 5"] * len(result.frames)
    assert main(["frames", path, "--at", "2", "--json"]) == 0
    assert json.loads(capsys.readouterr().out)["handles"] == [{"edges": [1, 5], "start_face": 1}]
    out = tmp_path / "h.svg"
    assert main(["draw", "unlink(4) with handle across 1 2 and handle across 3 4", "-o", str(out)]) == 0
    assert re.findall(r'data-handle="(\d)" data-edges="([0-9 ]+)"', out.read_text()) == [("1", "1 2"), ("2", "3 4")]


@pytest.mark.parametrize("name", ["fibers-bound-disks-in-B2xS2", "trefoil-concordance-in-S1xS2",
                                  "annulus-of-two-fibers-in-S1xB3"])
def test_mutants_of_the_handle_examples_are_never_wrongly_verified(name):
    # each mutant changes one argument of one step; one the checker calls verified is replayed here step by step,
    # and each step must keep off the handles in the sense that matters: for every k it is a step of the same kind
    # between the twisted approximations
    from pathlib import Path

    from checker.test_mutations import mutants

    path = Path(__file__).resolve().parents[2] / "examples" / "movies" / f"{name}.movie"
    movie = parse_movie(path.read_text())
    original = check_movie(movie)
    assert original.verified
    verdicts = []
    for description, mutant in mutants(movie, original.frames, random.Random(name)) + _cap_mutants(movie, original):
        result = check_movie(mutant)
        verdicts.append(result.verdict)
        if not result.verified:
            continue
        frames, handles = result.frames, result.handle_frames
        steps = [s for s in mutant.statements if s.record is not None]
        for number, statement in enumerate(steps):
            record = statement.record
            if record.kind == "cap":
                (edge,) = frames[number].components[record.component]
                assert sum(gate.edges.count(edge) for gate in handles[number].gates) == 1, description
                continue
            for k in (-1, 1):
                assert approximations_related(record.kind, record, (handles[number], frames[number]),
                                              (handles[number + 1], frames[number + 1]), k), (description, k)
    assert any(v != "verified" for v in verdicts)


def _cap_mutants(movie, original):
    """Mutants that cap another component, or die instead of capping."""
    from dataclasses import replace

    out = []
    for index, statement in enumerate(movie.statements):
        if statement.record is None or statement.record.kind != "cap":
            continue
        for component in range(1, 4):
            for kind in ("cap", "death"):
                record = MoveRecord(kind, component=component)
                if record == statement.record:
                    continue
                changed = replace(statement, kind=kind, record=record)
                statements = movie.statements[:index] + (changed,) + movie.statements[index + 1:]
                out.append((f"line {statement.line}: {record}", replace(movie, statements=statements)))
    return out


@pytest.mark.parametrize("start", ["L4a1{1}", "L4a1{1} with handle across 2 6 and handle across 4 8"])
def test_a_band_that_reverses_a_component_is_judged_with_the_induced_orientation(start):
    # a circle is born and banded to component 1 against its orientation: the move keeps the circle's orientation
    # and reverses component 1, but the surface (an annulus for each component) induces the old one. Beliakova–Wehrli
    # 2008: s of links is a concordance invariant, so s of the end, read with the induced orientation, equals s of the
    # start; read as drawn it would be s(L4a1{0}) = -1 and the inequalities would (wrongly) fail
    result = check_movie(f"start {start}\nbirth in face 1\nband 9 3 in face 1")
    assert result.verdict == "verified" and result.surface.end_reversed == (1,)
    assert result.bounds.s["end"] == result.bounds.s["start"]
    assert all(b.holds for b in result.bounds.bounds)


@pytest.mark.parametrize("name, manifold", [("fibers-bound-disks-in-B2xS2", "B^2 x S^2"),
                                            ("mistake-two-disks-in-B2xS2", "B^2 x S^2"),
                                            ("6_1-through-a-handle-disk-in-B2xS2", "B^2 x S^2"),
                                            ("annulus-of-two-fibers-in-S1xB3", "S^1 x B^3"),
                                            ("square-knot-through-a-handle-disk-in-S1xB3", "S^1 x B^3")])
def test_movies_bounds_agrees_with_the_checker_on_the_examples(name, manifold):
    # the same inequalities without a movie: 1 - chi >= s(L(k)) and s(m(L(k))) for the k the manifold allows
    from pathlib import Path

    from movies.bounds.handles import surface_questions

    path = Path(__file__).resolve().parents[2] / "examples" / "movies" / f"{name}.movie"
    result = check_movie(path)
    answers = {a.manifold: a for a in surface_questions(result.movie.handles, genus=0, fields=("Q", "F2"))}
    best = max(b.rhs for b in answers[manifold].bounds)
    allowed = 1 - result.surface.euler_characteristic >= best
    assert allowed == (result.verdict == "verified"), (name, best, result.surface.euler_characteristic)


def test_sliding_a_gate_past_a_crossing_of_its_strands():
    from movies.checker import search
    from movies.invariants.jones import jones_polynomial

    start = "start braid(2)[1, 1] with handle across 1 3 from face 1"
    result = check_movie(f"{start}\nslide handle 1 past crossing 1\nslide handle 1 past crossing 2")
    assert result.verified
    assert [h.gates[0].edges for h in result.handle_frames] == [(1, 3), (4, 2), (1, 3)]
    # the slide is an isotopy of the handle's circle off the link: every approximation stays the same knot type
    before, after = result.handle_frames[0], result.handle_frames[1]
    for k in (-1, 1, 2):
        a, b = twisted(before, k), twisted(after, k)
        assert jones_polynomial(a) == jones_polynomial(b)
        assert search.certify(a, b, 5).certified, k
    # a crossing the gate's strands do not both run into, through the corner the gate passes
    assert "cannot slide past crossing 1" in _invalid("start 3_1 with handle across 1 5\nslide handle 1 past crossing 1")
    assert "'slide' is a step of a movie with handles" in _invalid("start unknot\nslide handle 1 past crossing 1")
    assert "'cap' is a step of a movie with handles" in _invalid("start unknot\ncap fiber 1")


def _example(name):
    from pathlib import Path

    return Path(__file__).resolve().parents[2] / "examples" / "movies" / f"{name}.movie"


@pytest.mark.parametrize("name", ["annulus-of-two-fibers-in-S1xB3", "square-knot-through-a-handle-disk-in-S1xB3",
                                  "6_1-through-a-handle-disk-in-B2xS2", "trefoil-concordance-in-S1xS2"])
def test_every_step_of_the_handle_examples_is_a_step_between_the_approximations(name):
    # the design notes (section 2), tested on each example: for every k the movie is one in S^3, each step a step of
    # the same kind between the twisted approximations (a band, found among the bands across one face, then an
    # isotopy; or an isotopy), proved by moves the Reidemeister search certifies. A fiber cap is no S^3 step.
    result = check_movie(_example(name))
    assert result.verdict == "verified"
    frames, handles = result.frames, result.handle_frames
    for number, statement in enumerate(result.movie.steps):
        if statement.kind == "cap":
            continue
        for k in (-1, 1):
            assert approximations_related(statement.kind, statement.record, (handles[number], frames[number]),
                                          (handles[number + 1], frames[number + 1]), k), (name, number, k)


def test_the_annulus_two_opposite_fibers_bound_in_s1xb3():
    result = check_movie(_example("annulus-of-two-fibers-in-S1xB3"))
    assert result.verdict == "verified" and as_json(result)["surface"]["lives_in"] == "S^1 x B^3"
    (component,) = result.surface.components
    assert (component.euler_characteristic, component.boundary_start) == (0, 2)
    # common practice, no source: L(k) of F(1, 1) is the (2, 2k) torus link with one strand reversed, which bounds
    # an annulus in B^4 (its two circles cobound a twisted annulus), so every B^4 inequality must hold with chi = 0
    assert all(b.holds for b in result.bounds.bounds)


def test_the_square_knot_through_a_handle_bounds_a_disk_in_s1xb3_and_every_approximation_is_slice():
    # the movie is, for every k, a ribbon disk for L(k). KnotInfo, columns jones_polynomial and smooth_four_genus:
    # L(1) and L(-1) are 8_20 and its mirror image, L(2) and L(-2) are 10_140 and its mirror, all of 4-genus 0
    from database_knotinfo import link_list

    from movies.diagram.constructors import mirror
    from movies.invariants.jones import jones_polynomial

    result = check_movie(_example("square-knot-through-a-handle-disk-in-S1xB3"))
    assert result.verdict == "verified" and as_json(result)["surface"]["lives_in"] == "S^1 x B^3"
    assert result.surface.euler_characteristic == 1 and result.surface.connected
    rows = {row["name"]: row for row in link_list() if row.get("name") in ("8_20", "10_140")}
    start = result.handle_frames[0]
    for k, name in ((1, "8_20"), (-1, "8_20"), (2, "10_140"), (-2, "10_140")):
        ours = {jones_polynomial(twisted(start, k)), jones_polynomial(mirror(twisted(start, k)))}
        assert jones_polynomial(parse_diagram(name)) in ours, (k, name)
        assert rows[name]["smooth_four_genus"] == "0"


def test_the_stevedore_knot_through_a_handle_bounds_a_disk_in_b2xs2():
    # Gompf–Stipsicz, "4-Manifolds and Kirby Calculus" (1999), section 4.6: a meridian of the attaching circle of a
    # 2-handle bounds its cocore disk; here the movie ends in two fibers, one each way, capped by cocores
    result = check_movie(_example("6_1-through-a-handle-disk-in-B2xS2"))
    assert result.verdict == "verified" and as_json(result)["surface"]["lives_in"] == "B^2 x S^2"
    assert result.surface.euler_characteristic == 1 and result.surface.connected
    assert sorted(direction for _, _, direction in result.caps) == [-1, 1]


def test_pulling_back_a_strand_that_turns_back_through_a_handle():
    start = "start unlink(2) with handle across 1 2 2 from face 1"
    result = check_movie(f"{start}\npull back edge 2 through handle 1\ndeath 2")
    assert result.verdict == "verified"
    assert [h.gates[0].edges for h in result.handle_frames] == [(1, 2, 2), (1,), (1,)]
    assert result.handle_frames[0].homology_class() == result.handle_frames[1].homology_class() == (1,)
    assert "does not turn straight back through handle 1" in _invalid(f"{start}\npull back edge 1 through handle 1")
    assert "component 2 passes through handle 1" in _invalid(f"{start}\ndeath 2")
    assert "no handle 2" in _invalid(f"{start}\npull back edge 2 through handle 2")
    # a gate that crosses an edge twice, but not straight back, is refused where the diagram is read
    with pytest.raises(Exception, match="more than once, and not straight back"):
        parse_movie("start unlink(2) with handle across 2 1 2 from face 3")


def test_a_move_may_act_on_a_strand_through_a_handle_but_not_sweep_across_the_handle():
    # a kink and a finger on circle 1, beside where it passes through the handle, are carried along
    result = check_movie("start unlink(2) with handle across 1 2\nR1 add 1 left +\nR2 add 2 over 1 in face 2")
    assert result.verdict == "verified", [f.message for f in result.findings]
    assert result.handle_frames[-1].homology_class() == (0,)
    # removing a kink whose loop closes around the end of a gate would pass the strand through the handle's circle:
    # the gate of 'unknot with handle across 2 ...' starts inside the kink's loop
    kinked = "pd[[1, 1, 2, 2]] with handle across 1 2"
    link = parse_movie(f"start {kinked}").handles
    faces = gate_faces(link)[0]
    assert len(link.diagram.faces[faces[0]][0]) == 1  # the gate starts inside a monogon
    assert "sweeps across handle 1" in _invalid(f"start {kinked}\nR1 remove 1 kink 1")


def test_sliding_a_gate_past_a_strand_over_the_whole_bundle():
    from movies.checker import search

    start = "start pd[[1,5,2,4],[3,1,4,6],[5,3,6,2]] with handle across 4 from face 1"
    result = check_movie(f"{start}\nslide handle 1 past crossings 2")
    assert result.verified
    assert [h.gates[0].edges for h in result.handle_frames] == [(4,), (3,)]
    before, after = result.handle_frames
    for k in (-1, 1, 2):
        assert search.certify(twisted(before, k), twisted(after, k), 5).certified, k
    assert "must cross each of the 1 strands" in _invalid(f"{start}\nslide handle 1 past crossings 2 3")
    assert "does not run into crossing 3" in _invalid(f"{start}\nslide handle 1 past crossings 3")


def test_sliding_a_gate_of_two_strands_past_a_strand_over_both():
    from movies.checker import search

    # three nested circles, the handle around the outer two; a finger of the inner circle is pushed over both (two
    # R2 moves), and the gate slides along its two strands under the finger's first leg (crossings 1 and 3)
    start = ("start braid(3)[] with handle across 2 3\nR2 add 1 over 2 in face 2\nR2 add 4 over 3 in face 3")
    result = check_movie(f"{start}\nslide handle 1 past crossings 1 3\nslide handle 1 past crossings 2 4")
    assert result.verdict == "verified", [f.message for f in result.findings]
    assert [h.gates[0].edges for h in result.handle_frames[2:]] == [(2, 3), (5, 8), (2, 3)]
    before, after = result.handle_frames[2], result.handle_frames[3]
    for k in (-1, 1):
        assert search.certify(twisted(before, k), twisted(after, k), 10).certified, k
    assert "not next to each other along one strand" in _invalid(f"{start}\nslide handle 1 past crossings 1 4")
    assert "does not run into crossing" in _invalid(f"{start}\nslide handle 1 past crossings 3 1")
    # the finger over circle 2 but under circle 3: the handle's circle cannot pass it
    mixed = "start braid(3)[] with handle across 2 3\nR2 add 1 over 2 in face 2\nR2 add 3 over 4 in face 3"
    assert "passes over some strands of the bundle and under others" in _invalid(
        f"{mixed}\nslide handle 1 past crossings 1 3")


def test_random_steps_on_the_strands_through_a_handle_are_steps_between_the_approximations():
    # kinks, fingers and bands on the strands through a gate, beside the passage: the checker verifies the movie,
    # no inequality breaks (a broken one would raise inside check_movie), and for k = -1, 1 each step is a step of
    # the same kind between the approximations, proved by moves the search certifies
    rng = random.Random(2026)
    names = table_names("knot", max_crossings=5)[1:]
    touched = steps = 0
    for name in names * 4:
        link = random_link_with_a_handle(parse_diagram(name), rng)
        if link is None:
            continue
        records, _ = random_steps(link, rng, 4, most_crossings=9, on_gates=True)
        result, text = _checked_random_movie(name, link, records)
        for number, record in enumerate(records):
            before = result.handle_frames[number]
            touched += bool(set(perform(record, before.diagram).places.edges) & set(before.gates[0].edges))
            steps += 1
            for k in (-1, 1):
                assert approximations_related(record.kind, record, (before, result.frames[number]),
                                              (result.handle_frames[number + 1], result.frames[number + 1]), k,
                                              budget=5.0), (text, number, k)
    assert steps >= 30 and touched >= 8, (steps, touched)


def test_a_movie_may_start_from_nothing_with_handles_declared():
    start = "start empty with handle\nin S1xB3\nbirth in face 1\npush edge 1 through handle 1"
    # the band across the finger could run on either side of the passages: the checker asks which
    message = _invalid(f"{start}\nband 1 1 in face 2")
    assert "say which with 'leaving ...'" in message and "handle 1 across 1 2" in message
    assert "cannot cross what 'leaving' says" in _invalid(f"{start}\nband 1 1 in face 2 leaving handle 1 across 2 2 2")
    result = check_movie(_example("annulus-of-two-fibers-from-nothing"))
    assert result.verdict == "verified"
    assert [h.gates[0].edges for h in result.handle_frames] == [(), (), (1, 1), (1, 2)]
    data = as_json(result)["surface"]
    assert (data["lives_in"], data["reading"]) == ("S^1 x B^3", "bounded by the end")
    # the end is F(1, 1), one fiber each way: its class is 0 and each circle passes once
    end = result.handle_frames[-1]
    assert end.homology_class() == (0,) and sorted(end.directions[0]) == [-1, 1]
    for number, statement in enumerate(result.movie.steps):
        for k in (-1, 1):
            assert approximations_related(statement.kind, statement.record,
                                          (result.handle_frames[number], result.frames[number]),
                                          (result.handle_frames[number + 1], result.frames[number + 1]), k)


def test_pushing_a_finger_through_a_handle():
    assert "does not border edge 1" in _invalid("start unknot with handle\npush edge 1 through handle 1 in face 5")
    assert "runs through no face beside edge 3" in _invalid(
        "start braid(3)[] with handle across 1 from face 1\npush edge 3 through handle 1")
    # beside the gate's path: the new passages come in a row, and the class stays
    result = check_movie("start unlink(2) with handle across 1 from face 1\npush edge 2 through handle 1")
    assert result.verdict == "verified"
    after = result.handle_frames[-1]
    assert after.gates[0].edges in ((2, 2, 1), (1, 2, 2)) and after.homology_class() == (1,)


def test_a_handle_keeps_its_number_when_no_strand_is_left_through_it():
    start = "start unlink(3) with handle across 1 1 from face 1 and handle across 2 3"
    result = check_movie(f"{start}\npull back edge 1 through handle 1\ndeath 1\npush edge 2 through handle 2")
    assert result.verdict == "verified", [f.message for f in result.findings]
    assert [len(h.gates) for h in result.handle_frames] == [2, 2, 2, 2]
    assert result.handle_frames[-1].gates[0].edges == () and len(result.handle_frames[-1].gates[1].edges) == 4
    assert "no strand passes through it" in _invalid(
        "start pd[[1,5,2,4],[3,1,4,6],[5,3,6,2]] with handle across 4 from face 1 and handle\n"
        "slide handle 2 past crossings 2")


def test_movies_bounds_refuses_the_empty_link_with_handles(capsys):
    # a sphere bounds the empty link in every 4-manifold: the s-inequalities, which are about surfaces whose every
    # component meets the link, must not be read as forbidding it
    from movies.cli.main import main

    assert main(["bounds", "empty with handle"]) == 2
    assert "the empty link bounds only closed surfaces" in capsys.readouterr().err
