"""Bad league files give a ConfigError whose message names the field, never a traceback.

Outside references used here: :mod:`difflib` (did-you-mean), :mod:`zoneinfo` (PEP 615 time zone
names), the ``holidays`` package (supported countries and subdivisions), :mod:`tomllib` and
PyYAML (syntax errors and their line numbers), de Werra 1981 (break lower bound).
"""

from __future__ import annotations

import copy
import datetime as dt
import difflib
import tomllib
import zoneinfo
from pathlib import Path

import holidays
import pytest
import yaml
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from scheduler.config import load_league, parse_league
from scheduler.config.reading import LeagueYamlLoader
from scheduler.errors import ConfigError, InputError

REPO = Path(__file__).resolve().parents[2]
COUNTY = REPO / "sample_leagues" / "county_double.toml"
HALL = REPO / "sample_leagues" / "evening_hall.toml"


def county() -> dict:
    with COUNTY.open("rb") as handle:
        return tomllib.load(handle)


def hall() -> dict:
    with HALL.open("rb") as handle:
        return tomllib.load(handle)


def problems_of(data: dict) -> list[str]:
    with pytest.raises(ConfigError) as info:
        parse_league(data, source="test.toml")
    err = info.value
    assert err.path == "test.toml"
    assert isinstance(err, InputError)
    return err.problems


def only_problem(data: dict) -> str:
    problems = problems_of(data)
    assert len(problems) == 1, problems
    return problems[0]


# --- one case per class of bad input -------------------------------------------------------


def _set(path: list, value):
    def change(d: dict) -> None:
        target = d
        for key in path[:-1]:
            target = target[key]
        target[path[-1]] = value

    return change


CASES = [
    # (change, expected start of the problem)
    (_set(["format", "legz"], 2), "format.legz: unknown option; did you mean 'legs'?"),
    (_set(["leauge"], {}), "leauge: unknown section; did you mean 'league'?"),
    (_set(["teams", 3, "home_venu"], "x"), "teams[3].home_venu: unknown option; did you mean"),
    (_set(["format", "legs"], "2"), "format.legs: expected a whole number, got '2'"),
    (_set(["format", "legs"], 1.5), "format.legs: expected a whole number"),
    (_set(["format", "legs"], True), "format.legs: expected a whole number"),
    (_set(["format", "legs"], 0), "format.legs: must be at least 1, got 0"),
    (_set(["format", "scheme"], "mirored"), "format.scheme: 'mirored' is not a scheme; did you"),
    (_set(["format", "home_meaning"], "ground"), "format.home_meaning: 'ground' is not a"),
    (_set(["league", "name"], 3), "league.name: expected text"),
    (_set(["league", "name"], "   "), "league.name: must not be empty"),
    (_set(["league", "seed"], -1), "league.seed: must be at least 0"),
    (_set(["league", "solve_seconds"], 0), "league.solve_seconds: must be more than 0"),
    (_set(["league", "timezone"], "Mars/Olympus"), "league.timezone: 'Mars/Olympus' is not a"),
    (_set(["calendar", "weekdays"], ["sta"]), "calendar.weekdays[0]: 'sta' is not a weekday"),
    (_set(["calendar", "weekdays"], [7]), "calendar.weekdays[0]: weekday numbers go from 0"),
    (_set(["calendar", "kickoff"], "25:00"), "calendar.kickoff: expected a time of day"),
    (_set(["calendar", "start"], "next week"), "calendar.start: expected a date like"),
    (
        _set(["calendar", "start"], dt.datetime(2027, 8, 14, 15, 0)),
        "calendar.start: expected a date without a time of day",
    ),
    (_set(["calendar", "excluded"], ["2027-12-24..2027-12-01"]), "calendar.excluded[0]: the range"),
    (
        _set(["calendar", "holidays"], {"country": "XQ"}),
        "calendar.holidays.country: 'XQ' is not a country",
    ),
    (
        _set(["calendar", "holidays"], {"country": "GB", "subdivision": "ENX"}),
        "calendar.holidays.subdivision: 'ENX' is not a subdivision of GB; did you mean 'ENG'?",
    ),
    (
        _set(["calendar", "holidays"], {"country": "GB", "region": "ENG"}),
        "calendar.holidays.region: unknown option (known: country, subdivision)",
    ),
    (_set(["calendar", "end"], dt.date(2027, 1, 1)), "calendar.end: 2027-01-01 is before"),
    (_set(["calendar", "excluded"], [dt.date(2026, 12, 25)]), "calendar.excluded[0]: 2026-12-25"),
    (
        _set(["teams", 3, "home_venue"], "Saltmarsh Lan"),
        "teams[3].home_venue: 'Saltmarsh Lan' is not a venue; did you mean 'Saltmarsh Lane'?",
    ),
    (_set(["teams", 2, "name"], "Ashby Vale"), "teams[2].name: 'Ashby Vale' is listed twice"),
    (_set(["teams", 2, "code"], "A B"), "teams[2].code: 'A B' must be 1-8 letters"),
    (_set(["teams", 0], "Ashby"), "teams[0]: expected a section"),
    (_set(["teams"], "Ashby"), "teams: expected a list"),
    (_set(["venues", 1, "name"], "Corvey Road"), "venues[1].name: 'Corvey Road' is listed twice"),
    (_set(["venues", 1, "slots"], ["14:00", "15:00"]), "venues[1].slots: 14:00 and 15:00 are 60"),
    (_set(["rules", "fixed", 0, "home"], "Rovers"), "rules.fixed[0].home: 'Rovers' is not a team"),
    (
        _set(["rules", "fixed", 0, "away"], "Kingsferry United"),
        "rules.fixed[0]: a team cannot play itself",
    ),
    (_set(["rules", "fixed", 0, "round"], 31), "rules.fixed[0].round: the season has only 30"),
    (_set(["rules", "fixed", 0, "round"], 0), "rules.fixed[0].round: must be at least 1"),
    (
        _set(["rules", "fixed", 0, "date"], dt.date(2027, 8, 14)),
        "rules.fixed[0]: give either the round or the date, not both",
    ),
    (
        _set(["rules", "no_home_games", 0, "dates"], [dt.date(2026, 8, 29)]),
        "rules.no_home_games[0].dates[0]: 2026-08-29 is outside the season",
    ),
    (
        _set(["rules", "unavailable"], [{"team": "Hollin Twn", "dates": [dt.date(2027, 9, 4)]}]),
        "rules.unavailable[0].team: 'Hollin Twn' is not a team; did you mean 'Hollin Town'?",
    ),
    (_set(["rules", "max_home_run"], 0), "rules.max_home_run: must be at least 1"),
    (
        _set(["rules", "shared_grounds"], [["Ashby Vale"]]),
        "rules.shared_grounds[0]: a shared ground needs at least two teams",
    ),
    (
        _set(["priorities", "order"], ["breaks", "mixng"]),
        "priorities.order[1]: 'mixng' is not a goal; did you mean 'mixing'?",
    ),
    (_set(["priorities", "breaks"], -2), "priorities.breaks: must be at least 0"),
]


@pytest.mark.parametrize(("change", "expected"), CASES)
def test_each_bad_input_is_located(change, expected):
    data = county()
    change(data)
    problems = problems_of(data)
    assert any(p.startswith(expected) for p in problems), problems


def test_missing_sections_and_options():
    data = county()
    del data["league"]
    assert only_problem(data) == "league: required section is missing"
    data = county()
    del data["league"]["timezone"]
    assert only_problem(data) == "league.timezone: required option is missing"
    data = county()
    del data["teams"][4]["home_venue"]
    assert only_problem(data).startswith("teams[4].home_venue: required option is missing")


def test_duplicate_team_codes():
    data = county()
    data["teams"][0]["code"] = "AV"
    data["teams"][5]["code"] = "av"
    assert only_problem(data) == "teams[5].code: 'av' is already the code of teams[0]"


def test_side_mode_needs_a_venue_but_no_home_venues():
    data = hall()
    data["venues"] = []
    assert only_problem(data).startswith("venues: at least one venue is needed")
    data = hall()
    data["teams"][1]["home_venue"] = "Bramblewick Sport Hall"
    assert only_problem(data) == (
        "teams[1].home_venue: 'Bramblewick Sport Hall' is not a venue; "
        "did you mean 'Bramblewick Sports Hall'?"
    )


def test_several_problems_are_reported_together():
    data = county()
    data["format"]["legz"] = 2
    data["league"]["seed"] = "one"
    data["calendar"]["weekdays"] = ["sat", "sunnday"]
    problems = problems_of(data)
    assert len(problems) == 3
    assert {p.split(":")[0] for p in problems} == {
        "format.legz",
        "league.seed",
        "calendar.weekdays[1]",
    }
    message = str(ConfigError(problems, path="test.toml"))
    assert message.startswith("test.toml: 3 problems")


def test_did_you_mean_agrees_with_difflib():
    """The suggestion is difflib's closest match among the real names (Python stdlib)."""
    data = county()
    data["teams"][6]["home_venue"] = "Gravel Pit Road"
    venues = [v["name"] for v in data["venues"]]
    best = difflib.get_close_matches("Gravel Pit Road", venues, n=1)[0]
    assert only_problem(data).endswith(f"did you mean {best!r}?")


def test_timezone_check_agrees_with_zoneinfo():
    """Every IANA name zoneinfo knows is accepted (PEP 615); a misspelt one is refused."""
    names = sorted(zoneinfo.available_timezones())
    for name in names[:: max(1, len(names) // 25)]:
        data = county()
        data["league"]["timezone"] = name
        assert parse_league(data).timezone == name
    data = county()
    data["league"]["timezone"] = "Europe/Lodnon"
    assert only_problem(data) == (
        "league.timezone: 'Europe/Lodnon' is not a time zone; did you mean 'Europe/London'?"
    )


def test_holiday_regions_agree_with_the_holidays_package():
    supported = holidays.list_supported_countries(include_aliases=False)
    assert "ENG" in supported["GB"] and "BY" in supported["DE"]
    data = county()
    data["calendar"]["holidays"] = {"country": "gb", "subdivision": "eng"}
    cal = parse_league(data).calendar
    assert (cal.holidays_country, cal.holidays_subdivision) == ("GB", "ENG")
    data = county()
    data["calendar"]["holidays"] = {"country": "DE", "subdivision": "Bayern"}
    # "Bayern" is one of the package's own subdivision aliases of BY.
    assert holidays.DE.subdivisions_aliases["Bayern"] == "BY"
    assert parse_league(data).calendar.holidays_subdivision == "BY"


def test_season_too_short():
    """30 rounds (16 teams, 2 legs: 2 * (16 - 1)) do not fit into fewer Saturdays."""
    data = county()
    data["calendar"]["end"] = dt.date(2027, 12, 18)
    data["calendar"]["excluded"] = []
    data["rules"]["no_home_games"] = data["rules"]["no_home_games"][:1]
    saturdays = sum(
        1
        for k in range((dt.date(2027, 12, 18) - dt.date(2027, 8, 14)).days + 1)
        if (dt.date(2027, 8, 14) + dt.timedelta(days=k)).weekday() == 5
    )
    assert saturdays < 30
    problems = problems_of(data)
    assert problems[0].startswith(f"calendar: the season has {saturdays} match days but needs 30")


def test_static_contradictions():
    data = county()
    data["rules"]["no_home_games"] = [{"team": "Durley Chase", "dates": ["2027-08-14..2028-05-27"]}]
    assert only_problem(data).startswith(
        "rules.no_home_games[0]: Durley Chase can play at home on 0 match days but must host 15"
    )
    data = county()
    data["rules"]["unavailable"] = [{"team": "Westermoor", "dates": ["2027-08-14..2028-04-30"]}]
    assert only_problem(data).startswith("rules.unavailable[0]: Westermoor is available on")
    data = county()
    data["rules"]["fixed"].append(
        {"home": "Kingsferry United", "away": "Saltmarsh Rovers", "round": 20}
    )
    assert only_problem(data).startswith(
        "rules.fixed[1]: Kingsferry United would host Saltmarsh Rovers 2 times"
    )
    data = county()
    data["rules"]["fixed"][0].pop("round")
    data["rules"]["fixed"][0]["date"] = dt.date(2027, 8, 15)  # a Sunday
    assert (
        only_problem(data) == "rules.fixed[0].date: 2027-08-15 is not a match day of the calendar"
    )


def test_de_werra_break_bound():
    """de Werra 1981 (Annals of Discrete Math. 11): an even SRR has >= n - 2 breaks, so runs of 1
    only are impossible for 16 teams; for 9 teams (odd) a break-free schedule exists."""
    data = county()
    data["rules"]["max_home_run"] = 1
    data["rules"]["max_away_run"] = 1
    assert only_problem(data).startswith("rules.max_home_run: with max_home_run = 1")
    odd = hall()
    odd["rules"]["max_home_run"] = 1
    odd["rules"]["max_away_run"] = 1
    assert parse_league(odd).rules.max_home_run == 1


def test_scheme_separation():
    """English scheme: the last-round pairs of leg 1 meet again straight away (0 rounds between);
    Goossens & Spieksma 2012, J. Scheduling 15, via the index maps of docs/leg-schemes.md."""
    data = county()
    data["format"]["scheme"] = "english"
    data["rules"]["min_separation"] = 1
    assert only_problem(data).startswith("rules.min_separation: with scheme = 'english'")
    data = county()
    data["rules"]["min_separation"] = 14  # mirrored, 16 teams: every pair has 14 rounds between
    assert parse_league(data).rules.min_separation == 14
    data["rules"]["min_separation"] = 15
    assert only_problem(data).startswith("rules.min_separation")


def test_side_mode_room_and_rest():
    data = hall()
    data["venues"][0]["courts"] = ["Court A"]  # 1 court x 2 slots < 4 games a round
    assert only_problem(data).startswith("venues: 4 games are played per match day")
    data = hall()
    data["calendar"]["rounds_per_day"] = 2
    problems = problems_of(data)
    assert any(p.startswith("rules.min_rest_days: teams play up to 2 games") for p in problems)


# --- files ----------------------------------------------------------------------------------


def test_toml_syntax_error_has_the_line(tmp_path):
    path = tmp_path / "league.toml"
    path.write_text('[league]\nname = "x"\nseason = "2027\n', encoding="utf-8")
    with pytest.raises(tomllib.TOMLDecodeError) as reference:
        tomllib.loads(path.read_text(encoding="utf-8"))
    assert "line 3" in str(reference.value)
    with pytest.raises(ConfigError) as info:
        load_league(path)
    assert info.value.path == str(path)
    assert info.value.problems[0].startswith("line 3, column")
    assert "TOML syntax error" in str(info.value)


def test_yaml_syntax_error_has_the_line(tmp_path):
    path = tmp_path / "league.yaml"
    path.write_text("league:\n  name: x\n  season: [2027\nteams: []\n", encoding="utf-8")
    with pytest.raises(yaml.YAMLError) as reference:
        yaml.safe_load(path.read_text(encoding="utf-8"))
    line = reference.value.problem_mark.line + 1
    with pytest.raises(ConfigError) as info:
        load_league(path)
    assert info.value.problems[0].startswith(f"line {line}, column")


def test_yaml_duplicate_key_is_an_error(tmp_path):
    path = tmp_path / "league.yml"
    path.write_text("league:\n  name: x\n  name: y\n", encoding="utf-8")
    with pytest.raises(ConfigError) as info:
        load_league(path)
    assert info.value.problems[0].startswith("line 3, column 3")
    assert "'name' appears twice" in info.value.problems[0]


def test_yaml_reads_codes_and_times_as_text():
    """YAML 1.1 reads NO as false and 19:30 as 1170 (base 60); the league loader does not."""
    assert yaml.safe_load("a: NO\nb: 19:30") == {"a": False, "b": 1170}
    assert yaml.load("a: NO\nb: 19:30\nc: true\nd: 3\ne: 2.5", Loader=LeagueYamlLoader) == {
        "a": "NO",
        "b": "19:30",
        "c": True,
        "d": 3,
        "e": 2.5,
    }


@pytest.mark.parametrize(
    ("name", "content", "expected"),
    [
        ("missing.toml", None, "file not found"),
        ("empty.toml", b"", "the file is empty"),
        ("blank.yaml", b"  \n\n", "the file is empty"),
        ("comments.toml", b"# nothing here\n", "the file has no settings"),
        (
            "latin1.toml",
            '[league]\nname = "Sch\u00fctzen"\n'.encode("latin-1"),
            "line 2: the file is not UTF-8",
        ),
        ("league.json", b"{}", "unknown file type ('.json')"),
        ("list.yaml", b"- a\n- b\n", "the file must hold sections"),
    ],
)
def test_file_problems(tmp_path, name, content, expected):
    path = tmp_path / name
    if content is not None:
        path.write_bytes(content)
    with pytest.raises(ConfigError) as info:
        load_league(path)
    assert info.value.path == str(path)
    assert info.value.problems[0].startswith(expected), info.value.problems
    assert str(info.value).startswith(f"{path}: ")


def test_a_folder_is_not_a_league(tmp_path):
    folder = tmp_path / "league.toml"
    folder.mkdir()
    with pytest.raises(ConfigError, match="folder"):
        load_league(folder)


def test_utf8_bom_is_accepted(tmp_path):
    path = tmp_path / "bom.toml"
    path.write_bytes(b"\xef\xbb\xbf" + COUNTY.read_bytes())
    assert load_league(path).name == load_league(COUNTY).name


# --- never a traceback ----------------------------------------------------------------------

_leaf = st.one_of(
    st.none(),
    st.booleans(),
    st.integers(-5, 40),
    st.floats(allow_nan=True),
    st.text(max_size=12),
    st.dates(dt.date(2020, 1, 1), dt.date(2030, 1, 1)),
    st.times(),
)
_values = st.recursive(
    _leaf,
    lambda inner: (
        st.lists(inner, max_size=4) | st.dictionaries(st.text(max_size=8), inner, max_size=4)
    ),
    max_leaves=12,
)


@settings(max_examples=120, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(
    section=st.sampled_from(
        ["league", "format", "calendar", "rules", "priorities", "teams", "venues"]
    ),
    key=st.sampled_from(
        [
            "name",
            "legs",
            "scheme",
            "start",
            "end",
            "dates",
            "weekdays",
            "holidays",
            "fixed",
            "unavailable",
            "order",
            "timezone",
            "courts",
            "slots",
            "home_venue",
            "zzz",
        ]
    ),
    value=_values,
)
def test_random_values_never_escape_as_tracebacks(section, key, value):
    data = county()
    target = data[section]
    if isinstance(target, list):
        target = target[0]
    target[key] = copy.deepcopy(value)
    try:
        league = parse_league(data)
    except ConfigError as err:
        assert err.problems and all(isinstance(p, str) and ":" in p for p in err.problems)
    else:
        assert league.name


@settings(max_examples=60, deadline=None)
@given(data=st.dictionaries(st.text(max_size=10), _values, max_size=5))
def test_random_documents_never_escape_as_tracebacks(data):
    with pytest.raises(ConfigError):
        parse_league(data)


def test_rounds_per_day_needs_kickoff_times():
    club = tomllib.loads((REPO / "sample_leagues" / "club_day.toml").read_text(encoding="utf-8"))
    club["venues"][0]["slots"] = ["09:30", "11:00", "13:30"]
    problems = problems_of(club)
    assert any(p.startswith("calendar.rounds_per_day: 4 rounds on one match day") for p in problems)
    # Without slots the venue has one kick-off per round of the day (kickoff + k * game_minutes).
    club["venues"][0].pop("slots")
    assert parse_league(club).calendar.rounds_per_day == 4


def test_open_ended_season_can_grow_around_rules():
    """Without calendar.end the planner may add match days, so no counting check applies; a
    fixed date must still be an allowed weekday."""
    data = county()
    del data["calendar"]["end"]
    data["calendar"]["excluded"] = []
    data["rules"]["no_home_games"] = data["rules"]["no_home_games"][:1]
    data["rules"]["unavailable"] = [{"team": "Westermoor", "dates": ["2027-08-14..2027-12-31"]}]
    data["rules"]["fixed"][0].pop("round")
    data["rules"]["fixed"][0]["date"] = dt.date(2029, 8, 18)  # a Saturday, far ahead
    assert dt.date(2029, 8, 18).weekday() == 5
    assert parse_league(data).calendar.end is None
    data["rules"]["fixed"][0]["date"] = dt.date(2029, 8, 19)
    problem = only_problem(data)
    assert problem == "rules.fixed[0].date: 2029-08-19 is not a match day of the calendar"
