"""League configuration: read a TOML/YAML league file into validated, frozen values.

``load_league(path)`` and ``parse_league(data)`` return a :class:`League`; every problem is a
:class:`scheduler.errors.ConfigError` naming the field. ``write_starter_config`` writes the
commented starter file; ``template_path``/``sample_path`` find shipped files.
"""

from scheduler.config.loader import load_league, parse_league
from scheduler.config.model import (
    CalendarSpec,
    FixedFixture,
    Format,
    League,
    Priorities,
    Rules,
    Team,
    TeamDates,
    Venue,
)
from scheduler.config.resources import sample_names, sample_path, template_path
from scheduler.config.starter import starter_config_text, write_starter_config

__all__ = [
    "CalendarSpec",
    "FixedFixture",
    "Format",
    "League",
    "Priorities",
    "Rules",
    "Team",
    "TeamDates",
    "Venue",
    "load_league",
    "parse_league",
    "sample_names",
    "sample_path",
    "starter_config_text",
    "template_path",
    "write_starter_config",
]
