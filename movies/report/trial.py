"""The readable answer of ``movies try``: what each candidate step would leave.

>>> from movies.checker.trial import try_steps
>>> from movies.language.spec import parse_diagram
>>> print("\\n".join(trial_lines("unlink(2)", try_steps(parse_diagram("unlink(2)"), ["band 1 2"], budget=1))))
unlink(2)
  band 1 2
    legal: band across face 2 merges components 1 and 2
    leaves 1 component, 0 crossings
    unlink: yes (the frame is crossingless)
"""

from __future__ import annotations

from movies.wording import plural

__all__ = ["trial_lines"]

_UNLINK = {"certified": "yes", "no": "no", "invariants agree": "not shown"}


def trial_lines(heading: str, trials) -> list[str]:
    """One block per candidate step: legal or not (with the reason), and what it leaves."""
    lines = [heading]
    for trial in trials:
        lines.append(f"  {trial.step}")
        if not trial.legal:
            lines.append(f"    not legal: {trial.reason}")
            continue
        lines.append(f"    legal: {trial.note}")
        names = trial.component_names
        links = [f"lk({names[i]},{names[j]}) = {row[j]}" for i, row in enumerate(trial.linking_matrix)
                 for j in range(i + 1, len(row))]
        lines.append(f"    leaves {plural(trial.components, 'component')}, {plural(trial.crossings, 'crossing')}"
                     + (f"; linking numbers {', '.join(links)}" if links else ""))
        where = " in S^3, the handles left out" if trial.handles is not None else ""
        lines.append(f"    unlink{where}: {_UNLINK[trial.unlink]} ({trial.unlink_detail})")
        if trial.moves:
            lines.append(f"    moves found: {'; '.join(trial.moves)}")
        if trial.handles is not None:
            for number, gate in enumerate(trial.handles.gates, start=1):
                lines.append(f"    handle {number}: its gate crosses edges {', '.join(map(str, gate.edges))}")
    return lines
