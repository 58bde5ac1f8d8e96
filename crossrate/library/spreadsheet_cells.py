"""CSV cells that a spreadsheet cannot take for a formula.

A spreadsheet opening a CSV evaluates a cell that begins with `=`, `+`, `-` or `@` (and, in some, a tab or a
carriage return first) as a formula: a couple name or a row label such as `=HYPERLINK(...)` would run as one.
The usual defence is to start such a text cell with an apostrophe, which the spreadsheet shows as text and
drops from the value. Numbers (-0.25, +1e3) are left as they are so that they stay numbers.
"""

import math

_FORMULA_START = ("=", "+", "-", "@", "\t", "\r")


def _is_number(text: str) -> bool:
    try:
        return math.isfinite(float(text))
    except ValueError:
        return False


def _needs_guard(text: str) -> bool:
    # Apostrophes already in front count as part of the text: "'=x" is guarded too, so that
    # from_spreadsheet_cell can tell a guard from an apostrophe the text itself begins with.
    rest = text.lstrip("'")
    return rest.startswith(_FORMULA_START) and not _is_number(rest)


def spreadsheet_safe(cell):
    """The cell as it may be written: a text beginning with = + - @ tab or CR (after any apostrophes) gets a
    leading apostrophe unless it is a plain number; anything that is not text is returned unchanged."""
    if isinstance(cell, str) and _needs_guard(cell):
        return "'" + cell
    return cell


def from_spreadsheet_cell(text: str) -> str:
    """The text spreadsheet_safe was given, from the cell it wrote (the guard's apostrophe dropped):
    `crossrate library import` reads an exported CSV back to exactly the same values."""
    if text.startswith("'") and _needs_guard(text[1:]):
        return text[1:]
    return text


def safe_row(cells) -> list:
    """spreadsheet_safe applied to every cell of a row."""
    return [spreadsheet_safe(c) for c in cells]
