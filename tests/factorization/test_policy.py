"""``factorize``: perfect wherever a formula or the catalogue covers the order.

Sources: GK_n perfect for n - 1 prime (Kotzig 1964; Wallis 1997), GA_n perfect for n/2 prime
(Anderson 1973), catalogue entries (re-verified in test_catalogue). Every result here is
re-checked by the independent verifier.
"""

from __future__ import annotations

import math
import subprocess
import sys

import pytest

from scheduler.errors import InputError
from scheduler.factorization.catalogue import catalogue_orders
from scheduler.factorization.policy import MAX_TEAMS, factorize, known_perfect
from scheduler.factorization.verify import verify_rounds


def _is_prime(k):
    return k >= 2 and all(k % d for d in range(2, math.isqrt(k) + 1))


COVERED = sorted(
    {2}
    | {n for n in range(4, 63, 2) if _is_prime(n - 1) or _is_prime(n // 2)}
    | set(catalogue_orders())
)


def test_every_even_order_up_to_34_is_covered():
    assert [n for n in range(2, 35, 2) if n not in COVERED] == []


@pytest.mark.parametrize("n", COVERED)
def test_perfect_for_covered_orders(n):
    for teams in (n, n - 1):
        if teams < 2:
            continue
        f = factorize(teams)
        assert f.n == n
        cert = verify_rounds(f.n, f.rounds)
        assert cert.valid and cert.perfect, (teams, f.method)
        assert f.details["teams"] == teams
        assert f.details["bye"] == (teams % 2 == 1)
        assert f.details["p1f_known"] is True


def test_method_names_the_construction():
    assert factorize(12).method == "circle GK_12"
    assert factorize(10).method == "Anderson GA_10"
    f = factorize(15)
    assert f.method == "starter in Z_15 (catalogue)"
    assert "found by this project's search" in f.source and f.details["bye_vertex"] == 15


def test_cheap_orders_do_not_load_numba():
    """The formula and catalogue paths never compile or import numba."""
    code = (
        "import sys\n"
        "from scheduler.factorization import factorize\n"
        f"for t in {COVERED}:\n"
        "    factorize(t).certificate()\n"
        "assert 'numba' not in sys.modules, 'numba imported'\n"
    )
    subprocess.run([sys.executable, "-c", code], check=True, timeout=120)


def test_uncovered_order_is_honest_and_deterministic():
    a = factorize(64, seed=3, budget=0.5)
    b = factorize(64, seed=3, budget=0.5)
    assert a.rounds == b.rounds and a.method == b.method
    cert = a.certificate()
    assert cert.valid and cert.perfect_pairs == a.details["perfect_pairs"]
    assert a.details["p1f_known"] is False
    assert "best available" in " ".join(a.details["tried"])
    assert cert.perfect_pairs > 1134  # better than GK_64


@pytest.mark.parametrize(
    "bad", [True, False, 2.0, "12", None, 1, 0, -4, MAX_TEAMS + 1, 10**7, 10**100]
)
def test_bad_team_counts(bad):
    with pytest.raises(InputError) as err:
        factorize(bad)
    assert err.value.location == "teams"


@pytest.mark.parametrize(
    ("kwargs", "where"),
    [({"seed": 1.0}, "seed"), ({"seed": True}, "seed"), ({"budget": 0}, "budget"),
     ({"budget": float("nan")}, "budget"), ({"budget": "5"}, "budget")],
)
def test_bad_seed_or_budget(kwargs, where):
    with pytest.raises(InputError) as err:
        factorize(12, **kwargs)
    assert err.value.location == where


def test_known_perfect_reasons():
    assert known_perfect(12)[0] and "prime" in known_perfect(12)[1]
    assert known_perfect(22)[0]
    assert known_perfect(52) == (True, known_perfect(52)[1]) and "Wolfe" in known_perfect(52)[1]
    assert known_perfect(64)[0] is False
    assert MAX_TEAMS >= 1000
