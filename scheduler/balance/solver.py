"""CP-SAT parameters shared by every model of the balancer: reproducible runs.

One worker, a fixed ``random_seed`` and a deterministic time limit (``max_deterministic_time``);
the wall-clock limit is only a safety net, reported when hit.
"""

from __future__ import annotations

from dataclasses import dataclass

from ortools.sat.python import cp_model


@dataclass(frozen=True)
class SolveLimits:
    """Deterministic time (CP-SAT's ``max_deterministic_time``) and a wall-clock safety cap."""

    deterministic: float
    wall: float
    seed: int


def configure(solver: cp_model.CpSolver, limits: SolveLimits) -> None:
    """Parameters for reproducible runs: one worker, fixed seed, deterministic limit."""
    parameters = solver.parameters
    parameters.random_seed = int(limits.seed) % (2**31)
    parameters.num_workers = 1
    parameters.max_deterministic_time = float(limits.deterministic)
    parameters.max_time_in_seconds = float(limits.wall)
