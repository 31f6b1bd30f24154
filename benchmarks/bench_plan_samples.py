"""Time ``scheduler plan`` on every shipped sample league, outputs included.

Prints, per sample: the seconds for each stage (load, plan, fairness, outputs), the total, its
ratio to the 20 s target, and the headline figures of the plan. The stages are timed through the
library (the same calls the CLI makes), in a fresh temporary output folder each time.

Run: ``python benchmarks/bench_plan_samples.py``
"""

from __future__ import annotations

import tempfile
import time
from itertools import pairwise
from pathlib import Path

from scheduler.config import load_league, sample_names, sample_path
from scheduler.export import write_season_outputs
from scheduler.fairness import compute_fairness
from scheduler.plan import plan_season

TARGET_SECONDS = 20.0


def bench(name: str) -> None:
    path = sample_path(name)
    marks = [time.perf_counter()]
    league = load_league(path)
    marks.append(time.perf_counter())
    result = plan_season(league)
    marks.append(time.perf_counter())
    fairness = compute_fairness(result.season)
    marks.append(time.perf_counter())
    with tempfile.TemporaryDirectory() as folder:
        files = write_season_outputs(
            result.season,
            fairness,
            Path(folder) / "season",
            config_path=path,
            game_minutes=league.calendar.game_minutes,
            side_labels=league.format.grid_labels,
        )
    marks.append(time.perf_counter())
    stages = [b - a for a, b in pairwise(marks)]
    total = marks[-1] - marks[0]
    print(
        f"{name:>14}: load {stages[0]:5.2f}s  plan {stages[1]:6.2f}s  fairness {stages[2]:5.2f}s"
        f"  outputs {stages[3]:5.2f}s ({len(files)} files)  total {total:6.2f}s"
        f"  = {total / TARGET_SECONDS:.2f} x the {TARGET_SECONDS:.0f} s target"
    )
    print(
        f"{'':>16}{len(league.teams)} teams, breaks {fairness.breaks_total} "
        f"(lower bound {fairness.breaks_lower_bound}), perfect pairs "
        f"{fairness.perfect_pairs}/{fairness.pairs}, status {result.status}"
    )


def main() -> None:
    for name in sample_names():
        bench(name)


if __name__ == "__main__":
    main()
