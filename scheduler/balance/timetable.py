"""The timetable model (OR-Tools CP-SAT): round order, teams on vertices, home/away, match days.

Given a one-factorization of K_n (``n`` even; an odd league plays on ``n = teams + 1`` with the
bye vertex ``n - 1``) the model decides

- the order of the factorization's rounds in every leg (one order for the fixed schemes, see
  :mod:`scheduler.balance.legs`; one per leg for "free");
- which vertex each team named in a team-specific rule sits on (the others fill the free vertices
  in order afterwards);
- the venue of every game of leg 1 (later legs swap it leg by leg);
- the match day of every group of ``rounds_per_day`` rounds (:mod:`scheduler.balance.dates`);

subject to the league's hard rules, each under its own assumption literal
(:mod:`scheduler.balance.explain`), and minimises the total number of breaks (then the lateness of
the match days). Breaks are counted over the games actually played: a bye is skipped.

Valid lower bounds from :func:`scheduler.balance.legs.total_break_bound` (de Werra 1981, Annals of
Discrete Math. 11:381-395; fairness.md §1, §4) are added as constraints so that CP-SAT can prove
optimality as soon as it reaches them. The search starts from a hint: for GK_n the canonical
circle schedule with de Werra's orientation (fairness.md §1 "Canonical schedule"), which has
exactly ``n - 2`` breaks, its round order rotated to suit the leg scheme (the rotation by one
gives the English scheme 2n-4; the free scheme starts from the inverted order); for other
factorizations the round-order search on colouring paths (:mod:`scheduler.balance.orders`, which
finds the leg-1 order and venues; the CP-SAT limit is halved to pay for it) followed by the
venue-flip annealing of :mod:`scheduler.balance.anneal` over the whole season (kept only where
it is no worse); the annealing alone for odd leagues above 16 vertices.

Determinism: one CP-SAT worker, a fixed ``random_seed`` and ``max_deterministic_time``; the
wall-clock limit is only a safety net (reported when hit).
"""

from __future__ import annotations

from dataclasses import dataclass
from datetime import date
from functools import lru_cache

from ortools.sat.python import cp_model

from scheduler.balance import legs as leg_schemes
from scheduler.balance.anneal import anneal, breaks_of
from scheduler.balance.dates import DayModel, candidate_days, day_groups
from scheduler.balance.explain import RuleBook, explain
from scheduler.balance.orders import EXACT_HALF, MAX_N, OrderResult, search_order
from scheduler.config.model import League
from scheduler.errors import InfeasibleError
from scheduler.factorization.circle import circle_rounds
from scheduler.factorization.model import Factorization
from scheduler.interrupt import solve_interruptibly


@dataclass(frozen=True)
class Timetable:
    """A solved timetable, by team index (``league.teams`` order).

    ``games[s]`` are the (home, away) team indices of season round ``s`` (0-based), ``byes[s]``
    the team sitting out; ``day[s]`` indexes ``days``; ``order[l]`` lists the factorization's round
    index at every position of leg ``l``.
    """

    n: int
    vertex_of_team: tuple[int, ...]
    order: tuple[tuple[int, ...], ...]
    games: tuple[tuple[tuple[int, int], ...], ...]
    byes: tuple[tuple[int, ...], ...]
    day: tuple[int, ...]
    days: tuple[date, ...]
    breaks: int
    break_bound: int
    break_bound_reason: str
    status: str
    wall_cap_hit: bool
    orientation: tuple[tuple[int, int, bool], ...] = ()
    """Leg-1 venue of every factorization game ``(a, b, a_is_home)`` (vertices, a < b)."""


@dataclass(frozen=True)
class SolveLimits:
    """Deterministic time (CP-SAT's ``max_deterministic_time``) and a wall-clock safety cap."""

    deterministic: float
    wall: float
    seed: int


def configure(solver: cp_model.CpSolver, limits: SolveLimits) -> None:
    """Parameters for reproducible runs: one worker, fixed seed, deterministic limit."""
    p = solver.parameters
    p.random_seed = int(limits.seed) % (2**31)
    p.num_workers = 1
    p.max_deterministic_time = float(limits.deterministic)
    p.max_time_in_seconds = float(limits.wall)


def canonical_hint(n: int) -> tuple[list[int], dict[tuple[int, int], bool]] | None:
    """For GK_n as built by ``circle_rounds``: the canonical round order and de Werra's
    orientation (fairness.md §1): round k = 1..n-1 contains {∞, k}; ∞ is home when k is odd;
    in {k+i, k-i} the vertex k+i is home when i is odd. Returns (order, home-of-(a, b))."""
    m = n - 1
    rounds = circle_rounds(n)
    index = {r: i for i, r in enumerate(rounds)}
    order: list[int] = []
    home: dict[tuple[int, int], bool] = {}
    for k in range(1, n):
        games = [(m, k % m)] + [((k + i) % m, (k - i) % m) for i in range(1, n // 2)]
        key = tuple(sorted(tuple(sorted(g)) for g in games))
        order.append(index[key])
        home_first = [k % 2 == 1] + [i % 2 == 1 for i in range(1, n // 2)]
        for (a, b), first in zip(games, home_first, strict=True):
            lo, hi = min(a, b), max(a, b)
            home[(lo, hi)] = first if a == lo else not first
    return order, home


SEARCH_WORK = 7.5e8
"""Order-search work units per second of deterministic solve limit (about half a second of one
core); the CP-SAT limit is halved when the search runs, so the total stays about the same."""


@lru_cache(maxsize=8)
def _order_search(rounds, n: int, seed: int, work: float, bye: int | None) -> OrderResult:
    """Cached :func:`scheduler.balance.orders.search_order` (a model may be built twice)."""
    return search_order(rounds, n, seed=seed, work=work, bye=bye)


def _greedy_orientation(rounds, order) -> dict[tuple[int, int], bool]:
    """A start orientation for other factorizations: alternate each vertex where possible."""
    last: dict[int, bool] = {}
    home: dict[tuple[int, int], bool] = {}
    for k in order:
        for a, b in rounds[k]:
            want_a = not last.get(a, False)
            want_b = not last.get(b, True)
            a_home = want_a if (a in last or b not in last) else not want_b
            home[(a, b)] = a_home
            last[a], last[b] = a_home, not a_home
    return home


class TimetableModel:
    """Builds and solves the CP-SAT model for one factorization and one league."""

    def __init__(self, league: League, fact: Factorization, *, minimise_breaks: bool = True,
                 fixed_order: tuple[int, ...] | None = None, earliest_days: bool = False,
                 effort: float = 2.0,
                 start_home: dict[tuple[int, int], bool] | None = None) -> None:
        self.earliest_days = earliest_days
        self.start_home = start_home
        self.effort = effort
        self.league = league
        self.fact = fact
        self.model = cp_model.CpModel()
        self.book = RuleBook(self.model)
        teams = len(league.teams)
        self.T = teams
        self.odd = teams % 2 == 1
        n = fact.n
        if n != teams + (1 if self.odd else 0):
            raise ValueError(f"factorization of K_{n} does not fit {teams} teams")
        self.n = n
        self.R = n - 1
        self.L = max(1, league.format.legs)
        self.P = self.L * self.R
        self.scheme = league.format.scheme if self.L > 1 else "mirrored"
        self.bye = n - 1 if self.odd else None
        self.vertices = list(range(n - 1)) if self.odd else list(range(n))
        self.partner = fact.partner_table()
        self.per_day = max(1, league.calendar.rounds_per_day)
        self.groups = day_groups(self.P, self.per_day)
        self.group_of = {s: g for g, ss in enumerate(self.groups) for s in ss}
        self._th: dict[tuple[int, int], cp_model.IntVar] = {}
        self._tb: dict[tuple[int, int], cp_model.IntVar] = {}
        self.minimise_breaks = minimise_breaks
        self._build_order(fixed_order)
        self._build_venues()
        self._build_teams()
        self._build_breaks()
        self._build_days()
        self._build_rules()
        self._build_objective()

    # --- structure -----------------------------------------------------------------------------
    def _perm(self, tag: str) -> list[list[cp_model.IntVar]]:
        m, R = self.model, self.R
        y = [[m.NewBoolVar(f"{tag}_{q}_{k}") for k in range(R)] for q in range(R)]
        for q in range(R):
            m.AddExactlyOne(y[q])
        for k in range(R):
            m.AddExactlyOne(y[q][k] for q in range(R))
        return y

    def _build_order(self, fixed_order) -> None:
        R, m = self.R, self.model
        self.base = self._perm("y")
        self.is_canonical = self.fact.rounds == circle_rounds(self.n)
        self.searched = False
        if self.is_canonical:
            hint_order, hint_home = canonical_hint(self.n)
            if self.L > 1 and fixed_order is None:
                hint_order = self._best_rotation(hint_order, hint_home)
        elif fixed_order is not None:
            hint_order = list(fixed_order)
            hint_home = self.start_home or _greedy_orientation(self.fact.rounds, hint_order)
        else:
            maps = (leg_schemes.leg_maps(self.scheme, self.L, R)
                    or leg_schemes.leg_maps("inverted", self.L, R))
            moves = int(min(1_500_000, 60_000 + 30_000 * self.effort))
            if self.n > MAX_N or (self.odd and self.n > 2 * EXACT_HALF):
                # two independent runs (seeds fixed), the better one wins
                runs = [anneal(self.fact.rounds, self.n, maps, self.bye,
                               seed=self.league.seed * 2 + i, moves=moves // 2)
                        for i in range(2)]
            else:
                # order search on the colouring paths (scheduler.balance.orders), then the
                # venue-flip annealing from it for the whole season (never worse than its start)
                found = _order_search(self.fact.rounds, self.n, self.league.seed,
                                      SEARCH_WORK * self.effort, self.bye)
                self.searched = True
                runs = [anneal(self.fact.rounds, self.n, maps, self.bye,
                               seed=self.league.seed * 2, moves=moves // 4,
                               start=(found.order, found.home))]
            hint_order, hint_home, _ = min(runs, key=lambda run: run[2])
        if fixed_order is not None:
            hint_order = list(fixed_order)
            for q, k in enumerate(fixed_order):
                m.Add(self.base[q][k] == 1)
        self.hint_order, self.hint_home = hint_order, hint_home
        for q in range(R):
            for k in range(R):
                m.AddHint(self.base[q][k], hint_order[q] == k)
        maps = leg_schemes.leg_maps(self.scheme, self.L, R)
        self.leg_y: list[list[list[cp_model.IntVar]]] = []
        if maps is None:
            # free scheme: start from the inverted order, which reaches 2n-4 breaks with the
            # canonical schedule (fairness.md §4)
            start = leg_schemes.leg_maps("inverted", self.L, R)
            self.leg_y.append(self.base)
            for leg in range(1, self.L):
                y = self._perm(f"y{leg}")
                for q in range(R):
                    for k in range(R):
                        m.AddHint(y[q][k], hint_order[start[leg][q]] == k)
                self.leg_y.append(y)
        else:
            for mp in maps:
                self.leg_y.append([self.base[mp[q]] for q in range(R)])
        # Y[s][k]: season round s holds factorization round k
        self.Y = [self.leg_y[s // R][s % R] for s in range(self.P)]

    def _best_rotation(self, order: list[int], home) -> list[int]:
        """The rotation of the canonical order with the fewest season breaks under the scheme
        (for the English scheme the rotation by one reaches 2n-4 [computed for n = 4..20])."""
        maps = leg_schemes.leg_maps(self.scheme, self.L, self.R) or tuple(
            tuple(range(self.R)) for _ in range(self.L))
        best = None
        for r in range(self.R):
            rot = order[r:] + order[:r]
            value = breaks_of(self.fact.rounds, home,
                              [[rot[mp[q]] for q in range(self.R)] for mp in maps], self.bye)
            if best is None or value < best[0]:
                best = (value, rot)
        return best[1]

    def _build_venues(self) -> None:
        m = self.model
        self.h: dict[tuple[int, int], cp_model.IntVar] = {}
        for rnd in self.fact.rounds:
            for a, b in rnd:
                if self.bye in (a, b):
                    continue
                var = m.NewBoolVar(f"h_{a}_{b}")
                self.h[(a, b)] = var
                m.AddHint(var, bool(self.hint_home.get((a, b), True)))
        # HV[s][v]: vertex v plays at home in season round s (false at its bye)
        self.HV: list[dict[int, cp_model.IntVar]] = []
        self.bye_round = {}
        if self.odd:
            for k, rnd in enumerate(self.fact.rounds):
                for a, b in rnd:
                    if b == self.bye:
                        self.bye_round[a] = k
        for s in range(self.P):
            flip = leg_schemes.flipped(s // self.R)
            row = {}
            for v in self.vertices:
                hv = m.NewBoolVar(f"H_{s}_{v}")
                for k in range(self.R):
                    y = self.Y[s][k]
                    w = self.partner[k][v]
                    if w == self.bye:
                        m.Add(hv == 0).OnlyEnforceIf(y)
                        continue
                    a, b = (v, w) if v < w else (w, v)
                    var = self.h[(a, b)]
                    positive = (v == a) != flip
                    if positive:
                        m.Add(hv == var).OnlyEnforceIf(y)
                    else:
                        m.Add(hv + var == 1).OnlyEnforceIf(y)
                row[v] = hv
            self.HV.append(row)

    def played(self, s: int, v: int):
        """Literal 'vertex v plays in season round s' (None = always)."""
        if not self.odd:
            return None
        return self.Y[s][self.bye_round[v]].Not()

    def _build_teams(self) -> None:
        r = self.league.rules
        names = {t.name: i for i, t in enumerate(self.league.teams)}
        self.names = names
        named: set[int] = set()
        for td in (*r.unavailable, *r.no_home_games):
            named.add(names[td.team])
        for grp in self.league.shared_ground_groups:
            named |= {names[t] for t in grp}
        for f in r.fixed:
            named |= {names[f.home], names[f.away]}
        self.capacity_groups = self._capacity_groups()
        for _, _, members in self.capacity_groups:
            named |= set(members)
        self.named = sorted(named)
        m = self.model
        self.z: dict[int, dict[int, cp_model.IntVar]] = {}
        for t in self.named:
            self.z[t] = {v: m.NewBoolVar(f"z_{t}_{v}") for v in self.vertices}
            m.AddExactlyOne(self.z[t].values())
            for v in self.vertices:
                m.AddHint(self.z[t][v], v == t)
        for v in self.vertices:
            m.AddAtMostOne(self.z[t][v] for t in self.named)

    def _capacity_groups(self) -> list[tuple[str, int, list[int]]]:
        """Venue mode: teams hosting at one venue whose games a day could exceed its capacity."""
        lg = self.league
        if lg.format.home_meaning != "venue":
            return []
        by_venue: dict[str, list[int]] = {}
        for i, t in enumerate(lg.teams):
            if t.home_venue:
                by_venue.setdefault(t.home_venue, []).append(i)
        out = []
        for vname, members in by_venue.items():
            cap = lg.venue(vname).capacity
            if len(members) * self.per_day > cap:
                out.append((vname, cap, members))
        return out

    def TH(self, t: int, s: int):
        """Literal 'team t (named) plays at home in season round s'."""
        key = (t, s)
        if key not in self._th:
            lit = self.model.NewBoolVar(f"TH_{t}_{s}")
            for v, zv in self.z[t].items():
                self.model.Add(lit == self.HV[s][v]).OnlyEnforceIf(zv)
            self._th[key] = lit
        return self._th[key]

    def TB(self, t: int, s: int):
        """Literal 'team t (named) has its bye in season round s' (odd leagues)."""
        key = (t, s)
        if key not in self._tb:
            lit = self.model.NewBoolVar(f"TB_{t}_{s}")
            for v, zv in self.z[t].items():
                self.model.Add(lit == self.Y[s][self.bye_round[v]]).OnlyEnforceIf(zv)
            self._tb[key] = lit
        return self._tb[key]

    def meet(self, a: int, b: int, s: int, lit) -> None:
        """Under ``lit``: teams a and b (named) meet in season round s."""
        m = self.model
        for v in self.vertices:
            for k in range(self.R):
                w = self.partner[k][v]
                clause = [lit.Not(), self.z[a][v].Not(), self.Y[s][k].Not()]
                if w != self.bye:
                    clause.append(self.z[b][w])
                m.AddBoolOr(clause)

    def _build_breaks(self) -> None:
        m = self.model
        self.b: list[dict[int, cp_model.IntVar]] = [{}]
        self.E: list[dict[int, cp_model.IntVar]] = []
        if self.odd:
            for s in range(self.P):
                row = {}
                for v in self.vertices:
                    e = m.NewBoolVar(f"E_{s}_{v}")
                    pl = self.played(s, v)
                    m.Add(e == self.HV[s][v]).OnlyEnforceIf(pl)
                    if s > 0:
                        m.Add(e == self.E[s - 1][v]).OnlyEnforceIf(pl.Not())
                    row[v] = e
                self.E.append(row)
        for s in range(1, self.P):
            row = {}
            for v in self.vertices:
                b = m.NewBoolVar(f"b_{s}_{v}")
                x = self.HV[s][v]
                if not self.odd:
                    y = self.HV[s - 1][v]
                    m.AddBoolOr([b, x, y])
                    m.AddBoolOr([b, x.Not(), y.Not()])
                    m.AddBoolOr([b.Not(), x, y.Not()])
                    m.AddBoolOr([b.Not(), x.Not(), y])
                else:
                    y = self.E[s - 1][v]
                    pl = self.played(s, v)
                    m.AddBoolOr([b.Not(), pl])
                    m.AddBoolOr([b.Not(), x, y.Not()])
                    m.AddBoolOr([b.Not(), x.Not(), y])
                    m.AddBoolOr([b, pl.Not(), x, y])
                    m.AddBoolOr([b, pl.Not(), x.Not(), y.Not()])
                row[v] = b
            self.b.append(row)
        self.total_breaks = sum(b for row in self.b for b in row.values())
        bound = leg_schemes.total_break_bound(self.n, self.T, self.scheme, self.L)
        self.bound = bound
        if self.P > 1:
            m.Add(self.total_breaks >= bound.value)
            per_leg = leg_schemes.leg_break_bound(self.n, self.odd)
            if per_leg:
                for leg in range(self.L):
                    inside = [self.b[s][v] for s in range(leg * self.R + 1, (leg + 1) * self.R)
                              for v in self.vertices]
                    m.Add(sum(inside) >= per_leg)

    def _build_days(self) -> None:
        self.days = candidate_days(self.league, self.P)
        G = len(self.groups)
        if len(self.days) < G:
            self.book.forbid(
                f"the calendar offers {len(self.days)} match days but the season needs {G}"
            )
            self.daymodel = None
            return
        self.daymodel = DayModel(self.model, self.days, G)
        self.day_index = {d: i for i, d in enumerate(self.days)}
        r = self.league.rules
        dated = r.unavailable or r.no_home_games or any(f.date is not None for f in r.fixed)
        if self.earliest_days or (not dated and r.min_rest_days is None):
            # nothing depends on the choice of days: use the first ones
            for g in range(G):
                self.model.Add(self.daymodel.on[(g, g)] == 1)

    # --- rules ---------------------------------------------------------------------------------
    def _build_rules(self) -> None:
        lg, r, m = self.league, self.league.rules, self.model
        book = self.book
        P = self.P
        # runs of home / away games
        for value, home, word in ((r.max_home_run, True, "home"), (r.max_away_run, False, "away")):
            if value is None:
                continue
            lit = book.rule(f"max_{word}_run = {value} for every team")
            if value < 1:
                m.AddBoolOr([lit.Not()])
                continue
            for v in self.vertices:
                self._run_limit(v, value, home, lit)
        if r.no_breaks_first:
            lit = book.rule(f"no_breaks_first = {r.no_breaks_first} (no break in rounds 2.."
                            f"{r.no_breaks_first + 1})")
            for s in range(1, min(P, r.no_breaks_first + 1)):
                for v in self.vertices:
                    m.AddImplication(lit, self.b[s][v].Not())
        if r.no_breaks_last:
            lit = book.rule(f"no_breaks_last = {r.no_breaks_last} (no break in the last "
                            f"{r.no_breaks_last} rounds)")
            for s in range(max(1, P - r.no_breaks_last), P):
                for v in self.vertices:
                    m.AddImplication(lit, self.b[s][v].Not())
        if r.min_separation is not None and self.L > 1:
            self._separation(r.min_separation)
        if r.min_rest_days is not None and self.daymodel is not None:
            text = f"min_rest_days = {r.min_rest_days}"
            if self.per_day > 1:
                book.forbid(f"{text} (with {self.per_day} rounds on each match day)")
            else:
                lit = book.rule(text)
                o = self.daymodel.ordinal
                for g in range(len(self.groups) - 1):
                    m.Add(o[g + 1] - o[g] >= r.min_rest_days + 1).OnlyEnforceIf(lit)
        for td in r.unavailable:
            t = self.names[td.team]
            for d in td.dates:
                self._unavailable(t, td.team, d)
        for td in r.no_home_games:
            t = self.names[td.team]
            for d in td.dates:
                self._no_home(t, td.team, d)
        for grp in lg.shared_ground_groups:
            members = [self.names[x] for x in grp]
            lit = book.rule("shared ground: at most one of " + ", ".join(grp)
                            + " at home on a match day")
            self._day_cap(members, 1, lit, per_team=True)
        for vname, cap, members in self.capacity_groups:
            lit = book.rule(f"{vname} can host at most {cap} game{'s' if cap != 1 else ''} "
                            f"on a match day")
            self._day_cap(members, cap, lit, per_team=False)
        for f in r.fixed:
            self._fixed(f)

    def _run_limit(self, v: int, value: int, home: bool, lit) -> None:
        m, P = self.model, self.P

        def lit_of(s):
            x = self.HV[s][v]
            return x if home else x.Not()

        if not self.odd:
            for s in range(P - value):
                window = [self.HV[u][v] for u in range(s, s + value + 1)]
                if home:
                    m.Add(sum(window) <= value).OnlyEnforceIf(lit)
                else:
                    m.Add(sum(window) >= 1).OnlyEnforceIf(lit)
            return
        prev = None
        for s in range(P):
            c = m.NewIntVar(0, value, f"run{int(home)}_{s}_{v}")
            pl = self.played(s, v)
            x = lit_of(s)
            if prev is None:
                m.Add(c == 1).OnlyEnforceIf([lit, pl, x])
                m.Add(c == 0).OnlyEnforceIf([lit, pl, x.Not()])
                m.Add(c == 0).OnlyEnforceIf([lit, pl.Not()])
            else:
                m.Add(c == prev + 1).OnlyEnforceIf([lit, pl, x])
                m.Add(c == 0).OnlyEnforceIf([lit, pl, x.Not()])
                m.Add(c == prev).OnlyEnforceIf([lit, pl.Not()])
            prev = c

    def _separation(self, value: int) -> None:
        m, R, book = self.model, self.R, self.book
        text = f"min_separation = {value}"
        if self.scheme in leg_schemes.FIXED_SCHEMES:
            seps = leg_schemes.separations(self.scheme, self.L, R)
            if seps and min(seps) < value:
                book.forbid(f"{text} (the {self.scheme} scheme keeps some pairs only "
                            f"{min(seps)} rounds apart)")
            return
        lit = book.rule(text)
        pos = [[sum(q * self.leg_y[leg][q][k] for q in range(R)) for k in range(R)]
               for leg in range(self.L)]
        for leg in range(self.L - 1):
            for k in range(R):
                m.Add(R + pos[leg + 1][k] - pos[leg][k] - 1 >= value).OnlyEnforceIf(lit)

    def _unavailable(self, t: int, name: str, d: date) -> None:
        if self.daymodel is None or d not in self.day_index:
            return
        lit = self.book.rule(f"{name} is unavailable on {d.isoformat()}")
        for g, on in self.daymodel.groups_on(self.day_index[d]):
            if not self.odd:
                self.model.AddBoolOr([lit.Not(), on.Not()])
            else:
                for s in self.groups[g]:
                    self.model.AddBoolOr([lit.Not(), on.Not(), self.TB(t, s)])

    def _no_home(self, t: int, name: str, d: date) -> None:
        if self.daymodel is None or d not in self.day_index:
            return
        lit = self.book.rule(f"{name} cannot play at home on {d.isoformat()}")
        for g, on in self.daymodel.groups_on(self.day_index[d]):
            for s in self.groups[g]:
                self.model.AddBoolOr([lit.Not(), on.Not(), self.TH(t, s).Not()])

    def _day_cap(self, members: list[int], cap: int, lit, *, per_team: bool) -> None:
        m = self.model
        for ss in self.groups:
            if per_team and len(ss) > 1:
                days = []
                for t in members:
                    hd = m.NewBoolVar(f"hd_{t}_{ss[0]}")
                    for s in ss:
                        m.AddImplication(self.TH(t, s), hd)
                    days.append(hd)
                m.Add(sum(days) <= cap).OnlyEnforceIf(lit)
            else:
                m.Add(sum(self.TH(t, s) for t in members for s in ss) <= cap).OnlyEnforceIf(lit)

    def _fixed(self, f) -> None:
        m, book = self.model, self.book
        a, b = self.names[f.home], self.names[f.away]
        where = " ".join(x for x in (
            f"in round {f.round}" if f.round is not None else "",
            f"on {f.date.isoformat()}" if f.date is not None else "") if x)
        venue = " (either venue)" if f.any_venue else ""
        lit = book.rule(f"fixed: {f.home} v {f.away} {where}{venue}")
        if f.round is not None:
            s = f.round - 1
            if not 0 <= s < self.P:
                m.AddBoolOr([lit.Not()])
                return
            self.meet(a, b, s, lit)
            if not f.any_venue:
                m.AddImplication(lit, self.TH(a, s))
            if f.date is not None:  # both a round and a date: that round on that date
                on = None
                if self.daymodel is not None and f.date in self.day_index:
                    on = self.daymodel.on.get((self.group_of[s], self.day_index[f.date]))
                if on is None:
                    m.AddBoolOr([lit.Not()])
                else:
                    m.AddImplication(lit, on)
            return
        if self.daymodel is None or f.date not in self.day_index:
            m.AddBoolOr([lit.Not()])
            return
        d = self.day_index[f.date]
        options = []
        for g, on in self.daymodel.groups_on(d):
            for s in self.groups[g]:
                ms = m.NewBoolVar(f"fx_{a}_{b}_{s}")
                m.AddImplication(ms, on)
                self.meet(a, b, s, ms)
                if not f.any_venue:
                    m.AddImplication(ms, self.TH(a, s))
                options.append(ms)
        m.AddBoolOr([lit.Not(), *options])

    def _build_objective(self) -> None:
        late = self.daymodel.lateness() if self.daymodel is not None else 0
        if self.minimise_breaks:
            span = len(self.groups) * max(1, len(self.days)) + 1
            self.model.Minimize(span * self.total_breaks + late)
        else:
            self.model.Minimize(late)

    # --- solving -------------------------------------------------------------------------------
    def solve(self, limits: SolveLimits, *, explain_failure: bool = True) -> Timetable:
        self.book.assume_all()
        solver = cp_model.CpSolver()
        if self.searched:  # the order search took half of the deterministic budget
            limits = SolveLimits(max(0.5, limits.deterministic / 2), limits.wall, limits.seed)
        configure(solver, limits)
        status = solve_interruptibly(solver, self.model)
        if status == cp_model.INFEASIBLE and not explain_failure:
            raise InfeasibleError("infeasible on the earliest match days", [])
        if status == cp_model.INFEASIBLE:
            raise explain(self.book, solver, lambda idx: self._still_infeasible(idx, limits),
                          what="the league's rules cannot all hold with the round pairings of "
                               f"{self.fact.method}")
        if status not in (cp_model.OPTIMAL, cp_model.FEASIBLE):
            raise InfeasibleError(
                "no timetable was found within the time limit; allow more time "
                "(time_limit_seconds in the league file, or --time-limit) or relax the rules", [])
        hit = status != cp_model.OPTIMAL and solver.WallTime() >= limits.wall * 0.98
        return self._extract(solver, "optimal" if status == cp_model.OPTIMAL else "feasible", hit)

    def _still_infeasible(self, indices: list[int], limits: SolveLimits) -> bool:
        self.model.ClearAssumptions()
        self.model.AddAssumptions([self.book.literals[i] for i in indices])
        solver = cp_model.CpSolver()
        configure(solver, SolveLimits(min(limits.deterministic, 2.0), min(limits.wall, 10.0),
                                      limits.seed))
        status = solve_interruptibly(solver, self.model)
        return status == cp_model.INFEASIBLE

    def _extract(self, solver: cp_model.CpSolver, status: str, hit: bool) -> Timetable:
        R, P = self.R, self.P
        val = solver.BooleanValue
        order = []
        for leg in range(self.L):
            order.append(tuple(next(k for k in range(R) if val(self.leg_y[leg][q][k]))
                               for q in range(R)))
        vertex_of_team = [-1] * self.T
        used = set()
        for t in self.named:
            v = next(v for v in self.vertices if val(self.z[t][v]))
            vertex_of_team[t] = v
            used.add(v)
        free = iter(v for v in self.vertices if v not in used)
        for t in range(self.T):
            if vertex_of_team[t] < 0:
                vertex_of_team[t] = next(free)
        team_at = {v: t for t, v in enumerate(vertex_of_team)}
        games, byes = [], []
        for s in range(P):
            leg, q = divmod(s, R)
            k = order[leg][q]
            flip = leg_schemes.flipped(leg)
            rs, bs = [], []
            for a, b in self.fact.rounds[k]:
                if self.bye in (a, b):
                    bs.append(team_at[a if b == self.bye else b])
                    continue
                a_home = val(self.h[(a, b)]) != flip
                hv, av = (a, b) if a_home else (b, a)
                rs.append((team_at[hv], team_at[av]))
            games.append(tuple(sorted(rs)))
            byes.append(tuple(sorted(bs)))
        if self.daymodel is not None:
            gday = [next(d for (gg, d), lit in self.daymodel.on.items() if gg == g and val(lit))
                    for g in range(len(self.groups))]
        else:
            gday = list(range(len(self.groups)))
        day = tuple(gday[self.group_of[s]] for s in range(P))
        breaks = count_breaks(games, self.T)
        orientation = tuple((a, b, val(var)) for (a, b), var in sorted(self.h.items()))
        return Timetable(self.n, tuple(vertex_of_team), tuple(order), tuple(games), tuple(byes),
                         day, self.days, breaks, self.bound.value, self.bound.reason, status, hit,
                         orientation)


def count_breaks(games, teams: int) -> int:
    """Total breaks over games actually played (byes skipped), counted in the second game."""
    last: dict[int, bool] = {}
    total = 0
    for rnd in games:
        for h, a in rnd:
            for t, home in ((h, True), (a, False)):
                if last.get(t) is home:
                    total += 1
                last[t] = home
    return total


def solve_timetable(league: League, fact: Factorization, limits: SolveLimits, *,
                    minimise_breaks: bool = True,
                    fixed_order: tuple[int, ...] | None = None,
                    start_home: dict[tuple[int, int], bool] | None = None) -> Timetable:
    """Build and solve the timetable model; raises ``InfeasibleError`` naming the rules.

    The earliest match days are tried first (half the limit); only when the rules cannot hold on
    them is the choice of days opened up (then the model prefers early days).
    """
    first = TimetableModel(league, fact, minimise_breaks=minimise_breaks, fixed_order=fixed_order,
                           earliest_days=True, effort=limits.deterministic,
                           start_home=start_home)
    if first.daymodel is None or len(first.days) == len(first.groups):
        return first.solve(limits)
    half = SolveLimits(limits.deterministic / 2, limits.wall / 2, limits.seed)
    try:
        return first.solve(half, explain_failure=False)
    except InfeasibleError:
        pass
    model = TimetableModel(league, fact, minimise_breaks=minimise_breaks, fixed_order=fixed_order,
                           effort=limits.deterministic, start_home=start_home)
    return model.solve(half)
