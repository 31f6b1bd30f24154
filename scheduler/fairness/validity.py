"""Is a season a valid round robin? Problems in the user's terms, with the offending rows.

Checks (the usual definition of a k-leg round robin: every pair of teams meets once per leg,
each team at most once per round, an odd league has one bye per round; common practice):

* a team that is not in the season's team list (*unknown team*);
* a team playing itself;
* a round number below 1, a leg number below 1;
* a team in more than one game of one round;
* a pair meeting more or fewer times than expected (the season's number of legs, or the most
  common number of meetings when no pair meets that often), and missing games (pairs that
  never meet); a season that declares a number of legs no pair matches;
* byes inconsistent: a team listed with a bye that plays in that round, a team that sits out
  without a listed bye (when the season lists byes), more than one team sitting out in a round of
  an odd league, teams with unequal numbers of byes, byes naming unknown teams.

Messages name rows of the source file when the caller passes them (``rows``: one source row per
fixture, as returned by :func:`scheduler.audit.readers.read_schedule_with_rows`), otherwise
fixture numbers (1-based positions in ``Season.fixtures``). Each kind of problem is spelled out
at most :data:`MAX_PER_KIND` times; the rest are summed up in one more problem.
"""

from __future__ import annotations

from collections import Counter, defaultdict
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from scheduler.fairness.table import SeasonTable, build_table
from scheduler.season import Season

MAX_PER_KIND = 100


@dataclass(frozen=True, slots=True)
class Problem:
    """One reason a season is not a valid round robin.

    Parameters
    ----------
    kind
        A short stable code (``"plays-twice"``, ``"missing-game"``, ...).
    message
        The reason in one sentence, naming rounds, teams and source rows.
    rows
        The source rows involved (empty when unknown).
    fixtures
        The 0-based positions of the fixtures involved in ``Season.fixtures``.

    Examples
    --------
    >>> problem = Problem("plays-twice", "round 3: Ash plays twice (rows 6, 7)", (6, 7), (4, 5))
    >>> str(problem), problem.to_dict()["rows"]
    ('round 3: Ash plays twice (rows 6, 7)', [6, 7])
    """

    kind: str
    message: str
    rows: tuple[int, ...] = ()
    fixtures: tuple[int, ...] = ()

    def __str__(self) -> str:
        return self.message

    def to_dict(self) -> dict:
        """JSON-ready form.

        Returns
        -------
        dict
            ``kind``, ``message``, ``rows`` and ``fixtures`` (lists).
        """
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

    Parameters
    ----------
    season
        The season.
    rows
        The source row of each fixture (``None`` where unknown).

    Returns
    -------
    list of Problem
        The problems, in a fixed order.

    Raises
    ------
    ValueError
        When ``rows`` does not give one row per fixture (a programming error).

    References
    ----------
    ``docs/audit-input.md``.

    Examples
    --------
    >>> from scheduler.season import Fixture, Season
    >>> games = [(1, "Ash", "Elm"), (1, "Oak", "Yew"), (2, "Elm", "Oak"),
    ...          (2, "Ash", "Yew"), (3, "Ash", "Oak")]
    >>> season = Season("Demo", "2031", ("Ash", "Elm", "Oak", "Yew"),
    ...                 tuple(Fixture(*game) for game in games))
    >>> for problem in validate_season(season):
    ...     print(problem)
    missing game: Elm and Yew never meet
    round 3: Elm, Yew have no game
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

    table = build_table(season)
    _check_twice(table, out)
    _check_pairs(season, table, out)
    _check_byes(season, table, out)
    return out.result()


def _groups(keys: np.ndarray, positions: np.ndarray):
    """Sort ``keys``; return (unique keys, counts, first position, positions grouped by key)."""
    order = np.lexsort((positions, keys))
    keys, positions = keys[order], positions[order]
    if len(keys) == 0:
        empty = np.zeros(0, dtype=np.int64)
        return empty, empty, empty, positions, empty
    starts = np.flatnonzero(np.concatenate([[True], keys[1:] != keys[:-1]]))
    counts = np.diff(np.append(starts, len(keys)))
    return keys[starts], counts, positions[starts], positions, starts


def _check_twice(table: SeasonTable, out: _Collector) -> None:
    """A team in more than one game of a round (vectorised over all fixtures)."""
    n = max(table.n, 1)
    other = table.away != table.home
    keys = np.concatenate([table.round * n + table.home, (table.round * n + table.away)[other]])
    pos = np.concatenate([table.fixture, table.fixture[other]])
    uniq, counts, first, grouped, starts = _groups(keys, pos)
    dup = np.flatnonzero(counts > 1)
    if not len(dup):
        return
    order = np.lexsort((first[dup], uniq[dup] // n))
    for k in dup[order]:
        rnd, team = divmod(int(uniq[k]), n)
        idx = grouped[starts[k] : starts[k] + counts[k]].tolist()
        out.add("plays-twice", f"round {rnd + 1}: {table.names[team]} plays {_times(len(idx))}",
                idx)


def _check_pairs(season: Season, table: SeasonTable, out: _Collector) -> None:
    n = table.known
    names = table.names
    if n < 2:
        if not season.fixtures:
            out.add("no-games", "the season has no games")
        return
    ok = (table.home < n) & (table.away < n) & (table.home != table.away)
    lo = np.minimum(table.home, table.away)[ok]
    hi = np.maximum(table.home, table.away)[ok]
    uniq, counts, first, grouped, starts = _groups(lo * n + hi, table.fixture[ok])
    zero = n * (n - 1) // 2 - len(uniq)
    values, freq = np.unique(counts, return_counts=True)
    tally = dict(zip(values.tolist(), freq.tolist(), strict=True))
    if zero:
        tally[0] = tally.get(0, 0) + zero
    mode = max(tally.items(), key=lambda kv: (kv[1], kv[0]))[0] if tally else 1
    # The declared number of legs, unless no pair meets that often (then the most common count).
    expected = season.legs if tally.get(season.legs, 0) > 0 else max(mode, 1)
    if season.legs != expected:
        out.add(
            "legs",
            f"the season has {season.legs} leg(s) but no pair meets {_times(season.legs)}; "
            f"most pairs meet {_times(expected)}",
        )
    odd = np.flatnonzero(counts != expected)
    for k in odd[np.argsort(first[odd], kind="stable")]:
        a, b = divmod(int(uniq[k]), n)
        idx = grouped[starts[k] : starts[k] + counts[k]].tolist()
        out.add(
            "pair-count",
            f"{names[a]} and {names[b]} meet {_times(len(idx))}; expected {_times(expected)}",
            idx,
        )
    if zero:
        found = 0
        row_of = uniq // n
        bounds = np.searchsorted(row_of, np.arange(n + 1))
        for a in range(n - 1):
            if found >= MAX_PER_KIND:
                break
            partners = uniq[bounds[a] : bounds[a + 1]] % n
            missing = np.setdiff1d(np.arange(a + 1, n), partners, assume_unique=True)
            for b in missing.tolist():
                if found >= MAX_PER_KIND:
                    break
                out.add("missing-game", f"missing game: {names[a]} and {names[b]} never meet")
                found += 1
        # Counted, not spelled out: the collector sums up the rest.
        out.counts["missing-game"] += zero - found


def _rounds_phrase(rounds: list[int]) -> str:
    """"round 4" / "rounds 4-9, 12" for a sorted list of round numbers."""
    runs: list[str] = []
    start = prev = rounds[0]
    for r in [*rounds[1:], None]:
        if r is not None and r == prev + 1:
            prev = r
            continue
        runs.append(str(start) if start == prev else f"{start}-{prev}")
        if r is not None:
            start = prev = r
    word = "round" if len(rounds) == 1 else "rounds"
    return f"{word} {', '.join(runs)}"


def _check_byes(season: Season, table: SeasonTable, out: _Collector) -> None:
    n = table.known
    teams = table.names[:n]
    index = {t: k for k, t in enumerate(teams)}
    plays = table.plays[:, :n]
    declared = season.byes
    for rnd, names in sorted(declared.items()):
        for name in names:
            t = index.get(name)
            if t is None:
                out.add("bye", f"round {rnd}: the bye names unknown team {name!r}")
            elif 1 <= rnd <= table.rounds and plays[rnd - 1, t] > 0:
                mask = (table.round == rnd - 1) & ((table.home == t) | (table.away == t))
                out.add("bye", f"round {rnd}: {name} has a bye but plays",
                        table.fixture[mask].tolist())
    games = np.bincount(table.round, minlength=table.rounds)
    empty = (np.flatnonzero(games == 0) + 1).tolist()
    if empty:
        out.add("empty-round", f"{_rounds_phrase(empty)} {'has' if len(empty) == 1 else 'have'}"
                " no games")
    odd = n % 2 == 1
    idle_matrix = plays == 0
    idle_count = idle_matrix[games > 0].sum(axis=0)
    for r in np.flatnonzero((games > 0) & idle_matrix.any(axis=1)).tolist():
        rnd = r + 1
        idle = [teams[t] for t in np.flatnonzero(idle_matrix[r]).tolist()]
        if declared:
            listed = set(declared.get(rnd, ()))
            for idle_team in idle:
                if idle_team not in listed:
                    out.add("bye", f"round {rnd}: {idle_team} has no game and no bye")
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
    if odd and idle_count.any():
        values, freq = np.unique(idle_count, return_counts=True)
        common = int(values[np.argmax(freq)])
        for t in np.flatnonzero(idle_count != common).tolist():
            out.add(
                "bye",
                f"{teams[t]} sits out {_times(int(idle_count[t]))}; the other teams "
                f"{_times(common)}",
            )
