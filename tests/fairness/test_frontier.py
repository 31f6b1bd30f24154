"""The frontier of schedule options against a brute-force Pareto filter (hypothesis).

Source of the definition: Pareto dominance as in M. Ehrgott, *Multicriteria Optimization*,
Springer 2005, ch. 2 (more perfect pairs better, fewer breaks better, lower carry-over better).
The brute force below compares every option with every other one, independently of the sorted
sweep of :func:`scheduler.fairness.frontier.frontier`.
"""

from __future__ import annotations

from hypothesis import given, settings
from hypothesis import strategies as st

from scheduler.fairness.frontier import ScheduleOption, dominates, frontier

figures = st.tuples(st.integers(0, 6), st.integers(0, 6), st.integers(0, 6))


def _brute(options):
    def beats(a, b):
        ge = a[0] >= b[0] and a[1] <= b[1] and a[2] <= b[2]
        return ge and a != b

    keep = set()
    for o in options:
        if not any(beats(p.figures(), o.figures()) for p in options):
            keep.add(o.figures())
    return keep


@settings(max_examples=300, deadline=None)
@given(st.lists(figures, max_size=25))
def test_frontier_matches_brute_force(rows):
    options = [ScheduleOption(f"option {k}", *row) for k, row in enumerate(rows)]
    got = frontier(options)
    assert {o.figures() for o in got} == _brute(options)
    # no two kept options share their figures, and none dominates another
    assert len({o.figures() for o in got}) == len(got)
    assert not any(dominates(a, b) for a in got for b in got)
    # sorted: most perfect pairs first
    assert [o.perfect_pairs for o in got] == sorted((o.perfect_pairs for o in got), reverse=True)


def test_small_example():
    perfect = ScheduleOption("perfect", 105, 20, 2000)
    circle = ScheduleOption("circle", 60, 14, 2580)
    low = ScheduleOption("low carry-over", 40, 30, 240)
    worse = ScheduleOption("worse", 60, 16, 2580)
    assert frontier([worse, low, circle, perfect]) == (perfect, circle, low)
    assert frontier([]) == ()
