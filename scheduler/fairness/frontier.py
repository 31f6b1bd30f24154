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

from collections.abc import Iterable
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
