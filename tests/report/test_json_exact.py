"""No floating point anywhere in the JSON the command line prints: every number is exact."""

import json
from pathlib import Path

import pytest

from movies.cli.main import main

EXAMPLES = Path(__file__).resolve().parents[2] / "examples" / "movies"


def _floats(value, path="$"):
    """Every place in a JSON value that holds a float."""
    if isinstance(value, float):
        return [path]
    if isinstance(value, dict):
        return [p for key, item in value.items() for p in _floats(item, f"{path}.{key}")]
    if isinstance(value, list):
        return [p for index, item in enumerate(value) for p in _floats(item, f"{path}[{index}]")]
    return []


def _json(capsys, *argv):
    code = main(list(argv))
    assert code in (0, 1), capsys.readouterr().err
    return json.loads(capsys.readouterr().out)


@pytest.mark.parametrize("spec", ["L2a1{1}", "L4a1{0}", "unlink(2)", "torus(2, 4)", "3_1 # mirror(3_1)"])
def test_invariants_json_is_exact(capsys, spec):
    data = _json(capsys, "invariants", spec, "--json", "--reduced", "--bar-natan", "--field", "F3")
    assert _floats(data) == []
    # half-integer exponents are written as fractions in strings
    assert all(isinstance(e, int) or "/" in e for e, _ in data["jones"])


@pytest.mark.parametrize("name", sorted(p.stem for p in EXAMPLES.glob("*.movie")))
def test_check_and_frames_json_is_exact(capsys, name):
    assert _floats(_json(capsys, "check", str(EXAMPLES / f"{name}.movie"), "--json")) == []
    assert _floats(_json(capsys, "frames", str(EXAMPLES / f"{name}.movie"), "--at", "0", "--json")) == []


def test_bounds_json_is_exact(capsys):
    assert _floats(_json(capsys, "bounds", "3_1", "--json")) == []
    assert _floats(_json(capsys, "bounds", "L2a1{1}", "--to", "unlink(2)", "--json")) == []
    assert _floats(_json(capsys, "bounds", "3_1", "--blowups", "2", "--class", "1,1", "--json")) == []
