"""Find the files shipped with the package: the starter template, the sample leagues.

In an installed wheel they live inside the package (``scheduler/_templates`` and
``scheduler/_samples``; ``pyproject.toml`` force-includes the repository's ``templates/`` and
``sample_leagues/`` there). In a source checkout (or an editable install) they are read from the
repository's ``templates/`` and ``sample_leagues/`` folders next to the package.
"""

from __future__ import annotations

from importlib import resources
from pathlib import Path

from scheduler.config.schema import suggestion
from scheduler.errors import InputError

_PACKAGE_ROOT = Path(__file__).resolve().parent.parent  # .../scheduler
_REPO_ROOT = _PACKAGE_ROOT.parent


def _folder(installed: str, checkout: str) -> Path:
    """The folder of shipped files: inside the installed package, else in the checkout."""
    try:
        candidate = resources.files("scheduler").joinpath(installed)
        if candidate.is_dir():
            return Path(str(candidate))
    except (ModuleNotFoundError, NotADirectoryError, OSError):  # pragma: no cover
        pass
    return _REPO_ROOT / checkout


def templates_dir() -> Path:
    """Folder of the shipped templates (starter config, report template).

    Returns
    -------
    pathlib.Path
        The folder inside the installed package, or the repository's ``templates`` folder when
        running from a checkout.
    """
    return _folder("_templates", "templates")


def samples_dir() -> Path:
    """Folder of the shipped sample leagues.

    Returns
    -------
    pathlib.Path
        The folder inside the installed package, or the repository's ``sample_leagues`` folder
        when running from a checkout.
    """
    return _folder("_samples", "sample_leagues")


def _shipped(folder: Path, name: str, what: str) -> Path:
    path = folder / name
    if path.is_file():
        return path
    names = sorted(p.name for p in folder.iterdir() if p.is_file()) if folder.is_dir() else []
    hint = suggestion(name, names)
    known = f" (shipped: {', '.join(names)})" if names and not hint else ""
    raise InputError(f"no {what} named {name!r}{hint}{known}", location=str(folder))


def template_path(name: str) -> Path:
    """Path of a shipped template file, e.g. ``template_path("league.toml")``.

    Parameters
    ----------
    name
        File name of the template.

    Returns
    -------
    pathlib.Path
        Its path inside the installed package.

    Raises
    ------
    InputError
        When no such file is shipped (with a did-you-mean suggestion).

    Examples
    --------
    >>> template_path("league.toml").name
    'league.toml'
    """
    return _shipped(templates_dir(), name, "template")


def sample_path(name: str) -> Path:
    """Path of a shipped sample league, e.g. ``sample_path("county_double.toml")``.

    A name without an ending also finds ``<name>.toml``, ``<name>.yaml`` or ``<name>.yml``.

    Parameters
    ----------
    name
        File name of the sample, with or without its ending.

    Returns
    -------
    pathlib.Path
        Its path inside the installed package.

    Raises
    ------
    InputError
        When no such file is shipped (with a did-you-mean suggestion).

    Examples
    --------
    >>> sample_path("club_day").name
    'club_day.toml'
    """
    folder = samples_dir()
    if not Path(name).suffix:
        for ending in (".toml", ".yaml", ".yml"):
            if (folder / f"{name}{ending}").is_file():
                return folder / f"{name}{ending}"
    return _shipped(folder, name, "sample league")


def _is_league_file(path: Path) -> bool:
    """A shipped league file: not a season-events file (``*.events.toml``) and not a file of
    several divisions (one with a top-level ``[federation]`` table or ``federation:`` key)."""
    from scheduler.config.federation import is_federation_file

    if path.suffix not in (".toml", ".yaml", ".yml") or ".events." in path.name:
        return False
    return not is_federation_file(path)


def sample_names() -> tuple[str, ...]:
    """File names of every shipped single-league sample, sorted (season-events files such as
    ``county_double.events.toml`` and files of several divisions such as ``federation.toml``
    are left out).

    Returns
    -------
    tuple of str
        The file names.

    Examples
    --------
    >>> "county_double.toml" in sample_names()
    True
    """
    folder = samples_dir()
    if not folder.is_dir():
        return ()
    return tuple(sorted(p.name for p in folder.iterdir() if p.is_file() and _is_league_file(p)))
