"""Several divisions in one file: read a federation file into frozen, checked values.

A federation file holds the divisions an association plans on one calendar. Its sections:

- ``[federation]``: ``name``, ``season``, ``timezone``, ``seed``, ``solve_seconds`` (shared);
- ``[calendar]``: the shared calendar (the options of a league's ``[calendar]``);
- ``[[venues]]``: every ground and hall of the federation (the options of a league's venue);
- ``[[divisions]]``: ``name``, and per division ``format``, ``rules``, ``priorities``,
  ``calendar`` (options that override the shared calendar), ``teams``, ``venues`` (names of
  shared venues a division plays at when "home" means a side), ``seed``, ``solve_seconds``;
- ``[[teams]]`` (optional): teams listed outside their division, each with ``division``,
  ``name``, ``code``, ``home_venue`` and ``unavailable`` dates (the layout a team sheet gives);
- ``[[shared_grounds]]``: ``teams`` of different divisions on one ground and the ``pattern``
  (``"apart"``: never two of them at home on one day; ``"complementary"``: in addition the first
  team is at home when the other is away, as far as the calendars allow);
- ``[[player_groups]]``: a ``name`` and ``teams`` whose players overlap: never at the same time;
- ``[[clubs]]``: a ``name`` and its ``teams`` (for the club calendars).

Each division becomes an ordinary :class:`~scheduler.config.model.League`, checked by the league
parser (:func:`scheduler.config.loader.parse_league`), so every league check and message applies;
its problems are reported under ``divisions[i]``. Problems across divisions (a team in two
divisions, an unknown division, a group naming an unknown team) are located the same way, with a
did-you-mean suggestion. See ``docs/divisions.md``.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass
from pathlib import Path
from typing import Annotated, Any, Literal

from pydantic import BeforeValidator, Field, ValidationError

from scheduler.config.loader import parse_league, read_config_data
from scheduler.config.messages import describe, field_path, model_at
from scheduler.config.model import League, Venue
from scheduler.config.schema import (
    NonNegative,
    Section,
    Text,
    TextList,
    VenueSection,
    _as_list,
    _choice,
    _season,
    show,
    suggestion,
)
from scheduler.errors import ConfigError

FEDERATION_KEY = "federation"
"""The top-level section that marks a file as a federation file (a league file has ``league``)."""

PATTERNS = ("apart", "complementary")
GroundPattern = Literal["apart", "complementary"]

Raw = dict[str, Any]
RawList = Annotated[list[dict[str, Any]], BeforeValidator(_as_list)]


class FederationSection(Section):
    """The ``[federation]`` section: what every division shares (shape only).

    Parameters
    ----------
    name : str
        The federation's name.
    season : str
        The season's label; a number is kept as text.
    timezone : str
        The IANA time zone of every division.
    seed : int, optional
        The default seed of the divisions (0 or more).
    solve_seconds : float, optional
        The default planning time of a division, in seconds (more than 0, at most a day).
    """

    name: Text
    season: Annotated[Text, BeforeValidator(_season)]
    timezone: Text
    seed: NonNegative = 0
    solve_seconds: Annotated[float, Field(gt=0, le=86400)] = 10.0


class DivisionSection(Section):
    """One ``[[divisions]]`` entry (shape only; its league sections are checked as a league).

    Parameters
    ----------
    name : str
        The division's name.
    format, calendar, rules, priorities : dict, optional
        The division's sections, with the options of a league file (``calendar`` overrides the
        shared calendar option by option).
    teams : list of dict, optional
        The division's teams, as a league file's ``[[teams]]``.
    venues : list of str, optional
        Names of shared venues the division plays at when "home" means a side.
    seed : int or None, optional
        The division's seed; None for the federation's.
    solve_seconds : float or None, optional
        The division's planning time in seconds; None for the federation's.
    """

    name: Text
    format: Raw = Field(default_factory=dict)
    calendar: Raw = Field(default_factory=dict)
    rules: Raw = Field(default_factory=dict)
    priorities: Raw = Field(default_factory=dict)
    teams: RawList = Field(default_factory=list)
    venues: TextList = Field(default_factory=list)
    seed: NonNegative | None = None
    solve_seconds: Annotated[float, Field(gt=0, le=86400)] | None = None


class SharedGroundSection(Section):
    """One ``[[shared_grounds]]`` entry (shape only).

    Parameters
    ----------
    teams : list of str
        Two or more teams of different divisions on one ground.
    pattern : {"apart", "complementary"}, optional
        ``"apart"``: never two of them at home on one day; ``"complementary"``: in addition the
        first team is at home when the other is away, as far as the calendars allow.
    name : str or None, optional
        A name for messages; made from the teams when left out.
    """

    teams: Annotated[TextList, Field(min_length=2)]
    pattern: Annotated[str, BeforeValidator(_choice(PATTERNS, "pattern"))] = "apart"
    name: Text | None = None


class GroupSection(Section):
    """One ``[[player_groups]]`` or ``[[clubs]]`` entry (shape only).

    Parameters
    ----------
    name : str
        The group's or club's name.
    teams : list of str
        Its teams (one or more), in any divisions.
    """

    name: Text
    teams: Annotated[TextList, Field(min_length=1)]


class FederationFile(Section):
    """A whole federation file (shape only; see the module docstring for the sections).

    Parameters
    ----------
    federation : FederationSection
        The shared name, season, time zone and defaults.
    calendar : dict
        The shared calendar, with the options of a league's ``[calendar]``.
    venues : list of dict, optional
        Every ground and hall, with the options of a league's ``[[venues]]``.
    divisions : list of DivisionSection
        One or more divisions.
    teams : list of dict, optional
        Teams listed outside their division (with a ``division`` option).
    shared_grounds : list of SharedGroundSection, optional
        Grounds shared across divisions.
    player_groups : list of GroupSection, optional
        Teams whose players overlap.
    clubs : list of GroupSection, optional
        Clubs and their teams.
    """

    federation: FederationSection
    calendar: Raw
    venues: RawList = Field(default_factory=list)
    divisions: Annotated[list[DivisionSection], BeforeValidator(_as_list), Field(min_length=1)]
    teams: RawList = Field(default_factory=list)
    shared_grounds: Annotated[list[SharedGroundSection], BeforeValidator(_as_list)] = Field(
        default_factory=list)
    player_groups: Annotated[list[GroupSection], BeforeValidator(_as_list)] = Field(
        default_factory=list)
    clubs: Annotated[list[GroupSection], BeforeValidator(_as_list)] = Field(default_factory=list)


# ---- frozen values ---------------------------------------------------------------------------


@dataclass(frozen=True)
class Division:
    """One division: its name and the league it is (teams, format, rules, calendar, venues).

    Parameters
    ----------
    name : str
        The division's name, unique in the federation.
    league : League
        The division as an ordinary league, checked by the league parser.
    """

    name: str
    league: League


@dataclass(frozen=True, slots=True)
class SharedGround:
    """Teams of different divisions on one ground; ``pattern`` as in the module docstring.

    Parameters
    ----------
    name : str
        A name for messages.
    teams : tuple of str
        Two or more teams of different divisions.
    pattern : {"apart", "complementary"}, optional
        ``"apart"``: never two of them at home on one day; ``"complementary"``: in addition the
        first team is at home when the other is away, as far as the calendars allow.
    """

    name: str
    teams: tuple[str, ...]
    pattern: GroundPattern = "apart"


@dataclass(frozen=True, slots=True)
class PlayerGroup:
    """Teams whose players overlap: no two of them play at the same time.

    Parameters
    ----------
    name : str
        The group's name.
    teams : tuple of str
        Its teams, in any divisions.
    """

    name: str
    teams: tuple[str, ...]


@dataclass(frozen=True, slots=True)
class Club:
    """A club and its teams (in any divisions).

    Parameters
    ----------
    name : str
        The club's name.
    teams : tuple of str
        Its teams, in any divisions.
    """

    name: str
    teams: tuple[str, ...]


@dataclass(frozen=True)
class Federation:
    """Several divisions on one calendar with the rules across them.

    See ``docs/divisions.md``.

    Parameters
    ----------
    name : str
        The federation's name.
    season : str
        The season's label.
    timezone : str
        The IANA time zone of every division.
    divisions : tuple of Division
        The divisions, in the file's order.
    venues : tuple of Venue
        Every ground and hall of the federation.
    shared_grounds : tuple of SharedGround, optional
        Grounds shared across divisions.
    player_groups : tuple of PlayerGroup, optional
        Teams whose players overlap.
    clubs : tuple of Club, optional
        Clubs and their teams.
    seed : int, optional
        The federation's default seed.
    source : str or None, optional
        The file it was read from, for messages.
    """

    name: str
    season: str
    timezone: str
    divisions: tuple[Division, ...]
    venues: tuple[Venue, ...]
    shared_grounds: tuple[SharedGround, ...] = ()
    player_groups: tuple[PlayerGroup, ...] = ()
    clubs: tuple[Club, ...] = ()
    seed: int = 0
    source: str | None = None

    @property
    def division_names(self) -> tuple[str, ...]:
        """The division names, in the file's order."""
        return tuple(d.name for d in self.divisions)

    def division(self, name: str) -> Division:
        """The division called ``name`` (``KeyError`` when there is none).

        Parameters
        ----------
        name : str
            The exact division name.

        Returns
        -------
        Division
            The division.

        Raises
        ------
        KeyError
            For a name that is not a division.
        """
        for d in self.divisions:
            if d.name == name:
                return d
        raise KeyError(name)

    def division_of(self, team: str) -> str:
        """The name of the division ``team`` plays in (``KeyError`` when none).

        Parameters
        ----------
        team : str
            A team name.

        Returns
        -------
        str
            The division's name.

        Raises
        ------
        KeyError
            For a team that plays in no division.
        """
        for d in self.divisions:
            if team in d.league.team_names:
                return d.name
        raise KeyError(team)


# ---- reading ---------------------------------------------------------------------------------


def is_federation_data(data: Mapping[str, Any]) -> bool:
    """True when parsed file data is a federation file (it has a ``[federation]`` section).

    Parameters
    ----------
    data : Mapping
        Parsed file data (anything; a non-mapping is not a federation).

    Returns
    -------
    bool
        True for a federation file.

    Examples
    --------
    >>> is_federation_data({"federation": {"name": "Weald FA"}}), is_federation_data({"league": {}})
    (True, False)
    """
    return isinstance(data, Mapping) and FEDERATION_KEY in data


def is_federation_file(path: str | Path) -> bool:
    """True when the file at ``path`` is a federation file: a top-level ``[federation]`` table
    (TOML) or ``federation:`` key (YAML). A cheap look at the text, before any parsing; a file
    that cannot be read is not one (reading it as a league then reports the problem).

    Parameters
    ----------
    path : str or pathlib.Path
        The file.

    Returns
    -------
    bool
        True when the text has a top-level ``federation`` table or key.

    Examples
    --------
    >>> is_federation_file("sample_leagues/federation.toml")  # doctest: +SKIP
    True
    """
    import re

    try:
        with open(path, encoding="utf-8", errors="replace") as handle:
            text = handle.read(2_000_000)
    except OSError:
        return False
    return re.search(r"^(\[federation\]|federation:)", text, flags=re.MULTILINE) is not None


def load_federation(path: str | Path) -> Federation:
    """Read, check and build the federation in ``path`` (``.toml``, ``.yaml`` or ``.yml``).

    Parameters
    ----------
    path
        The federation file.

    Returns
    -------
    Federation
        Frozen, checked values; each division's league already passed the league checks.

    Raises
    ------
    ConfigError
        Every problem found, each located by its field path (``divisions[2].teams[0].name``).

    References
    ----------
    ``docs/divisions.md`` (what a federation file holds and what is checked).

    Examples
    --------
    >>> fed = load_federation("sample_leagues/federation.toml")  # doctest: +SKIP
    >>> len(fed.divisions) >= 12  # doctest: +SKIP
    True
    """
    return parse_federation(read_config_data(path), source=str(path))


def parse_federation(data: Mapping[str, Any], source: str = "<federation>") -> Federation:
    """Check and build a federation from already-parsed file data (see :func:`load_federation`).

    Parameters
    ----------
    data : Mapping
        The parsed federation file.
    source : str, optional
        The file name for messages.

    Returns
    -------
    Federation
        The checked federation; each division a checked league.

    Raises
    ------
    ConfigError
        Every problem found, located by field path, under ``path=source``.
    """
    if not isinstance(data, Mapping):
        raise ConfigError([f"expected sections, got {type(data).__name__}"], path=source)
    if FEDERATION_KEY not in data:
        hint = " (this looks like a league file: plan it with `scheduler plan`)" if (
            "league" in data) else ""
        raise ConfigError([f"federation: this section is missing{hint}"], path=source)
    try:
        doc = FederationFile.model_validate(dict(data))
    except ValidationError as exc:
        raise ConfigError(_shape_problems(exc), path=source) from None
    return _build(doc, source)


def _shape_problems(exc: ValidationError) -> list[str]:
    """Located problems of the federation file's shape (unknown options with did-you-mean)."""
    out: list[str] = []
    for error in exc.errors(include_url=False):
        loc = tuple(error.get("loc", ()))
        if error.get("type") == "extra_forbidden":
            model = model_at(loc, root=FederationFile)
            names = list(getattr(model, "model_fields", {}))
            hint = suggestion(str(loc[-1]), names) or (
                f" (known: {', '.join(names)})" if names else "")
            what = "section" if len(loc) == 1 else "option"
            text = f"{field_path(loc)}: unknown {what}{hint}"
        else:
            text = describe(dict(error))
        if text not in out:
            out.append(text)
    return out


def _venue_names(doc: FederationFile) -> tuple[list[str], list[str]]:
    names, problems = [], []
    for i, v in enumerate(doc.venues):
        name = v.get("name")
        if not isinstance(name, str) or not name.strip():
            problems.append(f"venues[{i}].name: every venue needs a name")
            continue
        if name.strip() in names:
            problems.append(f"venues[{i}].name: {show(name)} is listed twice")
        try:
            VenueSection.model_validate(dict(v))
        except ValidationError as exc:
            problems.extend(f"venues[{i}].{p}" for p in _shape_problems(exc))
        names.append(name.strip())
    return names, problems


def _teams_by_division(
    doc: FederationFile, problems: list[str]
) -> dict[int, list[tuple[str, Raw]]]:
    """Per division index: (location, team entry) of its teams, from both places teams may be."""
    div_names = [d.name for d in doc.divisions]
    seen_div: dict[str, int] = {}
    for i, name in enumerate(div_names):
        if name in seen_div:
            problems.append(
                f"divisions[{i}].name: {show(name)} is already divisions[{seen_div[name]}]")
        seen_div.setdefault(name, i)
    out: dict[int, list[tuple[str, Raw]]] = {i: [] for i in range(len(div_names))}
    for i, d in enumerate(doc.divisions):
        for j, team in enumerate(d.teams):
            out[i].append((f"divisions[{i}].teams[{j}]", dict(team)))
    for j, team in enumerate(doc.teams):
        entry = dict(team)
        division = entry.pop("division", None)
        if not isinstance(division, str) or not division.strip():
            problems.append(f"teams[{j}].division: every team listed here needs its division")
            continue
        division = division.strip()
        if division not in seen_div:
            problems.append(
                f"teams[{j}].division: {show(division)} is not a division"
                f"{suggestion(division, div_names)}"
            )
            continue
        out[seen_div[division]].append((f"teams[{j}]", entry))
    return out


def _division_data(doc: FederationFile, index: int, teams: list[tuple[str, Raw]],
                   venue_data: dict[str, Raw]) -> tuple[Raw, list[str], list[str]]:
    """The league data of division ``index``, its team locations and early problems."""
    d = doc.divisions[index]
    fed = doc.federation
    problems: list[str] = []
    league_teams: list[Raw] = []
    unavailable: list[Raw] = []
    locations: list[str] = []
    for where, entry in teams:
        entry = dict(entry)
        dates = entry.pop("unavailable", None)
        home = entry.get("home_venue")
        if isinstance(home, str) and home.strip() and home.strip() not in venue_data:
            problems.append(f"{where}.home_venue: {show(home)} is not a venue of the federation"
                            f"{suggestion(home.strip(), list(venue_data))}")
            entry.pop("home_venue")
        if dates not in (None, []):
            unavailable.append({"team": entry.get("name"), "dates": dates})
        league_teams.append(entry)
        locations.append(where)
    used = [v for v in d.venues]
    for name in used:
        if name not in venue_data:
            problems.append(f"divisions[{index}].venues: {show(name)} is not a venue of the "
                            f"federation{suggestion(name, list(venue_data))}")
    for entry in league_teams:
        home = entry.get("home_venue")
        if isinstance(home, str) and home.strip() in venue_data and home.strip() not in used:
            used.append(home.strip())
    rules = dict(d.rules)
    if unavailable:
        rules["unavailable"] = list(rules.get("unavailable", [])) + unavailable
    league = {
        "name": d.name,
        "season": fed.season,
        "timezone": fed.timezone,
        "seed": fed.seed if d.seed is None else d.seed,
        "solve_seconds": fed.solve_seconds if d.solve_seconds is None else d.solve_seconds,
    }
    data: Raw = {
        "league": league,
        "format": dict(d.format),
        "calendar": _calendar(doc.calendar, d.calendar),
        "venues": [venue_data[name] for name in used if name in venue_data],
        "teams": league_teams,
        "rules": rules,
        "priorities": dict(d.priorities),
    }
    return data, locations, problems


def _calendar(shared: Raw, own: Raw) -> Raw:
    """A division's calendar: the shared one with the division's options on top; a division
    that lists its own ``dates`` drops the shared weekday pattern (start, end, weekdays)."""
    base = dict(shared)
    if "dates" in own:
        for key in ("weekdays", "start", "end"):
            base.pop(key, None)
    return {**base, **own}


def _relocate(problem: str, index: int, locations: list[str], own_calendar: bool,
              venue_index: list[int]) -> str:
    """A league problem in the federation file's terms."""
    if problem.startswith("league."):
        return "federation." + problem[len("league."):]
    if problem.startswith("calendar") and not own_calendar:
        return problem
    if problem.startswith("teams["):
        number, _, rest = problem[len("teams["):].partition("]")
        if number.isdigit() and int(number) < len(locations):
            return locations[int(number)] + rest
    if problem.startswith("venues["):
        number, _, rest = problem[len("venues["):].partition("]")
        if number.isdigit() and int(number) < len(venue_index):
            return f"venues[{venue_index[int(number)]}]{rest} (in division {index})"
    return f"divisions[{index}].{problem}"


def _build(doc: FederationFile, source: str) -> Federation:
    venue_names, problems = _venue_names(doc)
    venue_data = {name: dict(doc.venues[i]) for i, name in enumerate(venue_names)}
    by_division = _teams_by_division(doc, problems)
    divisions: list[Division] = []
    team_home: dict[str, str] = {}
    team_division: dict[str, int] = {}
    for i, d in enumerate(doc.divisions):
        data, locations, early = _division_data(doc, i, by_division[i], venue_data)
        problems.extend(early)
        for where, entry in zip(locations, data["teams"], strict=True):
            name = entry.get("name")
            if isinstance(name, str) and name.strip():
                key = name.strip()
                if key in team_home and team_division[key] != i:
                    problems.append(f"{where}.name: {show(key)} is already a team of another "
                                    f"division ({team_home[key]}); a team plays in one division")
                team_home.setdefault(key, f"{where.split('.')[0]} in division {d.name!r}")
                team_division.setdefault(key, i)
        if early:
            continue
        try:
            league = parse_league(data, source=f"{source} divisions[{i}]")
        except ConfigError as exc:
            own = bool(d.calendar)
            used = [venue_names.index(v["name"].strip()) for v in data["venues"]]
            problems.extend(_relocate(p, i, locations, own, used) for p in exc.problems)
            continue
        divisions.append(Division(d.name, league))
    all_teams = list(team_home)
    grounds = []
    for i, g in enumerate(doc.shared_grounds):
        problems.extend(_team_refs(f"shared_grounds[{i}]", g.teams, all_teams))
        if g.pattern == "complementary" and len(g.teams) != 2:
            problems.append(f"shared_grounds[{i}].pattern: 'complementary' pairs exactly two "
                            f"teams, {len(g.teams)} are listed")
        grounds.append(SharedGround(g.name or " / ".join(g.teams), tuple(g.teams),
                                    g.pattern))  # type: ignore[arg-type]
    groups = []
    for i, entry in enumerate(doc.player_groups):
        problems.extend(_team_refs(f"player_groups[{i}]", entry.teams, all_teams))
        groups.append(PlayerGroup(entry.name, tuple(entry.teams)))
    clubs = []
    for i, c in enumerate(doc.clubs):
        problems.extend(_team_refs(f"clubs[{i}]", c.teams, all_teams))
        clubs.append(Club(c.name, tuple(c.teams)))
    problems = list(dict.fromkeys(problems))
    if problems:
        raise ConfigError(problems, path=source)
    division_of = {t: d.name for d in divisions for t in d.league.team_names}
    for i, ground in enumerate(grounds):
        if len({division_of[t] for t in ground.teams}) < len(ground.teams):
            problems.append(f"shared_grounds[{i}].teams: two of these teams are in one division; "
                            "a ground shared inside a division is that division's "
                            "rules.shared_grounds")
    if problems:
        raise ConfigError(problems, path=source)
    venues = tuple(
        Venue(name=v.name, courts=v.courts, slots=v.slots, address=v.address)
        for name in venue_names
        for v in _venue_of(divisions, name, venue_data[name])
    )
    fed = doc.federation
    return Federation(
        name=fed.name, season=fed.season, timezone=fed.timezone, divisions=tuple(divisions),
        venues=venues, shared_grounds=tuple(grounds), player_groups=tuple(groups),
        clubs=tuple(clubs), seed=fed.seed, source=source)


def _venue_of(divisions: list[Division], name: str, raw: Raw) -> list[Venue]:
    """The checked Venue called ``name`` (from a division that uses it, else parsed alone)."""
    for d in divisions:
        for v in d.league.venues:
            if v.name == name:
                return [v]
    section = VenueSection.model_validate(dict(raw))
    return [Venue(name=name, courts=tuple(section.courts), slots=tuple(section.slots),
                  address=section.address)]


def _team_refs(where: str, teams: list[str], known: list[str]) -> list[str]:
    problems = []
    seen: set[str] = set()
    for j, team in enumerate(teams):
        if team not in known:
            problems.append(f"{where}.teams[{j}]: {show(team)} is not a team of any division"
                            f"{suggestion(team, known)}")
        elif team in seen:
            problems.append(f"{where}.teams[{j}]: {show(team)} is listed twice")
        seen.add(team)
    return problems
