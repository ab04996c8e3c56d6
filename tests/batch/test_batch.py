"""movies batch: local runs, a real Dask scheduler with two workers, a worker killed mid-run,
an interrupted run resumed, refused database files, timeouts and errors recorded, exports."""

from __future__ import annotations

import csv
import json
import os
import signal
import socket
import sqlite3
import subprocess
import sys
import time
from pathlib import Path

import pytest

from movies.cli.main import main

ROOT = Path(__file__).resolve().parents[2]


def _movies(*args, check=True, **kw):
    """Run the movies command as a separate process (the batch starts worker processes)."""
    done = subprocess.run([sys.executable, "-m", "movies", *args], capture_output=True, text=True, cwd=ROOT,
                          timeout=600, **kw)
    if check:
        assert done.returncode == 0, done.stderr
    return done


def _table(path) -> list[tuple]:
    """The rows of a results file without the times (which differ from run to run)."""
    with sqlite3.connect(path) as db:
        return sorted(db.execute("SELECT item, source, input, position, task, version, options, status, result, "
                                 "reason FROM results"))


def _wait_for_rows(path, seconds: float = 120) -> None:
    """Wait until a running batch has written some results to ``path``."""
    deadline = time.monotonic() + seconds
    while time.monotonic() < deadline:
        time.sleep(0.1)
        try:
            with sqlite3.connect(path) as db:
                if db.execute("SELECT count(*) FROM results").fetchone()[0] > 0:
                    return
        except sqlite3.Error:
            continue


def _free_port() -> int:
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


def test_a_local_batch_stores_what_the_command_line_prints(tmp_path, capsys):
    db = tmp_path / "r.sqlite"
    done = _movies("batch", "run", "--knots", "3-7", "--task", "invariants", "--db", str(db), "--workers", "2")
    assert "14 items; 0 already done; ran 14: 14 ok" in done.stdout
    rows = {row[0]: row for row in _table(db)}
    assert len(rows) == 14 and all(row[7] == "ok" for row in rows.values())
    # the same functions as the command line: the stored result is what 'movies invariants --json' prints
    assert main(["invariants", "5_2", "--json"]) == 0
    assert json.loads(rows["5_2"][8]) == json.loads(capsys.readouterr().out)
    # again: everything is done already
    again = _movies("batch", "run", "--knots", "3-7", "--task", "invariants", "--db", str(db), "--workers", "2")
    assert "14 already done; ran 0: nothing new" in again.stdout
    # KnotInfo columns rasmussen_invariant and khovanov_unreduced_integral_polynomial, through the summary
    summary = json.loads(_movies("batch", "summary", str(db), "--json").stdout)
    (entry,) = summary
    assert entry["status"] == {"ok": 14, "timeout": 0, "error": 0}
    assert entry["tables"]["rasmussen_invariant"] == {"compared": 14, "agree": 14, "disagree": []}
    assert entry["tables"]["khovanov_unreduced_integral_polynomial"]["agree"] == 14


def test_timeouts_and_errors_are_recorded_and_the_batch_goes_on(tmp_path):
    items = tmp_path / "diagrams.txt"
    items.write_text("3_1\n% a comment\nnot a diagram\n\ntorus(7, 8)\n4_1 # 4_1\n", encoding="utf-8")
    db = tmp_path / "r.sqlite"
    _movies("batch", "run", "--diagrams", str(items), "--task", "invariants", "--db", str(db), "--workers", "1",
            "--time-limit", "2")
    rows = {row[0]: row for row in _table(db)}
    assert {key: row[7] for key, row in rows.items()} == {"line 1": "ok", "line 3": "error", "line 5": "timeout",
                                                         "line 6": "ok"}
    assert "is not a word of the notation" in rows["line 3"][9]
    assert "time limit of 2 s" in rows["line 5"][9]
    # exports: every row, the result as JSON
    out = tmp_path / "r.jsonl"
    _movies("batch", "export", str(db), "--jsonl", str(out))
    lines = [json.loads(line) for line in out.read_text().splitlines()]
    assert [(x["item"], x["status"]) for x in lines] == [("line 1", "ok"), ("line 3", "error"), ("line 5", "timeout"),
                                                         ("line 6", "ok")]
    assert lines[0]["result"]["s"] == {"Q": 2, "F2": 2}
    table = tmp_path / "r.csv"
    _movies("batch", "export", str(db), "--csv", str(table))
    with open(table, newline="") as handle:
        read = list(csv.DictReader(handle))
    assert [r["status"] for r in read] == ["ok", "error", "timeout", "ok"] and json.loads(read[3]["result"])["s"]


def test_a_batch_of_movies_and_of_searches(tmp_path):
    folder = tmp_path / "movies"
    folder.mkdir()
    for name in ("square-knot-ribbon", "mistake-illegal-move"):
        (folder / f"{name}.movie").write_text((ROOT / "examples" / "movies" / f"{name}.movie").read_text())
    db = tmp_path / "r.sqlite"
    _movies("batch", "run", "--movies", str(folder), "--task", "check", "--db", str(db), "--workers", "1")
    verdicts = {row[0]: json.loads(row[8])["verdict"] for row in _table(db)}
    assert verdicts == {"mistake-illegal-move.movie": "invalid", "square-knot-ribbon.movie": "verified"}
    # KnotInfo column smooth_four_genus: 6_1 is slice; the search's certified 4-genus is compared with it
    _movies("batch", "run", "--knots", "6", "--task", "find-ribbon", "--db", str(db), "--workers", "1",
            "--budget", "20")
    summary = json.loads(_movies("batch", "summary", str(db), "--json").stdout)
    (ribbon,) = [entry for entry in summary if entry["task"] == "find-ribbon"]
    assert ribbon["tables"]["smooth_four_genus"]["agree"] == ribbon["tables"]["smooth_four_genus"]["compared"] >= 1


@pytest.mark.parametrize("content", [b"this is not a database at all, just some text" * 20, None], ids=["garbage", "foreign"])
def test_a_corrupted_or_foreign_database_is_refused_and_left_alone(tmp_path, content):
    db = tmp_path / "other.sqlite"
    if content is None:  # a real SQLite database of something else
        with sqlite3.connect(db) as other:
            other.execute("CREATE TABLE accounts (name TEXT)")
            other.execute("INSERT INTO accounts VALUES ('x')")
    else:
        db.write_bytes(content)
    before = db.read_bytes()
    done = _movies("batch", "run", "--knots", "3", "--task", "invariants", "--db", str(db), check=False)
    assert done.returncode == 2
    assert ("is not a database" in done.stderr) if content else ("a database of something else" in done.stderr)
    assert db.read_bytes() == before
    assert _movies("batch", "summary", str(db), check=False).returncode == 2


def test_an_interrupted_batch_resumes_to_the_same_database(tmp_path):
    whole, parts = tmp_path / "whole.sqlite", tmp_path / "parts.sqlite"
    args = ["batch", "run", "--knots", "3-10", "--task", "invariants", "--workers", "2"]
    _movies(*args, "--db", str(whole))
    process = subprocess.Popen([sys.executable, "-m", "movies", *args, "--db", str(parts)], cwd=ROOT,
                               stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True, start_new_session=True)
    _wait_for_rows(parts)  # then press Ctrl-C
    os.killpg(process.pid, signal.SIGINT)  # as Ctrl-C on a terminal: to the whole process group, workers too
    out, err = process.communicate(timeout=120)
    assert process.returncode == 130, (out, err)
    assert "to resume" in err and "Traceback" not in err, err
    stored = len(_table(parts))
    assert 0 < stored < len(_table(whole))
    _movies(*args, "--db", str(parts))
    assert _table(parts) == _table(whole)


def test_a_running_scheduler_with_two_workers_and_one_killed(tmp_path):
    port = _free_port()
    address = f"tcp://127.0.0.1:{port}"
    scheduler = subprocess.Popen(["dask", "scheduler", "--host", "127.0.0.1", "--port", str(port), "--no-dashboard"],
                                 stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
    workers = [subprocess.Popen(["dask", "worker", address, "--nthreads", "1", "--no-nanny", "--no-dashboard",
                                 "--name", f"w{i}"], stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL, cwd=ROOT)
               for i in range(2)]
    try:
        local, remote, killed = (tmp_path / name for name in ("local.sqlite", "remote.sqlite", "killed.sqlite"))
        args = ["batch", "run", "--knots", "3-9", "--task", "invariants"]
        _movies(*args, "--db", str(local), "--workers", "1")
        _movies(*args, "--db", str(remote), "--scheduler", address)
        assert _table(remote) == _table(local)
        # a longer batch; one worker is killed once results arrive: the other finishes every item, once
        args = ["batch", "run", "--knots", "3-10", "--task", "invariants", "--db", str(killed),
                "--scheduler", address]
        process = subprocess.Popen([sys.executable, "-m", "movies", *args], cwd=ROOT, stdout=subprocess.PIPE,
                                   stderr=subprocess.PIPE, text=True)
        _wait_for_rows(killed)
        workers[0].kill()
        out, err = process.communicate(timeout=300)
        assert process.returncode == 0, err
        rows = _table(killed)
        with sqlite3.connect(killed) as db:
            assert db.execute("SELECT count(*), count(DISTINCT item) FROM results").fetchone() == (len(rows),) * 2
        assert len(rows) == 249 and all(row[7] == "ok" for row in rows)  # every knot of 3 to 10 crossings
    finally:
        for process in workers + [scheduler]:
            process.kill()
            process.wait()


def test_ctrl_c_stops_a_batch_promptly_while_long_items_run(tmp_path):
    # each item takes far longer than the test waits; the client must still see Ctrl-C within a second or two
    items = tmp_path / "slow.txt"
    items.write_text("torus(7, 8)\ntorus(7, 8) # 3_1\n", encoding="utf-8")
    db = tmp_path / "r.sqlite"
    process = subprocess.Popen([sys.executable, "-m", "movies", "batch", "run", "--diagrams", str(items), "--task",
                                "invariants", "--db", str(db), "--workers", "1", "--time-limit", "300"], cwd=ROOT,
                               stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
    time.sleep(8)  # the cluster is up and the first item running
    process.send_signal(signal.SIGINT)
    started = time.monotonic()
    out, err = process.communicate(timeout=60)
    assert process.returncode == 130 and "to resume" in err, (out, err)
    assert time.monotonic() - started < 20
