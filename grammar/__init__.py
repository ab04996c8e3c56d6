"""The grammars of the notation, shipped as package data (``movies.grammar``)."""
