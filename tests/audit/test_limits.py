"""Hostile schedule files are refused with a located message and exit code 2, before the heavy
work: a CSV with a 50 MB field, JSON nested 100 000 deep, a workbook that inflates far beyond
its size, season.json nested too deeply.

Outside checks: :mod:`zipfile` (the standard library's reader of the archive format) builds the
inflating workbook and reports its declared sizes; :mod:`json` shows the nesting it would
recurse into (``RecursionError``); the ``csv`` module's own field limit is the reference for
quoted fields.
"""

from __future__ import annotations

import csv
import json
import zipfile

import openpyxl
import pytest
from typer.testing import CliRunner

from scheduler.audit import limits, read_schedule_with_rows
from scheduler.audit.season_file import loads_season
from scheduler.cli import app
from scheduler.config.limits import nesting_depth
from scheduler.errors import InputError

runner = CliRunner()


def _audit(path):
    result = runner.invoke(app, ["audit", str(path)])
    assert "Traceback" not in result.output
    return result


def test_csv_with_a_50_mb_field_exits_2(tmp_path):
    path = tmp_path / "field.csv"
    path.write_text("round,home,away\n1,Aschental," + "x" * 50_000_000 + "\n", encoding="utf-8")
    result = _audit(path)
    assert result.exit_code == 2
    assert "longer than 10000 characters starts on line 2" in result.output


def test_quoted_field_over_the_limit_uses_the_csv_modules_own_limit(tmp_path):
    path = tmp_path / "quoted.csv"
    path.write_text('round,home,away\n1,A,"' + "x," * 6000 + '"\n', encoding="utf-8")
    # The reference: the csv module refuses the same field at the same limit.
    previous = csv.field_size_limit(limits.MAX_CSV_FIELD_CHARS)
    try:
        with pytest.raises(csv.Error, match="field limit"):
            list(csv.reader(path.read_text(encoding="utf-8").splitlines()))
    finally:
        csv.field_size_limit(previous)
    with pytest.raises(InputError, match="quoted field is longer"):
        read_schedule_with_rows(path)
    assert csv.field_size_limit() == previous  # the reader restores the module's setting


@pytest.mark.parametrize("body", ["[" * 100_000 + "]" * 100_000,
                                  '{"format": "x", "a": ' + "[" * 100_000 + "]" * 100_000 + "}"])
def test_json_nested_100000_deep_exits_2(tmp_path, body):
    with pytest.raises(RecursionError):  # what the standard parser would do with it
        json.loads(body)
    path = tmp_path / "deep.json"
    path.write_text(body, encoding="utf-8")
    result = _audit(path)
    assert result.exit_code == 2 and "levels deep; at most 64" in result.output


def test_nesting_depth_agrees_with_pythons_own_parse():
    def depth(value) -> int:
        if isinstance(value, dict):
            return 1 + max((depth(v) for v in value.values()), default=0)
        if isinstance(value, list):
            return 1 + max((depth(v) for v in value), default=0)
        return 0

    for text in ['{"a": [1, {"b": "]]]"}], "c": [[["x"]]]}', "[]", '"[["', "[[], [[]], {}]"]:
        assert nesting_depth(text) == depth(json.loads(text)), text


def test_season_file_nested_too_deeply_is_located():
    with pytest.raises(InputError) as info:
        loads_season("[" * 65 + "]" * 65, source="old.json")
    assert info.value.location == "old.json"


def _bomb(path, megabytes: int) -> None:
    book = openpyxl.Workbook()
    book.active.append(["Round", "Home", "Away"])
    book.active.append([1, "Aschental", "Birkenmoor"])
    book.save(path)
    with zipfile.ZipFile(path, "a", compression=zipfile.ZIP_DEFLATED) as archive, \
            archive.open("xl/media/padding.bin", "w", force_zip64=True) as member:
        chunk = b"\0" * (1 << 20)
        for _ in range(megabytes):
            member.write(chunk)


def test_inflating_workbook_is_refused_from_the_zip_directory(tmp_path, monkeypatch):
    path = tmp_path / "bomb.xlsx"
    _bomb(path, 210)
    with zipfile.ZipFile(path) as archive:  # the reference reading of the directory
        declared = sum(m.file_size for m in archive.infolist())
    assert declared > limits.MAX_XLSX_UNCOMPRESSED_BYTES > path.stat().st_size
    # Refused before any sheet is read: pandas.read_excel must never run.
    monkeypatch.setattr("pandas.read_excel", lambda *a, **k: pytest.fail("workbook was read"))
    with pytest.raises(InputError, match=r"unpacks to 2[0-9.]+ MB"):
        read_schedule_with_rows(path)


def test_packing_ratio_limit(tmp_path):
    path = tmp_path / "ratio.xlsx"
    _bomb(path, 20)  # 20 MB of zeros pack to about 20 kB: a ratio near 1000
    with pytest.raises(InputError, match="likely zip bomb"):
        read_schedule_with_rows(path)
    result = _audit(path)
    assert result.exit_code == 2


def test_a_normal_workbook_passes_the_size_checks(tmp_path):
    path = tmp_path / "ok.xlsx"
    book = openpyxl.Workbook()
    book.active.append(["Round", "Home", "Away"])
    book.active.append([1, "Aschental", "Birkenmoor"])
    book.save(path)
    limits.check_xlsx_members(path)
    assert read_schedule_with_rows(path).season.fixtures[0].home == "Aschental"


@pytest.mark.parametrize(("cell", "what"), [("\u202eWest", "U+202E"), ("Ost\u2066", "U+2066"),
                                            ("Nord\u0378", "U+0378")])
def test_bad_characters_in_csv_team_names_are_located(tmp_path, cell, what):
    path = tmp_path / "names.csv"
    path.write_text(f"Round,Home,Away\n1,Sued,Mitte\n2,Mitte,{cell}\n", encoding="utf-8")
    with pytest.raises(InputError) as info:
        read_schedule_with_rows(path)
    assert info.value.location.endswith("row 3, column 'Away'") and what in info.value.detail
    assert _audit(path).exit_code == 2


@pytest.mark.parametrize("cell", ["Ost\x00", "Nord\x7f", "West\x01"])
def test_control_characters_in_csv_are_refused_as_binary(tmp_path, cell):
    path = tmp_path / "names.csv"
    path.write_text(f"Round,Home,Away\n1,Sued,{cell}\n", encoding="utf-8")
    result = _audit(path)
    assert result.exit_code == 2 and "binary file" in result.output


def test_control_characters_in_xlsx_team_names_are_located(tmp_path):
    book = openpyxl.Workbook()
    book.active.append(["Round", "Home", "Away"])
    book.active.append([1, "Nord\x7f", "Sued"])  # DEL: openpyxl writes it, the audit refuses it
    path = tmp_path / "names.xlsx"
    book.save(path)
    with pytest.raises(InputError) as info:
        read_schedule_with_rows(path)
    assert info.value.location.endswith("row 2, column 'Home'")
    assert "U+007F" in info.value.detail


def test_team_names_two_ways_are_one_team(tmp_path):
    path = tmp_path / "cafe.csv"
    path.write_text("Round,Home,Away\n1,Caf\u00e9,Mitte\n2,Mitte,Cafe\u0301\n", encoding="utf-8")
    season = read_schedule_with_rows(path).season
    assert season.teams == ("Caf\u00e9", "Mitte")


def test_audited_season_file_team_names_with_controls_are_located(tmp_path):
    text = json.dumps({"format": "roundrobin-scheduler/season/1", "league": "L",
                       "teams": ["Ost", "We\u202est"],
                       "fixtures": [{"round": 1, "home": "Ost", "away": "We\u202est"}]})
    # The project's own reader keeps any name (it reads back what the writer wrote) ...
    assert loads_season(text).teams[1] == "We\u202est"
    # ... the audit of a file from elsewhere refuses it, with the place.
    path = tmp_path / "s.json"
    path.write_text(text, encoding="utf-8")
    with pytest.raises(InputError) as info:
        read_schedule_with_rows(path)
    assert info.value.location == f"{path}: teams[1]" and "U+202E" in info.value.detail
