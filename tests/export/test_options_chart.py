"""The options chart of the report, read back with the standard library's XML and HTML parsers
(xml.etree.ElementTree, html.parser): every option drawn in both panels (breaks, carry-over) at
places whose order follows its figures, the bound lines where the numbers put them, the numbers
as in the table, marks told apart by shape (print in black and white) and a text equivalent.

Outside checks: the carry-over bounds are the published ones, written out here: the lower
bound n(n-1) (K. G. Russell, Biometrika 67 (1980) 127-131; Σ c[i][j] = n(n-1) and
Cauchy-Schwarz, docs/carry-over.md) and the circle method's value (n-1)(n² - 6n + 12), the
largest (Lambrechts, Ficker, Goossens & Spieksma, Math. Programming 172 (2018) 277-302).
"""

from __future__ import annotations

import xml.etree.ElementTree as ET
from dataclasses import replace
from html.parser import HTMLParser

import pytest

from scheduler.export.report import options_chart, render_report
from scheduler.fairness import compute_fairness
from scheduler.season import PlanOptionFigures
from tests.export.samples import make_season

SVG = "{http://www.w3.org/2000/svg}"

# 8 teams: 7 rounds, C(7, 2) = 21 pairs; Russell's bound 8 * 7 = 56, the circle method's value
# 7 * (64 - 48 + 12) = 196 (the papers named above)
EIGHT = (
    PlanOptionFigures("best mixing", 21, 21, 6, 6, 196, True, True, detail="circle method"),
    PlanOptionFigures("low carry-over order", 21, 21, 10, 6, 96, False, True,
                      detail="circle method, rounds re-ordered"),
    PlanOptionFigures("lowest carry-over", 0, 21, 8, 6, 56, False, True,
                      detail="Russell GF(8)"),
    PlanOptionFigures("middle", 12, 21, 9, 6, 120, False, False, detail="some annealing"),
    PlanOptionFigures("same as middle", 12, 21, 9, 6, 120, False, False, detail="twin"),
    PlanOptionFigures("fallback", 3, 21, None, 6, None, False, False, detail="clash"),
)


def _centre(mark: ET.Element) -> tuple[float, float]:
    if mark.tag == f"{SVG}circle":
        return float(mark.get("cx")), float(mark.get("cy"))
    assert mark.tag == f"{SVG}rect"
    return (float(mark.get("x")) + float(mark.get("width")) / 2,
            float(mark.get("y")) + float(mark.get("height")) / 2)


def _read(options) -> tuple[ET.Element, dict[str, dict[int, ET.Element]]]:
    root = ET.fromstring(str(options_chart(options)))
    panels = {}
    for panel in root.iter(f"{SVG}g"):
        if panel.get("data-figure"):
            panels[panel.get("data-figure")] = {
                int(g.get("data-option")): g for g in panel.iter(f"{SVG}g")
                if g.get("data-option")}
    return root, panels


def _mark(group: ET.Element) -> ET.Element:
    shapes = [el for el in group if el.tag in (f"{SVG}circle", f"{SVG}rect")]
    assert len(shapes) == 1
    return shapes[0]


def _same_order(values: list[float], places: list[float], *, reverse: bool = False) -> None:
    """The places sort the options as their values do (ties stay ties)."""
    for a, pa in zip(values, places, strict=True):
        for b, pb in zip(values, places, strict=True):
            if a == b:
                assert pa == pytest.approx(pb, abs=0.02)
            elif (a < b) != reverse:
                assert pa < pb
            else:
                assert pa > pb


@pytest.mark.parametrize("options", [EIGHT, EIGHT[:3], tuple(reversed(EIGHT))])
def test_every_option_is_drawn_in_both_panels_where_its_figures_put_it(options):
    _, panels = _read(options)
    assert set(panels) == {"breaks", "carry-over"}
    drawn = {k: o for k, o in enumerate(options, 1) if o.breaks is not None}
    for name, figure in (("breaks", "breaks"), ("carry-over", "carry_over")):
        groups = panels[name]
        assert set(groups) == set(drawn)  # no timetable: not drawn, said in the description
        numbers = sorted(groups)
        centres = [_centre(_mark(groups[k])) for k in numbers]
        # more perfect pairs to the right; a larger value higher up (smaller y)
        _same_order([drawn[k].perfect_pairs for k in numbers], [c[0] for c in centres])
        _same_order([getattr(drawn[k], figure) for k in numbers], [c[1] for c in centres],
                    reverse=True)
        # the panels share the horizontal axis
        other = panels["carry-over" if name == "breaks" else "breaks"]
        assert [c[0] for c in centres] == [_centre(_mark(other[k]))[0] for k in numbers]
        # the number in the mark and the value beside it are the table's
        for k in numbers:
            texts = [t.text for t in groups[k].iter(f"{SVG}text")]
            assert texts[0] == str(k)
            assert texts[1].split(": ")[-1] == str(getattr(drawn[k], figure))


def _linear(points: list[tuple[float, float]]):
    """The straight line through the first two points of different value (value -> y)."""
    (v1, y1), (v2, y2) = next((a, b) for a in points for b in points if a[0] != b[0])
    return lambda value: y1 + (value - v1) * (y2 - y1) / (v2 - v1)


def test_bound_lines_lie_where_the_numbers_say():
    root, panels = _read(EIGHT)
    teams = 8
    lower, worst = teams * (teams - 1), (teams - 1) * (teams ** 2 - 6 * teams + 12)
    assert (lower, worst) == (56, 196)
    for name, figure, expected in (("breaks", "breaks", {6: "lower bound 6"}),
                                   ("carry-over", "carry_over",
                                    {lower: f"lower bound {lower}",
                                     worst: f"worst possible {worst}"})):
        panel = next(g for g in root.iter(f"{SVG}g") if g.get("data-figure") == name)
        scale = _linear([(getattr(EIGHT[k - 1], figure), _centre(_mark(g))[1])
                         for k, g in panels[name].items()])
        lines = [el for el in panel.iter(f"{SVG}line") if "bound" in (el.get("class") or "")]
        assert sorted(int(el.get("data-value")) for el in lines) == sorted(expected)
        labels = [t.text for t in panel.iter(f"{SVG}text")]
        for line in lines:
            value = int(line.get("data-value"))
            # drawn to 0.01 of a unit
            assert float(line.get("y1")) == float(line.get("y2"))
            assert float(line.get("y1")) == pytest.approx(scale(value), abs=0.02)
            assert expected[value] in labels
        # dashed for the lower bound, dotted (shorter dashes) for the worst possible value
        dashes = {int(el.get("data-value")): el.get("stroke-dasharray") for el in lines}
        if name == "carry-over":
            assert dashes[lower] != dashes[worst]


def test_marks_differ_in_shape_not_only_colour_and_the_chart_is_described():
    root, panels = _read(EIGHT)
    for groups in panels.values():
        kinds = {k: (_mark(g).tag, _mark(g).get("stroke-dasharray")) for k, g in groups.items()}
        assert kinds[1][0] == f"{SVG}rect"  # the chosen one: a square
        assert {kinds[k] for k in (2, 3)} == {(f"{SVG}circle", None)}  # not beaten: plain ring
        assert all(kinds[k][0] == f"{SVG}circle" and kinds[k][1] for k in (4, 5))  # dashed
        # two options at the same place: the label beside them names both
        assert [t.text for t in groups[4].iter(f"{SVG}text")][1].startswith("4, 5: ")
    assert root.get("role") == "img"
    title, desc = root.find(f"{SVG}title").text, root.find(f"{SVG}desc").text
    assert "breaks" in title and "carry-over" in title
    for k, option in enumerate(EIGHT, 1):
        assert f"option {k} ({option.label}" in desc
    assert "no timetable" in desc and "worst possible 196" in desc
    legend = " ".join(t.text or "" for g in root.iter(f"{SVG}g") if g.get("class") == "legend"
                      for t in g.iter(f"{SVG}text"))
    assert "chosen" in legend and "not beaten" in legend and "lower bound" in legend
    # the option without a timetable is said on the chart too, not only in its description
    assert any((t.text or "").endswith("option 6") and "not drawn" in t.text
               for t in root.iter(f"{SVG}text"))


class _Table(HTMLParser):
    """The rows of the options table: the text of each cell, and the detail spans."""

    def __init__(self) -> None:
        super().__init__()
        self.rows: list[list[str]] = []
        self.details: list[str] = []
        self.inside = self.detail = False

    def handle_starttag(self, tag, attrs):
        if tag == "table" and ("class", "options") in attrs:
            self.inside = True
        elif self.inside and tag == "tr":
            self.rows.append([])
        elif self.inside and tag == "td":
            self.rows[-1].append("")
        elif self.inside and tag == "span" and ("class", "option-detail") in attrs:
            self.detail = True
            self.details.append("")

    def handle_endtag(self, tag):
        if tag == "table":
            self.inside = False
        elif tag == "span":
            self.detail = False

    def handle_data(self, data):
        if self.inside and self.rows and self.rows[-1]:
            self.rows[-1][-1] += data
        if self.detail:
            self.details[-1] += data


def test_the_table_shows_short_labels_with_their_detail_and_the_chart_numbers():
    season = replace(make_season(), options=EIGHT)
    page = render_report(season, compute_fairness(season))
    table = _Table()
    table.feed(page)
    rows = [row for row in table.rows if row]
    assert len(rows) == len(EIGHT)
    assert table.details == [o.detail for o in EIGHT]
    for row, option in zip(rows, EIGHT, strict=True):
        assert row[1].startswith(option.label) and row[1].endswith(option.detail)
    chart = page[page.index("<svg", page.index('id="options"')):]
    root = ET.fromstring(chart[:chart.index("</svg>") + len("</svg>")])
    values = {t.text for t in root.iter(f"{SVG}text")}
    for row, option in zip(rows, EIGHT, strict=True):
        if option.breaks is not None:
            assert row[3].startswith(str(option.breaks)) and row[4].startswith(
                str(option.carry_over))
            assert str(option.breaks) in " ".join(values)
