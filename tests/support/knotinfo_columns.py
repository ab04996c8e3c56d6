"""The readers of KnotInfo and LinkInfo column text, for the tests (they live in the package:
:mod:`movies.diagram.table_columns`, where the batch summary compares results with the tables)."""

from movies.diagram.table_columns import *  # noqa: F401,F403
from movies.diagram.table_columns import __all__  # noqa: F401
