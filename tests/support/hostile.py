"""Inputs built to break the readers: grammar-aware text with random numbers (huge ones too),
random nesting, unmatched brackets, and mutations of the bundled example movies.

Every generator takes a ``random.Random`` (or anything with its methods, such as the random
object hypothesis draws), so the tests and the benchmark share them.
"""

from __future__ import annotations

import random
from pathlib import Path

EXAMPLES = Path(__file__).resolve().parents[2] / "examples" / "movies"

TABLE_NAMES = ("3_1", "4_1", "5_2", "8_20", "10_165", "11a_1", "11n34", "K3_1", "13n_5110", "L2a1{1}",
               "L7a1{0}", "L4a1", "L11n459{0,1,1}", "0_1")
BAD_NAMES = ("3_99", "L7a1{5}", "L99a1", "12_1", "3_1x", "L2a1{0,0,0}", "99n_1")
WORDS = ("unknot", "empty", "unlink", "braid", "torus", "pd", "mirror", "reverse", "mirorr", "knot", "x")
PUNCTUATION = "()[]{},#+-% \n\t_"
#: characters outside the notation: accents, other digits, controls, a byte-order mark
EXOTIC = "é²٣\x00\r\ufeff\u2028→"
STATEMENT_WORDS = ("title", "start", "band", "R1", "R2", "R3", "birth", "death", "twist", "simplify",
                   "isotopic", "expect", "surface", "budget")


def number(rng: random.Random, signed: bool = False) -> str:
    """A number as text: mostly small, sometimes past every limit, now and then absurd."""
    pick = rng.random()
    if pick < 0.75:
        value = str(rng.randint(0, 9))
    elif pick < 0.85:
        value = str(rng.randint(10, 120))
    elif pick < 0.92:
        value = str(rng.choice([2000, 2001, 100_000_000, 1_000_000_000, 9223372036854775808, 10 ** 20]))
    elif pick < 0.98:
        value = str(rng.randint(10 ** 11, 10 ** 14))
    else:
        value = "9" * rng.choice([13, 4301, 5000])
    if rng.random() < 0.05:
        value = "000" + value
    if signed and rng.random() < 0.25:
        value = "-" + value
    return value


def braid_word(rng: random.Random) -> str:
    return ", ".join(number(rng, signed=True) for _ in range(rng.randint(0, 6)))


def pd_code(rng: random.Random) -> str:
    shapes = ["[[1,5,2,4],[3,1,4,6],[5,3,6,2]]", "[[1,1,2,2]]", "{{4, 1, 3, 2}, {2, 3, 1, 4}}"]
    if rng.random() < 0.5:
        return rng.choice(shapes)
    rows = [f"[{', '.join(number(rng) for _ in range(rng.choice([3, 4, 4, 4, 5])))}]"
            for _ in range(rng.randint(0, 4))]
    return "[" + ", ".join(rows) + "]"


def atom(rng: random.Random) -> str:
    pick = rng.randrange(10)
    if pick == 0:
        return rng.choice(BAD_NAMES)
    if pick <= 2:
        return rng.choice(TABLE_NAMES)
    if pick == 3:
        return rng.choice(("unknot", "empty"))
    if pick == 4:
        return f"unlink({number(rng, signed=True)})"
    if pick == 5:
        strands = f"({number(rng)})" if rng.random() < 0.4 else ""
        return f"braid{strands}[{braid_word(rng)}]"
    if pick == 6:
        return f"torus({number(rng, signed=True)}, {number(rng, signed=True)})"
    if pick == 7:
        return f"pd{pd_code(rng)}"
    return rng.choice(WORDS)


def spec(rng: random.Random, depth: int = 0) -> str:
    """A diagram in the notation, nested up to a few levels (sometimes very deep)."""
    if depth > 3 or rng.random() < 0.4:
        return atom(rng)
    pick = rng.randrange(9)
    if pick == 0:
        return f"mirror({spec(rng, depth + 1)})"
    if pick == 1:
        numbers = "".join(f", {number(rng)}" for _ in range(rng.randint(0, 2)))
        return f"reverse({spec(rng, depth + 1)}{numbers})"
    if pick == 2:
        return f"({spec(rng, depth + 1)})"
    if pick == 3:
        places = f"({number(rng)}, {number(rng)})" if rng.random() < 0.3 else ""
        return f"{spec(rng, depth + 1)} #{places} {spec(rng, depth + 1)}"
    if pick == 4:
        places = f"({number(rng)}, {number(rng)})" if rng.random() < 0.3 else ""
        return f"{spec(rng, depth + 1)} +{places} {spec(rng, depth + 1)}"
    if pick == 5:
        deep = rng.choice([50, 101, 500, 3000])
        word = rng.choice(["mirror(", "(", "reverse(", "[", "pd["])
        closed = rng.random() < 0.5
        return word * deep + atom(rng) + (")" * deep if closed else "")
    if pick == 6:
        return " # ".join(rng.choice(TABLE_NAMES[:6]) for _ in range(rng.choice([2, 5, 102, 150])))
    if pick == 7:
        return mangle(rng, spec(rng, depth + 1))
    return f"{spec(rng, depth + 1)} {spec(rng, depth + 1)}"


def mangle(rng: random.Random, text: str) -> str:
    """``text`` with a few random edits: characters deleted, inserted or doubled, a cut, a huge number."""
    for _ in range(rng.randint(1, 3)):
        spot = rng.randint(0, len(text))
        pick = rng.randrange(7)
        if pick == 0 and text:
            text = text[:spot] + text[spot + 1:]
        elif pick == 1:
            text = text[:spot] + rng.choice(PUNCTUATION if rng.random() < 0.8 else EXOTIC) + text[spot:]
        elif pick == 2:
            text = text[:spot] + rng.choice(PUNCTUATION[:6]) * rng.choice([1, 2, 200, 20000]) + text[spot:]
        elif pick == 3:
            text = text[:spot]
        elif pick == 4:
            text = text[:spot] + number(rng) + text[spot:]
        elif pick == 5:
            text = text[:spot] + rng.choice(WORDS + STATEMENT_WORDS) + " " + text[spot:]
        else:
            end = min(len(text), spot + rng.randint(1, 20))
            text = text[:end] + text[spot:end] + text[end:]
    return text


def statement(rng: random.Random) -> str:
    """One statement built from the movie grammar's words, with random numbers."""
    n = lambda: number(rng)  # noqa: E731
    names = f" new edges {n()} {n()}, faces {n()}" if rng.random() < 0.1 else ""
    choices = [
        lambda: f"band {n()} {n()}" + (f" in face {n()}" if rng.random() < 0.6 else "") + names,
        lambda: f"R1 add {n()} {rng.choice(['left', 'right', 'L', 'R', 'up'])} {rng.choice('+-')}" + names,
        lambda: f"R1 remove {n()}" + (f" kink {n()}" if rng.random() < 0.3 else ""),
        lambda: f"R2 add {n()} over {n()} in face {n()}" + names,
        lambda: f"R2 remove face {n()}",
        lambda: f"R3 face {n()}" + names,
        lambda: f"birth {rng.choice(['', 'cw ', 'ccw '])}in face {n()}" + names,
        lambda: f"death {n()}",
        lambda: f"twist {rng.choice(['+1', '-1'])} across {' '.join(n() for _ in range(rng.randint(1, 4)))}"
                + (f" from face {n()}" if rng.random() < 0.3 else ""),
        lambda: "simplify" + rng.choice(["", " to crossingless", f" to {n()} crossings", f" to {spec(rng, 2)}"]),
        lambda: f"isotopic to {spec(rng, 2)}",
        lambda: f"expect {rng.choice(['components', 'crossings'])} {n()}",
        lambda: f"expect {rng.choice(['crossingless', 'unlink'])}",
        lambda: f"expect isotopic to {spec(rng, 2)}",
        lambda: f"expect {rng.choice(['signature', 'writhe', 'determinant'])} {number(rng, signed=True)}",
        lambda: f"expect {rng.choice(['jones', 'alexander'])} t^{number(rng, signed=True)} - {n()}*t^(-{n()}) + {n()}",
        lambda: "surface " + ", ".join(rng.choice(["disk", "connected", "ribbon", "orientable", f"genus {n()}",
                                                   f"euler {number(rng, signed=True)}", f"components {n()}"])
                                       for _ in range(rng.randint(1, 3))),
        lambda: f"budget {number(rng, signed=True)} {rng.choice(['seconds', '', 'minutes'])}",
        lambda: f"title {mangle(rng, 'a movie')}",
    ]
    return rng.choice(choices)()


def movie(rng: random.Random) -> str:
    """A movie of grammar-built statements; now and then one edited at random."""
    lines = [f"start {spec(rng, 2)}"] + [statement(rng) for _ in range(rng.randint(0, 6))]
    if rng.random() < 0.2:
        lines.insert(0, statement(rng))
    text = "\n".join(lines)
    return mangle(rng, text) if rng.random() < 0.3 else text


def plausible_movie(rng: random.Random) -> str:
    """A well-formed movie on a small diagram with small names, so that many steps apply and
    the checker, not only the reader, has work to do."""
    small = lambda: str(rng.randint(1, 12))  # noqa: E731
    start = rng.choice(["unknot", "3_1", "4_1", "L2a1{1}", "unlink(2)", "3_1 # mirror(3_1)", "braid[1, -2, 1]",
                        "5_1", "torus(2, 4)"])
    steps = [
        lambda: f"band {small()} {small()}" + (f" in face {small()}" if rng.random() < 0.5 else ""),
        lambda: f"R1 add {small()} {rng.choice(['left', 'right'])} {rng.choice('+-')}",
        lambda: f"R1 remove {small()}",
        lambda: f"R2 add {small()} over {small()} in face {small()}",
        lambda: f"R2 remove face {small()}",
        lambda: f"R3 face {small()}",
        lambda: f"birth in face {small()}",
        lambda: f"death {small()}",
        lambda: f"twist {rng.choice(['+1', '-1'])} across {small()} {small()}",
        lambda: rng.choice(["simplify", "simplify to crossingless", "expect unlink", "isotopic to unknot",
                            f"expect crossings {small()}", "expect signature 0", "expect jones 1",
                            "surface disk", "surface orientable, genus 1"]),
    ]
    return "\n".join([f"start {start}"] + [rng.choice(steps)() for _ in range(rng.randint(1, 8))])


def example_texts() -> list[str]:
    """The bundled example movies."""
    return [path.read_text(encoding="utf-8") for path in sorted(EXAMPLES.glob("*.movie"))]


def mutated_example(rng: random.Random, examples: list[str]) -> str:
    """A bundled example movie with lines dropped, doubled, swapped or replaced, and edits."""
    lines = rng.choice(examples).split("\n")
    for _ in range(rng.randint(1, 4)):
        spot = rng.randrange(len(lines))
        pick = rng.randrange(5)
        if pick == 0 and len(lines) > 1:
            del lines[spot]
        elif pick == 1:
            lines.insert(spot, lines[spot])
        elif pick == 2:
            other = rng.randrange(len(lines))
            lines[spot], lines[other] = lines[other], lines[spot]
        elif pick == 3:
            lines[spot] = statement(rng)
        else:
            lines[spot] = mangle(rng, lines[spot])
    return "\n".join(lines)


def small_limits(rng: random.Random) -> list[str]:
    """``--limit`` options that keep each run of the command line cheap (and sometimes odd)."""
    options = ["--limit", f"crossings={rng.choice([8, 12, 16])}", "--limit", "components=8"]
    if rng.random() < 0.1:
        options += ["--limit", rng.choice(["digits=3", "depth=2", "lines=3", "seconds=1", "size=3", "crossings=x",
                                           "crossings=0", "digits=" + "9" * 30])]
    return options


def argv(rng: random.Random, movie_file: str, output: str) -> list[str]:
    """Arguments for the command line: a cheap command with hostile options and diagrams.

    ``movie_file`` is a path the caller has written a movie to; ``output`` a path for drawings.
    """
    pick = rng.randrange(10)
    if pick <= 2:
        args = ["check", movie_file, "--budget", rng.choice(["0.1", "0", "nan", "-1", "inf", "1e3", "0.1", number(rng)])]
        args += rng.choice([[], ["--json"]])
    elif pick == 3:
        args = ["frames", movie_file, "--budget", "0.1"] + (["--at", number(rng, signed=True)] if rng.random() < 0.5 else [])
    elif pick == 4:
        args = ["invariants", rng.choice(TABLE_NAMES[:3] + ("unknot", "torus(2, 3)")), "--field",
                rng.choice(["F3", "F4", "F" + number(rng), "Q", "Z", "F", "x", "F²", "f5"])]
    elif pick <= 7:
        args = ["invariants", "--classical"]
        kind = rng.randrange(6)
        if kind <= 1:
            args.append(spec(rng, 1))
        elif kind == 2:
            args += ["--pd", rng.choice([pd_code(rng), "[" * rng.choice([5, 101, 3000]), "[[1, 2", '["a"]', "[1e999]"])]
        elif kind == 3:
            args += ["--braid", "[" + braid_word(rng) + "]"]
            if rng.random() < 0.5:
                args += ["--strands", number(rng, signed=True)]
        elif kind == 4:
            args += [spec(rng, 1), "--json"]
        else:
            with open(movie_file, "w", encoding="utf-8") as handle:
                handle.write(f"% a diagram\n{spec(rng, 1)}\n")
            args += ["--file", movie_file]
    elif pick == 8:
        args = ["bounds", rng.choice(TABLE_NAMES[:4] + BAD_NAMES[:2] + ("unknot", "unlink(2)"))]
        args += rng.choice([[], ["--genus", number(rng, signed=True)], ["--blowups", number(rng, signed=True)],
                            ["--blowups", "2", "--class", f"{number(rng, signed=True)},{number(rng)}"],
                            ["--to", rng.choice(["empty", "unknot", spec(rng, 3)]), "--components", number(rng)]])
        return args + small_limits(rng) + ["--limit", "crossings=6"]
    else:
        args = ["draw", spec(rng, 3), "-o", output]
    return args + small_limits(rng)
