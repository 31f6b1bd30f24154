"""Independent tasks on a local process pool or on embedded Dask (``task_engine``): the same
results from either engine, errors located at the option."""

from __future__ import annotations

import pytest

from scheduler.divisions.execute import task_engine
from scheduler.errors import InputError


@pytest.mark.parametrize("engine", ["pool", "dask"])
def test_both_engines_run_every_task(engine):
    results = set()
    with task_engine(engine, workers=1) as (submit, wait_first):
        pending = {submit(pow, 2, k) for k in range(6)}
        while pending:
            for future in wait_first(pending):
                pending.discard(future)
                results.add(future.result())
    assert results == {1, 2, 4, 8, 16, 32}


@pytest.mark.parametrize("kwargs, where", [
    ({"engine": "threads"}, "--engine"), ({"workers": 0}, "--workers"),
])
def test_bad_engine_or_workers(kwargs, where):
    with pytest.raises(InputError) as err, task_engine(**kwargs):
        pass
    assert err.value.location == where
