"""Formula-injection defence, safe names and atomic writes (scheduler.export.safety)."""

from __future__ import annotations

import os
import re
import warnings
from pathlib import Path, PureWindowsPath

import pytest
from hypothesis import given
from hypothesis import strategies as st
from openpyxl import Workbook

from scheduler.export.safety import (
    neutralise_cell,
    restore_cell,
    safe_filename,
    safe_filenames,
    safe_sheet_title,
)
from scheduler.files import atomic_write_bytes, atomic_write_text

# The characters that start a formula: OWASP Foundation, "CSV Injection" (common practice).
OWASP_TRIGGERS = ["=", "+", "-", "@", "\t", "\r"]


@pytest.mark.parametrize("first", OWASP_TRIGGERS)
def test_formula_starters_are_prefixed(first):
    # OWASP "CSV Injection": prefix a single quote so the cell is shown as text.
    cell = neutralise_cell(first + "SUM(A1:A9)")
    assert cell == "'" + first + "SUM(A1:A9)"
    assert not cell.startswith(tuple(OWASP_TRIGGERS))


def test_plain_text_unchanged():
    for text in ["Ashford Rovers", "1. FC Brookvale", 'Saints, "Old"; Boys\nB', "", "A=B"]:
        assert neutralise_cell(text) == text
    assert neutralise_cell(None) is None


@given(st.text(max_size=12))
def test_neutralise_is_reversible_and_inert(text):
    cell = neutralise_cell(text)
    assert restore_cell(cell) == text
    assert not cell.startswith(tuple(OWASP_TRIGGERS))


def _is_reserved_on_windows(stem: str) -> bool:
    # Python's own list of Windows device names (pathlib.PureWindowsPath.is_reserved), which
    # follows Microsoft's "Naming Files, Paths, and Namespaces".
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", DeprecationWarning)
        return PureWindowsPath(stem).is_reserved() or PureWindowsPath(stem + ".ics").is_reserved()


NAMES = [
    "Ashford Rovers", "ashford rovers", "ASHFORD ROVERS", "con", "CON", "Nul", "lpt1", "com9",
    "../../etc/passwd", "C:\\Windows\\x", "a/b", "Café Lyonnais", "Cafe Lyonnais", "東京",
    "大阪", "", " ", "...", "x" * 300, "lions", "lions-0123abcd", 'Saints, "Old"; Boys\nB',
    "=cmd|' /C calc'!A0",
]  # fmt: skip


def test_safe_filename_is_portable_and_unique():
    stems = [safe_filename(n) for n in NAMES]
    for name, stem in zip(NAMES, stems, strict=True):
        assert re.fullmatch(r"[a-z0-9]+(-[a-z0-9]+)*", stem), (name, stem)
        assert len(stem) <= 64
        assert Path(stem).name == stem and PureWindowsPath(stem).name == stem
        assert not _is_reserved_on_windows(stem), stem
    # Unique also on case-insensitive file systems.
    assert len({s.lower() for s in stems}) == len(NAMES)
    # Stable: a pure function of the name.
    assert stems == [safe_filename(n) for n in NAMES]
    assert safe_filenames(NAMES) == dict(zip(NAMES, stems, strict=True))


@given(st.lists(st.text(min_size=1, max_size=10), min_size=2, max_size=6, unique=True))
def test_safe_filenames_distinct(names):
    stems = safe_filenames(names)
    assert len({s.lower() for s in stems.values()}) == len(names)


def test_sheet_titles_accepted_by_openpyxl():
    wb = Workbook()
    taken = {"fixtures", "grid", "fairness"}
    titles = [safe_sheet_title(n, taken) for n in [*NAMES, "Grid", "History", "y" * 40, "y" * 41]]
    for title in titles:
        assert 1 <= len(title) <= 31
        wb.create_sheet(title)  # openpyxl raises ValueError on a forbidden character
    assert len({t.lower() for t in titles}) == len(titles)
    assert "grid" not in {t.lower() for t in titles}


def _leftovers(folder: Path) -> list[str]:
    return sorted(p.name for p in folder.iterdir() if p.name.endswith(".tmp"))


def test_atomic_write_replaces_and_leaves_no_temp(tmp_path):
    target = tmp_path / "fixtures.csv"
    atomic_write_text(target, "old\r\n")
    atomic_write_bytes(target, b"new\r\n")
    assert target.read_bytes() == b"new\r\n"
    assert _leftovers(tmp_path) == []
    # An ordinary file mode (mkstemp alone would give 0600).
    mask = os.umask(0)
    os.umask(mask)
    assert target.stat().st_mode & 0o777 == 0o666 & ~mask


def test_atomic_write_failure_keeps_old_file(tmp_path):
    target = tmp_path / "season.json"
    atomic_write_text(target, "{}")
    with pytest.raises(TypeError):
        atomic_write_bytes(target, "not bytes")  # type: ignore[arg-type]
    assert target.read_text() == "{}"
    assert _leftovers(tmp_path) == []
