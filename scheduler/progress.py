"""The one progress-callback convention of the library, and two displays for non-terminals.

Long computations (searches, solves) accept ``progress(message, fraction)``: a short
human-readable stage message and the fraction done, between 0 and 1. The message starts with
its phase (``"factorize: searching ..."``, ``"timetable"``, ``"places"``, ``"dates"``) and may
say the best found so far. The CLI turns it into a progress display; library users may pass any
callable or nothing.

Displays (used by the CLI when its output is not a terminal, or on request):

* :class:`PlainProgress`: one plain line at each new phase and at most every ``interval``
  seconds within a phase (``[  12s] timetable: ... (45%)``); while a phase is silent for longer
  (a solver at work), a heartbeat line repeats the last message with the elapsed time, so a log
  never goes quiet for long.
* :class:`JsonProgress`: the same events as JSON Lines (one JSON object per line, RFC 8259
  text; the JSON Lines convention is common practice), with the keys ``elapsed`` (seconds,
  float), ``phase``, ``message``, ``fraction`` and ``event`` (``"progress"``, ``"heartbeat"`` or
  ``"done"``), for tools that follow a run.

Both write to a text stream (the CLI uses standard error, so standard output keeps the results)
and read only a monotonic clock; nothing they print reaches the season's files.
"""

from __future__ import annotations

import json
import threading
import time
from collections.abc import Callable
from typing import TextIO

Progress = Callable[[str, float], None]

DEFAULT_INTERVAL = 3.0
"""Seconds between two plain lines of one phase (and the heartbeat period)."""


def phase_of(message: str) -> str:
    """The phase a progress message belongs to: its text before the first colon.

    Parameters
    ----------
    message : str
        A progress message such as ``"factorize: searching Z_15"``.

    Returns
    -------
    str
        The text before the first colon, stripped; ``"working"`` when that is empty.

    Examples
    --------
    >>> phase_of("factorize: searching Z_15")
    'factorize'
    >>> phase_of("places")
    'places'
    """
    return message.split(":", 1)[0].strip() or "working"


class _Display:
    """Shared state of the two displays: rate limit, heartbeat thread, last message."""

    def __init__(
        self,
        stream: TextIO,
        *,
        interval: float = DEFAULT_INTERVAL,
        clock: Callable[[], float] = time.monotonic,
        heartbeat: bool = True,
    ) -> None:
        self.stream = stream
        self.interval = float(interval)
        self.clock = clock
        self.started = clock()
        self.last_line = float("-inf")
        self.phase: str | None = None
        self.message = ""
        self.fraction = 0.0
        self.lock = threading.Lock()
        self.stop_event = threading.Event()
        self.thread: threading.Thread | None = None
        if heartbeat:
            self.thread = threading.Thread(target=self._beat, name="progress", daemon=True)

    message_interval: float | None = None
    """Seconds between two lines of one phase when not ``interval`` (``None``: ``interval``)."""

    # The callback -------------------------------------------------------------------
    def __call__(self, message: str, fraction: float) -> None:
        fraction = max(0.0, min(1.0, float(fraction)))
        with self.lock:
            now = self.clock()
            phase = phase_of(message)
            new_phase = phase != self.phase
            self.phase, self.message, self.fraction = phase, message, fraction
            gap = self.interval if self.message_interval is None else self.message_interval
            if new_phase or now - self.last_line >= gap:
                self._emit("progress", now)

    # Context manager: the heartbeat runs only inside ``with`` -------------------------
    def __enter__(self):
        if self.thread is not None:
            self.thread.start()
        return self

    def __exit__(self, *exc) -> None:
        self.stop_event.set()
        if self.thread is not None and self.thread.is_alive():
            self.thread.join(timeout=2 * self.interval + 1)
        if exc[0] is None and self.phase is not None:
            with self.lock:
                self._emit("done", self.clock())

    def _beat(self) -> None:
        while not self.stop_event.wait(self.interval / 2):
            with self.lock:
                now = self.clock()
                if self.phase is not None and now - self.last_line >= self.interval:
                    self._emit("heartbeat", now)

    def _emit(self, event: str, now: float) -> None:
        self.last_line = now
        try:
            self.stream.write(self.format(event, now - self.started) + "\n")
            self.stream.flush()
        except (OSError, ValueError):  # a closed pipe: stop showing progress, keep working
            self.stop_event.set()

    def format(self, event: str, elapsed: float) -> str:  # pragma: no cover - abstract
        """One output line (without its newline) for an event of the current message.

        Parameters
        ----------
        event : str
            ``"progress"`` (a new message), ``"heartbeat"`` (the last message repeated while
            the phase is silent) or ``"done"`` (the end of a ``with`` block).
        elapsed : float
            Seconds since the display was made.

        Returns
        -------
        str
            The line, in the display's own format.
        """
        raise NotImplementedError


class PlainProgress(_Display):
    """Plain progress lines for logs and CI jobs (see the module docstring).

    Call it as the ``progress(message, fraction)`` callback; use it as a context manager so
    that the heartbeat runs and a final ``done`` line is written.

    Parameters
    ----------
    stream : TextIO
        Where the lines go (the CLI passes standard error).
    interval : float, optional
        Seconds between two lines of one phase, and the silence after which a heartbeat line
        is written (default :data:`DEFAULT_INTERVAL`).
    clock : callable, optional
        Returns the time in seconds; a monotonic clock by default (the elapsed times printed
        count from the creation of the display).
    heartbeat : bool, optional
        Start a background thread, inside ``with``, that repeats the last message while a
        phase is silent; False for no thread (tests, or callers that report often).

    Examples
    --------
    >>> import io
    >>> ticks = iter([0.0, 0.0, 1.0, 5.0])
    >>> out = io.StringIO()
    >>> show = PlainProgress(out, interval=3, clock=lambda: next(ticks), heartbeat=False)
    >>> show("factorize: searching", 0.1); show("factorize: best 20 of 21", 0.15)
    >>> show("factorize: best 21 of 21", 0.2)
    >>> print(out.getvalue(), end="")
    [   0s] factorize: searching (10%)
    [   5s] factorize: best 21 of 21 (20%)
    """

    def format(self, event: str, elapsed: float) -> str:
        stamp = f"[{elapsed:4.0f}s]"
        if event == "done":
            return f"{stamp} done"
        still = " (still working)" if event == "heartbeat" else ""
        return f"{stamp} {self.message} ({self.fraction:.0%}){still}"


class JsonProgress(_Display):
    """Progress as JSON Lines for tools (see the module docstring): every message, at most
    ten a second (tools filter what they need), and the heartbeat of the plain lines.

    Parameters
    ----------
    stream : TextIO
        Where the lines go (the CLI passes standard error).
    interval : float, optional
        Seconds between two lines of one phase, and the silence after which a heartbeat line
        is written (default :data:`DEFAULT_INTERVAL`).
    clock : callable, optional
        Returns the time in seconds; a monotonic clock by default (the elapsed times printed
        count from the creation of the display).
    heartbeat : bool, optional
        Start a background thread, inside ``with``, that repeats the last message while a
        phase is silent; False for no thread (tests, or callers that report often).

    Examples
    --------
    >>> import io
    >>> out = io.StringIO()
    >>> show = JsonProgress(out, clock=lambda: 2.0, heartbeat=False)
    >>> show("timetable: 56 breaks", 0.4)
    >>> json.loads(out.getvalue())["phase"]
    'timetable'
    """

    message_interval = 0.1
    """Seconds between two lines of one phase: tools get each stage's result (the best so
    far), the rate still bounded when a search reports very often."""

    def format(self, event: str, elapsed: float) -> str:
        data = {
            "event": event,
            "elapsed": round(elapsed, 3),
            "phase": self.phase,
            "message": self.message,
            "fraction": round(self.fraction, 4),
        }
        return json.dumps(data, ensure_ascii=False, separators=(",", ":"))
