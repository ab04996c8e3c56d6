"""The command line: what it prints, its JSON, and its exit codes."""

import json
import subprocess
import sys
from pathlib import Path

import pytest

from movies.cli.main import main

ROOT = Path(__file__).resolve().parents[2]


def run(capsys, *argv):
    code = main(list(argv))
    out, err = capsys.readouterr()
    return code, out, err


def test_json_of_the_trefoil(capsys):
    code, out, err = run(capsys, "invariants", "--pd", "[[1,5,2,4],[3,1,4,6],[5,3,6,2]]", "--json")
    assert code == 0 and err == ""
    facts = json.loads(out)
    assert facts["components"] == 1 and facts["crossings"] == 3 and facts["writhe"] == 3
    # KnotInfo column jones_polynomial of 3_1: t+ t^3-t^4
    assert facts["jones"] == [[1, 1], [3, 1], [4, -1]]
    # KnotInfo column signature of 3_1
    assert facts["signature"] == -2
    assert facts["linking_matrix"] == [[0]]
    # KnotInfo column alexander_polynomial of 3_1: 1-t+ t^2
    assert facts["alexander"] == [[0, 1], [1, -1], [2, 1]]
    # KnotInfo column determinant of 3_1
    assert facts["determinant"] == 3


def test_every_way_of_naming_the_trefoil_agrees(capsys):
    outputs = []
    for argv in (
        ["3_1"],
        ["--braid", "[1, 1, 1]"],
        ["--braid", "[1, 1, 1]", "--strands", "2"],
        ["torus(2, 3)"],
        ["pd[[1,5,2,4],[3,1,4,6],[5,3,6,2]]"],
    ):
        code, out, _ = run(capsys, "invariants", *argv, "--json")
        assert code == 0
        outputs.append(json.loads(out))
    assert all(o == outputs[0] for o in outputs)


def test_half_integer_jones_exponents_of_a_link(capsys):
    code, out, _ = run(capsys, "invariants", "L2a1{1}", "--json")
    facts = json.loads(out)
    # LinkInfo column jones_polynomial of L2a1{1}: -x-x^5 with x = t^(1/2)
    # written exactly, with no floating point in the JSON
    assert facts["jones"] == [["1/2", -1], ["5/2", -1]]
    # LinkInfo column linking_matrix of L2a1{1}
    assert facts["linking_matrix"] == [[0, 1], [1, 0]]


def test_readable_table(capsys):
    code, out, _ = run(capsys, "invariants", "3_1 # mirror(3_1)")
    assert code == 0
    lines = out.splitlines()
    assert lines[0] == "3_1 # mirror(3_1)"
    rows = {line.split()[0]: line for line in lines[1:]}
    assert "6   (writhe 0, 3 Seifert circles, 1 split piece)" in rows["crossings"]
    # from memory: the square knot has signature 0 and determinant 9
    assert rows["signature"].split()[-1] == "0"
    assert rows["determinant"].split()[-1] == "9"


def test_spec_from_a_file_with_comments(capsys, tmp_path):
    spec = tmp_path / "k.txt"
    spec.write_text("% a comment\nmirror(3_1)  % the left-handed trefoil\n")
    code, out, _ = run(capsys, "invariants", "--file", str(spec), "--json")
    assert code == 0
    # KnotInfo column signature of 3_1, negated for the mirror image
    assert json.loads(out)["signature"] == 2


@pytest.mark.parametrize(
    "argv, fragment",
    [
        (["--pd", "[[1,2,3,4]]"], "occur once each"),
        (["--pd", "[[1,1,2,2,2]]"], "5 labels"),
        (["--pd", "[[1,3,2,4],[2,4,1,3]]"], "not planar"),
        (["--pd", "[]"], "empty"),
        (["--pd", "[[1,2"], "not valid JSON"),
        (["--braid", "[1, 0]"], "nonzero"),
        (["--braid", "[1, 5]", "--strands", "3"], "position 2"),
        (["no_such_knot"], "no_such_knot"),
        (["3_2"], "3_2"),
        (["braid[1, 1"], "never closed"),
        (["--file", "/nonexistent/k.txt"], "cannot read"),
        (["3_1", "--pd", "[[1,5,2,4],[3,1,4,6],[5,3,6,2]]"], "exactly one diagram"),
        ([], "exactly one diagram"),
    ],
)
def test_bad_input_exits_2_with_one_reason(capsys, argv, fragment):
    code, out, err = run(capsys, "invariants", *argv)
    assert code == 2
    assert out == ""
    assert err.startswith("movies: error: ")
    assert fragment in err
    assert "Traceback" not in err


def test_usage_errors_exit_2(capsys):
    with pytest.raises(SystemExit) as stop:
        main(["invariants", "--strands", "x"])
    assert stop.value.code == 2


def test_module_entry_point_and_console_script():
    result = subprocess.run(
        [sys.executable, "-m", "movies", "invariants", "4_1", "--json"],
        capture_output=True, text=True, cwd=ROOT, check=False,
    )
    assert result.returncode == 0, result.stderr
    # KnotInfo column jones_polynomial of 4_1: t^(-2)-t^(-1)+ 1-t+ t^2
    assert json.loads(result.stdout)["jones"] == [[-2, 1], [-1, -1], [0, 1], [1, -1], [2, 1]]
    broken = subprocess.run(
        [sys.executable, "-m", "movies", "invariants", "--pd", "[[1,2,3,4]]"],
        capture_output=True, text=True, cwd=ROOT, check=False,
    )
    assert broken.returncode == 2 and "Traceback" not in broken.stderr


def test_invariants_of_a_link_with_handles(capsys):
    code, out, _ = run(capsys, "invariants", "3_1 with handle across 1 5", "--json", "--twists", "2")
    facts = json.loads(out)
    assert code == 0 and facts["class"] == [0] and facts["null_homologous"] and facts["two_divisible"]
    # KnotInfo rasmussen_invariant: L(0) = 3_1 has s = 2, L(1) the unknot 0; the floor 2 - 2 = 0 is reached
    assert facts["s"]["Q"]["sequence"] == [[-2, 2], [-1, 2], [0, 2], [1, 0]]
    assert facts["s"]["Q"]["s_plus"] == {"low": 0, "high": 0, "certified": True, "reached_at_k": 1}
    assert facts["s"]["Q"]["s_minus"]["certified"] is False
    code, out, _ = run(capsys, "invariants", "3_1 with handle across 1 5", "--twists", "2")
    assert "s+ over Q          0: certified" in out and "s- over Q          between 2 and 4: not certified" in out
    code, out, _ = run(capsys, "invariants", "braid(3)[] with handle across 1 2 3")
    assert code == 0 and "s is defined for null-homologous links only" in out
    code, _, err = run(capsys, "invariants", "3_1 with handle across 1 9")
    assert code == 2 and "handle 1: edge 9 is not in the diagram" in err


def test_khovanov_tables_and_the_approximations_of_a_link_with_handles(capsys):
    code, out, _ = run(capsys, "invariants", "fibers(1, 1)", "--json", "--twists", "2")
    facts = json.loads(out)
    tables = {t["k"]: t for t in facts["khovanov"]["Q"]}
    # the k computed for s, each with its table; Rasmussen 2010 / Khovanov 2000: Kh of the 2-component unlink,
    # L(0), is (q + 1/q)^2 in degree 0
    assert sorted(tables) == [-1, 0, 1, 2] and tables[0]["ranks"] == [[0, -2, 1], [0, 0, 2], [0, 2, 1]]
    assert tables[2]["stable_degrees"] == [0, 1] and tables[0]["stable_degrees"] == []
    code, out, _ = run(capsys, "invariants", "fibers(1, 1)", "--twists", "1")
    assert "Kh(L(k)) over Q, each twist region's identity resolution in bidegree (0, 0)" in out
    assert "    k = 1        h   0    1*   2" in out
    # --classical: no homology, and each L(k) as a link in S^3 (lk of F(1, 1)(k) is -k: k negative crossings)
    code, out, _ = run(capsys, "invariants", "fibers(1, 1)", "--twists", "1", "--classical", "--json")
    facts = json.loads(out)
    assert facts["khovanov"] is None and facts["s"] is None
    assert [(a["k"], a["linking_matrix"][0][1]) for a in facts["approximations"]] == [(-1, 1), (0, 0), (1, -1)]
    code, out, _ = run(capsys, "invariants", "fibers(1, 1)", "--twists", "1", "--reduced")
    assert code == 0 and out.count("reduced") >= 3 and "L(-1)" in out
