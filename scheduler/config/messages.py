"""Turn pydantic validation errors into located problems a league organizer can act on.

A problem reads ``<field path>: <what is wrong>``. Field paths are written the way the file nests
them: ``format.legs``, ``teams[3].home_venue``, ``rules.fixed[0].home`` (list positions count from
0, so ``teams[0]`` is the first ``[[teams]]`` entry). Unknown options get a did-you-mean
suggestion (:mod:`difflib`) from the options the section really has.
"""

from __future__ import annotations

import types
import typing
from typing import Any

from pydantic import BaseModel, ValidationError

from scheduler.config.schema import LeagueFile, show, suggestion


def field_path(loc: tuple[str | int, ...] | list[str | int]) -> str:
    """``("teams", 3, "home_venue")`` -> ``"teams[3].home_venue"``.

    Parameters
    ----------
    loc : tuple or list of str and int
        A pydantic error location: names of sections and options, and list indices.

    Returns
    -------
    str
        The field path as the league organizer reads it; ``"(top level)"`` for an empty
        location.

    Examples
    --------
    >>> field_path(("teams", 3, "home_venue"))
    'teams[3].home_venue'
    >>> field_path(())
    '(top level)'
    """
    out = ""
    for part in loc:
        if isinstance(part, int):
            out += f"[{part}]"
        else:
            out += f".{part}" if out else str(part)
    return out or "(top level)"


def _model_in(annotation: Any) -> type[BaseModel] | None:
    """The pydantic model inside an annotation such as ``list[X]``, ``X | None``, ``Annotated``."""
    if isinstance(annotation, type) and issubclass(annotation, BaseModel):
        return annotation
    origin = typing.get_origin(annotation)
    if origin is None:
        return None
    args = typing.get_args(annotation)
    if origin is typing.Annotated:
        return _model_in(args[0])
    for arg in args:
        found = _model_in(arg)
        if found is not None:
            return found
    return None


def model_at(
    loc: tuple[str | int, ...], root: type[BaseModel] = LeagueFile
) -> type[BaseModel] | None:
    """The section model that holds the option at ``loc`` (for the list of allowed names).

    Parameters
    ----------
    loc : tuple of str and int
        The pydantic error location of an option.
    root : type of pydantic.BaseModel, optional
        The model of the whole file.

    Returns
    -------
    type of pydantic.BaseModel or None
        The section model; None when the location leaves the known sections.
    """
    model: type[BaseModel] | None = root
    for part in loc[:-1]:
        if isinstance(part, int):
            continue
        if model is None or part not in model.model_fields:
            return None
        model = _model_in(model.model_fields[part].annotation)
    return model


def _is_section(loc: tuple[str | int, ...]) -> bool:
    """Whether ``loc`` names a whole section (a table) rather than a single option."""
    model = model_at(loc)
    if model is None or not isinstance(loc[-1], str) or loc[-1] not in model.model_fields:
        return False
    annotation = model.model_fields[loc[-1]].annotation
    while typing.get_origin(annotation) in (typing.Annotated, typing.Union, types.UnionType):
        args = [a for a in typing.get_args(annotation) if a is not type(None)]
        annotation = args[0]
    return isinstance(annotation, type) and issubclass(annotation, BaseModel)


_KIND = {
    "int_type": "a whole number",
    "int_parsing": "a whole number",
    "int_from_float": "a whole number",
    "float_type": "a number",
    "float_parsing": "a number",
    "string_type": "text (in quotes)",
    "bool_type": "true or false",
    "bool_parsing": "true or false",
    "list_type": "a list like [...]",
    "tuple_type": "a list like [...]",
    "dict_type": "a section (a table of options)",
    "model_type": "a section (a table of options)",
    "model_attributes_type": "a section (a table of options)",
}


def describe(error: dict[str, Any]) -> str:
    """One pydantic error as ``path: message``.

    Parameters
    ----------
    error : dict
        One entry of :meth:`pydantic.ValidationError.errors`.

    Returns
    -------
    str
        ``"<field path>: <what is wrong>"`` in plain words, with the nearest known name for an
        unknown option.
    """
    loc = tuple(error.get("loc", ()))
    kind = error.get("type", "")
    ctx = error.get("ctx") or {}
    value = error.get("input")
    path = field_path(loc)
    if kind == "extra_forbidden":
        model = model_at(loc)
        names = list(model.model_fields) if model is not None else []
        name = loc[-1] if loc else ""
        what = "section" if len(loc) == 1 else "option"
        hint = suggestion(str(name), names)
        if not hint and names:
            hint = f" (known: {', '.join(names)})"
        return f"{path}: unknown {what}{hint}"
    if kind == "missing":
        what = "section" if _is_section(loc) else "option"
        return f"{path}: required {what} is missing"
    if kind == "config":
        return f"{path}: {error.get('msg', '')}"
    if kind in _KIND:
        return f"{path}: expected {_KIND[kind]}, got {show(value)}"
    if kind == "greater_than_equal":
        return f"{path}: must be at least {ctx.get('ge')}, got {show(value)}"
    if kind == "greater_than":
        return f"{path}: must be more than {ctx.get('gt')}, got {show(value)}"
    if kind == "less_than_equal":
        return f"{path}: must be at most {ctx.get('le')}, got {show(value)}"
    if kind == "less_than":
        return f"{path}: must be less than {ctx.get('lt')}, got {show(value)}"
    if kind == "too_short":
        n = ctx.get("min_length")
        return f"{path}: needs at least {n} entr{'y' if n == 1 else 'ies'}"
    if kind == "too_long":
        n = ctx.get("max_length")
        return f"{path}: allows at most {n} entr{'y' if n == 1 else 'ies'}"
    if kind == "value_error":
        message = str(error.get("msg", "")).removeprefix("Value error, ")
        return f"{path}: {message}"
    return f"{path}: {error.get('msg', 'invalid value')}"


def problems_from(exc: ValidationError) -> list[str]:
    """Every error of a pydantic validation, described, in file order, without repeats.

    Parameters
    ----------
    exc : pydantic.ValidationError
        The failed validation of a league file.

    Returns
    -------
    list of str
        One described problem per error (:func:`describe`), duplicates left out.
    """
    out: list[str] = []
    for error in exc.errors(include_url=False):
        text = describe(dict(error))
        if text not in out:
            out.append(text)
    return out
