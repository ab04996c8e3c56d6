"""The README's Python example runs as written, and its set-up commands match .ci/run."""

import re
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
README = (ROOT / "README.md").read_text(encoding="utf-8")


def test_python_example_runs():
    (block,) = re.findall(r"```python\n(.*?)```", README, re.S)
    namespace: dict = {}
    exec(compile(block, "README.md", "exec"), namespace)
    assert namespace["k"].crossing_count() == 6 and namespace["k"].writhe() == 0
    assert namespace["d3"].crossing_count() == 6
    assert namespace["result"].verdict == "verified" and namespace["disk"].verified


def test_ci_runs_the_readme_test_command():
    commands = re.findall(r"```\n(python -m pip install[^\n]*)\n```", README)
    assert len(commands) == 2
    test_command = commands[1]
    assert "pytest" in test_command
    assert test_command in (ROOT / ".ci" / "run").read_text(encoding="utf-8")
