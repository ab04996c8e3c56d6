"""The ``movies`` command: argument parsing, dispatch, and the one place errors become exit codes.

Exit codes: 0 success; 2 input that cannot be read (unparsable, invalid PD code, unknown
name); 130 interrupted. Errors are one line on standard error, never a traceback.

>>> main(["invariants", "--pd", "[[1,5,2,4],[3,1,4,6],[5,3,6,2]]", "--json"])  # doctest: +ELLIPSIS
{"components": 1, "crossings": 3, "writhe": 3, ...}
0
"""

from __future__ import annotations

import argparse
import json
import sys
from typing import Sequence

from movies.errors import InputError, MoviesError

EXIT_OK = 0
EXIT_INPUT = 2
EXIT_INTERRUPTED = 130


class _Parser(argparse.ArgumentParser):
    """argparse that reports usage errors in our one-line form, with our exit code."""

    def error(self, message: str) -> None:  # type: ignore[override]
        self.print_usage(sys.stderr)
        print(f"movies: error: {message}", file=sys.stderr)
        raise SystemExit(EXIT_INPUT)


def build_parser() -> argparse.ArgumentParser:
    """The argument parser of the ``movies`` command."""
    parser = _Parser(
        prog="movies",
        description="Check surfaces drawn as movies of link diagrams, and compute invariants of links.",
    )
    commands = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)

    inv = commands.add_parser(
        "invariants",
        help="print the invariants of a diagram",
        description=(
            "Print the classical invariants of a diagram. SPEC is any diagram notation of the "
            "movie language, e.g. 3_1, 'mirror(8_20)', 'torus(3, 4)', 'braid[1, -2, 1]', "
            "'L7a1{0}', '3_1 # mirror(3_1)', 'unlink(2)'. Scripts may pass --pd or --braid instead."
        ),
    )
    inv.add_argument("spec", nargs="?", metavar="SPEC", help="the diagram, in the movie language's notation")
    inv.add_argument("--pd", metavar="JSON", help="a PD code as a JSON list of 4-lists")
    inv.add_argument("--braid", metavar="JSON", help="a braid word as a JSON list of signed generators")
    inv.add_argument("--strands", type=int, metavar="N", help="number of strands of the --braid word")
    inv.add_argument("--file", metavar="PATH", help="read SPEC from a file")
    inv.add_argument("--json", action="store_true", help="print one JSON object instead of the table")
    inv.set_defaults(run=_run_invariants)
    return parser


def _json_argument(text: str, what: str):
    try:
        return json.loads(text)
    except json.JSONDecodeError as err:
        raise InputError(f"{what} is not valid JSON: {err.msg} at column {err.colno}") from None


def diagram_from_arguments(args: argparse.Namespace):
    """The diagram named by SPEC, --pd or --braid (exactly one of them)."""
    given = [name for name in ("spec", "pd", "braid", "file") if getattr(args, name) is not None]
    if len(given) != 1:
        raise InputError("give exactly one diagram: SPEC, --pd JSON, --braid JSON or --file PATH")
    if args.strands is not None and args.braid is None:
        raise InputError("--strands goes with --braid")
    if args.pd is not None:
        from movies.diagram.pd import from_pd

        return args.pd, from_pd(_json_argument(args.pd, "--pd"))
    if args.braid is not None:
        from movies.diagram.constructors import from_braid

        word = _json_argument(args.braid, "--braid")
        if not isinstance(word, list):
            raise InputError("--braid takes a JSON list of signed generators, e.g. [1, 1, -2]")
        return f"braid {args.braid}", from_braid(word, strands=args.strands)
    from movies.language.spec import parse_diagram

    if args.file is not None:
        try:
            with open(args.file, encoding="utf-8") as handle:
                text = handle.read()
        except OSError as err:
            raise InputError(f"cannot read {args.file}: {err.strerror}") from None
        return args.file, parse_diagram(text)
    return args.spec, parse_diagram(args.spec)


def _run_invariants(args: argparse.Namespace) -> int:
    from movies.cli.render import invariants_text
    from movies.invariants.summary import classical_invariants

    label, diagram = diagram_from_arguments(args)
    facts = classical_invariants(diagram)
    if args.json:
        print(json.dumps(facts))
    else:
        print(invariants_text(label, facts))
    return EXIT_OK


def main(argv: Sequence[str] | None = None) -> int:
    """Run the command line; returns the exit code."""
    parser = build_parser()
    args = parser.parse_args(argv)
    if getattr(args, "run", None) is None:
        parser.print_help()
        return EXIT_INPUT
    try:
        return args.run(args)
    except MoviesError as err:
        message = str(err).strip() or type(err).__name__
        print(f"movies: error: {message}", file=sys.stderr)
        context = getattr(err, "context", None)
        if callable(context):
            for line in context().splitlines():
                print(f"    {line}", file=sys.stderr)
        return err.exit_code
    except KeyboardInterrupt:
        print("movies: interrupted", file=sys.stderr)
        return EXIT_INTERRUPTED
