"""Benchmark of the season exports against plain reference writers of the same fixtures.

For a double round robin of ``teams`` teams (circle method, built here directly; E. Lucas 1883,
de Werra 1981) it times each exporter and a reference that writes the same fixture table with a
general-purpose library, and prints the ratio (ours / reference):

* CSV: ``fixtures_csv`` vs ``pandas.DataFrame.to_csv``;
* workbook: ``workbook_bytes`` (Fixtures, Grid, Fairness and one sheet per team) vs
  ``pandas.DataFrame.to_excel`` (openpyxl engine, the fixture sheet only);
* iCalendar: ``league_calendar`` (stable UIDs, SEQUENCE plan, VTIMEZONE) vs a minimal
  ``icalendar`` loop (UID, DTSTAMP, DTSTART, SUMMARY only);
* report: ``render_report`` vs ``pandas.DataFrame.to_html`` of the fixture table.

The fairness figures are computed once beforehand and not timed (exporters never compute them).

Run from the repository root, in the project's environment:
``python benchmarks/bench_export.py [teams]`` (default 20 teams).
"""

from __future__ import annotations

import io
import sys
import time
from datetime import UTC, datetime, timedelta
from zoneinfo import ZoneInfo

import pandas as pd
from icalendar import Calendar, Event

from scheduler.export.csv_out import fixtures_csv
from scheduler.export.ics import league_calendar
from scheduler.export.report import render_report
from scheduler.export.xlsx import workbook_bytes
from scheduler.fairness import compute_fairness
from scheduler.season import Fixture, Season

ZONE = ZoneInfo("Europe/Brussels")


def build(n: int) -> Season:
    names = [f"Club {i:03d}" for i in range(n)]
    m = n - 1
    fixtures = []
    first = datetime(2026, 9, 5, 15, 0, tzinfo=ZONE)
    for leg in (1, 2):
        for r in range(m):
            number = (leg - 1) * m + r + 1
            games = [(r, m)] + [((r + k) % m, (r - k) % m) for k in range(1, n // 2)]
            for court, (h, a) in enumerate(games, start=1):
                if leg == 2:
                    h, a = a, h
                start = first + timedelta(days=7 * (number - 1))
                fixtures.append(
                    Fixture(number, names[h], names[a], leg, f"{names[h]} Park",
                            f"Pitch {court % 3 + 1}", "15:00", start.date(), start)
                )  # fmt: skip
    return Season("Benchmark League", "2026-27", tuple(names), tuple(fixtures), legs=2,
                  timezone="Europe/Brussels", revision="bench")  # fmt: skip


def timed(fn, repeat: int = 3) -> float:
    best = float("inf")
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        best = min(best, time.perf_counter() - t0)
    return best


def frame(season: Season) -> pd.DataFrame:
    return pd.DataFrame(
        [(f.round, f.leg, f.date, f.start.strftime("%H:%M"), f.home, f.away, f.venue, f.court,
          f.slot) for f in season.fixtures],
        columns=["round", "leg", "date", "time", "home", "away", "venue", "court", "slot"],
    )  # fmt: skip


def reference_ics(season: Season) -> bytes:
    cal = Calendar()
    cal.add("prodid", "-//reference//EN")
    cal.add("version", "2.0")
    stamp = datetime(2026, 1, 1, tzinfo=UTC)
    for k, f in enumerate(season.fixtures):
        ev = Event()
        ev.add("uid", f"{k}@reference.invalid")
        ev.add("dtstamp", stamp)
        ev.add("dtstart", f.start)
        ev.add("summary", f"{f.home} v {f.away}")
        cal.add_component(ev)
    return cal.to_ical()


def main() -> None:
    n = int(sys.argv[1]) if len(sys.argv) > 1 else 20
    season = build(n)
    fairness = compute_fairness(season)
    table = frame(season)
    print(f"{n} teams, {len(season.fixtures)} fixtures, {season.rounds} rounds")
    rows = [
        ("CSV", lambda: fixtures_csv(season), lambda: table.to_csv(index=False)),
        (
            "workbook",
            lambda: workbook_bytes(season, fairness),
            lambda: table.to_excel(io.BytesIO(), index=False, engine="openpyxl"),
        ),
        ("iCalendar", lambda: league_calendar(season), lambda: reference_ics(season)),
        ("report", lambda: render_report(season, fairness), lambda: table.to_html()),
    ]
    print(f"{'export':<10} {'ours (s)':>10} {'reference (s)':>14} {'ratio':>7}")
    for name, ours, ref in rows:
        t_ours, t_ref = timed(ours), timed(ref)
        print(f"{name:<10} {t_ours:>10.4f} {t_ref:>14.4f} {t_ours / t_ref:>7.2f}")


if __name__ == "__main__":
    main()
