"""Balance: turn a one-factorization and a league's rules into a season (OR-Tools CP-SAT).

``plan_season(league)`` runs the whole pipeline: factorization, round order and home/away with
the fewest breaks, venues/courts/slots, match days and kick-off times.
"""

from scheduler.balance.plan import PlanOption, PlanResult, plan_season, revision

__all__ = ["PlanOption", "PlanResult", "plan_season", "revision"]
