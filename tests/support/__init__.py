"""Helpers shared by the tests: readers of the KnotInfo and LinkInfo text columns."""
