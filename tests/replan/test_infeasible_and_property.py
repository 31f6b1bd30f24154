"""Re-plans that cannot keep every rule, and a property: random events never move history."""

from __future__ import annotations

import json
from datetime import date, timedelta

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st
from typer.testing import CliRunner

from scheduler.cli import app
from scheduler.config import load_league
from scheduler.config.events import parse_events
from scheduler.errors import InfeasibleError
from scheduler.export.season_json import load_season_json
from scheduler.replan import replan_season
from tests.replan.conftest import DATA, LEAGUE, folder_digest, write_events

runner = CliRunner()


def test_no_date_left_names_the_clash_and_a_relaxation(season_dir, tmp_path):
    """With no match day after the last round, a postponed game needs a later end: the
    message names the teams short of days and the relaxation found by re-solving."""
    tight = DATA / "tight.toml"
    data = json.loads((season_dir / "season.json").read_text(encoding="utf-8"))
    game = next(f for f in data["fixtures"] if f["round"] == 4)
    events = write_events(tmp_path, f'[[postponed]]\nhome = "{game["home"]}"\n'
                                    f'away = "{game["away"]}"\n')
    before = folder_digest(season_dir)
    result = runner.invoke(app, ["replan", str(tight), "--season", str(season_dir),
                                 "--events", str(events)], catch_exceptions=False)
    text = " ".join(result.output.split())
    assert result.exit_code == 2, result.output
    assert f"{game['home']} has" in text and "match days on which it can play" in text
    assert "possible fix: extend the season by" in text
    assert folder_digest(season_dir) == before


PLAYED = ["2031-03-08", "2031-03-15", "2031-03-22", "2031-03-29", "2031-04-05", "2031-04-12"]


@settings(max_examples=4, deadline=None, derandomize=True,
          suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(
    through=st.sampled_from(PLAYED),
    postpone=st.lists(st.integers(0, 29), max_size=2, unique=True),
    off=st.lists(st.tuples(st.integers(0, 5), st.integers(0, 5)), max_size=2),
    closed=st.booleans(),
)
def test_random_events_never_move_history(planned_small, through, postpone, off, closed):
    league = load_league(LEAGUE)
    previous = load_season_json(planned_small / "season.json")
    pt = date.fromisoformat(through)
    past = [f for f in previous.fixtures if f.date <= pt]
    chosen = {past[i % len(past)] for i in postpone}
    saturdays = sorted({f.date for f in previous.fixtures if f.date > pt})
    data = {
        "league": league.name, "season": league.season, "played_through": pt,
        "postponed": [{"home": f.home, "away": f.away, "date": f.date} for f in chosen],
        "unavailable": [{"team": league.teams[t].name,
                         "dates": [saturdays[d % len(saturdays)]]} for t, d in off],
        "closed": ([{"venue": "Old Sluice", "dates": [saturdays[0]]}] if closed else []),
    }
    events = parse_events(data, league)
    try:
        result = replan_season(league, previous, events, time_limit=2)
    except InfeasibleError:
        return  # nothing is written in that case (see the scenario tests)
    history = [f for f in past if f not in chosen]
    assert all(f in result.season.fixtures for f in history)
    assert all(f.date > pt for f in result.season.fixtures if f not in history)
    assert len(result.season.fixtures) == len(previous.fixtures)


@settings(max_examples=4, deadline=None, derandomize=True,
          suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(
    first=st.sampled_from(PLAYED[:3]),
    weeks=st.integers(1, 2),
    postpone=st.lists(st.tuples(st.integers(0, 30), st.booleans()), min_size=1, max_size=2),
    later=st.lists(st.tuples(st.integers(0, 30), st.booleans()), max_size=2),
)
def test_a_growing_file_never_moves_history_and_repeats_as_nothing(planned_small, first, weeks,
                                                                    postpone, later):
    """Two re-plans with one file that grows (the second adds postponements and moves
    ``played_through`` on): what either published as played stays exactly as it was, and the
    grown file applied once more changes nothing (docs/replanning.md, section 8)."""
    league = load_league(LEAGUE)
    previous = load_season_json(planned_small / "season.json")

    def entries(season, since, through, picks):
        window = [f for f in season.fixtures if since < f.date <= through]
        chosen = {window[i % len(window)]: dated for i, dated in picks} if window else {}
        return [{"home": f.home, "away": f.away, **({"date": f.date} if dated else {})}
                for f, dated in chosen.items()], list(chosen)

    def replan(season, through, postponed):
        events = parse_events({"league": league.name, "season": league.season,
                               "played_through": through, "postponed": postponed}, league)
        return replan_season(league, season, events, time_limit=2)

    pt1 = date.fromisoformat(first)
    pt2 = pt1 + timedelta(weeks=weeks)
    listed, gone1 = entries(previous, date.min, pt1, postpone)
    try:
        one = replan(previous, pt1, listed).season
    except InfeasibleError:
        return
    grown, gone2 = entries(one, pt1, pt2, later)
    try:
        two = replan(one, pt2, listed + grown)
    except InfeasibleError:
        return
    for season, through, gone in ((previous, pt1, gone1), (one, pt2, gone2)):
        played = [f for f in season.fixtures if f.date <= through and f not in gone]
        assert all(f in two.season.fixtures for f in played)
    assert len(two.season.fixtures) == len(previous.fixtures)
    again = replan(two.season, pt2, listed + grown)
    assert again.nothing_to_change and again.season == two.season
