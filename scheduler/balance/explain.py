"""Infeasibility explained in the league's own words.

Every hard rule is added to the CP-SAT model under its own *assumption literal* (the constraints
are ``OnlyEnforceIf(literal)`` and the literal is passed to ``AddAssumptions``). When the model is
infeasible, ``CpSolver.SufficientAssumptionsForInfeasibility()`` returns a subset of assumptions
that cannot all hold; it is shrunk further by deletion (drop one rule, re-solve, keep it out if the
rest is still infeasible), and the remaining rules are reported.

Source: the assumption/core interface of OR-Tools CP-SAT (``AddAssumptions``,
``SufficientAssumptionsForInfeasibility``); deletion-based core minimisation is the textbook
"deletion filter" (Chinneck & Dravnieks 1991, ORSA J. Computing 3(2):157-168, from memory).
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, field

from ortools.sat.python import cp_model

from scheduler.errors import InfeasibleError


@dataclass
class RuleBook:
    """The assumption literals of one model and the plain-words text of each rule."""

    model: cp_model.CpModel
    literals: list[cp_model.IntVar] = field(default_factory=list)
    texts: list[str] = field(default_factory=list)
    _by_text: dict[str, cp_model.IntVar] = field(default_factory=dict)

    def rule(self, text: str) -> cp_model.IntVar:
        """The literal that switches the rule described by ``text`` on (one per distinct text)."""
        if text in self._by_text:
            return self._by_text[text]
        lit = self.model.NewBoolVar(f"rule{len(self.literals)}")
        self.literals.append(lit)
        self.texts.append(text)
        self._by_text[text] = lit
        return lit

    def forbid(self, text: str) -> None:
        """A rule that cannot hold at all (checked before solving): its literal must be false."""
        lit = self.rule(text)
        self.model.AddBoolOr([lit.Not()])

    def assume_all(self) -> None:
        self.model.ClearAssumptions()
        self.model.AddAssumptions(self.literals)


def explain(
    book: RuleBook,
    solver: cp_model.CpSolver,
    resolve: Callable[[list[int]], bool],
    *,
    what: str = "the league's rules cannot all hold",
) -> InfeasibleError:
    """Build the error after an INFEASIBLE solve.

    ``resolve(indices)`` re-solves with only those rules assumed and returns True when that is
    still proven infeasible (used to shrink the core).
    """
    index_of = {lit.Index(): i for i, lit in enumerate(book.literals)}
    core = sorted(index_of[v] for v in solver.SufficientAssumptionsForInfeasibility()
                  if v in index_of)
    if core and len(core) <= 12:
        kept = list(core)
        for i in list(core):
            trial = [j for j in kept if j != i]
            if trial and resolve(trial):
                kept = trial
        core = kept
    conflicts = [book.texts[i] for i in core]
    if not conflicts:
        return InfeasibleError(
            "the format and calendar cannot be scheduled even without the league's rules", []
        )
    if len(conflicts) == 1:
        message = f"{what}: this one cannot hold"
    else:
        message = f"{what}: these {len(conflicts)} cannot hold together"
    return InfeasibleError(message, conflicts)
