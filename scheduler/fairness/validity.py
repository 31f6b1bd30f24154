"""Is a season a valid round robin? Problems in the user's terms, with the offending rows.

Checks (the usual definition of a k-leg round robin: every pair of teams meets once per leg,
each team at most once per round, an odd league has one bye per round; common practice):

* a team that is not in the season's team list (*unknown team*);
* a team playing itself;
* a round number below 1, a leg number below 1;
* a team in more than one game of one round;
* a pair meeting more or fewer times than expected (the most common number of meetings), and
  missing games (pairs that never meet); a season that declares another number of legs;
* byes inconsistent: a team listed with a bye that plays in that round, a team that sits out
  without a listed bye (when the season lists byes), more than one team sitting out in a round of
  an odd league, teams with unequal numbers of byes, byes naming unknown teams.

Messages name rows of the source file when the caller passes them (``rows``: one source row per
fixture, as returned by :func:`scheduler.export.readers.read_schedule_with_rows`), otherwise
fixture numbers (1-based positions in ``Season.fixtures``). Each kind of problem is spelled out
at most :data:`MAX_PER_KIND` times; the rest are summed up in one more problem.
"""

from __future__ import annotations

from collections import Counter, defaultdict
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from scheduler.season import Season

MAX_PER_KIND = 100


@dataclass(frozen=True, slots=True)
class Problem:
    """One reason a season is not a valid round robin.

    ``kind`` is a short stable code (``"plays-twice"``, ``"missing-game"``, ...); ``rows`` the
    source rows involved (empty when unknown), ``fixtures`` the 0-based positions in
    ``Season.fixtures``.
    """

    kind: str
    message: str
    rows: tuple[int, ...] = ()
    fixtures: tuple[int, ...] = ()

    def __str__(self) -> str:
        return self.message

    def to_dict(self) -> dict:
        return {
            "kind": self.kind,
            "message": self.message,
            "rows": list(self.rows),
            "fixtures": list(self.fixtures),
        }


class _Collector:
    def __init__(self, rows: Sequence[int | None] | None) -> None:
        self.rows = rows
        self.items: list[Problem] = []
        self.counts: Counter[str] = Counter()

    def where(self, idx: Sequence[int]) -> tuple[str, tuple[int, ...]]:
        """A "(rows 4, 9)" phrase and the row numbers for fixture positions ``idx``."""
        idx = sorted(idx)
        if self.rows is not None:
            rows = tuple(r for i in idx if (r := self.rows[i]) is not None)
            if rows and len(rows) == len(idx):
                word = "row" if len(rows) == 1 else "rows"
                return f"{word} {_join(rows)}", rows
            rows_known = rows
        else:
            rows_known = ()
        word = "fixture" if len(idx) == 1 else "fixtures"
        return f"{word} {_join([i + 1 for i in idx])}", rows_known

    def add(self, kind: str, text: str, idx: Sequence[int] = ()) -> None:
        self.counts[kind] += 1
        if self.counts[kind] > MAX_PER_KIND:
            return
        if idx:
            phrase, rows = self.where(idx)
            text = f"{text} ({phrase})"
        else:
            rows = ()
        self.items.append(Problem(kind, text, rows, tuple(sorted(idx))))

    def result(self) -> list[Problem]:
        out = list(self.items)
        for kind, count in sorted(self.counts.items()):
            if count > MAX_PER_KIND:
                more = count - MAX_PER_KIND
                out.append(Problem(kind, f"... and {more} more problems of this kind ({kind})"))
        return out


def _join(values: Sequence[int], limit: int = 12) -> str:
    shown = ", ".join(str(v) for v in values[:limit])
    if len(values) > limit:
        shown += f", ... ({len(values)} in all)"
    return shown


def _times(k: int) -> str:
    return {1: "once", 2: "twice"}.get(k, f"{k} times")


def validate_season(season: Season, rows: Sequence[int | None] | None = None) -> list[Problem]:
    """Every problem that keeps ``season`` from being a valid round robin (empty if valid).

    ``rows`` (optional) gives the source row of each fixture, for the messages.
    """
    if rows is not None and len(rows) != len(season.fixtures):
        raise ValueError("rows must give one source row per fixture")
    out = _Collector(rows)
    fixtures = season.fixtures
    teams = season.teams
    known = set(teams)

    duplicates = [name for name, c in Counter(teams).items() if c > 1]
    for name in duplicates:
        out.add("duplicate-team", f"team {name} is listed more than once")

    unknown: dict[str, list[int]] = defaultdict(list)
    for i, f in enumerate(fixtures):
        for name in dict.fromkeys((f.home, f.away)):
            if name not in known:
                unknown[name].append(i)
    for name, idx in unknown.items():
        out.add("unknown-team", f"unknown team {name!r}: not in the team list", idx)

    for i, f in enumerate(fixtures):
        if f.round < 1:
            out.add("bad-round", f"round {f.round} is not a round number (rounds start at 1)", [i])
        if f.leg < 1:
            out.add("bad-leg", f"leg {f.leg} is not a leg number (legs start at 1)", [i])
        if f.home == f.away:
            out.add("plays-itself", f"round {f.round}: {f.home} plays itself", [i])

    # A team in more than one game of a round.
    slots: dict[tuple[int, str], list[int]] = defaultdict(list)
    for i, f in enumerate(fixtures):
        slots[(f.round, f.home)].append(i)
        if f.away != f.home:
            slots[(f.round, f.away)].append(i)
    for (rnd, name), idx in sorted(slots.items(), key=lambda kv: (kv[0][0], kv[1][0])):
        if len(idx) > 1 and rnd >= 1:
            out.add("plays-twice", f"round {rnd}: {name} plays {_times(len(idx))}", idx)

    _check_pairs(season, out)
    _check_byes(season, slots, out)
    return out.result()


def _check_pairs(season: Season, out: _Collector) -> None:
    fixtures = season.fixtures
    names = list(dict.fromkeys(season.teams))
    index = {name: k for k, name in enumerate(names)}
    n = len(names)
    meetings: dict[tuple[int, int], list[int]] = defaultdict(list)
    for i, f in enumerate(fixtures):
        a, b = index.get(f.home), index.get(f.away)
        if a is None or b is None or a == b:
            continue
        meetings[(a, b) if a < b else (b, a)].append(i)
    if n < 2:
        if not fixtures:
            out.add("no-games", "the season has no games")
        return
    counts = Counter(len(v) for v in meetings.values())
    zero = n * (n - 1) // 2 - len(meetings)
    if zero:
        counts[0] += zero
    expected = max(counts.items(), key=lambda kv: (kv[1], kv[0]))[0] if counts else 1
    expected = max(expected, 1)
    if season.legs != expected:
        out.add(
            "legs",
            f"the season has {season.legs} leg(s) but most pairs meet {_times(expected)}",
        )
    for (a, b), idx in sorted(meetings.items(), key=lambda kv: kv[1][0]):
        if len(idx) != expected:
            out.add(
                "pair-count",
                f"{names[a]} and {names[b]} meet {_times(len(idx))}; expected {_times(expected)}",
                idx,
            )
    if zero:
        met = np.zeros((n, n), dtype=bool)
        if meetings:
            keys = np.array(list(meetings), dtype=np.int64)
            met[keys[:, 0], keys[:, 1]] = True
        a_idx, b_idx = np.nonzero(np.triu(~met, k=1))
        for a, b in zip(a_idx.tolist(), b_idx.tolist(), strict=True):
            out.add("missing-game", f"missing game: {names[a]} and {names[b]} never meet")


def _check_byes(season: Season, slots: dict[tuple[int, str], list[int]], out: _Collector) -> None:
    teams = list(dict.fromkeys(season.teams))
    known = set(teams)
    rounds = season.rounds
    declared = season.byes
    for rnd, names in sorted(declared.items()):
        for name in names:
            if name not in known:
                out.add("bye", f"round {rnd}: the bye names unknown team {name!r}")
            elif (rnd, name) in slots:
                out.add("bye", f"round {rnd}: {name} has a bye but plays", slots[(rnd, name)])
    played_rounds = {f.round for f in season.fixtures}
    odd = len(teams) % 2 == 1
    idle_count: Counter[str] = Counter()
    for rnd in range(1, rounds + 1):
        if rnd not in played_rounds:
            out.add("empty-round", f"round {rnd} has no games")
            continue
        idle = [t for t in teams if (rnd, t) not in slots]
        idle_count.update(idle)
        if declared:
            listed = set(declared.get(rnd, ()))
            for t in idle:
                if t not in listed:
                    out.add("bye", f"round {rnd}: {t} has no game and no bye")
        if odd and len(idle) > 1:
            out.add(
                "bye",
                f"round {rnd}: {len(idle)} teams sit out ({', '.join(idle[:6])}"
                f"{', ...' if len(idle) > 6 else ''}); an odd league has one bye per round",
            )
        elif not odd and idle and not declared:
            out.add(
                "idle",
                f"round {rnd}: {', '.join(idle[:6])}{', ...' if len(idle) > 6 else ''} "
                f"{'has' if len(idle) == 1 else 'have'} no game",
            )
    if odd and idle_count:
        per_team = Counter({t: idle_count.get(t, 0) for t in teams})
        common = Counter(per_team.values()).most_common(1)[0][0]
        for t in teams:
            if per_team[t] != common:
                out.add(
                    "bye",
                    f"{t} sits out {_times(per_team[t])}; the other teams {_times(common)}",
                )
