"""Calendar: the season's match days and kick-off datetimes (no pairing decisions).

``match_days`` lists the dates games may be played on, ``days_needed``/``rounds_needed`` say how
many the league needs, ``round_days`` maps rounds to dates when every match day is used in order,
``kickoff`` turns a match day and a time slot into an aware datetime on the league's clock.
"""

from scheduler.calendar.days import (
    days_needed,
    match_days,
    public_holidays,
    round_days,
    rounds_needed,
)
from scheduler.calendar.kickoff import game_end, kickoff, local_datetime, parse_slot
from scheduler.calendar.spec import CalendarLeague, CalendarSpec

__all__ = [
    "CalendarLeague",
    "CalendarSpec",
    "days_needed",
    "game_end",
    "kickoff",
    "local_datetime",
    "match_days",
    "parse_slot",
    "public_holidays",
    "round_days",
    "rounds_needed",
]
