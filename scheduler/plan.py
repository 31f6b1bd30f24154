"""Season planning, the whole pipeline in one place: a League in, a complete Season out.

config -> factorization -> balance -> calendar -> season (the fairness figures and the rules'
checklist are computed from the season by ``scheduler.fairness.compute_fairness``). The
balancer (:mod:`scheduler.balance`) only builds and solves its models; this module chooses what
to ask it, in this order.

0. *calendar*: rules that the calendar alone makes impossible (``min_rest_days`` longer than the
   gaps between the match days allow) are reported before anything is solved
   (:func:`scheduler.rules.rest_days.calendar_clash`): no factorization can help.

Stages (each reported through ``progress(stage, fraction)``):

1. *factorize*: the engine's best one-factorization of K_n (perfect where one is known); when it
   is not the circle schedule GK_n, GK_n is considered as well, because GK_n with de Werra's
   orientation reaches the fewest breaks (n - 2 per single round robin, de Werra 1981) while it
   is perfect only when n - 1 is prime (Kotzig 1964). A search found no perfect 10-team
   schedule on the canonical minimum-break home/away patterns, so the two goals can conflict;
   the choice follows ``league.priorities`` (mixing against breaks) and is stated in the notes
   with both figures.
2. *timetable*: round order, home/away and match days under the hard rules
   (:mod:`scheduler.balance.timetable`), then a carry-over local search when its weight is > 0
   (:mod:`scheduler.balance.carry`). When the rules cannot hold with any of those
   factorizations, the other available ones (GK_n, Anderson's GA_n, the catalogue's) are tried
   before a clash is reported; the clash names a minimal set of rules
   (:mod:`scheduler.balance.explain`).
   *More options* (``docs/options.md``): the best-mixing rounds in a low-carry-over order and
   the lowest-carry-over schedule (Russell's for a power of two, else an annealing), each
   timetabled with its order fixed, are added when no option so far is as good in every figure
   (at most five options).
3. *places*: every option is finished the same way, chosen or not: the carry-over swap search,
   venue, court and time slot (:mod:`scheduler.balance.places`), then its complete season.
4. *dates*: kick-off datetimes from ``scheduler.calendar``.
5. *choice*: the league's priorities pick one option; the others stay in ``season.options``
   with their complete seasons, so that :func:`choose_option` can switch to another later
   without solving, writing exactly what a plan whose priorities picked it writes.

Determinism: CP-SAT runs with one worker, a fixed seed and a deterministic time limit; a
wall-clock cap is only a safety net and the notes say when it was hit.
"""

from __future__ import annotations

import hashlib
import itertools
from collections.abc import Callable, Iterator
from dataclasses import dataclass, field, replace
from pathlib import Path

from scheduler.balance.carry import improve_order
from scheduler.balance.dates import candidate_days, day_groups, kickoff
from scheduler.balance.low_carry_over import (
    best_low_carry_over,
    carry_over_bounds,
    search_low_carry_over,
)
from scheduler.balance.perfect_breaks import stored_best_perfect
from scheduler.balance.places import Placement, assign_places
from scheduler.balance.timetable import SolveLimits, Timetable, solve_timetable
from scheduler.carry_over import carry_over_of_rounds
from scheduler.config.model import League, Priorities
from scheduler.errors import ConfigError, InfeasibleError, InputError
from scheduler.factorization.anderson import anderson_factorization
from scheduler.factorization.catalogue import catalogue_factorization
from scheduler.factorization.circle import circle_factorization, circle_rounds
from scheduler.factorization.model import Certificate, Factorization
from scheduler.factorization.verify import verify_rounds
from scheduler.fairness.frontier import ScheduleOption, dominates, frontier, frontier_summary
from scheduler.progress import Progress
from scheduler.rules.rest_days import calendar_clash
from scheduler.season import Fixture, MixingInfo, PlanOptionFigures, Season


@dataclass(frozen=True)
class PlanOption:
    """One alternative the planner considered.

    Parameters
    ----------
    label
        The option's short name in every output and for ``scheduler choose --option``: what the
        option is for ("best mixing", "fewest breaks", ...), unique among the options
        (``docs/options.md``).
    method
        The factorization's construction (:attr:`scheduler.factorization.Factorization.method`).
    perfect_pairs
        Pairs of rounds whose union is a Hamiltonian cycle (the independent verifier).
    pairs
        All pairs of rounds, ``R (R - 1) / 2`` for ``R`` rounds of one leg.
    breaks
        The fewest breaks found with this factorization under the league's rules; ``None``
        when the rules cannot hold with it (then ``feasible`` is ``False``).
    break_bound
        The proven lower bound on breaks for the league's size and leg scheme
        (``docs/leg-schemes.md``).
    carry_over
        Russell's carry-over value of leg 1 when computed, else ``None``.
    chosen
        ``True`` for the option the season was built from.
    feasible
        ``False`` when no timetable keeps every rule with this factorization.
    on_frontier
        ``True`` when no other option considered is at least as good in perfect pairs,
        breaks and carry-over and better in one of them.
    detail
        The long description beside the short label: which factorization, from which source,
        in which round order (empty when there is nothing to add).

    Examples
    --------
    >>> option = PlanOption("circle", "circle", 3, 3, 4, 4, None, True)
    >>> option.feasible, option.on_frontier
    (True, False)
    """

    label: str
    method: str
    perfect_pairs: int
    pairs: int
    breaks: int | None
    break_bound: int
    carry_over: int | None
    chosen: bool
    feasible: bool = True
    on_frontier: bool = False
    """No other option considered has at least as many perfect pairs, at most as many breaks and
    at most the carry-over value, and is better in one of them
    (:func:`scheduler.fairness.frontier.frontier`)."""
    detail: str = ""
    """The long description of the option (the label is short)."""

    def figures(self) -> str:
        """The option's figures in words, named as in every other output
        (:mod:`scheduler.fairness.names`), never a missing value printed as "None".

        Returns
        -------
        str
            Comma-separated figures: perfect pairs, then breaks with their bound (or why there
            are none), then the carry-over value when known.

        Examples
        --------
        >>> option = PlanOption("x", "x", 3, 3, None, 4, None, False, False)
        >>> for part in option.figures().split(", "):
        ...     print(part)
        pairs of rounds that mix perfectly 3 of 3
        no timetable keeps every rule with these pairings
        """
        from scheduler.fairness.names import figure_name

        text = f"{figure_name('perfect_pairs')} {self.perfect_pairs} of {self.pairs}"
        if self.breaks is None:
            return text + ", no timetable keeps every rule with these pairings"
        text += f", {figure_name('breaks_total')} {self.breaks} (lower bound {self.break_bound})"
        if self.carry_over is not None:
            text += f", {figure_name('carry_over_value')} {self.carry_over}"
        return text


@dataclass(frozen=True)
class PlanResult:
    """The outcome of :func:`plan_season`.

    Parameters
    ----------
    season
        The planned season (the chosen option's, every option listed in ``season.options``).
    options
        The options considered, in the order of the outputs' numbers.
    status
        "optimal" when every solver stage of the chosen option proved its optimum, else
        "feasible".
    notes
        The planner's notes (those of the season).
    why
        Why the league's priorities picked the chosen option (see below).
    """

    season: Season
    options: tuple[PlanOption, ...]
    status: str
    notes: tuple[str, ...]
    why: str = ""
    """Why the league's priorities picked the chosen option (empty when only one option keeps
    the rules); said on the terminal, never written into the season folder, so that choosing
    an option later (:func:`choose_option`) writes the same files as a plan whose priorities
    picked it."""


def plan_key(league: League, seed: int) -> str:
    """A 16-hex id of what a plan's options are computed from: the league configuration without
    its priorities and the seed (sha256 of their repr; the file path ``source`` is left out so
    that moving the file keeps it).

    The priorities are left out because they only weigh the options against each other; the
    season folder keeps this id beside the stored options, so that ``choose`` can check that
    the league file is still the one they were planned from.

    Parameters
    ----------
    league
        The league.
    seed
        The plan's seed.

    Returns
    -------
    str
        16 lower-case hexadecimal digits.
    """
    text = repr(replace(league, source=None, priorities=Priorities())) + f"|seed={seed}"
    return hashlib.sha256(text.encode("utf-8")).hexdigest()[:16]


def revision(league: League, seed: int, fixtures: tuple[Fixture, ...] = (),
             byes: dict[int, tuple[str, ...]] | None = None) -> str:
    """A deterministic 12-hex id of one published version of a season: the league configuration
    without its priorities (:func:`plan_key`), the seed and the games published.

    The games enter instead of the priorities, so that two plans of the same league that
    publish the same games share a revision however the option was picked (by the priorities
    or later with ``choose``), and different games always get different revisions.

    Parameters
    ----------
    league
        The league.
    seed
        The plan's seed.
    fixtures, byes
        The published games and byes.

    Returns
    -------
    str
        12 lower-case hexadecimal digits.
    """
    games = [(f.round, f.leg, f.home, f.away, f.venue, f.court, f.slot,
              f.date.isoformat() if f.date else None, f.start.isoformat() if f.start else None)
             for f in fixtures]
    text = (plan_key(league, seed) + "|" + repr(games) + "|"
            + repr(sorted((byes or {}).items())))
    return hashlib.sha256(text.encode("utf-8")).hexdigest()[:12]


def _factorize(teams: int, seed: int, budget: float, progress: Progress | None) -> Factorization:
    """The engine's factorization; its progress fills the first fifth of the bar."""
    from scheduler.factorization import factorize

    def inner(message: str, fraction: float) -> None:
        if progress is not None:
            progress(f"factorize: {message}", 0.2 * max(0.0, min(1.0, float(fraction))))

    return factorize(teams, seed=seed, budget=budget, progress=inner)


def _is_circle(fact: Factorization) -> bool:
    return fact.rounds == circle_rounds(fact.n)


@dataclass
class _Candidate:
    label: str
    fact: Factorization
    cert: Certificate
    detail: str = ""
    """The long description (the factorization and how its rounds were ordered)."""
    tt: Timetable | None = None
    error: InfeasibleError | None = None
    coe: int | None = None
    placement: Placement | None = None
    notes: list[str] = field(default_factory=list)
    """Notes about this option alone (its carry-over search, its places)."""
    season: Season | None = None
    """The complete season of this option, as the outputs would publish it."""
    added: bool = False
    """An option added for its low carry-over value (smaller solver budgets)."""


def _choose(cands: list[_Candidate], league: League) -> tuple[_Candidate, str | None]:
    ok = [c for c in cands if c.tt is not None]
    w = league.priorities
    if len(ok) == 1:
        return ok[0], None

    def mix(c):
        return c.cert.perfect_pairs / max(1, c.cert.pairs)

    def brk(c):
        return (c.tt.breaks - c.tt.break_bound) / max(1, c.tt.break_bound)

    if w.carry_over > max(w.mixing, w.breaks) and all(c.coe is not None for c in ok):
        mixing_first = w.mixing >= w.breaks

        def by_carry_over(c: _Candidate) -> tuple[float, float, float]:
            assert c.coe is not None
            if mixing_first:
                return (c.coe, -mix(c), brk(c))
            return (c.coe, brk(c), -mix(c))

        why = (f"priorities.carry_over ({w.carry_over}) weighs more than mixing ({w.mixing}) "
               f"and breaks ({w.breaks}): the lowest carry-over value wins")
        return min(ok, key=by_carry_over), why
    if w.mixing > w.breaks:
        key = lambda c: (-mix(c), brk(c))  # noqa: E731
        why = f"priorities.mixing ({w.mixing}) > priorities.breaks ({w.breaks})"
    elif w.breaks > w.mixing:
        key = lambda c: (brk(c), -mix(c))  # noqa: E731
        why = f"priorities.breaks ({w.breaks}) > priorities.mixing ({w.mixing})"
    else:
        key = lambda c: ((1 - mix(c)) + brk(c), -mix(c))  # noqa: E731
        why = "mixing and breaks weigh the same; the smaller relative loss wins"
    best = min(ok, key=key)
    return best, why


def _limits(total: float, share: float, seed: int) -> SolveLimits:
    return SolveLimits.with_safety_net(max(1.0, total * share), seed)


def plan_season(
    league: League,
    *,
    seed: int | None = None,
    time_limit: float | None = None,
    progress: Progress | None = None,
) -> PlanResult:
    """Plan a complete season for ``league`` (see the module docstring for the stages).

    Parameters
    ----------
    league : League
        A validated league (``scheduler.config.load_league``).
    seed : int, optional
        Overrides ``league.seed``; the same league and seed give the same season.
    time_limit : float, optional
        Overrides ``league.solve_seconds`` (deterministic solver time, shared by the stages).
    progress : callable, optional
        ``progress(stage, fraction)`` for a progress bar.

    Returns
    -------
    PlanResult
        The season, the options considered (:class:`PlanOption`), the status and the notes.

    Raises
    ------
    InfeasibleError
        When the hard rules cannot all hold (a minimal set of them in plain words, after every
        available factorization was tried), or the calendar alone makes a rule impossible.
    InputError
        For a league that cannot be planned at all (fewer than two teams).

    References
    ----------
    D. de Werra, "Scheduling in sports", Annals of Discrete Mathematics 11 (1981) 381-395;
    K. G. Russell, Biometrika 67 (1980) 127-131; U. Junker, "QUICKXPLAIN", AAAI 2004 (from
    memory).

    Examples
    --------
    >>> from scheduler.config import parse_league
    >>> clubs = ["Quenby", "Larkholt", "Ebbside", "Morrow"]
    >>> league = parse_league({
    ...     "league": {"name": "Quenby Four", "season": "2031", "timezone": "Europe/London"},
    ...     "calendar": {"start": "2031-01-07", "end": "2031-04-29", "weekdays": ["tue"]},
    ...     "venues": [{"name": f"{club} Hall"} for club in clubs],
    ...     "teams": [{"name": club, "home_venue": f"{club} Hall"} for club in clubs]})
    >>> result = plan_season(league)
    >>> result.status, len(result.season.fixtures), result.season.mixing.perfect
    ('optimal', 6, True)
    >>> result.options[0].breaks, result.options[0].break_bound
    (2, 2)
    """
    seed = league.seed if seed is None else int(seed)
    total = float(time_limit if time_limit is not None else league.solve_seconds)
    teams = len(league.teams)
    if teams < 2:
        raise InputError("a round robin needs at least two teams", location="teams")

    def report(stage: str, fraction: float) -> None:
        if progress is not None:
            progress(stage, fraction)

    notes: list[str] = []
    _calendar_clashes(league)
    report("factorize", 0.0)
    found = _factorize(teams, seed, max(0.5, 0.2 * total), progress)
    n = found.n
    cands = [_Candidate("best mixing", found, verify_rounds(n, found.rounds),
                        detail=found.method)]
    if not _is_circle(found) and league.priorities.breaks > 0:
        gk = circle_factorization(n)
        single = max(1, league.format.legs) == 1
        stored = stored_best_perfect(n) if cands[0].cert.perfect and single else None
        if stored is not None and stored.factorization.rounds != found.rounds:
            # another perfect factorization of the same order that admits fewer breaks in a
            # single round robin (docs/perfect-breaks.md): perfect mixing kept, breaks lowered
            fewer = stored.factorization
            cands.append(_Candidate("perfect with fewest breaks", fewer,
                                    verify_rounds(n, fewer.rounds), detail=fewer.method))
        cands.append(_Candidate("fewest breaks", gk, verify_rounds(n, gk.rounds),
                                detail=gk.method))
    report("timetable", 0.2)
    share = 0.45 / len(cands)
    fewest: int | None = None
    for k, c in enumerate(cands, start=1):
        report(f"timetable: option {k} of {len(cands)}", round(0.2 + 0.4 * (k - 1) / len(cands), 6))
        try:
            c.tt = solve_timetable(league, c.fact, _limits(total, share, seed),
                                   minimise_breaks=league.priorities.breaks > 0)
        except InfeasibleError as exc:
            c.error = exc
        # the best so far, for the progress lines of a log or a tool
        if c.tt is not None:
            fewest = c.tt.breaks if fewest is None else min(fewest, c.tt.breaks)
        outcome = (f"{c.tt.breaks} breaks (lower bound {c.tt.break_bound})"
                   if c.tt is not None else "no timetable keeps every rule")
        best = f"; fewest so far {fewest}" if fewest is not None else ""
        report(f"timetable: option {k} of {len(cands)}: {outcome}{best}",
               round(0.2 + 0.4 * k / len(cands), 6))
    if all(c.tt is None for c in cands):
        _try_other_factorizations(league, cands, total, seed)
    if all(c.tt is None for c in cands):
        raise _clash(cands)
    feasible_base = [c for c in cands if c.tt is not None]
    for c in feasible_base:
        assert c.tt is not None
        c.coe = carry_over_of_rounds(_leg1_rounds(c.fact, c.tt), n)
    general = list(notes)
    if len(cands) > 1:
        general.extend(_tradeoff_notes(cands))
    report("timetable: more options", 0.6)

    def added(cand: _Candidate) -> None:
        """Progress line of an added option, like those of the first ones."""
        assert cand.tt is not None
        best = min(c.tt.breaks for c in cands if c.tt is not None)
        report(f"timetable: {cand.label}: {cand.tt.breaks} breaks (lower bound "
               f"{cand.tt.break_bound}); fewest so far {best}", 0.6)

    _add_order_options(league, cands, total, seed, added)
    feasible = [c for c in cands if c.tt is not None]
    report("places", 0.65)
    for k, c in enumerate(feasible, start=1):
        report(f"places: option {k} of {len(feasible)} (carry-over, courts and slots)",
               round(0.65 + 0.25 * (k - 1) / len(feasible), 6))
        _finish(league, c, total, seed)
    for c in feasible:
        c.notes.extend(_carry_over_worst_notes(c, cands))
    summary = frontier_summary([(c.cert.perfect_pairs, c.cert.pairs,
                                 c.tt.breaks if c.tt else None, c.coe) for c in cands])
    if "fewer than three" in summary:
        general.append(summary)
    report("dates", 0.9)
    from scheduler.fairness.notes import silent_effect_notes

    for c in feasible:
        assert c.tt is not None and c.placement is not None
        season = _season(league, c, c.tt, c.placement, seed, tuple(general + c.notes))
        c.season = replace(season, notes=season.notes + silent_effect_notes(league, season))
    chosen, why = _choose(cands, league)
    front = frontier(
        ScheduleOption(c.label, c.cert.perfect_pairs, c.tt.breaks, c.coe, payload=c)
        for c in cands if c.tt is not None and c.coe is not None)
    options = tuple(
        PlanOption(
            label=c.label, method=c.fact.method, perfect_pairs=c.cert.perfect_pairs,
            pairs=c.cert.pairs, breaks=c.tt.breaks if c.tt else None,
            break_bound=c.tt.break_bound if c.tt else 0, carry_over=c.coe,
            chosen=c is chosen, feasible=c.tt is not None,
            on_frontier=any(o.payload is c for o in front), detail=c.detail)
        for c in cands)
    assert chosen.season is not None and chosen.tt is not None and chosen.placement is not None
    season = chosen.season
    if len(options) > 1:
        from scheduler.fairness.names import plain_text

        season = replace(season, options=tuple(
            PlanOptionFigures(plain_text(o.label), o.perfect_pairs, o.pairs, o.breaks,
                              o.break_bound, o.carry_over, o.chosen, o.on_frontier,
                              season=c.season, detail=plain_text(o.detail))
            for o, c in zip(options, cands, strict=True)))
    status = ("optimal" if chosen.tt.status == "optimal" and chosen.placement.status == "optimal"
              else "feasible")
    report("done", 1.0)
    return PlanResult(season, options, status, season.notes, why or "")


def _calendar_clashes(league: League) -> None:
    """Rules the calendar alone makes impossible, reported before any solving (no pairing of
    the teams can help): ``min_rest_days`` longer than the match days allow."""
    value = league.rules.min_rest_days
    if not value or league.calendar.rounds_per_day > 1:
        return
    teams = len(league.teams)
    rounds = max(1, league.format.legs) * (teams - 1 + teams % 2)
    try:
        days = candidate_days(league, rounds)
    except ConfigError:
        return  # the calendar's own error is reported by the model with its location
    groups = len(day_groups(rounds, 1))
    if len(days) < groups:
        return
    clash = calendar_clash(value, days, groups)
    if clash is not None:
        raise InfeasibleError("the calendar cannot keep the rest-day rule, whatever the pairings",
                              [f"min_rest_days = {value}: {clash}"])


def _searched_starter(n: int, seed: int) -> Factorization | None:
    """A perfect starter of Z_(n-1) found by a short seeded search (numba is imported here,
    only when the fall-back runs), as a factorization; ``None`` when none turns up."""
    from scheduler.factorization.groups import cyclic
    from scheduler.factorization.search import search_perfect_starter
    from scheduler.factorization.starters import starter_factorization

    group = cyclic(n - 1)
    found = search_perfect_starter(group, seed=seed + 1, budget=1.0)
    if found.starter is None:
        return None
    return starter_factorization(group, found.starter,
                                 method=f"searched starter in Z_{n - 1} (seed {seed + 1})")


def _other_factorizations(n: int, tried: list[Factorization],
                          seed: int = 0) -> Iterator[Factorization]:
    """Further one-factorizations of K_n to try when the rules cannot hold with the first ones,
    made only when needed: GK_n, Anderson's GA_n (n = 2p, p odd), the catalogue's perfect one and
    a perfect starter of Z_(n-1) from a short seeded search; rounds already tried are skipped."""
    seen = [f.rounds for f in tried]
    makers: list[Callable[[int], Factorization | None]] = [circle_factorization]
    if n >= 6 and (n // 2) % 2 == 1:
        makers.append(anderson_factorization)
    makers.append(catalogue_factorization)
    if 6 <= n <= 40:
        makers.append(lambda size: _searched_starter(size, seed))
    for make in makers:
        try:
            fact = make(n)
        except (ValueError, KeyError):
            continue
        if fact is None or fact.rounds in seen:
            continue
        seen.append(fact.rounds)
        yield fact


FALLBACKS = 3
"""At most this many further factorizations are solved when the first ones clash."""


def _try_other_factorizations(league: League, cands: list[_Candidate], total: float,
                              seed: int) -> None:
    """When no candidate keeps the rules, try the other factorizations (appended to ``cands``)
    until one does; a clash that does not depend on the pairings is not retried."""
    if not any(c.error is not None and c.error.conflicts for c in cands):
        return  # no rule clash (the time limit ran out): other pairings would not be faster
    others = _other_factorizations(cands[0].fact.n, [c.fact for c in cands], seed)
    for fact in itertools.islice(others, FALLBACKS):
        number = sum(c.label.startswith("fallback") for c in cands) + 1
        cand = _Candidate("fallback" if number == 1 else f"fallback {number}", fact,
                          verify_rounds(fact.n, fact.rounds), detail=fact.method)
        cands.append(cand)
        try:
            cand.tt = solve_timetable(league, fact, _limits(total, 0.45 / FALLBACKS, seed),
                                      minimise_breaks=league.priorities.breaks > 0)
        except InfeasibleError as exc:
            cand.error = exc
            continue
        return


def _clash(cands: list[_Candidate]) -> InfeasibleError:
    """The error to report when no factorization keeps the rules: the first clash found, saying
    which pairings were tried."""
    first = next((c.error for c in cands if c.error is not None and c.error.conflicts),
                 cands[0].error)
    assert first is not None
    if len(cands) == 1:
        return first
    tried = ", ".join(c.fact.method for c in cands)
    message = str(first).split("\n", 1)[0]
    return InfeasibleError(f"{message} (tried the round pairings of: {tried})",
                           list(first.conflicts))


def _leg1_rounds(fact: Factorization, tt: Timetable):
    return [fact.rounds[k] for k in tt.order[0]]


def _tradeoff_notes(cands: list[_Candidate]) -> list[str]:
    """What the first options show about mixing against breaks, in words that do not depend on
    which option is chosen (the reason of the choice is ``PlanResult.why``)."""
    out = []
    failed = [c for c in cands if c.tt is None]
    rescued = [c for c in cands if c.tt is not None and c.label.startswith("fallback")]
    if failed and rescued:
        tried = ", ".join(c.fact.method for c in failed)
        return [f"no timetable keeps every rule with the round pairings of {tried}; "
                f"planned with {rescued[0].fact.method}"]
    a, b = cands[0], cands[1]
    if a.tt is None or b.tt is None:
        bad = a if a.tt is None else b
        out.append(f"{bad.label}: no timetable satisfies the rules with it")
        return out
    figs = "; ".join(
        f"{c.label}: {c.cert.perfect_pairs}/{c.cert.pairs} perfect round pairs, "
        f"{tt.breaks} breaks (lower bound {tt.break_bound})"
        for c, tt in ((a, a.tt), (b, b.tt)))
    if (a.cert.perfect_pairs > b.cert.perfect_pairs) and (a.tt.breaks > b.tt.breaks):
        out.append(f"better mixing and fewest breaks conflict here: {figs}")
    else:
        out.append(f"compared {figs}")
    return out


ORDER_MOVES = 3000
"""Moves of the carry-over annealing that re-orders the rounds of the best-mixing option."""

LOW_MOVES = 4000
"""Moves of the carry-over annealing that may change the pairings (n not a power of two)."""

EXTRA_SHARE = 0.05
"""Share of the time limit for each solve of an option added by :func:`_add_order_options`
(its timetable, whose round order is fixed so that the model is small, and its places), with a
floor of :data:`EXTRA_FLOOR` deterministic seconds instead of one."""

EXTRA_FLOOR = 0.4
"""Least deterministic time of a solve for an added option."""


def _extra_limits(total: float, seed: int) -> SolveLimits:
    return SolveLimits.with_safety_net(max(EXTRA_FLOOR, total * EXTRA_SHARE), seed)

MAX_OPTIONS = 5
"""The planner offers at most this many options that keep every rule."""


def _add_order_options(league: League, cands: list[_Candidate], total: float, seed: int,
                       added: Callable[[_Candidate], None] = lambda cand: None) -> None:
    """Add options with a low carry-over value (appended to ``cands``), each timetabled under
    every hard rule with its round order kept (docs/options.md):

    * the best-mixing option's own rounds in a low-carry-over order (annealing over round
      orders only, so its mixing is kept; :func:`search_low_carry_over`);
    * the lowest-carry-over single round robin the project can make: Russell's balanced
      schedule for a power of two, else the annealing that may also change the pairings
      (:func:`best_low_carry_over`).

    An option is added only when its carry-over value is below every option's so far and no
    option so far is at least as good in every figure; a round order that breaks a rule is left
    out. No more than :data:`MAX_OPTIONS` options that keep the rules are offered."""
    feasible = [c for c in cands if c.tt is not None and c.coe is not None]
    if not feasible:
        return
    n = feasible[0].fact.n
    lower, upper = carry_over_bounds(n) if n >= 4 else (0, 0)
    if lower == upper:
        return  # every single round robin of this order has the same carry-over value
    base = max(feasible, key=lambda c: c.cert.perfect_pairs)

    def reordered() -> tuple[Factorization, str]:
        assert base.tt is not None
        found = search_low_carry_over(_leg1_rounds(base.fact, base.tt), n, seed=seed,
                                      moves=ORDER_MOVES, change_pairings=False)
        detail = (f"{base.fact.method}, rounds re-ordered for a low carry-over value "
                  f"(annealing, seed {seed}, {ORDER_MOVES} moves)")
        return Factorization(n, found.rounds, base.fact.method, base.fact.source), detail

    def lowest() -> tuple[Factorization, str]:
        found = best_low_carry_over(n, seed=seed, moves=LOW_MOVES)
        russell = found.method.startswith("Russell")
        source = ("K. G. Russell, Biometrika 67 (1980) 127-131" if russell
                  else "simulated annealing over round orders and Kempe moves "
                       "(scheduler.balance.low_carry_over)")
        return Factorization(n, found.rounds, found.method, source), found.method

    makers: list[tuple[str, Callable[[], tuple[Factorization, str]]]] = [
        ("low carry-over order", reordered), ("lowest carry-over", lowest)]
    for label, make in makers:
        if len([c for c in cands if c.tt is not None]) >= MAX_OPTIONS:
            return
        fact, detail = make()
        if any(c.fact.rounds == fact.rounds for c in cands):
            continue
        value = carry_over_of_rounds(fact.rounds, n)
        if value >= min(c.coe for c in cands if c.coe is not None):
            continue
        cand = _Candidate(label, fact, verify_rounds(n, fact.rounds), detail=detail, added=True)
        try:
            cand.tt = solve_timetable(league, fact, _extra_limits(total, seed),
                                      minimise_breaks=league.priorities.breaks > 0,
                                      fixed_order=tuple(range(len(fact.rounds))))
        except InfeasibleError:
            continue
        cand.coe = carry_over_of_rounds(_leg1_rounds(fact, cand.tt), n)
        new = ScheduleOption(label, cand.cert.perfect_pairs, cand.tt.breaks, cand.coe)
        if any(dominates(ScheduleOption(c.label, c.cert.perfect_pairs, c.tt.breaks, c.coe), new)
               for c in cands if c.tt is not None and c.coe is not None):
            continue
        cands.append(cand)
        added(cand)


def _finish(league: League, cand: _Candidate, total: float, seed: int) -> None:
    """Make one option complete, the same way whether it is chosen or not: its carry-over
    search (when ``priorities.carry_over`` > 0), its places, and its notes."""
    notes = cand.notes
    if league.priorities.carry_over > 0:
        reduced, note = _reduce_carry_over(league, cand, _limits(total, 0.1, seed))
        cand.tt = reduced
        if note:
            notes.append(note)
    tt = cand.tt
    assert tt is not None
    if tt.wall_cap_hit:
        notes.append("the wall-clock safety limit was hit while solving the timetable; the "
                     "result may depend on machine load (allow more time: time_limit_seconds "
                     "in the league file, or --time-limit)")
    if tt.breaks > tt.break_bound and tt.status != "optimal":
        notes.append(f"breaks: {tt.breaks} (lower bound {tt.break_bound}: {tt.break_bound_reason});"
                     " not proven optimal within the time limit")
    places_limits = _extra_limits(total, seed) if cand.added else _limits(total, 0.25, seed)
    placement = assign_places(league, tt, places_limits)
    if placement.wall_cap_hit:
        notes.append("the wall-clock safety limit was hit while placing the games; the result "
                     "may depend on machine load (allow more time: time_limit_seconds in the "
                     "league file, or --time-limit)")
    if placement.court_max is not None or placement.slot_max is not None:
        figs = [f"{label} {v}" for label, v in (("court", placement.court_max),
                                                 ("slot", placement.slot_max)) if v is not None]
        notes.append("most games of one team on one " + " and on one ".join(figs)
                     + (" (proven best)" if placement.status == "optimal" else ""))
    cand.placement = placement


def _carry_over_worst_notes(cand: _Candidate, cands: list[_Candidate]) -> list[str]:
    """A note when this option has the worst carry-over value possible (Lambrechts et al.
    2018: the circle method's), naming the option with the lowest value on offer."""
    if cand.coe is None:
        return []
    n = cand.fact.n
    lower, upper = carry_over_bounds(n) if n >= 4 else (0, 0)
    if cand.coe < upper or lower == upper:
        return []
    assert cand.tt is not None
    bye = " (the bye counted as a team)" if n != len(cand.tt.vertex_of_team) else ""
    text = (f"carry-over value {cand.coe} is the worst possible for {n} teams{bye}, the circle "
            f"method's (Lambrechts et al. 2018; lower bound {lower}, Russell 1980)")
    others = [(k, c) for k, c in enumerate(cands, start=1)
              if c.tt is not None and c.coe is not None and c.coe < cand.coe]
    if not others:
        return [text + "; no other schedule the planner built has a lower value"]
    number, best = min(others, key=lambda kc: (kc[1].coe, kc[0]))
    return [text + f"; option {number} ({best.label}) has {best.coe}, and `scheduler choose` "
            f"with --option {number} picks it without solving again"]


def _reduce_carry_over(league: League, cand: _Candidate,
                       limits: SolveLimits) -> tuple[Timetable, str]:
    tt = cand.tt
    assert tt is not None
    fact = cand.fact
    home = {(a, b): h for a, b, h in tt.orientation}
    scheme = league.format.scheme if league.format.legs > 1 else "mirrored"
    bye = fact.n - 1 if len(league.teams) % 2 else None
    before = cand.coe
    assert before is not None
    keep = league.priorities.breaks >= league.priorities.carry_over
    order = improve_order(fact.rounds, fact.n, tt.order[0], home, scheme,
                          max(1, league.format.legs), tt.order[1:], bye, keep_breaks=keep)
    if tuple(order) == tuple(tt.order[0]):
        return tt, (f"carry-over value {before} (Russell 1980); no round swap lowers it"
                    + (" without adding breaks" if keep else ""))
    try:
        new = solve_timetable(league, fact, limits, minimise_breaks=league.priorities.breaks > 0,
                              fixed_order=tuple(order), start_home=home)
    except InfeasibleError:
        return tt, f"carry-over value {before}; a lower-carry-over order breaks a rule, kept"
    after = carry_over_of_rounds([fact.rounds[k] for k in new.order[0]], fact.n)
    if (new.breaks <= tt.breaks or not keep) and after < before:
        cand.coe = after
        extra = "" if new.breaks <= tt.breaks else (
            f"; breaks rose from {tt.breaks} to {new.breaks} because priorities.carry_over "
            f"({league.priorities.carry_over}) > priorities.breaks ({league.priorities.breaks})")
        return new, f"carry-over value lowered from {before} to {after} (Russell 1980){extra}"
    return tt, f"carry-over value {before} (Russell 1980)"


def season_from_timetable(league: League, fact: Factorization, timetable: Timetable,
                          placement: Placement, notes: tuple[str, ...]) -> Season:
    """The season of one solved timetable, assembled exactly as :func:`plan_season` does.

    For planners that solve timetables themselves (the joint model of several divisions,
    :mod:`scheduler.divisions.joint`) and need the same Season: dated fixtures, byes, mixing
    certificate (re-verified by :func:`scheduler.factorization.verify.verify_rounds`), revision.

    Parameters
    ----------
    league
        The league the timetable was solved for.
    fact
        The one-factorization whose rounds the timetable orders.
    timetable
        The solved timetable (round order, home/away, days).
    placement
        Its venues, courts and slots (:func:`scheduler.balance.places.assign_places`).
    notes
        The planner's notes, in plain sentences.

    Returns
    -------
    Season
        The season, seeded with ``league.seed``.
    """
    cand = _Candidate(fact.method, fact, verify_rounds(fact.n, fact.rounds), tt=timetable)
    return _season(league, cand, timetable, placement, league.seed, notes)


def _season(league: League, cand: _Candidate, tt: Timetable, placement: Placement, seed: int,
            notes: tuple[str, ...]) -> Season:
    names = league.team_names
    R = tt.n - 1
    fixtures = []
    venue_rank: dict[str | None, int] = {v.name: i for i, v in enumerate(league.venues)}
    for s, games in enumerate(tt.games):
        day = tt.days[tt.day[s]] if tt.days else None
        for i, (h, a) in enumerate(games):
            place = placement.places[s][i]
            start = kickoff(league, day, place.slot) if day is not None else None
            fixtures.append(Fixture(
                round=s + 1, home=names[h], away=names[a], leg=s // R + 1, venue=place.venue,
                court=place.court, slot=place.label, date=day, start=start))

    def court_rank(f: Fixture) -> int:
        if f.venue is None:
            return 0
        courts: list[str | None] = list(league.venue(f.venue).courts)
        return courts.index(f.court)

    fixtures.sort(key=lambda f: (f.round, f.start or 0, venue_rank.get(f.venue, -1),
                                 court_rank(f), f.home))
    byes = {s + 1: tuple(names[t] for t in b) for s, b in enumerate(tt.byes) if b}
    cert = cand.cert
    mixing = MixingInfo(cand.fact.method, cand.fact.source, cert.perfect, cert.perfect_pairs,
                        cert.pairs)
    return Season(
        league=league.name, season_id=league.season, teams=names, fixtures=tuple(fixtures),
        byes=byes, legs=max(1, league.format.legs),
        scheme=league.format.scheme, timezone=league.timezone,
        venues=tuple(v.name for v in league.venues), mixing=mixing, seed=seed, notes=notes,
        revision=revision(league, seed, tuple(fixtures), byes),
        home_meaning=league.format.home_meaning,
        side_labels=league.format.side_labels,
        venue_addresses={v.name: v.address for v in league.venues if v.address},
        venue_coordinates={v.name: (v.latitude, v.longitude) for v in league.venues
                           if v.latitude is not None and v.longitude is not None},
        calendar_end=league.calendar.end or max(league.calendar.dates, default=None))



@dataclass(frozen=True)
class Choice:
    """A season rebuilt from another option kept in its folder (:func:`choose_option`).

    Parameters
    ----------
    season
        The season of the chosen option, with every option (and its complete season) listed
        and this one marked chosen: ready for the season-folder writer.
    number, label
        The chosen option (1-based number, label).
    previous_number, previous_label
        The option the folder held before.
    """

    season: Season
    number: int
    label: str
    previous_number: int
    previous_label: str


def _pick_option(options: tuple[PlanOptionFigures, ...], wanted: str, where: str) -> int:
    """The 0-based index of the option named by ``wanted``: its number, its label (letter case
    ignored) or the start of exactly one label."""
    listing = "; ".join(f"{k} = {o.label}" for k, o in enumerate(options, start=1))
    text = wanted.strip()
    if text.isdigit():
        number = int(text)
        if 1 <= number <= len(options):
            return number - 1
        raise InputError(f"there is no option {number}; the options are {listing}",
                         location=where)
    folded = text.casefold()
    exact = [k for k, o in enumerate(options) if o.label.casefold() == folded]
    if exact:
        return exact[0]
    starts = [k for k, o in enumerate(options) if folded and o.label.casefold().startswith(folded)]
    if len(starts) == 1:
        return starts[0]
    what = "names more than one option" if starts else "names no option"
    raise InputError(f"{wanted!r} {what}; give a number or a label: {listing}", location=where)


def choose_option(league: League, season_dir: str | Path, option: str) -> Choice:
    """Another option of a planned season, from the timetables its folder keeps: no solving,
    no factorization search (``docs/options.md``).

    The season folder written from the result (``scheduler.export.write_season_outputs``) is
    byte for byte the folder that ``plan`` writes over it when the league's priorities pick
    that option: every option is finished the same way whether chosen or not, and the
    revision depends on the games published, not on the priorities.

    Parameters
    ----------
    league
        The league file the season was planned from (its priorities may differ: they only
        weigh the options).
    season_dir
        The season folder written by ``plan``.
    option
        The option: its number as listed (1 = first), its label, or the start of one label.

    Returns
    -------
    Choice

    Raises
    ------
    InputError
        When the folder is not a season folder of this program, keeps no options, was changed
        since it was written, was re-planned since (choosing would rewrite published history),
        belongs to another league file, or ``option`` names no option that keeps the rules.

    Examples
    --------
    >>> import tempfile
    >>> from pathlib import Path
    >>> try:
    ...     choose_option(None, Path(tempfile.mkdtemp()), "1")  # doctest: +ELLIPSIS
    ... except InputError as exc:
    ...     print(exc.detail.split(";")[0])
    not a season folder: it holds no season.json and no .season-manifest.json
    """
    from scheduler.export.bundle import SEASON_FILE
    from scheduler.export.manifest import MANIFEST_FILE, Manifest
    from scheduler.export.season_json import OPTIONS_FILE, load_season_json, loads_options

    folder = Path(season_dir)
    if not folder.is_dir():
        raise InputError("not a folder" if folder.exists() else "no such folder",
                         location=str(folder))
    season_path, manifest_path = folder / SEASON_FILE, folder / MANIFEST_FILE
    if not season_path.is_file() or not manifest_path.is_file():
        raise InputError(f"not a season folder: it holds no {SEASON_FILE} and no {MANIFEST_FILE}"
                         "; give the folder that `scheduler plan` wrote", location=str(folder))
    try:
        manifest = Manifest.from_bytes(manifest_path.read_bytes())
    except (OSError, ValueError) as exc:
        raise InputError(f"the season manifest cannot be read ({exc})",
                         location=str(manifest_path)) from None
    current = load_season_json(season_path)
    if current.revisions:
        raise InputError(
            f"this season was re-planned since it was planned ({len(current.revisions)} "
            "versions); choosing another option now would rewrite games already published or "
            "played. Plan the season again instead", location=f"{season_path}: revisions")
    if not current.options or not (folder / OPTIONS_FILE).is_file():
        raise InputError(
            f"this season keeps no options to choose from (no {OPTIONS_FILE}: only one option "
            "was planned, or the folder was written by an older version); plan it again",
            location=str(folder))
    for name in (SEASON_FILE, OPTIONS_FILE):
        if not manifest.matches(folder, name):
            raise InputError(f"{name} was changed after the planner wrote it; plan the season "
                             "again", location=str(folder / name))
    stored = loads_options((folder / OPTIONS_FILE).read_text(encoding="utf-8"),
                           source=str(folder / OPTIONS_FILE))
    if stored.revision != current.revision or len(stored.seasons) != len(current.options):
        raise InputError(f"{OPTIONS_FILE} does not belong to the {SEASON_FILE} beside it; plan "
                         "the season again", location=str(folder / OPTIONS_FILE))
    index = _pick_option(current.options, option, "--option")
    picked = stored.seasons[index]
    if picked is None:
        raise InputError(f"option {index + 1} ({current.options[index].label}) has no timetable "
                         "that keeps every rule; choose another", location="--option")
    if revision(league, picked.seed, picked.fixtures, picked.byes) != picked.revision:
        raise InputError(
            "this league file is not the one the season was planned from (teams, venues, "
            "calendar, rules or seed differ; only the priorities may change); plan the season "
            "again", location=league.source or "league file")
    options = tuple(replace(o, chosen=k == index, season=stored.seasons[k])
                    for k, o in enumerate(current.options))
    before = next((k for k, o in enumerate(current.options) if o.chosen), index)
    return Choice(replace(picked, options=options), index + 1, current.options[index].label,
                  before + 1, current.options[before].label)
