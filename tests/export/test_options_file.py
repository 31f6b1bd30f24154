"""``options.json``: every option's complete season, read back exactly; no figure printed as
"None" anywhere an option is shown.

Outside checks: the file is parsed with the standard library's ``json`` (RFC 8259) and every
stored season is compared field by field with the planner's own; the report is parsed with the
standard library's ``html.parser`` to read the options table's cells.
"""

from __future__ import annotations

import json
from dataclasses import replace
from html.parser import HTMLParser

import pytest

from scheduler.export.report import render_report
from scheduler.export.season_json import (
    OPTIONS_FORMAT,
    dumps_options,
    keeps_options,
    loads_options,
)
from scheduler.fairness import compute_fairness
from scheduler.fairness.frontier import frontier_summary
from scheduler.plan import plan_season
from tests.balance.helpers import league


@pytest.fixture(scope="module")
def planned():
    return plan_season(league(8, solve_seconds=2.0))


def test_every_option_is_stored_and_read_back_exactly(planned):
    season = planned.season
    assert keeps_options(season) and len(season.options) >= 3
    text = dumps_options(season)
    data = json.loads(text)
    assert data["format"] == OPTIONS_FORMAT and data["revision"] == season.revision
    assert len(data["options"]) == len(season.options)
    stored = loads_options(text)
    for figures, back in zip(season.options, stored.seasons, strict=True):
        assert figures.season is not None and back is not None
        assert back == figures.season  # every field, fixtures with their aware kick-offs too
        assert [f.start for f in back.fixtures] == [f.start for f in figures.season.fixtures]
    # reading and writing again gives the same bytes (deterministic)
    again = replace(season, options=tuple(replace(o, season=s) for o, s in
                                          zip(season.options, stored.seasons, strict=True)))
    assert dumps_options(again) == text


def test_a_damaged_options_file_is_refused_with_its_place():
    from scheduler.errors import InputError

    with pytest.raises(InputError, match=r"options\.json: format"):
        loads_options('{"format": "something else"}')
    bad = json.dumps({"format": OPTIONS_FORMAT, "league": "x", "season": "y", "revision": "z",
                      "options": [{"format": "roundrobin-scheduler/season/1"}]})
    with pytest.raises(InputError, match=r"options\[0\]"):
        loads_options(bad)


class _Cells(HTMLParser):
    def __init__(self) -> None:
        super().__init__()
        self.inside = False
        self.cells: list[str] = []

    def handle_starttag(self, tag, attrs):
        if tag == "table" and ("class", "options") in attrs:
            self.inside = True
        if self.inside and tag == "td":
            self.cells.append("")

    def handle_endtag(self, tag):
        if tag == "table":
            self.inside = False

    def handle_data(self, data):
        if self.inside and self.cells:
            self.cells[-1] += data


def test_no_figure_is_printed_as_none(planned):
    season = planned.season
    missing = replace(season.options[-1], breaks=None, carry_over=None, not_dominated=False,
                      chosen=False)
    shown = replace(season, options=(*season.options[:-1], missing))
    page = render_report(shown, compute_fairness(shown))
    parser = _Cells()
    parser.feed(page)
    assert parser.cells and not any("None" in cell for cell in parser.cells)
    assert "no timetable keeps every rule" in page and "not measured" in page
    assert "None" not in page
    figures = [(o.perfect_pairs, o.pairs, o.breaks, o.carry_over) for o in shown.options]
    assert "None" not in frontier_summary(figures)
    for option in planned.options:
        assert "None" not in option.figures()
    assert "None" not in " ".join(planned.notes)
