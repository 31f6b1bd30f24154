"""Run the units of work of a federation on Dask distributed.

The default is embedded: ``distributed.LocalCluster(n_workers=N, threads_per_worker=1,
processes=True)``, worker processes on this machine, nothing to set up. With an address the same
tasks go to a running Dask scheduler (started with ``dask scheduler``, workers with
``dask worker ADDRESS``). One task per unit (:func:`scheduler.divisions.plan.plan_unit`); the
results are gathered by the unit's key and put back in unit order, so the outcome never depends
on which worker finished first or how many there are. Each unit's solves are deterministic
(CP-SAT with one search worker, a fixed seed and a deterministic time limit), so the same file
gives the same plans with 1, 2 or 20 workers (tested).

API used (Dask documentation, distributed: ``LocalCluster``, ``Client(address, timeout=...)``,
``Client.scatter``, ``Client.submit``, ``as_completed``).
"""

from __future__ import annotations

import concurrent.futures as cf
import hashlib
import logging
import time as clock
from collections.abc import Callable, Iterator
from contextlib import contextmanager
from dataclasses import dataclass
from typing import Any

from scheduler.config.federation import Federation
from scheduler.divisions.check import CrossCheck, check_federation
from scheduler.divisions.grouping import Unit, units_of
from scheduler.divisions.plan import JOINT, DivisionPlan, UnitResult, plan_unit
from scheduler.errors import InfeasibleError, InputError

CONNECT_SECONDS = 5
"""How long to wait for a Dask scheduler at an address before giving up (under 10 s)."""


@dataclass(frozen=True)
class FederationPlan:
    """Every division planned.

    Parameters
    ----------
    federation : Federation
        The federation planned.
    units : tuple of Unit
        Its units of work.
    results : tuple of UnitResult
        Their results, in unit order.
    plans : tuple of DivisionPlan
        The division plans, in file order.
    check : CrossCheck
        The independent check of the rules across divisions.
    wall_seconds : float
        Wall time of the whole planning.
    """

    federation: Federation
    units: tuple[Unit, ...]
    results: tuple[UnitResult, ...]
    plans: tuple[DivisionPlan, ...]
    check: CrossCheck
    wall_seconds: float

    @property
    def solve_seconds(self) -> float:
        """Sum of the units' own planning times (what one worker would need without overhead)."""
        return sum(r.seconds for r in self.results)

    @property
    def cpu_seconds(self) -> float:
        """Sum of the units' processor times (their cost on idle cores, whatever the load)."""
        return sum(r.cpu_seconds for r in self.results)


@contextmanager
def dask_client(workers: int = 2, cluster: str | None = None) -> Iterator[Any]:
    """A ``distributed.Client``: on an embedded local cluster, or connected to ``cluster``.

    Parameters
    ----------
    workers : int
        Worker processes of the embedded cluster (ignored with ``cluster``).
    cluster : str or None
        Address of a running Dask scheduler, or ``None`` for the embedded cluster.

    Yields
    ------
    distributed.Client
        The client; closed (with the embedded cluster) on leaving the context.

    Raises
    ------
    InputError
        When no scheduler answers at ``cluster`` within :data:`CONNECT_SECONDS` seconds, or
        ``workers`` is not a positive number.
    """
    from distributed import Client, LocalCluster

    if cluster is not None:
        try:
            client = Client(cluster, timeout=f"{CONNECT_SECONDS}s")
        except (OSError, TimeoutError, ValueError) as exc:
            raise InputError(
                f"no Dask scheduler answers at {cluster!r} within {CONNECT_SECONDS} s ({exc}); "
                "start one with `dask scheduler` and workers with `dask worker ADDRESS`, or "
                "leave out --cluster to use worker processes on this machine",
                location="--cluster") from None
        try:
            yield client
        finally:
            client.close()
        return
    if workers < 1:
        raise InputError(f"--workers must be 1 or more, got {workers}", location="--workers")
    local = LocalCluster(n_workers=workers, threads_per_worker=1, processes=True,
                         dashboard_address=None, silence_logs=logging.ERROR)
    client = Client(local)
    try:
        yield client
    finally:
        client.close()
        local.close()


@contextmanager
def task_engine(engine: str = "pool", workers: int = 2, cluster: str | None = None
                ) -> Iterator[tuple[Callable[..., Any], Callable[[set[Any]], set[Any]]]]:
    """``(submit, wait_first)`` for independent tasks on a local process pool or on Dask
    distributed (the engine of :func:`dask_client`, with its connection errors).

    ``submit(function, *args)`` returns a future; ``wait_first(pending)`` blocks until at least
    one of the pending futures is done and returns the finished ones (``future.result()`` gives
    the value). The functions must be plain top-level functions with picklable arguments, so that
    workers on other machines need only the installed package. Used by the offline searches
    (``benchmarks/find_k52_k56.py``, ``benchmarks/find_structured.py``).

    Parameters
    ----------
    engine : str, optional
        ``"pool"`` (a ``concurrent.futures`` process pool on this machine) or ``"dask"``.
    workers : int, optional
        Worker processes of the pool or of the embedded Dask cluster.
    cluster : str or None, optional
        Address of a running Dask scheduler (with ``engine="dask"``).

    Yields
    ------
    tuple of callable
        ``(submit, wait_first)``.

    Raises
    ------
    InputError
        For an unknown engine, fewer than one worker, or a cluster that does not answer.

    Examples
    --------
    >>> with task_engine("pool", workers=1) as (submit, wait_first):  # doctest: +SKIP
    ...     [future.result() for future in wait_first({submit(pow, 2, 10)})]
    [1024]
    """
    if engine == "dask":
        from distributed import wait

        with dask_client(workers, cluster) as client:
            yield (lambda function, *args: client.submit(function, *args, pure=False),
                   lambda pending: set(wait(pending, return_when="FIRST_COMPLETED").done))
        return
    if engine != "pool":
        raise InputError(f"the engine must be 'pool' or 'dask', got {engine!r}",
                         location="--engine")
    if workers < 1:
        raise InputError(f"--workers must be 1 or more, got {workers}", location="--workers")
    with cf.ProcessPoolExecutor(max_workers=workers) as pool:
        yield (pool.submit,
               lambda pending: set(cf.wait(pending, return_when=cf.FIRST_COMPLETED)[0]))


def _unit_size(fed: Federation, unit: Unit) -> int:
    """A work estimate of a unit: its games (teams choose 2, times legs) over its divisions."""
    leagues = {d.name: d.league for d in fed.divisions}
    return sum(
        len(leagues[name].teams) * (len(leagues[name].teams) - 1) // 2
        * max(1, leagues[name].format.legs)
        for name in unit.divisions
    )


def plan_federation(
    fed: Federation,
    *,
    workers: int = 2,
    cluster: str | None = None,
    time_limit: float | None = None,
    progress: Callable[[str, float], None] | None = None,
    method: str = "auto",
) -> FederationPlan:
    """Plan every division of ``fed``, one Dask task per unit of work.

    Parameters
    ----------
    fed
        The federation.
    workers
        Worker processes of the embedded cluster (ignored with ``cluster``).
    cluster
        Address of a running Dask scheduler (``tcp://host:8786``), or ``None`` for embedded.
    time_limit
        Solver seconds per division (default: each division's own).
    progress
        ``progress(message, fraction)`` after each finished unit.
    method
        How units of several divisions are planned (:data:`scheduler.divisions.plan.METHODS`):
        ``auto`` (the joint model, else one division after another), ``joint``, ``sequential``.

    Returns
    -------
    FederationPlan
        The plans and the independent check.

    Raises
    ------
    InfeasibleError
        When a unit cannot be planned (every failing unit is named, with its clash).
    InputError
        When no scheduler answers at ``cluster``.

    References
    ----------
    ``docs/divisions.md`` (units of work, couplings and the independent check); Dask
    distributed documentation (``Client.submit``, ``as_completed``).

    Examples
    --------
    >>> plan = plan_federation(fed, workers=2)  # doctest: +SKIP
    >>> plan.check.valid  # doctest: +SKIP
    True
    """
    from distributed import as_completed

    began = clock.perf_counter()
    units = units_of(fed)
    digest = hashlib.sha256(repr(fed).encode("utf-8")).hexdigest()[:12]
    results: dict[str, UnitResult] = {}
    with dask_client(workers, cluster) as client:
        shared = client.scatter(fed, broadcast=True)
        # Largest units first (longest-processing-time-first list scheduling, R. L. Graham,
        # SIAM J. Appl. Math. 17, 1969, from memory): the last units to finish are small, so
        # the workers finish close together. Only the order of work changes, never a result.
        futures = {
            client.submit(plan_unit, shared, unit, time_limit, method,
                          key=f"plan-{digest}-{method}-{unit.key}",
                          pure=False, priority=_unit_size(fed, unit)): unit.key
            for unit in units
        }
        for done, future in enumerate(as_completed(futures), start=1):
            key = futures[future]
            results[key] = future.result()
            if progress is not None:
                progress(f"planned {done} of {len(units)} units ({key})", done / len(units))
    ordered = tuple(results[u.key] for u in units)
    failed = [r for r in ordered if r.error]
    if failed:
        conflicts = [f"{r.key}: {r.error}" for r in failed]
        raise InfeasibleError(
            f"{len(failed)} of {len(units)} units of divisions cannot be planned", conflicts)
    by_name = {p.name: p for r in ordered for p in r.plans}
    plans = tuple(by_name[name] for name in fed.division_names)
    joint = {d for u, r in zip(units, ordered, strict=True) if r.method == JOINT
             for d in u.divisions}
    promised = [g.name for g in fed.shared_grounds
                if g.pattern == "complementary" and {fed.division_of(t) for t in g.teams} <= joint]
    check = check_federation(fed, {p.name: p.season for p in plans}, promised)
    return FederationPlan(fed, units, ordered, plans, check, clock.perf_counter() - began)
