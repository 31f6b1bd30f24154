"""Clashes are explained by a minimal set of rules, in the league's words; rules that are
switched off are never named; the calendar is blamed where it alone is the cause; other
factorizations are tried before a clash is reported."""

from __future__ import annotations

import itertools
import random
from datetime import date

import pytest

import scheduler.plan as plan_module
from scheduler.balance.explain import quickxplain
from scheduler.config.model import CalendarSpec, Rules, Venue
from scheduler.errors import InfeasibleError
from scheduler.plan import PlanOption, plan_season

from .helpers import league


def _clash(lg) -> InfeasibleError:
    with pytest.raises(InfeasibleError) as info:
        plan_season(lg, time_limit=4)
    return info.value


@pytest.mark.parametrize("seed", range(40))
def test_quickxplain_returns_a_minimal_clash(seed):
    """Against brute force over all subsets (Junker 2004, from memory: the result is a minimal
    conflict): random monotone 'clash' predicates given by a few minimal sets."""
    rng = random.Random(seed)
    size = rng.randint(1, 9)
    minimal_sets = [frozenset(rng.sample(range(size), rng.randint(1, min(3, size))))
                    for _ in range(rng.randint(1, 3))]

    def clashes(subset):
        return any(m <= set(subset) for m in minimal_sets)

    found = quickxplain(list(range(size)), clashes)
    assert clashes(found)
    for drop in found:  # minimal: dropping any one element removes the clash
        assert not clashes([x for x in found if x != drop])
    # and no smaller clashing subset is contained in it (brute force)
    for k in range(len(found)):
        assert not any(clashes(c) for c in itertools.combinations(found, k))


def test_rest_days_longer_than_the_calendar_allows_blame_the_calendar():
    """Saturdays only: at most 6 free days between consecutive match days, so 8 rest days cannot
    hold in consecutive Saturdays whatever the pairings; said before any solving."""
    lg = league(6, rules=Rules(min_rest_days=8),
                calendar=CalendarSpec(start=date(2027, 1, 2), weekdays=(5,)))
    error = _clash(lg)
    assert len(error.conflicts) == 1
    text = error.conflicts[0]
    assert text.startswith("min_rest_days = 8")
    assert "Saturdays" in text and "6 free days" in text and "not the pairings" in text
    assert "calendar" in str(error) and "round pairings" not in str(error)


def test_a_rule_that_is_off_is_never_named():
    """min_rest_days = 0 (one round a day) and min_separation = 0 hold by construction."""
    lg = league(6, rules=Rules(max_home_run=1, max_away_run=1, min_rest_days=0,
                               min_separation=0),
                calendar=CalendarSpec(start=date(2027, 1, 2), weekdays=(5,)))
    error = _clash(lg)
    assert error.conflicts
    assert not any("min_rest_days" in c or "min_separation" in c for c in error.conflicts)


def test_the_smallest_relaxation_is_offered():
    error = _clash(league(8, rules=Rules(max_home_run=1, max_away_run=3)))
    assert error.conflicts == ["max_home_run = 1 for every team"]
    assert "max_home_run = 2" in str(error)


def test_other_factorizations_are_tried_before_a_clash(monkeypatch):
    """The first candidates are made to clash; the plan must go on to another factorization."""
    real = plan_module.solve_timetable
    tried = []

    def only_anderson(league_, fact, limits, **kwargs):
        tried.append(fact.method)
        if "Anderson" not in fact.method:
            raise InfeasibleError("clash", ["a rule"])
        return real(league_, fact, limits, **kwargs)

    monkeypatch.setattr(plan_module, "solve_timetable", only_anderson)
    hall = Venue("Big Hall", courts=tuple(f"Court {i}" for i in range(1, 8)))
    # GK_14 comes first; 14 = 2 x 7, so Anderson's GA_14 exists
    result = plan_season(league(14, venues=(hall,)), time_limit=4)
    assert any("Anderson" in m for m in tried)
    assert len(tried) >= 2
    chosen = next(o for o in result.options if o.chosen)
    assert "Anderson" in chosen.method
    assert any("no timetable keeps every rule" in note for note in result.notes)
    for option in result.options:
        assert "None" not in option.figures()


def test_a_clash_with_every_factorization_says_what_was_tried(monkeypatch):
    def never(league_, fact, limits, **kwargs):
        raise InfeasibleError("the league's rules cannot all hold", ["a rule"])

    monkeypatch.setattr(plan_module, "solve_timetable", never)
    error = _clash(league(10))
    assert "tried the round pairings of" in str(error)
    assert error.conflicts == ["a rule"]


def test_option_figures_never_print_none():
    option = PlanOption("best mixing", "x", 3, 3, None, 12, None, False, False)
    assert "None" not in option.figures()
    assert "no timetable" in option.figures()


def test_each_rule_words_its_own_one_step_relaxations():
    """The steps (``lowered``) and the clash wording (``relaxation``) come from one place: each
    statement of a switched-on rule gets exactly its field's step; a rule that is off offers
    none (a run one longer, one rest day, break-free round or match day fewer)."""
    from scheduler.rules import RULES

    lg = league(8, rules=Rules(max_home_run=2, max_away_run=3, min_rest_days=2,
                               no_breaks_first=1, no_breaks_last=2, min_separation=3))
    steps = [step for rule in RULES for step in rule.lowered(lg)]
    assert sorted(steps) == [("max_away_run", 4), ("max_home_run", 3), ("min_rest_days", 1),
                             ("min_separation", 2), ("no_breaks_first", 0),
                             ("no_breaks_last", 1)]
    for rule in RULES:
        for name, value in rule.lowered(lg):
            assert rule.relaxation(lg, f"{name} = 7 for every team") == f"{name} = {value}"
        assert rule.relaxation(lg, "some other statement") is None
    plain = league(8)
    assert all(not rule.lowered(plain) for rule in RULES)
