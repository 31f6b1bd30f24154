"""The Examples sections of the rules, leg-scheme, break and carry-over modules run as doctests
(the examples are the documentation; this keeps them true)."""

from __future__ import annotations

import doctest
import importlib

import pytest

MODULES = [
    "scheduler.rules",
    "scheduler.rules.rest_days",
    "scheduler.leg_schemes",
    "scheduler.home_away",
    "scheduler.carry_over",
    "scheduler.plan",
    "scheduler.balance.explain",
    "scheduler.config.contradictions",
]


@pytest.mark.parametrize("name", MODULES)
def test_examples(name):
    module = importlib.import_module(name)
    failures, tried = doctest.testmod(module, optionflags=doctest.ELLIPSIS)
    assert tried > 0 and failures == 0
