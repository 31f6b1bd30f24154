"""Small builders of League objects for the rules tests (invented clubs; as in tests/balance)."""

from __future__ import annotations

from datetime import date

from scheduler.config.model import (
    CalendarSpec,
    Format,
    League,
    Priorities,
    Rules,
    Team,
    Venue,
)

TOWNS = ("Alder Vale", "Brook Farm", "Cobble Hill", "Dunmere", "Elm Quay", "Fernwick",
         "Gorse Bank", "Harbour Town", "Ivy Cross", "Juniper Row", "Kelp Point", "Larch End",
         "Mossford", "Nettle Green", "Oak Hollow", "Pebble Strand", "Quarry Lane", "Rushmoor",
         "Sedge Park", "Thornby")


HALL = Venue("Central Hall", courts=tuple(f"Court {i}" for i in range(1, 7)))
"""Six courts, one kick-off: room for every round of up to 12 teams."""


def league(teams: int, *, legs: int = 1, scheme: str = "mirrored", rules: Rules | None = None,
           venues: tuple[Venue, ...] | None = None, mode: str = "side",
           priorities: Priorities | None = None, calendar: CalendarSpec | None = None,
           home_venues: dict[str, str] | None = None, seed: int = 0,
           solve_seconds: float = 4.0) -> League:
    home_venues = home_venues or {}
    ts = tuple(Team(n, n[:3].upper() + str(i), home_venues.get(n)) for i, n in
               enumerate(TOWNS[:teams]))
    return League(
        name="Test League", season="2027", timezone="Europe/London", teams=ts,
        venues=venues if venues is not None else (HALL,),
        format=Format(legs=legs, scheme=scheme, home_meaning=mode),
        calendar=calendar or CalendarSpec(start=date(2027, 1, 2)),
        rules=rules or Rules(), priorities=priorities or Priorities(), seed=seed,
        solve_seconds=solve_seconds)
