"""Rules that cannot hold, found before any solving (static checks on a built League).

Only certain contradictions are reported here; everything subtler is left to the solver, which
explains its own infeasibility. Each check is a counting argument stated in its comment. The
conventions assumed (to be shared with the balancer):

- ``min_rest_days = k``: at least ``k`` whole days without a game between two games of a team
  (Tuesday then Friday gives 2 rest days);
- ``min_separation = k``: at least ``k`` rounds strictly between two meetings of the same pair
  (the separation constraint of the sports-timetabling literature, e.g. the timetabling
  competition benchmark of Van Bulck, Goossens, Beliën & Davari, PATAT 2021, from memory);
- a break is two home games or two away games in consecutive rounds (de Werra 1981).
"""

from __future__ import annotations

from collections import Counter, defaultdict
from dataclasses import replace
from datetime import date

from scheduler.config.model import League
from scheduler.errors import ConfigError
from scheduler.leg_schemes import FIXED_SCHEMES, least_separation


def _plural(n: int, word: str) -> str:
    return f"{n} {word}" if n == 1 else f"{n} {word}s"


def leg_separation(scheme: str, per_leg: int, legs: int = 2) -> int | None:
    """Smallest number of rounds strictly between two meetings of a pair that ``scheme`` allows
    with ``per_leg`` rounds in a leg (:func:`scheduler.leg_schemes.least_separation`; derived in
    ``docs/leg-schemes.md``): mirrored ``per_leg - 1``, French ``per_leg - 2``, English and
    inverted 0; ``None`` for ``free``, which fixes nothing.

    Parameters
    ----------
    scheme : str
        The league's scheme (``format.scheme``).
    per_leg : int
        Rounds per leg.
    legs : int, optional
        Number of legs; fewer than 2 is read as 2 (the question is about a second meeting).

    Returns
    -------
    int or None
        The least separation in rounds; None for the free scheme or an empty leg.

    References
    ----------
    ``docs/leg-schemes.md``.

    Examples
    --------
    >>> leg_separation("french", 9), leg_separation("free", 9) is None
    (7, True)
    """
    if scheme not in FIXED_SCHEMES or per_leg < 1:
        return None
    return least_separation(scheme, max(2, legs), per_leg)


def season_problems(league: League) -> list[str]:
    """Contradictions a league organizer can fix in the file; empty when none are certain.

    Checked against the match days and the format: enough days for the rounds, fixed games on
    rounds and dates that exist, dates that leave a team too few days to play (or to play at
    home), run limits no timetable can keep (de Werra's bound on breaks), rest days with several
    rounds a day, a separation the scheme cannot give, and room at the venues.

    Parameters
    ----------
    league : League
        A league whose file is already valid in shape and references.

    Returns
    -------
    list of str
        Located problems (``"<field path>: <what is wrong and how to fix it>"``); empty when no
        contradiction is certain (the balancer may still find the rules cannot all hold).

    References
    ----------
    ``docs/rules.md`` (the rules), ``docs/leg-schemes.md`` (separations).
    """
    # Local import: the calendar package imports scheduler.config.model.
    from scheduler.calendar.days import days_needed, match_days, rounds_needed

    problems: list[str] = []
    n = len(league.teams)
    fmt, cal, rules = league.format, league.calendar, league.rules
    rounds = rounds_needed(league)
    per_leg = rounds // fmt.legs
    per_day = cal.rounds_per_day
    games_per_team = fmt.legs * (n - 1)

    try:
        days = match_days(league, days_needed(league))
    except ConfigError as exc:
        problems += exc.problems
        days = match_days(league, 0) if (cal.end is not None or cal.dates) else []
    day_set = set(days)
    # Without an end date the season can grow, so only dates named in the rules are checked
    # against the weekday/excluded/holiday filter; counting arguments do not apply.
    open_end = cal.end is None and not cal.dates
    fixed_dates = [fx.date for fx in rules.fixed if fx.date is not None]
    if open_end and fixed_dates:
        horizon = max(fixed_dates)
        if days and days[-1] > horizon:
            horizon = days[-1]
        day_set = set(match_days(replace(cal, end=horizon), 0))

    # Fixed fixtures: a round that exists, a date that is a match day, and not more fixed games
    # of a pair than the legs in which they meet.
    pair_count: Counter[frozenset[str]] = Counter()
    home_count: Counter[tuple[str, str]] = Counter()
    busy_round: dict[tuple[str, int], int] = {}
    busy_day: Counter[tuple[str, date]] = Counter()
    unavailable: defaultdict[str, set[date]] = defaultdict(set)
    no_home: defaultdict[str, set[date]] = defaultdict(set)
    for entry in rules.unavailable:
        unavailable[entry.team] |= set(entry.dates)
    for entry in rules.no_home_games:
        no_home[entry.team] |= set(entry.dates)
    for i, fx in enumerate(rules.fixed):
        path = f"rules.fixed[{i}]"
        pair = frozenset((fx.home, fx.away))
        pair_count[pair] += 1
        if pair_count[pair] == fmt.legs + 1:
            problems.append(
                f"{path}: {fx.home} and {fx.away} meet {_plural(fmt.legs, 'time')} "
                f"but {pair_count[pair]} games between them are fixed"
            )
        # Every later leg swaps the venues of the one before, so one team hosts a given
        # opponent at most ceil(legs / 2) times.
        if not fx.any_venue:
            home_count[(fx.home, fx.away)] += 1
            limit = -(-fmt.legs // 2)
            if home_count[(fx.home, fx.away)] == limit + 1:
                problems.append(
                    f"{path}: {fx.home} would host {fx.away} {limit + 1} times, but hosts them "
                    f"at most {_plural(limit, 'time')} in {_plural(fmt.legs, 'leg')}"
                )
        if fx.round is not None:
            if fx.round > rounds:
                problems.append(
                    f"{path}.round: the season has only {_plural(rounds, 'round')}, got {fx.round}"
                )
            for team in (fx.home, fx.away):
                if (team, fx.round) in busy_round:
                    problems.append(
                        f"{path}.round: {team} already has a fixed game in round {fx.round} "
                        f"(rules.fixed[{busy_round[(team, fx.round)]}])"
                    )
                else:
                    busy_round[(team, fx.round)] = i
        if fx.date is not None:
            d = fx.date.isoformat()
            if day_set and fx.date not in day_set:
                problems.append(f"{path}.date: {d} is not a match day of the calendar")
            for team in (fx.home, fx.away):
                busy_day[(team, fx.date)] += 1
                if busy_day[(team, fx.date)] == per_day + 1:
                    problems.append(
                        f"{path}.date: {team} would play more than {_plural(per_day, 'game')} "
                        f"on {d} (calendar.rounds_per_day)"
                    )
                if fx.date in unavailable[team]:
                    problems.append(
                        f"{path}.date: {team} is unavailable on {d} (rules.unavailable)"
                    )
            if not fx.any_venue and fx.date in no_home[fx.home]:
                problems.append(
                    f"{path}.date: {fx.home} may not play at home on {d} (rules.no_home_games); "
                    "set any_venue = true or choose another date"
                )
    # A team plays at most rounds_per_day games on a match day, so it needs at least
    # ceil(games / rounds_per_day) match days it is available on.
    if days and not open_end:
        first_index: dict[str, int] = {}
        for i, entry in enumerate(rules.unavailable):
            first_index.setdefault(entry.team, i)
        for team, i in first_index.items():
            free = len(day_set - unavailable[team])
            if free * per_day < games_per_team:
                problems.append(
                    f"rules.unavailable[{i}]: {team} is available on "
                    f"{_plural(free, 'match day')} but has {games_per_team} games to play"
                )
        # With two or more legs every team hosts each opponent at least legs // 2 times.
        must_host = (fmt.legs // 2) * (n - 1)
        first_index = {}
        for i, entry in enumerate(rules.no_home_games):
            first_index.setdefault(entry.team, i)
        for team, i in first_index.items():
            can_host = len(day_set - unavailable[team] - no_home[team])
            if must_host and can_host * per_day < must_host:
                problems.append(
                    f"rules.no_home_games[{i}]: {team} can play at home on "
                    f"{_plural(can_host, 'match day')} but must host {must_host} games "
                    f"in {_plural(fmt.legs, 'leg')}"
                )
        # At most one team of a shared ground is at home on a match day.
        for i, group in enumerate(league.shared_ground_groups):
            need = len(group) * must_host
            if must_host and need > len(days) * per_day:
                where = (
                    f"rules.shared_grounds[{i}]"
                    if i < len(rules.shared_grounds)
                    else "teams (sharing one venue with room for one game a day)"
                )
                problems.append(
                    f"{where}: {', '.join(group)} share a ground, so at most one of them is at "
                    f"home on a match day; they host {need} games together but the season has "
                    f"{_plural(len(days), 'match day')}"
                )

    # de Werra (1981), "Scheduling in sports", Annals of Discrete Math. 11: a single round robin
    # of an even number n >= 4 of teams has at least n - 2 breaks, so not every team can
    # alternate home and away.
    if n % 2 == 0 and n >= 4 and rules.max_home_run == 1 and rules.max_away_run == 1:
        problems.append(
            "rules.max_home_run: with max_home_run = 1 and max_away_run = 1 no team may ever have "
            f"two home or two away games in a row, but a round robin of {n} teams has at least "
            f"{n - 2} such breaks (de Werra 1981); allow runs of 2"
        )
    for name in ("no_breaks_first", "no_breaks_last"):
        value = getattr(rules, name)
        if value > rounds:
            problems.append(
                f"rules.{name}: the season has only {_plural(rounds, 'round')}, got {value}"
            )
    if rules.min_separation and fmt.legs >= 2:
        most = leg_separation(fmt.scheme, per_leg, fmt.legs)
        if most is not None and rules.min_separation > most:
            problems.append(
                f"rules.min_separation: with scheme = {fmt.scheme!r} some pairs have only "
                f"{_plural(most, 'round')} between their meetings, but {rules.min_separation} "
                'are required; use scheme = "mirrored" or "free", or lower min_separation'
            )
    if rules.min_rest_days and per_day > 1:
        problems.append(
            f"rules.min_rest_days: teams play up to {per_day} games on one match day "
            "(calendar.rounds_per_day), so they cannot rest between them; remove min_rest_days "
            "or set rounds_per_day = 1"
        )

    # Room: every game of a match day needs a court in a time slot. A venue without slots has
    # one kick-off per round of the day (calendar.kickoff, then every game_minutes), as the
    # balancer lays them out; a team that plays several rounds on one day needs that many
    # different kick-off times.
    games_per_round = n // 2

    def day_slots(v) -> int:
        return len(v.slots) if v.slots else per_day

    if fmt.home_meaning == "side" and league.venues:
        room = sum(len(v.courts) * day_slots(v) for v in league.venues)
        need = games_per_round * per_day
        if room < need:
            problems.append(
                f"venues: {_plural(need, 'game')} are played per match day "
                f"({games_per_round} per round, {per_day} per day) but the venues have room for "
                f"{room} (courts x time slots); add courts or slots"
            )
    if per_day > 1 and league.venues and all(v.slots for v in league.venues):
        times = {s for v in league.venues for s in v.slots}
        if len(times) < per_day:
            problems.append(
                f"calendar.rounds_per_day: {per_day} rounds on one match day need at least "
                f"{per_day} different kick-off times, but the venues have {len(times)}; "
                "add [[venues]] slots"
            )
    return problems
