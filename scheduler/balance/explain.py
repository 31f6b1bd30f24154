"""Infeasibility explained in the league's own words, with a minimal set of rules.

Every statement of a hard rule is added to the CP-SAT model under its own *assumption literal*
(the constraints are ``only_enforce_if(literal)`` and the literal is passed to
``AddAssumptions``); rules the league switches off add no literal at all. When the model is
infeasible, ``CpSolver.sufficient_assumptions_for_infeasibility()`` returns a subset of assumptions
that cannot all hold; it is shrunk to a *minimal* one with QuickXplain (U. Junker, "QUICKXPLAIN:
preferred explanations and relaxations for over-constrained problems", AAAI 2004, from memory):
divide the candidates in two halves, find what the second half must contribute given the first,
then what the first must contribute given that, recursively; each test is a re-solve with only
those assumptions. When every test is decided, dropping any one statement of the result removes
the clash (the result is minimal); a test that runs out of time counts as "not proven
infeasible", so the result is always a set proven to clash.

Where a rule offers an obvious smallest relaxation (one more home game in a row, one rest day
fewer...), the message names it beside the clash (:meth:`scheduler.rules.HardRule.relaxation`).
"""

from __future__ import annotations

from collections.abc import Callable
from dataclasses import dataclass, field

from ortools.sat.python import cp_model

from scheduler.config.model import League
from scheduler.errors import InfeasibleError
from scheduler.rules import RULES

MAX_CHECKS = 40
"""Re-solves allowed for minimising one clash at most (each capped at two deterministic
seconds); the timetable model allows fewer for a short solve limit."""


@dataclass
class RuleBook:
    """The assumption literals of one model and the plain-words text of each statement.

    Parameters
    ----------
    model
        The CP-SAT model the literals belong to.
    literals
        One assumption literal per distinct statement, in the order they were added.
    texts
        ``texts[i]``: the statement of ``literals[i]`` in the organizer's words.
    _by_text
        Statement -> its literal (filled by :meth:`rule`; not meant to be passed).

    Examples
    --------
    >>> book = RuleBook(cp_model.CpModel())
    >>> book.rule("no team plays 3 home games in a row") is book.rule(
    ...     "no team plays 3 home games in a row")
    True
    >>> book.texts
    ['no team plays 3 home games in a row']
    """

    model: cp_model.CpModel
    literals: list[cp_model.IntVar] = field(default_factory=list)
    texts: list[str] = field(default_factory=list)
    _by_text: dict[str, cp_model.IntVar] = field(default_factory=dict)

    def rule(self, text: str) -> cp_model.IntVar:
        """The literal that switches the rule described by ``text`` on (one per distinct text).

        Parameters
        ----------
        text
            The statement in the organizer's words; repeating a text gives the same literal.

        Returns
        -------
        ortools.sat.python.cp_model.IntVar
            The assumption literal; constraints of the statement are enforced only if it holds.
        """
        if text in self._by_text:
            return self._by_text[text]
        lit = self.model.new_bool_var(f"rule{len(self.literals)}")
        self.literals.append(lit)
        self.texts.append(text)
        self._by_text[text] = lit
        return lit

    def forbid(self, text: str) -> None:
        """A rule that cannot hold at all (checked before solving): its literal must be false.

        Parameters
        ----------
        text
            The statement in the organizer's words.
        """
        lit = self.rule(text)
        self.model.add_bool_or([lit.negated()])

    def assume_all(self) -> None:
        """Make every statement's literal an assumption of the model (replacing earlier
        assumptions), so that an infeasible solve can name the statements that clash."""
        self.model.clear_assumptions()
        self.model.add_assumptions(self.literals)


def quickxplain(candidates: list[int], clashes: Callable[[list[int]], bool],
                budget: int = MAX_CHECKS) -> list[int]:
    """A minimal subset of ``candidates`` for which ``clashes`` holds (Junker 2004).

    ``clashes(subset)`` must be monotone (a superset of a clashing set clashes) and true for the
    whole of ``candidates``. After ``budget`` calls the remaining tests are answered "no
    clash", which keeps the result clashing but maybe not minimal.

    Parameters
    ----------
    candidates
        Indexes of the statements of a clashing set.
    clashes
        The test: does this subset still clash (a re-solve)?
    budget
        Most calls of ``clashes``.

    Returns
    -------
    list of int
        A clashing subset of ``candidates``, sorted; minimal when every test was decided
        within the budget.

    References
    ----------
    U. Junker, "QUICKXPLAIN: preferred explanations and relaxations for over-constrained
    problems", AAAI 2004 (from memory); ``docs/rules.md``.

    Examples
    --------
    >>> quickxplain(list(range(8)), lambda s: {2, 5} <= set(s))
    [2, 5]
    """
    calls = [0]

    def test(subset: list[int]) -> bool:
        if calls[0] >= budget:
            return False
        calls[0] += 1
        return clashes(subset)

    def search(background: list[int], added: bool, pool: list[int]) -> list[int]:
        if added and background and test(background):
            return []
        if len(pool) == 1:
            return list(pool)
        half = len(pool) // 2
        first, second = pool[:half], pool[half:]
        need_second = search(background + first, bool(first), second)
        need_first = search(background + need_second, bool(need_second), first)
        return need_first + need_second

    if not candidates:
        return []
    return sorted(search([], False, list(candidates)))


def explain(
    book: RuleBook,
    solver: cp_model.CpSolver,
    resolve: Callable[[list[int]], bool],
    *,
    what: str = "the league's rules cannot all hold",
    league: League | None = None,
    checks: int = MAX_CHECKS,
) -> InfeasibleError:
    """Build the error after an INFEASIBLE solve.

    ``resolve(indices)`` re-solves with only those statements assumed and returns True when that
    is still proven infeasible (used to shrink the clash to a minimal one, at most ``checks``
    times).

    Parameters
    ----------
    book
        The model's statements and their assumption literals.
    solver
        The solver after the INFEASIBLE solve (its sufficient assumptions are read).
    resolve
        Re-solve with only the statements of these indexes; True when still infeasible.
    what
        The start of the message (what cannot hold).
    league
        The league, to name the smallest relaxation of each rule; ``None`` names none.
    checks
        Most re-solves used to shrink the clash.

    Returns
    -------
    InfeasibleError
        The error to raise, listing the clashing statements in the organizer's words.

    References
    ----------
    ``docs/rules.md``.
    """
    index_of = {lit.index: i for i, lit in enumerate(book.literals)}
    core = sorted(index_of[v] for v in solver.sufficient_assumptions_for_infeasibility()
                  if v in index_of)
    if core and len(core) > 1:
        core = quickxplain(core, resolve, budget=checks)
    conflicts = [book.texts[i] for i in core]
    if not conflicts:
        return InfeasibleError(
            "the format and calendar cannot be scheduled even without the league's rules", []
        )
    if len(conflicts) == 1:
        message = f"{what}: this one cannot hold"
    else:
        message = f"{what}: these {len(conflicts)} cannot hold together"
    if league is not None:
        tries = []
        for text in conflicts:
            for rule in RULES:
                change = rule.relaxation(league, text)
                if change is not None:
                    tries.append(change)
                    break
        if tries:
            message += ("; the smallest changes to "
                        "try: " + ", ".join(dict.fromkeys(tries)))
    return InfeasibleError(message, conflicts)
