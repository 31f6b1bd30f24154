"""Read ``season.json``, the project's own season file, back into a :class:`Season`.

The layout is documented with the writer (``scheduler.export.season_json``); both share the
format tag :data:`FORMAT`. Every malformed document raises a located
:class:`~scheduler.errors.InputError` (``fixtures[3].start``); the text is refused before parsing
when it is bigger than the limits of ``scheduler.audit.limits`` or nested deeper than
:data:`~scheduler.audit.limits.MAX_NESTING_DEPTH`. "place", "time" and "fairness" are ignored:
the figures are always recomputed from the fixtures.
"""

from __future__ import annotations

import json
from datetime import date, datetime
from pathlib import Path
from zoneinfo import ZoneInfo, ZoneInfoNotFoundError

from scheduler.audit.limits import check_nesting, read_bytes_limited
from scheduler.config.names import character_problem
from scheduler.errors import InputError
from scheduler.season import Fixture, MixingInfo, PlanOptionFigures, Revision, Season

FORMAT = "roundrobin-scheduler/season/1"
"""The format tag written into every file; the number after the last slash is the version."""

FORMAT_PREFIX = "roundrobin-scheduler/season/"
SUPPORTED_VERSIONS = (1,)



def _need(data: dict, key: str, kinds, where: str, *, optional: bool = False, default=None):
    if key not in data or data[key] is None:
        if optional:
            return default
        raise InputError(f"missing {key!r}", location=f"{where}.{key}" if where else key)
    value = data[key]
    if isinstance(value, bool) and bool not in (kinds if isinstance(kinds, tuple) else (kinds,)):
        raise InputError(f"{key!r} must be {_kind_name(kinds)}", location=_loc(where, key))
    if not isinstance(value, kinds):
        raise InputError(
            f"{key!r} must be {_kind_name(kinds)}, got {type(value).__name__}",
            location=_loc(where, key),
        )
    return value


def _loc(where: str, key: str) -> str:
    return f"{where}.{key}" if where else key


def _kind_name(kinds) -> str:
    kinds = kinds if isinstance(kinds, tuple) else (kinds,)
    words = {str: "text", int: "a whole number", bool: "true or false", list: "a list",
             dict: "an object"}
    return " or ".join(words.get(k, k.__name__) for k in kinds)


def _str_list(data: dict, key: str, where: str) -> tuple[str, ...]:
    values = _need(data, key, list, where, optional=True, default=[])
    for i, v in enumerate(values):
        if not isinstance(v, str):
            raise InputError(
                f"entries of {key!r} must be text", location=f"{_loc(where, key)}[{i}]"
            )
    return tuple(values)


def _zone(name: str | None):
    if not name:
        return None
    try:
        return ZoneInfo(name)
    except (ZoneInfoNotFoundError, ValueError) as exc:
        raise InputError(f"unknown time zone {name!r}", location="timezone") from exc


def _fixture(item, i: int, zone) -> Fixture:
    where = f"fixtures[{i}]"
    if not isinstance(item, dict):
        raise InputError("a fixture must be an object", location=where)
    rnd = _need(item, "round", int, where)
    leg = _need(item, "leg", int, where, optional=True, default=1)
    home = _need(item, "home", str, where)
    away = _need(item, "away", str, where)
    venue = _need(item, "venue", str, where, optional=True)
    court = _need(item, "court", str, where, optional=True)
    slot = _need(item, "slot", str, where, optional=True)
    day_text = _need(item, "date", str, where, optional=True)
    start_text = _need(item, "start", str, where, optional=True)
    day = None
    if day_text is not None:
        try:
            day = date.fromisoformat(day_text)
        except ValueError as exc:
            raise InputError(f"not an ISO date: {day_text!r}", location=f"{where}.date") from exc
    start = None
    if start_text is not None:
        try:
            start = datetime.fromisoformat(start_text)
        except ValueError as exc:
            raise InputError(
                f"not an ISO date-time: {start_text!r}", location=f"{where}.start"
            ) from exc
        if start.tzinfo is None:
            raise InputError(
                f"the start {start_text!r} has no UTC offset", location=f"{where}.start"
            )
        if zone is not None:
            start = start.astimezone(zone)
    return Fixture(
        round=rnd, home=home, away=away, leg=leg, venue=venue, court=court, slot=slot,
        date=day, start=start,
    )


def season_name_problem(season: Season) -> tuple[str, str] | None:
    """(place, problem) of the first team name of ``season`` holding a control, text-direction or
    unassigned character (``scheduler.config.names``), or ``None``.

    Reading a season file back never refuses such names (the writer may hold any season made in
    memory); the audit of a file from elsewhere does, with this place.

    Parameters
    ----------
    season
        The season whose team names are checked (team list first, then each fixture).

    Returns
    -------
    tuple of (str, str) or None
        The place (``"teams[2]"``, ``"fixtures[5].home"``) and the problem as a sentence, or
        ``None`` when every name is acceptable.

    Examples
    --------
    >>> from scheduler.season import Fixture, Season
    >>> season_name_problem(Season("L", "2031", ("A", "B"), (Fixture(1, "A", "B"),))) is None
    True
    >>> season_name_problem(Season("L", "2031", ("A", "B\\x07"), ()))[0]
    'teams[1]'
    """
    for i, team in enumerate(season.teams):
        problem = character_problem(team)
        if problem:
            return f"teams[{i}]", f"the team name {team!r} {problem}"
    for i, fixture in enumerate(season.fixtures):
        for side in ("home", "away"):
            name = getattr(fixture, side)
            problem = character_problem(name)
            if problem:
                return f"fixtures[{i}].{side}", f"the team name {name!r} {problem}"
    return None


def _revisions(data: dict) -> tuple[Revision, ...]:
    """The revision history of a re-planned season (absent in a season never re-planned)."""
    raw = _need(data, "revisions", list, "", optional=True, default=[])
    out = []
    for i, item in enumerate(raw):
        where = f"revisions[{i}]"
        if not isinstance(item, dict):
            raise InputError("a revision must be an object", location=where)
        day = _need(item, "played_through", str, where, optional=True)
        try:
            through = date.fromisoformat(day) if day is not None else None
        except ValueError as exc:
            raise InputError(f"not an ISO date: {day!r}", location=f"{where}.played_through"
                             ) from exc
        postponed = []
        for j, game in enumerate(_need(item, "postponed", list, where, optional=True,
                                       default=[])):
            spot = f"{where}.postponed[{j}]"
            if not isinstance(game, dict):
                raise InputError("a postponed game must be an object", location=spot)
            text = _need(game, "date", str, spot)
            try:
                planned = date.fromisoformat(text)
            except ValueError as exc:
                raise InputError(f"not an ISO date: {text!r}", location=f"{spot}.date"
                                 ) from exc
            postponed.append((_need(game, "home", str, spot), _need(game, "away", str, spot),
                              planned))
        out.append(Revision(
            revision=_need(item, "revision", str, where),
            played_through=through,
            changed=_need(item, "changed", int, where, optional=True, default=0),
            note=_need(item, "note", str, where, optional=True, default=""),
            postponed=tuple(postponed),
        ))
    return tuple(out)


def season_from_dict(data: object) -> Season:
    """Rebuild a :class:`Season` from :func:`season_to_dict` output; located
    :class:`InputError` on anything malformed. Kick-offs are put in the season's time zone.

    Parameters
    ----------
    data
        The parsed JSON of a ``season.json`` file.

    Returns
    -------
    Season
        The season, revisions and plan options included.

    Raises
    ------
    InputError
        For anything malformed: not an object, another format or version, a missing or wrong
        field (located by its JSON path).

    References
    ----------
    RFC 8259 (JSON); ``docs/season-folder.md``.
    """
    if not isinstance(data, dict):
        raise InputError("a season file must hold one JSON object", location="(top level)")
    tag = data.get("format")
    if not isinstance(tag, str) or not tag.startswith(FORMAT_PREFIX):
        raise InputError(
            f"not a season file of this tool (format tag {tag!r}, expected {FORMAT!r})",
            location="format",
        )
    version = tag[len(FORMAT_PREFIX):]
    if not version.isdigit() or int(version) not in SUPPORTED_VERSIONS:
        raise InputError(
            f"season file version {version!r} is not supported (supported: "
            f"{', '.join(map(str, SUPPORTED_VERSIONS))})",
            location="format",
        )
    timezone = _need(data, "timezone", str, "", optional=True)
    zone = _zone(timezone)
    raw_fixtures = _need(data, "fixtures", list, "")
    fixtures = tuple(_fixture(item, i, zone) for i, item in enumerate(raw_fixtures))
    raw_byes = _need(data, "byes", dict, "", optional=True, default={})
    byes: dict[int, tuple[str, ...]] = {}
    for key, names in raw_byes.items():
        if not str(key).lstrip("-").isdigit():
            raise InputError(f"bye round {key!r} is not a number", location=f"byes.{key}")
        if not isinstance(names, list) or not all(isinstance(x, str) for x in names):
            raise InputError("byes must list team names", location=f"byes.{key}")
        byes[int(key)] = tuple(names)
    byes = dict(sorted(byes.items()))
    mixing = None
    raw_mixing = _need(data, "mixing", dict, "", optional=True)
    if raw_mixing is not None:
        mixing = MixingInfo(
            method=_need(raw_mixing, "method", str, "mixing"),
            source=_need(raw_mixing, "source", str, "mixing"),
            perfect=_need(raw_mixing, "perfect", bool, "mixing"),
            perfect_pairs=_need(raw_mixing, "perfect_pairs", int, "mixing"),
            pairs=_need(raw_mixing, "pairs", int, "mixing"),
        )
    return Season(
        league=_need(data, "league", str, ""),
        season_id=_need(data, "season", str, "", optional=True, default=""),
        teams=_str_list(data, "teams", ""),
        fixtures=fixtures,
        byes=byes,
        legs=_need(data, "legs", int, "", optional=True, default=1),
        scheme=_need(data, "scheme", str, "", optional=True, default="mirrored"),
        timezone=timezone,
        venues=_str_list(data, "venues", ""),
        mixing=mixing,
        seed=_need(data, "seed", int, "", optional=True, default=0),
        notes=_str_list(data, "notes", ""),
        revision=_need(data, "revision", str, "", optional=True, default=""),
        revisions=_revisions(data),
        **_presentation(data),
    )


def _presentation(data: dict) -> dict:
    """The optional presentation fields of a season file (see ``export.season_json``)."""
    out: dict = {}
    meaning = _need(data, "home_meaning", str, "", optional=True)
    if meaning is not None:
        if meaning not in ("venue", "side"):
            raise InputError(f"home_meaning must be 'venue' or 'side', got {meaning!r}",
                             location="home_meaning")
        out["home_meaning"] = meaning
    labels = _str_list(data, "side_labels", "")
    if labels:
        if len(labels) != 2:
            raise InputError("side_labels must name two sides", location="side_labels")
        out["side_labels"] = (labels[0], labels[1])
    addresses = _need(data, "venue_addresses", dict, "", optional=True, default={})
    if addresses:
        if not all(isinstance(k, str) and isinstance(v, str) for k, v in addresses.items()):
            raise InputError("venue addresses must be text", location="venue_addresses")
        out["venue_addresses"] = dict(addresses)
    coordinates = _need(data, "venue_coordinates", dict, "", optional=True, default={})
    if coordinates:
        parsed = {}
        for name, pair in coordinates.items():
            ok = (isinstance(pair, list) and len(pair) == 2
                  and all(isinstance(x, int | float) and not isinstance(x, bool) for x in pair))
            if not ok:
                raise InputError("a venue position is [latitude, longitude]",
                                 location=f"venue_coordinates.{name}")
            parsed[name] = (float(pair[0]), float(pair[1]))
        out["venue_coordinates"] = parsed
    end = _need(data, "calendar_end", str, "", optional=True)
    if end is not None:
        try:
            out["calendar_end"] = date.fromisoformat(end)
        except ValueError as exc:
            raise InputError(f"not an ISO date: {end!r}", location="calendar_end") from exc
    raw_options = _need(data, "options", list, "", optional=True, default=[])
    options = []
    for i, item in enumerate(raw_options):
        where = f"options[{i}]"
        if not isinstance(item, dict):
            raise InputError("an option must be an object", location=where)
        label = _need(item, "label", str, where)
        detail = _need(item, "detail", str, where, optional=True, default=None)
        if detail is None:
            # files written before options had a short label kept "kind: construction" in one
            # string (docs/options.md); read them as label and detail
            label, _, detail = label.partition(": ")
        options.append(PlanOptionFigures(
            label=label, detail=detail,
            perfect_pairs=_need(item, "perfect_pairs", int, where),
            pairs=_need(item, "pairs", int, where),
            breaks=_need(item, "breaks", int, where, optional=True),
            break_bound=_need(item, "break_bound", int, where, optional=True, default=0),
            carry_over=_need(item, "carry_over", int, where, optional=True),
            chosen=_need(item, "chosen", bool, where, optional=True, default=False),
            not_dominated=_need(item, "not_dominated", bool, where, optional=True,
                                default=False),
        ))
    if options:
        out["options"] = tuple(options)
    return out


def loads_season(text: str, *, source: str = "season.json") -> Season:
    """Parse ``season.json`` text (``source`` names it in error locations).

    Parameters
    ----------
    text
        The JSON text.
    source
        Name of the input in error locations.

    Returns
    -------
    Season
        The season, as :func:`season_from_dict` builds it.

    Raises
    ------
    InputError
        For text that is not JSON, nested too deeply, or not a season file of this tool.

    References
    ----------
    RFC 8259 (JSON); ``docs/season-folder.md``.

    Examples
    --------
    >>> from scheduler.export.season_json import dumps_season
    >>> from scheduler.season import Fixture, Season
    >>> season = Season("Demo", "2031", ("Ash", "Elm"), (Fixture(1, "Ash", "Elm"),))
    >>> loads_season(dumps_season(season)).fixtures == season.fixtures
    True
    >>> try:
    ...     loads_season("[1, 2", source="demo.json")
    ... except InputError as error:
    ...     print(error.location)
    demo.json: line 1, column 6
    """
    check_nesting(text, source)
    try:
        data = json.loads(text)
    except json.JSONDecodeError as exc:
        raise InputError(
            f"not valid JSON: {exc.msg}",
            location=f"{source}: line {exc.lineno}, column {exc.colno}",
        ) from exc
    except RecursionError as exc:  # nesting the bracket count could not see
        raise InputError("the file nests lists or objects too deeply", location=source) from exc
    try:
        return season_from_dict(data)
    except InputError as exc:
        raise InputError(exc.detail, location=f"{source}: {exc.location}") from exc


def load_season_json(path: str | Path) -> Season:
    """Read a ``season.json`` file (size-limited, UTF-8 with or without BOM).

    Parameters
    ----------
    path
        The ``season.json`` file.

    Returns
    -------
    Season
        The season it holds.

    Raises
    ------
    InputError
        For a file that cannot be read, is too large, is not UTF-8 or is not a season file.

    References
    ----------
    RFC 8259 (JSON); ``docs/season-folder.md``.

    Examples
    --------
    >>> import tempfile
    >>> from scheduler.export.season_json import dumps_season
    >>> from scheduler.season import Fixture, Season
    >>> season = Season("Demo", "2031", ("Ash", "Elm"), (Fixture(1, "Ash", "Elm"),))
    >>> path = Path(tempfile.mkdtemp()) / "season.json"
    >>> _ = path.write_text(dumps_season(season), encoding="utf-8")
    >>> load_season_json(path).teams
    ('Ash', 'Elm')
    """
    path = Path(path)
    return loads_season_bytes(read_bytes_limited(path), source=str(path))


def loads_season_bytes(raw: bytes, *, source: str) -> Season:
    """A season from the bytes of a ``season.json`` (UTF-8 with or without BOM).

    Parameters
    ----------
    raw
        The file's bytes (already size-checked by the caller).
    source
        Name of the input in error locations.

    Returns
    -------
    Season
        The season, as :func:`loads_season` reads it.

    Raises
    ------
    InputError
        Bytes that are not UTF-8, or text that :func:`loads_season` refuses.
    """
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        raise InputError(
            f"a season file must be UTF-8 (undecodable byte at offset {exc.start})",
            location=source,
        ) from exc
    return loads_season(text, source=source)
