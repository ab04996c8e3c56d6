"""Table-scale runs: one task over many diagrams or movies, on Dask, into an SQLite database.

A batch reads its items (:mod:`movies.batch.items`: a range of the knot or link tables, a file of
diagrams, a folder of movies), runs one task on each (:mod:`movies.batch.tasks`: the same
functions the command line calls, each item under a time limit), on a Dask cluster
(:mod:`movies.batch.engine`: local worker processes by default, or a running scheduler), and
keeps every result in a database file (:mod:`movies.batch.store`), written by the client in
transactions, so that an interrupted run resumes where it stopped. :mod:`movies.batch.report`
summarises and exports it.
"""
