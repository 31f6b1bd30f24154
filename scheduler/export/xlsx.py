"""The season as a spreadsheet workbook (Office Open XML, ECMA-376), written with openpyxl.

Sheets: ``Fixtures`` (every game), ``Grid`` (team by round: opponent and home/away, byes shown),
``Fairness`` (the figures of a :class:`~scheduler.fairness.FairnessReport`, written as given:
this module computes no figure itself) and one sheet per team. Dates and kick-off times are real
date and time cells with number formats, so they sort and filter as dates. Every sheet has a
frozen header row, an autofilter where it is a table, column widths fitted to the text, the
header row repeated on printed pages and a landscape, fit-to-width page setup.

User text (team, venue, court and slot names) is stored exactly as typed, as a string cell
(``t="inlineStr"`` in ECMA-376 SpreadsheetML): a spreadsheet program shows a string cell as text
and never evaluates it, so a name such as ``=Hill United`` needs no apostrophe in front (a
formula would be an ``<f>`` element, which this workbook never holds). Cells whose text starts
like a formula (``=``, ``+``, ``-``, ``@``; OWASP "CSV Injection", common practice) also get the
``quotePrefix`` cell style, the mark a spreadsheet program sets itself when a user types
``'=...``, so that editing such a cell keeps it text. See :func:`plain_text_cells` and
``docs/season-folder.md``. Characters that XML 1.0 forbids are replaced by U+FFFD and line
breaks are written as LF. Only a name that itself starts with an apostrophe followed by such a
character gets one more apostrophe, so that readers that undo the CSV neutralisation
(:func:`~scheduler.export.safety.restore_cell`) give the name back unchanged.

Byte-identical output: openpyxl stamps ``modified`` with the clock and the zip members with the
local time. :func:`workbook_bytes` sets the document properties to a time derived from the season
(:func:`scheduler.export.ics.plan_stamp`) and writes the archive through a zip writer that gives
every member the same fixed timestamp, so the same season gives the same bytes.
"""

from __future__ import annotations

import io
import os
import zipfile
from collections.abc import Sequence
from pathlib import Path

from openpyxl import Workbook
from openpyxl.cell.cell import ILLEGAL_CHARACTERS_RE
from openpyxl.styles import Alignment, Border, Font, PatternFill, Side
from openpyxl.utils import get_column_letter
from openpyxl.worksheet.pagebreak import Break
from openpyxl.worksheet.worksheet import Worksheet
from openpyxl.writer.excel import ExcelWriter

from scheduler.export.csv_out import fixture_rows
from scheduler.export.ics import plan_stamp
from scheduler.export.safety import (
    FORMULA_TRIGGERS,
    neutralise_cell,
    restore_cell,
    safe_sheet_title,
)
from scheduler.fairness.model import FairnessReport
from scheduler.fairness.names import figure_lines, plain_source
from scheduler.files import atomic_write_bytes
from scheduler.season import Season

DATE_FORMAT = "yyyy-mm-dd"
TIME_FORMAT = "hh:mm"
_ZIP_TIME = (1980, 1, 1, 0, 0, 0)

# Our own plain style: a neutral warm-grey header with a dark rule beneath it.
_HEADER_FILL = PatternFill("solid", fgColor="E4E2DC")
_HEADER_FONT = Font(bold=True, color="222222")
_HEADER_BORDER = Border(bottom=Side(style="medium", color="555555"))
_HOME_FILL = PatternFill("solid", fgColor="DDE8F3")
_AWAY_FILL = PatternFill("solid", fgColor="F7E6CF")
_BYE_FILL = PatternFill("gray125", fgColor="BBBBBB")
_WRAP = Alignment(wrap_text=True, vertical="top")

FIXTURE_HEADERS = ("Round", "Leg", "Date", "Kick-off", "Home", "Away", "Venue", "Court", "Slot")


def user_text(value: str | None) -> str | None:
    """A cell of user text: as typed, free of characters XML 1.0 cannot hold.

    Line breaks become LF (an XML reader turns a raw CR into LF anyway, XML 1.0 §2.11). Text that
    starts like a formula is kept as it is; :func:`plain_text_cells` makes its cell a string cell.
    Only text that already looks neutralised (an apostrophe, then a formula character) is
    quoted once more, so that ``restore_cell`` gives it back unchanged.

    Parameters
    ----------
    value
        The text as the user typed it, or ``None``.

    Returns
    -------
    str or None
        The cell's text (``None`` for ``None``); characters XML 1.0 cannot hold become
        U+FFFD.

    References
    ----------
    XML 1.0 (Fifth Edition) §2.2 (characters) and §2.11 (line ends).

    Examples
    --------
    >>> user_text("=Hill United")
    '=Hill United'
    >>> user_text("'=x")
    "''=x"
    """
    if value is None:
        return None
    text = ILLEGAL_CHARACTERS_RE.sub("\ufffd", value.replace("\r\n", "\n").replace("\r", "\n"))
    if restore_cell(text) != text:
        return neutralise_cell(text)
    return text


def plain_text_cells(wb: Workbook) -> int:
    """Make every cell of text that starts like a formula a plain string cell.

    openpyxl turns any text starting with ``=`` into a formula cell (data type ``"f"``). This
    workbook holds no formulas of its own, so such cells, and cells of text starting with
    another formula character, get data type ``"s"`` (string, written as ``inlineStr``) and the
    ``quotePrefix`` style, which a spreadsheet program shows as the text itself.

    Parameters
    ----------
    wb
        The workbook, changed in place.

    Returns
    -------
    int
        How many cells were marked.

    Examples
    --------
    >>> wb = Workbook(); wb.active["A1"] = "=1+1"; plain_text_cells(wb), wb.active["A1"].data_type
    (1, 's')
    """
    marked = 0
    for ws in wb.worksheets:
        for row in ws.iter_rows():
            for cell in row:
                value = cell.value
                if isinstance(value, str) and (
                    cell.data_type == "f" or value.startswith(FORMULA_TRIGGERS)
                ):
                    cell.data_type = "s"
                    cell.quotePrefix = True
                    marked += 1
    return marked


class _FixedTimeZip(zipfile.ZipFile):
    """A zip writer that stamps every member with one fixed time (for identical bytes)."""

    def writestr(self, zinfo_or_arcname, data, compress_type=None, compresslevel=None):
        if not isinstance(zinfo_or_arcname, zipfile.ZipInfo):
            info = zipfile.ZipInfo(str(zinfo_or_arcname), date_time=_ZIP_TIME)
            info.compress_type = zipfile.ZIP_DEFLATED
            info.external_attr = 0o644 << 16
            zinfo_or_arcname = info
        return super().writestr(zinfo_or_arcname, data, compress_type, compresslevel)

    def write(self, filename, arcname=None, compress_type=None, compresslevel=None):
        # openpyxl streams each worksheet through a temporary file and adds it with write(),
        # which would record that file's modification time.
        with open(filename, "rb") as handle:
            data = handle.read()
        return self.writestr(arcname or os.path.basename(filename), data)


def _header(ws: Worksheet, headers: Sequence[str], row: int = 1) -> None:
    for col, text in enumerate(headers, start=1):
        cell = ws.cell(row=row, column=col, value=text)
        cell.fill = _HEADER_FILL
        cell.font = _HEADER_FONT
        cell.border = _HEADER_BORDER
        cell.alignment = Alignment(vertical="center")


def _finish(ws: Worksheet, *, header_row: int = 1, freeze: str = "A2", table: bool = True) -> None:
    """Frozen header, autofilter, fitted widths, print titles, landscape fit-to-width."""
    ws.freeze_panes = freeze
    if table and ws.max_row > header_row:
        ws.auto_filter.ref = f"A{header_row}:{get_column_letter(ws.max_column)}{ws.max_row}"
    widths: dict[int, int] = {}
    for row in ws.iter_rows():
        for cell in row:
            if cell.value is None:
                continue
            text = "2026-01-01" if cell.is_date else str(cell.value)
            length = max(len(line) for line in text.split("\n"))
            widths[cell.column] = max(widths.get(cell.column, 0), length)
    for col, length in widths.items():
        ws.column_dimensions[get_column_letter(col)].width = min(max(length + 2, 6), 48)
    ws.print_title_rows = f"{header_row}:{header_row}"
    ws.page_setup.orientation = "landscape"
    ws.page_setup.fitToWidth = 1
    ws.page_setup.fitToHeight = 0
    ws.sheet_properties.pageSetUpPr.fitToPage = True
    ws.print_options.gridLines = True


SHEET_TITLE_MAX = 31
"""Longest worksheet title a spreadsheet program accepts (ECMA-376 / Excel limit)."""

GRID_ROUNDS_PER_PAGE = 8
"""Rounds per printed page of the Grid sheet (the team column repeats on every page)."""

_HEADER_PART_MAX = 80


def short_title(name: str, limit: int = SHEET_TITLE_MAX) -> str:
    """``name`` cut to ``limit`` characters in the middle, keeping its end.

    Long names of one club's teams differ at the end ("... Girls A", "... Girls B"), so the
    end is kept whole (up to 12 characters, from a word start where possible) and the middle
    gives way to an ellipsis.

    Parameters
    ----------
    name
        A team's name (runs of white space count as one space).
    limit
        Longest title in characters.

    Returns
    -------
    str
        The name itself when short enough, else head, ``…`` and tail.

    Examples
    --------
    >>> short_title("Marlwick and District Sunday League Girls A")
    'Marlwick and District…Girls A'
    """
    text = " ".join(str(name).split())
    if len(text) <= limit:
        return text
    tail = text[-12:]
    if " " in tail:
        tail = tail[tail.index(" ") + 1 :]
    head = text[: limit - len(tail) - 1]
    if text[len(head)] != " " and " " in head[len(head) // 2 :]:
        head = head[: head.rindex(" ")]
    return f"{head.rstrip()}…{tail}"


def _header_text(text: str) -> str:
    """Text for a page header or footer: ``&`` doubled (a single one starts a code, ECMA-376
    §18.3.1.46), one line, at most :data:`_HEADER_PART_MAX` characters."""
    one = " ".join(ILLEGAL_CHARACTERS_RE.sub("\ufffd", str(text)).split())
    return short_title(one, _HEADER_PART_MAX).replace("&", "&&")


def _page_header(ws: Worksheet, season: Season, title: str) -> None:
    """Header: league and season left, the sheet's title (a team's name) right; footer: the
    page number as "page &P of &N" in the middle (header codes of ECMA-376 §18.3.1.46)."""
    league = " ".join(p for p in (season.league, season.season_id) if p)
    for part in (ws.oddHeader, ws.evenHeader, ws.firstHeader):
        part.left.text = _header_text(league)
        part.right.text = _header_text(title)
    for part in (ws.oddFooter, ws.evenFooter, ws.firstFooter):
        part.center.text = "Page &P of &N"
        part.left.text = _header_text(title)


def _fixtures_sheet(ws: Worksheet, season: Season) -> None:
    headers = list(FIXTURE_HEADERS)
    if season.home_meaning == "side":  # the columns are named by the league's sides
        headers[4], headers[5] = season.side_labels
    _header(ws, headers)
    for r, row in enumerate(fixture_rows(season), start=2):
        f = row.fixture
        values = (
            f.round,
            f.leg,
            row.date,
            row.time,
            user_text(f.home),
            user_text(f.away),
            user_text(f.venue),
            user_text(f.court),
            user_text(f.slot),
        )
        for c, value in enumerate(values, start=1):
            cell = ws.cell(row=r, column=c, value=value)
            if c == 3 and value is not None:
                cell.number_format = DATE_FORMAT
            elif c == 4 and value is not None:
                cell.number_format = TIME_FORMAT
            elif c >= 5 and isinstance(value, str) and value and "\n" in value:
                cell.alignment = _WRAP
    _finish(ws)


def side_words(season: Season, side_labels: tuple[str, str] = ("H", "A")) -> tuple[str, str] | None:
    """The names of the two sides when "home" is a side or colour (the season's labels, or the
    ``side_labels`` a caller passes other than the default), else ``None``.

    Parameters
    ----------
    season
        The season (what "home" means, its side labels).
    side_labels
        Side labels a caller asks for; the default ``("H", "A")`` means none.

    Returns
    -------
    tuple of (str, str) or None
        The two side names, or ``None`` when home means a venue.

    Examples
    --------
    >>> from scheduler.season import Season
    >>> side_words(Season("Demo", "2031", (), ())) is None
    True
    >>> side_words(Season("Demo", "2031", (), ()), ("White", "Black"))
    ('White', 'Black')
    """
    if season.home_meaning == "side":
        return season.side_labels
    if tuple(side_labels) != ("H", "A"):
        return (side_labels[0], side_labels[1])
    return None


def grid_cell_text(home_side: bool, opponent: str, sides: tuple[str, str] | None) -> str:
    """What a Grid cell says about the row's team: ``"home v Westermoor"`` (the row's team is
    at home), ``"away at Westermoor"``, or with sides, ``"White v Westermoor"``.

    Parameters
    ----------
    home_side
        ``True`` when the row's team is at home (or plays the first side).
    opponent
        The other team.
    sides
        The side names (:func:`side_words`), or ``None``.

    Returns
    -------
    str
        The cell's text.

    Examples
    --------
    >>> grid_cell_text(False, "Westermoor", None)
    'away at Westermoor'
    >>> grid_cell_text(True, "Westermoor", ("White", "Black"))
    'White v Westermoor'
    """
    if sides is not None:
        return f"{sides[0] if home_side else sides[1]} v {opponent}"
    return f"home v {opponent}" if home_side else f"away at {opponent}"


def _grid_sheet(ws: Worksheet, season: Season, side_labels: tuple[str, str]) -> None:
    sides = side_words(season, side_labels)
    rounds = season.rounds
    _header(ws, ["Team", *[f"R{r}" for r in range(1, rounds + 1)]])
    cells: dict[tuple[str, int], list[tuple[str, str]]] = {}
    for f in season.fixtures:
        cells.setdefault((f.home, f.round), []).append(("home", f.away))
        cells.setdefault((f.away, f.round), []).append(("away", f.home))
    for r, team in enumerate(season.teams, start=2):
        name_cell = ws.cell(row=r, column=1, value=user_text(team))
        name_cell.font = Font(bold=True)
        for number in range(1, rounds + 1):
            games = cells.get((team, number), [])
            cell = ws.cell(row=r, column=number + 1)
            if not games:
                cell.value = "bye"
                cell.fill = _BYE_FILL
                continue
            cell.value = user_text(
                "\n".join(
                    grid_cell_text(side == "home", opp, sides)
                    for side, opp in sorted(games, key=lambda g: g[1])
                )
            )
            if len(games) == 1:
                cell.fill = _HOME_FILL if games[0][0] == "home" else _AWAY_FILL
            cell.alignment = _WRAP
    _finish(ws, freeze="B2", table=False)
    # Printing: rounds split across pages, the team column repeated on each (print titles).
    for col in range(2, rounds + 2):
        letter = get_column_letter(col)
        ws.column_dimensions[letter].width = min(ws.column_dimensions[letter].width or 12, 22)
    ws.print_title_cols = "A:A"
    for first in range(1 + GRID_ROUNDS_PER_PAGE, rounds + 1, GRID_ROUNDS_PER_PAGE):
        ws.col_breaks.append(Break(id=first))  # a break after column `first` (round first-1)
    # Spreadsheet programs ignore manual page breaks under "fit to pages", so the Grid is
    # scaled instead: the team column and one page's rounds fill the printable width.
    ws.sheet_properties.pageSetUpPr.fitToPage = False
    ws.page_setup.scale = grid_print_scale(ws, rounds)


def column_pixels(width: float) -> float:
    """Screen pixels of a column ``width`` characters wide (ECMA-376 §18.3.1.13: the width is
    counted in widths of the digit "0" of the default font, 7 pixels for 11-point Calibri, plus
    5 pixels of padding; from memory).

    Parameters
    ----------
    width
        Column width in characters, as openpyxl stores it.

    Returns
    -------
    float
        Width in screen pixels.

    References
    ----------
    ECMA-376 Part 1, §18.3.1.13 (from memory).

    Examples
    --------
    >>> column_pixels(10)
    75
    """
    return width * 7 + 5


def grid_print_scale(ws: Worksheet, rounds: int) -> int:
    """The print scale (percent, 10 to 100) at which the team column and any
    :data:`GRID_ROUNDS_PER_PAGE` rounds fit the printable width of a landscape A4 page.

    Parameters
    ----------
    ws
        The Grid sheet (its column widths and page margins, in inches).
    rounds
        Number of round columns after the team column.

    Returns
    -------
    int
        The scale in percent.

    References
    ----------
    ISO 216 (A4: 210 mm x 297 mm).
    """
    margins = (ws.page_margins.left or 0.7) + (ws.page_margins.right or 0.7)
    printable = (297 / 25.4 - margins) * 96  # landscape A4 (ISO 216), in 96-dpi pixels

    def width(col: int) -> float:
        return column_pixels(ws.column_dimensions[get_column_letter(col)].width or 8.43)

    widest = 0.0
    for first in range(2, rounds + 2, GRID_ROUNDS_PER_PAGE):
        page = width(1) + sum(
            width(c) for c in range(first, min(first + GRID_ROUNDS_PER_PAGE, rounds + 2))
        )
        widest = max(widest, page)
    if widest <= 0:
        return 100
    return max(10, min(100, int(printable / widest * 100)))


def _team_sheet(ws: Worksheet, season: Season, team: str, side_labels: tuple[str, str]) -> None:
    sides = side_words(season, side_labels)
    side_head = "Side" if sides is not None else "Home/away"
    words = sides if sides is not None else ("home", "away")
    _header(
        ws, ["Round", "Leg", "Date", "Kick-off", side_head, "Opponent", "Venue", "Court", "Slot"]
    )
    rows = [row for row in fixture_rows(season) if team in row.fixture.teams]
    entries: list[tuple[int, tuple]] = []
    for row in rows:
        f = row.fixture
        home = f.home == team
        entries.append(
            (
                f.round,
                (
                    f.round,
                    f.leg,
                    row.date,
                    row.time,
                    words[0] if home else words[1],
                    user_text(f.away if home else f.home),
                    user_text(f.venue),
                    user_text(f.court),
                    user_text(f.slot),
                ),
            )
        )
    for number, teams in season.byes.items():
        if team in teams:
            entries.append((number, (number, None, None, None, "bye", None, None, None, None)))
    entries.sort(key=lambda e: (e[0], e[1][4] == "bye"))
    for r, (_, values) in enumerate(entries, start=2):
        for c, value in enumerate(values, start=1):
            cell = ws.cell(row=r, column=c, value=value)
            if c == 3 and value is not None:
                cell.number_format = DATE_FORMAT
            elif c == 4 and value is not None:
                cell.number_format = TIME_FORMAT
            if values[4] == "bye":
                cell.fill = _BYE_FILL
    _finish(ws)


_CARRY_SOURCE = (
    "lower bound n(n-1): Russell, Biometrika 67 (1980) 127-131; worst possible (n-1)(n²-6n+12), "
    "reached by the circle method: Lambrechts, Ficker, Goossens & Spieksma, Math. Programming "
    "172 (2018) 277-302"
)
_COURT_SOURCE = (
    "each court at most twice per leg (balanced tournament design): Schellenberg, van Rees & "
    "Vanstone, Ars Combinatoria 3 (1977) 303-318"
)


def _fairness_sheet(ws: Worksheet, season: Season, fairness) -> None:
    """The report's figures, as given (nothing is computed here), each under its one name
    (:mod:`scheduler.fairness.names`) with where it stands and what it is measured over."""
    fr = fairness
    mixing_source = plain_source(season.mixing.source) if season.mixing else ""

    def fmt(value) -> object:
        if value is None:
            return "n/a"
        if isinstance(value, bool):
            return "yes" if value else "no"
        if isinstance(value, tuple | list):
            return ", ".join("n/a" if v is None else str(v) for v in value)
        return value

    sources = {
        "perfect_pairs": mixing_source,
        "breaks_total": fr.breaks_lower_bound_source,
        "carry_over_value": _CARRY_SOURCE,
        "home_gap_max": "Goossens & Spieksma, ranking-balancedness (2012)",
    }
    numbers = {
        "breaks_total": fr.breaks_total,
        "carry_over_value": fr.carry_over_value,
        "home_gap_max": fr.home_gap_max,
        "court_spread_max": fr.court_spread_max,
        "slot_spread_max": fr.slot_spread_max,
        "rest_days_min": fr.rest_days_min,
        "separation_min": fr.separation_min,
    }
    rows: list[tuple] = [
        ("teams", fr.teams, "", "", ""),
        ("rounds", fr.rounds, "", "", ""),
        ("legs", f"{fr.legs} ({fr.scheme})" if fr.legs > 1 else fr.legs, "", "", ""),
        ("games", fr.games, "", "", ""),
    ]
    for line in figure_lines(fr):
        value = numbers.get(line.key, line.value)
        rows.append((line.name, value, line.standing, line.over, sources.get(line.key, "")))
    if fr.btd_applicable:
        rows.append(
            (
                "each court at most twice per leg",
                fmt(fr.btd_ok),
                "kept" if fr.btd_ok else "; ".join(fr.btd_violations[:3]),
                "every leg",
                _COURT_SOURCE,
            )
        )
    if fr.legs > 1 and fr.carry_over_value is not None:
        rows.append(
            (
                "carry-over value of each leg",
                fmt(fr.carry_over_per_leg),
                "lower is better",
                "each leg on its own, its last round followed by its first",
                "",
            )
        )
    rows.append(("byes and breaks", fr.bye_convention, "", "", ""))
    rows += [("note", user_text(note), "", "", "") for note in (*fr.notes, *season.notes)]
    _header(ws, ["Figure", "Value", "Where it stands", "Measured over", "Source"])
    for r, values in enumerate(rows, start=2):
        for c, value in enumerate(values, start=1):
            cell = ws.cell(row=r, column=c, value=value if value != "" else None)
            if c >= 3:
                cell.alignment = _WRAP
    top = len(rows) + 3
    headers = [
        "Team", "Games", "Home", "Away", "Byes", "Breaks", "Break rounds", "Pattern",
        "Court spread", "Slot spread", "Least rest", "Mean rest",
    ]  # fmt: skip
    _header(ws, headers, row=top)
    for r, t in enumerate(fr.team_figures, start=top + 1):
        values = (
            user_text(t.name),
            t.games,
            t.home,
            t.away,
            t.byes,
            t.breaks,
            fmt(t.break_rounds),
            t.pattern,
            fmt(t.court_spread),
            fmt(t.slot_spread),
            fmt(t.rest_days_min),
            "n/a" if t.rest_days_mean is None else round(t.rest_days_mean, 2),
        )
        for c, value in enumerate(values, start=1):
            ws.cell(row=r, column=c, value=value if value != "" else None)
    _finish(ws, table=False)
    for letter, width in (("C", 40), ("D", 36), ("E", 48)):
        ws.column_dimensions[letter].width = width
    ws.print_title_rows = "1:1"


def build_workbook(
    season: Season,
    fairness: FairnessReport | None = None,
    *,
    side_labels: tuple[str, str] = ("H", "A"),
) -> Workbook:
    """The workbook object (``fairness`` optional: without it there is no Fairness sheet).

    Parameters
    ----------
    season
        The season.
    fairness
        Its fairness figures, or ``None``.
    side_labels
        Labels of the two sides in the grid.

    Returns
    -------
    openpyxl.Workbook
        Sheets Fixtures, Grid, Fairness (with figures) and one per team; document dates
        derived from the plan revision.

    Examples
    --------
    >>> from scheduler.season import Fixture, Season
    >>> wb = build_workbook(Season("Demo", "2031", ("Ash", "Elm"), (Fixture(1, "Ash", "Elm"),)))
    >>> wb.sheetnames
    ['Fixtures', 'Grid', 'Ash', 'Elm']
    """
    wb = Workbook()
    ws = wb.active
    ws.title = "Fixtures"
    _fixtures_sheet(ws, season)
    _page_header(ws, season, "Fixtures")
    grid = wb.create_sheet("Grid")
    _grid_sheet(grid, season, side_labels)
    _page_header(grid, season, "Team by round")
    taken = {"fixtures", "grid", "fairness"}
    if fairness is not None:
        sheet = wb.create_sheet("Fairness")
        _fairness_sheet(sheet, season, fairness)
        _page_header(sheet, season, "Fairness figures")
    for team in season.teams:
        title = safe_sheet_title(short_title(team), taken)
        sheet = wb.create_sheet(title)
        _team_sheet(sheet, season, team, side_labels)
        _page_header(sheet, season, team)
    stamp = plan_stamp(season).replace(tzinfo=None)
    props = wb.properties
    props.creator = "roundrobin-scheduler"
    props.lastModifiedBy = "roundrobin-scheduler"
    props.title = user_text(f"{season.league} {season.season_id}")
    props.created = stamp
    props.modified = stamp
    plain_text_cells(wb)
    return wb


def workbook_bytes(
    season: Season,
    fairness: FairnessReport | None = None,
    *,
    side_labels: tuple[str, str] = ("H", "A"),
) -> bytes:
    """The .xlsx file as bytes; the same season and figures always give the same bytes.

    Parameters
    ----------
    season
        The season.
    fairness
        Its fairness figures, or ``None``.
    side_labels
        Labels of the two sides in the grid.

    Returns
    -------
    bytes
        The workbook (a zip archive, ECMA-376).

    Examples
    --------
    >>> from scheduler.season import Fixture, Season
    >>> season = Season("Demo", "2031", ("Ash", "Elm"), (Fixture(1, "Ash", "Elm"),))
    >>> workbook_bytes(season) == workbook_bytes(season)
    True
    """
    return stable_workbook_bytes(build_workbook(season, fairness, side_labels=side_labels))


def stable_workbook_bytes(wb: Workbook) -> bytes:
    """Any openpyxl workbook as .xlsx bytes with every zip member stamped with one fixed time,
    so that equal workbooks give equal bytes (the document properties' dates are the caller's).

    Parameters
    ----------
    wb
        The workbook.

    Returns
    -------
    bytes
        The .xlsx file.
    """
    buffer = io.BytesIO()
    archive = _FixedTimeZip(buffer, "w", zipfile.ZIP_DEFLATED, allowZip64=True)
    ExcelWriter(wb, archive).save()
    return buffer.getvalue()


def write_workbook(
    season: Season,
    fairness: FairnessReport | None,
    path: str | os.PathLike[str],
    *,
    side_labels: tuple[str, str] = ("H", "A"),
) -> Path:
    """Write the workbook to ``path`` atomically; returns the path.

    Parameters
    ----------
    season
        The season to write.
    fairness
        Its fairness figures for the ``Fairness`` sheet (``None``: no such sheet).
    path
        The ``.xlsx`` file to write.
    side_labels
        Labels of the two sides in the grid.

    Returns
    -------
    Path
        ``path``.

    Raises
    ------
    OSError
        When the file cannot be written (a file already at ``path`` is left untouched).

    References
    ----------
    ECMA-376 (Office Open XML); ``docs/outputs.md``.

    Examples
    --------
    >>> import tempfile
    >>> from openpyxl import load_workbook
    >>> from scheduler.season import Fixture, Season
    >>> season = Season("Demo", "2031", ("Ash", "Elm"), (Fixture(1, "Ash", "Elm"),))
    >>> path = write_workbook(season, None, Path(tempfile.mkdtemp()) / "season.xlsx")
    >>> [cell.value for cell in load_workbook(path)["Fixtures"][2]][:6]
    [1, 1, None, None, 'Ash', 'Elm']
    """
    return atomic_write_bytes(path, workbook_bytes(season, fairness, side_labels=side_labels))
