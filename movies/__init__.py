"""Check cobordisms and slice surfaces written as movies of link diagrams.

The names here are the short way in; each lives in the module that owns it, and is loaded the
first time it is used, so that ``import movies`` (and the command line) starts at once.

>>> import movies
>>> k = movies.parse_diagram("3_1 # mirror(3_1)")
>>> k.crossing_count(), movies.signature(k), str(movies.jones_polynomial(movies.from_braid([1, 1, 1])))
(6, 0, 't + t^3 - t^4')
"""

from __future__ import annotations

import importlib

from movies.diagram.model import Diagram, Side
from movies.errors import MoviesError

#: the short names, and the module each lives in
_HOMES = {
    "from_braid": "movies.diagram.constructors", "from_table": "movies.diagram.constructors",
    "torus_link": "movies.diagram.constructors", "unknot": "movies.diagram.constructors",
    "unlink": "movies.diagram.constructors", "disjoint_union": "movies.diagram.constructors",
    "connected_sum": "movies.diagram.constructors", "mirror": "movies.diagram.constructors",
    "reverse": "movies.diagram.constructors",
    "canonical_form": "movies.diagram.isotopy", "same_on_sphere": "movies.diagram.isotopy",
    "same_up_to_reflection": "movies.diagram.isotopy",
    "from_pd": "movies.diagram.pd",
    "alexander_polynomial": "movies.invariants.alexander", "determinant": "movies.invariants.alexander",
    "jones_polynomial": "movies.invariants.jones",
    "seifert_matrix": "movies.invariants.seifert",
    "levine_tristram": "movies.invariants.signature", "signature": "movies.invariants.signature",
    "classical_invariants": "movies.invariants.summary",
    "parse_diagram": "movies.language.spec",
    "parse_movie": "movies.language.movie",
    "check_movie": "movies.checker.replay",
    "CheckResult": "movies.checker.result",
}

__all__ = ["Diagram", "Side", "MoviesError", "limits", *_HOMES]
__version__ = "0.1.0"


def _diagram_svg(diagram: Diagram) -> str:
    from movies.draw import svg_repr

    return svg_repr(diagram)


def _report_html(result) -> str:
    from movies.report import html_repr

    return html_repr(result)


# notebooks show diagrams as drawings and checked movies as their report
Diagram._repr_svg_ = _diagram_svg


def __getattr__(name: str):
    if name == "limits":
        return importlib.import_module("movies.limits")
    if name not in _HOMES:
        raise AttributeError(f"module 'movies' has no attribute {name!r}")
    value = getattr(importlib.import_module(_HOMES[name]), name)
    if name in ("check_movie", "CheckResult", "parse_movie"):
        importlib.import_module("movies.checker.result").CheckResult._repr_html_ = _report_html
    globals()[name] = value
    return value


def __dir__() -> list[str]:
    return sorted(set(globals()) | set(__all__))
