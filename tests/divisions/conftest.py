"""A small federation for the division tests: four short divisions on a few Saturdays.

Invented clubs and towns. ``North`` (6 teams, home grounds) and ``Reserves`` (4 teams) share
three grounds, one of them as a complementary pair; ``Hall A`` and ``Hall B`` (4 teams each,
"home" a side) share a four-court hall; a player group joins a ``North`` team and a ``Hall A``
team. ``Lone`` (4 teams) shares nothing and forms its own unit.
"""

from __future__ import annotations

import textwrap
from pathlib import Path

import pytest

SMALL_FEDERATION = textwrap.dedent(
    """
    [federation]
    name = "Test Vale Association"
    season = "2027"
    timezone = "Europe/London"
    seed = 0
    solve_seconds = 1

    [calendar]
    start = 2027-09-04
    end = 2027-12-31
    weekdays = ["sat"]
    kickoff = "14:00"
    game_minutes = 90

    [[venues]]
    name = "Oxlow Ground"
    [[venues]]
    name = "Pimbury Ground"
    [[venues]]
    name = "Quenby Ground"
    [[venues]]
    name = "Rushmere Ground"
    [[venues]]
    name = "Stallow Ground"
    [[venues]]
    name = "Tembry Ground"
    [[venues]]
    name = "Ulverdown Ground"
    [[venues]]
    name = "Vexby Hall"
    courts = ["Court 1", "Court 2", "Court 3", "Court 4"]
    slots = ["09:00", "10:00", "11:00"]
    [[venues]]
    name = "Zell Park"
    courts = ["North pitch", "South pitch"]

    [[divisions]]
    name = "North"
    teams = [
      { name = "Oxlow", home_venue = "Oxlow Ground" },
      { name = "Pimbury", home_venue = "Pimbury Ground" },
      { name = "Quenby", home_venue = "Quenby Ground" },
      { name = "Rushmere", home_venue = "Rushmere Ground" },
      { name = "Stallow", home_venue = "Stallow Ground" },
      { name = "Tembry", home_venue = "Tembry Ground" },
    ]

    [[divisions]]
    name = "Reserves"
    format = { legs = 2 }
    teams = [
      { name = "Oxlow Reserves", home_venue = "Oxlow Ground" },
      { name = "Pimbury Reserves", home_venue = "Pimbury Ground" },
      { name = "Quenby Reserves", home_venue = "Quenby Ground" },
      { name = "Ulverdown Reserves", home_venue = "Ulverdown Ground" },
    ]

    [[divisions]]
    name = "Hall A"
    format = { home_meaning = "side" }
    venues = ["Vexby Hall"]
    calendar = { game_minutes = 50 }
    teams = [{ name = "Oxlow Minis" }, { name = "Vexby Minis" }, { name = "Wend Minis" },
             { name = "Yarl Minis" }]

    [[divisions]]
    name = "Hall B"
    format = { home_meaning = "side" }
    venues = ["Vexby Hall"]
    calendar = { game_minutes = 50 }
    teams = [{ name = "Oxlow Kids" }, { name = "Vexby Kids" }, { name = "Wend Kids" },
             { name = "Yarl Kids" }]

    [[divisions]]
    name = "Lone"
    format = { home_meaning = "side" }
    venues = ["Zell Park"]
    calendar = { kickoff = "11:00" }
    teams = [{ name = "Zell" }, { name = "Abbing" }, { name = "Brill" }, { name = "Corve" }]

    [[shared_grounds]]
    teams = ["Oxlow", "Oxlow Reserves"]
    pattern = "complementary"

    [[player_groups]]
    name = "Oxlow juniors"
    teams = ["Oxlow Minis", "Oxlow Kids"]

    [[clubs]]
    name = "Oxlow"
    teams = ["Oxlow", "Oxlow Reserves", "Oxlow Minis", "Oxlow Kids"]

    [[clubs]]
    name = "Vexby"
    teams = ["Vexby Minis", "Vexby Kids"]
    """
)


@pytest.fixture(scope="session")
def small_text() -> str:
    return SMALL_FEDERATION


@pytest.fixture
def small_federation_file(tmp_path: Path) -> Path:
    path = tmp_path / "config" / "federation.toml"
    path.parent.mkdir()
    path.write_text(SMALL_FEDERATION, encoding="utf-8")
    return path
