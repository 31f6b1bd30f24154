"""CSV and workbook exports read back by independent readers (csv module, pandas, openpyxl).

Checks: RFC 4180 (Shafranovich 2005) CSV shape; ECMA-376 workbook read back by openpyxl and by
pandas (read_excel, openpyxl engine); formula injection neutralised (OWASP "CSV Injection",
common practice); identical bytes for the same season.
"""

from __future__ import annotations

import csv
import io
import re
import zipfile
from datetime import date, datetime, time

import openpyxl
import pandas as pd
import pytest
from hypothesis import example, given, settings
from hypothesis import strategies as st

from scheduler.export.csv_out import CSV_COLUMNS, fixtures_csv
from scheduler.export.safety import restore_cell
from scheduler.export.xlsx import workbook_bytes, write_workbook
from tests.export.samples import AT_SUM, FORMULA, TRICKY, make_season

TRIGGERS = ("=", "+", "-", "@", "\t", "\r")


@pytest.fixture(scope="module")
def season():
    return make_season(("Ashford Rovers", TRICKY, FORMULA, "Dunmore Town", AT_SUM, "-Minus"))


def expected(season):
    """(round, leg, date, time, home, away, venue, court, slot) straight from the Season."""
    return sorted(
        (f.round, f.leg, f.date, f.start.time().replace(tzinfo=None), f.home, f.away, f.venue,
         f.court, f.slot)
        for f in season.fixtures
    )  # fmt: skip


def test_csv_reads_back_with_csv_module(season):
    text = fixtures_csv(season)
    # RFC 4180 §2: CRLF record ends (embedded newlines only inside quoted fields).
    assert text.endswith("\r\n")
    rows = list(csv.reader(io.StringIO(text, newline="")))
    assert tuple(rows[0]) == CSV_COLUMNS
    got = sorted(
        (int(r[0]), int(r[1]), date.fromisoformat(r[2]), time.fromisoformat(r[3]),
         *(restore_cell(c) for c in r[4:]))
        for r in rows[1:]
    )  # fmt: skip
    assert got == expected(season)
    # The tricky name survives quoting exactly (comma, quotes, semicolon, real newline).
    assert any(r[4] == TRICKY or r[5] == TRICKY for r in rows[1:])


def test_csv_reads_back_with_pandas(season):
    frame = pd.read_csv(io.StringIO(fixtures_csv(season)), dtype=str, keep_default_na=False)
    assert list(frame.columns) == list(CSV_COLUMNS)
    assert len(frame) == len(season.fixtures)
    homes = sorted(restore_cell(h) for h in frame["home"])
    assert homes == sorted(f.home for f in season.fixtures)


def test_csv_cells_are_inert(season):
    rows = list(csv.reader(io.StringIO(fixtures_csv(season), newline="")))
    for row in rows:
        for cell in row:
            assert not cell.startswith(TRIGGERS), cell


def test_csv_is_deterministic(season):
    again = make_season(season.teams)
    assert fixtures_csv(season).encode() == fixtures_csv(again).encode()


@pytest.fixture(scope="module")
def xlsx_path(season, tmp_path_factory):
    path = tmp_path_factory.mktemp("xlsx") / "fixtures.xlsx"
    write_workbook(season, None, path)
    return path


def test_workbook_reads_back_with_openpyxl(season, xlsx_path):
    wb = openpyxl.load_workbook(xlsx_path)
    ws = wb["Fixtures"]
    header = [c.value for c in ws[1]]
    assert header == ["Round", "Leg", "Date", "Kick-off", "Home", "Away", "Venue", "Court", "Slot"]
    got = []
    for row in ws.iter_rows(min_row=2):
        r, leg, day, kick, *texts = (c.value for c in row)
        # Real date and time cells with number formats, not text.
        assert row[2].is_date and isinstance(day, datetime)
        assert row[2].number_format == "yyyy-mm-dd"
        assert isinstance(kick, time) and row[3].number_format == "hh:mm"
        got.append((r, leg, day.date(), kick, *(restore_cell(t) for t in texts)))
    assert sorted(got) == expected(season)
    assert ws.freeze_panes == "A2"
    assert ws.auto_filter.ref == f"A1:I{len(season.fixtures) + 1}"
    assert ws.page_setup.orientation == "landscape"
    assert ws.print_title_rows == "$1:$1"
    assert ws.sheet_properties.pageSetUpPr.fitToPage


def test_workbook_reads_back_with_pandas(season, xlsx_path):
    frame = pd.read_excel(xlsx_path, sheet_name="Fixtures", engine="openpyxl")
    assert len(frame) == len(season.fixtures)
    assert pd.api.types.is_datetime64_any_dtype(frame["Date"])
    pairs = sorted(
        (restore_cell(h), restore_cell(a))
        for h, a in zip(frame["Home"], frame["Away"], strict=True)
    )
    assert pairs == sorted((f.home, f.away) for f in season.fixtures)
    assert TRICKY in set(frame["Home"]) | set(frame["Away"])


def test_workbook_sheets_grid_and_teams(season, xlsx_path):
    wb = openpyxl.load_workbook(xlsx_path)
    team_sheets = wb.sheetnames[2:]
    assert wb.sheetnames[:2] == ["Fixtures", "Grid"]
    assert len(team_sheets) == len(season.teams)
    assert all(len(t) <= 31 for t in wb.sheetnames)
    assert len({t.lower() for t in wb.sheetnames}) == len(wb.sheetnames)
    grid = wb["Grid"]
    assert grid.max_row == len(season.teams) + 1
    assert grid.max_column == season.rounds + 1
    row_of = {restore_cell(grid.cell(row=r, column=1).value): r for r in range(2, grid.max_row + 1)}
    assert set(row_of) == set(season.teams)
    for f in season.fixtures:
        home_cell = restore_cell(grid.cell(row=row_of[f.home], column=f.round + 1).value)
        away_cell = restore_cell(grid.cell(row=row_of[f.away], column=f.round + 1).value)
        # The cell speaks of the row's team: unambiguous about who is at home.
        assert home_cell == f"home v {f.away}"
        assert away_cell == f"away at {f.home}"
    # A team sheet lists that team's games in round order.
    sheet = wb[team_sheets[0]]
    rounds = [c.value for c in sheet["A"][1:]]
    assert rounds == sorted(f.round for f in season.fixtures_of(season.teams[0]))


def test_workbook_byes_shown():
    odd = make_season(("North", "South", "East", "West", "Centre"))
    wb = openpyxl.load_workbook(io.BytesIO(workbook_bytes(odd)))
    grid = wb["Grid"]
    byes = sum(1 for row in grid.iter_rows(min_row=2) for c in row if c.value == "bye")
    assert byes == sum(len(t) for t in odd.byes.values()) == odd.rounds


def test_workbook_cells_are_inert(xlsx_path, season):
    # Formula-like names are stored as typed, in plain string cells (openpyxl data type "s",
    # ECMA-376 inlineStr) with the quotePrefix style; never as formulas, never with a visible
    # apostrophe.
    wb = openpyxl.load_workbook(xlsx_path)
    formula_like = set()
    for ws in wb.worksheets:
        for row in ws.iter_rows():
            for cell in row:
                assert cell.data_type != "f", (ws.title, cell.coordinate)
                if isinstance(cell.value, str) and cell.value.startswith(TRIGGERS):
                    assert cell.data_type == "s" and cell.quotePrefix, (ws.title, cell.value)
                    formula_like.add(cell.value)
                if isinstance(cell.value, str):
                    assert not cell.value.startswith("'"), (ws.title, cell.value)
    assert {FORMULA, AT_SUM, "-Minus"} <= formula_like
    with zipfile.ZipFile(xlsx_path) as archive:
        for name in archive.namelist():
            if name.startswith("xl/worksheets/"):
                assert b"<f>" not in archive.read(name) and b"<f " not in archive.read(name)


def test_workbook_bytes_identical(season):
    # Fixed document properties and zip member times (see xlsx module docstring).
    assert workbook_bytes(season) == workbook_bytes(make_season(season.teams))


def test_fairness_sheet_holds_the_report_figures(season, tmp_path):
    from scheduler.fairness import compute_fairness

    fairness = compute_fairness(season)
    path = tmp_path / "with_fairness.xlsx"
    write_workbook(season, fairness, path)
    wb = openpyxl.load_workbook(path)
    assert wb.sheetnames[:3] == ["Fixtures", "Grid", "Fairness"]
    ws = wb["Fairness"]
    figures = {
        ws.cell(row=r, column=1).value: (ws.cell(row=r, column=2).value,
                                         ws.cell(row=r, column=3).value)
        for r in range(2, ws.max_row + 1)
    }  # fmt: skip
    # One name per figure: the names of scheduler.fairness.names, as in terminal and report.
    from scheduler.fairness.names import figure_name

    assert figures[figure_name("breaks_total")][0] == fairness.breaks_total
    assert f"lower bound {fairness.breaks_lower_bound}" in figures[figure_name("breaks_total")][1]
    assert figures[figure_name("carry_over_value")][0] == fairness.carry_over_value
    assert figures[figure_name("perfect_pairs")][0] == (
        f"{fairness.perfect_pairs} of {fairness.pairs}"
    )
    # Circle-method carry-over is the maximum (Lambrechts et al. 2018): "worst possible".
    assert "worst possible" in figures[figure_name("carry_over_value")][1]
    # The per-team table, read back with pandas, equals the report's team figures.
    top = next(r for r in range(1, ws.max_row + 1) if ws.cell(row=r, column=1).value == "Team")
    frame = pd.read_excel(path, sheet_name="Fairness", skiprows=top - 1, engine="openpyxl")
    frame = frame.dropna(subset=["Team"])
    assert [restore_cell(t) for t in frame["Team"]] == [t.name for t in fairness.team_figures]
    assert list(frame["Breaks"]) == [t.breaks for t in fairness.team_figures]
    assert list(frame["Home"]) == [t.home for t in fairness.team_figures]
    assert list(frame["Pattern"]) == [t.pattern for t in fairness.team_figures]


def test_tricky_name_round_trips_in_team_sheet(season, xlsx_path):
    wb = openpyxl.load_workbook(xlsx_path)
    tricky_sheet = next(ws for ws in wb.worksheets[2:] if ws.title.startswith("Saints"))
    opponents = {restore_cell(c.value) for c in tricky_sheet["F"][1:]}
    assert opponents == set(season.teams) - {TRICKY}
    # Other teams' sheets name the tricky team exactly (newline included).
    assert any(c.value == TRICKY for ws in wb.worksheets[2:] for c in ws["F"][1:])


@settings(max_examples=15, deadline=None)
@given(st.text(st.characters(exclude_categories=("Cs",)), min_size=1, max_size=20))
@example("\r")
@example("=\r\n@x")
@example("'+1")
def test_any_team_name_survives_csv_and_workbook(name):
    # The csv module (RFC 4180 quoting) gives every name back exactly; the workbook too, except
    # for characters XML 1.0 cannot hold (U+FFFD, W3C XML 1.0 §2.2 Char) and CR (becomes LF).
    teams = tuple(dict.fromkeys((name, "North", "South", "East", "West")))[:4]
    if len(teams) < 4:
        return
    season = make_season(teams, legs=1)
    rows = list(csv.reader(io.StringIO(fixtures_csv(season), newline="")))
    assert {restore_cell(c) for r in rows[1:] for c in r[4:6]} == set(teams)
    wb = openpyxl.load_workbook(io.BytesIO(workbook_bytes(season)))
    got = {restore_cell(c.value) for row in wb["Fixtures"].iter_rows(min_row=2) for c in row[4:6]}
    lf = name.replace("\r\n", "\n").replace("\r", "\n")  # XML 1.0 §2.11 line-end handling
    xml_safe = re.sub(r"[\x00-\x08\x0b\x0c\x0e-\x1f]", "\ufffd", lf)
    assert got == (set(teams) - {name}) | {xml_safe}


# --------------------------------------------------------------------------- printing


def test_every_sheet_prints_with_header_footer_and_page_numbers(season):
    # Read back with openpyxl: header/footer codes &P (page) and &N (pages) of ECMA-376
    # §18.3.1.46; "&&" is a literal ampersand.
    from dataclasses import replace

    named = replace(season, league="Marlwick & District League", season_id="2031")
    wb = openpyxl.load_workbook(io.BytesIO(workbook_bytes(named)))
    for ws in wb.worksheets:
        assert ws.oddHeader.left.text == "Marlwick && District League 2031", ws.title
        assert ws.oddFooter.center.text == "Page &P of &N"
        assert ws.oddHeader.right.text, ws.title
        assert ws.page_setup.orientation == "landscape"
    teams = wb.worksheets[2:]
    for ws, team in zip(teams, named.teams, strict=True):
        assert " ".join(ws.oddHeader.right.text.replace("&&", "&").split()) == " ".join(
            team.split()
        )


def test_grid_splits_by_rounds_with_the_team_column_repeated():
    season = make_season(tuple(f"Club {i}" for i in range(10)), legs=2)  # 18 rounds
    wb = openpyxl.load_workbook(io.BytesIO(workbook_bytes(season)))
    grid = wb["Grid"]
    assert grid.print_title_cols == "$A:$A"
    assert grid.print_title_rows == "$1:$1"
    breaks = [b.id for b in grid.col_breaks.brk]
    # A page break after every GRID_ROUNDS_PER_PAGE rounds (column 1 is the team column).
    from scheduler.export.xlsx import GRID_ROUNDS_PER_PAGE

    assert breaks == list(range(1 + GRID_ROUNDS_PER_PAGE, season.rounds + 1, GRID_ROUNDS_PER_PAGE))
    # Manual breaks are ignored under "fit to pages" (common spreadsheet behaviour, from
    # memory), so the Grid is scaled: team column + one page of rounds fit landscape A4
    # (297 mm wide, ISO 216) inside the margins, at 96 pixels per inch.
    from scheduler.export.xlsx import column_pixels

    assert not grid.sheet_properties.pageSetUpPr.fitToPage
    assert grid.page_setup.orientation == "landscape"
    scale = int(grid.page_setup.scale)
    assert 10 <= scale <= 100
    printable = (297 / 25.4 - grid.page_margins.left - grid.page_margins.right) * 96
    team = column_pixels(grid.column_dimensions["A"].width)
    for first in range(2, season.rounds + 2, GRID_ROUNDS_PER_PAGE):
        cols = range(first, min(first + GRID_ROUNDS_PER_PAGE, season.rounds + 2))
        page = team + sum(
            column_pixels(grid.column_dimensions[openpyxl.utils.get_column_letter(c)].width)
            for c in cols
        )
        assert page * scale / 100 <= printable
    widths = [grid.column_dimensions[c].width for c in "BCDEFGHI"]
    assert max(widths) <= 22


def test_long_names_keep_their_distinguishing_end():
    long_a = "Marlwick and District Saturday League Girls A"
    long_b = "Marlwick and District Saturday League Girls B"
    season = make_season((long_a, long_b, "Ashford Rovers", "Brookvale"))
    wb = openpyxl.load_workbook(io.BytesIO(workbook_bytes(season)))
    titles = wb.sheetnames[2:]
    assert all(len(t) <= 31 for t in titles)
    assert any(t.endswith("Girls A") for t in titles)
    assert any(t.endswith("Girls B") for t in titles)


def test_side_leagues_name_the_sides_in_grid_and_team_sheets():
    from dataclasses import replace

    season = replace(make_season(), home_meaning="side", side_labels=("White", "Black"))
    wb = openpyxl.load_workbook(io.BytesIO(workbook_bytes(season)))
    grid = wb["Grid"]
    values = {grid.cell(row=r, column=c).value for r in range(2, grid.max_row + 1)
              for c in range(2, grid.max_column + 1)}  # fmt: skip
    f = season.fixtures[0]
    assert f"White v {f.away}" in values and f"Black v {f.home}" in values
    fixtures = wb["Fixtures"]
    assert (fixtures["E1"].value, fixtures["F1"].value) == ("White", "Black")
    sheet = wb.worksheets[2]
    assert sheet["E1"].value == "Side"
    assert {c.value for c in sheet["E"][1:]} <= {"White", "Black", "bye"}
