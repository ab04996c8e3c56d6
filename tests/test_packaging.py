"""A non-editable install carries everything the package reads at run time."""

import subprocess
import sys
import zipfile
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]


def test_wheel_holds_the_grammar_and_runs_from_elsewhere(tmp_path):
    wheels = tmp_path / "wheels"
    subprocess.run(
        [sys.executable, "-m", "pip", "wheel", "--quiet", "--no-deps", "--no-build-isolation",
         "-w", str(wheels), str(ROOT)],
        check=True, capture_output=True,
    )
    (wheel,) = wheels.glob("movies-*.whl")
    names = set(zipfile.ZipFile(wheel).namelist())
    assert "movies/grammar/diagram.lark" in names
    assert "movies/language/spec.py" in names
    assert "movies/diagram/model.py" in names
    target = tmp_path / "site"
    subprocess.run(
        [sys.executable, "-m", "pip", "install", "--quiet", "--no-deps", "--target", str(target), str(wheel)],
        check=True, capture_output=True,
    )
    elsewhere = tmp_path / "elsewhere"
    elsewhere.mkdir()
    probe = (
        "import movies.language.spec as s, movies.grammar as g; "
        "d = s.parse_diagram('torus(2, 5) + unknot'); "
        "print(d.crossing_count(), d.component_count(), g.__file__.startswith(%r))" % str(target)
    )
    result = subprocess.run(
        [sys.executable, "-c", probe], cwd=elsewhere, capture_output=True, text=True,
        env={"PYTHONPATH": str(target), "PATH": "/usr/bin:/bin"}, check=False,
    )
    assert result.returncode == 0, result.stderr
    assert result.stdout.split() == ["5", "2", "True"]


def test_every_package_is_listed_for_the_wheel():
    import os
    import re

    listed = set(re.findall(r'"(movies[a-z_.]*)"', (ROOT / "pyproject.toml").read_text()))
    found = {
        os.path.relpath(folder, ROOT).replace(os.sep, ".")
        for folder, _, files in os.walk(ROOT / "movies")
        if "__init__.py" in files and "__pycache__" not in folder
    }
    assert found | {"movies.grammar"} <= listed
