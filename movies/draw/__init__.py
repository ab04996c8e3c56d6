"""Pictures of diagrams and reports of movies: SVG drawings and one self-contained HTML page.

>>> from movies.diagram.constructors import unknot
>>> diagram_svg(unknot()).count('class="strand"')
1
"""

from movies.draw.svg import Highlight, PALETTE, diagram_svg, svg_repr

__all__ = ["Highlight", "PALETTE", "diagram_svg", "svg_repr"]
