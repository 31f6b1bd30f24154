"""Audit any schedule file: is it a valid round robin, and how fair is it?

:func:`audit_file` reads a CSV, xlsx or season.json schedule
(:func:`scheduler.audit.readers.read_schedule_with_rows`), checks it
(:func:`scheduler.fairness.validity.validate_season`, problems naming the source rows) and
measures it (:func:`scheduler.fairness.compute_fairness`). The figures are measured even for an
invalid schedule, as far as they can be (a team playing twice in a round, for example, makes
its break count a lower estimate); ``fairness_note`` says so. Unusable input raises
:class:`~scheduler.errors.InputError` with its location; the CLI maps that to exit code 2 and an
invalid schedule to exit code 1.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from pathlib import Path

from scheduler.audit.readers import ScheduleFile, read_schedule_with_rows
from scheduler.config.model import League
from scheduler.fairness import FairnessReport, compute_fairness
from scheduler.fairness.validity import Problem, validate_season
from scheduler.season import Season


@dataclass(frozen=True)
class AuditResult:
    """The outcome of an audit.

    Parameters
    ----------
    season
        The schedule as read (or as given), whether valid or not.
    valid
        ``True`` when the season is a valid round robin and keeps the league's hard rules
        (when a league was given).
    problems
        What makes the season invalid, each naming its source rows where known; empty when
        valid.
    fairness
        The fairness figures, measured as far as they can be even for an invalid season;
        ``None`` when the season has no games.
    source
        The file the season was read from, with each fixture's source row; ``None`` for a
        season audited in memory.
    fairness_note
        A sentence on how far the figures can be trusted ("" when fully).

    See Also
    --------
    audit_file, audit_season

    Examples
    --------
    >>> from scheduler.season import Fixture, Season
    >>> games = [(1, "Ash", "Elm"), (1, "Oak", "Yew"), (2, "Elm", "Oak"),
    ...          (2, "Yew", "Ash"), (3, "Ash", "Oak"), (3, "Elm", "Yew")]
    >>> season = Season("Demo", "2031", ("Ash", "Elm", "Oak", "Yew"),
    ...                 tuple(Fixture(*game) for game in games))
    >>> result = audit_season(season)
    >>> result.valid, result.path, result.to_dict()["breaks_total"]
    (True, None, 2)
    """

    season: Season
    valid: bool
    problems: tuple[Problem, ...]
    fairness: FairnessReport | None
    source: ScheduleFile | None = None
    fairness_note: str = ""

    @property
    def path(self) -> str | None:
        """The audited file as given, or ``None`` for a season audited in memory."""
        return self.source.path if self.source else None

    def to_dict(self, *, full: bool = False) -> dict:
        """JSON-ready outcome: validity, problems (as sentences), headline figures.

        Parameters
        ----------
        full
            Also include every fairness figure (``"fairness"``) and each problem with its
            rows and fixtures (``"problem_details"``).

        Returns
        -------
        dict
            Plain values only (str, int, float, bool, None, lists and dicts), ready for
            :func:`json.dumps`; figures are ``None`` when the season has no games. With a
            league, ``"rules"`` lists each hard rule's check.
        """
        f = self.fairness
        out: dict = {
            "file": self.path,
            "format": self.source.kind if self.source else None,
            "valid": self.valid,
            "problems": [p.message for p in self.problems],
            "teams": len(self.season.teams),
            "rounds": self.season.rounds,
            "games": len(self.season.fixtures),
            "legs": f.legs if f else self.season.legs,
            "scheme": f.scheme if f else self.season.scheme,
            "breaks_total": f.breaks_total if f else None,
            "breaks_lower_bound": f.breaks_lower_bound if f else None,
            "home_gap_max": f.home_gap_max if f else None,
            "carry_over_value": f.carry_over_value if f else None,
            "carry_over_lower_bound": f.carry_over_lower_bound if f else None,
            "carry_over_upper_bound": f.carry_over_upper_bound if f else None,
            "perfect_pairs": f.perfect_pairs if f else None,
            "pairs": f.pairs if f else None,
            "perfect": f.perfect if f else None,
            "rest_days_min": f.rest_days_min if f else None,
            "separation_min": f.separation_min if f else None,
            "fairness_note": self.fairness_note,
            "notes": list(self.source.notes) if self.source else [],
        }
        if f is not None and f.rule_checks is not None:
            out["rules"] = [check.to_dict() for check in f.rule_checks]
        if full:
            out["problem_details"] = [p.to_dict() for p in self.problems]
            out["fairness"] = f.to_dict() if f else None
        return out


def audit_season(season: Season, rows: Sequence[int | None] | None = None,
                 league: League | None = None) -> AuditResult:
    """Audit a season held in memory (``rows``: optional source row of each fixture). With
    ``league``, the season is also checked against that league's hard rules
    (``fairness.rule_checks``); a broken rule makes it invalid.

    Parameters
    ----------
    season
        The season to audit.
    rows
        The source row of each fixture (``None`` where unknown), for messages.
    league
        When given, its hard rules are checked too.

    Returns
    -------
    AuditResult
        Validity, problems and the fairness figures.

    References
    ----------
    ``docs/audit-input.md``; ``docs/fairness.md``.

    Examples
    --------
    Ash playing twice in round 3 (the rows are those of an imagined source file):

    >>> from scheduler.season import Fixture, Season
    >>> games = [(1, "Ash", "Elm"), (1, "Oak", "Yew"), (2, "Elm", "Oak"),
    ...          (2, "Yew", "Ash"), (3, "Ash", "Oak"), (3, "Elm", "Ash")]
    >>> season = Season("Demo", "2031", ("Ash", "Elm", "Oak", "Yew"),
    ...                 tuple(Fixture(*game) for game in games))
    >>> result = audit_season(season, rows=[2, 3, 4, 5, 6, 7])
    >>> result.valid, result.problems[0].message
    (False, 'round 3: Ash plays twice (rows 6, 7)')
    """
    problems = tuple(validate_season(season, rows))
    fairness = compute_fairness(season, league) if season.fixtures else None
    broken = bool(fairness and fairness.rule_checks
                  and not all(check.kept for check in fairness.rule_checks))
    note = ""
    if problems and fairness is not None:
        note = "the schedule is not a valid round robin: the figures describe it as it stands"
    elif fairness is None:
        note = "no games: nothing to measure"
    if league is not None and set(league.team_names) != set(season.teams):
        missing = sorted(set(league.team_names) - set(season.teams))
        note = "; ".join(x for x in (note, "the league file names teams the schedule does not: "
                                     + ", ".join(missing[:5]) if missing else
                                     "the schedule has teams the league file does not name")
                         if x)
    return AuditResult(
        season=season,
        valid=not problems and not broken,
        problems=problems,
        fairness=fairness,
        fairness_note=note,
    )


def audit_file(
    path: str | Path,
    *,
    timezone: str | None = None,
    columns: Mapping[str, str] | None = None,
    league: League | None = None,
) -> AuditResult:
    """Read, check and measure the schedule in ``path`` (CSV, xlsx or season.json).

    Parameters
    ----------
    path
        The schedule file.
    timezone
        IANA time zone of kick-off times written without a UTC offset.
    columns
        Fields named by hand (field -> header text), for headers outside the vocabulary of
        :mod:`scheduler.audit.headers`.
    league
        When given, the schedule is also checked against this league's hard rules.

    Returns
    -------
    AuditResult
        Validity, problems naming the source rows, and the fairness figures.

    Raises
    ------
    InputError
        Unusable input (the CLI's exit code 2), with its location.

    References
    ----------
    RFC 4180 (CSV); ECMA-376 (xlsx); ``docs/audit-input.md`` (how each format is read).

    Examples
    --------
    A season written by :func:`scheduler.export.write_season_outputs`, read back:

    >>> import tempfile
    >>> from pathlib import Path
    >>> from scheduler.config import parse_league
    >>> from scheduler.export import write_season_outputs
    >>> from scheduler.fairness import compute_fairness
    >>> from scheduler.plan import plan_season
    >>> clubs = ["Quenby", "Larkholt", "Ebbside", "Morrow"]
    >>> league = parse_league({
    ...     "league": {"name": "Quenby Four", "season": "2031", "timezone": "Europe/London"},
    ...     "calendar": {"start": "2031-01-07", "end": "2031-04-29", "weekdays": ["tue"]},
    ...     "venues": [{"name": f"{club} Hall"} for club in clubs],
    ...     "teams": [{"name": club, "home_venue": f"{club} Hall"} for club in clubs]})
    >>> season = plan_season(league).season
    >>> with tempfile.TemporaryDirectory() as folder:
    ...     _ = write_season_outputs(season, compute_fairness(season), Path(folder) / "out")
    ...     audit = audit_file(Path(folder) / "out" / "fixtures.csv", timezone="Europe/London")
    >>> audit.valid, audit.problems, len(audit.season.fixtures)
    (True, (), 6)
    """
    source = read_schedule_with_rows(path, timezone=timezone, columns=columns)
    rows = source.rows if any(r is not None for r in source.rows) else None
    result = audit_season(source.season, rows, league)
    return AuditResult(
        season=result.season,
        valid=result.valid,
        problems=result.problems,
        fairness=result.fairness,
        source=source,
        fairness_note=result.fairness_note,
    )
