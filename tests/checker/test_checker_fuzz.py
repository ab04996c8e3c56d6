"""Random movies of well-formed statements with random names: the checker always gives a verdict."""

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from movies.checker.replay import check_movie
from movies.checker.result import VERDICT_MEANING
from movies.report.movie import as_json, as_text
from movies.language.movie import parse_movie

small = st.integers(min_value=1, max_value=9)
statements = st.one_of(
    st.builds(lambda a, b, f: f"band {a} {b} in face {f}", small, small, small),
    st.builds(lambda a, b: f"band {a} {b}", small, small),
    st.builds(lambda e, h, s: f"R1 add {e} {h} {s}", small, st.sampled_from(["left", "right"]), st.sampled_from("+-")),
    st.builds(lambda c: f"R1 remove {c}", small),
    st.builds(lambda a, b, f: f"R2 add {a} over {b} in face {f}", small, small, small),
    st.builds(lambda f: f"R2 remove face {f}", small),
    st.builds(lambda f: f"R3 face {f}", small),
    st.builds(lambda f: f"birth in face {f}", small),
    st.builds(lambda k: f"death {k}", small),
    st.just("simplify"),
    st.just("expect unlink"),
    st.builds(lambda n: f"expect components {n}", small),
    st.just("isotopic to unknot"),
    st.just("surface disk"),
)
starts = st.sampled_from(["unknot", "3_1", "L2a1{1}", "unlink(2)", "4_1 + unknot", "braid[1, -2, 1]"])


@settings(max_examples=200, deadline=None, derandomize=True, suppress_health_check=[HealthCheck.too_slow])
@given(starts, st.lists(statements, max_size=8))
def test_random_movies_always_get_a_verdict(start, steps):
    movie = parse_movie("\n".join([f"start {start}", "budget 1 seconds"] + steps))
    result = check_movie(movie, budget=0.2)
    assert result.verdict in VERDICT_MEANING
    data = as_json(result)
    assert data["verdict"] == result.verdict
    assert as_text(data, "fuzz").splitlines()[-1 - len(data["findings"]) - sum(bool(f["evidence"]) for f in data["findings"])].startswith("VERDICT")
    if result.verified:
        assert not result.findings
