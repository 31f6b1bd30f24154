"""Balance: turn a one-factorization and a league's rules into a timetable (OR-Tools CP-SAT).

The models only: round order, home/away and match days (:mod:`.timetable`), venues, courts and
slots (:mod:`.places`), the carry-over search (:mod:`.carry`). The whole pipeline runs in
:func:`scheduler.plan.plan_season`.
"""

from scheduler.balance.solver import SolveLimits
from scheduler.balance.timetable import Timetable, solve_timetable

__all__ = ["SolveLimits", "Timetable", "solve_timetable"]
