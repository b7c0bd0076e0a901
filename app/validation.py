"""Request validation errors in our own words: which field, and what it expects.

FastAPI checks path, query, form and JSON fields against their declared types and raises
`RequestValidationError` with pydantic's error records. `plain_message` turns each record into
one sentence of ours (field label + what is expected + what came, cut to 40 characters), so no
library wording ("Field required", "Input should be a valid integer") reaches the user.
"""

from __future__ import annotations

from collections.abc import Callable, Iterable, Mapping
from typing import Any

from screening.errors import echo

LOCATIONS = ("body", "query", "path", "header", "cookie")
"""First parts of a field's location that say where it came from, not what it is."""


def field_label(loc: Iterable[Any]) -> str:
    """The field as a user knows it: "'name'", "'formulas' item 3", or "the request body"."""
    parts = list(loc)
    place = parts[0] if parts and parts[0] in LOCATIONS else None
    if place:
        parts = parts[1:]
    names = [str(p) for p in parts if not isinstance(p, int)]
    items = [p for p in parts if isinstance(p, int)]
    if not names:
        return "the request body" if place == "body" else "the request"
    label = f"'{'.'.join(names)}'"
    return label + (f" item {items[-1] + 1}" if items else "")


def _limit(ctx: Mapping[str, Any], key: str) -> str:
    return f"{ctx.get(key)}"


Sentence = Callable[[Mapping[str, Any]], str]

EXPECTED: dict[str, Sentence] = {
    "int_parsing": lambda c: "must be a whole number",
    "int_type": lambda c: "must be a whole number",
    "int_from_float": lambda c: "must be a whole number",
    "float_parsing": lambda c: "must be a number",
    "float_type": lambda c: "must be a number",
    "finite_number": lambda c: "must be a finite number",
    "bool_parsing": lambda c: "must be true or false",
    "bool_type": lambda c: "must be true or false",
    "string_type": lambda c: "must be text",
    "string_too_short": lambda c: (
        "must not be empty" if c.get("min_length") == 1
        else f"must be at least {_limit(c, 'min_length')} characters long"),
    "string_too_long": lambda c: f"must be at most {_limit(c, 'max_length')} characters long",
    "string_pattern_mismatch": lambda c: "does not have the accepted form",
    "greater_than": lambda c: f"must be more than {_limit(c, 'gt')}",
    "greater_than_equal": lambda c: f"must be at least {_limit(c, 'ge')}",
    "less_than": lambda c: f"must be less than {_limit(c, 'lt')}",
    "less_than_equal": lambda c: f"must be at most {_limit(c, 'le')}",
    "literal_error": lambda c: f"must be one of {_limit(c, 'expected')}",
    "enum": lambda c: f"must be one of {_limit(c, 'expected')}",
    "list_type": lambda c: "must be a list",
    "too_short": lambda c: f"must hold at least {_limit(c, 'min_length')} item(s)",
    "too_long": lambda c: f"must hold at most {_limit(c, 'max_length')} items",
    "dict_type": lambda c: "must be a JSON object",
    "model_attributes_type": lambda c: "must be a JSON object",
    "model_type": lambda c: "must be a JSON object",
    "extra_forbidden": lambda c: "is not an accepted field",
    "uuid_parsing": lambda c: "must be an identifier of the accepted form",
}
"""What a field expects, by pydantic error type (types not listed: "is not accepted")."""


def plain_message(error: Mapping[str, Any]) -> str:
    """One sentence for one pydantic error record (keys `type`, `loc`, `input`, `ctx`)."""
    kind = str(error.get("type", ""))
    label = field_label(error.get("loc", ()))
    ctx = error.get("ctx") or {}
    if kind == "missing":
        return f"{label} is missing: it is required"
    if kind == "json_invalid":
        return "the request body is not valid JSON"
    if kind in ("value_error", "assertion_error") and ctx.get("error") is not None:
        said = str(ctx["error"])
        return f"{label} {said}" if said.startswith("must ") else f"{label}: {said}"
    sentence = EXPECTED.get(kind, lambda c: "is not accepted")(ctx)
    if "input" in error and kind not in ("extra_forbidden", "model_attributes_type"):
        sentence += f", not {echo(error['input'])}"
    return f"{label} {sentence}"


def plain_messages(errors: Iterable[Mapping[str, Any]]) -> str:
    """All records as one line, sentences joined by "; " (each said once)."""
    sentences = list(dict.fromkeys(plain_message(e) for e in errors))
    return "; ".join(sentences) or "the request is not accepted"
