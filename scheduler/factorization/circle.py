"""The circle construction GK_n (Kotzig's patterned one-factorization).

Vertices ``Z_m`` plus a fixed vertex ``∞`` (here ``m = n - 1`` is odd and ``∞`` is vertex ``m``).
Round ``i`` (``i`` in ``Z_m``) is ``{∞, i}`` together with ``{i - j, i + j}`` for
``j = 1..n/2 - 1``.

The union of rounds ``i`` and ``j`` is a Hamiltonian cycle exactly when ``gcd(j - i, m) = 1``,
so GK_n is perfect exactly when ``n - 1`` is prime.

References: A. Kotzig, "Hamilton graphs and Hamilton circuits", Theory of Graphs and its
Applications (Proc. Symp. Smolenice 1963), 1964; W. D. Wallis, *One-Factorizations*, Kluwer 1997,
ch. 16 (the patterned factorization GK_{2n}).
"""

from __future__ import annotations

from scheduler.factorization.model import Factorization, normalise_round

SOURCE = "A. Kotzig 1964 (patterned one-factorization GK_n); W. D. Wallis, One-Factorizations, 1997"


def circle_rounds(n: int) -> tuple[tuple[tuple[int, int], ...], ...]:
    """The rounds of GK_n in their natural order ``i = 0..n-2``.

    Parameters
    ----------
    n
        The even order, at least 2.

    Returns
    -------
    tuple of rounds
        ``n - 1`` rounds of games on ``0..n-1``.

    Raises
    ------
    ValueError
        For an odd ``n`` or ``n < 2``.

    Examples
    --------
    >>> circle_rounds(4)
    (((0, 3), (1, 2)), ((0, 2), (1, 3)), ((0, 1), (2, 3)))
    """
    if n < 2 or n % 2:
        raise ValueError(f"GK_n needs an even n >= 2, got {n}")
    m = n - 1
    rounds = []
    for i in range(m):
        games = [(m, i)]
        games += [((i - j) % m, (i + j) % m) for j in range(1, n // 2)]
        rounds.append(normalise_round(games))
    return tuple(rounds)


def circle_factorization(n: int) -> Factorization:
    """GK_n, the circle (polygon) one-factorization of K_n.

    Parameters
    ----------
    n
        The even order (number of vertices), at least 2.

    Returns
    -------
    Factorization
        The ``n - 1`` rounds of :func:`circle_rounds`, vertex ``n - 1`` the fixed vertex ``∞``.
        It is perfect exactly when ``n - 1`` is prime.

    Raises
    ------
    ValueError
        For an odd ``n`` or ``n < 2``.

    References
    ----------
    A. Kotzig, "Hamilton graphs and Hamilton circuits", 1964; W. D. Wallis,
    *One-Factorizations*, Kluwer 1997, ch. 16; ``docs/one-factorizations.md``.

    Examples
    --------
    >>> from scheduler.factorization import circle_factorization, verify_rounds
    >>> gk6 = circle_factorization(6)
    >>> gk6.method
    'circle GK_6'
    >>> gk6.rounds[0]
    ((0, 5), (1, 4), (2, 3))
    >>> verify_rounds(6, gk6.rounds).perfect
    True
    """
    return Factorization(n, circle_rounds(n), f"circle GK_{n}", SOURCE, {"construction": "GK"})
