"""Write a season's output folder: every export, each file written atomically.

Layout of ``out_dir``::

    season.json              the season and its fairness figures (scheduler.export.season_json)
    fixtures.csv             RFC 4180 fixture list
    fixtures.xlsx            workbook: Fixtures, Grid, Fairness, one sheet per team
    report.html              the self-contained season report
    calendars/league.ics     every game (RFC 5545)
    calendars/<team>.ics     one feed per team (file stem from safety.safe_filename)
    calendars/.sequence.json per-UID SEQUENCE/DTSTAMP state, so a re-plan never lowers SEQUENCE

Safety rules: the user's league file is never overwritten (an output folder that holds it, or an
output path equal to it, is refused); a folder that already holds the ``season.json`` of another
league or season is refused unless ``force``; every file goes through
:func:`~scheduler.export.safety.atomic_write_bytes` (temp file, fsync, rename), so a reader sees
either the old file or the new one. A previous ``season.json`` and state file in the folder drive
the calendar updates (SEQUENCE, cancelled games; see :mod:`scheduler.export.ics`).

Team feeds of teams that are no longer in the league are not deleted (the folder may hold files
that are not ours); their games are cancelled in the league feed.
"""

from __future__ import annotations

import os
from pathlib import Path

from scheduler.errors import InputError, OutputError
from scheduler.export.csv_out import fixtures_csv
from scheduler.export.ics import (
    DEFAULT_GAME_MINUTES,
    CalendarState,
    league_calendar,
    plan_calendar,
    team_calendar,
    team_file_stems,
)
from scheduler.export.safety import (
    atomic_write_bytes,
    atomic_write_text,
    name_digest,
)
from scheduler.export.site import site_files, site_paths
from scheduler.export.xlsx import workbook_bytes
from scheduler.season import Season

SEASON_FILE = "season.json"
CSV_FILE = "fixtures.csv"
XLSX_FILE = "fixtures.xlsx"
REPORT_FILE = "report.html"
CALENDAR_FOLDER = "calendars"
LEAGUE_FEED = "league.ics"
STATE_FILE = ".sequence.json"
_RESERVED_STEMS = {"league"}


def team_feed_names(season: Season) -> dict[str, str]:
    """Team -> file name of its feed inside ``calendars/`` (unique, never ``league.ics``)."""
    stems = team_file_stems(season.teams)
    names = {}
    for team, stem in stems.items():
        if stem.lower() in _RESERVED_STEMS:
            stem = f"{stem}-{name_digest(team)}"
        names[team] = f"{stem}.ics"
    return names


def output_paths(season: Season, out_dir: str | os.PathLike[str]) -> list[Path]:
    """Every path :func:`write_season_outputs` writes, in writing order."""
    out = Path(out_dir)
    cal = out / CALENDAR_FOLDER
    return [
        out / CSV_FILE,
        out / XLSX_FILE,
        cal / STATE_FILE,
        cal / LEAGUE_FEED,
        *(cal / name for name in team_feed_names(season).values()),
        out / REPORT_FILE,
        *(out / rel for rel in site_paths(season, team_feed_names(season))),
        out / SEASON_FILE,
    ]


def _same_file(a: Path, b: Path) -> bool:
    try:
        return a.resolve() == b.resolve() or (a.exists() and b.exists() and a.samefile(b))
    except OSError:
        return False


def _check_config(out: Path, paths: list[Path], config_path) -> None:
    if config_path is None:
        return
    config = Path(config_path)
    out_resolved = out.resolve()
    config_resolved = config.resolve()
    if config_resolved == out_resolved or out_resolved in config_resolved.parents:
        raise OutputError(
            f"the output folder {out} holds your league file {config}; choose an output folder "
            "that does not contain it, so the league file can never be overwritten"
        )
    for path in paths:
        if _same_file(path, config):
            raise OutputError(f"output file {path} would overwrite your league file {config}")


def _previous(out: Path, season: Season, force: bool) -> tuple[Season | None, CalendarState | None]:
    """The previous season and calendar state in ``out`` (``None`` when absent or forced away)."""
    previous = None
    season_file = out / SEASON_FILE
    if season_file.is_file():
        from scheduler.export.season_json import load_season_json

        try:
            previous = load_season_json(season_file)
        except InputError as exc:
            if not force:
                raise OutputError(
                    f"{season_file} exists but is not a season file this program can read "
                    f"({exc}); choose another output folder, or force to replace it"
                ) from exc
            previous = None
        if previous is not None and (previous.league, previous.season_id) != (
            season.league,
            season.season_id,
        ):
            if not force:
                raise OutputError(
                    f"{out} already holds the outputs of another league: "
                    f"{previous.league!r} season {previous.season_id!r} (this plan is "
                    f"{season.league!r} season {season.season_id!r}); choose another output "
                    "folder, or force to replace them"
                )
            previous = None
    state = None
    state_file = out / CALENDAR_FOLDER / STATE_FILE
    if state_file.is_file():
        try:
            state = CalendarState.from_json(
                state_file.read_text(encoding="utf-8"), location=str(state_file)
            )
        except (InputError, OSError, UnicodeDecodeError) as exc:
            if not force:
                raise OutputError(
                    f"{state_file} is damaged ({exc}); without it calendar updates could lose "
                    "their sequence numbers. Restore it, or force to start the numbering anew"
                ) from exc
            state = None
        if state is not None and (state.league, state.season_id) != (
            season.league,
            season.season_id,
        ):
            if not force:
                raise OutputError(
                    f"{state_file} belongs to another league: {state.league!r} season "
                    f"{state.season_id!r}; choose another output folder, or force"
                )
            state = None
    return previous, state


def write_season_outputs(
    season: Season,
    fairness,
    out_dir: str | os.PathLike[str],
    *,
    force: bool = False,
    config_path: str | os.PathLike[str] | None = None,
    game_minutes: int = DEFAULT_GAME_MINUTES,
    side_labels: tuple[str, str] = ("H", "A"),
) -> list[Path]:
    """Write every output of ``season`` into ``out_dir`` (created if needed).

    ``fairness`` is the season's :class:`~scheduler.fairness.FairnessReport` (written into
    ``season.json``, the workbook and the report; with ``None`` the report and the workbook's
    Fairness sheet are left out). ``game_minutes`` sets each calendar event's length.
    Raises :class:`OutputError` for a folder that may not be written. Returns the paths
    written, in writing order.
    """
    from scheduler.export.season_json import dumps_season

    out = Path(out_dir)
    if out.exists() and not out.is_dir():
        raise OutputError(f"{out} exists and is not a folder")
    paths = output_paths(season, out)
    _check_config(out, paths, config_path)
    previous, state = _previous(out, season, force)
    try:
        (out / CALENDAR_FOLDER).mkdir(parents=True, exist_ok=True)
    except OSError as exc:
        raise OutputError(f"cannot create the output folder {out}: {exc.strerror}") from exc

    plan = plan_calendar(season, previous, state, game_minutes=game_minutes)
    cal = out / CALENDAR_FOLDER
    written: list[Path] = []
    try:
        written.append(atomic_write_text(out / CSV_FILE, fixtures_csv(season)))
        written.append(
            atomic_write_bytes(
                out / XLSX_FILE, workbook_bytes(season, fairness, side_labels=side_labels)
            )
        )
        # The state goes first: should writing stop half-way, the numbers it holds are never
        # lower than those of the feeds already published.
        written.append(atomic_write_text(cal / STATE_FILE, plan.to_json()))
        written.append(atomic_write_bytes(cal / LEAGUE_FEED, league_calendar(season, state=plan)))
        for team, name in team_feed_names(season).items():
            written.append(atomic_write_bytes(cal / name, team_calendar(season, team, state=plan)))
        if fairness is not None:
            from scheduler.export.report import render_report

            written.append(atomic_write_text(out / REPORT_FILE, render_report(season, fairness)))
        for rel, data in site_files(season, fairness, feed_names=team_feed_names(season)).items():
            (out / rel).parent.mkdir(parents=True, exist_ok=True)
            written.append(atomic_write_bytes(out / rel, data))
        written.append(atomic_write_text(out / SEASON_FILE, dumps_season(season, fairness)))
    except OSError as exc:
        raise OutputError(f"cannot write into {out}: {exc}") from exc
    return written
