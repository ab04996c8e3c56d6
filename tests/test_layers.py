"""Every import runs down the layers that DEVELOPERS.md lists, never up or sideways.

The layers are read from DEVELOPERS.md itself (the numbered list under "## Layers"), so the
document and the code cannot drift apart: a module may import its own package and the packages
of lower layers, nothing else. Imports inside functions count too.
"""

import ast
import re
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
PACKAGE = ROOT / "movies"


def layers() -> dict[str, int]:
    """Package (or ground-floor module) name -> its layer, from DEVELOPERS.md."""
    text = (ROOT / "DEVELOPERS.md").read_text(encoding="utf-8")
    section = text.split("## Layers", 1)[1].split("\n## ", 1)[0]
    level = {}
    for number, names in re.findall(r"^(\d+)\. ([^—\n]+)", section, re.M):
        for name in re.findall(r"`([a-z_]+)`", names):
            level[name] = int(number)
    return level


def imported(path: Path) -> list[tuple[int, str]]:
    """(line, first name under movies) for every import of the package in one file."""
    found = []
    for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
        if isinstance(node, ast.ImportFrom) and node.module and node.module.split(".")[0] == "movies" and node.level == 0:
            parts = node.module.split(".")
            names = [parts[1]] if len(parts) > 1 else [alias.name for alias in node.names]
            found += [(node.lineno, name) for name in names]
        elif isinstance(node, ast.Import):
            found += [(node.lineno, alias.name.split(".")[1]) for alias in node.names
                      if alias.name.startswith("movies.")]
    return found


def owner(path: Path) -> str:
    return path.relative_to(PACKAGE).with_suffix("").parts[0]


def test_every_package_has_a_layer():
    level = layers()
    owners = {owner(path) for path in PACKAGE.rglob("*.py")}
    assert owners - {"__init__", "__main__"} <= set(level), owners - set(level)
    assert len(set(level.values())) >= 8


def test_imports_run_down_the_layers():
    level = layers()
    level["__init__"] = level["__main__"] = max(level.values()) + 1
    wrong = []
    for path in sorted(PACKAGE.rglob("*.py")):
        mine = owner(path)
        for line, target in imported(path):
            if target == mine or target == "grammar":
                continue
            if level[target] >= level[mine]:
                wrong.append(f"{path.relative_to(ROOT)}:{line} imports movies.{target} "
                             f"(layer {level[target]}) from layer {level[mine]}")
    assert not wrong, "\n".join(wrong)


def test_the_check_can_fail(tmp_path):
    # a file that imports upward is caught by the same reading
    bad = tmp_path / "bad.py"
    bad.write_text("from movies.cli.main import main\n\ndef f():\n    import movies.report.movie\n")
    assert [name for _, name in imported(bad)] == ["cli", "report"]
