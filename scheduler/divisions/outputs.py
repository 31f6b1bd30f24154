"""The output folder of a federation.

Layout of ``out_dir``::

    index.html            one page linking every division's folder, the workbook and the clubs
    federation.json       what was planned: divisions, their folders, units, check results
    divisions.xlsx        one sheet of fixtures per division
    clubs/<club>.ics      one calendar per club covering all of its teams (RFC 5545)
    <division>/...        every output of the division (scheduler.export.bundle)

All or nothing: everything is first written into a fresh folder beside ``out_dir``; only when
all of it is written does that folder take the place of ``out_dir`` (``os.replace``). A failure
leaves ``out_dir`` as it was. An ``out_dir`` that exists, is not empty and is not the folder of
this federation is refused unless ``force``; the federation file is never inside the output.

The club calendars merge the team feeds of :func:`scheduler.export.ics.team_calendar` (same
UIDs, so a calendar subscribed to a club and a team shows each game once), read back with the
``icalendar`` package.
"""

from __future__ import annotations

import html
import json
import os
import shutil
from datetime import UTC, datetime
from pathlib import Path

from icalendar import Calendar, Component
from openpyxl import Workbook

from scheduler.divisions.execute import FederationPlan
from scheduler.errors import OutputError
from scheduler.export.bundle import write_season_outputs
from scheduler.export.csv_out import fixture_rows
from scheduler.export.ics import (
    PRODID,
    CalendarState,
    ical_text,
    plan_calendar,
    team_calendar,
)
from scheduler.export.safety import (
    neutralise_cell,
    safe_filenames,
    safe_sheet_title,
)
from scheduler.export.xlsx import stable_workbook_bytes
from scheduler.files import atomic_write_bytes, atomic_write_text

INDEX_FILE = "index.html"
SUMMARY_FILE = "federation.json"
WORKBOOK_FILE = "divisions.xlsx"
CLUB_FOLDER = "clubs"
SUMMARY_FORMAT = "roundrobin-scheduler federation"
_RESERVED = {"clubs", "index", "federation", "divisions"}
HEADERS = ("Round", "Leg", "Date", "Kick-off", "Home", "Away", "Venue", "Court", "Slot")


def division_folders(names: tuple[str, ...]) -> dict[str, str]:
    """Division name -> its folder name (unique, never one of the federation's own names).

    Parameters
    ----------
    names : tuple of str
        The division names.

    Returns
    -------
    dict of str to str
    """
    stems = safe_filenames(names)
    return {name: (f"division-{stem}" if stem.lower() in _RESERVED else stem)
            for name, stem in stems.items()}


def _cell(text: str | None) -> str | None:
    return neutralise_cell(text) if text is not None else None


def workbook_bytes(plan: FederationPlan) -> bytes:
    """The workbook: one sheet of fixtures per division, in file order (fixed bytes).

    Parameters
    ----------
    plan : FederationPlan
        The planned federation.

    Returns
    -------
    bytes
        The xlsx file.
    """

    wb = Workbook()
    wb.remove(wb.active)
    taken: set[str] = set()
    for p in plan.plans:
        ws = wb.create_sheet(safe_sheet_title(p.name, taken))
        ws.append(list(HEADERS))
        for row in fixture_rows(p.season):
            f = row.fixture
            ws.append([f.round, f.leg, row.date, row.time, _cell(f.home), _cell(f.away),
                       _cell(f.venue), _cell(f.court), _cell(f.slot)])
        for cell in ws["C"][1:]:
            cell.number_format = "yyyy-mm-dd"
        for cell in ws["D"][1:]:
            cell.number_format = "hh:mm"
        ws.freeze_panes = "A2"
    stamp = datetime(2000, 1, 1)
    wb.properties.creator = "roundrobin-scheduler"
    wb.properties.title = _cell(f"{plan.federation.name} {plan.federation.season}")
    wb.properties.created = stamp
    wb.properties.modified = stamp
    return stable_workbook_bytes(wb)


def _moment(component) -> tuple:
    start = component.decoded("dtstart")
    if isinstance(start, datetime):
        value = start.astimezone(UTC) if start.tzinfo else start.replace(tzinfo=UTC)
    else:
        value = datetime(start.year, start.month, start.day, tzinfo=UTC)
    return (value, str(component.get("uid")))


def club_calendar(plan: FederationPlan, club: str, teams: tuple[str, ...]) -> bytes:
    """One calendar with the games (and byes) of every team of ``club``, in time order.

    Parameters
    ----------
    plan : FederationPlan
        The planned federation.
    club : str
        The club's name.
    teams : tuple of str
        Its teams.

    Returns
    -------
    bytes
        The iCalendar file (RFC 5545).
    """
    by_team = {t: p for p in plan.plans for t in p.season.teams}
    events: dict[str, Component] = {}
    zones: dict[str, Component] = {}
    states: dict[str, CalendarState] = {}
    for team in teams:
        p = by_team[team]
        if p.name not in states:
            states[p.name] = plan_calendar(p.season,
                                           game_minutes=p.league.calendar.game_minutes)
        feed = Calendar.from_ical(team_calendar(p.season, team, state=states[p.name]))
        for component in feed.walk("VTIMEZONE"):
            zones.setdefault(str(component.get("tzid")), component)
        for component in feed.walk("VEVENT"):
            events.setdefault(str(component.get("uid")), component)
    cal = Calendar()
    cal.add("prodid", PRODID)
    cal.add("version", "2.0")
    cal.add("calscale", "GREGORIAN")
    cal.add("method", "PUBLISH")
    cal.add("x-wr-calname", " ".join(ical_text(f"{club} – all teams").split()))
    for tzid in sorted(zones):
        cal.add_component(zones[tzid])
    for component in sorted(events.values(), key=_moment):
        cal.add_component(component)
    return cal.to_ical()


def summary(plan: FederationPlan, folders: dict[str, str]) -> dict:
    """The contents of ``federation.json`` (no clock, no machine: the same plan, same text).

    Parameters
    ----------
    plan : FederationPlan
        The planned federation.
    folders : dict of str to str
        Division name -> its folder.

    Returns
    -------
    dict
        Divisions, units (with the method that planned each), check results.
    """
    fed = plan.federation
    unit_of = {d: u.key for u in plan.units for d in u.divisions}
    return {
        "format": SUMMARY_FORMAT,
        "version": 1,
        "federation": fed.name,
        "season": fed.season,
        "divisions": [
            {"name": p.name, "folder": folders[p.name], "unit": unit_of[p.name],
             "teams": list(p.season.teams), "rounds": p.season.rounds,
             "rules_across_divisions": list(p.added), "notes": list(p.notes)}
            for p in plan.plans
        ],
        "units": [{"key": u.key, "divisions": list(u.divisions), "method": r.method,
                   **({"joint_model_not_used_because": r.fallback} if r.fallback else {})}
                  for u, r in zip(plan.units, plan.results, strict=True)],
        "check": {
            "valid": plan.check.valid,
            "problems": list(plan.check.problems),
            "complementary": [
                {"ground": c.ground, "teams": list(c.teams),
                 "complementary_days": c.complementary_days, "common_days": c.common_days,
                 "enforced": c.enforced}
                for c in plan.check.complement
            ],
        },
    }


def index_html(plan: FederationPlan, folders: dict[str, str], clubs: dict[str, str]) -> str:
    """The index page: every division with links to its outputs, the workbook, the clubs.

    Parameters
    ----------
    plan : FederationPlan
        The planned federation.
    folders : dict of str to str
        Division name -> its folder.
    clubs : dict of str to str
        Club name -> its calendar file.

    Returns
    -------
    str
        The HTML page.
    """
    fed = plan.federation
    e = html.escape
    unit_of = {d: u.key for u in plan.units for d in u.divisions}
    method_of = {d: r.method for u, r in zip(plan.units, plan.results, strict=True)
                 for d in u.divisions}
    rows = []
    for p in plan.plans:
        folder = folders[p.name]
        links = " · ".join(
            f'<a href="{e(folder)}/{name}">{label}</a>'
            for name, label in (("report.html", "report"), ("fixtures.xlsx", "workbook"),
                                ("fixtures.csv", "CSV"), ("calendars/league.ics", "calendar"),
                                ("season.json", "data")))
        rows.append(f"<tr><td>{e(p.name)}</td><td>{len(p.season.teams)}</td>"
                    f"<td>{p.season.rounds}</td><td>{e(unit_of[p.name])}</td>"
                    f"<td>{e(method_of[p.name])}</td><td>{links}</td></tr>")
    club_items = "".join(f'<li><a href="{CLUB_FOLDER}/{e(file)}">{e(name)}</a></li>'
                         for name, file in clubs.items())
    check = ("every rule across divisions holds (checked from the fixtures)"
             if plan.check.valid else
             "<strong>rules across divisions broken:</strong> "
             + "; ".join(e(x) for x in plan.check.problems))
    comp = "".join(f"<li>{e(c.ground)}: {c.complementary_days} of {c.common_days} common match "
                   "days with one team at home and the other away</li>"
                   for c in plan.check.complement)
    title = e(f"{fed.name} {fed.season}")
    return f"""<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>{title}</title>
<style>body{{font-family:system-ui,sans-serif;margin:2rem;max-width:70rem;color:#222}}
table{{border-collapse:collapse}}td,th{{padding:.3rem .7rem;border-bottom:1px solid #ccc;
text-align:left}}</style></head>
<body><h1>{title}</h1>
<p>{len(plan.plans)} divisions in {len(plan.units)} independent units. {check}.</p>
<p><a href="{WORKBOOK_FILE}">All divisions in one workbook</a> ·
<a href="{SUMMARY_FILE}">summary (JSON)</a></p>
<table><thead><tr><th>division</th><th>teams</th><th>rounds</th><th>unit</th>
<th>planned</th><th>outputs</th>
</tr></thead><tbody>
{chr(10).join(rows)}
</tbody></table>
<h2>Club calendars</h2><ul>{club_items}</ul>
{f"<h2>Shared grounds, complementary pattern</h2><ul>{comp}</ul>" if comp else ""}
<p>Rest days and safety: league rules, governing bodies and local regulations take precedence
over anything this tool computes.</p>
</body></html>
"""


def _holds_this(out: Path, plan: FederationPlan) -> bool:
    try:
        data = json.loads((out / SUMMARY_FILE).read_text(encoding="utf-8"))
    except (OSError, ValueError):
        return False
    return (data.get("format") == SUMMARY_FORMAT
            and data.get("federation") == plan.federation.name
            and data.get("season") == plan.federation.season)


def write_federation_outputs(plan: FederationPlan, out_dir: str | os.PathLike[str], *,
                             force: bool = False,
                             config_path: str | os.PathLike[str] | None = None) -> Path:
    """Write the whole output folder (see the module docstring); returns ``out_dir``.

    Parameters
    ----------
    plan
        The planned federation.
    out_dir
        The output folder.
    force
        Replace a folder that holds something else.
    config_path
        The federation file (refused inside the output folder).

    Returns
    -------
    Path
        ``out_dir``.

    Raises
    ------
    OutputError
        A folder that may not be written (another program's or another federation's files, the
        federation file inside it, a disk error); ``out_dir`` is then left as it was.

    Examples
    --------
    >>> write_federation_outputs(plan, "federation")  # doctest: +SKIP
    PosixPath('federation')

    References
    ----------
    RFC 5545 (iCalendar) for the club calendars; ECMA-376 (xlsx) through openpyxl.
    """
    out = Path(out_dir)
    if out.exists() and not out.is_dir():
        raise OutputError(f"{out} exists and is not a folder")
    if config_path is not None:
        config = Path(config_path).resolve()
        if config == out.resolve() or out.resolve() in config.parents:
            raise OutputError(f"the output folder {out} holds your federation file "
                              f"{config_path}; choose another output folder")
    if out.exists() and any(out.iterdir()) and not _holds_this(out, plan) and not force:
        raise OutputError(f"{out} is not empty and does not hold this federation's plan; "
                          "choose another output folder, or force to replace it")
    fed = plan.federation
    folders = division_folders(fed.division_names)
    club_files = {name: f"{stem}.ics"
                  for name, stem in safe_filenames(c.name for c in fed.clubs).items()}
    parent = out.resolve().parent
    try:
        parent.mkdir(parents=True, exist_ok=True)
        staging = Path(_fresh(parent, f".{out.name}.writing"))
    except OSError as exc:
        raise OutputError(f"cannot create the output folder {out}: {exc}") from exc
    try:
        for p in plan.plans:
            write_season_outputs(p.season, p.fairness, staging / folders[p.name],
                                 game_minutes=p.league.calendar.game_minutes,
                                 side_labels=p.league.format.grid_labels)
        (staging / CLUB_FOLDER).mkdir()
        for club in fed.clubs:
            atomic_write_bytes(staging / CLUB_FOLDER / club_files[club.name],
                               club_calendar(plan, club.name, club.teams))
        atomic_write_bytes(staging / WORKBOOK_FILE, workbook_bytes(plan))
        atomic_write_text(staging / SUMMARY_FILE,
                          json.dumps(summary(plan, folders), ensure_ascii=False, indent=1,
                                     sort_keys=True) + "\n")
        atomic_write_text(staging / INDEX_FILE, index_html(plan, folders, club_files))
        old = None
        if out.exists():
            old = Path(_fresh(parent, f".{out.name}.previous"))
            os.rmdir(old)
            os.replace(out, old)
        try:
            os.replace(staging, out)
        except OSError:
            if old is not None:
                os.replace(old, out)
            raise
        if old is not None:
            shutil.rmtree(old, ignore_errors=True)
    except OSError as exc:
        shutil.rmtree(staging, ignore_errors=True)
        raise OutputError(f"cannot write into {out}: {exc}") from exc
    except BaseException:
        shutil.rmtree(staging, ignore_errors=True)
        raise
    return out


def _fresh(parent: Path, prefix: str) -> str:
    import tempfile

    return tempfile.mkdtemp(prefix=prefix + "-", dir=parent)

