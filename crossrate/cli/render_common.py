"""Shared pieces of the CLI renderers: when to use Rich, number formats, symbols, the closing caution line."""

import os
import textwrap

#: Last line of every table form the prediction commands print.
CLOSING_CAUTION = (
    "Estimate only, not a safety assessment; follow your lab's safety rules and local regulations "
    "when handling strong oxidants and reductants."
)
#: Plain text is wrapped at this width whatever the terminal, so the output is the same everywhere.
PLAIN_WIDTH = 100

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
    """A bullet item wrapped to PLAIN_WIDTH with a hanging indent."""
    lead = " " * indent
    return textwrap.wrap(
        text, width=PLAIN_WIDTH, initial_indent=lead + bullet, subsequent_indent=lead + " " * len(bullet),
        break_on_hyphens=False,
    ) or [lead + bullet]


def wrap_line(text: str) -> list[str]:
    """A paragraph wrapped to PLAIN_WIDTH."""
    return textwrap.wrap(text, width=PLAIN_WIDTH, break_on_hyphens=False) or [""]
