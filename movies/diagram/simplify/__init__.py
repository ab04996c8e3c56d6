"""Finding Reidemeister moves by search: simplifying diagrams and certifying isotopies.

- :mod:`.records`: :class:`MoveRecord`, a move and its exact arguments; :func:`apply`,
  :func:`replay`; the moves that apply to a diagram; the move that undoes a move.
- :mod:`.search`: simplifying toward a crossing count, within a :class:`Budget`.
- :mod:`.certify`: :func:`certify_isotopy`, one explicit move sequence between two diagrams, and
  :func:`simplify` toward any target (a crossing count or a diagram). Each module imports only
  the ones listed above it.
- :mod:`.scramble`: random legal moves from a seed, to make test diagrams.

>>> from movies.diagram.constructors import from_braid
>>> simplify(from_braid([1, -1]), "crossingless").reached
True
"""

from movies.diagram.simplify.certify import IsotopyCertificate, certify_isotopy, rename, simplify
from movies.diagram.simplify.records import KINDS, MoveRecord, apply, candidates, inverse, replay, translate
from movies.diagram.simplify.scramble import scramble
from movies.diagram.simplify.search import Budget, SimplifyResult

__all__ = [
    "KINDS", "MoveRecord", "apply", "replay", "candidates", "inverse", "translate",
    "Budget", "SimplifyResult", "simplify",
    "IsotopyCertificate", "certify_isotopy", "rename",
    "scramble",
]
