"""Switching one crossing of a diagram, for tests that compare a diagram with its switch."""

from movies.diagram.assembly import assemble

from movies.diagram.model import Diagram


def switched(d: Diagram, crossing: int) -> Diagram:
    """The same diagram with one crossing switched (same faces and names).

    >>> from movies.language.spec import parse_diagram
    >>> switched(parse_diagram("3_1"), 1).writhe()
    1
    """
    crossings, signs = dict(d.crossings), dict(d.signs)
    a, b, c, e = crossings[crossing]
    crossings[crossing] = (e, a, b, c) if signs[crossing] > 0 else (b, c, e, a)
    signs[crossing] = -signs[crossing]
    return assemble(crossings, signs, d.loops, previous=d)
