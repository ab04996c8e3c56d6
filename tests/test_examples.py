"""Every bundled example: its verdict and its surface."""

import json
import subprocess
import sys
from pathlib import Path

import pytest

from movies.checker.replay import check_movie
from movies.report.movie import as_json
from movies.cli.main import main
from movies.language.movie import parse_movie

EXAMPLES = Path(__file__).resolve().parents[1] / "examples" / "movies"

# verdict, Euler characteristic, (genus or None, crosscaps or None, boundary on start, on end) per component
EXPECTED = {
    "square-knot-ribbon": ("verified", 1, [(0, None, 1, 0)]),
    "8_20-ribbon": ("verified", 1, [(0, None, 1, 0)]),
    "5_2-sum-ribbon": ("verified", 1, [(0, None, 1, 0)]),
    "5_2-to-5_1-genus-one": ("verified", -2, [(1, None, 1, 1)]),
    "trefoil-concordance": ("verified", 0, [(0, None, 1, 1)]),
    "trefoil-moebius-band": ("verified", 0, [(None, 1, 1, 0)]),
    "mistake-illegal-move": ("invalid", None, None),
    "mistake-false-checkpoint": ("contradicted", -1, [(0, None, 2, 1)]),
    "mistake-false-isotopy": ("contradicted", -2, [(1, None, 1, 1)]),
    "mistake-whitehead-disks": ("contradicted", 2, [(0, None, 1, 0), (0, None, 1, 0)]),
    "5_1-unknotted-by-twists": ("verified", 1, [(0, None, 1, 0)]),
    "mirror-5_1-least-genus-in-a-blowup": ("verified", -1, [(1, None, 1, 0)]),
    "mistake-twist-of-the-wrong-hand": ("contradicted", 1, [(0, None, 1, 0)]),
    "3_1-disk-in-punctured-CP2": ("verified", 1, [(0, None, 1, 0)]),
    "3_1-from-nothing-in-CP2": ("verified", 1, [(0, None, 0, 1)]),
    "fibers-bound-disks-in-B2xS2": ("verified", 2, [(0, None, 1, 0), (0, None, 1, 0)]),
    "trefoil-concordance-in-S1xS2": ("verified", 0, [(0, None, 1, 1)]),
    "mistake-two-disks-in-B2xS2": ("contradicted", 2, [(0, None, 1, 0), (0, None, 1, 0)]),
    "6_1-ribbon-along-a-path": ("verified", 1, [(0, None, 1, 0)]),
    "annulus-of-two-fibers-in-S1xB3": ("verified", 0, [(0, None, 2, 0)]),
    "annulus-of-two-fibers-from-nothing": ("verified", 0, [(0, None, 0, 2)]),
    "square-knot-through-a-handle-disk-in-S1xB3": ("verified", 1, [(0, None, 1, 0)]),
    "6_1-through-a-handle-disk-in-B2xS2": ("verified", 1, [(0, None, 1, 0)]),
}


def test_every_example_is_listed():
    assert sorted(p.stem for p in EXAMPLES.glob("*.movie")) == sorted(EXPECTED)


@pytest.mark.parametrize("name", sorted(EXPECTED))
def test_example(name):
    verdict, euler, components = EXPECTED[name]
    result = check_movie(parse_movie((EXAMPLES / f"{name}.movie").read_text()))
    data = as_json(result)
    assert data["verdict"] == verdict
    assert data["verified"] is (verdict == "verified")
    if euler is None:
        assert data["surface"] is None
        return
    s = data["surface"]
    assert s["euler_characteristic"] == euler
    assert [(c["genus"], c["crosscaps"], c["boundary_start"], c["boundary_end"]) for c in s["components"]] == components


def test_ribbon_disks_end_empty_and_have_no_births():
    for name in ("square-knot-ribbon", "8_20-ribbon", "5_2-sum-ribbon"):
        s = as_json(check_movie(parse_movie((EXAMPLES / f"{name}.movie").read_text())))["surface"]
        assert s["ribbon"] and s["lives_in"] == "B^4" and s["oriented_by_start"]
        assert s["every_component_meets_start"] and not s["every_component_meets_end"]


def test_the_moebius_band_is_broken_by_its_band():
    s = as_json(check_movie(parse_movie((EXAMPLES / "trefoil-moebius-band.movie").read_text())))["surface"]
    assert s["orientable"] is False and s["orientation_broken_at_step"] == 1


def test_the_mistakes_say_where_and_why():
    illegal = as_json(check_movie(parse_movie((EXAMPLES / "mistake-illegal-move.movie").read_text())))
    (finding,) = illegal["findings"]
    assert finding["kind"] == "invalid" and finding["step"] == 2 and finding["line"] == 6
    assert "not a bigon" in finding["message"] and "faces 1, 2, 3, 4, 5, 6" in finding["evidence"]
    false = as_json(check_movie(parse_movie((EXAMPLES / "mistake-false-isotopy.movie").read_text())))
    claim, surface = false["findings"]
    assert claim["kind"] == "false" and "signature" in claim["evidence"]
    # the surface the false claim pretends to exist breaks an s-inequality, and the report says why
    assert surface["kind"] == "false" and surface["message"].startswith("no such surface exists")
    assert "line 7" in surface["evidence"]
    checkpoint = as_json(check_movie(parse_movie((EXAMPLES / "mistake-false-checkpoint.movie").read_text())))
    assert [f["line"] for f in checkpoint["findings"]] == [6, 7]


def test_found_moves_replay(tmp_path):
    # the moves reported for a simplify step, pasted back as ordinary steps, check the same
    text = (EXAMPLES / "square-knot-ribbon.movie").read_text()
    result = check_movie(parse_movie(text))
    (found,) = [s.found for s in result.steps if s.kind == "simplify"]
    replayed = text.replace("simplify to crossingless", "\n".join(found))
    again = check_movie(parse_movie(replayed))
    assert again.verified and again.frames[-1] == result.frames[-1]


def test_check_command_json_and_exit_codes(capsys):
    assert main(["check", str(EXAMPLES / "square-knot-ribbon.movie"), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    assert {"verified", "verdict", "steps", "start", "end", "surface"} <= set(data)
    assert data["start"] == {"components": 1, "crossings": 6} and data["end"] == {"components": 0, "crossings": 0}
    step = data["steps"][0]
    assert {"line", "move", "crossings", "components", "certified"} <= set(step)
    assert {"euler_characteristic", "orientable", "ribbon", "every_component_meets_start",
            "every_component_meets_end", "components"} <= set(data["surface"])
    assert main(["check", str(EXAMPLES / "mistake-illegal-move.movie")]) == 1


def test_frames_command_prints_names(capsys):
    assert main(["frames", str(EXAMPLES / "square-knot-ribbon.movie"), "--at", "1"]) == 0
    out = capsys.readouterr().out
    assert out.startswith("the frame after step 1 (band 4 10 in face 1)")
    assert "components (edges along the orientation):" in out
    assert main(["frames", str(EXAMPLES / "square-knot-ribbon.movie"), "--at", "9"]) == 2


def test_frames_as_json_and_drawn(capsys, tmp_path):
    movie = str(EXAMPLES / "square-knot-ribbon.movie")
    out = tmp_path / "frame.svg"
    assert main(["frames", movie, "--at", "1", "--json", "--svg", str(out)]) == 0
    data = json.loads(capsys.readouterr().out)
    result = check_movie(parse_movie((EXAMPLES / "square-knot-ribbon.movie").read_text()))
    frame = result.frames[1]
    assert data["at"] == 1 and data["step"] == "band 4 10 in face 1" and data["frames"] == len(result.frames)
    assert [c["name"] for c in data["crossings"]] == sorted(frame.crossings)
    assert {c["name"]: tuple(c["pd"]) for c in data["crossings"]} == frame.crossings
    assert [c["edges"] for c in data["components"]] == [list(frame.components[k]) for k in sorted(frame.components)]
    assert [f["name"] for f in data["faces"]] == sorted(frame.faces)
    svg = out.read_text()
    # drawn with its names: every crossing's name is written in the picture
    assert svg.startswith("<svg") and all(f">{name}<" in svg for name in frame.crossings)
    assert main(["frames", movie, "--at", "1", "--svg", str(tmp_path / "no" / "such" / "dir.svg")]) == 2


def test_readme_run_command_works():
    result = subprocess.run([sys.executable, "-m", "movies", "check", str(EXAMPLES / "square-knot-ribbon.movie")],
                            capture_output=True, text=True)
    assert result.returncode == 0 and "VERDICT  verified" in result.stdout


def test_the_whitehead_disks_are_ruled_out_by_the_mirror():
    data = as_json(check_movie(parse_movie((EXAMPLES / "mistake-whitehead-disks.movie").read_text())))
    claim, surface = data["findings"]
    assert claim["kind"] == "false" and claim["line"] == 7
    # the step table says the claim is false, not merely unproved
    assert data["steps"][0]["note"].startswith("FALSE")
    # Beliakova–Wehrli 2008: capping L by disks needs s(m(L)) <= 1 - chi; here s(m(L)) = 1 and chi = 2
    failing = [b for b in data["bounds"] if not b["holds"]]
    assert failing and all(b["statement"].startswith("mirror movie") and (b["lhs"], b["rhs"]) == (0, 2) for b in failing)
    assert surface["kind"] == "false" and "line 7" in surface["evidence"]


def _example(name):
    return as_json(check_movie(parse_movie((EXAMPLES / f"{name}.movie").read_text())))


def test_crossing_changes_as_twists_give_a_null_homologous_disk():
    data = _example("5_1-unknotted-by-twists")
    s = data["surface"]
    # the movie ends empty: 5_1 is on the boundary as usual, and each +1 twist is a CP^2 summand
    assert s["lives_in"] == "B^4 # CP^2 # CP^2" and s["reading"] == "bounded by the start"
    assert s["class"] == [0, 0] and s["square"] == 0 and s["null_homologous"]
    assert all(b["holds"] for b in data["bounds"]) and data["bounds"]


def test_a_genus_one_surface_in_a_blowup_is_least_for_its_class():
    data = _example("mirror-5_1-least-genus-in-a-blowup")
    s = data["surface"]
    assert s["lives_in"] == "B^4 # CP^2" and [abs(a) for a in s["class"]] == [2] and s["square"] == 4
    # KnotInfo rasmussen_invariant: s(5_1) = 4, so s(mirror(5_1)) = -4 (Rasmussen 2010);
    # Ren (2023), Cor. 1.4: 1 - s(5_1) + A >= chi with A = 2, chi = -1: an equality
    assert data["s"]["start"]["Q"] == -4
    assert data["bounds"] and all(b["tight"] for b in data["bounds"])
    assert "least genus its class allows" in data["least_genus"][0]


def test_a_twist_of_the_wrong_hand_is_caught():
    data = _example("mistake-twist-of-the-wrong-hand")
    claim, surface = data["findings"]
    assert claim["kind"] == "false" and claim["line"] == 11
    assert data["surface"]["null_homologous"]
    # Ren (2023), Cor. 1.4: the left-handed trefoil bounding a null-homologous disk in a punctured CP^2 means
    # 3_1 bounds one in a punctured CP^2-bar, which needs s(3_1) <= 0; KnotInfo rasmussen_invariant: s(3_1) = 2
    assert data["surface"]["lives_in"] == "B^4 # CP^2"
    assert surface["message"].startswith("no such surface exists") and "Ren, +1 twists only" in surface["message"]


def test_the_positive_trefoil_bounds_a_null_homologous_disk_in_a_punctured_cp2_both_ways():
    # Ozsváth–Szabó, "Knot Floer homology and the four-ball genus" (2003), Thm 1.1: no such disk in a negative
    # definite 4-manifold (tau(3_1) = 1); in punctured CP^2 a crossing change by a twist gives one
    forwards, backwards = _example("3_1-disk-in-punctured-CP2"), _example("3_1-from-nothing-in-CP2")
    for data, reading in ((forwards, "bounded by the start"), (backwards, "bounded by the end")):
        s = data["surface"]
        assert data["verdict"] == "verified"
        assert (s["lives_in"], s["reading"], s["definite"]) == ("B^4 # CP^2", reading, "positive definite")
        assert s["null_homologous"] and s["square"] == 0
    assert [b["summand"] for b in forwards["surface"]["blowups"]] == ["CP^2"]
    assert [b["turns"] for b in forwards["surface"]["blowups"]] == [1]
    assert [b["turns"] for b in backwards["surface"]["blowups"]] == [-1]


def test_movies_with_handles_name_where_they_live():
    # Gompf–Stipsicz, '4-Manifolds and Kirby Calculus', ch. 4: the belt circle of a 2-handle (a meridian of its
    # attaching circle: here a fiber) bounds its cocore disk.
    # the design notes (section 4): fibers capped by cocores lie in B^2 x S^2; a movie between two links through
    # a handle lies in the product of S^1 x S^2 with an interval
    disks, annulus = _example("fibers-bound-disks-in-B2xS2"), _example("trefoil-concordance-in-S1xS2")
    assert disks["surface"]["lives_in"] == "B^2 x S^2" and disks["surface"]["fiber_caps"] == [[1, 1]]
    assert annulus["surface"]["lives_in"] == "S^1 x S^2 x I" and annulus["surface"]["handles"] == 1
    # every k from -2 to 2 is judged, and every bound holds (KnotInfo rasmussen_invariant: the ends are the
    # same twist knots, so the concordance meets each inequality with equality)
    assert sorted({b["statement"].split(":")[0] for b in annulus["bounds"]}) == [f"k = {k}" for k in (-1, -2, 0, 1, 2)]
    assert all(b["holds"] and b["tight"] for b in annulus["bounds"])


def test_a_claimed_pair_of_disks_in_b2xs2_that_s_forbids():
    data = _example("mistake-two-disks-in-B2xS2")
    # Beliakova–Wehrli 2008 for the cobordism from L(0) to the fibers; LinkInfo's L5a1 has linking number 0, and
    # the claim is refuted by an invariant of the approximations before s is needed
    messages = [f["message"] for f in data["findings"]]
    assert any("is not isotopic to reverse(braid(2)[], 2) with handle across 1 2 off the handles" in m for m in messages)
    assert any(m.startswith("no such surface exists: k = 0: mirror movie") for m in messages)
    assert data["surface"]["lives_in"] == "B^2 x S^2" and data["surface"]["null_homologous"]


def _handle_facts(capsys, name):
    path = EXAMPLES.parent / "diagrams" / f"{name}.txt"
    assert main(["invariants", "--file", str(path), "--json", "--twists", "2"]) == 0
    return json.loads(capsys.readouterr().out)


def test_links_in_s1xs2_examples(capsys):
    trefoil = _handle_facts(capsys, "trefoil-through-a-handle")
    # KnotInfo rasmussen_invariant: 3_1, 5_2, 7_2 have s = 2; the unknot 0 (L(1), identified in the homology tests)
    assert trefoil["s"]["Q"]["sequence"] == [[-2, 2], [-1, 2], [0, 2], [1, 0]]
    assert trefoil["s"]["Q"]["s_plus"]["certified"] and trefoil["s"]["Q"]["s_plus"]["low"] == 0
    fibers = _handle_facts(capsys, "two-fibers-opposite-ways")
    # the design notes: s(F(1, 1)(k)) = -1 for k >= 1 (Ren 2023 at k = 1), +1 for k <= -1
    assert [s for k, s in fibers["s"]["Q"]["sequence"]] == [1, -1, -1, -1]
    assert not fibers["s"]["Q"]["s_plus"]["certified"] and fibers["s"]["Q"]["s_minus"]["certified"]
    clasp = _handle_facts(capsys, "twist-knots-through-a-handle")
    # KnotInfo rasmussen_invariant: 4_1 and 6_1 have s = 0, the negative trefoil and mirror(5_2) -2
    assert clasp["s"]["Q"]["sequence"] == [[-2, 0], [-1, 0], [0, 0], [1, -2]]
    assert clasp["s"]["Q"]["s_plus"] == {"low": -2, "high": -2, "certified": True, "reached_at_k": 1}
    assert clasp["s"]["Q"]["s_minus"] == {"low": 0, "high": 2, "certified": False, "reached_at_k": None}
    two = _handle_facts(capsys, "two-handles")
    # Beliakova–Wehrli 2008: s of a split union is s1 + s2 - 1; each half is F(1, 1)(k)
    assert two["class"] == [0, 0] and [s for k, s in two["s"]["Q"]["sequence"]] == [1, -3, -3, -3]
