"""Fair round-robin season planning.

The pipeline reads like the packages: ``config`` -> ``factorization`` -> ``balance`` ->
``calendar`` -> :class:`Season` -> ``export``; ``fairness`` measures any season, ours or not.
"""

from scheduler.errors import (
    ConfigError,
    InfeasibleError,
    InputError,
    OutputError,
    SchedulerError,
)
from scheduler.season import Fixture, MixingInfo, Season

__all__ = [
    "ConfigError",
    "Fixture",
    "InfeasibleError",
    "InputError",
    "MixingInfo",
    "OutputError",
    "SchedulerError",
    "Season",
]

__version__ = "0.1.0"
