"""crossrate's own exceptions. Nothing in the API prints or exits; the CLI maps these to exit code 2."""

import re
from typing import TYPE_CHECKING

if TYPE_CHECKING:
    from .problem import Problem

#: Characters a terminal may act on instead of showing: C0 controls but tab and newline, DEL, C1 controls,
#: and the bidirectional overrides/isolates that can make text display in another order than it is stored.
_UNPRINTABLE = "[\x00-\x08\x0b-\x1f\x7f-\x9f\u200e\u200f\u202a-\u202e\u2066-\u2069]"
_UNPRINTABLE_OR_NEWLINE = "[\x00-\x1f\x7f-\x9f\u200e\u200f\u202a-\u202e\u2066-\u2069]"
#: The two patterns compiled, on first use: compiling them costs every cold command about 0.5 ms, and output
#: to a pipe or a file never escapes anything.
_COMPILED: dict[bool, re.Pattern] = {}


def _escape(match: re.Match) -> str:
    c = match.group()
    return f"\\x{ord(c):02x}" if ord(c) < 0x100 else f"\\u{ord(c):04x}"


def printable(text: str, keep_newlines: bool = True) -> str:
    """text with every character a terminal would act on (escape sequences, carriage return, bell, bidi
    overrides...) written as a visible escape such as \\x1b, so text read from a file cannot change the
    terminal. keep_newlines=False escapes newline and tab too (for one-line cells)."""
    pattern = _COMPILED.get(keep_newlines)
    if pattern is None:
        pattern = _COMPILED[keep_newlines] = re.compile(_UNPRINTABLE if keep_newlines else _UNPRINTABLE_OR_NEWLINE)
    return pattern.sub(_escape, text) if pattern.search(text) else text


class CrossrateError(Exception):
    """Base of every error crossrate raises on bad input. str(error) is one clear, user-facing message."""


class LibraryError(CrossrateError):
    """A library file is invalid; .problems lists every problem found (all at once)."""

    def __init__(self, problems: "list[Problem]"):
        self.problems = list(problems)
        super().__init__("\n".join(str(p) for p in self.problems))


class UnknownCoupleError(CrossrateError, KeyError):
    """A couple id is not in the loaded set; .suggestions lists the closest ids."""

    def __init__(self, couple_id: str, suggestions: list[str] | None = None, empty_reason: str = ""):
        """empty_reason: 'no couples loaded: ...' when the set holds no couple at all (said instead of a hint)."""
        self.couple_id = couple_id
        self.suggestions = list(suggestions or [])
        hint = f"; did you mean {', '.join(self.suggestions)}?" if self.suggestions else ""
        if empty_reason:
            hint = f": {empty_reason}"
        super().__init__(f"unknown couple {couple_id!r}{hint}")

    def __str__(self) -> str:  # KeyError would otherwise quote the message
        return self.args[0]


class ConditionsError(CrossrateError, ValueError):
    """Conditions out of range or inconsistent (bad temperature, mixed media, missing ionic strength...)."""


class ScienceError(CrossrateError, ValueError):
    """The requested calculation is outside what the model covers (n != 1, no self-exchange data...)."""


class ConflictError(CrossrateError):
    """A library file changed on disk since it was read; the write was refused and nothing was changed."""


class InputFileError(CrossrateError):
    """A CSV or other input file (not a library) is malformed; message names file, line and column."""


class ArgumentError(CrossrateError, TypeError):
    """A Python API function was given an argument of the wrong type, or a couple position out of range;
    the message names the argument and what was expected."""


def __getattr__(name: str):
    """Problem and ColumnProblem, from crossrate.problem on first use: `from crossrate.errors import Problem`
    stays the way to name them, while a command that meets no problem never defines them (see there)."""
    if name in ("Problem", "ColumnProblem"):
        from . import problem

        return getattr(problem, name)
    raise AttributeError(f"module {__name__!r} has no attribute {name!r}")
