"""The argument parser every crossrate command uses: help texts wrapped to the terminal, one-line errors.

argparse's own error form (the whole usage block, then `error: ...`) buries the message a chemist needs;
here a bad option gives one line naming the command, the option and what was expected, and exit code 2.
"""

import argparse
import os
import sys
import textwrap

#: The caution every help text and table form that shows predictions carries (contract wording).
CAUTION = (
    "Predictions are estimates, not a safety assessment; follow your lab's safety rules and local "
    "regulations when handling strong oxidants and reductants."
)


def terminal_columns() -> int:
    """Columns of the terminal as shutil.get_terminal_size() counts them: $COLUMNS, else the terminal on
    stdout, else 80.

    argparse asks shutil for every formatter it makes (one per add_argument, to check the metavar), and
    importing shutil imports bz2, lzma and zlib: about 2 ms of every cold command for nothing.
    """
    try:
        columns = int(os.environ["COLUMNS"])
    except (KeyError, ValueError):
        columns = 0
    if columns <= 0:
        try:
            columns = os.get_terminal_size(sys.__stdout__.fileno()).columns
        except (AttributeError, ValueError, OSError):
            columns = 0
    return columns if columns > 0 else 80


class ParagraphHelpFormatter(argparse.HelpFormatter):
    """Keeps the paragraphs of a description or epilog (blank-line separated) and wraps each to the
    terminal width; a paragraph whose lines are indented (an example block) is printed as written."""

    def __init__(self, prog, indent_increment=2, max_help_position=24, width=None):
        # argparse's own default width, without its import of shutil (see terminal_columns)
        super().__init__(prog, indent_increment, max_help_position,
                         terminal_columns() - 2 if width is None else width)

    def _fill_text(self, text, width, indent):
        out = []
        for block in text.strip("\n").split("\n\n"):
            lines = block.split("\n")
            if all(line.startswith(" ") for line in lines if line.strip()):
                out.append("\n".join(indent + line for line in lines))
                continue
            # A first line that introduces an indented block ("Examples:") stays on its own.
            head, rest = [], lines
            while rest and not rest[0].startswith(" "):
                head.append(rest.pop(0))
            paragraph = textwrap.fill(
                " ".join(part.strip() for part in head), width, initial_indent=indent, subsequent_indent=indent,
                break_on_hyphens=False,
            )
            out.append("\n".join([paragraph, *(indent + line for line in rest)]))
        return "\n\n".join(out)


class CrossrateArgumentParser(argparse.ArgumentParser):
    """ArgumentParser with wrapped paragraph help and one-line error messages (exit code 2)."""

    def __init__(self, *args, **kwargs):
        kwargs.setdefault("formatter_class", ParagraphHelpFormatter)
        super().__init__(*args, **kwargs)

    def error(self, message: str):
        message = message.replace("argument ", "", 1) if message.startswith("argument ") else message
        print(f"{self.prog}: {message} (see `{self.prog} --help`)", file=sys.stderr)
        sys.exit(2)
