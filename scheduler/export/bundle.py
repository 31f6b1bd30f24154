"""Write a season's output folder as a whole: the old season or the new one, never a mix.

Layout of ``out_dir``::

    season.json              the season and its fairness figures (scheduler.export.season_json)
    fixtures.csv             RFC 4180 fixture list
    fixtures.xlsx            workbook: Fixtures, Grid, Fairness, one sheet per team
    report.html              the self-contained season report
    options.json             every option the planner weighed, complete (when more than one;
                             scheduler.export.season_json.dumps_options, docs/options.md)
    calendars/league.ics     every game (RFC 5545)
    calendars/<team>.ics     one feed per team (file stem from safety.safe_filename)
    calendars/.sequence.json per-UID SEQUENCE/DTSTAMP state, so a re-plan never lowers SEQUENCE
    .season-manifest.json    every file above with its SHA-256 (scheduler.export.manifest)

How the folder is replaced (``docs/season-folder.md`` states the guarantees):

1. Every file's bytes are computed first; nothing is written while anything can still fail.
2. The new season is written into a sibling temporary folder ``.<name>.season-tmp-<token>``
   (same parent, so a rename can move it), each file and folder flushed with ``fsync``. Files of
   the user that are kept (see below) are hard-linked into it (copied where links fail).
3. The temporary folder and the season folder are swapped in one step (Linux
   ``renameat2(RENAME_EXCHANGE)``); where that is not available, with two renames, the old folder
   first moved to ``.<name>.season-old-<token>``. Then the old season is removed.
4. A temporary folder left by a killed run is removed by the next run for the same folder; an
   old folder left between the two renames is first moved back into place.

Which files are ours: the manifest lists them with their SHA-256. A folder holding any other
file (or one of ours changed since) is refused unless ``force``; with ``force`` the files of the
previous plan that the new plan does not write (for example the feed of a team that left the
league) are removed, and every other file is kept. The user's league file is never overwritten:
an output folder that holds it is refused, also with ``force``. A previous ``season.json`` and
state file drive the calendar updates (SEQUENCE, cancelled games; see
:mod:`scheduler.export.ics`).
"""

from __future__ import annotations

import contextlib
import ctypes
import errno
import os
import re
import secrets
import shutil
import stat
import sys
from collections.abc import Sequence
from dataclasses import dataclass
from pathlib import Path

from scheduler.errors import InputError, OutputError
from scheduler.export.changes import GameChange, changes_csv
from scheduler.export.csv_out import fixtures_csv
from scheduler.export.ics import (
    DEFAULT_GAME_MINUTES,
    CalendarState,
    league_calendar,
    plan_calendar,
    team_calendar,
    team_feed_names,
)
from scheduler.export.manifest import MANIFEST_FILE, Manifest
from scheduler.export.season_json import OPTIONS_FILE, keeps_options
from scheduler.export.site import site_files, site_paths
from scheduler.export.xlsx import workbook_bytes
from scheduler.fairness.model import FairnessReport
from scheduler.files import fsync_folder
from scheduler.interrupt import deferred_interrupts, pause_point, raise_if_interrupted
from scheduler.season import Season

SEASON_FILE = "season.json"
CSV_FILE = "fixtures.csv"
CHANGES_FILE = "changes.csv"
XLSX_FILE = "fixtures.xlsx"
REPORT_FILE = "report.html"
CALENDAR_FOLDER = "calendars"
LEAGUE_FEED = "league.ics"
STATE_FILE = ".sequence.json"


def output_paths(season: Season, out_dir: str | os.PathLike[str]) -> list[Path]:
    """Every path :func:`write_season_outputs` writes, in writing order.

    Parameters
    ----------
    season
        The season (its teams name the team calendars and pages).
    out_dir
        The season folder.

    Returns
    -------
    list of pathlib.Path
        The files below ``out_dir``: CSV, workbook, calendars, report, site, season file and
        manifest last.

    References
    ----------
    ``docs/season-folder.md``.

    Examples
    --------
    >>> from scheduler.season import Fixture, Season
    >>> season = Season("Demo", "2031", ("Ash", "Elm"), (Fixture(1, "Ash", "Elm"),))
    >>> paths = output_paths(season, "out")
    >>> paths[0].as_posix(), paths[-1].name == MANIFEST_FILE
    ('out/fixtures.csv', True)
    """
    out = Path(out_dir)
    cal = out / CALENDAR_FOLDER
    return [
        out / CSV_FILE,
        out / XLSX_FILE,
        cal / STATE_FILE,
        cal / LEAGUE_FEED,
        *(cal / name for name in team_feed_names(season).values()),
        out / REPORT_FILE,
        *(out / rel for rel in site_paths(season, team_feed_names(season))),
        *([out / OPTIONS_FILE] if keeps_options(season) else []),
        out / SEASON_FILE,
        out / MANIFEST_FILE,
    ]


def _same_file(a: Path, b: Path) -> bool:
    try:
        return a.resolve() == b.resolve() or (a.exists() and b.exists() and a.samefile(b))
    except OSError:
        return False


def _check_config(out: Path, paths: list[Path], config_path) -> None:
    if config_path is None:
        return
    config = Path(config_path)
    out_resolved = out.resolve()
    config_resolved = config.resolve()
    if config_resolved == out_resolved or out_resolved in config_resolved.parents:
        raise OutputError(
            f"the output folder {out} holds your league file {config}; choose an output folder "
            "that does not contain it, so the league file can never be overwritten"
        )
    for path in paths:
        if _same_file(path, config):
            raise OutputError(f"output file {path} would overwrite your league file {config}")



_CLUTTER = frozenset({".DS_Store", "Thumbs.db", "desktop.ini", ".directory"})
"""Files that file browsers put into any folder they show: kept, but no reason to refuse."""

_TEMP_KINDS = ("tmp", "old")


def _temp_pattern(target: Path) -> re.Pattern[str]:
    return re.compile(rf"^\.{re.escape(target.name)}\.season-({'|'.join(_TEMP_KINDS)})-[0-9a-f]+$")


def _temp_sibling(target: Path, kind: str) -> Path:
    return target.parent / f".{target.name}.season-{kind}-{os.getpid():x}{secrets.token_hex(4)}"


@dataclass(frozen=True)
class FolderCheck:
    """What :func:`check_output_folder` found in an existing output folder.

    Parameters
    ----------
    exists
        Whether the folder exists.
    manifest
        The previous plan's manifest, or ``None`` (no folder, no manifest, or a damaged one).
    foreign
        Relative paths of files the planner did not write (or that changed since it did).
    """

    exists: bool
    manifest: Manifest | None
    foreign: tuple[str, ...]


def _entries(folder: Path, prefix: str = "") -> list[tuple[str, os.stat_result]]:
    """Every entry below ``folder`` (relative posix path, lstat), folders before their contents;
    symbolic links are listed, never followed."""
    found: list[tuple[str, os.stat_result]] = []
    with os.scandir(folder) as it:
        items = sorted(it, key=lambda e: e.name)
    for item in items:
        relative = f"{prefix}{item.name}"
        info = item.stat(follow_symlinks=False)
        found.append((relative, info))
        if stat.S_ISDIR(info.st_mode):
            found.extend(_entries(Path(item.path), relative + "/"))
    return found


def _read_manifest(folder: Path) -> Manifest | None:
    path = folder / MANIFEST_FILE
    try:
        if path.is_symlink() or not path.is_file():
            return None
        return Manifest.from_bytes(path.read_bytes())
    except (OSError, ValueError):
        return None


def _resolve_target(out: Path) -> Path:
    """The folder to replace: a symbolic link to a folder is followed (the link stays)."""
    if out.is_symlink():
        return Path(os.path.realpath(out))
    return Path(os.path.abspath(out))


def check_output_folder(
    out_dir: str | os.PathLike[str],
    *,
    force: bool = False,
    config_path: str | os.PathLike[str] | None = None,
    new_files: tuple[str, ...] = (),
    league: tuple[str, str] | None = None,
) -> FolderCheck:
    """Check that ``out_dir`` may receive a season, before anything is computed or written.

    Parameters
    ----------
    out_dir
        The output folder (need not exist).
    force
        Accept a folder holding files the planner did not write (they are kept).
    config_path
        The user's league file: a folder holding it is always refused.
    new_files
        Relative paths the new plan writes, to refuse a user's folder standing where a file
        goes (also with ``force``).
    league
        ``(league name, season)`` of the new plan: a folder whose manifest names another one is
        refused without ``force``.

    Returns
    -------
    FolderCheck

    Raises
    ------
    OutputError
        When the folder may not be written: it is a file, holds the league file, or holds
        files of the user and ``force`` is not given.

    Examples
    --------
    >>> import tempfile, pathlib
    >>> check_output_folder(pathlib.Path(tempfile.mkdtemp()) / "season").exists
    False
    """
    out = Path(out_dir)
    if out.exists() and not out.is_dir():
        raise OutputError(f"{out} exists and is not a folder")
    if config_path is not None:
        _check_config(out, [out / name for name in new_files], config_path)
    if not out.exists():
        return FolderCheck(False, None, ())
    target = _resolve_target(out)
    try:
        entries = _entries(target)
    except OSError as exc:
        raise OutputError(f"cannot read the output folder {out}: {exc.strerror or exc}") from None
    kinds = {relative: info.st_mode for relative, info in entries}
    for name in new_files:
        parts = name.split("/")
        for depth in range(1, len(parts)):
            above = "/".join(parts[:depth])
            if above in kinds and not stat.S_ISDIR(kinds[above]):
                raise OutputError(
                    f"{out / above} is a file where the season needs a folder; move it away"
                )
        if name in kinds and stat.S_ISDIR(kinds[name]):
            raise OutputError(
                f"{out / name} is a folder where the season writes a file; move it away"
            )
    manifest = _read_manifest(target)
    foreign = []
    for relative, info in entries:
        if stat.S_ISDIR(info.st_mode) or relative == MANIFEST_FILE:
            continue
        if relative.rsplit("/", 1)[-1] in _CLUTTER:
            continue
        if manifest is None or not manifest.matches(target, relative):
            foreign.append(relative)
    if foreign and not force:
        more = f" and {len(foreign) - 5} more" if len(foreign) > 5 else ""
        shown = ", ".join(foreign[:5]) + more
        what = (
            "files this planner did not write, or changed since it wrote them"
            if manifest is not None
            else "files, but no season manifest (.season-manifest.json) of this planner"
        )
        raise OutputError(
            f"the output folder {out} holds {what}: {shown}. It is refused so that no file of "
            "yours is overwritten. Choose a new or empty folder, or pass --force to plan into it "
            "anyway (files of the previous plan are then replaced; other files are kept)"
        )
    if (
        league is not None
        and manifest is not None
        and not force
        and (manifest.league, manifest.season) != tuple(league)
    ):
        raise OutputError(
            f"{out} already holds the outputs of another league: {manifest.league!r} season "
            f"{manifest.season!r} (this plan is {league[0]!r} season {league[1]!r}); choose "
            "another output folder, or pass --force to replace them"
        )
    return FolderCheck(True, manifest, tuple(foreign))


def _previous(out: Path, season: Season, force: bool) -> tuple[Season | None, CalendarState | None]:
    """The previous season and calendar state in ``out`` (``None`` when absent or forced away)."""
    previous = None
    season_file = out / SEASON_FILE
    if season_file.is_file():
        from scheduler.export.season_json import load_season_json

        try:
            previous = load_season_json(season_file)
        except InputError as exc:
            if not force:
                raise OutputError(
                    f"{season_file} exists but is not a season file this program can read "
                    f"({exc}); choose another output folder, or pass --force to replace it"
                ) from exc
            previous = None
        if previous is not None and (previous.league, previous.season_id) != (
            season.league,
            season.season_id,
        ):
            if not force:
                raise OutputError(
                    f"{out} already holds the outputs of another league: "
                    f"{previous.league!r} season {previous.season_id!r} (this plan is "
                    f"{season.league!r} season {season.season_id!r}); choose another output "
                    "folder, or pass --force to replace them"
                )
            previous = None
    state = None
    state_file = out / CALENDAR_FOLDER / STATE_FILE
    if state_file.is_file():
        try:
            state = CalendarState.from_json(
                state_file.read_text(encoding="utf-8"), location=str(state_file)
            )
        except (InputError, OSError, UnicodeDecodeError) as exc:
            if not force:
                raise OutputError(
                    f"{state_file} is damaged ({exc}); without it calendar updates could lose "
                    "their sequence numbers. Restore it, or pass --force to start the numbering "
                    "anew"
                ) from exc
            state = None
        if state is not None and (state.league, state.season_id) != (
            season.league,
            season.season_id,
        ):
            if not force:
                raise OutputError(
                    f"{state_file} belongs to another league: {state.league!r} season "
                    f"{state.season_id!r}; choose another output folder, or pass --force"
                )
            state = None
    return previous, state


def render_season_files(
    season: Season,
    fairness: FairnessReport | None,
    previous: Season | None = None,
    state: CalendarState | None = None,
    *,
    game_minutes: int = DEFAULT_GAME_MINUTES,
    side_labels: tuple[str, str] = ("H", "A"),
    changes: Sequence[GameChange] | None = None,
) -> dict[str, bytes]:
    """Every file of the season folder as relative path -> bytes, the manifest last.

    ``changes`` (a re-plan's changed games, :mod:`scheduler.export.changes`) adds
    ``changes.csv`` and the report's section on them; ``None`` for a first plan.

    All computation of the outputs happens here, so that anything that can fail fails before
    a single byte is written.

    Parameters
    ----------
    season
        The season to write.
    fairness
        Its fairness figures (the report and ``season.json`` carry them; ``None`` leaves out
        the report).
    previous, state
        The season the folder held before and its calendar state, so that calendar events keep
        their identity and sequence numbers (RFC 5545).
    game_minutes
        Length of each calendar event.
    side_labels
        Labels of the two sides in the workbook's grid.
    changes
        The changed games of a re-plan.

    Returns
    -------
    dict of str to bytes
        Relative path -> contents, in writing order, the manifest last.

    References
    ----------
    ``docs/outputs.md``; ``docs/season-folder.md``; RFC 5545 (iCalendar).
    """
    from scheduler.export.season_json import dumps_options, dumps_season

    plan = plan_calendar(season, previous, state, game_minutes=game_minutes)
    calendars = CALENDAR_FOLDER + "/"
    files: dict[str, bytes] = {
        CSV_FILE: fixtures_csv(season).encode("utf-8"),
        XLSX_FILE: workbook_bytes(season, fairness, side_labels=side_labels),
        calendars + STATE_FILE: plan.to_json().encode("utf-8"),
        calendars + LEAGUE_FEED: league_calendar(season, state=plan),
    }
    for team, name in team_feed_names(season).items():
        files[calendars + name] = team_calendar(season, team, state=plan)
    if fairness is not None:
        from scheduler.export.report import render_report

        files[REPORT_FILE] = render_report(season, fairness, changes=changes).encode("utf-8")
    if changes is not None:
        files[CHANGES_FILE] = changes_csv(changes).encode("utf-8")
    files.update(site_files(season, fairness, feed_names=team_feed_names(season)))
    if keeps_options(season):
        files[OPTIONS_FILE] = dumps_options(season).encode("utf-8")
    files[SEASON_FILE] = dumps_season(season, fairness).encode("utf-8")
    manifest = Manifest.of_files(season.league, season.season_id, season.revision, files)
    files[MANIFEST_FILE] = manifest.to_bytes()
    return files


# --- locking, swapping and cleaning temporary folders ------------------------------------------


def _lock(folder: Path) -> int | None:
    """Open ``folder`` and hold an exclusive lock on it (POSIX); ``None`` where not possible."""
    try:
        import fcntl
    except ImportError:
        return None
    try:
        fd = os.open(folder, os.O_RDONLY)
    except OSError:
        return None
    try:
        fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
    except OSError:
        os.close(fd)
        return None
    return fd


def _recover_leftovers(target: Path) -> None:
    """Remove temporary folders of killed runs for ``target``; put back an old season left
    between the two renames of a swap. Folders locked by a running plan are left alone."""
    pattern = _temp_pattern(target)
    try:
        names = sorted(os.listdir(target.parent))
    except OSError:
        return
    for name in names:
        found = pattern.match(name)
        if not found:
            continue
        leftover = target.parent / name
        if leftover.is_symlink() or not leftover.is_dir():
            continue
        fd = _lock(leftover)
        if fd is None and "fcntl" in sys.modules:
            continue  # a plan that is running right now
        try:
            if found.group(1) == "old" and not os.path.lexists(target):
                os.rename(leftover, target)
                fsync_folder(target.parent)
                continue
            with contextlib.suppress(OSError):
                _remove_tree(leftover)
        finally:
            if fd is not None:
                os.close(fd)


def _remove_tree(folder: Path) -> None:
    """Remove a temporary folder, also where the user made a sub-folder read-only."""

    def unlock_and_retry(function, path, _exc_info) -> None:
        with contextlib.suppress(OSError):
            os.chmod(os.path.dirname(path), stat.S_IRWXU)
            if os.path.isdir(path) and not os.path.islink(path):
                os.chmod(path, stat.S_IRWXU)
            function(path)

    shutil.rmtree(folder, onerror=unlock_and_retry)


def _exchange(first: Path, second: Path) -> bool:
    """Swap two folders in one step (Linux ``renameat2`` with ``RENAME_EXCHANGE``).

    Returns False where the system or file system cannot do it; raises ``OSError`` otherwise.
    """
    if not sys.platform.startswith("linux"):
        return False
    try:
        libc = ctypes.CDLL(None, use_errno=True)
        renameat2 = libc.renameat2
    except (OSError, AttributeError):
        return False
    renameat2.argtypes = [ctypes.c_int, ctypes.c_char_p, ctypes.c_int, ctypes.c_char_p,
                          ctypes.c_uint]
    renameat2.restype = ctypes.c_int
    at_fdcwd, rename_exchange = -100, 2
    if renameat2(at_fdcwd, os.fsencode(first), at_fdcwd, os.fsencode(second), rename_exchange) == 0:
        return True
    code = ctypes.get_errno()
    if code in (errno.ENOSYS, errno.EINVAL, errno.EOPNOTSUPP, errno.ENOTSUP):
        return False
    raise OSError(code, os.strerror(code), str(second))


def _swap_in(new: Path, target: Path) -> Path | None:
    """Put ``new`` in the place of ``target``; returns where the old season now is (or None)."""
    if not os.path.lexists(target):
        os.rename(new, target)
        return None
    if _exchange(new, target):
        return new
    old = _temp_sibling(target, "old")
    os.rename(target, old)
    pause_point("folder:between-renames")
    try:
        os.rename(new, target)
    except BaseException:
        os.rename(old, target)
        raise
    return old


def _write_file(path: Path, data: bytes) -> None:
    with open(path, "xb") as handle:
        handle.write(data)
        handle.flush()
        os.fsync(handle.fileno())


def _carry(source: Path, destination: Path, relative: str, info: os.stat_result) -> None:
    """Keep one entry of the user in the new folder: a hard link (a copy where links fail)."""
    src, dst = source / relative, destination / relative
    if stat.S_ISDIR(info.st_mode):
        dst.mkdir(exist_ok=True)  # its mode is set once its contents are in
    elif stat.S_ISLNK(info.st_mode):
        os.symlink(os.readlink(src), dst)
    elif stat.S_ISREG(info.st_mode):
        try:
            os.link(src, dst, follow_symlinks=False)
        except OSError:
            shutil.copy2(src, dst, follow_symlinks=False)
    else:
        raise OutputError(f"{src} is not a plain file or folder; it cannot be kept, move it away")


def _rescue_late_files(old: Path, target: Path, ours: set[str]) -> None:
    """Move into the new season folder any file of the user that appeared in the old one after
    the user's files were linked across (a file saved there while the plan was being written)."""
    try:
        entries = _entries(old)
    except OSError:
        return
    for relative, info in entries:
        if relative in ours or stat.S_ISDIR(info.st_mode) or os.path.lexists(target / relative):
            continue
        with contextlib.suppress(OSError):
            (target / relative).parent.mkdir(parents=True, exist_ok=True)
            os.rename(old / relative, target / relative)


def write_season_outputs(
    season: Season,
    fairness: FairnessReport | None,
    out_dir: str | os.PathLike[str],
    *,
    force: bool = False,
    config_path: str | os.PathLike[str] | None = None,
    game_minutes: int = DEFAULT_GAME_MINUTES,
    side_labels: tuple[str, str] = ("H", "A"),
    changes: Sequence[GameChange] | None = None,
) -> list[Path]:
    """Write every output of ``season`` into ``out_dir``, replacing its previous season as a whole.

    Parameters
    ----------
    season
        The season to write.
    fairness
        Its :class:`~scheduler.fairness.FairnessReport` (written into ``season.json``, the
        workbook and the report; with ``None`` the report and the workbook's Fairness sheet are
        left out).
    out_dir
        The season folder (created if needed, with its parents).
    force
        Plan into a folder that holds files the planner did not write (they are kept), or
        another league's season (replaced).
    config_path
        The user's league file, which is never overwritten.
    game_minutes
        Length of each calendar event.
    side_labels
        Labels of the two sides in the workbook's grid.
    changes
        The changed games of a re-plan: ``changes.csv`` and a section of the report, written
        with the rest of the folder as one unit (``None`` for a first plan).

    Returns
    -------
    list of Path
        The paths written, in the order of :func:`output_paths`.

    Raises
    ------
    OutputError
        For a folder that may not be written (see :func:`check_output_folder`) or a write that
        failed; the previous season is then left as it was.
    KeyboardInterrupt
        When interrupted before the swap (the previous season is left as it was); an interrupt
        during the swap is held back until the swap is done.

    References
    ----------
    ``docs/season-folder.md`` (what the folder guarantees); ``docs/outputs.md`` (each file);
    RFC 5545 (iCalendar); RFC 4180 (CSV).

    Examples
    --------
    >>> import tempfile
    >>> from pathlib import Path
    >>> from scheduler.config import parse_league
    >>> from scheduler.fairness import compute_fairness
    >>> from scheduler.plan import plan_season
    >>> clubs = ["Quenby", "Larkholt", "Ebbside", "Morrow"]
    >>> league = parse_league({
    ...     "league": {"name": "Quenby Four", "season": "2031", "timezone": "Europe/London"},
    ...     "calendar": {"start": "2031-01-07", "end": "2031-04-29", "weekdays": ["tue"]},
    ...     "venues": [{"name": f"{club} Hall"} for club in clubs],
    ...     "teams": [{"name": club, "home_venue": f"{club} Hall"} for club in clubs]})
    >>> season = plan_season(league).season
    >>> with tempfile.TemporaryDirectory() as folder:
    ...     written = write_season_outputs(season, compute_fairness(season), Path(folder) / "out")
    ...     names = [path.name for path in written]
    >>> names[:2], names[-2:]
    (['fixtures.csv', 'fixtures.xlsx'], ['season.json', '.season-manifest.json'])
    """
    out = Path(out_dir)
    paths = output_paths(season, out)
    if changes is not None:
        paths.insert(paths.index(out / SEASON_FILE), out / CHANGES_FILE)
    relatives = tuple(p.relative_to(out).as_posix() for p in paths)
    if out.exists() and not out.is_dir():
        raise OutputError(f"{out} exists and is not a folder")
    target = _resolve_target(out)
    _recover_leftovers(target)
    check = check_output_folder(out, force=force, config_path=config_path, new_files=relatives)
    previous, state = _previous(out, season, force) if check.exists else (None, None)
    files = render_season_files(
        season, fairness, previous, state, game_minutes=game_minutes, side_labels=side_labels,
        changes=changes,
    )
    raise_if_interrupted()
    pause_point("folder:computed")
    try:
        target.parent.mkdir(parents=True, exist_ok=True)
    except OSError as exc:
        raise OutputError(
            f"cannot create the folder {target.parent}: {exc.strerror or exc}"
        ) from None
    new = _temp_sibling(target, "tmp")
    try:
        new.mkdir()
    except OSError as exc:
        raise OutputError(
            f"cannot create a temporary folder beside {out} ({exc.strerror or exc}); the folder "
            f"that holds it must be writable, so that the season can be replaced as a whole"
        ) from None
    lock = _lock(new)
    try:
        try:
            pause_point("folder:temp-created")
            (new / CALENDAR_FOLDER).mkdir()
            made_folders = {new / CALENDAR_FOLDER}
            for relative, data in files.items():
                parent = (new / relative).parent
                if parent not in made_folders:
                    parent.mkdir(parents=True, exist_ok=True)
                    made_folders.add(parent)
                _write_file(new / relative, data)
                pause_point(f"folder:wrote {relative}")
            if check.exists:
                folders = []
                for relative, info in _entries(target):
                    if relative in files or (check.manifest and relative in check.manifest.files):
                        continue
                    if relative in (CALENDAR_FOLDER, MANIFEST_FILE):
                        continue
                    _carry(target, new, relative, info)
                    if stat.S_ISDIR(info.st_mode):
                        folders.append((relative, stat.S_IMODE(info.st_mode)))
                for relative, mode in reversed(folders):
                    fsync_folder(new / relative)
                    os.chmod(new / relative, mode)
                pause_point("folder:kept-user-files")
                with contextlib.suppress(OSError):
                    os.chmod(new, stat.S_IMODE(target.stat().st_mode))
            for folder in sorted(made_folders, key=lambda f: len(f.parts), reverse=True):
                fsync_folder(folder)
            fsync_folder(new)
            pause_point("folder:before-swap")
            swapped = False
            try:
                with deferred_interrupts():
                    old = _swap_in(new, target)
                    swapped = True
                    fsync_folder(target.parent)
                    pause_point("folder:swapped")
                    if old is not None:
                        ours = set(files) | set(check.manifest.files if check.manifest else ())
                        _rescue_late_files(old, target, ours)
                        with contextlib.suppress(OSError):
                            _remove_tree(old)
            except KeyboardInterrupt:
                if not swapped:
                    raise
                raise KeyboardInterrupt(
                    f"interrupted; the new season had already been written to {out}"
                ) from None
        except OSError as exc:
            raise OutputError(f"cannot write the season into {out}: {exc}") from exc
        finally:
            if os.path.lexists(new):
                with contextlib.suppress(OSError):
                    _remove_tree(new)
    finally:
        if lock is not None:
            os.close(lock)
    return paths
