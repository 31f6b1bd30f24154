"""Legs, schemes and separation; the validity check; the report's JSON form.

Separation values per scheme come from docs/leg-schemes.md (section 2, index maps as in
Goossens & Spieksma, J. Scheduling 15 (2012) 641-651; recorded there from memory): mirrored
n-2 for every pair; French n-3, and 2n-4 for the pairs of round 1; English 0 for the pairs of
round n-1, otherwise n-1; inverted 2n-2-2k, so 0 to 2n-4. They are re-derived here by brute
force from the rounds.
"""

from __future__ import annotations

import itertools
import json
from dataclasses import fields, replace

import pytest

from scheduler.errors import InputError
from scheduler.fairness import FairnessReport, compute_fairness
from scheduler.fairness.validity import validate_season
from tests.fairness.constructions import (
    canonical_rounds,
    double_round_robin,
    odd_from_even,
    season_of,
)


def _brute_separation(rounds):
    meet = {}
    for r, games in enumerate(rounds):
        for h, a in games:
            meet.setdefault(frozenset((h, a)), []).append(r)
    gaps = [b - a - 1 for rs in meet.values() for a, b in itertools.pairwise(rs)]
    return min(gaps), max(gaps)


@pytest.mark.parametrize("n", [6, 8])
@pytest.mark.parametrize(
    "scheme,expected",
    [
        ("mirrored", lambda n: (n - 2, n - 2)),
        ("french", lambda n: (n - 3, 2 * n - 4)),
        ("english", lambda n: (0, n - 1)),
        ("inverted", lambda n: (0, 2 * n - 4)),
    ],
)
def test_separation_per_scheme(n, scheme, expected):
    rounds = double_round_robin(canonical_rounds(n), scheme)
    report = compute_fairness(season_of(rounds, n, legs=2, scheme=scheme))
    assert (report.separation_min, report.separation_max) == expected(n)
    assert (report.separation_min, report.separation_max) == _brute_separation(rounds)
    assert report.scheme == scheme


def test_scheme_read_from_fixtures_not_labels():
    """A French season labelled 'mirrored' is measured as French, with a note."""
    rounds = double_round_robin(canonical_rounds(6), "french")
    report = compute_fairness(season_of(rounds, 6, legs=2, scheme="mirrored"))
    assert report.scheme == "french"
    assert report.breaks_lower_bound == 12
    assert any("french" in note for note in report.notes)


def test_legs_inferred_without_leg_numbers():
    rounds = double_round_robin(canonical_rounds(6), "mirrored")
    season = season_of(rounds, 6, legs=2)
    season = replace(season, fixtures=tuple(replace(f, leg=1) for f in season.fixtures))
    report = compute_fairness(season)
    assert report.legs == 2 and report.scheme == "mirrored"
    assert report.breaks_lower_bound == 12


def test_single_round_robin_has_no_separation():
    report = compute_fairness(season_of(canonical_rounds(6), 6))
    assert report.separation_min is None and report.legs == 1


# ----------------------------------------------------------------------------- validity

NAMES = ["Harbour Town", "Mill Lane", "Oak Vale", "Riverside", "Stone Cross", "Westfield"]


def _season():
    return season_of(canonical_rounds(6), 6, names=NAMES)


def test_valid_schedules_have_no_problems():
    assert validate_season(_season()) == []
    drr = double_round_robin(canonical_rounds(8), "english")
    assert validate_season(season_of(drr, 8, legs=2)) == []
    odd = odd_from_even(canonical_rounds(8), dummy=8)
    assert validate_season(season_of(odd, 7)) == []


def test_duplicated_team_in_a_round_names_the_rows():
    season = _season()
    fx = list(season.fixtures)
    # Round 3 (fixtures 6, 7, 8): put the home team of fixture 6 into fixture 7 as well.
    fx[7] = replace(fx[7], home=fx[6].home)
    rows = [i + 2 for i in range(len(fx))]  # header on row 1
    problems = validate_season(replace(season, fixtures=tuple(fx)), rows)
    messages = [p.message for p in problems]
    team = fx[6].home
    assert f"round 3: {team} plays twice (rows 8, 9)" in messages
    twice = next(p for p in problems if p.kind == "plays-twice")
    assert twice.rows == (8, 9) and twice.fixtures == (6, 7)
    assert any(p.kind == "pair-count" for p in problems)
    assert any(p.kind == "missing-game" for p in problems)


def test_missing_game_is_reported():
    season = _season()
    fx = list(season.fixtures)
    gone = fx.pop(4)
    problems = validate_season(replace(season, fixtures=tuple(fx)))
    pair = sorted((gone.home, gone.away), key=NAMES.index)
    assert f"missing game: {pair[0]} and {pair[1]} never meet" in [p.message for p in problems]
    idle = [p for p in problems if p.kind == "idle"]
    assert idle and f"round {gone.round}" in idle[0].message


def test_self_game_unknown_team_and_byes():
    season = _season()
    fx = list(season.fixtures)
    fx[0] = replace(fx[0], away=fx[0].home)
    fx[1] = replace(fx[1], away="Harbor Town")
    bad = replace(season, fixtures=tuple(fx), byes={2: ("Mill Lane", "Nowhere FC")})
    problems = validate_season(bad, [10 + i for i in range(len(fx))])
    kinds = {p.kind for p in problems}
    assert {"plays-itself", "unknown-team", "bye"} <= kinds
    unknown = next(p for p in problems if p.kind == "unknown-team")
    assert "'Harbor Town'" in unknown.message and unknown.rows == (11,)
    assert any("Nowhere FC" in p.message for p in problems)
    assert any("has a bye but plays" in p.message for p in problems)


def test_odd_league_with_two_teams_sitting_out():
    odd = odd_from_even(canonical_rounds(8), dummy=8)
    season = season_of(odd, 7)
    fx = [f for f in season.fixtures if not (f.round == 2 and f is season.fixtures_in_round(2)[0])]
    bad = replace(season, fixtures=tuple(fx), byes={})
    problems = validate_season(bad)
    assert any("sit out" in p.message and p.message.startswith("round 2") for p in problems)


def test_bad_round_and_leg_numbers():
    season = _season()
    fx = list(season.fixtures)
    fx[0] = replace(fx[0], round=0, leg=0)
    problems = validate_season(replace(season, fixtures=tuple(fx)))
    kinds = {p.kind for p in problems}
    assert {"bad-round", "bad-leg"} <= kinds
    # The figures are still measured, leaving the bad fixture out.
    report = compute_fairness(replace(season, fixtures=tuple(fx)))
    assert report.games == len(fx) - 1


def test_problem_lists_are_capped():
    names = tuple(f"Club {i}" for i in range(40))
    season = season_of([[(1, 2)]], 40, names=list(names))
    problems = validate_season(season)
    missing = [p for p in problems if p.kind == "missing-game"]
    assert len(missing) == 101 and "more problems" in missing[-1].message


# ----------------------------------------------------------------------------- JSON form


def _plain(value):
    if isinstance(value, dict):
        return all(isinstance(k, str) and _plain(v) for k, v in value.items())
    if isinstance(value, list):
        return all(_plain(v) for v in value)
    return value is None or isinstance(value, bool | int | float | str)


def test_report_to_dict_is_plain_and_stable():
    rounds = double_round_robin(odd_from_even(canonical_rounds(8), dummy=8), "mirrored")
    season = season_of(rounds, 7, legs=2)
    season = replace(
        season,
        fixtures=tuple(replace(f, court="Court A", venue="Gull Hall") for f in season.fixtures),
    )
    report = compute_fairness(season)
    data = report.to_dict()
    assert list(data) == [f.name for f in fields(FairnessReport)]
    assert _plain(data)
    assert json.loads(json.dumps(data)) == data
    assert json.dumps(data) == json.dumps(compute_fairness(season).to_dict())
    for key in ("breaks_total", "carry_over_value", "perfect_pairs", "pairs", "bye_convention"):
        assert key in data
    team = data["team_figures"][0]
    assert team["venues"] == {"Gull Hall": 12}


def test_empty_rounds_are_reported_as_ranges():
    season = _season()
    moved = tuple(replace(f, round=f.round + 4) if f.round == 5 else f for f in season.fixtures)
    problems = validate_season(replace(season, fixtures=moved))
    assert "rounds 5-8 have no games" in [p.message for p in problems]


def test_absurd_round_numbers_are_refused():
    season = _season()
    fx = (replace(season.fixtures[0], round=20300301), *season.fixtures[1:])
    with pytest.raises(InputError) as info:
        compute_fairness(replace(season, fixtures=fx))
    assert info.value.location == "fixture 1"


def test_declared_legs_decide_the_expected_meetings():
    """A double round robin with half of leg 2 missing: the pairs that meet only once are the
    problem (the season declares 2 legs), not the ones that meet twice."""
    rounds = double_round_robin(canonical_rounds(6), "mirrored")
    season = season_of(rounds[:7], 6, legs=2)
    season = replace(season, fixtures=tuple(replace(f, leg=1 if f.round <= 5 else 2)
                                            for f in season.fixtures))
    problems = validate_season(season)
    counts = [p for p in problems if p.kind == "pair-count"]
    assert len(counts) == 15 - 6 and all("meet once; expected twice" in p.message for p in counts)
    # Labelled single but every pair meets twice: one "legs" problem, pairs judged by 2.
    full = replace(season_of(rounds, 6, legs=2), legs=1)
    problems = validate_season(full)
    assert [p.kind for p in problems] == ["legs"]
    assert "no pair meets once; most pairs meet twice" in problems[0].message


def _three_legs(rounds, scheme: str):
    """Legs 2 and 3 follow the scheme's index maps (scheduler.leg_schemes, docs/leg-schemes.md):
    leg l copies leg-1 position sigma^l(s), venues swapped in leg 2 only."""
    from scheduler.leg_schemes import flipped, leg_maps

    maps = leg_maps(scheme, 3, len(rounds))
    out = []
    for leg, leg_map in enumerate(maps):
        for p in leg_map:
            out.append([(a, h) if flipped(leg) else (h, a) for h, a in rounds[p]])
    return out


@pytest.mark.parametrize("scheme", ["mirrored", "french", "english", "inverted"])
def test_three_leg_scheme_read_from_fixtures(scheme):
    n = 6
    rounds = _three_legs(canonical_rounds(n), scheme)
    report = compute_fairness(season_of(rounds, n, legs=3, scheme=scheme))
    assert report.legs == 3 and report.scheme == scheme
    assert report.breaks_total >= report.breaks_lower_bound


def test_three_leg_mirrored_bound_is_the_settled_one():
    """(n-2)(2L-1) = 20 for 6 teams and 3 mirrored legs, reached by the canonical schedule with
    de Werra's orientation (docs/leg-schemes.md, Theorem C); the older L(n-2) = 12 was weaker."""
    n = 6
    rounds = _three_legs(canonical_rounds(n), "mirrored")
    report = compute_fairness(season_of(rounds, n, legs=3))
    assert report.breaks_lower_bound == (n - 2) * (2 * 3 - 1) == 20
    assert report.breaks_total >= 20


def test_legs_that_are_not_a_scheme_are_free():
    n = 6
    base = canonical_rounds(n)
    rounds = _three_legs(base, "mirrored")
    third = 2 * (n - 1)  # first round of leg 3: swap two of its rounds
    rounds[third], rounds[third + 1] = rounds[third + 1], rounds[third]
    report = compute_fairness(season_of(rounds, n, legs=3))
    assert report.scheme == "free"
    assert report.breaks_lower_bound == 3 * (n - 2)
