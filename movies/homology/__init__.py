"""Khovanov, Bar-Natan and reduced homology and Rasmussen's s, by Bar-Natan's local algorithm.

Modules: :mod:`~movies.homology.rings` (ground rings), :mod:`~movies.homology.cobordisms`
(dotted cobordisms between crossingless tangles in the disk basis),
:mod:`~movies.homology.scanning` (adding crossings, delooping, Gaussian elimination),
:mod:`~movies.homology.graded` (homology of the final complex over fields, Z and F[H]),
:mod:`~movies.homology.khovanov` (the functions below).

>>> from movies.diagram.pd import from_pd
>>> rasmussen_s(from_pd([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]))
2
"""

from movies.homology.errors import FieldError, HomologyError, NotAKnotError
from movies.homology.khovanov import (
    bar_natan_complex,
    bar_natan_homology,
    khovanov_homology,
    poincare_polynomial,
    rasmussen_s,
)

__all__ = [
    "khovanov_homology",
    "bar_natan_homology",
    "bar_natan_complex",
    "rasmussen_s",
    "poincare_polynomial",
    "HomologyError",
    "FieldError",
    "NotAKnotError",
]
