"""A checked movie as one self-contained HTML page: the report, with every frame drawn.

The page follows the terminal report of ``movies check`` line by line (title, the table of
steps, the moves found, the surface, checkpoints, the verdict and its reasons), and between the
table and the moves found it shows the movie itself: every frame, labelled, with the place of
the next move marked in it, and beside it the step that comes next. Everything is inline:
one ``<style>`` block, the drawings as ``<svg>`` elements, no scripts, fonts or links.

>>> from movies.language.movie import parse_movie
>>> from movies.checker.replay import check_movie
>>> page = movie_html(check_movie(parse_movie("start unknot\\ndeath 1\\nsurface disk")))
>>> page.count("<svg"), "VERDICT" in page, "http" in page.replace("http://www.w3.org/2000/svg", "")
(2, True, False)
"""

from __future__ import annotations

from html import escape

from movies.checker.result import CheckResult
from movies.draw.frames import NEW_DIAGRAM, frame_layouts
from movies.draw.svg import diagram_svg
from movies.report.movie import as_json, finding_lines, step_note, surface_lines
from movies.draw.svg import Highlight
from movies.wording import plural

#: the page's colours (our own): ink, muted ink, rules, card, accents for the verdicts
STYLE = """
.mv-report { font-family: system-ui, sans-serif; color: #1d2430; background: #fbfaf7; margin: 0 auto;
  max-width: 1100px; padding: 18px 22px; line-height: 1.4; }
.mv-report h1 { font-size: 1.35em; margin: 0 0 2px 0; }
.mv-report h2 { font-size: 1.05em; margin: 22px 0 8px 0; border-bottom: 1px solid #d9d4c7; padding-bottom: 3px; }
.mv-report .mv-source { color: #6b6f78; font-family: ui-monospace, monospace; font-size: 0.9em; }
.mv-report table.mv-steps { border-collapse: collapse; font-size: 0.92em; }
.mv-report table.mv-steps th, .mv-report table.mv-steps td { padding: 2px 10px; text-align: left;
  border-bottom: 1px solid #ebe6da; vertical-align: top; }
.mv-report table.mv-steps td.mv-num { text-align: right; font-variant-numeric: tabular-nums; }
.mv-report code, .mv-report pre { font-family: ui-monospace, monospace; font-size: 0.92em; }
.mv-report .mv-unproved { color: #a4540b; font-weight: 600; }
.mv-report .mv-row { display: flex; gap: 18px; align-items: flex-start; margin: 10px 0; }
.mv-report .mv-strip-label { font-size: 0.88em; color: #3c4350; cursor: pointer; }
.mv-report .mv-strip-toggle:checked ~ .mv-frames { display: flex; gap: 6px; overflow-x: auto; align-items: flex-start; }
.mv-report .mv-strip-toggle:checked ~ .mv-frames .mv-next,
.mv-report .mv-strip-toggle:checked ~ .mv-frames .mv-legend { display: none; }
.mv-report .mv-strip-toggle:checked ~ .mv-frames .mv-row { flex: 0 0 auto; }
.mv-report .mv-strip-toggle:checked ~ .mv-frames svg.diagram { width: 160px; height: auto; }
.mv-report .mv-strip-toggle:checked ~ .mv-frames figure.mv-frame { width: 170px; }
.mv-report .mv-strip-toggle:checked ~ .mv-frames figure.mv-frame figcaption { font-size: 0.72em; }
.mv-report figure.mv-frame { margin: 0; background: #ffffff; border: 1px solid #d9d4c7; border-radius: 6px;
  padding: 6px; }
.mv-report figure.mv-frame figcaption { font-size: 0.88em; color: #3c4350; margin: 0 0 4px 4px; }
.mv-report .mv-next { flex: 1; border-left: 4px solid #e0a21b; background: #fff8e6; padding: 8px 12px;
  border-radius: 0 6px 6px 0; font-size: 0.93em; margin-top: 26px; }
.mv-report .mv-next.mv-stop { border-left-color: #b3261e; background: #fdeceb; }
.mv-report .mv-next .mv-move { font-family: ui-monospace, monospace; font-weight: 600; }
.mv-report .mv-lines { white-space: pre-wrap; font-family: ui-monospace, monospace; font-size: 0.9em;
  background: #ffffff; border: 1px solid #e3ded2; border-radius: 6px; padding: 8px 12px; margin: 0; }
.mv-report .mv-verdict { font-weight: 700; padding: 8px 12px; border-radius: 6px; margin-top: 14px; }
.mv-report .mv-verdict-verified { background: #e3f3e6; color: #1b5e2a; }
.mv-report .mv-verdict-conditional { background: #fff1d6; color: #7a4a00; }
.mv-report .mv-verdict-contradicted, .mv-report .mv-verdict-invalid { background: #fbe3e1; color: #8c1d18; }
.mv-report .mv-legend { font-size: 0.85em; color: #5b606a; }
"""


def _step_table(data: dict) -> list[str]:
    out = ['<table class="mv-steps">',
           "<tr><th>step</th><th>line</th><th>move</th><th>crossings</th><th>components</th><th></th></tr>",
           f'<tr><td class="mv-num">0</td><td></td><td>start</td><td class="mv-num">{data["start"]["crossings"]}</td>'
           f'<td class="mv-num">{data["start"]["components"]}</td><td></td></tr>']
    for step in data["steps"]:
        note = escape(step_note(step))
        if note != escape(step["note"]):
            note = f'<span class="mv-unproved">UNPROVED:</span> {escape(step["note"])}'
        out.append(f'<tr><td class="mv-num">{step["step"]}</td><td class="mv-num">{step["line"]}</td>'
                   f'<td><code>{escape(step["move"])}</code></td><td class="mv-num">{step["crossings"]}</td>'
                   f'<td class="mv-num">{step["components"]}</td><td>{note}</td></tr>')
    out.append("</table>")
    return out


def _twist_box(frame, record):
    """A twist step's gate, as the drawing takes a handle's gate, and its turns; None if it does not apply."""
    from movies.diagram.handles import Gate
    from movies.diagram.moves.twist import gate_path
    from movies.errors import MoveError

    try:
        faces, _ = gate_path(frame, record.edges, record.start_face)
    except MoveError:
        return None
    left, _ = frame.faces_beside(record.edges[0])
    return Gate(tuple(record.edges), "L" if faces[0] == left else "R"), record.turns


def frame_steps(result: CheckResult) -> list:
    """For each step of a checked movie, what the pictures of its frames need to know (see
    :func:`movies.draw.frames.frame_layouts`): the band it adds, as (first edge, second edge,
    faces, path), unless it has half twists (its sides cross); ``NEW_DIAGRAM`` for an isotopy
    claim, whose frame after is the diagram it names; else None.

    >>> from pathlib import Path
    >>> from movies.checker.replay import check_movie
    >>> examples = Path(__file__).resolve().parents[2] / "examples" / "movies"
    >>> frame_steps(check_movie(examples / "6_1-ribbon-along-a-path.movie"))[:2]
    [(1, 4, (1, 6), ((11, True),)), None]
    """
    steps: list = []
    for statement, places in zip(result.movie.steps, result.places):
        record = statement.record
        step = NEW_DIAGRAM if statement.kind == "isotopic" else None
        if record is not None and record.kind == "band" and places is not None and places.faces and not record.twists:
            path = tuple(record.path or ())
            step = (record.first, record.second, tuple(places.faces) if path else (places.faces[0],), path)
        steps.append(step)
    return steps


def _frames(result: CheckResult, data: dict, size: int) -> list[str]:
    out = ['<input type="checkbox" id="mv-strip" class="mv-strip-toggle">'
           '<label for="mv-strip" class="mv-strip-label">show the frames side by side, small</label>',
           '<div class="mv-frames">',
           '<p class="mv-legend">Edge names sit beside their edges in the colour of their component, '
           "crossing names in small circles, face names in grey italics. In each frame the place of the "
           "next move is marked: faces shaded, edges traced, crossings ringed.</p>"]
    statements = result.movie.steps
    records = {s["step"]: s for s in data["steps"]}
    stops = {f["step"]: f for f in data["findings"] if f["kind"] == "invalid"}
    lays = frame_layouts(result.frames, frame_steps(result))
    for index, frame in enumerate(result.frames):
        number = index + 1  # the step that acts on this frame
        statement = statements[index] if index < len(statements) else None
        places = result.places[index] if index < len(result.places) else None
        band = None
        record = statement.record if statement is not None else None
        path = ()
        if record is not None and record.kind == "band" and places is not None and places.faces:
            band = (record.first, record.second, places.faces[0])
            path = tuple(record.path or ())
        twist = None
        if record is not None and record.kind == "twist" and places is not None:
            twist = _twist_box(frame, record)
        birth = places.faces[0] if record is not None and record.kind == "birth" and places and places.faces else None
        highlight = (Highlight(places.edges, () if twist else places.faces, places.crossings, band, twist, path, birth)
                     if places is not None else None)
        what = "the start" if index == 0 else f"after step {index}"
        caption = (f"frame {index} ({what}): {plural(frame.crossing_count(), 'crossing')}, "
                   f"{plural(frame.component_count(), 'component')}")
        handles = result.handle_frames[index] if index < len(result.handle_frames) else None
        svg = diagram_svg(frame, labels=True, highlight=highlight, size=size, title=f"frame {index}",
                          gates=handles.gates if handles is not None else (), lay=lays[index])
        out.append(f'<div class="mv-row" id="frame-{index}"><figure class="mv-frame"><figcaption>{escape(caption)}'
                   f"</figcaption>{svg}</figure>")
        if statement is not None and number in records:
            step = records[number]
            note = step_note(step)
            found = ""
            if step["found_moves"]:
                found = "<br>moves found: " + ", ".join(f"<code>{escape(m)}</code>" for m in step["found_moves"])
            out.append(f'<div class="mv-next"><div>step {number}, line {step["line"]}: '
                       f'<span class="mv-move">{escape(step["move"])}</span></div>'
                       f"<div>{escape(note)}{found}</div><div>then {plural(step['crossings'], 'crossing')}, "
                       f"{plural(step['components'], 'component')}</div></div>")
        elif statement is not None and number in stops:
            stop = stops[number]
            out.append(f'<div class="mv-next mv-stop"><div>step {number}, line {stop["line"]}: '
                       f'<span class="mv-move">{escape(statement.source.split("%")[0].strip())}</span></div>'
                       f"<div>{escape(stop['message'])}</div><div>{escape(stop['evidence'])}</div></div>")
        elif index == len(result.frames) - 1:
            out.append('<div class="mv-next"><div>the last frame</div></div>')
        out.append("</div>")
    out.append("</div>")
    return out


def report_body(result: CheckResult, source: str = "", size: int = 340) -> str:
    """The report as one ``<div class="mv-report">`` with its style inside (for embedding).

    Parameters: the checked movie; the file name to show; the width of each drawing.
    Returns the HTML fragment.

    >>> from movies.checker.replay import check_movie
    >>> report_body(check_movie("start unknot\\ndeath 1")).startswith('<div class="mv-report">')
    True
    """
    data = as_json(result)
    title = data["title"] or "(untitled)"
    out = [f"<div class=\"mv-report\"><style>{STYLE}</style>",
           f'<h1>movie &nbsp;{escape(title)}</h1>']
    if source:
        out.append(f'<div class="mv-source">[{escape(source)}]</div>')
    out.append("<h2>steps</h2>")
    out.extend(_step_table(data))
    out.append("<h2>the movie, frame by frame</h2>")
    out.extend(_frames(result, data, size))
    found = [s for s in data["steps"] if s["found_moves"]]
    if found:
        out.append("<h2>moves found</h2>")
        for step in found:
            out.append(f"<p>moves found for step {step['step']} (replay them with the ordinary moves):</p>")
            out.append('<pre class="mv-lines">' + escape("\n".join(step["found_moves"])) + "</pre>")
    out.append("<h2>surface</h2>")
    out.append('<pre class="mv-lines">' + escape("\n".join(surface_lines(data))) + "</pre>")
    out.append(f'<div class="mv-verdict mv-verdict-{data["verdict"]}">VERDICT &nbsp;{escape(data["verdict"])}: '
               f"{escape(data['verdict_meaning'])}</div>")
    reasons = finding_lines(data)
    if reasons:
        out.append('<pre class="mv-lines">' + escape("\n".join(reasons)) + "</pre>")
    out.append("</div>")
    return "\n".join(out)


def movie_html(result: CheckResult, source: str = "", size: int = 340) -> str:
    """The whole report as one self-contained HTML document.

    Parameters
    ----------
    result : CheckResult
        From :func:`movies.checker.replay.check_movie`.
    source : str
        The file name to show under the title (as the terminal report shows it).
    size : int
        Width of each drawing in pixels.

    Returns
    -------
    str
        An HTML5 document with every frame drawn; nothing in it is fetched from elsewhere.
    """
    title = escape(result.movie.title or "movie report")
    return ("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">"
            f"<title>{title}</title></head>\n<body style=\"margin:0;background:#fbfaf7\">\n"
            f"{report_body(result, source, size)}\n</body></html>\n")


def html_repr(result: CheckResult) -> str:
    """What a notebook shows for a checked movie, for ``CheckResult._repr_html_``.

    >>> from movies.language.movie import parse_movie
    >>> from movies.checker.replay import check_movie
    >>> html_repr(check_movie(parse_movie("start unknot\\ndeath 1"))).startswith('<div class="mv-report">')
    True
    """
    return report_body(result)
