"""Text layouts of the command line's reports.

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


def polynomial_text(terms: list[list], variable: str = "t") -> str:
    """A polynomial given as [[exponent, coefficient], ...] in the trade's readable form.

    >>> polynomial_text([[1, 1], [3, 1], [4, -1]])
    't + t^3 - t^4'
    >>> polynomial_text([[-0.5, -1], [0.5, -1]])
    '-t^(-1/2) - t^(1/2)'
    >>> polynomial_text([])
    '0'
    """
    pieces = []
    for exponent, coefficient in terms:
        exponent = Fraction(exponent).limit_denominator(2)
        if exponent == 0:
            monomial = ""
        elif exponent == 1:
            monomial = variable
        elif exponent.denominator == 1 and exponent > 0:
            monomial = f"{variable}^{exponent}"
        else:
            monomial = f"{variable}^({exponent})"
        size = abs(coefficient)
        body = f"{size}{monomial}" if size != 1 or not monomial else monomial
        sign = "-" if coefficient < 0 else "+"
        pieces.append((sign, body))
    if not pieces:
        return "0"
    first_sign, first = pieces[0]
    text = ("-" if first_sign == "-" else "") + first
    for sign, body in pieces[1:]:
        text += f" {sign} {body}"
    return text


def _plural(count: int, word: str) -> str:
    return f"{count} {word}" + ("" if count == 1 else "s")


def invariants_text(label: str, facts: dict) -> str:
    """The readable report of ``movies invariants``: one row per invariant."""
    rows = [
        ("components", str(facts["components"])),
        (
            "crossings",
            f"{facts['crossings']}   (writhe {facts['writhe']}, "
            f"{_plural(facts['seifert_circles'], 'Seifert circle')}, "
            f"{_plural(facts['split_pieces'], 'split piece')})",
        ),
        ("Jones", polynomial_text(facts["jones"])),
        ("signature", str(facts["signature"])),
        ("Alexander", polynomial_text(facts["alexander"])),
        ("determinant", str(facts["determinant"])),
    ]
    matrix = facts["linking_matrix"]
    if len(matrix) <= 1:
        rows.append(("linking numbers", "(one component)" if matrix else "(no components)"))
    else:
        pairs = [f"lk({i + 1},{j + 1}) = {matrix[i][j]}" for i in range(len(matrix)) for j in range(i + 1, len(matrix))]
        rows.append(("linking numbers", ", ".join(pairs)))
    return "\n".join([label] + [f"  {name:<16} {value}" for name, value in rows])
