"""Plain-ASCII service messages written with the trade's symbols, for faces that can show Unicode.

Services write "Delta G deg'" and "lambda" so that logs, pipes and any terminal can read them; the workbench
and a Unicode-capable terminal show ΔG°' and λ instead. Field names such as lambda_total are left alone.
"""

import re

_SYMBOLS = (
    (re.compile(r"Delta G deg'"), "ΔG°'"),
    (re.compile(r"Delta G deg"), "ΔG°"),
    (re.compile(r"\blambda\b"), "λ"),  # \b: "lambda_total" (a field name) is not touched
)


def with_symbols(text: str) -> str:
    """text with the ASCII spellings Delta G deg(') and lambda replaced by ΔG°(') and λ."""
    for pattern, symbol in _SYMBOLS:
        text = pattern.sub(symbol, text)
    return text
