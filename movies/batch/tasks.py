"""The tasks a batch runs: the same functions the command line calls, one item at a time, each
under a time limit.

A task takes an item's text and the task's options and returns the JSON the command line would
print for it. :func:`run_item` runs one with a time limit and never raises: a timeout or an error
is a status with its reason, which the batch records and goes on.

>>> status, result, reason = run_item("invariants", "3_1", {"fields": ["Q"], "classical": True}, 30)
>>> status, result["signature"], reason
('ok', -2, '')
"""

from __future__ import annotations

import json
import os
import select
import signal
import time

from movies.errors import InputError, MoviesError

__all__ = ["TASKS", "task_options", "run_task", "run_item"]

#: every task a batch can run, with the options it takes and their defaults
TASKS = {
    "invariants": {"fields": ["Q", "F2"], "classical": False, "reduced": False, "bar_natan": False, "twists": 3},
    "check": {"budget": 5.0},
    "find-ribbon": {"budget": 60.0},
    "find-surface": {"budget": 60.0},
}


def task_options(task: str, **given) -> dict:
    """The task's options: its defaults, with ``given`` (None meaning the default) put in.

    >>> task_options("check", budget=None)
    {'budget': 5.0}
    """
    if task not in TASKS:
        raise InputError(f"a batch task is one of {', '.join(TASKS)}, not {task!r}")
    options = dict(TASKS[task])
    for name, value in given.items():
        if name not in options:
            raise InputError(f"the task {task} takes no option {name}")
        if value is not None:
            options[name] = value
    return options


def run_task(task: str, text: str, options: dict) -> dict:
    """The command line's JSON for one item: ``movies invariants``, ``movies check`` or ``movies find``."""
    if task == "invariants":
        from movies.diagram.handles import HandleDiagram
        from movies.homology.summary import handle_link_facts, invariants_facts
        from movies.language.spec import read_spec

        fields = options["fields"]
        read = read_spec(text)
        if isinstance(read, HandleDiagram):
            return handle_link_facts(read, fields, options["classical"], options["reduced"], options["bar_natan"],
                                     options["twists"])
        diagram = read if not isinstance(read, tuple) else read[0]
        if options["classical"] or diagram.is_empty():
            from movies.invariants.summary import classical_invariants

            return classical_invariants(diagram)
        return invariants_facts(diagram, fields, False, options["reduced"], options["bar_natan"])
    if task == "check":
        from movies.checker.replay import check_movie
        from movies.language.movie import parse_movie
        from movies.report.movie import as_json

        return as_json(check_movie(parse_movie(text), options["budget"]))
    if task in ("find-ribbon", "find-surface"):
        from movies.checker.find import find_for

        data, _ = find_for(text, task.split("-")[1], options["budget"])
        return data
    raise InputError(f"a batch task is one of {', '.join(TASKS)}, not {task!r}")


def run_item(task: str, text: str, options: dict, seconds: float) -> tuple[str, dict | None, str]:
    """Run one item under a time limit: (status, result, reason), status ``ok``, ``timeout`` or
    ``error``; never raises.

    The task runs in a forked copy of this process, which is killed when the time is up, so a
    computation that does not stop by itself cannot hold up the batch. Where there is no fork
    (Windows), the task runs here, without the limit.
    """
    if not hasattr(os, "fork"):  # pragma: no cover - no fork: no limit
        return _guarded(task, text, options)
    _prepare(task)
    read_end, write_end = os.pipe()
    pid = os.fork()
    if pid == 0:  # the child: compute, send, and leave without running anything of the parent's
        os.close(read_end)
        _die_with_parent()
        try:
            payload = json.dumps(_guarded(task, text, options)).encode()
            view = memoryview(payload)
            while view:
                view = view[os.write(write_end, view):]
        finally:
            os._exit(0)
    os.close(write_end)
    chunks, deadline = [], time.monotonic() + seconds
    try:
        while True:
            left = deadline - time.monotonic()
            if left <= 0:
                os.kill(pid, signal.SIGKILL)
                return "timeout", None, f"stopped after the time limit of {seconds:g} s"
            ready, _, _ = select.select([read_end], [], [], left)
            if ready:
                chunk = os.read(read_end, 1 << 16)
                if not chunk:
                    break
                chunks.append(chunk)
    finally:
        os.close(read_end)
        os.waitpid(pid, 0)
    if not chunks:
        return "error", None, "the computation ended without a result (it ran out of memory or was killed)"
    status, result, reason = json.loads(b"".join(chunks))
    return status, result, reason


def _die_with_parent() -> None:
    """Ask Linux to stop this process when the one that forked it ends (a worker killed or shut
    down does not leave its item computing); elsewhere nothing happens."""
    try:
        import ctypes

        ctypes.CDLL(None, use_errno=True).prctl(1, signal.SIGKILL)  # PR_SET_PDEATHSIG
    except (OSError, AttributeError):  # pragma: no cover - not Linux
        pass


#: the tasks whose modules and grammars this process has loaded (each forked child starts from them)
_PREPARED: set[str] = set()


def _prepare(task: str) -> None:
    """Load what ``task`` uses once in this process, so that a forked child does not load it anew
    for every item (the readers build their parsers on first use)."""
    if task in _PREPARED:
        return
    warm = {"invariants": ("invariants", "3_1", dict(TASKS["invariants"], fields=["Q"])),
            "check": ("check", "start unknot\ndeath 1", TASKS["check"]),
            "find-ribbon": ("invariants", "3_1", dict(TASKS["invariants"], fields=["Q"])),
            "find-surface": ("invariants", "3_1", dict(TASKS["invariants"], fields=["Q"]))}[task]
    _guarded(*warm)
    if task.startswith("find"):
        import movies.checker.find  # noqa: F401
        import movies.checker.genus  # noqa: F401
    _PREPARED.add(task)


def _guarded(task: str, text: str, options: dict) -> tuple[str, dict | None, str]:
    """The task's result, or the error it raised, as (status, result, reason)."""
    try:
        return "ok", run_task(task, text, options), ""
    except MoviesError as err:
        return "error", None, f"{type(err).__name__}: {str(err).strip()}"
    except RecursionError:
        return "error", None, "internal error: too deep a recursion (please report it)"
    except Exception as err:  # a bug: recorded as such, and the batch goes on
        return "error", None, f"internal error ({type(err).__name__}: {err}); please report it"
