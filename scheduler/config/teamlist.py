"""Team lists from an organizer's spreadsheet (xlsx or CSV) into a league or federation file.

The sheet has a header row and one team per row. Columns are found by their header, in any
order and any letter case; the accepted headers of each column:

========================  =======================================================
column                    headers
========================  =======================================================
team (required)           team, team name, name
code                      code, short code, short name, abbreviation
division                  division, div, league, group
home ground               home ground, home venue, ground, venue, home
unavailable dates         unavailable, unavailable dates, not available, away dates
========================  =======================================================

Unavailable dates are ISO dates (``2027-10-16``) or ranges (``2027-12-20..2028-01-03``)
separated by commas or semicolons; a spreadsheet date cell works too. Every problem names the
sheet, the row and the column as the spreadsheet shows them (row 1 is the header, column A the
first), with a did-you-mean suggestion for a misspelt header.

With one division (or no division column) the result is a league file; with several, a
federation file (``scheduler.config.federation``) with one ``[[teams]]`` entry per row. Either
file is parsed back with the project's own loader before it is written, so what ``new`` writes
is always a file ``plan`` or ``plan-divisions`` accepts.

Reading: pandas (``read_excel`` with openpyxl, ``read_csv``).
"""

from __future__ import annotations

import datetime as dt
import json
import re
from dataclasses import dataclass
from pathlib import Path

from scheduler.config.schema import suggestion
from scheduler.errors import ConfigError

COLUMNS: dict[str, tuple[str, ...]] = {
    "team": ("team", "team name", "name"),
    "code": ("code", "short code", "short name", "abbreviation"),
    "division": ("division", "div", "league", "group"),
    "home_ground": ("home ground", "home venue", "ground", "venue", "home"),
    "unavailable": ("unavailable", "unavailable dates", "not available", "away dates"),
}
_HEADER_TO_COLUMN = {h: col for col, headers in COLUMNS.items() for h in headers}

START = dt.date(2027, 9, 4)
"""The placeholder first match day of a generated file (the starter file's; edit it)."""


@dataclass(frozen=True, slots=True)
class TeamRow:
    """One team of the sheet; ``row`` is the spreadsheet row number (header = 1).

    Parameters
    ----------
    row : int
        The spreadsheet row number (header = 1), for messages.
    name : str
        The team's name.
    code : str or None
        Its short code; None when the sheet gives none.
    division : str or None
        Its division; None for a sheet of one league.
    home_ground : str or None
        The name of its home ground; None when it has none.
    unavailable : tuple of str
        The dates it cannot play, checked ISO text: single dates or ``"first..last"`` ranges.
    """

    row: int
    name: str
    code: str | None
    division: str | None
    home_ground: str | None
    unavailable: tuple[str, ...]


@dataclass(frozen=True)
class TeamList:
    """The teams of a sheet, and where they came from (``source``, ``sheet``).

    Parameters
    ----------
    source : str
        The sheet's file.
    sheet : str
        The worksheet's name; ``"CSV"`` for a CSV file.
    rows : tuple of TeamRow
        The teams, in the sheet's order.
    """

    source: str
    sheet: str
    rows: tuple[TeamRow, ...]

    @property
    def divisions(self) -> tuple[str, ...]:
        """The division names, in order of first appearance (empty for one league)."""
        return tuple(dict.fromkeys(r.division for r in self.rows if r.division))


def _letter(index: int) -> str:
    """Spreadsheet column letter of a 0-based column index (0 -> A, 26 -> AA)."""
    text = ""
    index += 1
    while index:
        index, rest = divmod(index - 1, 26)
        text = chr(65 + rest) + text
    return text


def _blank(value: object) -> bool:
    if value is None:
        return True
    if isinstance(value, float) and value != value:  # NaN from pandas
        return True
    return isinstance(value, str) and not value.strip()


def _text(value: object) -> str:
    if isinstance(value, float) and value.is_integer():
        return str(int(value))
    return str(value).strip()


def _read_cells(path: Path) -> tuple[str, list[list[object]]]:
    import pandas as pd

    suffix = path.suffix.lower()
    try:
        if suffix == ".csv":
            frame = pd.read_csv(path, header=None, dtype=str, keep_default_na=False,
                                encoding="utf-8-sig")
            return "CSV", frame.values.tolist()
        if suffix in (".xlsx", ".xlsm"):
            sheets = pd.read_excel(path, sheet_name=None, header=None, dtype=object,
                                   engine="openpyxl")
            if not sheets:
                raise ConfigError(["the workbook has no sheets"], path=str(path))
            names = list(sheets)
            name = next((n for n in names if n.strip().lower() == "teams"), names[0])
            return name, sheets[name].values.tolist()
    except FileNotFoundError:
        raise ConfigError(["file not found"], path=str(path)) from None
    except ConfigError:
        raise
    except Exception as exc:  # a damaged or foreign file: say so, never a traceback
        raise ConfigError([f"the file could not be read as a team list "
                           f"({type(exc).__name__}: {exc})"], path=str(path)) from None
    raise ConfigError([f"unknown file type ({path.suffix or 'no ending'}); a team list is an "
                       ".xlsx or .csv file"], path=str(path))


def _dates(value: object, where: str, problems: list[str]) -> tuple[str, ...]:
    if _blank(value):
        return ()
    if isinstance(value, dt.datetime):
        return (value.date().isoformat(),)
    if isinstance(value, dt.date):
        return (value.isoformat(),)
    out = []
    for part in re.split(r"[;,]", str(value)):
        part = part.strip()
        if not part:
            continue
        ends = [p.strip() for p in part.split("..")]
        try:
            days = [dt.date.fromisoformat(p) for p in ends]
        except ValueError:
            problems.append(f"{where}: {part!r} is not a date like 2027-10-16 or a range like "
                            "2027-12-20..2028-01-03")
            continue
        if len(days) == 2 and days[1] < days[0]:
            problems.append(f"{where}: the range {part!r} ends before it starts")
            continue
        if len(days) > 2:
            problems.append(f"{where}: {part!r} has more than one '..'")
            continue
        out.append(part)
    return tuple(out)


def read_team_list(path: str | Path) -> TeamList:
    """Read the teams of an xlsx (the sheet called "Teams", else the first) or CSV file.

    Parameters
    ----------
    path
        The spreadsheet.

    Returns
    -------
    TeamList
        One row per team, in sheet order.

    Raises
    ------
    ConfigError
        Every problem, each as ``sheet 'Teams', row 4, column C (division): ...``.

    Examples
    --------
    >>> teams = read_team_list("teams.csv")  # doctest: +SKIP
    >>> teams.rows[0].name  # doctest: +SKIP
    'Oxlow'
    """
    p = Path(path)
    sheet, cells = _read_cells(p)
    where_sheet = f"sheet {sheet!r}" if sheet != "CSV" else "CSV"
    while cells and all(_blank(v) for v in cells[0]):
        cells = cells[1:]
    if not cells:
        raise ConfigError([f"{where_sheet}: the sheet is empty; give a header row (team, code, "
                           "division, home ground, unavailable) and one row per team"],
                          path=str(p))
    problems: list[str] = []
    columns: dict[str, int] = {}
    known = list(_HEADER_TO_COLUMN)
    for index, header in enumerate(cells[0]):
        if _blank(header):
            continue
        key = " ".join(_text(header).lower().replace("_", " ").split())
        column = _HEADER_TO_COLUMN.get(key)
        where = f"{where_sheet}, row 1, column {_letter(index)}"
        if column is None:
            problems.append(f"{where}: unknown column {_text(header)!r}"
                            f"{suggestion(key, known) or ' (known: ' + ', '.join(COLUMNS) + ')'}")
        elif column in columns:
            problems.append(f"{where}: a second {column.replace('_', ' ')} column (the first is "
                            f"column {_letter(columns[column])})")
        else:
            columns[column] = index
    if "team" not in columns:
        problems.append(f"{where_sheet}, row 1: no team column (a header such as 'team')")
    if problems:
        raise ConfigError(problems, path=str(p))
    rows: list[TeamRow] = []
    seen: dict[str, int] = {}
    codes: dict[str, int] = {}

    def cell(values: list[object], column: str) -> object:
        index = columns.get(column)
        return values[index] if index is not None and index < len(values) else None

    for offset, values in enumerate(cells[1:], start=2):
        if all(_blank(v) for v in values):
            continue

        def at(column: str, row: int = offset) -> str:
            return (f"{where_sheet}, row {row}, column {_letter(columns[column])} "
                    f"({column.replace('_', ' ')})")

        name = cell(values, "team")
        if _blank(name):
            problems.append(f"{at('team')}: the team name is missing")
            continue
        name = _text(name)
        if name in seen:
            problems.append(f"{at('team')}: {name!r} is already in row {seen[name]}")
            continue
        seen[name] = offset
        code = None if _blank(cell(values, "code")) else _text(cell(values, "code"))
        if code is not None:
            if code.lower() in codes:
                problems.append(f"{at('code')}: the code {code!r} is already used in row "
                                f"{codes[code.lower()]}")
            codes.setdefault(code.lower(), offset)
        division = None if _blank(cell(values, "division")) else _text(cell(values, "division"))
        if "division" in columns and division is None:
            problems.append(f"{at('division')}: the division of {name!r} is missing")
        ground = None if _blank(cell(values, "home_ground")) else _text(cell(values, "home_ground"))
        unavailable = (_dates(cell(values, "unavailable"), at("unavailable"), problems)
                       if "unavailable" in columns else ())
        rows.append(TeamRow(offset, name, code, division, ground, unavailable))
    if not rows and not problems:
        problems.append(f"{where_sheet}: no teams below the header row")
    if problems:
        raise ConfigError(problems, path=str(p))
    return TeamList(str(p), sheet, tuple(rows))


def _q(text: str) -> str:
    return json.dumps(text, ensure_ascii=False)


def _dates_toml(values: tuple[str, ...]) -> str:
    return "[" + ", ".join(v if ".." not in v else _q(v) for v in values) + "]"


def _start(teams: TeamList) -> dt.date:
    """The placeholder first match day: :data:`START`, or the Saturday on or before the
    earliest unavailable date of the sheet when that is earlier (so every date is in season)."""
    days = [dt.date.fromisoformat(part.split("..")[0].strip())
            for r in teams.rows for part in r.unavailable]
    if not days or min(days) >= START:
        return START
    first = min(days)
    return first - dt.timedelta(days=(first.weekday() - 5) % 7)


def team_list_toml(teams: TeamList, name: str = "My League") -> str:
    """The league file (one division) or federation file (several) of a team list.

    The calendar is a placeholder (Saturdays from :data:`START`) to edit; teams, codes, home
    grounds (as venues) and unavailable dates come from the sheet.

    Parameters
    ----------
    teams : TeamList
        The teams read from a sheet.
    name : str, optional
        The league's (or federation's) name.

    Returns
    -------
    str
        The TOML text: a league file for one division, a federation file for several.
    """
    grounds = list(dict.fromkeys(r.home_ground for r in teams.rows if r.home_ground))
    divisions = teams.divisions
    several = len(divisions) > 1
    out = [f"# Built from the team list {Path(teams.source).name}"
           + (f" (sheet {teams.sheet!r})" if teams.sheet != "CSV" else "") + ".",
           "# Edit the name, season, calendar and rules, then plan it.", ""]
    out += ["[federation]" if several else "[league]", f"name = {_q(name)}",
            'season = "2027-28"', 'timezone = "Europe/London"', "seed = 0", ""]
    if not several:
        side = not grounds
        out += ["[format]", "legs = 2", f'home_meaning = "{"side" if side else "venue"}"', ""]
    out += ["[calendar]", f"start = {_start(teams).isoformat()}", 'weekdays = ["sat"]',
            'kickoff = "15:00"', ""]
    for ground in grounds:
        out += ["[[venues]]", f"name = {_q(ground)}", ""]
    if not grounds:
        out += ["[[venues]]", 'name = "Main Ground"', ""]
    if several:
        for division in divisions:
            has_home = any(r.home_ground for r in teams.rows if r.division == division)
            out += ["[[divisions]]", f"name = {_q(division)}",
                    f'format = {{ legs = 2, home_meaning = "{"venue" if has_home else "side"}" }}']
            if not has_home:
                out.append(f"venues = [{_q(grounds[0]) if grounds else _q('Main Ground')}]")
            out.append("")
    unavailable = []
    for r in teams.rows:
        out.append("[[teams]]")
        if several:
            out.append(f"division = {_q(r.division or '')}")
        out.append(f"name = {_q(r.name)}")
        if r.code:
            out.append(f"code = {_q(r.code)}")
        if r.home_ground:
            out.append(f"home_venue = {_q(r.home_ground)}")
        if r.unavailable and several:
            out.append(f"unavailable = {_dates_toml(r.unavailable)}")
        elif r.unavailable:
            unavailable.append(r)
        out.append("")
    for r in unavailable:
        out += ["[[rules.unavailable]]", f"team = {_q(r.name)}",
                f"dates = {_dates_toml(r.unavailable)}", ""]
    return "\n".join(out).rstrip() + "\n"


def build_from_team_list(path: str | Path, name: str = "My League") -> str:
    """Read a team list and return the checked file text (league or federation).

    Parameters
    ----------
    path : str or pathlib.Path
        The team list: an ``.xlsx`` workbook or a ``.csv`` file.
    name : str, optional
        The league's (or federation's) name.

    Returns
    -------
    str
        The TOML text, already checked by the league (or federation) parser.

    Raises
    ------
    ConfigError
        The sheet's located problems, or the generated file's own (for example a team whose
        home ground is missing in a division that hosts games at home grounds).
    """
    import tomllib

    from scheduler.config.federation import is_federation_data, parse_federation
    from scheduler.config.loader import parse_league

    teams = read_team_list(path)
    text = team_list_toml(teams, name)
    data = tomllib.loads(text)
    try:
        if is_federation_data(data):
            parse_federation(data, source=teams.source)
        else:
            parse_league(data, source=teams.source)
    except ConfigError as exc:
        raise ConfigError([_sheet_problem(p, teams) for p in exc.problems],
                          path=teams.source) from None
    return text


_TEAM_PROBLEM = re.compile(r"^(?:divisions\[\d+\]\.)?teams\[(\d+)\](?:\.(\w+))?: (.*)$")
_FIELD_COLUMN = {"name": "team", "code": "code", "home_venue": "home ground",
                 "unavailable": "unavailable dates"}


def _sheet_problem(problem: str, teams: TeamList) -> str:
    """A problem of the generated file, told in the sheet's rows where it is about a team."""
    where = f"sheet {teams.sheet!r}" if teams.sheet != "CSV" else "CSV"
    m = _TEAM_PROBLEM.match(problem)
    if m and int(m.group(1)) < len(teams.rows):
        row = teams.rows[int(m.group(1))]
        column = _FIELD_COLUMN.get(m.group(2) or "", "")
        return f"{where}, row {row.row}" + (f" ({column})" if column else "") + f": {m.group(3)}"
    m = re.match(r"^rules\.unavailable\[(\d+)\]", problem)
    if m:
        rows = [r for r in teams.rows if r.unavailable]
        if int(m.group(1)) < len(rows):
            row = rows[int(m.group(1))]
            return f"{where}, row {row.row} (unavailable dates): {problem.split(': ', 1)[-1]}"
    return f"{where}: {problem}"


def write_new_file(target: str | Path, text: str) -> Path:
    """Write ``text`` to ``target`` atomically; never overwrites an existing file
    (:func:`scheduler.config.starter.write_new_text_file`).

    Parameters
    ----------
    target : str or pathlib.Path
        The new file; its folder must exist.
    text : str
        The contents.

    Returns
    -------
    pathlib.Path
        The path written.

    Raises
    ------
    OutputError
        When the file exists or cannot be written.
    """
    from scheduler.config.starter import write_new_text_file

    return write_new_text_file(target, text)
