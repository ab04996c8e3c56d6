"""The invariants of one diagram as the terminal shows them: one row per invariant.

>>> print(invariants_text("demo", {"components": 1, "crossings": 0, "writhe": 0, "seifert_circles": 1,
...     "split_pieces": 1, "jones": [[0, 1]], "signature": 0, "linking_matrix": [[0]],
...     "alexander": [[0, 1]], "determinant": 1}))
demo
  components       1
  crossings        0   (writhe 0, 1 Seifert circle, 1 split piece)
  Jones            1
  signature        0
  Alexander        1
  determinant      1
  linking numbers  (one component)
"""

from __future__ import annotations

from fractions import Fraction

from movies.algebra.laurent import LaurentPolynomial
# the movie report is laid out next to its JSON, where the HTML report uses it too
from movies.wording import plural


def polynomial_text(terms: list[list], variable: str = "t") -> str:
    """A polynomial given as [[exponent, coefficient], ...] in the trade's readable form.

    >>> polynomial_text([[1, 1], [3, 1], [4, -1]])
    't + t^3 - t^4'
    >>> polynomial_text([["-1/2", -1], ["1/2", -1]])
    '-t^(-1/2) - t^(1/2)'
    >>> polynomial_text([])
    '0'
    """
    exact = {Fraction(exponent): coefficient for exponent, coefficient in terms}
    return str(LaurentPolynomial(exact, variable=variable))


def homology_polynomial(triples: list[list[int]], torsion: list[list[int]] = ()) -> str:
    """Ranks [[i, j, rank], ...] (and torsion [[i, j, order, count]]) as a polynomial in t and q.

    >>> homology_polynomial([[0, 1, 1], [0, 3, 1], [2, 5, 1], [3, 9, 1]], [[3, 7, 2, 1]])
    'q + q^3 + t^2 q^5 + t^3 q^9 + Z/2 t^3 q^7'
    >>> homology_polynomial([[0, 0, 2], [1, 0, 3]])
    '2 + 3 t'
    """
    def monomial(i: int, j: int) -> str:
        parts = [("t" if i == 1 else f"t^{i}") if i else "", ("q" if j == 1 else f"q^{j}") if j else ""]
        return " ".join(p for p in parts if p) or "1"

    def term(i: int, j: int, r: int) -> str:
        if not i and not j:
            return str(r)
        return (f"{r} " if r > 1 else "") + monomial(i, j)

    terms = [term(i, j, r) for i, j, r in triples]
    terms += [(f"{count} " if count > 1 else "") + f"Z/{order} {monomial(i, j)}" for i, j, order, count in torsion]
    return " + ".join(terms) if terms else "0"


def homology_rows(facts: dict) -> list[tuple[str, str]]:
    """Rows of the invariants report for the homology in ``facts`` (if any was computed).

    >>> homology_rows({"khovanov": {"Q": [[0, 1, 1], [0, -1, 1]]}, "s": {"Q": 0}})
    [('Khovanov (Q)', 'q + q^-1'), ('s', '0 over Q')]
    """
    rows: list[tuple[str, str]] = []
    for field, triples in facts.get("khovanov", {}).items():
        rows.append((f"Khovanov ({field})", homology_polynomial(triples)))
    if "khovanov_Z" in facts:
        torsion = facts["khovanov_Z"]["torsion"]
        rows.append(("Khovanov (Z)", "no torsion" if not torsion else "torsion " + homology_polynomial([], torsion)))
    for field, triples in facts.get("reduced_khovanov", {}).items():
        rows.append((f"reduced ({field})", homology_polynomial(triples)))
    for field, module in facts.get("bar_natan", {}).items():
        text = "free " + homology_polynomial(module["free"])
        if module["torsion"]:
            text += "; H-torsion " + ", ".join(f"H^{k} at t^{i} q^{j}" + (f" ({c})" if c > 1 else "")
                                                for i, j, k, c in module["torsion"])
        rows.append((f"Bar-Natan ({field})", text))
    if "s" in facts:
        s = facts["s"]
        rows.append(("s", ", ".join(f"{value} over {field}" for field, value in s.items())))
    return rows


def invariants_text(label: str, facts: dict) -> str:
    """The readable report of ``movies invariants``: one row per invariant (see the module's example)."""
    rows = [
        ("components", str(facts["components"])),
        (
            "crossings",
            f"{facts['crossings']}   (writhe {facts['writhe']}, "
            f"{plural(facts['seifert_circles'], 'Seifert circle')}, "
            f"{plural(facts['split_pieces'], 'split piece')})",
        ),
        ("Jones", polynomial_text(facts["jones"])),
        ("signature", str(facts["signature"])),
        ("Alexander", polynomial_text(facts["alexander"])),
        ("determinant", str(facts["determinant"])),
    ]
    for name, value in homology_rows(facts):
        rows.append((name, value))
    matrix = facts["linking_matrix"]
    if len(matrix) <= 1:
        rows.append(("linking numbers", "(one component)" if matrix else "(no components)"))
    else:
        pairs = [f"lk({i + 1},{j + 1}) = {matrix[i][j]}" for i in range(len(matrix)) for j in range(i + 1, len(matrix))]
        rows.append(("linking numbers", ", ".join(pairs)))
    return "\n".join([label] + [f"  {name:<16} {value}" for name, value in rows])


def handles_text(label: str, facts: dict) -> str:
    """The readable report of ``movies invariants`` for a link in #ʳ S¹×S² (facts as its JSON).

    A limit of s(L(k)) is printed as a value only when it is certified; otherwise as the interval
    the computed sequence proves.

    >>> print(handles_text("demo", {"handles": 1, "class": [0], "null_homologous": True, "two_divisible": True,
    ...     "null_homologous_orientations": [[], [1, 2]], "s_note": "", "s": {"Q": {"sequence": [[-1, 1], [0, -1],
    ...     [1, -1]], "window": [-3, 1], "s_plus": {"low": -3, "high": -1, "certified": False, "reached_at_k": None},
    ...     "s_minus": {"low": 1, "high": 1, "certified": True, "reached_at_k": -1}}}}))
    demo
      a link in S^1 x S^2 (1 handle)
      class            (0): null-homologous, 2-divisible
      orientations     null-homologous: as given; reverse 1, 2
      s(L(k)) over Q   k = -1: 1, 0: -1, 1: -1   (window -3 to 1)
      s+ over Q          between -3 and -1: not certified (the sequence stays above the floor up to k = 1)
      s- over Q          1: certified (the ceiling is reached at k = -1)
    """
    r = facts["handles"]
    where = "S^1 x S^2" if r == 1 else f"#^{r} S^1 x S^2"
    klass = ", ".join(map(str, facts["class"]))
    kind = ("null-homologous" if facts["null_homologous"] else "not null-homologous") + \
        (", 2-divisible" if facts["two_divisible"] else ", not 2-divisible")
    shown = "; ".join("as given" if not o else "reverse " + ", ".join(map(str, o))
                      for o in facts["null_homologous_orientations"]) or "none"
    lines = [label, f"  a link in {where} ({plural(r, 'handle')})", f"  class            ({klass}): {kind}",
             f"  orientations     null-homologous: {shown}"]
    if facts["s"] is None:
        lines.append(f"  s                {facts['s_note']}")
        return "\n".join(lines)
    for field, found in facts["s"].items():
        sequence = ", ".join(f"{k}: {s}" for k, s in found["sequence"])
        low, high = found["window"]
        lines.append(f"  s(L(k)) over {field:<3} k = {sequence}   (window {low} to {high})")
        top, bottom = found["sequence"][-1][0], found["sequence"][0][0]
        for name, limit, end, far in (("s+", found["s_plus"], "floor", top), ("s-", found["s_minus"], "ceiling", bottom)):
            if limit["certified"]:
                text = f"{limit['low']}: certified (the {end} is reached at k = {limit['reached_at_k']})"
            else:
                side = "above the floor" if name == "s+" else "below the ceiling"
                text = (f"between {limit['low']} and {limit['high']}: not certified (the sequence stays {side} "
                        f"up to k = {far})")
            lines.append(f"  {name} over {field:<10} {text}")
    return "\n".join(lines)


def khovanov_tables_text(field: str, tables: list[dict]) -> list[str]:
    """Kh(L(k)) as tables of ranks, one per k (JSON of :class:`~movies.homology.approximations.KhovanovTable`).

    Columns are homological degrees h, rows quantum degrees q (highest first); ``*`` marks a
    degree in which the table equals the one for the k next to it on the way to 0.

    >>> for line in khovanov_tables_text("Q", [{"k": 1, "ranks": [[0, -2, 1], [0, 0, 1], [2, 2, 1], [2, 4, 1]],
    ...                                         "stable_degrees": [0, 1]}]):
    ...     print(line)
      Kh(L(k)) over Q, each twist region's identity resolution in bidegree (0, 0); * = as for the k next to it towards 0
        k = 1        h   0*   1*   2
                 q = 4             1
                 q = 2             1
                 q = 0   1
                q = -2   1
    """
    lines = [f"  Kh(L(k)) over {field}, each twist region's identity resolution in bidegree (0, 0); "
             "* = as for the k next to it towards 0"]
    for table in tables:
        ranks = {(i, j): r for i, j, r in table["ranks"]}
        if not ranks:
            lines.append(f"    k = {table['k']:<6}  0")
            continue
        hs = range(min(i for i, _ in ranks), max(i for i, _ in ranks) + 1)
        qs = sorted({j for _, j in ranks}, reverse=True)
        marks = set(table["stable_degrees"])
        head = "".join(f"{h:>4}{'*' if h in marks else ' '}" for h in hs)
        lines.append((f"    k = {table['k']}".ljust(14) + "   h" + head).rstrip())
        for q in qs:
            row = "".join(f"{ranks.get((h, q), ''):>4} " for h in hs)
            lines.append((f"q = {q}".rjust(18) + row).rstrip())
    return lines
