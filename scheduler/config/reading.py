"""Read a league file (TOML or YAML) into plain Python data, with located errors.

TOML is read with :mod:`tomllib` (TOML 1.0, https://toml.io/en/v1.0.0). YAML is read with
PyYAML's safe loader, changed in three ways so a league file means what it looks like:

- only ``true``/``false`` are booleans (YAML 1.1 also reads ``no``, ``yes``, ``on``, ``off`` as
  booleans, which would turn the country code ``NO`` into ``false``);
- ``19:30`` stays text (YAML 1.1 reads it as the base-60 number 1170);
- a key given twice in one mapping is an error (PyYAML silently keeps the last one, while TOML
  forbids repeats).

These are the YAML 1.2 core-schema rules for booleans and numbers (YAML 1.2.2 spec, section 10.3,
https://yaml.org/spec/1.2.2/). Every failure raises :class:`scheduler.errors.ConfigError` naming
the file and, for syntax errors, the line and column.
"""

from __future__ import annotations

import re
import tomllib
from pathlib import Path
from typing import Any

import yaml

from scheduler.config.limits import MAX_LEAGUE_FILE_BYTES, MAX_NESTING_DEPTH, nesting_depth
from scheduler.errors import ConfigError

TOML_SUFFIXES = (".toml",)
YAML_SUFFIXES = (".yaml", ".yml")


class LeagueYamlLoader(yaml.SafeLoader):
    """PyYAML safe loader with YAML 1.2 style booleans and numbers and no duplicate keys.

    Used as ``yaml.load(text, Loader=LeagueYamlLoader)``, so that YAML and TOML league files
    read alike.

    Parameters
    ----------
    stream : str or file
        The YAML text or an open text file (as for any PyYAML loader).
    """

    def construct_mapping(self, node: yaml.MappingNode, deep: bool = False) -> dict[Any, Any]:
        """A mapping of the file, refusing keys that appear twice or are not plain values.

        Parameters
        ----------
        node : yaml.MappingNode
            The mapping's node.
        deep : bool, optional
            Build nested values at once (PyYAML's own option).

        Returns
        -------
        dict
            The mapping.

        Raises
        ------
        yaml.constructor.ConstructorError
            For a duplicate or unhashable key, with its place in the text.
        """
        seen: set[Any] = set()
        for key_node, _value_node in node.value:
            key = self.construct_object(key_node, deep=True)
            try:
                hash(key)
            except TypeError:
                raise yaml.constructor.ConstructorError(
                    None, None, "a key must be plain text", key_node.start_mark
                ) from None
            if key in seen:
                raise yaml.constructor.ConstructorError(
                    "while reading a mapping",
                    node.start_mark,
                    f"the key {key!r} appears twice",
                    key_node.start_mark,
                )
            seen.add(key)
        return super().construct_mapping(node, deep=deep)


LeagueYamlLoader.yaml_implicit_resolvers = {
    first: [
        (tag, regexp)
        for tag, regexp in resolvers
        if tag not in ("tag:yaml.org,2002:bool", "tag:yaml.org,2002:int", "tag:yaml.org,2002:float")
    ]
    for first, resolvers in yaml.SafeLoader.yaml_implicit_resolvers.items()
}
LeagueYamlLoader.add_implicit_resolver(
    "tag:yaml.org,2002:bool", re.compile(r"^(?:true|True|TRUE|false|False|FALSE)$"), list("tTfF")
)
LeagueYamlLoader.add_implicit_resolver(
    "tag:yaml.org,2002:int", re.compile(r"^[-+]?[0-9]+$"), list("-+0123456789")
)
LeagueYamlLoader.add_implicit_resolver(
    "tag:yaml.org,2002:float",
    re.compile(
        r"^(?:[-+]?(?:\.[0-9]+|[0-9]+(?:\.[0-9]*)?)(?:[eE][-+]?[0-9]+)?|[-+]?\.(?:inf|Inf|INF)|\.(?:nan|NaN|NAN))$"
    ),
    list("-+0123456789."),
)


def _toml_problem(exc: tomllib.TOMLDecodeError) -> str:
    text = str(exc)
    m = re.search(r"\(at line (\d+), column (\d+)\)", text)
    if m:
        message = text[: m.start()].strip()
        return f"line {m.group(1)}, column {m.group(2)}: TOML syntax error: {message}"
    m = re.search(r"\(at end of document\)", text)
    if m:
        return f"end of file: TOML syntax error: {text[: m.start()].strip()}"
    return f"TOML syntax error: {text}"


def _yaml_problem(exc: yaml.YAMLError) -> str:
    mark = getattr(exc, "problem_mark", None) or getattr(exc, "context_mark", None)
    problem = getattr(exc, "problem", None) or str(exc)
    context = getattr(exc, "context", None)
    where = f"line {mark.line + 1}, column {mark.column + 1}: " if mark is not None else ""
    detail = f"{context}: {problem}" if context and "twice" in str(problem) else problem
    return f"{where}YAML syntax error: {detail}"


def parse_text(text: str, kind: str, *, path: str = "<config>") -> dict[str, Any]:
    """Parse league text of ``kind`` ``"toml"`` or ``"yaml"`` into a dict.

    Parameters
    ----------
    text : str
        The file's text.
    kind : {"toml", "yaml"}
        The file's syntax (:func:`file_kind`).
    path : str, optional
        The file name for messages.

    Returns
    -------
    dict
        The file's top-level tables.

    Raises
    ------
    ConfigError
        For empty text, a syntax error (with its line), too deep nesting, several YAML
        documents, or data that is not a table of sections.

    Examples
    --------
    >>> parse_text('league = { name = "Weald Cup" }', "toml")
    {'league': {'name': 'Weald Cup'}}
    >>> parse_text("league: {name: Weald Cup}", "yaml")
    {'league': {'name': 'Weald Cup'}}
    """
    if not text.strip():
        raise ConfigError(["the file is empty; start from `scheduler new`"], path=path)
    depth = nesting_depth(text, comments=True)
    if depth > MAX_NESTING_DEPTH:
        raise ConfigError(
            [f"the file nests lists or tables {depth} levels deep; at most "
             f"{MAX_NESTING_DEPTH} are read"],
            path=path,
        )
    too_deep = ConfigError(
        [f"the file nests lists or tables more than {MAX_NESTING_DEPTH} levels deep"], path=path
    )
    if kind == "toml":
        try:
            data: Any = tomllib.loads(text)
        except tomllib.TOMLDecodeError as exc:
            raise ConfigError([_toml_problem(exc)], path=path) from None
        except RecursionError:
            raise too_deep from None
    elif kind == "yaml":
        try:
            documents = list(yaml.load_all(text, Loader=LeagueYamlLoader))
        except yaml.YAMLError as exc:
            raise ConfigError([_yaml_problem(exc)], path=path) from None
        except RecursionError:  # block nesting by indentation, which has no brackets
            raise too_deep from None
        documents = [d for d in documents if d is not None]
        if len(documents) > 1:
            raise ConfigError(
                ["the file holds several YAML documents (---); keep one league per file"],
                path=path,
            )
        data = documents[0] if documents else None
    else:  # pragma: no cover - callers pass one of the two
        raise ConfigError([f"unknown file kind {kind!r}"], path=path)
    if data is None or data == {}:
        raise ConfigError(["the file has no settings (only comments or blank lines)"], path=path)
    if not isinstance(data, dict):
        raise ConfigError(
            [
                "the file must hold sections such as `league` and `teams`, "
                f"not a {type(data).__name__}"
            ],
            path=path,
        )
    bad_keys = [k for k in data if not isinstance(k, str)]
    if bad_keys:
        raise ConfigError([f"{k!r}: section names must be text" for k in bad_keys], path=path)
    return data


def file_kind(path: Path) -> str:
    """``"toml"`` or ``"yaml"`` by the file name's ending; a ConfigError otherwise.

    Parameters
    ----------
    path : pathlib.Path
        The file.

    Returns
    -------
    str
        ``"toml"`` for ``.toml``, ``"yaml"`` for ``.yaml`` and ``.yml`` (any case).

    Raises
    ------
    ConfigError
        For any other ending.

    Examples
    --------
    >>> file_kind(Path("league.YML"))
    'yaml'
    """
    suffix = path.suffix.lower()
    if suffix in TOML_SUFFIXES:
        return "toml"
    if suffix in YAML_SUFFIXES:
        return "yaml"
    shown = f"'{path.suffix}'" if path.suffix else "no ending"
    raise ConfigError(
        [f"unknown file type ({shown}); a league file ends in .toml, .yaml or .yml"],
        path=str(path),
    )


def read_file(path: str | Path) -> dict[str, Any]:
    """Read and parse a league file; every failure is a :class:`ConfigError`.

    Parameters
    ----------
    path : str or pathlib.Path
        A ``.toml``, ``.yaml`` or ``.yml`` file, UTF-8 (a byte order mark is allowed).

    Returns
    -------
    dict
        The file's top-level tables (:func:`parse_text`).

    Raises
    ------
    ConfigError
        When the file is missing, too large, not UTF-8, cannot be read or cannot be parsed.
    """
    p = Path(path)
    kind = file_kind(p)
    try:
        size = p.stat().st_size if p.is_file() else 0
    except OSError:
        size = 0
    if size > MAX_LEAGUE_FILE_BYTES:
        raise ConfigError(
            [f"the file is {size / (1024 * 1024):.1f} MB; league files over "
             f"{MAX_LEAGUE_FILE_BYTES // (1024 * 1024)} MB are not read"],
            path=str(p),
        )
    try:
        raw = p.read_bytes()
    except FileNotFoundError:
        raise ConfigError(["file not found"], path=str(p)) from None
    except IsADirectoryError:
        raise ConfigError(["this is a folder, not a league file"], path=str(p)) from None
    except PermissionError:
        raise ConfigError(["the file may not be read (permission denied)"], path=str(p)) from None
    except OSError as exc:
        problem = f"the file cannot be read: {exc.strerror or exc}"
        raise ConfigError([problem], path=str(p)) from None
    try:
        text = raw.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        line = raw[: exc.start].count(b"\n") + 1
        raise ConfigError(
            [
                f"line {line}: the file is not UTF-8 text (byte 0x{raw[exc.start]:02x}); "
                "save it as UTF-8"
            ],
            path=str(p),
        ) from None
    return parse_text(text, kind, path=str(p))
