"""The typed form of bond sets, `COUNT:DELTA_D:F_OX:F_RED`, shared by the command line (`crossrate lambda
--bonds`, `crossrate library add --bonds`) and the workbench's couple form, so a chemist types one form.

Several sets are separated by ';' (or spaces), e.g. `6:0.13:230:160; 2:0.05:300:280`. The TOML file keeps
its inline tables; this module only turns typed text into the same raw values (validated by the library).
"""

#: What a bond set looks like, for messages and help.
BOND_FORM = "COUNT:DELTA_D:F_OX:F_RED (bonds, angstrom, N/m, N/m), e.g. 6:0.13:230:160; several separated by ';'"


def parse_bond_item(text: str) -> dict:
    """One `COUNT:DELTA_D:F_OX:F_RED` -> {count, delta_d, f_ox, f_red} (count int, angstrom, N/m, N/m); the
    ranges are checked by the library's validation. Raises ValueError saying what was expected."""
    parts = text.strip().split(":")
    if len(parts) != 4:
        raise ValueError(f"{text.strip()!r}: expected {BOND_FORM}")
    try:
        count = int(parts[0])
        dd, fo, fr = (float(p) for p in parts[1:])
    except ValueError:
        raise ValueError(f"{text.strip()!r}: expected {BOND_FORM}") from None
    return {"count": count, "delta_d": dd, "f_ox": fo, "f_red": fr}


def parse_bonds_text(text: str) -> list[dict]:
    """Every bond set of the text (separated by ';' or white space); [] for empty text."""
    items = [p for chunk in text.split(";") for p in chunk.split()]
    return [parse_bond_item(p) for p in items]


def bonds_text(bonds) -> str:
    """Bond sets (BondSet records or their dicts) in the typed form, e.g. '6:0.13:230:160; 2:0.05:300:280'."""

    def get(b, key):
        return b[key] if isinstance(b, dict) else getattr(b, key)

    return "; ".join(f"{get(b, 'count')}:{get(b, 'delta_d')!r}:{_num(get(b, 'f_ox'))}:{_num(get(b, 'f_red'))}"
                     for b in bonds)


def _num(v: float) -> str:
    return str(int(v)) if float(v).is_integer() and abs(v) < 1e15 else repr(float(v))
