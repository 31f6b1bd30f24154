"""Team lists from spreadsheets: xlsx written by openpyxl and CSV written by the csv module
(neither is our writer) become league or federation files that the project's loaders accept;
bad sheets get problems located by sheet, row and column, exit 2 and no file."""

from __future__ import annotations

import csv
import datetime as dt
import tomllib

import pytest
from openpyxl import Workbook
from typer.testing import CliRunner

from scheduler.cli import app
from scheduler.config.federation import parse_federation
from scheduler.config.loader import load_league
from scheduler.config.teamlist import build_from_team_list, read_team_list
from scheduler.errors import ConfigError

runner = CliRunner()
HEADER = ["Team", "Short code", "Division", "Home ground", "Unavailable"]
ROWS = [
    ["Oxlow", "OXL", "North", "Oxlow Ground", dt.datetime(2027, 10, 16)],
    ["Pimbury", "PIM", "North", "Pimbury Ground", None],
    ["Quenby", "QUE", "North", "Quenby Ground", "2027-12-18..2028-01-02; 2027-11-06"],
    ["Rushmere", "RUS", "North", "Rushmere Ground", None],
    ["Oxlow Reserves", "OXR", "Reserves", "Oxlow Ground", None],
    ["Pimbury Reserves", "PIR", "Reserves", "Pimbury Ground", None],
    ["Quenby Reserves", "QUR", "Reserves", "Quenby Ground", None],
    ["Ulverdown Reserves", "ULR", "Reserves", "Ulverdown Ground", None],
]


def _xlsx(path, header, rows, title="Teams"):
    wb = Workbook()
    ws = wb.active
    ws.title = "Notes"
    ws.append(["not the team list"])
    teams = wb.create_sheet(title)
    teams.append(header)
    for row in rows:
        teams.append(row)
    wb.save(path)
    return path


def test_xlsx_with_two_divisions_becomes_a_federation(tmp_path):
    text = build_from_team_list(_xlsx(tmp_path / "teams.xlsx", HEADER, ROWS))
    fed = parse_federation(tomllib.loads(text))
    assert fed.division_names == ("North", "Reserves")
    north = fed.division("North").league
    assert north.team("Oxlow").code == "OXL"
    assert north.team("Quenby").home_venue == "Quenby Ground"
    quenby = {d for td in north.rules.unavailable if td.team == "Quenby" for d in td.dates}
    assert dt.date(2027, 11, 6) in quenby and dt.date(2027, 12, 25) in quenby


def test_csv_with_one_division_becomes_a_league(tmp_path):
    path = tmp_path / "teams.csv"
    with path.open("w", newline="", encoding="utf-8") as handle:
        writer = csv.writer(handle)
        writer.writerow(["team name", "CODE", "Home Venue"])
        writer.writerow(["Oxlow", "OXL", "Oxlow Ground"])
        writer.writerow(["Pimbury", "PIM", "Pimbury Ground"])
        writer.writerow(["Quenby", "", "Quenby Ground"])
    out = tmp_path / "league.toml"
    result = runner.invoke(app, ["new", str(out), "--teams", str(path)])
    assert result.exit_code == 0, result.output
    league = load_league(out)
    assert league.team_names == ("Oxlow", "Pimbury", "Quenby")
    assert league.team("Pimbury").code == "PIM"


def test_located_problems_with_did_you_mean(tmp_path):
    header = ["Team", "Code", "Divison", "Home ground"]
    path = _xlsx(tmp_path / "bad.xlsx", header, ROWS[:2])
    result = runner.invoke(app, ["new", str(tmp_path / "x.toml"), "--teams", str(path)])
    assert result.exit_code == 2
    assert "sheet 'Teams', row 1, column C: unknown column 'Divison'; did you mean 'division'?" \
        in result.output
    assert not (tmp_path / "x.toml").exists()


def test_row_problems_name_row_and_column(tmp_path):
    rows = [list(r) for r in ROWS]
    rows[1][0] = None                    # row 3: no team name
    rows[2][4] = "2027-13-01"            # row 4: not a date
    rows[3][1] = "OXL"                   # row 5: code of row 2 again
    path = _xlsx(tmp_path / "rows.xlsx", HEADER, rows)
    with pytest.raises(ConfigError) as info:
        read_team_list(path)
    text = str(info.value)
    assert "sheet 'Teams', row 3, column A (team): the team name is missing" in text
    assert "sheet 'Teams', row 4, column E (unavailable): '2027-13-01' is not a date" in text
    assert "sheet 'Teams', row 5, column B (code): the code 'OXL' is already used in row 2" \
        in text


def test_generated_file_problem_points_back_to_the_sheet(tmp_path):
    rows = [list(r) for r in ROWS]
    rows[1][3] = None  # Pimbury hosts at home grounds like its division but has none
    path = _xlsx(tmp_path / "teams.xlsx", HEADER, rows)
    result = runner.invoke(app, ["new", str(tmp_path / "x.toml"), "--teams", str(path)])
    assert result.exit_code == 2
    assert "sheet 'Teams', row 3 (home ground)" in result.output
    assert not (tmp_path / "x.toml").exists()
