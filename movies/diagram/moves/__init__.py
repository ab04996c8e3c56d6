"""Reidemeister and Morse moves as checked operations on diagrams.

Every move takes a :class:`~movies.diagram.model.Diagram` and the names of what it acts on,
and returns the new diagram, or raises :class:`~movies.errors.MoveError` saying exactly why
the move does not apply there. Names follow one rule: everything the move does not touch
keeps its name; where an edge is cut, its first part (along the orientation) keeps the name;
new things get the smallest names above every name of their kind in the frame before the
move, in the order each move lists, unless the caller passes ``names``.

==========  =====================================================================
move        what it needs
==========  =====================================================================
R1 add      an edge, the side ("L"/"R") the kink goes to, the crossing sign
R1 remove   a crossing with a monogon face (a kink)
R2 add      an edge pushed over another edge across a face they share
R2 remove   a bigon face whose one edge is over at both of its crossings
R3          a triangle face with one edge over at both of its crossings
saddle      two edges on a common face (the band runs across that face)
birth       a face; a new crossingless circle appears there
death       a crossingless circle component
twist       the edges a path (the gate) crosses in order; full twists on those strands
==========  =====================================================================

>>> from movies.diagram.constructors import unknot
>>> d = r1_add(unknot(), 1, "L", +1)
>>> d.crossing_count(), d.writhe()
(1, 1)
>>> r1_remove(d, 1).crossing_count()
0
"""


from movies.diagram.moves.base import NewNames
from movies.diagram.moves.morse import SaddleResult, birth, common_faces, death, saddle
from movies.diagram.moves.paths import PathBand, path_band
from movies.diagram.moves.reidemeister import kinks_at, r1_add, r1_remove, r2_add, r2_remove, r3
from movies.diagram.moves.twist import TwistResult, twist

__all__ = [
    "PathBand", "path_band",
    "NewNames", "r1_add", "r1_remove", "kinks_at", "r2_add", "r2_remove", "r3",
    "SaddleResult", "common_faces", "saddle", "birth", "death", "TwistResult", "twist",
]
