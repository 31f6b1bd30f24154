"""plan_season end to end: a complete Season, the options considered, determinism, progress."""

from __future__ import annotations

import re
from datetime import date, time

import pytest

from scheduler import leg_schemes
from scheduler.config.model import CalendarSpec, Priorities, Rules, Venue
from scheduler.factorization.anderson import anderson_factorization
from scheduler.factorization.circle import circle_factorization
from scheduler.factorization.verify import verify_rounds
from scheduler.plan import PlanResult, _Candidate, _choose, plan_season, revision

from .helpers import league
from .rule_checker import check_season


def test_season_is_complete():
    hall = Venue("Riverside Hall", courts=("Court A", "Court B"), slots=(time(19, 0),
                                                                          time(20, 15)))
    lg = league(7, legs=2, venues=(hall,), rules=Rules(max_home_run=2),
                calendar=CalendarSpec(start=date(2027, 9, 7), weekdays=(1,)))
    stages = []
    result = plan_season(lg, seed=3, progress=lambda s, f: stages.append((s, f)))
    assert isinstance(result, PlanResult)
    s = result.season
    assert s.league == "Test League" and s.season_id == "2027"
    assert s.teams == lg.team_names and s.legs == 2 and s.scheme == "mirrored"
    assert s.timezone == "Europe/London" and s.venues == ("Riverside Hall",)
    assert s.seed == 3 and re.fullmatch(r"[0-9a-f]{12}", s.revision)
    assert s.revision == revision(lg, 3, s.fixtures, s.byes) != revision(lg, 4, s.fixtures, s.byes)
    assert s.rounds == 14 and len(s.fixtures) == 2 * 21
    assert all(len(b) == 1 for b in s.byes.values()) and len(s.byes) == 14
    for f in s.fixtures:
        assert f.leg == (1 if f.round <= 7 else 2)
        assert f.venue == "Riverside Hall" and f.court in hall.courts
        assert f.slot in ("19:00", "20:15")
        assert f.start.tzinfo is not None and f.start.date() == f.date
        assert f.start.strftime("%H:%M") == f.slot
        assert f.date.weekday() == 1
    assert s.mixing is not None and s.mixing.pairs == 21  # C(7, 2) pairs of the 7 rounds of K_8
    assert check_season(lg, s) == []
    names = [st for st, _ in stages]
    for stage in ("factorize", "timetable", "places", "dates"):
        assert stage in names
    fractions = [f for _, f in stages]
    assert fractions == sorted(fractions) and fractions[-1] == 1.0
    assert result.status in ("optimal", "feasible")
    assert sum(o.chosen for o in result.options) == 1


def test_same_league_and_seed_give_identical_seasons():
    # the determinism promise: fixed CP-SAT seed, one worker, deterministic time limit
    lg = league(8, legs=2, rules=Rules(max_home_run=2, max_away_run=2, no_breaks_first=1),
                calendar=CalendarSpec(start=date(2027, 1, 2), end=date(2027, 6, 30)))
    a = plan_season(lg, time_limit=3)
    b = plan_season(lg, time_limit=3)
    assert a.season == b.season
    assert a.options == b.options and a.notes == b.notes


def test_seed_defaults_to_league_seed():
    lg = league(6, seed=11)
    assert plan_season(lg, time_limit=2).season.seed == 11


def _cands(n: int):
    perfect = anderson_factorization(n)
    gk = circle_factorization(n)
    return perfect, gk


def test_perfect_mixing_against_fewest_breaks_is_reported():
    # One-factorizations.md §7: for n = 10 (9 not prime) GK_10 is not perfect (27/36 perfect
    # pairs, Kotzig 1964: gcd condition), while Anderson's GA_10 is perfect (Anderson 1973);
    # GK_10 reaches n-2 = 8 breaks (de Werra 1981). With mixing first the perfect one is chosen and
    # the notes give both figures.
    lg = league(10, priorities=Priorities(mixing=5, breaks=2, venue_balance=0, slot_balance=0,
                                          carry_over=0))
    perfect, gk = _cands(10)
    from scheduler.balance.timetable import SolveLimits, solve_timetable

    cands = []
    for label, f in (("best mixing", perfect), ("fewest breaks", gk)):
        c = _Candidate(label, f, verify_rounds(10, f.rounds))
        c.tt = solve_timetable(lg, f, SolveLimits(1.5, 20, 0))
        cands.append(c)
    assert cands[0].cert.perfect_pairs == 36 and cands[1].cert.perfect_pairs == 27
    assert cands[1].tt.breaks == 8
    # docs/one-factorizations.md §7 probe: no perfect 8-break SRR seen
    assert cands[0].tt.breaks > 8
    chosen, why = _choose(cands, lg)
    assert chosen is cands[0] and "mixing" in why
    lg2 = league(10, priorities=Priorities(mixing=1, breaks=5))
    chosen2, _ = _choose(cands, lg2)
    assert chosen2 is cands[1]


def test_plan_lists_both_options_when_the_engine_finds_a_non_circle_factorization():
    lg = league(10, priorities=Priorities(mixing=5, breaks=2, venue_balance=0, slot_balance=0,
                                          carry_over=0))
    result = plan_season(lg, time_limit=4)
    methods = [o.method for o in result.options]
    if len(methods) == 1:
        pytest.skip("the factorization engine returned the circle schedule")
    assert "circle GK_10" in methods
    chosen = next(o for o in result.options if o.chosen)
    assert chosen.perfect_pairs == max(o.perfect_pairs for o in result.options)
    if any(o.breaks and o.breaks > 8 for o in result.options):
        assert any("conflict" in n for n in result.notes)


@pytest.mark.parametrize("scheme,expected", [
    # docs/leg-schemes.md table: leg 2 = leg-1 rounds (1-based) in this order
    ("mirrored", (1, 2, 3, 4, 5)), ("french", (2, 3, 4, 5, 1)),
    ("english", (5, 1, 2, 3, 4)), ("inverted", (5, 4, 3, 2, 1))])
def test_leg_orders_match_the_schemes(scheme, expected):
    maps = leg_schemes.leg_maps(scheme, 2, 5)
    assert tuple(p + 1 for p in maps[1]) == expected
    assert leg_schemes.flipped(1) and not leg_schemes.flipped(0)


def test_separations_match_the_table():
    # docs/leg-schemes.md: mirrored n-2 everywhere; French n-3 (2n-4 for round 1); English 0 for the
    # pairs of round n-1, otherwise n-1; inverted 2n-2-2k.
    n = 6
    R = n - 1
    assert set(leg_schemes.separations("mirrored", 2, R)) == {n - 2}
    fr = leg_schemes.separations("french", 2, R)
    assert fr[0] == 2 * n - 4 and set(fr[1:]) == {n - 3}
    en = leg_schemes.separations("english", 2, R)
    assert en[-1] == 0 and set(en[:-1]) == {n - 1}
    assert leg_schemes.separations("inverted", 2, R) == tuple(2 * n - 2 - 2 * k
                                                              for k in range(1, n))


def test_three_legs_alternate_venues():
    lg = league(4, legs=3, priorities=Priorities(mixing=1, breaks=5))
    s = plan_season(lg, time_limit=2).season
    assert check_season(lg, s) == []
    first = {f.pair: f.home for f in s.fixtures if f.leg == 1}
    for f in s.fixtures:
        assert (f.home == first[f.pair]) == (f.leg != 2)


@pytest.mark.parametrize("teams", [10, 9])
def test_determinism_on_the_annealing_path(teams):
    # 10 teams: the engine's perfect factorization is not GK_10, so the annealing start and
    # both candidates are used; 9 teams: odd league with byes.
    lg = league(teams, legs=2, rules=Rules(max_home_run=3, no_breaks_first=1,
                                           shared_grounds=(("Alder Vale", "Brook Farm"),)))
    a = plan_season(lg, time_limit=2)
    b = plan_season(lg, time_limit=2)
    assert a == b
    assert check_season(lg, a.season) == []
