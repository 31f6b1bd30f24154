"""Ctrl-C (SIGINT) that works at any moment, also inside a CP-SAT solve, and the test pause points.

CP-SAT catches SIGINT itself by default (its ``catch_sigint_signal`` parameter): a Ctrl-C then
only ends the search early, as if the time limit had been reached, and the program carries on
with a worse plan. Turning that off is not enough: Python runs its own SIGINT handler only
between bytecodes, so the ``KeyboardInterrupt`` would come when the solve returns, after the
whole time limit. :func:`solve_interruptibly` therefore turns CP-SAT's handler off, asks Python's
C-level signal handler to also write the signal number to a socket
(:func:`signal.set_wakeup_fd`), and a watcher thread that reads the socket calls
``solver.stop_search()`` (CP-SAT documents ``stop_search`` as callable from another thread). The
solve returns at once and Python's handler raises ``KeyboardInterrupt`` in the main thread.

:func:`sticky_interrupts` (installed by the command line) makes a Ctrl-C impossible to lose: some
code run during a plan swallows exceptions raised inside it (numba compiles through ctypes
callbacks, which print and drop a ``KeyboardInterrupt``). The handler records the interrupt before
raising it, and :func:`raise_if_interrupted`, called before each solve and before the season
folder is swapped, raises it again.

:func:`deferred_interrupts` holds a Ctrl-C back during a short section that must not be cut in
two (the swap of the season folder) and raises it afterwards.

:func:`pause_point` names the places where a test may stop the program: with the environment
variable ``SCHEDULER_TEST_PAUSE`` set to a comma-separated list of point names (or ``*``), the
program writes ``paused at NAME`` to standard error at each listed point and sleeps for up to
60 seconds, so that a test can send it SIGKILL or SIGINT there (see ``docs/season-folder.md``).
With ``SCHEDULER_TEST_ANNOUNCE`` set, every point writes ``at NAME`` to standard error without
pausing. Unset, a pause point does nothing.
"""

from __future__ import annotations

import contextlib
import os
import signal
import socket
import sys
import threading
import time
from collections.abc import Iterator
from typing import Any

PAUSE_VARIABLE = "SCHEDULER_TEST_PAUSE"
"""Environment variable read only by :func:`pause_point` (tests of interruptions)."""

ANNOUNCE_VARIABLE = "SCHEDULER_TEST_ANNOUNCE"
"""Environment variable read only by :func:`pause_point`: when set, every point writes
``at NAME`` to standard error (without pausing)."""

_PAUSE_SECONDS = 60.0


def pause_point(name: str) -> None:
    """Stop here for a test when ``SCHEDULER_TEST_PAUSE`` names this point (else do nothing).

    Parameters
    ----------
    name
        The point's name, for example ``"folder:before-swap"``.

    Examples
    --------
    >>> pause_point("nowhere")  # without the environment variable: returns at once
    """
    if os.environ.get(ANNOUNCE_VARIABLE):
        sys.stderr.write(f"at {name}\n")
        sys.stderr.flush()
    wanted = os.environ.get(PAUSE_VARIABLE)
    if not wanted:
        return
    names = {part.strip() for part in wanted.split(",")}
    if name not in names and "*" not in names:
        return
    sys.stderr.write(f"paused at {name}\n")
    sys.stderr.flush()
    end = time.monotonic() + _PAUSE_SECONDS
    while time.monotonic() < end:
        time.sleep(0.05)


def _in_main_thread() -> bool:
    return threading.current_thread() is threading.main_thread()


_recorded = threading.Event()


def _record_and_raise(signum: int, frame: object) -> None:
    _recorded.set()
    raise KeyboardInterrupt


@contextlib.contextmanager
def sticky_interrupts() -> Iterator[None]:
    """Inside the block, every SIGINT is recorded before ``KeyboardInterrupt`` is raised, so
    that :func:`raise_if_interrupted` can raise it again where other code swallowed it.

    Yields
    ------
    None
        The block runs with the recording handler (unchanged outside the main thread).

    Examples
    --------
    >>> with sticky_interrupts():
    ...     raise_if_interrupted()
    """
    _recorded.clear()
    if not _in_main_thread():
        yield
        return
    previous = signal.signal(signal.SIGINT, _record_and_raise)
    try:
        yield
    finally:
        signal.signal(signal.SIGINT, previous)
        _recorded.clear()


def raise_if_interrupted() -> None:
    """Raise ``KeyboardInterrupt`` when a Ctrl-C was recorded by :func:`sticky_interrupts`.

    Examples
    --------
    >>> raise_if_interrupted()  # nothing recorded: returns
    """
    if _recorded.is_set():
        raise KeyboardInterrupt


def solve_interruptibly(solver: Any, model: Any) -> Any:
    """``solver.solve(model)``, stopped at once by Ctrl-C, which then raises ``KeyboardInterrupt``.

    Parameters
    ----------
    solver
        An ``ortools.sat.python.cp_model.CpSolver`` with its parameters set.
    model
        The ``CpModel`` to solve.

    Returns
    -------
    int
        The solve status, as ``solver.solve`` returns it.

    Raises
    ------
    KeyboardInterrupt
        When SIGINT arrived during the solve (the search is stopped first).

    Examples
    --------
    >>> from ortools.sat.python import cp_model
    >>> model = cp_model.CpModel(); x = model.new_bool_var("x"); model.maximize(x)
    >>> solve_interruptibly(cp_model.CpSolver(), model) == cp_model.OPTIMAL
    True
    """
    raise_if_interrupted()
    with contextlib.suppress(AttributeError, ValueError):
        solver.parameters.catch_sigint_signal = False
    if not _in_main_thread() or signal.getsignal(signal.SIGINT) in (signal.SIG_IGN, None):
        return solver.solve(model)
    reader, writer = socket.socketpair()
    reader.setblocking(True)
    writer.setblocking(False)
    interrupted = threading.Event()
    finished = threading.Event()

    def watch() -> None:
        while not finished.is_set():
            try:
                data = reader.recv(64)
            except OSError:
                return
            if not data:
                return
            if signal.SIGINT in data:
                interrupted.set()
                solver.stop_search()

    try:
        previous_fd = signal.set_wakeup_fd(writer.fileno(), warn_on_full_buffer=False)
    except (ValueError, OSError):
        reader.close()
        writer.close()
        return solver.solve(model)
    watcher = threading.Thread(target=watch, name="sigint-watcher", daemon=True)
    watcher.start()
    try:
        pause_point("solve:started")
        status = solver.solve(model)
    finally:
        signal.set_wakeup_fd(previous_fd)
        finished.set()
        with contextlib.suppress(OSError):
            writer.send(b"\0")
        watcher.join(timeout=5)
        reader.close()
        writer.close()
    if interrupted.is_set():
        raise KeyboardInterrupt
    return status


@contextlib.contextmanager
def deferred_interrupts() -> Iterator[None]:
    """Hold SIGINT back inside the block; raise ``KeyboardInterrupt`` after it if one came.

    Outside the main thread (where signal handlers cannot be set) the block runs unchanged.

    Yields
    ------
    None
        The block runs with SIGINT held back.

    Raises
    ------
    KeyboardInterrupt
        After the block, when a SIGINT came during it; before it, when
        :func:`sticky_interrupts` had recorded one.

    Examples
    --------
    >>> with deferred_interrupts():
    ...     pass
    """
    if not _in_main_thread():
        yield
        return
    raise_if_interrupted()
    received: list[int] = []

    def hold(signum: int, frame: object) -> None:
        received.append(signum)

    try:
        previous = signal.signal(signal.SIGINT, hold)
    except ValueError:
        yield
        return
    try:
        yield
    finally:
        signal.signal(signal.SIGINT, previous)
    if received:
        raise KeyboardInterrupt
