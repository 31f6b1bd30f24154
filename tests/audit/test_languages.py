"""Schedules written by organizers in German, French, Spanish, Italian, Dutch and Portuguese, and
columns named by hand.

Each language gets a small invented schedule (a 4-team single round robin of the circle method)
with the header words its organizers write and day-first dates; the dates the audit reads are
checked against pandas (``to_datetime(..., dayfirst=True)``) and :func:`datetime.strptime`, two
parsers this project did not write. The header words themselves are the project's choice
(common practice; translations from memory, see ``docs/audit-input.md``).
"""

from __future__ import annotations

from datetime import date, datetime

import openpyxl
import pandas as pd
import pytest
from typer.testing import CliRunner

from scheduler.audit import audit_file, parse_column_names, read_schedule_with_rows
from scheduler.audit.headers import (
    FIELDS,
    HEADER_LOOKUP,
    LANGUAGES,
    VOCABULARY,
    normalise_header,
)
from scheduler.cli import app
from scheduler.errors import InputError

CLUBS = ["Aschental", "Birkenmoor", "Colmsee", "Dornfeld"]
ROUNDS = [
    [(0, 3), (1, 2)],
    [(3, 2), (0, 1)],
    [(1, 3), (2, 0)],
]
"""Circle method for 4 teams: every pair meets exactly once in 3 rounds."""

DAYS = ["01.03.2031", "08.03.2031", "15.03.2031"]

SCHEDULES = {
    "de": ("Spieltag;Datum;Uhrzeit;Heim;Gast;Spielort", ";", "%d.%m.%Y"),
    "fr": ("Journée;Date;Heure;Domicile;Extérieur;Lieu", ";", "%d/%m/%Y"),
    "es": ("Jornada;Fecha;Hora;Local;Visitante;Estadio", ";", "%d/%m/%Y"),
    "it": ("Giornata;Data;Ora;Casa;Ospite;Impianto", ";", "%d/%m/%Y"),
    "nl": ("Speelronde,Datum,Aanvang,Thuis,Uit,Sporthal", ",", "%d-%m-%Y"),
    "pt": ("Rodada;Data;Horário;Mandante;Visitantes;Estádio", ";", "%d/%m/%Y"),
}
"""Language -> (header row, delimiter, how that schedule writes its dates)."""


def _write(folder, language: str, encoding: str = "utf-8"):
    header, sep, fmt = SCHEDULES[language]
    lines = [header]
    for number, games in enumerate(ROUNDS, start=1):
        day = datetime.strptime(DAYS[number - 1], "%d.%m.%Y").strftime(fmt)
        for home, away in games:
            lines.append(sep.join([str(number), day, "19:30", CLUBS[home], CLUBS[away],
                                   f"Halle {CLUBS[home]}"]))
    path = folder / f"{language}.csv"
    path.write_bytes(("\n".join(lines) + "\n").encode(encoding))
    return path, [line.split(sep) for line in lines[1:]], fmt


@pytest.mark.parametrize("language", sorted(SCHEDULES))
def test_each_language_reads_with_day_first_dates(tmp_path, language):
    path, rows, fmt = _write(tmp_path, language)
    got = read_schedule_with_rows(path)
    season = got.season
    assert [(f.round, f.home, f.away) for f in season.fixtures] == [
        (int(r[0]), r[3], r[4]) for r in rows
    ]
    written = [r[1] for r in rows]
    # Outside checks: pandas (day first) and the standard library agree with the audit.
    by_pandas = [d.date() for d in pd.to_datetime(pd.Series(written), dayfirst=True,
                                                  format=fmt)]
    by_strptime = [datetime.strptime(text, fmt).date() for text in written]
    assert [f.date for f in season.fixtures] == by_pandas == by_strptime
    assert season.fixtures[0].date == date(2031, 3, 1)  # 1 March, not 3 January
    assert season.fixtures[0].venue == "Halle Aschental" and season.fixtures[0].slot == "19:30"
    assert f"headers read as {LANGUAGES[language]}" in got.notes
    assert audit_file(path).valid


def test_german_export_from_the_issue_with_cp1252_and_umlauts(tmp_path):
    text = "Spieltag;Datum;Uhrzeit;Heim;Gast\n"
    text += "1;01.03.2031;15:00;Grün-Weiß Mühlbach;Eintracht Öde\n"
    text += "2;08.03.2031;15:00;Eintracht Öde;Grün-Weiß Mühlbach\n"
    path = tmp_path / "spielplan.csv"
    path.write_bytes(text.encode("cp1252"))
    got = read_schedule_with_rows(path)
    assert got.encoding == "cp1252" and got.delimiter == ";"
    assert [f.date for f in got.season.fixtures] == [date(2031, 3, 1), date(2031, 3, 8)]
    assert got.season.fixtures[0].home == "Grün-Weiß Mühlbach"
    assert dict(got.columns) == {"round": "Spieltag", "date": "Datum", "time": "Uhrzeit",
                                 "home": "Heim", "away": "Gast"}


def test_xlsx_with_french_headers_and_real_dates(tmp_path):
    book = openpyxl.Workbook()
    sheet = book.active
    sheet.append(["Calendrier du championnat"])
    sheet.append(["Journée", "Date", "Domicile", "Extérieur"])
    for number, games in enumerate(ROUNDS, start=1):
        for home, away in games:
            sheet.append([number, date(2031, 3, 7 * number - 6), CLUBS[home], CLUBS[away]])
    path = tmp_path / "calendrier.xlsx"
    book.save(path)
    got = read_schedule_with_rows(path)
    assert got.rows[0] == 3
    # Read back with openpyxl (not the audit's engine) for the outside check.
    check = openpyxl.load_workbook(path, read_only=True)
    cells = [r for r in check.active.iter_rows(min_row=3, values_only=True)]
    assert [f.date for f in got.season.fixtures] == [c[1].date() for c in cells]
    assert [f.home for f in got.season.fixtures] == [c[2] for c in cells]


def test_every_word_means_one_field_and_every_language_names_the_sides():
    seen: dict[str, str] = {}
    for language, fields in VOCABULARY.items():
        assert set(fields) <= set(FIELDS) and language in LANGUAGES
        assert fields.get("home") and fields.get("away"), language
        for field, words in fields.items():
            for word in words:
                key = normalise_header(word)
                assert seen.setdefault(key, field) == field, (word, language)
                assert HEADER_LOOKUP[key][0] == field
    assert set(LANGUAGES) >= {"de", "fr", "es", "it", "nl", "pt"}


def test_columns_named_by_hand(tmp_path):
    # Headers outside the vocabulary (Frisian-like invented words).
    text = "Omgong|Dei|Thúsploech|Gastploech\n"
    text += "1|2031-03-01|Aschental|Birkenmoor\n2|2031-03-08|Birkenmoor|Aschental\n"
    path = tmp_path / "eigen.csv"
    path.write_text(text, encoding="utf-8")
    with pytest.raises(InputError, match="--columns"):
        read_schedule_with_rows(path)
    named = parse_column_names("round=Omgong, date=Dei, home=Thúsploech, away=Gastploech")
    got = read_schedule_with_rows(path, columns=named)
    assert got.delimiter == "|"
    assert [(f.round, f.home, f.date) for f in got.season.fixtures] == [
        (1, "Aschental", date(2031, 3, 1)), (2, "Birkenmoor", date(2031, 3, 8))]
    assert got.notes[0].startswith("columns named by hand")


def test_named_columns_take_precedence_over_the_vocabulary(tmp_path):
    # "Gast" is German for the away side, but this file means the guest referee.
    text = "Runde,Gastgeber,Besucher,Gast\n1,Aschental,Birkenmoor,R. Umpire\n"
    path = tmp_path / "f.csv"
    path.write_text(text, encoding="utf-8")
    got = read_schedule_with_rows(path, columns={"away": "Besucher"})
    fixture = got.season.fixtures[0]
    assert (fixture.home, fixture.away) == ("Aschental", "Birkenmoor")


@pytest.mark.parametrize("bad", ["home", "home=", "side=Heim", "home=Heim,home=Gast"])
def test_bad_columns_option_is_a_located_error(bad):
    with pytest.raises(InputError) as info:
        parse_column_names(bad)
    assert info.value.location == "--columns"


def test_cli_columns_option_and_exit_codes(tmp_path):
    path = tmp_path / "eigen.csv"
    path.write_text("A;B;C\n1;Aschental;Birkenmoor\n2;Birkenmoor;Aschental\n", encoding="utf-8")
    runner = CliRunner()
    refused = runner.invoke(app, ["audit", str(path)])
    assert refused.exit_code == 2 and "--columns" in refused.output
    ok = runner.invoke(app, ["audit", str(path), "--columns", "round=A,home=B,away=C", "--json"])
    assert ok.exit_code == 0, ok.output
    bad = runner.invoke(app, ["audit", str(path), "--columns", "home"])
    assert bad.exit_code == 2 and "--columns" in bad.output


def test_xlsx_rows_keep_their_spreadsheet_numbers_with_blank_rows_and_columns(tmp_path):
    book = openpyxl.Workbook()
    sheet = book.active
    sheet["C3"], sheet["D3"], sheet["E3"] = "Runde", "Heim", "Gast"
    sheet["C4"], sheet["D4"], sheet["E4"] = 1, "Aschental", "Birkenmoor"
    sheet["C6"], sheet["D6"], sheet["E6"] = 2, "Birkenmoor", "Aschental"
    path = tmp_path / "versetzt.xlsx"
    book.save(path)
    got = read_schedule_with_rows(path)
    # The reference: openpyxl's own row numbers of the cells holding the home teams.
    check = openpyxl.load_workbook(path)
    rows = [cell.row for cell in check.active["D"] if cell.value in ("Aschental", "Birkenmoor")]
    assert got.rows == tuple(rows) == (4, 6)
