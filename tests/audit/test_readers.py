"""Schedule readers: CSV (RFC 4180; encodings per the Unicode BOM conventions and Windows-1252),
xlsx written by openpyxl in the test, season.json; bad inputs raise located InputErrors.

Header synonyms and value formats are the project's own choice (common practice in league
spreadsheets).
"""

from __future__ import annotations

from datetime import date, datetime, time
from zoneinfo import ZoneInfo

import openpyxl
import pytest

from scheduler.audit import limits
from scheduler.audit.readers import read_schedule, read_schedule_with_rows
from scheduler.errors import InputError
from scheduler.export.season_json import dumps_season
from tests.fairness.constructions import canonical_rounds, double_round_robin

NAMES = ["Harbour Town", "Mill Lane", "Oak Vale", "Riverside", "Stone Cross", "Westfield"]


def _games(n=6, scheme=None):
    rounds = canonical_rounds(n)
    if scheme:
        rounds = double_round_robin(rounds, scheme)
    return [(r + 1, NAMES[h - 1], NAMES[a - 1]) for r, games in enumerate(rounds)
            for h, a in games]


def test_csv_semicolons_synonyms_and_utf8_bom(tmp_path):
    lines = ["Matchday;Date;Kick-off;Host;Visitor;Ground;Pitch"]
    for r, h, a in _games():
        lines.append(f"{r};{date(2030, 5, r).strftime('%d.%m.%Y')};19:30;{h};{a};Pier Park;P2")
    path = tmp_path / "fixtures.csv"
    path.write_bytes(("\r\n".join(lines) + "\r\n").encode("utf-8-sig"))
    got = read_schedule_with_rows(path)
    season = got.season
    assert got.delimiter == ";" and got.encoding == "utf-8-sig"
    assert dict(got.columns)["home"] == "Host" and dict(got.columns)["round"] == "Matchday"
    assert len(season.fixtures) == 15 and season.teams[0] == "Westfield"  # first named
    first = season.fixtures[0]
    assert first.round == 1 and first.date == date(2030, 5, 1)
    assert first.venue == "Pier Park" and first.court == "P2"
    assert first.slot == "19:30" and first.start is None  # no time zone given
    assert got.rows[:3] == (2, 3, 4)
    assert season.legs == 1


def test_cp1252_file_with_tabs(tmp_path):
    names = ["Élan Rovers", "Größe Mühle", "Château Vert", "Ñandú FC"]
    rounds = canonical_rounds(4)
    lines = ["Round\tHome Team\tAway Team"]
    lines += [f"{r + 1}\t{names[h - 1]}\t{names[a - 1]}" for r, g in enumerate(rounds)
              for h, a in g]
    path = tmp_path / "liga.csv"
    path.write_bytes("\n".join(lines).encode("cp1252"))
    got = read_schedule_with_rows(path)
    assert got.encoding == "cp1252" and got.delimiter == "\t"
    assert set(got.season.teams) == set(names)
    assert any("cp1252" in note for note in got.notes)


def test_utf16_with_bom_and_quoted_commas(tmp_path):
    lines = ['"Rd","Home","Away","Venue"']
    lines += [f'{r},"{h}","{a}","Hall, North Wing"' for r, h, a in _games()]
    path = tmp_path / "u16.csv"
    path.write_bytes("\n".join(lines).encode("utf-16"))
    season = read_schedule(path)
    assert len(season.fixtures) == 15
    assert season.fixtures[0].venue == "Hall, North Wing"


def test_rounds_derived_from_dates_and_legs_inferred(tmp_path):
    lines = ["Date,Time,Home,Away"]
    for r, h, a in _games(scheme="mirrored"):
        lines.append(f"2030-0{1 + (r - 1) // 5}-{1 + 5 * ((r - 1) % 5):02d},18:00,{h},{a}")
    path = tmp_path / "drr.csv"
    path.write_text("\n".join(lines), encoding="utf-8")
    got = read_schedule_with_rows(path, timezone="Europe/Dublin")
    season = got.season
    assert season.rounds == 10 and season.legs == 2
    assert {f.leg for f in season.fixtures if f.round > 5} == {2}
    assert any("derived from the dates" in note for note in got.notes)
    start = season.fixtures[0].start
    assert start == datetime(2030, 1, 1, 18, 0, tzinfo=ZoneInfo("Europe/Dublin"))


def test_title_rows_byes_match_column_and_iso_starts(tmp_path):
    text = (
        "Spring Ladder 2030\n"
        "\n"
        "Week,Match,Start\n"
        "1,Oak Vale v Mill Lane,2030-04-01T19:00:00+02:00\n"
        "1,Harbour Town vs Riverside,2030-04-01T20:00:00+02:00\n"
        "1,Stone Cross v Bye,\n"
        "2,Mill Lane - Harbour Town,2030-04-08T19:00:00+02:00\n"
    )
    path = tmp_path / "ladder.csv"
    path.write_text(text, encoding="utf-8")
    got = read_schedule_with_rows(path)
    season = got.season
    assert [(f.home, f.away) for f in season.fixtures] == [
        ("Oak Vale", "Mill Lane"), ("Harbour Town", "Riverside"), ("Mill Lane", "Harbour Town")]
    assert got.rows == (4, 5, 7)
    assert season.byes == {1: ("Stone Cross",)}
    assert season.fixtures[0].start.utcoffset().total_seconds() == 7200


def test_xlsx_second_sheet_with_real_dates(tmp_path):
    book = openpyxl.Workbook()
    notes = book.active
    notes.title = "Read me"
    notes.append(["Invented league for tests"])
    sheet = book.create_sheet("Fixtures")
    sheet.append(["Lake District Winter League"])
    sheet.append(["Game Day", "Date", "KO", "Home", "Guest", "Field", "Court"])
    for r, h, a in _games():
        sheet.append([r, datetime(2030, 11, r), time(10, 30), h, a, "Fell Park", "C1"])
    path = tmp_path / "league.xlsx"
    book.save(path)
    got = read_schedule_with_rows(path, timezone="Europe/London")
    assert got.sheet == "Fixtures" and got.kind == "xlsx"
    assert got.rows[0] == 3 and got.rows[-1] == 17
    f = got.season.fixtures[0]
    assert (f.round, f.home, f.venue, f.court, f.date) == (1, "Westfield", "Fell Park", "C1",
                                                          date(2030, 11, 1))
    assert f.start == datetime(2030, 11, 1, 10, 30, tzinfo=ZoneInfo("Europe/London"))


def test_season_json_through_read_schedule(tmp_path):
    lines = ["round,home,away"] + [f"{r},{h},{a}" for r, h, a in _games()]
    csv_path = tmp_path / "a.csv"
    csv_path.write_text("\n".join(lines), encoding="utf-8")
    season = read_schedule(csv_path)
    json_path = tmp_path / "a.json"
    json_path.write_text(dumps_season(season, None), encoding="utf-8")
    got = read_schedule_with_rows(json_path)
    assert got.season == season and got.kind == "season.json"
    assert set(got.rows) == {None}


# ------------------------------------------------------------------------------ bad input


def _write(tmp_path, name, data):
    path = tmp_path / name
    if isinstance(data, str):
        path.write_text(data, encoding="utf-8")
    else:
        path.write_bytes(data)
    return path


@pytest.mark.parametrize(
    "name,data,phrase,where",
    [
        ("empty.csv", b"", "empty", "empty.csv"),
        ("blank.csv", "\n\n  \n", "empty", "blank.csv"),
        ("nohead.csv", "1,2,3\n4,5,6\n", "no header row", "nohead.csv"),
        ("cols.csv", "Home,Away\nOak Vale,Mill Lane\n", "no round column", "row 1"),
        ("round.csv", "Round,Home,Away\n1,Oak Vale,Mill Lane\nsecond,A,B\n",
         "must be a number", "row 3, column 'Round'"),
        ("date.csv", "Round,Date,Home,Away\n1,someday,Oak Vale,Mill Lane\n", "not a date",
         "row 2, column 'Date'"),
        ("time.csv", "Round,Time,Home,Away\n1,late,Oak Vale,Mill Lane\n", "not a time",
         "row 2, column 'Time'"),
        ("binary.csv", bytes(range(256)) * 4, "cannot read the file as text", "binary.csv"),
        ("head.csv", "Round,Home,Away\n", "no games", "head.csv"),
        ("fake.xlsx", b"this is not a zip", "xlsx", "fake.xlsx"),
        ("old.xls", b"\xd0\xcf\x11\xe0", ".xls", "old.xls"),
        ("bad.json", "{\"format\": 3}", "not a season file", "format"),
        ("split.csv", "Round,Match\n1,Oak Vale and Mill Lane\n", "cannot split", "row 2"),
        ("huge.csv", "Round,Home,Away\n1,A,B\n20300301,B,A\n", "not a plausible round",
         "row 3, column 'Round'"),
    ],
)
def test_bad_inputs_raise_located_errors(tmp_path, name, data, phrase, where):
    path = _write(tmp_path, name, data)
    with pytest.raises(InputError) as info:
        read_schedule(path)
    assert phrase in str(info.value)
    assert where in str(info.value)
    assert info.value.location and name in info.value.location


def test_missing_file(tmp_path):
    with pytest.raises(InputError, match="not found"):
        read_schedule(tmp_path / "nowhere.csv")


def test_file_too_big_is_refused_before_reading(tmp_path, monkeypatch):
    path = _write(tmp_path, "big.csv", "Round,Home,Away\n" + "1,A,B\n" * 100)
    monkeypatch.setattr(limits, "MAX_FILE_BYTES", 64)
    monkeypatch.setattr(type(path), "read_bytes", lambda self: pytest.fail("file was read"))
    with pytest.raises(InputError) as info:
        read_schedule(path)
    assert "64 bytes" in str(info.value) and "big.csv" in info.value.location
    assert limits.MAX_FILE_BYTES == 64 and "100 MB" not in str(info.value)


def test_default_limit_is_100_mb():
    assert limits.MAX_FILE_BYTES == 100 * 1024 * 1024


def test_xlsx_without_a_usable_sheet(tmp_path):
    book = openpyxl.Workbook()
    book.active.append(["Name", "Score"])
    path = tmp_path / "scores.xlsx"
    book.save(path)
    with pytest.raises(InputError) as info:
        read_schedule(path)
    assert "no header row" in str(info.value) and "'Sheet'" in str(info.value)


def test_slash_dates_month_first_when_needed(tmp_path):
    """Slash dates are day first unless a value only makes sense month first (03/25/2030)."""
    text = (
        "Round,Date,Home,Away\n1,03/25/2030,Oak Vale,Mill Lane\n"
        "2,04/01/2030,Mill Lane,Oak Vale\n"
    )
    path = _write(tmp_path, "us.csv", text)
    days = [f.date for f in read_schedule(path).fixtures]
    assert days == [date(2030, 3, 25), date(2030, 4, 1)]
    text = "Round,Date,Home,Away\n1,05/04/2030,Oak Vale,Mill Lane\n"
    assert read_schedule(_write(tmp_path, "eu.csv", text)).fixtures[0].date == date(2030, 4, 5)
