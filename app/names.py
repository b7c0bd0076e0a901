"""When two names are the same name: one folding rule for shortlists and the user's substrates.

Names are unique, and found, ignoring case and Unicode encoding differences: "ÄPFEL" and
"äpfel", "Maß", "MASS" and "MAẞ", a composed "É" (U+00C9) and "E" + U+0301 are each one name.
The rule is the Unicode Standard's canonical caseless match (ch. 3, D145: NFD, full case
folding, NFD again), and `name_key` returns its result in NFC form, so two names get the same
key exactly when they match under that rule (NFC and NFD forms are equal for exactly the same
strings). For every single code point it gives the same key as folding the NFC form and
normalising to NFC again; the NFD first is the Standard's, for combining marks that fold.

The key is computed here, in Python, and stored beside the name (a `name_key` column with a
unique index, set by the models whenever a name is set); SQL only compares stored keys and
never folds text itself (SQLite's `lower()` folds ASCII letters only). Keys are stable across
Python versions: names hold assigned characters only (`app.text_rules`), and Unicode does not
change the case folding or the decomposition of an assigned character.
"""

from __future__ import annotations

import unicodedata

KEY_GROWTH = 3
"""Most code points a name's code point becomes in its key (full case folding: "ﬃ" -> "ffi")."""


def name_key(name: str) -> str:
    """The key two names share exactly when they are the same name (outer spaces are kept).

    Args:
        name: A name as stored or as typed (callers strip outer spaces first).

    Returns:
        NFC(casefold(NFD(name))), e.g. "Straße" -> "strasse", "ÉCLAIR" -> "éclair".
    """
    return unicodedata.normalize("NFC", unicodedata.normalize("NFD", name).casefold())
