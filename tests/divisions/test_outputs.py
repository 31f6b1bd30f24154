"""The federation's output folder without a cluster: all or nothing, never over someone else's
files, the same bytes for the same plan; the club calendar read back with icalendar (RFC 5545)
and the workbook with pandas."""

from __future__ import annotations

import tomllib

import pandas as pd
import pytest
from icalendar import Calendar

from scheduler.config.federation import parse_federation
from scheduler.divisions.check import check_federation
from scheduler.divisions.execute import FederationPlan
from scheduler.divisions.grouping import units_of
from scheduler.divisions.outputs import write_federation_outputs
from scheduler.divisions.plan import plan_unit
from scheduler.errors import OutputError


@pytest.fixture(scope="module")
def plan(small_text) -> FederationPlan:
    fed = parse_federation(tomllib.loads(small_text))
    units = units_of(fed)
    results = tuple(plan_unit(fed, u) for u in units)
    by_name = {p.name: p for r in results for p in r.plans}
    plans = tuple(by_name[n] for n in fed.division_names)
    check = check_federation(fed, {p.name: p.season for p in plans})
    return FederationPlan(fed, units, results, plans, check, 0.0)


def _files(folder):
    return {str(p.relative_to(folder)): p.read_bytes()
            for p in sorted(folder.rglob("*")) if p.is_file()}


def test_same_plan_same_bytes_and_replanning_in_place(plan, tmp_path):
    write_federation_outputs(plan, tmp_path / "a")
    write_federation_outputs(plan, tmp_path / "b")
    first = _files(tmp_path / "a")
    assert first == _files(tmp_path / "b")
    write_federation_outputs(plan, tmp_path / "a")  # its own folder: replaced as a whole
    assert _files(tmp_path / "a") == first
    assert sorted(p.name for p in tmp_path.iterdir()) == ["a", "b"]  # no staging left behind


def test_foreign_folder_is_refused_and_left_alone(plan, tmp_path):
    out = tmp_path / "out"
    out.mkdir()
    (out / "minutes.txt").write_text("club minutes", encoding="utf-8")
    with pytest.raises(OutputError):
        write_federation_outputs(plan, out)
    assert _files(out) == {"minutes.txt": b"club minutes"}
    assert sorted(p.name for p in tmp_path.iterdir()) == ["out"]


def test_config_inside_the_output_is_refused(plan, tmp_path):
    config = tmp_path / "out" / "fed.toml"
    config.parent.mkdir()
    config.write_text("x", encoding="utf-8")
    with pytest.raises(OutputError):
        write_federation_outputs(plan, tmp_path / "out", force=True, config_path=config)
    assert config.read_text(encoding="utf-8") == "x"


def test_workbook_and_club_calendar_read_back(plan, tmp_path):
    out = write_federation_outputs(plan, tmp_path / "out")
    sheets = pd.read_excel(out / "divisions.xlsx", sheet_name=None, engine="openpyxl")
    assert list(sheets) == list(plan.federation.division_names)
    for p in plan.plans:
        frame = sheets[p.name]
        assert len(frame) == len(p.season.fixtures)
        assert set(frame["Home"]) | set(frame["Away"]) == set(p.season.teams)
    (vexby,) = [f for f in (out / "clubs").iterdir() if f.name.startswith("vexby")]
    cal = Calendar.from_ical(vexby.read_bytes())
    games = [e for e in cal.walk("VEVENT") if " v " in str(e.get("summary"))]
    # Vexby Minis and Vexby Kids: 3 games each in their 4-team single round robins
    assert len(games) == 6
    starts = [e.decoded("dtstart") for e in games]
    assert starts == sorted(starts)
