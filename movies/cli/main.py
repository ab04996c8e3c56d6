"""The ``movies`` command: argument parsing, dispatch, and the one place errors become exit codes.

Exit codes: 0 success (for ``check``: the movie is verified); 1 a movie that is not verified;
2 input that cannot be read (missing file, unparsable, invalid PD code, unknown name, past a
limit of :mod:`movies.limits`); 3 an internal error (a bug: please report it); 130 interrupted.
Errors are one line on standard error (and, for text, the line with a caret), never a traceback.
Every subcommand takes ``--limit NAME=VALUE`` (repeatable) to raise a limit.

>>> main(["invariants", "--pd", "[[1,5,2,4],[3,1,4,6],[5,3,6,2]]", "--json"])  # doctest: +ELLIPSIS
{"components": 1, "crossings": 3, "writhe": 3, ...}
0
"""

from __future__ import annotations

import argparse
import json
import os
import re
import sys
from typing import Sequence

from movies import limits
from movies.errors import InputError, InternalError, LimitError, MoviesError
from movies.language.files import read_text

EXIT_OK = 0
EXIT_NOT_VERIFIED = 1
EXIT_INPUT = 2
EXIT_INTERNAL = 3
EXIT_INTERRUPTED = 130


class _Parser(argparse.ArgumentParser):
    """argparse that reports usage errors in our one-line form, with our exit code."""

    def error(self, message: str) -> None:  # type: ignore[override]
        self.print_usage(sys.stderr)
        print(f"movies: error: {message}", file=sys.stderr)
        raise SystemExit(EXIT_INPUT)


def _whole_number(text: str) -> str:
    """A whole number as written (checked against the digits limit once the limits are set)."""
    if not re.fullmatch(r"\s*[+-]?[0-9]+\s*", text):
        raise ValueError(text)
    return text


_whole_number.__name__ = "int"  # argparse says "invalid int value: ..."

_LIMIT_HELP = ("raise a limit on the input, e.g. crossings=5000 (repeatable); limits: "
               + ", ".join(f"{name} ({value})" for name, value in limits.DEFAULTS.items()))


def _limit_option(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("--limit", action="append", default=[], metavar="NAME=VALUE", help=_LIMIT_HELP)


def build_parser() -> argparse.ArgumentParser:
    """The argument parser of the ``movies`` command.

    >>> build_parser().parse_args(["check", "a.movie", "--json"]).json
    True
    """
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
    inv.add_argument("--strands", type=_whole_number, metavar="N", help="number of strands of the --braid word")
    inv.add_argument("--file", metavar="PATH", help="read SPEC from a file")
    inv.add_argument("--json", action="store_true", help="print one JSON object instead of the table")
    inv.add_argument("--field", action="append", default=[], metavar="F",
                     help="also compute homology and s over this field (F3, F5, ...); Q and F2 always")
    inv.add_argument("--reduced", action="store_true", help="also reduced Khovanov homology")
    inv.add_argument("--bar-natan", action="store_true", help="also Bar-Natan homology over F[H]")
    inv.add_argument("--classical", action="store_true", help="only the classical invariants (no homology)")
    inv.add_argument("--twists", type=_whole_number, metavar="K", default="3",
                     help="for a diagram with handles: compute s and Khovanov homology of L(k) for |k| up to K (default 3)")
    _limit_option(inv)
    inv.set_defaults(run=_run_invariants)

    chk = commands.add_parser(
        "check",
        help="check a movie: every step, the surface, every claim",
        description="Check a movie file. Exit 0 when it is verified, 1 for any other verdict, 2 when "
        "the file cannot be read.",
    )
    chk.add_argument("file", metavar="FILE", help="the movie file")
    chk.add_argument("--json", action="store_true", help="print one JSON object instead of the report")
    chk.add_argument("--budget", metavar="SECONDS", default=None,
                     help="time each search may take (default 5; a movie's own 'budget' statement wins)")
    chk.add_argument("--html", metavar="OUT.html", help="also write the report as one self-contained HTML page")
    _limit_option(chk)
    chk.set_defaults(run=_run_check)

    fnd = commands.add_parser(
        "find",
        help="find a surface: a ribbon disk for a knot, written as a movie and checked",
        description=("Search for a surface and write it as a movie that movies check verifies. 'ribbon': bands "
                     "that cut the knot into an unlink (one band across a face or along a path over or under one or "
                     "two edges, or two bands across faces), then deaths. 'surface': first built (crossing changes, "
                     "each a genus-one piece, then Seifert's algorithm on the knot left), then pairs of bands (a split "
                     "and a join) down to the unknot, then a death; the genus as small as it finds. Prints "
                     "the movie, the checker's verdict and the lower bounds for the 4-genus the invariants give, "
                     "and '4-genus certified' when they meet. The candidates come in a fixed order; the budget is "
                     "time, so a slower machine may stop sooner."),
    )
    fnd.add_argument("what", choices=["ribbon", "surface"],
                     help="ribbon: a ribbon disk; surface: a connected surface of least genus it can find")
    fnd.add_argument("spec", metavar="KNOT", help="the knot, in the diagram notation")
    fnd.add_argument("--budget", metavar="SECONDS", default="60", help="time for the whole search (default 60)")
    fnd.add_argument("-o", "--output", metavar="FILE.movie", help="also write the movie to this file")
    fnd.add_argument("--to", metavar="KNOT", help="for 'surface': a cobordism to this knot instead of a surface to nothing")
    fnd.add_argument("--json", action="store_true", help="print one JSON object")
    _limit_option(fnd)
    fnd.set_defaults(run=_run_find)

    tri = commands.add_parser(
        "try",
        help="what candidate steps would leave, before they are written into a movie",
        description=("Try one or more candidate steps (lines of the movie language) on a frame: SOURCE is a movie "
                     "file (the frame after step --at N, by default its last) or, when no such file exists, a "
                     "diagram in the notation. For each step: legal or not (and why), the components, crossings "
                     "and linking numbers it leaves, and whether that is an unlink (by the invariants, then by the "
                     "Reidemeister search within --budget seconds)."),
    )
    tri.add_argument("source", metavar="SOURCE", help="a movie file, or a diagram (e.g. 6_1)")
    tri.add_argument("steps", nargs="+", metavar="STEP", help="a candidate step, e.g. 'band 3 9 in face 2'")
    tri.add_argument("--at", metavar="N", default=None, help="the frame of the movie after step N (0: the first)")
    tri.add_argument("--budget", metavar="SECONDS", default=None, help="time each search may take (default 5)")
    tri.add_argument("--json", action="store_true", help="print one JSON object")
    tri.add_argument("--svg", metavar="OUT.svg", help="draw what each legal step leaves (OUT-1.svg, OUT-2.svg, ...)")
    _limit_option(tri)
    tri.set_defaults(run=_run_try)

    drw = commands.add_parser(
        "draw",
        help="draw a diagram as SVG (or PNG)",
        description="Draw a diagram from its combinatorics: smooth strands, a gap in the under-strand, "
        "orientation arrows, one colour per component. SPEC as for 'invariants'.",
    )
    drw.add_argument("spec", nargs="?", metavar="SPEC", help="the diagram, in the movie language's notation")
    drw.add_argument("--pd", metavar="JSON", help="a PD code as a JSON list of 4-lists")
    drw.add_argument("--braid", metavar="JSON", help="a braid word as a JSON list of signed generators")
    drw.add_argument("--strands", type=_whole_number, metavar="N", help="number of strands of the --braid word")
    drw.add_argument("--file", metavar="PATH", help="read SPEC from a file")
    drw.add_argument("-o", "--output", metavar="FILE", required=True, help="FILE.svg, or FILE.png where a converter is found")
    drw.add_argument("--labels", action="store_true", help="write the names of edges, crossings and faces")
    _limit_option(drw)
    drw.set_defaults(run=_run_draw)

    bnd = commands.add_parser(
        "bounds",
        help="what s and the signatures say: 4-ball genus of a knot, or cobordisms between two links",
        description="With one diagram: lower bounds for the 4-ball genus of a knot and the invariant that "
        "gives the best one. With --to: whether an oriented cobordism of the given total genus from the first "
        "diagram to the second can exist, connected or with several components each meeting both ends, "
        "according to s over Q and F2 and (for knots) the signatures.",
    )
    bnd.add_argument("spec", metavar="SPEC", help="the (first) diagram")
    bnd.add_argument("--to", metavar="SPEC", help="the other end of a cobordism ('empty' for the 4-ball)")
    bnd.add_argument("--genus", type=_whole_number, metavar="G", default="0", help="total genus of the cobordism asked about (default 0)")
    bnd.add_argument("--components", type=_whole_number, metavar="N", default=None,
                     help="ask about N components only (default: every number from 1, connected, upwards)")
    bnd.add_argument("--blowups", type=_whole_number, metavar="K", default=None,
                     help="ask, by Ren's inequality, about a connected surface that SPEC bounds in the 4-ball "
                          "blown up K times (SPEC on its boundary, oriented as usual); with --to, about a "
                          "cobordism from SPEC to the other end in S³ × I blown up K times")
    bnd.add_argument("--summand", metavar="CP2-bar|CP2", default=None,
                     help="with --blowups: which summand, CP2-bar (negative definite, the default) or CP2")
    bnd.add_argument("--class", dest="homology_class", metavar="A1,...,AK", default=None,
                     help="with --blowups: the surface's class (default: null-homologous, all zero)")
    bnd.add_argument("--json", action="store_true", help="print one JSON object")
    _limit_option(bnd)
    bnd.set_defaults(run=_run_bounds)

    frm = commands.add_parser(
        "frames",
        help="print a frame of a movie with all its names",
        description="Print the diagram after step N of a movie (0 is the first frame) with every name, "
        "so that the next step can be written.",
    )
    frm.add_argument("file", metavar="FILE", help="the movie file")
    frm.add_argument("--at", type=_whole_number, metavar="N", default=None, help="the step (default: the last frame)")
    frm.add_argument("--budget", metavar="SECONDS", default=None, help="as for check")
    frm.add_argument("--json", action="store_true", help="print the frame's names as one JSON object")
    frm.add_argument("--svg", metavar="OUT.svg", help="also draw the frame, with every name, as an SVG file")
    frm.add_argument("--png", metavar="OUT.png", help="also draw the frame, with every name, as a PNG file")
    _limit_option(frm)
    frm.set_defaults(run=_run_frames)
    bat = commands.add_parser(
        "batch",
        help="run one task over many diagrams or movies, on Dask, into a results database",
        description=("Run a task (the invariants, checking a movie, or a search) on every item of a table range, "
                     "a file of diagrams or a folder of movies, on a local Dask cluster of worker processes (or on a "
                     "running scheduler with --scheduler), each item under a time limit; every result goes into an "
                     "SQLite file, and running the same command again resumes where it stopped. 'summary' and "
                     "'export' read the file."),
    )
    actions = bat.add_subparsers(dest="action", metavar="ACTION", parser_class=_Parser)
    run = actions.add_parser("run", help="run a batch (resumes: items already in the database are skipped)",
                             description="Run a batch; items the database already holds for the same task, "
                                         "options and program version are skipped.")
    source = run.add_mutually_exclusive_group(required=True)
    source.add_argument("--knots", metavar="RANGE", help="the knots of the table with this many crossings (7, 3-12)")
    source.add_argument("--links", metavar="RANGE", help="the oriented links of the table with this many crossings")
    source.add_argument("--diagrams", metavar="FILE", help="a text file of diagrams, one per line ('%%' comments)")
    source.add_argument("--movies", metavar="FOLDER", help="a folder of .movie files")
    run.add_argument("--task", required=True, choices=["invariants", "check", "find-ribbon", "find-surface"],
                     help="what to compute for each item, as the command line does")
    run.add_argument("--db", required=True, metavar="FILE.sqlite", help="the results database (created if missing)")
    run.add_argument("--time-limit", metavar="SECONDS", default="60", help="per item (default 60)")
    run.add_argument("--workers", metavar="N", help="worker processes of the local cluster (default: one per core)")
    run.add_argument("--scheduler", metavar="ADDRESS", help="a running Dask scheduler (tcp://host:port) instead")
    run.add_argument("--field", action="append", default=[], metavar="F", help="invariants: another field")
    run.add_argument("--classical", action="store_true", help="invariants: no homology")
    run.add_argument("--reduced", action="store_true", help="invariants: reduced Khovanov homology too")
    run.add_argument("--bar-natan", action="store_true", help="invariants: Bar-Natan homology too")
    run.add_argument("--budget", metavar="SECONDS", help="check and find: the search budget per item")
    run.set_defaults(run=_run_batch)
    summ = actions.add_parser("summary", help="counts by status, the slowest items, agreement with the tables")
    summ.add_argument("db", metavar="FILE.sqlite")
    summ.add_argument("--json", action="store_true", help="print one JSON object")
    summ.set_defaults(run=_run_batch_summary)
    exp = actions.add_parser("export", help="write every row to CSV or JSON lines")
    exp.add_argument("db", metavar="FILE.sqlite")
    kind = exp.add_mutually_exclusive_group(required=True)
    kind.add_argument("--csv", metavar="FILE.csv")
    kind.add_argument("--jsonl", metavar="FILE.jsonl")
    exp.set_defaults(run=_run_batch_export)
    for sub in (run, summ, exp):
        _limit_option(sub)
    return parser


def _summand(text: str) -> str:
    """``CP2-bar``, ``CP^2-bar``, ``cp2bar`` ... -> ``CP^2-bar``; ``CP2``, ``CP^2`` -> ``CP^2``."""
    key = text.lower().replace("^", "").replace("-", "").replace("_", "").replace("²", "2")
    names = {"cp2bar": "CP^2-bar", "cp2": "CP^2"}
    if key not in names:
        raise InputError(f"--summand: a summand is CP2-bar or CP2, not {text!r}")
    return names[key]


def _json_argument(text: str, what: str):
    """JSON from the command line, its nesting and the digits of its numbers checked first."""
    from movies.language.frontend import depth_message, nesting_problem

    deep = nesting_problem(text, comment=None, strings=True)
    if deep is not None:
        raise LimitError(f"{what}: {depth_message(limits.current()['depth'] + 1)} (column {deep + 1})", "depth")

    def whole(digits: str) -> int:
        message = limits.digits_error(digits, what)
        if message:
            raise LimitError(message, "digits")
        return int(digits)

    try:
        return json.loads(text, parse_int=whole)
    except json.JSONDecodeError as err:
        raise InputError(f"{what} is not valid JSON: {err.msg} at column {err.colno}") from None
    except RecursionError:  # only when the depth limit was raised past what the JSON reader can take
        raise LimitError(f"{what}: the JSON nests deeper than the reader can follow", "depth") from None


def _number(text: str | None, what: str) -> int | None:
    """An option's whole number, checked against the digits limit (None stays None)."""
    return None if text is None else limits.number(text, what)


def _seconds(text: str | None) -> float:
    from movies.checker.search import DEFAULT_BUDGET

    return DEFAULT_BUDGET if text is None else limits.seconds(text, "--budget")


def diagram_from_arguments(args: argparse.Namespace):
    """The diagram named by SPEC, --pd, --braid or --file (exactly one of them), with its label.

    >>> label, d = diagram_from_arguments(build_parser().parse_args(["invariants", "torus(2, 3)"]))
    >>> label, d.crossing_count()
    ('torus(2, 3)', 3)
    """
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
        return f"braid {args.braid}", from_braid(word, strands=_number(args.strands, "--strands"))
    from movies.language.spec import parse_diagram

    if args.file is not None:
        return args.file, parse_diagram(read_text(args.file))
    return args.spec, parse_diagram(args.spec)


def _run_invariants(args: argparse.Namespace) -> int:
    from movies.report.invariants import invariants_text
    from movies.invariants.summary import classical_invariants

    fields = ["Q", "F2"] + [f for f in args.field if f.upper() not in ("Q", "F2")]
    if not args.classical:
        from movies.homology.rings import parse_field

        for field in fields:  # a field that is not one is refused before any work
            parse_field(field)
    if args.spec is not None or args.file is not None:
        from movies.diagram.handles import HandleDiagram
        from movies.language.spec import read_spec

        if sum(x is not None for x in (args.spec, args.pd, args.braid, args.file)) == 1:
            spec = args.spec if args.spec is not None else read_text(args.file)
            read = read_spec(spec)
            if isinstance(read, HandleDiagram):
                return _run_handles(args, args.spec or args.file, read, fields)
    label, diagram = diagram_from_arguments(args)
    if args.classical or diagram.is_empty():
        facts = classical_invariants(diagram)
    else:
        from movies.homology.summary import invariants_facts

        with _progress("homology") as report:
            facts = invariants_facts(diagram, fields, False, args.reduced, args.bar_natan, progress=report)
    if args.json:
        print(json.dumps(facts))
    else:
        print(invariants_text(label, facts))
    return EXIT_OK


def _run_handles(args: argparse.Namespace, label: str, link, fields: list[str]) -> int:
    """``movies invariants`` of a link in #ʳ S¹×S²: its class, s and Khovanov homology of its twisted
    approximations; with ``--classical``, ``--reduced`` or ``--bar-natan`` also every L(k) as a link in S³."""
    from movies.homology.summary import handle_link_facts
    from movies.report.invariants import handles_text, invariants_text, khovanov_tables_text

    with _progress("approximations") as _:
        facts = handle_link_facts(link, fields, args.classical, args.reduced, args.bar_natan,
                                  _number(args.twists, "--twists"))
    approximations = facts.get("approximations", [])
    if args.json:
        print(json.dumps(facts))
        return EXIT_OK
    lines = [handles_text(label, facts)]
    if facts["khovanov"] is not None:
        lines += khovanov_tables_text("Q", facts["khovanov"]["Q"])
    elif facts["khovanov_note"] and not args.classical:
        lines.append(f"  Kh               {facts['khovanov_note']}")
    for entry in approximations:
        lines.append(invariants_text(f"L({entry['k']})", {key: v for key, v in entry.items() if key != "k"}))
    print("\n".join(lines))
    return EXIT_OK


def _read_movie(path: str):
    from movies.language.movie import parse_movie

    return parse_movie(read_text(path))


def _checked(args: argparse.Namespace):
    from movies.checker.replay import check_movie

    budget = _seconds(args.budget)
    movie = _read_movie(args.file)
    return check_movie(movie, budget)


def _run_check(args: argparse.Namespace) -> int:
    from movies.report.movie import as_json
    from movies.report.movie import as_text as check_text

    result = _checked(args)
    data = as_json(result)
    if args.html:
        from movies.report import movie_html

        _write(args.html, movie_html(result, source=args.file))
    print(json.dumps(data) if args.json else check_text(data, args.file))
    return EXIT_OK if result.verified else EXIT_NOT_VERIFIED


def _write(path: str, text: str) -> None:
    try:
        with open(path, "w", encoding="utf-8") as handle:
            handle.write(text)
    except OSError as err:
        raise InputError(f"cannot write {path}: {err.strerror}") from None


def svg_to_png(svg: str, path: str) -> None:
    """Write a PNG through the first converter found on this machine (rsvg-convert, ImageMagick)."""
    import shutil
    import subprocess
    import tempfile

    for tool, command in (("rsvg-convert", ["rsvg-convert", "-o", path]),
                          ("magick", ["magick", "svg:-", path]), ("convert", ["convert", "svg:-", path])):
        if shutil.which(tool):
            done = subprocess.run(command, input=svg.encode(), capture_output=True, check=False)
            if done.returncode == 0:
                return
    chromium = shutil.which("chromium") or shutil.which("chromium-browser")
    if chromium:
        width, height = _svg_size(svg)
        with tempfile.TemporaryDirectory() as folder:
            page = os.path.join(folder, "drawing.html")
            with open(page, "w", encoding="utf-8") as handle:
                handle.write(f'<!DOCTYPE html><html><body style="margin:0">{svg}</body></html>')
            done = subprocess.run(
                [chromium, "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
                 "--disable-background-networking", "--disable-component-update", "--disable-sync",
                 f"--user-data-dir={os.path.join(folder, 'profile')}", "--hide-scrollbars",
                 f"--window-size={width},{height}", f"--screenshot={os.path.abspath(path)}", f"file://{page}"],
                capture_output=True, check=False, timeout=120,
            )
            if done.returncode == 0 and os.path.exists(path):
                return
    raise InputError("no SVG to PNG converter was found (rsvg-convert, ImageMagick or Chromium); "
                     "write an .svg instead")


def _svg_size(svg: str) -> tuple[int, int]:
    import re

    found = re.search(r'width="([0-9.]+)" height="([0-9.]+)"', svg)
    return (int(float(found.group(1))) + 1, int(float(found.group(2))) + 1) if found else (600, 600)


def _run_draw(args: argparse.Namespace) -> int:
    if args.spec is not None or args.file is not None:
        from movies.diagram.handles import HandleDiagram
        from movies.language.spec import read_spec

        if sum(x is not None for x in (args.spec, args.pd, args.braid, args.file)) == 1:
            text = args.spec if args.spec is not None else read_text(args.file)
            read = read_spec(text)
            if isinstance(read, HandleDiagram):  # a link in #^r S^1 x S^2: drawn with its gates
                return _draw(args, args.spec or args.file, read.diagram, read.gates)
    label, diagram = diagram_from_arguments(args)
    return _draw(args, label, diagram, ())


def _draw(args: argparse.Namespace, label: str, diagram, gates) -> int:
    from movies.draw import diagram_svg

    svg = diagram_svg(diagram, labels=args.labels, title=label, gates=gates)
    if args.output.lower().endswith(".png"):
        svg_to_png(svg, args.output)
    elif args.output.lower().endswith(".svg"):
        _write(args.output, svg)
    else:
        raise InputError(f"the output {args.output} should end in .svg or .png")
    return EXIT_OK


def _say_progress():
    """Progress lines on standard error when it is a terminal (nothing in pipes and logs)."""
    if not sys.stderr.isatty():
        return None
    return lambda line: print(line, file=sys.stderr, flush=True)


def _run_find(args: argparse.Namespace) -> int:
    """``movies find ribbon K`` and ``movies find surface K [--to K2]``: a surface found by a
    search, checked as a movie, beside the lower bounds the invariants give."""
    from movies.checker.find import find_for

    data, found = find_for(args.spec, args.what, _seconds(args.budget), args.to, progress=_say_progress())
    if args.output and found.movie:
        _write(args.output, found.movie)
    if args.json:
        print(json.dumps(data))
        return _found_exit(found)
    print(_find_text(args, data, found))
    return _found_exit(found)


def _find_text(args: argparse.Namespace, data: dict, found) -> str:
    if "link" in data:
        n, links, s, mirror_s = data["components"], data["linking_numbers"], data["s"], data["mirror_s"]
        lines = [args.spec, f"  {n} components; linking numbers {links}; s {s}; s of the mirror {mirror_s}"]
        if found.movie:
            lines += ["  found ribbon disks, one for each component (" + ("; ".join(found.bands) or "no band")
                      + f"), checked: {found.verdict}", "", found.movie.rstrip()]
        else:
            lines.append(f"  no ribbon disks found: {found.why}")
        return "\n".join(lines)
    cobordism = args.to is not None
    bounds = data["genus_bounds" if cobordism else "four_genus_bounds"]
    genus, best, invariant = data["genus"], data["best_lower_bound"], data["best_invariant"]
    certified = data["genus_certified" if cobordism else "four_genus_certified"]
    lines = [args.spec if not cobordism else f"{args.spec} to {args.to}"]
    quantity = "genus" if cobordism else "g4"
    for b in bounds:
        if b["invariant"].startswith("Fox–Milnor"):
            what = "the product of the determinants" if cobordism else "the determinant"
            lines.append(f"  {what} {b['value']}: " + ("a square" if b["bound"] == 0 else
                                                       f"not a square, so by Fox–Milnor {quantity} >= 1"))
        else:
            lines.append(f"  {('difference of ' if cobordism else '') + b['invariant']:<28} {b['value']:>4}   "
                         f"{quantity} >= {b['bound']}")
    what = "a ribbon disk" if args.what == "ribbon" else "a cobordism" if cobordism else "a surface"
    if found.movie:
        lines.append(f"  found {what} of genus {genus} (" + ("; ".join(found.bands) or "no band")
                     + f"), checked: {found.verdict}")
        if certified is not None:
            lines.append(f"  {'cobordism genus' if cobordism else '4-genus'} certified: {genus} (the surface found; "
                         f"{invariant} gives {quantity} >= {best})")
        else:
            lines.append(f"  {quantity} is between {best} ({invariant}) and {genus} (the surface found)")
        lines += ["", found.movie.rstrip()]
    else:
        lines.append(f"  no {what[2:]} found: {found.why}")
    return "\n".join(lines)


def _found_exit(found) -> int:
    """0 when the search found a surface the checker verified; 130 after Ctrl-C; 1 otherwise."""
    if found.why.startswith("stopped by Ctrl-C"):
        return EXIT_INTERRUPTED
    return EXIT_OK if found.movie else EXIT_NOT_VERIFIED


def _run_try(args: argparse.Namespace) -> int:
    """``movies try``: candidate steps on a frame of a movie, or on a diagram."""
    import os

    from movies.checker.trial import try_steps
    from movies.report.trial import trial_lines

    budget = _seconds(args.budget)
    if os.path.isfile(args.source):
        from movies.checker.replay import check_movie

        result = check_movie(_read_movie(args.source), budget, bounds=False)
        last = len(result.frames) - 1
        wanted = _number(args.at, "--at")
        at = last if wanted is None else wanted
        if not 0 <= at <= last:
            stop = " (the movie stops at an invalid step)" if not result.complete else ""
            raise InputError(f"there is no frame after step {at}: the frames run from 0 to {last}{stop}")
        frame = result.frames[at]
        handles = result.handle_frames[at] if at < len(result.handle_frames) else None
        lives = result.movie.lives
        heading = f"{args.source}, the frame after step {at}" if at else f"{args.source}, the first frame"
    else:
        from movies.diagram.handles import HandleDiagram
        from movies.language.spec import read_spec

        if args.at is not None:
            raise InputError(f"--at is for a movie file; there is no file {args.source}")
        read = read_spec(args.source)
        frame, handles = (read.diagram, read) if isinstance(read, HandleDiagram) else (read, None)
        lives, heading = None, args.source
    trials = try_steps(frame, args.steps, budget, handles, lives)
    if args.svg:
        from movies.draw import diagram_svg

        stem = args.svg[:-4] if args.svg.lower().endswith(".svg") else args.svg
        for index, trial in enumerate(trials, start=1):
            if trial.legal:
                gates = trial.handles.gates if trial.handles is not None else ()
                _write(f"{stem}-{index}.svg", diagram_svg(trial.diagram, labels=True, title=trial.step, gates=gates))
    if args.json:
        print(json.dumps({"source": args.source, "heading": heading, "trials": [t.as_json() for t in trials]}))
    else:
        print("\n".join(trial_lines(heading, trials)))
    return EXIT_OK


def _run_frames(args: argparse.Namespace) -> int:
    wanted = _number(args.at, "--at")
    result = _checked(args)
    last = len(result.frames) - 1
    at = last if wanted is None else wanted
    if not 0 <= at <= last:
        stop = " (the movie stops at an invalid step)" if not result.complete else ""
        raise InputError(f"there is no frame after step {at}: the frames run from 0 to {last}{stop}")
    heading = "the first frame" if at == 0 else f"the frame after step {at} ({result.steps[at - 1].source})"
    frame = result.frames[at]
    handles = result.handle_frames[at] if at < len(result.handle_frames) else None
    gates = handles.gates if handles is not None else ()
    if args.svg or args.png:
        from movies.draw import diagram_svg
        from movies.draw.frames import frame_layouts
        from movies.report.html import frame_steps

        # laid out from the frames before it, as the report draws it
        svg = diagram_svg(frame, labels=True, title=heading, gates=gates,
                          lay=frame_layouts(result.frames[:at + 1], frame_steps(result))[-1])
        if args.svg:
            _write(args.svg, svg)
        if args.png:
            svg_to_png(svg, args.png)
    if args.json:
        print(json.dumps({"file": args.file, "at": at, "frames": last + 1, "heading": heading,
                          "step": None if at == 0 else result.steps[at - 1].source, **frame.as_data(),
                          **({"handles": [{"edges": list(g.edges), "start_face": g.start_face(frame)} for g in gates]}
                             if result.movie.handles is not None else {})}))
    else:
        print(heading)
        print(frame.summary())
        for number, gate in enumerate(gates, start=1):
            print(f"handle {number}: its gate crosses edges {', '.join(map(str, gate.edges))} from face "
                  f"{gate.start_face(frame)}")
    return EXIT_OK


def _run_bounds(args: argparse.Namespace) -> int:
    from movies.bounds.inequalities import best_genus_bound
    from movies.bounds.questions import cobordism_question
    from movies.bounds.verdicts import knot_genus_bounds
    from movies.report.questions import cobordism_lines
    from movies.language.spec import parse_diagram

    args.genus = _number(args.genus, "--genus")
    args.components = _number(args.components, "--components")
    args.blowups = _number(args.blowups, "--blowups")
    from movies.diagram.handles import HandleDiagram
    from movies.language.spec import read_spec

    read = read_spec(args.spec)
    if isinstance(read, HandleDiagram):
        return _run_handle_bounds(args, read)
    first = parse_diagram(args.spec)
    data: dict = {"first": args.spec}
    lines = [args.spec]
    if args.blowups is not None or args.homology_class is not None or args.summand is not None:
        return _run_blown_up(args, first, data, lines)
    if args.to is None:
        if first.component_count() != 1:
            raise InputError("the 4-ball genus bounds are for knots; give --to SPEC to ask about a cobordism")
        bounds = knot_genus_bounds(first)
        best = best_genus_bound(bounds)
        data["four_genus_bounds"] = [{"invariant": b.invariant, "value": b.value, "bound": b.bound, "source": b.source}
                                     for b in bounds]
        data["best"] = {"invariant": best.invariant, "bound": best.bound}
        lines += [f"  {b.invariant:<28} {b.value:>4}   g4 >= {b.bound}" for b in bounds]
        lines.append(f"  best lower bound: g4 >= {best.bound}, from {best.invariant}")
    else:
        if args.genus < 0:
            raise InputError("--genus is 0 or more")
        second = parse_diagram(args.to)
        if first.is_empty() and second.is_empty():
            raise InputError("both ends are empty: there is no cobordism to ask about")
        try:
            answer = cobordism_question(first, second, args.genus, args.components)
        except ValueError as err:
            raise InputError(f"--components: {err}") from None
        data.update({
            "to": args.to, "genus": args.genus, "s": answer.s, "mirror_s": answer.mirror_s,
            "cobordisms": [shape.as_json() for shape in answer.shapes],
            "allowed_connected": answer.allowed_connected if answer.shapes[0].components == 1 else None,
            "allowed_by_s_and_signatures": answer.allowed_some, "notes": answer.notes,
        })
        lines += cobordism_lines(args.to, answer)
    print(json.dumps(data) if args.json else "\n".join(lines))
    return EXIT_OK


def _run_handle_bounds(args: argparse.Namespace, link) -> int:
    """``movies bounds`` of a link in #ʳ S¹×S²: surfaces it bounds in ♮ʳ S¹×B³ and in ♮ʳ B²×S²."""
    from movies.bounds.handles import surface_questions
    from movies.report.questions import handle_surface_lines

    if args.to is not None or args.blowups is not None or args.components is not None:
        raise InputError("for a diagram with handles, movies bounds asks about surfaces it bounds in the boundary "
                         "sums of S^1 x B^3 and of B^2 x S^2: --to, --blowups and --components do not apply")
    if args.genus < 0:
        raise InputError("--genus is 0 or more")
    answers = surface_questions(link, args.genus)
    data = {"first": args.spec, "genus": args.genus,
            "values": {f: {w: [[k, s] for k, s in sorted(v.items())] for w, v in vs.items()}
                       for f, vs in answers[0].values.items()},
            "manifolds": [answer.as_json() for answer in answers]}
    print(json.dumps(data) if args.json else "\n".join([args.spec] + handle_surface_lines(answers)))
    return EXIT_OK


def _run_blown_up(args: argparse.Namespace, first, data: dict, lines: list[str]) -> int:
    from movies.bounds.questions import blown_up_question
    from movies.report.questions import blown_up_lines
    from movies.language.spec import parse_diagram

    if args.blowups is None:
        raise InputError("--class and --summand need --blowups K (the number of blow-ups)")
    if args.blowups < 1:
        raise InputError("--blowups is 1 or more")
    limits.check("blowups", args.blowups, f"--blowups {args.blowups} asks about {args.blowups} CP²-bar summands")
    if args.genus < 0:
        raise InputError("--genus is 0 or more")
    if args.components is not None:
        raise InputError("--components is for cobordisms in S³ × I; with --blowups the surface is connected")
    summand = _summand(args.summand or "CP2-bar")
    klass = (0,) * args.blowups
    if args.homology_class is not None:
        parts = args.homology_class.split(",")
        if not all(re.fullmatch(r"\s*[+-]?[0-9]+\s*", part) for part in parts):
            shown = args.homology_class if len(args.homology_class) <= 60 else args.homology_class[:60] + "…"
            raise InputError(f"--class is a comma-separated list of integers, not {shown!r}")
        if len(parts) != args.blowups:
            raise InputError(f"--class has {len(parts)} entries but --blowups is {args.blowups}: one entry per blow-up")
        klass = tuple(limits.number(part, "--class") for part in parts)
    target = args.to or "empty"
    second = parse_diagram(target)
    try:
        answer = blown_up_question(first, second, args.genus, klass, summand)
    except ValueError as err:
        raise InputError(str(err)) from None
    shape = answer.shapes[0]
    data.update({"to": target, "genus": args.genus, "blowups": args.blowups, "summand": summand,
                 "lives_in": answer.place.name, "reading": answer.place.reading,
                 "definite": answer.place.definite, "class": list(klass), "square": answer.place.square,
                 "s": answer.s, "mirror_s": answer.mirror_s, "cobordisms": [shape.as_json()],
                 "allowed_by_s": shape.allowed, "notes": answer.notes})
    lines += blown_up_lines(args.spec, target, answer)
    print(json.dumps(data) if args.json else "\n".join(lines))
    return EXIT_OK


def _run_batch(args: argparse.Namespace) -> int:
    """``movies batch run``: see :mod:`movies.batch`."""
    from movies.batch.engine import run_batch
    from movies.batch.items import crossing_range, file_items, movie_items, table_items
    from movies.batch.store import ResultStore
    from movies.batch.tasks import task_options

    if args.knots or args.links:
        items = table_items("knot" if args.knots else "link", *crossing_range(args.knots or args.links))
    elif args.diagrams:
        items = file_items(args.diagrams)
    else:
        items = movie_items(args.movies)
    if args.task == "invariants":
        if args.budget is not None:
            raise InputError("--budget is for the tasks check, find-ribbon and find-surface")
        fields = ["Q", "F2"] + [f for f in args.field if f.upper() not in ("Q", "F2")]
        options = task_options("invariants", fields=fields, classical=args.classical, reduced=args.reduced,
                               bar_natan=args.bar_natan)
    else:
        if args.field or args.classical or args.reduced or args.bar_natan:
            raise InputError("--field, --classical, --reduced and --bar-natan are for the task invariants")
        options = task_options(args.task, budget=None if args.budget is None else _seconds(args.budget))
    workers = _number(args.workers, "--workers")
    if args.scheduler and workers is not None:
        raise InputError("--workers sizes the local cluster; with --scheduler the workers are the scheduler's")
    command = "movies " + " ".join(sys.argv[1:]) if sys.argv[1:2] == ["batch"] else "the same command"
    with ResultStore(args.db) as store:
        outcome = run_batch(items, args.task, options, store, _seconds(args.time_limit), args.scheduler, workers,
                            log=None if sys.stderr.isatty() else (lambda line: print(line, file=sys.stderr,
                                                                                     flush=True)))
    counts = ", ".join(f"{n} {status}" for status, n in sorted(outcome.counts.items())) or "nothing new"
    print(f"{args.db}: {outcome.total} items; {outcome.skipped} already done; ran {outcome.ran}: {counts}")
    if outcome.interrupted:
        print(f"movies: interrupted; what finished is saved in {args.db}. Run {command} again to resume.",
              file=sys.stderr)
        return EXIT_INTERRUPTED
    return EXIT_OK


def _run_batch_summary(args: argparse.Namespace) -> int:
    from movies.batch.report import summary, summary_text
    from movies.batch.store import ResultStore

    _existing(args.db)
    with ResultStore(args.db) as store:
        entries = summary(store)
    print(json.dumps(entries) if args.json else summary_text(entries, args.db))
    return EXIT_OK


def _run_batch_export(args: argparse.Namespace) -> int:
    from movies.batch.report import export_csv, export_jsonl
    from movies.batch.store import ResultStore

    _existing(args.db)
    with ResultStore(args.db) as store:
        count = export_csv(store, args.csv) if args.csv else export_jsonl(store, args.jsonl)
    print(f"{count} rows written to {args.csv or args.jsonl}")
    return EXIT_OK


def _existing(path: str) -> None:
    if not os.path.isfile(path):
        raise InputError(f"there is no results file {path}")


class _progress:
    """A crossing counter on the terminal while a long computation runs (only on a terminal)."""

    def __init__(self, what: str) -> None:
        self.what = what
        self.shown = False

    def __enter__(self):
        return self if sys.stderr.isatty() else None

    def __call__(self, done: int, total: int) -> None:
        if total >= 12:
            print(f"\r  {self.what}: {done}/{total} crossings added", end="", file=sys.stderr, flush=True)
            self.shown = True

    def __exit__(self, *exc) -> None:
        if self.shown:
            print("\r" + " " * 50 + "\r", end="", file=sys.stderr, flush=True)


def main(argv: Sequence[str] | None = None) -> int:
    """Run the command line; returns the exit code."""
    parser = build_parser()
    args = parser.parse_args(argv)
    if getattr(args, "run", None) is None:
        parser.print_help()
        return EXIT_INPUT
    try:
        settings = dict(limits.setting(text) for text in args.limit)
        with limits.using(settings):
            return args.run(args)
    except InternalError as err:
        if os.environ.get("MOVIES_DEBUG"):
            raise
        print(f"movies: internal error: {err}; please report it (MOVIES_DEBUG=1 shows the traceback)",
              file=sys.stderr)
        return EXIT_INTERNAL
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
    except BrokenPipeError:  # the reader went away (e.g. `| head`): nothing is wrong with the input
        sys.stderr.close()
        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
        return EXIT_OK
    except Exception as err:  # a bug: say so in one line, the traceback only on request
        if os.environ.get("MOVIES_DEBUG"):
            raise
        print(f"movies: internal error ({type(err).__name__}: {err}); please report it "
              "(MOVIES_DEBUG=1 shows the traceback)", file=sys.stderr)
        return EXIT_INTERNAL
