"""Looking knots and links up by table name, and the facts the module states about the PD codes."""

from __future__ import annotations

import collections
import dataclasses
import functools
import re

import pytest
from database_knotinfo import link_list

from movies.diagram import tables
from movies.diagram.tables import TableEntry, lookup, table_names, table_row
from movies.errors import InputError, MoviesError, TableError
from support.knotinfo_columns import parse_matrix


@functools.cache
def package_rows(links: bool) -> tuple[dict, ...]:
    """The rows as the package's own reader gives them, without the row of column titles."""
    return tuple(link_list(proper_links=links)[1:])


# --- spellings -----------------------------------------------------------------------------------

@pytest.mark.parametrize("spelling, canonical", [
    ("3_1", "3_1"), ("K3_1", "3_1"), ("k3_1", "3_1"), ("  3_1 ", "3_1"), ("0_1", "0_1"),
    ("8_20", "8_20"), ("10_165", "10_165"),
    ("11a_1", "11a_1"), ("11a1", "11a_1"), ("K11a1", "11a_1"), ("K11a_1", "11a_1"),
    ("11A1", "11a_1"), ("12n_123", "12n_123"), ("12N123", "12n_123"),
    ("13n_5110", "13n_5110"), ("K13n5110", "13n_5110"),
    ("L7a1{0}", "L7a1{0}"), ("L7a1{1}", "L7a1{1}"), ("L7a1", "L7a1{0}"), ("l7a1", "L7a1{0}"),
    ("L7a_1{1}", "L7a1{1}"), ("L11n459{0,1,1}", "L11n459{0,1,1}"),
    ("L11n459{0, 1, 1}", "L11n459{0,1,1}"), ("L11n459", "L11n459{0,0,0}"),
    ("L2a1", "L2a1{0}"),
])
def test_every_accepted_spelling_finds_the_canonical_name(spelling, canonical):
    entry = lookup(spelling)
    assert entry.name == canonical
    assert tables.canonical_name(spelling) == canonical
    assert table_row(spelling)["name"] == canonical


def test_knot_entry_is_the_table_row():
    entry = lookup("3_1")
    # KnotInfo column pd_notation: [[1,5,2,4],[3,1,4,6],[5,3,6,2]]
    assert entry == TableEntry("3_1", "knot", ((1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)), 1, 3)
    assert entry.orientation is None and entry.unoriented_name is None
    # KnotInfo column pd_notation: blank for the unknot
    assert lookup("0_1") == TableEntry("0_1", "knot", (), 1, 0)
    with pytest.raises(dataclasses.FrozenInstanceError):
        entry.name = "4_1"  # type: ignore[misc]


def test_link_entry_carries_its_orientation():
    negative, positive = lookup("L2a1{0}"), lookup("L2a1{1}")
    # LinkInfo column pd_notation_vector: {{4, 1, 3, 2}, {2, 3, 1, 4}} and {{4, 2, 3, 1}, ...}
    assert (negative.pd, positive.pd) == (((4, 1, 3, 2), (2, 3, 1, 4)),
                                          ((4, 2, 3, 1), (2, 4, 1, 3)))
    # LinkInfo columns components, crossing_number of L2a1{0}
    assert (negative.kind, negative.components, negative.crossing_number) == ("link", 2, 2)
    # LinkInfo columns orientation, name_unoriented of L2a1{0}
    assert (negative.orientation, negative.unoriented_name) == ("{0}", "L2a1")
    big = lookup("L11n459{1,0,1}")
    # LinkInfo columns components, crossing_number, orientation, name_unoriented
    assert (big.components, big.crossing_number, big.orientation, big.unoriented_name) == (
        4, 11, "{1,0,1}", "L11n459")


def test_a_name_without_braces_is_the_first_listed_orientation():
    for unoriented in ("L7a1", "L8n3", "L10a140", "L11n459"):
        first = next(row["name"] for row in package_rows(True)
                     if row["name_unoriented"] == unoriented)
        # LinkInfo column name: the first row of each link
        assert lookup(unoriented).name == first
        # LinkInfo column orientation: the first listed is {0}, {0,0}, ...
        assert re.fullmatch(r"\{0(,0)*\}", lookup(unoriented).orientation)


# --- names the tables do not have ----------------------------------------------------------------

@pytest.mark.parametrize("name, message", [
    ("5a1", "Dowker–Thistlethwaite numbering 5a_1 is the knot 5_2"),
    ("K10a1", "classical names such as 10_1"),
    ("11_3", "named 11a_3 or 11n_3"),
    ("11a_400", "run from 11a_1 to 11a_367"),
    ("14a_1", "stops at 13 crossings"),
    ("1_1", "no knots with 1 crossing"),
    ("L12a1", "stops at 11 crossings"),
    ("L3a1", "no links with 3 crossings"),
    ("L7a99", "run from L7a1 to L7a7"),
    ("L7a1{2}", "L7a1 has no orientation {2}; the table lists {0}, {1}"),
    ("L11n459{0,1}", "the table lists {0,0,0}, {1,0,0}"),
    ("3-1", "did you mean 3_1"),
    ("L7x1", "did you mean L7n1, L7a1"),
    ("trefoil", "expected a knot name such as 3_1"),
    ("", "no knot or link named ''"),
])
def test_unknown_names_say_what_is_wrong(name, message):
    with pytest.raises(TableError) as caught:
        lookup(name)
    assert message in str(caught.value)
    assert isinstance(caught.value, MoviesError)
    with pytest.raises(TableError):
        table_row(name)


def test_names_must_be_text_and_kinds_must_exist():
    with pytest.raises(TableError, match="must be text"):
        lookup(31)  # type: ignore[arg-type]
    with pytest.raises(InputError, match="kind must be"):
        table_names("knots")


# --- the tables as a whole -----------------------------------------------------------------------

def test_names_come_in_table_order():
    knots, links = table_names("knot"), table_names("link")
    # the package's own reader (database_knotinfo.link_list), row order
    assert (knots, links) == ([row["name"] for row in package_rows(False)],
                              [row["name"] for row in package_rows(True)])
    assert table_names() == knots + links
    assert table_names("knot", max_crossings=4) == ["0_1", "3_1", "4_1"]
    assert table_names(max_crossings=3) == ["0_1", "3_1", "L2a1{0}", "L2a1{1}"]


def test_knot_counts_by_crossing_number():
    counts = collections.Counter(lookup(name).crossing_number for name in table_names("knot"))
    # from memory: prime knots up to mirror image, by crossing number
    assert counts == {0: 1, 3: 1, 4: 1, 5: 2, 6: 3, 7: 7, 8: 21, 9: 49, 10: 165, 11: 552,
                      12: 2176, 13: 9988}
    families = collections.Counter(re.fullmatch(r"(\d+[an])_\d+", name).group(1)
                                   for name in table_names("knot") if "a" in name or "n" in name)
    # from memory: alternating and non-alternating knots of 11, 12, 13 crossings
    assert families == {"11a": 367, "11n": 185, "12a": 1288, "12n": 888, "13a": 4878,
                        "13n": 5110}


def test_link_counts_by_crossing_number():
    entries = [lookup(name) for name in table_names("link")]
    links = {entry.unoriented_name: entry for entry in entries}
    by_size = collections.Counter((e.crossing_number, e.components) for e in links.values())
    up_to_nine = {key: count for key, count in by_size.items() if key[0] <= 9}
    # from memory: Rolfsen's table of links, 2^2_1 ... 9^4_1
    assert up_to_nine == {(2, 2): 1, (4, 2): 1, (5, 2): 1, (6, 2): 3, (6, 3): 3, (7, 2): 8,
                          (7, 3): 1, (8, 2): 16, (8, 3): 10, (8, 4): 3, (9, 2): 61,
                          (9, 3): 21, (9, 4): 1}
    by_crossings = collections.Counter(e.crossing_number for e in links.values())
    # no source: the counts this version of the LinkInfo table ships, pinned
    assert (by_crossings[10], by_crossings[11]) == (287, 1007)
    orientations = collections.Counter(e.unoriented_name for e in entries)
    # LinkInfo column orientation: every orientation up to reversing the whole link is listed
    assert all(orientations[name] == 2 ** (entry.components - 1)
               for name, entry in links.items())
    # LinkInfo: 4188 rows in this version of the table
    assert len(entries) == 4188


def test_lookup_agrees_with_the_package_rows():
    """A spread of rows: every field of the entry against the package's own reading."""
    for links in (False, True):
        for index, row in enumerate(package_rows(links)[::13]):
            entry = lookup(row["name"])
            pd_text = row["pd_notation_vector" if links else "pd_notation"]
            labels = [int(x) for x in re.findall(r"-?\d+", pd_text)]
            # the package's own reader: columns name, pd_notation(_vector), crossing_number, ...
            assert ([label for crossing in entry.pd for label in crossing],
                    entry.crossing_number) == (labels, int(row["crossing_number"]))
            if links:
                # the package's own reader: columns components, orientation, name_unoriented
                assert (entry.components, entry.orientation, entry.unoriented_name) == (
                    int(row["components"]), row["orientation"], row["name_unoriented"])
            # the package's own reader, every column
            if index % 7 == 0:
                # the package's own reader: the whole row
                assert table_row(row["name"]) == row


def test_the_files_are_read_once(monkeypatch):
    lookup("3_1"), lookup("L2a1")  # both tables indexed

    def no_more_reading(*args, **kwargs):
        raise AssertionError("a lookup read the table file again")

    monkeypatch.setattr(tables, "open", no_more_reading, raising=False)

    # KnotInfo column crossing_number of 13n_5110; LinkInfo column components of L11a1{1}
    assert (lookup("13n_5110").crossing_number, lookup("L11a1{1}").components) == (13, 2)
    assert lookup("K3_1") is lookup("3_1")


# --- the facts about the PD codes that the module docstring states -------------------------------

def _walk_components(pd):
    """Orient every edge from the under-crossings: {label: (crossing, slot) where it ends} and
    the components as lists of labels in the order walked. A component that never passes under
    is not reached."""
    slots = collections.defaultdict(list)
    for crossing, labels in enumerate(pd):
        for slot, label in enumerate(labels):
            slots[label].append((crossing, slot))
    assert all(len(ends) == 2 for ends in slots.values())
    ends_at, walked = {}, []
    for crossing, labels in enumerate(pd):
        if labels[0] in ends_at:
            continue
        component, place = [], (crossing, 0)  # an incoming under-strand ends here
        while pd[place[0]][place[1]] not in ends_at:
            label = pd[place[0]][place[1]]
            ends_at[label] = place
            component.append(label)
            leaving = (place[0], (place[1] + 2) % 4)
            first, second = slots[pd[leaving[0]][leaving[1]]]
            place = second if first == leaving else first
        walked.append(component)
    return ends_at, walked, set(slots)


def _pd_facts(pd):
    """(all labels reached from under-crossings, each component labelled consecutively along
    its orientation, the components) for one PD code."""
    ends_at, walked, labels = _walk_components(pd)
    consecutive = True
    for component in walked:
        low, high = min(component), max(component)
        start = component.index(low)
        consecutive &= component[start:] + component[:start] == list(range(low, high + 1))
    return set(ends_at) == labels, consecutive, walked, ends_at


def _linking_matrix(pd, walked, ends_at):
    order = sorted(range(len(walked)), key=lambda k: min(walked[k]))
    component_of = {label: order.index(k) for k, comp in enumerate(walked) for label in comp}
    doubled = [[0] * len(walked) for _ in walked]
    for crossing, (a, b, c, d) in enumerate(pd):
        # the crossing is positive when the over-strand runs d -> b
        sign = 1 if ends_at[d] == (crossing, 3) else -1
        i, j = component_of[a], component_of[b]
        if i != j:
            doubled[i][j] += sign
            doubled[j][i] += sign
    return tuple(tuple(x // 2 for x in row) for row in doubled)


def test_every_table_pd_is_labelled_along_its_orientation():
    counts = collections.Counter()
    for name in table_names():
        entry = lookup(name)
        if not entry.pd:
            continue
        all_under, consecutive, walked, ends_at = _pd_facts(entry.pd)
        counts["diagrams"] += 1
        counts["components"] += len(walked)
        counts["every component passes under"] += all_under
        counts["labels follow the orientation"] += consecutive
        counts["two-edge components"] += sum(len(component) == 2 for component in walked)
        if entry.kind == "link" and all_under:
            # LinkInfo column linking_matrix, components in the order of their smallest label
            counts["linking matrix agrees"] += (_linking_matrix(entry.pd, walked, ends_at)
                                                == parse_matrix(_linking_texts()[name]))
    # the counts the module docstring of movies.diagram.tables reports
    assert counts == {"diagrams": 12965 + 4188, "components": 12965 + 11408,
                      "every component passes under": 12965 + 4188,
                      "labels follow the orientation": 12965 + 4188,
                      "two-edge components": 4, "linking matrix agrees": 4188}


@functools.cache
def _linking_texts() -> dict[str, str]:
    return {row["name"]: row["linking_matrix"] for row in package_rows(True)}
