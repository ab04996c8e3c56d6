"""Check cobordisms and slice surfaces written as movies of link diagrams.

The names here are the short way in; each lives in the module that owns it.

>>> import movies
>>> k = movies.parse_diagram("3_1 # mirror(3_1)")
>>> k.crossing_count(), movies.signature(k), str(movies.jones_polynomial(movies.from_braid([1, 1, 1])))
(6, 0, 't + t^3 - t^4')
"""

from movies.diagram.constructors import (
    connected_sum,
    disjoint_union,
    from_braid,
    from_table,
    mirror,
    reverse,
    torus_link,
    unknot,
    unlink,
)
from movies.diagram.isotopy import canonical_form, same_on_sphere, same_up_to_reflection
from movies.diagram.model import Diagram, Side
from movies.diagram.pd import from_pd
from movies import limits
from movies.errors import MoviesError
from movies.invariants.alexander import alexander_polynomial, determinant
from movies.invariants.jones import jones_polynomial
from movies.invariants.seifert import seifert_matrix
from movies.invariants.signature import levine_tristram, signature
from movies.invariants.summary import classical_invariants
from movies.language.spec import parse_diagram
from movies.checker.replay import check_movie
from movies.checker.result import CheckResult
from movies.draw import svg_repr
from movies.report import html_repr
from movies.language.movie import parse_movie

# notebooks show diagrams as drawings and checked movies as their report
Diagram._repr_svg_ = svg_repr
CheckResult._repr_html_ = html_repr

__all__ = [
    "Diagram", "Side", "MoviesError", "limits",
    "from_pd", "from_braid", "from_table", "torus_link", "unknot", "unlink",
    "disjoint_union", "connected_sum", "mirror", "reverse", "parse_diagram",
    "canonical_form", "same_on_sphere", "same_up_to_reflection",
    "jones_polynomial", "seifert_matrix", "signature", "levine_tristram",
    "alexander_polynomial", "determinant", "classical_invariants",
    "parse_movie", "check_movie", "CheckResult",
]
__version__ = "0.1.0"
