"""One plain name per figure and per construction method, for every output.

The terminal, the workbook, the report, the season site and ``docs/figures.md`` all take a
figure's display name from :data:`FIGURES` (keyed by the figure's key in
:meth:`~scheduler.fairness.model.FairnessReport.to_dict`, which stays the stable key of
``season.json``), and describe a value with :func:`figure_lines`: what it is measured over, and
where it stands between the best and the worst possible, in plain words.

Construction methods are named in words by :func:`plain_method` ("circle method", "starter
method over a group of 15 elements") instead of the notation of the literature (GK_16, Z_15);
:func:`plain_text` applies the same renaming to free text such as the planner's notes.

The bounds and their sources are collected in ``docs/figures.md``.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from typing import TYPE_CHECKING

if TYPE_CHECKING:
    from scheduler.fairness.model import FairnessReport


@dataclass(frozen=True, slots=True)
class FigureName:
    """A figure's one display name, and which way is better.

    Parameters
    ----------
    key
        The figure's key, as in ``season.json``'s ``fairness``.
    name
        Its display name in every output.
    better
        ``"lower"``, ``"higher"`` or ``""`` when neither is better.

    References
    ----------
    ``docs/figures.md``.

    Examples
    --------
    >>> FIGURES["breaks_total"]
    FigureName(key='breaks_total', name='breaks', better='lower')
    """

    key: str
    name: str
    better: str


FIGURES: dict[str, FigureName] = {
    f.key: f
    for f in (
        FigureName("teams", "teams", ""),
        FigureName("rounds", "rounds", ""),
        FigureName("games", "games", ""),
        FigureName("perfect_pairs", "pairs of rounds that mix perfectly", "higher"),
        FigureName("breaks_total", "breaks", "lower"),
        FigureName("home_gap_max", "largest home-game gap between teams", "lower"),
        FigureName("home_run_max", "longest run of home games", "lower"),
        FigureName("away_run_max", "longest run of away games", "lower"),
        FigureName("court_spread_max", "court spread", "lower"),
        FigureName("slot_spread_max", "kick-off time spread", "lower"),
        FigureName("court_uses_max", "most games of one team on one court", "lower"),
        FigureName("carry_over_value", "carry-over value", "lower"),
        FigureName("rest_days_min", "fewest rest days", ""),
        FigureName("rest_days_mean", "mean rest days", ""),
        FigureName("separation_min", "fewest rounds between two meetings", "higher"),
        FigureName("separation_max", "most rounds between two meetings", ""),
    )
}
"""Every figure the outputs show, by its key (the key of ``season.json``'s ``fairness``)."""


def figure_name(key: str) -> str:
    """The display name of the figure ``key`` (see :data:`FIGURES`).

    Parameters
    ----------
    key
        A key of :data:`FIGURES`.

    Returns
    -------
    str
        The name shown in every output.

    Raises
    ------
    KeyError
        An unknown key.

    Examples
    --------
    >>> figure_name("carry_over_value")
    'carry-over value'
    """
    return FIGURES[key].name


# --------------------------------------------------------------------------- methods


def _group_order(text: str) -> int | None:
    """Number of elements of a group written as ``Z_15``, ``Z_3 x Z_5`` or ``G_39``-like."""
    found = re.findall(r"[A-Za-z]+_\{?(\d+)\}?", text)
    if not found:
        return None
    return math.prod(int(k) for k in found)


_GROUP = r"((?:[A-Za-z]+_\{?\d+\}?)(?:\s*(?:x\|\d+|x|×|⋊|:)\s*[A-Za-z]+_\{?\d+\}?)*)"


def plain_method(method: str) -> str:
    """A construction method in words.

    Parameters
    ----------
    method : str
        The method as the factorization engine records it (``Factorization.method``).

    Returns
    -------
    str
        The same method without the literature's notation.

    Examples
    --------
    >>> plain_method("circle GK_16")
    'circle method'
    >>> plain_method("starter in Z_15 (catalogue)")
    'starter method over a group of 15 elements (from the catalogue)'
    >>> plain_method("even starter in Z_14")
    'even-starter method over a group of 14 elements'
    >>> plain_method("best found: Anderson GA_10 + Kempe annealing")
    "best found: Anderson's method, improved by Kempe-chain annealing"
    """
    text = str(method)
    text = re.sub(r"\bcircle GK_\{?\d+\}?", "circle method", text)
    text = re.sub(r"\bGK_\{?\d+\}?", "circle method", text)
    text = re.sub(r"\bAnderson GA_\{?\d+\}?", "Anderson's method", text)
    text = re.sub(r"\bGA_\{?\d+\}?", "Anderson's method", text)

    def group(match: re.Match[str]) -> str:
        kind = {"even starter": "even-starter", "near-perfect starter": "near-perfect starter"}
        head = kind.get(match.group(1), "starter")
        order = _group_order(match.group(2))
        where = f"a group of {order} elements" if order else "a group"
        return f"{head} method over {where}"

    text = re.sub(r"\b(even starter|near-perfect starter|starter) in " + _GROUP, group, text)
    text = text.replace("(catalogue)", "(from the catalogue)")
    text = text.replace(" + Kempe annealing", ", improved by Kempe-chain annealing")
    return text


def method_phrase(method: str) -> str:
    """:func:`plain_method` with its article, to follow "built with".

    Parameters
    ----------
    method
        A factorization's method as the engine names it (``"circle GK_8"``).

    Returns
    -------
    str
        The method in words with an article (or a possessive).

    Examples
    --------
    >>> method_phrase("circle GK_8")
    'the circle method'
    >>> method_phrase("Anderson GA_10")
    "Anderson's method"
    """
    text = plain_method(method)
    if text.startswith("Anderson's") or text.startswith("best found"):
        return text
    article = "an" if text[:1].lower() in "aeiou" else "a"
    return ("the " if text.startswith("circle method") else f"{article} ") + text


def plain_text(text: str) -> str:
    """Free text (a planner's note, an option label) with every method named in words.

    Parameters
    ----------
    text
        The text, as the engine wrote it.

    Returns
    -------
    str
        The text with methods and figure names as every output names them.

    Examples
    --------
    >>> plain_text("compared circle GK_10: 27/36 perfect round pairs")
    'compared circle method: 27/36 pairs of rounds that mix perfectly'
    """
    text = plain_method(text)
    text = text.replace("perfect round pairs", "pairs of rounds that mix perfectly")
    text = text.replace("(proven best)", "(the fewest possible under the rules: proven)")
    return text


# --------------------------------------------------------------------------- descriptions


@dataclass(frozen=True, slots=True)
class FigureLine:
    """One measured figure in words (see :func:`figure_lines`).

    Parameters
    ----------
    key
        The figure's key in :data:`FIGURES`.
    name
        Its display name.
    value
        The value as shown.
    over
        What it is measured over.
    standing
        Where it stands between the best and the worst possible, or which way is better.
    tone
        ``"good"`` when it is at the best possible, ``"fair"`` when a better value exists,
        ``"note"`` when neither applies.
    brief, over_brief
        ``standing`` and ``over`` in a few words (for the terminal).
    """

    key: str
    name: str
    value: str
    over: str
    standing: str
    tone: str
    brief: str = ""
    over_brief: str = ""


def _rounds_span(rounds) -> str:
    rounds = sorted(rounds)
    if not rounds:
        return "no rounds"
    if rounds == list(range(rounds[0], rounds[-1] + 1)):
        return f"rounds {rounds[0]}–{rounds[-1]}" if len(rounds) > 1 else f"round {rounds[0]}"
    return "rounds " + ", ".join(str(r) for r in rounds)


def mixing_over(fr: FairnessReport) -> str:
    """What the mixing figure is measured over, in words.

    Parameters
    ----------
    fr
        The fairness report.

    Returns
    -------
    str
        The rounds of the figure and, for several legs, why later legs are left out.
    """
    span = _rounds_span(fr.mixing_rounds)
    if fr.legs > 1:
        return (
            f"the first meeting of every pair of teams ({span}, leg 1); later legs repeat "
            "the same pairings"
        )
    return f"every pair of the season's rounds ({span})"


def carry_over_over(fr: FairnessReport) -> str:
    """What the carry-over value is measured over, in words.

    Parameters
    ----------
    fr
        The fairness report.

    Returns
    -------
    str
        The rounds the value is measured over.
    """
    if fr.legs > 1:
        return "leg 1 only (its last round followed by its first); each later leg alike"
    return "the whole round robin, its last round followed by its first"


def court_uses_max(fr: FairnessReport) -> int | None:
    """The most games one team plays on one court (``None`` when no courts are named).

    Parameters
    ----------
    fr
        The fairness report.

    Returns
    -------
    int or None
        The largest count over teams and courts.
    """
    counts = [count for t in fr.team_figures for _, count in t.courts]
    return max(counts) if counts and fr.court_names else None


def figure_lines(fr: FairnessReport) -> list[FigureLine]:
    """The measured figures of a :class:`~scheduler.fairness.model.FairnessReport` in words.

    Every comparison compares two numbers of the report (nothing is recomputed).

    Parameters
    ----------
    fr : FairnessReport
        The figures.

    Returns
    -------
    list of FigureLine
        In the order every output shows them.
    """
    lines: list[FigureLine] = []

    def add(
        key: str, value: str, over: str, standing: str, tone: str, brief: str, over_brief: str
    ) -> None:
        lines.append(
            FigureLine(key, figure_name(key), value, over, standing, tone, brief, over_brief)
        )

    all_rounds = "all rounds"
    season_wide = "each team, all rounds"

    if fr.mixing_valid and fr.pairs:
        if fr.perfect:
            standing, tone = "all of them: the best possible (higher is better)", "good"
            brief = "all: the best possible"
        else:
            brief = "higher is better"
            standing = (
                f"{fr.pairs - fr.perfect_pairs} pairs short of all {fr.pairs} "
                "(higher is better)"
            )
            tone = "fair"
        span = _rounds_span(fr.mixing_rounds) + (" (leg 1)" if fr.legs > 1 else "")
        add(
            "perfect_pairs",
            f"{fr.perfect_pairs} of {fr.pairs}",
            mixing_over(fr),
            standing,
            tone,
            brief,
            span,
        )

    bound = fr.breaks_lower_bound
    if fr.breaks_total <= bound:
        standing = f"at the lower bound {bound}: the fewest possible (lower is better)"
        tone = "good"
        brief = "at the lower bound: the fewest possible"
    else:
        brief = f"lower bound {bound}; lower is better"
        standing = (
            f"{fr.breaks_total - bound} above the lower bound {bound}, the fewest any season "
            "of this shape can have (lower is better)"
        )
        tone = "fair"
    add(
        "breaks_total",
        str(fr.breaks_total),
        "every round, byes skipped",
        standing,
        tone,
        brief,
        all_rounds,
    )

    gap = fr.home_gap_max
    if gap <= 1:
        standing, tone = "1 is the least possible (lower is better)", "good"
        brief = "the least possible"
    else:
        standing, tone = "lower is better; 1 is the least possible", "fair"
        brief = "lower is better; 1 is the least possible"
    add(
        "home_gap_max",
        str(gap),
        f"the table after every round (first reached after round {fr.home_gap_round})",
        standing,
        tone,
        brief,
        "after every round",
    )

    if fr.carry_over_value is not None:
        value, low, high = fr.carry_over_value, fr.carry_over_lower_bound, fr.carry_over_upper_bound
        if low is None or high is None:
            standing, tone = "lower is better", "note"
            brief = standing
        elif value <= low:
            standing, tone = f"at the lower bound {low}: the best possible", "good"
            brief = "at the lower bound: the best possible"
        elif value >= high:
            brief = f"the worst possible (range {low}–{high}; lower is better)"
            standing = (
                f"the worst possible: {high} is the highest value any single round robin of "
                f"this size can have (the lower bound is {low}; lower is better)"
            )
            tone = "fair"
        else:
            standing = (
                f"between the lower bound {low} and the worst possible {high} "
                "(lower is better)"
            )
            tone = "fair"
            brief = f"range {low}–{high}; lower is better"
        add(
            "carry_over_value",
            str(value),
            carry_over_over(fr),
            standing,
            tone,
            brief,
            "leg 1" if fr.legs > 1 else all_rounds,
        )

    if fr.court_spread_max is not None:
        spread = fr.court_spread_max
        standing = (
            "every team uses every court equally often"
            if spread == 0
            else "lower is better; 0 would mean every team uses every court equally often"
        )
        add(
            "court_spread_max",
            str(spread),
            "each team's games over the season: most minus fewest uses of one court",
            standing,
            "good" if spread == 0 else "note",
            "lower is better",
            season_wide,
        )
        most = court_uses_max(fr)
        if most is not None:
            add(
                "court_uses_max",
                str(most),
                "each team's games over the season",
                "lower is better",
                "note",
                "lower is better",
                season_wide,
            )
    if fr.slot_spread_max is not None:
        spread = fr.slot_spread_max
        standing = (
            "every team gets every kick-off time equally often"
            if spread == 0
            else "lower is better; 0 would mean every team gets every kick-off time equally often"
        )
        add(
            "slot_spread_max",
            str(spread),
            "each team's games over the season: most minus fewest uses of one kick-off time",
            standing,
            "good" if spread == 0 else "note",
            "lower is better",
            season_wide,
        )

    if fr.rest_days_min is not None:
        add(
            "rest_days_min",
            str(fr.rest_days_min),
            "days without a game between two games of a team, over the season",
            "measured: your league's rules decide what is enough",
            "note",
            "league rules decide",
            season_wide,
        )
        if fr.rest_days_mean is not None:
            add(
                "rest_days_mean",
                f"{fr.rest_days_mean:.1f}",
                "all teams over the season",
                "measured",
                "note",
                "",
                season_wide,
            )
    if fr.separation_min is not None:
        add(
            "separation_min",
            str(fr.separation_min),
            "rounds strictly between two meetings of the same two teams",
            "higher spreads the meetings further apart",
            "note",
            "higher spreads meetings apart",
            "each pair of teams",
        )
    return lines


def plain_source(source: str) -> str:
    """A method's source for readers: without the project's internal file names.

    Parameters
    ----------
    source
        The source as the factorization records it.

    Returns
    -------
    str
        The source without file names, group names in parentheses and search seeds.

    Examples
    --------
    >>> plain_source("perfect starter found by this project's search (tools/find.py), seed 0")
    "perfect starter found by this project's own search"
    """
    text = re.sub(r"\s*\([^()]*\.py[^()]*\)", "", str(source))
    text = re.sub(r"\s*\([^()]*\b(?:GK|GA|Z)_[^()]*\)", "", text)
    text = re.sub(r",\s*seeds? [\d\-–, ]+$", "", text)
    text = text.replace("this project's search", "this project's own search")
    return text.strip()
