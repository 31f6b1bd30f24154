"""Writing files so that a reader or a crash sees the old file or the new one, never a part.

One home for the mechanism (a temporary file in the same folder, ``fsync``, then a rename, then
``fsync`` of the folder) used by every room that writes: the season folder
(:mod:`scheduler.export.bundle`), single exported files, and the new files the tool makes for the
organizer to edit (:func:`scheduler.config.starter.write_new_text_file`), which must also never
replace an existing file.

References
----------
POSIX ``rename`` and ``link`` (atomic within one file system); ``docs/season-folder.md``.
"""

from __future__ import annotations

import contextlib
import os
import tempfile
from pathlib import Path

__all__ = ["atomic_write_bytes", "atomic_write_text", "fsync_folder"]


def atomic_write_bytes(
    path: str | os.PathLike[str], data: bytes, *, exclusive: bool = False
) -> Path:
    """Write ``data`` to ``path`` atomically (temp file in the same folder, fsync, os.replace).

    The folder must exist. On any failure the temporary file is removed and the old file, if
    any, is left untouched.

    Parameters
    ----------
    path : str or os.PathLike
        The file to write; its folder must exist.
    data : bytes
        The contents.
    exclusive : bool, optional
        Never replace an existing file: the new file is linked into place, which fails with
        ``FileExistsError`` when ``path`` exists (also when it appeared during the write).

    Returns
    -------
    pathlib.Path
        ``path``.

    Raises
    ------
    OSError
        When the file cannot be written (an old file is left untouched).

    References
    ----------
    POSIX ``rename`` (atomic replacement within one file system); ``docs/season-folder.md``.

    Examples
    --------
    >>> import tempfile
    >>> with tempfile.TemporaryDirectory() as folder:
    ...     target = atomic_write_bytes(Path(folder) / "a.bin", b"round 1")
    ...     print(target.read_bytes(), sorted(p.name for p in Path(folder).iterdir()))
    ...     try:
    ...         atomic_write_bytes(target, b"round 2", exclusive=True)
    ...     except FileExistsError:
    ...         print("kept:", target.read_bytes())
    b'round 1' ['a.bin']
    kept: b'round 1'
    """
    target = Path(path)
    folder = target.parent
    fd, tmp_name = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".tmp", dir=folder)
    try:
        with os.fdopen(fd, "wb") as handle:
            handle.write(data)
            handle.flush()
            os.fsync(handle.fileno())
        os.chmod(tmp_name, _file_mode(target))
        if exclusive:
            os.link(tmp_name, target)
            os.unlink(tmp_name)
        else:
            os.replace(tmp_name, target)
    except BaseException:
        with contextlib.suppress(OSError):
            os.unlink(tmp_name)
        raise
    fsync_folder(folder)
    return target


def atomic_write_text(path: str | os.PathLike[str], text: str, encoding: str = "utf-8") -> Path:
    """:func:`atomic_write_bytes` of ``text`` encoded (UTF-8 by default); newlines kept as given.

    Parameters
    ----------
    path : str or os.PathLike
        The file to write; its folder must exist.
    text : str
        The contents.
    encoding : str, optional
        The text encoding.

    Returns
    -------
    pathlib.Path
        ``path``.

    Raises
    ------
    OSError
        When the file cannot be written (an old file is left untouched).

    Examples
    --------
    >>> import tempfile
    >>> with tempfile.TemporaryDirectory() as folder:
    ...     target = Path(folder) / "note.txt"
    ...     _ = atomic_write_text(target, "old")
    ...     _ = atomic_write_text(target, "new")
    ...     print(target.read_text())
    new
    """
    return atomic_write_bytes(path, text.encode(encoding))


def _file_mode(target: Path) -> int:
    """The mode an ordinary new file would get (mkstemp makes 0600), or the old file's mode."""
    try:
        return target.stat().st_mode & 0o777
    except OSError:
        mask = os.umask(0)
        os.umask(mask)
        return 0o666 & ~mask


def fsync_folder(folder: str | os.PathLike[str]) -> None:
    """``fsync`` a folder, so that renames and new entries in it are durable (POSIX only).

    Folders cannot be opened this way on Windows; there, and where the file system refuses, this
    does nothing.

    Parameters
    ----------
    folder : str or os.PathLike
        The folder whose entries were just changed.
    """
    if os.name != "posix":
        return
    try:
        fd = os.open(folder, os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(fd)
    except OSError:
        pass
    finally:
        os.close(fd)
