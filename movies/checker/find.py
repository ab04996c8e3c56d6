"""``movies find`` as data: a surface found by a search and checked as a movie, beside the lower
bounds the invariants give. The command line prints it; a batch stores it.

>>> data, found = find_for("3_1 # mirror(3_1)", "ribbon", budget=30)
>>> data["verdict"], data["four_genus_certified"]
('verified', 0)
"""

from __future__ import annotations

from movies.bounds.inequalities import best_genus_bound
from movies.bounds.verdicts import mirror_s_values, s_values, search_genus_bounds
from movies.checker.ribbon import SearchResult, find_ribbon_disk
from movies.errors import InputError
from movies.language.spec import parse_diagram

__all__ = ["find_for", "find_knot", "find_link_ribbon"]


def find_for(spec: str, what: str, budget: float, to: str | None = None, progress=None) -> tuple[dict, SearchResult]:
    """``movies find ribbon|surface SPEC [--to SPEC2]`` as (JSON data, the search's result).

    Parameters: the diagram; ``what``, ``"ribbon"`` or ``"surface"``; the budget in seconds;
    ``to``, a second knot for a cobordism; ``progress``, called by the search as it goes.
    Raises :class:`~movies.errors.InputError` for a question that does not apply.
    """
    if what not in ("ribbon", "surface"):
        raise InputError(f"movies find looks for a 'ribbon' disk or a 'surface', not {what!r}")
    if to is not None and what != "surface":
        raise InputError("--to is for 'movies find surface' (a cobordism between two knots)")
    knot = parse_diagram(spec)
    if knot.component_count() != 1:
        if what != "ribbon":
            raise InputError(f"movies find surface is for knots; {spec} has {knot.component_count()} components "
                             "(movies find ribbon takes links: one disk for each component)")
        return find_link_ribbon(spec, knot, budget, progress)
    return find_knot(spec, what, budget, to, progress)


def find_knot(spec: str, what: str, budget: float, to: str | None = None, progress=None) -> tuple[dict, SearchResult]:
    """A ribbon disk or a least-genus surface for a knot (or a cobordism to ``to``), with its bounds.

    For a surface to nothing, when no bound rules out a disk (the best bound is 0), the ribbon
    search runs first, with half the budget: the band-pair search starts at genus one.
    """
    other = None if to is None else parse_diagram(to)
    if other is not None and other.component_count() != 1:
        raise InputError(f"--to takes a knot; {to} has {other.component_count()} components")
    knot = parse_diagram(spec)
    bounds = search_genus_bounds(knot, other)
    best = best_genus_bound(bounds)
    if what == "surface":
        from movies.checker.genus import find_surface

        found = None
        if other is None and best.bound == 0:  # a disk may exist: the ribbon search first, with half the time
            disk = find_ribbon_disk(spec, budget / 2, progress=progress)
            found = disk if disk.verdict == "verified" else None
            budget = budget / 2 if found is None else budget
        if found is None:
            found = find_surface(spec, budget, to=to, progress=progress)
    elif best.bound > 0:  # not slice: no disk to look for
        found = SearchResult(spec, why=f"the knot is not slice: {best.invariant} gives g4 >= {best.bound}")
    else:
        found = find_ribbon_disk(spec, budget, progress=progress)
    genus = found.genus if found.verdict == "verified" else None
    cobordism = other is not None
    certified = genus if genus is not None and genus == best.bound else None
    data = {"knot": spec, "to": to, "found": found.movie is not None, "verdict": found.verdict,
            "bands": list(found.bands), "movie": found.movie, "candidates": found.tried, "why": found.why,
            ("genus_bounds" if cobordism else "four_genus_bounds"):
                [{"invariant": b.invariant, "value": b.value, "bound": b.bound} for b in bounds],
            "genus": genus, "best_lower_bound": best.bound, "best_invariant": best.invariant,
            ("genus_certified" if cobordism else "four_genus_certified"): certified}
    return data, found


def find_link_ribbon(spec: str, link, budget: float, progress=None) -> tuple[dict, SearchResult]:
    """Disjoint ribbon disks for a link, one for each component, or why there are none."""
    n = link.component_count()
    s = s_values(link)
    mirror_s = mirror_s_values(link, s)
    links = [row[j] for i, row in enumerate(link.linking_matrix()) for j in range(i + 1, n)]
    # disjoint disks in B^4: every linking number is 0, and Beliakova–Wehrli 2008 with chi = n gives
    # s(L) <= 1 - n and s(m(L)) <= 1 - n
    reasons = ([f"a linking number is {next(v for v in links if v)}, not 0"] if any(links) else []) + [
        f"s of the {what} over {f} is {value} > {1 - n} = 1 - n (Beliakova–Wehrli)"
        for what, values in (("link", s), ("mirror", mirror_s)) for f, value in values.items() if value > 1 - n]
    found = SearchResult(spec, why="no disjoint disks: " + reasons[0]) if reasons else find_ribbon_disk(
        spec, budget, progress=progress)
    data = {"link": spec, "components": n, "found": found.movie is not None, "verdict": found.verdict,
            "bands": list(found.bands), "movie": found.movie, "why": found.why, "s": s, "mirror_s": mirror_s,
            "linking_numbers": links, "slice_certified": found.verdict == "verified"}
    return data, found
