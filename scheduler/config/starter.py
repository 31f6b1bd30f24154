"""The commented starter league file that ``scheduler new`` writes.

The text is the shipped template ``templates/league.toml``: a complete, valid league of invented
clubs with every option explained.
"""

from __future__ import annotations

import contextlib
import os
import tempfile
from pathlib import Path

from scheduler.config.resources import template_path
from scheduler.errors import OutputError

STARTER_TEMPLATE = "league.toml"


def starter_config_text() -> str:
    """The starter league file, as text."""
    return template_path(STARTER_TEMPLATE).read_text(encoding="utf-8")


def write_starter_config(path: str | Path) -> Path:
    """Write the starter league file to ``path``; never overwrites an existing file.

    The file is written to a temporary file in the same folder and then moved into place with
    :func:`os.replace`, so a reader never sees half a file.
    """
    target = Path(path)
    if target.exists():
        raise OutputError(f"{target}: the file already exists; choose another name or remove it")
    folder = target.parent if str(target.parent) else Path(".")
    if not folder.is_dir():
        raise OutputError(f"{target}: the folder {folder} does not exist")
    text = starter_config_text()
    try:
        fd, temp_name = tempfile.mkstemp(prefix=f".{target.name}.", suffix=".tmp", dir=folder)
    except OSError as exc:
        raise OutputError(f"{target}: cannot write in {folder} ({exc.strerror or exc})") from None
    try:
        with os.fdopen(fd, "w", encoding="utf-8", newline="\n") as handle:
            handle.write(text)
        if target.exists():
            raise OutputError(f"{target}: the file already exists; choose another name")
        os.replace(temp_name, target)
    except OSError as exc:
        raise OutputError(f"{target}: cannot write the file ({exc.strerror or exc})") from None
    finally:
        with contextlib.suppress(FileNotFoundError):
            os.unlink(temp_name)
    return target
