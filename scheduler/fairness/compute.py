"""``compute_fairness``: every figure of a season, from its fixtures alone.

The season is indexed once (:mod:`scheduler.fairness.table`); each topic module then works on
numpy arrays: :mod:`.breaks`, :mod:`.legs` (legs, scheme, separation), :mod:`.mixing`,
:mod:`.venues`, :mod:`.rest`, :mod:`.carryover`. Legs and the double-round-robin scheme are
read from the fixtures, not from the season's labels; a disagreement is noted.
"""

from __future__ import annotations

import numpy as np

from scheduler.config.model import League
from scheduler.fairness.breaks import break_figures, breaks_lower_bound
from scheduler.fairness.carryover import CONVENTION, carry_over_figures
from scheduler.fairness.legs import detect_legs, separation
from scheduler.fairness.mixing import mixing_figures
from scheduler.fairness.model import BYE_CONVENTION, FairnessReport, TeamFigures
from scheduler.fairness.rest import rest_figures
from scheduler.fairness.table import build_table
from scheduler.fairness.venues import btd_check, usages
from scheduler.rules import check_rules
from scheduler.season import Season


def _patterns(sign: np.ndarray, plays: np.ndarray) -> list[str]:
    chars = np.full(sign.shape, ord("B"), dtype=np.uint8)
    chars[sign == 1] = ord("H")
    chars[sign == -1] = ord("A")
    chars[plays > 1] = ord("X")
    cols = np.ascontiguousarray(chars.T)
    return [cols[t].tobytes().decode("ascii") for t in range(cols.shape[0])]


def _pairs(names: tuple[str, ...], row: np.ndarray) -> tuple[tuple[str, int], ...]:
    return tuple((names[k], int(v)) for k, v in enumerate(row.tolist()) if v)


def compute_fairness(season: Season, league: League | None = None) -> FairnessReport:
    """All fairness figures of ``season`` (see :class:`FairnessReport` for each one).

    Parameters
    ----------
    season : Season
        Any season, planned or read by the audit.
    league : League, optional
        The league whose hard rules the season must keep; when given, ``rule_checks`` holds the
        checklist of those rules (:func:`scheduler.rules.check_rules`), else it is ``None``.

    Returns
    -------
    FairnessReport
        Every figure, computed from the fixtures alone; legs and scheme are read from them.

    References
    ----------
    D. de Werra, "Scheduling in sports", Annals of Discrete Mathematics 11 (1981) 381-395
    (breaks); K. G. Russell, Biometrika 67 (1980) 127-131 (carry-over); ``docs/fairness.md``
    (every figure, its bound and its source).

    Examples
    --------
    >>> from scheduler.config import parse_league
    >>> from scheduler.plan import plan_season
    >>> clubs = ["Quenby", "Larkholt", "Ebbside", "Morrow"]
    >>> league = parse_league({
    ...     "league": {"name": "Quenby Four", "season": "2031", "timezone": "Europe/London"},
    ...     "calendar": {"start": "2031-01-07", "end": "2031-04-29", "weekdays": ["tue"]},
    ...     "venues": [{"name": f"{club} Hall"} for club in clubs],
    ...     "teams": [{"name": club, "home_venue": f"{club} Hall"} for club in clubs]})
    >>> report = compute_fairness(plan_season(league).season, league)
    >>> report.breaks_total, report.breaks_lower_bound, report.perfect
    (2, 2, True)
    >>> report.carry_over_value, report.carry_over_lower_bound
    (12, 12)
    """
    table = build_table(season)
    n = table.n
    notes: list[str] = []
    if table.n > table.known:
        notes.append(
            f"{table.n - table.known} team name(s) appear only in fixtures: "
            + ", ".join(table.names[table.known :][:10])
        )
    if len(table.fixture) < len(season.fixtures):
        left = len(season.fixtures) - len(table.fixture)
        notes.append(f"{left} fixture(s) without a valid round left out")

    structure = detect_legs(table)
    if (
        structure.legs > 1
        and structure.scheme != "free"
        and season.scheme not in (structure.scheme, "free")
    ):
        notes.append(
            f"the fixtures follow the {structure.scheme} scheme (the season says {season.scheme})"
        )
    brk = break_figures(table.venue_sign)
    bound, bound_source = breaks_lower_bound(n, structure.legs, structure.scheme)
    mix = mixing_figures(table, structure.round_leg)
    venue_use, court_use, slot_use = usages(season, table)
    btd = btd_check(table, court_use, structure.round_leg, structure.legs)
    rest = rest_figures(season, table)
    carry = carry_over_figures(table, structure.round_leg, structure.legs)
    if structure.legs > 1:
        sep_min, sep_max = separation(table)
    else:
        sep_min, sep_max = None, None
    if rest.league_min is None:
        notes.append("no dates on the fixtures: rest days not measured")

    patterns = _patterns(table.venue_sign, table.plays)
    break_rounds = [np.flatnonzero(brk.break_mask[:, t]) + 1 for t in range(n)]
    games = (table.plays.sum(axis=0)).astype(np.int64)
    byes = (table.plays == 0).sum(axis=0)
    team_figures = []
    for t in range(n):
        rest_t = rest.per_team[t]
        team_figures.append(
            TeamFigures(
                name=table.names[t],
                games=int(games[t]),
                home=int(brk.home[t]),
                away=int(brk.away[t]),
                byes=int(byes[t]),
                breaks=int(brk.per_team[t]),
                break_rounds=tuple(break_rounds[t].tolist()),
                pattern=patterns[t],
                venues=_pairs(venue_use.names, venue_use.counts[t]),
                courts=_pairs(court_use.names, court_use.counts[t]),
                slots=_pairs(slot_use.names, slot_use.counts[t]),
                court_spread=None if court_use.spread is None else int(court_use.spread[t]),
                slot_spread=None if slot_use.spread is None else int(slot_use.spread[t]),
                rest_days=rest_t,
                rest_days_min=min(rest_t) if rest_t else None,
                rest_days_mean=round(sum(rest_t) / len(rest_t), 4) if rest_t else None,
                home_run_max=int(brk.home_run[t]),
                away_run_max=int(brk.away_run[t]),
                less_rest_games=rest.less_rest[t],
            )
        )

    def _max(spread):
        return None if spread is None or not len(spread) else int(spread.max())

    return FairnessReport(
        teams=n,
        team_names=table.names,
        rounds=table.rounds,
        legs=structure.legs,
        scheme=structure.scheme,
        games=len(table.fixture),
        bye_convention=BYE_CONVENTION,
        breaks_total=int(brk.per_team.sum()),
        breaks_per_team=tuple(int(x) for x in brk.per_team.tolist()),
        breaks_lower_bound=bound,
        breaks_lower_bound_source=bound_source,
        home_counts=tuple(brk.home.tolist()),
        away_counts=tuple(brk.away.tolist()),
        home_gap_max=brk.gap_max,
        home_gap_round=brk.gap_round,
        perfect_pairs=mix.perfect_pairs,
        pairs=mix.pairs,
        perfect=mix.perfect,
        mixing_valid=mix.valid,
        mixing_rounds=mix.rounds,
        imperfect_pairs=mix.imperfect,
        imperfect_total=mix.imperfect_total,
        mixing_matrix=mix.matrix,
        mixing_note=mix.note,
        mixing_problems=mix.problems,
        venue_names=venue_use.names,
        court_names=court_use.names,
        slot_names=slot_use.names,
        court_spread_max=_max(court_use.spread),
        slot_spread_max=_max(slot_use.spread),
        btd_applicable=btd.applicable,
        btd_ok=btd.ok,
        btd_violations=btd.violations,
        rest_days_min=rest.league_min,
        rest_days_mean=rest.league_mean,
        carry_over_labels=carry.labels,
        carry_over_matrix=tuple(tuple(row) for row in carry.matrix.tolist()),
        carry_over_value=carry.value,
        carry_over_lower_bound=carry.lower,
        carry_over_upper_bound=carry.upper,
        carry_over_per_leg=carry.per_leg,
        carry_over_convention=CONVENTION,
        separation_min=sep_min,
        separation_max=sep_max,
        team_figures=tuple(team_figures),
        notes=tuple(notes),
        home_run_max=int(brk.home_run.max(initial=0)),
        away_run_max=int(brk.away_run.max(initial=0)),
        rest_mismatches=rest.mismatches,
        rule_checks=check_rules(league, season) if league is not None else None,
    )
