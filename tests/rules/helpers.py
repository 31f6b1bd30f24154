"""Small builders of League objects for the rules tests: the same ones as the balance tests
(invented clubs), imported from there so that the two suites build leagues one way."""

from __future__ import annotations

from tests.balance.helpers import HALL, TOWNS, league

__all__ = ["HALL", "TOWNS", "league"]
