"""Audit: the input side. Read any schedule file, check it, measure it.

* ``check``: :func:`audit_file`, :func:`audit_season`, :class:`AuditResult`
* ``readers``: :func:`read_schedule`, :func:`read_schedule_with_rows` (CSV, xlsx, season.json)
* ``headers``: the header vocabulary in several languages and columns named by hand
* ``values``: cell values (numbers, text, dates, times)
* ``season_file``: reading ``season.json`` back (the writer is ``scheduler.export.season_json``)
* ``limits``: size limits of untrusted files, checked before any heavy work

Nothing here writes files; ``scheduler.export`` writes.
"""

from scheduler.audit.check import AuditResult, audit_file, audit_season
from scheduler.audit.headers import parse_column_names
from scheduler.audit.readers import ScheduleFile, read_schedule, read_schedule_with_rows
from scheduler.audit.season_file import load_season_json, loads_season

__all__ = [
    "AuditResult",
    "ScheduleFile",
    "audit_file",
    "audit_season",
    "load_season_json",
    "loads_season",
    "parse_column_names",
    "read_schedule",
    "read_schedule_with_rows",
]
