"""Which characters a name may hold, and when two names are the same.

A name (of a team, venue, court, league, ...) is refused when it holds

* a C0 control (U+0000-U+001F, tab and line breaks included), DEL (U+007F) or a C1 control
  (U+0080-U+009F): they break files and terminals (a NUL ends a C string);
* a bidirectional formatting control: the embeddings and overrides U+202A-U+202E, the isolates
  U+2066-U+2069, the marks U+200E, U+200F and U+061C (Unicode Standard Annex #9, "Unicode
  Bidirectional Algorithm", section 2, explicit formatting characters); they can make a name
  show in another order than it is stored ("Trojan Source", CVE-2021-42574);
* a surrogate or an unassigned code point (general category ``Cs`` or ``Cn`` in the Unicode
  database of Python's :mod:`unicodedata`).

Names are stored in Normalization Form C (Unicode Standard Annex #15), so "Café" typed with a
precomposed "é" and with "e" + U+0301 is one name; two names are the same team when their
canonical caseless forms agree (:func:`name_key`).
"""

from __future__ import annotations

import unicodedata

BIDI_CONTROLS = frozenset(
    [chr(c) for c in range(0x202A, 0x202F)]
    + [chr(c) for c in range(0x2066, 0x206A)]
    + ["\u200e", "\u200f", "\u061c"]
)
"""Bidirectional formatting characters refused in names (UAX #9, section 2)."""


def _describe(char: str) -> str:
    code = f"U+{ord(char):04X}"
    if char in BIDI_CONTROLS:
        return f"the text-direction control {code} ({unicodedata.name(char, 'unnamed')})"
    category = unicodedata.category(char)
    if category == "Cc":
        return f"the control character {code}"
    if category == "Cs":
        return f"the surrogate {code}"
    return f"the unassigned code point {code}"


def character_problem(text: str) -> str | None:
    """Why ``text`` may not be a name, or ``None`` when every character is allowed.

    Parameters
    ----------
    text
        The name as read from the file.

    Returns
    -------
    str or None
        A sentence naming the first refused character and its position (1-based).

    Examples
    --------
    >>> character_problem("Harbour\\x00Town")
    'holds the control character U+0000 at character 8; remove it'
    >>> character_problem("Café Rovers") is None
    True
    """
    for position, char in enumerate(text, start=1):
        if char in BIDI_CONTROLS or unicodedata.category(char) in ("Cc", "Cs", "Cn"):
            return f"holds {_describe(char)} at character {position}; remove it"
    return None


def normal_form(text: str) -> str:
    """``text`` in Normalization Form C (UAX #15), the form names are stored in.

    Parameters
    ----------
    text : str
        A name as written in the file.

    Returns
    -------
    str
        The NFC form of ``text`` (case and spacing kept).

    Examples
    --------
    >>> normal_form("Cafe\\u0301") == "Caf\\u00e9"
    True
    """
    return unicodedata.normalize("NFC", text)


def name_key(text: str) -> str:
    """The key under which two names are the same: the canonical caseless form
    ``NFD(casefold(NFD(text)))`` of the Unicode Standard, section 3.13, definition D145 (from
    memory).

    Parameters
    ----------
    text : str
        A name.

    Returns
    -------
    str
        The caseless key; two names with the same key name the same team or venue.

    Examples
    --------
    >>> name_key("CAFE\\u0301") == name_key("café")
    True
    >>> name_key("Straße") == name_key("STRASSE")
    True
    """
    return unicodedata.normalize("NFD", unicodedata.normalize("NFD", text).casefold())
