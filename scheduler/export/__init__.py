"""Season outputs: CSV, spreadsheet workbook, iCalendar feeds, the HTML report, and the writer
of a whole output folder. One format per module; exporters never compute fairness figures
themselves, they write what ``scheduler.fairness`` measured.

* ``csv_out``: :func:`fixtures_csv` (RFC 4180 text)
* ``xlsx``: :func:`write_workbook` (openpyxl; identical bytes for the same season)
* ``ics``: :func:`league_calendar`, :func:`team_calendar` (RFC 5545, stable UIDs, SEQUENCE)
* ``report``: :func:`render_report` (one self-contained HTML page)
* ``bundle``: :func:`write_season_outputs` (the season folder, replaced as a whole)
* ``manifest``: the list of files the planner wrote, with their SHA-256
* ``safety``: formula-injection defence, safe file names, atomic writes
* ``season_json``: the season file (its reading side is ``scheduler.audit.season_file``)
"""

from scheduler.export.bundle import write_season_outputs
from scheduler.export.csv_out import fixtures_csv
from scheduler.export.ics import CalendarState, league_calendar, plan_calendar, team_calendar
from scheduler.export.report import render_report
from scheduler.export.safety import (
    neutralise_cell,
    restore_cell,
    safe_filename,
)
from scheduler.export.xlsx import write_workbook
from scheduler.files import atomic_write_bytes, atomic_write_text

__all__ = [
    "CalendarState",
    "atomic_write_bytes",
    "atomic_write_text",
    "fixtures_csv",
    "league_calendar",
    "neutralise_cell",
    "plan_calendar",
    "render_report",
    "restore_cell",
    "safe_filename",
    "team_calendar",
    "write_season_outputs",
    "write_workbook",
]
