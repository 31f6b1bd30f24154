"""Small invented leagues built by hand (no balancer): circle-method rounds, dates, venues.

The pairings come from the circle method as described by E. Lucas (Récréations
mathématiques, 1883) and de Werra (1981): team n fixed, the others rotating. They are written
out here literally so the tests do not depend on the project's own factorization code.
"""

from __future__ import annotations

from dataclasses import replace
from datetime import date, datetime, timedelta
from zoneinfo import ZoneInfo

from scheduler.season import Fixture, MixingInfo, Season

ZONE = ZoneInfo("Europe/Brussels")

TRICKY = 'Saints, "Old"; Boys\nB'
FORMULA = "=cmd|' /C calc'!A0"
AT_SUM = "@SUM(1)"


def circle_rounds(n: int) -> list[list[tuple[int, int]]]:
    """Circle method for even n: round r pairs (r, n-1) and (r+k, r-k) mod n-1 (0-based)."""
    m = n - 1
    rounds = []
    for r in range(m):
        games = [(r, m) if r % 2 == 0 else (m, r)]
        for k in range(1, n // 2):
            games.append(((r + k) % m, (r - k) % m))
        rounds.append(games)
    return rounds


def make_season(
    teams: tuple[str, ...] = ("Ashford Rovers", "Brookvale", "Cedar Hill", "Dunmore Town"),
    *,
    legs: int = 2,
    start: date = date(2026, 9, 5),
    kickoff: tuple[int, int] = (15, 0),
    revision: str = "r1",
    timezone: str | None = "Europe/Brussels",
) -> Season:
    """A double round robin (mirrored) of the given teams, one round per Saturday.

    An odd number of teams gets a dummy opponent whose games become byes.
    """
    names = list(teams)
    odd = len(names) % 2 == 1
    n = len(names) + (1 if odd else 0)
    base = circle_rounds(n)
    fixtures = []
    byes: dict[int, tuple[str, ...]] = {}
    venues = tuple(f"{t} Ground" for t in names)
    zone = ZoneInfo(timezone) if timezone else ZONE
    number = 0
    for leg in range(1, legs + 1):
        for games in base:
            number += 1
            day = start + timedelta(days=7 * (number - 1))
            court = 0
            for h, a in games:
                if leg % 2 == 0:
                    h, a = a, h
                if odd and n - 1 in (h, a):
                    byes[number] = (names[a if h == n - 1 else h],)
                    continue
                court += 1
                kick = datetime(day.year, day.month, day.day, *kickoff, tzinfo=zone)
                fixtures.append(
                    Fixture(
                        round=number,
                        home=names[h],
                        away=names[a],
                        leg=leg,
                        venue=venues[h],
                        court=f"Pitch {court}",
                        slot=f"{kickoff[0]:02d}:{kickoff[1]:02d}",
                        date=day,
                        start=kick,
                    )
                )
    return Season(
        league="Valley Friendly League",
        season_id="2026-27",
        teams=tuple(names),
        fixtures=tuple(fixtures),
        byes=byes,
        legs=legs,
        scheme="mirrored",
        timezone=timezone,
        venues=venues,
        mixing=MixingInfo("circle", "Lucas 1883 / de Werra 1981", n <= 4, 0, 0),
        seed=1,
        notes=("hand-built test season",),
        revision=revision,
    )


def move_fixture(season: Season, index: int, days: int, revision: str) -> Season:
    """The same season with fixture ``index`` moved by ``days`` (same teams, leg and round)."""
    fixtures = list(season.fixtures)
    f = fixtures[index]
    fixtures[index] = replace(
        f, date=f.date + timedelta(days=days), start=f.start + timedelta(days=days)
    )
    return replace(season, fixtures=tuple(fixtures), revision=revision)


def drop_fixture(season: Season, index: int, revision: str) -> Season:
    fixtures = list(season.fixtures)
    del fixtures[index]
    return replace(season, fixtures=tuple(fixtures), revision=revision)
