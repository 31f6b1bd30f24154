"""Every public function, class and method of ``scheduler`` carries a numpydoc docstring.

The check is numpydoc's own validator (``numpydoc.validate``, the reference implementation of
the numpydoc docstring standard), not a rule of this project: a public object must have a
docstring (GL08), document every parameter (PR01) and no unknown one (PR02), and describe what
it returns (RT01). A method that overrides a documented method of a base class inherits that
docstring, as ``inspect.getdoc`` and Sphinx's autodoc do (common practice), so the base method is
checked instead. Objects exported by a package's ``__init__`` (the flat public API) also need an
Examples section (EX01), and those examples run as doctests (tests/rules/test_doctests.py).
"""

from __future__ import annotations

import importlib
import inspect
import pkgutil
from collections.abc import Iterator

import pytest

numpydoc_validate = pytest.importorskip("numpydoc.validate")

import scheduler  # noqa: E402

CHECKED_CODES = ("GL08", "PR01", "PR02", "RT01")
FLAT_API_CODES = (*CHECKED_CODES, "EX01")


def _is_public(name: str) -> bool:
    return not name.startswith("_")


def _modules() -> Iterator[str]:
    yield "scheduler"
    for info in pkgutil.walk_packages(scheduler.__path__, "scheduler."):
        if any(part.startswith("_") for part in info.name.split(".")[1:]):
            continue
        yield info.name


def _documented_in_base(cls: type, name: str) -> bool:
    for base in cls.__mro__[1:]:
        attribute = base.__dict__.get(name)
        if attribute is not None and getattr(attribute, "__doc__", None):
            return True
    return False


def _public_objects() -> Iterator[tuple[str, str]]:
    """Yield (area, dotted name) of every public object defined in the package."""
    seen: set[str] = set()
    for module_name in _modules():
        module = importlib.import_module(module_name)
        area = module_name.split(".")[1] if "." in module_name else "scheduler"
        for name, obj in vars(module).items():
            if not _is_public(name) or getattr(obj, "__module__", None) != module_name:
                continue
            if not (inspect.isfunction(obj) or inspect.isclass(obj)):
                continue
            dotted = f"{module_name}.{name}"
            if dotted not in seen:
                seen.add(dotted)
                yield area, dotted
            if not inspect.isclass(obj):
                continue
            for member_name, member in vars(obj).items():
                if not _is_public(member_name):
                    continue
                function = member.fget if isinstance(member, property) else member
                if isinstance(function, (staticmethod, classmethod)):
                    function = function.__func__
                if not inspect.isfunction(function):
                    continue
                if not function.__doc__ and _documented_in_base(obj, member_name):
                    continue
                member_dotted = f"{dotted}.{member_name}"
                if member_dotted not in seen:
                    seen.add(member_dotted)
                    yield area, member_dotted


def _flat_api() -> set[str]:
    """Dotted names of the objects a package exports in its ``__all__``."""
    exported: set[str] = set()
    for module_name in _modules():
        module = importlib.import_module(module_name)
        if not hasattr(module, "__path__"):
            continue
        for name in getattr(module, "__all__", ()):
            obj = getattr(module, name, None)
            if inspect.isfunction(obj) or inspect.isclass(obj):
                exported.add(f"{obj.__module__}.{obj.__qualname__}")
    return exported


OBJECTS = list(_public_objects())
AREAS = sorted({area for area, _ in OBJECTS})
FLAT_API = _flat_api()


@pytest.mark.parametrize("area", AREAS)
def test_public_api_has_numpydoc_docstrings(area: str) -> None:
    problems = []
    for object_area, dotted in OBJECTS:
        if object_area != area:
            continue
        codes = FLAT_API_CODES if dotted in FLAT_API else CHECKED_CODES
        result = numpydoc_validate.validate(dotted)
        for code, message in result["errors"]:
            if code in codes:
                problems.append(f"{dotted}: {code} {message}")
    assert not problems, f"{len(problems)} docstring problems:\n" + "\n".join(problems)


def test_the_check_sees_the_whole_package() -> None:
    """Guard against a walk that silently finds nothing."""
    names = {dotted for _, dotted in OBJECTS}
    assert "scheduler.season.Season" in names
    assert "scheduler.plan.plan_season" in names
    assert len(OBJECTS) > 500
