"""Column headers of schedule files: the vocabulary in several languages, and named columns.

A schedule's columns are found by their header. :data:`VOCABULARY` lists, per language, the
words read for each field; :func:`normalise_header` compares them case-insensitively, without
accents and ignoring spaces and the characters ``- _ . # / ( ) '``, so ``"Kick-off"``,
``"kickoff"`` and ``"KICK OFF"`` are one word, and so are ``"Journée"`` and ``"journee"``.
Words were chosen from common usage in league spreadsheets of each language (common practice;
the translations are from memory, see ``docs/audit-input.md``). A word means one field in every
language it belongs to (checked by the tests).

For anything else the columns can be named by hand (``--columns home=Heim,away=Gast``,
:func:`parse_column_names`).

Fields: ``round``, ``leg``, ``date``, ``time``, ``home``, ``away``, ``match`` (one column
holding ``"A v B"``), ``venue``, ``court``, ``slot``.
"""

from __future__ import annotations

import re
import unicodedata
from collections.abc import Mapping, Sequence

from scheduler.errors import InputError

FIELDS = ("round", "leg", "date", "time", "home", "away", "match", "venue", "court", "slot")
"""The fields a schedule's columns can hold, in the order used for reports."""

LANGUAGES = {
    "en": "English",
    "de": "German",
    "fr": "French",
    "es": "Spanish",
    "it": "Italian",
    "nl": "Dutch",
    "pt": "Portuguese",
}
"""The languages of :data:`VOCABULARY` (ISO 639-1 codes)."""

VOCABULARY: dict[str, dict[str, tuple[str, ...]]] = {
    "en": {
        "round": ("round", "rd", "rnd", "round no", "round number", "matchday", "matchday no",
                  "week", "week no", "game day", "game day no", "match week"),
        "leg": ("leg", "leg no", "phase"),
        "date": ("date", "match date", "game date"),
        "time": ("time", "kick-off", "kick-off time", "start", "start time", "ko", "tip-off",
                 "begin"),
        "home": ("home", "home team", "host", "hosts", "home side", "team 1", "team a"),
        "away": ("away", "away team", "visitor", "visitors", "visiting team", "guest", "guests",
                 "away side", "team 2", "team b"),
        "match": ("match", "fixture", "pairing", "matchup"),
        "venue": ("venue", "ground", "location", "field", "stadium", "hall", "arena"),
        "court": ("court", "pitch", "table", "rink", "sheet", "board"),
        "slot": ("slot", "time slot"),
    },
    "de": {
        "round": ("Spieltag", "Runde", "Spielrunde", "Spielwoche"),
        "leg": ("Halbserie", "Serie"),
        "date": ("Datum", "Spieldatum"),
        "time": ("Uhrzeit", "Zeit", "Anstoß", "Anstoss", "Anpfiff", "Beginn", "Spielbeginn"),
        "home": ("Heim", "Heimmannschaft", "Heimteam", "Gastgeber", "Heimverein"),
        "away": ("Gast", "Gastmannschaft", "Gastteam", "Gäste", "Auswärts", "Gastverein"),
        "match": ("Begegnung", "Paarung", "Spiel", "Partie"),
        "venue": ("Spielort", "Ort", "Spielstätte", "Sportplatz", "Halle", "Stadion"),
        "court": ("Feld", "Spielfeld", "Tisch", "Bahn"),
        "slot": ("Zeitfenster",),
    },
    "fr": {
        "round": ("Journée", "Tour", "Numéro de journée"),
        "leg": ("Manche",),
        "date": ("Date", "Date du match"),
        "time": ("Heure", "Horaire", "Coup d'envoi", "Heure du match"),
        "home": ("Domicile", "Équipe à domicile", "Équipe domicile", "Recevant", "Locaux"),
        "away": ("Extérieur", "Équipe extérieure", "Visiteur", "Visiteurs", "Équipe visiteuse"),
        "match": ("Rencontre",),
        "venue": ("Lieu", "Stade", "Salle", "Gymnase"),
        "court": ("Terrain",),
        "slot": ("Créneau", "Créneau horaire"),
    },
    "es": {
        "round": ("Jornada", "Ronda"),
        "leg": ("Vuelta",),
        "date": ("Fecha", "Día"),
        "time": ("Hora", "Horario", "Hora de inicio"),
        "home": ("Local", "Equipo local"),
        "away": ("Visitante", "Equipo visitante", "Visita"),
        "match": ("Partido", "Encuentro", "Enfrentamiento"),
        "venue": ("Estadio", "Sede", "Lugar", "Recinto", "Pabellón", "Campo"),
        "court": ("Cancha", "Pista", "Mesa"),
        "slot": ("Franja", "Franja horaria"),
    },
    "it": {
        "round": ("Giornata", "Turno"),
        "leg": ("Girone",),
        "date": ("Data",),
        "time": ("Ora", "Orario", "Ora di inizio"),
        "home": ("Casa", "Squadra di casa", "Squadra in casa", "Ospitante"),
        "away": ("Ospite", "Ospiti", "Trasferta", "Squadra ospite"),
        "match": ("Partita", "Incontro"),
        "venue": ("Impianto", "Stadio", "Palestra", "Luogo"),
        "court": ("Tavolo",),
        "slot": ("Fascia oraria", "Fascia"),
    },
    "nl": {
        "round": ("Speelronde", "Ronde", "Speeldag", "Speelweek"),
        "leg": ("Seizoenshelft",),
        "date": ("Datum", "Datum wedstrijd"),
        "time": ("Tijd", "Aanvang", "Aftrap", "Begintijd"),
        "home": ("Thuis", "Thuisploeg", "Thuisteam", "Thuisclub"),
        "away": ("Uit", "Uitploeg", "Uitteam", "Bezoekers"),
        "match": ("Wedstrijd",),
        "venue": ("Locatie", "Accommodatie", "Sporthal", "Sportpark"),
        "court": ("Veld", "Baan", "Tafel"),
        "slot": ("Tijdslot", "Tijdvak"),
    },
    "pt": {
        "round": ("Rodada", "Jornada", "Número da rodada"),
        "leg": ("Fase",),
        "date": ("Data", "Data do jogo"),
        "time": ("Hora", "Horário", "Hora do jogo"),
        "home": ("Mandante", "Casa", "Equipa da casa", "Time da casa", "Anfitrião"),
        "away": ("Visitante", "Visitantes", "Equipa visitante", "Time visitante", "Fora"),
        "match": ("Jogo", "Confronto"),
        "venue": ("Estádio", "Ginásio", "Recinto desportivo"),
        "court": ("Quadra",),
        "slot": ("Faixa horária",),
    },
}
"""Header words per language (ISO 639-1 code) and field, as written in spreadsheets.

A word may belong to several languages (``Datum`` is German and Dutch, ``Data`` Italian and
Portuguese), always for the same field.
"""


_IGNORED = re.compile(r"[\s\-_.#/()'’]+")


def normalise_header(header: object) -> str:
    """A header cell as a comparable word: case-folded, without accents and separators.

    Parameters
    ----------
    header
        The cell (any value; ``None`` is the empty word).

    Returns
    -------
    str
        The word used to look the header up.

    Examples
    --------
    >>> normalise_header("Kick-off Time")
    'kickofftime'
    >>> normalise_header("Journée")
    'journee'
    >>> normalise_header("Anstoß")
    'anstoss'
    """
    text = "" if header is None else str(header)
    decomposed = unicodedata.normalize("NFKD", text.strip().casefold())
    plain = "".join(ch for ch in decomposed if not unicodedata.combining(ch))
    return _IGNORED.sub("", plain)


def _lookup() -> dict[str, tuple[str, tuple[str, ...]]]:
    table: dict[str, tuple[str, tuple[str, ...]]] = {}
    for language, fields in VOCABULARY.items():
        for field, words in fields.items():
            for word in words:
                key = normalise_header(word)
                known_field, languages = table.get(key, (field, ()))
                if known_field != field:  # pragma: no cover - guarded by the tests
                    raise AssertionError(f"header word {word!r} means two fields")
                if language not in languages:
                    table[key] = (field, (*languages, language))
    return table


HEADER_LOOKUP: dict[str, tuple[str, tuple[str, ...]]] = _lookup()
"""Normalised header word -> (field, languages the word belongs to)."""


def words_of(field: str) -> tuple[str, ...]:
    """Every header word of ``field`` in every language, normalised (for messages and tests).

    Parameters
    ----------
    field
        One of :data:`FIELDS` (``"round"``, ``"home"``, ...).

    Returns
    -------
    tuple of str
        The normalised words (see :func:`normalise_header`), in vocabulary order; empty for
        an unknown field.

    Examples
    --------
    >>> "spieltag" in words_of("round"), "heim" in words_of("home")
    (True, True)
    """
    return tuple(word for word, (f, _) in HEADER_LOOKUP.items() if f == field)


def match_headers(cells: Sequence[object],
                  named: Mapping[str, str] | None = None) -> dict[str, int]:
    """Field -> column index for a candidate header row (the first match of each field wins).

    Parameters
    ----------
    cells
        The cells of the candidate row.
    named
        Fields named by hand (field -> header text); they take precedence over the vocabulary,
        and a header named by hand is not read as any other field.

    Returns
    -------
    dict
        The fields found and their column indexes (0-based).
    """
    found: dict[str, int] = {}
    wanted = {normalise_header(text): field for field, text in (named or {}).items()}
    for column, cell in enumerate(cells):
        word = normalise_header(cell)
        if word in wanted:
            found.setdefault(wanted[word], column)
    for column, cell in enumerate(cells):
        word = normalise_header(cell)
        if not word or word in wanted or column in found.values():
            continue
        hit = HEADER_LOOKUP.get(word)
        if hit and hit[0] not in found:
            found[hit[0]] = column
    return found


def usable(found: Mapping[str, int], named: Mapping[str, str] | None = None) -> bool:
    """Whether a row's fields name the two sides (home and away, or one match column), and
    every field named by hand.

    Parameters
    ----------
    found
        Field -> column index of a candidate header row (:func:`match_headers`).
    named
        Fields named by hand (field -> header text); each must be among ``found``.

    Returns
    -------
    bool
        ``True`` when the row can serve as the header row.

    Examples
    --------
    >>> usable({"home": 1, "away": 2}), usable({"match": 0}), usable({"home": 1})
    (True, True, False)
    """
    if named and not all(field in found for field in named):
        return False
    return ("home" in found and "away" in found) or "match" in found


def parse_column_names(text: str | None) -> dict[str, str]:
    """Read a ``--columns`` value such as ``"home=Heim,away=Gast,round=Spieltag"``.

    Parameters
    ----------
    text
        Comma-separated ``field=header`` pairs; fields are those of :data:`FIELDS`.

    Returns
    -------
    dict
        Field -> header text, in the order given.

    Raises
    ------
    InputError
        An unknown field, a pair without ``=``, an empty header, or a field given twice.

    Examples
    --------
    >>> parse_column_names("home=Heim, away=Gast")
    {'home': 'Heim', 'away': 'Gast'}
    """
    if not text or not text.strip():
        return {}
    named: dict[str, str] = {}
    for part in text.split(","):
        if not part.strip():
            continue
        field, sep, header = part.partition("=")
        field, header = field.strip().lower(), header.strip()
        if not sep or not header:
            raise InputError(
                f"{part.strip()!r} is not field=header (for example home=Heim)",
                location="--columns",
            )
        if field not in FIELDS:
            raise InputError(
                f"unknown field {field!r}; the fields are {', '.join(FIELDS)}",
                location="--columns",
            )
        if field in named:
            raise InputError(f"the field {field!r} is named twice", location="--columns")
        named[field] = header
    return named


def expected_message(rows_searched: int, named: Mapping[str, str] | None = None) -> str:
    """The message for a file without a recognisable header row.

    Parameters
    ----------
    rows_searched
        How many rows from the top were searched (``HEADER_SEARCH_ROWS`` of the readers).
    named
        Fields named by hand, repeated in the message when given.

    Returns
    -------
    str
        One sentence saying what was expected and how to name the columns by hand.

    Examples
    --------
    >>> expected_message(10, {"home": "Heim"})[:40]
    'no header row in the first 10 rows holds'
    """
    if named:
        shown = ", ".join(f"{field}={header}" for field, header in named.items())
        return (
            f"no header row in the first {rows_searched} rows holds every column named by "
            f"--columns ({shown}) and both sides (home and away, or match)"
        )
    return (
        f"no header row naming the home and away columns in the first {rows_searched} rows "
        "(expected headers such as round, date, time, home, away, venue, court, or their "
        f"{', '.join(LANGUAGES[c] for c in LANGUAGES if c != 'en')} equivalents such as "
        "Spieltag, Heim, Gast; or name the columns with --columns home=...,away=...)"
    )


def languages_of(found: Mapping[str, int], cells: Sequence[object]) -> tuple[str, ...]:
    """The fewest languages whose words make up a header row (for the audit's notes).

    Greedy cover: the language holding most of the row's words first, then the one holding
    most of the rest, and so on (ties in the order of :data:`LANGUAGES`).

    Parameters
    ----------
    found
        Field -> column index of the header row (:func:`match_headers`).
    cells
        The header row's cells.

    Returns
    -------
    tuple of str
        ISO 639-1 codes of :data:`LANGUAGES`, the most used first; empty when no header word
        came from the vocabulary.

    Examples
    --------
    >>> languages_of({"round": 0, "date": 1, "home": 2}, ["Speelronde", "Datum", "Thuis"])
    ('nl',)
    """
    words = []
    for column in found.values():
        hit = HEADER_LOOKUP.get(normalise_header(cells[column]))
        if hit:
            words.append(set(hit[1]))
    chosen: list[str] = []
    while words:
        best = max(LANGUAGES, key=lambda code: sum(code in langs for langs in words))
        chosen.append(best)
        words = [langs for langs in words if best not in langs]
    return tuple(chosen)
