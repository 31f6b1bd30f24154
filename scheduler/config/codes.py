"""Short team codes (``"HRV"`` for "Harbour Rovers") when the league file gives none.

Three uppercase letters is the common practice of league tables and scoreboards (common
practice, not a standard). The code is made from the name, deterministically, and never clashes
with another team's code (compared without regard to case):

A leading "The" is skipped (``The Old Tannery`` -> ``OLD``).

1. one word: its first three letters (``Otters`` -> ``OTT``);
2. several words: the first three letters of the first word, then the initials of the first three
   words, then first letter + two letters of the second word, then two letters + one;
3. then the first letter followed by any two later letters of the name, in order;
4. finally the first two letters followed by a number (``OT2``, ``OT3``, ...).

Letters are folded to ASCII first (``Ölmühle`` -> ``OLMUHLE``); a name without any ASCII letter or
digit gets ``T`` + its position (``T07``).
"""

from __future__ import annotations

import itertools
import re
import unicodedata
from collections.abc import Iterable, Iterator


def _ascii_words(name: str) -> list[str]:
    folded = unicodedata.normalize("NFKD", name).encode("ascii", "ignore").decode("ascii")
    return [w.upper() for w in re.findall(r"[A-Za-z0-9]+", folded)]


def _words(name: str) -> list[str]:
    words = _ascii_words(name)
    if len(words) > 1 and words[0] == "THE":
        words = words[1:]
    return words


def _candidates(name: str) -> Iterator[str]:
    """Rules 1-3 (the numbered codes of rule 4 are handed out by :func:`make_codes`)."""
    words = _words(name)
    if not words:
        return
    joined = "".join(words)
    if len(words) == 1:
        yield joined[:3]
    else:
        yield words[0][:3]
        if len(words) >= 3:
            yield "".join(w[0] for w in words[:3])
        yield words[0][0] + words[1][:2]
        yield words[0][:2] + words[1][0]
    if len(joined) >= 3:
        for i, j in itertools.combinations(range(1, len(joined)), 2):
            yield joined[0] + joined[i] + joined[j]


def make_codes(names: Iterable[str], given: Iterable[str | None]) -> tuple[str, ...]:
    """One code per team: the given code where there is one, else a fresh abbreviation.

    ``given`` codes are assumed unique already (the checks report clashes among them).
    Linear in the number of teams: rules 1-3 try at most C(L - 1, 2) + 4 codes for a name of
    L letters, whatever the league, and the numbers of rule 4 continue per stem where the
    previous team of that stem stopped (never from 2 again).

    Parameters
    ----------
    names
        The team names, in the league's order.
    given
        The code the league file gives each team, or ``None``.

    Returns
    -------
    tuple of str
        One code per team.

    Examples
    --------
    >>> make_codes(["Harbour Rovers", "Otters", "Otter Bay"], [None, None, None])
    ('HAR', 'OTT', 'OBA')
    """
    names = list(names)
    given = list(given)
    taken = {g.upper() for g in given if g}
    next_number: dict[str, int] = {}
    codes: list[str] = []
    for position, (name, code) in enumerate(zip(names, given, strict=True), start=1):
        if code:
            codes.append(code)
            continue
        chosen = None
        for candidate in _candidates(name):
            if candidate.upper() not in taken:
                chosen = candidate
                break
        words = _words(name)
        if chosen is None and words:
            stem = "".join(words)[:2]
            k = next_number.get(stem, 2)
            while f"{stem}{k}".upper() in taken:
                k += 1
            next_number[stem] = k + 1
            chosen = f"{stem}{k}"
        if chosen is None:
            k = position
            while f"T{k:02d}" in taken:
                k += 100
            chosen = f"T{k:02d}"
        taken.add(chosen.upper())
        codes.append(chosen)
    return tuple(codes)
