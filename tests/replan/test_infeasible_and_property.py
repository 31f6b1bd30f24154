"""Re-plans that cannot keep every rule, and a property: random events never move history."""

from __future__ import annotations

import json
from datetime import date

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
