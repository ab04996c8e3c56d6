"""Benchmark: 100,000 hostile inputs through both readers and the command line.

Run: python tests/bench/bench_fuzz.py [COUNT] [SEED]   (writes tests/bench/results/fuzz.md)

Inputs come from tests/support/hostile.py: diagrams built from the notation's words with random
numbers (huge ones too), random nesting and unmatched brackets; movies built from the grammar's
statements; the bundled example movies mutated; command lines of cheap commands (``check`` of the
generated movies, ``frames``, ``invariants --classical``, ``bounds`` and ``draw`` under low
``--limit`` values) with hostile options. The contract: a reader returns or raises a located
``MoviesError`` (never an ``InternalError``); the command line ends in 0, 1 or 2 with no
traceback. Any other outcome is counted as a violation and the run exits 1. Each input has 120 s;
one that takes longer counts as a violation.
"""

from __future__ import annotations

import contextlib
import io
import os
import platform
import random
import signal
import statistics
import sys
import tempfile
import time
from collections import Counter
from datetime import date
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))
from support import hostile  # noqa: E402

from movies.cli.main import main  # noqa: E402
from movies.errors import InternalError, LocatedError, MoviesError  # noqa: E402
from movies.language.movie import parse_movie  # noqa: E402
from movies.language.spec import parse_diagram  # noqa: E402

RESULTS = Path(__file__).resolve().parent / "results" / "fuzz.md"
#: shares of the inputs: diagram reader, movie reader (grammar-built), movie reader (mutated
#: examples), command line
SHARES = (("spec", 0.35), ("movie", 0.20), ("example", 0.20), ("cli", 0.25))
PER_INPUT_SECONDS = 120


class _TooLong(BaseException):
    """An input that ran past its time (a BaseException, so no handler of the program hides it)."""


def _alarm(signum, frame):
    raise _TooLong()


def _reader_outcome(read, text: str) -> str:
    try:
        read(text)
    except InternalError as err:
        return f"VIOLATION internal error: {err}"
    except LocatedError as err:
        if not (isinstance(err.line, int) and isinstance(err.column, int) and err.line >= 1 and err.column >= 1):
            return f"VIOLATION no place: {type(err).__name__}"
        err.context()
        return type(err).__name__
    except MoviesError as err:
        return f"VIOLATION not located: {type(err).__name__}: {err}"
    except Exception as err:  # noqa: BLE001 - any other exception breaks the contract
        return f"VIOLATION {type(err).__name__}: {str(err)[:120]}"
    return "read"


def _cli_outcome(argv: list[str]) -> str:
    out, err = io.StringIO(), io.StringIO()
    try:
        with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
            code = main(argv)
    except SystemExit as stop:
        code = stop.code
    except Exception as exc:  # noqa: BLE001
        return f"VIOLATION {type(exc).__name__}: {str(exc)[:120]}"
    text = err.getvalue()
    if code not in (0, 1, 2) or "Traceback" in text:
        return f"VIOLATION exit {code}: {text[:200]}"
    return f"exit {code}"


def _shorten(text: str, width: int = 70) -> str:
    text = text.replace("\n", "⏎").replace("|", "¦")
    return text if len(text) <= width else f"{text[:width - 16]}… ({len(text)} chars)"


def main_bench(count: int, seed: int) -> int:
    rng = random.Random(seed)
    examples = hostile.example_texts()
    signal.signal(signal.SIGALRM, _alarm)
    outcomes: dict[str, Counter] = {kind: Counter() for kind, _ in SHARES}
    times: dict[str, list[float]] = {kind: [] for kind, _ in SHARES}
    slowest: list[tuple[float, str, str]] = []
    violations: list[tuple[str, str, str]] = []
    started = time.perf_counter()
    with tempfile.TemporaryDirectory() as folder:
        movie_file = os.path.join(folder, "input.movie")
        output = os.path.join(folder, "drawing.svg")
        for index in range(count):
            kind = rng.choices([k for k, _ in SHARES], [w for _, w in SHARES])[0]
            if kind == "spec":
                text = hostile.spec(rng)
                run = lambda: _reader_outcome(parse_diagram, text)  # noqa: E731
            elif kind in ("movie", "example"):
                text = hostile.movie(rng) if kind == "movie" else hostile.mutated_example(rng, examples)
                run = lambda: _reader_outcome(parse_movie, text)  # noqa: E731
            else:
                with open(movie_file, "w", encoding="utf-8") as handle:
                    handle.write(rng.choice([hostile.mutated_example(rng, examples), hostile.movie(rng),
                                             hostile.plausible_movie(rng), hostile.plausible_movie(rng)]))
                args = hostile.argv(rng, movie_file, output)
                text = " ".join(args)
                run = lambda: _cli_outcome(args)  # noqa: E731
            signal.alarm(PER_INPUT_SECONDS)
            began = time.perf_counter()
            try:
                outcome = run()
            except _TooLong:
                outcome = f"VIOLATION over {PER_INPUT_SECONDS} s"
            finally:
                signal.alarm(0)
            spent = time.perf_counter() - began
            times[kind].append(spent)
            outcomes[kind][outcome.split(":")[0] if outcome.startswith("VIOLATION") else outcome] += 1
            if outcome.startswith("VIOLATION"):
                violations.append((kind, outcome, text))
                print(f"{kind}: {outcome}\n    input: {text[:300]!r}", file=sys.stderr)
            slowest.append((spent, kind, text))
            if len(slowest) > 200:
                slowest = sorted(slowest, reverse=True)[:10]
            if (index + 1) % 5000 == 0:
                print(f"{index + 1} inputs, {time.perf_counter() - started:.0f} s, {len(violations)} violations",
                      file=sys.stderr)
    total = time.perf_counter() - started
    slowest = sorted(slowest, reverse=True)[:10]
    lines = [
        "# Hostile inputs through the readers and the command line",
        "",
        f"{date.today()}, {os.cpu_count()} cores, Python {platform.python_version()}. "
        f"`python tests/bench/bench_fuzz.py {count} {seed}`: {count} inputs from `tests/support/hostile.py` "
        f"(seed {seed}) in {total:.0f} s, in one process. Contract: every input ends in a result or a located "
        "`MoviesError` (readers), in exit 0, 1 or 2 without a traceback (command line); "
        f"violations: **{len(violations)}**.",
        "",
        "| input kind | inputs | median time (ms) | slowest (ms) |",
        "|---|---|---|---|",
    ]
    for kind, _ in SHARES:
        spent = times[kind]
        if spent:
            lines.append(f"| {kind} | {len(spent)} | {statistics.median(spent) * 1000:.2f} | {max(spent) * 1000:.0f} |")
    lines += ["", "Kinds: `spec` diagram notation (`parse_diagram`), `movie` grammar-built movies and `example` "
              "mutated example movies (`parse_movie`), `cli` `movies.cli.main.main([...])` in process.", ""]
    for kind, _ in SHARES:
        lines += [f"## Outcomes: {kind}", "", "| outcome | count |", "|---|---|"]
        lines += [f"| {outcome} | {n} |" for outcome, n in sorted(outcomes[kind].items(), key=lambda item: -item[1])]
        lines.append("")
    lines += ["## Slowest inputs", "", "| ms | kind | input |", "|---|---|---|"]
    lines += [f"| {spent * 1000:.0f} | {kind} | `{_shorten(text)}` |" for spent, kind, text in slowest]
    if violations:
        lines += ["", "## Violations", ""] + [f"- {kind}: {outcome} — `{_shorten(text, 120)}`"
                                                for kind, outcome, text in violations[:50]]
    RESULTS.write_text("\n".join(lines) + "\n", encoding="utf-8")
    print("\n".join(lines))
    return 1 if violations else 0


if __name__ == "__main__":
    arguments = sys.argv[1:]
    raise SystemExit(main_bench(int(arguments[0]) if arguments else 100_000, int(arguments[1]) if len(arguments) > 1 else 1))
