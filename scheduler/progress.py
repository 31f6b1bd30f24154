"""The one progress-callback convention of the library.

Long computations (searches, solves) accept ``progress(message, fraction)``: a short
human-readable stage message and the fraction done, between 0 and 1. The CLI turns it into a
progress display; library users may pass any callable or nothing.
"""

from __future__ import annotations

from collections.abc import Callable

Progress = Callable[[str, float], None]
