"""League-file limits, names and dates: refused when the file is read, located, exit code 2.

Outside references: :mod:`unicodedata` (Python's copy of the Unicode Character Database:
general categories, NFC/NFD per Unicode Standard Annex #15, case folding), the code points of the
bidirectional controls from Unicode Standard Annex #9 section 2 (from memory), :mod:`tomllib`
(the nesting it would recurse into), :mod:`datetime` (the years it can hold).
"""

from __future__ import annotations

import datetime as dt
import tomllib
import unicodedata
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from typer.testing import CliRunner

from scheduler.cli import app
from scheduler.config import codes as codes_module
from scheduler.config import limits, load_league, loader, parse_league
from scheduler.config.codes import make_codes
from scheduler.config.names import BIDI_CONTROLS, character_problem, name_key, normal_form
from scheduler.errors import ConfigError

REPO = Path(__file__).resolve().parents[2]
CLUB_DAY = REPO / "sample_leagues" / "club_day.toml"
TEXT = CLUB_DAY.read_text(encoding="utf-8")
runner = CliRunner()


def league_text(teams: list[str]) -> str:
    """The club_day sample with these teams instead of its own."""
    head, rest = TEXT.split("[[teams]]", 1)
    tail = rest[rest.index("[rules]"):]
    body = "".join(f'[[teams]]\nname = "{name}"\n\n' for name in teams)
    return head + body + tail


def write(tmp_path, text: str, name: str = "league.toml") -> Path:
    path = tmp_path / name
    path.write_text(text, encoding="utf-8")
    return path


def refused(path: Path) -> str:
    with pytest.raises(ConfigError) as info:
        load_league(path)
    return str(info.value)


def plan_exit(path: Path, tmp_path) -> tuple[int, str]:
    out = tmp_path / "out"
    result = runner.invoke(app, ["plan", str(path), "--out", str(out), "--quiet"])
    assert not out.exists(), "nothing is written for a refused league"
    return result.exit_code, result.output


# ---- sizes and counts -------------------------------------------------------------------------


def test_100000_teams_are_refused_by_size_before_parsing(tmp_path, monkeypatch):
    path = write(tmp_path, league_text([f"Team {i}" for i in range(100_000)]))
    assert path.stat().st_size > limits.MAX_LEAGUE_FILE_BYTES
    monkeypatch.setattr(tomllib, "loads", lambda *a: pytest.fail("the file was parsed"))
    assert "league files over 1 MB are not read" in refused(path)
    code, output = plan_exit(path, tmp_path)
    assert code == 2 and "1 MB" in output


def test_1001_teams_are_refused_before_validation_and_codes(tmp_path, monkeypatch):
    path = write(tmp_path, league_text([f"Team {i}" for i in range(1001)]))
    monkeypatch.setattr(loader.LeagueFile, "model_validate",
                        lambda *a, **k: pytest.fail("validated"))
    monkeypatch.setattr(loader, "make_codes", lambda *a: pytest.fail("codes were made"))
    assert "teams: 1001 teams; a league has at most 1000" in refused(path)


def test_1000_teams_are_within_the_limit():
    data = tomllib.loads(league_text([f"Team {i}" for i in range(1000)]))
    assert limits.count_problems(data) == []


def test_long_lists_and_many_dates_are_refused():
    data = tomllib.loads(TEXT)
    data["calendar"]["excluded"] = ["2027-01-01"] * (limits.MAX_LIST_ENTRIES + 1)
    assert "calendar.excluded: 10001 entries" in limits.count_problems(data)[0]
    data = tomllib.loads(TEXT)
    data["rules"]["unavailable"] = [
        {"team": "Marrowby Owls", "dates": ["1990-01-01..2000-01-01"]} for _ in range(30)
    ]
    assert "dates (ranges counted day by day)" in limits.count_problems(data)[0]


def test_season_longer_than_ten_years(tmp_path):
    text = TEXT.replace("dates = [2027-05-15, 2027-05-16]",
                        "start = 2027-05-15\nend = 2047-05-16\nweekdays = [\"sat\", \"sun\"]")
    message = refused(write(tmp_path, text))
    assert "calendar.end" in message and "at most 3660" in message


@pytest.mark.parametrize("suffix", [".toml", ".yaml"])
def test_deep_nesting_is_refused_before_the_parser_recurses(tmp_path, suffix):
    deep = "[" * 100_000 + "]" * 100_000
    with pytest.raises(RecursionError):  # the reference: tomllib would recurse to the limit
        tomllib.loads("x = " + deep)
    text = TEXT + "\n[extra]\nx = " + deep + "\n" if suffix == ".toml" else "x: " + deep + "\n"
    path = write(tmp_path, text, "league" + suffix)
    assert "levels deep; at most 64" in refused(path)
    code, _ = plan_exit(path, tmp_path)
    assert code == 2


def test_yaml_block_nesting_without_brackets(tmp_path):
    text = "".join(" " * i + f"k{i}:\n" for i in range(1200)) + " " * 1200 + "v: 1\n"
    path = write(tmp_path, text, "league.yaml")
    # No brackets to count: PyYAML's recursion is caught and reported the same way.
    assert "nests lists or tables more than 64 levels deep" in refused(path)


# ---- names ------------------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("char", "what"),
    [("\x00", "control character U+0000"), ("\x01", "control character U+0001"),
     ("\x0b", "control character U+000B"), ("\x7f", "control character U+007F"),
     ("\x85", "control character U+0085"), ("\u202e", "text-direction control U+202E"),
     ("\u2066", "text-direction control U+2066"), ("\u200f", "text-direction control U+200F"),
     ("\u061c", "text-direction control U+061C"), ("\u0378", "unassigned code point U+0378")],
)
def test_bad_characters_in_names_are_located(tmp_path, char, what):
    escaped = f"\\u{ord(char):04x}"
    text = TEXT.replace('name = "Upper Foxley"', f'name = "Upper {escaped}Foxley"')
    message = refused(write(tmp_path, text))
    assert "teams[4].name: 'Upper " in message and what in message
    assert char not in message  # the message shows the character escaped


def test_the_refused_set_matches_the_unicode_database():
    # Every code point of the Basic Multilingual Plane: refused exactly when unicodedata calls it
    # a control (Cc), surrogate (Cs) or unassigned (Cn), or it is one of UAX #9's controls.
    for code in range(0x10000):
        char = chr(code)
        expected = unicodedata.category(char) in ("Cc", "Cs", "Cn") or code in (
            *range(0x202A, 0x202F), *range(0x2066, 0x206A), 0x200E, 0x200F, 0x061C)
        assert (character_problem(char) is not None) == expected, hex(code)
    assert len(BIDI_CONTROLS) == 12


def test_bidi_controls_are_the_explicit_formatting_characters_of_the_database():
    # The Unicode Character Database's Bidi_Class (via unicodedata): the nine explicit
    # embedding, override and isolate characters, plus the three implicit marks by name.
    explicit = {chr(c) for c in range(0x110000) if unicodedata.bidirectional(chr(c)) in (
        "LRE", "RLE", "PDF", "LRO", "RLO", "LRI", "RLI", "FSI", "PDI")}
    marks = {unicodedata.lookup(name) for name in (
        "LEFT-TO-RIGHT MARK", "RIGHT-TO-LEFT MARK", "ARABIC LETTER MARK")}
    assert explicit | marks == BIDI_CONTROLS


def test_names_are_stored_in_nfc_and_duplicates_compare_caselessly(tmp_path):
    decomposed = "Cafe\u0301 Rovers"
    assert unicodedata.normalize("NFC", decomposed) == "Caf\u00e9 Rovers" != decomposed
    text = TEXT.replace('name = "Upper Foxley"', 'name = "Caf\u00e9 Rovers"').replace(
        'name = "Sorrel Street"', f'name = "{decomposed}"')
    message = refused(write(tmp_path, text))
    assert "teams[5].name" in message and "listed twice (already at teams[4])" in message
    # Upper and lower case, and the German sharp s, are one name too.
    text = TEXT.replace('name = "Upper Foxley"', 'name = "STRASSE 9"').replace(
        'name = "Sorrel Street"', 'name = "Straße 9"')
    assert "listed twice" in refused(write(tmp_path, text))
    # A decomposed name on its own is accepted, stored in NFC.
    text = TEXT.replace('name = "Upper Foxley"', f'name = "{decomposed}"')
    league = load_league(write(tmp_path, text))
    assert decomposed not in [t.name for t in league.teams]
    assert "Caf\u00e9 Rovers" in [t.name for t in league.teams]


@given(st.text(min_size=1, max_size=12))
@settings(max_examples=200, deadline=None)
def test_name_key_is_the_canonical_caseless_match(text):
    # Unicode Standard section 3.13, D145 (from memory): NFD(casefold(NFD(X))).
    nfd = unicodedata.normalize("NFD", text)
    assert name_key(text) == unicodedata.normalize("NFD", nfd.casefold())
    assert name_key(normal_form(text)) == name_key(text)
    assert name_key(text) == name_key(unicodedata.normalize("NFC", text))


def test_name_length_limit(tmp_path):
    ok = TEXT.replace('name = "Upper Foxley"', 'name = "' + "x" * 80 + '"')
    assert len(load_league(write(tmp_path, ok)).teams) == 8
    long = TEXT.replace('name = "Upper Foxley"', 'name = "' + "x" * 81 + '"')
    assert "teams[4].name" in refused(write(tmp_path, long))


# ---- dates ------------------------------------------------------------------------------------


@pytest.mark.parametrize("days", ["9999-12-30, 9999-12-31", "1800-05-15, 1800-05-16",
                                  '"2201-01-01..2201-01-02"'])
def test_dates_outside_the_supported_years(tmp_path, days):
    text = TEXT.replace("dates = [2027-05-15, 2027-05-16]", f"dates = [{days}]")
    message = refused(write(tmp_path, text))
    assert "calendar.dates" in message and "supported years 1900 to 2200" in message
    code, _ = plan_exit(write(tmp_path, text), tmp_path)
    assert code == 2


def test_supported_years_keep_every_computed_date_representable():
    # The latest season end plus the open-ended search window must fit datetime.date.
    from scheduler.calendar.days import MAX_SEARCH_YEARS

    assert limits.MAX_YEAR + MAX_SEARCH_YEARS + 1 < dt.MAXYEAR
    assert limits.MIN_YEAR > dt.MINYEAR


def test_parse_league_applies_the_same_limits():
    data = tomllib.loads(league_text([f"T{i}" for i in range(1001)]))
    with pytest.raises(ConfigError, match="at most 1000"):
        parse_league(data)


# ---- team codes -------------------------------------------------------------------------------


def reference_codes(names, given):
    """The rules of ``codes.py`` written plainly: rule 4 takes the smallest free number >= 2."""
    taken = {g.upper() for g in given if g}
    out = []
    for position, (name, code) in enumerate(zip(names, given, strict=True), start=1):
        if code:
            out.append(code)
            continue
        chosen = next((c for c in codes_module._candidates(name) if c.upper() not in taken), None)
        words = codes_module._words(name)
        if chosen is None and words:
            stem, k = "".join(words)[:2], 2
            while f"{stem}{k}".upper() in taken:
                k += 1
            chosen = f"{stem}{k}"
        if chosen is None:
            k = position
            while f"T{k:02d}" in taken:
                k += 100
            chosen = f"T{k:02d}"
        taken.add(chosen.upper())
        out.append(chosen)
    return tuple(out)


@given(st.lists(st.tuples(st.sampled_from(["Team", "Tea", "Otters", "The Old Mill", "Ölmühle",
                                           "東京", "Te 3", "Tx"]),
                          st.integers(0, 30), st.sampled_from([None, None, None, "TE5", "TE2"])),
                min_size=1, max_size=60))
@settings(max_examples=150, deadline=None)
def test_team_codes_equal_the_plain_rule_and_are_unique(entries):
    names = [f"{word} {number}" for word, number, _ in entries]
    given_codes: list[str | None] = []
    used: set[str] = set()
    for _, _, code in entries:
        given_codes.append(code if code and code not in used else None)
        if code:
            used.add(code)
    got = make_codes(names, given_codes)
    assert got == reference_codes(names, given_codes)
    assert len({c.upper() for c in got}) == len(got)


def test_team_codes_for_many_similar_names_are_unique():
    names = [f"Team {i}" for i in range(20_000)]
    got = make_codes(names, [None] * len(names))
    assert len({c.upper() for c in got}) == len(names)


def test_only_dates_count_towards_the_date_limit():
    data = tomllib.loads(TEXT)
    data["venues"][0]["courts"] = [f"Table {i}" for i in range(limits.MAX_LIST_ENTRIES)]
    data["calendar"]["excluded"] = [dt.date(2027, 1, 1)] * limits.MAX_LIST_ENTRIES
    assert limits.count_problems(data) == []  # 10 000 courts are no dates
    data["rules"]["no_home_games"] = [
        {"team": "Marrowby Owls", "dates": ["2027-01-01"] * limits.MAX_LIST_ENTRIES}
        for _ in range(10)
    ]
    # 10 000 excluded + 100 000 no-home dates + the sample's own 2 match days.
    assert "the file names 110002 dates" in limits.count_problems(data)[0]
