"""Read any schedule file into a :class:`~scheduler.season.Season`: CSV, xlsx or season.json.

:func:`read_schedule_with_rows` returns a :class:`ScheduleFile`: the season plus, for every
fixture, the row of the source file it came from (so validity problems can say "rows 14, 17").
:func:`read_schedule` returns the season only. Every problem raises
:class:`~scheduler.errors.InputError` with its location (file, sheet, row, column); the size
limits of :mod:`scheduler.audit.limits` are checked before anything is parsed.

CSV (RFC 4180): the records are tokenised by :func:`pandas.read_csv` (C engine, every cell as
text, blank lines kept as empty records, so rows are numbered as CSV records), after two steps
pandas does not offer, which stay the project's own (reasons in ``docs/audit-input.md``):

* encoding: a byte-order mark decides (UTF-8, UTF-16 LE/BE, UTF-32); otherwise UTF-8, then
  Windows-1252 (cp1252), then Latin-1; text that still holds control characters (a binary file)
  is refused with a message. pandas reads with a given encoding and detects none;
* delimiter: comma, semicolon, tab or ``|``, chosen as the one that splits the header row into
  the most recognised column names (then the most fields). pandas' ``sep=None`` asks
  ``csv.Sniffer``, which guesses from character frequencies and knows nothing of headers (it
  takes the space for the delimiter of a title row such as "Spring Ladder 2031").

The columns read are those of the first :data:`HEADER_SEARCH_ROWS` records (the header is one of
them): narrower title rows and wider data rows (a trailing delimiter) are padded or cut, as the
``csv`` module's ragged rows were. Limits: no unquoted run longer than
:data:`~scheduler.audit.limits.MAX_CSV_FIELD_CHARS` (checked before tokenising), and no quoted
field longer either (the ``csv`` module's own limit for the header region, a check of the
frame with row and column for the rest). An unclosed quote is refused with the row it opens.

xlsx: read into one pandas frame per sheet with :func:`pandas.read_excel` and the calamine
engine (python-calamine; about four times faster than openpyxl here, see
``benchmarks/bench_xlsx_engine.py``), after the workbook's declared unpacked size is checked;
the first sheet that has a header row with the needed columns is used.

Columns are found by header in several languages (:mod:`scheduler.audit.headers`), or named by
hand (``columns={"home": "Heim", ...}``). A single "match" column holding ``"A v B"``,
``"A vs B"`` or ``"A - B"`` may replace home and away. The header row is the first of the first
:data:`HEADER_SEARCH_ROWS` rows that names home and away. Cell values:
:mod:`scheduler.audit.values`. Without an offset a kick-off needs a time zone: pass
``timezone=`` (an IANA name); otherwise the date is kept and the time becomes the fixture's
slot label (when there is no slot column). A row whose away side is empty or one of
:data:`BYE_WORDS` is a bye of the home team. Team names are refused with their row and column
when they hold control, text-direction or unassigned characters, and are read in Unicode
Normalization Form C (so "Café" typed two ways is one team), as in league files
(:mod:`scheduler.config.names`).

Without a round column the rounds are derived from the dates (each distinct date is one round,
in date order); without either, reading fails. Without a leg column the legs are inferred: with
pairs meeting k > 1 times (most commonly) and a number of rounds divisible by k, the rounds are
cut into k equal consecutive legs.
"""

from __future__ import annotations

import csv
import io
import itertools
import re
from collections import Counter
from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from datetime import date, datetime, time
from pathlib import Path
from zoneinfo import ZoneInfo, ZoneInfoNotFoundError

import pandas as pd

from scheduler.audit.headers import (
    FIELDS,
    LANGUAGES,
    expected_message,
    languages_of,
    match_headers,
    usable,
)
from scheduler.audit.limits import (
    MAX_CSV_FIELD_CHARS,
    MAX_FILE_BYTES,
    check_csv_fields,
    check_xlsx_members,
    read_bytes_limited,
)
from scheduler.audit.season_file import loads_season_bytes, season_name_problem
from scheduler.audit.values import (
    BadCell,
    as_date,
    as_int,
    as_time,
    cell_text,
    month_first,
    parse_date_texts,
    team_name,
)
from scheduler.errors import InputError
from scheduler.fairness.table import MAX_ROUNDS
from scheduler.season import Fixture, Season

__all__ = [
    "BYE_WORDS",
    "HEADER_SEARCH_ROWS",
    "MAX_FILE_BYTES",
    "ScheduleFile",
    "decode_text",
    "read_bytes_limited",
    "read_schedule",
    "read_schedule_with_rows",
]

HEADER_SEARCH_ROWS = 10
"""How many rows from the top are searched for the header row."""

BYE_WORDS = frozenset({"", "bye", "free", "rest", "-", "–", "—", "none", "n/a"})

_MATCH_SPLIT = re.compile(r"\s+(?:v|vs\.?|versus|-|–|—|:)\s+", re.IGNORECASE)


@dataclass(frozen=True)
class ScheduleFile:
    r"""A schedule read from a file.

    Parameters
    ----------
    season
        The schedule as a season (league name: the file's stem).
    rows
        ``rows[i]`` is the source row (1-based, as a spreadsheet or text editor shows it;
        CSV records, so a quoted field over two lines counts once) of ``season.fixtures[i]``,
        or ``None`` when the format has no rows (season.json).
    path
        The file as given.
    kind
        ``"csv"``, ``"xlsx"`` or ``"season.json"``.
    sheet
        The worksheet read (xlsx only).
    encoding
        The text encoding used (CSV and season.json).
    delimiter
        The field delimiter chosen (CSV only).
    columns
        (field, header) for each field used, in the order of
        :data:`scheduler.audit.headers.FIELDS`.
    notes
        What was inferred: the encoding when not UTF-8, the legs, the rounds, the header
        language, columns named by hand.

    See Also
    --------
    read_schedule_with_rows

    Examples
    --------
    >>> import tempfile, pathlib
    >>> path = pathlib.Path(tempfile.mkdtemp()) / "cup.csv"
    >>> _ = path.write_text("round,home,away\n1,Ash,Elm\n2,Elm,Ash\n", encoding="utf-8")
    >>> read = read_schedule_with_rows(path)
    >>> read.kind, read.delimiter, read.rows, read.columns
    ('csv', ',', (2, 3), (('round', 'round'), ('home', 'home'), ('away', 'away')))
    >>> read.notes
    ('no leg column: 2 legs of 1 rounds inferred',)
    """

    season: Season
    rows: tuple[int | None, ...]
    path: str
    kind: str
    sheet: str | None = None
    encoding: str | None = None
    delimiter: str | None = None
    columns: tuple[tuple[str, str], ...] = ()
    notes: tuple[str, ...] = ()


# --------------------------------------------------------------------------- rows -> season


@dataclass
class _Row:
    rownum: int
    round: int | None
    leg: int | None
    home: str
    away: str
    venue: str | None
    court: str | None
    slot: str | None
    day: date | None
    clock: time | None
    start: datetime | None


def _blank(cells: list) -> bool:
    try:
        return not "".join(cells).strip()
    except TypeError:
        return all(cell_text(c) == "" for c in cells)


def _cell(cells: list, col: int | None):
    if col is None or col >= len(cells):
        return None
    return cells[col]


def _rows_to_schedule(
    data_rows: list[tuple[int, list]],
    found: dict[str, int],
    headers: list,
    where: str,
    *,
    path: Path,
    kind: str,
    timezone: str | None,
    sheet: str | None = None,
    encoding: str | None = None,
    delimiter: str | None = None,
    notes: list[str] | None = None,
) -> ScheduleFile:
    notes = list(notes or [])
    zone = None
    if timezone:
        try:
            zone = ZoneInfo(timezone)
        except (ZoneInfoNotFoundError, ValueError) as exc:
            raise InputError(f"unknown time zone {timezone!r}", location="timezone") from exc
    if "round" not in found and "date" not in found:
        raise InputError(
            "no round column (round, rd, matchday, week, game day) and no date column to "
            "derive the rounds from",
            location=f"{where}, row {data_rows[0][0] - 1 if data_rows else 1}",
        )
    col_name = {field: cell_text(headers[col]) for field, col in found.items()}
    date_col = found.get("date")
    date_cells = [_cell(c, date_col) for _, c in data_rows] if date_col is not None else []
    slash_month_first = month_first(date_cells)
    # Every distinct text of the date column at once (pandas); the rest cell by cell below.
    date_cache: dict[str, tuple[date | None, datetime | None]] = {
        text: (day, None)
        for text, day in parse_date_texts(
            (c for c in date_cells if isinstance(c, str)), slash_month_first
        ).items()
    }

    def loc(rownum: int, field: str) -> str:
        return f"{where}, row {rownum}, column {col_name[field]!r}"

    parsed: list[_Row] = []
    byes: list[tuple[int, int | None, date | None, str]] = []
    col = {field: found.get(field) for field in FIELDS}
    split_match = "match" in found and not ("home" in found and "away" in found)
    time_cache: dict[str, tuple[time | None, datetime | None]] = {}
    names_seen: dict[str, str] = {}
    for rownum, cells in data_rows:
        if _blank(cells):
            continue
        field = "match"
        try:
            if split_match:
                text = cell_text(_cell(cells, col["match"]))
                parts = _MATCH_SPLIT.split(text, maxsplit=1)
                if len(parts) != 2:
                    raise BadCell(f"cannot split {text!r} into two teams (write 'Home v Away')")
                home, away = cell_text(parts[0]), cell_text(parts[1])
            else:
                home = cell_text(_cell(cells, col["home"]))
                away = cell_text(_cell(cells, col["away"]))
            if not split_match:
                field = "home"
            home = team_name(home, names_seen)
            if not split_match:
                field = "away"
            away = team_name(away, names_seen)
            rnd = None
            field = "round"
            if col["round"] is not None:
                raw = _cell(cells, col["round"])
                if cell_text(raw) == "":
                    raise BadCell("the round is empty")
                rnd = as_int(raw, "the round")
                if rnd > MAX_ROUNDS:
                    raise BadCell(
                        f"round {rnd} is not a plausible round number (at most {MAX_ROUNDS})"
                    )
            leg = None
            field = "leg"
            if col["leg"] is not None and cell_text(_cell(cells, col["leg"])) != "":
                leg = as_int(_cell(cells, col["leg"]), "the leg")
            day, full = (None, None)
            field = "date"
            if date_col is not None:
                raw = _cell(cells, date_col)
                key = raw.strip() if isinstance(raw, str) else None
                if key is not None and key in date_cache:
                    day, full = date_cache[key]
                else:
                    day, full = as_date(raw, slash_month_first)
                    if key is not None:
                        date_cache[key] = (day, full)
            clock = None
            field = "time"
            if col["time"] is not None:
                raw = _cell(cells, col["time"])
                key = raw if isinstance(raw, str) else None
                if key is not None and key in time_cache:
                    clock, full_t = time_cache[key]
                else:
                    clock, full_t = as_time(raw)
                    if key is not None:
                        time_cache[key] = (clock, full_t)
                full = full_t or full
                if full_t is not None and day is None:
                    day = full_t.date()
        except BadCell as exc:
            raise InputError(str(exc), location=loc(rownum, field)) from exc
        home_bye = home.lower() in BYE_WORDS
        away_bye = away.lower() in BYE_WORDS
        if home_bye and away_bye:
            continue
        if home_bye or away_bye:
            byes.append((rownum, rnd, day, home if away_bye else away))
            continue
        start = None
        if full is not None and full.tzinfo is not None:
            start = full.astimezone(zone) if zone else full
        elif zone is not None and day is not None and clock is not None:
            start = datetime.combine(day, clock, tzinfo=zone)
        slot = cell_text(_cell(cells, col["slot"])) or None
        if slot is None and clock is not None and start is None:
            slot = clock.strftime("%H:%M")
        parsed.append(
            _Row(
                rownum=rownum,
                round=rnd,
                leg=leg,
                home=home,
                away=away,
                venue=cell_text(_cell(cells, col["venue"])) or None,
                court=cell_text(_cell(cells, col["court"])) or None,
                slot=slot,
                day=day,
                clock=clock,
                start=start,
            )
        )
    if not parsed:
        raise InputError("the file has a header but no games", location=where)

    # Rounds: written, or one per distinct date in date order.
    if "round" in found:
        round_of = [r.round if r.round is not None else 0 for r in parsed]
    else:
        days: list[date] = []
        for r in parsed:
            if r.day is None:
                raise InputError(
                    "no round column, and this row has no date to derive the round from",
                    location=f"{where}, row {r.rownum}",
                )
            days.append(r.day)
        order = {d: k + 1 for k, d in enumerate(sorted(set(days)))}
        round_of = [order[d] for d in days]
        notes.append(f"no round column: {len(order)} rounds derived from the dates")

    # Legs: written, or inferred from the pair meeting counts.
    leg_of: list[int] = []
    if "leg" in found:
        for r in parsed:
            if r.leg is None:
                raise InputError("the leg is empty", location=loc(r.rownum, "leg"))
            leg_of.append(r.leg)
        legs = max(leg_of)
    else:
        meets = Counter(
            (r.home, r.away) if r.home < r.away else (r.away, r.home)
            for r in parsed
            if r.home != r.away
        )
        mode = Counter(meets.values()).most_common(1)[0][0] if meets else 1
        rounds = max(round_of)
        if mode > 1 and rounds % mode == 0:
            per = rounds // mode
            leg_of = [(rnd - 1) // per + 1 if rnd >= 1 else 1 for rnd in round_of]
            legs = mode
            notes.append(f"no leg column: {mode} legs of {per} rounds inferred")
        else:
            leg_of = [1] * len(parsed)
            legs = 1

    teams = list(dict.fromkeys(name for r in parsed for name in (r.home, r.away)))
    round_of_day = {r.day: rnd for r, rnd in zip(parsed, round_of, strict=True)
                    if r.day is not None}
    bye_map: dict[int, list[str]] = {}
    for rownum, bye_round, day, team in byes:
        if bye_round is None and day is not None:
            bye_round = round_of_day.get(day)
        if bye_round is None:
            raise InputError(
                "a bye without a round (or a date of a round)", location=f"{where}, row {rownum}"
            )
        if team not in teams:
            teams.append(team)
        bye_map.setdefault(bye_round, [])
        if team not in bye_map[bye_round]:
            bye_map[bye_round].append(team)
    fixtures = tuple(
        Fixture(
            round=rnd, home=r.home, away=r.away, leg=leg, venue=r.venue, court=r.court,
            slot=r.slot, date=r.day, start=r.start,
        )
        for r, rnd, leg in zip(parsed, round_of, leg_of, strict=True)
    )
    venues = tuple(dict.fromkeys(r.venue for r in parsed if r.venue))
    season = Season(
        league=path.stem,
        season_id="",
        teams=tuple(teams),
        fixtures=fixtures,
        byes={k: tuple(v) for k, v in sorted(bye_map.items())},
        legs=legs,
        scheme="mirrored" if legs == 1 else "free",
        timezone=timezone,
        venues=venues,
        notes=tuple(notes),
    )
    return ScheduleFile(
        season=season,
        rows=tuple(r.rownum for r in parsed),
        path=str(path),
        kind=kind,
        sheet=sheet,
        encoding=encoding,
        delimiter=delimiter,
        columns=tuple((f, col_name[f]) for f in FIELDS if f in found),
        notes=tuple(notes),
    )


# --------------------------------------------------------------------------- header row


def _find_header(
    rows: Sequence[tuple[int, Sequence[object]]], named: Mapping[str, str] | None
) -> tuple[int, dict[str, int]] | None:
    """(position in ``rows``, field map) of the header row, if any."""
    for pos, (_, cells) in enumerate(rows[:HEADER_SEARCH_ROWS]):
        found = match_headers(cells, named)
        if usable(found, named):
            return pos, found
    return None


def _header_notes(found: Mapping[str, int], cells: Sequence[object],
                  named: Mapping[str, str] | None) -> list[str]:
    notes = []
    if named:
        notes.append("columns named by hand: " + ", ".join(f"{f}={h}" for f, h in named.items()))
    foreign = [LANGUAGES[code] for code in languages_of(found, cells) if code != "en"]
    if foreign:
        notes.append("headers read as " + " and ".join(foreign))
    return notes


# --------------------------------------------------------------------------- CSV


_CONTROL = re.compile(r"[\x00-\x08\x0b\x0c\x0e-\x1f\x7f-\x9f]")
_DELIMITERS = (",", ";", "\t", "|")
_UNCLOSED_QUOTE = re.compile(r"EOF inside string starting at row (\d+)")


def decode_text(raw: bytes, location: str) -> tuple[str, str]:
    """Decode CSV bytes: byte-order mark first, then UTF-8, cp1252, Latin-1.

    Parameters
    ----------
    raw
        The file's bytes.
    location
        The file, for messages.

    Returns
    -------
    tuple
        (text, name of the encoding used).

    Raises
    ------
    InputError
        A byte-order mark with undecodable text after it, or text that holds control
        characters in every encoding tried (a binary file).

    Examples
    --------
    >>> decode_text("Spieltag;Heim".encode("cp1252"), "f.csv")
    ('Spieltag;Heim', 'utf-8')
    >>> decode_text("Équipe".encode("cp1252"), "f.csv")
    ('Équipe', 'cp1252')
    """
    boms = (
        (b"\xef\xbb\xbf", "utf-8-sig"),
        (b"\xff\xfe\x00\x00", "utf-32"),
        (b"\x00\x00\xfe\xff", "utf-32"),
        (b"\xff\xfe", "utf-16"),
        (b"\xfe\xff", "utf-16"),
    )
    for bom, encoding in boms:
        if raw.startswith(bom):
            try:
                return raw.decode(encoding), encoding
            except UnicodeDecodeError as exc:
                raise InputError(
                    f"the file starts with a {encoding.upper()} byte-order mark but is not valid "
                    f"{encoding.upper()} (byte {exc.start})",
                    location=location,
                ) from exc
    for encoding in ("utf-8", "cp1252", "latin-1"):
        try:
            text = raw.decode(encoding)
        except UnicodeDecodeError:
            continue
        if not _CONTROL.search(text):
            return text, encoding
    raise InputError(
        "cannot read the file as text: it is not UTF-8, UTF-16, Windows-1252 or Latin-1 "
        "(is it a binary file?); save it as CSV in UTF-8",
        location=location,
    )


def _choose_delimiter(text: str, named: Mapping[str, str] | None) -> str:
    lines = [ln for ln in text.splitlines()[:HEADER_SEARCH_ROWS] if ln.strip()]
    best, best_score = ",", (-1, -1)
    for delimiter in _DELIMITERS:
        score = (-1, -1)
        for cells in csv.reader(lines, delimiter=delimiter):
            found = match_headers(cells, named)
            score = max(score, (len(found) + (10 if usable(found, named) else 0), len(cells)))
        if score > best_score:
            best, best_score = delimiter, score
    return best


def _header_width(text: str, delimiter: str) -> int:
    """The most fields of the first :data:`HEADER_SEARCH_ROWS` records (the header row is one
    of them, so no column the reader uses lies beyond)."""
    records = itertools.islice(csv.reader(io.StringIO(text), delimiter=delimiter),
                               HEADER_SEARCH_ROWS)
    return max((len(cells) for cells in records), default=1) or 1


def _csv_rows(text: str, delimiter: str, width: int, where: str) -> list[tuple[int, list]]:
    """The records of CSV text as (record number, cells), tokenised by :func:`pandas.read_csv`.

    pandas' C tokeniser reads RFC 4180 quoting (a quoted field may hold the delimiter, doubled
    quotes and line breaks) and keeps blank lines as empty records, so record numbers are those
    a text editor shows for one-line records. Every record is cut or padded to the width of the
    header region (``usecols``): title rows above the header may be narrower, data rows may
    carry extra trailing cells (a trailing delimiter), and neither is an error. pandas has no
    field-size limit, so the longest field is checked here, with its row and column.
    """
    columns = list(range(width))
    try:
        frame = pd.read_csv(
            io.StringIO(text), sep=delimiter, header=None, names=columns, usecols=columns,
            dtype=str, keep_default_na=False, na_filter=False, skip_blank_lines=False,
            engine="c", quoting=csv.QUOTE_MINIMAL, doublequote=True,
        )
    except (pd.errors.ParserError, ValueError) as exc:
        message = " ".join(str(exc).replace("Error tokenizing data. C error:", "").split())
        unclosed = _UNCLOSED_QUOTE.search(message)
        if unclosed:  # pandas counts records from 0
            raise InputError(
                "a quoted field is never closed (a closing quote is missing)",
                location=f"{where}, row {int(unclosed.group(1)) + 1}",
            ) from exc
        raise InputError(f"malformed CSV: {message}", location=where) from exc
    for column in columns:
        lengths = frame[column].str.len()
        if len(lengths) and lengths.max() > MAX_CSV_FIELD_CHARS:
            record = int(lengths.to_numpy().argmax()) + 1
            raise InputError(
                f"a quoted field is longer than {MAX_CSV_FIELD_CHARS} characters; is this a "
                "schedule?",
                location=f"{where}, row {record}, column {column + 1}",
            )
    return [(k + 1, list(cells))
            for k, cells in enumerate(frame.itertuples(index=False, name=None))]


def _read_csv(path: Path, raw: bytes, timezone: str | None,
              named: Mapping[str, str] | None) -> ScheduleFile:
    where = str(path)
    text, encoding = decode_text(raw, where)
    if not text.strip():
        raise InputError("the file is empty", location=where)
    check_csv_fields(text, where)
    previous_limit = csv.field_size_limit()
    try:
        csv.field_size_limit(MAX_CSV_FIELD_CHARS)
        delimiter = _choose_delimiter(text, named)
        width = _header_width(text, delimiter)
    except csv.Error as exc:
        if "field limit" in str(exc):
            raise InputError(
                f"a quoted field is longer than {MAX_CSV_FIELD_CHARS} characters; is this a "
                "schedule?",
                location=where,
            ) from exc
        raise InputError(f"malformed CSV: {exc}", location=where) from exc
    finally:
        csv.field_size_limit(previous_limit)
    rows = _csv_rows(text, delimiter, width, where)
    head = _find_header(rows, named)
    if head is None:
        raise InputError(expected_message(HEADER_SEARCH_ROWS, named), location=where)
    pos, found = head
    notes = _header_notes(found, rows[pos][1], named)
    if encoding not in ("utf-8", "utf-8-sig"):
        notes.append(f"read with encoding {encoding}")
    return _rows_to_schedule(
        rows[pos + 1 :], found, rows[pos][1], where, path=path, kind="csv",
        timezone=timezone, encoding=encoding, delimiter=delimiter, notes=notes,
    )


# --------------------------------------------------------------------------- xlsx


def _plain(value: object) -> object:
    """A frame cell as the reader expects it: ``None`` for an empty cell."""
    if value is None or (isinstance(value, float) and value != value):
        return None
    if isinstance(value, pd.Timestamp):
        return value.to_pydatetime()
    return value


def _read_xlsx(path: Path, timezone: str | None, named: Mapping[str, str] | None) -> ScheduleFile:
    where = str(path)
    check_xlsx_members(path)
    try:
        frames = pd.read_excel(path, sheet_name=None, header=None, dtype=object,
                               engine="calamine")
    except Exception as exc:  # calamine reports broken workbooks with its own exception types
        raise InputError(f"not a readable xlsx workbook ({exc})", location=where) from exc
    for name, frame in frames.items():
        rows = [
            (k + 1, [_plain(v) for v in values])
            for k, values in enumerate(frame.itertuples(index=False, name=None))
        ]
        head = _find_header(rows, named)
        if head is None:
            continue
        pos, found = head
        return _rows_to_schedule(
            rows[pos + 1 :], found, rows[pos][1], f"{where} [sheet {name!r}]", path=path,
            kind="xlsx", timezone=timezone, sheet=str(name),
            notes=_header_notes(found, rows[pos][1], named),
        )
    raise InputError(
        expected_message(HEADER_SEARCH_ROWS, named)
        + f"; looked at the sheets {', '.join(map(repr, frames))}",
        location=where,
    )


# --------------------------------------------------------------------------- entry points


def _kind_of(path: Path, raw: bytes) -> str:
    ext = path.suffix.lower()
    if ext in (".xlsx", ".xlsm"):
        return "xlsx"
    if ext == ".json":
        return "json"
    if ext in (".csv", ".tsv", ".txt"):
        return "csv"
    if ext == ".xls":
        raise InputError(
            "old .xls workbooks are not read; save the sheet as .xlsx or CSV", location=str(path)
        )
    if raw.startswith(b"PK\x03\x04"):
        return "xlsx"
    if raw.lstrip(b"\xef\xbb\xbf \t\r\n").startswith(b"{"):
        return "json"
    return "csv"


def read_schedule_with_rows(
    path: str | Path,
    *,
    timezone: str | None = None,
    columns: Mapping[str, str] | None = None,
) -> ScheduleFile:
    r"""Read a CSV, xlsx or season.json schedule, keeping each fixture's source row.

    Parameters
    ----------
    path
        The schedule file.
    timezone
        IANA time zone of kick-off times written without a UTC offset.
    columns
        Fields named by hand (field -> header text, see
        :func:`scheduler.audit.headers.parse_column_names`); the other fields are found by the
        header vocabulary.

    Returns
    -------
    ScheduleFile
        The season, each fixture's source row and notes on what was inferred.

    Raises
    ------
    InputError
        Unusable input, with its location (file, sheet, row, column).

    Examples
    --------
    >>> import tempfile, pathlib
    >>> folder = pathlib.Path(tempfile.mkdtemp())
    >>> _ = (folder / "f.csv").write_text("Spieltag;Datum;Heim;Gast\n1;01.03.2031;Ost;West\n")
    >>> got = read_schedule_with_rows(folder / "f.csv")
    >>> got.season.fixtures[0].date, got.rows, got.notes
    (datetime.date(2031, 3, 1), (2,), ('headers read as German',))
    """
    path = Path(path)
    raw = read_bytes_limited(path)
    kind = _kind_of(path, raw)
    named = dict(columns or {})
    if kind == "xlsx":
        return _read_xlsx(path, timezone, named)
    if kind == "json":
        season = loads_season_bytes(raw, source=str(path))
        bad_name = season_name_problem(season)
        if bad_name is not None:
            raise InputError(bad_name[1], location=f"{path}: {bad_name[0]}")
        return ScheduleFile(
            season=season,
            rows=tuple(None for _ in season.fixtures),
            path=str(path),
            kind="season.json",
            encoding="utf-8",
        )
    return _read_csv(path, raw, timezone, named)


def read_schedule(path: str | Path, *, timezone: str | None = None,
                  columns: Mapping[str, str] | None = None) -> Season:
    r"""Read a CSV, xlsx or season.json schedule into a :class:`Season`.

    See :func:`read_schedule_with_rows` for the parameters and errors.

    Parameters
    ----------
    path
        The schedule file.
    timezone
        IANA time zone of kick-off times written without a UTC offset.
    columns
        Fields named by hand (field -> header text).

    Returns
    -------
    Season
        The schedule as a season.

    Raises
    ------
    InputError
        Unusable input, with its location.

    References
    ----------
    RFC 4180 (CSV); ECMA-376 (xlsx); ``docs/audit-input.md``.

    Examples
    --------
    >>> import tempfile, pathlib
    >>> path = pathlib.Path(tempfile.mkdtemp()) / "cup.csv"
    >>> _ = path.write_text("Date;Time;Home;Away\n07/01/2031;19:30;Ash;Elm\n",
    ...                     encoding="utf-8")
    >>> season = read_schedule(path, timezone="Europe/London")
    >>> season.fixtures[0].round, season.fixtures[0].start.isoformat()
    (1, '2031-01-07T19:30:00+00:00')
    """
    return read_schedule_with_rows(path, timezone=timezone, columns=columns).season
