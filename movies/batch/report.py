"""What a results database holds: a summary, and exports to CSV and JSON lines.

The summary counts rows by status, lists the slowest items, and for items of the knot and link
tables compares each result with the table's own columns where one is filled: s over Q with
KnotInfo's ``rasmussen_invariant``, Khovanov homology over Q with the free part of
``khovanov_unreduced_integral_polynomial`` (knots) or LinkInfo's ``khovanov_polynomial``
(links), and a certified 4-genus with ``smooth_four_genus``.
"""

from __future__ import annotations

import csv
import json
from pathlib import Path

from movies.batch.store import STATUSES, ResultStore
from movies.diagram.table_columns import parse_four_genus_bounds, parse_int, parse_khovanov
from movies.diagram.tables import table_row
from movies.errors import InputError

__all__ = ["summary", "summary_text", "export_csv", "export_jsonl", "table_agreement"]

#: how many of the slowest items the summary lists
SLOWEST = 10


def summary(store: ResultStore) -> list[dict]:
    """One entry per task, version and options in the file: counts by status, total and median
    time, the slowest items, and the agreement with the tables."""
    groups: dict[tuple, list] = {}
    for row in store.rows():
        groups.setdefault((row.task, row.version, row.options), []).append(row)
    out = []
    for (task, version, options), rows in groups.items():
        times = sorted(row.milliseconds for row in rows)
        slowest = sorted(rows, key=lambda row: (-row.milliseconds, row.position))[:SLOWEST]
        out.append({
            "task": task, "version": version, "options": json.loads(options), "items": len(rows),
            "status": {status: sum(row.status == status for row in rows) for status in STATUSES},
            "milliseconds": {"total": sum(times), "median": times[len(times) // 2]},
            "slowest": [{"item": row.item, "status": row.status, "milliseconds": row.milliseconds}
                        for row in slowest],
            "failures": [{"item": row.item, "status": row.status, "reason": row.reason}
                         for row in rows if row.status != "ok"][:SLOWEST],
            "tables": table_agreement(rows),
        })
    return out


def table_agreement(rows) -> dict:
    """For rows of the knot and link tables: per column, how many results were compared with a
    filled entry, how many agree, and the first few that do not."""
    columns: dict[str, dict] = {}

    def compare(column: str, item: str, ours, theirs) -> None:
        entry = columns.setdefault(column, {"compared": 0, "agree": 0, "disagree": []})
        entry["compared"] += 1
        if ours == theirs:
            entry["agree"] += 1
        elif len(entry["disagree"]) < SLOWEST:
            entry["disagree"].append({"item": item, "ours": ours, "table": theirs})

    for row in rows:
        if row.status != "ok" or row.source not in ("knots", "links"):
            continue
        result, table = json.loads(row.result), table_row(row.item)
        if row.task == "invariants":
            s = (result.get("s") or {}).get("Q")
            expected = parse_int(table.get("rasmussen_invariant", ""))
            if row.source == "knots" and s is not None and expected is not None:
                compare("rasmussen_invariant", row.item, s, expected)
            ranks = (result.get("khovanov") or {}).get("Q")
            column = "khovanov_unreduced_integral_polynomial" if row.source == "knots" else "khovanov_polynomial"
            groups = parse_khovanov(table.get(column, ""))
            if ranks is not None and groups is not None:
                theirs = sorted([i, j, g["free"]] for (i, j), g in groups.items() if g["free"])
                compare(column, row.item, sorted(ranks), theirs)
        elif row.task.startswith("find") and row.source == "knots":
            certified = result.get("four_genus_certified")
            bounds = parse_four_genus_bounds(table.get("smooth_four_genus", ""))
            if certified is not None and bounds is not None:
                low, high = bounds
                compare("smooth_four_genus", row.item, certified, certified if low <= certified <= high
                        else table.get("smooth_four_genus"))
    return columns


def summary_text(entries: list[dict], path: str) -> str:
    """The summary as the command line prints it."""
    if not entries:
        return f"{path}: no results yet"
    lines = []
    for entry in entries:
        status = ", ".join(f"{count} {name}" for name, count in entry["status"].items() if count)
        lines += [f"{path}: task {entry['task']} (version {entry['version']}, options "
                  f"{json.dumps(entry['options'], sort_keys=True)})",
                  f"  {entry['items']} items: {status}",
                  f"  time: {entry['milliseconds']['total'] / 1000:.1f} s in all, median "
                  f"{entry['milliseconds']['median']} ms per item",
                  "  slowest: " + ", ".join(f"{s['item']} ({s['milliseconds']} ms{'' if s['status'] == 'ok' else ', ' + s['status']})"
                                            for s in entry["slowest"])]
        for failure in entry["failures"]:
            lines.append(f"  {failure['status']}: {failure['item']}: {failure['reason']}")
        for column, counts in entry["tables"].items():
            lines.append(f"  table column {column}: {counts['agree']} of {counts['compared']} agree")
            for miss in counts["disagree"]:
                lines.append(f"    {miss['item']}: ours {miss['ours']}, the table's {miss['table']}")
    return "\n".join(lines)


def export_csv(store: ResultStore, path: str | Path) -> int:
    """Every row to a CSV file (the result as its JSON text); returns the number of rows."""
    rows = store.rows()
    try:
        with open(path, "w", newline="", encoding="utf-8") as handle:
            writer = csv.writer(handle)
            writer.writerow(["item", "source", "input", "task", "version", "options", "status", "milliseconds",
                             "reason", "result"])
            for row in rows:
                writer.writerow([row.item, row.source, row.input, row.task, row.version, row.options, row.status,
                                 row.milliseconds, row.reason, row.result or ""])
    except OSError as err:
        raise InputError(f"cannot write {path}: {err}") from None
    return len(rows)


def export_jsonl(store: ResultStore, path: str | Path) -> int:
    """Every row to a JSON-lines file, one object per row with the result as JSON; returns the count."""
    rows = store.rows()
    try:
        with open(path, "w", encoding="utf-8") as handle:
            for row in rows:
                handle.write(json.dumps({"item": row.item, "source": row.source, "input": row.input,
                                         "task": row.task, "version": row.version,
                                         "options": json.loads(row.options), "status": row.status,
                                         "milliseconds": row.milliseconds, "reason": row.reason,
                                         "result": json.loads(row.result) if row.result else None}) + "\n")
    except OSError as err:
        raise InputError(f"cannot write {path}: {err}") from None
    return len(rows)
