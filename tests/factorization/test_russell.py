"""Russell's balanced carry-over schedules against the published bound.

Source: K. G. Russell, "Balancing carry-over effects in round robin tournaments", Biometrika 67
(1980) 127-131: every schedule has carry-over effects value at least n(n-1), and for n a power
of two a schedule reaching it exists. The carry-over count used here is the fairness layer's
(:mod:`scheduler.fairness.carryover`, itself tested against the published circle-method maximum
(n-1)(n^2-6n+12) of Lambrechts, Ficker, Goossens & Spieksma, Math. Programming 172 (2018)); the
factorization is checked by the independent verifier.
"""

from __future__ import annotations

import numpy as np
import pytest

from scheduler.errors import InputError
from scheduler.factorization.russell import russell_factorization
from scheduler.factorization.verify import verify_rounds
from scheduler.fairness.carryover import carry_over_matrix, carry_over_value, coe_bounds


@pytest.mark.parametrize("n", [4, 8, 16, 32])
def test_russell_reaches_the_lower_bound(n):
    fact = russell_factorization(n)
    assert verify_rounds(n, fact.rounds).valid
    matrix = carry_over_matrix(np.array(fact.partner_table()))
    off = ~np.eye(n, dtype=bool)
    assert (matrix[off] == 1).all() and (np.diag(matrix) == 0).all()
    lower, upper = coe_bounds(n)
    assert carry_over_value(matrix) == lower == n * (n - 1)
    assert lower < upper or n == 4


@pytest.mark.parametrize("n", [6, 12, 3, 2048])
def test_russell_refuses_other_orders(n):
    with pytest.raises(InputError):
        russell_factorization(n)
