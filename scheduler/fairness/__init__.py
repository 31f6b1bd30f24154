"""Fairness figures of any season: breaks, home/away balance, mixing, venue/court/slot balance,
rest days, carry-over and separation. Computed from the fixtures alone; one topic per module."""

from scheduler.fairness.compute import compute_fairness
from scheduler.fairness.model import (
    BYE_CONVENTION,
    FairnessReport,
    ImperfectRoundPair,
    TeamFigures,
)

__all__ = [
    "BYE_CONVENTION",
    "FairnessReport",
    "ImperfectRoundPair",
    "TeamFigures",
    "compute_fairness",
]
