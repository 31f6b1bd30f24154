"""Read any schedule file into a :class:`~scheduler.season.Season`: CSV, xlsx or season.json.

:func:`read_schedule_with_rows` returns a :class:`ScheduleFile`: the season plus, for every
fixture, the row of the source file it came from (so validity problems can say "rows 14, 17").
:func:`read_schedule` returns the season only.

Files over :data:`MAX_FILE_BYTES` are refused before reading. Every problem raises
:class:`~scheduler.errors.InputError` with its location (file, sheet, row, column).

CSV (RFC 4180, read with the standard ``csv`` module):

* encoding: a byte-order mark decides (UTF-8, UTF-16 LE/BE, UTF-32); otherwise UTF-8, then
  Windows-1252 (cp1252), then Latin-1; text that still holds control characters (a binary file)
  is refused with a message;
* delimiter: comma, semicolon, tab or ``|``, chosen as the one that splits the header row into
  the most recognised column names (then the most fields).

xlsx (read with openpyxl in read-only mode, values only): the first sheet that has a header
row with the needed columns.

Columns are found by header, case-insensitively and ignoring spaces, ``-``, ``_``, ``.``, ``#``,
with these synonyms (:data:`SYNONYMS`): round (rd, matchday, week, game day, ...), date, time
(kick-off, kickoff, start, ...), home (home team, host, ...), away (away team, visitor, guest,
...), venue (ground, location, field), court (pitch, table), slot (time slot), leg. A single
"match" column holding ``"A v B"``, ``"A vs B"`` or ``"A - B"`` may replace home and away. The
header row is the first of the first :data:`HEADER_SEARCH_ROWS` rows that names home and away.

Values: rounds and legs are the first whole number in the cell (``"Round 3"`` -> 3). Dates are
ISO ``YYYY-MM-DD``, ``YYYY/MM/DD``, ``DD.MM.YYYY`` or ``DD/MM/YYYY`` (slashes are read day first
unless some value of the column only makes sense month first), or spreadsheet dates. Times are
``HH:MM[:SS]`` (also ``HH.MM``, ``7:30 pm``) or spreadsheet times; a full ISO date-time with a
UTC offset gives the kick-off directly. Without an offset a kick-off needs a time zone: pass
``timezone=`` (an IANA name); otherwise the date is kept and the time becomes the fixture's
slot label (when there is no slot column). A row whose away side is empty or one of
:data:`BYE_WORDS` is a bye of the home team. A text cell that the project's exporters made
inert against formula injection (a leading ``'``, :func:`scheduler.export.safety.neutralise_cell`)
is restored.

Without a round column the rounds are derived from the dates (each distinct date is one round,
in date order); without either, reading fails. Without a leg column the legs are inferred: with
pairs meeting k > 1 times (most commonly) and a number of rounds divisible by k, the rounds are
cut into k equal consecutive legs.
"""

from __future__ import annotations

import csv
import io
import re
import zipfile
from collections import Counter
from dataclasses import dataclass
from datetime import date, datetime, time
from pathlib import Path
from zoneinfo import ZoneInfo, ZoneInfoNotFoundError

from scheduler.errors import InputError
from scheduler.export.safety import restore_cell
from scheduler.fairness.table import MAX_ROUNDS
from scheduler.season import Fixture, Season

MAX_FILE_BYTES = 100 * 1024 * 1024
"""Largest schedule file read (100 MB)."""

HEADER_SEARCH_ROWS = 10

SYNONYMS: dict[str, tuple[str, ...]] = {
    "round": ("round", "rd", "rnd", "roundno", "roundnumber", "matchday", "matchdayno",
              "week", "weekno", "gameday", "gamedayno", "matchweek", "spieltag", "journee"),
    "leg": ("leg", "legno", "phase"),
    "date": ("date", "matchdate", "gamedate", "datum", "fecha"),
    "time": ("time", "kickoff", "kickofftime", "start", "starttime", "ko", "tipoff", "begin"),
    "home": ("home", "hometeam", "host", "hosts", "homeside", "team1", "teama"),
    "away": ("away", "awayteam", "visitor", "visitors", "visitingteam", "guest", "guests",
             "awayside", "team2", "teamb"),
    "match": ("match", "fixture", "pairing", "matchup"),
    "venue": ("venue", "ground", "location", "field", "stadium", "hall", "arena"),
    "court": ("court", "pitch", "table", "rink", "sheet", "board"),
    "slot": ("slot", "timeslot"),
}

BYE_WORDS = frozenset({"", "bye", "free", "rest", "-", "–", "—", "none", "n/a"})

_MATCH_SPLIT = re.compile(r"\s+(?:v|vs\.?|versus|-|–|—|:)\s+", re.IGNORECASE)


@dataclass(frozen=True)
class ScheduleFile:
    """A schedule read from a file.

    ``rows[i]`` is the source row (1-based, as a spreadsheet shows it) of ``season.fixtures[i]``,
    or ``None`` when the format has no rows (season.json). ``columns`` maps each field used to
    the header it was read from. ``notes`` say what was inferred (encoding, legs, rounds).
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


# --------------------------------------------------------------------------- bytes


def read_bytes_limited(path: str | Path, limit: int | None = None) -> bytes:
    """The file's bytes; refuses missing files, folders and files over ``limit`` bytes
    (default :data:`MAX_FILE_BYTES`), before reading them."""
    path = Path(path)
    limit = MAX_FILE_BYTES if limit is None else limit
    if not path.exists():
        raise InputError("file not found", location=str(path))
    if not path.is_file():
        raise InputError("not a file", location=str(path))
    size = path.stat().st_size
    if size > limit:
        raise InputError(
            f"the file is {_size(size)}; schedule files over {_size(limit)} are not read",
            location=str(path),
        )
    if size == 0:
        raise InputError("the file is empty", location=str(path))
    try:
        return path.read_bytes()
    except OSError as exc:
        raise InputError(f"cannot read the file: {exc.strerror}", location=str(path)) from exc


def _size(nbytes: int) -> str:
    if nbytes >= 1024 * 1024:
        return f"{nbytes / (1024 * 1024):.1f} MB"
    return f"{nbytes} bytes"


_CONTROL = re.compile(r"[\x00-\x08\x0b\x0c\x0e-\x1f\x7f-\x9f]")


def decode_text(raw: bytes, location: str) -> tuple[str, str]:
    """Decode CSV bytes: BOM first, then UTF-8, cp1252, Latin-1. Returns (text, encoding)."""
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


# --------------------------------------------------------------------------- headers


def _norm(header) -> str:
    text = "" if header is None else str(header)
    return re.sub(r"[\s\-_.#/()]+", "", text.strip().lower())


_LOOKUP = {syn: field for field, syns in SYNONYMS.items() for syn in syns}


def _match_headers(cells) -> dict[str, int]:
    """Field -> column index for a candidate header row (first match of each field wins)."""
    found: dict[str, int] = {}
    for col, cell in enumerate(cells):
        field = _LOOKUP.get(_norm(cell))
        if field and field not in found:
            found[field] = col
    return found


def _usable(found: dict[str, int]) -> bool:
    return ("home" in found and "away" in found) or "match" in found


def _find_header(rows: list[tuple[int, list]]) -> tuple[int, int, dict[str, int]] | None:
    """(position in ``rows``, source row, field map) of the header row, if any."""
    for pos, (rownum, cells) in enumerate(rows[:HEADER_SEARCH_ROWS]):
        found = _match_headers(cells)
        if _usable(found):
            return pos, rownum, found
    return None


def _expected_message() -> str:
    return (
        "no header row naming the home and away columns in the first "
        f"{HEADER_SEARCH_ROWS} rows (expected headers such as: round, date, time, home, away, "
        "venue, court)"
    )


# --------------------------------------------------------------------------- values


_INT = re.compile(r"\d+")


class _Bad(ValueError):
    """A cell value that cannot be used; the caller adds the location."""


def _as_int(value, what: str) -> int:
    if type(value) is str and value.isdigit():
        return int(value)
    if isinstance(value, bool):
        raise _Bad(f"{what} must be a whole number, got {value!r}")
    if isinstance(value, int):
        return value
    if isinstance(value, float):
        if value.is_integer():
            return int(value)
        raise _Bad(f"{what} must be a whole number, got {value!r}")
    m = _INT.search(str(value))
    if not m:
        raise _Bad(f"{what} must be a number, got {str(value)!r}")
    return int(m.group())


def _text(value) -> str:
    """The cell as text with runs of white space collapsed ("" for an empty cell)."""
    if type(value) is str:
        stripped = value.strip()
        if stripped.startswith("'"):
            # A cell our exporters made inert against formula injection (scheduler.export.safety).
            stripped = (restore_cell(stripped) or "").strip()
        if "  " not in stripped and "\t" not in stripped and "\n" not in stripped:
            return stripped
        return " ".join(stripped.split())
    if value is None:
        return ""
    if isinstance(value, float) and value.is_integer():
        value = int(value)
    return " ".join(str(value).split())


_DATE_FORMATS_DAY_FIRST = ("%Y-%m-%d", "%Y/%m/%d", "%d.%m.%Y", "%d/%m/%Y", "%d-%m-%Y",
                           "%d.%m.%y", "%d/%m/%y")
_DATE_FORMATS_MONTH_FIRST = ("%Y-%m-%d", "%Y/%m/%d", "%d.%m.%Y", "%m/%d/%Y", "%d-%m-%Y",
                             "%d.%m.%y", "%m/%d/%y")


def _month_first(values) -> bool:
    """True when some slash date of the column only makes sense month first (second part > 12)."""
    for v in values:
        if isinstance(v, str):
            parts = v.strip().split(" ")[0].split("/")
            if (
                len(parts) == 3
                and len(parts[0]) <= 2
                and parts[1].isdigit()
                and int(parts[1]) > 12
            ):
                return True
    return False


def _parse_datetime_text(text: str) -> datetime | None:
    try:
        return datetime.fromisoformat(text.replace(" ", "T", 1) if "T" not in text else text)
    except ValueError:
        return None


def _as_date(value, month_first: bool) -> tuple[date | None, datetime | None]:
    """(date, full datetime when the cell holds one)."""
    if value is None or value == "":
        return None, None
    if isinstance(value, datetime):
        return value.date(), (value if value.tzinfo else None)
    if isinstance(value, date):
        return value, None
    text = str(value).strip()
    formats = _DATE_FORMATS_MONTH_FIRST if month_first else _DATE_FORMATS_DAY_FIRST
    head = text.split("T")[0].split(" ")[0]
    for fmt in formats:
        try:
            return datetime.strptime(head, fmt).date(), None
        except ValueError:
            continue
    full = _parse_datetime_text(text)
    if full is not None:
        return full.date(), (full if full.tzinfo else None)
    raise _Bad(f"not a date: {text!r} (use YYYY-MM-DD)")


_TIME = re.compile(r"^(\d{1,2})[:.h](\d{2})(?::(\d{2}))?\s*([ap]\.?m\.?)?$", re.IGNORECASE)


def _as_time(value) -> tuple[time | None, datetime | None]:
    """(time of day, full aware datetime when the cell holds one with an offset)."""
    if value is None or value == "":
        return None, None
    if isinstance(value, datetime):
        return value.time().replace(tzinfo=None), (value if value.tzinfo else None)
    if isinstance(value, time):
        return value.replace(tzinfo=None), None
    text = str(value).strip()
    m = _TIME.match(text)
    if m:
        hour, minute = int(m.group(1)), int(m.group(2))
        second = int(m.group(3) or 0)
        ampm = (m.group(4) or "").lower().replace(".", "")
        if ampm == "pm" and hour < 12:
            hour += 12
        elif ampm == "am" and hour == 12:
            hour = 0
        try:
            return time(hour, minute, second), None
        except ValueError:
            pass
    full = _parse_datetime_text(text)
    if full is not None:
        return full.time(), (full if full.tzinfo else None)
    raise _Bad(f"not a time of day: {text!r} (use HH:MM)")


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
        return all(_text(c) == "" for c in cells)


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
    col_name = {field: _text(headers[col]) for field, col in found.items()}
    date_col = found.get("date")
    month_first = _month_first([_cell(c, date_col) for _, c in data_rows]) if date_col else False

    def loc(rownum: int, field: str) -> str:
        return f"{where}, row {rownum}, column {col_name[field]!r}"

    parsed: list[_Row] = []
    byes: list[tuple[int, int | None, date | None, str]] = []
    col = {field: found.get(field) for field in SYNONYMS}
    split_match = "match" in found and not ("home" in found and "away" in found)
    date_cache: dict = {}
    time_cache: dict = {}
    for rownum, cells in data_rows:
        if _blank(cells):
            continue
        field = "match"
        try:
            if split_match:
                text = _text(_cell(cells, col["match"]))
                parts = _MATCH_SPLIT.split(text, maxsplit=1)
                if len(parts) != 2:
                    raise _Bad(f"cannot split {text!r} into two teams (write 'Home v Away')")
                home, away = _text(parts[0]), _text(parts[1])
            else:
                home = _text(_cell(cells, col["home"]))
                away = _text(_cell(cells, col["away"]))
            rnd = None
            field = "round"
            if col["round"] is not None:
                raw = _cell(cells, col["round"])
                if _text(raw) == "":
                    raise _Bad("the round is empty")
                rnd = _as_int(raw, "the round")
                if rnd > MAX_ROUNDS:
                    raise _Bad(
                        f"round {rnd} is not a plausible round number (at most {MAX_ROUNDS})"
                    )
            leg = None
            field = "leg"
            if col["leg"] is not None and _text(_cell(cells, col["leg"])) != "":
                leg = _as_int(_cell(cells, col["leg"]), "the leg")
            day, full = (None, None)
            field = "date"
            if date_col is not None:
                raw = _cell(cells, date_col)
                key = raw if isinstance(raw, str) else None
                if key is not None and key in date_cache:
                    day, full = date_cache[key]
                else:
                    day, full = _as_date(raw, month_first)
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
                    clock, full_t = _as_time(raw)
                    if key is not None:
                        time_cache[key] = (clock, full_t)
                full = full_t or full
                if full_t is not None and day is None:
                    day = full_t.date()
        except _Bad as exc:
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
        slot = _text(_cell(cells, col["slot"])) or None
        if slot is None and clock is not None and start is None:
            slot = clock.strftime("%H:%M")
        parsed.append(
            _Row(
                rownum=rownum,
                round=rnd,
                leg=leg,
                home=home,
                away=away,
                venue=_text(_cell(cells, col["venue"])) or None,
                court=_text(_cell(cells, col["court"])) or None,
                slot=slot,
                day=day,
                clock=clock,
                start=start,
            )
        )
    if not parsed:
        raise InputError("the file has a header but no games", location=where)

    if "round" not in found:
        missing = [r for r in parsed if r.day is None]
        if missing:
            raise InputError(
                "no round column, and this row has no date to derive the round from",
                location=f"{where}, row {missing[0].rownum}",
            )
        order = {d: k + 1 for k, d in enumerate(sorted({r.day for r in parsed}))}
        for r in parsed:
            r.round = order[r.day]
        notes.append(f"no round column: {len(order)} rounds derived from the dates")

    # Legs: written, or inferred from the pair meeting counts.
    if "leg" in found:
        for r in parsed:
            if r.leg is None:
                raise InputError("the leg is empty", location=loc(r.rownum, "leg"))
        legs = max(r.leg for r in parsed)
    else:
        meets = Counter(
            (r.home, r.away) if r.home < r.away else (r.away, r.home)
            for r in parsed
            if r.home != r.away
        )
        mode = Counter(meets.values()).most_common(1)[0][0] if meets else 1
        rounds = max(r.round for r in parsed)
        if mode > 1 and rounds % mode == 0:
            per = rounds // mode
            for r in parsed:
                r.leg = (r.round - 1) // per + 1 if r.round >= 1 else 1
            legs = mode
            notes.append(f"no leg column: {mode} legs of {per} rounds inferred")
        else:
            for r in parsed:
                r.leg = 1
            legs = 1

    teams = list(dict.fromkeys(name for r in parsed for name in (r.home, r.away)))
    round_of_day = {r.day: r.round for r in parsed if r.day is not None}
    bye_map: dict[int, list[str]] = {}
    for rownum, rnd, day, team in byes:
        if rnd is None:
            rnd = round_of_day.get(day)
        if rnd is None:
            raise InputError(
                "a bye without a round (or a date of a round)", location=f"{where}, row {rownum}"
            )
        if team not in teams:
            teams.append(team)
        bye_map.setdefault(rnd, [])
        if team not in bye_map[rnd]:
            bye_map[rnd].append(team)
    fixtures = tuple(
        Fixture(
            round=r.round, home=r.home, away=r.away, leg=r.leg, venue=r.venue, court=r.court,
            slot=r.slot, date=r.day, start=r.start,
        )
        for r in parsed
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
        columns=tuple((f, col_name[f]) for f in SYNONYMS if f in found),
        notes=tuple(notes),
    )


# --------------------------------------------------------------------------- CSV


_DELIMITERS = (",", ";", "\t", "|")


def _choose_delimiter(text: str) -> str:
    lines = [ln for ln in text.splitlines()[:HEADER_SEARCH_ROWS] if ln.strip()]
    best, best_score = ",", (-1, -1)
    for d in _DELIMITERS:
        score = (-1, -1)
        for cells in csv.reader(lines, delimiter=d):
            found = _match_headers(cells)
            score = max(score, (len(found) + (10 if _usable(found) else 0), len(cells)))
        if score > best_score:
            best, best_score = d, score
    return best


def _read_csv(path: Path, raw: bytes, timezone: str | None) -> ScheduleFile:
    where = str(path)
    text, encoding = decode_text(raw, where)
    if not text.strip():
        raise InputError("the file is empty", location=where)
    delimiter = _choose_delimiter(text)
    try:
        rows = [(k + 1, cells) for k, cells in enumerate(csv.reader(io.StringIO(text),
                                                                      delimiter=delimiter))]
    except csv.Error as exc:
        raise InputError(f"malformed CSV: {exc}", location=where) from exc
    head = _find_header(rows)
    if head is None:
        raise InputError(_expected_message(), location=where)
    pos, _, found = head
    notes = []
    if encoding not in ("utf-8", "utf-8-sig"):
        notes.append(f"read with encoding {encoding}")
    return _rows_to_schedule(
        rows[pos + 1 :], found, rows[pos][1], where, path=path, kind="csv",
        timezone=timezone, encoding=encoding, delimiter=delimiter, notes=notes,
    )


# --------------------------------------------------------------------------- xlsx


def _read_xlsx(path: Path, timezone: str | None) -> ScheduleFile:
    import openpyxl

    where = str(path)
    try:
        book = openpyxl.load_workbook(path, read_only=True, data_only=True)
    except (zipfile.BadZipFile, KeyError, OSError, ValueError) as exc:
        raise InputError(f"not a readable xlsx workbook ({exc})", location=where) from exc
    try:
        names = book.sheetnames
        for name in names:
            ws = book[name]
            rows = []
            for k, values in enumerate(ws.iter_rows(min_row=1, values_only=True)):
                rows.append((k + 1, list(values)))
            head = _find_header(rows)
            if head is None:
                continue
            pos, _, found = head
            return _rows_to_schedule(
                rows[pos + 1 :], found, rows[pos][1], f"{where} [sheet {name!r}]", path=path,
                kind="xlsx", timezone=timezone, sheet=name,
            )
    finally:
        book.close()
    raise InputError(
        _expected_message() + f"; looked at the sheets {', '.join(map(repr, names))}",
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


def read_schedule_with_rows(path: str | Path, *, timezone: str | None = None) -> ScheduleFile:
    """Read a CSV, xlsx or season.json schedule, keeping each fixture's source row."""
    from scheduler.export.season_json import loads_season_bytes

    path = Path(path)
    raw = read_bytes_limited(path)
    kind = _kind_of(path, raw)
    if kind == "xlsx":
        return _read_xlsx(path, timezone)
    if kind == "json":
        season = loads_season_bytes(raw, source=str(path))
        return ScheduleFile(
            season=season,
            rows=tuple(None for _ in season.fixtures),
            path=str(path),
            kind="season.json",
            encoding="utf-8",
        )
    return _read_csv(path, raw, timezone)


def read_schedule(path: str | Path, *, timezone: str | None = None) -> Season:
    """Read a CSV, xlsx or season.json schedule into a :class:`Season`."""
    return read_schedule_with_rows(path, timezone=timezone).season
