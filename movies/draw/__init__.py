"""Pictures of diagrams and reports of movies: SVG drawings and one self-contained HTML page.

:func:`diagram_svg` draws any diagram from its combinatorics alone; :func:`movie_html` turns a
checked movie into one HTML file; :func:`svg_repr` and :func:`html_repr` are what a notebook
shows for a diagram and for a checked movie.

>>> from movies.diagram.constructors import unknot
>>> diagram_svg(unknot()).count('class="strand"')
1
"""

from movies.draw.html import html_repr, movie_html
from movies.draw.places import place_of
from movies.draw.svg import PALETTE, Highlight, diagram_svg, svg_repr

__all__ = ["Highlight", "PALETTE", "diagram_svg", "svg_repr", "movie_html", "html_repr", "place_of"]
