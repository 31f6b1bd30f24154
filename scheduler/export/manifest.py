"""The season folder's manifest: which files the planner wrote, with their SHA-256.

The manifest is the hidden file ``.season-manifest.json`` at the top of the season folder (our
own name and format). It lists every other file of the season by its path relative to the
folder (``/`` separated) with the SHA-256 of its bytes (FIPS 180-4, computed with
:mod:`hashlib`), together with the league, season and plan revision. The writer of the folder
(:mod:`scheduler.export.bundle`) uses it to tell its own files from the user's: a file that is
not listed, or whose bytes changed since, is the user's and is never overwritten without
``--force`` nor deleted.

Example of the format::

    {
      "format": "season-folder-manifest",
      "version": 1,
      "league": "Marlwick League",
      "season": "2027-28",
      "revision": "3f2a...",
      "files": {"calendars/league.ics": "9c1e...", "fixtures.csv": "02ab..."}
    }
"""

from __future__ import annotations

import hashlib
import json
from collections.abc import Mapping
from dataclasses import dataclass, field
from pathlib import Path

MANIFEST_FILE = ".season-manifest.json"
MANIFEST_FORMAT = "season-folder-manifest"
MANIFEST_VERSION = 1


def sha256_hex(data: bytes) -> str:
    """The SHA-256 of ``data`` as 64 lower-case hex digits.

    Parameters
    ----------
    data
        The bytes to digest.

    Returns
    -------
    str
        The digest in hexadecimal.

    References
    ----------
    FIPS 180-4 (SHA-256; the digest of ``b"abc"`` is its first example).

    Examples
    --------
    >>> sha256_hex(b"abc")[:16]
    'ba7816bf8f01cfea'
    """
    return hashlib.sha256(data).hexdigest()


@dataclass(frozen=True)
class Manifest:
    """What the planner wrote into a season folder.

    Parameters
    ----------
    league, season, revision
        The plan the files belong to (``Season.league``, ``Season.season_id``,
        ``Season.revision``).
    files
        Relative path (``/`` separated) -> SHA-256 hex digest of the file's bytes.

    References
    ----------
    ``docs/season-folder.md``.

    Examples
    --------
    >>> manifest = Manifest.of_files("Demo", "2031", "abc", {"fixtures.csv": b"round\\r\\n"})
    >>> Manifest.from_bytes(manifest.to_bytes()) == manifest
    True
    """

    league: str
    season: str
    revision: str
    files: Mapping[str, str] = field(default_factory=dict)

    @classmethod
    def of_files(
        cls, league: str, season: str, revision: str, contents: Mapping[str, bytes]
    ) -> Manifest:
        """The manifest of files given as relative path -> bytes.

        Parameters
        ----------
        league, season, revision
            The plan the files belong to.
        contents
            Relative path (``/`` separated) -> the file's bytes.

        Returns
        -------
        Manifest
            With the SHA-256 of each file.
        """
        digests = {name: sha256_hex(data) for name, data in contents.items()}
        return cls(league, season, revision, digests)

    def to_bytes(self) -> bytes:
        """The manifest as UTF-8 JSON (sorted keys, so the same plan gives the same bytes).

        Returns
        -------
        bytes
            The file's content, ending in a newline.
        """
        payload = {
            "format": MANIFEST_FORMAT,
            "version": MANIFEST_VERSION,
            "league": self.league,
            "season": self.season,
            "revision": self.revision,
            "files": dict(sorted(self.files.items())),
        }
        return (json.dumps(payload, ensure_ascii=False, indent=2, sort_keys=True) + "\n").encode(
            "utf-8"
        )

    @classmethod
    def from_bytes(cls, data: bytes) -> Manifest:
        """Read a manifest written by :meth:`to_bytes`.

        Parameters
        ----------
        data
            The file's bytes.

        Returns
        -------
        Manifest
            The manifest.

        Raises
        ------
        ValueError
            When ``data`` is not a manifest of this format and version (the caller treats
            the folder as holding no manifest).
        """
        try:
            payload = json.loads(data.decode("utf-8"))
        except (UnicodeDecodeError, json.JSONDecodeError) as exc:
            raise ValueError(f"not JSON ({exc})") from None
        if not isinstance(payload, dict) or payload.get("format") != MANIFEST_FORMAT:
            raise ValueError("not a season-folder manifest")
        if payload.get("version") != MANIFEST_VERSION:
            raise ValueError(f"unknown manifest version {payload.get('version')!r}")
        files = payload.get("files")
        if not isinstance(files, dict) or not all(
            isinstance(k, str) and isinstance(v, str) for k, v in files.items()
        ):
            raise ValueError("the file list is damaged")
        league, season, revision = (payload.get(k) for k in ("league", "season", "revision"))
        if not (isinstance(league, str) and isinstance(season, str) and isinstance(revision, str)):
            raise ValueError("league, season or revision missing")
        return cls(league, season, revision, dict(files))

    def matches(self, folder: Path, relative: str) -> bool:
        """True when ``folder/relative`` is listed and still holds the bytes that were written.

        Parameters
        ----------
        folder
            The season folder.
        relative
            A path below it, ``/`` separated.

        Returns
        -------
        bool
            ``False`` also for a symbolic link, a folder or a file that cannot be read.
        """
        digest = self.files.get(relative)
        if digest is None:
            return False
        path = folder / relative
        try:
            if path.is_symlink() or not path.is_file():
                return False
            return sha256_hex(path.read_bytes()) == digest
        except OSError:
            return False
