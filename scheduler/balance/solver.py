"""CP-SAT parameters shared by every model of the balancer: reproducible runs.

One worker, a fixed ``random_seed`` and a deterministic time limit (``max_deterministic_time``);
the wall-clock limit is only a safety net, reported when hit.
"""

from __future__ import annotations

from dataclasses import dataclass

from ortools.sat.python import cp_model


@dataclass(frozen=True)
class SolveLimits:
    """Deterministic time (CP-SAT's ``max_deterministic_time``) and a wall-clock safety cap.

    Parameters
    ----------
    deterministic
        CP-SAT's deterministic time limit (its own work units, roughly seconds); the same
        limit gives the same result on any machine.
    wall
        Wall-clock seconds after which the solve stops anyway (a safety net, reported when
        hit, since the result may then depend on the machine).
    seed
        CP-SAT's random seed (taken modulo 2^31).

    See Also
    --------
    configure

    Examples
    --------
    >>> limits = SolveLimits(deterministic=5.0, wall=60.0, seed=7)
    >>> solver = cp_model.CpSolver()
    >>> configure(solver, limits)
    >>> solver.parameters.num_workers, solver.parameters.random_seed
    (1, 7)
    """

    deterministic: float
    wall: float
    seed: int

    @classmethod
    def with_safety_net(cls, deterministic: float, seed: int) -> SolveLimits:
        """Limits with the planner's usual wall-clock safety net, ``4 * deterministic + 10``
        seconds (room for a machine four times slower than CP-SAT's work units assume, plus
        model building).

        Parameters
        ----------
        deterministic
            CP-SAT's deterministic time limit.
        seed
            CP-SAT's random seed.

        Returns
        -------
        SolveLimits
            The limits.

        Examples
        --------
        >>> SolveLimits.with_safety_net(5.0, seed=7)
        SolveLimits(deterministic=5.0, wall=30.0, seed=7)
        """
        return cls(deterministic, 4 * deterministic + 10, seed)


def configure(solver: cp_model.CpSolver, limits: SolveLimits) -> None:
    """Parameters for reproducible runs: one worker, fixed seed, deterministic limit.

    Parameters
    ----------
    solver
        The solver, changed in place.
    limits
        The limits and seed to set.

    References
    ----------
    OR-Tools CP-SAT parameters ``num_workers``, ``random_seed``, ``max_deterministic_time``
    and ``max_time_in_seconds`` (sat_parameters.proto).

    Examples
    --------
    >>> solver = cp_model.CpSolver()
    >>> configure(solver, SolveLimits(deterministic=2.0, wall=30.0, seed=1))
    >>> solver.parameters.max_deterministic_time
    2.0
    """
    parameters = solver.parameters
    parameters.random_seed = int(limits.seed) % (2**31)
    parameters.num_workers = 1
    parameters.max_deterministic_time = float(limits.deterministic)
    parameters.max_time_in_seconds = float(limits.wall)
