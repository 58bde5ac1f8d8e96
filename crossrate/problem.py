"""One problem found in a library, config or CSV file: where it is (file, line, couple, field, column) and
what was wrong and expected.

Named through crossrate.errors (`from crossrate.errors import Problem`), which imports this module on first
use: defining the two frozen dataclasses costs a cold command about 2 ms (Python 3.11 compiles each one's
methods at import), and a valid library read from the load cache has no problem to report.
"""

from dataclasses import dataclass

from .errors import printable


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
        return printable(": ".join(parts), keep_newlines=False)


@dataclass(frozen=True)
class ColumnProblem(Problem):
    """A problem with a column too (TOML syntax, encoding, a CSV cell): shown as `path:line:column: ...`."""

    column: int | None = None

    def __str__(self) -> str:
        text = super().__str__()
        if self.line and self.column:
            head = f"{self.path}:{self.line}"
            return f"{head}:{self.column}{text[len(head):]}"
        return text
