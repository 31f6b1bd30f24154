"""The non-dominated schedules over perfect pairs, breaks and carry-over.

A schedule option is described by three figures: the number of *perfect pairs* of rounds (two
rounds whose games form one Hamiltonian cycle; more is better), its *breaks* (fewer is better)
and its *carry-over effects value* (lower is better). Option ``a`` *dominates* ``b`` when it is
at least as good in every figure and strictly better in one (Pareto dominance; V. Pareto,
*Manuale di economia politica*, 1906; the standard multi-objective definition, e.g.
M. Ehrgott, *Multicriteria Optimization*, Springer 2005, ch. 2). :func:`frontier` keeps the
options no other option dominates: the ones worth showing to an organizer, who picks among them
by the league's priorities.
"""

from __future__ import annotations

import math
from collections.abc import Iterable, Sequence
from dataclasses import dataclass, field


@dataclass(frozen=True)
class ScheduleOption:
    """One schedule option's figures.

    Parameters
    ----------
    label
        The option's name in reports.
    perfect_pairs
        Pairs of rounds that mix perfectly (more is better).
    breaks
        Total breaks (fewer is better).
    carry_over
        Russell's carry-over effects value (lower is better).
    payload
        Anything the caller needs to rebuild the option; takes no part in comparisons.

    Examples
    --------
    >>> ScheduleOption("a", 3, 4, 60) == ScheduleOption("a", 3, 4, 60, payload=[1])
    True
    """

    label: str
    perfect_pairs: int
    breaks: int
    carry_over: int
    payload: object = field(default=None, compare=False, hash=False, repr=False)

    def figures(self) -> tuple[int, int, int]:
        """The three figures compared on the frontier.

        Returns
        -------
        tuple of (int, int, int)
            ``(perfect pairs, breaks, carry-over)``.
        """
        return (self.perfect_pairs, self.breaks, self.carry_over)


def dominates(first: ScheduleOption, second: ScheduleOption) -> bool:
    """Is ``first`` at least as good as ``second`` in every figure and better in one?

    Parameters
    ----------
    first, second
        The options compared: more perfect pairs, fewer breaks and a lower carry-over value
        are better.

    Returns
    -------
    bool
        ``True`` when ``first`` dominates ``second`` (Pareto dominance); an option never
        dominates itself.

    Examples
    --------
    >>> better, worse = ScheduleOption("a", 3, 4, 60), ScheduleOption("b", 3, 5, 60)
    >>> dominates(better, worse), dominates(worse, better), dominates(better, better)
    (True, False, False)
    """
    at_least = (first.perfect_pairs >= second.perfect_pairs and first.breaks <= second.breaks
                and first.carry_over <= second.carry_over)
    better = (first.perfect_pairs > second.perfect_pairs or first.breaks < second.breaks
              or first.carry_over < second.carry_over)
    return at_least and better


def _sort_key(option: ScheduleOption) -> tuple[int, int, int, str]:
    return (-option.perfect_pairs, option.breaks, option.carry_over, option.label)


def frontier(options: Iterable[ScheduleOption]) -> tuple[ScheduleOption, ...]:
    """The options no other option dominates, most perfect pairs first.

    Options with identical figures are all dominated by none of each other; only the first of
    them (in the order of the sort key: perfect pairs descending, then breaks, carry-over,
    label) is kept, since showing the same figures twice offers no choice.

    Parameters
    ----------
    options
        Any number of options (an empty input gives an empty frontier).

    Returns
    -------
    tuple of ScheduleOption
        Sorted by perfect pairs (descending), then breaks, carry-over and label.

    Examples
    --------
    >>> a = ScheduleOption("perfect", 105, 20, 2000)
    >>> b = ScheduleOption("circle", 60, 14, 2580)
    >>> c = ScheduleOption("worse", 60, 16, 2580)
    >>> [o.label for o in frontier([a, b, c])]
    ['perfect', 'circle']

    References
    ----------
    M. Ehrgott, *Multicriteria Optimization*, Springer 2005, ch. 2 (Pareto dominance).
    """
    ordered = sorted(options, key=_sort_key)
    kept: list[ScheduleOption] = []
    for option in ordered:
        # anything that dominates ``option`` comes earlier in this order (it has at least as
        # many perfect pairs, and on a tie fewer breaks or less carry-over)
        if any(dominates(other, option) or other.figures() == option.figures()
               for other in kept):
            continue
        kept.append(option)
    return tuple(kept)


def rounds_of_pairs(pairs: int) -> int:
    """The number of rounds ``r`` with ``r(r-1)/2 == pairs`` (0 when there is none).

    Parameters
    ----------
    pairs
        A number of pairs of rounds.

    Returns
    -------
    int
        The rounds of one single round robin, so the teams are this plus one.

    Examples
    --------
    >>> rounds_of_pairs(105)
    15
    """
    rounds = (1 + math.isqrt(1 + 8 * max(0, pairs))) // 2
    return rounds if rounds * (rounds - 1) // 2 == pairs and pairs > 0 else 0


def frontier_summary(figures: Sequence[tuple[int, int, int | None, int | None]]) -> str:
    """One sentence on the frontier of a plan's options: how many are not dominated, and, when
    fewer than three, why no more were offered.

    Parameters
    ----------
    figures
        Per option ``(perfect pairs, pairs of rounds, breaks, carry-over value)``; breaks or
        carry-over ``None`` for an option without a timetable (it takes no part).

    Returns
    -------
    str
        For example ``"3 of 4 options are not dominated."``.

    Examples
    --------
    >>> frontier_summary([(105, 105, 20, 600), (60, 105, 14, 2580), (60, 105, 16, 2580)])
    '2 of 3 options are not dominated (fewer than three: the planner found no other schedule \
that is better in one figure without being worse in another).'

    References
    ----------
    M. Ehrgott, *Multicriteria Optimization*, Springer 2005, ch. 2 (Pareto dominance);
    ``docs/options.md``.
    """
    options = [ScheduleOption(str(k), perfect, breaks, carry)
               for k, (perfect, _pairs, breaks, carry) in enumerate(figures)
               if breaks is not None and carry is not None]
    kept = len(frontier(options))
    noun = "option is" if len(figures) == 1 else "options are"
    text = f"{kept} of {len(figures)} {noun} not dominated"
    if kept >= 3 or not figures:
        return text + "."
    pairs = figures[0][1]
    vertices = rounds_of_pairs(pairs) + 1 if pairs else 2
    if 0 < vertices <= 6:
        reason = (f"with {vertices} teams or fewer (a bye counted as a team) there is one "
                  "single round robin up to renaming the teams and the order of the rounds, "
                  "every pair of its rounds mixes perfectly"
                  + (", and every order of its rounds has the same carry-over value"
                     if vertices >= 4 else "")
                  + ", so only the breaks can differ")
    else:
        reason = ("the planner found no other schedule that is better in one figure without "
                  "being worse in another")
    return f"{text} (fewer than three: {reason})."
