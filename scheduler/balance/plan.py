"""Season planning: a League in, a complete Season out.

Stages (each reported through ``progress(stage, fraction)``):

1. *factorize*: the engine's best one-factorization of K_n (perfect where one is known); when it
   is not the circle schedule GK_n, GK_n is considered as well, because GK_n with de Werra's
   orientation reaches the fewest breaks (n - 2 per single round robin, de Werra 1981) while it
   is perfect only when n - 1 is prime (Kotzig 1964). A probe (one-factorizations.md §7) found no
   perfect 10-team schedule on the canonical minimum-break home/away patterns, so the two goals
   can conflict; the choice follows ``league.priorities`` (mixing against breaks) and is stated
   in the notes with both figures.
2. *timetable*: round order, home/away and match days under the hard rules
   (:mod:`scheduler.balance.timetable`), then a carry-over local search when its weight is > 0
   (:mod:`scheduler.balance.carry`).
3. *places*: venue, court and time slot (:mod:`scheduler.balance.places`).
4. *dates*: kick-off datetimes from ``scheduler.calendar``.

Determinism: CP-SAT runs with one worker, a fixed seed and a deterministic time limit; a
wall-clock cap is only a safety net and the notes say when it was hit.
"""

from __future__ import annotations

import hashlib
from dataclasses import dataclass, replace

from scheduler.balance.carry import carry_over_value, improve_order
from scheduler.balance.dates import kickoff
from scheduler.balance.places import Placement, assign_places
from scheduler.balance.timetable import SolveLimits, Timetable, solve_timetable
from scheduler.config.model import League
from scheduler.errors import InfeasibleError, InputError
from scheduler.factorization.circle import circle_factorization, circle_rounds
from scheduler.factorization.model import Certificate, Factorization
from scheduler.factorization.verify import verify_rounds
from scheduler.progress import Progress
from scheduler.season import Fixture, MixingInfo, Season


@dataclass(frozen=True)
class PlanOption:
    """One alternative the planner considered.

    ``method`` is the factorization's construction, ``perfect_pairs``/``pairs`` its mixing
    (verifier), ``breaks`` the fewest breaks found with it under the rules (``None`` when the
    rules cannot hold with it, then ``feasible`` is False), ``break_bound`` the proven lower
    bound, ``carry_over`` Russell's carry-over value of leg 1 when computed.
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


@dataclass(frozen=True)
class PlanResult:
    """The planned season, the alternatives considered, ``status`` ("optimal" when every solver
    stage proved its optimum, else "feasible") and the planner's notes (also in the season)."""

    season: Season
    options: tuple[PlanOption, ...]
    status: str
    notes: tuple[str, ...]


def revision(league: League, seed: int) -> str:
    """A deterministic 12-hex id of the league configuration and seed (sha256 of its repr; the
    file path ``source`` is left out so that moving the file keeps the revision)."""
    text = repr(replace(league, source=None)) + f"|seed={seed}"
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
    tt: Timetable | None = None
    error: InfeasibleError | None = None
    coe: int | None = None


def _choose(cands: list[_Candidate], league: League) -> tuple[_Candidate, str | None]:
    ok = [c for c in cands if c.tt is not None]
    w = league.priorities
    if len(ok) == 1:
        return ok[0], None

    def mix(c):
        return c.cert.perfect_pairs / max(1, c.cert.pairs)

    def brk(c):
        return (c.tt.breaks - c.tt.break_bound) / max(1, c.tt.break_bound)

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
    det = max(1.0, total * share)
    return SolveLimits(det, 4 * det + 10, seed)


def plan_season(
    league: League,
    *,
    seed: int | None = None,
    time_limit: float | None = None,
    progress: Progress | None = None,
) -> PlanResult:
    """Plan a complete season for ``league`` (see the module docstring for the stages).

    Raises :class:`~scheduler.errors.InfeasibleError` (with the conflicting rules in plain words)
    when the hard rules cannot all hold, :class:`~scheduler.errors.InputError` for a league that
    cannot be planned at all.
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
    report("factorize", 0.0)
    found = _factorize(teams, seed, max(0.5, 0.2 * total), progress)
    n = found.n
    cands = [_Candidate(f"mixing: {found.method}", found, verify_rounds(n, found.rounds))]
    if not _is_circle(found) and league.priorities.breaks > 0:
        gk = circle_factorization(n)
        cands[0].label = f"best mixing: {found.method}"
        cands.append(_Candidate(f"fewest breaks: {gk.method}", gk, verify_rounds(n, gk.rounds)))
    else:
        cands[0].label = found.method
    report("timetable", 0.2)
    share = 0.45 / len(cands)
    for c in cands:
        try:
            c.tt = solve_timetable(league, c.fact, _limits(total, share, seed),
                                   minimise_breaks=league.priorities.breaks > 0)
        except InfeasibleError as exc:
            c.error = exc
    if all(c.tt is None for c in cands):
        raise cands[0].error
    chosen, why = _choose(cands, league)
    tt = chosen.tt
    assert tt is not None
    chosen.coe = carry_over_value(_leg1_rounds(chosen.fact, tt), n)
    for c in cands:
        if c.tt is not None and c.coe is None:
            c.coe = carry_over_value(_leg1_rounds(c.fact, c.tt), n)
    if len(cands) > 1:
        notes.extend(_tradeoff_notes(cands, chosen, why))
    report("timetable: carry-over", 0.6)
    if league.priorities.carry_over > 0:
        tt, note = _reduce_carry_over(league, chosen, _limits(total, 0.1, seed))
        chosen.tt = tt
        if note:
            notes.append(note)
    if tt.wall_cap_hit:
        notes.append("the wall-clock safety limit was hit while solving the timetable; the "
                     "result may depend on machine load (allow more time: time_limit_seconds "
                     "in the league file, or --time-limit)")
    if tt.breaks > tt.break_bound and tt.status != "optimal":
        notes.append(f"breaks: {tt.breaks} (lower bound {tt.break_bound}: {tt.break_bound_reason});"
                     " not proven optimal within the time limit")
    report("places", 0.75)
    placement = assign_places(league, tt, _limits(total, 0.25, seed))
    if placement.wall_cap_hit:
        notes.append("the wall-clock safety limit was hit while placing the games; the result "
                     "may depend on machine load (allow more time: time_limit_seconds in the "
                     "league file, or --time-limit)")
    if placement.court_max is not None or placement.slot_max is not None:
        figs = [f"{label} {v}" for label, v in (("court", placement.court_max),
                                                 ("slot", placement.slot_max)) if v is not None]
        notes.append("most games of one team on one " + " and on one ".join(figs)
                     + (" (proven best)" if placement.status == "optimal" else ""))
    report("dates", 0.9)
    season = _season(league, chosen, tt, placement, seed, tuple(notes))
    options = tuple(
        PlanOption(
            label=c.label, method=c.fact.method, perfect_pairs=c.cert.perfect_pairs,
            pairs=c.cert.pairs, breaks=c.tt.breaks if c.tt else None,
            break_bound=c.tt.break_bound if c.tt else 0, carry_over=c.coe,
            chosen=c is chosen, feasible=c.tt is not None)
        for c in cands)
    status = "optimal" if tt.status == "optimal" and placement.status == "optimal" else "feasible"
    report("done", 1.0)
    return PlanResult(season, options, status, tuple(notes))


def _leg1_rounds(fact: Factorization, tt: Timetable):
    return [fact.rounds[k] for k in tt.order[0]]


def _tradeoff_notes(cands: list[_Candidate], chosen: _Candidate, why: str | None) -> list[str]:
    out = []
    a, b = cands[0], cands[1]
    if a.tt is None or b.tt is None:
        bad = a if a.tt is None else b
        out.append(f"{bad.label}: no timetable satisfies the rules with it")
        return out
    figs = "; ".join(
        f"{c.label}: {c.cert.perfect_pairs}/{c.cert.pairs} perfect round pairs, "
        f"{c.tt.breaks} breaks (lower bound {c.tt.break_bound})" for c in cands)
    if (a.cert.perfect_pairs > b.cert.perfect_pairs) and (a.tt.breaks > b.tt.breaks):
        out.append(f"better mixing and fewest breaks conflict here: {figs}. "
                   f"Chosen: {chosen.label} because {why}.")
    else:
        out.append(f"compared {figs}. Chosen: {chosen.label}"
                   + (f" because {why}." if why else "."))
    return out


def _reduce_carry_over(league: League, cand: _Candidate, limits: SolveLimits):
    tt = cand.tt
    fact = cand.fact
    home = {(a, b): h for a, b, h in tt.orientation}
    scheme = league.format.scheme if league.format.legs > 1 else "mirrored"
    bye = fact.n - 1 if len(league.teams) % 2 else None
    before = cand.coe
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
    after = carry_over_value([fact.rounds[k] for k in new.order[0]], fact.n)
    if (new.breaks <= tt.breaks or not keep) and after < before:
        cand.coe = after
        extra = "" if new.breaks <= tt.breaks else (
            f"; breaks rose from {tt.breaks} to {new.breaks} because priorities.carry_over "
            f"({league.priorities.carry_over}) > priorities.breaks ({league.priorities.breaks})")
        return new, f"carry-over value lowered from {before} to {after} (Russell 1980){extra}"
    return tt, f"carry-over value {before} (Russell 1980)"


def _season(league: League, cand: _Candidate, tt: Timetable, placement: Placement, seed: int,
            notes: tuple[str, ...]) -> Season:
    names = league.team_names
    R = tt.n - 1
    fixtures = []
    venue_rank = {v.name: i for i, v in enumerate(league.venues)}
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
        return list(league.venue(f.venue).courts).index(f.court)

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
        revision=revision(league, seed))
