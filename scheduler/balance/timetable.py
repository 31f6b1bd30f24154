"""Solve the timetable of one factorization under a league's rules: :func:`solve_timetable`.

The model itself is :class:`scheduler.balance.timetable_model.TimetableModel`; the rules' own
constraints live in :mod:`scheduler.rules`; the first solution in
:mod:`scheduler.balance.starting_point`; solver parameters in :mod:`scheduler.balance.solver`.

Determinism: one CP-SAT worker, a fixed ``random_seed`` and ``max_deterministic_time``; the
wall-clock limit is only a safety net (reported when hit).
"""

from __future__ import annotations

from scheduler.balance.solver import SolveLimits, configure
from scheduler.balance.starting_point import canonical_hint
from scheduler.balance.timetable_model import Timetable, TimetableModel
from scheduler.config.model import League
from scheduler.errors import InfeasibleError
from scheduler.factorization.model import Factorization

__all__ = ["SolveLimits", "Timetable", "TimetableModel", "canonical_hint", "configure",
           "solve_timetable"]


def solve_timetable(league: League, fact: Factorization, limits: SolveLimits, *,
                    minimise_breaks: bool = True,
                    fixed_order: tuple[int, ...] | None = None,
                    start_home: dict[tuple[int, int], bool] | None = None) -> Timetable:
    """Build and solve the timetable model; raises ``InfeasibleError`` naming the rules.

    The earliest match days are tried first (half the limit); only when the rules cannot hold on
    them is the choice of days opened up (then the model prefers early days).

    Parameters
    ----------
    league : League
        The league and its rules.
    fact : Factorization
        The round pairings (K_n, n even; an odd league's bye is vertex n - 1).
    limits : SolveLimits
        Deterministic and wall-clock limits, seed.
    minimise_breaks : bool
        Minimise the breaks (else only the lateness of the match days).
    fixed_order, start_home : optional
        A leg-1 round order to keep and the venues to start from (the carry-over search).

    Returns
    -------
    Timetable

    Raises
    ------
    InfeasibleError
        When the rules cannot all hold with these pairings (naming a minimal set of them), or
        no timetable was found in the time limit.

    References
    ----------
    ``docs/rules.md``; ``docs/leg-schemes.md``.

    Examples
    --------
    >>> from scheduler.config import parse_league
    >>> from scheduler.factorization import circle_factorization
    >>> clubs = ["Quenby", "Larkholt", "Ebbside", "Morrow"]
    >>> league = parse_league({
    ...     "league": {"name": "Quenby Four", "season": "2031", "timezone": "Europe/London"},
    ...     "calendar": {"start": "2031-01-07", "end": "2031-04-29", "weekdays": ["tue"]},
    ...     "venues": [{"name": f"{club} Hall"} for club in clubs],
    ...     "teams": [{"name": club, "home_venue": f"{club} Hall"} for club in clubs]})
    >>> timetable = solve_timetable(league, circle_factorization(4), SolveLimits(5.0, 60.0, 0))
    >>> [(league.teams[home].name, league.teams[away].name) for home, away in timetable.games[0]]
    [('Larkholt', 'Ebbside'), ('Morrow', 'Quenby')]
    """
    first = TimetableModel(league, fact, minimise_breaks=minimise_breaks, fixed_order=fixed_order,
                           earliest_days=True, effort=limits.deterministic,
                           start_home=start_home)
    if first.days is None or len(first.candidate_days) == len(first.day_groups):
        return first.solve(limits)
    half = SolveLimits(limits.deterministic / 2, limits.wall / 2, limits.seed)
    try:
        return first.solve(half, explain_failure=False)
    except InfeasibleError:
        pass
    model = TimetableModel(league, fact, minimise_breaks=minimise_breaks, fixed_order=fixed_order,
                           effort=limits.deterministic, start_home=start_home)
    return model.solve(half)
