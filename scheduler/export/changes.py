"""``changes.csv``: what a re-plan changed, one row per changed game, then the count per team.

Rows (RFC 4180 CSV, CRLF line ends, UTF-8): ``change`` (``moved``, ``home/away swapped``,
``moved and swapped``, ``cancelled``), ``round``, ``leg``, ``home``, ``away`` (as now planned;
the old sides for a cancelled game), then ``old_date``, ``old_start``, ``old_court``,
``old_home`` and ``new_date``, ``new_start``, ``new_court``, ``new_home`` (empty for a cancelled
game). Start times are local ``HH:MM``. A blank line and a second table ``team,changed_games``
follow, with every team whose games changed (most first, then by name).
"""

from __future__ import annotations

import csv
import io
from collections import Counter
from collections.abc import Sequence
from dataclasses import dataclass

from scheduler.season import Fixture

HEADER = (
    "change", "round", "leg", "home", "away",
    "old_date", "old_start", "old_court", "old_home",
    "new_date", "new_start", "new_court", "new_home",
)  # fmt: skip


@dataclass(frozen=True, slots=True)
class GameChange:
    """One changed game of a re-plan.

    Parameters
    ----------
    old
        The game as previously planned.
    new
        The game as now planned; ``None`` when it is cancelled.

    Examples
    --------
    >>> from datetime import date
    >>> from scheduler.season import Fixture
    >>> change = GameChange(Fixture(4, "Ash", "Elm", date=date(2031, 3, 4)),
    ...                     Fixture(4, "Elm", "Ash", date=date(2031, 3, 11)))
    >>> change.kind, change.teams
    ('moved and swapped', ('Ash', 'Elm'))
    """

    old: Fixture
    new: Fixture | None

    @property
    def kind(self) -> str:
        """``"cancelled"``, ``"moved"`` (date, kick-off or court), ``"home/away swapped"`` or
        ``"moved and swapped"``."""
        if self.new is None:
            return "cancelled"
        moved = (self.old.date, self.old.start, self.old.court) != (
            self.new.date, self.new.start, self.new.court
        )
        swapped = self.old.home != self.new.home
        if moved and swapped:
            return "moved and swapped"
        return "home/away swapped" if swapped else "moved"

    @property
    def teams(self) -> tuple[str, str]:
        """The two teams (home first, as previously planned)."""
        return self.old.teams


def team_counts(changes: Sequence[GameChange]) -> list[tuple[str, int]]:
    """Teams with changed games and how many, most first, then by name.

    Parameters
    ----------
    changes
        The changed games.

    Returns
    -------
    list of (str, int)
        (team, number of its games that changed).

    Examples
    --------
    >>> from scheduler.season import Fixture
    >>> changes = [GameChange(Fixture(4, "Ash", "Elm"), None),
    ...            GameChange(Fixture(5, "Oak", "Ash"), None)]
    >>> team_counts(changes)
    [('Ash', 2), ('Elm', 1), ('Oak', 1)]
    """
    counts: Counter[str] = Counter()
    for change in changes:
        for team in change.teams:
            counts[team] += 1
    return sorted(counts.items(), key=lambda item: (-item[1], item[0]))


def _clock(f: Fixture | None) -> str:
    return f.start.strftime("%H:%M") if f is not None and f.start is not None else ""


def _day(f: Fixture | None) -> str:
    return f.date.isoformat() if f is not None and f.date is not None else ""


def changes_csv(changes: Sequence[GameChange]) -> str:
    """The text of ``changes.csv`` (see the module docstring).

    Parameters
    ----------
    changes
        The changed games in the order to list them.

    Returns
    -------
    str
        CSV text with CRLF line ends.

    Examples
    --------
    >>> from scheduler.season import Fixture
    >>> from datetime import date
    >>> old = Fixture(round=3, home="A", away="B", date=date(2027, 9, 4))
    >>> new = Fixture(round=3, home="A", away="B", date=date(2027, 9, 18))
    >>> changes_csv([GameChange(old, new)]).splitlines()[1]
    'moved,3,1,A,B,2027-09-04,,,A,2027-09-18,,,A'

    References
    ----------
    RFC 4180 (CSV).
    """
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\r\n")
    writer.writerow(HEADER)
    for change in changes:
        now = change.new or change.old
        new = change.new
        writer.writerow([
            change.kind, now.round, now.leg, now.home, now.away,
            _day(change.old), _clock(change.old), change.old.court or "", change.old.home,
            _day(new), _clock(new), (new.court or "") if new else "", new.home if new else "",
        ])
    writer.writerow([])
    writer.writerow(["team", "changed_games"])
    for team, count in team_counts(changes):
        writer.writerow([team, count])
    return buffer.getvalue()
