"""season.json: round trip, determinism, layout, and located errors.

The text is checked with Python's standard ``json`` module (RFC 8259) and the date-times with
``datetime.fromisoformat`` (ISO 8601 with a UTC offset).
"""

from __future__ import annotations

import json
import random
from datetime import date, datetime
from zoneinfo import ZoneInfo

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from scheduler.audit.readers import read_schedule
from scheduler.errors import InputError
from scheduler.export.season_json import (
    FORMAT,
    dumps_season,
    load_season_json,
    loads_season,
    season_from_dict,
    season_to_dict,
)
from scheduler.fairness import compute_fairness
from scheduler.season import Fixture, MixingInfo, Season
from tests.fairness.constructions import canonical_rounds, odd_from_even


def _season() -> Season:
    zone = ZoneInfo("Europe/Vienna")
    names = ["Álmos Kör", "Brückenau", "Cedar Row", "Dunmore", "Eastmere"]
    rounds = odd_from_even(canonical_rounds(6), dummy=6)
    fixtures = []
    byes = {}
    for r, games in enumerate(rounds):
        playing = set()
        for g, (h, a) in enumerate(games):
            day = date(2031, 3, 1 + 7 * r)
            fixtures.append(
                Fixture(
                    round=r + 1, home=names[h - 1], away=names[a - 1], leg=1,
                    venue="Lindenhalle", court=f"Feld {g + 1}", slot="früh" if g else None,
                    date=day, start=datetime(2031, 3, 1 + 7 * r, 18 + g, 30, tzinfo=zone),
                )
            )
            playing.update((h, a))
        byes[r + 1] = tuple(names[t - 1] for t in range(1, 6) if t not in playing)
    return Season(
        league="Donau Abendliga", season_id="2031", teams=tuple(names), fixtures=tuple(fixtures),
        byes=byes, legs=1, scheme="mirrored", timezone="Europe/Vienna", venues=("Lindenhalle",),
        mixing=MixingInfo("circle GK_6", "Kotzig 1964", True, 10, 10), seed=42,
        notes=("invented test league",), revision="r1",
    )


def test_round_trip_gives_an_equal_season():
    season = _season()
    text = dumps_season(season, compute_fairness(season))
    back = loads_season(text)
    assert back == season
    assert all(f.start.tzinfo == ZoneInfo("Europe/Vienna") for f in back.fixtures)
    assert dumps_season(back, compute_fairness(back)) == text


def test_text_is_deterministic_utf8_with_trailing_newline():
    season = _season()
    a = dumps_season(season, compute_fairness(season))
    b = dumps_season(season, compute_fairness(season))
    assert a == b
    assert a.endswith("}\n") and not a.endswith("\n\n")
    assert "Álmos Kör" in a and "\\u" not in a
    assert a.startswith('{\n  "format": ')


def test_layout_and_fairness_block():
    season = _season()
    data = json.loads(dumps_season(season, compute_fairness(season)))
    assert data["format"] == FORMAT
    assert list(data)[:4] == ["format", "league", "season", "timezone"]
    first = data["fixtures"][0]
    assert list(first) == ["round", "leg", "date", "start", "home", "away", "venue", "court",
                           "slot", "place", "time"]
    assert datetime.fromisoformat(first["start"]).utcoffset() is not None
    assert first["round"] == 1 and first["time"] == "18:30"
    assert data["fixtures"][1]["place"] == "Feld 2 · früh"
    assert list(data["byes"]) == [str(r) for r in sorted(season.byes)]
    fair = data["fairness"]
    for key in ("breaks_total", "carry_over_value", "perfect_pairs", "pairs"):
        assert key in fair
    assert fair["pairs"] == 10  # odd league of 5: C(5, 2) pairs of pairings with a bye vertex


def test_without_fairness_and_via_the_file_readers(tmp_path):
    season = _season()
    path = tmp_path / "season.json"
    path.write_text(dumps_season(season, None), encoding="utf-8")
    assert json.loads(path.read_text(encoding="utf-8"))["fairness"] is None
    assert load_season_json(path) == season
    assert read_schedule(path) == season


def test_season_to_dict_matches_dumps():
    season = _season()
    assert json.loads(dumps_season(season)) == season_to_dict(season)


@pytest.mark.parametrize(
    "mutate,where",
    [
        (lambda d: d.update(format="other/1"), "format"),
        (lambda d: d.update(format="roundrobin-scheduler/season/9"), "format"),
        (lambda d: d["fixtures"][2].pop("home"), "fixtures[2].home"),
        (lambda d: d["fixtures"][1].update(round="three"), "fixtures[1].round"),
        (lambda d: d["fixtures"][0].update(start="2031-03-01T18:30:00"), "fixtures[0].start"),
        (lambda d: d["fixtures"][0].update(date="1 March"), "fixtures[0].date"),
        (lambda d: d.update(timezone="Mars/Olympus"), "timezone"),
        (lambda d: d.update(byes={"x": []}), "byes.x"),
        (lambda d: d.update(teams=[1, 2]), "teams[0]"),
    ],
)
def test_bad_documents_raise_located_errors(mutate, where):
    data = json.loads(dumps_season(_season()))
    mutate(data)
    with pytest.raises(InputError) as info:
        season_from_dict(data)
    assert info.value.location == where


def test_bad_json_names_line_and_column(tmp_path):
    path = tmp_path / "broken.json"
    path.write_text('{\n  "format": "roundrobin-scheduler/season/1",\n  "league": ,\n}\n')
    with pytest.raises(InputError) as info:
        load_season_json(path)
    assert "line 3" in str(info.value) and "broken.json" in str(info.value)


_names = st.text(
    alphabet=st.characters(blacklist_categories=("Cs", "Cc")), min_size=1, max_size=12
).map(str.strip).filter(bool)


@settings(max_examples=40, deadline=None)
@given(
    names=st.lists(_names, min_size=2, max_size=7, unique=True),
    seed=st.integers(0, 2**31),
    with_times=st.booleans(),
)
def test_round_trip_of_random_seasons(names, seed, with_times):
    """dumps -> loads gives an equal Season, and dumping again gives the same text."""
    rng = random.Random(seed)
    zone = ZoneInfo("America/Halifax")
    fixtures = []
    for r in range(rng.randint(1, 4)):
        a, b = rng.sample(names, 2)
        start = None
        if with_times:
            start = datetime(2031, 1 + r, 3, rng.randint(8, 21), 15, tzinfo=zone)
        fixtures.append(Fixture(round=r + 1, home=a, away=b, leg=1,
                                venue=rng.choice([None, "Bay Hall"]),
                                court=rng.choice([None, "2"]), slot=rng.choice([None, "late"]),
                                date=start.date() if start else None, start=start))
    season = Season(league=rng.choice(names), season_id="x", teams=tuple(names),
                    fixtures=tuple(fixtures), byes={2: (names[0],)},
                    timezone="America/Halifax" if with_times else None, seed=seed)
    text = dumps_season(season, compute_fairness(season))
    back = loads_season(text)
    assert back == season
    assert dumps_season(back, compute_fairness(back)) == text


def test_presentation_fields_round_trip_and_older_files_stay_as_they_were():
    """Side labels, addresses, map positions and the calendar's end survive a write and a read
    (the standard json module reads the file; the RFC 8259 object keys are checked by name)."""
    import json
    from datetime import date

    from scheduler.export.season_json import dumps_season, loads_season
    from scheduler.season import Fixture, Season

    games = (Fixture(round=1, home="Upper Foxley", away="Sorrel Street", date=date(2031, 5, 3)),)
    season = Season(
        league="L", season_id="S", teams=("Upper Foxley", "Sorrel Street"), fixtures=games,
        home_meaning="side", side_labels=("White", "Black"),
        venue_addresses={"Lantern Room": "1 Quay Row, Marrowby"},
        venue_coordinates={"Lantern Room": (54.25, -0.5)}, calendar_end=date(2031, 6, 1),
    )
    text = dumps_season(season)
    data = json.loads(text)
    assert data["side_labels"] == ["White", "Black"] and data["home_meaning"] == "side"
    assert data["venue_coordinates"] == {"Lantern Room": [54.25, -0.5]}
    assert loads_season(text) == season
    plain = Season(league="L", season_id="S", teams=season.teams, fixtures=games)
    keys = set(json.loads(dumps_season(plain)))
    assert not keys & {"home_meaning", "side_labels", "venue_addresses", "venue_coordinates",
                       "calendar_end"}
