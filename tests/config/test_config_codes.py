"""Team codes made from team names: unique, deterministic, explicit codes kept."""

from __future__ import annotations

from hypothesis import given, settings
from hypothesis import strategies as st

from scheduler.config.codes import make_codes


def test_simple_names():
    codes = make_codes(
        ["Otters", "Harbour Rovers", "The Old Tannery", "Upper Foxley Chess Club"],
        [None, None, None, None],
    )
    assert codes == ("OTT", "HAR", "OLD", "UPP")


def test_clashes_fall_back_to_other_letters():
    codes = make_codes(["Marrowby Owls", "Marrowby Herons", "Marrowby Town"], [None] * 3)
    assert codes[0] == "MAR"
    assert len(set(codes)) == 3
    assert all(c[0] == "M" for c in codes)


def test_explicit_codes_are_kept_and_reserved():
    codes = make_codes(["Harbour Rovers", "Harbour Town"], ["HAR", None])
    assert codes[0] == "HAR" and codes[1] != "HAR"


def test_names_without_ascii_letters():
    codes = make_codes(["東京", "大阪"], [None, None])
    assert codes == ("T01", "T02")


def test_accents_are_folded():
    assert make_codes(["Ölmühle Süd"], [None]) == ("OLM",)


@settings(max_examples=150, deadline=None)
@given(st.lists(st.text(min_size=1, max_size=20), min_size=2, max_size=30, unique=True))
def test_codes_are_unique_and_deterministic(names):
    codes = make_codes(names, [None] * len(names))
    assert len({c.upper() for c in codes}) == len(codes)
    assert make_codes(names, [None] * len(names)) == codes
