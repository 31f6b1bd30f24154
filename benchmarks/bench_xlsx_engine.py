"""Benchmark of the xlsx engines the audit could read workbooks with: calamine against openpyxl.

Writes a schedule workbook with openpyxl (a single round robin of ``teams`` teams by the circle
method; default 200 teams, 19 900 rows of round, date, time, home, away, venue), then reads its
cells back with

* openpyxl in read-only mode, values only (the reference: the audit's engine before);
* pandas ``read_excel(engine="openpyxl")``;
* python-calamine directly (``CalamineWorkbook``), and pandas ``read_excel(engine="calamine")``.

Every reader must give the same cells (checked: the team names and dates of every row). Prints
the best of ``repeats`` times for each and the ratio to openpyxl read-only.

Run: ``python benchmarks/bench_xlsx_engine.py [teams] [repeats]``.
"""

from __future__ import annotations

import sys
import tempfile
import time
from datetime import date, datetime, timedelta
from pathlib import Path

import openpyxl
import pandas as pd
from python_calamine import CalamineWorkbook


def circle_rows(teams: int) -> list[list[object]]:
    """Rows (round, date, time, home, away, venue) of the circle method's single round robin."""
    n = teams if teams % 2 == 0 else teams + 1
    rows: list[list[object]] = []
    first = date(2031, 3, 1)
    for rnd in range(n - 1):
        circle = [n - 1] + [(rnd + k) % (n - 1) for k in range(n - 1)]
        for k in range(n // 2):
            home, away = circle[k], circle[n - 1 - k]
            if home >= teams or away >= teams:
                continue
            rows.append([rnd + 1, first + timedelta(days=7 * rnd), "19:30",
                         f"Club {home:04d}", f"Club {away:04d}", f"Ground {home:04d}"])
    return rows


def write_book(path: Path, rows: list[list[object]]) -> None:
    book = openpyxl.Workbook()
    sheet = book.active
    sheet.append(["Round", "Date", "Time", "Home", "Away", "Venue"])
    for row in rows:
        sheet.append(row)
    book.save(path)


def read_openpyxl(path: Path) -> list[tuple]:
    book = openpyxl.load_workbook(path, read_only=True, data_only=True)
    try:
        return [tuple(r) for r in book.active.iter_rows(values_only=True)]
    finally:
        book.close()


def read_calamine(path: Path) -> list[tuple]:
    book = CalamineWorkbook.from_path(str(path))
    return [tuple(r) for r in book.get_sheet_by_index(0).to_python(skip_empty_area=False)]


def read_pandas(engine: str):
    def run(path: Path) -> list[tuple]:
        frame = pd.read_excel(path, sheet_name=0, header=None, dtype=object, engine=engine)
        return [tuple(r) for r in frame.itertuples(index=False, name=None)]
    return run


def _day(value: object) -> date:
    return value.date() if isinstance(value, datetime) else value  # type: ignore[return-value]


def best_of(fn, path: Path, repeats: int) -> tuple[float, list[tuple]]:
    best, out = float("inf"), []
    for _ in range(repeats):
        t0 = time.perf_counter()
        out = fn(path)
        best = min(best, time.perf_counter() - t0)
    return best, out


def main() -> None:
    teams = int(sys.argv[1]) if len(sys.argv) > 1 else 200
    repeats = int(sys.argv[2]) if len(sys.argv) > 2 else 3
    rows = circle_rows(teams)
    with tempfile.TemporaryDirectory() as folder:
        path = Path(folder) / "schedule.xlsx"
        write_book(path, rows)
        print(f"{teams} teams, {len(rows)} rows, {path.stat().st_size / 1e6:.2f} MB")
        readers = {
            "openpyxl read-only": read_openpyxl,
            "pandas + openpyxl": read_pandas("openpyxl"),
            "python-calamine": read_calamine,
            "pandas + calamine": read_pandas("calamine"),
        }
        reference = None
        for name, fn in readers.items():
            seconds, got = best_of(fn, path, repeats)
            body = [(r[3], r[4], _day(r[1])) for r in got[1:]]
            assert body == [(r[3], r[4], r[1]) for r in rows], f"{name} read other cells"
            reference = reference or seconds
            ratio = seconds / reference
            print(f"{name:20s} {seconds:7.3f} s   ratio to openpyxl read-only {ratio:5.2f}")


if __name__ == "__main__":
    main()
