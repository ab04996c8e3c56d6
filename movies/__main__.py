"""``python -m movies`` is the ``movies`` command."""

from movies.cli.main import main

if __name__ == "__main__":  # a batch's worker processes import this module again, and must not run it
    raise SystemExit(main())
