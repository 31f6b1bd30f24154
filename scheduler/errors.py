"""Exception types of the library.

Every error a league organizer can cause carries a message written for them. Only the CLI turns
these into exit codes (see ``scheduler.cli``): 0 ok, 1 audit found the schedule invalid,
2 unusable input.
"""

from __future__ import annotations


class SchedulerError(Exception):
    """Base class of every error the library raises on purpose.

    Catching it separates the problems a league organizer can fix (bad input, rules that cannot
    hold, an output folder that may not be written) from bugs, which surface as any other
    exception. The CLI maps the subclasses to exit codes; the library itself never exits.

    See Also
    --------
    InputError, ConfigError, InfeasibleError, OutputError

    Examples
    --------
    >>> issubclass(ConfigError, SchedulerError) and issubclass(OutputError, SchedulerError)
    True
    """


class InputError(SchedulerError):
    """Unusable input: a bad number, a malformed file, an unknown name.

    The text of the exception is ``"<location>: <message>"`` (or the message alone); the two
    parts stay available as :attr:`location` and :attr:`detail`.

    Parameters
    ----------
    message : str
        What is wrong, written for the league organizer.
    location : str or None, optional
        Where: a file, a field path such as ``teams[3].home_venue``, a row. None when the
        problem has no single place.

    Examples
    --------
    >>> error = InputError("unknown venue 'Elm Park'", location="teams[3].home_venue")
    >>> str(error)
    "teams[3].home_venue: unknown venue 'Elm Park'"
    >>> error.detail
    "unknown venue 'Elm Park'"
    """

    def __init__(self, message: str, *, location: str | None = None) -> None:
        self.location = location
        self.detail = message
        super().__init__(f"{location}: {message}" if location else message)


class ConfigError(InputError):
    """A league file that cannot be used; one or more located problems.

    All the problems found in one reading are reported together, each already located by its
    field path, so the organizer can fix the file in one pass.

    Parameters
    ----------
    problems : list of str
        The problems, one located message each (for example ``"teams[2].name: missing"``).
    path : str or None, optional
        The file the problems are in; None for data that did not come from a file.

    Examples
    --------
    >>> error = ConfigError(["teams: at least 2 teams", "format.legs: must be 1 to 4"],
    ...                     path="league.toml")
    >>> print(error)
    league.toml: 2 problems
      - teams: at least 2 teams
      - format.legs: must be 1 to 4
    >>> error.problems[0]
    'teams: at least 2 teams'
    """

    def __init__(self, problems: list[str], *, path: str | None = None) -> None:
        self.problems = list(problems)
        self.path = path
        head = f"{path}: " if path else ""
        if len(self.problems) == 1:
            message = head + self.problems[0]
        else:
            message = (
                head
                + f"{len(self.problems)} problems\n"
                + "\n".join(f"  - {p}" for p in self.problems)
            )
        SchedulerError.__init__(self, message)
        self.location = path
        self.detail = message


class InfeasibleError(SchedulerError):
    """The league's hard rules cannot all hold together.

    Parameters
    ----------
    message : str
        What could not be planned.
    conflicts : list of str or None, optional
        The rules (in the user's words) that together cannot hold, listed one a line under the
        message; None or empty when no smaller set of rules is known.

    Examples
    --------
    >>> error = InfeasibleError("no timetable keeps every rule",
    ...                         ["at most 1 home game in a row", "no breaks in the first 3 rounds"])
    >>> error.conflicts[1]
    'no breaks in the first 3 rounds'
    >>> print(error)
    no timetable keeps every rule
      - at most 1 home game in a row
      - no breaks in the first 3 rounds
    """

    def __init__(self, message: str, conflicts: list[str] | None = None) -> None:
        self.conflicts = list(conflicts or [])
        text = message
        if self.conflicts:
            text += "\n" + "\n".join(f"  - {c}" for c in self.conflicts)
        super().__init__(text)


class OutputError(SchedulerError):
    """An output folder or file that may not be written (for example it holds another league).

    Outputs are all-or-nothing and never overwrite the user's own files; this error is raised
    before anything is written.

    Examples
    --------
    >>> str(OutputError("out/ holds the season of another league"))
    'out/ holds the season of another league'
    """
