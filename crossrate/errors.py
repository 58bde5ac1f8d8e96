"""crossrate's own exceptions. Nothing in the API prints or exits; the CLI maps these to exit code 2."""

from dataclasses import dataclass


class CrossrateError(Exception):
    """Base of every error crossrate raises on bad input. str(error) is one clear, user-facing message."""


@dataclass(frozen=True)
class Problem:
    """One validation problem: where (file, line, couple, field) and what was wrong / expected."""

    path: str
    line: int | None
    couple: str | None
    field: str | None
    message: str

    def __str__(self) -> str:
        loc = f"{self.path}:{self.line}" if self.line else f"{self.path}"
        parts = [loc]
        if self.couple:
            parts.append(f"couple {self.couple}")
        if self.field:
            parts.append(f"field {self.field}")
        parts.append(self.message)
        return ": ".join(parts)


class LibraryError(CrossrateError):
    """A library file is invalid; .problems lists every problem found (all at once)."""

    def __init__(self, problems: list[Problem]):
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
