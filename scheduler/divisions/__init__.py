"""Several divisions on one calendar: couplings, units of work, planning, checking, outputs.

``units_of(federation)`` cuts a federation into independent units (connected components of the
graph of couplings); ``plan_federation`` plans them, on a Dask cluster of worker processes
(embedded or at an address); ``check_federation`` checks the rules across divisions from the
fixtures alone; ``write_federation_outputs`` writes the folder. See ``docs/divisions.md``.
"""

from scheduler.divisions.check import CrossCheck, check_federation
from scheduler.divisions.grouping import Coupling, Unit, couplings_of, units_of
from scheduler.divisions.plan import DivisionPlan, UnitResult, plan_unit

__all__ = [
    "Coupling",
    "CrossCheck",
    "DivisionPlan",
    "Unit",
    "UnitResult",
    "check_federation",
    "couplings_of",
    "plan_unit",
    "units_of",
]
