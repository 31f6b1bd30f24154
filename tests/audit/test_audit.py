"""The audit: read, check, measure.

Check values: de Werra 1981 (n-2 breaks for the canonical SRR), the circle method's carry-over
(n-1)(n^2-6n+12) (Lambrechts et al. 2018; closed form from the project notes), and Kotzig /
Wallis (GK_n perfect iff n-1 prime: 7 is prime, so every pair of the 8-team rounds is perfect).
"""

from __future__ import annotations

import json

import openpyxl

from scheduler.audit import audit_file, audit_season
from scheduler.export.season_json import dumps_season
from scheduler.fairness import compute_fairness
from tests.fairness.constructions import canonical_rounds, name, season_of


def _csv_lines(n=8):
    lines = ["Round,Home,Away"]
    for r, games in enumerate(canonical_rounds(n)):
        lines += [f"{r + 1},{name(h)},{name(a)}" for h, a in games]
    return lines


def test_valid_csv(tmp_path):
    path = tmp_path / "league.csv"
    path.write_text("\n".join(_csv_lines()), encoding="utf-8")
    result = audit_file(path)
    assert result.valid and result.problems == ()
    d = result.to_dict()
    assert d["valid"] is True and d["problems"] == []
    assert d["breaks_total"] == 6
    assert d["carry_over_value"] == 7 * (64 - 48 + 12) == 196
    assert (d["perfect_pairs"], d["pairs"]) == (21, 21)
    assert d["file"] == str(path) and d["format"] == "csv"
    assert json.loads(json.dumps(result.to_dict(full=True)))["fairness"]["teams"] == 8


def test_invalid_csv_names_the_rows(tmp_path):
    lines = _csv_lines()
    # Row 3 is round 1's second game; make its home team the home team of row 2.
    home_row2 = lines[1].split(",")[1]
    parts = lines[2].split(",")
    lines[2] = ",".join([parts[0], home_row2, parts[2]])
    del lines[10]  # drop a game of round 3 (file row 11)
    path = tmp_path / "edited.csv"
    path.write_text("\n".join(lines), encoding="utf-8")
    result = audit_file(path)
    assert not result.valid
    messages = result.to_dict()["problems"]
    assert f"round 1: {home_row2} plays twice (rows 2, 3)" in messages
    assert any(m.startswith("missing game") for m in messages)
    assert result.fairness is not None and result.fairness_note
    details = result.to_dict(full=True)["problem_details"]
    assert any(p["rows"] == [2, 3] for p in details)


def test_xlsx_and_season_json_give_the_same_figures(tmp_path):
    season = season_of(canonical_rounds(10), 10)
    json_path = tmp_path / "season.json"
    json_path.write_text(dumps_season(season, compute_fairness(season)), encoding="utf-8")
    book = openpyxl.Workbook()
    ws = book.active
    ws.append(["Round", "Home", "Away"])
    for f in season.fixtures:
        ws.append([f.round, f.home, f.away])
    xlsx_path = tmp_path / "season.xlsx"
    book.save(xlsx_path)
    a = audit_file(json_path).to_dict()
    b = audit_file(xlsx_path).to_dict()
    for key in ("valid", "breaks_total", "carry_over_value", "perfect_pairs", "pairs"):
        assert a[key] == b[key], key
    assert a["valid"] and a["pairs"] == 36 and a["perfect_pairs"] < 36  # 9 is not prime


def test_audit_season_in_memory():
    season = season_of(canonical_rounds(6), 6)
    result = audit_season(season)
    assert result.valid and result.path is None
    assert result.fairness.breaks_total == 4


def test_reads_the_projects_own_csv_and_xlsx(tmp_path):
    """The fixtures CSV and the workbook written by scheduler.export read back into the same
    figures (the exporters' own formats; headers found by the readers' synonyms)."""
    from dataclasses import replace
    from datetime import date, datetime, timedelta
    from zoneinfo import ZoneInfo

    from scheduler.export.csv_out import fixtures_csv
    from scheduler.export.xlsx import write_workbook
    from scheduler.season import Fixture, Season
    from tests.fairness.constructions import double_round_robin

    zone = ZoneInfo("Europe/Oslo")
    n = 6
    fixtures = []
    for r, games in enumerate(double_round_robin(canonical_rounds(n), "mirrored")):
        day = date(2030, 8, 3) + timedelta(days=7 * r)
        for h, a in games:
            fixtures.append(Fixture(
                r + 1, name(h), name(a), leg=1 if r < n - 1 else 2, venue=f"{name(h)} Ground",
                date=day, start=datetime(day.year, day.month, day.day, 15, 0, tzinfo=zone)))
    # A name that starts like a formula: the exporters quote it, the readers restore it.
    rename = {name(1): "=Hill United", name(2): "-Dash Rovers"}
    fixtures = [replace(f, home=rename.get(f.home, f.home), away=rename.get(f.away, f.away))
                for f in fixtures]
    teams = tuple(rename.get(name(t), name(t)) for t in range(1, n + 1))
    season = Season("Fjord League", "2030", teams, tuple(fixtures), legs=2,
                    timezone="Europe/Oslo")
    report = compute_fairness(season)
    (tmp_path / "fixtures.csv").write_text(fixtures_csv(season), encoding="utf-8")
    write_workbook(season, report, tmp_path / "season.xlsx")
    for file in ("fixtures.csv", "season.xlsx"):
        result = audit_file(tmp_path / file, timezone="Europe/Oslo")
        assert result.valid, result.problems
        got = result.fairness
        assert (got.breaks_total, got.carry_over_value, got.perfect_pairs, got.scheme) == (
            report.breaks_total, report.carry_over_value, report.perfect_pairs, "mirrored")
        assert sorted(f.start for f in result.season.fixtures) == sorted(
            f.start for f in fixtures)
        assert set(result.season.teams) == set(teams)
