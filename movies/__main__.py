"""``python -m movies`` is the ``movies`` command."""

from movies.cli.main import main

raise SystemExit(main())
