"""Safe output: inert spreadsheet cells, safe file and sheet names.

* :func:`neutralise_cell` makes user text inert in CSV and spreadsheet cells. A cell that starts
  with ``=``, ``+``, ``-``, ``@``, a tab or a carriage return may be run as a formula by a
  spreadsheet program ("CSV injection" / "formula injection"). The defence is common practice,
  described in the OWASP Foundation's "CSV Injection" page: prefix such a cell with a single
  quote so the program shows it as text. We also prefix a cell that already *looks* neutralised
  (a quote followed by such a cell), which makes the change reversible (:func:`restore_cell`).
* :func:`safe_filename` turns any team name into a file-name stem that is valid on Windows,
  macOS and Linux (ASCII letters, digits and ``-`` only; no reserved device names such as
  ``CON`` or ``NUL``, following Microsoft's "Naming Files, Paths, and Namespaces"), and that
  differs for different names, including names that differ only in letter case.
* :func:`safe_sheet_title` makes a valid, unique worksheet title (at most 31 characters, none of
  ``[ ] : * ? / \\``; the limits Excel enforces and openpyxl checks).

Atomic file writes live in :mod:`scheduler.files` (one mechanism for every room that writes).
"""

from __future__ import annotations

import hashlib
import re
import unicodedata
from collections.abc import Iterable

FORMULA_TRIGGERS = ("=", "+", "-", "@", "\t", "\r")
"""First characters that make a spreadsheet treat a cell as a formula (OWASP, common practice)."""

_QUOTE = "'"


def _needs_quote(text: str) -> bool:
    if text.startswith(FORMULA_TRIGGERS):
        return True
    return text.startswith(_QUOTE) and _needs_quote(text[1:])


def neutralise_cell(text: str | None) -> str | None:
    """Make one cell of user text inert: prefix ``'`` when it could start a formula.

    ``None`` stays ``None``. Text that cannot start a formula is returned unchanged.

    Parameters
    ----------
    text
        The cell's text.

    Returns
    -------
    str or None
        The inert text.

    References
    ----------
    OWASP, "CSV Injection" (common practice).

    Examples
    --------
    >>> neutralise_cell("=SUM(A1)"), neutralise_cell("Quenby")
    ("'=SUM(A1)", 'Quenby')
    """
    if text is None:
        return None
    return _QUOTE + text if _needs_quote(text) else text


def restore_cell(text: str | None) -> str | None:
    """Undo :func:`neutralise_cell` exactly (``restore_cell(neutralise_cell(t)) == t``).

    Parameters
    ----------
    text
        Text written by :func:`neutralise_cell`.

    Returns
    -------
    str or None
        The original text.

    Examples
    --------
    >>> restore_cell(neutralise_cell("=SUM(A1)"))
    '=SUM(A1)'
    """
    if text is None:
        return None
    if text.startswith(_QUOTE) and _needs_quote(text[1:]):
        return text[1:]
    return text


_RESERVED = frozenset(
    ["con", "prn", "aux", "nul", "clock$", "conin$", "conout$"]
    + [f"com{i}" for i in "0123456789¹²³"]
    + [f"lpt{i}" for i in "0123456789¹²³"]
)
"""Windows device names (case-insensitive, with or without an extension)."""

_HASHED = re.compile(r"-[0-9a-f]{8}$")
_MAX_SLUG = 40


def name_digest(name: str, length: int = 8) -> str:
    """The first ``length`` hex digits of the SHA-256 of ``name`` (UTF-8).

    Parameters
    ----------
    name
        Any text.
    length
        Number of hex digits kept (1 to 64).

    Returns
    -------
    str
        Lower-case hex digits.

    Examples
    --------
    >>> name_digest("abc", 6)
    'ba7816'
    """
    return hashlib.sha256(name.encode("utf-8")).hexdigest()[:length]


_digest = name_digest


def _slug(name: str) -> str:
    ascii_text = unicodedata.normalize("NFKD", name).encode("ascii", "ignore").decode("ascii")
    slug = re.sub(r"[^a-z0-9]+", "-", ascii_text.lower()).strip("-")
    return slug[:_MAX_SLUG].rstrip("-")


def safe_filename(name: str) -> str:
    """A cross-platform file-name stem for ``name`` (no extension, no path separator).

    The stem is a lower-case ASCII slug. When the slug is not exactly ``name`` (letters changed,
    characters dropped, or cut short), or it is a reserved device name, or it could be mistaken
    for a hashed stem, ``-`` and the first 8 hex digits of the name's SHA-256 are added. So two
    different names give two different stems (up to a 32-bit hash collision), also on
    case-insensitive file systems: a stem without hash is the name itself, a stem with hash
    ends in the hash pattern, and those two kinds never meet.

    Parameters
    ----------
    name
        A team's or club's name.

    Returns
    -------
    str
        The stem.

    Examples
    --------
    >>> safe_filename("quenby"), safe_filename("Quenby Hall")
    ('quenby', 'quenby-hall-ae3daf95')
    """
    slug = _slug(name)
    if slug and slug == name and slug not in _RESERVED and not _HASHED.search(slug):
        return slug
    return f"{slug or 'team'}-{_digest(name)}"


def safe_filenames(names: Iterable[str]) -> dict[str, str]:
    """:func:`safe_filename` of each name, checked to be unique (case-insensitive).

    Parameters
    ----------
    names
        The names (repeats give the same stem).

    Returns
    -------
    dict
        Name -> stem; where two names would share a stem, the later one gets a 16-digit hash.

    Examples
    --------
    >>> safe_filenames(["ash", "Elm"])
    {'ash': 'ash', 'Elm': 'elm-bff0aac9'}
    """
    result: dict[str, str] = {}
    seen: dict[str, str] = {}
    for name in names:
        stem = safe_filename(name)
        key = stem.lower()
        if key in seen and seen[key] != name:
            stem = f"{_slug(name) or 'team'}-{_digest(name, 16)}"
            key = stem.lower()
        seen[key] = name
        result[name] = stem
    return result


_SHEET_BAD = re.compile(r"[\[\]:*?/\\\x00-\x1f]")
_SHEET_MAX = 31


def safe_sheet_title(name: str, taken: set[str]) -> str:
    """A valid worksheet title for ``name`` that is not in ``taken`` (compared case-insensitively).

    The chosen title is added to ``taken`` (as lower case). Titles may not be empty, may not
    start or end with an apostrophe, and "History" is reserved by Excel.

    Parameters
    ----------
    name
        A team's name.
    taken
        Lower-case titles already used in the workbook; updated in place.

    Returns
    -------
    str
        At most 31 characters, none of ``[ ] : * ? / \\``; a short hash of the name is added
        when the cut title is taken.

    References
    ----------
    ECMA-376 Part 1, §18.2.20 (sheet names; from memory).

    Examples
    --------
    >>> taken = set()
    >>> safe_sheet_title("Ash: 1st XI", taken), safe_sheet_title("history", taken)
    ('Ash_ 1st XI', 'History team')
    """
    title = _SHEET_BAD.sub("_", name).strip().strip("'").strip() or "Team"
    if title.lower() == "history":
        title = "History team"
    title = title[:_SHEET_MAX].rstrip().rstrip("'")
    if title.lower() in taken:
        tail = f" ~{_digest(name, 6)}"
        title = title[: _SHEET_MAX - len(tail)].rstrip().rstrip("'") + tail
        counter = 2
        while title.lower() in taken:
            tail = f" ~{_digest(name, 6)}{counter}"
            title = title[: _SHEET_MAX - len(tail)].rstrip().rstrip("'") + tail
            counter += 1
    taken.add(title.lower())
    return title
