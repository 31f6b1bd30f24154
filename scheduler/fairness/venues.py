"""Venue, court and time-slot use per team, and the balanced-tournament-design check.

Labels, read from each fixture:

* venue: ``Fixture.venue``;
* court: ``Fixture.court``, prefixed ``"<venue>: "`` when the season's courts sit in more than
  one venue (so "Court 1" of two halls are two courts);
* slot: ``Fixture.slot``, or, when the fixture has no slot label but a kick-off, the local
  kick-off time ``"HH:MM"`` (time-slot balance is about kick-off times).

A team's *spread* for slots is the largest minus the smallest number of its games in one slot,
over all slots of the season; for courts it is taken inside each venue that has two or more
courts (the largest such spread), since courts of different grounds are not alternatives to
each other; ``None`` when there is nothing to compare. This is common practice for "each team
gets each court about equally often".

Balanced tournament design (BTD): 2m teams, m courts, each round uses every court once, and each
team uses each court at most twice over the single round robin (Schellenberg, van Rees &
Vanstone, "The existence of balanced tournament designs", Ars Combinatoria 3 (1977) 303-318;
exists for every m except m = 2). The check applies per leg when every round of the leg plays
exactly one game on each of the season's courts.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from scheduler.fairness.table import SeasonTable
from scheduler.season import Season


@dataclass(frozen=True)
class Usage:
    """How often each team uses each venue, court or slot (see :func:`usages`).

    Parameters
    ----------
    names
        The labels used (sorted).
    counts
        ``(teams, labels)`` games of each team with each label.
    spread
        Per team, most minus fewest uses of one label (for courts: within each venue of two
        or more courts); ``None`` when no label is used.
    codes
        Label index of each used fixture (-1 = none).
    """

    names: tuple[str, ...]
    counts: np.ndarray
    """``(teams, labels)`` games of each team with each label."""
    spread: np.ndarray | None
    codes: np.ndarray
    """Label index of each used fixture (-1 = none)."""


@dataclass(frozen=True)
class BtdCheck:
    """The balanced-tournament-design check of the courts (see :func:`btd_check`).

    Parameters
    ----------
    applicable
        ``True`` when some leg plays, in every round, one game on each court.
    ok
        Then whether every team uses every court at most twice per leg; ``None`` when not
        applicable.
    violations
        Each team, court and leg used more than twice, in words.
    """

    applicable: bool
    ok: bool | None
    violations: tuple[str, ...]


def _encode(labels: list[str | None]) -> tuple[tuple[str, ...], np.ndarray]:
    names = tuple(sorted({x for x in labels if x is not None}))
    index = {x: i for i, x in enumerate(names)}
    codes = np.fromiter(
        (index[x] if x is not None else -1 for x in labels), dtype=np.int64, count=len(labels)
    )
    return names, codes


def _usage(table: SeasonTable, labels: list[str | None]) -> Usage:
    names, codes = _encode(labels)
    k = len(names)
    n = table.n
    counts = np.zeros((n, k), dtype=np.int64)
    if k:
        ok = codes >= 0
        for side in (table.home, table.away):
            flat = side[ok] * k + codes[ok]
            counts += np.bincount(flat, minlength=n * k).reshape(n, k)
        spread = counts.max(axis=1) - counts.min(axis=1)
    else:
        spread = None
    return Usage(names, counts, spread, codes)


def _slot_label(f) -> str | None:
    if f.slot:
        return f.slot
    if f.start is not None:
        return f.start.strftime("%H:%M")
    return None


def usages(season: Season, table: SeasonTable) -> tuple[Usage, Usage, Usage]:
    """Venue, court and slot usage of every team.

    Parameters
    ----------
    season
        The season (its fixtures' venue, court and slot labels).
    table
        Its index (:func:`scheduler.fairness.table.build_table`).

    Returns
    -------
    tuple of Usage
        (venues, courts, slots). Courts are named ``"venue: court"`` when courts of several
        venues are used; slots are the slot label, else the kick-off time.

    Examples
    --------
    >>> from scheduler.fairness.table import build_table
    >>> from scheduler.season import Fixture, Season
    >>> season = Season("Demo", "2031", ("Ash", "Elm"),
    ...                 (Fixture(1, "Ash", "Elm", court="1"), Fixture(2, "Elm", "Ash", court="2")))
    >>> venues, courts, slots = usages(season, build_table(season))
    >>> courts.names, courts.counts.tolist(), courts.spread.tolist()
    (('1', '2'), [[1, 1], [1, 1]], [0, 0])
    """
    fixtures = season.fixtures
    used = [fixtures[i] for i in table.fixture.tolist()]
    venues = [f.venue for f in used]
    court_venues = {f.venue for f in used if f.court is not None}
    if len(court_venues) > 1:
        courts = [
            (f"{f.venue}: {f.court}" if f.venue else f.court) if f.court is not None else None
            for f in used
        ]
    else:
        courts = [f.court for f in used]
    slots = [_slot_label(f) for f in used]
    court_usage = _usage(table, courts)
    return _usage(table, venues), _within_venue_spread(court_usage, used), _usage(table, slots)


def _within_venue_spread(courts: Usage, used: list) -> Usage:
    """The court usage with its spread taken per venue of two or more courts."""
    venue_of: dict[int, str | None] = {}
    for f, code in zip(used, courts.codes.tolist(), strict=True):
        if code >= 0:
            venue_of.setdefault(code, f.venue)
    groups: dict[str | None, list[int]] = {}
    for code, venue in sorted(venue_of.items()):
        groups.setdefault(venue, []).append(code)
    spread = None
    for codes in groups.values():
        if len(codes) < 2:
            continue
        sub = courts.counts[:, codes]
        part = sub.max(axis=1) - sub.min(axis=1)
        spread = part if spread is None else np.maximum(spread, part)
    return Usage(courts.names, courts.counts, spread, courts.codes)


def btd_check(table: SeasonTable, courts: Usage, round_leg: np.ndarray, legs: int) -> BtdCheck:
    """Each team uses each court at most twice per leg, when every round of a leg plays one game
    on each court (Schellenberg, van Rees & Vanstone 1977).

    Parameters
    ----------
    table
        The indexed season.
    courts
        The court usage (:func:`usages`).
    round_leg
        The leg (1-based) of each round.
    legs
        Number of legs.

    Returns
    -------
    BtdCheck
        Not applicable with fewer than two courts or when no leg plays one game per court in
        every round.

    References
    ----------
    P. J. Schellenberg, G. H. J. van Rees and S. A. Vanstone, "The existence of balanced
    tournament designs", Ars Combinatoria 3 (1977) 303-318; ``docs/fairness.md``.
    """
    k = len(courts.names)
    if k < 2 or not len(table.round):
        return BtdCheck(False, None, ())
    per_round = np.zeros((table.rounds, k), dtype=np.int64)
    ok = courts.codes >= 0
    np.add.at(per_round, (table.round[ok], courts.codes[ok]), 1)
    games = np.bincount(table.round, minlength=table.rounds)
    violations: list[str] = []
    applicable = False
    for leg in range(1, max(legs, 1) + 1):
        rounds = np.flatnonzero((round_leg == leg) & (games > 0))
        if len(rounds) == 0:
            continue
        if not (np.all(per_round[rounds] == 1) and np.all(games[rounds] == k)):
            continue
        applicable = True
        in_leg = np.isin(table.round, rounds) & ok
        n = table.n
        counts = np.zeros((n, k), dtype=np.int64)
        for side in (table.home, table.away):
            flat = side[in_leg] * k + courts.codes[in_leg]
            counts += np.bincount(flat, minlength=n * k).reshape(n, k)
        for t, c in zip(*np.nonzero(counts > 2), strict=True):
            violations.append(
                f"leg {leg}: {table.names[t]} uses {courts.names[c]} {int(counts[t, c])} times"
            )
    if not applicable:
        return BtdCheck(False, None, ())
    return BtdCheck(True, not violations, tuple(violations))
