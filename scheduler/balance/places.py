"""Venue, court and time-slot of every game (OR-Tools CP-SAT), balanced over the teams.

A *place* is (venue, court, kick-off time). On one match day each place holds at most one game.
Where "home" means a venue the game is played at the home team's ``home_venue``; where it means a
side or colour (or the home team has no venue) any of the league's venues may be used.
With several rounds on one match day the rounds take disjoint, increasing kick-off times (venues
without slots get one virtual slot per round: ``kickoff + j * game_minutes``).

Balance: the model minimises the largest number of games any team plays on one court (venue +
court; weight ``priorities.venue_balance``) and in one time slot (``priorities.slot_balance``).
With 2k teams on k courts over 2k-1 rounds the optimum is 2 for every k except k = 2: that is a
balanced tournament design BTD(k), which exists exactly for k != 2 (Schellenberg, van Rees &
Vanstone 1977, "The existence of balanced tournament designs", Ars Combinatoria 3:303-318;
definition as in Lamken 1990, J. Austral. Math. Soc. A 49:175-195). The trivial lower bound
``ceil(games / places)`` is added so that CP-SAT proves optimality when it reaches it.
"""

from __future__ import annotations

from dataclasses import dataclass
from datetime import datetime, time, timedelta
from math import ceil

from ortools.sat.python import cp_model

from scheduler.balance.timetable import SolveLimits, Timetable, configure
from scheduler.config.model import League
from scheduler.errors import InfeasibleError
from scheduler.interrupt import solve_interruptibly


@dataclass(frozen=True)
class Place:
    """Where and when one game is played.

    Parameters
    ----------
    venue
        The venue's name, or ``None`` for a league without venues.
    court
        The court (pitch, table, sheet) at the venue, or ``None``.
    slot
        The kick-off time, or ``None`` when the day has one kick-off.
    label
        The slot label shown in outputs (``"19:30"``), or ``None``.
    """

    venue: str | None
    court: str | None
    slot: time | None
    label: str | None


@dataclass(frozen=True)
class Placement:
    """The places chosen for every game of a timetable (:func:`assign_places`).

    Parameters
    ----------
    places
        ``places[s][i]`` is the place of game ``i`` of season round ``s`` (timetable order).
    court_max
        The largest number of games any team plays on one court, or ``None`` when not
        balanced (one court).
    slot_max
        The largest number of games any team plays in one time slot, or ``None``.
    status
        ``"optimal"`` when the balance is proven best, else ``"feasible"``.
    wall_cap_hit
        ``True`` when the solve stopped at the wall-clock safety net rather than its
        deterministic limit (the result may then depend on the machine).
    """

    places: tuple[tuple[Place, ...], ...]
    court_max: int | None
    slot_max: int | None
    status: str
    wall_cap_hit: bool = False


def venue_places(league: League, venue_index: int, per_day: int) -> list[Place]:
    """The places of one venue on a match day: every court at every slot (the venue's own slots,
    else ``per_day`` kick-offs ``game_minutes`` apart from the calendar's kick-off, else one
    unnamed time).

    Parameters
    ----------
    league : League
        The league the venue belongs to.
    venue_index : int
        The venue's position in ``league.venues``.
    per_day : int
        Rounds played on one match day (``calendar.rounds_per_day``).

    Returns
    -------
    list of Place
        Court by court, slot by slot; a slot label only where the times are named.
    """
    v = league.venues[venue_index]
    if v.slots:
        times: list[time | None] = list(v.slots)
    elif per_day > 1:
        base = datetime.combine(datetime(2000, 1, 1).date(), league.calendar.kickoff)
        times = [(base + timedelta(minutes=j * league.calendar.game_minutes)).time()
                 for j in range(per_day)]
    else:
        times = [None]
    labelled = bool(v.slots) or per_day > 1
    return [Place(v.name, c, t, t.strftime("%H:%M") if (labelled and t is not None) else None)
            for c in v.courts for t in times]


def _minutes(t: time | None) -> int:
    return -1 if t is None else t.hour * 60 + t.minute


def assign_places(league: League, tt: Timetable, limits: SolveLimits) -> Placement:
    """Choose a place for every game of the timetable (see module docstring).

    Parameters
    ----------
    league
        The league (venues, courts, slots, what "home" means, balance priorities).
    tt
        The timetable (rounds, games, match days).
    limits
        The solver's limits.

    Returns
    -------
    Placement
        A place for every game, balanced over courts and slots.

    Raises
    ------
    InfeasibleError
        No place for every game (too few courts or slots on some match day), or none found
        within the time limit.

    References
    ----------
    P. J. Schellenberg, G. H. J. van Rees and S. A. Vanstone, Ars Combinatoria 3 (1977)
    303-318; ``docs/fairness.md``.
    """
    P = len(tt.games)
    if not league.venues:
        empty = tuple(tuple(Place(None, None, None, None) for _ in g) for g in tt.games)
        return Placement(empty, None, None, "optimal")
    per_day = max(1, league.calendar.rounds_per_day)
    all_places: list[Place] = []
    by_venue: dict[str, list[int]] = {}
    for vi, v in enumerate(league.venues):
        ids = []
        for place in venue_places(league, vi, per_day):
            ids.append(len(all_places))
            all_places.append(place)
        by_venue[v.name] = ids
    everywhere = list(range(len(all_places)))
    venue_mode = league.format.home_meaning == "venue"

    def options(home: int) -> list[int]:
        hv = league.teams[home].home_venue
        if venue_mode and hv:
            return by_venue[hv]
        return everywhere

    # the rounds of each match day
    days: dict[int, list[int]] = {}
    for s in range(P):
        days.setdefault(tt.day[s], []).append(s)
    games = [(s, i, h, a) for s in range(P) for i, (h, a) in enumerate(tt.games[s])]
    opts = {(s, i): options(h) for s, i, h, _ in games}
    for d, rounds in days.items():
        need = sum(len(tt.games[s]) for s in rounds)
        if need > len(everywhere) and not venue_mode:
            raise InfeasibleError(
                "the venues cannot hold one match day's games",
                [f"{len(everywhere)} places (courts × time slots) at the venues",
                 f"{need} games on {tt.days[d].isoformat() if tt.days else 'a match day'}"])

    if all(len(o) == 1 for o in opts.values()):
        chosen = {key: o[0] for key, o in opts.items()}
        return _result(tt, all_places, chosen, None, None, "optimal")
    m = cp_model.CpModel()
    x: dict[tuple[int, int, int], cp_model.IntVar] = {}
    for s, i, _, _ in games:
        lits = []
        for p in opts[(s, i)]:
            lit = m.new_bool_var(f"x_{s}_{i}_{p}")
            x[(s, i, p)] = lit
            lits.append(lit)
        m.add_exactly_one(lits)
    times = sorted({_minutes(p.slot) for p in all_places})
    for _d, rounds in days.items():
        for p in everywhere:
            cell = [x[(s, i, p)] for s in rounds for i in range(len(tt.games[s]))
                    if (s, i, p) in x]
            if len(cell) > 1:
                m.add_at_most_one(cell)
        if len(rounds) > 1:
            use = {(s, t): m.new_bool_var(f"u_{s}_{t}") for s in rounds for t in times}
            for s in rounds:
                for i in range(len(tt.games[s])):
                    for p in opts[(s, i)]:
                        m.add_implication(x[(s, i, p)], use[(s, _minutes(all_places[p].slot))])
            for t in times:
                m.add_at_most_one(use[(s, t)] for s in rounds)
            for j, s in enumerate(rounds):
                for s2 in rounds[j + 1:]:
                    for t in times:
                        for t2 in times:
                            if t2 <= t:
                                m.add_bool_or([use[(s, t)].negated(), use[(s2, t2)].negated()])
    w = league.priorities
    objective = []
    court_max = slot_max = None
    bounds: dict[str, int] = {}
    court_keys = sorted({(p.venue, p.court) for p in all_places})
    slot_keys = sorted({_minutes(p.slot) for p in all_places})
    teams = range(len(league.teams))
    for label, keys, key_of, weight in (
        ("court", court_keys, lambda p: (p.venue, p.court), w.venue_balance),
        ("slot", slot_keys, lambda p: _minutes(p.slot), w.slot_balance),
    ):
        if len(keys) < 2 or weight <= 0:
            continue
        top = m.new_int_var(0, P, f"max_{label}")
        bound = 0
        for t in teams:
            mine = [(s, i) for s, i, h, a in games if t in (h, a)]
            reach = {key_of(all_places[p]) for key in mine for p in opts[key]}
            for key in reach:
                cnt = [x[(s, i, p)] for s, i in mine for p in opts[(s, i)]
                       if key_of(all_places[p]) == key]
                m.add(sum(cnt) <= top)
            if reach:
                bound = max(bound, ceil(len(mine) / len(reach)))
        m.add(top >= bound)
        bounds[label] = bound
        objective.append((weight, top, label))
    if not objective:
        # no balance wanted: the earliest free places, if the simple pass fits everything
        quick = _greedy(games, opts, days, all_places, tt, balance=False)
        if len(quick) == len(games):
            return _result(tt, all_places, quick, None, None, "optimal")
        m.minimize(sum(_minutes(all_places[p].slot) * lit for (s, i, p), lit in x.items()))
    else:
        m.minimize(sum(wt * var for wt, var, _ in objective))
    if len(league.venues) == 1 and len(times) == 1 and tt.games:
        # the courts of one venue with one kick-off time are interchangeable: relabel them so
        # that game i of the first round is on court i (symmetry breaking, no loss)
        first = min(range(P), key=lambda s: (tt.day[s], s))
        if len(days[tt.day[first]]) == 1:
            for i in range(len(tt.games[first])):
                m.add(x[(first, i, everywhere[i])] == 1)
    start = None
    if objective and len(days) == P:
        start = _by_assignment(opts, days, all_places, tt, max(0, w.venue_balance),
                               max(0, w.slot_balance))
    if start is None:
        start = _greedy(games, opts, days, all_places, tt)
    for key, p in start.items():
        for q in opts[key]:
            m.add_hint(x[(key[0], key[1], q)], q == p)
    complete = len(start) == len(games)
    start_value: dict[str, int] = {}
    if complete:
        for _wt, var, label in objective:
            start_value[label] = _max_use(start, tt, all_places, label)
            m.add_hint(var, start_value[label])
        if all(start_value[label] <= bounds[label] for _wt, _v, label in objective):
            return _result(tt, all_places, start, start_value.get("court"),
                           start_value.get("slot"), "optimal")
    solver = cp_model.CpSolver()
    configure(solver, limits)
    status = solve_interruptibly(solver, m)
    if status == cp_model.INFEASIBLE:
        raise InfeasibleError(
            "the courts and time slots cannot hold the games of some match day",
            ["venue capacities (courts × time slots)",
             f"{per_day} round(s) on each match day"])
    if complete:
        start_score = sum(wt * start_value[label] for wt, _v, label in objective)
        if (status not in (cp_model.OPTIMAL, cp_model.FEASIBLE)
                or solver.objective_value > start_score):
            return _result(tt, all_places, start, start_value.get("court"),
                           start_value.get("slot"), "feasible")
    if status not in (cp_model.OPTIMAL, cp_model.FEASIBLE):
        raise InfeasibleError("no assignment of courts and time slots was found in the time "
                              "limit; allow more time (time_limit_seconds in the league file, or "
                              "--time-limit)", [])
    chosen = {}
    for (s, i, p), lit in x.items():
        if solver.boolean_value(lit):
            chosen[(s, i)] = p
    for _wt, var, label in objective:
        if label == "court":
            court_max = solver.value(var)
        else:
            slot_max = solver.value(var)
    out = _result(tt, all_places, chosen, court_max, slot_max,
                  "optimal" if status == cp_model.OPTIMAL else "feasible")
    if status != cp_model.OPTIMAL and solver.wall_time >= limits.wall * 0.98:
        out = Placement(out.places, out.court_max, out.slot_max, out.status, True)
    return out


def _by_assignment(opts, days, all_places, tt, wv: int, ws: int
                   ) -> dict[tuple[int, int], int] | None:
    """Start for one round per match day: round by round, a minimum-cost assignment of the
    games to the places (OR-Tools linear sum assignment), the cost of a place being the growth of
    the two teams' sums of squared court and slot counts (which favours even use)."""
    from ortools.graph.python import linear_sum_assignment

    court: dict = {}
    slot: dict = {}
    chosen: dict[tuple[int, int], int] = {}
    for _d, rounds in sorted(days.items()):
        if len(rounds) != 1:
            return None
        s = rounds[0]
        solver = linear_sum_assignment.SimpleLinearSumAssignment()
        cols = sorted({p for i in range(len(tt.games[s])) for p in opts[(s, i)]})
        col_of = {p: j for j, p in enumerate(cols)}
        for i, (h, a) in enumerate(tt.games[s]):
            for p in opts[(s, i)]:
                pl = all_places[p]
                ck, sk = (pl.venue, pl.court), _minutes(pl.slot)
                cost = wv * (2 * court.get((h, ck), 0) + 2 * court.get((a, ck), 0) + 2)
                cost += ws * (2 * slot.get((h, sk), 0) + 2 * slot.get((a, sk), 0) + 2)
                solver.add_arc_with_cost(i, col_of[p], cost * 1000 + col_of[p])
        if solver.solve() != solver.OPTIMAL:
            return None
        for i, (h, a) in enumerate(tt.games[s]):
            p = cols[solver.right_mate(i)]
            pl = all_places[p]
            ck, sk = (pl.venue, pl.court), _minutes(pl.slot)
            for t in (h, a):
                court[(t, ck)] = court.get((t, ck), 0) + 1
                slot[(t, sk)] = slot.get((t, sk), 0) + 1
            chosen[(s, i)] = p
    return chosen


def _greedy(games, opts, days, all_places, tt, *, balance: bool = True
            ) -> dict[tuple[int, int], int]:
    """A start for the solver (and the answer when no balance is wanted): each game, in round
    order, takes the free place whose court and slot its two teams have used least so far
    (``balance``) or simply the earliest free place; the rounds of one match day take
    increasing, disjoint kick-off times. May stop early (then it is only a partial hint)."""
    court: dict = {}
    slot: dict = {}
    chosen: dict[tuple[int, int], int] = {}
    for _d, rounds in sorted(days.items()):
        taken: set[int] = set()
        latest = -2
        for s in rounds:
            mine: set[int] = set()
            for i, (h, a) in enumerate(tt.games[s]):
                best = None
                for p in opts[(s, i)]:
                    pl = all_places[p]
                    sk = _minutes(pl.slot)
                    if p in taken or (sk <= latest and sk not in mine):
                        continue
                    ck = (pl.venue, pl.court)
                    if balance:
                        cost = (court.get((h, ck), 0) + court.get((a, ck), 0)
                                + slot.get((h, sk), 0) + slot.get((a, sk), 0), 0, p)
                    else:
                        cost = (0, sk, p)
                    if best is None or cost < best[0]:
                        best = (cost, p)
                if best is None:
                    return chosen
                p = best[1]
                pl = all_places[p]
                ck, sk = (pl.venue, pl.court), _minutes(pl.slot)
                for t in (h, a):
                    court[(t, ck)] = court.get((t, ck), 0) + 1
                    slot[(t, sk)] = slot.get((t, sk), 0) + 1
                taken.add(p)
                mine.add(sk)
                chosen[(s, i)] = p
            latest = max(mine, default=latest)
    return chosen


def _max_use(chosen, tt, all_places, label: str) -> int:
    use: dict = {}
    for (s, i), p in chosen.items():
        pl = all_places[p]
        key = (pl.venue, pl.court) if label == "court" else _minutes(pl.slot)
        for t in tt.games[s][i]:
            use[(t, key)] = use.get((t, key), 0) + 1
    return max(use.values(), default=0)


def _result(tt, all_places, chosen, court_max, slot_max, status) -> Placement:
    places = tuple(tuple(all_places[chosen[(s, i)]] for i in range(len(tt.games[s])))
                   for s in range(len(tt.games)))
    return Placement(places, court_max, slot_max, status)
