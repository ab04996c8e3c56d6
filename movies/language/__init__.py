"""The text notations: one-line diagrams (:mod:`movies.language.spec`)."""
