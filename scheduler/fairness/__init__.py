"""Fairness figures of any season: breaks, home/away balance, mixing, venue/court/slot balance,
rest days, carry-over and separation, plus the validity check. Computed from the fixtures alone
(never from the engine's bookkeeping); one topic per module:

* ``table``: the season as numpy arrays; ``legs``: legs, scheme and separation;
* ``breaks``: breaks, runs, home counts and the break lower bounds (de Werra 1981);
* ``mixing``: perfect pairs of rounds (the independent verifier) and the cycle-count matrix;
* ``venues``: venue / court / slot use and the balanced-tournament-design check;
* ``rest``: rest days and rest mismatches; ``carryover``: Russell's carry-over matrix;
* ``validity``: is the season a valid round robin (problems naming the source rows);
* ``compute``: :func:`compute_fairness`; ``model``: :class:`FairnessReport`, :class:`TeamFigures`.
"""

from scheduler.fairness.compute import compute_fairness
from scheduler.fairness.model import (
    BYE_CONVENTION,
    FairnessReport,
    ImperfectRoundPair,
    TeamFigures,
)
from scheduler.fairness.validity import Problem, validate_season

__all__ = [
    "BYE_CONVENTION",
    "FairnessReport",
    "ImperfectRoundPair",
    "Problem",
    "TeamFigures",
    "compute_fairness",
    "validate_season",
]
