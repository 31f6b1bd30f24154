"""One name per figure (scheduler.fairness.names) across terminal, workbook, report, site and
docs/figures.md; methods in words; standings that say the truth about the bounds.

Bounds used for the checks: Russell (1980) n(n-1) and Lambrechts et al. (2018) (n-1)(n²-6n+12)
for carry-over (the circle method reaches the maximum); de Werra (1981) n-2 breaks for an even
single round robin; the circle method is perfect when n-1 is prime (Kotzig 1964). The names
themselves follow common practice (the trade's words).
"""

from __future__ import annotations

import re
from dataclasses import replace
from pathlib import Path

import pytest

from scheduler.factorization import factorize
from scheduler.fairness import compute_fairness
from scheduler.fairness.names import (
    FIGURES,
    figure_lines,
    figure_name,
    plain_method,
    plain_source,
    plain_text,
)
from tests.export.samples import make_season

DOCS = Path(__file__).resolve().parent.parent.parent / "docs" / "figures.md"


def test_names_are_unique_and_documented():
    names = [f.name for f in FIGURES.values()]
    assert len(names) == len(set(names))
    text = DOCS.read_text(encoding="utf-8")
    for figure in FIGURES.values():
        if figure.key in ("teams", "rounds", "games"):
            continue
        assert figure.name.split(" / ")[0] in text or figure.key in text, figure.key


@pytest.mark.parametrize("teams", [8, 10, 16, 28, 40])
def test_engine_methods_in_words(teams):
    fac = factorize(teams, seed=0, budget=2.0)
    words = plain_method(fac.method)
    assert not re.search(r"\b(GK|GA|Z)_", words), words
    assert "method" in words
    source = plain_source(fac.source)
    assert ".py" not in source and not re.search(r"\b(GK|GA|Z)_", source), source


def test_plain_text_renames_methods_inside_notes():
    note = "compared circle GK_10: 27/36 perfect round pairs; starter in Z_15 (catalogue)"
    assert plain_text(note) == (
        "compared circle method: 27/36 pairs of rounds that mix perfectly; starter method over "
        "a group of 15 elements (from the catalogue)"
    )


def test_standings_tell_best_and_worst():
    season = make_season(tuple(f"Club {i}" for i in range(8)), legs=1)  # circle method, n = 8
    fr = compute_fairness(season)
    lines = {line.key: line for line in figure_lines(fr)}
    assert fr.carry_over_value == (8 - 1) * (64 - 48 + 12)  # the circle maximum, 196
    carry = lines["carry_over_value"]
    assert "worst possible" in carry.standing and "above the lower bound" not in carry.standing
    assert carry.tone == "fair" and "lower is better" in carry.standing
    mixing = lines["perfect_pairs"]  # 7 is prime: perfect
    assert mixing.value == "21 of 21" and "best possible" in mixing.standing
    breaks = lines["breaks_total"]
    # The hand-made orientation is not de Werra's: above his n - 2 = 6, and said so.
    assert fr.breaks_lower_bound == 8 - 2 < fr.breaks_total
    assert f"{fr.breaks_total - 6} above the lower bound 6" in breaks.standing
    assert breaks.tone == "fair" and "lower is better" in breaks.standing
    assert breaks.name == figure_name("breaks_total") == "breaks"
    # Every figure says what it is measured over and which way is better (or that it is not
    # ranked, for rest days).
    for line in lines.values():
        assert line.over and line.standing and line.brief is not None


def test_multi_leg_figures_say_they_cover_leg_one():
    season = make_season(tuple(f"Club {i}" for i in range(6)), legs=2)
    lines = {line.key: line for line in figure_lines(compute_fairness(season))}
    assert "leg 1" in lines["perfect_pairs"].over
    assert "leg 1" in lines["carry_over_value"].over
    assert lines["perfect_pairs"].over_brief.endswith("(leg 1)")


def test_carry_over_between_the_bounds_says_so():
    season = make_season(tuple(f"Club {i}" for i in range(8)), legs=1)
    fr = replace(compute_fairness(season), carry_over_value=120)
    line = next(x for x in figure_lines(fr) if x.key == "carry_over_value")
    assert "between the lower bound 56 and the worst possible 196" in line.standing


def test_terminal_uses_the_same_names(tmp_path, monkeypatch):
    # The audit's table, through typer's test runner: names from FIGURES, the direction said,
    # none of the old names.
    from typer.testing import CliRunner

    from scheduler import cli
    from scheduler.cli import app
    from scheduler.export.csv_out import fixtures_csv

    monkeypatch.setattr(cli.out, "width", 250)  # one line per table row

    season = make_season(tuple(f"Club {i}" for i in range(8)), legs=1)
    path = tmp_path / "ext.csv"
    path.write_text(fixtures_csv(season), encoding="utf-8", newline="")
    result = CliRunner().invoke(app, ["audit", str(path)])
    assert result.exit_code == 0, result.output
    for key in ("perfect_pairs", "breaks_total", "carry_over_value", "home_gap_max"):
        assert figure_name(key) in result.output, key
    assert "the worst possible" in result.output and "lower is better" in result.output
    for old in ("perfect pairs of rounds", "home-count gap", "bounds 56..196"):
        assert old not in result.output
