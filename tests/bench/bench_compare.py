"""Benchmark: the code as it is against an earlier commit, side by side in one run.

Run: python tests/bench/bench_compare.py [COMMIT] [--rounds N]
     (default COMMIT: the one before the restructuring; writes tests/bench/results/compare.md)

The earlier commit is checked out into a temporary git worktree. Each round runs every workload
once in a fresh process for each tree, alternating which tree goes first, so that the machine's
drift hits both alike; the report gives the median time per workload for each tree and the
ratio of the medians (now / before). Workloads, each through functions both trees have:

- homology: s over Q of a fixed spread of 10- to 12-crossing table knots, and of three torus
  knots of 20 to 24 crossings;
- checker: reading and checking every example movie of the earlier commit (the same movies for
  both trees), bounds included, and the 40-step random movies of the checker benchmark.
"""

from __future__ import annotations

import argparse
import json
import os
import platform
import statistics
import subprocess
import sys
import tempfile
from datetime import date
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
RESULTS = Path(__file__).resolve().parent / "results" / "compare.md"
BEFORE = "9e9d3f0"

WORKLOAD = r'''
import json, sys, time
from pathlib import Path
tests = Path(sys.argv[1])
sys.path.insert(0, str(tests))
from movies.checker.replay import check_movie
from movies.homology import rasmussen_s
from movies.language.movie import parse_movie
from movies.language.spec import parse_diagram
from draw.randomized import random_movie
which = sys.argv[2]
started = time.perf_counter()
if which == "homology":
    for name in ("10_132", "10_145", "11a_1", "11n_34", "12a_100", "12n_242", "12a_1000", "12n_800",
                 "torus(5, 6)", "torus(4, 7)", "torus(3, 10)"):
        rasmussen_s(parse_diagram(name))
elif which == "examples":
    for path in sorted(Path(sys.argv[3]).glob("*.movie")):
        check_movie(parse_movie(path.read_text()))
else:
    for seed in (1, 2, 3):
        text, _ = random_movie(seed)
        check_movie(parse_movie(text))
print(json.dumps(time.perf_counter() - started))
'''
WORKLOADS = ("homology", "examples", "random movies")


def run(tree: Path, which: str, examples: Path) -> float:
    env = dict(os.environ, PYTHONPATH=str(tree))
    out = subprocess.run([sys.executable, "-c", WORKLOAD, str(tree / "tests"), which, str(examples)], env=env, cwd=tree,
                         capture_output=True, text=True, check=True)
    return json.loads(out.stdout.strip().splitlines()[-1])


def main() -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("commit", nargs="?", default=BEFORE)
    parser.add_argument("--rounds", type=int, default=7)
    args = parser.parse_args()
    with tempfile.TemporaryDirectory() as folder:
        before = Path(folder) / "before"
        subprocess.run(["git", "-C", str(ROOT), "worktree", "add", "--detach", str(before), args.commit],
                       check=True, capture_output=True)
        try:
            times = {(tree, w): [] for tree in ("now", "before") for w in WORKLOADS}
            for index in range(args.rounds):
                order = [("now", ROOT), ("before", before)]
                if index % 2:
                    order.reverse()
                for which in WORKLOADS:
                    for label, tree in order:
                        # both trees check the same movies: the earlier commit's examples
                        times[(label, which)].append(run(tree, which, before / "examples" / "movies"))
                print(f"round {index + 1} of {args.rounds} done", file=sys.stderr)
        finally:
            subprocess.run(["git", "-C", str(ROOT), "worktree", "remove", "--force", str(before)], check=False)
    head = subprocess.run(["git", "-C", str(ROOT), "rev-parse", "--short", "HEAD"], capture_output=True,
                          text=True).stdout.strip()
    lines = [
        "# The code now against an earlier commit, side by side",
        "",
        f"{date.today()}, {os.cpu_count()} cores, Python {platform.python_version()}. Now: {head} (with any "
        f"uncommitted changes); before: {args.commit}. {args.rounds} rounds, each workload once per tree per "
        "round in a fresh process, the order of the trees alternating. Goal: ratio of medians at most 1.05.",
        "",
        "| workload | median now (s) | median before (s) | ratio now/before |",
        "|---|---|---|---|",
    ]
    worst = 0.0
    for which in WORKLOADS:
        now, old = statistics.median(times[("now", which)]), statistics.median(times[("before", which)])
        worst = max(worst, now / old)
        lines.append(f"| {which} | {now:.3f} | {old:.3f} | {now / old:.3f} |")
    RESULTS.write_text("\n".join(lines) + "\n")
    print("\n".join(lines))
    return 0 if worst <= 1.05 else 3


if __name__ == "__main__":
    raise SystemExit(main())
