"""Couplings between divisions and the units of work they form.

Three kinds of coupling join two divisions (``docs/divisions.md`` explains each):

- ``ground``: teams of different divisions on one ground, never both at home on one day
  (explicit ``[[shared_grounds]]``, or found: a ground with room for one game at a time that is
  the home venue of teams of several divisions);
- ``venue``: a ground or hall with several courts or time slots used by several divisions; its
  courts and slots are split between them (:func:`venue_shares`);
- ``players``: a ``[[player_groups]]`` entry: its teams never play at the same time.

The divisions are the nodes of a graph (networkx) and every coupling joins the divisions it
touches; the connected components are the units of work: divisions of one unit are planned
together, units are independent of each other (``networkx.connected_components``, Hagberg,
Schult & Swart 2008, "Exploring network structure, dynamics, and function using NetworkX").
"""

from __future__ import annotations

import itertools
from dataclasses import dataclass, replace
from typing import Literal

import networkx as nx

from scheduler.config.federation import Federation
from scheduler.config.model import League, Venue
from scheduler.errors import ConfigError

CouplingKind = Literal["ground", "venue", "players"]


@dataclass(frozen=True, slots=True)
class Coupling:
    """One rule across divisions.

    ``teams`` are the teams it binds (for a venue: the teams of its divisions homed there, empty
    when "home" is a side), ``divisions`` the divisions it joins, ``pattern`` the ground pattern
    (``apart``/``complementary``; empty for other kinds), ``venue`` the ground or hall.

    Parameters
    ----------
    kind : {"ground", "venue", "players"}
        What couples the divisions.
    name : str
        The ground, venue or group.
    divisions : tuple of str
        The divisions it joins.
    teams : tuple of str
        The teams it binds.
    pattern : str
        ``apart`` or ``complementary`` for a ground.
    venue : str or None
        The ground or hall, where there is one.

    Examples
    --------
    >>> Coupling("ground", "Mill Lane", ("First", "Reserves"), ("Mill", "Mill Reserves"),
    ...          "complementary").describe()
    "shared ground 'Mill Lane' (Mill, Mill Reserves): complementary home/away"
    """

    kind: CouplingKind
    name: str
    divisions: tuple[str, ...]
    teams: tuple[str, ...] = ()
    pattern: str = ""
    venue: str | None = None

    def describe(self) -> str:
        """The coupling in the words of the federation file.

        Returns
        -------
        str
        """
        if self.kind == "ground":
            what = "complementary home/away" if self.pattern == "complementary" else (
                "never both at home on one day")
            return f"shared ground {self.name!r} ({', '.join(self.teams)}): {what}"
        if self.kind == "venue":
            return (f"venue {self.name!r} shared by divisions {', '.join(self.divisions)}: "
                    "its courts and slots are split between them")
        return f"player group {self.name!r} ({', '.join(self.teams)}): never at the same time"


@dataclass(frozen=True, slots=True)
class Unit:
    """A unit of work: divisions planned together, in ``divisions`` order (file order).

    Parameters
    ----------
    key : str
        ``unit-01``, ``unit-02``, ...
    divisions : tuple of str
        Its divisions, in file order.

    Examples
    --------
    >>> Unit("unit-01", ("First", "Reserves")).divisions
    ('First', 'Reserves')
    """

    key: str
    divisions: tuple[str, ...]


def _games_per_day(league: League, venue: str) -> int:
    """Most games ``league`` can put at ``venue`` on one match day."""
    per_round = len(league.teams) // 2
    if league.format.home_meaning == "side":
        hosted = per_round
    else:
        hosted = min(per_round, sum(1 for t in league.teams if t.home_venue == venue))
    return hosted * max(1, league.calendar.rounds_per_day)


def possible_windows(league: League) -> list[tuple[int, int]]:
    """Minute-of-day intervals ``[start, end)`` in which ``league`` may play a game.

    From the slots of its venues (or the calendar's kick-off, and the later rounds of one day
    when several rounds share it) and its ``game_minutes``.

    Parameters
    ----------
    league : League
        The division.

    Returns
    -------
    list of tuple of int
        ``(start, end)`` minutes of the day, sorted.
    """
    cal = league.calendar
    minutes = cal.game_minutes
    per_day = max(1, cal.rounds_per_day)
    starts: set[int] = set()
    for venue in league.venues:
        if venue.slots:
            starts.update(s.hour * 60 + s.minute for s in venue.slots)
    base = cal.kickoff.hour * 60 + cal.kickoff.minute
    if not starts or any(not v.slots for v in league.venues) or not league.venues:
        starts.update(base + j * minutes for j in range(per_day))
    return sorted((s, s + minutes) for s in starts)


def windows_overlap(first: tuple[int, int], second: tuple[int, int]) -> bool:
    """Whether two half-open intervals ``[start, end)`` (minutes of the day) overlap.

    Parameters
    ----------
    first, second : tuple of int
        ``(start, end)``, as :func:`possible_windows` gives them.

    Returns
    -------
    bool

    Examples
    --------
    >>> windows_overlap((600, 690), (660, 750)), windows_overlap((600, 690), (690, 780))
    (True, False)
    """
    return first[0] < second[1] and second[0] < first[1]


def _users(fed: Federation) -> dict[str, list[str]]:
    """Venue name -> divisions that play there (file order)."""
    users: dict[str, list[str]] = {}
    for d in fed.divisions:
        lg = d.league
        names = ([v.name for v in lg.venues] if lg.format.home_meaning == "side"
                 else sorted({t.home_venue for t in lg.teams if t.home_venue},
                             key=[v.name for v in lg.venues].index))
        for name in names:
            users.setdefault(name, []).append(d.name)
    return users


def _day_keys(league: League) -> frozenset:
    """What match days ``league`` may use: its explicit dates, else its weekdays."""
    cal = league.calendar
    if cal.dates:
        return frozenset(("date", d) for d in cal.dates) | frozenset(
            ("weekday", d.weekday()) for d in cal.dates)
    return frozenset(("weekday", w) for w in cal.weekdays)


def may_share_day(a: League, b: League) -> bool:
    """Whether two divisions can ever play on the same day (a common weekday, or a date of one
    on a weekday of the other). Divisions that never share a day need no coupling.

    Parameters
    ----------
    a, b : League
        The two divisions' leagues.

    Returns
    -------
    bool
    """
    ka, kb = _day_keys(a), _day_keys(b)
    if ka & kb:
        return True
    dates_a = {d for kind, d in ka if kind == "date"}
    dates_b = {d for kind, d in kb if kind == "date"}
    days_a = {w for kind, w in ka if kind == "weekday"}
    days_b = {w for kind, w in kb if kind == "weekday"}
    return any(d.weekday() in days_b for d in dates_a) or any(
        d.weekday() in days_a for d in dates_b)


def same_day_groups(fed: Federation, divisions: list[str]) -> list[list[str]]:
    """``divisions`` cut into groups that can share a day (connected under :func:`may_share_day`),
    each in the given order; groups of one are left out.

    Parameters
    ----------
    fed : Federation
        The federation.
    divisions : list of str
        Division names.

    Returns
    -------
    list of list of str
    """
    graph = nx.Graph()
    graph.add_nodes_from(divisions)
    for a, b in itertools.combinations(divisions, 2):
        if may_share_day(fed.division(a).league, fed.division(b).league):
            graph.add_edge(a, b)
    rank = {d: i for i, d in enumerate(divisions)}
    groups = [sorted(c, key=rank.__getitem__) for c in nx.connected_components(graph)]
    return sorted((g for g in groups if len(g) >= 2), key=lambda g: rank[g[0]])


def _split(count: int, needs: list[int]) -> list[tuple[int, int]] | None:
    """Consecutive blocks ``(first, stop)`` of ``count`` items, block i at least ``needs[i]``."""
    if sum(needs) > count:
        return None
    blocks, first = [], 0
    for need in needs:
        blocks.append((first, first + need))
        first += need
    return blocks


def venue_shares(fed: Federation, strict: bool = True
                 ) -> tuple[dict[tuple[str, str], Venue], list[Coupling]]:
    """How each venue used by several divisions is shared by the one-after-another method.

    Returns ``(shares, couplings)``: ``shares[(division, venue)]`` is the part of the venue the
    division may use (some of its slots with every court, or some of its courts with every slot,
    in consecutive blocks in file order, each block large enough for the division's most games
    on one day); a venue too small to split whose users all host their own home games becomes a
    ``ground`` coupling instead (never two of those teams of different divisions at home on one
    day), which needs no split. Venues used by one division are left whole.

    Parameters
    ----------
    fed : Federation
        The federation.
    strict : bool
        Raise for a venue that cannot be split (the one-after-another method needs the split);
        with ``False`` such a venue only gets its ``venue`` coupling (the joint model shares it
        date by date, :mod:`scheduler.divisions.joint`).

    Returns
    -------
    tuple
        ``(shares, couplings)`` as above.

    Raises
    ------
    ConfigError
        With ``strict``: a venue that can neither be split nor shared by dates (located at
        ``venues[i]``).
    """
    shares: dict[tuple[str, str], Venue] = {}
    couplings: list[Coupling] = []
    users = _users(fed)
    for index, venue in enumerate(fed.venues):
        for divs in same_day_groups(fed, users.get(venue.name, [])):
            _share(fed, index, venue, divs, shares, couplings, strict)
    return shares, couplings


def _share(fed: Federation, index: int, venue: Venue, divs: list[str],
           shares: dict[tuple[str, str], Venue], couplings: list[Coupling],
           strict: bool = True) -> None:
    leagues = [fed.division(d).league for d in divs]
    demand = [_games_per_day(lg, venue.name) for lg in leagues]
    slots = list(venue.slots)
    courts = list(venue.courts)
    by_slot = _split(len(slots), [-(-need // len(courts)) for need in demand]) if slots else None
    by_court = None if by_slot else _split(
        len(courts), [-(-need // max(1, len(slots))) for need in demand])
    home_teams = tuple(t.name for lg in leagues for t in lg.teams if t.home_venue == venue.name)
    if by_slot:
        for d, (a, b) in zip(divs, by_slot, strict=True):
            shares[(d, venue.name)] = replace(venue, slots=tuple(slots[a:b]))
    elif by_court:
        for d, (a, b) in zip(divs, by_court, strict=True):
            shares[(d, venue.name)] = replace(venue, courts=tuple(courts[a:b]))
    elif all(lg.format.home_meaning == "venue" for lg in leagues):
        couplings.append(Coupling("ground", venue.name, tuple(divs), home_teams, "apart",
                                  venue.name))
        return
    elif strict:
        needs = ", ".join(f"{d} {n}" for d, n in zip(divs, demand, strict=True))
        raise ConfigError(
            [f"venues[{index}]: {venue.name!r} hosts {venue.capacity} games at a time but "
             f"its divisions need more on one day ({needs}); give it more courts or slots, "
             "or move a division to another venue"], path=fed.source)
    couplings.append(Coupling("venue", venue.name, tuple(divs), home_teams, "", venue.name))


def couplings_of(fed: Federation) -> list[Coupling]:
    """Every coupling of the federation (explicit grounds, shared venues, player groups).

    Parameters
    ----------
    fed
        The federation.

    Returns
    -------
    list of Coupling
        Explicit shared grounds first (file order), then shared venues and automatic grounds
        (venue order), then player groups (file order).

    Examples
    --------
    >>> from scheduler.config.federation import parse_federation
    >>> def division(name, teams):
    ...     return {"name": name, "teams": [{"name": t, "home_venue": f"{t} Ground"}
    ...                                      for t in teams]}
    >>> fed = parse_federation({
    ...     "federation": {"name": "Example", "season": "2031", "timezone": "Europe/London",
    ...                    "solve_seconds": 1},
    ...     "calendar": {"start": "2031-09-06", "end": "2031-12-20", "weekdays": ["sat"]},
    ...     "venues": [{"name": f"{t} Ground"} for t in "ABCDEFGH"],
    ...     "divisions": [division("First", "ABCD"), division("Reserves", "EF"),
    ...                   division("Other", "GH")],
    ...     "shared_grounds": [{"teams": ["A", "E"], "pattern": "complementary"}]})
    >>> [(c.kind, c.divisions) for c in couplings_of(fed)]
    [('ground', ('First', 'Reserves'))]

    References
    ----------
    ``docs/divisions.md``, "Couplings and units of work".
    """
    _, couplings = venue_shares(fed, strict=False)
    out = []
    for g in fed.shared_grounds:
        divs = tuple(dict.fromkeys(fed.division_of(t) for t in g.teams))
        out.append(Coupling("ground", g.name, divs, g.teams, g.pattern))
    out.extend(couplings)
    for p in fed.player_groups:
        members = list(dict.fromkeys(fed.division_of(t) for t in p.teams))
        for group in same_day_groups(fed, members):
            teams = tuple(t for t in p.teams if fed.division_of(t) in group)
            out.append(Coupling("players", p.name, tuple(group), teams))
    return out


def coupling_graph(fed: Federation, couplings: list[Coupling] | None = None) -> nx.Graph:
    """The graph of divisions; an edge for every pair of divisions one coupling joins.

    Edge attribute ``couplings`` lists the names of the couplings joining the pair.

    Parameters
    ----------
    fed
        The federation.
    couplings
        Its couplings (computed when not given).

    Returns
    -------
    networkx.Graph
        One node per division.

    Examples
    --------
    >>> from scheduler.config.federation import parse_federation
    >>> def division(name, teams):
    ...     return {"name": name, "teams": [{"name": t, "home_venue": f"{t} Ground"}
    ...                                      for t in teams]}
    >>> fed = parse_federation({
    ...     "federation": {"name": "Example", "season": "2031", "timezone": "Europe/London",
    ...                    "solve_seconds": 1},
    ...     "calendar": {"start": "2031-09-06", "end": "2031-12-20", "weekdays": ["sat"]},
    ...     "venues": [{"name": f"{t} Ground"} for t in "ABCDEFGH"],
    ...     "divisions": [division("First", "ABCD"), division("Reserves", "EF"),
    ...                   division("Other", "GH")],
    ...     "shared_grounds": [{"teams": ["A", "E"], "pattern": "complementary"}]})
    >>> graph = coupling_graph(fed)
    >>> graph.number_of_nodes(), list(graph.edges(data=True))
    (3, [('First', 'Reserves', {'couplings': ['A / E']})])

    References
    ----------
    Hagberg, Schult & Swart (2008), NetworkX (Proc. SciPy 2008).
    """
    graph = nx.Graph()
    graph.add_nodes_from(fed.division_names)
    for c in couplings if couplings is not None else couplings_of(fed):
        for a, b in itertools.combinations(c.divisions, 2):
            if graph.has_edge(a, b):
                graph[a][b]["couplings"].append(c.name)
            else:
                graph.add_edge(a, b, couplings=[c.name])
    return graph


def units_of(fed: Federation, couplings: list[Coupling] | None = None) -> tuple[Unit, ...]:
    """The units of work: connected components of the coupling graph.

    Each unit lists its divisions in file order; units are ordered by their first division, and
    named ``unit-01``, ``unit-02``, ... in that order (deterministic, whatever the graph library's
    iteration order).

    Examples
    --------
    >>> from scheduler.config.federation import parse_federation
    >>> def division(name, teams):
    ...     return {"name": name, "teams": [{"name": t, "home_venue": f"{t} Ground"}
    ...                                      for t in teams]}
    >>> fed = parse_federation({
    ...     "federation": {"name": "Example", "season": "2031", "timezone": "Europe/London",
    ...                    "solve_seconds": 1},
    ...     "calendar": {"start": "2031-09-06", "end": "2031-12-20", "weekdays": ["sat"]},
    ...     "venues": [{"name": f"{t} Ground"} for t in "ABCDEFGH"],
    ...     "divisions": [division("First", "ABCD"), division("Reserves", "EF"),
    ...                   division("Other", "GH")],
    ...     "shared_grounds": [{"teams": ["A", "E"], "pattern": "complementary"}]})
    >>> [(u.key, u.divisions) for u in units_of(fed)]
    [('unit-01', ('First', 'Reserves')), ('unit-02', ('Other',))]

    Parameters
    ----------
    fed
        The federation.
    couplings
        Its couplings (default: :func:`couplings_of`).

    Returns
    -------
    tuple of Unit
        The units, in the order of their first division.

    References
    ----------
    ``docs/divisions.md``; networkx ``connected_components``.
    """
    graph = coupling_graph(fed, couplings)
    rank = {name: i for i, name in enumerate(fed.division_names)}
    parts = [sorted(component, key=rank.__getitem__)
             for component in nx.connected_components(graph)]
    parts.sort(key=lambda part: rank[part[0]])
    width = max(2, len(str(len(parts))))
    return tuple(Unit(f"unit-{i + 1:0{width}d}", tuple(part)) for i, part in enumerate(parts))
