"""Shared pieces of the CLI renderers: when to use Rich, number formats, symbols, the closing caution line."""

import os
import re
import sys
import textwrap

#: Last line of every table form the prediction commands print.
CLOSING_CAUTION = (
    "Estimate only, not a safety assessment; follow your lab's safety rules and local regulations "
    "when handling strong oxidants and reductants."
)
#: Plain text is wrapped at this width whatever the terminal, so the output is the same everywhere and
#: fits an 80-column terminal.
PLAIN_WIDTH = 80

_UNICODE_SYMBOLS = {"dG0": "ΔG°", "dG0p": "ΔG°'", "dGact": "ΔG‡", "lambda": "λ", "pm": "±", "to": "–"}
_ASCII_SYMBOLS = {"dG0": "dG0", "dG0p": "dG0'", "dGact": "dG_act", "lambda": "lambda", "pm": "+/-", "to": "-"}


def symbols(stream) -> dict[str, str]:
    """Unicode symbols (ΔG°, λ, ‡) when the stream can encode them, else ASCII spellings."""
    encoding = getattr(stream, "encoding", None) or "ascii"
    try:
        "".join(_UNICODE_SYMBOLS.values()).encode(encoding)
    except (UnicodeEncodeError, LookupError):
        return dict(_ASCII_SYMBOLS)
    return dict(_UNICODE_SYMBOLS)


def use_rich(stream) -> bool:
    """Rich output only on an interactive terminal that wants colour (NO_COLOR unset, TERM not dumb)."""
    if os.environ.get("NO_COLOR") or os.environ.get("TERM") == "dumb":
        return False
    isatty = getattr(stream, "isatty", None)
    return bool(isatty and isatty())


def fmt_fixed(value, digits: int) -> str:
    """Fixed-point text, or 'n/a' for a missing / non-finite value."""
    if value is None or value != value or value in (float("inf"), float("-inf")):
        return "n/a"
    text = f"{value:.{digits}f}"
    return text[1:] if text.startswith("-") and float(text) == 0.0 else text  # no "-0.000"


def fmt_sci(value, digits: int = 3) -> str:
    """Scientific notation with `digits` significant figures, or 'n/a'."""
    if value is None or value != value or value in (float("inf"), float("-inf")):
        return "n/a"
    return f"{value:.{digits - 1}e}"


def pow10(log10_value, digits: int = 3) -> str:
    """10**log10_value in scientific notation without overflowing (works for 1e-300 or 1e400)."""
    if log10_value is None or log10_value != log10_value:
        return "n/a"
    exponent = int(log10_value // 1)
    mantissa = 10.0 ** (log10_value - exponent)
    text = f"{mantissa:.{digits - 1}f}"
    if text.startswith("10"):  # rounding carried into the next decade
        mantissa /= 10.0
        exponent += 1
        text = f"{mantissa:.{digits - 1}f}"
    sign = "-" if exponent < 0 else "+"
    return f"{text}e{sign}{abs(exponent):02d}"


def wrap_item(text: str, bullet: str = "- ", indent: int = 2) -> list[str]:
    """A bullet item wrapped to PLAIN_WIDTH with a hanging indent (numbers stay with their units)."""
    lead = " " * indent
    return wrap_text(text, PLAIN_WIDTH, lead + bullet, lead + " " * len(bullet))


def wrap_line(text: str) -> list[str]:
    """A paragraph wrapped to PLAIN_WIDTH (numbers stay with their units)."""
    return wrap_text(text, PLAIN_WIDTH, "", "")


def labelled_row(label: str, value: str, unit: str, note: str, widths: tuple[int, int, int]) -> list[str]:
    """One `label  value  unit  note` row of a plain table, the note wrapped under itself so no line is
    wider than PLAIN_WIDTH. widths: (label, value, unit) column widths."""
    label_w, value_w, unit_w = widths
    lead = f"  {label:<{label_w}}{value:>{value_w}}  {unit:<{unit_w}}"
    room = max(20, PLAIN_WIDTH - len(lead))
    parts = textwrap.wrap(note, width=room, break_on_hyphens=False) if note else []
    if not parts:
        return [lead.rstrip()]
    return [(lead + parts[0]).rstrip()] + [" " * len(lead) + part for part in parts[1:]]


# A line break must not separate a number from its unit, a symbol from its "=", or the words of
# "Delta G deg"; these spaces are held by a placeholder while wrapping.
_KEEP = "\x00"
_KEEP_PATTERNS = (
    re.compile(r"(?<=[\d)\]]) (?=(?:kJ/mol|kcal/mol|M\^-1|s\^-1|eV|mV|V|K|M|mol/L|angstrom|log10|times)\b)"),
    re.compile(r"(?<=M\^-1) (?=s\^-1)"),
    re.compile(r" (?==)"),
    re.compile(r"(?<==) (?=[-+\d(\[])"),
    re.compile(r"(?<=Delta) (?=G)|(?<=G) (?=deg)"),
    re.compile(r"(?<=plateau) (?=10\^)"),
    re.compile(r"(?<=\([!?]) (?=invented\b|unverified\b)"),
    re.compile(r"(?<=\+/-) (?=[\d.])|(?<=±) (?=[\d.])|(?<=\d) (?=\+/-|±)"),
)


def wrap_text(text: str, width: int = PLAIN_WIDTH, indent: str = "", subsequent: str = "  ") -> list[str]:
    """A line of prose wrapped to `width` with a hanging indent, never breaking between a number and its
    unit, around '=', or inside 'Delta G deg'."""
    held = text
    for pattern in _KEEP_PATTERNS:
        held = pattern.sub(_KEEP, held)
    lines = textwrap.wrap(held, width=width, initial_indent=indent, subsequent_indent=subsequent,
                          break_on_hyphens=False, break_long_words=False) or [indent]
    return [line.replace(_KEEP, " ") for line in lines]


def print_lines(lines, stream=None, closing: str | None = None) -> None:
    """Write prose lines (each wrapped by wrap_text, hanging indent) to stream, default stdout, then the
    `closing` paragraph (wrapped flush left) if given."""
    stream = stream or sys.stdout
    out = [w for line in lines for w in wrap_text(line)]
    if closing:
        out += wrap_text(closing, subsequent="")
    stream.write("".join(w + "\n" for w in out))


def print_rich_sections(console, sections, widths: tuple[int, int, int], highlight: str) -> None:
    """The `label value unit note` sections on a Rich console, one small table per section with fixed
    column widths so they line up; values of labels starting with `highlight` in bold green."""
    from rich.table import Table
    from rich.text import Text

    for title, rows in sections:
        console.print()
        console.print(Text(title, style="bold underline"))
        table = Table(show_header=False, box=None, pad_edge=False, padding=(0, 1), collapse_padding=True)
        # min_width, not width: a longer label or value widens its section rather than being cut.
        table.add_column("quantity", style="bold", min_width=widths[0] + 2, no_wrap=True)
        table.add_column("value", justify="right", min_width=widths[1], no_wrap=True)
        table.add_column("unit", style="dim", min_width=widths[2] - 1, no_wrap=True)
        table.add_column("note", style="dim")
        for label, value, unit, note in rows:
            style = "bold green" if label.startswith(highlight) else ""
            table.add_row("  " + label, Text(value, style=style), unit, note)
        console.print(table)
