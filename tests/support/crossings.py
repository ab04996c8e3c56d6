"""Switching one crossing of a diagram, for tests that compare a diagram with its switch."""

from movies.checker.changes import switched

__all__ = ["switched"]
