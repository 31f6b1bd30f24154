"""Formula-like names in the workbook: shown as typed, never evaluated (scheduler.export.xlsx).

Checked from outside with openpyxl (the cell's data type and style as a general-purpose reader
sees them) and, where LibreOffice is installed, with a real spreadsheet program that converts
the workbook to CSV: the converted text must equal the names as typed (no apostrophe, no
computed value). Without LibreOffice that test is skipped, and fails when the ``CI`` environment
variable is set, so that it never passes silently.
"""

from __future__ import annotations

import csv
import io
import os
import shutil
import subprocess

import openpyxl
import pytest

from scheduler.export.csv_out import fixtures_csv
from scheduler.export.xlsx import user_text, workbook_bytes
from tests.export.samples import make_season

NAMES = ("=1+1", "+44 Club", "-Minus", "@SUM(1)", "'=quoted", "Plain Town")


@pytest.fixture(scope="module")
def season():
    return make_season(NAMES)


def test_names_are_string_cells_as_typed(season):
    wb = openpyxl.load_workbook(io.BytesIO(workbook_bytes(season)))
    cells = [c for row in wb["Fixtures"].iter_rows(min_row=2) for c in row[4:6]]
    shown = {c.value for c in cells}
    # "'=quoted" starts like a neutralised cell, so it keeps one more apostrophe (reversible).
    assert shown == {user_text(name) for name in NAMES}
    assert shown - {"''=quoted"} == set(NAMES) - {"'=quoted"}
    for cell in cells:
        assert cell.data_type == "s", (cell.coordinate, cell.value)
        if cell.value[0] in "=+-@":
            assert cell.quotePrefix


def test_audit_of_the_workbook_gives_the_names_back(season, tmp_path):
    from scheduler.audit import audit_file

    path = tmp_path / "fixtures.xlsx"
    path.write_bytes(workbook_bytes(season))
    result = audit_file(path, timezone="Europe/Brussels")
    assert result.valid, result.problems
    assert set(result.season.teams) == set(NAMES)


def test_csv_keeps_the_apostrophe_defence(season):
    # CSV has no cell types: the OWASP "CSV Injection" apostrophe stays (README, Outputs).
    rows = list(csv.reader(io.StringIO(fixtures_csv(season))))
    homes = {row[4] for row in rows[1:]} | {row[5] for row in rows[1:]}
    assert "'=1+1" in homes and "'@SUM(1)" in homes and "Plain Town" in homes


def test_libreoffice_shows_the_names_as_typed(season, tmp_path):
    soffice = shutil.which("soffice") or shutil.which("libreoffice")
    if soffice is None:
        if os.environ.get("CI"):
            pytest.fail("LibreOffice (soffice) is needed for this test in CI")
        pytest.skip("LibreOffice (soffice) is not installed")
    book = tmp_path / "fixtures.xlsx"
    book.write_bytes(workbook_bytes(season))
    subprocess.run(
        [soffice, f"-env:UserInstallation=file://{tmp_path / 'profile'}", "--headless",
         "--convert-to", "csv", "--outdir", str(tmp_path), str(book)],
        check=True, capture_output=True, timeout=120,
    )  # fmt: skip
    text = (tmp_path / "fixtures.csv").read_text(encoding="utf-8", errors="replace")
    rows = list(csv.reader(io.StringIO(text)))
    names = {row[4] for row in rows[1:]} | {row[5] for row in rows[1:]}
    assert set(NAMES) - {"'=quoted"} <= names  # as typed: not "2", not "'=1+1"
