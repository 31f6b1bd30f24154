"""Anderson's one-factorization GA_{2p} of K_{2p} (p odd).

Vertices ``x_i = (i, 0)`` and ``y_i = (i, 1)`` for ``i`` in ``Z_p``; this module labels ``x_i``
as ``i`` and ``y_i`` as ``p + i``. The rounds are

* ``G_b = {x_b y_b} ∪ {x_{b-j} x_{b+j}, y_{b-j} y_{b+j} : 1 <= j <= (p-1)/2}`` for ``b`` in
  ``Z_p`` (rounds ``0..p-1``), and
* ``H_a = {x_i y_{i+a} : i in Z_p}`` for ``a = 1..p-1`` (rounds ``p..2p-2``).

This is a one-factorization of ``K_{2p}`` for every odd ``p``; it is perfect when ``p`` is prime
(``G_b ∪ G_c`` is two Hamiltonian paths closed by ``x_b y_b`` and ``x_c y_c``; ``H_a ∪ H_c`` is
one cycle because ``a - c`` generates ``Z_p``). For composite ``p`` it is a good but imperfect
starting point (e.g. 1656 of 2346 pairs perfect for ``K_70``).

Reference: B. A. Anderson, "Finite topologies and Hamiltonian paths", J. Combin. Theory Ser. B
14 (1973) 87-93 (the family GA_{2p}); labelling as in docs/one-factorizations.md §2.2, whose
exact match with Anderson's labelling is from memory. Perfection for prime ``p`` is re-checked
by this project's tests with the independent verifier.
"""

from __future__ import annotations

from scheduler.factorization.model import Factorization, normalise_round

SOURCE = "B. A. Anderson, J. Combin. Theory Ser. B 14 (1973) (family GA_2p)"


def anderson_rounds(n: int) -> tuple[tuple[tuple[int, int], ...], ...]:
    """Rounds of GA_n for ``n = 2p`` with ``p`` odd: ``G_0..G_{p-1}`` then ``H_1..H_{p-1}``.

    Parameters
    ----------
    n
        The order, ``2p`` with ``p`` odd.

    Returns
    -------
    tuple of rounds
        ``n - 1`` rounds of games on ``0..n-1``.

    Raises
    ------
    ValueError
        When ``n`` is not twice an odd number.

    Examples
    --------
    >>> rounds = anderson_rounds(6)
    >>> rounds[0]
    ((0, 3), (1, 2), (4, 5))
    >>> from scheduler.factorization.verify import verify_rounds
    >>> verify_rounds(6, rounds).perfect  # p = 3 is prime (Anderson 1973)
    True
    """
    if n < 2 or n % 4 != 2:
        raise ValueError(f"GA_n needs n = 2p with p odd, got {n}")
    p = n // 2

    def x(i: int) -> int:
        return i % p

    def y(i: int) -> int:
        return p + i % p

    rounds = []
    for b in range(p):
        games = [(x(b), y(b))]
        for j in range(1, (p - 1) // 2 + 1):
            games.append((x(b - j), x(b + j)))
            games.append((y(b - j), y(b + j)))
        rounds.append(normalise_round(games))
    for a in range(1, p):
        rounds.append(normalise_round((x(i), y(i + a)) for i in range(p)))
    return tuple(rounds)


def anderson_factorization(n: int) -> Factorization:
    """GA_n, Anderson's one-factorization of ``K_n`` for ``n = 2p``, ``p`` odd.

    Parameters
    ----------
    n
        The order, ``2p`` with ``p`` odd.

    Returns
    -------
    Factorization
        The rounds ``G_0..G_{p-1}`` then ``H_1..H_{p-1}`` of :func:`anderson_rounds`; perfect
        when ``p`` is prime.

    Raises
    ------
    ValueError
        When ``n`` is not twice an odd number.

    References
    ----------
    B. A. Anderson, "Finite topologies and Hamiltonian paths", J. Combin. Theory Ser. B 14
    (1973) 87-93; ``docs/one-factorizations.md`` §2.2.

    Examples
    --------
    >>> from scheduler.factorization import anderson_factorization, verify_rounds
    >>> ga10 = anderson_factorization(10)
    >>> ga10.method
    'Anderson GA_10'
    >>> verify_rounds(10, ga10.rounds).perfect
    True
    """
    return Factorization(
        n, anderson_rounds(n), f"Anderson GA_{n}", SOURCE, {"construction": "GA", "p": n // 2}
    )
