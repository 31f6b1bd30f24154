"""Exception types of the library.

Every error a league organizer can cause carries a message written for them. Only the CLI turns
these into exit codes (see ``scheduler.cli``): 0 ok, 1 audit found the schedule invalid,
2 unusable input.
"""

from __future__ import annotations


class SchedulerError(Exception):
    """Base class of every error the library raises on purpose."""


class InputError(SchedulerError):
    """Unusable input: a bad number, a malformed file, an unknown name.

    ``location`` says where (a file, a field path such as ``teams[3].home_venue``, a row).
    """

    def __init__(self, message: str, *, location: str | None = None) -> None:
        self.location = location
        self.detail = message
        super().__init__(f"{location}: {message}" if location else message)


class ConfigError(InputError):
    """A league file that cannot be used; one or more located problems."""

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

    ``conflicts`` lists the rules (in the user's words) that together cannot hold.
    """

    def __init__(self, message: str, conflicts: list[str] | None = None) -> None:
        self.conflicts = list(conflicts or [])
        text = message
        if self.conflicts:
            text += "\n" + "\n".join(f"  - {c}" for c in self.conflicts)
        super().__init__(text)


class OutputError(SchedulerError):
    """An output folder or file that may not be written (for example it holds another league)."""
