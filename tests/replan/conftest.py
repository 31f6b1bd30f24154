"""Shared set-up: the small invented test league planned once per session."""

from __future__ import annotations

import hashlib
import shutil
from pathlib import Path

import pytest

from scheduler.config import load_league
from scheduler.export import write_season_outputs
from scheduler.fairness import compute_fairness

DATA = Path(__file__).parent / "data"
LEAGUE = DATA / "small.toml"


@pytest.fixture(scope="session")
def planned_small(tmp_path_factory) -> Path:
    """A season folder of the small league, planned once (never modified: copy it)."""
    from scheduler.plan import plan_season

    league = load_league(LEAGUE)
    season = plan_season(league).season
    out = tmp_path_factory.mktemp("planned") / "season"
    write_season_outputs(season, compute_fairness(season), out, config_path=LEAGUE,
                         game_minutes=league.calendar.game_minutes,
                         side_labels=league.format.grid_labels)
    return out


@pytest.fixture
def season_dir(planned_small, tmp_path) -> Path:
    target = tmp_path / "season"
    shutil.copytree(planned_small, target)
    return target


def folder_digest(folder: Path) -> str:
    """sha256 over every file's relative path and bytes (to prove a folder untouched)."""
    digest = hashlib.sha256()
    for path in sorted(p for p in folder.rglob("*") if p.is_file()):
        digest.update(str(path.relative_to(folder)).encode())
        digest.update(path.read_bytes())
    return digest.hexdigest()


def write_events(tmp_path: Path, body: str, *, played_through: str = "2031-03-22",
                 league: str = "Fenmarsh Test League", season: str = "2031") -> Path:
    path = tmp_path / "events.toml"
    path.write_text(f'league = "{league}"\nseason = "{season}"\n'
                    f"played_through = {played_through}\n\n{body}", encoding="utf-8")
    return path
