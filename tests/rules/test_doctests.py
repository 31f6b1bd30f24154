"""The Examples sections of the package run as doctests (the examples are the documentation;
this keeps them true).

Every module of ``scheduler/`` whose source holds ``>>>`` is collected, except the numba kernel
modules (``_*_kernel.py``), so that a new example is tested without being listed here. Examples
that would need the user's files or a long solve are marked ``# doctest: +SKIP`` at the example.
"""

from __future__ import annotations

import doctest
import importlib
from pathlib import Path

import pytest

PACKAGE = Path(__file__).resolve().parents[2] / "scheduler"


def _modules_with_examples() -> list[str]:
    names = []
    for path in sorted(PACKAGE.rglob("*.py")):
        if path.name.endswith("_kernel.py") or ">>>" not in path.read_text(encoding="utf-8"):
            continue
        parts = path.relative_to(PACKAGE.parent).with_suffix("").parts
        if parts[-1] == "__init__":
            parts = parts[:-1]
        names.append(".".join(parts))
    return names


MODULES = _modules_with_examples()


def test_the_modules_listed_so_far_are_collected():
    # the modules whose examples this test ran before it collected them by itself
    earlier = {
        "scheduler.rules", "scheduler.rules.rest_days", "scheduler.leg_schemes",
        "scheduler.home_away", "scheduler.carry_over", "scheduler.plan",
        "scheduler.balance.explain", "scheduler.config.contradictions",
    }
    assert earlier <= set(MODULES)


@pytest.mark.parametrize("name", MODULES)
def test_examples(name):
    module = importlib.import_module(name)
    finder = doctest.DocTestFinder()
    runner = doctest.DocTestRunner(optionflags=doctest.ELLIPSIS)
    ran = 0
    for test in finder.find(module, name):
        result = runner.run(test)
        ran += len(test.examples)
        assert result.failed == 0, f"{test.name}: {result.failed} example(s) failed"
    assert ran > 0
