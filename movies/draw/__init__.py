"""Pictures of diagrams: SVG drawings from the combinatorics alone.

:func:`diagram_svg` draws any diagram; :func:`svg_repr` is what a notebook shows for one. The
HTML report of a checked movie, which draws every frame, is in :mod:`movies.report.html`.

>>> from movies.diagram.constructors import unknot
>>> diagram_svg(unknot()).count('class="strand"')
1
"""

from movies.draw.svg import PALETTE, Highlight, component_style, diagram_svg, svg_repr

__all__ = ["Highlight", "PALETTE", "component_style", "diagram_svg", "svg_repr"]
