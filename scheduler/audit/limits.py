"""Size limits of untrusted files, checked before any heavy work (see ``docs/limits.md``).

Every check here is cheap (a ``stat``, the zip directory, one regular-expression pass over the
text) and raises :class:`~scheduler.errors.InputError` with the file as location, so the CLI
answers with exit code 2 and a message in well under a second, whatever the file holds.

* :func:`read_bytes_limited`: the whole file, refused above :data:`MAX_FILE_BYTES`;
* :func:`check_xlsx_members`: the uncompressed sizes an xlsx (a zip archive, ECMA-376 Part 2)
  declares in its central directory, refused above :data:`MAX_XLSX_UNCOMPRESSED_BYTES` in total
  or :data:`MAX_XLSX_RATIO` times the packed size ("zip bomb");
* :func:`check_csv_fields`: the longest field of a CSV text, refused above
  :data:`MAX_CSV_FIELD_CHARS`;
* :func:`check_nesting`: the bracket depth of JSON text (RFC 8259), refused above
  :data:`~scheduler.config.limits.MAX_NESTING_DEPTH` (the standard parser recurses per level,
  so deeper text would exhaust the interpreter's stack). The depth is measured by
  :func:`scheduler.config.limits.nesting_depth`, shared with the league files.
"""

from __future__ import annotations

import re
import zipfile
from pathlib import Path

from scheduler.config.limits import MAX_NESTING_DEPTH, nesting_depth
from scheduler.errors import InputError

__all__ = [
    "MAX_CSV_FIELD_CHARS",
    "MAX_FILE_BYTES",
    "MAX_NESTING_DEPTH",
    "MAX_XLSX_RATIO",
    "MAX_XLSX_UNCOMPRESSED_BYTES",
    "check_csv_fields",
    "check_nesting",
    "check_xlsx_members",
    "nesting_depth",
    "read_bytes_limited",
    "size_text",
]

MAX_FILE_BYTES = 100 * 1024 * 1024
"""Largest schedule file read (100 MB)."""

MAX_XLSX_UNCOMPRESSED_BYTES = 200 * 1024 * 1024
"""Largest total uncompressed size of the members of an xlsx workbook (200 MB)."""

MAX_XLSX_RATIO = 200
"""Largest ratio of uncompressed to packed size of an xlsx workbook above 1 MB unpacked."""

MAX_CSV_FIELD_CHARS = 10_000
"""Longest field of a CSV schedule (characters); a team name is at most a few dozen."""



def size_text(nbytes: int) -> str:
    """``nbytes`` for a message: ``"12.5 MB"`` from 1 MiB upwards, else ``"812 bytes"``.

    Parameters
    ----------
    nbytes
        A size in bytes (not negative).

    Returns
    -------
    str
        The size in MB (units of 1024 * 1024 bytes, one decimal) or in bytes.

    Examples
    --------
    >>> size_text(3 * 1024 * 1024)
    '3.0 MB'
    >>> size_text(80)
    '80 bytes'
    """
    if nbytes >= 1024 * 1024:
        return f"{nbytes / (1024 * 1024):.1f} MB"
    return f"{nbytes} bytes"


def read_bytes_limited(path: str | Path, limit: int | None = None) -> bytes:
    """The bytes of ``path``, refused before reading when missing, a folder, empty or too big.

    Parameters
    ----------
    path
        The file to read.
    limit
        Largest size in bytes; default :data:`MAX_FILE_BYTES`.

    Returns
    -------
    bytes
        The file's content.

    Raises
    ------
    InputError
        Missing file, a folder, an empty file, a file over ``limit``, or an unreadable file.
    """
    path = Path(path)
    limit = MAX_FILE_BYTES if limit is None else limit
    if not path.exists():
        raise InputError("file not found", location=str(path))
    if not path.is_file():
        raise InputError("not a file", location=str(path))
    size = path.stat().st_size
    if size > limit:
        raise InputError(
            f"the file is {size_text(size)}; schedule files over {size_text(limit)} are not read",
            location=str(path),
        )
    if size == 0:
        raise InputError("the file is empty", location=str(path))
    try:
        return path.read_bytes()
    except OSError as exc:
        raise InputError(f"cannot read the file: {exc.strerror}", location=str(path)) from exc


def check_xlsx_members(path: str | Path, limit: int | None = None) -> None:
    """Refuse a workbook whose members would inflate too much, reading only the zip directory.

    Parameters
    ----------
    path
        The xlsx file.
    limit
        Largest total uncompressed size; default :data:`MAX_XLSX_UNCOMPRESSED_BYTES`.

    Raises
    ------
    InputError
        Not a zip archive, a total declared size over ``limit``, or a packing ratio above
        :data:`MAX_XLSX_RATIO`, both as the archive's directory declares them (a directory that
        understates its members is beyond this check; zip readers then stop at the declared
        size or fail the member's CRC-32, from memory).

    References
    ----------
    .. [1] PKWARE, "APPNOTE.TXT - .ZIP File Format Specification", section 4.3.12 (central
       directory file header: compressed and uncompressed sizes). From memory.
    """
    limit = MAX_XLSX_UNCOMPRESSED_BYTES if limit is None else limit
    try:
        with zipfile.ZipFile(path) as archive:
            members = archive.infolist()
    except (zipfile.BadZipFile, OSError, ValueError) as exc:
        raise InputError(f"not a readable xlsx workbook ({exc})", location=str(path)) from exc
    total = sum(member.file_size for member in members)
    packed = sum(member.compress_size for member in members)
    if total > limit:
        raise InputError(
            f"the workbook unpacks to {size_text(total)}; workbooks over {size_text(limit)} "
            "unpacked are not read (save the schedule as CSV, or split it)",
            location=str(path),
        )
    if total > 1024 * 1024 and total > MAX_XLSX_RATIO * max(packed, 1):
        raise InputError(
            f"the workbook unpacks to {size_text(total)} from {size_text(packed)} "
            f"(more than {MAX_XLSX_RATIO} times): refused as a likely zip bomb",
            location=str(path),
        )


def check_csv_fields(text: str, location: str, limit: int | None = None) -> None:
    r"""Refuse CSV text holding a run of more than ``limit`` characters without a separator.

    The run between two of ``, ; TAB | CR LF "`` bounds every unquoted field from above, so the
    search is one regular expression at C speed, before the ``csv`` module tokenises anything;
    a longer quoted field with separators inside is then refused by the ``csv`` module's own
    field limit, set to the same value.

    Parameters
    ----------
    text
        The decoded CSV text.
    location
        The file, for the message.
    limit
        Longest field in characters; default :data:`MAX_CSV_FIELD_CHARS`.

    Raises
    ------
    InputError
        A run over the limit, with the line where it starts.

    Examples
    --------
    >>> check_csv_fields("round,home,away\n1,A,B\n", "f.csv", limit=5)
    >>> try:
    ...     check_csv_fields("round,home,away\n1,Abcdefgh,B\n", "f.csv", limit=5)
    ... except InputError as error:
    ...     print(error.detail)
    a field longer than 5 characters starts on line 2; is this a schedule?
    """
    limit = MAX_CSV_FIELD_CHARS if limit is None else limit
    if len(text) <= limit:
        return
    match = re.search(f'[^,;\t|\r\n"]{{{limit + 1}}}', text)
    if match is None:
        return
    line = text.count("\n", 0, match.start()) + 1
    raise InputError(
        f"a field longer than {limit} characters starts on line {line}; is this a schedule?",
        location=location,
    )


def check_nesting(text: str, location: str, *, comments: bool = False,
                  limit: int | None = None) -> None:
    """Refuse text nested deeper than ``limit`` (default :data:`MAX_NESTING_DEPTH`) levels.

    Parameters
    ----------
    text
        JSON text (or TOML/YAML text with ``comments``).
    location
        The file, for the message.
    comments
        Skip ``#`` comments when counting brackets (TOML, YAML).
    limit
        Deepest nesting read; default :data:`MAX_NESTING_DEPTH`.

    Raises
    ------
    InputError
        The depth over the limit.

    Examples
    --------
    >>> check_nesting("[[1]]", "f.json", limit=2)
    >>> try:
    ...     check_nesting("[[[1]]]", "f.json", limit=2)
    ... except InputError as error:
    ...     print(error.detail)
    the file nests lists or objects 3 levels deep; at most 2 are read
    """
    limit = MAX_NESTING_DEPTH if limit is None else limit
    depth = nesting_depth(text, comments=comments)
    if depth > limit:
        raise InputError(
            f"the file nests lists or objects {depth} levels deep; at most {limit} are read",
            location=location,
        )
