"""The CSV reader against a plain pandas read of the same file.

Outside check: :func:`pandas.read_csv` (C engine) told the encoding, the delimiter and where the
header row is, and :func:`pandas.to_datetime` for the dates, read each file here independently of
the audit's reader (which has to find all three by itself, see ``docs/audit-input.md``); both must
give the same teams, rounds, venues, dates and source rows. The standard library is the second
reference where pandas is not one: :func:`datetime.datetime.strptime` for the date formats and
the ``csv`` module's field limit for a long quoted field.
"""

from __future__ import annotations

import csv
import io
import random
from datetime import date, datetime

import pandas as pd
import pytest
from typer.testing import CliRunner

from scheduler.audit import limits
from scheduler.audit.readers import read_schedule_with_rows
from scheduler.audit.values import (
    DATE_FORMATS_DAY_FIRST,
    DATE_FORMATS_MONTH_FIRST,
    parse_date_texts,
)
from scheduler.cli import app
from scheduler.errors import InputError
from tests.fairness.constructions import canonical_rounds

NAMES = ["Harbour Town", "Mill Lane", "Oak Vale", "Riverside", "Stone Cross", "Westfield"]


def _games():
    return [(r + 1, NAMES[h - 1], NAMES[a - 1])
            for r, games in enumerate(canonical_rounds(6)) for h, a in games]


def _plain_pandas(path, *, encoding, sep, header_record, columns, dayfirst=True):
    """The same file read by pandas alone: records before the header skipped, header row 0."""
    frame = pd.read_csv(path, encoding=encoding, sep=sep, skiprows=header_record - 1, header=0,
                        dtype=str, keep_default_na=False, skip_blank_lines=False,
                        index_col=False, usecols=list(columns.values()))
    frame = frame[(frame[columns["home"]] != "") | (frame[columns["away"]] != "")]
    records = [header_record + 1 + int(k) for k in frame.index]
    dates = None
    if "date" in columns:
        dates = pd.to_datetime(frame[columns["date"]], dayfirst=dayfirst, format="mixed")
    return frame, records, dates


def _compare(got, frame, records, dates, columns):
    fixtures = got.season.fixtures
    assert list(got.rows) == records
    assert [f.home for f in fixtures] == [h.strip() for h in frame[columns["home"]]]
    assert [f.away for f in fixtures] == [a.strip() for a in frame[columns["away"]]]
    assert [f.round for f in fixtures] == [int(r) for r in frame[columns["round"]]]
    if "venue" in columns:
        assert [f.venue for f in fixtures] == [v.strip() or None for v in frame[columns["venue"]]]
    if dates is not None:
        assert [f.date for f in fixtures] == [stamp.date() for stamp in dates]


def test_semicolons_in_windows_1252_with_title_rows_and_trailing_delimiters(tmp_path):
    lines = ["Kreisliga Süd 2031;;", "", "Spieltag;Datum;Heim;Gast;Spielort"]
    for r, h, a in _games():
        lines.append(f"{r};{date(2031, 3, r).strftime('%d.%m.%Y')};{h};{a};Halle Nord;")
    path = tmp_path / "liga.csv"
    path.write_bytes(("\r\n".join(lines) + "\r\n").encode("cp1252"))
    got = read_schedule_with_rows(path)
    assert (got.encoding, got.delimiter) == ("cp1252", ";")
    columns = {"round": "Spieltag", "date": "Datum", "home": "Heim", "away": "Gast",
               "venue": "Spielort"}
    frame, records, dates = _plain_pandas(path, encoding="cp1252", sep=";", header_record=3,
                                          columns=columns)
    assert len(frame) == 15
    _compare(got, frame, records, dates, columns)


def test_quoted_fields_with_delimiters_quotes_and_line_breaks(tmp_path):
    lines = ["Round,Date,Home,Away,Venue"]
    for k, (r, h, a) in enumerate(_games()):
        venue = ('"Pier Park, ""North"" pitch\nGate 2"' if k % 4 == 0 else "Mill Field")
        lines.append(f"{r},2031-04-{r:02d},{h},{a},{venue}")
    path = tmp_path / "quoted.csv"
    path.write_text("\n".join(lines) + "\n", encoding="utf-8")
    got = read_schedule_with_rows(path)
    assert got.season.fixtures[0].venue == 'Pier Park, "North" pitch Gate 2'
    columns = {"round": "Round", "date": "Date", "home": "Home", "away": "Away"}
    frame, records, dates = _plain_pandas(path, encoding="utf-8", sep=",", header_record=1,
                                          columns=columns, dayfirst=False)
    # Rows are CSV records (what pandas counts), not text lines: a field over two lines is one.
    _compare(got, frame, records, dates, columns)
    assert records[-1] == 16


def test_tabs_in_utf16_with_blank_lines_between_rounds(tmp_path):
    lines = ["Round\tHome\tAway"]
    last = 0
    for r, h, a in _games():
        if r != last and last:
            lines.append("")
        lines.append(f"{r}\t{h}\t{a}")
        last = r
    path = tmp_path / "u16.csv"
    path.write_bytes("\n".join(lines).encode("utf-16"))
    got = read_schedule_with_rows(path)
    assert (got.encoding, got.delimiter) == ("utf-16", "\t")
    columns = {"round": "Round", "home": "Home", "away": "Away"}
    frame, records, _ = _plain_pandas(path, encoding="utf-16", sep="\t", header_record=1,
                                      columns=columns)
    _compare(got, frame, records, None, columns)
    assert got.rows[3] == 6  # after one blank line


def test_a_date_after_2262_is_read_not_a_crash(tmp_path):
    # pandas' nanosecond timestamps end in 2262 (pandas documentation, "Timestamp limitations");
    # the date column is parsed at microsecond resolution, so the year 2300 is an ordinary date.
    path = tmp_path / "far.csv"
    path.write_text("Round,Date,Home,Away\n1,01.03.2300,Ash,Elm\n2,08.03.2300,Elm,Ash\n",
                    encoding="utf-8")
    got = read_schedule_with_rows(path)
    assert [f.date for f in got.season.fixtures] == [
        datetime.strptime(text, "%d.%m.%Y").date() for text in ("01.03.2300", "08.03.2300")]
    result = CliRunner().invoke(app, ["audit", str(path)])
    assert result.exit_code == 0, result.output


def test_an_unclosed_quote_is_a_located_error_as_pandas_refuses_it(tmp_path):
    text = 'round,home,away\n1,Ash,Elm\n2,"Elm,Ash\n3,Oak,Ash\n'
    path = tmp_path / "open.csv"
    path.write_text(text, encoding="utf-8")
    with pytest.raises(pd.errors.ParserError):  # the reference refuses the same file
        pd.read_csv(io.StringIO(text), dtype=str)
    with pytest.raises(InputError, match="never closed") as caught:
        read_schedule_with_rows(path)
    assert caught.value.location == f"{path}, row 3"


def test_a_long_quoted_field_below_the_header_region_is_located(tmp_path):
    lines = ["round,home,away"] + [f"{r},A{r},B{r}" for r in range(1, 15)]
    field = "x," * 6000
    lines.append(f'15,A15,"{field}"')
    path = tmp_path / "long.csv"
    path.write_text("\n".join(lines) + "\n", encoding="utf-8")
    # The reference: the csv module refuses the same field at the same limit.
    previous = csv.field_size_limit(limits.MAX_CSV_FIELD_CHARS)
    try:
        with pytest.raises(csv.Error, match="field limit"):
            list(csv.reader(io.StringIO(path.read_text(encoding="utf-8"))))
    finally:
        csv.field_size_limit(previous)
    with pytest.raises(InputError, match="quoted field is longer") as caught:
        read_schedule_with_rows(path)
    assert caught.value.location == f"{path}, row 16, column 3"


@pytest.mark.parametrize("month_first", [False, True])
def test_the_date_column_parser_agrees_with_strptime(month_first):
    # pandas reads the column at once; datetime.strptime with the same format strings, tried in
    # the same order, is the per-cell reference.
    rng = random.Random(7)
    parts = ["1", "01", "9", "12", "13", "29", "31", "32", "0", "02", "31", "99", "2031", "2032",
             "1999", "2300", "0031"]
    texts = {f"{rng.choice(parts)}{rng.choice('./-')}{rng.choice(parts)}"
             f"{rng.choice('./-')}{rng.choice(parts)}" for _ in range(3000)}
    texts |= {"2032-02-29", "2031-02-29", "31.04.2031", "01/03/2031 19:30", "2031-03-01T10:00"}
    formats = DATE_FORMATS_MONTH_FIRST if month_first else DATE_FORMATS_DAY_FIRST
    got = parse_date_texts(sorted(texts), month_first)
    for text in sorted(texts):
        head = text.split("T")[0].split(" ")[0]
        expected = None
        for fmt in formats:
            try:
                expected = datetime.strptime(head, fmt).date()
                break
            except ValueError:
                continue
        assert got.get(text) == expected, text
