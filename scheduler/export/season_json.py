"""``season.json``: the project's own lossless file format of a season, with its fairness figures.

Layout (format tag :data:`FORMAT`; keys always in this order)::

    {
      "format": "roundrobin-scheduler/season/1",
      "league": str, "season": str, "timezone": str | null,
      "teams": [str, ...], "venues": [str, ...],
      "legs": int, "scheme": str, "seed": int, "revision": str,
      "mixing": {"method", "source", "perfect", "perfect_pairs", "pairs"} | null,
      "notes": [str, ...],
      "fixtures": [
        {"round": int (1-based over the season), "leg": int,
         "date": "YYYY-MM-DD" | null, "start": ISO 8601 date-time with UTC offset | null,
         "home": str, "away": str, "venue": str | null,
         "court": str | null   (court / field / table inside the venue),
         "slot": str | null    (time-slot label, e.g. "19:30" or "early"),
         "place": str | null   (court and slot as one label, Fixture.place_label; derived),
         "time": "HH:MM" | null (local kick-off time of "start"; derived)}
      ],
      "byes": {"<round>": [str, ...]},      (rounds in increasing order)
      "fairness": FairnessReport.to_dict() | null,
      "revisions": [{"revision", "played_through", "changed", "note",
                     "postponed": [{"home", "away", "date"}, ...] (only when non-empty)}, ...]
                                            (only in a re-planned season, oldest first)
    }

"place" and "time" are written for readers' convenience and ignored when reading; "fairness"
is ignored too (figures are always recomputed from the fixtures). Reading is
``scheduler.audit.season_file`` (re-exported here). Output is deterministic:
fixtures in the season's order, UTF-8 without ASCII escapes, two-space indent, one trailing
newline (JSON: RFC 8259; date-times: ISO 8601 / RFC 3339 with offset).
"""

from __future__ import annotations

import json
from dataclasses import dataclass

# The reading side lives with the audit's input side; it is re-exported here so callers that
# read back the season they wrote (the output folder) keep one import.
from scheduler.audit.season_file import (
    FORMAT,
    FORMAT_PREFIX,
    SUPPORTED_VERSIONS,
    load_season_json,
    loads_season,
    loads_season_bytes,
    season_from_dict,
)
from scheduler.errors import InputError
from scheduler.fairness.model import FairnessReport
from scheduler.season import Fixture, Revision, Season

__all__ = [
    "FORMAT",
    "FORMAT_PREFIX",
    "OPTIONS_FILE",
    "OPTIONS_FORMAT",
    "SUPPORTED_VERSIONS",
    "StoredOptions",
    "dumps_options",
    "dumps_season",
    "keeps_options",
    "load_season_json",
    "loads_options",
    "loads_season",
    "loads_season_bytes",
    "season_from_dict",
    "season_to_dict",
]


def _fixture_dict(f: Fixture) -> dict:
    return {
        "round": f.round,
        "leg": f.leg,
        "date": f.date.isoformat() if f.date is not None else None,
        "start": f.start.isoformat() if f.start is not None else None,
        "home": f.home,
        "away": f.away,
        "venue": f.venue,
        "court": f.court,
        "slot": f.slot,
        "place": f.place_label,
        "time": f.start.strftime("%H:%M") if f.start is not None else None,
    }


def season_to_dict(season: Season, fairness: FairnessReport | None = None) -> dict:
    """The JSON-ready form of ``season`` (and its fairness figures when given).

    Parameters
    ----------
    season
        The season.
    fairness
        Its fairness figures, or ``None`` (then ``"fairness"`` is ``null``).

    Returns
    -------
    dict
        Plain values in a fixed key order: format, league, season, teams, fixtures, byes,
        fairness, revisions and the presentation fields.

    References
    ----------
    RFC 8259 (JSON); ``docs/season-folder.md``.

    Examples
    --------
    >>> from scheduler.season import Fixture, Season
    >>> data = season_to_dict(Season("Demo", "2031", ("Ash", "Elm"), (Fixture(1, "Ash", "Elm"),)))
    >>> data["teams"], data["fixtures"][0]["home"], data["fairness"]
    (['Ash', 'Elm'], 'Ash', None)
    """
    mixing = None
    if season.mixing is not None:
        m = season.mixing
        mixing = {
            "method": m.method,
            "source": m.source,
            "perfect": m.perfect,
            "perfect_pairs": m.perfect_pairs,
            "pairs": m.pairs,
        }
    return {
        "format": FORMAT,
        "league": season.league,
        "season": season.season_id,
        "timezone": season.timezone,
        "teams": list(season.teams),
        "venues": list(season.venues),
        "legs": season.legs,
        "scheme": season.scheme,
        "seed": season.seed,
        "revision": season.revision,
        "mixing": mixing,
        "notes": list(season.notes),
        "fixtures": [_fixture_dict(f) for f in season.fixtures],
        "byes": {str(r): list(season.byes[r]) for r in sorted(season.byes)},
        "fairness": fairness.to_dict() if fairness is not None else None,
        **({"revisions": [_revision_dict(r) for r in season.revisions]}
           if season.revisions else {}),
        **_presentation(season),
    }


def _presentation(season: Season) -> dict:
    """What the outputs show that is not a fixture: the meaning of "home" and the sides' labels,
    the venues' addresses and map positions, the calendar's last date. Written only where it
    differs from the defaults, so a season without them keeps its earlier bytes."""
    out: dict = {}
    if season.home_meaning != "venue" or season.side_labels != ("Home", "Away"):
        out["home_meaning"] = season.home_meaning
        out["side_labels"] = list(season.side_labels)
    if season.venue_addresses:
        out["venue_addresses"] = dict(sorted(season.venue_addresses.items()))
    if season.venue_coordinates:
        out["venue_coordinates"] = {
            name: [lat, lon] for name, (lat, lon) in sorted(season.venue_coordinates.items())
        }
    if season.calendar_end is not None:
        out["calendar_end"] = season.calendar_end.isoformat()
    if season.options:
        out["options"] = [
            {"label": o.label, "perfect_pairs": o.perfect_pairs, "pairs": o.pairs,
             "breaks": o.breaks, "break_bound": o.break_bound, "carry_over": o.carry_over,
             "chosen": o.chosen, "not_dominated": o.not_dominated,
             **({"detail": o.detail} if o.detail else {})}
            for o in season.options
        ]
    return out


def _revision_dict(r: Revision) -> dict:
    return {
        "revision": r.revision,
        "played_through": r.played_through.isoformat() if r.played_through else None,
        "changed": r.changed,
        "note": r.note,
        **({"postponed": [{"home": home, "away": away, "date": day.isoformat()}
                          for home, away, day in r.postponed]} if r.postponed else {}),
    }


def dumps_season(season: Season, fairness: FairnessReport | None = None) -> str:
    """``season.json`` text: deterministic, UTF-8 (no ASCII escapes), indent 2, final newline.

    Parameters
    ----------
    season
        The season.
    fairness
        Its fairness figures, or ``None``.

    Returns
    -------
    str
        The file's text; read back by :func:`scheduler.audit.season_file.loads_season`.

    References
    ----------
    RFC 8259 (JSON); ``docs/season-folder.md``.

    Examples
    --------
    >>> from scheduler.season import Fixture, Season
    >>> text = dumps_season(Season("Démo", "2031", ("Ash", "Elm"), (Fixture(1, "Ash", "Elm"),)))
    >>> '"league": "Démo"' in text, text.endswith("}\\n")
    (True, True)
    """
    data = season_to_dict(season, fairness)
    return json.dumps(data, ensure_ascii=False, indent=2, allow_nan=False) + "\n"


OPTIONS_FILE = "options.json"
"""The season folder's file of every option's complete season (``docs/options.md``)."""

OPTIONS_FORMAT = "roundrobin-scheduler/options/1"
"""Format tag of :data:`OPTIONS_FILE`."""


def keeps_options(season: Season) -> bool:
    """Whether ``season`` carries the complete seasons of its options (a plan that weighed more
    than one option), so that the folder gets an :data:`OPTIONS_FILE`.

    Parameters
    ----------
    season
        The season to write.

    Returns
    -------
    bool
        True when at least one of ``season.options`` holds its season.
    """
    return any(o.season is not None for o in season.options)


def dumps_options(season: Season) -> str:
    """The text of :data:`OPTIONS_FILE`: every option's complete season, in the order of
    ``season.options`` (``null`` for an option without a timetable), each in the layout of
    ``season.json`` without fairness figures, plus the revision of the season it sits beside.

    Layout::

        {"format": "roundrobin-scheduler/options/1", "league": str, "season": str,
         "revision": str (of the season.json beside it),
         "options": [season.json layout without "fairness" | null, ...]}

    Deterministic like :func:`dumps_season`; ``season.json`` itself is unchanged by it, so
    readers of ``season.json`` never see the options' timetables.

    Parameters
    ----------
    season
        The chosen season, its options carrying their seasons (:func:`keeps_options`).

    Returns
    -------
    str
        JSON text, UTF-8 without ASCII escapes, indent 1, one trailing newline.
    """
    options: list[dict | None] = []
    for option in season.options:
        if option.season is None:
            options.append(None)
            continue
        data = season_to_dict(option.season)
        del data["fairness"]
        options.append(data)
    payload = {"format": OPTIONS_FORMAT, "league": season.league, "season": season.season_id,
               "revision": season.revision, "options": options}
    return json.dumps(payload, ensure_ascii=False, indent=1, allow_nan=False) + "\n"


@dataclass(frozen=True)
class StoredOptions:
    """The contents of :data:`OPTIONS_FILE`.

    Parameters
    ----------
    league, season_id
        The league and season it belongs to.
    revision
        The revision of the ``season.json`` written beside it.
    seasons
        Every option's complete season, ``None`` for an option without a timetable.
    """

    league: str
    season_id: str
    revision: str
    seasons: tuple[Season | None, ...]


def loads_options(text: str, *, source: str = OPTIONS_FILE) -> StoredOptions:
    """Read the text of :data:`OPTIONS_FILE`.

    Parameters
    ----------
    text
        The JSON text.
    source
        Name of the file in error locations.

    Returns
    -------
    StoredOptions

    Raises
    ------
    InputError
        For text that is not an options file of this program (located by its JSON path).
    """
    try:
        data = json.loads(text)
    except json.JSONDecodeError as exc:
        raise InputError(f"not JSON: {exc.msg} (line {exc.lineno})", location=source) from None
    if not isinstance(data, dict) or data.get("format") != OPTIONS_FORMAT:
        raise InputError(f"not an options file of this program (expected format "
                         f"{OPTIONS_FORMAT!r})", location=f"{source}: format")
    for key in ("league", "season", "revision"):
        if not isinstance(data.get(key), str):
            raise InputError(f"{key!r} must be text", location=f"{source}: {key}")
    raw = data.get("options")
    if not isinstance(raw, list):
        raise InputError("'options' must be a list", location=f"{source}: options")
    seasons: list[Season | None] = []
    for i, item in enumerate(raw):
        if item is None:
            seasons.append(None)
            continue
        try:
            seasons.append(season_from_dict(item))
        except InputError as exc:
            inner = f".{exc.location}" if exc.location else ""
            raise InputError(exc.detail, location=f"{source}: options[{i}]{inner}") from None
    return StoredOptions(data["league"], data["season"], data["revision"], tuple(seasons))
