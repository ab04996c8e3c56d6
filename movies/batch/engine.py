"""Running a batch on Dask: a local cluster of worker processes by default, or a running
scheduler, with progress, results written by the client, and a clean stop on Ctrl-C.

The client submits the items in small chunks, one Dask task each (:func:`chunk_size`; each item
runs through :func:`movies.batch.tasks.run_item`, which keeps its time limit itself), gathers
results as they come and writes them to the database in transactions. A worker that dies takes
its running chunk with it; the scheduler runs it again on the others, and each item is written
once, when its result arrives.
"""

from __future__ import annotations

import os
import signal
import sys
import time
from dataclasses import dataclass, field
from importlib.metadata import PackageNotFoundError, version as package_version

from movies.batch.items import Item
from movies.batch.store import ResultStore, Row, canonical_options
from movies.batch.tasks import run_item
from movies.errors import InputError

__all__ = ["BatchOutcome", "program_version", "run_batch"]

#: results are written in a transaction at least this often (seconds) and every this many rows
COMMIT_SECONDS = 2.0
COMMIT_ROWS = 500


def program_version() -> str:
    """This program's version, as the database records it."""
    try:
        return package_version("movies")
    except PackageNotFoundError:  # pragma: no cover - run from a checkout without an install
        return "unknown"


@dataclass
class BatchOutcome:
    """What a run did: items in the source, skipped (already done), run now, and by status."""

    total: int
    skipped: int
    counts: dict = field(default_factory=dict)
    interrupted: bool = False

    @property
    def ran(self) -> int:
        return sum(self.counts.values())


def run_batch(items: list[Item], task: str, options: dict, store: ResultStore, seconds: float,
              scheduler: str | None = None, workers: int | None = None, log=None) -> BatchOutcome:
    """Run ``task`` on every item not yet in ``store`` (same version and options), each under a
    time limit of ``seconds``, on a local Dask cluster of ``workers`` processes (default: one per
    core) or on the scheduler at ``scheduler``. ``log`` receives progress lines (a terminal gets a
    progress bar instead). Ctrl-C stops the run cleanly: everything finished is written, and the
    outcome says so.
    """
    if seconds <= 0:
        raise InputError(f"the time limit per item is a positive number of seconds, not {seconds}")
    version, canonical = program_version(), canonical_options(options)
    done = store.done(task, version, canonical)
    pending = [item for item in items if item.key not in done]
    outcome = BatchOutcome(total=len(items), skipped=len(items) - len(pending))
    if not pending:
        return outcome
    client, cluster = _connect(scheduler, workers)
    waiting: list[Row] = []
    last_commit = time.monotonic()
    bar = _Progress(len(pending), log)
    futures = []
    try:
        size = chunk_size(len(pending), len(client.scheduler_info().get("workers", {})) or 1) \
            if task in QUICK_TASKS else 1
        chunks = [pending[i:i + size] for i in range(0, len(pending), size)]
        futures = client.map(_run_chunk, chunks, task=task, options=options, seconds=seconds, version=version,
                             canonical=canonical, pure=False)
        from distributed import as_completed

        arriving = as_completed(futures)
        while not arriving.is_empty():
            finished = arriving.next_batch(block=False)
            if not finished:  # the main thread sleeps in short naps, so that Ctrl-C is seen while long items run
                time.sleep(0.05)
                continue
            for future in finished:
                rows = future.result()
                waiting.extend(rows)
                for row in rows:
                    outcome.counts[row.status] = outcome.counts.get(row.status, 0) + 1
                bar.advance(len(rows))
            if len(waiting) >= COMMIT_ROWS or time.monotonic() - last_commit >= COMMIT_SECONDS:
                store.write(waiting)
                waiting, last_commit = [], time.monotonic()
    except KeyboardInterrupt:
        outcome.interrupted = True
    finally:
        store.write(waiting)
        bar.close()
        _shut(client, cluster, futures, quickly=outcome.interrupted)
    return outcome


def _shut(client, cluster, futures, quickly: bool) -> None:
    """Cancel what is left and close the client and the local cluster; after Ctrl-C without waiting
    long for workers busy with an item (the local workers are daemonic processes, stopped when this
    one ends, and each item's forked child dies with its worker)."""
    try:
        client.cancel(futures)
        client.close(timeout=5 if quickly else None)
        if cluster is not None:
            cluster.close(timeout=5 if quickly else None)
    except (TimeoutError, OSError, RuntimeError):  # pragma: no cover - a worker that would not stop in time
        pass


def chunk_size(items: int, workers: int) -> int:
    """How many items one Dask task runs: enough that the scheduler's and the client's work per
    task is small beside the items' own, few enough that every worker gets fifty or so tasks (the
    last ones end close together, and a worker that dies loses little).

    >>> chunk_size(12965, 2), chunk_size(40, 2), chunk_size(3, 8)
    (25, 1, 1)
    """
    return max(1, min(CHUNK_MOST, items // (workers * 50)))


#: at most this many items in one Dask task
CHUNK_MOST = 25
#: the tasks whose items take milliseconds, run in chunks; the searches and checks run one item a task
QUICK_TASKS = ("invariants",)


def _run_chunk(items: list[Item], task: str, options: dict, seconds: float, version: str,
               canonical: str) -> list[Row]:
    """On a worker: run items one after another, each under its time limit, and make their rows."""
    import json

    rows = []
    for item in items:
        start = time.monotonic()
        status, result, reason = run_item(task, item.text, options, seconds)
        elapsed = int(round((time.monotonic() - start) * 1000))
        rows.append(Row(item.key, item.source, item.text, item.position, task, version, canonical, status,
                        json.dumps(result) if result is not None else None, reason, elapsed))
    return rows


def _connect(scheduler: str | None, workers: int | None):
    """A Dask client: to the scheduler at ``scheduler``, or to a new local cluster of processes."""
    import logging

    try:
        from distributed import Client, LocalCluster
    except ImportError as err:  # pragma: no cover - installed with the program
        raise InputError(f"a batch runs on Dask, which is not installed here ({err})") from None
    logging.getLogger("distributed").setLevel(logging.ERROR)
    if scheduler is not None:
        try:
            return Client(scheduler, timeout="20s"), None
        except (OSError, TimeoutError) as err:
            raise InputError(f"no Dask scheduler answers at {scheduler} ({err})") from None
    count = workers or os.cpu_count() or 1
    if count < 1:
        raise InputError(f"a local cluster needs at least one worker, not {count}")
    # the worker processes ignore Ctrl-C (they inherit an ignored SIGINT, and Python then leaves it
    # ignored): the client alone stops the batch, and shuts them down, without their tracebacks
    previous = signal.signal(signal.SIGINT, signal.SIG_IGN)
    try:
        cluster = LocalCluster(n_workers=count, threads_per_worker=1, processes=True, dashboard_address=None,
                               silence_logs=logging.ERROR)
    finally:
        signal.signal(signal.SIGINT, previous)
    return Client(cluster), cluster


class _Progress:
    """A tqdm bar on a terminal; otherwise a plain line to ``log`` every ten seconds or so."""

    def __init__(self, total: int, log) -> None:
        self.total, self.log, self.count, self.start = total, log, 0, time.monotonic()
        self.last = self.start
        self.bar = None
        if log is None and sys.stderr.isatty():
            from tqdm import tqdm

            self.bar = tqdm(total=total, unit="item", file=sys.stderr, dynamic_ncols=True)

    def advance(self, count: int) -> None:
        self.count += count
        if self.bar is not None:
            self.bar.update(count)
            return
        now = time.monotonic()
        if self.log is not None and (now - self.last >= 10 or self.count == self.total):
            self.last = now
            rate = self.count / max(now - self.start, 1e-9)
            left = (self.total - self.count) / rate if rate else 0
            self.log(f"batch: {self.count}/{self.total} done, {rate:.1f} items/s, about {left:.0f} s left")

    def close(self) -> None:
        if self.bar is not None:
            self.bar.close()
