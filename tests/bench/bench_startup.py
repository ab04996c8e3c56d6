"""Benchmark: whole-process time of small commands (start-up, import, work, exit).

Run: python tests/bench/bench_startup.py [--rounds N]   (writes tests/bench/results/startup.md)

Each command runs as a fresh process, as the installed ``movies`` script runs it, interleaved round by
round so that machine noise hits them alike; the table gives the median and the slowest of N
rounds. Byte-code caching is left on (``PYTHONDONTWRITEBYTECODE`` is removed from the
environment), as on an installed copy; one untimed warm-up run writes the caches (Python's and
the parser tables'). Goal: under 0.3 s for ``invariants 3_1 --classical`` and for ``check`` of a
small movie.
"""

from __future__ import annotations

import argparse
import os
import platform
import statistics
import subprocess
import sys
import time
from datetime import date
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
RESULTS = Path(__file__).resolve().parent / "results" / "startup.md"

# what the installed ``movies`` script runs
MOVIES = [sys.executable, "-c", "import sys; from movies.cli.main import main; sys.exit(main())"]
COMMANDS = {
    "python -c pass (the interpreter alone)": [sys.executable, "-c", "pass"],
    "movies invariants 3_1 --classical": MOVIES + ["invariants", "3_1", "--classical"],
    "movies check examples/movies/trefoil-concordance.movie": MOVIES + [
        "check", str(ROOT / "examples" / "movies" / "trefoil-concordance.movie")],
    "movies invariants 3_1 (with homology)": MOVIES + ["invariants", "3_1"],
}


def measure(rounds: int) -> dict[str, list[float]]:
    """Whole-process seconds of each command, ``rounds`` interleaved rounds after one warm-up."""
    env = {k: v for k, v in os.environ.items() if k != "PYTHONDONTWRITEBYTECODE"}
    times: dict[str, list[float]] = {name: [] for name in COMMANDS}
    for command in COMMANDS.values():
        subprocess.run(command, env=env, capture_output=True, check=True, cwd=ROOT)
    for _ in range(rounds):
        for name, command in COMMANDS.items():
            started = time.perf_counter()
            subprocess.run(command, env=env, capture_output=True, check=True, cwd=ROOT)
            times[name].append(time.perf_counter() - started)
    return times


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--rounds", type=int, default=11)
    args = parser.parse_args()
    times = measure(args.rounds)
    lines = ["# Start-up: whole-process time of small commands", "",
             f"{date.today()}, {os.cpu_count()} cores, Python {platform.python_version()}. "
             f"Median and slowest of {args.rounds} interleaved rounds; byte-code caches on. Goal: 0.3 s.", "",
             "| command | median (s) | slowest (s) | median / interpreter alone |", "|---|---|---|---|"]
    base = statistics.median(times["python -c pass (the interpreter alone)"])
    for name, values in times.items():
        median = statistics.median(values)
        lines.append(f"| {name} | {median:.3f} | {max(values):.3f} | {median / base:.1f} |")
    RESULTS.write_text("\n".join(lines) + "\n", encoding="utf-8")
    print("\n".join(lines))
    return 0


if __name__ == "__main__":
    sys.exit(main())
