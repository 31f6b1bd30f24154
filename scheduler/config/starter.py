"""The commented starter league file that ``scheduler new`` writes, in TOML or YAML.

The text is a shipped template: ``templates/league.toml`` or ``templates/league.yaml``, the same
complete, valid league of invented clubs with every option explained (a test checks that both
give the same league). The file name's ending chooses the format; any other ending is refused,
because ``scheduler plan`` reads only these.
"""

from __future__ import annotations

from pathlib import Path

from scheduler.config.resources import template_path
from scheduler.errors import InputError, OutputError
from scheduler.files import atomic_write_bytes

STARTER_TEMPLATE = "league.toml"
STARTER_TEMPLATES = {".toml": "league.toml", ".yaml": "league.yaml", ".yml": "league.yaml"}
"""File ending -> shipped template."""


def starter_config_text(kind: str = ".toml") -> str:
    """The starter league file, as text, for the ending ``kind`` (``.toml``, ``.yaml``, ``.yml``).

    Parameters
    ----------
    kind
        The file ending, with its dot; letter case does not matter.

    Returns
    -------
    str
        The commented starter file.

    Raises
    ------
    InputError
        For any other ending.

    Examples
    --------
    >>> starter_config_text(".yaml").startswith("# League file")
    True
    """
    name = STARTER_TEMPLATES.get(kind.lower())
    if name is None:
        raise InputError(
            f"a league file must end in .toml, .yaml or .yml, not {kind or 'nothing'!r}"
        )
    return template_path(name).read_text(encoding="utf-8")


def write_starter_config(path: str | Path) -> Path:
    """Write the starter league file to ``path``; never overwrites an existing file.

    The ending of ``path`` chooses the format (``.toml``, or ``.yaml``/``.yml``). The file is
    written to a temporary file in the same folder and then moved into place with
    :func:`os.replace`, so a reader never sees half a file.

    Parameters
    ----------
    path
        Where to write the file.

    Returns
    -------
    Path
        ``path``.

    Raises
    ------
    InputError
        For an ending other than ``.toml``, ``.yaml`` or ``.yml`` (nothing is written).
    OutputError
        When the file exists or cannot be written.

    Examples
    --------
    >>> import tempfile, pathlib
    >>> write_starter_config(pathlib.Path(tempfile.mkdtemp()) / "league.yaml").suffix
    '.yaml'
    """
    target = Path(path)
    try:
        text = starter_config_text(target.suffix)
    except InputError as exc:
        raise InputError(str(exc), location=str(target)) from None
    return write_new_text_file(target, text)


def write_new_text_file(path: str | Path, text: str) -> Path:
    """Write ``text`` (UTF-8, LF line ends) to a new file at ``path``, atomically; never
    overwrites an existing file. Used for every file the tool creates for the organizer to
    edit (the starter league, a league built from a team list).

    Parameters
    ----------
    path : str or pathlib.Path
        The new file; its folder must exist.
    text : str
        The contents.

    Returns
    -------
    pathlib.Path
        The path written.

    Raises
    ------
    OutputError
        When the file exists, its folder does not, or it cannot be written.
    """
    target = Path(path)
    folder = target.parent if str(target.parent) else Path(".")
    if not folder.is_dir():
        raise OutputError(f"{target}: the folder {folder} does not exist")
    try:
        return atomic_write_bytes(target, text.encode("utf-8"), exclusive=True)
    except FileExistsError:
        raise OutputError(
            f"{target}: the file already exists; choose another name or remove it") from None
    except OSError as exc:
        raise OutputError(f"{target}: cannot write the file ({exc.strerror or exc})") from None
