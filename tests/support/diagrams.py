"""Diagrams the tests share, each with where it comes from.

>>> len(TREFOIL_PD), len(HOPF_PD)
(3, 2)
"""

# KnotInfo column pd_notation of 3_1: the positive (right-handed) trefoil
TREFOIL_PD = [[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]
# LinkInfo column pd_notation_vector of L2a1{0}: the negative Hopf link (both crossings negative)
HOPF_PD = [[4, 1, 3, 2], [2, 3, 1, 4]]
# KnotInfo column pd_notation of 4_1: the figure-eight knot
FIGURE_EIGHT_PD = [[4, 2, 5, 1], [8, 6, 1, 5], [6, 3, 7, 4], [2, 7, 3, 8]]
