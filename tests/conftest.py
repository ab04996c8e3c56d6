"""Fixtures every test folder shares: the standard diagrams and the bundled examples.

The PD codes come from tests/support/diagrams.py, where each names its table column.
"""

from pathlib import Path

import pytest

from movies.diagram.pd import from_pd
from support.diagrams import FIGURE_EIGHT_PD, HOPF_PD, TREFOIL_PD

ROOT = Path(__file__).resolve().parents[1]


@pytest.fixture
def trefoil():
    """KnotInfo's 3_1, the positive trefoil, read from its PD code."""
    return from_pd(TREFOIL_PD)


@pytest.fixture
def hopf():
    """LinkInfo's L2a1{0}, the negative Hopf link."""
    return from_pd(HOPF_PD)


@pytest.fixture
def figure_eight():
    """KnotInfo's 4_1."""
    return from_pd(FIGURE_EIGHT_PD)


@pytest.fixture
def examples():
    """The folder of bundled example movies."""
    return ROOT / "examples" / "movies"
