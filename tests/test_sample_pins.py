"""The fixtures of every shipped sample league, pinned by hash.

Moving code between packages must not change a single game: these hashes were taken from the
outputs of ``scheduler plan`` before the code was reorganised. A change that is *meant* to change
the schedule (a better solver, a new rule default) updates the pin in the same commit and says
why in its message. The hash covers what an organizer publishes: round, leg, date, start, home,
away, venue, court, slot of every fixture, and the byes.
"""

from __future__ import annotations

import hashlib
import json
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parent.parent

PINNED = {
    "club_day": "803bec91118b0ed46499fb8d42e0765e5c3682a03d82aff96e39627dcaf27de6",
    "evening_hall": "35e48f43bdf68f554bb306bcf019f9048269a50d9cf25f43357536ed0903a01f",
    "county_double": "f775302213eabe77beba04b62d573f0d49ec777906b81c0cd0afeb29c83fbe8e",
}


def fixtures_digest(season_json: Path) -> str:
    """sha256 of the published facts of every fixture and bye in a season.json."""
    data = json.loads(season_json.read_text(encoding="utf-8"))
    keys = ("round", "leg", "date", "start", "home", "away", "venue", "court", "slot")
    rows = [[f.get(k) for k in keys] for f in data["fixtures"]]
    text = json.dumps({"fixtures": rows, "byes": data.get("byes")}, sort_keys=True)
    return hashlib.sha256(text.encode("utf-8")).hexdigest()


@pytest.mark.slow
@pytest.mark.parametrize("sample", sorted(PINNED))
def test_sample_fixtures_unchanged(sample: str, tmp_path: Path) -> None:
    out = tmp_path / "season"
    subprocess.run(
        [sys.executable, "-m", "scheduler.cli", "plan",
         str(ROOT / "sample_leagues" / f"{sample}.toml"), "--out", str(out), "--quiet"],
        check=True, cwd=tmp_path, capture_output=True,
    )
    assert fixtures_digest(out / "season.json") == PINNED[sample]
