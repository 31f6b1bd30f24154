"""Court/slot/venue balance, the balanced-tournament-design check, and rest days.

* BTD(m): 2m teams on m courts, each team on each court at most twice; it exists for every m
  except m = 2 (Schellenberg, van Rees & Vanstone, Ars Combinatoria 3 (1977) 303-318). Since
  K4 and K6 each have one 1-factorization up to isomorphism (Wallis, One-Factorizations, 1997),
  a BTD(3) gives a court assignment for any 6-team timetable, and no court assignment of a
  4-team timetable can be balanced.
* Counts and spreads are compared with pandas (a general-purpose library); rest days with a
  pandas group-by of the dates (rest = days between games minus one; common practice).
"""

from __future__ import annotations

import itertools
import random
from datetime import date, datetime, timedelta
from zoneinfo import ZoneInfo

import pandas as pd

from scheduler.fairness import compute_fairness
from scheduler.season import Fixture, Season
from tests.fairness.constructions import canonical_rounds, name, season_of


def _with_courts(rounds, n, assignment):
    """Season whose round r puts game g on court ``assignment[r][g]``."""
    fixtures = []
    for r, games in enumerate(rounds):
        for g, (h, a) in enumerate(games):
            fixtures.append(
                Fixture(r + 1, name(h), name(a), venue="Dock Hall",
                        court=f"Court {assignment[r][g] + 1}")
            )
    return Season("L", "S", tuple(name(t) for t in range(1, n + 1)), tuple(fixtures))


def _ref_balanced(rounds, n, assignment) -> bool:
    uses = {}
    for r, games in enumerate(rounds):
        for g, (h, a) in enumerate(games):
            for t in (h, a):
                key = (t, assignment[r][g])
                uses[key] = uses.get(key, 0) + 1
    return all(v <= 2 for v in uses.values())


def test_no_balanced_court_assignment_for_four_teams():
    """BTD(2) does not exist (Schellenberg et al. 1977): every assignment fails the check."""
    rounds = canonical_rounds(4)
    perms = list(itertools.permutations(range(2)))
    for choice in itertools.product(perms, repeat=3):
        report = compute_fairness(_with_courts(rounds, 4, choice))
        assert report.btd_applicable
        assert report.btd_ok is False
        assert report.btd_violations
        assert not _ref_balanced(rounds, 4, choice)


def test_balanced_court_assignment_for_six_teams():
    """BTD(3) exists: a plain search finds assignments; the report agrees with the plain check
    on those and on a sample of others."""
    rounds = canonical_rounds(6)
    perms = list(itertools.permutations(range(3)))
    all_choices = list(itertools.product(perms, repeat=5))
    good = [c for c in all_choices if _ref_balanced(rounds, 6, c)]
    assert good
    sample = good[:5] + random.Random(2).sample(all_choices, 25)
    for choice in sample:
        report = compute_fairness(_with_courts(rounds, 6, choice))
        assert report.btd_applicable
        assert report.btd_ok == _ref_balanced(rounds, 6, choice)
        if report.btd_ok:
            assert report.court_spread_max <= 1  # 5 games on 3 courts: (2, 2, 1)


def test_court_and_slot_counts_match_pandas():
    n = 8
    rng = random.Random(5)
    rounds = canonical_rounds(n)
    zone = ZoneInfo("Europe/Lisbon")
    fixtures = []
    for r, games in enumerate(rounds):
        for h, a in games:
            court = rng.choice(["North", "South", "East"])
            hour = rng.choice([18, 20])
            fixtures.append(
                Fixture(r + 1, name(h), name(a), venue=rng.choice(["Quay Park", "Elm Rise"]),
                        court=court, start=datetime(2030, 4, 1 + r, hour, 0, tzinfo=zone))
            )
    season = Season("L", "S", tuple(name(t) for t in range(1, n + 1)), tuple(fixtures))
    report = compute_fairness(season)
    rows = []
    for f in fixtures:
        venue_court = f"{f.venue}: {f.court}"
        for team in (f.home, f.away):
            rows.append({"team": team, "venue": f.venue, "court": venue_court,
                         "slot": f.start.strftime("%H:%M")})
    df = pd.DataFrame(rows)
    for column, attr in (("venue", "venues"), ("court", "courts"), ("slot", "slots")):
        table = pd.crosstab(df["team"], df[column])
        for fig in report.team_figures:
            expected = {k: int(v) for k, v in table.loc[fig.name].items() if v}
            assert dict(getattr(fig, attr)) == expected
    # Court spread is taken inside each venue (courts of different grounds are no alternatives),
    # then the largest over the venues.
    per_venue = []
    for _, part in df.groupby("venue"):
        counts = pd.crosstab(part["team"], part["court"]).reindex(df["team"].unique(), fill_value=0)
        per_venue.append(counts.max(axis=1) - counts.min(axis=1))
    spreads = pd.concat(per_venue, axis=1).max(axis=1)
    for fig in report.team_figures:
        assert fig.court_spread == int(spreads[fig.name])
    assert report.court_spread_max == int(spreads.max())
    assert report.slot_names == ("18:00", "20:00")
    assert not report.btd_applicable  # games are not one per court per round


def test_rest_days_match_pandas():
    n = 6
    rng = random.Random(11)
    rounds = canonical_rounds(n)
    day = date(2030, 9, 1)
    fixtures = []
    for r, games in enumerate(rounds):
        day += timedelta(days=rng.choice([3, 4, 7]))
        for h, a in games:
            fixtures.append(Fixture(r + 1, name(h), name(a),
                                    date=day + timedelta(days=rng.choice([0, 1]))))
    season = Season("L", "S", tuple(name(t) for t in range(1, n + 1)), tuple(fixtures))
    report = compute_fairness(season)
    df = pd.DataFrame(
        [{"team": t, "day": pd.Timestamp(f.date)} for f in fixtures for t in (f.home, f.away)]
    ).sort_values(["team", "day"])
    df["rest"] = df.groupby("team")["day"].diff().dt.days - 1
    for fig in report.team_figures:
        expected = df[df.team == fig.name]["rest"].dropna().astype(int).tolist()
        assert list(fig.rest_days) == expected
        assert fig.rest_days_min == min(expected)
    assert report.rest_days_min == int(df["rest"].min())
    assert abs(report.rest_days_mean - df["rest"].mean()) < 1e-3


def test_no_dates_means_no_rest_figures():
    report = compute_fairness(season_of(canonical_rounds(4), 4))
    assert report.rest_days_min is None and report.rest_days_mean is None
    assert any("rest" in note for note in report.notes)


def test_rest_mismatches_match_a_plain_count():
    """Rest mismatch: both teams played before and their rest days differ (plain loop)."""
    n = 6
    rng = random.Random(4)
    rounds = canonical_rounds(n)
    day = date(2030, 9, 1)
    fixtures = []
    for r, games in enumerate(rounds):
        day += timedelta(days=7)
        for h, a in games:
            fixtures.append(Fixture(r + 1, name(h), name(a),
                                    date=day + timedelta(days=rng.choice([0, 1, 2]))))
    season = Season("L", "S", tuple(name(t) for t in range(1, n + 1)), tuple(fixtures))
    report = compute_fairness(season)
    last: dict[str, date] = {}
    mismatches = 0
    less = dict.fromkeys(season.teams, 0)
    for f in sorted(fixtures, key=lambda f: f.date):
        if f.home in last and f.away in last:
            rh = (f.date - last[f.home]).days - 1
            ra = (f.date - last[f.away]).days - 1
            if rh != ra:
                mismatches += 1
                less[f.home if rh < ra else f.away] += 1
        last[f.home] = last[f.away] = f.date
    assert report.rest_mismatches == mismatches > 0
    assert {t.name: t.less_rest_games for t in report.team_figures} == less
