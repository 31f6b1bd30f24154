"""A printable season site: an index page and one page per team, for clubs that publish fixtures.

Layout inside the season folder (paths relative to it)::

    site/index.html              the league: teams, every round's fixtures, the league feed
    site/teams/<stem>.html       one team: its fixtures and byes, a link to subscribe to its feed

The pages are made from the same :class:`~scheduler.season.Season` as every other output, with
Jinja2 templates (``templates/site_*.html.j2``, autoescaping on). They are plain static HTML
with inline CSS: no script, no external asset, nothing fetched; every link is relative
(``../calendars/league.ics``, ``../../calendars/<team>.ics``, ``teams/<stem>.html``), so the
folder can be copied to any web space or opened from the disk. Page stems are the calendar
feeds' stems, so a team's page and feed share one name. The print stylesheet sets A4 pages
and lets the fixture tables wrap inside the printable width (ISO 216 A4, 210 mm x 297 mm).

Which side is "home" is named as the league names it (``Season.side_labels`` when home is a
side or colour), the venue's address is shown where the league file gives one, and the rest
caution of the report is repeated, as on every output meant for players.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass

from scheduler.export.csv_out import FixtureRow, fixture_rows
from scheduler.export.ics import team_feed_names
from scheduler.fairness.model import FairnessReport
from scheduler.season import Season

SITE_CAUTION = (
    "A schedule can put players at risk: too little rest between games, long trips, or late "
    "kick-offs for youth teams. The rules of your league, your governing body and local "
    "regulations (for example on minimum rest, youth kick-off times and travel) take precedence "
    "over this schedule."
)

SITE_FOLDER = "site"
INDEX_PAGE = "index.html"
TEAM_FOLDER = "teams"


@dataclass(frozen=True, slots=True)
class TeamLine:
    """One row of a team's page: a game or a bye.

    Parameters
    ----------
    round
        The round number.
    row
        The game with its local date and time, or ``None`` for a bye.
    side
        ``"home"``, ``"away"``, the league's side label, or ``"bye"``.
    opponent
        The other team ("" for a bye).
    address
        The venue's postal address when the league gives one, else "".
    """

    round: int
    row: FixtureRow | None
    side: str
    opponent: str
    address: str


def _sides(season: Season) -> tuple[str, str]:
    return season.side_labels if season.home_meaning == "side" else ("Home", "Away")


def _feed_names(season: Season, feed_names: Mapping[str, str] | None) -> dict[str, str]:
    if feed_names is not None:
        return dict(feed_names)
    return team_feed_names(season)


def _team_lines(season: Season, team: str, rows: list[FixtureRow]) -> list[TeamLine]:
    home_word, away_word = _sides(season)
    if season.home_meaning != "side":
        home_word, away_word = "home", "away"
    lines = []
    for row in rows:
        f = row.fixture
        if team not in (f.home, f.away):
            continue
        at_home = f.home == team
        lines.append(
            TeamLine(
                f.round,
                row,
                home_word if at_home else away_word,
                f.away if at_home else f.home,
                season.venue_addresses.get(f.venue or "", ""),
            )
        )
    for number, teams in season.byes.items():
        if team in teams:
            lines.append(TeamLine(number, None, "bye", "", ""))
    lines.sort(key=lambda line: (line.round, line.row is None))
    return lines


def site_paths(season: Season, feed_names: Mapping[str, str] | None = None) -> list[str]:
    """The paths :func:`site_files` returns, in the same order, without rendering anything.

    Parameters
    ----------
    season
        The season (its teams).
    feed_names
        Team -> calendar file name (:func:`scheduler.export.ics.team_feed_names` when
        ``None``); a team's page takes its feed's stem.

    Returns
    -------
    list of str
        ``/``-separated paths relative to the season folder: the index page, then one page
        per team.

    Examples
    --------
    >>> from scheduler.season import Season
    >>> site_paths(Season("Demo", "2031", ("ash",), ()), {"ash": "ash.ics"})
    ['site/index.html', 'site/teams/ash.html']
    """
    feeds = _feed_names(season, feed_names)
    return [f"{SITE_FOLDER}/{INDEX_PAGE}"] + [
        f"{SITE_FOLDER}/{TEAM_FOLDER}/{feeds[team].rsplit('.', 1)[0]}.html"
        for team in season.teams
    ]


def site_files(
    season: Season,
    fairness: FairnessReport | None = None,
    *,
    feed_names: Mapping[str, str] | None = None,
    calendar_folder: str = "calendars",
    league_feed: str = "league.ics",
) -> dict[str, bytes]:
    """Every file of the season site, by its path relative to the season folder.

    Parameters
    ----------
    season : Season
        The season to publish.
    fairness : FairnessReport, optional
        When given, the index page states the headline figures by their one names
        (:mod:`scheduler.fairness.names`).
    feed_names : mapping of str to str, optional
        Team -> file name of its feed inside ``calendar_folder`` (default: the names the season
        folder's writer uses, :func:`scheduler.export.ics.team_feed_names`).
    calendar_folder, league_feed : str
        Where the feeds are, relative to the season folder.

    Returns
    -------
    dict of str to bytes
        ``"site/index.html"`` and ``"site/teams/<stem>.html"`` -> UTF-8 HTML; deterministic
        (the same season gives the same bytes).

    Examples
    --------
    >>> files = site_files(season)  # doctest: +SKIP
    >>> sorted(files)[:2]  # doctest: +SKIP
    ['site/index.html', 'site/teams/ashford-rovers-1a2b3c4d.html']
    """
    from scheduler.export.report import _environment

    env = _environment()
    feeds = _feed_names(season, feed_names)
    rows = fixture_rows(season)
    rounds: dict[int, list[FixtureRow]] = {}
    for row in rows:
        rounds.setdefault(row.fixture.round, []).append(row)
    pages = {team: f"{feeds[team].rsplit('.', 1)[0]}.html" for team in season.teams}
    title = " · ".join(p for p in (season.league, season.season_id) if p) or "Season"
    sides = _sides(season)
    figures = []
    if fairness is not None:
        from scheduler.fairness.names import figure_lines

        figures = figure_lines(fairness)
    common = {
        "season": season,
        "title": title,
        "sides": sides,
        "side_meaning": season.home_meaning == "side",
        "caution": SITE_CAUTION,
    }
    files: dict[str, bytes] = {}
    index = env.get_template("site_index.html.j2").render(
        **common,
        teams=[(team, f"{TEAM_FOLDER}/{pages[team]}") for team in season.teams],
        rounds=rounds,
        byes={r: season.byes[r] for r in sorted(season.byes)},
        league_feed=f"../{calendar_folder}/{league_feed}",
        figures=figures,
    )
    files[f"{SITE_FOLDER}/{INDEX_PAGE}"] = index.encode("utf-8")
    team_page = env.get_template("site_team.html.j2")
    for team in season.teams:
        html = team_page.render(
            **common,
            team=team,
            lines=_team_lines(season, team, rows),
            feed=f"../../{calendar_folder}/{feeds[team]}",
            index=f"../{INDEX_PAGE}",
        )
        files[f"{SITE_FOLDER}/{TEAM_FOLDER}/{pages[team]}"] = html.encode("utf-8")
    return files
