"""The column readers against the whole KnotInfo and LinkInfo tables.

Each sweep reads every non-blank entry of a column (a spread of every 7th row for the four
Khovanov columns nobody else uses yet: reduced integral and the odd ones). The readings are then
checked against each other: Euler characteristics against the Jones polynomial, coefficients
mod 2 against the reduced mod 2 column, determinants against the Alexander and Jones
polynomials, braid closures against the component counts and linking matrices.
"""

from __future__ import annotations

import functools
import itertools
from fractions import Fraction

import pytest
from database_knotinfo import link_list
from hypothesis import given, settings
from hypothesis import strategies as st

from movies.errors import MoviesError
from movies.diagram import table_columns as columns
from support.knotinfo_columns import (
    ColumnTextError,
    parse_braid,
    parse_braids,
    parse_four_genus,
    parse_four_genus_bounds,
    parse_int,
    parse_khovanov,
    parse_laurent,
    parse_laurent_polynomial,
    parse_linkinfo_jones,
    parse_matrix,
)

KNOTS, LINKS = "knots", "links"


@functools.cache
def table(which: str) -> tuple[dict, ...]:
    """The rows of one table, without the row of column titles that comes first."""
    return tuple(link_list(proper_links=(which == LINKS))[1:])


def _jones_in_t(text: str):
    return parse_laurent(text, "t")


SWEEPS = [
    # (table, column, reader, step)
    (KNOTS, "jones_polynomial", _jones_in_t, 1),
    (KNOTS, "alexander_polynomial", _jones_in_t, 1),
    (KNOTS, "khovanov_unreduced_integral_polynomial", parse_khovanov, 1),
    (KNOTS, "khovanov_reduced_rational_polynomial", parse_khovanov, 1),
    (KNOTS, "khovanov_reduced_mod2_polynomial", parse_khovanov, 1),
    (KNOTS, "khovanov_reduced_integral_polynomial", parse_khovanov, 7),
    (KNOTS, "khovanov_odd_integral_polynomial", parse_khovanov, 7),
    (KNOTS, "khovanov_odd_rational_polynomial", parse_khovanov, 7),
    (KNOTS, "khovanov_odd_mod2_polynomial", parse_khovanov, 7),
    (KNOTS, "signature", parse_int, 1),
    (KNOTS, "rasmussen_invariant", parse_int, 1),
    (KNOTS, "determinant", parse_int, 1),
    (KNOTS, "crossing_number", parse_int, 1),
    (KNOTS, "smooth_four_genus", parse_four_genus_bounds, 1),
    (KNOTS, "seifert_matrix", parse_matrix, 1),
    (KNOTS, "braid_notation", parse_braids, 1),
    (LINKS, "jones_polynomial", parse_linkinfo_jones, 1),
    (LINKS, "khovanov_polynomial", parse_khovanov, 1),
    (LINKS, "linking_matrix", parse_matrix, 1),
    (LINKS, "seifert_matrix", parse_matrix, 1),
    (LINKS, "braid_notation", parse_braids, 1),
    (LINKS, "signature", parse_int, 1),
    (LINKS, "determinant", parse_int, 1),
    (LINKS, "crossing_number", parse_int, 1),
    (LINKS, "components", parse_int, 1),
    (LINKS, "smooth_four_genus", parse_four_genus_bounds, 1),
]
_READER = {(which, column): (reader, step) for which, column, reader, step in SWEEPS}


@functools.cache
def sweep(which: str, column: str) -> tuple[dict, list]:
    """({row name: reading} for the non-blank entries, [(name, text, error)] for failures)."""
    reader, step = _READER[which, column]
    readings, failures = {}, []
    for row in table(which)[::step]:
        text = row[column]
        if not text.strip():
            continue
        try:
            readings[row["name"]] = reader(text)
        except MoviesError as error:
            failures.append((row["name"], text[:80], str(error)[:120]))
    return readings, failures


def readings(which: str, column: str) -> dict:
    return sweep(which, column)[0]


@pytest.mark.parametrize("which, column", [(w, c) for w, c, _, _ in SWEEPS])
def test_every_entry_of_the_column_is_read(which, column):
    found, failures = sweep(which, column)
    step = _READER[which, column][1]
    nonblank = sum(1 for row in table(which)[::step] if row[column].strip())
    assert failures == []
    assert len(found) == nonblank > 0
    # a non-blank entry never reads as "unknown"
    assert all(value is not None for value in found.values())


# --- the readings against each other, over the whole tables ------------------------------------

def _euler_characteristic(groups: dict) -> dict[int, int]:
    """Sum of (-1)^i q^j times the free rank (torsion does not count over Q)."""
    total: dict[int, int] = {}
    for (i, j), group in groups.items():
        total[j] = total.get(j, 0) + (-1) ** (i % 2) * group["free"]
    return {j: c for j, c in total.items() if c}


def _jones_at_minus_q(jones: dict[Fraction, int], quantum_factor: bool) -> dict[int, int]:
    """V at t^(1/2) = -q, times (q + 1/q) if ``quantum_factor``; as {q exponent: coefficient}."""
    total: dict[int, int] = {}
    for exponent, coefficient in jones.items():
        power = int(2 * exponent)
        value = coefficient * (-1) ** (power % 2)
        shifts = (1, -1) if quantum_factor else (0,)
        for shift in shifts:
            total[power + shift] = total.get(power + shift, 0) + value
    return {j: c for j, c in total.items() if c}


def test_knot_khovanov_euler_characteristic_is_the_jones_polynomial():
    jones = readings(KNOTS, "jones_polynomial")
    unreduced = readings(KNOTS, "khovanov_unreduced_integral_polynomial")
    rational = readings(KNOTS, "khovanov_reduced_rational_polynomial")
    mod2 = readings(KNOTS, "khovanov_reduced_mod2_polynomial")
    assert len(unreduced) == len(rational) == len(mod2) == len(jones) - 1  # 0_1 has no Kh
    for name, groups in unreduced.items():
        # Khovanov (2000): the graded Euler characteristic is (q + 1/q) V(q^2); KnotInfo columns
        # khovanov_unreduced_integral_polynomial and jones_polynomial
        assert _euler_characteristic(groups) == _jones_at_minus_q(jones[name], True), name
        # reduced homology has Euler characteristic V(q^2); columns khovanov_reduced_*_polynomial
        assert _euler_characteristic(rational[name]) == _jones_at_minus_q(jones[name], False)
        # the same over F2; KnotInfo columns khovanov_reduced_mod2_polynomial, jones_polynomial
        assert _euler_characteristic(mod2[name]) == _jones_at_minus_q(jones[name], False)


def test_knot_quantum_degrees_have_the_parity_of_a_knot():
    for groups in readings(KNOTS, "khovanov_unreduced_integral_polynomial").values():
        # common practice, no source: a knot's unreduced q-degrees are odd
        assert all(j % 2 == 1 for _, j in groups)
    for groups in readings(KNOTS, "khovanov_reduced_rational_polynomial").values():
        # common practice, no source: a knot's reduced q-degrees are even
        assert all(j % 2 == 0 for _, j in groups)


def test_integral_torsion_matches_the_mod2_column():
    """Universal coefficients turn the integral groups into F2 dimensions; those must be the
    reduced mod 2 homology tensored with q + 1/q."""
    unreduced = readings(KNOTS, "khovanov_unreduced_integral_polynomial")
    mod2 = readings(KNOTS, "khovanov_reduced_mod2_polynomial")
    for name, groups in unreduced.items():
        dims: dict[tuple[int, int], int] = {}
        for (i, j), group in groups.items():
            even = sum(count for order, count in group["torsion"].items() if order % 2 == 0)
            for key, amount in (((i, j), group["free"] + even), ((i - 1, j), even)):
                dims[key] = dims.get(key, 0) + amount
        expected: dict[tuple[int, int], int] = {}
        for (i, j), group in mod2[name].items():
            for shift in (1, -1):
                expected[i, j + shift] = expected.get((i, j + shift), 0) + group["free"]
        # Shumakovitch, "Torsion of the Khovanov homology" (2014): Kh(K; F2) = Khr(K; F2) ⊗
        # (q + 1/q); KnotInfo columns khovanov_unreduced_integral / khovanov_reduced_mod2
        assert {k: v for k, v in dims.items() if v} == expected, name


def test_knot_determinant_is_alexander_and_jones_at_minus_one():
    determinant = readings(KNOTS, "determinant")
    alexander = readings(KNOTS, "alexander_polynomial")
    jones = readings(KNOTS, "jones_polynomial")
    disagreeing = []
    for name, value in determinant.items():
        from_alexander = abs(sum(c * (-1) ** int(e) for e, c in alexander[name].items()))
        from_jones = abs(sum(c * (-1) ** int(e) for e, c in jones[name].items()))
        if not from_alexander == from_jones == value:
            disagreeing.append((name, value, from_alexander, from_jones))
    # common practice, no source: det K = |Δ(-1)| = |V(-1)|, which is 1 for the unknot; the
    # KnotInfo column determinant gives 0 for 0_1 and agrees everywhere else
    assert disagreeing == [("0_1", 0, 1, 1)]


def test_rasmussen_invariant_against_signature_and_four_genus():
    rasmussen = readings(KNOTS, "rasmussen_invariant")
    signature = readings(KNOTS, "signature")
    genus = readings(KNOTS, "smooth_four_genus")
    alternating = {row["name"] for row in table(KNOTS) if row["alternating"] == "Y"}
    # from memory: alternating prime knots of 0, 3, 4, ..., 13 crossings
    assert len(alternating) == 1 + 1 + 1 + 2 + 3 + 7 + 18 + 41 + 123 + 367 + 1288 + 4878
    for name, s in rasmussen.items():
        # Rasmussen, "Khovanov homology and the slice genus" (2010): s is even, |s| <= 2 g4
        assert s % 2 == 0 and abs(s) <= 2 * genus[name][1], name
        if name in alternating:
            # Rasmussen (2010), Theorem 3 (after Lee): s = -σ for alternating knots, with
            # σ(3_1) = -2 as KnotInfo column signature has it
            assert s == -signature[name], name


def test_four_genus_ranges_read_as_unknown():
    entries = [row["smooth_four_genus"] for row in table(KNOTS)]
    ranges = [text for text in entries if text.startswith("[")]
    # KnotInfo column smooth_four_genus: 19 ranges in this version of the table
    assert len(ranges) == 19
    # KnotInfo column smooth_four_genus: exact where a number, unknown where a range
    assert all(parse_four_genus(text) is None for text in ranges)
    # KnotInfo column smooth_four_genus: every other entry is a plain number
    assert all(parse_four_genus(text) == int(text) for text in entries if text.isdigit())


def test_linkinfo_khovanov_has_the_knot_columns_normalisation():
    jones = readings(LINKS, "jones_polynomial")
    khovanov = readings(LINKS, "khovanov_polynomial")
    components = readings(LINKS, "components")
    for name, groups in khovanov.items():
        # common practice, no source: q-degrees have the parity of the number of components,
        # and V(L) lies in t^((c-1)/2) Z[t, 1/t]; LinkInfo columns khovanov_polynomial, jones
        assert all((j - components[name]) % 2 == 0 for _, j in groups), name
        # common practice, no source: V(L) lies in t^((c-1)/2) Z[t, 1/t]
        assert all((2 * e - components[name] + 1) % 2 == 0 for e in jones[name]), name
        # Khovanov (2000): χ = (q + 1/q) V at t^(1/2) = -q, the same as for the knot columns
        assert _euler_characteristic(groups) == _jones_at_minus_q(jones[name], True), name


def _closure_components(strands: int, word: tuple[int, ...]) -> list[list[int]]:
    """The positions at the top of the braid that each component of the closure passes."""
    permutation = list(range(strands))
    for generator in word:
        i = abs(generator) - 1
        permutation[i], permutation[i + 1] = permutation[i + 1], permutation[i]
    seen, cycles = set(), []
    for start in range(strands):
        if start not in seen:
            cycle, position = [], start
            while position not in seen:
                seen.add(position)
                cycle.append(position)
                position = permutation.index(position)
            cycles.append(cycle)
    return cycles


def _closure_linking_matrix(strands: int, word: tuple[int, ...]) -> list[list[int]]:
    """Linking numbers of the components of the braid closure (in the order of their first
    strand); a crossing +i is positive, the closure being oriented along the braid."""
    # follow which component occupies each position as the word is read
    component_of_start = {}
    for index, cycle in enumerate(_closure_components(strands, word)):
        for strand in cycle:
            component_of_start[strand] = index
    count = len(set(component_of_start.values()))
    at_position = [component_of_start[p] for p in range(strands)]
    doubled = [[0] * count for _ in range(count)]
    for generator in word:
        i = abs(generator) - 1
        a, b = at_position[i], at_position[i + 1]
        if a != b:
            sign = 1 if generator > 0 else -1
            doubled[a][b] += sign
            doubled[b][a] += sign
        at_position[i], at_position[i + 1] = b, a
    return [[value // 2 for value in row] for row in doubled]


def test_braid_closures_have_the_right_components_and_linking():
    for name, words in readings(KNOTS, "braid_notation").items():
        for strands, word in words:
            # KnotInfo column braid_notation: the closure of each word is a knot
            assert len(_closure_components(strands, word)) == 1, name
    linking = readings(LINKS, "linking_matrix")
    components = readings(LINKS, "components")
    other_orientation = []
    for name, words in readings(LINKS, "braid_notation").items():
        (strands, word), = words
        computed = _closure_linking_matrix(strands, word)
        table_matrix = [list(row) for row in linking[name]]
        # LinkInfo columns braid_notation, components: the closure has the link's components
        assert len(computed) == components[name] == len(table_matrix), name
        order = range(len(computed))
        if not any([[computed[p[i]][p[j]] for j in order] for i in order] == table_matrix
                   for p in itertools.permutations(order)):
            other_orientation.append(name)
    # LinkInfo columns braid_notation, linking_matrix: the closure oriented along the braid has
    # the linking numbers of that orientation, up to the order of the components, on every row
    # but one, whose braid has the linking numbers of L10n99{1,0,0} instead
    assert other_orientation == ["L10n99{0,0,0}"]


def test_linking_matrices_are_symmetric_with_zero_diagonal():
    for name, matrix in readings(LINKS, "linking_matrix").items():
        size = len(matrix)
        # common practice, no source: lk is symmetric; LinkInfo column linking_matrix
        assert all(matrix[i][j] == matrix[j][i] for i in range(size) for j in range(size)), name
        # common practice, no source: the diagonal of a linking matrix is 0
        assert all(matrix[i][i] == 0 for i in range(size)), name


def _signature(matrix: list[list[int]]) -> int:
    """Signature of a symmetric integer matrix, by exact congruence diagonalisation."""
    rows = [[Fraction(x) for x in row] for row in matrix]
    total = 0
    while rows:
        size = len(rows)
        pivot = next((k for k in range(size) if rows[k][k] != 0), None)
        if pivot is None:
            pair = next(((i, j) for i in range(size) for j in range(size) if rows[i][j]), None)
            if pair is None:
                break
            i, j = pair  # all diagonal entries are 0: adding row/column j to i makes 2*a_ij
            for c in range(size):
                rows[i][c] += rows[j][c]
            for r in range(size):
                rows[r][i] += rows[r][j]
            pivot = i
        value = rows[pivot][pivot]
        total += 1 if value > 0 else -1
        rest = [r for r in range(size) if r != pivot]
        rows = [[rows[r][c] - rows[r][pivot] * rows[pivot][c] / value for c in rest]
                for r in rest]
    return total


def _determinant(matrix: list[list[int]]) -> int:
    """Determinant by fraction-free (Bareiss) elimination."""
    rows, sign, previous = [list(row) for row in matrix], 1, 1
    size = len(rows)
    for k in range(size - 1):
        if rows[k][k] == 0:
            swap = next((r for r in range(k + 1, size) if rows[r][k]), None)
            if swap is None:
                return 0
            rows[k], rows[swap], sign = rows[swap], rows[k], -sign
        for i in range(k + 1, size):
            for j in range(k + 1, size):
                rows[i][j] = (rows[k][k] * rows[i][j] - rows[i][k] * rows[k][j]) // previous
        previous = rows[k][k]
    return sign * rows[-1][-1] if size else 1


@pytest.mark.parametrize("which, max_crossings", [(KNOTS, 10), (LINKS, 8)])
def test_seifert_matrices_give_signature_and_determinant(which, max_crossings):
    """A spread: the small diagrams (the elimination is cubic in Fractions)."""
    seifert = readings(which, "seifert_matrix")
    signature = readings(which, "signature")
    determinant = readings(which, "determinant")
    checked = 0
    for row in table(which):
        name = row["name"]
        if name not in seifert or int(row["crossing_number"]) > max_crossings:
            continue
        v = seifert[name]
        size = len(v)
        symmetrised = [[v[i][j] + v[j][i] for j in range(size)] for i in range(size)]
        # common practice, no source: σ = signature(V + V^T), det = |det(V + V^T)|; columns
        # seifert_matrix, signature, determinant
        assert _signature(symmetrised) == signature[name], name
        # common practice, no source: det = |det(V + V^T)|; column determinant
        assert abs(_determinant(symmetrised)) == determinant[name], name
        if which == KNOTS:
            # common practice, no source: a knot's Seifert matrix has det(V - V^T) = 1
            antisymmetrised = [[v[i][j] - v[j][i] for j in range(size)] for i in range(size)]
            assert _determinant(antisymmetrised) == 1, name
        checked += 1
    assert checked > 100


# --- rows checked by hand ----------------------------------------------------------------------

def _row(which: str, name: str) -> dict:
    return next(row for row in table(which) if row["name"] == name)


def test_trefoil_by_hand():
    row = _row(KNOTS, "3_1")
    # from memory: V(right-handed trefoil) = t + t^3 - t^4, Δ = 1 - t + t^2
    assert parse_laurent(row["jones_polynomial"], "t") == {1: 1, 3: 1, 4: -1}
    # from memory: Δ(3_1) = 1 - t + t^2
    assert parse_laurent(row["alexander_polynomial"], "t") == {0: 1, 1: -1, 2: 1}
    # from memory: Kh(3_1) = q + q^3 + t^2 q^5 + t^3 q^9 and a Z/2 at t^3 q^7
    assert parse_khovanov(row["khovanov_unreduced_integral_polynomial"]) == {
        (0, 1): {"free": 1, "torsion": {}},
        (0, 3): {"free": 1, "torsion": {}},
        (2, 5): {"free": 1, "torsion": {}},
        (3, 7): {"free": 0, "torsion": {2: 1}},
        (3, 9): {"free": 1, "torsion": {}},
    }
    # from memory: reduced Kh(3_1) = q^2 + t^2 q^6 + t^3 q^8
    assert set(parse_khovanov(row["khovanov_reduced_rational_polynomial"])) == {
        (0, 2), (2, 6), (3, 8)}
    # from memory: σ = -2, s = 2, det = 3
    assert [parse_int(row[c]) for c in ("signature", "rasmussen_invariant", "determinant")] == [
        -2, 2, 3]
    # from memory: g4(3_1) = 1
    assert parse_four_genus(row["smooth_four_genus"]) == 1
    # from memory: 3_1 is the closure of σ1^3
    assert parse_braid(row["braid_notation"]) == (2, (1, 1, 1))


def test_figure_eight_and_torus_knot_by_hand():
    figure_eight = _row(KNOTS, "4_1")
    # from memory: V(4_1) = t^-2 - t^-1 + 1 - t + t^2
    assert parse_laurent(figure_eight["jones_polynomial"], "t") == {
        -2: 1, -1: -1, 0: 1, 1: -1, 2: 1}
    # from memory: det(4_1) = 5, σ(4_1) = 0
    assert (parse_int(figure_eight["determinant"]), parse_int(figure_eight["signature"])) == (5, 0)
    torus = _row(KNOTS, "8_19")
    # from memory: 8_19 = T(3,4), V = t^3 + t^5 - t^8
    assert parse_laurent(torus["jones_polynomial"], "t") == {3: 1, 5: 1, 8: -1}
    # Rasmussen (2010): s(T(p,q)) = (p-1)(q-1) for positive torus knots
    assert parse_int(torus["rasmussen_invariant"]) == 6


def test_hopf_links_by_hand():
    positive, negative = _row(LINKS, "L2a1{1}"), _row(LINKS, "L2a1{0}")
    half = Fraction(1, 2)
    # from memory: V(positive Hopf link) = -t^(1/2) - t^(5/2); the mirror has t -> 1/t
    assert parse_linkinfo_jones(positive["jones_polynomial"]) == {half: -1, 5 * half: -1}
    # from memory: V(negative Hopf link) = -t^(-1/2) - t^(-5/2)
    assert parse_linkinfo_jones(negative["jones_polynomial"]) == {-half: -1, -5 * half: -1}
    # from memory: Kh(positive Hopf link) = 1 + q^2 + t^2 q^4 + t^2 q^6, in the units of Kh(3_1)
    assert parse_khovanov(positive["khovanov_polynomial"]) == {
        key: {"free": 1, "torsion": {}} for key in ((0, 0), (0, 2), (2, 4), (2, 6))}
    # from memory: mirroring turns (i, j) into (-i, -j) for this homology without torsion
    assert set(parse_khovanov(negative["khovanov_polynomial"])) == {
        (0, 0), (0, -2), (-2, -4), (-2, -6)}
    # from memory: lk = +1 and -1 for the two orientations
    assert (parse_matrix(positive["linking_matrix"]), parse_matrix(negative["linking_matrix"])) \
        == (((0, 1), (1, 0)), ((0, -1), (-1, 0)))
    # from memory: σ1^2 closes to the positive Hopf link
    assert parse_braid(positive["braid_notation"]) == (2, (1, 1))


# --- the readers on their own -------------------------------------------------------------------

def test_forms_that_the_columns_use():
    # common practice, no source: the usual meaning of the written forms
    assert parse_laurent("-2 + t^(-3) - 2/t^2 + 3*t", "t") == {-3: 1, -2: -2, 0: -2, 1: 3}
    assert parse_laurent("t^(-1/2)+ 2*t^(1/2)", "t") == {Fraction(-1, 2): 1, Fraction(1, 2): 2}
    assert parse_laurent("t - t", "t") == {}
    assert parse_laurent("", "t") is None and parse_khovanov("  ") is None
    two_variables = parse_laurent_polynomial("(2*q^2)/t + t^2/q + 1/(q*t^2)", ("q", "t"))
    assert two_variables == {(-1, -2): 1, (-1, 2): 1, (2, -1): 2}
    # terms the quick path does not take go to the general reader, with the usual precedence
    assert parse_laurent("2/t*t^3 + (t + 1)^2", "t") == {0: 1, 1: 2, 2: 3}
    assert parse_khovanov("2*q^(3)*T^(2)+ q^(3)*T^(4)+ 3*q^(3)") == {
        (0, 3): {"free": 3, "torsion": {2: 2, 4: 1}}}
    assert parse_braids("{4,{2, -3, 1)}") == [(4, (2, -3, 1))]
    assert parse_matrix("{}") == ()


@pytest.mark.parametrize("text, reader, message", [
    ("t^", _jones_in_t, "end"),
    ("2*z", _jones_in_t, "unknown variable 'z'"),
    ("1/(t + 1)", _jones_in_t, "monomial"),
    ("1/2*t", _jones_in_t, "not an integer"),
    ("t^(1/2)*q", parse_khovanov, "fractional degree"),
    ("-q", parse_khovanov, "not a rank"),
    ("q*T", parse_khovanov, "not a rank"),
    ("t 2", _jones_in_t, "unexpected"),
    ("[[1, 2], [3]]", parse_matrix, "different lengths"),
    ("[[1, 2}, [3, 4]]", parse_matrix, "closed by"),
    ("[1, 0, 2]", parse_braids, "nonzero"),
    ("{2, {1, 2}}", parse_braids, "does not fit 2 strands"),
    ("[1, 2", parse_braids, "unclosed"),
    ("[1,2,3", parse_four_genus_bounds, "range"),
])
def test_unreadable_text_is_refused_precisely(text, reader, message):
    with pytest.raises(ColumnTextError, match=message.replace("(", r"\(")) as caught:
        reader(text)
    assert isinstance(caught.value, MoviesError)


def test_quick_path_agrees_with_the_general_reader():
    """On a spread of every polynomial column, the per-term quick path and the general
    recursive-descent reader give the same polynomial."""
    cases = [(KNOTS, "jones_polynomial", ("t",)), (KNOTS, "alexander_polynomial", ("t",)),
             (KNOTS, "khovanov_unreduced_integral_polynomial", ("t", "q", "T")),
             (LINKS, "jones_polynomial", ("x",)), (LINKS, "khovanov_polynomial", ("q", "t"))]
    for which, column, variables in cases:
        for row in table(which)[::97]:
            text = row[column]
            if not text:
                continue
            slow = columns._ExpressionReader(text, variables).read_all()
            slow = {monomial: int(c) for monomial, c in slow.items() if c}
            assert parse_laurent_polynomial(text, variables) == slow, (row["name"], column)


_laurent = st.dictionaries(st.fractions(min_value=-30, max_value=30, max_denominator=2),
                           st.integers(-99, 99).filter(bool), max_size=8)


def _written_with_powers(polynomial):
    """Written as KnotInfo writes Khovanov terms: 3*t^(2)+ t^(-1/2)-t."""
    parts = []
    for exponent, coefficient in sorted(polynomial.items()):
        magnitude = "" if abs(coefficient) == 1 and exponent else f"{abs(coefficient)}"
        power = "" if exponent == 0 else ("t" if exponent == 1 else f"t^({exponent})")
        body = "*".join(part for part in (magnitude, power) if part)
        parts.append(("-" if coefficient < 0 else "+ ") + body)
    return "".join(parts).lstrip("+ ") or "0"


def _written_with_slashes(polynomial):
    """Written as the Jones columns write negative powers: 2/t^3 - t^(-1) + 5*t^2."""
    parts = []
    for exponent, coefficient in sorted(polynomial.items()):
        sign = " - " if coefficient < 0 else " + "
        if exponent < 0 and exponent.denominator == 1:
            body = f"{abs(coefficient)}/t^{-exponent}"
        elif exponent == 0:
            body = f"{abs(coefficient)}"
        else:
            body = f"{abs(coefficient)}*t^({exponent})"
        parts.append(sign + body)
    return "".join(parts) or "0"


@settings(max_examples=80, deadline=None)
@given(_laurent)
def test_written_polynomials_read_back(polynomial):
    # common practice, no source: writing a polynomial and reading it back gives it again
    assert parse_laurent(_written_with_powers(polynomial), "t") == polynomial
    assert parse_laurent(_written_with_slashes(polynomial), "t") == polynomial
